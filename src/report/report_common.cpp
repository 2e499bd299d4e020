#include "report/report_common.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>
#include <unordered_map>

#include <fmt/format.h>

namespace heatdeck::report {

namespace {

struct GreekWord {
  std::string_view word;
  std::string_view letter;
};

// Lower-case letters and the capitals that differ from Latin ones.
constexpr GreekWord kGreek[] = {
    {"alpha", "α"}, {"beta", "β"},  {"gamma", "γ"},   {"Gamma", "Γ"},  {"delta", "δ"},
    {"Delta", "Δ"}, {"eps", "ε"},   {"epsilon", "ε"}, {"zeta", "ζ"},   {"eta", "η"},
    {"theta", "θ"}, {"Theta", "Θ"}, {"kappa", "κ"},   {"lambda", "λ"}, {"Lambda", "Λ"},
    {"mu", "μ"},    {"nu", "ν"},    {"xi", "ξ"},      {"Xi", "Ξ"},     {"pi", "π"},
    {"Pi", "Π"},    {"rho", "ρ"},   {"sigma", "σ"},   {"Sigma", "Σ"},  {"tau", "τ"},
    {"phi", "φ"},   {"Phi", "Φ"},   {"chi", "χ"},     {"psi", "ψ"},    {"Psi", "Ψ"},
    {"omega", "ω"}, {"Omega", "Ω"},
};

bool IsUpper(char c) { return c >= 'A' && c <= 'Z'; }
bool IsDigit(char c) { return c >= '0' && c <= '9'; }
bool IsLetter(char c) { return (c >= 'a' && c <= 'z') || IsUpper(c); }

// "DeltaT" -> "ΔT", "eps" -> "ε"; anything else unchanged.
std::string GreekBase(std::string_view base) {
  if (std::string_view g = GreekLetter(base); !g.empty()) return std::string(g);
  // The longest Greek word that is followed by a capital or a digit.
  std::string best;
  size_t best_len = 0;
  for (const GreekWord& w : kGreek) {
    if (base.size() > w.word.size() && base.substr(0, w.word.size()) == w.word &&
        (IsUpper(base[w.word.size()]) || IsDigit(base[w.word.size()])) &&
        w.word.size() > best_len) {
      best_len = w.word.size();
      best = std::string(w.letter);
    }
  }
  if (best_len == 0) return std::string(base);
  return best + std::string(base.substr(best_len));
}

std::string_view SubscriptChar(char c) {
  switch (c) {
    case '0':
      return "₀";
    case '1':
      return "₁";
    case '2':
      return "₂";
    case '3':
      return "₃";
    case '4':
      return "₄";
    case '5':
      return "₅";
    case '6':
      return "₆";
    case '7':
      return "₇";
    case '8':
      return "₈";
    case '9':
      return "₉";
    case 'a':
      return "ₐ";
    case 'e':
      return "ₑ";
    case 'h':
      return "ₕ";
    case 'i':
      return "ᵢ";
    case 'j':
      return "ⱼ";
    case 'k':
      return "ₖ";
    case 'l':
      return "ₗ";
    case 'm':
      return "ₘ";
    case 'n':
      return "ₙ";
    case 'o':
      return "ₒ";
    case 'p':
      return "ₚ";
    case 'r':
      return "ᵣ";
    case 's':
      return "ₛ";
    case 't':
      return "ₜ";
    case 'u':
      return "ᵤ";
    case 'v':
      return "ᵥ";
    case 'x':
      return "ₓ";
    default:
      return "";
  }
}

std::string_view SuperscriptChar(char c) {
  switch (c) {
    case '0':
      return "⁰";
    case '1':
      return "¹";
    case '2':
      return "²";
    case '3':
      return "³";
    case '4':
      return "⁴";
    case '5':
      return "⁵";
    case '6':
      return "⁶";
    case '7':
      return "⁷";
    case '8':
      return "⁸";
    case '9':
      return "⁹";
    case '-':
      return "⁻";
    default:
      return "";
  }
}

std::string PrettyUnitWord(std::string_view w) {
  if (w == "degC") return "°C";
  if (w == "degF") return "°F";
  if (w == "ddegC") return "Δ°C";
  if (w == "ddegF") return "Δ°F";
  if (w == "deg") return "°";
  // The registry has no symbol starting with 'u': a leading 'u' is always
  // the micro prefix (unit.h), printed as the micro sign.
  if (w.size() > 1 && w[0] == 'u') return "µ" + std::string(w.substr(1));
  return std::string(w);
}

std::string Trimmed(std::string s) {
  const size_t e = s.find('e');
  std::string mantissa = e == std::string::npos ? s : s.substr(0, e);
  const std::string exponent = e == std::string::npos ? "" : s.substr(e);
  if (mantissa.find('.') != std::string::npos) {
    while (!mantissa.empty() && mantissa.back() == '0') mantissa.pop_back();
    if (!mantissa.empty() && mantissa.back() == '.') mantissa.pop_back();
  }
  return mantissa + exponent;
}

bool UnitHasOperator(std::string_view u) {
  return u.find_first_of("*/^·") != std::string_view::npos || u.find(' ') != std::string_view::npos;
}

// The literal text of a given as the deck writes it, when that is its value
// in its display unit; "" otherwise.
std::string GivenLiteralText(const Model& m, const Quantity& q) {
  const Expr* e = q.expr;
  if (e == nullptr) return "";
  std::string sign;
  const Expr* lit = e;
  if (e->kind == ExprKind::kNeg && e->args.size() == 1 && e->args[0]->kind == ExprKind::kNumber) {
    sign = "-";
    lit = e->args[0];
  }
  if (lit->kind != ExprKind::kNumber) return "";
  auto it = m.info.find(lit);
  if (it == m.info.end()) return "";
  const units::Unit& u = m.LiteralUnit(it->second);
  if (lit->unit.empty()) {
    if (q.display.factor != 1.0 || q.display.offset != 0.0) return "";
  } else if (u.factor != q.display.factor || u.offset != q.display.offset) {
    return "";
  }
  return sign + std::string(lit->text);
}

template <typename Visit>
void Walk(const Expr& e, const Visit& visit) {
  visit(e);
  for (const Expr* a : e.args) Walk(*a, visit);
}

}  // namespace

// ---- Symbols ---------------------------------------------------------------

std::string_view GreekLetter(std::string_view word) {
  for (const GreekWord& w : kGreek) {
    if (w.word == word) return w.letter;
  }
  return "";
}

Symbol SplitSymbol(std::string_view name) {
  Symbol s;
  const size_t dot = name.rfind('.');
  if (dot != std::string_view::npos) {
    s.prefix = std::string(name.substr(0, dot + 1));
    name = name.substr(dot + 1);
  }
  const size_t us = name.find('_');
  s.base = GreekBase(name.substr(0, us));
  if (us == std::string_view::npos) return s;
  std::string_view rest = name.substr(us + 1);
  while (true) {
    const size_t next = rest.find('_');
    const std::string_view part = rest.substr(0, next);
    if (!part.empty()) {
      if (!s.subscript.empty()) s.subscript += ',';
      const std::string_view g = GreekLetter(part);
      s.subscript += g.empty() ? std::string(part) : std::string(g);
    }
    if (next == std::string_view::npos) break;
    rest = rest.substr(next + 1);
  }
  return s;
}

std::string SymbolText(std::string_view name) {
  const Symbol s = SplitSymbol(name);
  if (s.subscript.empty()) return s.prefix + s.base;
  std::string sub;
  for (char c : s.subscript) {
    const std::string_view u = SubscriptChar(c);
    if (u.empty()) return s.prefix + s.base + "_" + s.subscript;
    sub += u;
  }
  return s.prefix + s.base + sub;
}

// ---- Units -----------------------------------------------------------------

std::string PrettyUnit(std::string_view t) {
  std::string out;
  size_t i = 0;
  while (i < t.size()) {
    const char c = t[i];
    if (IsLetter(c)) {
      size_t j = i;
      while (j < t.size() && IsLetter(t[j])) ++j;
      out += PrettyUnitWord(t.substr(i, j - i));
      i = j;
    } else if (c == '^') {
      size_t j = i + 1;
      std::string sup;
      if (j < t.size() && t[j] == '-') {
        sup += SuperscriptChar('-');
        ++j;
      }
      const size_t digits = j;
      while (j < t.size() && IsDigit(t[j])) sup += SuperscriptChar(t[j++]);
      if (j == digits) {  // not an exponent after all: keep as written
        out += c;
        ++i;
        continue;
      }
      out += sup;
      i = j;
    } else if (c == '*') {
      out += "·";
      ++i;
    } else {
      out += c;
      ++i;
    }
  }
  return out;
}

std::string IntervalUnitText(const units::Unit& u) {
  if (u.text == "degC") return "ddegC";
  if (u.text == "degF") return "ddegF";
  return u.text;
}

// ---- Numbers ---------------------------------------------------------------

std::string FormatResult(double v) {
  if (!std::isfinite(v)) return "—";
  return units::FormatSig(v, kResultDigits);
}

std::string FormatInput(double v) {
  if (!std::isfinite(v)) return "—";
  return Trimmed(units::FormatSig(v, kInputDigits));
}

std::string WithUnit(std::string_view value, std::string_view unit_text, std::string_view sep) {
  if (unit_text.empty()) return std::string(value);
  return fmt::format("{}{}{}", value, sep, PrettyUnit(unit_text));
}

bool QuantityOk(const CaseResult& c, int q) {
  const size_t i = static_cast<size_t>(q);
  if (q < 0 || i >= c.values.size()) return false;
  if (i < c.ok.size() && !c.ok[i]) return false;
  return std::isfinite(c.values[i]);
}

std::string QuantityValueText(const Model& m, const CaseResult& c, int q) {
  if (!QuantityOk(c, q)) return "";
  const Quantity& qq = m.quantities[static_cast<size_t>(q)];
  const double v = qq.display.FromSi(c.values[static_cast<size_t>(q)]);
  if (qq.kind == QuantityKind::kGiven) {
    const bool overridden =
        std::find(c.overridden.begin(), c.overridden.end(), q) != c.overridden.end();
    if (!overridden) {
      std::string lit = GivenLiteralText(m, qq);
      if (!lit.empty()) return lit;
    }
    return FormatInput(v);
  }
  return FormatResult(v);
}

bool ValuesDiffer(const CaseResult& a, const CaseResult& b, int q) {
  const bool oa = QuantityOk(a, q), ob = QuantityOk(b, q);
  if (oa != ob) return true;
  if (!oa) return false;
  const size_t i = static_cast<size_t>(q);
  return a.values[i] != b.values[i];
}

std::vector<const QuantityMessage*> MessagesOf(const CaseResult& c, int q,
                                               QuantityMessage::Kind kind) {
  std::vector<const QuantityMessage*> out;
  const size_t i = static_cast<size_t>(q);
  if (q < 0 || i >= c.messages.size()) return out;
  for (const QuantityMessage& msg : c.messages[i]) {
    if (msg.kind == kind) out.push_back(&msg);
  }
  return out;
}

// ---- Expressions as text -----------------------------------------------------

std::string SymbolicText(const Model& m, const Expr& e) {
  return Pretty(e, [&](const Expr& n) -> std::string {
    if (n.kind == ExprKind::kNumber) return WithUnit(n.text, n.unit);
    if (n.kind != ExprKind::kName) return "";
    auto it = m.info.find(&n);
    if (it == m.info.end() || it->second.quantity < 0) return "";
    return m.quantities[static_cast<size_t>(it->second.quantity)].name;
  });
}

std::string SubstitutedText(const Model& m, const CaseResult& c, const Expr& e) {
  // Pretty() hands the leaf callback no context, so the parents are found
  // first: a value reads as one factor under a product, quotient, power or
  // sign, and needs no parentheses as a sum's term or a call's argument.
  std::unordered_map<const Expr*, const Expr*> parent;
  Walk(e, [&](const Expr& n) {
    for (const Expr* a : n.args) parent[a] = &n;
  });
  return Pretty(e, [&](const Expr& n) -> std::string {
    if (n.kind == ExprKind::kNumber) return WithUnit(n.text, n.unit);
    if (n.kind != ExprKind::kName) return "";
    auto it = m.info.find(&n);
    if (it == m.info.end()) return "";
    if (it->second.quantity < 0) return "";  // a constant keeps its name
    const int q = it->second.quantity;
    const std::string v = QuantityValueText(m, c, q);
    if (v.empty()) return "?";
    const std::string& unit = m.quantities[static_cast<size_t>(q)].display.text;
    const std::string text = WithUnit(v, unit);
    auto p = parent.find(&n);
    if (p == parent.end()) return text;
    const ExprKind pk = p->second->kind;
    const bool factor = pk == ExprKind::kMul || pk == ExprKind::kDiv || pk == ExprKind::kPow ||
                        pk == ExprKind::kNeg;
    const bool right_of_op =
        pk != ExprKind::kCall && p->second->args.size() == 2 && p->second->args[1] == &n;
    // "22 mm" raised to a power must read (22 mm)^2, not 22 mm^2.
    const bool power_base = pk == ExprKind::kPow && p->second->args[0] == &n;
    if ((factor && UnitHasOperator(unit)) || (power_base && !unit.empty()) ||
        (v[0] == '-' && (factor || right_of_op)))
      return "(" + text + ")";
    return text;
  });
}

// ---- Checks ----------------------------------------------------------------

Verdict CheckVerdict(const CheckResult& r) {
  if (!r.evaluated) return Verdict::kNotEvaluated;
  return r.pass ? Verdict::kPass : Verdict::kFail;
}

const char* VerdictText(Verdict v) {
  switch (v) {
    case Verdict::kPass:
      return "pass";
    case Verdict::kFail:
      return "FAIL";
    case Verdict::kNotEvaluated:
      return "not evaluated";
  }
  return "";
}

CheckSides SidesOf(const CheckDef& d, const CheckResult& r) {
  CheckSides s;
  if (!d.has_sides || !r.evaluated) return s;
  s.shown = true;
  s.unit = d.side_unit.text;
  s.margin_unit = IntervalUnitText(d.side_unit);
  s.lhs = FormatResult(d.side_unit.FromSi(r.lhs_si));
  s.rhs = FormatResult(d.side_unit.FromSi(r.rhs_si));
  // A margin is a difference: it converts with the factor alone.
  s.margin = FormatResult(r.margin_si / d.side_unit.factor);
  return s;
}

const char* ComparisonSign(ExprKind k) {
  switch (k) {
    case ExprKind::kLe:
      return "≤";
    case ExprKind::kGe:
      return "≥";
    case ExprKind::kNe:
      return "≠";
    case ExprKind::kEq:
      return "=";
    case ExprKind::kSub:
      return "−";
    default:
      return OperatorText(k);
  }
}

CheckTally Tally(const Model& m, const CaseResult& c) {
  CheckTally t;
  for (size_t i = 0; i < m.checks.size(); ++i) {
    if (i >= c.checks.size()) {
      ++t.not_evaluated;
      continue;
    }
    switch (CheckVerdict(c.checks[i])) {
      case Verdict::kPass:
        ++t.passed;
        break;
      case Verdict::kFail:
        ++t.failed;
        break;
      case Verdict::kNotEvaluated:
        ++t.not_evaluated;
        break;
    }
  }
  for (const auto& msgs : c.messages) {
    for (const QuantityMessage& msg : msgs)
      t.warnings += msg.kind == QuantityMessage::Kind::kWarning;
  }
  return t;
}

// ---- Title block -------------------------------------------------------------

const std::vector<MetaField>& TitleFields() {
  static const std::vector<MetaField> kFields = {
      {"project", "Project"}, {"number", "Calculation no."}, {"revision", "Revision"},
      {"date", "Date"},       {"client", "Client"},          {"status", "Status"},
  };
  return kFields;
}

const std::vector<MetaField>& SignOffRoles() {
  static const std::vector<MetaField> kRoles = {
      {"prepared", "Prepared"},
      {"checked", "Checked"},
      {"approved", "Approved"},
  };
  return kRoles;
}

bool IsPlacedMetaKey(std::string_view key) {
  for (const MetaField& f : TitleFields()) {
    if (key == f.key) return true;
  }
  for (const MetaField& f : SignOffRoles()) {
    if (key == f.key) return true;
  }
  return false;
}

std::string MetaValue(const Results& r, std::string_view key) {
  if (key == "date" && !r.date.empty()) return r.date;
  std::string v;
  if (r.model == nullptr) return v;
  for (const auto& [k, val] : r.model->meta) {
    if (k == key) v = val;
  }
  return v;
}

bool SectionShown(const Section& s) { return !s.items.empty(); }

std::vector<int> SectionNumbers(const Model& m) {
  std::vector<int> out;
  int n = 0;
  for (const Section& s : m.sections) out.push_back(SectionShown(s) ? ++n : 0);
  return out;
}

std::string SectionTitle(const Section& s) { return s.title.empty() ? "General" : s.title; }

const char kSafetyCaution[] =
    "These results are the output of a calculation tool and are for a competent engineer to "
    "check before use. The inputs, the methods chosen and their validity ranges are the "
    "responsibility of the engineer who signs this calculation. Local codes, the applicable "
    "equipment standards and licensed engineering practice govern over anything shown here.";

// ---- What a deck uses --------------------------------------------------------

std::vector<const library::FunctionInfo*> MethodsIn(const Model& m, const Expr& e) {
  std::vector<const library::FunctionInfo*> out;
  Walk(e, [&](const Expr& n) {
    if (n.kind != ExprKind::kCall) return;
    auto it = m.info.find(&n);
    if (it == m.info.end() || it->second.fn == nullptr) return;
    if (std::find(out.begin(), out.end(), it->second.fn) == out.end()) out.push_back(it->second.fn);
  });
  return out;
}

std::vector<int> TablesIn(const Model& m, const Expr& e) {
  std::vector<int> out;
  Walk(e, [&](const Expr& n) {
    if (n.kind != ExprKind::kCall) return;
    auto it = m.info.find(&n);
    if (it == m.info.end() || it->second.table < 0) return;
    if (std::find(out.begin(), out.end(), it->second.table) == out.end())
      out.push_back(it->second.table);
  });
  return out;
}

std::vector<const library::FunctionInfo*> MethodsUsed(const Model& m) {
  std::map<std::string, const library::FunctionInfo*> by_name;
  auto add = [&](const Expr* e) {
    if (e == nullptr) return;
    for (const library::FunctionInfo* f : MethodsIn(m, *e)) by_name[f->name] = f;
  };
  for (const Quantity& q : m.quantities) {
    if (q.kind == QuantityKind::kCalc) add(q.expr);
  }
  for (const CheckDef& c : m.checks) add(c.expr);
  for (const SolveDef& s : m.solves) {
    add(s.lhs);
    add(s.rhs);
  }
  std::vector<const library::FunctionInfo*> out;
  for (const auto& [name, f] : by_name) out.push_back(f);
  return out;
}

std::vector<UnitUse> UnitsUsed(const Model& m) {
  std::map<std::string, UnitUse> by_text;
  auto add = [&](const units::Unit& u) {
    if (u.text.empty()) return;
    by_text.emplace(u.text, UnitUse{u.text, u.dim.SiUnit(), u.factor, u.offset});
  };
  for (const Quantity& q : m.quantities) add(q.display);
  for (const CheckDef& c : m.checks) {
    if (c.has_sides) add(c.side_unit);
  }
  // Literal units, visited in a stable order (the info map is unordered, so
  // only the set of spellings is taken from it).
  m.info.ForEach([&](const Expr* e, const ExprInfo& info) {
    if (e->kind == ExprKind::kNumber && !e->unit.empty()) add(m.LiteralUnit(info));
  });
  std::vector<UnitUse> out;
  for (auto& [text, u] : by_text) out.push_back(std::move(u));
  return out;
}

// ---- Profiles ----------------------------------------------------------------

const std::vector<ProfileResult>& ProfilesOf(const CaseResult& c) { return c.profiles; }

}  // namespace heatdeck::report
