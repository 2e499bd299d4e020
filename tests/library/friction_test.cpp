// Family 'friction': Darcy friction factors and pressure drop.
#include "library/friction.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <set>
#include <string>
#include <vector>

#include "library/reference_rows.h"
#include "library/registry.h"

namespace heatdeck::library {
namespace {

namespace dim = units::dim;
using testing::RowTally;

// |1/sqrt(f) + 2 log10(e/3.7 + 2.51/(Re sqrt(f)))| relative to 1/sqrt(f),
// in long double so that the check itself adds no error at the 1e-12 level.
double ColebrookResidual(double re, double rel_rough, double f) {
  const long double x = 1.0L / std::sqrt(static_cast<long double>(f));
  const long double g =
      x + 2.0L * std::log10(static_cast<long double>(rel_rough) / 3.7L + 2.51L * x / re);
  return static_cast<double>(std::fabs(g) / x);
}

TEST(FrictionTest, ReferenceRows) {
  const RowTally checks = testing::RunCheckRows("friction");
  EXPECT_EQ(checks.failed, 0);
  EXPECT_EQ(checks.functions_run, (std::set<std::string>{"f_laminar", "f_colebrook", "dp_darcy"}));
  const RowTally errors = testing::RunErrorRows("friction");
  EXPECT_EQ(errors.failed, 0);
  EXPECT_GT(errors.run, 0);
  const RowTally sheet = testing::RunSpreadsheetRows("friction");
  EXPECT_EQ(sheet.failed, 0);
  EXPECT_EQ(sheet.functions_run, (std::set<std::string>{"f_laminar", "dp_darcy"}));
}

TEST(FrictionTest, Signatures) {
  const FunctionInfo* laminar = FindFunction("f_laminar");
  const FunctionInfo* colebrook = FindFunction("f_colebrook");
  const FunctionInfo* dp = FindFunction("dp_darcy");
  ASSERT_TRUE(laminar && colebrook && dp);
  for (const FunctionInfo* f : {laminar, colebrook, dp}) EXPECT_STREQ(f->family, "friction");
  ASSERT_EQ(laminar->args.size(), 1u);
  EXPECT_TRUE(laminar->args[0].dim == dim::kOne);
  EXPECT_TRUE(laminar->result == dim::kOne);
  ASSERT_EQ(colebrook->args.size(), 2u);
  EXPECT_TRUE(colebrook->args[0].dim == dim::kOne && colebrook->args[1].dim == dim::kOne);
  EXPECT_TRUE(colebrook->result == dim::kOne);
  EXPECT_EQ(colebrook->spreadsheet, nullptr);  // iterative: no closed form
  const std::vector<units::Dimension> dp_args = {dim::kOne, dim::kLength, dim::kLength,
                                                 dim::kDensity, dim::kVelocity};
  ASSERT_EQ(dp->args.size(), dp_args.size());
  for (size_t i = 0; i < dp_args.size(); ++i) EXPECT_TRUE(dp->args[i].dim == dp_args[i]) << i;
  EXPECT_TRUE(dp->result == dim::kPressure);
  EXPECT_TRUE(dim::kDensity * dim::kVelocity * dim::kVelocity == dim::kPressure);
}

TEST(FrictionTest, HandValues) {
  RecordingSink sink;
  EXPECT_NEAR(FLaminar(1600, sink), 0.04, 1e-17);  // 64/1600
  // 0.02 * (10/0.02) * 1000 * 2^2 / 2 = 20000 Pa.
  EXPECT_NEAR(DpDarcy(0.02, 10, 0.02, 1000, 2, sink), 20000, 1e-9);
  EXPECT_EQ(DpDarcy(0.02, 0, 0.02, 1000, 2, sink), 0.0);
  EXPECT_TRUE(sink.errors.empty());
  EXPECT_TRUE(sink.warnings.empty());
}

// Over the Moody chart the returned f satisfies Colebrook-White to 1e-12.
TEST(FrictionTest, ColebrookResidual) {
  for (double re : {4000.0, 1e4, 6.5e4, 1e5, 1e6, 1e7, 1e8}) {
    for (double eps : {0.0, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 0.05}) {
      RecordingSink sink;
      const double f = FColebrook(re, eps, sink);
      EXPECT_LT(ColebrookResidual(re, eps, f), 1e-12) << re << " " << eps;
      EXPECT_TRUE(sink.errors.empty() && sink.warnings.empty()) << re << " " << eps;
    }
  }
}

// Far outside the chart the solve still converges (with warnings).  Values
// from fluids 1.0.22 fluids.friction.Colebrook (Lambert-W closed form),
// confirmed with mpmath findroot at 40 digits.
TEST(FrictionTest, ColebrookOutsideTheChart) {
  struct Case {
    double re, eps, expected;
    size_t warnings;
  };
  const Case cases[] = {
      {5.0, 0.0, 1.5767904549299319, 1},  // Swamee-Jain start unusable here
      {100.0, 0.0, 0.16940839168199245, 1},
      {2000.0, 0.001, 0.05021390477445414, 1},
      {1e5, 0.3, 0.2101163685913863, 1},  // rougher than the chart
  };
  for (const auto& c : cases) {
    RecordingSink sink;
    const double f = FColebrook(c.re, c.eps, sink);
    EXPECT_NEAR(f / c.expected, 1.0, 1e-12) << c.re << " " << c.eps;
    EXPECT_LT(ColebrookResidual(c.re, c.eps, f), 1e-12);
    EXPECT_TRUE(sink.errors.empty());
    EXPECT_EQ(sink.warnings.size(), c.warnings);
  }
}

// Fully rough limit (hand): as Re -> infinity, 1/sqrt(f) = -2 log10(e/3.7);
// e = 0.037 gives 1/sqrt(f) = 4, f = 1/16.  At Re = 1e15 the viscous term
// shifts f by 4e-13 relative (fluids gives 0.06250000000002726).
TEST(FrictionTest, ColebrookFullyRough) {
  RecordingSink sink;
  EXPECT_NEAR(FColebrook(1e15, 0.037, sink), 0.0625, 1e-13);
}

TEST(FrictionTest, Warnings) {
  {
    RecordingSink sink;
    FColebrook(3000, 0, sink);
    ASSERT_EQ(sink.warnings.size(), 1u);
    EXPECT_NE(sink.warnings[0].find("Re = 3000"), std::string::npos) << sink.warnings[0];
    EXPECT_NE(sink.warnings[0].find("Re >= 4000"), std::string::npos) << sink.warnings[0];
    EXPECT_NE(sink.warnings[0].find("Colebrook 1939"), std::string::npos) << sink.warnings[0];
  }
  {
    RecordingSink sink;
    FLaminar(5000, sink);
    ASSERT_EQ(sink.warnings.size(), 1u);
    EXPECT_NE(sink.warnings[0].find("Re = 5000"), std::string::npos) << sink.warnings[0];
  }
  {
    RecordingSink sink;
    FLaminar(2300, sink);
    EXPECT_TRUE(sink.warnings.empty());
  }
}

TEST(FrictionTest, MeaninglessInputIsAnError) {
  const double inf = std::numeric_limits<double>::infinity();
  struct Case {
    const char* name;
    std::vector<double> args;
  };
  const Case cases[] = {
      {"f_laminar", {0}},
      {"f_laminar", {-100}},
      {"f_colebrook", {0, 1e-4}},
      {"f_colebrook", {1e5, -1e-4}},
      {"f_colebrook", {inf, 1e-4}},
      {"dp_darcy", {-0.02, 10, 0.02, 1000, 2}},
      {"dp_darcy", {0.02, -10, 0.02, 1000, 2}},
      {"dp_darcy", {0.02, 10, 0, 1000, 2}},
      {"dp_darcy", {0.02, 10, 0.02, 0, 2}},
      {"dp_darcy", {0.02, 10, 0.02, 1000, -2}},
  };
  for (const auto& c : cases) {
    SCOPED_TRACE(c.name);
    RecordingSink sink;
    EXPECT_TRUE(std::isnan(Call(*FindFunction(c.name), c.args, sink)));
    ASSERT_EQ(sink.errors.size(), 1u);
    EXPECT_EQ(sink.errors[0].rfind(std::string(c.name) + ":", 0), 0u) << sink.errors[0];
  }
}

}  // namespace
}  // namespace heatdeck::library
