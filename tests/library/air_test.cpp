#include "library/air.h"

#include <cmath>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "library/registry.h"

namespace heatdeck::library {
namespace {

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

TEST(AirDensity, IdealGasAtStandardConditions) {
  // CODATA 2018 molar volume of an ideal gas at 273.15 K and 101.325 kPa,
  // 22.41396954 L/mol (from memory): rho = M / V_m.
  ExpectRel(CallOk("air_rho", {273.15, 101325}), 28.9586e-3 / 22.41396954e-3, 1e-9);
  // Hand-derived: density scales with p/T.
  ExpectRel(CallOk("air_rho", {546.3, 202650}), 28.9586e-3 / 22.41396954e-3, 1e-9);
}

TEST(AirTransport, MatchesLemmonJacobsenCheckValues) {
  // Lemmon & Jacobsen (2004) dilute-gas check values for air at 300 K
  // (from memory): eta0 = 18.5230 uPa s, lambda0 = 26.3529 mW/(m K).
  EXPECT_NEAR(air::DiluteViscosity(300) * 1e6, 18.5230, 5e-5);
  EXPECT_NEAR(air::DiluteConductivity(300) * 1e3, 26.3529, 5e-5);
}

TEST(AirTransport, MatchesIapwsLibraryDiluteGasTerms) {
  // python3-iapws 1.5.2, humidAir.Air._visco(0, T) and Air()._thermo(0, T,
  // None): the same Lemmon & Jacobsen dilute-gas terms at zero density.
  struct Row {
    double T, mu, k;
  };
  constexpr Row kRows[] = {
      {200, 1.3316135340917797e-05, 0.018453138430790304},
      {300, 1.8522999163224034e-05, 0.02635290397998064},
      {600, 3.0760267019310224e-05, 0.04599658782099534},
      {1000, 4.3274572873618456e-05, 0.0676687686584937},
  };
  for (const Row& row : kRows) {
    SCOPED_TRACE(::testing::Message() << row.T << " K");
    ExpectRel(CallOk("air_mu", {row.T}), row.mu, 1e-12);
    ExpectRel(CallOk("air_k", {row.T}), row.k, 1e-12);
  }
}

TEST(AirHeatCapacity, MatchesIapwsLibraryIdealGasLimit) {
  // python3-iapws 1.5.2 humidAir.Air(T=T, rho=1e-9).cp, i.e. the Lemmon et
  // al. (2000) equation at vanishing density, rescaled from that library's
  // molar mass 28.96546 g/mol to Lemmon's 28.9586 g/mol.
  ExpectRel(CallOk("air_cp", {200}), 1002.6423365546767, 1e-10);
  ExpectRel(CallOk("air_cp", {300}), 1005.0141126079949, 1e-10);
  ExpectRel(CallOk("air_cp", {600}), 1051.1332399607643, 1e-10);
  ExpectRel(CallOk("air_cp", {1000}), 1141.1751094859383, 1e-10);
}

TEST(AirPrandtl, IsCpMuOverK) {
  // Hand-derived from the three values python3-iapws gives at 600 K above.
  ExpectRel(CallOk("air_pr", {600}),
            1051.1332399607643 * 3.0760267019310224e-05 / 0.04599658782099534, 1e-10);
}

TEST(AirFunctions, RangeEdgesAndErrors) {
  // LIBRARY.md: error outside 200-1000 K.
  CallOk("air_cp", {200});
  CallOk("air_k", {1000});
  EXPECT_EQ(CallError("air_cp", {150}),
            "T = 150 K is outside the air-property range 200 K ... 1000 K");
  EXPECT_EQ(CallError("air_mu", {1200}),
            "T = 1200 K is outside the air-property range 200 K ... 1000 K");
  EXPECT_EQ(CallError("air_rho", {199.9, 101325}),
            "T = 199.9 K is outside the air-property range 200 K ... 1000 K");
  EXPECT_EQ(CallError("air_rho", {300, 0}),
            "p = 0 Pa: air density needs a positive absolute pressure");
  EXPECT_NE(CallError("air_pr", {std::nan("")}), "");
}

TEST(AirFunctions, RegistryEntriesDescribeTheFunctions) {
  for (const char* name : {"air_rho", "air_cp", "air_mu", "air_k", "air_pr"}) {
    SCOPED_TRACE(name);
    const FunctionInfo* f = FindFunction(name);
    ASSERT_NE(f, nullptr);
    EXPECT_STREQ(f->family, "air");
    ASSERT_FALSE(f->args.empty());
    EXPECT_EQ(f->args[0].dim, units::dim::kTemperature);
    EXPECT_EQ(f->args[0].kind, units::TempKind::kAbsolute);
    ASSERT_NE(f->spreadsheet, nullptr);
    EXPECT_NE(std::string(f->spreadsheet).find("{0}"), std::string::npos);
  }
  EXPECT_EQ(FindFunction("air_rho")->args.size(), 2u);
  EXPECT_EQ(FindFunction("air_rho")->result, units::dim::kDensity);
  EXPECT_EQ(FindFunction("air_cp")->args.size(), 1u);
  EXPECT_EQ(FindFunction("air_cp")->result, units::dim::kSpecificHeat);
  EXPECT_EQ(FindFunction("air_mu")->result, units::dim::kViscosity);
  EXPECT_EQ(FindFunction("air_k")->result, units::dim::kConductivity);
  EXPECT_EQ(FindFunction("air_pr")->result, units::dim::kOne);
}

}  // namespace
}  // namespace heatdeck::library
