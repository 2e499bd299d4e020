#include "eval/expr_parser.h"

#include <cmath>
#include <cstdlib>

namespace heatdeck {
namespace {

double Min(const double* a, int n) {
  double v = a[0];
  for (int i = 1; i < n; ++i) v = std::isnan(a[i]) || a[i] < v ? a[i] : v;
  return v;
}
double Max(const double* a, int n) {
  double v = a[0];
  for (int i = 1; i < n; ++i) v = std::isnan(a[i]) || a[i] > v ? a[i] : v;
  return v;
}
double Neg(double x) { return -x; }
double Abs(double x) { return std::fabs(x); }
double Sqrt(double x) { return std::sqrt(x); }
double Exp(double x) { return std::exp(x); }
double Ln(double x) { return std::log(x); }
double Log10(double x) { return std::log10(x); }
double Sin(double x) { return std::sin(x); }
double Cos(double x) { return std::cos(x); }
double Tan(double x) { return std::tan(x); }
double Asin(double x) { return std::asin(x); }
double Acos(double x) { return std::acos(x); }
double Atan(double x) { return std::atan(x); }
double Sinh(double x) { return std::sinh(x); }
double Cosh(double x) { return std::cosh(x); }
double Tanh(double x) { return std::tanh(x); }

}  // namespace

ExprParser::ExprParser() {
  AddValIdent(&ExprParser::ReadNumber);
  InitCharSets();
  InitFun();
  InitConst();
  InitOprt();
}

void ExprParser::InitCharSets() {
  DefineNameChars("0123456789_abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ");
  DefineOprtChars("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ+-*^/?<>=#!$%&|~'_{}");
  DefineInfixOprtChars("/+-*^?<>=#!$%&|~'_");
}

void ExprParser::InitFun() {
  // min and max propagate NaN, so that a failed input is never masked.
  DefineFun("min", Min);
  DefineFun("max", Max);
  DefineFun("abs", Abs);
  DefineFun("sqrt", Sqrt);
  DefineFun("exp", Exp);
  DefineFun("ln", Ln);
  DefineFun("log10", Log10);
  DefineFun("sin", Sin);
  DefineFun("cos", Cos);
  DefineFun("tan", Tan);
  DefineFun("asin", Asin);
  DefineFun("acos", Acos);
  DefineFun("atan", Atan);
  DefineFun("sinh", Sinh);
  DefineFun("cosh", Cosh);
  DefineFun("tanh", Tanh);
}

void ExprParser::InitConst() {}

void ExprParser::InitOprt() { DefineInfixOprt("-", Neg); }

// The translator writes numbers as the shortest text that reads back
// exactly ("0.1", "1e-05"); strtod in the C locale reads them back exactly.
int ExprParser::ReadNumber(const char* expr, int* pos, double* value) {
  const char c = expr[0];
  if (!((c >= '0' && c <= '9') || c == '.')) return 0;
  char* end = nullptr;
  const double v = std::strtod(expr, &end);
  if (end == expr) return 0;
  *pos += static_cast<int>(end - expr);
  *value = v;
  return 1;
}

}  // namespace heatdeck
