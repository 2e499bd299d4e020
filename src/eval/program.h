// A compiled deck: each quantity's expression compiled once to a muParser
// expression over SI doubles (unit factors folded to constants, library
// functions bound as callbacks), run in dependency order over a frame of
// values.  Re-running it with new input values parses nothing and allocates
// nothing on the normal path; cases, sweeps and solves run it many times.
//
// A Program binds its parsers to its own frame, so one thread uses one
// Program; Clone() gives another thread its own.
#pragma once

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
  void ClearSteps() { ClearFrom(0, -1); }

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

  // The muParser text of a quantity's expression (for tests and debugging).
  std::string ExpressionText(int quantity) const;

  // Internal, public only so that the translator in program.cpp can name them.
  struct CallSite;
  struct TableSite;

 private:
  struct Step;
  struct CheckStep;
  struct CheckChunk;

  void Build(bool with_checks);
  bool EvalChunk(Step& s, std::string* error);
  // NaN for the steps of chunks[chunk…] from `quantity` on (all of them
  // when quantity < 0).
  void ClearFrom(size_t chunk, int quantity);
  QuantityMessage Explain(int quantity) const;
  std::unique_ptr<CheckStep> CompileCheck(int check);
  void RunCheck(const CheckStep& s, CheckResult& r, int* failed) const;

  const Model& model_;
  std::vector<int> steps_idx_;
  std::vector<double> values_;  // the frame when the program owns it
  double* frame_ = nullptr;
  std::vector<std::unique_ptr<Step>> extra_;
  std::vector<std::unique_ptr<Step>> steps_;
  std::vector<std::unique_ptr<CheckStep>> checks_;  // compiled alone (too long for a chunk)
  std::vector<std::unique_ptr<CheckChunk>> check_chunks_;
  std::vector<std::unique_ptr<CallSite>> sites_;
  std::vector<std::unique_ptr<TableSite>> table_sites_;
  std::vector<Recorded> recorded_;
  int current_quantity_ = -1;
  int failed_step_ = -1;
  QuantityMessage failure_;
  bool library_error_ = false;
};

}  // namespace heatdeck
