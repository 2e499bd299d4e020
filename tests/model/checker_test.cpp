// The checker: name resolution, duplicates, cycles and the dimension and
// temperature rules of LANGUAGE.md, each error class with its exact message,
// line, column and caret (STYLE.md 11: "test diagnostics as text").
//
// A deck is run through the same stages Session::LoadText runs (parse, then
// BuildModel) under the file name "input"; the model layer cannot link the
// session, which lives in the evaluation layer above it.  The expected texts
// are the compiler-style rendering of LANGUAGE.md "Diagnostics and exit
// codes": `input:LINE:COL: error: message`, the source line, a caret under
// the span, then related places and notes.
#include <memory>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "lang/diagnostics.h"
#include "lang/parser.h"
#include "model/builder.h"
#include "model/model.h"

namespace heatdeck {
namespace {

using units::TempKind;

struct Checked {
  SourceFiles files;
  Diagnostics diags;
  std::unique_ptr<Deck> deck;
  std::vector<std::unique_ptr<Deck>> keep;
  std::unique_ptr<Model> model;

  // Every diagnostic, sorted and rendered without colour.
  std::string Text() const {
    std::string out;
    for (const Diagnostic* d : diags.Sorted()) out += Render(*d, files, false);
    return out;
  }
  const Quantity& Q(const std::string& name) const {
    const int i = model->Find(name);
    EXPECT_GE(i, 0) << "no quantity " << name;
    return model->quantities.at(static_cast<size_t>(i < 0 ? 0 : i));
  }
};

std::unique_ptr<Checked> Check(const std::string& text) {
  auto c = std::make_unique<Checked>();
  const std::string_view name = c->files.Add("input", text);
  c->deck = std::make_unique<Deck>(Parse(name, c->files.Text(name), c->diags));
  c->model = BuildModel(*c->deck, BuildOptions{}, &c->keep, c->diags);
  return c;
}

std::string Errors(const std::string& text) { return Check(text)->Text(); }

// The first deck of LANGUAGE.md, verbatim.
constexpr const char* kFirstDeck =
    R"(# Comments start with '#'. They are for the author and never reach a report.

title "Jacket-water cooler C-2: rating at summer design"
meta  number   "TC-0042"
meta  revision "B"
meta  prepared "RO"

section "Process data"

> Both streams are treated water. Properties at the estimated mean temperatures.

given m_h   = 0.50 kg/s        "Hot water flow"              source "Plant heat balance, case S1"
given T_h1  = 80 degC          "Hot water inlet"             source "Plant heat balance, case S1"
given m_c   = 0.70 kg/s        "Cooling water flow"
given T_c1  = 20 degC          "Cooling water inlet"
given cp_h  = 4.19 kJ/(kg*K)   "Hot-side specific heat"      source "IAPWS-IF97 at 70 degC"
given cp_c  = 4.18 kJ/(kg*K)
given UA    = 2.9 kW/K         "Overall conductance"         source "see TC-0041"

section "Rating"

C_h   = m_h * cp_h                     in W/K   "Hot capacity rate"
C_c   = m_c * cp_c                     in W/K
C_min = min(C_h, C_c)                  in W/K
Cr    = C_min / max(C_h, C_c)
NTU   = UA / C_min
eps   = eff_counter(NTU, Cr)                    "Effectiveness, counterflow"
Q     = eps * C_min * (T_h1 - T_c1)    in kW    "Duty"
T_h2  = T_h1 - Q / C_h                 in degC  "Hot outlet"
T_c2  = T_c1 + Q / C_c                 in degC  "Cold outlet"

check T_h2 <= 45 degC                           "Hot water returned at or below 45 degC"
check T_h2 - T_c1 >= 5 K                        "Cold-end approach"
)";

// ---- clean decks --------------------------------------------------------

TEST(Checker, CleanDeckHasNoDiagnostics) {
  auto c = Check(kFirstDeck);
  EXPECT_EQ(c->Text(), "");
  EXPECT_EQ(c->diags.list().size(), 0u);
  EXPECT_EQ(c->model->quantities.size(), 16u);
  EXPECT_EQ(c->model->checks.size(), 2u);
  // Types the checker derived, in SI spellings.
  EXPECT_EQ(c->Q("C_h").type.dim.SiUnit(), "W/K");
  EXPECT_EQ(c->Q("Q").type.dim.SiUnit(), "W");
  EXPECT_TRUE(c->Q("NTU").type.dim.dimensionless());
  EXPECT_EQ(c->Q("T_h2").type.temp, TempKind::kAbsolute);
  EXPECT_EQ(c->Q("T_h2").display.text, "degC");
  EXPECT_EQ(c->Q("Q").display.text, "kW");
  // Dependency order: every quantity after what it reads.
  std::vector<int> position(c->model->quantities.size(), -1);
  for (size_t i = 0; i < c->model->order.size(); ++i) {
    position[static_cast<size_t>(c->model->order[i])] = static_cast<int>(i);
  }
  for (size_t qi = 0; qi < c->model->quantities.size(); ++qi) {
    ASSERT_GE(position[qi], 0);
    for (int d : c->model->quantities[qi].deps) {
      EXPECT_LT(position[static_cast<size_t>(d)], position[qi])
          << c->model->quantities[static_cast<size_t>(d)].name << " before "
          << c->model->quantities[qi].name;
    }
  }
}

// Literal units live apart from the per-node info (Model::literal_units):
// a literal with a unit finds the unit it was written with, a negated one
// shares it, a plain number has none.  Hand-derived: 12 mm = 0.012 m,
// -5 degC = 268.15 K.
TEST(Checker, LiteralsKeepTheUnitTheyWereWrittenWith) {
  auto c = Check("given D = 12 mm\ngiven T = -5 degC\ngiven n = 3\n");
  ASSERT_EQ(c->Text(), "");
  const ExprInfo& d = c->model->Info(c->Q("D").expr);
  EXPECT_EQ(c->model->LiteralUnit(d).text, "mm");
  EXPECT_DOUBLE_EQ(d.si, 0.012);
  const Expr* neg = c->Q("T").expr;
  ASSERT_EQ(neg->kind, ExprKind::kNeg);
  const ExprInfo& t = c->model->Info(neg);
  EXPECT_EQ(t.unit, c->model->Info(neg->args[0]).unit);
  EXPECT_EQ(c->model->LiteralUnit(t).text, "degC");
  EXPECT_DOUBLE_EQ(t.si, 268.15);
  EXPECT_EQ(c->Q("T").display.text, "degC");
  const ExprInfo& n = c->model->Info(c->Q("n").expr);
  EXPECT_EQ(n.unit, -1);
  EXPECT_EQ(c->model->LiteralUnit(n).text, "");
  EXPECT_EQ(c->model->literal_units.size(), 2u);
}

TEST(Checker, EmptyAndCommentOnlyDecksAreClean) {
  EXPECT_EQ(Errors(""), "");
  EXPECT_EQ(Errors("# nothing but a comment\n\n   # and another\n"), "");
}

// ---- names ----------------------------------------------------------------

TEST(Checker, UnknownNameSuggestsTheNearestName) {
  EXPECT_EQ(Errors("given T_h1 = 80 degC\n"
                   "T = T_h + 1 K\n"),
            "input:2:5: error: unknown name 'T_h'\n"
            "  T = T_h + 1 K\n"
            "      ^~~\n"
            "  note: did you mean 'T_h1'?\n");
}

TEST(Checker, UnknownNameFarFromEveryNameHasNoSuggestion) {
  EXPECT_EQ(Errors("given a = 1\n"
                   "c = qqqqqqqq + 1\n"),
            "input:2:5: error: unknown name 'qqqqqqqq'\n"
            "  c = qqqqqqqq + 1\n"
            "      ^~~~~~~~\n");
}

TEST(Checker, DuplicateDefinitionPointsAtBothLines) {
  EXPECT_EQ(Errors("given a = 1 m\n"
                   "given b = 2 m\n"
                   "a = b * 2\n"),
            "input:3:1: error: 'a' is defined twice\n"
            "  a = b * 2\n"
            "  ^\n"
            "input:1:7: note: first defined here\n"
            "  given a = 1 m\n"
            "        ^\n");
}

TEST(Checker, CycleListsEveryMemberWithItsLine) {
  EXPECT_EQ(Errors("given k = 2\n"
                   "a = b + 1\n"
                   "b = c * k\n"
                   "c = a - 1\n"),
            "input:2:1: error: dependency cycle: a -> b -> c -> a\n"
            "  a = b + 1\n"
            "  ^\n"
            "input:2:1: note: 'a' is part of the cycle\n"
            "  a = b + 1\n"
            "  ^\n"
            "input:3:1: note: 'b' is part of the cycle\n"
            "  b = c * k\n"
            "  ^\n"
            "input:4:1: note: 'c' is part of the cycle\n"
            "  c = a - 1\n"
            "  ^\n");
}

TEST(Checker, QuantityThatReadsItselfIsACycle) {
  EXPECT_EQ(Errors("x = x + 1\n"),
            "input:1:1: error: dependency cycle: x -> x\n"
            "  x = x + 1\n"
            "  ^\n"
            "input:1:1: note: 'x' is part of the cycle\n"
            "  x = x + 1\n"
            "  ^\n");
}

TEST(Checker, KeywordCannotNameAQuantity) {
  EXPECT_EQ(Errors("given in = 2 m\n"
                   "from = 2\n"),
            "input:1:7: error: 'in' is a keyword and cannot be used as a quantity name\n"
            "  given in = 2 m\n"
            "        ^~\n"
            "input:2:1: error: 'from' is a keyword and cannot be used as a quantity name\n"
            "  from = 2\n"
            "  ^~~~\n");
}

// ---- dimensions -----------------------------------------------------------

TEST(Checker, CannotAddDifferentDimensionsNamedInTheDecksUnits) {
  EXPECT_EQ(Errors("given m_h = 0.5 kg/s\n"
                   "given C_c = 2926 W/K\n"
                   "x = m_h + C_c\n"),
            "input:3:5: error: cannot add kg/s and W/K\n"
            "  x = m_h + C_c\n"
            "      ^~~~~~~~~\n");
  // The unit the deck wrote, not its SI form.
  EXPECT_EQ(Errors("given UA = 2.9 kW/K\n"
                   "given m = 1 kg/s\n"
                   "x = UA - m\n"),
            "input:3:5: error: cannot subtract kW/K and kg/s\n"
            "  x = UA - m\n"
            "      ^~~~~~\n");
}

TEST(Checker, CannotCompareDifferentDimensions) {
  EXPECT_EQ(Errors("given m = 1 kg/s\n"
                   "given C = 2 W/K\n"
                   "check m <= C\n"
                   "z = max(m, C)\n"),
            "input:3:7: error: cannot compare kg/s with W/K\n"
            "  check m <= C\n"
            "        ^~~~~~\n"
            "input:4:5: error: max needs arguments of one kind: kg/s and W/K\n"
            "  z = max(m, C)\n"
            "      ^~~~~~~~~\n");
}

TEST(Checker, ExponentMustBeAPlainNumber) {
  EXPECT_EQ(Errors("given L = 2 m\n"
                   "x = 2 ^ L\n"),
            "input:2:9: error: an exponent must be a plain number, not m\n"
            "  x = 2 ^ L\n"
            "          ^\n");
}

TEST(Checker, VariableExponentOfADimensionalBase) {
  EXPECT_EQ(Errors("given L = 2 m\n"
                   "given n = 2\n"
                   "y = L ^ n\n"),
            "input:3:9: error: m raised to a variable power has no fixed unit; the exponent must "
            "be a constant number\n"
            "  y = L ^ n\n"
            "          ^\n");
  // A constant exponent on a dimensional base and a variable one on a plain
  // number are fine.
  auto c = Check("given L = 2 m\ngiven n = 2\na = L ^ 2\nb = L ^ -1\nc = n ^ n\nd = L^(4/2)\n");
  EXPECT_EQ(c->Text(), "");
  EXPECT_EQ(c->Q("a").type.dim.SiUnit(), "m^2");
  EXPECT_EQ(c->Q("b").type.dim.SiUnit(), "1/m");
  EXPECT_TRUE(c->Q("c").type.dim.dimensionless());
  EXPECT_EQ(c->Q("d").type.dim.SiUnit(), "m^2");
}

TEST(Checker, FractionalPowerNeedsAWholeNumberedResult) {
  EXPECT_EQ(Errors("given L = 2 m\n"
                   "w = L ^ 0.5\n"),
            "input:2:5: error: m raised to 0.5 has no whole-numbered unit\n"
            "  w = L ^ 0.5\n"
            "      ^~~~~~~\n");
}

TEST(Checker, SquareRootHalvesEvenExponentsOnly) {
  EXPECT_EQ(Errors("given V = 2 m^3\n"
                   "y = sqrt(V)\n"),
            "input:2:5: error: the square root of m^3 has no whole-numbered unit\n"
            "  y = sqrt(V)\n"
            "      ^~~~~~~\n");
  auto c = Check("given A = 3 m^2\ngiven g = 9.81 m/s^2\nx = sqrt(A)\nv = sqrt(2 * g * x)\n");
  EXPECT_EQ(c->Text(), "");
  EXPECT_EQ(c->Q("x").type.dim.SiUnit(), "m");
  EXPECT_EQ(c->Q("v").type.dim.SiUnit(), "m/s");
}

TEST(Checker, TranscendentalFunctionsNeedPlainNumbers) {
  EXPECT_EQ(Errors("given L = 2 m\n"
                   "v = exp(L)\n"),
            "input:2:9: error: the argument of exp must be a plain number, not m\n"
            "  v = exp(L)\n"
            "          ^\n");
}

TEST(Checker, LibraryArgumentOfTheWrongDimension) {
  EXPECT_EQ(Errors("x = res_cyl(25 mm, 2 kg, 16 W/(m*K), 6 m)\n"),
            "input:1:20: error: argument 2 of res_cyl (D_out) expects a length (m), got kg\n"
            "  x = res_cyl(25 mm, 2 kg, 16 W/(m*K), 6 m)\n"
            "                     ^~~~\n");
}

TEST(Checker, LibraryAbsoluteTemperatureArgumentGivenAnInterval) {
  EXPECT_EQ(Errors("given T_h1 = 80 degC\n"
                   "given T_c1 = 20 degC\n"
                   "given T_h2 = 45 degC\n"
                   "dT = lmtd_counter(T_h1 - T_c1, T_h2, T_c1, T_c1)\n"),
            "input:4:19: error: argument 1 of lmtd_counter (T_h_in) is an absolute temperature, "
            "got a temperature difference\n"
            "  dT = lmtd_counter(T_h1 - T_c1, T_h2, T_c1, T_c1)\n"
            "                    ^~~~~~~~~~~\n");
}

TEST(Checker, WrongArgumentCount) {
  EXPECT_EQ(Errors("x = res_cyl(25 mm, 16 W/(m*K), 6 m)\n"
                   "y = sqrt(1, 2)\n"),
            "input:1:5: error: res_cyl takes 4 arguments (D_in, D_out, k, L), got 3\n"
            "  x = res_cyl(25 mm, 16 W/(m*K), 6 m)\n"
            "      ^~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~\n"
            "input:2:5: error: sqrt takes 1 argument, got 2\n"
            "  y = sqrt(1, 2)\n"
            "      ^~~~~~~~~~\n");
}

TEST(Checker, UnknownFunctionSuggestsTheNearestFunction) {
  EXPECT_EQ(Errors("x = res_cil(25 mm, 28 mm, 16 W/(m*K), 6 m)\n"),
            "input:1:5: error: unknown function 'res_cil'\n"
            "  x = res_cil(25 mm, 28 mm, 16 W/(m*K), 6 m)\n"
            "      ^~~~~~~\n"
            "  note: did you mean 'res_cyl'?\n"
            "  note: 'heatdeck functions' lists every function\n");
}

TEST(Checker, QuantityCalledLikeAFunction) {
  EXPECT_EQ(Errors("given C_h = 2 W/K\n"
                   "w = C_h(2)\n"),
            "input:2:5: error: 'C_h' is a quantity, not a function; write 'C_h * (…)' to "
            "multiply\n"
            "  w = C_h(2)\n"
            "      ^~~~~~\n");
}

// ---- temperatures ---------------------------------------------------------

TEST(Checker, AbsolutePlusAbsoluteIsAnError) {
  EXPECT_EQ(Errors("given T1 = 80 degC\n"
                   "given T2 = 20 degC\n"
                   "x = T1 + T2\n"),
            "input:3:5: error: cannot add two absolute temperatures; for a mean write "
            "T_a + 0.5 * (T_b - T_a)\n"
            "  x = T1 + T2\n"
            "      ^~~~~~~\n");
}

TEST(Checker, IntervalMinusAbsoluteIsAnError) {
  EXPECT_EQ(Errors("given T1 = 80 degC\n"
                   "given dT = 5 ddegC\n"
                   "x = dT - T1\n"),
            "input:3:5: error: cannot subtract an absolute temperature from a temperature "
            "difference\n"
            "  x = dT - T1\n"
            "      ^~~~~~~\n");
}

TEST(Checker, NegatedAbsoluteTemperatureIsAnError) {
  EXPECT_EQ(Errors("given q = 20 degC\n"
                   "w = -q\n"),
            "input:2:5: error: cannot negate an absolute temperature\n"
            "  w = -q\n"
            "      ^~\n");
  // The sign of a literal belongs to the number: -5 degC is a temperature.
  auto c = Check("given T = -5 degC\n");
  EXPECT_EQ(c->Text(), "");
  EXPECT_DOUBLE_EQ(c->Q("T").given_si, 268.15);
}

TEST(Checker, IntervalShownInDegCSuggestsKOrDdegC) {
  EXPECT_EQ(Errors("given T1 = 80 degC\n"
                   "given T2 = 20 degC\n"
                   "x = T1 - T2 in degC\n"),
            "input:3:16: error: 'x' is a temperature difference; show it in K or ddegC rather "
            "than degC\n"
            "  x = T1 - T2 in degC\n"
            "                 ^~~~\n");
}

TEST(Checker, CheckComparingAbsoluteWithInterval) {
  EXPECT_EQ(Errors("given T1 = 80 degC\n"
                   "given T2 = 20 degC\n"
                   "check T1 > T1 - T2\n"),
            "input:3:7: error: cannot compare an absolute temperature with a temperature "
            "difference\n"
            "  check T1 > T1 - T2\n"
            "        ^~~~~~~~~~~~\n");
}

TEST(Checker, TemperatureRulesThatPass) {
  auto c = Check(
      "given T1 = 80 degC\n"
      "given T2 = 20 degC\n"
      "given Tk = 300 K\n"
      "d = T1 - T2\n"       // absolute - absolute = interval
      "e = T1 + 5 K\n"      // absolute + interval = absolute
      "f = T1 - 5 ddegC\n"  // absolute - interval = absolute
      "g = 5 K + T1\n"      // interval + absolute = absolute
      "h = Tk - T1\n"       // K as an absolute: absolute - absolute
      "i = T1 + Tk - T2\n"  // K as an interval: (absolute + interval) - absolute
      "j = d + 2 K\n"       // interval + K
      // Not "(T1 - T2)/2 in degC": right after a number, `in` is the inch.
      "T_m = T2 + 0.5 * (T1 - T2) in degC\n"
      "check T1 > 300 K\n"  // K literal as an absolute
      "check d >= 5 K\n"    // K literal as an interval
      "check T_m <= 60 degC\n");
  EXPECT_EQ(c->Text(), "");
  EXPECT_EQ(c->Q("d").type.temp, TempKind::kInterval);
  EXPECT_EQ(c->Q("d").display.text, "K");  // an interval shows in K, never degC
  EXPECT_EQ(c->Q("e").type.temp, TempKind::kAbsolute);
  EXPECT_EQ(c->Q("f").type.temp, TempKind::kAbsolute);
  EXPECT_EQ(c->Q("g").type.temp, TempKind::kAbsolute);
  EXPECT_EQ(c->Q("h").type.temp, TempKind::kInterval);
  EXPECT_EQ(c->Q("i").type.temp, TempKind::kInterval);
  // An interval plus a K literal: K may be either, so the result may be too.
  EXPECT_NE(c->Q("j").type.temp, TempKind::kAbsolute);
  EXPECT_EQ(c->Q("j").display.text, "K");
  EXPECT_EQ(c->Q("T_m").type.temp, TempKind::kAbsolute);
  EXPECT_EQ(c->Q("T_m").display.text, "degC");
}

// ---- display units and units ----------------------------------------------

TEST(Checker, DisplayUnitOfTheWrongDimension) {
  EXPECT_EQ(Errors("given m = 1 kg/s\n"
                   "x = (m * 2) in W\n"),
            "input:2:16: error: 'x' is a mass flow rate (kg/s), which cannot be shown in W "
            "(power)\n"
            "  x = (m * 2) in W\n"
            "                 ^\n");
}

TEST(Checker, UnknownUnitInALiteralAndInADisplayUnit) {
  EXPECT_EQ(Errors("given L = 3 furlong\n"
                   "given a = 1\n"
                   "d = a in xyz\n"),
            "input:1:13: error: unknown unit 'furlong'\n"
            "  given L = 3 furlong\n"
            "              ^~~~~~~\n"
            "input:3:10: error: unknown unit 'xyz'\n"
            "  d = a in xyz\n"
            "           ^~~\n");
}

// LANGUAGE.md: "`2 x` is an error that says so ("unknown unit 'x'; write
// 2 * x to multiply") — there is no implicit multiplication."
TEST(Checker, WordAfterANumberIsAUnitAndTheMessageSaysHowToMultiply) {
  const std::string text = Errors("given x = 3\ny = 2 x\n");
  EXPECT_EQ(text.rfind("input:2:7: error: unknown unit 'x'", 0), 0u) << text;
  EXPECT_NE(text.find("write 2 * x to multiply"), std::string::npos) << text;
}

// ---- comparisons, checks and givens ---------------------------------------

TEST(Checker, ComparisonUsedAsAValue) {
  EXPECT_EQ(Errors("given a = 1\n"
                   "given b = 2\n"
                   "x = a < b\n"
                   "y = (a < b) + 1\n"),
            "input:3:5: error: a quantity cannot be a comparison; use a check, or if(condition, "
            "a, b)\n"
            "  x = a < b\n"
            "      ^~~~~\n"
            "input:4:5: error: a comparison gives true or false, not a value; use "
            "if(condition, a, b)\n"
            "  y = (a < b) + 1\n"
            "      ^~~~~~~\n");
}

TEST(Checker, CheckNeedsAComparison) {
  EXPECT_EQ(Errors("given a = 1 m\n"
                   "check a = 2 m\n"
                   "check a\n"
                   "check a < 2 m and a\n"),
            "input:2:9: error: a check compares with ==, not =\n"
            "  check a = 2 m\n"
            "          ^\n"
            "input:3:7: error: a check needs a comparison such as 'T_h2 <= 45 degC'\n"
            "  check a\n"
            "        ^\n"
            "input:4:19: error: 'and' needs a comparison on each side\n"
            "  check a < 2 m and a\n"
            "                    ^\n");
}

TEST(Checker, GivenTakesALiteralNotAnExpression) {
  EXPECT_EQ(Errors("given a = 1\n"
                   "given b = a\n"
                   "given c = 1 + 2\n"),
            "input:2:11: error: expected a literal value such as 0.5 kg/s: this takes a number "
            "with its unit, not an expression (write a calculated quantity instead)\n"
            "  given b = a\n"
            "            ^\n"
            "input:3:13: error: unexpected '+' at the end of the statement\n"
            "  given c = 1 + 2\n"
            "              ^\n");
}

// ---- all errors in one run --------------------------------------------------

TEST(Checker, EveryErrorOfADeckInOneRun) {
  // Five different mistakes on five lines, from the lexer to the checker.
  auto c = Check(
      "given m = 0.5 kg/s\n"
      "given cp = 4.19 kJ/(kg*K)\n"
      "given T1 = 80 degC\n"
      "C = m * cpp\n"             // unknown name
      "x = m + cp\n"              // dimensions
      "given L = 3 furlong\n"     // unit
      "T2 = T1 + T1\n"            // absolute + absolute
      "title \"unterminated\n");  // lexer
  EXPECT_EQ(c->diags.error_count(), 5);
  EXPECT_EQ(c->Text(),
            "input:4:9: error: unknown name 'cpp'\n"
            "  C = m * cpp\n"
            "          ^~~\n"
            "  note: did you mean 'cp'?\n"
            "input:5:5: error: cannot add kg/s and kJ/(kg*K)\n"
            "  x = m + cp\n"
            "      ^~~~~~\n"
            "input:6:13: error: unknown unit 'furlong'\n"
            "  given L = 3 furlong\n"
            "              ^~~~~~~\n"
            "input:7:6: error: cannot add two absolute temperatures; for a mean write "
            "T_a + 0.5 * (T_b - T_a)\n"
            "  T2 = T1 + T1\n"
            "       ^~~~~~~\n"
            "input:8:7: error: unterminated string: missing closing '\"'\n"
            "  title \"unterminated\n"
            "        ^\n");
}

// LANGUAGE.md: "All errors in a deck are reported in one run" -- a cycle in
// one place must not hide a unit error in another.
TEST(Checker, CycleDoesNotHideOtherErrors) {
  const std::string text = Errors(
      "a = b + 1\n"
      "b = a\n"
      "given m = 1 kg/s\n"
      "given C = 1 W/K\n"
      "x = m + C\n");
  EXPECT_NE(text.find("input:1:1: error: dependency cycle: a -> b -> a"), std::string::npos)
      << text;
  EXPECT_NE(text.find("input:5:5: error: cannot add kg/s and W/K"), std::string::npos) << text;
}

TEST(Checker, AnErrorInOneQuantityDoesNotCascadeIntoItsReaders) {
  // y reads the broken x; only x is reported.
  EXPECT_EQ(Errors("given m = 1 kg/s\n"
                   "given C = 2 W/K\n"
                   "x = m + C\n"
                   "y = x * 2\n"
                   "z = y + 1 m\n"),
            "input:3:5: error: cannot add kg/s and W/K\n"
            "  x = m + C\n"
            "      ^~~~~\n");
}

}  // namespace
}  // namespace heatdeck
