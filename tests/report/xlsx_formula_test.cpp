// Tests of the workbook's spelling of a deck: defined names and formula
// translation.  Expected formulas are written out by hand from the rules in
// src/report/xlsx_formula.h (spreadsheet precedence: unary minus above ^,
// ^ left to right, then * /, then + -, then comparisons).  That the
// formulas compute heatdeck's values is proven by xlsx_recalc_test.cpp,
// which recalculates them in LibreOffice.
#include "report/xlsx_formula.h"

#include <cstdlib>
#include <memory>
#include <regex>
#include <string>

#include <gtest/gtest.h>

#include "lang/parser.h"
#include "model/builder.h"

namespace heatdeck {
namespace {

// A deck parsed and checked from text; `table` files are served from memory.
struct TestModel {
  explicit TestModel(const std::string& text, const std::string& csv = "") {
    const std::string_view name = files.Add("input", text);
    deck = Parse(name, files.Text(name), diags);
    BuildOptions options;
    options.load = [this, csv](const std::string&, const std::string& path,
                               std::string_view* loaded, std::string_view* body, std::string* why) {
      if (csv.empty()) {
        *why = "no files in this test";
        return false;
      }
      const std::string_view n = files.Add(path, csv);
      *loaded = n;
      *body = files.Text(n);
      return true;
    };
    model = BuildModel(deck, options, &keep, diags);
    for (const Diagnostic& d : diags.list()) ADD_FAILURE() << d.message;
    names = xlsx::MakeDefinedNames(*model);
  }
  const Expr* ExprOf(const std::string& quantity) const {
    const int q = model->Find(quantity);
    EXPECT_GE(q, 0) << quantity;
    return q < 0 ? nullptr : model->quantities[static_cast<size_t>(q)].expr;
  }
  // The formula of a calculated quantity, or "NONE: <why>".
  std::string Formula(const std::string& quantity) const {
    xlsx::FormulaWriter w(*model, names.quantities);
    std::string out, why;
    if (!w.Write(ExprOf(quantity), &out, &why)) return "NONE: " + why;
    return out;
  }
  const std::string& Name(const std::string& quantity) const {
    return names.quantities[static_cast<size_t>(model->Find(quantity))];
  }

  SourceFiles files;
  Diagnostics diags;
  Deck deck;
  std::vector<std::unique_ptr<Deck>> keep;
  std::unique_ptr<Model> model;
  xlsx::DefinedNames names;
};

TEST(XlsxNames, CellReferencesFunctionsAndBooleansAreUnsafe) {
  // A1 notation: 1 to 3 letters, then digits.
  for (const char* n : {"A1", "a1", "XFD1048576", "ABC123", "dp1", "NTU2", "Re2", "b9"}) {
    EXPECT_FALSE(xlsx::IsSafeName(n)) << n;
  }
  // R1C1 notation, including R and C alone.
  for (const char* n : {"R", "C", "r", "c", "RC", "R2C3", "R1", "C4", "rc12", "r1c"}) {
    EXPECT_FALSE(xlsx::IsSafeName(n)) << n;
  }
  // Booleans and function names, in any case.
  for (const char* n : {"TRUE", "false", "LN", "ln", "PI", "Sqrt", "besseli", "IF", "SUM", "MIN"}) {
    EXPECT_FALSE(xlsx::IsSafeName(n)) << n;
  }
  // Characters and length.
  EXPECT_FALSE(xlsx::IsSafeName(""));
  EXPECT_FALSE(xlsx::IsSafeName("1a"));
  EXPECT_FALSE(xlsx::IsSafeName("a b"));
  EXPECT_FALSE(xlsx::IsSafeName(std::string(256, 'a')));
  // Ordinary deck names are kept as written.
  for (const char* n : {"T_h1", "hx.Q", "T", "t", "x", "Re_t", "eps", "N_c", "R_u", "ABCD1", "_x",
                        "check_1", "Q", "UA", "NTU", "dT_lm"}) {
    EXPECT_TRUE(xlsx::IsSafeName(n)) << n;
  }
  EXPECT_TRUE(xlsx::IsSafeName(std::string(255, 'a')));
}

TEST(XlsxNames, UniqueIgnoringCaseWithDeckNamesFirst) {
  // Hand-derived from the rule in xlsx_formula.h: pass 1 keeps T, q_A1 (the
  // deck's own), check_1 (a quantity); pass 2 gives t -> t_2 (T taken
  // ignoring case), A1 -> q_A1 taken -> q_A1_2, LN -> q_LN, the check ->
  // check_1 taken -> check_1_2.
  TestModel m(
      "given T = 300 K\n"
      "given t = 5 s\n"
      "given A1 = 2 m^2\n"
      "given q_A1 = 3\n"
      "given LN = 0.5\n"
      "given check_1 = 1\n"
      "y = T / (1 K) + t / (1 s) + A1 / (1 m^2) + q_A1 + LN + check_1\n"
      "check y > 0\n");
  EXPECT_EQ(m.Name("T"), "T");
  EXPECT_EQ(m.Name("t"), "t_2");
  EXPECT_EQ(m.Name("A1"), "q_A1_2");
  EXPECT_EQ(m.Name("q_A1"), "q_A1");
  EXPECT_EQ(m.Name("LN"), "q_LN");
  EXPECT_EQ(m.Name("check_1"), "check_1");
  EXPECT_EQ(m.Name("y"), "y");
  ASSERT_EQ(m.names.checks.size(), 1u);
  EXPECT_EQ(m.names.checks[0], "check_1_2");
  EXPECT_EQ(m.Formula("y"), "T/1+t_2/1+q_A1_2/1+q_A1+q_LN+check_1");
}

TEST(XlsxFormula, PrecedenceAndUnaryMinus) {
  TestModel m(
      "given x = 1.5\n"
      "given y = 0.25\n"
      "n1 = -x^2\n"
      "n2 = (-x)^2\n"
      "n3 = x^-y\n"
      "n4 = x - (y - x)\n"
      "n5 = x / (y * x)\n"
      "n6 = x - y - x\n"
      "n7 = x / y / x\n"
      "n8 = 2^x^y\n"
      "n9 = -(x + y) * -y\n"
      "n10 = x * -y\n"
      "n11 = -x - -y\n"
      "n12 = -(-x)\n"
      "n13 = (x + y)^(1/3)\n"
      "n14 = -2.5 * x + 1e-3 / y\n"
      "n15 = -x^2^y\n"
      "n16 = (x * y) * (x + y)\n"
      "n17 = x + (y + x)\n");
  // N1 … N17 read as cells, so their own names carry q_; the formulas only
  // read x and y.
  EXPECT_EQ(m.Formula("n1"), "-(x^2)");  // the spreadsheet would read -x^2 as (-x)^2
  EXPECT_EQ(m.Formula("n2"), "(-x)^2");
  EXPECT_EQ(m.Formula("n3"), "x^(-y)");
  EXPECT_EQ(m.Formula("n4"), "x-(y-x)");
  EXPECT_EQ(m.Formula("n5"), "x/(y*x)");
  EXPECT_EQ(m.Formula("n6"), "x-y-x");
  EXPECT_EQ(m.Formula("n7"), "x/y/x");
  EXPECT_EQ(m.Formula("n8"), "2^(x^y)");  // the deck's ^ groups right, the spreadsheet's left
  EXPECT_EQ(m.Formula("n9"), "-(x+y)*(-y)");
  EXPECT_EQ(m.Formula("n10"), "x*(-y)");
  EXPECT_EQ(m.Formula("n11"), "-x-(-y)");
  EXPECT_EQ(m.Formula("n12"), "-(-x)");
  EXPECT_EQ(m.Formula("n13"), "(x+y)^(1/3)");
  EXPECT_EQ(m.Formula("n14"), "(-2.5)*x+0.001/y");
  EXPECT_EQ(m.Formula("n15"), "-(x^(2^y))");
  EXPECT_EQ(m.Formula("n16"), "x*y*(x+y)");
  EXPECT_EQ(m.Formula("n17"), "x+(y+x)");
  EXPECT_EQ(m.Name("n1"), "q_n1");
}

TEST(XlsxFormula, LiteralsInSiConstantsAndBuiltins) {
  TestModel m(
      "given x = 1.5\n"
      "given y = 0.25\n"
      "given T = 300 K\n"
      "a1 = 25 mm * x\n"
      "a2 = 80 degC + 1.8e-4 m^2*K/W * 1 W/m^2\n"
      "a3 = pi * x\n"
      "a4 = g_n * 2 s\n"
      "a5 = min(x, y, 2) + max(x) + abs(-y)\n"
      "a6 = sqrt(x) + exp(y) + ln(x) + log10(x)\n"
      "a7 = sin(y) + cos(y) + tan(y) + asin(y) + acos(y) + atan(y)\n"
      "a8 = sinh(y) + cosh(y) + tanh(y)\n"
      "a9 = if(x > y and not (y >= 1) or x == 1.5, x, y)\n"
      "a10 = if(x != y, 1, 0)\n"
      "a11 = if(T < 300 K, 1, 2)\n");
  EXPECT_EQ(m.Formula("a1"), "0.025*x");
  // 80 degC is 353.15 K; 1.8e-4 m^2*K/W * 1 W/m^2 is in K.
  EXPECT_EQ(m.Formula("a2"), "353.15+0.00018*1");
  EXPECT_EQ(m.Formula("a3"), "PI()*x");
  EXPECT_EQ(m.Formula("a4"), "9.80665*2");
  EXPECT_EQ(m.Formula("a5"), "MIN(x,y,2)+x+ABS(-y)");
  EXPECT_EQ(m.Formula("a6"), "SQRT(x)+EXP(y)+LN(x)+LOG10(x)");
  EXPECT_EQ(m.Formula("a7"), "SIN(y)+COS(y)+TAN(y)+ASIN(y)+ACOS(y)+ATAN(y)");
  EXPECT_EQ(m.Formula("a8"), "SINH(y)+COSH(y)+TANH(y)");
  // == holds within 1e-9 relative, as in the evaluator.
  EXPECT_EQ(m.Formula("a9"),
            "IF(OR(AND(x>y,NOT(y>=1)),ABS(x-1.5)<=1E-9*MAX(ABS(x),ABS(1.5))),x,y)");
  EXPECT_EQ(m.Formula("a10"), "IF(NOT(ABS(x-y)<=1E-9*MAX(ABS(x),ABS(y))),1,0)");
  EXPECT_EQ(m.Formula("a11"), "IF(T<300,1,2)");
}

TEST(XlsxFormula, LibraryFunctionsSubstituteParenthesisedArguments) {
  TestModel m(
      "given a = 40 K\n"
      "given b = 15 K\n"
      "given Re = 20000\n"
      "given e = 0.0001\n"
      "d1 = lmtd(a - b, b)\n"
      "d2 = lmtd(a, b)\n"
      "f1 = f_colebrook(Re, e)\n"
      "f2 = 2 * f_colebrook(Re, e) + 1\n"
      "w1 = water_rho(300 K, 1 bar)\n");
  // Every {i} is replaced by the argument: a compound one in parentheses,
  // a name bare.  The expectation substitutes the registry's own form.
  const auto expand = [](std::string form, const std::vector<std::string>& args) {
    for (size_t i = 0; i < args.size(); ++i) {
      form = std::regex_replace(form, std::regex("\\{" + std::to_string(i) + "\\}"), args[i]);
    }
    return form;
  };
  const std::string lmtd = library::FindFunction("lmtd")->spreadsheet;
  EXPECT_EQ(m.Formula("d1"), expand(lmtd, {"(a-b)", "b"}));
  EXPECT_EQ(m.Formula("d2"), expand(lmtd, {"a", "b"}));
  EXPECT_EQ(m.Formula("d1").find('{'), std::string::npos);
  // No closed form: the reason names the function.
  EXPECT_EQ(m.Formula("f1").rfind("NONE: f_colebrook() has no closed form", 0), 0u)
      << m.Formula("f1");
  EXPECT_EQ(m.Formula("f2").rfind("NONE: f_colebrook()", 0), 0u) << m.Formula("f2");
  EXPECT_EQ(m.Formula("w1").rfind("NONE: water_rho()", 0), 0u) << m.Formula("w1");
}

TEST(XlsxFormula, TablesHaveNoFormula) {
  TestModel m(
      "table oil = \"oil.csv\"\n"
      "given T = 50 degC\n"
      "cp = oil.cp(T)\n",
      "T [degC], cp [kJ/(kg*K)]\n20, 1.9\n80, 2.1\n");
  EXPECT_EQ(m.Formula("cp").rfind("NONE: oil.cp() is a linear interpolation in the table oil", 0),
            0u)
      << m.Formula("cp");
}

TEST(XlsxFormula, TooLongForACellHasNoFormula) {
  // eff_counter repeats its arguments; nesting it multiplies the length
  // until it passes the 8192 characters a spreadsheet cell holds.
  TestModel m(
      "given N = 1.2\n"
      "given Cr = 0.5\n"
      "e1 = eff_counter(N, Cr)\n"
      "e4 = eff_counter(eff_counter(eff_counter(eff_counter(N, Cr), Cr), Cr), Cr)\n");
  EXPECT_EQ(m.Formula("e1").rfind("NONE", 0), std::string::npos);
  EXPECT_NE(m.Formula("e4").find("more than a spreadsheet cell holds (8192)"), std::string::npos)
      << m.Formula("e4").substr(0, 200);
}

TEST(XlsxFormula, QuantitiesWithoutExpressions) {
  TestModel m(
      "given a = 2\n"
      "solve x from 0 to 10 so that x^2 = a\n");
  xlsx::FormulaWriter w(*m.model, m.names.quantities);
  std::string out, why;
  EXPECT_FALSE(w.WriteQuantity(m.model->Find("a"), &out, &why));
  EXPECT_EQ(why, "an input");
  EXPECT_FALSE(w.WriteQuantity(m.model->Find("x"), &out, &why));
  EXPECT_EQ(why, "found by a root search");
}

TEST(XlsxFormula, NumbersReadBackExactly) {
  EXPECT_EQ(xlsx::NumberText(0.1), "0.1");
  EXPECT_EQ(xlsx::NumberText(-2.5), "(-2.5)");
  EXPECT_EQ(xlsx::NumberText(1e-300), "1E-300");
  for (double v : {0.1, 1.0 / 3.0, 353.15, 5.670374419e-8, 1e300, -7.25e-19, 4190.0}) {
    std::string t = xlsx::NumberText(v);
    if (t.front() == '(') t = t.substr(1, t.size() - 2);
    EXPECT_EQ(std::strtod(t.c_str(), nullptr), v) << t;
    EXPECT_EQ(t.find('e'), std::string::npos) << t;
  }
}

}  // namespace
}  // namespace heatdeck
