#include "eval/program.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "units/unit.h"

namespace heatdeck {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Relative tolerance of == in checks (LANGUAGE.md: "== within 1e-9 relative").
constexpr double kEqualTol = 1e-9;

bool NearlyEqual(double a, double b) {
  return std::fabs(a - b) <= kEqualTol * std::max(std::fabs(a), std::fabs(b));
}

// Decides a comparison check from its evaluated sides.  Returns false when
// a side is not finite (the check is then not evaluated).
bool JudgeSides(ExprKind kind, double l, double h, CheckResult& r) {
  r.lhs_si = l;
  r.rhs_si = h;
  if (!std::isfinite(l) || !std::isfinite(h)) return false;
  switch (kind) {
    case ExprKind::kLt:
      r.pass = l < h;
      r.margin_si = h - l;
      break;
    case ExprKind::kLe:
      r.pass = l <= h;
      r.margin_si = h - l;
      break;
    case ExprKind::kGt:
      r.pass = l > h;
      r.margin_si = l - h;
      break;
    case ExprKind::kGe:
      r.pass = l >= h;
      r.margin_si = l - h;
      break;
    case ExprKind::kEq:
      r.pass = NearlyEqual(l, h);
      r.margin_si = -std::fabs(l - h);
      break;
    case ExprKind::kNe:
      r.pass = !NearlyEqual(l, h);
      r.margin_si = std::fabs(l - h);
      break;
    default:
      break;
  }
  return true;
}

}  // namespace

// A library call site: which function, on behalf of which quantity.
struct Program::CallSite : library::Sink {
  const library::FunctionInfo* fn = nullptr;
  int quantity = -1;
  SourceRange range;  // the call in the deck
  Program* program = nullptr;

  void Warning(std::string message) override {
    program->recorded_.push_back(Recorded{
        quantity, QuantityMessage{QuantityMessage::Kind::kWarning, std::move(message), {}}});
  }
  void Error(std::string message) override {
    program->library_error_ = true;
    program->recorded_.push_back(Recorded{
        quantity,
        QuantityMessage{QuantityMessage::Kind::kError,
                        // The library's message may name the function already.
                        message.rfind(fn->name, 0) == 0 ? std::move(message)
                                                        : fmt::format("{}: {}", fn->name, message),
                        range}});
  }
  void Note(const char* static_text) override {
    program->recorded_.push_back(
        Recorded{quantity, QuantityMessage{QuantityMessage::Kind::kNote, static_text, {}}});
  }

  double Call(const double* args) { return fn->fn(args, *this); }
};

// A table interpolation site: NAME.COLUMN(x).
struct Program::TableSite {
  const TableDef* table = nullptr;
  int column = 0;
  int quantity = -1;
  SourceRange range;  // the call in the deck
  Program* program = nullptr;

  double At(double x) {
    TableSite* site = this;
    double v = kNaN;
    if (site->table->table.Interpolate(site->column, x, &v)) return v;
    const auto& cols = site->table->table.columns;
    const units::Unit& u = cols[0].unit;
    const auto& arg = cols[0].si;
    site->program->library_error_ = true;
    site->program->recorded_.push_back(Recorded{
        site->quantity,
        QuantityMessage{
            QuantityMessage::Kind::kError,
            fmt::format("table '{}' column '{}': {} = {} {} is outside the table's range {} … {} "
                        "{} (no extrapolation)",
                        site->table->name, cols[static_cast<size_t>(site->column)].name,
                        cols[0].name, units::FormatSig(u.FromSi(x), 6), u.text,
                        units::FormatSig(u.FromSi(arg.front()), 6),
                        units::FormatSig(u.FromSi(arg.back()), 6), u.text),
            site->range}});
    return kNaN;
  }
};

// Why a hand-written stack machine rather than an expression library: the
// model already holds every expression as a typed tree with its units folded
// to SI, so what is left is evaluation alone.  Compiling through an
// expression-string library meant writing each tree back out as text and
// having the library tokenise it again: at 100 000 statements that round
// trip was over 40 % of checking a deck, its parsers most of the memory, and
// its 20 000-character limit split long expressions.  The instruction set
// below is the deck language's own operators, no more.
enum class Op : uint8_t {
  kConst,  // push c
  kLoad,   // push frame[a]
  kNeg,
  kAdd,
  kSub,
  kMul,
  kDiv,
  kPow,
  kSquare,  // x^2, x^3, x^4 of a quantity: repeated products
  kCube,
  kFourth,
  kLt,
  kLe,
  kGt,
  kGe,
  kNear,  // == within kEqualTol relative
  kFar,   // != likewise
  kNot,   // x == 0
  kAnd,   // both operands are evaluated, and NaN counts as true (C++ truth)
  kOr,
  kFn,   // f(x), a one-argument built-in
  kMin,  // of the top a values, NaN propagating
  kMax,
  kJumpIfZero,  // pop; jump to a when it was 0 (if's condition)
  kJump,        // jump to a
  kCall,        // library call site a over the c arguments on the stack
  kTable,       // table interpolation site a
  // Fused: the right operand read straight from the frame (a) or the
  // constant (c), saving a push per operator.
  kAddLoad,
  kSubLoad,
  kMulLoad,
  kDivLoad,
  kAddConst,
  kSubConst,
  kMulConst,
  kDivConst,
};

struct Program::Ins {
  Op op = Op::kConst;
  int32_t a = 0;
  double c = 0.0;
  double (*f)(double) = nullptr;
};

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
double Near(double a, double b) {
  // |a-b| <= tol*max(|a|,|b|), a NaN side making it false.
  const double fa = std::fabs(a), fb = std::fabs(b);
  const double m = std::isnan(fb) || fb > fa ? fb : fa;
  return std::fabs(a - b) <= kEqualTol * m ? 1.0 : 0.0;
}

double (*UnaryBuiltin(Builtin id))(double) {
  switch (id) {
    case Builtin::kAbs:
      return [](double x) { return std::fabs(x); };
    case Builtin::kSqrt:
      return [](double x) { return std::sqrt(x); };
    case Builtin::kExp:
      return [](double x) { return std::exp(x); };
    case Builtin::kLn:
      return [](double x) { return std::log(x); };
    case Builtin::kLog10:
      return [](double x) { return std::log10(x); };
    case Builtin::kSin:
      return [](double x) { return std::sin(x); };
    case Builtin::kCos:
      return [](double x) { return std::cos(x); };
    case Builtin::kTan:
      return [](double x) { return std::tan(x); };
    case Builtin::kAsin:
      return [](double x) { return std::asin(x); };
    case Builtin::kAcos:
      return [](double x) { return std::acos(x); };
    case Builtin::kAtan:
      return [](double x) { return std::atan(x); };
    case Builtin::kSinh:
      return [](double x) { return std::sinh(x); };
    case Builtin::kCosh:
      return [](double x) { return std::cosh(x); };
    case Builtin::kTanh:
      return [](double x) { return std::tanh(x); };
    default:
      return nullptr;
  }
}

const char* OpName(Op op) {
  static const char* const kNames[] = {
      "const",    "load",     "neg",          "add",       "sub",       "mul",       "div",
      "pow",      "square",   "cube",         "fourth",    "lt",        "le",        "gt",
      "ge",       "near",     "far",          "not",       "and",       "or",        "fn",
      "min",      "max",      "jump_if_zero", "jump",      "call",      "table",     "add_load",
      "sub_load", "mul_load", "div_load",     "add_const", "sub_const", "mul_const", "div_const"};
  return kNames[static_cast<size_t>(op)];
}

}  // namespace

// Emits a typed expression's code at the end of the program's code, in
// evaluation order, tracking the stack depth it needs.
class Program::Compiler {
 public:
  Compiler(Program& p, int quantity) : p_(p), m_(p.model_), quantity_(quantity) {}

  Range Compile(const Expr* e) {
    Range r;
    r.begin = static_cast<uint32_t>(p_.code_.size());
    Emit(e);
    r.end = static_cast<uint32_t>(p_.code_.size());
    if (p_.stack_.size() < static_cast<size_t>(max_depth_))
      p_.stack_.resize(static_cast<size_t>(max_depth_));
    return r;
  }

 private:
  void Push(Ins in) { p_.code_.push_back(in); }
  void Grow(int n) {
    depth_ += n;
    max_depth_ = std::max(max_depth_, depth_);
  }
  void Const(double v) {
    Push(Ins{Op::kConst, 0, v, nullptr});
    Grow(1);
  }
  size_t Here() const { return p_.code_.size(); }

  // A binary operator over the two values on the stack; when the right
  // operand was a single load or constant, the fused form replaces it.
  void Binary(Op op, size_t right_begin) {
    const bool single = Here() == right_begin + 1;
    const Ins last = p_.code_.back();
    if (single && (last.op == Op::kLoad || last.op == Op::kConst)) {
      Op fused = op;
      const bool load = last.op == Op::kLoad;
      switch (op) {
        case Op::kAdd:
          fused = load ? Op::kAddLoad : Op::kAddConst;
          break;
        case Op::kSub:
          fused = load ? Op::kSubLoad : Op::kSubConst;
          break;
        case Op::kMul:
          fused = load ? Op::kMulLoad : Op::kMulConst;
          break;
        case Op::kDiv:
          fused = load ? Op::kDivLoad : Op::kDivConst;
          break;
        default:
          break;
      }
      if (fused != op) {
        p_.code_.back().op = fused;  // keeps a (frame index) and c (constant)
        Grow(-1);
        return;
      }
    }
    Push(Ins{op, 0, 0.0, nullptr});
    Grow(-1);
  }

  void Emit(const Expr* e) {
    const ExprInfo& info = m_.Info(e);
    if (info.literal) return Const(info.si);
    switch (e->kind) {
      case ExprKind::kNumber:
        return Const(info.si);
      case ExprKind::kName:
        if (info.constant >= 0) return Const(info.si);
        Push(Ins{Op::kLoad, info.quantity, 0.0, nullptr});
        return Grow(1);
      case ExprKind::kNeg:
        Emit(e->args[0]);
        return Push(Ins{Op::kNeg, 0, 0.0, nullptr});
      case ExprKind::kNot:
        Emit(e->args[0]);
        return Push(Ins{Op::kNot, 0, 0.0, nullptr});
      case ExprKind::kCall:
        return Call(e, info);
      case ExprKind::kPow:
        if (PowerOfQuantity(e)) return;
        break;
      default:
        break;
    }
    Emit(e->args[0]);
    const size_t right = Here();
    Emit(e->args[1]);
    Binary(BinaryOp(e->kind), right);
  }

  static Op BinaryOp(ExprKind k) {
    switch (k) {
      case ExprKind::kAdd:
        return Op::kAdd;
      case ExprKind::kSub:
        return Op::kSub;
      case ExprKind::kMul:
        return Op::kMul;
      case ExprKind::kDiv:
        return Op::kDiv;
      case ExprKind::kPow:
        return Op::kPow;
      case ExprKind::kLt:
        return Op::kLt;
      case ExprKind::kLe:
        return Op::kLe;
      case ExprKind::kGt:
        return Op::kGt;
      case ExprKind::kGe:
        return Op::kGe;
      case ExprKind::kEq:
        return Op::kNear;
      case ExprKind::kNe:
        return Op::kFar;
      case ExprKind::kAnd:
        return Op::kAnd;
      case ExprKind::kOr:
        return Op::kOr;
      default:
        return Op::kAdd;  // not reached: every binary kind is listed
    }
  }

  // q^2, q^3, q^4 of a quantity as repeated products (exact to rounding
  // like any product, and cheaper than pow).
  bool PowerOfQuantity(const Expr* e) {
    const ExprInfo& base = m_.Info(e->args[0]);
    const ExprInfo& ex = m_.Info(e->args[1]);
    if (e->args[0]->kind != ExprKind::kName || base.literal || base.constant >= 0) return false;
    if (!ex.literal && e->args[1]->kind != ExprKind::kNumber) return false;
    Op op;
    if (ex.si == 2.0) {
      op = Op::kSquare;
    } else if (ex.si == 3.0) {
      op = Op::kCube;
    } else if (ex.si == 4.0) {
      op = Op::kFourth;
    } else {
      return false;
    }
    Emit(e->args[0]);
    Push(Ins{op, 0, 0.0, nullptr});
    return true;
  }

  void Call(const Expr* e, const ExprInfo& info) {
    const int n = static_cast<int>(e->args.size());
    if (info.builtin >= 0) {
      const BuiltinInfo& b = BuiltinFunctions()[static_cast<size_t>(info.builtin)];
      if (b.id == Builtin::kIf) {
        // Only the branch taken is evaluated.
        Emit(e->args[0]);
        const size_t jz = Here();
        Push(Ins{Op::kJumpIfZero, 0, 0.0, nullptr});
        Grow(-1);
        Emit(e->args[1]);
        const size_t j = Here();
        Push(Ins{Op::kJump, 0, 0.0, nullptr});
        Grow(-1);
        p_.code_[jz].a = static_cast<int32_t>(Here());
        Emit(e->args[2]);
        p_.code_[j].a = static_cast<int32_t>(Here());
        return;
      }
      for (const Expr* a : e->args) Emit(a);
      if (b.id == Builtin::kMin || b.id == Builtin::kMax) {
        if (n == 1) return;
        Push(Ins{b.id == Builtin::kMin ? Op::kMin : Op::kMax, n, 0.0, nullptr});
        return Grow(1 - n);
      }
      return Push(Ins{Op::kFn, 0, 0.0, UnaryBuiltin(b.id)});
    }
    for (const Expr* a : e->args) Emit(a);
    if (info.table >= 0) {
      auto site = std::make_unique<TableSite>();
      site->table = &m_.tables[static_cast<size_t>(info.table)];
      site->column = info.column;
      site->range = e->range;
      site->quantity = quantity_;
      site->program = &p_;
      Push(Ins{Op::kTable, static_cast<int32_t>(p_.table_sites_.size()), 0.0, nullptr});
      p_.table_sites_.push_back(std::move(site));
      return Grow(1 - n);
    }
    // A library function: a call site of its own, so that warnings land on
    // the right quantity.
    auto site = std::make_unique<CallSite>();
    site->fn = info.fn;
    site->range = e->range;
    site->quantity = quantity_;
    site->program = &p_;
    Push(Ins{Op::kCall, static_cast<int32_t>(p_.sites_.size()), static_cast<double>(n), nullptr});
    p_.sites_.push_back(std::move(site));
    Grow(1 - n);
  }

  Program& p_;
  const Model& m_;
  int quantity_;
  int depth_ = 0;
  int max_depth_ = 1;
};

Program::Program(const Model& model, std::vector<int> steps)
    : model_(model), steps_idx_(std::move(steps)), values_(model.quantities.size(), kNaN) {
  frame_ = values_.data();
  Build(true);
}

Program::Program(const Model& model, std::vector<int> steps, double* frame, bool with_checks)
    : model_(model), steps_idx_(std::move(steps)), frame_(frame) {
  Build(with_checks);
}

Program::~Program() = default;

std::unique_ptr<Program> Program::Clone() const {
  auto p = std::make_unique<Program>(model_, steps_idx_);
  std::copy(frame_, frame_ + model_.quantities.size(), p->values_.begin());
  return p;
}

Program::Range Program::Compile(const Expr* e, int quantity) {
  Compiler c(*this, quantity);
  return c.Compile(e);
}

void Program::Build(bool with_checks) {
  for (int qi : steps_idx_) {
    const Quantity& q = model_.quantities[static_cast<size_t>(qi)];
    if (q.kind != QuantityKind::kCalc) continue;  // inputs are set in the frame
    steps_.push_back(Step{qi, Compile(q.expr, qi)});
  }
  if (!with_checks) return;
  for (size_t ci = 0; ci < model_.checks.size(); ++ci) {
    const CheckDef& c = model_.checks[ci];
    CheckCode cc;
    cc.check = static_cast<int>(ci);
    cc.sides = c.has_sides;
    if (c.has_sides) {
      cc.a = Compile(c.expr->args[0], -1);
      cc.b = Compile(c.expr->args[1], -1);
    } else {
      cc.a = Compile(c.expr, -1);
    }
    checks_.push_back(cc);
  }
}

int Program::AddExpression(const Expr* e) {
  extra_.push_back(Compile(e, -1));
  return static_cast<int>(extra_.size()) - 1;
}

double Program::Eval(int handle) { return Exec(extra_[static_cast<size_t>(handle)]); }

// The interpreter: one switch per instruction over a stack that Build sized.
double Program::Exec(Range r) {
  const Ins* const code = code_.data();
  double* const frame = frame_;
  double* sp = stack_.data();  // the next free slot
  for (uint32_t pc = r.begin; pc < r.end; ++pc) {
    const Ins& in = code[pc];
    switch (in.op) {
      case Op::kConst:
        *sp++ = in.c;
        break;
      case Op::kLoad:
        *sp++ = frame[in.a];
        break;
      case Op::kNeg:
        sp[-1] = -sp[-1];
        break;
      case Op::kAdd:
        sp[-2] += sp[-1];
        --sp;
        break;
      case Op::kSub:
        sp[-2] -= sp[-1];
        --sp;
        break;
      case Op::kMul:
        sp[-2] *= sp[-1];
        --sp;
        break;
      case Op::kDiv:
        sp[-2] /= sp[-1];
        --sp;
        break;
      case Op::kPow:
        sp[-2] = std::pow(sp[-2], sp[-1]);
        --sp;
        break;
      case Op::kSquare:
        sp[-1] = sp[-1] * sp[-1];
        break;
      case Op::kCube:
        sp[-1] = sp[-1] * sp[-1] * sp[-1];
        break;
      case Op::kFourth:
        sp[-1] = sp[-1] * sp[-1] * sp[-1] * sp[-1];
        break;
      case Op::kLt:
        sp[-2] = sp[-2] < sp[-1] ? 1.0 : 0.0;
        --sp;
        break;
      case Op::kLe:
        sp[-2] = sp[-2] <= sp[-1] ? 1.0 : 0.0;
        --sp;
        break;
      case Op::kGt:
        sp[-2] = sp[-2] > sp[-1] ? 1.0 : 0.0;
        --sp;
        break;
      case Op::kGe:
        sp[-2] = sp[-2] >= sp[-1] ? 1.0 : 0.0;
        --sp;
        break;
      case Op::kNear:
        sp[-2] = Near(sp[-2], sp[-1]);
        --sp;
        break;
      case Op::kFar:
        sp[-2] = 1.0 - Near(sp[-2], sp[-1]);
        --sp;
        break;
      case Op::kNot:
        sp[-1] = sp[-1] == 0.0 ? 1.0 : 0.0;
        break;
      case Op::kAnd:
        sp[-2] = (sp[-2] != 0.0 && sp[-1] != 0.0) ? 1.0 : 0.0;
        --sp;
        break;
      case Op::kOr:
        sp[-2] = (sp[-2] != 0.0 || sp[-1] != 0.0) ? 1.0 : 0.0;
        --sp;
        break;
      case Op::kFn:
        sp[-1] = in.f(sp[-1]);
        break;
      case Op::kMin:
        sp -= in.a - 1;
        sp[-1] = Min(sp - 1, in.a);
        break;
      case Op::kMax:
        sp -= in.a - 1;
        sp[-1] = Max(sp - 1, in.a);
        break;
      case Op::kJumpIfZero:
        if (*--sp == 0.0) pc = static_cast<uint32_t>(in.a) - 1;
        break;
      case Op::kJump:
        pc = static_cast<uint32_t>(in.a) - 1;
        break;
      case Op::kCall: {
        const int n = static_cast<int>(in.c);
        sp -= n;
        const double v = sites_[static_cast<size_t>(in.a)]->Call(sp);
        *sp++ = v;
        break;
      }
      case Op::kTable:
        sp[-1] = table_sites_[static_cast<size_t>(in.a)]->At(sp[-1]);
        break;
      case Op::kAddLoad:
        sp[-1] += frame[in.a];
        break;
      case Op::kSubLoad:
        sp[-1] -= frame[in.a];
        break;
      case Op::kMulLoad:
        sp[-1] *= frame[in.a];
        break;
      case Op::kDivLoad:
        sp[-1] /= frame[in.a];
        break;
      case Op::kAddConst:
        sp[-1] += in.c;
        break;
      case Op::kSubConst:
        sp[-1] -= in.c;
        break;
      case Op::kMulConst:
        sp[-1] *= in.c;
        break;
      case Op::kDivConst:
        sp[-1] /= in.c;
        break;
    }
  }
  return sp[-1];
}

void Program::LoadGivens() {
  for (size_t i = 0; i < model_.quantities.size(); ++i) {
    const Quantity& q = model_.quantities[i];
    if (q.kind == QuantityKind::kGiven) frame_[i] = q.given_si;
  }
}

std::string Program::Disassemble(Range r) const {
  std::string s;
  for (uint32_t pc = r.begin; pc < r.end; ++pc) {
    const Ins& in = code_[pc];
    s += fmt::format("{:4} {}", pc - r.begin, OpName(in.op));
    switch (in.op) {
      case Op::kConst:
      case Op::kAddConst:
      case Op::kSubConst:
      case Op::kMulConst:
      case Op::kDivConst:
        s += " " + units::FormatExact(in.c);
        break;
      case Op::kLoad:
      case Op::kAddLoad:
      case Op::kSubLoad:
      case Op::kMulLoad:
      case Op::kDivLoad:
        s += " " + model_.quantities[static_cast<size_t>(in.a)].name;
        break;
      case Op::kMin:
      case Op::kMax:
        s += fmt::format(" {}", in.a);
        break;
      case Op::kJumpIfZero:
      case Op::kJump:
        s += fmt::format(" {}", static_cast<uint32_t>(in.a) - r.begin);
        break;
      case Op::kCall:
        s += fmt::format(" {}", sites_[static_cast<size_t>(in.a)]->fn->name);
        break;
      case Op::kTable: {
        const TableSite& t = *table_sites_[static_cast<size_t>(in.a)];
        s += fmt::format(" {}.{}", t.table->name,
                         t.table->table.columns[static_cast<size_t>(t.column)].name);
        break;
      }
      default:
        break;
    }
    s += '\n';
  }
  return s;
}

std::string Program::CodeText(int quantity) const {
  for (const Step& s : steps_) {
    if (s.quantity == quantity) return Disassemble(s.code);
  }
  return "";
}

void Program::ClearFrom(size_t step) {
  for (size_t i = step; i < steps_.size(); ++i)
    frame_[static_cast<size_t>(steps_[i].quantity)] = kNaN;
}

bool Program::Run() {
  failed_step_ = -1;
  failure_ = QuantityMessage{};
  // Only the last run's messages are kept: a sweep runs a program a million
  // times, and a correlation that warns at every point must not pile up.
  recorded_.clear();
  for (size_t i = 0; i < steps_.size(); ++i) {
    const Step& s = steps_[i];
    library_error_ = false;
    const double v = Exec(s.code);
    frame_[static_cast<size_t>(s.quantity)] = v;
    if (!std::isfinite(v) || library_error_) {
      failed_step_ = s.quantity;
      failure_ = Explain(s.quantity);
      // What comes after the failure was not evaluated at these inputs: NaN,
      // not the last point's values.
      ClearFrom(i);
      return false;
    }
  }
  return true;
}

void Program::RunAll(CaseResult* out) {
  const size_t n = model_.quantities.size();
  out->ok.assign(n, true);
  out->messages.assign(n, {});
  recorded_.clear();
  for (const Step& s : steps_) {
    const size_t qi = static_cast<size_t>(s.quantity);
    library_error_ = false;
    frame_[qi] = Exec(s.code);
    bool inputs_ok = true;
    for (int d : model_.quantities[qi].deps)
      inputs_ok = inputs_ok && out->ok[static_cast<size_t>(d)];
    if (!inputs_ok) {
      out->ok[qi] = false;
      frame_[qi] = kNaN;
      continue;
    }
    if (!std::isfinite(frame_[qi]) || library_error_) {
      if (!library_error_) out->messages[qi].push_back(Explain(s.quantity));
      out->ok[qi] = false;
      frame_[qi] = kNaN;
    }
  }
  for (auto& r : recorded_) {
    if (r.quantity < 0) continue;
    QuantityMessage m = std::move(r.message);
    if (m.kind == QuantityMessage::Kind::kError) {
      m.text = fmt::format("cannot evaluate '{}': {}",
                           model_.quantities[static_cast<size_t>(r.quantity)].name, m.text);
    }
    out->messages[static_cast<size_t>(r.quantity)].push_back(std::move(m));
  }
  recorded_.clear();
}

void Program::RunChecks(std::vector<CheckResult>* out, int* failed) {
  out->assign(model_.checks.size(), CheckResult{});
  *failed = 0;
  for (const CheckCode& cc : checks_) {
    const CheckDef& c = model_.checks[static_cast<size_t>(cc.check)];
    CheckResult& r = (*out)[static_cast<size_t>(cc.check)];
    bool inputs_ok = true;
    for (int d : c.deps) inputs_ok = inputs_ok && std::isfinite(frame_[static_cast<size_t>(d)]);
    if (!inputs_ok) continue;
    if (cc.sides) {
      const double l = Exec(cc.a);
      const double h = Exec(cc.b);
      if (!JudgeSides(c.expr->kind, l, h, r)) continue;
    } else {
      const double v = Exec(cc.a);
      if (!std::isfinite(v)) continue;
      r.pass = v != 0.0;
    }
    r.evaluated = true;
    if (!r.pass) ++*failed;
  }
}

}  // namespace heatdeck
