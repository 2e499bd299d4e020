#include "report/diff.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <utility>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "lang/syntax.h"

namespace heatdeck {

using nlohmann::ordered_json;

const char* CheckOutcomeName(CheckOutcome o) {
  switch (o) {
    case CheckOutcome::kAbsent:
      return "";
    case CheckOutcome::kPass:
      return "pass";
    case CheckOutcome::kFail:
      return "fail";
    case CheckOutcome::kNotEvaluated:
      return "not evaluated";
  }
  return "";
}

bool DiffResult::empty() const {
  if (title_changed || !meta.empty() || !cases_added.empty() || !cases_removed.empty()) {
    return false;
  }
  return std::all_of(cases.begin(), cases.end(), [](const CaseDiff& c) { return c.empty(); });
}

// ---- Comparison ------------------------------------------------------------

namespace {

// The relative tolerance below which two SI values are the same value: far
// above the rounding of a re-evaluation, far below any engineering change.
constexpr double kRelativeTolerance = 1e-12;

DiffValue ValueOf(const Model& m, const CaseResult& c, size_t qi) {
  const Quantity& q = m.quantities[qi];
  DiffValue v;
  v.present = true;
  v.evaluated = qi < c.ok.size() && c.ok[qi] && qi < c.values.size();
  v.si = v.evaluated ? c.values[qi] : 0.0;
  v.si_unit = q.type.dim.SiUnit();
  v.display = q.display;
  v.kind = q.kind;
  return v;
}

bool SameValue(double a, double b) {
  if (std::isnan(a) || std::isnan(b)) return std::isnan(a) && std::isnan(b);
  if (a == b) return true;  // also equal infinities
  return std::fabs(b - a) <= kRelativeTolerance * std::max(std::fabs(a), std::fabs(b));
}

// Fills the comparison of a quantity present on both sides; returns whether
// it changed.
bool CompareValues(const Quantity& oq, const Quantity& nq, QuantityChange* ch) {
  DiffValue& o = ch->old_value;
  DiffValue& n = ch->new_value;
  ch->dimension_changed = !(oq.type.dim == nq.type.dim);
  if (!ch->dimension_changed && oq.type.temp == nq.type.temp) o.display = n.display;
  // A calculated value replaced by a given (or the reverse) matters to a
  // checker even when the number stayed.
  const bool kind_changed = oq.kind != nq.kind;
  if (ch->dimension_changed) return true;
  if (o.evaluated != n.evaluated) return true;
  if (!o.evaluated) return kind_changed;
  if (SameValue(o.si, n.si)) return kind_changed;
  if (o.si != 0.0 && std::isfinite(o.si) && std::isfinite(n.si)) {
    ch->has_percent = true;
    ch->percent = 100.0 * (n.si - o.si) / std::fabs(o.si);
  }
  return true;
}

CheckOutcome OutcomeOf(const CaseResult& c, size_t ci) {
  if (ci >= c.checks.size() || !c.checks[ci].evaluated) return CheckOutcome::kNotEvaluated;
  return c.checks[ci].pass ? CheckOutcome::kPass : CheckOutcome::kFail;
}

// Checks are matched by prefix and expression text; the k-th check with a
// given key in one deck pairs with the k-th in the other, so that repeated
// texts still pair up one to one and in order.
std::vector<std::string> CheckKeys(const Model& m) {
  std::vector<std::string> keys;
  std::map<std::string, int> seen;
  for (const CheckDef& d : m.checks) {
    const std::string text = d.prefix + '\x1f' + Pretty(*d.expr);
    keys.push_back(fmt::format("{}\x1f{}", text, seen[text]++));
  }
  return keys;
}

std::string PrefixName(const std::string& prefix) {
  return prefix.empty() ? prefix : prefix.substr(0, prefix.size() - 1);
}

CheckChange CheckFrom(const CheckDef& d) {
  CheckChange ch;
  ch.expression = Pretty(*d.expr);
  ch.prefix = PrefixName(d.prefix);
  ch.description = d.description;
  return ch;
}

CaseDiff CompareCase(const Model& om, const CaseResult& oc, const Model& nm, const CaseResult& nc) {
  CaseDiff cd;
  cd.name = nc.name;
  for (size_t i = 0; i < nm.quantities.size(); ++i) {
    const Quantity& nq = nm.quantities[i];
    QuantityChange ch;
    ch.name = nq.name;
    ch.new_value = ValueOf(nm, nc, i);
    const int j = om.Find(nq.name);
    if (j < 0) {
      ch.change = QuantityChange::Change::kAdded;
      cd.added.push_back(std::move(ch));
      continue;
    }
    const size_t oj = static_cast<size_t>(j);
    ch.old_value = ValueOf(om, oc, oj);
    if (!CompareValues(om.quantities[oj], nq, &ch)) continue;
    (nq.kind == QuantityKind::kGiven ? cd.inputs : cd.results).push_back(std::move(ch));
  }
  for (size_t j = 0; j < om.quantities.size(); ++j) {
    const Quantity& oq = om.quantities[j];
    if (nm.Find(oq.name) >= 0) continue;
    QuantityChange ch;
    ch.change = QuantityChange::Change::kRemoved;
    ch.name = oq.name;
    ch.old_value = ValueOf(om, oc, j);
    cd.removed.push_back(std::move(ch));
  }

  const std::vector<std::string> okeys = CheckKeys(om);
  const std::vector<std::string> nkeys = CheckKeys(nm);
  std::map<std::string, size_t> old_index;
  for (size_t j = 0; j < okeys.size(); ++j) old_index[okeys[j]] = j;
  std::vector<bool> matched(okeys.size(), false);
  for (size_t i = 0; i < nkeys.size(); ++i) {
    CheckChange ch = CheckFrom(nm.checks[i]);
    ch.new_outcome = OutcomeOf(nc, i);
    auto it = old_index.find(nkeys[i]);
    if (it != old_index.end()) {
      matched[it->second] = true;
      ch.old_outcome = OutcomeOf(oc, it->second);
    }
    if (ch.old_outcome != ch.new_outcome) cd.checks.push_back(std::move(ch));
  }
  for (size_t j = 0; j < okeys.size(); ++j) {
    if (matched[j]) continue;
    CheckChange ch = CheckFrom(om.checks[j]);
    ch.old_outcome = OutcomeOf(oc, j);
    cd.checks.push_back(std::move(ch));
  }
  return cd;
}

// Meta fields keyed like checks: key and occurrence.
std::vector<std::string> MetaKeys(const Model& m) {
  std::vector<std::string> keys;
  std::map<std::string, int> seen;
  for (const auto& kv : m.meta) keys.push_back(fmt::format("{}\x1f{}", kv.first, seen[kv.first]++));
  return keys;
}

void CompareMeta(const Model& om, const Model& nm, DiffResult* d) {
  const std::vector<std::string> okeys = MetaKeys(om);
  const std::vector<std::string> nkeys = MetaKeys(nm);
  std::map<std::string, size_t> old_index;
  for (size_t j = 0; j < okeys.size(); ++j) old_index[okeys[j]] = j;
  std::vector<bool> matched(okeys.size(), false);
  for (size_t i = 0; i < nkeys.size(); ++i) {
    MetaChange ch;
    ch.key = nm.meta[i].first;
    ch.in_new = true;
    ch.new_text = nm.meta[i].second;
    auto it = old_index.find(nkeys[i]);
    if (it != old_index.end()) {
      matched[it->second] = true;
      ch.in_old = true;
      ch.old_text = om.meta[it->second].second;
      if (ch.old_text == ch.new_text) continue;
    }
    d->meta.push_back(std::move(ch));
  }
  for (size_t j = 0; j < okeys.size(); ++j) {
    if (matched[j]) continue;
    MetaChange ch;
    ch.key = om.meta[j].first;
    ch.in_old = true;
    ch.old_text = om.meta[j].second;
    d->meta.push_back(std::move(ch));
  }
}

}  // namespace

DiffResult Compare(const Results& old, const Results& neu) {
  const Model& om = *old.model;
  const Model& nm = *neu.model;
  DiffResult d;
  d.old_label = old.deck_path;
  d.new_label = neu.deck_path;
  d.tool_version = neu.tool_version;
  d.old_title = om.title;
  d.new_title = nm.title;
  d.title_changed = om.title != nm.title;
  CompareMeta(om, nm, &d);
  for (const CaseResult& nc : neu.cases) {
    auto oc = std::find_if(old.cases.begin(), old.cases.end(),
                           [&](const CaseResult& c) { return c.name == nc.name; });
    if (oc == old.cases.end()) {
      d.cases_added.push_back(nc.name);
    } else {
      d.cases.push_back(CompareCase(om, *oc, nm, nc));
    }
  }
  for (const CaseResult& oc : old.cases) {
    const bool in_new = std::any_of(neu.cases.begin(), neu.cases.end(),
                                    [&](const CaseResult& c) { return c.name == oc.name; });
    if (!in_new) d.cases_removed.push_back(oc.name);
  }
  return d;
}

// ---- Formatting shared by the writers --------------------------------------

namespace {

constexpr int kMinDigits = 4;
constexpr int kPercentDigits = 3;

// "1.200" -> "1.2", "2.000e-05" -> "2e-05", "20" stays.  FormatSig keeps
// trailing zeros to show precision; a diff shows just enough digits to tell
// old from new, so they would only be noise here.
std::string TrimZeros(std::string s) {
  const size_t e = s.find('e');
  std::string exp = e == std::string::npos ? "" : s.substr(e);
  std::string mant = e == std::string::npos ? s : s.substr(0, e);
  if (mant.find('.') != std::string::npos) {
    while (!mant.empty() && mant.back() == '0') mant.pop_back();
    if (!mant.empty() && mant.back() == '.') mant.pop_back();
  }
  return mant + exp;
}

std::string Number(double display, int digits) {
  return TrimZeros(units::FormatSig(display, digits));
}

std::string WithUnit(const std::string& number, const std::string& unit) {
  return unit.empty() ? number : number + " " + unit;
}

// The fewest digits (at least kMinDigits) at which the two sides of a
// changed value print differently, so that a change in the 7th digit is not
// shown as "40.12 kW -> 40.12 kW".
int DigitsToTell(const QuantityChange& ch) {
  const DiffValue& o = ch.old_value;
  const DiffValue& n = ch.new_value;
  if (!o.evaluated || !n.evaluated || o.display.text != n.display.text) return kMinDigits;
  const double a = o.display.FromSi(o.si);
  const double b = n.display.FromSi(n.si);
  for (int digits = kMinDigits; digits <= 17; ++digits) {
    if (units::FormatSig(a, digits) != units::FormatSig(b, digits)) return digits;
  }
  return kMinDigits;  // the same number (a change of kind alone)
}

// A value as shown: "35 degC"; "not evaluated" when it failed.
std::string ValueText(const DiffValue& v, int digits) {
  if (!v.present) return "";
  if (!v.evaluated) return "not evaluated";
  return WithUnit(Number(v.display.FromSi(v.si), digits), v.display.text);
}

std::string PercentText(const QuantityChange& ch) {
  if (!ch.has_percent) return "";
  const std::string n = Number(ch.percent, kPercentDigits);
  return (ch.percent > 0 ? "+" : "") + n + "%";
}

std::string CheckLabel(const CheckChange& c) {
  return c.prefix.empty() ? c.expression : c.prefix + ": " + c.expression;
}

std::string OutcomeText(CheckOutcome o, const char* absent) {
  return o == CheckOutcome::kAbsent ? absent : CheckOutcomeName(o);
}

std::string KindName(const QuantityChange& ch) {
  const DiffValue& v = ch.new_value.present ? ch.new_value : ch.old_value;
  return QuantityKindName(v.kind);
}

// ---- Text ------------------------------------------------------------------

// Characters, not bytes, so that "°C" in an expression keeps columns
// aligned: UTF-8 continuation bytes do not count.
size_t Width(const std::string& s) {
  return static_cast<size_t>(std::count_if(
      s.begin(), s.end(), [](char c) { return (static_cast<unsigned char>(c) & 0xC0) != 0x80; }));
}

// Rows of cells printed as aligned columns, two spaces apart, under an
// indent; trailing blanks trimmed.
void Table(const std::vector<std::vector<std::string>>& rows, std::string* out) {
  if (rows.empty()) return;
  std::vector<size_t> widths(rows[0].size(), 0);
  for (const auto& r : rows) {
    for (size_t c = 0; c < r.size(); ++c) widths[c] = std::max(widths[c], Width(r[c]));
  }
  for (const auto& r : rows) {
    std::string line = "    ";
    for (size_t c = 0; c < r.size(); ++c) {
      line += r[c];
      if (c + 1 < r.size()) line += std::string(widths[c] - Width(r[c]) + 2, ' ');
    }
    while (!line.empty() && line.back() == ' ') line.pop_back();
    *out += line + "\n";
  }
}

void ChangedText(const char* heading, const std::vector<QuantityChange>& list, std::string* out) {
  if (list.empty()) return;
  *out += fmt::format("  {}:\n", heading);
  std::vector<std::vector<std::string>> rows;
  for (const QuantityChange& ch : list) {
    const int digits = DigitsToTell(ch);
    std::string note = PercentText(ch);
    if (ch.dimension_changed) note = "dimension changed";
    if (ch.old_value.kind != ch.new_value.kind) {
      note +=
          fmt::format("{}was {}", note.empty() ? "" : "; ", QuantityKindName(ch.old_value.kind));
    }
    rows.push_back(
        {ch.name, ValueText(ch.old_value, digits), "->", ValueText(ch.new_value, digits), note});
  }
  Table(rows, out);
}

void OneSidedText(const char* heading, const std::vector<QuantityChange>& list, std::string* out) {
  if (list.empty()) return;
  *out += fmt::format("  {}:\n", heading);
  std::vector<std::vector<std::string>> rows;
  for (const QuantityChange& ch : list) {
    const DiffValue& v = ch.new_value.present ? ch.new_value : ch.old_value;
    rows.push_back({ch.name, KindName(ch), ValueText(v, kMinDigits)});
  }
  Table(rows, out);
}

std::string Quoted(const std::string& s) { return "\"" + s + "\""; }

}  // namespace

std::string WriteDiffText(const DiffResult& d) {
  std::string out;
  out += fmt::format("old: {}\nnew: {}\n", d.old_label, d.new_label);
  if (!d.note.empty()) out += fmt::format("note: {}\n", d.note);
  if (d.empty()) {
    out += "no differences\n";
    return out;
  }
  if (d.title_changed || !d.meta.empty()) {
    out += "\n";
    if (d.title_changed) {
      out += fmt::format("title: {} -> {}\n", Quoted(d.old_title), Quoted(d.new_title));
    }
    for (const MetaChange& m : d.meta) {
      out += fmt::format("meta {}: {} -> {}\n", m.key, m.in_old ? Quoted(m.old_text) : "(none)",
                         m.in_new ? Quoted(m.new_text) : "(removed)");
    }
  }
  for (const CaseDiff& c : d.cases) {
    out += fmt::format("\ncase {}", c.name);
    if (c.empty()) {
      out += ": no changes\n";
      continue;
    }
    out += "\n";
    ChangedText("inputs changed", c.inputs, &out);
    ChangedText("results changed", c.results, &out);
    OneSidedText("quantities added", c.added, &out);
    OneSidedText("quantities removed", c.removed, &out);
    if (!c.checks.empty()) {
      out += "  checks changed:\n";
      std::vector<std::vector<std::string>> rows;
      for (const CheckChange& ch : c.checks) {
        rows.push_back({CheckLabel(ch), OutcomeText(ch.old_outcome, "(new check)"), "->",
                        OutcomeText(ch.new_outcome, "(removed)")});
      }
      Table(rows, &out);
    }
  }
  if (!d.cases_added.empty() || !d.cases_removed.empty()) out += "\n";
  for (const std::string& name : d.cases_added) out += fmt::format("case {}: added\n", name);
  for (const std::string& name : d.cases_removed) out += fmt::format("case {}: removed\n", name);
  return out;
}

// ---- Markdown --------------------------------------------------------------

namespace {

// A table cell: '|' would end the cell and a line break the row.
std::string Cell(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (c == '|') {
      out += "\\|";
    } else if (c == '\n' || c == '\r') {
      out += ' ';
    } else {
      out += c;
    }
  }
  return out;
}

// Inline code that survives backticks in the text (CommonMark: a longer
// fence, padded with spaces).
std::string Code(const std::string& s) {
  size_t run = 0, longest = 0;
  for (char c : s) {
    run = c == '`' ? run + 1 : 0;
    longest = std::max(longest, run);
  }
  const std::string fence(longest + 1, '`');
  const bool pad = longest > 0;
  return fence + (pad ? " " : "") + s + (pad ? " " : "") + fence;
}

void ChangedMarkdown(const char* heading, const std::vector<QuantityChange>& list,
                     std::string* out) {
  if (list.empty()) return;
  *out +=
      fmt::format("\n### {}\n\n| Quantity | Old | New | Change |\n|---|---:|---:|---:|\n", heading);
  for (const QuantityChange& ch : list) {
    const int digits = DigitsToTell(ch);
    std::string note = ch.dimension_changed ? "dimension changed" : PercentText(ch);
    if (ch.old_value.kind != ch.new_value.kind) {
      note +=
          fmt::format("{}was {}", note.empty() ? "" : "; ", QuantityKindName(ch.old_value.kind));
    }
    *out += fmt::format("| {} | {} | {} | {} |\n", Cell(Code(ch.name)),
                        Cell(ValueText(ch.old_value, digits)),
                        Cell(ValueText(ch.new_value, digits)), Cell(note));
  }
}

void OneSidedMarkdown(const char* heading, const std::vector<QuantityChange>& list,
                      std::string* out) {
  if (list.empty()) return;
  *out += fmt::format("\n### {}\n\n| Quantity | Kind | Value |\n|---|---|---:|\n", heading);
  for (const QuantityChange& ch : list) {
    const DiffValue& v = ch.new_value.present ? ch.new_value : ch.old_value;
    *out += fmt::format("| {} | {} | {} |\n", Cell(Code(ch.name)), KindName(ch),
                        Cell(ValueText(v, kMinDigits)));
  }
}

}  // namespace

std::string WriteDiffMarkdown(const DiffResult& d) {
  std::string out = "# Deck differences\n\n";
  out += fmt::format("- Old: {}\n- New: {}\n", Code(d.old_label), Code(d.new_label));
  if (!d.note.empty()) out += fmt::format("- Note: {}\n", d.note);
  if (d.empty()) {
    out += "\nNo differences.\n";
    return out;
  }
  if (d.title_changed || !d.meta.empty()) {
    out += "\n## Title block\n\n| Field | Old | New |\n|---|---|---|\n";
    if (d.title_changed) {
      out += fmt::format("| title | {} | {} |\n", Cell(d.old_title), Cell(d.new_title));
    }
    for (const MetaChange& m : d.meta) {
      out += fmt::format("| {} | {} | {} |\n", Cell(m.key), m.in_old ? Cell(m.old_text) : "—",
                         m.in_new ? Cell(m.new_text) : "—");
    }
  }
  for (const CaseDiff& c : d.cases) {
    out += fmt::format("\n## Case {}\n", Cell(c.name));
    if (c.empty()) {
      out += "\nNo changes.\n";
      continue;
    }
    ChangedMarkdown("Inputs changed", c.inputs, &out);
    ChangedMarkdown("Results changed", c.results, &out);
    OneSidedMarkdown("Quantities added", c.added, &out);
    OneSidedMarkdown("Quantities removed", c.removed, &out);
    if (!c.checks.empty()) {
      out += "\n### Checks changed\n\n| Check | Old | New |\n|---|---|---|\n";
      for (const CheckChange& ch : c.checks) {
        out += fmt::format("| {} | {} | {} |\n", Cell(Code(CheckLabel(ch))),
                           OutcomeText(ch.old_outcome, "(new check)"),
                           OutcomeText(ch.new_outcome, "(removed)"));
      }
    }
  }
  if (!d.cases_added.empty() || !d.cases_removed.empty()) {
    out += "\n## Cases added or removed\n\n";
    for (const std::string& name : d.cases_added) out += fmt::format("- {}: added\n", Code(name));
    for (const std::string& name : d.cases_removed) {
      out += fmt::format("- {}: removed\n", Code(name));
    }
  }
  return out;
}

// ---- JSON ------------------------------------------------------------------

namespace {

ordered_json JsonNumber(double v) {
  if (!std::isfinite(v)) return nullptr;
  return v;
}

ordered_json JsonSide(const DiffValue& v) {
  if (!v.present) return nullptr;
  ordered_json j;
  j["kind"] = QuantityKindName(v.kind);
  j["evaluated"] = v.evaluated;
  j["value"] = v.evaluated ? JsonNumber(v.display.FromSi(v.si)) : ordered_json(nullptr);
  j["unit"] = v.display.text;
  j["si_value"] = v.evaluated ? JsonNumber(v.si) : ordered_json(nullptr);
  j["si_unit"] = v.si_unit;
  return j;
}

ordered_json JsonQuantities(const std::vector<QuantityChange>& list) {
  ordered_json a = ordered_json::array();
  for (const QuantityChange& ch : list) {
    ordered_json j;
    j["name"] = ch.name;
    j["old"] = JsonSide(ch.old_value);
    j["new"] = JsonSide(ch.new_value);
    j["change_percent"] = ch.has_percent ? JsonNumber(ch.percent) : ordered_json(nullptr);
    j["dimension_changed"] = ch.dimension_changed;
    a.push_back(std::move(j));
  }
  return a;
}

ordered_json JsonOutcome(CheckOutcome o) {
  if (o == CheckOutcome::kAbsent) return nullptr;
  return CheckOutcomeName(o);
}

}  // namespace

std::string WriteDiffJson(const DiffResult& d) {
  ordered_json doc;
  doc["tool"] = "heatdeck";
  doc["version"] = d.tool_version;
  doc["old"] = d.old_label;
  doc["new"] = d.new_label;
  doc["note"] = d.note;
  doc["changed"] = !d.empty();
  doc["title"] = d.title_changed ? ordered_json{{"old", d.old_title}, {"new", d.new_title}}
                                 : ordered_json(nullptr);
  ordered_json meta = ordered_json::array();
  for (const MetaChange& m : d.meta) {
    meta.push_back({{"key", m.key},
                    {"old", m.in_old ? ordered_json(m.old_text) : ordered_json(nullptr)},
                    {"new", m.in_new ? ordered_json(m.new_text) : ordered_json(nullptr)}});
  }
  doc["meta"] = meta;
  ordered_json cases = ordered_json::array();
  for (const CaseDiff& c : d.cases) {
    ordered_json j;
    j["name"] = c.name;
    j["changed"] = !c.empty();
    j["inputs"] = JsonQuantities(c.inputs);
    j["results"] = JsonQuantities(c.results);
    j["added"] = JsonQuantities(c.added);
    j["removed"] = JsonQuantities(c.removed);
    ordered_json checks = ordered_json::array();
    for (const CheckChange& ch : c.checks) {
      ordered_json k;
      k["expression"] = ch.expression;
      k["template"] = ch.prefix.empty() ? ordered_json(nullptr) : ordered_json(ch.prefix);
      k["description"] = ch.description;
      k["old"] = JsonOutcome(ch.old_outcome);
      k["new"] = JsonOutcome(ch.new_outcome);
      checks.push_back(std::move(k));
    }
    j["checks"] = checks;
    cases.push_back(std::move(j));
  }
  doc["cases"] = cases;
  doc["cases_added"] = d.cases_added;
  doc["cases_removed"] = d.cases_removed;
  // A deck's strings are meant to be UTF-8 but not guaranteed to be; a bad
  // byte becomes U+FFFD rather than an exception.
  return doc.dump(2, ' ', false, ordered_json::error_handler_t::replace) + "\n";
}

}  // namespace heatdeck
