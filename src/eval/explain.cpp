// Explaining why a quantity came out as NaN or infinite.  This runs only on
// the failure path: it re-evaluates the expression node by node (a small
// tree-walking interpreter over the same SI values) to find the innermost
// operation that went wrong and the values that went into it.
#include <cmath>
#include <limits>
#include <unordered_map>

#include <fmt/format.h>

#include "eval/program.h"
#include "units/unit.h"

namespace heatdeck {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

class Explainer {
 public:
  Explainer(const Model& m, const std::vector<double>& values) : m_(m), values_(values) {}

  // Evaluates e; on the first operation that turns finite inputs into a
  // non-finite result, records what happened.
  double Eval(const Expr* e) {
    const ExprInfo& info = m_.Info(e);
    if (info.literal) return info.si;
    switch (e->kind) {
      case ExprKind::kNumber:
        return info.si;
      case ExprKind::kName:
        if (info.constant >= 0) return info.si;
        return values_[static_cast<size_t>(info.quantity)];
      case ExprKind::kCall:
        return Call(e, info);
      default:
        break;
    }
    std::vector<double> a;
    for (const Expr* c : e->args) a.push_back(Eval(c));
    if (found_) return kNaN;
    double v = kNaN;
    switch (e->kind) {
      case ExprKind::kNeg:
        v = -a[0];
        break;
      case ExprKind::kAdd:
        v = a[0] + a[1];
        break;
      case ExprKind::kSub:
        v = a[0] - a[1];
        break;
      case ExprKind::kMul:
        v = a[0] * a[1];
        break;
      case ExprKind::kDiv:
        if (a[1] == 0.0) {
          Found(e, fmt::format("division by zero: {} is 0", Describe(e->args[1], a[1])));
          return kNaN;
        }
        v = a[0] / a[1];
        break;
      case ExprKind::kPow:
        v = std::pow(a[0], a[1]);
        if (!std::isfinite(v) && a[0] < 0) {
          Found(e, fmt::format("a negative number raised to a fractional power: {} ^ {}",
                               Describe(e->args[0], a[0]), Describe(e->args[1], a[1])));
          return kNaN;
        }
        if (!std::isfinite(v) && a[0] == 0 && a[1] < 0) {
          Found(e, fmt::format("zero raised to a negative power: {} is 0",
                               Describe(e->args[0], a[0])));
          return kNaN;
        }
        break;
      default:
        v = 0.0;  // comparisons and logic cannot overflow
        break;
    }
    if (!std::isfinite(v)) {
      Found(e,
            fmt::format("the result overflows the range of a double ({})", units::FormatExact(v)));
    }
    return v;
  }

  bool found() const { return found_; }
  QuantityMessage message() const { return msg_; }

 private:
  double Call(const Expr* e, const ExprInfo& info) {
    std::vector<double> a;
    for (const Expr* c : e->args) a.push_back(Eval(c));
    if (found_) return kNaN;
    if (info.fn != nullptr) {
      library::RecordingSink sink;
      const double v = info.fn->fn(a.data(), sink);
      if (!sink.errors.empty()) {
        Found(e, fmt::format("{}: {}", e->text, sink.errors.front()));
        return kNaN;
      }
      if (!std::isfinite(v)) {
        Found(e, fmt::format("{} gives no finite result for {}", e->text, ArgList(e, a)));
      }
      return v;
    }
    if (info.builtin < 0) return kNaN;
    const Builtin id = BuiltinFunctions()[static_cast<size_t>(info.builtin)].id;
    double v = kNaN;
    const std::string name(e->text);
    switch (id) {
      case Builtin::kMin:
        v = a[0];
        for (double x : a) v = std::min(v, x);
        break;
      case Builtin::kMax:
        v = a[0];
        for (double x : a) v = std::max(v, x);
        break;
      case Builtin::kAbs:
        v = std::fabs(a[0]);
        break;
      case Builtin::kIf:
        v = a[0] != 0.0 ? a[1] : a[2];
        break;
      case Builtin::kSqrt:
        if (a[0] < 0) return Bad(e, "the square root of a negative number", a);
        v = std::sqrt(a[0]);
        break;
      case Builtin::kLn:
      case Builtin::kLog10:
        if (a[0] <= 0) return Bad(e, "the logarithm of a number that is not positive", a);
        v = id == Builtin::kLn ? std::log(a[0]) : std::log10(a[0]);
        break;
      case Builtin::kAsin:
      case Builtin::kAcos:
        if (a[0] < -1 || a[0] > 1) return Bad(e, fmt::format("{} outside [-1, 1]", name), a);
        v = id == Builtin::kAsin ? std::asin(a[0]) : std::acos(a[0]);
        break;
      case Builtin::kExp:
        v = std::exp(a[0]);
        break;
      case Builtin::kSin:
        v = std::sin(a[0]);
        break;
      case Builtin::kCos:
        v = std::cos(a[0]);
        break;
      case Builtin::kTan:
        v = std::tan(a[0]);
        break;
      case Builtin::kAtan:
        v = std::atan(a[0]);
        break;
      case Builtin::kSinh:
        v = std::sinh(a[0]);
        break;
      case Builtin::kCosh:
        v = std::cosh(a[0]);
        break;
      case Builtin::kTanh:
        v = std::tanh(a[0]);
        break;
    }
    if (!std::isfinite(v)) {
      Found(e, fmt::format("{} overflows for {}", name, ArgList(e, a)));
    }
    return v;
  }

  double Bad(const Expr* e, const std::string& what, const std::vector<double>& a) {
    Found(e, fmt::format("{}: {}({})", what, e->text, ArgList(e, a)));
    return kNaN;
  }

  std::string ArgList(const Expr* e, const std::vector<double>& a) const {
    std::string s;
    for (size_t i = 0; i < a.size(); ++i) {
      if (i > 0) s += ", ";
      s += Describe(e->args[i], a[i]);
    }
    return s;
  }

  // "C_h = 0 W/K" for a name, the value in SI for anything else.
  std::string Describe(const Expr* e, double si) const {
    const ExprInfo& info = m_.Info(e);
    if (e->kind == ExprKind::kName && info.quantity >= 0) {
      const Quantity& q = m_.quantities[static_cast<size_t>(info.quantity)];
      const std::string u = q.display.text;
      return fmt::format("{} = {}{}{}", q.name, units::FormatSig(q.display.FromSi(si), 6),
                         u.empty() ? "" : " ", u);
    }
    const std::string u = info.type.dim.SiUnit();
    return fmt::format("{} = {}{}{}", Pretty(*e), units::FormatSig(si, 6), u.empty() ? "" : " ", u);
  }

  void Found(const Expr* e, std::string text) {
    if (found_) return;
    found_ = true;
    msg_.kind = QuantityMessage::Kind::kError;
    msg_.text = std::move(text);
    msg_.range = e->range;
  }

  const Model& m_;
  const std::vector<double>& values_;
  bool found_ = false;
  QuantityMessage msg_;
};

}  // namespace

QuantityMessage Program::Explain(int quantity) const {
  const Quantity& q = model_.quantities[static_cast<size_t>(quantity)];
  for (auto it = recorded_.rbegin(); it != recorded_.rend(); ++it) {
    if (it->quantity == quantity && it->message.kind == QuantityMessage::Kind::kError) {
      QuantityMessage m = it->message;
      m.text = fmt::format("cannot evaluate '{}': {}", q.name, m.text);
      if (!m.range.valid()) m.range = q.expr != nullptr ? q.expr->range : q.range;
      return m;
    }
  }
  const std::vector<double> values = frame();
  Explainer x(model_, values);
  x.Eval(q.expr);
  QuantityMessage m;
  m.kind = QuantityMessage::Kind::kError;
  if (x.found()) {
    m = x.message();
    m.text = fmt::format("cannot evaluate '{}': {}", q.name, m.text);
  } else {
    m.text = fmt::format("cannot evaluate '{}': the result is not a finite number", q.name);
    m.range = q.expr->range;
  }
  return m;
}

}  // namespace heatdeck
