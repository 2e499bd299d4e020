// The evaluator: runs a model's compiled programs over one frame of SI
// values, stage by stage so that each `solve` re-evaluates only what
// depends on its unknown.  One Evaluator serves one thread; sweeps make one
// per thread.
#pragma once

#include <memory>
#include <string>
#include <vector>

#include "eval/program.h"
#include "eval/results.h"
#include "model/model.h"

namespace heatdeck {

// How the quantities split into stages: stage 0 depends on no unknown; the
// stage of solve s holds what depends on s's unknown and on no unknown
// solved later.  Built once per model.
struct Plan {
  std::vector<int> solve_order;               // indices into Model::solves
  std::vector<int> stage_of;                  // per quantity: -1 or a solve index
  std::vector<std::vector<int>> stage_steps;  // [0] stage 0, [1 + k] solve_order[k]'s stage
  std::string error;                          // solves that depend on each other
  SourceRange error_range;
};
Plan MakePlan(const Model& model);

class Evaluator {
 public:
  Evaluator(const Model& model, const Plan& plan);
  ~Evaluator();
  Evaluator(const Evaluator&) = delete;
  Evaluator& operator=(const Evaluator&) = delete;

  double* frame() { return frame_.data(); }

  // Sets every given to its deck value, then applies overrides (SI).
  void LoadInputs(const std::vector<std::pair<int, double>>& overrides);

  // Evaluates everything: quantities (a failing one does not stop the
  // others), solves, checks and profiles, with every message, into *out.
  void EvaluateCase(CaseResult* out);

  // For sweeps: after EvaluateCase() on the sweep's base, restricts later
  // EvaluatePoint() calls to what depends on `varying` inputs (the swept
  // quantities, outermost sweep line first).
  void PrepareSweep(const std::vector<int>& varying);
  // Re-evaluates the dependent stages with the frame's current inputs.
  // `changed` is the index in `varying` of the outermost input that changed
  // since this evaluator's last point (0, the default, re-runs everything
  // that varies).  Returns false and sets *error (naming the quantity and
  // values) when a quantity or a solve fails; the frame then holds NaN where
  // it failed and for what was not evaluated after it.
  bool EvaluatePoint(std::string* error, int changed = 0);

 private:
  struct SolveStage;
  bool RunSolve(SolveStage& st, bool record, SolveResult* result);
  void ComputeProfiles(CaseResult* out) const;

  const Model& model_;
  const Plan& plan_;
  std::vector<double> frame_;
  std::unique_ptr<Program> stage0_;
  std::unique_ptr<Program> checks_;
  std::vector<std::unique_ptr<SolveStage>> solves_;  // in plan order
  // Sweep fast path.
  std::vector<std::unique_ptr<Program>> sweep_levels_;  // by innermost sweep line read
  int sweep_stale_ = 0;            // first level whose values are not the last point's
  std::vector<int> sweep_solves_;  // indices into solves_ to re-run per point
};

}  // namespace heatdeck
