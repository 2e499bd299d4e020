// What changed between two revisions of a deck: the comparison of two
// evaluated Results (Compare) and its three renderings (text, Markdown,
// JSON; docs/diff.md describes them and the JSON fields).  The comparison
// is the only place that computes; the writers format what it found.
//
//   DiffResult d = Compare(old_session.results(), new_session.results());
//   std::cout << WriteDiffText(d);
#pragma once

#include <string>
#include <vector>

#include "eval/results.h"
#include "units/unit.h"

namespace heatdeck {

// One side of a quantity's comparison: its value in one deck and case.
struct DiffValue {
  bool present = false;    // the quantity exists on this side
  bool evaluated = false;  // it has a value (false: its evaluation failed)
  double si = 0.0;
  std::string si_unit;  // "W", "K", "" for a plain number
  // The unit the value is shown in: the new deck's display unit on both
  // sides when the dimension is unchanged (so old and new read alike),
  // else each deck's own.
  units::Unit display;
  QuantityKind kind = QuantityKind::kCalc;
};

struct QuantityChange {
  enum class Change { kChanged, kAdded, kRemoved };
  Change change = Change::kChanged;
  std::string name;
  DiffValue old_value, new_value;
  // 100·(new − old)/|old| in SI; false when undefined: old is zero, either
  // side failed or is absent, or the dimension changed.  For an absolute
  // temperature the base is the kelvin value.
  bool has_percent = false;
  double percent = 0.0;
  bool dimension_changed = false;
};

enum class CheckOutcome { kAbsent, kPass, kFail, kNotEvaluated };
const char* CheckOutcomeName(CheckOutcome o);  // "", "pass", "fail", "not evaluated"

struct CheckChange {
  std::string expression;  // as written (Pretty form)
  std::string prefix;      // template prefix without its dot, "" for the deck's own
  std::string description;
  CheckOutcome old_outcome = CheckOutcome::kAbsent;  // kAbsent: a new check
  CheckOutcome new_outcome = CheckOutcome::kAbsent;  // kAbsent: a removed check
};

// The differences within one case present in both decks.
struct CaseDiff {
  std::string name;                     // "base" or the case name
  std::vector<QuantityChange> inputs;   // changed givens (kind given in the new deck)
  std::vector<QuantityChange> results;  // changed calculated and solved quantities
  std::vector<QuantityChange> added;    // only in the new deck
  std::vector<QuantityChange> removed;  // only in the old deck
  std::vector<CheckChange> checks;      // outcome changed, added or removed
  bool empty() const {
    return inputs.empty() && results.empty() && added.empty() && removed.empty() && checks.empty();
  }
};

// One `meta` field that changed; absent on a side when that deck lacks it.
struct MetaChange {
  std::string key;
  bool in_old = false, in_new = false;
  std::string old_text, new_text;
};

struct DiffResult {
  // Names of the two decks as shown; Compare takes them from the Results,
  // the command may replace them (e.g. "HEAD:exchangers/cooler.deck").
  std::string old_label, new_label;
  std::string note;          // one line shown under the labels, "" for none
  std::string tool_version;  // of the new Results
  bool title_changed = false;
  std::string old_title, new_title;
  std::vector<MetaChange> meta;  // the new deck's order, then removed keys
  std::vector<CaseDiff> cases;   // the new deck's case order; only cases in both
  std::vector<std::string> cases_added, cases_removed;
  bool empty() const;
};

// Compares two evaluated decks case by case (base, and each case present in
// both, matched by name).  Quantities are matched by name, checks by
// template prefix and expression text (the k-th occurrence of a text in the
// old deck with the k-th in the new), meta fields by key and occurrence.
// A value counts as changed when |new − old| > 1e-12·max(|old|, |new|) in
// SI, when it was evaluated on one side only, when its dimension changed,
// or when its kind did (a calculation replaced by a given of the same
// value); values that failed on both sides are equal.  Order: the new
// deck's order, then what was removed in the old deck's order.
// Both Results must come from a successful Load (model set); cases missing
// from a Results are simply not compared.
DiffResult Compare(const Results& old, const Results& neu);

// Renderings.  Deterministic: the same DiffResult gives the same bytes.
std::string WriteDiffText(const DiffResult& d);
std::string WriteDiffMarkdown(const DiffResult& d);
std::string WriteDiffJson(const DiffResult& d);

}  // namespace heatdeck
