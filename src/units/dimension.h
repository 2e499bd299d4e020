// Dimension vectors: exponents of the SI base dimensions.
#pragma once

#include <array>
#include <cstdint>
#include <string>

namespace heatdeck::units {

enum class Base : int {
  kLength = 0,
  kMass,
  kTime,
  kTemperature,
  kAmount,
  kCurrent,
  kLuminous,
};
inline constexpr int kNumBase = 7;

// An exponent vector over the seven SI base dimensions.  Angles are
// dimensionless (rad is 1).  Value type, cheap to copy and compare.
class Dimension {
 public:
  constexpr Dimension() = default;
  static constexpr Dimension Of(Base b, int e = 1) {
    Dimension d;
    d.e_[static_cast<int>(b)] = static_cast<int8_t>(e);
    return d;
  }

  constexpr int exp(Base b) const { return e_[static_cast<int>(b)]; }
  constexpr int exp(int i) const { return e_[i]; }
  constexpr bool dimensionless() const {
    for (auto v : e_) {
      if (v != 0) return false;
    }
    return true;
  }
  // True for exactly Θ¹ (a temperature or temperature difference).
  constexpr bool IsTemperature() const { return *this == Of(Base::kTemperature); }

  constexpr Dimension operator*(const Dimension& o) const {
    Dimension d;
    for (int i = 0; i < kNumBase; ++i) d.e_[i] = static_cast<int8_t>(e_[i] + o.e_[i]);
    return d;
  }
  constexpr Dimension operator/(const Dimension& o) const {
    Dimension d;
    for (int i = 0; i < kNumBase; ++i) d.e_[i] = static_cast<int8_t>(e_[i] - o.e_[i]);
    return d;
  }
  constexpr Dimension Pow(int n) const {
    Dimension d;
    for (int i = 0; i < kNumBase; ++i) d.e_[i] = static_cast<int8_t>(e_[i] * n);
    return d;
  }
  // Raises to num/den; false when an exponent would not be a whole number.
  constexpr bool PowRational(int num, int den, Dimension* out) const {
    Dimension d;
    for (int i = 0; i < kNumBase; ++i) {
      const int p = e_[i] * num;
      if (p % den != 0) return false;
      d.e_[i] = static_cast<int8_t>(p / den);
    }
    *out = d;
    return true;
  }
  constexpr bool operator==(const Dimension& o) const = default;

  // The coherent SI unit of this dimension, in the deck's ASCII spelling,
  // preferring named units: "W/(m^2*K)", "Pa*s", "J/(kg*K)", "" for 1.
  std::string SiUnit() const;
  // A plain-words name where one is common ("length", "power",
  // "thermal conductivity"); otherwise SiUnit().  Used in diagnostics.
  std::string Describe() const;

 private:
  std::array<int8_t, kNumBase> e_{};
};

namespace dim {
inline constexpr Dimension kOne{};
inline constexpr Dimension kLength = Dimension::Of(Base::kLength);
inline constexpr Dimension kMass = Dimension::Of(Base::kMass);
inline constexpr Dimension kTime = Dimension::Of(Base::kTime);
inline constexpr Dimension kTemperature = Dimension::Of(Base::kTemperature);
inline constexpr Dimension kAmount = Dimension::Of(Base::kAmount);
inline constexpr Dimension kArea = kLength * kLength;
inline constexpr Dimension kVolume = kArea * kLength;
inline constexpr Dimension kVelocity = kLength / kTime;
inline constexpr Dimension kMassFlow = kMass / kTime;
inline constexpr Dimension kDensity = kMass / kVolume;
inline constexpr Dimension kForce = kMass * kLength / (kTime * kTime);
inline constexpr Dimension kPressure = kForce / kArea;
inline constexpr Dimension kEnergy = kForce * kLength;
inline constexpr Dimension kPower = kEnergy / kTime;
inline constexpr Dimension kViscosity = kPressure * kTime;
inline constexpr Dimension kSpecificHeat = kEnergy / (kMass * kTemperature);
inline constexpr Dimension kConductivity = kPower / (kLength * kTemperature);
inline constexpr Dimension kHeatTransferCoeff = kPower / (kArea * kTemperature);
inline constexpr Dimension kFoulingResistance = kArea * kTemperature / kPower;
inline constexpr Dimension kThermalResistance = kTemperature / kPower;
inline constexpr Dimension kConductance = kPower / kTemperature;
inline constexpr Dimension kPerLength = kOne / kLength;
}  // namespace dim

// Whether a Θ¹ quantity is an absolute temperature, an interval, or may be
// read as either (kelvin and rankine literals).  kNone for every other
// dimension.  See LANGUAGE.md "Temperatures".
enum class TempKind : uint8_t { kNone, kAbsolute, kInterval, kEither };

}  // namespace heatdeck::units
