#include "report/json_writer.h"

#include <cmath>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

namespace heatdeck {

using nlohmann::ordered_json;

namespace {

ordered_json Number(double v) {
  if (!std::isfinite(v)) return nullptr;
  return v;
}

ordered_json QuantityJson(const Model& m, const CaseResult& c, size_t i) {
  const Quantity& q = m.quantities[i];
  const bool ok = i < c.ok.size() ? c.ok[i] : false;
  const double si = i < c.values.size() ? c.values[i] : NAN;
  ordered_json j;
  j["name"] = q.name;
  j["kind"] = QuantityKindName(q.kind);
  j["value"] = ok ? Number(q.display.FromSi(si)) : ordered_json(nullptr);
  j["unit"] = q.display.text;
  j["si_value"] = ok ? Number(si) : ordered_json(nullptr);
  j["si_unit"] = q.type.dim.SiUnit();
  j["expression"] = q.expr != nullptr ? Pretty(*q.expr) : "";
  j["description"] = q.description;
  j["source"] = q.source;
  j["line"] = q.range.line;
  ordered_json warnings = ordered_json::array();
  ordered_json notes = ordered_json::array();
  ordered_json errors = ordered_json::array();
  if (i < c.messages.size()) {
    for (const auto& msg : c.messages[i]) {
      switch (msg.kind) {
        case QuantityMessage::Kind::kWarning:
          warnings.push_back(msg.text);
          break;
        case QuantityMessage::Kind::kNote:
          notes.push_back(msg.text);
          break;
        case QuantityMessage::Kind::kError:
          errors.push_back(msg.text);
          break;
      }
    }
  }
  j["warnings"] = warnings;
  j["notes"] = notes;
  j["errors"] = errors;
  if (!q.prefix.empty()) j["template"] = q.prefix.substr(0, q.prefix.size() - 1);
  if (q.template_default) j["template_default"] = true;
  return j;
}

ordered_json CheckJson(const Model& m, const CaseResult& c, size_t i) {
  const CheckDef& d = m.checks[i];
  const CheckResult& r = c.checks[i];
  ordered_json j;
  j["expression"] = Pretty(*d.expr);
  j["evaluated"] = r.evaluated;
  j["pass"] = r.evaluated ? ordered_json(r.pass) : ordered_json(nullptr);
  if (d.has_sides && r.evaluated) {
    j["lhs_si"] = Number(r.lhs_si);
    j["rhs_si"] = Number(r.rhs_si);
    j["margin"] = Number(r.margin_si);
    j["si_unit"] = d.side_unit.dim.SiUnit();
    j["unit"] = d.side_unit.text;
    // Display values of the two sides; a margin is a difference, so it
    // converts with the unit's factor alone.
    j["lhs"] = Number(d.side_unit.FromSi(r.lhs_si));
    j["rhs"] = Number(d.side_unit.FromSi(r.rhs_si));
    j["margin_display"] = Number(r.margin_si / d.side_unit.factor);
  } else {
    j["lhs_si"] = nullptr;
    j["rhs_si"] = nullptr;
    j["margin"] = nullptr;
  }
  j["line"] = d.stmt->range.line;
  j["description"] = d.description;
  if (!d.prefix.empty()) j["template"] = d.prefix.substr(0, d.prefix.size() - 1);
  return j;
}

ordered_json Sweeps(const Model& m, const Results& r) {
  ordered_json list = ordered_json::array();
  for (const SweepResult& s : r.sweeps) {
    ordered_json j;
    ordered_json swept = ordered_json::array();
    for (int q : s.swept) swept.push_back(m.quantities[static_cast<size_t>(q)].name);
    j["swept"] = swept;
    ordered_json cols = ordered_json::array();
    for (int q : s.columns) {
      const Quantity& qq = m.quantities[static_cast<size_t>(q)];
      cols.push_back(
          {{"name", qq.name}, {"unit", qq.display.text}, {"si_unit", qq.type.dim.SiUnit()}});
    }
    j["columns"] = cols;
    j["points"] = s.points;
    ordered_json rows = ordered_json::array();
    for (size_t p = 0; p < s.rows.size(); ++p) {
      ordered_json row = ordered_json::array();
      for (double v : s.rows[p]) row.push_back(Number(v));
      ordered_json point;
      point["si_values"] = row;
      point["error"] = p < s.row_errors.size() && !s.row_errors[p].empty()
                           ? ordered_json(s.row_errors[p])
                           : ordered_json(nullptr);
      rows.push_back(std::move(point));
    }
    j["rows"] = rows;
    list.push_back(std::move(j));
  }
  return list;
}

// Writes the document a value at a time, in exactly the layout of
// nlohmann's dump(2): built whole, the document of a 100 000-statement deck
// took about 6 KB of memory per quantity before a byte was written.  Small
// values are still built with nlohmann and dumped; only the long arrays
// (quantities, checks) are streamed element by element.
class Stream {
 public:
  explicit Stream(std::string* out) : out_(*out) {}

  void BeginObject() { Begin('{'); }
  void BeginArray() { Begin('['); }
  void End() {
    const Frame f = stack_.back();
    stack_.pop_back();
    if (f.count > 0) {
      out_ += '\n';
      out_.append(static_cast<size_t>(f.indent), ' ');
    }
    out_ += f.close;
  }
  void Key(const std::string& key) {
    Next();
    out_ += ordered_json(key).dump();
    out_ += ": ";
    keyed_ = true;
  }
  void Value(const ordered_json& v) {
    if (!keyed_) Next();
    keyed_ = false;
    // A nested value's lines sit two spaces deeper per level.
    const std::string text = v.dump(2);
    const size_t indent = stack_.empty() ? 0 : static_cast<size_t>(stack_.back().indent) + 2;
    size_t from = 0;
    for (size_t nl = text.find('\n'); nl != std::string::npos; nl = text.find('\n', from)) {
      out_.append(text, from, nl + 1 - from);
      out_.append(indent, ' ');
      from = nl + 1;
    }
    out_.append(text, from, std::string::npos);
  }
  void Field(const std::string& key, const ordered_json& v) {
    Key(key);
    Value(v);
  }

 private:
  struct Frame {
    char close;
    int indent;  // the column of the closing bracket
    size_t count = 0;
  };
  void Begin(char open) {
    int indent = 0;
    if (!stack_.empty()) {
      if (!keyed_) Next();
      indent = stack_.back().indent + 2;
    }
    keyed_ = false;
    out_ += open;
    stack_.push_back(Frame{open == '{' ? '}' : ']', indent});
  }
  // Starts the next member or element of the innermost container.
  void Next() {
    Frame& f = stack_.back();
    if (f.count++ > 0) out_ += ',';
    out_ += '\n';
    out_.append(static_cast<size_t>(f.indent) + 2, ' ');
  }

  std::string& out_;
  std::vector<Frame> stack_;
  bool keyed_ = false;
};

}  // namespace

std::string WriteJson(const Results& results, const Diagnostics* diags) {
  const Model& m = *results.model;
  std::string text;
  Stream doc(&text);
  doc.BeginObject();
  doc.Field("tool", "heatdeck");
  doc.Field("version", results.tool_version);
  doc.Field("deck", results.deck_path);
  doc.Field("sha256", results.files.empty() ? "" : results.files.front().sha256);
  doc.Field("title", m.title);
  doc.Field("date", results.date);
  ordered_json meta = ordered_json::object();
  for (const auto& [k, v] : m.meta) meta[k] = v;
  doc.Field("meta", meta);
  doc.Key("cases");
  doc.BeginArray();
  for (const CaseResult& c : results.cases) {
    doc.BeginObject();
    doc.Field("name", c.name);
    doc.Field("description", c.description);
    ordered_json over = ordered_json::array();
    for (int q : c.overridden) over.push_back(m.quantities[static_cast<size_t>(q)].name);
    doc.Field("overridden", over);
    doc.Key("quantities");
    doc.BeginArray();
    for (size_t i = 0; i < m.quantities.size(); ++i) doc.Value(QuantityJson(m, c, i));
    doc.End();
    doc.Key("checks");
    doc.BeginArray();
    for (size_t i = 0; i < m.checks.size(); ++i) doc.Value(CheckJson(m, c, i));
    doc.End();
    ordered_json solves = ordered_json::array();
    for (size_t i = 0; i < m.solves.size() && i < c.solves.size(); ++i) {
      const SolveDef& d = m.solves[i];
      const SolveResult& r = c.solves[i];
      const Quantity& x = m.quantities[static_cast<size_t>(d.unknown)];
      ordered_json sj;
      sj["unknown"] = x.name;
      sj["converged"] = r.converged;
      sj["iterations"] = r.iterations;
      sj["value_si"] = r.converged ? Number(r.value_si) : ordered_json(nullptr);
      sj["residual_si"] = r.converged ? Number(r.residual_si) : ordered_json(nullptr);
      sj["bracket_si"] = {Number(d.lo), Number(d.hi)};
      sj["residual_at_bracket_si"] = {Number(r.residual_lo), Number(r.residual_hi)};
      sj["line"] = d.stmt->range.line;
      sj["error"] = r.error.empty() ? ordered_json(nullptr) : ordered_json(r.error);
      solves.push_back(std::move(sj));
    }
    doc.Field("solves", solves);
    doc.Field("failed_checks", c.failed_checks);
    doc.End();
  }
  doc.End();
  doc.Field("sweeps", Sweeps(m, results));
  ordered_json files = ordered_json::array();
  for (const InputFile& f : results.files)
    files.push_back({{"path", f.path}, {"sha256", f.sha256}});
  doc.Field("files", files);
  ordered_json diag = ordered_json::array();
  if (diags != nullptr) {
    for (const Diagnostic* d : diags->Sorted()) {
      diag.push_back({{"severity", d->severity == Severity::kError     ? "error"
                                   : d->severity == Severity::kWarning ? "warning"
                                                                       : "note"},
                      {"file", std::string(d->range.file)},
                      {"line", d->range.line},
                      {"column", d->range.col},
                      {"message", d->message}});
    }
  }
  doc.Field("diagnostics", diag);
  doc.End();
  text += '\n';
  return text;
}

}  // namespace heatdeck
