// The compiled program's stack machine: every operator and built-in against
// the same operation on C++ doubles, bit for bit; `if` evaluating only the
// branch it takes; the fused instructions it compiles; expressions long and
// deep enough to need a large stack.
#include <bit>
#include <cmath>
#include <cstdint>
#include <string>
#include <vector>

#include <fmt/format.h>
#include <gtest/gtest.h>

#include "eval/program.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"
#include "model/model.h"
#include "session_checks.h"

namespace heatdeck {
namespace {

using test::RenderAll;
using test::SameBits;
using test::Value;

TEST(Program, OperatorsAndBuiltinsGiveWhatCppGives) {
  Session s;
  ASSERT_TRUE(s.LoadText("ops.deck",
                         "given a = 3\ngiven b = -2\ngiven c = 0.7\n"
                         "sq = a^2\ncu = a^3\nfo = a^4\nrt = a^c\nsum2 = (a + b)^2\n"
                         "neg = -a * b\nfused = a * 2 + b / 4 - c\nrev = 10 / a - 1 / c\n"
                         "mn = min(a, b, c)\nmx = max(a, b, c)\none = min(a)\n"
                         "i1 = if(a > b, a - b, a / b)\ni2 = if(a < b, 1, 2)\n"
                         "i3 = if(a > 0, if(b > 0, 1, 2), 3)\n"
                         "l_and = if(a > 0 and b > 0, 1, 0)\nl_or = if(a > 0 or b > 0, 1, 0)\n"
                         "l_not = if(not (a > 0), 1, 0)\n"
                         "near = if(a == 3 + 1e-12, 1, 0)\nfar = if(a != 3.1, 1, 0)\n"
                         "le = if(a <= 3, 1, 0)\nge = if(b >= -1, 1, 0)\n"
                         "f_abs = abs(b)\nf_sqrt = sqrt(a)\nf_exp = exp(c)\nf_ln = ln(a)\n"
                         "f_log = log10(a)\nf_sin = sin(c)\nf_cos = cos(c)\nf_tan = tan(c)\n"
                         "f_asin = asin(c)\nf_acos = acos(c)\nf_atan = atan(b)\n"
                         "f_sinh = sinh(c)\nf_cosh = cosh(c)\nf_tanh = tanh(c)\n",
                         {}))
      << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  // volatile: computed at run time, as the program does, not folded.
  const volatile double a = 3, b = -2, c = 0.7;
  EXPECT_TRUE(SameBits(Value(s, "sq"), a * a));
  EXPECT_TRUE(SameBits(Value(s, "cu"), a * a * a));
  EXPECT_TRUE(SameBits(Value(s, "fo"), a * a * a * a));
  EXPECT_TRUE(SameBits(Value(s, "rt"), std::pow(a, c)));
  EXPECT_TRUE(SameBits(Value(s, "sum2"), std::pow(a + b, 2.0)));
  EXPECT_TRUE(SameBits(Value(s, "neg"), -a * b));
  EXPECT_TRUE(SameBits(Value(s, "fused"), a * 2 + b / 4 - c));
  EXPECT_TRUE(SameBits(Value(s, "rev"), 10 / a - 1 / c));
  EXPECT_TRUE(SameBits(Value(s, "mn"), -2.0));
  EXPECT_TRUE(SameBits(Value(s, "mx"), 3.0));
  EXPECT_TRUE(SameBits(Value(s, "one"), 3.0));
  EXPECT_TRUE(SameBits(Value(s, "i1"), 5.0));
  EXPECT_TRUE(SameBits(Value(s, "i2"), 2.0));
  EXPECT_TRUE(SameBits(Value(s, "i3"), 2.0));
  EXPECT_TRUE(SameBits(Value(s, "l_and"), 0.0));
  EXPECT_TRUE(SameBits(Value(s, "l_or"), 1.0));
  EXPECT_TRUE(SameBits(Value(s, "l_not"), 0.0));
  // == and != within 1e-9 relative (LANGUAGE.md).
  EXPECT_TRUE(SameBits(Value(s, "near"), 1.0));
  EXPECT_TRUE(SameBits(Value(s, "far"), 1.0));
  EXPECT_TRUE(SameBits(Value(s, "le"), 1.0));
  EXPECT_TRUE(SameBits(Value(s, "ge"), 0.0));
  EXPECT_TRUE(SameBits(Value(s, "f_abs"), 2.0));
  EXPECT_TRUE(SameBits(Value(s, "f_sqrt"), std::sqrt(a)));
  EXPECT_TRUE(SameBits(Value(s, "f_exp"), std::exp(c)));
  EXPECT_TRUE(SameBits(Value(s, "f_ln"), std::log(a)));
  EXPECT_TRUE(SameBits(Value(s, "f_log"), std::log10(a)));
  EXPECT_TRUE(SameBits(Value(s, "f_sin"), std::sin(c)));
  EXPECT_TRUE(SameBits(Value(s, "f_cos"), std::cos(c)));
  EXPECT_TRUE(SameBits(Value(s, "f_tan"), std::tan(c)));
  EXPECT_TRUE(SameBits(Value(s, "f_asin"), std::asin(c)));
  EXPECT_TRUE(SameBits(Value(s, "f_acos"), std::acos(c)));
  EXPECT_TRUE(SameBits(Value(s, "f_atan"), std::atan(b)));
  EXPECT_TRUE(SameBits(Value(s, "f_sinh"), std::sinh(c)));
  EXPECT_TRUE(SameBits(Value(s, "f_cosh"), std::cosh(c)));
  EXPECT_TRUE(SameBits(Value(s, "f_tanh"), std::tanh(c)));
}

// min and max pass a failed (NaN) argument on, so that a failure is never
// hidden; the program then reports the quantity as failed.
TEST(Program, MinAndMaxDoNotHideANaN) {
  Session s;
  ASSERT_TRUE(
      s.LoadText("nan.deck", "given a = 1\ngiven b = 2\nlo = min(a, b)\nhi = max(b, a)\n", {}))
      << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  const Model& m = s.model();
  Program p(m, m.order);
  p.LoadGivens();
  p.values()[static_cast<size_t>(m.Find("b"))] = std::nan("");
  EXPECT_FALSE(p.Run());
  EXPECT_EQ(p.failed_step(), m.Find("lo"));
  EXPECT_TRUE(std::isnan(p.frame()[static_cast<size_t>(m.Find("hi"))]));
}

// Only the branch taken runs: the correlation outside its range (Re = 3000
// and Pr = 0.3 are below Dittus-Boelter's limits in LIBRARY.md, so a call
// warns) records nothing when its branch is not taken.
TEST(Program, IfEvaluatesOnlyTheBranchItTakes) {
  Session s;
  ASSERT_TRUE(s.LoadText("if.deck",
                         "given Re = 3000\ngiven Pr = 0.3\n"
                         "Nu = if(Re > 1e5, nu_dittus_boelter(Re, Pr, 0.4), 3.66)\n",
                         {}))
      << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  const Model& m = s.model();
  Program p(m, m.order);
  p.LoadGivens();
  ASSERT_TRUE(p.Run());
  EXPECT_TRUE(p.recorded().empty());
  EXPECT_TRUE(SameBits(p.frame()[static_cast<size_t>(m.Find("Nu"))], 3.66));
  // The other branch: the call runs, and warns.
  p.values()[static_cast<size_t>(m.Find("Re"))] = 2e5;
  ASSERT_TRUE(p.Run());
  EXPECT_FALSE(p.recorded().empty());
  const double nu = p.frame()[static_cast<size_t>(m.Find("Nu"))];
  // Dittus-Boelter, heating (n = 0.4): 0.023 Re^0.8 Pr^0.4 (LIBRARY.md).
  EXPECT_NEAR(nu, 0.023 * std::pow(2e5, 0.8) * std::pow(0.3, 0.4), 1e-9 * nu);
}

// What the compiler makes of a small expression: the right operand of an
// operator read straight from the frame or the code, and x^2 of a quantity
// as a product (hand-derived listing).
TEST(Program, CompilesRightOperandsIntoTheirOperators) {
  Session s;
  ASSERT_TRUE(s.LoadText("code.deck",
                         "given a = 3\ngiven b = 4\nx = a * 2 + b\ny = b^2 - a / (a + 1)\n"
                         "z = if(a > b, a, b)\n",
                         {}))
      << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  const Model& m = s.model();
  Program p(m, m.order);
  EXPECT_EQ(p.CodeText(m.Find("x")), "   0 load a\n   1 mul_const 2\n   2 add_load b\n");
  EXPECT_EQ(p.CodeText(m.Find("y")),
            "   0 load b\n   1 square\n   2 load a\n   3 load a\n   4 add_const 1\n   5 div\n"
            "   6 sub\n");
  EXPECT_EQ(p.CodeText(m.Find("z")),
            "   0 load a\n   1 load b\n   2 gt\n   3 jump_if_zero 6\n   4 load a\n   5 jump 7\n"
            "   6 load b\n");
}

// An expression of 3 600 terms (some 30 000 characters once written out as
// text, past the 20 000 an expression-string library reads) and one nested
// 90 parentheses deep (a stack 91 values deep) compile and give what C++
// gives in the same order.
TEST(Program, LongAndDeepExpressionsCompile) {
  std::string wide = "given a = 0.123456789\nwide = ";
  for (int g = 0; g < 60; ++g) {
    wide += g == 0 ? "(" : " + (";
    for (int t = 0; t < 60; ++t) wide += fmt::format("{}{} * a", t == 0 ? "" : " + ", 1 + g + t);
    wide += ")";
  }
  std::string deep = "\ndeep = ";
  for (int i = 1; i <= 90; ++i) deep += fmt::format("a * {} - (", i);
  deep += "a * 91" + std::string(90, ')') + "\n";
  Session s;
  ASSERT_TRUE(s.LoadText("long.deck", wide + deep, {})) << RenderAll(s);
  ASSERT_TRUE(s.Evaluate()) << RenderAll(s);
  const volatile double a = 0.123456789;
  double sum = 0.0;
  for (int g = 0; g < 60; ++g) {
    double group = (1 + g) * a;
    for (int t = 1; t < 60; ++t) group += (1 + g + t) * a;
    sum = g == 0 ? group : sum + group;
  }
  EXPECT_TRUE(SameBits(Value(s, "wide"), sum));
  // a*1 - (a*2 - (… - a*91)), from the innermost term out.
  double v = a * 91;
  for (int i = 90; i >= 1; --i) v = a * i - v;
  EXPECT_TRUE(SameBits(Value(s, "deep"), v));
}

}  // namespace
}  // namespace heatdeck
