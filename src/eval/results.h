// Results: what evaluation produced, the one structure every writer reads.
// Writers never compute; whatever they show is here or in the Model
// (names, expressions, display units), derived by formatting alone.
#pragma once

#include <string>
#include <vector>

#include "model/model.h"

namespace heatdeck {

// A warning, note or error recorded on one quantity during evaluation.
struct QuantityMessage {
  enum class Kind { kWarning, kNote, kError } kind = Kind::kWarning;
  std::string text;
  SourceRange range;  // the sub-expression concerned, when known
};

struct CheckResult {
  bool evaluated = false;  // false when a quantity it reads failed
  bool pass = false;
  // Single comparisons only (CheckDef::has_sides): both sides in SI and the
  // margin, in SI of the compared dimension, positive when the check passes
  // with room: rhs - lhs for < and <=, lhs - rhs for > and >=,
  // -|lhs - rhs| for ==, |lhs - rhs| for !=.
  double lhs_si = 0.0;
  double rhs_si = 0.0;
  double margin_si = 0.0;
};

struct SolveResult {
  bool converged = false;
  int iterations = 0;
  double value_si = 0.0;     // the unknown
  double residual_si = 0.0;  // lhs - rhs at the solution, SI of the condition
  double residual_lo = 0.0;  // lhs - rhs at the bracket ends
  double residual_hi = 0.0;
  std::string error;  // why it failed, when it did
};

// A temperature profile along the exchanger (the `profile` statement),
// computed by the evaluator for one case: hot and cold stream temperatures at
// fractions x of the heat-transfer area, x = 0 where the hot stream enters.
struct ProfileResult {
  int profile = -1;  // index into Model::profiles
  bool counterflow = true;
  std::vector<double> x;        // 0 … 1
  std::vector<double> hot_si;   // K
  std::vector<double> cold_si;  // K
  bool ok = false;              // false when the end temperatures are inconsistent
  std::string error;
};

// One evaluation of the whole deck: the base inputs or one case's.
struct CaseResult {
  std::string name;  // "base" or the case name
  std::string description;
  std::vector<int> overridden;  // quantity indices this case changed
  std::vector<double> values;   // SI, indexed like Model::quantities
  std::vector<bool> ok;         // false where the quantity could not be evaluated
  std::vector<std::vector<QuantityMessage>> messages;  // indexed like values
  std::vector<CheckResult> checks;                     // indexed like Model::checks
  std::vector<SolveResult> solves;                     // indexed like Model::solves
  std::vector<ProfileResult> profiles;                 // indexed like Model::profiles
  int failed_checks = 0;
  int warnings = 0;
};

// A sweep evaluated point by point.  Large sweeps are streamed to their
// writer instead of being kept (see eval/sweep.h); this holds the points
// only when they were kept.
struct SweepResult {
  std::vector<int> swept;    // the swept givens, grid order (first varies slowest)
  std::vector<int> columns;  // quantities written per point
  size_t points = 0;
  std::vector<std::vector<double>> rows;  // SI values per point, per column
  std::vector<std::string> row_errors;    // per point, "" when the point evaluated
};

// A file that went into the results, for the report's appendix.
struct InputFile {
  std::string path;
  std::string sha256;
};

struct Results {
  const Model* model = nullptr;
  std::string deck_path;
  std::string tool_version;
  std::string date;  // from `meta date` or the --date option; never the clock by default
  std::vector<InputFile> files;   // the deck first, then templates and tables
  std::vector<CaseResult> cases;  // cases[0] is "base"
  std::vector<SweepResult> sweeps;

  int failed_checks() const {
    int n = 0;
    for (const auto& c : cases) n += c.failed_checks;
    return n;
  }
};

}  // namespace heatdeck
