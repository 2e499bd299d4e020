#include "eval/evaluator.h"

#include <cmath>
#include <limits>
#include <set>

#include <fmt/format.h>

#include "library/roots.h"
#include "units/unit.h"

namespace heatdeck {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
// LANGUAGE.md: the root search stops at 1e-10 relative.
constexpr double kSolveRelTol = 1e-10;
constexpr int kSolveMaxIter = 200;
constexpr int kProfilePoints = 41;

}  // namespace

Plan MakePlan(const Model& model) {
  Plan plan;
  const size_t n = model.quantities.size();
  const size_t ns = model.solves.size();
  // unk[q]: the solves whose unknown q depends on, as a sorted list.
  std::vector<std::vector<int>> unk(n);
  std::vector<int> solve_of(n, -1);
  for (size_t s = 0; s < ns; ++s)
    solve_of[static_cast<size_t>(model.solves[s].unknown)] = static_cast<int>(s);
  for (int qi : model.order) {
    std::set<int> u;
    const size_t q = static_cast<size_t>(qi);
    if (solve_of[q] >= 0) u.insert(solve_of[q]);
    for (int d : model.quantities[q].deps) {
      for (int s : unk[static_cast<size_t>(d)]) u.insert(s);
    }
    unk[q].assign(u.begin(), u.end());
  }
  // Solve s needs every other solve its condition reads.
  std::vector<std::vector<int>> needs(ns);
  for (size_t s = 0; s < ns; ++s) {
    std::set<int> u;
    for (int d : model.solves[s].deps) {
      for (int x : unk[static_cast<size_t>(d)]) {
        if (x != static_cast<int>(s)) u.insert(x);
      }
    }
    needs[s].assign(u.begin(), u.end());
  }
  std::vector<int> state(ns, 0);
  bool cyclic = false;
  std::function<void(int)> visit = [&](int s) {
    if (state[static_cast<size_t>(s)] == 2 || cyclic) return;
    if (state[static_cast<size_t>(s)] == 1) {
      cyclic = true;
      const SolveDef& d = model.solves[static_cast<size_t>(s)];
      plan.error = fmt::format(
          "the solve for '{}' and another solve depend on each other; "
          "heatdeck solves one unknown at a time",
          model.quantities[static_cast<size_t>(d.unknown)].name);
      plan.error_range = d.stmt->name_range;
      return;
    }
    state[static_cast<size_t>(s)] = 1;
    for (int t : needs[static_cast<size_t>(s)]) visit(t);
    state[static_cast<size_t>(s)] = 2;
    plan.solve_order.push_back(s);
  };
  for (size_t s = 0; s < ns; ++s) visit(static_cast<int>(s));
  std::vector<int> rank(ns, 0);
  for (size_t k = 0; k < plan.solve_order.size(); ++k) {
    rank[static_cast<size_t>(plan.solve_order[k])] = static_cast<int>(k);
  }
  plan.stage_of.assign(n, -1);
  plan.stage_steps.assign(1 + plan.solve_order.size(), {});
  for (int qi : model.order) {
    const size_t q = static_cast<size_t>(qi);
    int stage = -1;
    for (int s : unk[q]) {
      if (stage < 0 || rank[static_cast<size_t>(s)] > rank[static_cast<size_t>(stage)]) stage = s;
    }
    plan.stage_of[q] = stage;
    const size_t slot = stage < 0 ? 0 : 1 + static_cast<size_t>(rank[static_cast<size_t>(stage)]);
    if (slot < plan.stage_steps.size()) plan.stage_steps[slot].push_back(qi);
  }
  return plan;
}

struct Evaluator::SolveStage {
  int solve = -1;  // index into Model::solves
  std::unique_ptr<Program> inner;
  int lhs = -1, rhs = -1;
  std::vector<int> steps;
};

Evaluator::Evaluator(const Model& model, const Plan& plan)
    : model_(model), plan_(plan), frame_(model.quantities.size(), kNaN) {
  stage0_ = std::make_unique<Program>(model, plan.stage_steps[0], frame_.data(), false);
  checks_ = std::make_unique<Program>(model, std::vector<int>{}, frame_.data(), true);
  for (size_t k = 0; k < plan.solve_order.size(); ++k) {
    auto st = std::make_unique<SolveStage>();
    st->solve = plan.solve_order[k];
    const SolveDef& d = model.solves[static_cast<size_t>(st->solve)];
    // The unknown itself is a step of its stage only as an input.
    for (int q : plan.stage_steps[1 + k]) {
      if (q != d.unknown) st->steps.push_back(q);
    }
    st->inner = std::make_unique<Program>(model, st->steps, frame_.data(), false);
    if (d.ok) {
      st->lhs = st->inner->AddExpression(d.lhs);
      st->rhs = st->inner->AddExpression(d.rhs);
    }
    solves_.push_back(std::move(st));
  }
}

Evaluator::~Evaluator() = default;

void Evaluator::LoadInputs(const std::vector<std::pair<int, double>>& overrides) {
  std::fill(frame_.begin(), frame_.end(), kNaN);
  for (size_t i = 0; i < model_.quantities.size(); ++i) {
    const Quantity& q = model_.quantities[i];
    if (q.kind == QuantityKind::kGiven) frame_[i] = q.given_si;
  }
  for (const auto& [q, v] : overrides) frame_[static_cast<size_t>(q)] = v;
}

// Brent's method on lhs - rhs over the bracket; re-evaluates only the
// solve's stage.  The last evaluation is at the root, so the frame holds the
// solution's values.
bool Evaluator::RunSolve(SolveStage& st, bool record, SolveResult* result) {
  const SolveDef& d = model_.solves[static_cast<size_t>(st.solve)];
  const size_t x = static_cast<size_t>(d.unknown);
  const std::string& name = model_.quantities[x].name;
  const units::Unit& xu = model_.quantities[x].display;
  *result = SolveResult{};
  if (!d.ok) {
    result->error = "the condition has errors";
    return false;
  }
  Program& p = *st.inner;
  int calls = 0;
  std::string failure;
  auto residual = [&](double v) {
    ++calls;
    frame_[x] = v;
    p.ClearRecorded();
    if (!p.Run()) {
      if (failure.empty()) failure = p.failure().text;
      return kNaN;
    }
    return p.Eval(st.lhs) - p.Eval(st.rhs);
  };
  const double f_lo = residual(d.lo);
  const double f_hi = residual(d.hi);
  result->residual_lo = f_lo;
  result->residual_hi = f_hi;
  const units::Unit& ru = d.residual_unit;
  // A dimensionless value has no unit text, and so no space before it.
  auto show = [](double v, const std::string& unit) {
    return unit.empty() ? units::FormatSig(v, 6)
                        : fmt::format("{} {}", units::FormatSig(v, 6), unit);
  };
  auto show_x = [&](double v) { return show(xu.FromSi(v), xu.text); };
  auto show_r = [&](double r) { return show(r / ru.factor, ru.text); };
  if (!std::isfinite(f_lo) || !std::isfinite(f_hi)) {
    const bool lo_bad = !std::isfinite(f_lo);
    result->error =
        fmt::format("solve for '{}': the condition cannot be evaluated at {} = {}{}", name, name,
                    show_x(lo_bad ? d.lo : d.hi), failure.empty() ? "" : ": " + failure);
    frame_[x] = kNaN;
    return false;
  }
  if ((f_lo > 0) == (f_hi > 0) && f_lo != 0 && f_hi != 0) {
    result->error = fmt::format(
        "solve for '{}': no sign change over the bracket; lhs - rhs = {} at {} = {} and {} at "
        "{} = {}",
        name, show_r(f_lo), name, show_x(d.lo), show_r(f_hi), name, show_x(d.hi));
    frame_[x] = kNaN;
    return false;
  }
  const double root =
      library::BrentRoot(residual, d.lo, d.hi, f_lo, f_hi, kSolveRelTol, 0.0, kSolveMaxIter);
  if (!std::isfinite(root)) {
    result->error =
        fmt::format("solve for '{}' failed{}", name, failure.empty() ? "" : ": " + failure);
    frame_[x] = kNaN;
    return false;
  }
  const double r = residual(root);  // leaves the frame at the root
  result->iterations = calls;
  result->value_si = root;
  result->residual_si = r;
  if (!std::isfinite(r)) {
    result->error = fmt::format("solve for '{}': the condition fails at the root {}{}", name,
                                show_x(root), failure.empty() ? "" : ": " + failure);
    frame_[x] = kNaN;
    return false;
  }
  result->converged = true;
  (void)record;
  return true;
}

void Evaluator::EvaluateCase(CaseResult* out) {
  const size_t n = model_.quantities.size();
  stage0_->RunAll(out);
  out->solves.assign(model_.solves.size(), SolveResult{});
  for (auto& st : solves_) {
    const SolveDef& d = model_.solves[static_cast<size_t>(st->solve)];
    const size_t x = static_cast<size_t>(d.unknown);
    SolveResult& sr = out->solves[static_cast<size_t>(st->solve)];
    bool inputs_ok = true;
    for (int q : d.deps) {
      const size_t qq = static_cast<size_t>(q);
      if (plan_.stage_of[qq] < 0 && !out->ok[qq]) inputs_ok = false;
    }
    if (inputs_ok && RunSolve(*st, true, &sr)) {
      // Re-run the stage once more at the root with messages recorded.
      CaseResult stage;
      st->inner->RunAll(&stage);
      for (int q : st->steps) {
        const size_t qq = static_cast<size_t>(q);
        out->ok[qq] = stage.ok[qq];
        for (auto& m : stage.messages[qq]) out->messages[qq].push_back(std::move(m));
      }
      out->ok[x] = true;
    } else {
      if (!inputs_ok) sr.error = "an input of the condition could not be evaluated";
      out->ok[x] = false;
      out->messages[x].push_back(
          QuantityMessage{QuantityMessage::Kind::kError, sr.error, d.stmt->range});
      for (int q : st->steps) {
        out->ok[static_cast<size_t>(q)] = false;
        frame_[static_cast<size_t>(q)] = kNaN;
      }
    }
  }
  out->values.assign(frame_.begin(), frame_.begin() + static_cast<long>(n));
  checks_->RunChecks(&out->checks, &out->failed_checks);
  ComputeProfiles(out);
}

void Evaluator::ComputeProfiles(CaseResult* out) const {
  out->profiles.clear();
  for (size_t i = 0; i < model_.profiles.size(); ++i) {
    const ProfileDef& p = model_.profiles[i];
    ProfileResult r;
    r.profile = static_cast<int>(i);
    r.counterflow = p.counterflow;
    const double th1 = frame_[static_cast<size_t>(p.hot_in)];
    const double th2 = frame_[static_cast<size_t>(p.hot_out)];
    const double tc1 = frame_[static_cast<size_t>(p.cold_in)];
    const double tc2 = frame_[static_cast<size_t>(p.cold_out)];
    if (!std::isfinite(th1 + th2 + tc1 + tc2)) {
      r.error = "the stream temperatures could not be evaluated";
      out->profiles.push_back(std::move(r));
      continue;
    }
    // With constant U and heat capacities the local difference varies
    // exponentially along the area: dT(x) = dT_a * (dT_b/dT_a)^x, and the
    // fraction of the duty transferred up to x is (1 - r^x)/(1 - r),
    // r = dT_b/dT_a (x where r = 1).  x = 0 is the hot inlet.
    const double dta = p.counterflow ? th1 - tc2 : th1 - tc1;
    const double dtb = p.counterflow ? th2 - tc1 : th2 - tc2;
    if (!(dta > 0) || !(dtb > 0)) {
      r.error = fmt::format(
          "the end temperature differences {} K and {} K are not both positive "
          "(temperature cross)",
          units::FormatSig(dta, 4), units::FormatSig(dtb, 4));
      out->profiles.push_back(std::move(r));
      continue;
    }
    const double ratio = dtb / dta;
    for (int k = 0; k < kProfilePoints; ++k) {
      const double x = static_cast<double>(k) / (kProfilePoints - 1);
      const double g = std::fabs(ratio - 1) < 1e-9 ? x : (1 - std::pow(ratio, x)) / (1 - ratio);
      r.x.push_back(x);
      r.hot_si.push_back(th1 - (th1 - th2) * g);
      r.cold_si.push_back(p.counterflow ? tc2 - (tc2 - tc1) * g : tc1 + (tc2 - tc1) * g);
    }
    r.ok = true;
    out->profiles.push_back(std::move(r));
  }
}

void Evaluator::PrepareSweep(const std::vector<int>& varying) {
  const size_t n = model_.quantities.size();
  std::vector<bool> dirty(n, false);
  for (int v : varying) dirty[static_cast<size_t>(v)] = true;
  // Propagate in dependency order; an unknown is dirty when its condition
  // reads something dirty (apart from what depends on the unknown itself).
  std::vector<int> solve_of(n, -1);
  for (size_t s = 0; s < model_.solves.size(); ++s) {
    solve_of[static_cast<size_t>(model_.solves[s].unknown)] = static_cast<int>(s);
  }
  auto propagate = [&] {
    for (int qi : model_.order) {
      const size_t q = static_cast<size_t>(qi);
      for (int d : model_.quantities[q].deps) dirty[q] = dirty[q] || dirty[static_cast<size_t>(d)];
    }
  };
  propagate();
  for (size_t k = 0; k < solves_.size(); ++k) {
    const SolveDef& d = model_.solves[static_cast<size_t>(solves_[k]->solve)];
    bool any = false;
    for (int q : d.deps) {
      if (plan_.stage_of[static_cast<size_t>(q)] != solves_[k]->solve) {
        any = any || dirty[static_cast<size_t>(q)];
      }
    }
    for (int q : solves_[k]->steps) {
      for (int dep : model_.quantities[static_cast<size_t>(q)].deps) {
        if (plan_.stage_of[static_cast<size_t>(dep)] != solves_[k]->solve) {
          any = any || dirty[static_cast<size_t>(dep)];
        }
      }
    }
    if (any) {
      dirty[static_cast<size_t>(d.unknown)] = true;
      propagate();
    }
  }
  // A grid runs its last sweep line fastest: from one point to the next only
  // the inner inputs change.  So stage 0's varying steps are split by the
  // innermost sweep line they depend on (their level), and a point re-runs
  // only the levels at and inside the outermost line that changed.  On B1,
  // whose inner line is the length, the friction factors and film
  // coefficients are then computed once per 101 points instead of at each.
  std::vector<int> level(n, -1);
  for (size_t j = 0; j < varying.size(); ++j)
    level[static_cast<size_t>(varying[j])] = static_cast<int>(j);
  for (int qi : model_.order) {
    const size_t q = static_cast<size_t>(qi);
    for (int d : model_.quantities[q].deps)
      level[q] = std::max(level[q], level[static_cast<size_t>(d)]);
  }
  std::vector<std::vector<int>> steps(std::max<size_t>(1, varying.size()));
  for (int q : plan_.stage_steps[0]) {
    if (dirty[static_cast<size_t>(q)] && level[static_cast<size_t>(q)] >= 0) {
      steps[static_cast<size_t>(level[static_cast<size_t>(q)])].push_back(q);
    }
  }
  sweep_levels_.clear();
  for (auto& st : steps) {
    sweep_levels_.push_back(std::make_unique<Program>(model_, std::move(st), frame_.data(), false));
  }
  sweep_stale_ = 0;
  sweep_solves_.clear();
  for (size_t k = 0; k < solves_.size(); ++k) {
    const SolveDef& d = model_.solves[static_cast<size_t>(solves_[k]->solve)];
    if (dirty[static_cast<size_t>(d.unknown)]) sweep_solves_.push_back(static_cast<int>(k));
  }
}

bool Evaluator::EvaluatePoint(std::string* error, int changed) {
  // What a failure leaves unevaluated is NaN, never a value from the last
  // point or from a solve's last bracket probe: solves from the i-th on.
  auto clear_solves = [&](size_t i) {
    for (; i < sweep_solves_.size(); ++i) {
      SolveStage& st = *solves_[static_cast<size_t>(sweep_solves_[i])];
      frame_[static_cast<size_t>(model_.solves[static_cast<size_t>(st.solve)].unknown)] = kNaN;
      st.inner->ClearSteps();
    }
  };
  // Levels before `changed` still hold this point's values, unless one of
  // them failed at the last point (it then holds NaN, and must run again).
  const size_t from = static_cast<size_t>(std::max(0, std::min(changed, sweep_stale_)));
  sweep_stale_ = static_cast<int>(sweep_levels_.size());
  for (size_t j = from; j < sweep_levels_.size(); ++j) {
    if (sweep_levels_[j]->Run()) continue;
    *error = sweep_levels_[j]->failure().text;
    sweep_stale_ = static_cast<int>(j);
    for (size_t k = j + 1; k < sweep_levels_.size(); ++k) sweep_levels_[k]->ClearSteps();
    clear_solves(0);
    return false;
  }
  for (size_t i = 0; i < sweep_solves_.size(); ++i) {
    SolveResult r;
    if (!RunSolve(*solves_[static_cast<size_t>(sweep_solves_[i])], false, &r)) {
      *error = r.error;
      clear_solves(i);
      return false;
    }
  }
  return true;
}

}  // namespace heatdeck
