// `heatdeck templates` lists the template library; `heatdeck new` starts a
// deck from one of its templates.
#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <ostream>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "cli/app.h"
#include "eval/files.h"
#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"
#include "lang/parser.h"
#include "lang/syntax.h"
#include "model/builder.h"
#include "model/model.h"
#include "model/stdlib_files.h"

namespace heatdeck::cli {

namespace {

namespace fs = std::filesystem;

constexpr const char* kDeckExt = ".deck";
constexpr size_t kListWidth = 88;
// The section whose calculated quantities a template offers as its main
// results (the stdlib's convention; `new` re-exports them).
constexpr const char* kResultsSection = "Results";

struct TemplateFile {
  std::string name;  // without ".deck"
  std::string text;
};

// The library: the *.deck files of `dir` when given (the --stdlib option),
// else the templates built into the binary.  Sorted by name.
bool LoadLibrary(const std::string& dir, std::vector<TemplateFile>* out, std::string* why) {
  if (dir.empty()) {
    for (const EmbeddedFile& f : StdlibFiles()) {
      const fs::path p(f.name);
      if (p.extension() == kDeckExt) out->push_back({p.stem().string(), f.text});
    }
    return true;
  }
  std::error_code ec;
  fs::directory_iterator it(dir, ec);
  if (ec) {
    *why = fmt::format("cannot read the template folder '{}': {}", dir, ec.message());
    return false;
  }
  for (const fs::directory_entry& e : it) {
    if (e.path().extension() != kDeckExt) continue;
    TemplateFile f{e.path().stem().string(), {}};
    std::string read_why;
    if (!ReadWholeFile(e.path().string(), SessionOptions{}.max_file_bytes, &f.text, &read_why)) {
      *why = fmt::format("cannot read '{}': {}", e.path().string(), read_why);
      return false;
    }
    out->push_back(std::move(f));
  }
  std::sort(out->begin(), out->end(),
            [](const TemplateFile& a, const TemplateFile& b) { return a.name < b.name; });
  return true;
}

// What the two commands need from a template, read from its syntax tree.
struct TemplateInfo {
  struct Input {
    std::string section;  // the template's section holding it
    std::string name;
    std::string literal;  // as written: "0.60 kg/s"
    std::string description;
    std::string source;
  };
  struct Result {
    std::string name;
    std::string unit;  // the template's display unit as written ("" for none)
    std::string description;
  };
  std::string title;
  std::string first_narrative;
  std::vector<Input> inputs;
  std::vector<Result> results;
};

// Parses the template; false (with the first error) when it does not parse.
bool ReadTemplate(const TemplateFile& f, TemplateInfo* info, std::string* why) {
  SourceFiles files;
  Diagnostics diags;
  const std::string_view name = files.Add(f.name + kDeckExt, f.text);
  const Deck deck = Parse(name, files.Text(name), diags);
  if (diags.has_errors()) {
    *why = Render(*diags.Sorted().front(), files, false);
    return false;
  }
  std::string section;
  for (const Stmt& s : deck.stmts) {
    switch (s.kind) {
      case StmtKind::kTitle:
        info->title = s.text;
        break;
      case StmtKind::kSection:
        section = s.text;
        break;
      case StmtKind::kNarrative:
        if (info->first_narrative.empty()) info->first_narrative = s.text;
        break;
      case StmtKind::kGiven:
        info->inputs.push_back(
            {section, std::string(s.name), Pretty(*s.expr), s.attrs.description, s.attrs.source});
        break;
      case StmtKind::kCalc:
        if (section == kResultsSection) {
          info->results.push_back(
              {std::string(s.name), std::string(s.display.text), s.attrs.description});
        }
        break;
      default:
        break;
    }
  }
  return true;
}

// A deck string literal.
std::string Quote(const std::string& s) {
  std::string q = "\"";
  for (const char c : s) {
    if (c == '"' || c == '\\') q += '\\';
    q += c;
  }
  return q + "\"";
}

// Greedy word wrap, each line indented.
std::string Wrap(const std::string& text, size_t indent, size_t width) {
  std::string out, line;
  size_t start = 0;
  while (start < text.size()) {
    size_t end = text.find(' ', start);
    if (end == std::string::npos) end = text.size();
    const std::string word = text.substr(start, end - start);
    if (!line.empty() && indent + line.size() + 1 + word.size() > width) {
      out += std::string(indent, ' ') + line + "\n";
      line.clear();
    }
    line += (line.empty() ? "" : " ") + word;
    start = end + 1;
  }
  if (!line.empty()) out += std::string(indent, ' ') + line + "\n";
  return out;
}

// A name usable as the `use … as PREFIX` of a template file name.
std::string PrefixFor(const std::string& name) {
  std::string p;
  for (const char c : name) {
    const bool ok = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9');
    p += ok ? c : '_';
  }
  if (p.empty() || (p[0] >= '0' && p[0] <= '9')) p = "t_" + p;
  return p;
}

// v rounded towards minus infinity to two significant figures, as text, so
// that the example check `RESULT >= LIMIT` passes on the template's defaults.
std::string FloorTwoFigures(double v) {
  if (v == 0.0 || !std::isfinite(v)) return "0";
  const int e = static_cast<int>(std::floor(std::log10(std::abs(v))));
  const double step = std::pow(10.0, e - 1);
  const double floored = std::floor(v / step) * step;
  return fmt::format("{:.{}f}", floored, std::max(0, 1 - e));
}

// The template's defaults evaluated on their own, for the example check;
// "" when the first result cannot be evaluated.
std::string ExampleLimit(const TemplateFile& f, const std::string& result,
                         const std::string& stdlib_dir) {
  SessionOptions options;
  options.stdlib_dir = stdlib_dir;
  Session session;
  if (!session.LoadText(f.name + kDeckExt, f.text, options) || !session.Evaluate()) return "";
  const int q = session.model().Find(result);
  const CaseResult& base = session.results().cases.front();
  if (q < 0 || !base.ok[static_cast<size_t>(q)]) return "";
  const Quantity& quantity = session.model().quantities[static_cast<size_t>(q)];
  return FloorTwoFigures(quantity.display.FromSi(base.values[static_cast<size_t>(q)]));
}

// The text of a new deck that uses template f with every input bound to a
// given of its own (the template's value, unit, description and source).
std::string NewDeckText(const TemplateFile& f, const TemplateInfo& info,
                        const std::string& stdlib_dir) {
  const std::string prefix = PrefixFor(f.name);
  size_t width = 0;
  for (const auto& in : info.inputs) width = std::max(width, in.name.size());
  for (const auto& r : info.results) width = std::max(width, r.name.size());

  std::string d;
  d += fmt::format(
      "# Started from the template {name}{ext} of the template library by 'heatdeck new'.\n"
      "# The givens are the template's inputs with its default values: replace each with\n"
      "# this job's value and name its source, fill in the title and the meta fields,\n"
      "# then run 'heatdeck check' and 'heatdeck run' on this file.  The template's method,\n"
      "# quantities and checks appear in the report under the prefix '{prefix}'.\n"
      "# Cases and sweeps vary the givens below, e.g. case fouled \"Fouled\": GIVEN = VALUE,\n"
      "# or sweep GIVEN from A to B step S (docs/language.md).\n\n",
      fmt::arg("name", f.name), fmt::arg("ext", kDeckExt), fmt::arg("prefix", prefix));
  d += fmt::format("title {}\n", Quote("Tag and service (edit): " + info.title));
  for (const char* key : {"project", "number", "revision", "date", "client", "prepared", "checked",
                          "approved", "status"}) {
    const std::string value = std::string(key) == "revision" ? "A"
                              : std::string(key) == "status" ? "Draft"
                                                             : "";
    d += fmt::format("meta {:<9}{}\n", key, Quote(value));
  }

  std::string section = "\x01";  // no section yet
  for (const auto& in : info.inputs) {
    if (in.section != section) {
      section = in.section;
      d += fmt::format("\nsection {}\n\n", Quote(section.empty() ? "Inputs" : section));
    }
    std::string line = fmt::format("given {:<{}} = {:<16}", in.name, width, in.literal);
    if (!in.description.empty()) line += " " + Quote(in.description);
    if (!in.source.empty()) line += " source " + Quote(in.source);
    d += line + "\n";
  }

  d += fmt::format("\nsection {}\n\n", Quote("Calculation"));
  d += fmt::format("use {} as {}", Quote("stdlib/" + f.name + kDeckExt), prefix);
  for (size_t i = 0; i < info.inputs.size(); ++i) {
    d += fmt::format("{} \\\n    {} = {}", i == 0 ? " with" : ",", info.inputs[i].name,
                     info.inputs[i].name);
  }
  d += "\n";

  if (!info.results.empty()) {
    d += fmt::format("\nsection {}\n\n", Quote(kResultsSection));
    size_t rhs = 0, unit = 0;
    for (const auto& r : info.results) {
      rhs = std::max(rhs, prefix.size() + 1 + r.name.size());
      unit = std::max(unit, r.unit.size());
    }
    for (const auto& r : info.results) {
      std::string line = fmt::format("{:<{}} = {:<{}}", r.name, width, prefix + "." + r.name, rhs);
      if (unit > 0) line += fmt::format(" {:<{}}", r.unit.empty() ? "" : "in " + r.unit, unit + 3);
      if (!r.description.empty()) line += " " + Quote(r.description);
      while (!line.empty() && line.back() == ' ') line.pop_back();
      d += line + "\n";
    }
    const auto& first = info.results.front();
    const std::string limit = ExampleLimit(f, first.name, stdlib_dir);
    if (!limit.empty()) {
      d += fmt::format("\ncheck {} >= {}{}  {}\n", first.name, limit,
                       first.unit.empty() ? "" : " " + first.unit,
                       Quote("Example acceptance check: replace the limit with this job's "
                             "requirement"));
    }
  }
  return d;
}

// The template named on the command line: "double_pipe", "double_pipe.deck"
// or "stdlib/double_pipe.deck".
const TemplateFile* FindTemplate(const std::vector<TemplateFile>& lib, std::string name) {
  if (name.rfind("stdlib/", 0) == 0) name = name.substr(7);
  const size_t ext = std::strlen(kDeckExt);
  if (name.size() > ext && name.compare(name.size() - ext, ext, kDeckExt) == 0) {
    name.resize(name.size() - ext);
  }
  for (const TemplateFile& f : lib) {
    if (f.name == name) return &f;
  }
  return nullptr;
}

}  // namespace

int RunTemplates(const std::string& stdlib_dir, Streams io) {
  std::vector<TemplateFile> lib;
  std::string why;
  if (!LoadLibrary(stdlib_dir, &lib, &why)) {
    io.err << "heatdeck: " << why << "\n";
    return kUsage;
  }
  if (lib.empty()) {
    io.err << "heatdeck: the template library is empty\n";
    return kUsage;
  }
  for (const TemplateFile& f : lib) {
    TemplateInfo info;
    if (!ReadTemplate(f, &info, &why)) {
      io.out << fmt::format("{}\n    (does not parse: {})\n", f.name, why);
      continue;
    }
    io.out << fmt::format("{:<16} {}\n", f.name, info.title);
    if (!info.first_narrative.empty()) io.out << Wrap(info.first_narrative, 4, kListWidth);
  }
  io.out << "\n'heatdeck new NAME [FILE]' starts a deck that uses a template; in a deck, write\n"
            "use \"stdlib/NAME.deck\" as PREFIX with INPUT = EXPR, ...\n";
  return kOk;
}

int RunNew(const std::string& name, const std::string& file, const std::string& stdlib_dir,
           Streams io) {
  std::vector<TemplateFile> lib;
  std::string why;
  if (!LoadLibrary(stdlib_dir, &lib, &why)) {
    io.err << "heatdeck: " << why << "\n";
    return kUsage;
  }
  const TemplateFile* f = FindTemplate(lib, name);
  if (f == nullptr) {
    std::vector<std::string> names;
    for (const TemplateFile& t : lib) names.push_back(t.name);
    const std::string near = NearestName(name, names);
    io.err << fmt::format("heatdeck: no template '{}'{}; 'heatdeck templates' lists them\n", name,
                          near.empty() ? "" : fmt::format(" (did you mean '{}'?)", near));
    return kUsage;
  }
  TemplateInfo info;
  if (!ReadTemplate(*f, &info, &why)) {
    io.err << fmt::format("heatdeck: the template '{}' does not parse:\n{}", f->name, why);
    return kDeckErrors;
  }
  const std::string text = NewDeckText(*f, info, stdlib_dir);
  if (file.empty()) {
    io.out << text;
    return kOk;
  }
  // "x": create only, so an existing deck is never overwritten, even by a
  // file that appears between a check and the write.
  std::FILE* out = std::fopen(file.c_str(), "wx");
  if (out == nullptr) {
    const int err = errno;
    io.err << (err == EEXIST
                   ? fmt::format(
                         "heatdeck: '{}' exists; 'heatdeck new' does not overwrite a file\n", file)
                   : fmt::format("heatdeck: cannot write '{}': {}\n", file, std::strerror(err)));
    return kUsage;
  }
  const bool written = std::fwrite(text.data(), 1, text.size(), out) == text.size();
  if (std::fclose(out) != 0 || !written) {
    io.err << fmt::format("heatdeck: cannot write '{}'\n", file);
    return kUsage;
  }
  io.out << fmt::format(
      "{}: a deck using {}{} ({} inputs, {} results); edit the values, then 'heatdeck check {}'\n",
      file, f->name, kDeckExt, info.inputs.size(), info.results.size(), file);
  return kOk;
}

}  // namespace heatdeck::cli
