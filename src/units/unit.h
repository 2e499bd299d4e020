// Units: the registry, the unit-expression parser, conversion to and from
// SI, and formatting.  Nothing outside src/units knows a conversion factor.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "units/dimension.h"

namespace heatdeck::units {

// A parsed unit expression such as "kJ/(kg*K)" or "degC".
// SI value = value * factor + offset.
struct Unit {
  std::string text;  // canonical ASCII spelling ("degC" for "°C", "um" kept as written)
  Dimension dim;
  double factor = 1.0;
  double offset = 0.0;  // non-zero only for absolute degC / degF (and never inside compounds)
  TempKind kind = TempKind::kNone;  // for dim == Θ¹: absolute, interval or either

  double ToSi(double v) const { return v * factor + offset; }
  double FromSi(double si) const { return (si - offset) / factor; }
};

// Where and why a unit expression is wrong.  offset/length are byte offsets
// into the text given to ParseUnit, for the caret.
struct UnitError {
  std::string message;  // "unknown unit 'x'"; includes "did you mean 'kW'?" when close
  int offset = 0;
  int length = 1;
};

// Parses a unit expression: symbols joined by '*' or '·' or '/', powers
// '^2', '^-1', '²', '³', parentheses, a leading "1/" ("1/m"), '%'.
// Unicode spellings '°C', '°F', 'Δ°C', 'µm' are accepted.  A bare degC or
// degF (the whole expression) is absolute; inside a compound it is an
// interval.  Returns false and fills *error on failure.
//
// Details of the contract:
// - SI prefixes y z a f p n u/µ/μ m c d da h k M G T P E Z Y go on m, g, s,
//   K, A, cd, mol, N, Pa, J, W, Hz, rad, L and bar only.  An exact registry
//   symbol wins over a prefixed reading ("min" minute, "Pa" pascal, "ft"
//   foot, "cP" centipoise, "kcal" the IT kilocalorie); otherwise the
//   longest prefix ("dam" decametre).
// - "Bare" means one symbol with no operator and no exponent; surrounding
//   parentheses do not count ("(degC)" is absolute, "degC^1" an interval).
// - kind: a bare symbol gives its own kind (degC/degF kAbsolute, ddegC/ddegF
//   kInterval, K/R/mK kEither).  A compound whose dimension is Θ¹ is
//   kInterval if it contains a Celsius or Fahrenheit symbol, else kEither;
//   any other dimension gives kNone.
// - Operators associate left ("J/kg*K" is J*K/kg); ASCII blanks between
//   tokens are ignored; '⋅' (U+22C5), '℃', '℉', '⁻' and '−' (U+2212) in
//   exponents are also accepted.  `text` has no blanks.
// - Error classes: "empty unit", "unknown unit 'x'" (with "; did you mean
//   'y'?" or " ('ft' takes no SI prefix)"), "unclosed '('", "unmatched ')'",
//   "expected an integer exponent after '^'", "missing '^' before exponent
//   '2'", "expected a unit after '/'", "expected a unit before ')'",
//   "missing '*' or '/' between units", "unexpected character 'c'",
//   "unexpected number '2' in a unit", "exponent too large" (beyond 99, or a
//   dimension exponent beyond 60), "unit factor out of range",
//   "parentheses nested too deeply".  error may be null.
bool ParseUnit(std::string_view text, Unit* out, UnitError* error);

// One registry entry, for `heatdeck units`.
struct UnitListing {
  std::string symbol;   // "kW", "degC"
  std::string name;     // "kilowatt"
  std::string si_unit;  // "W"
  double factor = 1.0;
  double offset = 0.0;
  bool prefixable = false;  // takes SI prefixes
  std::string note;         // "absolute temperature; an interval inside compound units"
};
// Every base symbol of the registry (prefixed forms are not expanded), in a
// stable order grouped by dimension.
std::vector<UnitListing> ListUnits();

// Known unit symbols closest to `text` (edit distance), best first, at most 3.
// Candidates are the registry symbols and their prefixed forms.  Ranking:
// case-insensitive distance (adjacent transposition counts 1), then
// case-sensitive distance, unprefixed before prefixed, registry order.
// Allowed distance: 0 (case only) for texts of 1-2 characters, 1 for 3-4,
// 2 beyond.
std::vector<std::string> SuggestUnits(std::string_view text);

// Formats a number with `sig` significant digits for people: no exponent
// for 1e-4 <= |v| < 1e7, trailing zeros kept ("25.36", "0.2017", "1.800e-05").
// The range is judged after rounding (9999999.6 at 4 digits: "1.000e+07");
// the integer part is printed in full (1234567 at 4 digits: "1235000");
// sig is clamped to 1..17; 0 and -0 give "0"; "nan", "inf", "-inf".
std::string FormatSig(double v, int sig);

// The shortest text that reads back to exactly v ("0.1", "1e-300", "nan").
std::string FormatExact(double v);

}  // namespace heatdeck::units
