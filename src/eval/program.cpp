#include "eval/program.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>
#include "eval/expr_parser.h"

#include "units/unit.h"

namespace heatdeck {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Quantities per compiled chunk: large enough that per-call overhead is
// spread, small enough that a failure is cheap to locate.
constexpr size_t kChunk = 32;
constexpr size_t kMaxText = 19000;

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

std::string Num(double v) {
  const std::string s = units::FormatExact(v);
  return v < 0 ? "(" + s + ")" : s;
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

  static double Trampoline(void* data, const double* args, int /*n*/) {
    auto* site = static_cast<CallSite*>(data);
    return site->fn->fn(args, *site);
  }
};

// A table interpolation site: NAME.COLUMN(x).
struct Program::TableSite {
  const TableDef* table = nullptr;
  int column = 0;
  int quantity = -1;
  SourceRange range;  // the call in the deck
  Program* program = nullptr;

  static double Trampoline(void* data, double x) {
    auto* site = static_cast<TableSite*>(data);
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

// Consecutive calculated quantities compiled into one muParser expression
// of assignments, "q5=(…),q6=(…),…": one parser and one Eval() call per
// chunk instead of per quantity.  Assignments run left to right, so a
// quantity may read one computed earlier in the same chunk.
struct Program::Step {
  ExprParser parser;
  std::string compile_error;  // set when the chunk could not be compiled
  std::vector<int> quantities;
  std::vector<std::string> texts;  // each quantity's expression text
};

struct Program::CheckStep {
  int check = -1;
  ExprParser whole;  // the full condition (1 or 0)
  ExprParser lhs, rhs;
  bool sides = false;
  bool broken = false;
};

// Checks compiled together like quantities: one muParser expression list
// "lhs0,rhs0,whole1,…" (both sides of a comparison, else the condition)
// evaluated in one call.  A parser per check cost three parser
// constructions and three first-evaluation set-ups per check, most of the
// compile time of a deck with many checks.  Should the list fail to
// evaluate, its checks are compiled alone, as before, so that only the
// faulty one is reported as not evaluated.
struct Program::CheckChunk {
  ExprParser parser;
  bool failed = false;
  struct Slot {
    int check = -1;
    bool sides = false;
    int first = 0;  // index of its first value in the list's results
  };
  std::vector<Slot> slots;
  int values = 0;                                 // results the list gives
  std::vector<std::unique_ptr<CheckStep>> alone;  // after a failure, per slot
};

// Translates typed expressions to muParser text.  Each variable a parser
// reads is defined on that parser alone, so compile cost stays linear in the
// size of the deck.
class Translator {
 public:
  Translator(const Model& m, ExprParser& p, double* values,
             std::vector<std::unique_ptr<Program::CallSite>>* sites,
             std::vector<std::unique_ptr<Program::TableSite>>* table_sites, Program* program,
             int quantity, bool strict_equal)
      : m_(m),
        p_(p),
        values_(values),
        sites_(sites),
        table_sites_(table_sites),
        program_(program),
        quantity_(quantity),
        strict_equal_(strict_equal) {}

  std::string Text(const Expr* e) {
    const ExprInfo& info = m_.Info(e);
    if (info.literal) return Num(info.si);
    switch (e->kind) {
      case ExprKind::kNumber:
        return Num(info.si);
      case ExprKind::kName: {
        if (info.constant >= 0) return Num(info.si);
        const std::string var = fmt::format("q{}", info.quantity);
        p_.DefineVar(var, values_ + info.quantity);
        return var;
      }
      case ExprKind::kNeg:
        return fmt::format("(-{})", Text(e->args[0]));
      case ExprKind::kNot:
        return fmt::format("({}==0)", Text(e->args[0]));
      case ExprKind::kAnd:
        return fmt::format("({}&&{})", Text(e->args[0]), Text(e->args[1]));
      case ExprKind::kOr:
        return fmt::format("({}||{})", Text(e->args[0]), Text(e->args[1]));
      case ExprKind::kEq:
      case ExprKind::kNe: {
        const std::string a = Text(e->args[0]);
        const std::string b = Text(e->args[1]);
        if (strict_equal_) return fmt::format("({}{}{})", a, OperatorText(e->kind), b);
        const std::string near = fmt::format("(abs({0}-{1})<=({2}*max(abs({0}),abs({1}))))", a, b,
                                             units::FormatExact(kEqualTol));
        return e->kind == ExprKind::kEq ? near : fmt::format("({}==0)", near);
      }
      case ExprKind::kCall:
        return Call(e, info);
      default:
        return fmt::format("({}{}{})", Text(e->args[0]), OperatorText(e->kind), Text(e->args[1]));
    }
  }

 private:
  std::string Args(const Expr* e, size_t from) {
    std::string s;
    for (size_t i = from; i < e->args.size(); ++i) {
      if (i > from) s += ",";
      s += Text(e->args[i]);
    }
    return s;
  }

  std::string Call(const Expr* e, const ExprInfo& info) {
    if (info.builtin >= 0) {
      const BuiltinInfo& b = BuiltinFunctions()[static_cast<size_t>(info.builtin)];
      if (b.id == Builtin::kIf) {
        return fmt::format("({}?{}:{})", Text(e->args[0]), Text(e->args[1]), Text(e->args[2]));
      }
      if ((b.id == Builtin::kMin || b.id == Builtin::kMax) && e->args.size() == 1) {
        return Text(e->args[0]);
      }
      return fmt::format("{}({})", b.name, Args(e, 0));
    }
    if (info.table >= 0) {
      auto site = std::make_unique<Program::TableSite>();
      site->table = &m_.tables[static_cast<size_t>(info.table)];
      site->column = info.column;
      site->range = e->range;
      site->quantity = quantity_;
      site->program = program_;
      const std::string name = fmt::format("t{}", table_sites_->size());
      p_.DefineFunUserData(name, &Program::TableSite::Trampoline, site.get(), false);
      table_sites_->push_back(std::move(site));
      return fmt::format("{}({})", name, Args(e, 0));
    }
    // A library function: its own callback name per call site, with the site
    // as user data, so warnings land on the right quantity.
    auto site = std::make_unique<Program::CallSite>();
    site->fn = info.fn;
    site->range = e->range;
    site->quantity = quantity_;
    site->program = program_;
    const std::string name = fmt::format("f{}", sites_->size());
    p_.DefineFunUserData(name, &Program::CallSite::Trampoline, site.get(), false);
    sites_->push_back(std::move(site));
    return fmt::format("{}({})", name, Args(e, 0));
  }

  const Model& m_;
  ExprParser& p_;
  double* values_;
  std::vector<std::unique_ptr<Program::CallSite>>* sites_;
  std::vector<std::unique_ptr<Program::TableSite>>* table_sites_;
  Program* program_;
  int quantity_;
  bool strict_equal_;
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

int Program::AddExpression(const Expr* e) {
  auto step = std::make_unique<Step>();
  Translator t(model_, step->parser, frame_, &sites_, &table_sites_, this, -1, false);
  step->texts.push_back(t.Text(e));
  try {
    step->parser.SetExpr(step->texts.back());
  } catch (const mu::ParserError& err) {
    step->compile_error = err.GetMsg();
  }
  extra_.push_back(std::move(step));
  return static_cast<int>(extra_.size()) - 1;
}

double Program::Eval(int handle) {
  if (!extra_[static_cast<size_t>(handle)]->compile_error.empty()) return kNaN;
  try {
    return extra_[static_cast<size_t>(handle)]->parser.Eval();
  } catch (const mu::ParserError&) {
    return kNaN;
  }
}

Program::~Program() = default;

std::unique_ptr<Program> Program::Clone() const {
  auto p = std::make_unique<Program>(model_, steps_idx_);
  std::copy(frame_, frame_ + model_.quantities.size(), p->values_.begin());
  return p;
}

void Program::Build(bool with_checks) {
  std::unique_ptr<Step> chunk;
  std::string text;
  auto flush = [&] {
    if (!chunk) return;
    if (chunk->compile_error.empty()) {
      try {
        chunk->parser.SetExpr(text);
      } catch (const mu::ParserError& e) {
        chunk->compile_error = e.GetMsg();
      }
    }
    steps_.push_back(std::move(chunk));
    text.clear();
  };
  for (int qi : steps_idx_) {
    const Quantity& q = model_.quantities[static_cast<size_t>(qi)];
    if (q.kind != QuantityKind::kCalc) continue;  // inputs are set in the frame
    if (!chunk) chunk = std::make_unique<Step>();
    Translator t(model_, chunk->parser, frame_, &sites_, &table_sites_, this, qi, false);
    const std::string var = fmt::format("q{}", qi);
    std::string expr = t.Text(q.expr);
    if (expr.size() + var.size() + 1 > kMaxText) {
      // muParser reads at most 20 000 characters per expression.
      flush();
      chunk = std::make_unique<Step>();
      chunk->quantities.push_back(qi);
      chunk->compile_error = fmt::format(
          "the expression is too long to compile ({} characters once translated; the limit is "
          "{}): split it into named quantities",
          expr.size(), kMaxText);
      chunk->texts.push_back(std::move(expr));
      flush();
      continue;
    }
    if (!text.empty() && text.size() + expr.size() + var.size() + 2 > kMaxText) {
      flush();
      chunk = std::make_unique<Step>();
      Translator t2(model_, chunk->parser, frame_, &sites_, &table_sites_, this, qi, false);
      expr = t2.Text(q.expr);
    }
    chunk->parser.DefineVar(var, frame_ + qi);
    chunk->quantities.push_back(qi);
    chunk->texts.push_back(std::move(expr));
    if (!text.empty()) text += ',';
    text += var + "=" + chunk->texts.back();
    if (chunk->quantities.size() >= kChunk) flush();
  }
  flush();
  if (!with_checks) return;
  std::unique_ptr<CheckChunk> cc;
  text.clear();
  auto flush_checks = [&] {
    if (!cc || cc->slots.empty()) return;
    try {
      cc->parser.SetExpr(text);
    } catch (const mu::ParserError&) {
      cc->failed = true;  // compiled check by check on first use
    }
    check_chunks_.push_back(std::move(cc));
    text.clear();
  };
  for (size_t ci = 0; ci < model_.checks.size(); ++ci) {
    const CheckDef& c = model_.checks[ci];
    if (!cc) cc = std::make_unique<CheckChunk>();
    auto translate = [&](std::string* list) {
      Translator t(model_, cc->parser, frame_, &sites_, &table_sites_, this, -1, false);
      if (!c.has_sides) {
        *list = t.Text(c.expr);
        return;
      }
      *list = t.Text(c.expr->args[0]);
      *list += ',';
      *list += t.Text(c.expr->args[1]);
    };
    std::string list;
    translate(&list);
    // A check compiled alone also compiles its whole condition, which repeats
    // each side up to twice plus a few dozen characters; a check that might
    // come near muParser's length limit keeps that path, so that it breaks
    // exactly as it always did.
    if (2 * list.size() + 200 > kMaxText) {
      checks_.push_back(CompileCheck(static_cast<int>(ci)));
      continue;
    }
    if (!text.empty() && text.size() + list.size() + 1 > kMaxText) {
      flush_checks();
      cc = std::make_unique<CheckChunk>();
      translate(&list);
    }
    cc->slots.push_back(CheckChunk::Slot{static_cast<int>(ci), c.has_sides, cc->values});
    cc->values += c.has_sides ? 2 : 1;
    if (!text.empty()) text += ',';
    text += list;
    if (cc->slots.size() >= kChunk) flush_checks();
  }
  flush_checks();
}

// One check on parsers of its own (the whole condition, and both sides of a
// comparison).
std::unique_ptr<Program::CheckStep> Program::CompileCheck(int check) {
  const CheckDef& c = model_.checks[static_cast<size_t>(check)];
  auto step = std::make_unique<CheckStep>();
  step->check = check;
  Translator whole(model_, step->whole, frame_, &sites_, &table_sites_, this, -1, false);
  try {
    step->whole.SetExpr(whole.Text(c.expr));
    if (c.has_sides) {
      step->sides = true;
      Translator l(model_, step->lhs, frame_, &sites_, &table_sites_, this, -1, false);
      step->lhs.SetExpr(l.Text(c.expr->args[0]));
      Translator r(model_, step->rhs, frame_, &sites_, &table_sites_, this, -1, false);
      step->rhs.SetExpr(r.Text(c.expr->args[1]));
    }
  } catch (const mu::ParserError&) {
    step->broken = true;  // reported as not evaluated
  }
  return step;
}

void Program::LoadGivens() {
  for (size_t i = 0; i < model_.quantities.size(); ++i) {
    const Quantity& q = model_.quantities[i];
    if (q.kind == QuantityKind::kGiven) frame_[i] = q.given_si;
  }
}

std::string Program::ExpressionText(int quantity) const {
  for (const auto& s : steps_) {
    for (size_t i = 0; i < s->quantities.size(); ++i) {
      if (s->quantities[i] == quantity) return s->texts[i];
    }
  }
  return "";
}

bool Program::EvalChunk(Step& s, std::string* error) {
  if (!s.compile_error.empty()) {
    *error = s.compile_error;
    for (int q : s.quantities) frame_[static_cast<size_t>(q)] = kNaN;
    return false;
  }
  try {
    int n = 0;
    s.parser.Eval(n);
    return true;
  } catch (const mu::ParserError& e) {
    *error = e.GetMsg();
    for (int q : s.quantities) frame_[static_cast<size_t>(q)] = kNaN;
    return false;
  }
}

void Program::ClearFrom(size_t chunk, int quantity) {
  bool after = quantity < 0;
  for (size_t c = chunk; c < steps_.size(); ++c) {
    for (int q : steps_[c]->quantities) {
      after = after || q == quantity;
      if (after) frame_[static_cast<size_t>(q)] = kNaN;
    }
  }
}

bool Program::Run() {
  failed_step_ = -1;
  failure_ = QuantityMessage{};
  // Only the last run's messages are kept: a sweep runs a program a million
  // times, and a correlation that warns at every point must not pile up.
  recorded_.clear();
  for (size_t c = 0; c < steps_.size(); ++c) {
    Step* s = steps_[c].get();
    library_error_ = false;
    const size_t rec_before = recorded_.size();
    std::string internal;
    if (!EvalChunk(*s, &internal)) {
      failed_step_ = s->quantities.front();
      ClearFrom(c + 1, -1);
      failure_ = QuantityMessage{
          QuantityMessage::Kind::kError,
          fmt::format("cannot evaluate '{}': {}",
                      model_.quantities[static_cast<size_t>(failed_step_)].name, internal),
          {}};
      return false;
    }
    for (int q : s->quantities) {
      bool lib_error = false;
      if (library_error_) {
        for (size_t r = rec_before; r < recorded_.size(); ++r) {
          lib_error = lib_error || (recorded_[r].quantity == q &&
                                    recorded_[r].message.kind == QuantityMessage::Kind::kError);
        }
      }
      if (!std::isfinite(frame_[static_cast<size_t>(q)]) || lib_error) {
        failed_step_ = q;
        failure_ = Explain(q);
        // What comes after the failure was not evaluated at these inputs
        // (later chunks did not run at all): NaN, not the last point's values.
        ClearFrom(c, q);
        return false;
      }
    }
  }
  return true;
}

void Program::RunAll(CaseResult* out) {
  const size_t n = model_.quantities.size();
  out->ok.assign(n, true);
  out->messages.assign(n, {});
  recorded_.clear();
  std::vector<int> lib_failed;
  for (auto& s : steps_) {
    library_error_ = false;
    const size_t rec_before = recorded_.size();
    std::string internal;
    const bool evaluated = EvalChunk(*s, &internal);
    lib_failed.clear();
    if (library_error_) {
      for (size_t r = rec_before; r < recorded_.size(); ++r) {
        if (recorded_[r].message.kind == QuantityMessage::Kind::kError) {
          lib_failed.push_back(recorded_[r].quantity);
        }
      }
    }
    for (int q : s->quantities) {
      const size_t qi = static_cast<size_t>(q);
      bool inputs_ok = true;
      for (int d : model_.quantities[qi].deps)
        inputs_ok = inputs_ok && out->ok[static_cast<size_t>(d)];
      const bool lib_error = std::find(lib_failed.begin(), lib_failed.end(), q) != lib_failed.end();
      if (!inputs_ok) {
        out->ok[qi] = false;
        frame_[qi] = kNaN;
        continue;
      }
      if (!evaluated) {
        out->ok[qi] = false;
        const Quantity& qq = model_.quantities[qi];
        out->messages[qi].push_back(QuantityMessage{
            QuantityMessage::Kind::kError,
            fmt::format("cannot evaluate '{}': {}", qq.name,
                        s->compile_error.empty() ? "internal error: " + internal : internal),
            qq.expr != nullptr ? qq.expr->range : qq.range});
        continue;
      }
      if (!std::isfinite(frame_[qi]) || lib_error) {
        if (!lib_error) out->messages[qi].push_back(Explain(q));
        out->ok[qi] = false;
        frame_[qi] = kNaN;
      }
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

void Program::RunCheck(const CheckStep& s, CheckResult& r, int* failed) const {
  const CheckDef& c = model_.checks[static_cast<size_t>(s.check)];
  bool inputs_ok = true;
  for (int d : c.deps) inputs_ok = inputs_ok && std::isfinite(frame_[static_cast<size_t>(d)]);
  if (!inputs_ok || s.broken) return;
  try {
    if (s.sides) {
      r.lhs_si = s.lhs.Eval();
      r.rhs_si = s.rhs.Eval();
      if (!JudgeSides(c.expr->kind, r.lhs_si, r.rhs_si, r)) return;
    } else {
      const double v = s.whole.Eval();
      if (!std::isfinite(v)) return;
      r.pass = v != 0.0;
    }
    r.evaluated = true;
    if (!r.pass) ++*failed;
  } catch (const mu::ParserError&) {
    r.evaluated = false;
  }
}

void Program::RunChecks(std::vector<CheckResult>* out, int* failed) {
  out->assign(model_.checks.size(), CheckResult{});
  *failed = 0;
  for (const auto& s : checks_) RunCheck(*s, (*out)[static_cast<size_t>(s->check)], failed);
  for (const auto& chunk : check_chunks_) {
    const double* v = nullptr;
    if (!chunk->failed) {
      try {
        int n = 0;
        v = chunk->parser.Eval(n);
        chunk->failed = n != chunk->values;
      } catch (const mu::ParserError&) {
        chunk->failed = true;
      }
    }
    if (chunk->failed) {
      if (chunk->alone.empty()) {
        for (const auto& slot : chunk->slots) chunk->alone.push_back(CompileCheck(slot.check));
      }
      for (const auto& s : chunk->alone)
        RunCheck(*s, (*out)[static_cast<size_t>(s->check)], failed);
      continue;
    }
    for (const auto& slot : chunk->slots) {
      const CheckDef& c = model_.checks[static_cast<size_t>(slot.check)];
      CheckResult& r = (*out)[static_cast<size_t>(slot.check)];
      bool inputs_ok = true;
      for (int d : c.deps) inputs_ok = inputs_ok && std::isfinite(frame_[static_cast<size_t>(d)]);
      if (!inputs_ok) continue;
      const double* x = v + slot.first;
      if (slot.sides) {
        if (!JudgeSides(c.expr->kind, x[0], x[1], r)) continue;
      } else {
        if (!std::isfinite(x[0])) continue;
        r.pass = x[0] != 0.0;
      }
      r.evaluated = true;
      if (!r.pass) ++*failed;
    }
  }
}

}  // namespace heatdeck
