#include "report/xlsx_formula.h"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <set>
#include <string_view>

#include <fmt/format.h>

#include "units/unit.h"

namespace heatdeck::xlsx {
namespace {

// Excel refuses longer formulas (its specification limits); LibreOffice
// accepts them, but the workbook is meant for either.
constexpr size_t kMaxFormulaChars = 8192;
// The evaluator's tolerance for == and != (LANGUAGE.md).
constexpr const char* kEqualTol = "1E-9";
constexpr size_t kMaxNameChars = 200;

std::string Upper(std::string_view s) {
  std::string out(s);
  for (char& c : out) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  return out;
}

bool IsLetter(char c) { return std::isalpha(static_cast<unsigned char>(c)) != 0; }
bool IsDigit(char c) { return std::isdigit(static_cast<unsigned char>(c)) != 0; }

// "A1", "dp1", "NTU12": 1 to 3 letters then digits only.  Excel's last
// column is XFD (3 letters); refusing every 3-letter column, even beyond
// XFD, keeps the rule simple and safe in any spreadsheet.
bool LooksLikeA1(std::string_view s) {
  size_t i = 0;
  while (i < s.size() && IsLetter(s[i])) ++i;
  if (i == 0 || i > 3 || i == s.size()) return false;
  for (size_t j = i; j < s.size(); ++j) {
    if (!IsDigit(s[j])) return false;
  }
  return true;
}

// "R", "C", "RC", "R2", "C3", "R2C3": row and column references in R1C1
// notation, which spreadsheets also parse in names.
bool LooksLikeR1C1(std::string_view s) {
  size_t i = 0;
  const auto digits = [&] {
    while (i < s.size() && IsDigit(s[i])) ++i;
  };
  if (i < s.size() && (s[i] == 'R' || s[i] == 'r')) {
    ++i;
    digits();
  }
  if (i < s.size() && (s[i] == 'C' || s[i] == 'c')) {
    ++i;
    digits();
  }
  return i > 0 && i == s.size();
}

// Function names a formula of this workbook may call: the ones this file
// writes, the ones in the library's spreadsheet forms, and a few common
// ones a reviewer is likely to type.
const std::set<std::string>& FunctionNames() {
  static const std::set<std::string> names = [] {
    std::set<std::string> s = {"PI",    "LN",      "LOG10",   "EXP",    "SQRT",  "ABS",     "MIN",
                               "MAX",   "IF",      "AND",     "OR",     "NOT",   "SIN",     "COS",
                               "TAN",   "ASIN",    "ACOS",    "ATAN",   "SINH",  "COSH",    "TANH",
                               "SUM",   "LOG",     "INT",     "MOD",    "ROUND", "PRODUCT", "SIGN",
                               "POWER", "COUNTIF", "BESSELI", "BESSELK"};
    for (const library::FunctionInfo& f : library::Functions()) {
      if (f.spreadsheet == nullptr) continue;
      const std::string_view t = f.spreadsheet;
      for (size_t i = 0; i < t.size(); ++i) {
        if (t[i] != '(') continue;
        size_t b = i;
        while (b > 0 && (IsLetter(t[b - 1]) || IsDigit(t[b - 1]) || t[b - 1] == '.')) --b;
        if (b < i && IsLetter(t[b])) s.insert(Upper(t.substr(b, i - b)));
      }
    }
    return s;
  }();
  return names;
}

const char* BuiltinSheetName(Builtin id) {
  switch (id) {
    case Builtin::kMin:
      return "MIN";
    case Builtin::kMax:
      return "MAX";
    case Builtin::kAbs:
      return "ABS";
    case Builtin::kSqrt:
      return "SQRT";
    case Builtin::kExp:
      return "EXP";
    case Builtin::kLn:
      return "LN";
    case Builtin::kLog10:
      return "LOG10";
    case Builtin::kSin:
      return "SIN";
    case Builtin::kCos:
      return "COS";
    case Builtin::kTan:
      return "TAN";
    case Builtin::kAsin:
      return "ASIN";
    case Builtin::kAcos:
      return "ACOS";
    case Builtin::kAtan:
      return "ATAN";
    case Builtin::kSinh:
      return "SINH";
    case Builtin::kCosh:
      return "COSH";
    case Builtin::kTanh:
      return "TANH";
    case Builtin::kIf:
      return "IF";
  }
  return "";
}

// True when text is one function call from its first character to its last
// ("IF(a,b,c)"), so that it needs no parentheses around it.
bool IsOneCall(std::string_view t) {
  size_t i = 0;
  while (i < t.size() && (IsLetter(t[i]) || IsDigit(t[i]) || t[i] == '.')) ++i;
  if (i == 0 || i >= t.size() || t[i] != '(') return false;
  int depth = 0;
  for (size_t j = i; j < t.size(); ++j) {
    if (t[j] == '(') ++depth;
    if (t[j] == ')' && --depth == 0) return j + 1 == t.size();
  }
  return false;
}

}  // namespace

bool IsSafeName(const std::string& name) {
  if (name.empty() || name.size() > 255) return false;
  if (!IsLetter(name[0]) && name[0] != '_') return false;
  for (char c : name) {
    if (!IsLetter(c) && !IsDigit(c) && c != '_' && c != '.') return false;
  }
  if (LooksLikeA1(name) || LooksLikeR1C1(name)) return false;
  const std::string up = Upper(name);
  if (up == "TRUE" || up == "FALSE") return false;
  return FunctionNames().count(up) == 0;
}

DefinedNames MakeDefinedNames(const Model& model) {
  const size_t nq = model.quantities.size();
  std::vector<std::string> wanted;
  wanted.reserve(nq + model.checks.size());
  for (const Quantity& q : model.quantities) wanted.push_back(q.name);
  for (size_t k = 0; k < model.checks.size(); ++k) wanted.push_back(fmt::format("check_{}", k + 1));

  std::vector<std::string> out(wanted.size());
  std::set<std::string> taken;  // upper case: spreadsheets ignore case in names
  std::vector<size_t> pending;
  for (size_t i = 0; i < wanted.size(); ++i) {
    if (IsSafeName(wanted[i]) && taken.insert(Upper(wanted[i])).second) {
      out[i] = wanted[i];
    } else {
      pending.push_back(i);
    }
  }
  for (size_t i : pending) {
    std::string base = wanted[i];
    if (!IsSafeName(base)) {
      if (base.size() > kMaxNameChars) base.resize(kMaxNameChars);
      base = "q_" + base;
      // A name with characters no spreadsheet accepts cannot come from a
      // deck; keep the writer total anyway.
      for (char& c : base) {
        if (!IsLetter(c) && !IsDigit(c) && c != '.') c = '_';
      }
    }
    std::string name = base;
    for (int k = 2; !taken.insert(Upper(name)).second; ++k) name = fmt::format("{}_{}", base, k);
    out[i] = name;
  }
  DefinedNames names;
  names.quantities.assign(out.begin(), out.begin() + static_cast<std::ptrdiff_t>(nq));
  names.checks.assign(out.begin() + static_cast<std::ptrdiff_t>(nq), out.end());
  return names;
}

std::string NumberText(double v) {
  std::string s = units::FormatExact(v);
  for (char& c : s) {
    if (c == 'e') c = 'E';
  }
  return std::signbit(v) ? "(" + s + ")" : s;
}

std::string FormulaWriter::Operand(const Part& p, Prec min) {
  return p.prec < min ? "(" + p.text + ")" : p.text;
}

FormulaWriter::FormulaWriter(const Model& model, const std::vector<std::string>& names)
    : model_(model), names_(names) {}

bool FormulaWriter::WriteQuantity(int quantity, std::string* out, std::string* why) const {
  const Quantity& q = model_.quantities[static_cast<size_t>(quantity)];
  if (q.kind != QuantityKind::kCalc || q.expr == nullptr) {
    *why = q.kind == QuantityKind::kSolved ? "found by a root search" : "an input";
    return false;
  }
  return Write(q.expr, out, why);
}

bool FormulaWriter::Write(const Expr* e, std::string* out, std::string* why) const {
  Part p;
  if (!Node(e, &p, why)) return false;
  if (p.text.size() > kMaxFormulaChars) {
    *why = fmt::format(
        "its formula would be {} characters long, more than a spreadsheet cell holds ({})",
        p.text.size(), kMaxFormulaChars);
    return false;
  }
  *out = std::move(p.text);
  return true;
}

bool FormulaWriter::Node(const Expr* e, Part* out, std::string* why) const {
  const ExprInfo& info = model_.Info(e);
  if (info.literal) {
    if (!std::isfinite(info.si)) {
      *why = "a literal has no finite value";
      return false;
    }
    *out = Part{NumberText(info.si), Prec::kAtom};
    return true;
  }
  std::vector<Part> a(e->args.size());
  if (e->kind != ExprKind::kCall) {
    for (size_t i = 0; i < e->args.size(); ++i) {
      if (!Node(e->args[i], &a[i], why)) return false;
    }
  }
  switch (e->kind) {
    case ExprKind::kNumber:
      *out = Part{NumberText(info.si), Prec::kAtom};
      return true;
    case ExprKind::kName:
      if (info.constant >= 0) {
        const ConstantInfo& c = BuiltinConstants()[static_cast<size_t>(info.constant)];
        *out = std::string_view(c.name) == "pi" ? Part{"PI()", Prec::kAtom}
                                                : Part{NumberText(info.si), Prec::kAtom};
        return true;
      }
      if (info.quantity < 0 || static_cast<size_t>(info.quantity) >= names_.size()) {
        *why = fmt::format("the name '{}' is not a quantity", e->text);
        return false;
      }
      *out = Part{names_[static_cast<size_t>(info.quantity)], Prec::kAtom};
      return true;
    case ExprKind::kNeg:
      // The spreadsheet's unary minus binds tighter than ^: -(x^2), never -x^2.
      *out = Part{"-" + Operand(a[0], Prec::kAtom), Prec::kNeg};
      return true;
    case ExprKind::kAdd:
    case ExprKind::kSub:
    case ExprKind::kMul:
    case ExprKind::kDiv: {
      const bool add = e->kind == ExprKind::kAdd || e->kind == ExprKind::kSub;
      const Prec p = add ? Prec::kAdd : Prec::kMul;
      // The right operand is parenthesised at equal precedence too, so the
      // spreadsheet groups exactly as the deck's tree (a-(b-c), a/(b*c)),
      // and after a binary operator a unary minus is parenthesised for
      // readability: a*(-b).
      const std::string rhs =
          a[1].prec > p && a[1].prec != Prec::kNeg ? a[1].text : "(" + a[1].text + ")";
      *out = Part{Operand(a[0], p) + OperatorText(e->kind) + rhs, p};
      return true;
    }
    case ExprKind::kPow:
      // Only atoms go unparenthesised around ^: the spreadsheet reads a^b^c
      // left to right and -a^b as (-a)^b.
      *out = Part{Operand(a[0], Prec::kAtom) + "^" + Operand(a[1], Prec::kAtom), Prec::kPow};
      return true;
    case ExprKind::kLt:
    case ExprKind::kLe:
    case ExprKind::kGt:
    case ExprKind::kGe:
      *out = Part{Operand(a[0], Prec::kAdd) + OperatorText(e->kind) + Operand(a[1], Prec::kAdd),
                  Prec::kCompare};
      return true;
    case ExprKind::kEq:
    case ExprKind::kNe: {
      // == holds within 1e-9 relative, as in the evaluator.
      const std::string diff =
          Operand(a[0], Prec::kAdd) + "-" +
          (a[1].prec > Prec::kAdd && a[1].prec != Prec::kNeg ? a[1].text : "(" + a[1].text + ")");
      const std::string near =
          fmt::format("ABS({})<={}*MAX(ABS({}),ABS({}))", diff, kEqualTol, a[0].text, a[1].text);
      *out = e->kind == ExprKind::kEq ? Part{near, Prec::kCompare}
                                      : Part{"NOT(" + near + ")", Prec::kAtom};
      return true;
    }
    case ExprKind::kAnd:
      *out = Part{"AND(" + a[0].text + "," + a[1].text + ")", Prec::kAtom};
      return true;
    case ExprKind::kOr:
      *out = Part{"OR(" + a[0].text + "," + a[1].text + ")", Prec::kAtom};
      return true;
    case ExprKind::kNot:
      *out = Part{"NOT(" + a[0].text + ")", Prec::kAtom};
      return true;
    case ExprKind::kCall:
      return CallNode(e, info, out, why);
  }
  *why = "an unknown expression";
  return false;
}

bool FormulaWriter::CallNode(const Expr* e, const ExprInfo& info, Part* out,
                             std::string* why) const {
  if (info.table >= 0) {
    const TableDef& t = model_.tables[static_cast<size_t>(info.table)];
    *why =
        fmt::format("{}() is a linear interpolation in the table {} ({})", e->text, t.name, t.path);
    return false;
  }
  if (info.builtin < 0 && info.fn == nullptr) {
    *why = fmt::format("{}() is not a known function", e->text);
    return false;
  }
  if (info.fn != nullptr && info.fn->spreadsheet == nullptr) {
    *why = fmt::format("{}() has no closed form a spreadsheet can evaluate (method: {}; {})",
                       info.fn->name, info.fn->formula, info.fn->source);
    return false;
  }
  std::vector<Part> a(e->args.size());
  for (size_t i = 0; i < e->args.size(); ++i) {
    if (!Node(e->args[i], &a[i], why)) return false;
  }
  if (info.builtin >= 0) {
    const BuiltinInfo& b = BuiltinFunctions()[static_cast<size_t>(info.builtin)];
    if ((b.id == Builtin::kMin || b.id == Builtin::kMax) && a.size() == 1) {
      *out = a[0];
      return true;
    }
    std::string text = std::string(BuiltinSheetName(b.id)) + "(";
    for (size_t i = 0; i < a.size(); ++i) {
      if (i > 0) text += ",";
      text += a[i].text;
    }
    *out = Part{text + ")", Prec::kAtom};
    return true;
  }
  // A library function's spreadsheet form: each {i} becomes the i-th
  // argument, parenthesised unless it is already an atom.
  const std::string_view form = info.fn->spreadsheet;
  std::string text;
  for (size_t i = 0; i < form.size(); ++i) {
    if (form[i] != '{') {
      text += form[i];
      continue;
    }
    const size_t close = form.find('}', i);
    size_t index = 0;
    bool ok = close != std::string_view::npos && close > i + 1;
    for (size_t j = i + 1; ok && j < close; ++j) {
      ok = IsDigit(form[j]);
      index = index * 10 + static_cast<size_t>(form[j] - '0');
    }
    if (!ok || index >= a.size()) {
      *why = fmt::format("{}()'s spreadsheet form is malformed near offset {}", info.fn->name, i);
      return false;
    }
    text += Operand(a[index], Prec::kAtom);
    i = close;
  }
  *out = IsOneCall(text) ? Part{text, Prec::kAtom} : Part{text, Prec::kCompare};
  return true;
}

}  // namespace heatdeck::xlsx
