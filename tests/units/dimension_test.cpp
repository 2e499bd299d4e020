#include "units/dimension.h"

#include <string>

#include <gtest/gtest.h>

#include "units/unit.h"

namespace heatdeck::units {
namespace {

TEST(DimensionTest, NamedSiUnits) {
  EXPECT_EQ(dim::kOne.SiUnit(), "");
  EXPECT_EQ(dim::kLength.SiUnit(), "m");
  EXPECT_EQ(dim::kMass.SiUnit(), "kg");
  EXPECT_EQ(dim::kTemperature.SiUnit(), "K");
  EXPECT_EQ(dim::kHeatTransferCoeff.SiUnit(), "W/(m^2*K)");
  EXPECT_EQ(dim::kConductivity.SiUnit(), "W/(m*K)");
  EXPECT_EQ(dim::kFoulingResistance.SiUnit(), "m^2*K/W");
  EXPECT_EQ(dim::kThermalResistance.SiUnit(), "K/W");
  EXPECT_EQ(dim::kConductance.SiUnit(), "W/K");
  EXPECT_EQ(dim::kSpecificHeat.SiUnit(), "J/(kg*K)");
  EXPECT_EQ(dim::kViscosity.SiUnit(), "Pa*s");
  EXPECT_EQ(dim::kMassFlow.SiUnit(), "kg/s");
  EXPECT_EQ(dim::kDensity.SiUnit(), "kg/m^3");
  EXPECT_EQ((dim::kVolume / dim::kTime).SiUnit(), "m^3/s");
  EXPECT_EQ(dim::kPressure.SiUnit(), "Pa");
  EXPECT_EQ(dim::kEnergy.SiUnit(), "J");
  EXPECT_EQ(dim::kPower.SiUnit(), "W");
  EXPECT_EQ(dim::kForce.SiUnit(), "N");
  EXPECT_EQ(dim::kVelocity.SiUnit(), "m/s");
  EXPECT_EQ(dim::kPerLength.SiUnit(), "1/m");
  EXPECT_EQ(dim::kArea.SiUnit(), "m^2");
  EXPECT_EQ((dim::kEnergy / dim::kMass).SiUnit(), "J/kg");
  EXPECT_EQ((dim::kPower / dim::kArea).SiUnit(), "W/m^2");
}

TEST(DimensionTest, FallbackProductOfBaseUnits) {
  // W/K^2 has no name: kg*m^2*s^-3*K^-2.
  EXPECT_EQ((dim::kConductance / dim::kTemperature).SiUnit(), "kg*m^2/(s^3*K^2)");
  EXPECT_EQ(dim::kLength.Pow(4).SiUnit(), "m^4");
  EXPECT_EQ((dim::kMass * dim::kLength).SiUnit(), "kg*m");
  EXPECT_EQ((dim::kOne / (dim::kLength * dim::kTime)).SiUnit(), "1/(m*s)");
  EXPECT_EQ((dim::kAmount / dim::kTime).SiUnit(), "mol/s");
  EXPECT_EQ((dim::kLength / dim::kTemperature.Pow(2)).SiUnit(), "m/K^2");
  EXPECT_EQ(dim::kTime.Pow(-2).SiUnit(), "1/s^2");
}

TEST(DimensionTest, Describe) {
  EXPECT_EQ(dim::kOne.Describe(), "dimensionless");
  EXPECT_EQ(dim::kLength.Describe(), "length");
  EXPECT_EQ(dim::kMass.Describe(), "mass");
  EXPECT_EQ(dim::kTime.Describe(), "time");
  EXPECT_EQ(dim::kTemperature.Describe(), "temperature");
  EXPECT_EQ(dim::kMassFlow.Describe(), "mass flow rate");
  EXPECT_EQ(dim::kPower.Describe(), "power");
  EXPECT_EQ(dim::kConductivity.Describe(), "thermal conductivity");
  EXPECT_EQ(dim::kHeatTransferCoeff.Describe(), "heat transfer coefficient");
  EXPECT_EQ(dim::kFoulingResistance.Describe(), "fouling resistance");
  EXPECT_EQ(dim::kThermalResistance.Describe(), "thermal resistance");
  EXPECT_EQ(dim::kConductance.Describe(), "thermal conductance");
  EXPECT_EQ(dim::kPressure.Describe(), "pressure");
  EXPECT_EQ(dim::kViscosity.Describe(), "dynamic viscosity");
  EXPECT_EQ(dim::kSpecificHeat.Describe(), "specific heat capacity");
  EXPECT_EQ(dim::kDensity.Describe(), "density");
  EXPECT_EQ(dim::kVelocity.Describe(), "velocity");
  EXPECT_EQ(dim::kArea.Describe(), "area");
  EXPECT_EQ(dim::kVolume.Describe(), "volume");
  EXPECT_EQ(dim::kEnergy.Describe(), "energy");
  // No common name: the SI spelling.
  EXPECT_EQ(dim::kLength.Pow(4).Describe(), "m^4");
}

// Every SI spelling SiUnit produces reads back through the parser as the
// same dimension with factor 1, so diagnostics can be pasted into a deck.
TEST(DimensionTest, SiUnitParsesBack) {
  const Dimension dims[] = {
      dim::kLength,
      dim::kMass,
      dim::kTime,
      dim::kTemperature,
      dim::kAmount,
      Dimension::Of(Base::kCurrent),
      Dimension::Of(Base::kLuminous),
      dim::kArea,
      dim::kVolume,
      dim::kVelocity,
      dim::kMassFlow,
      dim::kDensity,
      dim::kForce,
      dim::kPressure,
      dim::kEnergy,
      dim::kPower,
      dim::kViscosity,
      dim::kSpecificHeat,
      dim::kConductivity,
      dim::kHeatTransferCoeff,
      dim::kFoulingResistance,
      dim::kThermalResistance,
      dim::kConductance,
      dim::kPerLength,
      dim::kOne / dim::kTime,
      dim::kHeatTransferCoeff / dim::kTemperature.Pow(3),
      dim::kConductance / dim::kTemperature,
      dim::kOne / (dim::kLength * dim::kTime),
      dim::kTime.Pow(-2),
  };
  for (const Dimension& d : dims) {
    const std::string text = d.SiUnit();
    SCOPED_TRACE(text);
    Unit u;
    UnitError error;
    ASSERT_TRUE(ParseUnit(text, &u, &error)) << error.message;
    EXPECT_EQ(u.dim, d);
    EXPECT_EQ(u.factor, 1.0);
  }
}

TEST(DimensionTest, Arithmetic) {
  EXPECT_EQ(dim::kPower / dim::kPower, dim::kOne);
  EXPECT_TRUE(dim::kTemperature.IsTemperature());
  EXPECT_FALSE(dim::kTemperature.Pow(2).IsTemperature());
  Dimension root;
  EXPECT_TRUE(dim::kArea.PowRational(1, 2, &root));
  EXPECT_EQ(root, dim::kLength);
  EXPECT_FALSE(dim::kVolume.PowRational(1, 2, &root));
}

}  // namespace
}  // namespace heatdeck::units
