// The evaluator end to end through the public Session: the first deck of
// LANGUAGE.md evaluated and every value compared with a derivation written
// out here; checks with their margins; domain errors located and explained;
// the compiled program re-run with new inputs; literals carried exactly.
#include <bit>
#include <cmath>
#include <cstdint>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "eval/program.h"
#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"
#include "model/model.h"
#include "session_checks.h"

namespace heatdeck {
namespace {

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

constexpr double kTol = 1e-9;  // relative, as issue 2's "done when" asks for T_h2

// |actual - expected| <= kTol * |expected|.
::testing::AssertionResult Near(double actual, double expected) {
  if (std::fabs(actual - expected) <= kTol * std::fabs(expected)) {
    return ::testing::AssertionSuccess();
  }
  return ::testing::AssertionFailure()
         << actual << " differs from " << expected << " by more than " << kTol << " relative";
}

using test::RenderAll;
using test::SameBits;
using test::Value;

// The hand calculation of the first deck (SI units throughout).
//   C_h = m_h * cp_h = 0.50 kg/s * 4190 J/(kg K)      = 2095 W/K
//   C_c = m_c * cp_c = 0.70 kg/s * 4180 J/(kg K)      = 2926 W/K
//   C_min = 2095 W/K, C_max = 2926 W/K, Cr = 2095/2926
//   NTU = UA / C_min = 2900 / 2095
//   eps, counterflow (Kays & London, Compact Heat Exchangers, 3rd ed.,
//   Table 2-2; also Incropera & DeWitt eq. 11.29a):
//     eps = (1 - exp(-NTU (1 - Cr))) / (1 - Cr exp(-NTU (1 - Cr)))
//   Q    = eps * C_min * (T_h1 - T_c1), T_h1 - T_c1 = 80 degC - 20 degC = 60 K
//   T_h2 = T_h1 - Q / C_h  (energy balance on the hot stream)
//   T_c2 = T_c1 + Q / C_c  (energy balance on the cold stream)
struct Hand {
  double m_h, cp_h, m_c, cp_c, UA, T_h1, T_c1;
  double C_h, C_c, C_min, Cr, NTU, eps, Q, T_h2, T_c2;
  void Solve() {
    C_h = m_h * cp_h;
    C_c = m_c * cp_c;
    C_min = std::min(C_h, C_c);
    Cr = C_min / std::max(C_h, C_c);
    NTU = UA / C_min;
    const double x = std::exp(-NTU * (1.0 - Cr));
    eps = (1.0 - x) / (1.0 - Cr * x);
    Q = eps * C_min * (T_h1 - T_c1);
    T_h2 = T_h1 - Q / C_h;
    T_c2 = T_c1 + Q / C_c;
  }
};

Hand FirstDeckByHand() {
  Hand h{};
  h.m_h = 0.50;
  h.cp_h = 4190.0;
  h.m_c = 0.70;
  h.cp_c = 4180.0;
  h.UA = 2900.0;
  h.T_h1 = 353.15;  // 80 degC
  h.T_c1 = 293.15;  // 20 degC
  h.Solve();
  return h;
}

TEST(Evaluator, FirstDeckOfTheLanguageMatchesTheHandCalculation) {
  Session s;
  ASSERT_TRUE(s.LoadText("input", kFirstDeck, {})) << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  EXPECT_EQ(RenderAll(s), "");
  EXPECT_EQ(s.ExitStatus(), 0);
  const Hand h = FirstDeckByHand();

  // The products that come out round.
  EXPECT_TRUE(Near(Value(s, "C_h"), 2095.0));
  EXPECT_TRUE(Near(Value(s, "C_c"), 2926.0));
  EXPECT_TRUE(Near(Value(s, "C_min"), 2095.0));
  // The rest against the derivation above.
  EXPECT_TRUE(Near(Value(s, "Cr"), h.Cr));
  EXPECT_TRUE(Near(Value(s, "NTU"), h.NTU));
  EXPECT_TRUE(Near(Value(s, "eps"), h.eps));
  EXPECT_TRUE(Near(Value(s, "Q"), h.Q));
  EXPECT_TRUE(Near(Value(s, "T_h2"), h.T_h2));
  EXPECT_TRUE(Near(Value(s, "T_c2"), h.T_c2));
  // The same derivation carried out in 50-digit decimal arithmetic (Python's
  // decimal module), so the double evaluation above is itself checked:
  //   eps = 0.629052857174277105877..., Q = 79071.9441468066322... W,
  //   T_h2 = 315.406828569543373647... K = 42.2568285695433736... degC,
  //   T_c2 = 320.173904356393244090... K.
  EXPECT_TRUE(Near(Value(s, "eps"), 0.629052857174277105877));
  EXPECT_TRUE(Near(Value(s, "Q"), 79071.9441468066322088));
  EXPECT_TRUE(Near(Value(s, "T_h2"), 315.406828569543373647));
  EXPECT_TRUE(Near(Value(s, "T_c2"), 320.173904356393244090));

  // Display units: T_h2 in degC is the SI value less 273.15 K.
  const Quantity& t_h2 = s.model().quantities[static_cast<size_t>(s.model().Find("T_h2"))];
  EXPECT_TRUE(Near(t_h2.display.FromSi(Value(s, "T_h2")), 42.2568285695433736));
  const Quantity& q = s.model().quantities[static_cast<size_t>(s.model().Find("Q"))];
  EXPECT_TRUE(Near(q.display.FromSi(Value(s, "Q")), 79.0719441468066322));
}

TEST(Evaluator, FirstDeckChecksPassWithTheirMargins) {
  Session s;
  ASSERT_TRUE(s.LoadText("input", kFirstDeck, {})) << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  const Hand h = FirstDeckByHand();
  const CaseResult& base = s.results().cases.at(0);
  ASSERT_EQ(base.checks.size(), 2u);
  EXPECT_EQ(base.failed_checks, 0);

  // check T_h2 <= 45 degC: margin = rhs - lhs = 318.15 K - T_h2.
  const CheckResult& c1 = base.checks[0];
  EXPECT_TRUE(c1.evaluated);
  EXPECT_TRUE(c1.pass);
  EXPECT_TRUE(Near(c1.lhs_si, h.T_h2));
  EXPECT_TRUE(Near(c1.rhs_si, 318.15));
  EXPECT_TRUE(Near(c1.margin_si, 318.15 - h.T_h2));  // 2.7431714304566... K

  // check T_h2 - T_c1 >= 5 K: margin = lhs - rhs = (T_h2 - T_c1) - 5 K.
  const CheckResult& c2 = base.checks[1];
  EXPECT_TRUE(c2.evaluated);
  EXPECT_TRUE(c2.pass);
  EXPECT_TRUE(Near(c2.lhs_si, h.T_h2 - h.T_c1));
  EXPECT_TRUE(Near(c2.rhs_si, 5.0));
  EXPECT_TRUE(Near(c2.margin_si, h.T_h2 - h.T_c1 - 5.0));  // 17.2568... K
}

TEST(Evaluator, CaseThatFailsACheckHasANegativeMargin) {
  // A fouled exchanger: UA = 1.0 kW/K.  By the same derivation with
  // NTU = 1000/2095: eps = 0.338271570464473..., Q = 42520.7364073842... W,
  // T_h2 = 59.7037057721316... degC, above the 45 degC limit.
  Session s;
  ASSERT_TRUE(s.LoadText("input", std::string(kFirstDeck) + "case fouled: UA = 1.0 kW/K\n", {}))
      << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  ASSERT_EQ(s.results().cases.size(), 2u);
  const CaseResult& fouled = s.results().cases[1];
  EXPECT_EQ(fouled.name, "fouled");
  Hand h = FirstDeckByHand();
  h.UA = 1000.0;
  h.Solve();
  EXPECT_TRUE(Near(Value(s, "T_h2", 1), h.T_h2));
  EXPECT_TRUE(Near(Value(s, "T_h2", 1), 273.15 + 59.7037057721316097));
  EXPECT_TRUE(Near(Value(s, "Q", 1), 42520.7364073842777));
  ASSERT_EQ(fouled.checks.size(), 2u);
  EXPECT_TRUE(fouled.checks[0].evaluated);
  EXPECT_FALSE(fouled.checks[0].pass);
  EXPECT_TRUE(Near(fouled.checks[0].margin_si, 318.15 - h.T_h2));  // -14.70... K
  EXPECT_LT(fouled.checks[0].margin_si, 0.0);
  EXPECT_TRUE(fouled.checks[1].pass);
  EXPECT_EQ(fouled.failed_checks, 1);
  EXPECT_EQ(s.results().failed_checks(), 1);
  EXPECT_EQ(s.ExitStatus(), 1);  // LANGUAGE.md: 1 = evaluated, and a check failed
  // The base case is untouched by the case.
  EXPECT_TRUE(s.results().cases[0].checks[0].pass);
}

TEST(Evaluator, EqualityCheckUsesARelativeToleranceOf1e9) {
  // LANGUAGE.md: `==` holds within 1e-9 relative.
  Session s;
  ASSERT_TRUE(s.LoadText("input",
                         "given a = 1 m\n"
                         "b = a * (1 + 5e-10)\n"
                         "c = a * (1 + 5e-9)\n"
                         "check b == a\n"
                         "check c == a\n"
                         "check c != a\n",
                         {}))
      << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  const auto& checks = s.results().cases[0].checks;
  ASSERT_EQ(checks.size(), 3u);
  EXPECT_TRUE(checks[0].pass);
  EXPECT_FALSE(checks[1].pass);
  EXPECT_TRUE(checks[2].pass);
  // -|lhs - rhs| and |lhs - rhs|, with the rounding of 1 + 5e-9 in doubles.
  const double diff = (1.0 + 5e-9) - 1.0;
  EXPECT_DOUBLE_EQ(checks[1].margin_si, -diff);
  EXPECT_DOUBLE_EQ(checks[2].margin_si, diff);
}

// ---- domain errors ----------------------------------------------------------

struct RuntimeError {
  std::string message;
  int line, col, last_col;
};

std::vector<RuntimeError> Errors(const Session& s) {
  std::vector<RuntimeError> v;
  for (const Diagnostic* d : s.diagnostics().Sorted()) {
    if (d->severity != Severity::kError) continue;
    v.push_back(RuntimeError{d->message, d->range.line, d->range.col, d->range.last_col});
  }
  return v;
}

TEST(Evaluator, DomainErrorsAreLocatedAndNameTheQuantityAndTheValues) {
  Session s;
  ASSERT_TRUE(s.LoadText("input",
                         "given a = 1 m\n"               // 1
                         "given b = 0 m\n"               // 2
                         "given n = -2\n"                // 3
                         "given big = 1e300 W\n"         // 4
                         "x = a / b\n"                   // 5
                         "y = ln(n)\n"                   // 6
                         "z = sqrt(n)\n"                 // 7
                         "w = big * big\n"               // 8
                         "v = exp(-n * 500)\n"           // 9
                         "given T = 150 degC\n"          // 10
                         "given p = 1 bar\n"             // 11
                         "rho = 2 * water_rho(T, p)\n",  // 12
                         {}))
      << RenderAll(s);
  EXPECT_FALSE(s.Evaluate());
  EXPECT_EQ(s.ExitStatus(), 2);
  const std::vector<RuntimeError> e = Errors(s);
  ASSERT_EQ(e.size(), 6u) << RenderAll(s);

  EXPECT_EQ(e[0].message, "cannot evaluate 'x': division by zero: b = 0 m is 0");
  EXPECT_EQ((std::vector<int>{e[0].line, e[0].col, e[0].last_col}), (std::vector<int>{5, 5, 9}));

  EXPECT_EQ(e[1].message.rfind("cannot evaluate 'y': the logarithm of a number that is not "
                               "positive: ln(n = -2",
                               0),
            0u)
      << e[1].message;
  EXPECT_EQ((std::vector<int>{e[1].line, e[1].col, e[1].last_col}), (std::vector<int>{6, 5, 9}));

  EXPECT_EQ(e[2].message.rfind(
                "cannot evaluate 'z': the square root of a negative number: sqrt(n = -2", 0),
            0u)
      << e[2].message;
  EXPECT_EQ((std::vector<int>{e[2].line, e[2].col, e[2].last_col}), (std::vector<int>{7, 5, 11}));

  // Overflow of an operation and of a function, each with the values.
  EXPECT_EQ(e[3].message.rfind("cannot evaluate 'w': ", 0), 0u) << e[3].message;
  EXPECT_NE(e[3].message.find("overflow"), std::string::npos) << e[3].message;
  EXPECT_EQ((std::vector<int>{e[3].line, e[3].col, e[3].last_col}), (std::vector<int>{8, 5, 13}));
  EXPECT_EQ(e[4].message.rfind("cannot evaluate 'v': exp overflows for ", 0), 0u) << e[4].message;
  EXPECT_NE(e[4].message.find("1000"), std::string::npos) << e[4].message;
  EXPECT_EQ(e[4].line, 9);

  // A library function's own error: water at 150 degC and 1 bar is steam
  // (saturation pressure at 150 degC is 476.16 kPa, IAPWS-IF97 Table 35).
  EXPECT_EQ(e[5].message.rfind("cannot evaluate 'rho': water_rho: ", 0), 0u) << e[5].message;
  EXPECT_NE(e[5].message.find("vapour"), std::string::npos) << e[5].message;
  EXPECT_NE(e[5].message.find("423.15 K"), std::string::npos) << e[5].message;
  EXPECT_EQ(e[5].line, 12);
  EXPECT_EQ(e[5].col, 11);  // the call, not the whole expression
}

TEST(Evaluator, RuntimeErrorDoesNotStopIndependentQuantities) {
  Session s;
  ASSERT_TRUE(s.LoadText("input",
                         "given a = 1 m\n"
                         "given b = 0 m\n"
                         "x = a / b\n"             // fails
                         "y = a * 2\n"             // independent: evaluated
                         "z = x + 1\n"             // reads x: not evaluated, not reported again
                         "u = sqrt(-1 * a / a)\n"  // fails on its own: reported too
                         "check y > 1 m\n"
                         "check z > 1\n",
                         {}))
      << RenderAll(s);
  EXPECT_FALSE(s.Evaluate());
  const std::vector<RuntimeError> e = Errors(s);
  ASSERT_EQ(e.size(), 2u) << RenderAll(s);
  EXPECT_EQ(e[0].line, 3);
  EXPECT_EQ(e[1].line, 6);
  const CaseResult& base = s.results().cases.at(0);
  const auto ok = [&](const char* n) { return base.ok.at(static_cast<size_t>(s.model().Find(n))); };
  EXPECT_FALSE(ok("x"));
  EXPECT_TRUE(ok("y"));
  EXPECT_FALSE(ok("z"));
  EXPECT_FALSE(ok("u"));
  EXPECT_EQ(Value(s, "y"), 2.0);
  EXPECT_TRUE(std::isnan(Value(s, "z")));
  // A check on a good quantity is still evaluated; one on a failed one is not.
  ASSERT_EQ(base.checks.size(), 2u);
  EXPECT_TRUE(base.checks[0].evaluated);
  EXPECT_TRUE(base.checks[0].pass);
  EXPECT_FALSE(base.checks[1].evaluated);
}

// ---- the compiled program ---------------------------------------------------

TEST(Evaluator, ProgramRerunWithNewInputsGivesTheNewResults) {
  Session s;
  ASSERT_TRUE(s.LoadText("input", kFirstDeck, {})) << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  const Model& m = s.model();
  Program p(m, m.order);
  p.LoadGivens();
  ASSERT_TRUE(p.Run());
  // The program gives the session's values, bit for bit.
  for (size_t i = 0; i < m.quantities.size(); ++i) {
    EXPECT_TRUE(SameBits(p.frame()[i], s.results().cases[0].values[i])) << m.quantities[i].name;
  }
  const std::string text_before = p.CodeText(m.Find("T_h2"));

  // New inputs: m_h = 0.62 kg/s, UA = 3.4 kW/K, T_c1 = 25 degC.
  const auto at = [&](const char* n) { return static_cast<size_t>(m.Find(n)); };
  p.values()[at("m_h")] = 0.62;
  p.values()[at("UA")] = 3400.0;
  p.values()[at("T_c1")] = 298.15;
  ASSERT_TRUE(p.Run());
  Hand h = FirstDeckByHand();
  h.m_h = 0.62;
  h.UA = 3400.0;
  h.T_c1 = 298.15;
  h.Solve();
  // Now C_h = 0.62 * 4190 = 2597.8 W/K is still C_min (C_c = 2926 W/K).
  EXPECT_TRUE(Near(p.frame()[at("C_h")], 2597.8));
  EXPECT_TRUE(Near(p.frame()[at("Cr")], h.Cr));
  EXPECT_TRUE(Near(p.frame()[at("NTU")], h.NTU));
  EXPECT_TRUE(Near(p.frame()[at("eps")], h.eps));
  EXPECT_TRUE(Near(p.frame()[at("Q")], h.Q));
  EXPECT_TRUE(Near(p.frame()[at("T_h2")], h.T_h2));
  EXPECT_TRUE(Near(p.frame()[at("T_c2")], h.T_c2));
  // Checks read the same frame.
  std::vector<CheckResult> checks;
  int failed = 0;
  p.RunChecks(&checks, &failed);
  ASSERT_EQ(checks.size(), 2u);
  EXPECT_TRUE(Near(checks[0].margin_si, 318.15 - h.T_h2));
  EXPECT_EQ(failed, h.T_h2 <= 318.15 ? 0 : 1);
  // Nothing was recompiled.
  EXPECT_EQ(p.CodeText(m.Find("T_h2")), text_before);

  // Back to the deck's givens: the first results again, exactly.
  p.LoadGivens();
  ASSERT_TRUE(p.Run());
  EXPECT_TRUE(SameBits(p.frame()[at("T_h2")], Value(s, "T_h2")));
}

TEST(Evaluator, ProgramRunStopsAtTheFirstFailingStepAndNamesIt) {
  Session s;
  ASSERT_TRUE(s.LoadText("input", "given a = 1 m\ngiven b = 2 m\nx = a / b\n", {}));
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  const Model& m = s.model();
  Program p(m, m.order);
  p.LoadGivens();
  p.values()[static_cast<size_t>(m.Find("b"))] = 0.0;
  EXPECT_FALSE(p.Run());
  EXPECT_EQ(p.failed_step(), m.Find("x"));
  EXPECT_EQ(p.failure().text, "cannot evaluate 'x': division by zero: b = 0 m is 0");
  EXPECT_EQ(p.failure().range.line, 3);
}

// ---- exactness ----------------------------------------------------------------

TEST(Evaluator, LiteralsAndArithmeticAreCarriedExactly) {
  // Each quantity is compared bit for bit with the same operation on C++
  // doubles: folding a literal into the compiled expression must not round.
  Session s;
  ASSERT_TRUE(s.LoadText("input",
                         "given a = 0.1\n"
                         "given tiny = 1e-300\n"
                         "given sub = 4.9e-324\n"
                         "b = a + tiny\n"
                         "c = a * 3\n"
                         "d = tiny / 3\n"
                         "e = 1.7976931348623157e308 / 2\n"
                         "f = sub * 1\n"
                         "g = 0.1 + 0.2\n"
                         "h = 123456789.123456789\n"
                         "i = 2.2250738585072014e-308 * 1\n"
                         "j = 1 / 3\n"
                         "k = -a\n",
                         {}))
      << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  const volatile double tenth = 0.1, tiny = 1e-300, sub = 4.9e-324;
  EXPECT_TRUE(SameBits(Value(s, "a"), 0.1));
  EXPECT_TRUE(SameBits(Value(s, "tiny"), 1e-300));
  EXPECT_TRUE(SameBits(Value(s, "sub"), 4.9e-324));
  EXPECT_TRUE(SameBits(Value(s, "b"), tenth + tiny));
  EXPECT_TRUE(SameBits(Value(s, "c"), tenth * 3));
  EXPECT_TRUE(SameBits(Value(s, "d"), tiny / 3));
  EXPECT_TRUE(SameBits(Value(s, "e"), 1.7976931348623157e308 / 2));
  EXPECT_TRUE(SameBits(Value(s, "f"), sub * 1));
  EXPECT_TRUE(SameBits(Value(s, "g"), 0.30000000000000004));
  EXPECT_TRUE(SameBits(Value(s, "h"), 123456789.123456789));
  EXPECT_TRUE(SameBits(Value(s, "i"), 2.2250738585072014e-308));
  EXPECT_TRUE(SameBits(Value(s, "j"), 1.0 / 3.0));
  EXPECT_TRUE(SameBits(Value(s, "k"), -0.1));
}

}  // namespace
}  // namespace heatdeck
