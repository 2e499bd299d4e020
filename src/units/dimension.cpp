#include "units/dimension.h"

#include <array>
#include <string>
#include <string_view>

#include <fmt/format.h>

namespace heatdeck::units {
namespace {

struct Named {
  Dimension dim;
  std::string_view unit;
  std::string_view description;  // empty when no plain-words name is common
};

constexpr Dimension kCurrent = Dimension::Of(Base::kCurrent);
constexpr Dimension kLuminous = Dimension::Of(Base::kLuminous);
constexpr Dimension kFrequency = dim::kOne / dim::kTime;
constexpr Dimension kAcceleration = dim::kVelocity / dim::kTime;

// Where two quantities share a dimension, the first row wins: J/kg is
// preferred to m^2/s^2, Pa to J/m^3, N*m is not offered (torque and energy
// share J).
constexpr std::array kNamed = {
    Named{dim::kOne, "", "dimensionless"},
    Named{dim::kLength, "m", "length"},
    Named{dim::kMass, "kg", "mass"},
    Named{dim::kTime, "s", "time"},
    Named{dim::kTemperature, "K", "temperature"},
    Named{dim::kAmount, "mol", "amount of substance"},
    Named{kCurrent, "A", "electric current"},
    Named{kLuminous, "cd", "luminous intensity"},
    Named{dim::kArea, "m^2", "area"},
    Named{dim::kVolume, "m^3", "volume"},
    Named{dim::kVelocity, "m/s", "velocity"},
    Named{kAcceleration, "m/s^2", "acceleration"},
    Named{kFrequency, "1/s", "frequency"},
    Named{dim::kPerLength, "1/m", "inverse length"},
    Named{dim::kOne / dim::kTemperature, "1/K", "inverse temperature"},
    Named{dim::kMassFlow, "kg/s", "mass flow rate"},
    Named{dim::kVolume / dim::kTime, "m^3/s", "volumetric flow rate"},
    Named{dim::kMassFlow / dim::kArea, "kg/(m^2*s)", "mass flux"},
    Named{dim::kDensity, "kg/m^3", "density"},
    Named{dim::kVolume / dim::kMass, "m^3/kg", "specific volume"},
    Named{dim::kForce, "N", "force"},
    Named{dim::kForce / dim::kLength, "N/m", "surface tension"},
    Named{dim::kPressure, "Pa", "pressure"},
    Named{dim::kPressure / dim::kLength, "Pa/m", "pressure gradient"},
    Named{dim::kEnergy, "J", "energy"},
    Named{dim::kEnergy / dim::kMass, "J/kg", "specific energy"},
    Named{dim::kPower, "W", "power"},
    Named{dim::kPower / dim::kArea, "W/m^2", "heat flux"},
    Named{dim::kPower / dim::kLength, "W/m", "heat rate per length"},
    Named{dim::kPower / dim::kVolume, "W/m^3", "heat rate per volume"},
    Named{dim::kViscosity, "Pa*s", "dynamic viscosity"},
    Named{dim::kArea / dim::kTime, "m^2/s", "kinematic viscosity or diffusivity"},
    Named{dim::kSpecificHeat, "J/(kg*K)", "specific heat capacity"},
    Named{dim::kConductivity, "W/(m*K)", "thermal conductivity"},
    Named{dim::kHeatTransferCoeff, "W/(m^2*K)", "heat transfer coefficient"},
    Named{dim::kFoulingResistance, "m^2*K/W", "fouling resistance"},
    Named{dim::kThermalResistance, "K/W", "thermal resistance"},
    Named{dim::kConductance, "W/K", "thermal conductance"},
    Named{dim::kEnergy / dim::kTemperature, "J/K", "heat capacity"},
    Named{dim::kMass / dim::kAmount, "kg/mol", "molar mass"},
    Named{dim::kEnergy / (dim::kAmount * dim::kTemperature), "J/(mol*K)", "molar heat capacity"},
    Named{dim::kHeatTransferCoeff / dim::kTemperature.Pow(3), "W/(m^2*K^4)", "radiation constant"},
    Named{dim::kTemperature / dim::kLength, "K/m", "temperature gradient"},
};

const Named* FindNamed(const Dimension& d) {
  for (const Named& n : kNamed) {
    if (n.dim == d) return &n;
  }
  return nullptr;
}

// Base-unit symbols in the order the fallback spelling lists them
// ("kg*m^2/(s^3*K)"), with their Base index.
struct BaseSymbol {
  Base base;
  std::string_view symbol;
};
constexpr std::array kBaseOrder = {
    BaseSymbol{Base::kMass, "kg"},     BaseSymbol{Base::kLength, "m"},
    BaseSymbol{Base::kTime, "s"},      BaseSymbol{Base::kTemperature, "K"},
    BaseSymbol{Base::kAmount, "mol"},  BaseSymbol{Base::kCurrent, "A"},
    BaseSymbol{Base::kLuminous, "cd"},
};

std::string Factor(std::string_view symbol, int power) {
  if (power == 1) return std::string(symbol);
  return fmt::format("{}^{}", symbol, power);
}

}  // namespace

std::string Dimension::SiUnit() const {
  if (const Named* n = FindNamed(*this)) return std::string(n->unit);
  std::string num;
  std::string den;
  int den_count = 0;
  for (const BaseSymbol& b : kBaseOrder) {
    const int e = exp(b.base);
    if (e > 0) {
      if (!num.empty()) num += '*';
      num += Factor(b.symbol, e);
    } else if (e < 0) {
      if (!den.empty()) den += '*';
      den += Factor(b.symbol, -e);
      ++den_count;
    }
  }
  if (den.empty()) return num;
  const std::string_view top = num.empty() ? std::string_view("1") : std::string_view(num);
  if (den_count > 1) return fmt::format("{}/({})", top, den);
  return fmt::format("{}/{}", top, den);
}

std::string Dimension::Describe() const {
  const Named* n = FindNamed(*this);
  if (n != nullptr && !n->description.empty()) return std::string(n->description);
  return SiUnit();
}

}  // namespace heatdeck::units
