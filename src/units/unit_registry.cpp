#include "units/unit_registry.h"

#include <algorithm>
#include <array>
#include <cctype>
#include <cstddef>
#include <numbers>
#include <string>
#include <string_view>
#include <vector>

#include "units/unit.h"

namespace heatdeck::units {
namespace {

// Exact definitions: the inch, pound and foot-based units follow the 1959
// international yard and pound agreement; the International Table calorie
// and Btu follow the 1956 International Steam Table conference; standard
// gravity 9.80665 m/s^2 makes the pound-force 0.45359237 * 9.80665 N.
constexpr double kInch = 0.0254;
constexpr double kPound = 0.45359237;
constexpr double kPoundForce = 4.4482216152605;
constexpr double kBtu = 1055.05585262;
constexpr double kCalorie = 4.1868;
constexpr double kRankine = 5.0 / 9.0;
constexpr double kCubicInch = kInch * kInch * kInch;

constexpr Dimension kFrequency = dim::kOne / dim::kTime;

constexpr std::string_view kScaleNote = "absolute temperature; an interval inside compound units";
constexpr std::string_view kEitherNote = "absolute temperature or interval";
constexpr std::string_view kIntervalNote = "temperature interval";

// Prefixable: the SI units (m, g, s, K, A, cd, mol, N, Pa, J, W, Hz, rad)
// and the units accepted for use with SI that are commonly prefixed (L, bar:
// mL, mbar).  kg is its own entry so that it is listed; "kkg" is not
// accepted.  The minute, hour and day take no prefix (common practice); the
// tonne is kept unprefixed so that no prefixed tonne ("ft", "at") competes
// with another symbol; no US customary, CGS or calorie-based unit takes a
// prefix ("kcal" is an entry of its own).
constexpr std::array kUnits = {
    UnitDef{"m", "metre", dim::kLength, 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"in", "inch", dim::kLength, kInch, 0.0, false, TempRole::kNone, "0.0254 m exactly"},
    UnitDef{"ft", "foot", dim::kLength, 12 * kInch, 0.0, false, TempRole::kNone, "12 in"},
    UnitDef{"yd", "yard", dim::kLength, 36 * kInch, 0.0, false, TempRole::kNone, "3 ft"},
    UnitDef{"mi", "mile", dim::kLength, 63360 * kInch, 0.0, false, TempRole::kNone,
            "international mile, 5280 ft"},
    UnitDef{"kg", "kilogram", dim::kMass, 1.0, 0.0, false, TempRole::kNone, "prefixes go on g"},
    UnitDef{"g", "gram", dim::kMass, 1e-3, 0.0, true, TempRole::kNone, ""},
    UnitDef{"t", "tonne", dim::kMass, 1e3, 0.0, false, TempRole::kNone, "metric ton"},
    UnitDef{"lb", "pound", dim::kMass, kPound, 0.0, false, TempRole::kNone,
            "avoirdupois pound mass, same as lbm"},
    UnitDef{"lbm", "pound mass", dim::kMass, kPound, 0.0, false, TempRole::kNone,
            "avoirdupois pound mass"},
    UnitDef{"s", "second", dim::kTime, 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"min", "minute", dim::kTime, 60.0, 0.0, false, TempRole::kNone, ""},
    UnitDef{"h", "hour", dim::kTime, 3600.0, 0.0, false, TempRole::kNone, ""},
    UnitDef{"hr", "hour", dim::kTime, 3600.0, 0.0, false, TempRole::kNone, "same as h"},
    UnitDef{"d", "day", dim::kTime, 86400.0, 0.0, false, TempRole::kNone, "24 h"},
    UnitDef{"K", "kelvin", dim::kTemperature, 1.0, 0.0, true, TempRole::kEither, kEitherNote},
    UnitDef{"R", "rankine", dim::kTemperature, kRankine, 0.0, false, TempRole::kEither,
            kEitherNote},
    UnitDef{"degC", "degree Celsius", dim::kTemperature, 1.0, 273.15, false, TempRole::kScale,
            kScaleNote},
    UnitDef{"degF", "degree Fahrenheit", dim::kTemperature, kRankine, 459.67 * kRankine, false,
            TempRole::kScale, kScaleNote},
    UnitDef{"ddegC", "degree Celsius interval", dim::kTemperature, 1.0, 0.0, false,
            TempRole::kInterval, kIntervalNote},
    UnitDef{"ddegF", "degree Fahrenheit interval", dim::kTemperature, kRankine, 0.0, false,
            TempRole::kInterval, kIntervalNote},
    UnitDef{"A", "ampere", Dimension::Of(Base::kCurrent), 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"cd", "candela", Dimension::Of(Base::kLuminous), 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"mol", "mole", dim::kAmount, 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"Hz", "hertz", kFrequency, 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"N", "newton", dim::kForce, 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"lbf", "pound-force", dim::kForce, kPoundForce, 0.0, false, TempRole::kNone,
            "lbm times standard gravity 9.80665 m/s^2"},
    UnitDef{"Pa", "pascal", dim::kPressure, 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"bar", "bar", dim::kPressure, 1e5, 0.0, true, TempRole::kNone, ""},
    UnitDef{"atm", "standard atmosphere", dim::kPressure, 101325.0, 0.0, false, TempRole::kNone,
            ""},
    UnitDef{"psi", "pound-force per square inch", dim::kPressure, kPoundForce / (kInch * kInch),
            0.0, false, TempRole::kNone, "lbf/in^2; absolute, no gauge offset"},
    UnitDef{"J", "joule", dim::kEnergy, 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"cal", "calorie", dim::kEnergy, kCalorie, 0.0, false, TempRole::kNone,
            "International Table calorie"},
    UnitDef{"kcal", "kilocalorie", dim::kEnergy, 1000 * kCalorie, 0.0, false, TempRole::kNone,
            "International Table kilocalorie"},
    UnitDef{"Btu", "British thermal unit", dim::kEnergy, kBtu, 0.0, false, TempRole::kNone,
            "International Table Btu"},
    UnitDef{"W", "watt", dim::kPower, 1.0, 0.0, true, TempRole::kNone, ""},
    // Mechanical horsepower, 550 ft*lbf/s (common practice for "hp").
    UnitDef{"hp", "horsepower", dim::kPower, 745.69987158227022, 0.0, false, TempRole::kNone,
            "mechanical horsepower, 550 ft*lbf/s"},
    UnitDef{"TR", "ton of refrigeration", dim::kPower, 12000 * kBtu / 3600, 0.0, false,
            TempRole::kNone, "12000 Btu/h"},
    UnitDef{"L", "litre", dim::kVolume, 1e-3, 0.0, true, TempRole::kNone, ""},
    UnitDef{"gal", "US gallon", dim::kVolume, 231 * kCubicInch, 0.0, false, TempRole::kNone,
            "231 in^3"},
    UnitDef{"cP", "centipoise", dim::kViscosity, 1e-3, 0.0, false, TempRole::kNone, ""},
    UnitDef{"P", "poise", dim::kViscosity, 0.1, 0.0, false, TempRole::kNone, ""},
    UnitDef{"%", "percent", dim::kOne, 0.01, 0.0, false, TempRole::kNone, ""},
    UnitDef{"rad", "radian", dim::kOne, 1.0, 0.0, true, TempRole::kNone, ""},
    UnitDef{"deg", "degree of angle", dim::kOne, std::numbers::pi / 180, 0.0, false,
            TempRole::kNone, "also written \xC2\xB0"},
};

constexpr std::array kPrefixes = {
    Prefix{"da", "deca", 1e1},  Prefix{"y", "yocto", 1e-24}, Prefix{"z", "zepto", 1e-21},
    Prefix{"a", "atto", 1e-18}, Prefix{"f", "femto", 1e-15}, Prefix{"p", "pico", 1e-12},
    Prefix{"n", "nano", 1e-9},  Prefix{"u", "micro", 1e-6},  Prefix{"m", "milli", 1e-3},
    Prefix{"c", "centi", 1e-2}, Prefix{"d", "deci", 1e-1},   Prefix{"h", "hecto", 1e2},
    Prefix{"k", "kilo", 1e3},   Prefix{"M", "mega", 1e6},    Prefix{"G", "giga", 1e9},
    Prefix{"T", "tera", 1e12},  Prefix{"P", "peta", 1e15},   Prefix{"E", "exa", 1e18},
    Prefix{"Z", "zetta", 1e21}, Prefix{"Y", "yotta", 1e24},
};

const UnitDef* FindExact(std::string_view symbol) {
  for (const UnitDef& u : kUnits) {
    if (u.symbol == symbol) return &u;
  }
  return nullptr;
}

// Optimal-string-alignment distance (Levenshtein plus adjacent
// transposition), optionally ignoring ASCII case.  Symbols are a few bytes
// long, so the quadratic table is cheap.
int EditDistance(std::string_view a, std::string_view b, bool fold) {
  auto eq = [fold](char x, char y) {
    if (!fold) return x == y;
    return std::tolower(static_cast<unsigned char>(x)) ==
           std::tolower(static_cast<unsigned char>(y));
  };
  const size_t n = a.size();
  const size_t m = b.size();
  std::vector<int> d((n + 1) * (m + 1));
  auto at = [&](size_t i, size_t j) -> int& { return d[i * (m + 1) + j]; };
  for (size_t i = 0; i <= n; ++i) at(i, 0) = static_cast<int>(i);
  for (size_t j = 0; j <= m; ++j) at(0, j) = static_cast<int>(j);
  for (size_t i = 1; i <= n; ++i) {
    for (size_t j = 1; j <= m; ++j) {
      const int cost = eq(a[i - 1], b[j - 1]) ? 0 : 1;
      int v = std::min({at(i - 1, j) + 1, at(i, j - 1) + 1, at(i - 1, j - 1) + cost});
      if (i > 1 && j > 1 && eq(a[i - 1], b[j - 2]) && eq(a[i - 2], b[j - 1])) {
        v = std::min(v, at(i - 2, j - 2) + 1);
      }
      at(i, j) = v;
    }
  }
  return at(n, m);
}

struct Candidate {
  std::string symbol;
  bool prefixed;
};

// Every spelling a suggestion may offer: the registry symbols, then each
// prefixable symbol with each prefix, unless that spelling is itself a
// registry symbol (so "Pa" is offered once, as the pascal).
const std::vector<Candidate>& SuggestionCandidates() {
  static const std::vector<Candidate> candidates = [] {
    std::vector<Candidate> c;
    for (const UnitDef& u : kUnits) c.push_back({std::string(u.symbol), false});
    for (const UnitDef& u : kUnits) {
      if (!u.prefixable) continue;
      for (const Prefix& p : kPrefixes) {
        std::string s = std::string(p.symbol) + std::string(u.symbol);
        if (LookupSymbol(s).prefix == &p) c.push_back({std::move(s), true});
      }
    }
    return c;
  }();
  return candidates;
}

}  // namespace

std::span<const UnitDef> RegistryUnits() { return kUnits; }
std::span<const Prefix> SiPrefixes() { return kPrefixes; }

SymbolMatch LookupSymbol(std::string_view symbol) {
  SymbolMatch match;
  if (const UnitDef* exact = FindExact(symbol)) {
    match.def = exact;
    return match;
  }
  // kPrefixes lists "da" before "d", so the first hit is the longest prefix.
  for (const Prefix& p : kPrefixes) {
    if (symbol.size() <= p.symbol.size() || !symbol.starts_with(p.symbol)) continue;
    const UnitDef* rest = FindExact(symbol.substr(p.symbol.size()));
    if (rest == nullptr) continue;
    if (rest->prefixable) {
      match.def = rest;
      match.prefix = &p;
      match.unprefixable = nullptr;
      return match;
    }
    if (match.unprefixable == nullptr) match.unprefixable = rest;
  }
  return match;
}

bool NormalizeSymbol(std::string_view raw, std::string* out) {
  // UTF-8 byte sequences of the accepted non-ASCII spellings.
  constexpr std::string_view kDegree = "\xC2\xB0";          // U+00B0 °
  constexpr std::string_view kDelta = "\xCE\x94";           // U+0394 Δ
  constexpr std::string_view kMicro = "\xC2\xB5";           // U+00B5 µ
  constexpr std::string_view kMu = "\xCE\xBC";              // U+03BC μ
  constexpr std::string_view kCelsius = "\xE2\x84\x83";     // U+2103 ℃
  constexpr std::string_view kFahrenheit = "\xE2\x84\x89";  // U+2109 ℉
  out->clear();
  std::string_view s = raw;
  bool ok = true;
  // Δ may only open a temperature spelling: "Δ°C", "Δ℃".
  if (s.starts_with(kDelta)) {
    std::string_view rest = s.substr(kDelta.size());
    if (rest.starts_with(kDegree) || rest.starts_with(kCelsius) || rest.starts_with(kFahrenheit)) {
      *out += 'd';
      s = rest;
    }
  }
  if (s.starts_with(kDegree)) {
    *out += "deg";
    s.remove_prefix(kDegree.size());
  } else if (s.starts_with(kCelsius)) {
    *out += "degC";
    s.remove_prefix(kCelsius.size());
  } else if (s.starts_with(kFahrenheit)) {
    *out += "degF";
    s.remove_prefix(kFahrenheit.size());
  } else if (s.starts_with(kMicro) || s.starts_with(kMu)) {
    *out += 'u';
    s.remove_prefix(kMicro.size());
  }
  for (char c : s) {
    if (static_cast<unsigned char>(c) >= 0x80) ok = false;
    *out += c;
  }
  return ok;
}

std::vector<UnitListing> ListUnits() {
  std::vector<UnitListing> list;
  list.reserve(kUnits.size());
  for (const UnitDef& u : kUnits) {
    UnitListing l;
    l.symbol = std::string(u.symbol);
    l.name = std::string(u.name);
    l.si_unit = u.dim.SiUnit();
    l.factor = u.factor;
    l.offset = u.offset;
    l.prefixable = u.prefixable;
    l.note = std::string(u.note);
    list.push_back(std::move(l));
  }
  return list;
}

std::vector<std::string> SuggestUnits(std::string_view text) {
  std::string norm;
  NormalizeSymbol(text, &norm);
  // Short symbols are a keystroke away from dozens of others ("x" -> "m",
  // "s", "K"), so they only get case-insensitive matches ("kw" -> "kW").
  const int max_distance = norm.size() <= 2 ? 0 : norm.size() <= 4 ? 1 : 2;
  // No unit symbol is longer than a dozen characters: a longer text is
  // nothing's misspelling, and comparing it would cost time for nothing.
  if (norm.size() > 24) return {};
  struct Scored {
    int folded;
    int exact;
    bool prefixed;
    size_t order;
  };
  std::vector<Scored> scored;
  const std::vector<Candidate>& candidates = SuggestionCandidates();
  for (size_t i = 0; i < candidates.size(); ++i) {
    // The distance is at least the difference in length: most candidates
    // are ruled out without filling a table.
    const size_t len = candidates[i].symbol.size();
    const size_t gap = len > norm.size() ? len - norm.size() : norm.size() - len;
    if (gap > static_cast<size_t>(max_distance)) continue;
    const int folded = EditDistance(norm, candidates[i].symbol, true);
    if (folded > max_distance) continue;
    scored.push_back(
        {folded, EditDistance(norm, candidates[i].symbol, false), candidates[i].prefixed, i});
  }
  std::sort(scored.begin(), scored.end(), [](const Scored& a, const Scored& b) {
    if (a.folded != b.folded) return a.folded < b.folded;
    if (a.exact != b.exact) return a.exact < b.exact;
    if (a.prefixed != b.prefixed) return !a.prefixed;
    return a.order < b.order;
  });
  std::vector<std::string> out;
  for (const Scored& s : scored) {
    if (out.size() == 3) break;
    out.push_back(candidates[s.order].symbol);
  }
  return out;
}

}  // namespace heatdeck::units
