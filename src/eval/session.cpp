#include "heatdeck/session.h"

#include <filesystem>

#include <fmt/format.h>

#include "eval/files.h"
#include "eval/program.h"
#include "eval/results.h"
#include "lang/diagnostics.h"
#include "lang/parser.h"
#include "model/builder.h"

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
  build.load = [this, allowed](const std::string& from_file, const std::string& path,
                               std::string* loaded_name, std::string_view* loaded_text,
                               std::string* why) {
    const std::string base = CanonicalDir(fs::path(from_file).parent_path().string());
    std::string resolved;
    if (!ResolveContained(base, path, allowed, &resolved, why)) return false;
    std::string content;
    if (!ReadWholeFile(resolved, s_->options.max_file_bytes, &content, why)) return false;
    s_->results.files.push_back(InputFile{resolved, Sha256Hex(content)});
    const std::string_view n = s_->files.Add(resolved, std::move(content));
    *loaded_name = std::string(n);
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

  // compile
  Program program(m, m.order);

  // evaluate: the base inputs, then each case's.
  auto run_case = [&](const std::string& name, const std::string& description,
                      const std::vector<std::pair<int, double>>& overrides) {
    CaseResult c;
    c.name = name;
    c.description = description;
    program.LoadGivens();
    for (const auto& [qi, v] : overrides) {
      program.values()[qi] = v;
      c.overridden.push_back(qi);
    }
    program.RunAll(&c);
    c.values = program.frame();
    program.RunChecks(&c.checks, &c.failed_checks);
    for (const auto& msgs : c.messages) {
      for (const auto& msg : msgs) c.warnings += msg.kind == QuantityMessage::Kind::kWarning;
    }
    ReportRuntimeErrors(m, c, s.diags);
    r.cases.push_back(std::move(c));
  };
  const std::string& only = s.options.only_case;
  if (!only.empty() && only != "base") {
    bool found = false;
    for (const CaseDef& cd : m.cases) found = found || cd.name == only;
    if (!found) {
      s.diags.Error(SourceRange{s.deck_name, 0, 0, 0},
                    fmt::format("the deck has no case '{}'", only));
      return false;
    }
  }
  if (only.empty() || only == "base") run_case("base", "", {});
  for (const CaseDef& cd : m.cases) {
    if (only.empty() || only == cd.name) run_case(cd.name, cd.description, cd.overrides);
  }
  s.evaluated = true;
  return !s.diags.has_errors();
}

int Session::ExitStatus() const {
  if (s_->diags.has_errors()) return 2;
  if (s_->evaluated && s_->results.failed_checks() > 0) return 1;
  return 0;
}

}  // namespace heatdeck
