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
  std::string text;     // canonical ASCII spelling ("degC" for "°C", "um" kept as written)
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
bool ParseUnit(std::string_view text, Unit* out, UnitError* error);

// One registry entry, for `heatdeck units`.
struct UnitListing {
  std::string symbol;    // "kW", "degC"
  std::string name;      // "kilowatt"
  std::string si_unit;   // "W"
  double factor = 1.0;
  double offset = 0.0;
  bool prefixable = false;  // takes SI prefixes
  std::string note;      // "absolute temperature; an interval inside compound units"
};
// Every base symbol of the registry (prefixed forms are not expanded), in a
// stable order grouped by dimension.
std::vector<UnitListing> ListUnits();

// Known unit symbols closest to `text` (edit distance), best first, at most 3.
std::vector<std::string> SuggestUnits(std::string_view text);

// Formats a number with `sig` significant digits for people: no exponent
// for 1e-4 <= |v| < 1e7, trailing zeros kept ("25.36", "0.2017", "1.800e-05").
std::string FormatSig(double v, int sig);

// The shortest text that reads back to exactly v ("0.1", "1e-300", "nan").
std::string FormatExact(double v);

}  // namespace heatdeck::units
