// What every human-readable report (HTML, Markdown, workbook) shows the same
// way: symbols with subscripts and Greek letters, units as people write them,
// numbers at a fixed precision, check sides and margins, the title-block
// fields, the methods and units a deck uses.  Formatting only: nothing here
// computes a result (DESIGN.md "Writers never compute").
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "eval/results.h"
#include "library/registry.h"
#include "model/model.h"
#include "units/unit.h"

namespace heatdeck::report {

// Significant digits of every calculated value in a report.
inline constexpr int kResultDigits = 4;
// Most significant digits an input shown from its SI value keeps (case
// overrides, sweep points); trailing zeros are dropped.
inline constexpr int kInputDigits = 6;

// ---- Symbols ---------------------------------------------------------------

// A quantity name split for typesetting.  "hx.T_h1" -> prefix "hx.", base
// "T", subscript "h1".  The base's leading Greek word becomes its letter
// ("eps" -> "ε", "DeltaT" -> "ΔT": a Greek word followed by an upper-case
// letter or a digit); in the subscript, parts separated by '_' are joined
// by ',' and a part that is a whole Greek word becomes its letter
// ("T_h_in" -> "h,in", "q_lambda" -> "λ").
struct Symbol {
  std::string prefix;  // template prefix with its dot; "" for the deck's own
  std::string base;
  std::string subscript;  // "" when the name has none
};
Symbol SplitSymbol(std::string_view name);

// The letter a Greek word stands for ("eps" and "epsilon" -> "ε", "Delta" ->
// "Δ"); "" when the word is not one.  Capitals that look like Latin letters
// (Alpha, Beta, Nu, …) are not Greek here: "Nu" is the Nusselt number.
std::string_view GreekLetter(std::string_view word);

// The symbol as plain text for places without markup: the subscript in
// Unicode subscript characters when each of its characters has one
// ("T_h1" -> "Tₕ₁"), else after an underscore ("T_c,w").
std::string SymbolText(std::string_view name);

// ---- Units -----------------------------------------------------------------

// A unit as people print it: "m^2" -> "m²", "W/(m^2*K)" -> "W/(m²·K)",
// "degC" -> "°C", "ddegC" -> "Δ°C", "deg" -> "°", "um" -> "µm" (any 'u'
// prefix), "s^-1" -> "s⁻¹".  Text already in Unicode passes through; ""
// stays "" (a plain number).
std::string PrettyUnit(std::string_view unit_text);

// The unit a difference of two values in `u` is shown in: "ddegC" for an
// absolute "degC", "ddegF" for "degF", u's own text otherwise.  Its factor is
// u.factor (a difference carries no offset).
std::string IntervalUnitText(const units::Unit& u);

// ---- Numbers ---------------------------------------------------------------

// A calculated value: kResultDigits significant digits (units::FormatSig);
// "—" for NaN or infinity.
std::string FormatResult(double v);
// An input known only as a number: up to kInputDigits significant digits
// with trailing zeros dropped ("85", "0.6", "1.25e-05").
std::string FormatInput(double v);

// Joins a value and its unit with `sep` ("105.3 kW"); the unit is printed
// with PrettyUnit; no separator when the unit is empty.
std::string WithUnit(std::string_view value, std::string_view unit_text,
                     std::string_view sep = " ");

// Whether quantity q has a finite value in case c.
bool QuantityOk(const CaseResult& c, int q);

// Quantity q's value in case c, in its display unit, without the unit: a
// given the case did not override exactly as the deck writes it ("0.50"),
// an overridden given with FormatInput, anything else with FormatResult;
// "" when the quantity could not be evaluated.
std::string QuantityValueText(const Model& m, const CaseResult& c, int q);

// Whether case a and case b disagree on quantity q (value or evaluability).
bool ValuesDiffer(const CaseResult& a, const CaseResult& b, int q);

// Messages of one kind recorded on quantity q in case c, in order.
std::vector<const QuantityMessage*> MessagesOf(const CaseResult& c, int q,
                                               QuantityMessage::Kind kind);

// ---- Expressions as text -----------------------------------------------------

// The expression as the deck writes it, units printed with PrettyUnit and
// each quantity by its full name (a template's "Q" as "hx.Q"), so that every
// name in a report can be looked up in it.
std::string SymbolicText(const Model& m, const Expr& e);
// The same expression with every quantity replaced by its value and display
// unit in case c ("0.7521 * (2095 W/K) * (80 °C - 20 °C)").  Under a product,
// quotient, power or sign, a value whose unit has an operator in it is put in
// parentheses so that it reads as one factor, and so is a negative value
// there or as the right operand of any operator.  Quantities that could not
// be evaluated show as "?".
std::string SubstitutedText(const Model& m, const CaseResult& c, const Expr& e);

// ---- Checks ----------------------------------------------------------------

enum class Verdict { kPass, kFail, kNotEvaluated };
Verdict CheckVerdict(const CheckResult& r);
const char* VerdictText(Verdict v);  // "pass", "FAIL", "not evaluated"

// A single-comparison check's sides and margin as shown: values in the
// check's side unit, the margin in IntervalUnitText(side unit).  `shown` is
// false for compound conditions and for checks that were not evaluated.
struct CheckSides {
  bool shown = false;
  std::string lhs, rhs, margin;  // numbers without unit
  std::string unit;              // side unit (ASCII spelling)
  std::string margin_unit;       // interval unit of the sides (ASCII spelling)
};
CheckSides SidesOf(const CheckDef& d, const CheckResult& r);

// The comparison sign in a check as people print it ("≤", "≥", "≠", "=" for
// "==").  Non-comparisons give OperatorText().
const char* ComparisonSign(ExprKind k);

struct CheckTally {
  int passed = 0;
  int failed = 0;
  int not_evaluated = 0;
  int warnings = 0;  // warnings recorded on quantities in this case
};
CheckTally Tally(const Model& m, const CaseResult& c);

// ---- Title block -------------------------------------------------------------

struct MetaField {
  const char* key;    // `meta KEY`
  const char* label;  // as printed
};
// The title-block fields with fixed places, in print order: project, number,
// revision, date, client, status.
const std::vector<MetaField>& TitleFields();
// The sign-off roles, in order: prepared, checked, approved.
const std::vector<MetaField>& SignOffRoles();
// True for a key of TitleFields() or SignOffRoles(); the reports list every
// other key under "other fields".
bool IsPlacedMetaKey(std::string_view key);
// The value of `meta key` (the last one when repeated); "" when absent.  For
// "date" the report date (Results::date) wins.
std::string MetaValue(const Results& r, std::string_view key);

// ---- Sections -------------------------------------------------------------------

// A section is printed when it holds something: the implicit section before
// the first `section` and a template's continuation headings are often empty.
bool SectionShown(const Section& s);
// The printed number of each section (1, 2, …, in order, counting printed
// sections only); 0 for a section that is not printed.  Indexed like
// Model::sections.
std::vector<int> SectionNumbers(const Model& m);
// The printed title: the deck's, or "General" for the untitled section.
std::string SectionTitle(const Section& s);

// The caution printed on every report.
extern const char kSafetyCaution[];

// ---- What a deck uses --------------------------------------------------------

// Library functions called in e, each once, in first-call order.
std::vector<const library::FunctionInfo*> MethodsIn(const Model& m, const Expr& e);
// Property tables (indices into Model::tables) read in e, each once, in order.
std::vector<int> TablesIn(const Model& m, const Expr& e);
// Every library function the model's quantities, checks and solves call,
// each once, sorted by name.
std::vector<const library::FunctionInfo*> MethodsUsed(const Model& m);

// A unit that appears in the report (a display unit, a literal's unit or a
// check's side unit) with its conversion: SI = value * factor + offset.
struct UnitUse {
  std::string text;     // ASCII spelling, as in the deck
  std::string si_unit;  // coherent SI unit of its dimension ("" for 1)
  double factor = 1.0;
  double offset = 0.0;
};
// Distinct by spelling, sorted by it; plain numbers (no unit) left out.
std::vector<UnitUse> UnitsUsed(const Model& m);

// The temperature profiles evaluated for case c (empty when none were).
const std::vector<ProfileResult>& ProfilesOf(const CaseResult& c);

}  // namespace heatdeck::report
