// The Markdown twin of the HTML report, written for version control: every
// quantity, check and input on one table row of its own, rows in deck order,
// numbers formatted as in the HTML, and no timestamp, so that changing one
// input changes exactly the rows of that input and of what depends on it.
#include "report/markdown_writer.h"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "report/report_common.h"

namespace heatdeck {

namespace report {
namespace {

// Text from the deck as inert Markdown: every character that could start
// markup (emphasis, links, raw HTML, table cells, code) is backslash-escaped
// and line breaks become spaces, so a description can never open a tag, a
// link or a new table cell.
std::string Esc(std::string_view s) {
  std::string out;
  for (char c : s) {
    switch (c) {
      case '\\':
      case '`':
      case '*':
      case '_':
      case '[':
      case ']':
      case '<':
      case '>':
      case '|':
      case '&':
      case '#':
      case '!':
        out += '\\';
        out += c;
        break;
      case '\n':
      case '\r':
        out += ' ';
        break;
      default:
        out += c;
    }
  }
  return out;
}

// A paragraph of deck text: Esc(), and a line start that would make a list,
// a heading underline or a numbered item ("- ", "+ ", "=", "3. ") is
// escaped too.
std::string EscParagraph(std::string_view s) {
  std::string out = Esc(s);
  if (out.empty()) return out;
  if (out[0] == '-' || out[0] == '+' || out[0] == '=') return "\\" + out;
  size_t i = 0;
  while (i < out.size() && out[i] >= '0' && out[i] <= '9') ++i;
  if (i > 0 && i < out.size() && (out[i] == '.' || out[i] == ')')) out.insert(i, "\\");
  return out;
}

// A code span that survives any content: a fence longer than the longest
// run of backticks inside, and '|' escaped as GitHub tables require.
std::string Code(std::string_view s) {
  size_t longest = 0, run = 0;
  std::string body;
  for (char c : s) {
    run = c == '`' ? run + 1 : 0;
    longest = std::max(longest, run);
    if (c == '|')
      body += "\\|";
    else if (c == '\n' || c == '\r')
      body += ' ';
    else
      body += c;
  }
  const std::string fence(longest + 1, '`');
  const bool pad = !body.empty() && (body.front() == '`' || body.back() == '`');
  return fence + (pad ? " " : "") + body + (pad ? " " : "") + fence;
}

std::string Row(const std::vector<std::string>& cells) {
  std::string s = "|";
  for (const std::string& c : cells) s += " " + c + " |";
  return s + "\n";
}

// Header and alignment rows; a column whose name starts with '>' is right
// aligned (the '>' is not printed).
std::string Header(const std::vector<std::string>& cols) {
  std::vector<std::string> names, rule;
  for (const std::string& c : cols) {
    const bool right = !c.empty() && c[0] == '>';
    names.push_back(right ? c.substr(1) : c);
    rule.push_back(right ? "--:" : "---");
  }
  return Row(names) + Row(rule);
}

class MarkdownReport {
 public:
  explicit MarkdownReport(const Results& r) : r_(r), m_(*r.model) {}

  std::string Build() {
    TitleBlock();
    Summary();
    SignOff();
    out_ += "> **Caution.** " + Esc(kSafetyCaution) + "\n\n";
    Contents();
    for (size_t i = 0; i < m_.sections.size(); ++i) SectionBlock(i);
    if (r_.cases.size() > 1) Cases();
    if (HasSweepRows()) Sweeps();
    Appendix();
    return out_;
  }

 private:
  const CaseResult& Base() const { return r_.cases.front(); }

  std::string Title() const { return m_.title.empty() ? "Calculation report" : m_.title; }

  std::string ValueOrDash(const std::string& v) const { return v.empty() ? "—" : v; }

  void TitleBlock() {
    out_ += "# " + Esc(Title()) + "\n\n";
    out_ += Header({"Field", "Value"});
    for (const MetaField& f : TitleFields()) out_ += Row({f.label, Esc(MetaValue(r_, f.key))});
    out_ += "\n";
    bool any = false;
    for (const auto& [k, v] : m_.meta) {
      if (IsPlacedMetaKey(k)) continue;
      if (!any) out_ += Header({"Other field", "Value"});
      any = true;
      out_ += Row({Esc(k), Esc(v)});
    }
    if (any) out_ += "\n";
  }

  void Summary() {
    out_ += "## Checks summary\n\n";
    int passed = 0, failed = 0, not_eval = 0, warnings = 0;
    for (const CaseResult& c : r_.cases) {
      const CheckTally t = Tally(m_, c);
      passed += t.passed;
      failed += t.failed;
      not_eval += t.not_evaluated;
      warnings += t.warnings;
    }
    const int total = passed + failed + not_eval;
    std::string headline;
    if (total == 0)
      headline = "No acceptance checks in this calculation.";
    else if (failed > 0)
      headline = fmt::format("{} of {} check results FAIL.", failed, total);
    else if (not_eval > 0)
      headline = "Not every check could be evaluated.";
    else if (r_.cases.size() > 1)
      headline = fmt::format("All checks pass in all {} cases.", r_.cases.size());
    else
      headline = total == 1 ? "The check passes." : fmt::format("All {} checks pass.", total);
    out_ += "**" + headline + "** ";
    out_ += fmt::format("{} passed, {} failed, ", passed, failed);
    if (not_eval > 0) out_ += fmt::format("{} not evaluated, ", not_eval);
    out_ += fmt::format("{} {}.\n\n", warnings, warnings == 1 ? "warning" : "warnings");
    if (r_.cases.size() > 1) {
      out_ += Header({"Case", ">Passed", ">Failed", ">Not evaluated", ">Warnings"});
      for (const CaseResult& c : r_.cases) {
        const CheckTally t = Tally(m_, c);
        out_ += Row({Esc(c.name), fmt::format("{}", t.passed), fmt::format("{}", t.failed),
                     fmt::format("{}", t.not_evaluated), fmt::format("{}", t.warnings)});
      }
      out_ += "\n";
    }
    bool any = false;
    for (const CaseResult& c : r_.cases) {
      for (size_t i = 0; i < m_.checks.size() && i < c.checks.size(); ++i) {
        if (CheckVerdict(c.checks[i]) != Verdict::kFail) continue;
        if (!any) out_ += "Failed checks:\n\n";
        any = true;
        out_ +=
            fmt::format("- C{}{}: {}\n", i + 1,
                        r_.cases.size() > 1 ? " (case " + Esc(c.name) + ")" : "", CheckLabel(i));
      }
    }
    if (any) out_ += "\n";
  }

  std::string CheckLabel(size_t i) const {
    const CheckDef& d = m_.checks[i];
    return d.description.empty() ? Code(SymbolicText(m_, *d.expr)) : Esc(d.description);
  }

  void SignOff() {
    out_ += "## Revision and sign-off\n\n";
    out_ += Header({"Role", "Name", "Signature", "Date"});
    for (const MetaField& role : SignOffRoles())
      out_ += Row({role.label, Esc(MetaValue(r_, role.key)), "", ""});
    out_ += "\n";
  }

  void Contents() {
    out_ += "## Contents\n\n";
    int n = 0;
    for (const Section& sec : m_.sections) {
      if (SectionShown(sec)) out_ += fmt::format("{}. {}\n", ++n, Esc(SectionTitle(sec)));
    }
    if (r_.cases.size() > 1) out_ += fmt::format("{}. Cases compared\n", ++n);
    if (HasSweepRows()) out_ += fmt::format("{}. Parameter study\n", ++n);
    out_ += fmt::format("{}. Appendix: inputs, units, methods, warnings\n\n", ++n);
  }

  // ---- sections ----

  enum class Block { kNone, kCalcs, kChecks };

  void SectionBlock(size_t si) {
    const Section& sec = m_.sections[si];
    if (!SectionShown(sec)) return;
    const int number = SectionNumbers(m_)[si];
    out_ += fmt::format("## {} {}\n\n", number, Esc(SectionTitle(sec)));
    if (r_.cases.size() > 1 && number == 1)
      out_ += "Values in the sections are those of case " + Esc(Base().name) + ".\n\n";
    size_t k = 0;
    for (; k < sec.items.size() && sec.items[k].kind == Section::Item::Kind::kNarrative; ++k)
      out_ += EscParagraph(m_.narrative[static_cast<size_t>(sec.items[k].index)]) + "\n\n";
    InputsTable(sec);
    // A table runs while items of its kind follow each other; anything else
    // (narrative, a solve, a figure) closes it.
    Block open = Block::kNone;
    bool calcs_titled = false, checks_titled = false;
    auto close = [&] {
      if (open != Block::kNone) out_ += "\n";
      open = Block::kNone;
    };
    for (; k < sec.items.size(); ++k) {
      const Section::Item& it = sec.items[k];
      switch (it.kind) {
        case Section::Item::Kind::kNarrative:
          close();
          out_ += EscParagraph(m_.narrative[static_cast<size_t>(it.index)]) + "\n\n";
          break;
        case Section::Item::Kind::kQuantity:
          if (m_.quantities[static_cast<size_t>(it.index)].kind != QuantityKind::kCalc) break;
          if (open != Block::kCalcs) {
            close();
            if (!calcs_titled) out_ += "### Calculations\n\n";
            calcs_titled = true;
            out_ += Header(
                {"Symbol", "Equation", "With values", ">Result", "Unit", "Description", "Notes"});
            open = Block::kCalcs;
          }
          CalcRow(it.index);
          break;
        case Section::Item::Kind::kCheck:
          if (open != Block::kChecks) {
            close();
            if (!checks_titled) out_ += "### Acceptance checks\n\n";
            checks_titled = true;
            out_ += Header({"No.", "Criterion", ">Evaluated", ">Margin", "Result", "Description"});
            open = Block::kChecks;
          }
          CheckRow(it.index);
          break;
        case Section::Item::Kind::kSolve:
          close();
          Solve(it.index);
          break;
        case Section::Item::Kind::kProfile:
          close();
          Profile(it.index);
          break;
      }
    }
    close();
  }

  void InputsTable(const Section& sec) {
    bool any = false;
    for (const Section::Item& it : sec.items) {
      if (it.kind != Section::Item::Kind::kQuantity) continue;
      const Quantity& q = m_.quantities[static_cast<size_t>(it.index)];
      if (q.kind != QuantityKind::kGiven) continue;
      if (!any) {
        out_ += "### Inputs\n\n";
        out_ += Header({"Symbol", "Description", ">Value", "Unit", "Source"});
      }
      any = true;
      std::string source = Esc(q.source);
      if (q.template_default) source += source.empty() ? "template default" : " (template default)";
      out_ += Row({Code(q.name), Esc(q.description),
                   ValueOrDash(QuantityValueText(m_, Base(), it.index)), PrettyUnit(q.display.text),
                   source});
    }
    if (any) out_ += "\n";
  }

  std::string Notes(int q, const Expr* e) const {
    std::vector<std::string> notes;
    if (e != nullptr) {
      for (const library::FunctionInfo* f : MethodsIn(m_, *e))
        notes.push_back("method " + Code(f->name) + " (A.4)");
      for (int t : TablesIn(m_, *e))
        notes.push_back("table " + Code(m_.tables[static_cast<size_t>(t)].name) + " (A.1)");
    }
    using Kind = QuantityMessage::Kind;
    for (auto [kind, label] :
         {std::pair{Kind::kError, "**error:** "}, std::pair{Kind::kWarning, "**warning:** "},
          std::pair{Kind::kNote, "note: "}}) {
      for (const QuantityMessage* msg : MessagesOf(Base(), q, kind))
        notes.push_back(label + Esc(msg->text));
    }
    std::string s;
    for (const std::string& n : notes) s += (s.empty() ? "" : "; ") + n;
    return s;
  }

  void CalcRow(int q) {
    const Quantity& qq = m_.quantities[static_cast<size_t>(q)];
    const std::string v = QuantityValueText(m_, Base(), q);
    out_ += Row({Code(qq.name), qq.expr != nullptr ? Code(SymbolicText(m_, *qq.expr)) : "",
                 qq.expr != nullptr ? Code(SubstitutedText(m_, Base(), *qq.expr)) : "",
                 v.empty() ? "**not evaluated**" : "**" + v + "**", PrettyUnit(qq.display.text),
                 Esc(qq.description), Notes(q, qq.expr)});
  }

  void CheckRow(int i) {
    const CheckDef& d = m_.checks[static_cast<size_t>(i)];
    const CheckResult empty;
    const CheckResult& r = static_cast<size_t>(i) < Base().checks.size()
                               ? Base().checks[static_cast<size_t>(i)]
                               : empty;
    const CheckSides s = SidesOf(d, r);
    const Verdict v = CheckVerdict(r);
    out_ += Row({fmt::format("C{}", i + 1), Code(SymbolicText(m_, *d.expr)),
                 s.shown ? WithUnit(s.lhs, s.unit) + " " + ComparisonSign(d.expr->kind) + " " +
                               WithUnit(s.rhs, s.unit)
                         : "—",
                 s.shown ? WithUnit(s.margin, s.margin_unit) : "—",
                 v == Verdict::kFail ? "**FAIL**" : VerdictText(v), Esc(d.description)});
  }

  void Solve(int index) {
    const SolveDef& d = m_.solves[static_cast<size_t>(index)];
    const Quantity& q = m_.quantities[static_cast<size_t>(d.unknown)];
    out_ += "**Solve for " + Code(q.name) + "**";
    if (d.lhs != nullptr && d.rhs != nullptr)
      out_ += " so that " + Code(SymbolicText(m_, *d.lhs) + " = " + SymbolicText(m_, *d.rhs));
    out_ += !q.description.empty() ? " — " + Esc(q.description) + "\n\n" : "\n\n";
    const std::string residual_unit =
        d.lhs != nullptr ? m_.Info(d.lhs).type.dim.SiUnit() : std::string();
    out_ +=
        Header({"Bracket", ">Residual at the ends", ">Iterations", ">Final residual", ">Result"});
    const std::string bracket = FormatInput(q.display.FromSi(d.lo)) + " … " +
                                WithUnit(FormatInput(q.display.FromSi(d.hi)), q.display.text);
    if (static_cast<size_t>(index) >= Base().solves.size()) {
      out_ += Row({bracket, "—", "—", "—", "not evaluated"}) + "\n";
      return;
    }
    const SolveResult& sr = Base().solves[static_cast<size_t>(index)];
    out_ += Row(
        {bracket,
         FormatResult(sr.residual_lo) + " / " +
             WithUnit(FormatResult(sr.residual_hi), residual_unit),
         fmt::format("{}", sr.iterations), WithUnit(FormatResult(sr.residual_si), residual_unit),
         sr.converged
             ? "**" + WithUnit(FormatResult(q.display.FromSi(sr.value_si)), q.display.text) + "**"
             : "**did not converge**"});
    out_ += "\n";
    if (!sr.error.empty()) out_ += "**Error:** " + Esc(sr.error) + "\n\n";
  }

  void Profile(int index) {
    const ProfileDef& d = m_.profiles[static_cast<size_t>(index)];
    const ProfileResult* pr = nullptr;
    for (const ProfileResult& p : ProfilesOf(Base())) {
      if (p.profile == index) pr = &p;
    }
    if (pr == nullptr) return;
    const std::string flow = pr->counterflow ? "counterflow" : "parallel flow";
    out_ +=
        "**Figure: " +
        Esc(d.caption.empty() ? "Temperature profile along the exchanger, " + flow : d.caption) +
        "**\n\n";
    if (!pr->ok) {
      out_ += "Not drawn: " + Esc(pr->error) + "\n\n";
      return;
    }
    const units::Unit& u = m_.quantities[static_cast<size_t>(d.hot_in)].display;
    const std::string unit = u.text.empty() ? "" : " [" + PrettyUnit(u.text) + "]";
    out_ += "Hot stream enters at x = 0; cold stream enters at x = " +
            std::string(pr->counterflow ? "1" : "0") + ".\n\n";
    out_ += Header({">x", ">Hot" + unit, ">Cold" + unit});
    for (size_t i = 0; i < pr->x.size(); ++i) {
      out_ += Row({FormatInput(pr->x[i]),
                   i < pr->hot_si.size() ? FormatResult(u.FromSi(pr->hot_si[i])) : "—",
                   i < pr->cold_si.size() ? FormatResult(u.FromSi(pr->cold_si[i])) : "—"});
    }
    out_ += "\n";
  }

  // ---- cases ----

  void Cases() {
    out_ += "## Cases compared\n\n";
    for (const CaseResult& c : r_.cases)
      out_ += "- **" + Esc(c.name) + "**" +
              (c.description.empty() ? "" : ": " + Esc(c.description)) + "\n";
    out_ += "\n";
    std::vector<std::string> cols = {"Quantity", "Unit"};
    for (const CaseResult& c : r_.cases) cols.push_back(">" + Esc(c.name));
    std::vector<int> inputs, results;
    for (size_t qi = 0; qi < m_.quantities.size(); ++qi) {
      bool differs = false;
      for (size_t ci = 1; ci < r_.cases.size(); ++ci)
        differs = differs || ValuesDiffer(r_.cases[0], r_.cases[ci], static_cast<int>(qi));
      if (differs)
        (m_.quantities[qi].kind == QuantityKind::kGiven ? inputs : results)
            .push_back(static_cast<int>(qi));
    }
    auto table = [&](const char* title, const std::vector<int>& qs) {
      out_ += fmt::format("### {}\n\n", title);
      if (qs.empty()) {
        out_ += "None.\n\n";
        return;
      }
      out_ += Header(cols);
      for (int q : qs) {
        const Quantity& qq = m_.quantities[static_cast<size_t>(q)];
        std::vector<std::string> row = {Code(qq.name), PrettyUnit(qq.display.text)};
        for (const CaseResult& c : r_.cases) {
          const std::string v = ValueOrDash(QuantityValueText(m_, c, q));
          row.push_back(&c != &r_.cases[0] && ValuesDiffer(r_.cases[0], c, q) ? "**" + v + "**"
                                                                              : v);
        }
        out_ += Row(row);
      }
      out_ += "\n";
    };
    table("Inputs that differ", inputs);
    table("Results that differ", results);
    if (m_.checks.empty()) return;
    out_ += "### Checks per case\n\n";
    std::vector<std::string> ccols = {"No.", "Check"};
    for (const CaseResult& c : r_.cases) ccols.push_back(Esc(c.name));
    out_ += Header(ccols);
    for (size_t i = 0; i < m_.checks.size(); ++i) {
      std::vector<std::string> row = {fmt::format("C{}", i + 1), CheckLabel(i)};
      for (const CaseResult& c : r_.cases) {
        const Verdict v = i < c.checks.size() ? CheckVerdict(c.checks[i]) : Verdict::kNotEvaluated;
        row.push_back(v == Verdict::kFail ? "**FAIL**" : VerdictText(v));
      }
      out_ += Row(row);
    }
    out_ += "\n";
  }

  // ---- sweeps ----

  bool HasSweepRows() const {
    for (const SweepResult& s : r_.sweeps) {
      if (!s.rows.empty()) return true;
    }
    return false;
  }

  void Sweeps() {
    out_ += "## Parameter study\n\n";
    for (size_t si = 0; si < r_.sweeps.size(); ++si) {
      const SweepResult& s = r_.sweeps[si];
      if (s.rows.empty()) continue;
      std::string swept;
      for (size_t i = 0; i < s.swept.size(); ++i)
        swept += (i > 0 ? ", " : "") + Code(m_.quantities[static_cast<size_t>(s.swept[i])].name);
      out_ += fmt::format("Study {}: {} points varying {}.\n\n", si + 1, s.rows.size(), swept);
      std::vector<std::string> cols = {">#"};
      for (int q : s.columns) {
        const Quantity& qq = m_.quantities[static_cast<size_t>(q)];
        cols.push_back(">" + Code(qq.name) +
                       (qq.display.text.empty() ? "" : " [" + PrettyUnit(qq.display.text) + "]"));
      }
      cols.push_back("Error");
      out_ += Header(cols);
      for (size_t p = 0; p < s.rows.size(); ++p) {
        std::vector<std::string> row = {fmt::format("{}", p + 1)};
        for (size_t k = 0; k < s.columns.size(); ++k) {
          const Quantity& qq = m_.quantities[static_cast<size_t>(s.columns[k])];
          const double v = k < s.rows[p].size() ? qq.display.FromSi(s.rows[p][k]) : NAN;
          row.push_back(qq.kind == QuantityKind::kGiven ? FormatInput(v) : FormatResult(v));
        }
        row.push_back(p < s.row_errors.size() ? Esc(s.row_errors[p]) : "");
        out_ += Row(row);
      }
      out_ += "\n";
    }
  }

  // ---- appendix ----

  void Appendix() {
    out_ += "## Appendix\n\n### A.1 Input files\n\n";
    out_ += Header({"File", "SHA-256"});
    for (const InputFile& f : r_.files) out_ += Row({Esc(f.path), Code(f.sha256)});
    out_ += "\n";
    if (!m_.tables.empty()) {
      out_ += Header({"Table", "File", "Source"});
      for (const TableDef& t : m_.tables)
        out_ +=
            Row({Code(t.name), Esc(t.path), Esc(t.stmt != nullptr ? t.stmt->attrs.source : "")});
      out_ += "\n";
    }
    out_ += "### A.2 Tool\n\n";
    out_ += "Produced by heatdeck " + Esc(r_.tool_version) + " from " + Esc(r_.deck_path) + ".";
    out_ += r_.date.empty() ? " No report date was given.\n\n"
                            : " Report date " + Esc(r_.date) + ".\n\n";

    out_ += "### A.3 Units and their SI conversion\n\nValue in SI = value × factor + offset.\n\n";
    out_ += Header({"Unit", "Written in the deck", "SI unit", ">Factor", ">Offset"});
    for (const UnitUse& u : UnitsUsed(m_)) {
      out_ +=
          Row({PrettyUnit(u.text), Code(u.text), u.si_unit.empty() ? "1" : PrettyUnit(u.si_unit),
               units::FormatExact(u.factor), u.offset == 0 ? "" : units::FormatExact(u.offset)});
    }
    out_ += "\n### A.4 Methods\n\n";
    const auto methods = MethodsUsed(m_);
    if (methods.empty()) {
      out_ += "No library method is used.\n\n";
    } else {
      out_ += Header({"Function", "Formula", "Published source", "Validity"});
      for (const library::FunctionInfo* f : methods)
        out_ += Row({Code(f->name), Code(f->formula), Esc(f->source), Esc(f->validity)});
      out_ += "\n";
    }
    out_ += "### A.5 Warnings and messages\n\n";
    bool any = false;
    for (const CaseResult& c : r_.cases) {
      for (size_t q = 0; q < c.messages.size() && q < m_.quantities.size(); ++q) {
        for (const QuantityMessage& msg : c.messages[q]) {
          if (!any) out_ += Header({"Case", "Quantity", "Kind", "Message"});
          any = true;
          out_ += Row({Esc(c.name), Code(m_.quantities[q].name),
                       msg.kind == QuantityMessage::Kind::kWarning ? "warning"
                       : msg.kind == QuantityMessage::Kind::kError ? "**error**"
                                                                   : "note",
                       Esc(msg.text)});
        }
      }
    }
    out_ += any ? "\n" : "No warnings were recorded.\n";
  }

  const Results& r_;
  const Model& m_;
  std::string out_;
};

}  // namespace
}  // namespace report

bool WriteMarkdown(const Results& results, std::string* out, std::string* error) {
  if (results.model == nullptr || results.cases.empty()) {
    *error = "nothing was evaluated, so there is no report to write";
    return false;
  }
  *out = report::MarkdownReport(results).Build();
  return true;
}

}  // namespace heatdeck
