// A compiled deck: each quantity's typed expression compiled once to code
// for a small stack machine over SI doubles (unit factors folded to
// constants, library functions bound as call sites), run in dependency order
// over a frame of values.  Re-running it with new input values compiles
// nothing and allocates nothing on the normal path; cases, sweeps and solves
// run it many times.
//
// A Program evaluates on its own stack and frame (or a frame it was given),
// so one thread uses one Program; Clone() gives another thread its own.
#pragma once

#include <cstdint>
#include <memory>
#include <string>
#include <vector>

#include "eval/results.h"
#include "model/model.h"

namespace heatdeck {

class Program {
 public:
  // Compiles `steps` (quantity indices in dependency order) and the checks,
  // over a frame of its own.  The model must outlive the program.
  Program(const Model& model, std::vector<int> steps);
  // The same over an external frame (Model::quantities.size() doubles that
  // outlive the program), so that several programs (the stages of a solve)
  // share one frame; checks are compiled only when with_checks.
  Program(const Model& model, std::vector<int> steps, double* frame, bool with_checks);
  ~Program();
  Program(const Program&) = delete;
  Program& operator=(const Program&) = delete;

  // A program with the same steps bound to a fresh frame (for another thread).
  std::unique_ptr<Program> Clone() const;

  // The frame: SI values indexed like Model::quantities.  Set inputs here
  // before Run().
  double* values() { return frame_; }
  std::vector<double> frame() const { return {frame_, frame_ + model_.quantities.size()}; }

  // Compiles an extra expression (a solve's condition side) over the frame;
  // returns a handle for Eval().
  int AddExpression(const Expr* e);
  // Evaluates an expression added with AddExpression (NaN on failure).
  double Eval(int handle);

  // Sets every given to its value in the deck.
  void LoadGivens();

  // Evaluates the steps in order.  Returns true when every step gave a
  // finite value; otherwise stops at the first failing step and returns
  // false (failed_step() tells which, failure() why, naming the values),
  // with NaN in the frame for the failing step and every step after it.
  bool Run();
  // Like Run(), but a failing quantity does not stop the others: it gets NaN
  // and so do the quantities that read it.  Messages are recorded per
  // quantity into *out (out->values untouched).
  void RunAll(CaseResult* out);

  // Evaluates the checks against the current frame.  Not const: a chunk of
  // checks that fails to evaluate is recompiled check by check on the spot.
  void RunChecks(std::vector<CheckResult>* out, int* failed);

  // Sets every step's value in the frame to NaN (not evaluated).
  void ClearSteps() { ClearFrom(0); }

  int failed_step() const { return failed_step_; }
  const QuantityMessage& failure() const { return failure_; }

  // Warnings and notes recorded by library calls during the last Run() or
  // RunAll(), as (quantity, message) in call order.
  struct Recorded {
    int quantity;
    QuantityMessage message;
  };
  const std::vector<Recorded>& recorded() const { return recorded_; }
  void ClearRecorded() { recorded_.clear(); }

  // The compiled code of a quantity's expression, one instruction per line
  // (for tests and debugging).
  std::string CodeText(int quantity) const;

  // Internal, public only so that the compiler in program.cpp can name them.
  struct CallSite;
  struct TableSite;
  struct Ins;  // one instruction
  struct Range {
    uint32_t begin = 0, end = 0;  // code_[begin, end) leaves one value on the stack
  };
  class Compiler;

 private:
  struct Step {
    int quantity = -1;
    Range code;
  };
  struct CheckCode {
    int check = -1;
    bool sides = false;
    Range a, b;  // both sides of a comparison, else a is the whole condition
  };

  void Build(bool with_checks);
  Range Compile(const Expr* e, int quantity);
  double Exec(Range r);
  // NaN for the steps from steps_[step] on.
  void ClearFrom(size_t step);
  QuantityMessage Explain(int quantity) const;
  std::string Disassemble(Range r) const;

  const Model& model_;
  std::vector<int> steps_idx_;
  std::vector<double> values_;  // the frame when the program owns it
  double* frame_ = nullptr;
  std::vector<Ins> code_;      // every range's instructions, back to back
  std::vector<double> stack_;  // deep enough for the deepest range
  std::vector<Step> steps_;
  std::vector<Range> extra_;
  std::vector<CheckCode> checks_;
  std::vector<std::unique_ptr<CallSite>> sites_;
  std::vector<std::unique_ptr<TableSite>> table_sites_;
  std::vector<Recorded> recorded_;
  int current_quantity_ = -1;
  int failed_step_ = -1;
  QuantityMessage failure_;
  bool library_error_ = false;
};

}  // namespace heatdeck
