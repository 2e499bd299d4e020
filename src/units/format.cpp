#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <string>

#include <fmt/format.h>

#include "units/unit.h"

namespace heatdeck::units {

std::string FormatSig(double v, int sig) {
  if (std::isnan(v)) return "nan";
  if (std::isinf(v)) return v > 0 ? "inf" : "-inf";
  if (v == 0) return "0";
  // 17 significant digits already identify every double.
  sig = std::clamp(sig, 1, 17);
  // fmt rounds the exact binary value to sig digits; the choice between
  // plain and exponent form is made on the rounded value, so 9999999.6 at
  // four digits prints as 1.000e+07 and not as "10000000".
  const std::string e = fmt::format("{:.{}e}", v, sig - 1);
  const size_t e_pos = e.find('e');
  const int exponent = std::atoi(e.c_str() + e_pos + 1);
  if (exponent < -4 || exponent > 6) return e;

  const bool negative = e[0] == '-';
  std::string digits;
  for (size_t i = negative ? 1 : 0; i < e_pos; ++i) {
    if (e[i] != '.') digits += e[i];
  }
  std::string out = negative ? "-" : "";
  if (exponent < 0) {
    out += "0.";
    out.append(static_cast<size_t>(-exponent - 1), '0');
    out += digits;
    return out;
  }
  // The integer part is printed in full even beyond sig digits
  // ("1235000" for 1234567 at four digits): reports keep magnitudes readable.
  const size_t int_len = static_cast<size_t>(exponent) + 1;
  if (digits.size() <= int_len) {
    out += digits;
    out.append(int_len - digits.size(), '0');
    return out;
  }
  out += digits.substr(0, int_len);
  out += '.';
  out += digits.substr(int_len);
  return out;
}

std::string FormatExact(double v) {
  // fmt's default presentation is the shortest text that round-trips.
  return fmt::format("{}", v);
}

}  // namespace heatdeck::units
