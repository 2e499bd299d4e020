#include "library/water.h"

#include <cmath>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "library/registry.h"

namespace heatdeck::library {
namespace {

constexpr double kTableRel = 1e-8;  // the IAPWS tables print 9 significant digits

void ExpectRel(double got, double expected, double rel) {
  EXPECT_NEAR(got, expected, rel * std::fabs(expected)) << "expected " << expected;
}

double CallOk(const char* name, std::vector<double> args) {
  const FunctionInfo* f = FindFunction(name);
  EXPECT_NE(f, nullptr) << name;
  if (f == nullptr) return std::nan("");
  RecordingSink sink;
  const double v = Call(*f, args, sink);
  EXPECT_TRUE(sink.errors.empty()) << name << ": " << (sink.errors.empty() ? "" : sink.errors[0]);
  EXPECT_TRUE(sink.warnings.empty()) << name;
  return v;
}

// The error text of a call that must fail (and return NaN).
std::string CallError(const char* name, std::vector<double> args) {
  const FunctionInfo* f = FindFunction(name);
  EXPECT_NE(f, nullptr) << name;
  if (f == nullptr) return "";
  RecordingSink sink;
  const double v = Call(*f, args, sink);
  EXPECT_TRUE(std::isnan(v)) << name << " returned " << v;
  EXPECT_EQ(sink.errors.size(), 1u) << name;
  return sink.errors.empty() ? "" : sink.errors[0];
}

// IAPWS R7-97(2012) Table 5, verification values of the region-1 basic
// equation (v, h, u, s, cp, w; from memory, and python3-iapws 1.5.2
// iapws97._Region1 prints the same digits).
struct Table5Row {
  double T, p, v, h, u, s, cp, w;
};
constexpr Table5Row kTable5[] = {
    {300, 3e6, 0.100215168e-2, 0.115331273e6, 0.112324818e6, 0.392294792e3, 0.417301218e4,
     0.150773921e4},
    {300, 80e6, 0.971180894e-3, 0.184142828e6, 0.106448356e6, 0.368563852e3, 0.401008987e4,
     0.163469054e4},
    {500, 3e6, 0.120241800e-2, 0.975542239e6, 0.971934985e6, 0.258041912e4, 0.465580682e4,
     0.124071337e4},
};

TEST(WaterRegion1, MatchesIf97Table5) {
  for (const Table5Row& row : kTable5) {
    SCOPED_TRACE(::testing::Message() << row.T << " K, " << row.p << " Pa");
    const water::Region1 r = water::If97Region1(row.T, row.p);
    ExpectRel(r.v, row.v, kTableRel);
    ExpectRel(r.h, row.h, kTableRel);
    ExpectRel(r.u, row.u, kTableRel);
    ExpectRel(r.s, row.s, kTableRel);
    ExpectRel(r.cp, row.cp, kTableRel);
    ExpectRel(r.w, row.w, kTableRel);
  }
}

TEST(WaterRegion1, IsochoricHeatCapacityMatchesIapwsLibrary) {
  // python3-iapws 1.5.2, iapws97._Region1(300, 80)["cv"] = 3.91736606 kJ/(kg K).
  ExpectRel(water::If97Region1(300, 80e6).cv, 3917.3660618448736, 1e-10);
  // IAPWS97(T=500, P=5).cv = 3.2198420976 kJ/(kg K).
  ExpectRel(water::If97Region1(500, 5e6).cv, 3219.8420976040683, 1e-10);
}

TEST(WaterRegion1, DensityDerivativeMatchesCentralDifference) {
  // Hand check: (d rho/d p)_T against a central difference of 1/v.
  for (const auto& [T, p] : {std::pair{300.0, 1e6}, {450.0, 5e6}, {620.0, 20e6}}) {
    const double dp = p * 1e-5;
    const double fd =
        (1 / water::If97Region1(T, p + dp).v - 1 / water::If97Region1(T, p - dp).v) / (2 * dp);
    ExpectRel(water::If97Region1(T, p).drho_dp, fd, 1e-6);
  }
}

TEST(WaterSaturation, PressureMatchesIf97Table35) {
  // IAPWS R7-97(2012) Table 35 (from memory; python3-iapws 1.5.2 _PSat_T agrees).
  ExpectRel(water::SaturationPressure(300), 0.353658941e-2 * 1e6, kTableRel);
  ExpectRel(water::SaturationPressure(500), 0.263889776e1 * 1e6, kTableRel);
  ExpectRel(water::SaturationPressure(600), 0.123443146e2 * 1e6, kTableRel);
}

TEST(WaterSaturation, TemperatureMatchesIf97Table36) {
  // IAPWS R7-97(2012) Table 36 (from memory; python3-iapws 1.5.2 _TSat_P agrees).
  ExpectRel(water::SaturationTemperature(0.1e6), 0.372755919e3, kTableRel);
  ExpectRel(water::SaturationTemperature(1e6), 0.453035632e3, kTableRel);
  ExpectRel(water::SaturationTemperature(10e6), 0.584149488e3, kTableRel);
}

TEST(WaterSaturation, ForwardAndBackwardEquationsInvertEachOther) {
  // Eqs. 30 and 31 of R7-97 solve the same implicit quadratic (Eq. 29), so a
  // round trip returns the start to rounding.
  for (double T = 273.15; T <= 647.0; T += 12.5) {
    EXPECT_NEAR(water::SaturationTemperature(water::SaturationPressure(T)), T, 1e-9 * T);
  }
}

TEST(WaterViscosity, MatchesR1208Table4) {
  // IAPWS R12-08 Table 4, check values for mu0*mu1 (mu2 = 1) at given T and
  // rho, in uPa s (from memory; python3-iapws 1.5.2 _Viscosity(rho, T)
  // prints the same digits).
  struct Row {
    double T, rho, mu_micro;
  };
  constexpr Row kRows[] = {
      {298.15, 998, 889.735100}, {298.15, 1200, 1437.649467}, {373.15, 1000, 307.883622},
      {433.15, 1, 14.538324},    {433.15, 1000, 217.685358},  {873.15, 1, 32.619287},
      {873.15, 100, 35.802262},  {873.15, 600, 77.430195},    {1173.15, 1, 44.217245},
      {1173.15, 100, 47.640433}, {1173.15, 400, 64.154608},
  };
  for (const Row& row : kRows) {
    SCOPED_TRACE(::testing::Message() << row.T << " K, " << row.rho << " kg/m3");
    // Half a unit in the last printed digit.
    EXPECT_NEAR(water::Viscosity(row.rho, row.T) * 1e6, row.mu_micro, 5e-7);
  }
}

TEST(WaterConductivity, BackgroundMatchesR1511Table) {
  // IAPWS R15-11, check values for lambda0*lambda1 (lambda2 = 0), in
  // mW/(m K) (from memory; python3-iapws 1.5.2 _ThCond(rho, T) without
  // critical enhancement prints the same digits).
  ExpectRel(water::ConductivityBackground(0, 298.15) * 1e3, 18.4341883, kTableRel);
  ExpectRel(water::ConductivityBackground(998, 298.15) * 1e3, 607.712868, kTableRel);
  ExpectRel(water::ConductivityBackground(1200, 298.15) * 1e3, 799.038144, kTableRel);
  ExpectRel(water::ConductivityBackground(0, 873.15) * 1e3, 79.1034659, kTableRel);
}

TEST(WaterConductivity, CriticalEnhancementMatchesIapwsLibrary) {
  // python3-iapws 1.5.2: IAPWS97(T=620, P=20).k - _ThCond(rho, 620) =
  // 0.0126391714 W/(m K), lambda2 by the R15-11 industrial route.
  const double T = 620, p = 20e6;
  const water::Region1 r = water::If97Region1(T, p);
  const double rho = 1 / r.v;
  ExpectRel(water::ConductivityCriticalEnhancement(rho, T, r.cp, r.cv, water::Viscosity(rho, T),
                                                   r.drho_dp),
            0.012639171430784135, 1e-8);
  // Far from the critical point the enhancement vanishes: at 300 K, 1 atm
  // python3-iapws gives k with and without lambda2 identical.
  const water::Region1 cold = water::If97Region1(300, 101325);
  EXPECT_EQ(water::ConductivityCriticalEnhancement(1 / cold.v, 300, cold.cp, cold.cv, 8.5e-4,
                                                   cold.drho_dp),
            0.0);
}

TEST(WaterFunctions, MatchIapwsLibraryAwayFromTheReferenceRows) {
  // python3-iapws 1.5.2 IAPWS97(T=..., P=...) liquid: rho, cp, mu, k, Prandt
  // (k there uses the R15-11 industrial critical enhancement, as here).
  struct Row {
    double T, p, rho, cp, mu, k, pr;
  };
  constexpr Row kRows[] = {
      {500, 5e6, 833.5186810378918, 4638.4204450581255, 1.1852804687184705e-4, 0.6417032311619414,
       0.8567557232455932},
      {620, 20e6, 613.2277774403244, 7634.337046791434, 7.090510675152441e-05, 0.48148519510200266,
       1.1242577939809488},
  };
  for (const Row& row : kRows) {
    SCOPED_TRACE(::testing::Message() << row.T << " K, " << row.p << " Pa");
    ExpectRel(CallOk("water_rho", {row.T, row.p}), row.rho, 1e-10);
    ExpectRel(CallOk("water_cp", {row.T, row.p}), row.cp, 1e-10);
    ExpectRel(CallOk("water_mu", {row.T, row.p}), row.mu, 1e-10);
    ExpectRel(CallOk("water_k", {row.T, row.p}), row.k, 1e-10);
    ExpectRel(CallOk("water_pr", {row.T, row.p}), row.pr, 1e-10);
  }
  // More k values from the same library across the range, where lambda2
  // matters (550-620 K) and where it does not.
  const std::pair<std::pair<double, double>, double> kK[] = {
      {{550, 10e6}, 0.5903562316511672},  {{600, 15e6}, 0.5141705290318156},
      {{620, 50e6}, 0.5450389397199975},  {{600, 100e6}, 0.634943674355195},
      {{400, 100e6}, 0.7403810846130479}, {{273.15, 100e6}, 0.6166022587058474},
  };
  for (const auto& [tp, k] : kK) {
    ExpectRel(CallOk("water_k", {tp.first, tp.second}), k, 1e-10);
  }
}

TEST(WaterFunctions, RangeEdgesAreAccepted) {
  // LIBRARY.md: 273.15 K <= T <= 623.15 K, p_sat(T) <= p <= 100 MPa.
  CallOk("water_rho", {273.15, 101325});
  CallOk("water_rho", {623.15, 100e6});
  CallOk("water_cp", {400, water::SaturationPressure(400)});
  CallOk("water_psat", {273.15});
  CallOk("water_psat", {647.096});
  CallOk("water_tsat", {22.064e6});
  CallOk("water_tsat", {water::SaturationPressure(273.15)});
}

TEST(WaterFunctions, ErrorsNameTheValues) {
  EXPECT_EQ(CallError("water_rho", {400, 101325}),
            "water is vapour at 400 K, 101325 Pa (p_sat = 245.8 kPa)");
  EXPECT_EQ(CallError("water_cp", {300, 1000}),
            "water is vapour at 300 K, 1000 Pa (p_sat = 3537 Pa)");
  // Just below p_sat(373.15 K) = 101417.978 Pa both values get the digits
  // that show which is larger.
  EXPECT_EQ(CallError("water_pr", {373.15, 101417.8765}),
            "water is vapour at 373.15 K, 101417.9 Pa (p_sat = 101418 Pa)");
  EXPECT_EQ(CallError("water_mu", {650, 20e6}),
            "T = 650 K is outside the liquid-water range 273.15 K ... 623.15 K (IAPWS-IF97 "
            "region 1)");
  EXPECT_EQ(CallError("water_k", {623.1500001, 20e6}),
            "T = 623.1500001 K is outside the liquid-water range 273.15 K ... 623.15 K "
            "(IAPWS-IF97 region 1)");
  EXPECT_EQ(CallError("water_rho", {300, 150e6}),
            "p = 150 MPa is outside the liquid-water range (p <= 100 MPa, IAPWS-IF97 region 1)");
  EXPECT_NE(CallError("water_rho", {std::nan(""), 1e5}), "");
  EXPECT_NE(CallError("water_rho", {300, std::nan("")}), "");
  EXPECT_EQ(
      CallError("water_psat", {250}),
      "T = 250 K is outside the saturation line 273.15 K ... 647.096 K (IAPWS-IF97 region 4)");
  EXPECT_EQ(CallError("water_tsat", {30e6}),
            "p = 30 MPa is outside the saturation line 611.213 Pa ... 22.064 MPa (IAPWS-IF97 "
            "region 4)");
  EXPECT_EQ(CallError("water_tsat", {600}),
            "p = 600 Pa is outside the saturation line 611.213 Pa ... 22.064 MPa (IAPWS-IF97 "
            "region 4)");
}

TEST(WaterFunctions, RegistryEntriesDescribeTheFunctions) {
  for (const char* name :
       {"water_rho", "water_cp", "water_mu", "water_k", "water_pr", "water_psat", "water_tsat"}) {
    SCOPED_TRACE(name);
    const FunctionInfo* f = FindFunction(name);
    ASSERT_NE(f, nullptr);
    EXPECT_STREQ(f->family, "water");
    EXPECT_EQ(f->spreadsheet, nullptr);
    ASSERT_FALSE(f->args.empty());
    EXPECT_NE(std::string(f->source).find("IAPWS"), std::string::npos);
    EXPECT_NE(std::string(f->validity).find("error"), std::string::npos);
  }
  const FunctionInfo* rho = FindFunction("water_rho");
  ASSERT_EQ(rho->args.size(), 2u);
  EXPECT_EQ(rho->args[0].dim, units::dim::kTemperature);
  EXPECT_EQ(rho->args[0].kind, units::TempKind::kAbsolute);
  EXPECT_EQ(rho->args[1].dim, units::dim::kPressure);
  EXPECT_EQ(rho->result, units::dim::kDensity);
  EXPECT_EQ(FindFunction("water_cp")->result, units::dim::kSpecificHeat);
  EXPECT_EQ(FindFunction("water_mu")->result, units::dim::kViscosity);
  EXPECT_EQ(FindFunction("water_k")->result, units::dim::kConductivity);
  EXPECT_EQ(FindFunction("water_pr")->result, units::dim::kOne);
  EXPECT_EQ(FindFunction("water_psat")->result, units::dim::kPressure);
  const FunctionInfo* tsat = FindFunction("water_tsat");
  EXPECT_EQ(tsat->result, units::dim::kTemperature);
  EXPECT_EQ(tsat->result_kind, units::TempKind::kAbsolute);
}

}  // namespace
}  // namespace heatdeck::library
