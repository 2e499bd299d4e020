// The report is built as a DOM with pugixml, so every text from the deck
// (titles, descriptions, narrative, sources) is escaped by construction; no
// string is ever spliced into markup.  One self-contained file: inline CSS,
// MathML for equations and inline SVG for figures, no script, nothing fetched.
#include "report/html_writer.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>
#include <sstream>

#include <fmt/format.h>
#include <pugixml.hpp>

#include "report/report_common.h"
#include "report/svg_plot.h"

namespace heatdeck {

namespace report {
namespace {

using pugi::xml_node;

// Layout and print rules.  Sized for the narrower A4 width and the shorter
// Letter height so that either paper prints without scaling.  The running
// header is a fixed element (repeated on every printed page by Chromium);
// the spacer row in the repeating <thead> of the page table keeps the text
// of every page clear of it.  The text holds no '>' or '&', which the DOM
// would escape inside <style>.
constexpr char kCss[] = R"css(
:root {
  --ink: #1b2029; --muted: #5a6372; --rule: #c5cbd3; --faint: #eef1f4;
  --accent: #24476b; --pass: #1c6a3a; --pass-bg: #e7f3ea;
  --fail: #a11d17; --fail-bg: #fbe7e5; --warn: #7d5200; --warn-bg: #fff4d8;
}
* { box-sizing: border-box; }
html { color: var(--ink); background: #f4f5f7; }
body {
  margin: 0; font-family: "Lato", "Liberation Sans", "DejaVu Sans", Arial, sans-serif;
  font-size: 10pt; line-height: 1.4; font-variant-numeric: tabular-nums;
}
math { font-family: "DejaVu Math TeX Gyre", "STIX Two Math", "Cambria Math", math; font-size: 1.08em; }
table.page { width: 100%; border-collapse: collapse; margin: 0; }
table.page td.page-head, table.page td.page-body { padding: 0; border: 0; }
table.page tr.page-row { break-inside: auto; }
.page-spacer { height: 0; }
.report { max-width: 188mm; margin: 0 auto; padding: 10mm 12mm 16mm; background: #fff; }
.running-head {
  display: flex; justify-content: space-between; gap: 8mm; max-width: 188mm; margin: 0 auto;
  padding: 2.2mm 12mm 1.6mm; font-size: 8pt; color: var(--muted); background: #fff;
  border-bottom: 0.6pt solid var(--rule);
}
.running-head .rh-ref { white-space: nowrap; }
h1 { font-size: 17pt; line-height: 1.2; margin: 0 0 3mm; color: var(--accent); font-weight: 700; }
h2 {
  font-size: 13pt; margin: 8mm 0 3mm; padding-bottom: 1mm; color: var(--accent);
  border-bottom: 1.2pt solid var(--accent); break-after: avoid;
}
h2 .num { display: inline-block; min-width: 9mm; }
h3 { font-size: 10.5pt; margin: 5mm 0 2mm; color: var(--ink); break-after: avoid; }
p { margin: 0 0 2mm; }
.muted { color: var(--muted); }
.nowrap { white-space: nowrap; }
.title-block { border: 1pt solid var(--ink); padding: 4mm 5mm 3mm; margin-bottom: 4mm; break-inside: avoid; }
.fields { display: grid; grid-template-columns: repeat(3, 1fr); gap: 2mm 6mm; }
.field .label, .field-label {
  font-size: 7.5pt; text-transform: uppercase; letter-spacing: 0.06em; color: var(--muted);
}
.field .value { min-height: 5mm; border-bottom: 0.5pt solid var(--rule); font-weight: 600; }
.field .value.empty { font-weight: 400; color: var(--muted); }
.other-fields { margin-top: 3mm; }
table { border-collapse: collapse; width: 100%; margin: 1mm 0 3mm; }
th, td { text-align: left; vertical-align: top; padding: 1.2mm 2mm; border-bottom: 0.5pt solid var(--rule); }
th { font-size: 8pt; font-weight: 700; color: var(--muted); background: var(--faint); border-bottom: 0.8pt solid var(--ink); }
tr { break-inside: avoid; }
table[data-keep], .section-intro { break-inside: avoid; }
td.num, th.num { text-align: right; white-space: nowrap; }
td.unit { white-space: nowrap; }
td.src, .small { font-size: 8.5pt; color: var(--muted); }
table.signoff td { height: 10mm; vertical-align: bottom; }
table.signoff td.role { font-weight: 700; vertical-align: middle; width: 22mm; }
table.signoff td.blank { border-bottom: 0.6pt solid var(--ink); }
.caution {
  border-left: 2.5pt solid var(--warn); background: var(--warn-bg); padding: 2mm 4mm;
  margin: 3mm 0; font-size: 9pt; break-inside: avoid;
}
.caution strong { color: var(--warn); }
.verdict { border: 1pt solid var(--rule); padding: 3mm 4mm; margin: 0 0 4mm; break-inside: avoid; }
.verdict.ok { border-color: var(--pass); background: var(--pass-bg); }
.verdict.bad { border-color: var(--fail); background: var(--fail-bg); }
.verdict .headline { font-size: 13pt; font-weight: 700; margin-bottom: 1mm; }
.verdict.ok .headline { color: var(--pass); }
.verdict.bad .headline { color: var(--fail); }
.counts { display: flex; flex-wrap: wrap; gap: 2mm 6mm; }
.count b { font-size: 11pt; }
.verdict table { background: #fff; margin-top: 2mm; }
.verdict ul { margin: 1.5mm 0 0; padding-left: 5mm; }
nav.contents ul { margin: 0; padding-left: 0; list-style: none; columns: 2; column-gap: 10mm; }
nav.contents a { color: var(--ink); text-decoration: none; }
.narrative { max-width: 165mm; }
.sym { white-space: nowrap; }
.sym .it { font-style: italic; font-family: "DejaVu Serif", "Liberation Serif", serif; }
.sym sub { font-size: 0.72em; }
.sym .pfx { color: var(--muted); font-size: 0.9em; }
.badge {
  display: inline-block; padding: 0.2mm 2mm; border-radius: 1mm; font-size: 8pt;
  font-weight: 700; letter-spacing: 0.04em; white-space: nowrap;
}
.badge.pass { color: var(--pass); border: 0.7pt solid var(--pass); }
.badge.fail { color: #fff; background: var(--fail); border: 0.7pt solid var(--fail); }
.badge.na { color: var(--warn); border: 0.7pt solid var(--warn); }
.badge.tag { color: var(--muted); border: 0.5pt solid var(--rule); font-weight: 400; }
tr.failed td { background: var(--fail-bg); }
tr.failed td:first-child { box-shadow: inset 2.5pt 0 0 var(--fail); }
.eq {
  position: relative; border-top: 0.5pt solid var(--rule); padding: 2mm 0 2.5mm;
  break-inside: avoid;
}
.eq .ref { position: absolute; top: 2mm; right: 0; }
.eq.long .eq-lines { font-size: 0.86em; }
.eq.very-long .eq-lines { font-size: 0.72em; }
.eq-head { display: flex; gap: 3mm; align-items: baseline; margin-bottom: 1mm; }
.eq-head .desc { font-weight: 600; }
.eq-head .ref, .eq .ref { margin-left: auto; font-size: 7.5pt; color: var(--muted); white-space: nowrap; }
.eq-lines {
  display: grid; grid-template-columns: max-content 6mm minmax(0, 1fr); align-items: center;
  row-gap: 1.2mm; padding-left: 4mm;
}
.eq-rel { text-align: center; }
.eq-lines .result { font-weight: 700; font-size: 10.5pt; white-space: nowrap; }
.eq-lines .failed-value { color: var(--fail); font-weight: 700; }
mtext.u { color: #3a4350; }
.eq-notes { margin: 1.2mm 0 0 4mm; font-size: 8.5pt; }
.eq-notes div { margin-top: 0.6mm; }
.method { color: var(--muted); }
.method code, .appendix code { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 8pt; }
.msg { padding: 0.6mm 2mm; border-left: 2pt solid; }
.msg.warning { border-color: var(--warn); background: var(--warn-bg); color: var(--warn); }
.msg.error { border-color: var(--fail); background: var(--fail-bg); color: var(--fail); }
.msg.note { border-color: var(--rule); color: var(--muted); }
.solve { border: 0.6pt solid var(--rule); padding: 2mm 3mm; margin: 2mm 0 3mm; break-inside: avoid; }
figure { margin: 3mm 0 4mm; break-inside: avoid; }
figure svg.plot { width: 100%; max-width: 150mm; height: auto; display: block; }
figcaption { font-size: 8.5pt; color: var(--muted); margin-top: 1mm; }
.plots { display: grid; grid-template-columns: repeat(auto-fill, minmax(82mm, 1fr)); gap: 2mm 6mm; }
.plots figure { margin: 0 0 2mm; }
td.changed { background: var(--warn-bg); font-weight: 700; }
.cases-table th.case { text-align: right; }
.appendix td.hash { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 7.5pt; word-break: break-all; }
@page { size: auto; margin: 11mm 13mm 13mm 13mm; }
@media print {
  html, .report { background: #fff; }
  .report { max-width: none; padding: 0; }
  .running-head {
    position: fixed; top: 0; left: 0; right: 0; max-width: none; padding: 0 0 1.2mm;
  }
  .page-spacer { height: 9mm; }
  h2 { break-before: auto; }
  section.appendix { break-before: page; }
  a { color: inherit; text-decoration: none; }
}
@media screen {
  .report { box-shadow: 0 0 3mm rgba(0, 0, 0, 0.12); margin-bottom: 10mm; }
}
)css";

// Tables up to this many rows are kept on one printed page rather than
// leaving a row or two alone on the next.
constexpr size_t kKeepWholeRows = 14;

xml_node Add(xml_node parent, const char* tag, const char* cls = nullptr) {
  xml_node n = parent.append_child(tag);
  if (cls != nullptr) n.append_attribute("class") = cls;
  return n;
}

void Text(xml_node parent, const std::string& text) {
  parent.append_child(pugi::node_pcdata).set_value(text.c_str());
}

xml_node AddText(xml_node parent, const char* tag, const std::string& text,
                 const char* cls = nullptr) {
  xml_node n = Add(parent, tag, cls);
  Text(n, text);
  return n;
}

// A line break in the saved source between block elements, for people who
// read the file; the browser ignores it.
void Newline(xml_node parent) { Text(parent, "\n"); }

// "1.800e-05" -> mantissa "1.800", exponent "-5"; false when v has no exponent.
bool SplitExponent(const std::string& v, std::string* mantissa, std::string* exponent) {
  const size_t e = v.find('e');
  if (e == std::string::npos) return false;
  *mantissa = v.substr(0, e);
  const int x = std::atoi(v.c_str() + e + 1);
  *exponent = x < 0 ? fmt::format("−{}", -x) : fmt::format("{}", x);
  return true;
}

std::string MinusSign(const std::string& v) {
  if (!v.empty() && v[0] == '-') return "−" + v.substr(1);
  return v;
}

// A number in running text: exponent form printed as "1.800×10⁻⁵".
void AppendNumber(xml_node parent, const std::string& v) {
  std::string mantissa, exponent;
  if (SplitExponent(v, &mantissa, &exponent)) {
    Text(parent, MinusSign(mantissa) + "×10");
    AddText(parent, "sup", exponent);
    return;
  }
  Text(parent, MinusSign(v));
}

// Value and unit kept on one line (a no-break space between them).
void AppendValueUnit(xml_node parent, const std::string& value, const std::string& unit) {
  xml_node span = Add(parent, "span", "nowrap");
  AppendNumber(span, value);
  if (!unit.empty()) Text(span, "\u00a0" + PrettyUnit(unit));
}

bool IsSingleLetter(const std::string& s) {
  if (s.size() == 1) return true;
  // One Greek letter: two bytes of UTF-8 in the Greek block.
  return s.size() == 2 && static_cast<unsigned char>(s[0]) >= 0xCE &&
         static_cast<unsigned char>(s[0]) <= 0xCF;
}

// A quantity symbol in HTML text: single letters italic, names upright,
// subscripts upright (descriptive labels).
void AppendSymbol(xml_node parent, std::string_view name) {
  const Symbol s = SplitSymbol(name);
  xml_node span = Add(parent, "span", "sym");
  if (!s.prefix.empty()) AddText(span, "span", s.prefix, "pfx");
  if (IsSingleLetter(s.base))
    AddText(span, "span", s.base, "it");
  else
    Text(span, s.base);
  if (!s.subscript.empty()) AddText(span, "sub", s.subscript);
}

// Plot labels: subscripts as "_{…}" (svg_plot.h).
std::string PlotSymbol(std::string_view name) {
  const Symbol s = SplitSymbol(name);
  return s.prefix + s.base + (s.subscript.empty() ? "" : "_{" + s.subscript + "}");
}

std::string PlotAxisLabel(std::string_view name, const std::string& unit) {
  const std::string sym = PlotSymbol(name);
  return unit.empty() ? sym : fmt::format("{} [{}]", sym, PrettyUnit(unit));
}

// ---- MathML ------------------------------------------------------------------

// As the language's precedence, except that a fraction is drawn as one
// block and so never needs parentheses around it.
int MathPrecedence(ExprKind k) { return k == ExprKind::kDiv ? 9 : Precedence(k); }

// <math> in display style, so that fractions keep full-size text.
xml_node MathElement(xml_node parent) {
  xml_node math = Add(parent, "math");
  math.append_attribute("displaystyle") = "true";
  return math;
}

class MathWriter {
 public:
  // c == nullptr: symbolic; otherwise quantities are replaced by their
  // values in case *c.
  MathWriter(const Model& m, const CaseResult* c) : m_(m), c_(c) {}

  xml_node Math(xml_node parent, const heatdeck::Expr& e) {
    xml_node math = MathElement(parent);
    Node(Add(math, "mrow"), e);
    return math;
  }

  void Node(xml_node row, const heatdeck::Expr& e) {
    switch (e.kind) {
      case ExprKind::kNumber:
        Value(row, e.text, e.unit, false);
        return;
      case ExprKind::kName:
        Name(row, e);
        return;
      case ExprKind::kCall:
        Call(row, e);
        return;
      case ExprKind::kNeg:
        Op(row, "−");
        Child(row, *e.args[0], MathPrecedence(ExprKind::kNeg), true, true);
        return;
      case ExprKind::kNot:
        Op(row, "not");
        Child(row, *e.args[0], MathPrecedence(ExprKind::kNot), true, true);
        return;
      case ExprKind::kDiv: {
        xml_node frac = Add(row, "mfrac");
        Node(Add(frac, "mrow"), *e.args[0]);
        Node(Add(frac, "mrow"), *e.args[1]);
        return;
      }
      case ExprKind::kPow: {
        xml_node sup = Add(row, "msup");
        xml_node base = Add(sup, "mrow");
        Child(base, *e.args[0], MathPrecedence(ExprKind::kPow), true, false);
        Node(Add(sup, "mrow"), *e.args[1]);
        return;
      }
      default: {
        const int p = MathPrecedence(e.kind);
        Child(row, *e.args[0], p, false, false);
        const char* sign = e.kind == ExprKind::kMul   ? "·"
                           : e.kind == ExprKind::kAnd ? "and"
                           : e.kind == ExprKind::kOr  ? "or"
                                                      : ComparisonSign(e.kind);
        Op(row, sign);
        // Right operands of '-' (and of comparisons) keep their grouping.
        Child(row, *e.args[1], p, e.kind != ExprKind::kAdd && e.kind != ExprKind::kMul, true);
        return;
      }
    }
  }

 private:
  static void Op(xml_node row, const char* text) { AddText(row, "mo", text); }

  // Fences stretch to the height of the row they are in: each pair gets a
  // row of its own, so that it grows with what it encloses and not with a
  // fraction beside it.
  void Parens(xml_node row, const heatdeck::Expr& c) {
    xml_node group = Add(row, "mrow");
    Op(group, "(");
    Node(Add(group, "mrow"), c);
    Op(group, ")");
  }

  // Whether a child needs parentheses under a parent of precedence p.
  static bool NeedsParens(const heatdeck::Expr& c, int p, bool strict) {
    const int pc = MathPrecedence(c.kind);
    return pc < p || (strict && pc == p && p < 9);
  }

  void Child(xml_node row, const heatdeck::Expr& c, int p, bool strict, bool right) {
    if (NeedsParens(c, p, strict)) {
      Parens(row, c);
      return;
    }
    // A substituted value with a unit or a sign is one factor: parenthesise
    // it under a product, a power or a sign, and a negative one also as a
    // right operand.
    if (c_ != nullptr && c.kind == ExprKind::kName && ValueNeedsGroup(c, p, right)) {
      Parens(row, c);
      return;
    }
    Node(row, c);
  }

  bool ValueNeedsGroup(const heatdeck::Expr& name, int p, bool right) const {
    auto it = m_.info.find(&name);
    if (it == m_.info.end() || it->second.quantity < 0) return false;
    const int q = it->second.quantity;
    const std::string v = QuantityValueText(m_, *c_, q);
    const std::string& u = m_.quantities[static_cast<size_t>(q)].display.text;
    const bool factor = p >= MathPrecedence(ExprKind::kMul) && p < 9;
    const bool negative = !v.empty() && v[0] == '-';
    // A power's base with any unit: (22 mm)², not 22 mm².
    const bool power_base = p == MathPrecedence(ExprKind::kPow) && !right;
    return (factor && (negative || u.find_first_of("*/^") != std::string::npos)) ||
           (power_base && !u.empty()) || (negative && right);
  }

  // A number with its unit: "2095 W/K", exponent form as "1.8×10⁻⁵".
  void Value(xml_node row, std::string_view value, std::string_view unit, bool failed) {
    std::string mantissa, exponent;
    const std::string v(value);
    if (failed) {
      AddText(row, "mtext", "?", "failed-value");
    } else if (SplitExponent(v, &mantissa, &exponent)) {
      AddText(row, "mn", MinusSign(mantissa));
      Op(row, "×");
      xml_node sup = Add(row, "msup");
      AddText(sup, "mn", "10");
      AddText(sup, "mn", exponent);
    } else if (!v.empty() && v[0] == '-') {
      Op(row, "−");
      AddText(row, "mn", v.substr(1));
    } else {
      AddText(row, "mn", v);
    }
    if (!unit.empty()) {
      xml_node sp = Add(row, "mspace");
      sp.append_attribute("width") = "0.22em";
      AddText(row, "mtext", PrettyUnit(unit), "u");
    }
  }

  void Sym(xml_node row, std::string_view name) {
    const report::Symbol s = SplitSymbol(name);
    if (!s.prefix.empty()) AddText(row, "mi", s.prefix, "pfx");
    if (s.subscript.empty()) {
      AddText(row, "mi", s.base);
      return;
    }
    xml_node sub = Add(row, "msub");
    AddText(sub, "mi", s.base);
    xml_node label = AddText(sub, "mi", s.subscript);
    label.append_attribute("mathvariant") = "normal";
  }

  void Name(xml_node row, const heatdeck::Expr& e) {
    auto it = m_.info.find(&e);
    const int q = it == m_.info.end() ? -1 : it->second.quantity;
    if (q < 0) {
      Sym(row, e.text);  // constants keep their symbol when substituted
      return;
    }
    if (c_ == nullptr) {
      // The full name: a template's "Q" is shown as "hx.Q", as in its tables.
      Sym(row, m_.quantities[static_cast<size_t>(q)].name);
      return;
    }
    const std::string v = QuantityValueText(m_, *c_, q);
    Value(row, v, m_.quantities[static_cast<size_t>(q)].display.text, v.empty());
  }

  void Call(xml_node row, const heatdeck::Expr& e) {
    const std::string_view name = e.text;
    if (name == "sqrt" && e.args.size() == 1) {
      Node(Add(Add(row, "msqrt"), "mrow"), *e.args[0]);
      return;
    }
    if (name == "abs" && e.args.size() == 1) {
      xml_node group = Add(row, "mrow");
      Op(group, "|");
      Node(Add(group, "mrow"), *e.args[0]);
      Op(group, "|");
      return;
    }
    xml_node fn = AddText(row, "mi", std::string(name));
    fn.append_attribute("mathvariant") = "normal";
    Op(row, "\u2061");  // function application
    row = Add(row, "mrow");
    Op(row, "(");
    xml_node args = Add(row, "mrow");
    for (size_t i = 0; i < e.args.size(); ++i) {
      if (i > 0) {
        xml_node comma = AddText(args, "mo", ",");
        comma.append_attribute("separator") = "true";
      }
      Node(args, *e.args[i]);
    }
    Op(row, ")");
  }

  const Model& m_;
  const CaseResult* c_;
};

void AppendMathSymbol(xml_node parent, const Model& m, std::string_view name) {
  // A name as a one-token expression, drawn like any other symbol.
  heatdeck::Expr e;
  e.kind = ExprKind::kName;
  e.text = name;
  xml_node math = MathElement(parent);
  MathWriter(m, nullptr).Node(Add(math, "mrow"), e);
}

bool HasQuantityNames(const Model& m, const Expr& e) {
  if (e.kind == ExprKind::kName) {
    auto it = m.info.find(&e);
    return it != m.info.end() && it->second.quantity >= 0;
  }
  for (const Expr* a : e.args) {
    if (HasQuantityNames(m, *a)) return true;
  }
  return false;
}

// ---- Sweeps ------------------------------------------------------------------

// The values of sweep column `col` (a quantity index) per point, in SI: from
// the rows when the quantity is a column, else from the grid position.
std::vector<double> SweptValues(const Model& m, const SweepResult& s, int quantity) {
  std::vector<double> out(s.rows.size(), NAN);
  for (size_t k = 0; k < s.columns.size(); ++k) {
    if (s.columns[k] != quantity) continue;
    for (size_t p = 0; p < s.rows.size(); ++p) {
      if (k < s.rows[p].size()) out[p] = s.rows[p][k];
    }
    return out;
  }
  // Grid order: the first swept input varies slowest.
  std::vector<const std::vector<double>*> axes;
  for (int q : s.swept) {
    const std::vector<double>* values = nullptr;
    for (const SweepDef& d : m.sweeps) {
      if (d.quantity == q) values = &d.values;
    }
    if (values == nullptr || values->empty()) return out;
    axes.push_back(values);
  }
  for (size_t p = 0; p < s.rows.size(); ++p) {
    size_t rest = p;
    for (size_t a = axes.size(); a-- > 0;) {
      const size_t n = axes[a]->size();
      if (s.swept[a] == quantity) out[p] = (*axes[a])[rest % n];
      rest /= n;
    }
  }
  return out;
}

// ---- The report --------------------------------------------------------------

class HtmlReport {
 public:
  explicit HtmlReport(const Results& r) : r_(r), m_(*r.model) {}

  std::string Build() {
    xml_node html = doc_.append_child("html");
    html.append_attribute("lang") = "en";
    Head(html);
    xml_node body = Add(html, "body");
    Newline(body);
    RunningHead(body);
    Newline(body);
    // The page table repeats its header row on every printed page: a spacer
    // under the fixed running head.
    xml_node page = Add(body, "table", "page");
    Add(Add(Add(Add(page, "thead"), "tr"), "td", "page-head"), "div", "page-spacer");
    xml_node cell = Add(Add(Add(page, "tbody"), "tr", "page-row"), "td", "page-body");
    xml_node main = Add(cell, "main", "report");
    Newline(main);
    TitleBlock(main);
    VerdictBox(main);
    SignOff(main);
    Caution(main);
    Contents(main);
    for (size_t i = 0; i < m_.sections.size(); ++i) SectionBlock(main, i);
    if (r_.cases.size() > 1) Cases(main);
    if (HasSweepRows()) Sweeps(main);
    Appendix(main);

    std::ostringstream out;
    out << "<!DOCTYPE html>\n";
    doc_.save(out, "",
              pugi::format_raw | pugi::format_no_empty_element_tags | pugi::format_no_declaration,
              pugi::encoding_utf8);
    // <meta> is the one void element in the document; pugixml writes an end
    // tag for it, which HTML does not have.  "<meta … />" is valid HTML and
    // keeps the file well-formed XML.  The DOM escapes every '>' in text, so
    // this sequence can only come from the element itself.
    std::string s = out.str();
    for (size_t at; (at = s.find("></meta>")) != std::string::npos;) s.replace(at, 8, " />");
    s += "\n";
    return s;
  }

 private:
  const CaseResult& Base() const { return r_.cases.front(); }

  std::string Ref() const {
    std::string ref = MetaValue(r_, "number");
    const std::string rev = MetaValue(r_, "revision");
    if (!rev.empty()) ref += (ref.empty() ? "" : " · ") + ("Rev. " + rev);
    return ref;
  }

  void Head(xml_node html) {
    xml_node head = Add(html, "head");
    Newline(head);
    Add(head, "meta").append_attribute("charset") = "utf-8";
    xml_node gen = Add(head, "meta");
    gen.append_attribute("name") = "generator";
    gen.append_attribute("content") = fmt::format("heatdeck {}", r_.tool_version).c_str();
    const std::string ref = Ref();
    const std::string title = m_.title.empty() ? "Calculation report" : m_.title;
    AddText(head, "title", ref.empty() ? title : fmt::format("{} — {}", title, ref));
    AddText(head, "style", kCss);
    Newline(head);
  }

  void RunningHead(xml_node body) {
    xml_node rh = Add(body, "div", "running-head");
    AddText(rh, "span", m_.title.empty() ? "Calculation report" : m_.title, "rh-title");
    AddText(rh, "span", Ref(), "rh-ref");
  }

  // ---- front matter ----

  void TitleBlock(xml_node main) {
    xml_node block = Add(main, "header", "title-block");
    AddText(block, "h1", m_.title.empty() ? "Calculation report" : m_.title);
    xml_node fields = Add(block, "div", "fields");
    for (const MetaField& f : TitleFields()) {
      xml_node field = Add(fields, "div", "field");
      field.append_attribute("data-key") = f.key;
      AddText(field, "div", f.label, "label");
      const std::string v = MetaValue(r_, f.key);
      AddText(field, "div", v.empty() ? "—" : v, v.empty() ? "value empty" : "value");
    }
    std::vector<std::pair<std::string, std::string>> other;
    for (const auto& [k, v] : m_.meta) {
      if (!IsPlacedMetaKey(k)) other.emplace_back(k, v);
    }
    if (!other.empty()) {
      xml_node t = Add(block, "table", "other-fields");
      xml_node hr = Add(Add(t, "thead"), "tr");
      AddText(hr, "th", "Other field");
      AddText(hr, "th", "Value");
      xml_node tb = Add(t, "tbody");
      for (const auto& [k, v] : other) {
        xml_node tr = Add(tb, "tr");
        AddText(tr, "td", k);
        AddText(tr, "td", v);
      }
    }
    Newline(main);
  }

  void VerdictBox(xml_node main) {
    int failed = 0, not_eval = 0, passed = 0, warnings = 0, bad_quantities = 0;
    std::vector<CheckTally> tallies;
    for (const CaseResult& c : r_.cases) {
      tallies.push_back(Tally(m_, c));
      failed += tallies.back().failed;
      passed += tallies.back().passed;
      not_eval += tallies.back().not_evaluated;
      warnings += tallies.back().warnings;
      for (size_t q = 0; q < m_.quantities.size(); ++q)
        bad_quantities += !QuantityOk(c, static_cast<int>(q));
    }
    const bool ok = failed == 0 && not_eval == 0 && bad_quantities == 0;
    xml_node box = Add(main, "section", ok ? "verdict ok" : "verdict bad");
    box.append_attribute("id") = "verdict";
    const int total = passed + failed + not_eval;
    const bool many = r_.cases.size() > 1;
    std::string headline;
    if (total == 0)
      headline = "No acceptance checks in this calculation";
    else if (ok)
      headline = many         ? fmt::format("All checks pass in all {} cases", r_.cases.size())
                 : total == 1 ? "The check passes"
                              : fmt::format("All {} checks pass", total);
    else if (failed > 0)
      headline = fmt::format("{} of {} check results FAIL", failed, total);
    else
      headline = "Not every check could be evaluated";
    AddText(box, "div", headline, "headline");
    xml_node counts = Add(box, "div", "counts");
    auto count = [&](const char* key, int n, const char* label) {
      xml_node c = Add(counts, "span", "count");
      c.append_attribute("data-count") = key;
      AddText(c, "b", fmt::format("{}", n));
      Text(c, std::string(" ") + label);
    };
    count("passed", passed, "passed");
    count("failed", failed, "failed");
    if (not_eval > 0) count("not-evaluated", not_eval, "not evaluated");
    count("warnings", warnings, warnings == 1 ? "warning" : "warnings");
    if (bad_quantities > 0) count("errors", bad_quantities, "values could not be evaluated");
    if (many) {
      xml_node t = Add(box, "table", "case-tally");
      xml_node hr = Add(Add(t, "thead"), "tr");
      for (const char* h : {"Case", "Passed", "Failed", "Not evaluated", "Warnings"})
        AddText(hr, "th", h, std::string_view(h) == "Case" ? nullptr : "num");
      xml_node tb = Add(t, "tbody");
      for (size_t i = 0; i < r_.cases.size(); ++i) {
        const CheckTally& t2 = tallies[i];
        xml_node tr = Add(tb, "tr", t2.failed > 0 ? "failed" : nullptr);
        AddText(tr, "td", r_.cases[i].name);
        for (int n : {t2.passed, t2.failed, t2.not_evaluated, t2.warnings})
          AddText(tr, "td", fmt::format("{}", n), "num");
      }
    }
    // Name the failed checks, linked to where they are shown.
    xml_node list;
    for (const CaseResult& c : r_.cases) {
      for (size_t i = 0; i < m_.checks.size() && i < c.checks.size(); ++i) {
        if (CheckVerdict(c.checks[i]) != report::Verdict::kFail) continue;
        if (list.empty()) list = Add(box, "ul", "failed-checks");
        xml_node li = Add(list, "li");
        xml_node a = Add(li, "a");
        a.append_attribute("href") =
            (&c == &Base() ? fmt::format("#check-{}", i + 1) : std::string("#cases")).c_str();
        Text(a, fmt::format("C{}", i + 1));
        if (many) Text(li, fmt::format(" (case {})", c.name));
        Text(li, ": " + (m_.checks[i].description.empty() ? SymbolicText(m_, *m_.checks[i].expr)
                                                          : m_.checks[i].description));
      }
    }
    Newline(main);
  }

  void SignOff(xml_node main) {
    xml_node sec = Add(main, "section", "signoff-block");
    AddText(sec, "h3", "Revision and sign-off");
    xml_node t = Add(sec, "table", "signoff");
    xml_node hr = Add(Add(t, "thead"), "tr");
    for (const char* h : {"", "Name", "Signature", "Date"}) AddText(hr, "th", h);
    xml_node tb = Add(t, "tbody");
    for (const MetaField& role : SignOffRoles()) {
      xml_node tr = Add(tb, "tr");
      tr.append_attribute("data-role") = role.key;
      AddText(tr, "td", role.label, "role");
      const std::string name = MetaValue(r_, role.key);
      AddText(tr, "td", name, name.empty() ? "blank" : "name");
      Add(tr, "td", "blank");
      Add(tr, "td", "blank");
    }
    const std::string rev = MetaValue(r_, "revision");
    xml_node p = Add(sec, "p", "small");
    Text(p, rev.empty() ? "Revision: not stated." : "Revision " + rev + ".");
    if (!r_.date.empty()) Text(p, " Dated " + r_.date + ".");
    Newline(main);
  }

  void Caution(xml_node main) {
    xml_node box = Add(main, "aside", "caution");
    AddText(box, "strong", "Caution. ");
    Text(box, kSafetyCaution);
    Newline(main);
  }

  void Contents(xml_node main) {
    xml_node nav = Add(main, "nav", "contents");
    AddText(nav, "h3", "Contents");
    xml_node ol = Add(nav, "ul");
    auto item = [&](const std::string& href, const std::string& text) {
      xml_node a = Add(Add(ol, "li"), "a");
      a.append_attribute("href") = href.c_str();
      Text(a, text);
    };
    const std::vector<int> numbers = SectionNumbers(m_);
    for (size_t i = 0; i < m_.sections.size(); ++i) {
      if (numbers[i] > 0)
        item(SectionId(i), fmt::format("{} {}", numbers[i], SectionTitle(m_.sections[i])));
    }
    if (r_.cases.size() > 1) item("#cases", "Cases compared");
    if (HasSweepRows()) item("#sweeps", "Parameter study");
    item("#appendix", "Appendix: inputs, units, methods, warnings");
    Newline(main);
  }

  // Where a statement is: "deck line 12", or "template hx, line 12" for a
  // template's (prefix "hx.").
  static std::string LineRef(const std::string& prefix, int line) {
    if (prefix.empty()) return fmt::format("deck line {}", line);
    return fmt::format("template {}, line {}", prefix.substr(0, prefix.size() - 1), line);
  }

  std::string SectionId(size_t i) const { return fmt::format("#sec-{}", i + 1); }

  // ---- sections ----

  void SectionBlock(xml_node main, size_t si) {
    const Section& sec = m_.sections[si];
    if (!SectionShown(sec)) return;
    const int number = SectionNumbers(m_)[si];
    xml_node s = Add(main, "section", "calc-section");
    s.append_attribute("id") = SectionId(si).substr(1).c_str();
    // The heading, its introduction and a short inputs table print on one
    // page, so that no heading is left alone at the foot of a page.
    xml_node intro = Add(s, "div", "section-intro");
    xml_node h2 = Add(intro, "h2");
    AddText(h2, "span", fmt::format("{}", number), "num");
    Text(h2, SectionTitle(sec));
    Newline(intro);
    if (r_.cases.size() > 1 && number == 1) {
      AddText(intro, "p",
              fmt::format("Values in the sections are those of case {}; the other cases are "
                          "compared in “Cases compared”.",
                          Base().name),
              "small");
    }
    // Narrative written before the first statement introduces the section;
    // then the inputs; then the rest in the order of the deck.
    size_t k = 0;
    for (; k < sec.items.size() && sec.items[k].kind == Section::Item::Kind::kNarrative; ++k)
      Narrative(intro, sec.items[k].index);
    InputsTable(intro, s, sec);
    std::vector<int> pending_checks;
    auto flush_checks = [&] {
      if (!pending_checks.empty()) ChecksTable(s, pending_checks);
      pending_checks.clear();
    };
    for (; k < sec.items.size(); ++k) {
      const Section::Item& it = sec.items[k];
      if (it.kind != Section::Item::Kind::kCheck) flush_checks();
      switch (it.kind) {
        case Section::Item::Kind::kNarrative:
          Narrative(s, it.index);
          break;
        case Section::Item::Kind::kQuantity:
          if (m_.quantities[static_cast<size_t>(it.index)].kind == QuantityKind::kCalc)
            Equation(s, it.index);
          break;
        case Section::Item::Kind::kCheck:
          pending_checks.push_back(it.index);
          break;
        case Section::Item::Kind::kSolve:
          Solve(s, it.index);
          break;
        case Section::Item::Kind::kProfile:
          Profile(s, it.index);
          break;
      }
    }
    flush_checks();
    Newline(main);
  }

  void Narrative(xml_node s, int index) {
    AddText(s, "p", m_.narrative[static_cast<size_t>(index)], "narrative");
    Newline(s);
  }

  // A short table goes into `intro` (kept whole with the heading), a long
  // one into the section `s`.
  void InputsTable(xml_node intro, xml_node s, const Section& sec) {
    std::vector<int> givens;
    for (const Section::Item& it : sec.items) {
      if (it.kind == Section::Item::Kind::kQuantity &&
          m_.quantities[static_cast<size_t>(it.index)].kind == QuantityKind::kGiven)
        givens.push_back(it.index);
    }
    if (givens.empty()) return;
    if (givens.size() <= kKeepWholeRows) s = intro;
    AddText(s, "h3", "Inputs");
    xml_node t = Add(s, "table", "inputs");
    if (givens.size() <= kKeepWholeRows) t.append_attribute("data-keep") = "whole";
    xml_node hr = Add(Add(t, "thead"), "tr");
    AddText(hr, "th", "Symbol");
    AddText(hr, "th", "Description");
    AddText(hr, "th", "Value", "num");
    AddText(hr, "th", "Unit");
    AddText(hr, "th", "Source");
    xml_node tb = Add(t, "tbody");
    for (int q : givens) {
      const Quantity& qq = m_.quantities[static_cast<size_t>(q)];
      xml_node tr = Add(tb, "tr");
      tr.append_attribute("id") = ("q-" + qq.name).c_str();
      tr.append_attribute("data-name") = qq.name.c_str();
      AppendSymbol(Add(tr, "td", "symbol"), qq.name);
      AddText(tr, "td", qq.description, "desc");
      const std::string v = QuantityValueText(m_, Base(), q);
      xml_node vc = Add(tr, "td", "num value");
      AppendNumber(vc, v.empty() ? "—" : v);
      AddText(tr, "td", PrettyUnit(qq.display.text), "unit");
      xml_node src = Add(tr, "td", "src");
      Text(src, qq.source);
      if (qq.template_default) {
        if (!qq.source.empty()) Text(src, " ");
        AddText(src, "span", "template default", "badge tag");
      }
    }
    Newline(s);
  }

  void Messages(xml_node notes, const CaseResult& c, int q) {
    using Kind = QuantityMessage::Kind;
    for (auto [kind, cls, label] : {std::tuple{Kind::kError, "msg error", "Error: "},
                                    std::tuple{Kind::kWarning, "msg warning", "Warning: "},
                                    std::tuple{Kind::kNote, "msg note", "Note: "}}) {
      for (const QuantityMessage* msg : MessagesOf(c, q, kind)) {
        xml_node d = Add(notes, "div", cls);
        AddText(d, "strong", label);
        Text(d, msg->text);
      }
    }
  }

  void Methods(xml_node notes, const Expr& e) {
    for (const library::FunctionInfo* f : MethodsIn(m_, e)) {
      xml_node d = Add(notes, "div", "method");
      AddText(d, "strong", "Method ");
      AddText(d, "code", f->name);
      Text(d, ": ");
      AddText(d, "code", f->formula);
      Text(d, std::string(". Source: ") + f->source + ".");
    }
    for (int t : TablesIn(m_, e)) {
      const TableDef& td = m_.tables[static_cast<size_t>(t)];
      xml_node d = Add(notes, "div", "method");
      AddText(d, "strong", "Table ");
      AddText(d, "code", td.name);
      Text(d, ": linear interpolation in " + td.path + ".");
      if (td.stmt != nullptr && !td.stmt->attrs.source.empty())
        Text(d, " Source: " + td.stmt->attrs.source + ".");
    }
  }

  void Equation(xml_node s, int q) {
    const Quantity& qq = m_.quantities[static_cast<size_t>(q)];
    const CaseResult& c = Base();
    // MathML does not wrap lines: long equations are set smaller so that
    // they still fit the printed width (about 100 characters of text at the
    // normal size).
    size_t length = 0;
    if (qq.expr != nullptr) {
      length = std::max(SymbolicText(m_, *qq.expr).size(), SubstitutedText(m_, c, *qq.expr).size());
    }
    xml_node eq = Add(s, "div", length > 150 ? "eq very-long" : length > 100 ? "eq long" : "eq");
    eq.append_attribute("id") = ("q-" + qq.name).c_str();
    eq.append_attribute("data-name") = qq.name.c_str();
    AddText(eq, "span", LineRef(qq.prefix, qq.range.line), "ref");
    if (!qq.description.empty()) AddText(Add(eq, "div", "eq-head"), "span", qq.description, "desc");

    xml_node lines = Add(eq, "div", "eq-lines");
    AppendMathSymbol(Add(lines, "span", "lhs"), m_, qq.name);
    AddText(lines, "span", "=", "eq-rel");
    if (qq.expr != nullptr) MathWriter(m_, nullptr).Math(Add(lines, "span", "symbolic"), *qq.expr);
    if (qq.expr != nullptr && HasQuantityNames(m_, *qq.expr)) {
      Add(lines, "span");
      AddText(lines, "span", "=", "eq-rel");
      MathWriter(m_, &c).Math(Add(lines, "span", "substituted"), *qq.expr);
    }
    Add(lines, "span");
    AddText(lines, "span", "=", "eq-rel");
    const std::string v = QuantityValueText(m_, c, q);
    xml_node res = Add(lines, "span", "result");
    if (v.empty())
      AddText(res, "span", "not evaluated", "failed-value");
    else
      AppendValueUnit(res, v, qq.display.text);

    xml_node notes = Add(eq, "div", "eq-notes");
    if (qq.expr != nullptr) Methods(notes, *qq.expr);
    Messages(notes, c, q);
    if (notes.first_child().empty()) eq.remove_child(notes);
    Newline(s);
  }

  void ChecksTable(xml_node s, const std::vector<int>& checks) {
    const CaseResult& c = Base();
    AddText(s, "h3", "Acceptance checks");
    xml_node t = Add(s, "table", "checks");
    if (checks.size() <= kKeepWholeRows) t.append_attribute("data-keep") = "whole";
    xml_node hr = Add(Add(t, "thead"), "tr");
    AddText(hr, "th", "No.");
    AddText(hr, "th", "Criterion");
    AddText(hr, "th", "Evaluated", "num");
    AddText(hr, "th", "Margin", "num");
    AddText(hr, "th", "Result");
    xml_node tb = Add(t, "tbody");
    for (int i : checks) {
      const CheckDef& d = m_.checks[static_cast<size_t>(i)];
      const CheckResult empty;
      const CheckResult& r =
          static_cast<size_t>(i) < c.checks.size() ? c.checks[static_cast<size_t>(i)] : empty;
      const report::Verdict v = CheckVerdict(r);
      xml_node tr = Add(tb, "tr", v == report::Verdict::kFail ? "failed" : nullptr);
      tr.append_attribute("id") = fmt::format("check-{}", i + 1).c_str();
      tr.append_attribute("data-verdict") = VerdictText(v);
      AddText(tr, "td", fmt::format("C{}", i + 1), "nowrap");
      xml_node crit = Add(tr, "td", "criterion");
      MathWriter(m_, nullptr).Math(crit, *d.expr);
      if (!d.description.empty()) AddText(crit, "div", d.description, "small");
      const CheckSides sides = SidesOf(d, r);
      xml_node ev = Add(tr, "td", "num sides");
      xml_node mg = Add(tr, "td", "num margin");
      if (sides.shown) {
        AppendValueUnit(ev, sides.lhs, sides.unit);
        Text(ev, std::string(" ") + ComparisonSign(d.expr->kind) + " ");
        AppendValueUnit(ev, sides.rhs, sides.unit);
        AppendValueUnit(mg, sides.margin, sides.margin_unit);
      } else {
        Text(ev, "—");
        Text(mg, "—");
      }
      xml_node verdict = Add(tr, "td", "verdict-cell");
      AddText(verdict, "span", v == report::Verdict::kPass ? "PASS" : VerdictText(v),
              v == report::Verdict::kPass   ? "badge pass"
              : v == report::Verdict::kFail ? "badge fail"
                                            : "badge na");
    }
    Newline(s);
  }

  void Solve(xml_node s, int index) {
    const SolveDef& d = m_.solves[static_cast<size_t>(index)];
    const Quantity& q = m_.quantities[static_cast<size_t>(d.unknown)];
    const CaseResult& c = Base();
    xml_node box = Add(s, "div", "solve");
    box.append_attribute("id") = ("q-" + q.name).c_str();
    box.append_attribute("data-name") = q.name.c_str();
    xml_node head = Add(box, "div", "eq-head");
    Text(head, "Solve for ");
    AppendSymbol(head, q.name);
    if (!q.description.empty()) AddText(head, "span", q.description, "desc");
    if (d.stmt != nullptr) AddText(head, "span", LineRef(q.prefix, d.stmt->range.line), "ref");
    xml_node cond = Add(box, "div", "eq-lines");
    AddText(cond, "span", "so that", "small");
    Add(cond, "span");
    xml_node m = Add(cond, "span");
    if (d.lhs != nullptr && d.rhs != nullptr) {
      xml_node math = MathElement(m);
      xml_node row = Add(math, "mrow");
      MathWriter w(m_, nullptr);
      w.Node(Add(row, "mrow"), *d.lhs);
      AddText(row, "mo", "=");
      w.Node(Add(row, "mrow"), *d.rhs);
    }
    const std::string residual_unit =
        d.lhs != nullptr ? m_.Info(d.lhs).type.dim.SiUnit() : std::string();
    xml_node t = Add(box, "table", "solve-table");
    xml_node hr = Add(Add(t, "thead"), "tr");
    for (const char* h :
         {"Bracket", "Residual at the ends", "Iterations", "Final residual", "Result"})
      AddText(hr, "th", h);
    xml_node tr = Add(Add(t, "tbody"), "tr");
    xml_node bracket = Add(tr, "td");
    AppendValueUnit(bracket, FormatInput(q.display.FromSi(d.lo)), "");
    Text(bracket, " … ");
    AppendValueUnit(bracket, FormatInput(q.display.FromSi(d.hi)), q.display.text);
    if (static_cast<size_t>(index) >= c.solves.size()) {
      xml_node na = AddText(tr, "td", "not evaluated");
      na.append_attribute("colspan") = "4";
      Newline(s);
      return;
    }
    const SolveResult& sr = c.solves[static_cast<size_t>(index)];
    xml_node ends = Add(tr, "td");
    AppendValueUnit(ends, FormatResult(sr.residual_lo), "");
    Text(ends, " / ");
    AppendValueUnit(ends, FormatResult(sr.residual_hi), residual_unit);
    AddText(tr, "td", fmt::format("{}", sr.iterations), "num");
    AppendValueUnit(Add(tr, "td", "num"), FormatResult(sr.residual_si), residual_unit);
    xml_node res = Add(tr, "td", "num");
    if (sr.converged)
      AppendValueUnit(res, FormatResult(q.display.FromSi(sr.value_si)), q.display.text);
    else
      AddText(res, "span", "did not converge", "badge fail");
    if (!sr.error.empty()) {
      xml_node d2 = Add(box, "div", "msg error");
      AddText(d2, "strong", "Error: ");
      Text(d2, sr.error);
    }
    Newline(s);
  }

  void Profile(xml_node s, int index) {
    const ProfileDef& d = m_.profiles[static_cast<size_t>(index)];
    const ProfileResult* pr = nullptr;
    for (const ProfileResult& p : ProfilesOf(Base())) {
      if (p.profile == index) pr = &p;
    }
    if (pr == nullptr) return;  // nothing evaluated, nothing drawn
    xml_node fig = Add(s, "figure", "profile");
    fig.append_attribute("id") = fmt::format("profile-{}", index + 1).c_str();
    const std::string flow = pr->counterflow ? "counterflow" : "parallel flow";
    const std::string caption =
        d.caption.empty() ? "Temperature profile along the exchanger, " + flow : d.caption;
    if (!pr->ok) {
      AddText(fig, "figcaption", caption);
      xml_node e = Add(fig, "div", "msg error");
      AddText(e, "strong", "Not drawn: ");
      Text(e, pr->error);
      Newline(s);
      return;
    }
    const Quantity& hot_in = m_.quantities[static_cast<size_t>(d.hot_in)];
    const units::Unit& u = hot_in.display;
    auto name = [&](int q) { return m_.quantities[static_cast<size_t>(q)].name; };
    LinePlot plot;
    plot.x_label = "Fraction of heat-transfer area from the hot inlet";
    plot.y_label = u.text.empty() ? "T" : fmt::format("T [{}]", PrettyUnit(u.text));
    plot.fix_x = true;
    plot.description = caption;
    PlotSeries hot, cold;
    hot.tone = 0;
    cold.tone = 1;
    hot.direction = 1;
    cold.direction = pr->counterflow ? -1 : 1;
    hot.x = cold.x = pr->x;
    for (double t : pr->hot_si) hot.y.push_back(u.FromSi(t));
    for (double t : pr->cold_si) cold.y.push_back(u.FromSi(t));
    // The end temperatures go in the legend, where they cannot collide with
    // the lines: "Hot stream: T_h1 80.00 °C → T_h2 42.26 °C".
    auto end = [&](int q) {
      return PlotSymbol(name(q)) + " " +
             WithUnit(QuantityValueText(m_, Base(), q),
                      m_.quantities[static_cast<size_t>(q)].display.text);
    };
    hot.label = "Hot stream: " + end(d.hot_in) + " → " + end(d.hot_out);
    cold.label = "Cold stream: " + end(d.cold_in) + " → " + end(d.cold_out);
    plot.series = {hot, cold};
    AppendLinePlot(plot, fig);
    AddText(fig, "figcaption", caption + ". Arrows show the direction of flow.");
    Newline(s);
  }

  // ---- cases ----

  void Cases(xml_node main) {
    xml_node s = Add(main, "section", "cases");
    s.append_attribute("id") = "cases";
    AddText(s, "h2", "Cases compared");
    xml_node ul = Add(s, "ul", "small");
    for (const CaseResult& c : r_.cases) {
      xml_node li = Add(ul, "li");
      AddText(li, "strong", c.name);
      if (!c.description.empty()) Text(li, ": " + c.description);
    }
    std::vector<int> inputs, results;
    for (size_t qi = 0; qi < m_.quantities.size(); ++qi) {
      const int q = static_cast<int>(qi);
      bool differs = false;
      for (size_t ci = 1; ci < r_.cases.size(); ++ci)
        differs = differs || ValuesDiffer(r_.cases[0], r_.cases[ci], q);
      if (!differs) continue;
      (m_.quantities[qi].kind == QuantityKind::kGiven ? inputs : results).push_back(q);
    }
    xml_node t = Add(s, "table", "cases-table");
    xml_node hr = Add(Add(t, "thead"), "tr");
    AddText(hr, "th", "Quantity");
    AddText(hr, "th", "Unit");
    for (const CaseResult& c : r_.cases) AddText(hr, "th", c.name, "case");
    xml_node tb = Add(t, "tbody");
    auto group = [&](const std::string& title) {
      xml_node th = AddText(Add(tb, "tr", "group"), "th", title);
      th.append_attribute("colspan") = fmt::format("{}", r_.cases.size() + 2).c_str();
    };
    auto rows = [&](const std::vector<int>& qs) {
      for (int q : qs) {
        const Quantity& qq = m_.quantities[static_cast<size_t>(q)];
        xml_node tr = Add(tb, "tr");
        tr.append_attribute("data-name") = qq.name.c_str();
        AppendSymbol(Add(tr, "td"), qq.name);
        AddText(tr, "td", PrettyUnit(qq.display.text), "unit");
        for (const CaseResult& c : r_.cases) {
          const bool changed = &c != &r_.cases[0] && ValuesDiffer(r_.cases[0], c, q);
          const std::string v = QuantityValueText(m_, c, q);
          AppendNumber(Add(tr, "td", changed ? "num changed" : "num"), v.empty() ? "—" : v);
        }
      }
    };
    group("Inputs that differ");
    rows(inputs);
    group("Results that differ");
    rows(results);
    if (!m_.checks.empty()) {
      group("Checks");
      for (size_t i = 0; i < m_.checks.size(); ++i) {
        xml_node tr = Add(tb, "tr");
        xml_node name = Add(tr, "td");
        Text(name, fmt::format("C{} ", i + 1));
        AddText(name, "span",
                m_.checks[i].description.empty() ? SymbolicText(m_, *m_.checks[i].expr)
                                                 : m_.checks[i].description,
                "small");
        Add(tr, "td");
        for (const CaseResult& c : r_.cases) {
          const report::Verdict v =
              i < c.checks.size() ? CheckVerdict(c.checks[i]) : report::Verdict::kNotEvaluated;
          xml_node td = Add(tr, "td", "num");
          AddText(td, "span", v == report::Verdict::kPass ? "PASS" : VerdictText(v),
                  v == report::Verdict::kPass   ? "badge pass"
                  : v == report::Verdict::kFail ? "badge fail"
                                                : "badge na");
        }
      }
    }
    Newline(main);
  }

  // ---- sweeps ----

  bool HasSweepRows() const {
    for (const SweepResult& s : r_.sweeps) {
      if (!s.rows.empty()) return true;
    }
    return false;
  }

  void Sweeps(xml_node main) {
    xml_node sec = Add(main, "section", "sweeps");
    sec.append_attribute("id") = "sweeps";
    AddText(sec, "h2", "Parameter study");
    for (size_t si = 0; si < r_.sweeps.size(); ++si) {
      if (!r_.sweeps[si].rows.empty()) Sweep(sec, r_.sweeps[si], si);
    }
    Newline(main);
  }

  void Sweep(xml_node sec, const SweepResult& s, size_t index) {
    xml_node block = Add(sec, "div", "sweep");
    block.append_attribute("id") = fmt::format("sweep-{}", index + 1).c_str();
    // Swept inputs first, then every result that changes over the sweep;
    // the ones that do not are named once.
    std::vector<int> swept = s.swept;
    std::vector<std::vector<double>> swept_values;
    for (int q : swept) swept_values.push_back(SweptValues(m_, s, q));
    std::vector<size_t> varying;
    std::vector<int> constant;
    for (size_t k = 0; k < s.columns.size(); ++k) {
      const int q = s.columns[k];
      const Quantity& qq = m_.quantities[static_cast<size_t>(q)];
      if (qq.kind == QuantityKind::kGiven) continue;
      bool varies = false;
      for (size_t p = 1; p < s.rows.size(); ++p) {
        if (k < s.rows[p].size() && k < s.rows[0].size() && s.rows[p][k] != s.rows[0][k])
          varies = true;
      }
      if (varies)
        varying.push_back(k);
      else
        constant.push_back(q);
    }
    xml_node intro = Add(block, "p");
    Text(intro, fmt::format("{} points varying ", s.rows.size()));
    for (size_t i = 0; i < swept.size(); ++i) {
      if (i > 0) Text(intro, i + 1 == swept.size() ? " and " : ", ");
      AppendSymbol(intro, m_.quantities[static_cast<size_t>(swept[i])].name);
    }
    Text(intro, swept.size() > 1 ? " (a full grid; the first varies slowest)." : ".");
    if (!constant.empty()) {
      xml_node p = Add(block, "p", "small");
      Text(p, "Unchanged over the study: ");
      for (size_t i = 0; i < constant.size(); ++i) {
        if (i > 0) Text(p, ", ");
        AppendSymbol(p, m_.quantities[static_cast<size_t>(constant[i])].name);
      }
      Text(p, ".");
    }

    // Tables of at most this many result columns keep the print readable.
    constexpr size_t kColumnsPerTable = 6;
    for (size_t first = 0; first < std::max<size_t>(varying.size(), 1); first += kColumnsPerTable) {
      const size_t last = std::min(varying.size(), first + kColumnsPerTable);
      xml_node t = Add(block, "table", "sweep-table");
      xml_node hr = Add(Add(t, "thead"), "tr");
      AddText(hr, "th", "#", "num");
      auto header = [&](int q) {
        const Quantity& qq = m_.quantities[static_cast<size_t>(q)];
        xml_node th = Add(hr, "th", "num");
        AppendSymbol(th, qq.name);
        if (!qq.display.text.empty()) Text(th, " [" + PrettyUnit(qq.display.text) + "]");
      };
      for (int q : swept) header(q);
      for (size_t k = first; k < last; ++k) header(s.columns[varying[k]]);
      xml_node tb = Add(t, "tbody");
      for (size_t p = 0; p < s.rows.size(); ++p) {
        const bool error = p < s.row_errors.size() && !s.row_errors[p].empty();
        xml_node tr = Add(tb, "tr", error ? "failed" : nullptr);
        AddText(tr, "td", fmt::format("{}", p + 1), "num");
        for (size_t i = 0; i < swept.size(); ++i) {
          const Quantity& qq = m_.quantities[static_cast<size_t>(swept[i])];
          AppendNumber(Add(tr, "td", "num"), FormatInput(qq.display.FromSi(swept_values[i][p])));
        }
        if (error) {
          xml_node td = AddText(tr, "td", s.row_errors[p]);
          td.append_attribute("colspan") =
              fmt::format("{}", std::max<size_t>(last - first, 1)).c_str();
          continue;
        }
        for (size_t k = first; k < last; ++k) {
          const Quantity& qq = m_.quantities[static_cast<size_t>(s.columns[varying[k]])];
          const double v = varying[k] < s.rows[p].size() ? s.rows[p][varying[k]] : NAN;
          AppendNumber(Add(tr, "td", "num"), FormatResult(qq.display.FromSi(v)));
        }
      }
    }

    // One plot per result against the first swept input; further swept
    // inputs give one line per combination of their values.
    if (swept.empty() || varying.empty()) return;
    const Quantity& xq = m_.quantities[static_cast<size_t>(swept[0])];
    std::vector<std::string> line_keys;  // per point: its combination of the other inputs
    std::vector<std::string> keys_in_order;
    for (size_t p = 0; p < s.rows.size(); ++p) {
      std::string key;
      for (size_t i = 1; i < swept.size(); ++i) {
        const Quantity& qq = m_.quantities[static_cast<size_t>(swept[i])];
        if (!key.empty()) key += ", ";
        key += PlotSymbol(qq.name) + " = " +
               WithUnit(FormatInput(qq.display.FromSi(swept_values[i][p])), qq.display.text);
      }
      line_keys.push_back(key);
      if (std::find(keys_in_order.begin(), keys_in_order.end(), key) == keys_in_order.end())
        keys_in_order.push_back(key);
    }
    xml_node plots = Add(block, "div", "plots");
    for (size_t k : varying) {
      const Quantity& yq = m_.quantities[static_cast<size_t>(s.columns[k])];
      // Two plots share a printed line: a narrower drawing keeps its text
      // legible at that size.
      LinePlot plot;
      plot.width = 380;
      plot.height = 250;
      plot.x_label = PlotAxisLabel(xq.name, xq.display.text);
      plot.y_label = PlotAxisLabel(yq.name, yq.display.text);
      plot.description = fmt::format("{} against {}", yq.name, xq.name);
      for (const std::string& key : keys_in_order) {
        PlotSeries ps;
        ps.markers = true;
        ps.label = key.empty() ? PlotSymbol(yq.name) : key;
        for (size_t p = 0; p < s.rows.size(); ++p) {
          if (line_keys[p] != key) continue;
          ps.x.push_back(xq.display.FromSi(swept_values[0][p]));
          const bool error = p < s.row_errors.size() && !s.row_errors[p].empty();
          ps.y.push_back(error || k >= s.rows[p].size() ? NAN : yq.display.FromSi(s.rows[p][k]));
        }
        plot.series.push_back(std::move(ps));
      }
      xml_node fig = Add(plots, "figure", "sweep-plot");
      AppendLinePlot(plot, fig);
      xml_node cap = Add(fig, "figcaption");
      AppendSymbol(cap, yq.name);
      Text(cap, yq.description.empty() ? "" : " — " + yq.description);
    }
  }

  // ---- appendix ----

  void Appendix(xml_node main) {
    xml_node s = Add(main, "section", "appendix");
    s.append_attribute("id") = "appendix";
    AddText(s, "h2", "Appendix");

    AddText(s, "h3", "A.1 Input files");
    xml_node t = Add(s, "table", "files");
    xml_node hr = Add(Add(t, "thead"), "tr");
    AddText(hr, "th", "File");
    AddText(hr, "th", "SHA-256");
    xml_node tb = Add(t, "tbody");
    for (const InputFile& f : r_.files) {
      xml_node tr = Add(tb, "tr");
      AddText(tr, "td", f.path);
      AddText(tr, "td", f.sha256, "hash");
    }
    if (!m_.tables.empty()) {
      xml_node tt = Add(s, "table", "tables");
      xml_node th = Add(Add(tt, "thead"), "tr");
      AddText(th, "th", "Table");
      AddText(th, "th", "File");
      AddText(th, "th", "Source");
      xml_node tbb = Add(tt, "tbody");
      for (const TableDef& td : m_.tables) {
        xml_node tr = Add(tbb, "tr");
        AddText(tr, "td", td.name);
        AddText(tr, "td", td.path);
        AddText(tr, "td", td.stmt != nullptr ? td.stmt->attrs.source : "", "src");
      }
    }

    AddText(s, "h3", "A.2 Tool");
    xml_node p = Add(s, "p");
    Text(p, fmt::format("Produced by heatdeck {} from {}.", r_.tool_version, r_.deck_path));
    Text(p, r_.date.empty() ? " No report date was given." : " Report date " + r_.date + ".");

    AddText(s, "h3", "A.3 Units and their SI conversion");
    AddText(s, "p", "Value in SI = value × factor + offset.", "small");
    xml_node ut = Add(s, "table", "units");
    xml_node uh = Add(Add(ut, "thead"), "tr");
    AddText(uh, "th", "Unit");
    AddText(uh, "th", "Written in the deck");
    AddText(uh, "th", "SI unit");
    AddText(uh, "th", "Factor", "num");
    AddText(uh, "th", "Offset", "num");
    xml_node ub = Add(ut, "tbody");
    for (const UnitUse& u : UnitsUsed(m_)) {
      xml_node tr = Add(ub, "tr");
      AddText(tr, "td", PrettyUnit(u.text));
      AddText(Add(tr, "td"), "code", u.text);
      AddText(tr, "td", u.si_unit.empty() ? "1" : PrettyUnit(u.si_unit));
      AddText(tr, "td", units::FormatExact(u.factor), "num");
      AddText(tr, "td", u.offset == 0 ? "" : units::FormatExact(u.offset), "num");
    }

    AddText(s, "h3", "A.4 Methods");
    const std::vector<const library::FunctionInfo*> methods = MethodsUsed(m_);
    if (methods.empty()) {
      AddText(s, "p", "No library method is used.", "muted");
    } else {
      xml_node mt = Add(s, "table", "methods");
      xml_node mh = Add(Add(mt, "thead"), "tr");
      for (const char* h : {"Function", "Formula", "Published source", "Validity"})
        AddText(mh, "th", h);
      xml_node mb = Add(mt, "tbody");
      for (const library::FunctionInfo* f : methods) {
        xml_node tr = Add(mb, "tr");
        AddText(Add(tr, "td"), "code", f->name);
        AddText(Add(tr, "td"), "code", f->formula);
        AddText(tr, "td", f->source);
        AddText(tr, "td", f->validity, "src");
      }
    }

    AddText(s, "h3", "A.5 Warnings and messages");
    xml_node wt;
    xml_node wb;
    for (const CaseResult& c : r_.cases) {
      for (size_t q = 0; q < c.messages.size() && q < m_.quantities.size(); ++q) {
        for (const QuantityMessage& msg : c.messages[q]) {
          if (wt.empty()) {
            wt = Add(s, "table", "warnings");
            xml_node wh = Add(Add(wt, "thead"), "tr");
            for (const char* h : {"Case", "Quantity", "Kind", "Message"}) AddText(wh, "th", h);
            wb = Add(wt, "tbody");
          }
          xml_node tr =
              Add(wb, "tr", msg.kind == QuantityMessage::Kind::kError ? "failed" : nullptr);
          AddText(tr, "td", c.name);
          AppendSymbol(Add(tr, "td"), m_.quantities[q].name);
          AddText(tr, "td",
                  msg.kind == QuantityMessage::Kind::kWarning ? "warning"
                  : msg.kind == QuantityMessage::Kind::kError ? "error"
                                                              : "note");
          AddText(tr, "td", msg.text);
        }
      }
    }
    if (wt.empty()) AddText(s, "p", "No warnings were recorded.", "muted");
    Newline(main);
  }

  const Results& r_;
  const Model& m_;
  pugi::xml_document doc_;
};

}  // namespace
}  // namespace report

bool WriteHtml(const Results& results, std::string* out, std::string* error) {
  if (results.model == nullptr || results.cases.empty()) {
    *error = "nothing was evaluated, so there is no report to write";
    return false;
  }
  *out = report::HtmlReport(results).Build();
  return true;
}

}  // namespace heatdeck
