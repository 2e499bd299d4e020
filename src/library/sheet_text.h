// Builds the registry's spreadsheet formulas (FunctionInfo::spreadsheet)
// from readable named parts.  Registration-time only; allocates.
//
// Spreadsheets have no expm1/log1p, so the building blocks below give their
// values without the cancellation of 1 - EXP(-x) or LN(1 + z) for small
// arguments, using only functions every spreadsheet has.  Each repeats its
// argument, so deeply nested formulas use them only where the simple
// relations would lose digits in their common range (small NTU or eff);
// Excel caps a formula at 8192 characters.
#pragma once

#include <initializer_list>
#include <string>
#include <string_view>
#include <utility>

namespace heatdeck::library {

// Replaces every occurrence of each name in subs, in list order, by its text
// wrapped in parentheses.  List a name before any name that is its prefix
// ("@FEQ" before "@F").  The texts themselves must not contain the names.
inline std::string ExpandSheet(
    std::string text, std::initializer_list<std::pair<std::string_view, std::string>> subs) {
  for (const auto& [name, value] : subs) {
    const std::string wrapped = "(" + value + ")";
    for (size_t at = text.find(name); at != std::string::npos;
         at = text.find(name, at + wrapped.size())) {
      text.replace(at, name.size(), wrapped);
    }
  }
  return text;
}

// 1 - e^-x = 2 tanh(x/2)/(1 + tanh(x/2)): full precision for small x, and
// no overflow for large x.
inline std::string SheetOneMinusExpNeg(const std::string& x) {
  return ExpandSheet("2*TANH(@X/2)/(1+TANH(@X/2))", {{"@X", x}});
}

// e^y - 1 = 2 sinh(y/2) e^(y/2).
inline std::string SheetExpm1(const std::string& y) {
  return ExpandSheet("2*SINH(@Y/2)*EXP(@Y/2)", {{"@Y", y}});
}

// ln(1 + z): three terms of the Taylor series for |z| < 1e-4 (truncation
// below z^4/4, 2.5e-13 relative), LN(1 + z) above, where rounding 1 + z
// costs at most 1.1e-12 relative.  z appears five times: nest with care.
inline std::string SheetLog1p(const std::string& z) {
  return ExpandSheet("IF(ABS(@Z)<0.0001,@Z*(1-@Z/2+@Z^2/3),LN(1+@Z))", {{"@Z", z}});
}

}  // namespace heatdeck::library
