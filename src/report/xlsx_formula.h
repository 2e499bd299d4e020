// How a deck is spelled in a spreadsheet: the defined name of each quantity
// and the formula text of each expression (Excel / OpenFormula function
// names, as libxlsxwriter stores them: no leading '=', ',' between
// arguments).  Internal to the workbook writer; docs/workbook.md states the
// rules for readers of the workbook.
#pragma once

#include <string>
#include <vector>

#include "model/model.h"

namespace heatdeck::xlsx {

// True when `name` can be used as a spreadsheet defined name exactly as
// written: it starts with a letter or '_', holds only letters, digits, '_'
// and '.', is at most 255 characters, does not read as a cell reference in
// A1 notation (1 to 3 letters then digits: "A1", "dp1", "NTU2") or R1C1
// notation ("R", "C", "R2C3", "RC", "R1", "C4"), is not TRUE or FALSE, and
// is not the name of a spreadsheet function the workbook may use (the
// functions of the formulas below and of the library's spreadsheet forms,
// plus SUM, PRODUCT, LOG, INT, MOD, ROUND, SIGN, POWER).  All comparisons
// ignore case, as spreadsheets do.
bool IsSafeName(const std::string& name);

// The workbook-scoped defined name of every quantity (indexed like
// Model::quantities) and then of every check's verdict cell (indexed like
// Model::checks, base name "check_<k>" with k from 1).  The rule, applied
// in that order:
//   1. every safe name (IsSafeName) keeps its spelling, unless a name
//      already taken equals it ignoring case;
//   2. every other name becomes "q_" + name when the name itself is not
//      safe (names longer than 200 characters are cut to 200 first), then
//      the first of "<base>_2", "<base>_3", … that is free, ignoring case,
//      when the base itself is taken.
// The result is deterministic, unique ignoring case, and safe.
struct DefinedNames {
  std::vector<std::string> quantities;
  std::vector<std::string> checks;
};
DefinedNames MakeDefinedNames(const Model& model);

// Translates deck expressions into formulas over the defined names.
class FormulaWriter {
 public:
  // names: the defined name of every quantity (DefinedNames::quantities).
  // Both arguments must outlive the writer.
  FormulaWriter(const Model& model, const std::vector<std::string>& names);

  // Writes the formula of `e` into *out.  Returns false when the
  // expression has no closed spreadsheet form (a library function without
  // one, a table look-up) or is too long for a spreadsheet cell (8192
  // characters); *why then says which method and why, for the cell's
  // comment.
  //
  // Translation: names become their defined names; literals their SI value,
  // written so that it reads back exactly; pi becomes PI() and the other
  // constants their SI values; + - * / ^ keep the tree's grouping, with
  // parentheses wherever the spreadsheet's precedence or left-to-right
  // reading could regroup it (its unary minus binds tighter than ^, so
  // -x^2 is written -(x^2)); comparisons as in the deck, == and != within
  // 1e-9 relative as the evaluator does; and/or/not as AND/OR/NOT; the
  // built-ins by their spreadsheet names (ln LN, log10 LOG10, if IF, …); a
  // library function by its FunctionInfo::spreadsheet form with each {i}
  // replaced by the i-th argument's formula in parentheses.
  bool Write(const Expr* e, std::string* out, std::string* why) const;

  // The formula of a quantity: its expression's formula, or false for
  // givens and solved quantities (no expression) with *why saying so.
  bool WriteQuantity(int quantity, std::string* out, std::string* why) const;

 private:
  enum class Prec { kCompare = 1, kAdd, kMul, kPow, kNeg, kAtom };
  struct Part {
    std::string text;
    Prec prec = Prec::kAtom;
  };
  // p's text, in parentheses when its precedence is below min.
  static std::string Operand(const Part& p, Prec min);
  bool Node(const Expr* e, Part* out, std::string* why) const;
  bool CallNode(const Expr* e, const ExprInfo& info, Part* out, std::string* why) const;

  const Model& model_;
  const std::vector<std::string>& names_;
};

// A number as formula text that reads back to exactly v: the shortest
// round-trip digits, exponent with a capital E, negatives parenthesised.
std::string NumberText(double v);

}  // namespace heatdeck::xlsx
