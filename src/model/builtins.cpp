#include <cmath>

#include "model/model.h"

namespace heatdeck {

const char* QuantityKindName(QuantityKind k) {
  switch (k) {
    case QuantityKind::kGiven:
      return "given";
    case QuantityKind::kCalc:
      return "calc";
    case QuantityKind::kSolved:
      return "solved";
  }
  return "calc";
}

const std::vector<BuiltinInfo>& BuiltinFunctions() {
  static const std::vector<BuiltinInfo> all = {
      {"min", Builtin::kMin, 1, -1},    {"max", Builtin::kMax, 1, -1},
      {"abs", Builtin::kAbs, 1, 1},     {"sqrt", Builtin::kSqrt, 1, 1},
      {"exp", Builtin::kExp, 1, 1},     {"ln", Builtin::kLn, 1, 1},
      {"log10", Builtin::kLog10, 1, 1}, {"sin", Builtin::kSin, 1, 1},
      {"cos", Builtin::kCos, 1, 1},     {"tan", Builtin::kTan, 1, 1},
      {"asin", Builtin::kAsin, 1, 1},   {"acos", Builtin::kAcos, 1, 1},
      {"atan", Builtin::kAtan, 1, 1},   {"sinh", Builtin::kSinh, 1, 1},
      {"cosh", Builtin::kCosh, 1, 1},   {"tanh", Builtin::kTanh, 1, 1},
      {"if", Builtin::kIf, 3, 3},
  };
  return all;
}

const std::vector<ConstantInfo>& BuiltinConstants() {
  using units::Base;
  using units::Dimension;
  namespace dim = units::dim;
  // sigma_sb and R_u are exact in the 2019 SI (CODATA 2018); g_n is the
  // standard acceleration of gravity (CGPM 1901, exact by definition).
  static const std::vector<ConstantInfo> all = {
      {"pi", M_PI, dim::kOne, "the ratio of a circle's circumference to its diameter"},
      {"sigma_sb", 5.670374419e-8, dim::kPower / (dim::kArea * dim::kTemperature.Pow(4)),
       "Stefan-Boltzmann constant, 5.670374419e-8 W/(m^2*K^4) (CODATA 2018)"},
      {"g_n", 9.80665, dim::kLength / (dim::kTime * dim::kTime),
       "standard acceleration of gravity, 9.80665 m/s^2 (exact)"},
      {"R_u", 8.314462618, dim::kEnergy / (dim::kAmount * dim::kTemperature),
       "molar gas constant, 8.314462618 J/(mol*K) (CODATA 2018)"},
  };
  return all;
}

}  // namespace heatdeck
