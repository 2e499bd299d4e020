// The unit registry: every unit symbol the deck language knows, the SI
// prefixes, and symbol lookup.  Internal to src/units; the rest of the program
// uses unit.h.
#pragma once

#include <span>
#include <string>
#include <string_view>

#include "units/dimension.h"

namespace heatdeck::units {

// How a symbol behaves with respect to temperature (LANGUAGE.md
// "Temperatures").
enum class TempRole : uint8_t {
  kNone,      // not a temperature unit
  kScale,     // degC, degF: absolute when the whole unit, an interval in compounds
  kInterval,  // ddegC, ddegF: always an interval
  kEither,    // K, R: absolute or interval
};

// One registry entry.  SI value = value * factor + offset, where offset is
// used only when a kScale symbol stands alone.
struct UnitDef {
  std::string_view symbol;  // ASCII, as written in a deck
  std::string_view name;
  Dimension dim;
  double factor;
  double offset;
  bool prefixable;  // takes SI prefixes
  TempRole temp;
  std::string_view note;
};

struct Prefix {
  std::string_view symbol;  // ASCII ("u" for micro)
  std::string_view name;
  double factor;
};

// All entries, grouped by dimension, in listing order.
std::span<const UnitDef> RegistryUnits();
// The twenty SI prefixes y ... Y (without ronna/quetta/ronto/quecto: "R" is
// the rankine here), "da" before "d" so longest matches come first.
std::span<const Prefix> SiPrefixes();

// A symbol resolved against the registry.
struct SymbolMatch {
  const UnitDef* def = nullptr;    // null when the symbol is unknown
  const Prefix* prefix = nullptr;  // null for an unprefixed symbol
  // When def is null but the symbol reads as prefix + a registry unit that
  // takes no prefix ("kft"), that unit; for the error message.
  const UnitDef* unprefixable = nullptr;
};

// Resolves an ASCII symbol ("kW", "min", "degC").  An exact registry symbol
// always wins over a prefixed reading ("min" is the minute, "Pa" the pascal,
// "ft" the foot), then the longest prefix whose remainder is a prefixable
// symbol ("dam" is the decametre).
SymbolMatch LookupSymbol(std::string_view symbol);

// Rewrites the Unicode spellings of one symbol into ASCII: "°C" -> "degC",
// "Δ°F" -> "ddegF", "µm"/"μm" -> "um", "℃" -> "degC", "°" -> "deg".  Returns
// false when a non-ASCII character stands where no spelling allows it; *out
// then holds the text as far as it could be read.
bool NormalizeSymbol(std::string_view raw, std::string* out);

}  // namespace heatdeck::units
