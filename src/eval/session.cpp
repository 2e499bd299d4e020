#include "heatdeck/session.h"

#include <algorithm>
#include <filesystem>
#include <thread>

#include <fmt/format.h>

#include "eval/evaluator.h"
#include "eval/files.h"
#include "eval/program.h"
#include "eval/results.h"
#include "eval/sweep.h"
#include "lang/diagnostics.h"
#include "lang/parser.h"
#include "model/builder.h"
#include "model/stdlib_files.h"

#ifndef HEATDECK_VERSION
#define HEATDECK_VERSION "0.0.0"
#endif

namespace heatdeck {

namespace fs = std::filesystem;

struct Session::State {
  SessionOptions options;
  SourceFiles files;
  Diagnostics diags;
  std::string deck_name;  // as registered in files
  std::string deck_dir;   // canonical folder of the deck
  std::unique_ptr<Deck> deck;
  std::vector<std::unique_ptr<Deck>> templates;
  std::unique_ptr<Model> model;
  Results results;
  Plan plan;
  bool loaded_ok = false;
  bool evaluated = false;
};

Session::Session() : s_(std::make_unique<State>()) {}
Session::~Session() = default;

const Model& Session::model() const { return *s_->model; }
const Results& Session::results() const { return s_->results; }
const Diagnostics& Session::diagnostics() const { return s_->diags; }
const SourceFiles& Session::files() const { return s_->files; }

bool Session::Load(const std::string& path, const SessionOptions& options) {
  std::string text, why;
  if (!ReadWholeFile(path, options.max_file_bytes, &text, &why)) {
    s_->diags.Error(SourceRange{}, fmt::format("cannot read '{}': {}", path, why));
    return false;
  }
  return LoadText(path, std::move(text), options);
}

bool Session::LoadText(const std::string& name, std::string text, const SessionOptions& options) {
  State& s = *s_;
  s.options = options;
  s.results.files.push_back(InputFile{name, Sha256Hex(text)});
  const std::string_view file = s.files.Add(name, std::move(text));
  s.deck_name = std::string(file);
  s.deck_dir = CanonicalDir(fs::path(name).parent_path().string());

  // lex + parse
  ParseLimits limits;
  limits.max_depth = options.max_expression_depth;
  limits.max_statements = options.max_statements;
  s.deck = std::make_unique<Deck>(Parse(file, s.files.Text(file), s.diags, limits));

  // resolve + check
  BuildOptions build;
  std::vector<std::string> allowed = {s.deck_dir};
  for (const auto& dir : options.allow_paths) allowed.push_back(CanonicalDir(dir));
  if (!options.stdlib_dir.empty()) allowed.push_back(CanonicalDir(options.stdlib_dir));
  build.max_sweep_points = options.max_sweep_points;
  build.load = [this, allowed](const std::string& from_file, const std::string& path,
                               std::string_view* loaded_name, std::string_view* loaded_text,
                               std::string* why) {
    const std::string base = CanonicalDir(fs::path(from_file).parent_path().string());
    std::string resolved;
    std::string content;
    if (ResolveContained(base, path, allowed, &resolved, why)) {
      if (!ReadWholeFile(resolved, s_->options.max_file_bytes, &content, why)) return false;
    } else {
      // Not beside the deck: the template library, installed or built in.
      const std::string local_why = *why;
      std::string rel = path;
      if (rel.rfind("stdlib/", 0) == 0) rel = rel.substr(7);
      bool found = false;
      if (!s_->options.stdlib_dir.empty()) {
        const std::string dir = CanonicalDir(s_->options.stdlib_dir);
        if (ResolveContained(dir, rel, {dir}, &resolved, why)) {
          if (!ReadWholeFile(resolved, s_->options.max_file_bytes, &content, why)) return false;
          found = true;
        }
      } else if (fs::path(rel).is_relative()) {
        for (const EmbeddedFile& f : StdlibFiles()) {
          if (f.name == rel) {
            resolved = "<stdlib>/" + f.name;
            content = f.text;
            found = true;
          }
        }
      }
      if (!found) {
        *why = local_why == "no such file"
                   ? "no such file beside the deck or in the template library"
                   : local_why;
        return false;
      }
    }
    // Files inside the deck's folder are named relative to it, so that
    // reports do not depend on where the project is checked out.
    std::string shown = resolved;
    if (!s_->deck_dir.empty() && resolved.rfind(s_->deck_dir + "/", 0) == 0) {
      const fs::path deck_parent = fs::path(s_->deck_name).parent_path();
      shown = (deck_parent / resolved.substr(s_->deck_dir.size() + 1)).string();
    }
    s_->results.files.push_back(InputFile{shown, Sha256Hex(content)});
    const std::string_view n = s_->files.Add(shown, std::move(content));
    *loaded_name = n;
    *loaded_text = s_->files.Text(n);
    return true;
  };
  s.model = BuildModel(*s.deck, build, &s.templates, s.diags);
  s.loaded_ok = !s.diags.has_errors();
  return s.loaded_ok;
}

namespace {

// Moves runtime errors of one case into diagnostics, located at the
// sub-expression that failed.
void ReportRuntimeErrors(const Model& model, const CaseResult& c, Diagnostics& diags) {
  for (size_t qi = 0; qi < c.messages.size(); ++qi) {
    for (const QuantityMessage& m : c.messages[qi]) {
      if (m.kind != QuantityMessage::Kind::kError) continue;
      const SourceRange r = m.range.valid() ? m.range : model.quantities[qi].range;
      Diagnostic& d =
          diags.Error(r, c.name == "base" ? m.text : fmt::format("case '{}': {}", c.name, m.text));
      (void)d;
    }
  }
}

}  // namespace

std::vector<std::pair<int, double>> Session::CaseOverrides() const {
  const std::string& only = s_->options.only_case;
  if (only.empty() || only == "base") return {};
  for (const CaseDef& cd : s_->model->cases) {
    if (cd.name == only) return cd.overrides;
  }
  return {};
}

bool Session::Evaluate() {
  State& s = *s_;
  if (!s.loaded_ok) return false;
  const Model& m = *s.model;
  Results& r = s.results;
  r.model = &m;
  r.deck_path = s.deck_name;
  r.tool_version = HEATDECK_VERSION;
  r.date = s.options.date;
  if (r.date.empty()) {
    for (const auto& [k, v] : m.meta) {
      if (k == "date") r.date = v;
    }
  }
  const std::string& only = s.options.only_case;
  if (!only.empty() && only != "base") {
    bool found = false;
    for (const CaseDef& cd : m.cases) found = found || cd.name == only;
    if (!found) {
      Diagnostic& d = s.diags.Error(SourceRange{s.deck_name, 0, 0, 0},
                                    fmt::format("the deck has no case '{}'", only));
      std::string names = "base";
      for (const CaseDef& cd : m.cases) names += ", " + cd.name;
      d.notes.push_back("its cases: " + names);
      return false;
    }
  }

  // compile
  s.plan = MakePlan(m);
  if (!s.plan.error.empty()) {
    s.diags.Error(s.plan.error_range, s.plan.error);
    return false;
  }
  Evaluator ev(m, s.plan);

  // evaluate: the base inputs, then each case's.
  auto run_case = [&](const std::string& name, const std::string& description,
                      const std::vector<std::pair<int, double>>& overrides) {
    CaseResult c;
    c.name = name;
    c.description = description;
    ev.LoadInputs(overrides);
    for (const auto& [qi, v] : overrides) c.overridden.push_back(qi);
    ev.EvaluateCase(&c);
    for (const auto& msgs : c.messages) {
      for (const auto& msg : msgs) c.warnings += msg.kind == QuantityMessage::Kind::kWarning;
    }
    ReportRuntimeErrors(m, c, s.diags);
    r.cases.push_back(std::move(c));
  };
  if (only.empty() || only == "base") run_case("base", "", {});
  for (const CaseDef& cd : m.cases) {
    if (only.empty() || only == cd.name) run_case(cd.name, cd.description, cd.overrides);
  }
  s.evaluated = true;
  if (s.diags.has_errors()) return false;

  // A small sweep is kept for the report and JSON; a large one streams.
  const size_t points = SweepGridSize(m);
  if (points > 0 && points <= s.options.keep_sweep_points) {
    SweepResult sr;
    for (const SweepDef& sd : m.sweeps) sr.swept.push_back(sd.quantity);
    std::string why;
    if (!SweepColumnsFor(&sr.columns, &why)) {
      s.diags.Error(SourceRange{s.deck_name, 0, 0, 0}, why);
      return false;
    }
    sr.points = points;
    struct Keep : SweepSink {
      SweepResult* out;
      size_t n;
      void Point(size_t, const double* values, const std::string& error) override {
        out->rows.emplace_back(values, values + n);
        out->row_errors.push_back(error);
      }
    } keep;
    keep.out = &sr;
    keep.n = sr.columns.size();
    SweepOptions so;
    so.jobs = EffectiveJobs();
    so.columns = sr.columns;
    RunSweep(m, s.plan, CaseOverrides(), so, keep);
    r.sweeps.push_back(std::move(sr));
  }
  return true;
}

int Session::EffectiveJobs() const {
  if (s_->options.jobs > 0) return s_->options.jobs;
  const unsigned hw = std::thread::hardware_concurrency();
  return hw == 0 ? 1 : static_cast<int>(hw);
}

bool Session::SweepColumnsFor(std::vector<int>* columns, std::string* why) const {
  const Model& m = *s_->model;
  if (s_->options.sweep_columns.empty()) {
    *columns = DefaultSweepColumns(m);
    return true;
  }
  columns->clear();
  for (const SweepDef& sd : m.sweeps) columns->push_back(sd.quantity);
  for (const std::string& name : s_->options.sweep_columns) {
    const int q = m.Find(name);
    if (q < 0) {
      std::vector<std::string> names;
      for (const auto& qq : m.quantities) names.push_back(qq.name);
      const std::string near = NearestName(name, names);
      *why = fmt::format("--columns: the deck has no quantity '{}'{}", name,
                         near.empty() ? "" : fmt::format("; did you mean '{}'?", near));
      return false;
    }
    if (std::find(columns->begin(), columns->end(), q) == columns->end()) columns->push_back(q);
  }
  return true;
}

bool Session::StreamSweep(const std::function<void(const std::vector<SweepColumn>&)>& on_header,
                          const std::function<void(const double* values, const std::string& error,
                                                   std::string* out)>& format_row,
                          const std::function<void(const std::string& bytes)>& write,
                          std::string* error) {
  State& s = *s_;
  if (!s.evaluated) {
    *error = "the deck has not been evaluated";
    return false;
  }
  const Model& m = *s.model;
  if (m.sweeps.empty()) {
    *error = "csv output is for sweeps, and this deck has no sweep";
    return false;
  }
  std::vector<int> columns;
  if (!SweepColumnsFor(&columns, error)) return false;
  std::vector<SweepColumn> header;
  std::vector<const units::Unit*> unit;
  for (int q : columns) {
    const Quantity& qq = m.quantities[static_cast<size_t>(q)];
    header.push_back(SweepColumn{qq.name, qq.display.text});
    unit.push_back(&qq.display);
  }
  on_header(header);
  struct Stream : SweepSink {
    const std::function<void(const double*, const std::string&, std::string*)>* format;
    const std::function<void(const std::string&)>* write;
    const std::vector<const units::Unit*>* unit;
    void Point(size_t, const double*, const std::string&) override {}
    bool Formats() const override { return true; }
    void Format(size_t, const double* values, const std::string& err,
                std::string* out) const override {
      thread_local std::vector<double> shown;
      shown.resize(unit->size());
      for (size_t c = 0; c < shown.size(); ++c) shown[c] = (*unit)[c]->FromSi(values[c]);
      (*format)(shown.data(), err, out);
    }
    void Write(const std::string& bytes) override { (*write)(bytes); }
  } stream;
  stream.format = &format_row;
  stream.write = &write;
  stream.unit = &unit;
  SweepOptions so;
  so.jobs = EffectiveJobs();
  so.shard = s.options.shard;
  so.shards = s.options.shards;
  so.columns = columns;
  RunSweep(m, s.plan, CaseOverrides(), so, stream);
  return true;
}

int Session::ExitStatus() const {
  if (s_->diags.has_errors()) return 2;
  if (s_->evaluated && s_->results.failed_checks() > 0) return 1;
  return 0;
}

}  // namespace heatdeck
