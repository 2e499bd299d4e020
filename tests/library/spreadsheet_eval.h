// A small evaluator for the registry's spreadsheet formulas (the Excel /
// OpenFormula subset the library writes), so that tests can check that a
// workbook formula reproduces the library's value without a spreadsheet
// program.  Test-only; not a general formula engine.
//
// Precedence as in Excel: comparison (= <> < > <= >=) lowest, then + -,
// then * /, then ^ (left-associative), then unary minus (which binds tighter
// than ^: -2^2 = 4).  Functions: PI, LN, LOG10, EXP, SQRT, ABS, TANH, SINH,
// COSH, POWER, MIN, MAX, IF, AND, OR, NOT, BESSELI(x, n), BESSELK(x, n).
// Arguments are separated by ','.  IF picks its branch after evaluating both
// (a NaN in the branch not taken does not matter).
#pragma once

#include <cctype>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <numbers>
#include <string>
#include <vector>

namespace heatdeck::testing {

class SpreadsheetEval {
 public:
  // Replaces each {i} by "(args[i])" printed with 17 significant digits, as
  // the workbook writer substitutes each argument's formula parenthesised.
  static std::string Substitute(const std::string& formula, const std::vector<double>& args,
                                std::string* error) {
    std::string out;
    for (size_t i = 0; i < formula.size(); ++i) {
      if (formula[i] != '{') {
        out += formula[i];
        continue;
      }
      const size_t close = formula.find('}', i);
      if (close == std::string::npos) {
        *error = "unclosed '{'";
        return {};
      }
      const int index = std::atoi(formula.substr(i + 1, close - i - 1).c_str());
      if (index < 0 || static_cast<size_t>(index) >= args.size()) {
        *error = "placeholder {" + std::to_string(index) + "} has no argument";
        return {};
      }
      char buf[40];
      std::snprintf(buf, sizeof buf, "(%.17g)", args[static_cast<size_t>(index)]);
      out += buf;
      i = close;
    }
    return out;
  }

  // Evaluates formula with args substituted.  Returns false and sets *error on
  // a syntax error or an unknown function.
  static bool Evaluate(const std::string& formula, const std::vector<double>& args, double* out,
                       std::string* error) {
    error->clear();
    SpreadsheetEval e;
    e.text_ = Substitute(formula, args, error);
    if (!error->empty()) return false;
    *out = e.Comparison();
    e.SkipSpace();
    if (e.error_.empty() && e.pos_ != e.text_.size()) e.error_ = "trailing text";
    if (!e.error_.empty()) {
      *error = e.error_ + " at offset " + std::to_string(e.pos_) + " of " + e.text_;
      return false;
    }
    return true;
  }

 private:
  void SkipSpace() {
    while (pos_ < text_.size() && text_[pos_] == ' ') ++pos_;
  }
  bool Accept(const char* s) {
    SkipSpace();
    const std::string token(s);
    if (text_.compare(pos_, token.size(), token) == 0) {
      pos_ += token.size();
      return true;
    }
    return false;
  }
  void Expect(const char* s) {
    if (!Accept(s) && error_.empty()) error_ = std::string("expected '") + s + "'";
  }

  double Comparison() {
    double lhs = Sum();
    for (;;) {
      if (Accept("<=")) {
        lhs = lhs <= Sum() ? 1 : 0;
      } else if (Accept(">=")) {
        lhs = lhs >= Sum() ? 1 : 0;
      } else if (Accept("<>")) {
        lhs = lhs != Sum() ? 1 : 0;
      } else if (Accept("<")) {
        lhs = lhs < Sum() ? 1 : 0;
      } else if (Accept(">")) {
        lhs = lhs > Sum() ? 1 : 0;
      } else if (Accept("=")) {
        lhs = lhs == Sum() ? 1 : 0;
      } else {
        return lhs;
      }
    }
  }
  double Sum() {
    double v = Product();
    for (;;) {
      if (Accept("+")) {
        v += Product();
      } else if (Accept("-")) {
        v -= Product();
      } else {
        return v;
      }
    }
  }
  double Product() {
    double v = Power();
    for (;;) {
      if (Accept("*")) {
        v *= Power();
      } else if (Accept("/")) {
        v /= Power();
      } else {
        return v;
      }
    }
  }
  double Power() {
    double v = Unary();
    while (Accept("^")) v = std::pow(v, Unary());
    return v;
  }
  double Unary() {
    if (Accept("-")) return -Unary();
    if (Accept("+")) return Unary();
    return Primary();
  }
  double Primary() {
    SkipSpace();
    if (Accept("(")) {
      const double v = Comparison();
      Expect(")");
      return v;
    }
    if (pos_ < text_.size() &&
        (std::isdigit(static_cast<unsigned char>(text_[pos_])) || text_[pos_] == '.')) {
      const char* begin = text_.c_str() + pos_;
      char* end = nullptr;
      const double v = std::strtod(begin, &end);
      pos_ += static_cast<size_t>(end - begin);
      return v;
    }
    std::string name;
    while (pos_ < text_.size() &&
           (std::isalnum(static_cast<unsigned char>(text_[pos_])) || text_[pos_] == '_')) {
      name += text_[pos_++];
    }
    if (name.empty()) {
      if (error_.empty()) error_ = "expected a value";
      return 0;
    }
    Expect("(");
    std::vector<double> a;
    if (!Accept(")")) {
      do {
        a.push_back(Comparison());
      } while (Accept(","));
      Expect(")");
    }
    return Call(name, a);
  }
  double Call(const std::string& f, const std::vector<double>& a) {
    auto need = [&](size_t n) {
      if (a.size() == n) return true;
      if (error_.empty()) error_ = f + " takes " + std::to_string(n) + " arguments";
      return false;
    };
    if (f == "PI" && need(0)) return std::numbers::pi;
    if (f == "LN" && need(1)) return std::log(a[0]);
    if (f == "LOG10" && need(1)) return std::log10(a[0]);
    if (f == "EXP" && need(1)) return std::exp(a[0]);
    if (f == "SQRT" && need(1)) return std::sqrt(a[0]);
    if (f == "ABS" && need(1)) return std::abs(a[0]);
    if (f == "TANH" && need(1)) return std::tanh(a[0]);
    if (f == "SINH" && need(1)) return std::sinh(a[0]);
    if (f == "COSH" && need(1)) return std::cosh(a[0]);
    if (f == "POWER" && need(2)) return std::pow(a[0], a[1]);
    if (f == "IF" && need(3)) return a[0] != 0 ? a[1] : a[2];
    if (f == "NOT" && need(1)) return a[0] == 0 ? 1 : 0;
    if (f == "BESSELI" && need(2)) return std::cyl_bessel_i(a[1], a[0]);
    if (f == "BESSELK" && need(2)) return std::cyl_bessel_k(a[1], a[0]);
    if ((f == "MIN" || f == "MAX" || f == "AND" || f == "OR") && !a.empty()) {
      double v = a[0];
      for (double x : a) {
        if (f == "MIN") v = std::fmin(v, x);
        if (f == "MAX") v = std::fmax(v, x);
        if (f == "AND") v = (v != 0 && x != 0) ? 1 : 0;
        if (f == "OR") v = (v != 0 || x != 0) ? 1 : 0;
      }
      return v;
    }
    if (error_.empty()) error_ = "unknown or misused function " + f;
    return 0;
  }

  std::string text_;
  size_t pos_ = 0;
  std::string error_;
};

}  // namespace heatdeck::testing
