// Family 'groups': dimensionless groups and annulus geometry.
#include "library/groups.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <numbers>
#include <set>
#include <string>
#include <utility>
#include <vector>

#include "library/reference_rows.h"
#include "library/registry.h"

namespace heatdeck::library {
namespace {

namespace dim = units::dim;
using testing::RowTally;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

TEST(GroupsTest, ReferenceRows) {
  const RowTally checks = testing::RunCheckRows("groups");
  EXPECT_EQ(checks.failed, 0);
  EXPECT_EQ(checks.functions_run,
            (std::set<std::string>{"reynolds", "reynolds_tube", "prandtl", "h_from_nu",
                                   "dh_annulus", "area_annulus"}));
  EXPECT_EQ(testing::RunErrorRows("groups").failed, 0);
  const RowTally sheet = testing::RunSpreadsheetRows("groups");
  EXPECT_EQ(sheet.failed, 0);
  EXPECT_EQ(sheet.run, checks.run);
}

TEST(GroupsTest, Signatures) {
  struct Expected {
    const char* name;
    std::vector<units::Dimension> args;
    units::Dimension result;
  };
  const Expected expected[] = {
      {"reynolds", {dim::kDensity, dim::kVelocity, dim::kLength, dim::kViscosity}, dim::kOne},
      {"reynolds_tube", {dim::kMassFlow, dim::kLength, dim::kViscosity}, dim::kOne},
      {"prandtl", {dim::kSpecificHeat, dim::kViscosity, dim::kConductivity}, dim::kOne},
      {"h_from_nu", {dim::kOne, dim::kConductivity, dim::kLength}, dim::kHeatTransferCoeff},
      {"dh_annulus", {dim::kLength, dim::kLength}, dim::kLength},
      {"area_annulus", {dim::kLength, dim::kLength}, dim::kArea},
  };
  for (const auto& e : expected) {
    SCOPED_TRACE(e.name);
    const FunctionInfo* f = FindFunction(e.name);
    ASSERT_NE(f, nullptr);
    EXPECT_STREQ(f->family, "groups");
    ASSERT_EQ(f->args.size(), e.args.size());
    for (size_t i = 0; i < e.args.size(); ++i) EXPECT_TRUE(f->args[i].dim == e.args[i]) << i;
    EXPECT_TRUE(f->result == e.result);
    EXPECT_NE(f->spreadsheet, nullptr);
  }
  // Each result is dimensionally what its formula gives.
  EXPECT_TRUE(dim::kDensity * dim::kVelocity * dim::kLength / dim::kViscosity == dim::kOne);
  EXPECT_TRUE(dim::kMassFlow / (dim::kLength * dim::kViscosity) == dim::kOne);
  EXPECT_TRUE(dim::kSpecificHeat * dim::kViscosity / dim::kConductivity == dim::kOne);
  EXPECT_TRUE(dim::kConductivity / dim::kLength == dim::kHeatTransferCoeff);
}

TEST(GroupsTest, HandValues) {
  RecordingSink sink;
  // 1000 kg/m^3 * 2 m/s * 0.05 m / 1e-3 Pa*s = 1e5 (hand).
  EXPECT_NEAR(Reynolds(1000, 2, 0.05, 1e-3, sink), 1e5, 1e-9);
  // 2000 J/(kg*K) * 0.003 Pa*s / 0.15 W/(m*K) = 40 (hand).
  EXPECT_NEAR(Prandtl(2000, 0.003, 0.15, sink), 40.0, 1e-12);
  // 100 * 0.5 W/(m*K) / 0.025 m = 2000 W/(m^2*K) (hand).
  EXPECT_NEAR(HFromNu(100, 0.5, 0.025, sink), 2000.0, 1e-9);
  // 4 * 1 kg/s / (pi * 0.1 m * 1e-3 Pa*s) = 40000/pi (hand).
  EXPECT_NEAR(ReynoldsTube(1, 0.1, 1e-3, sink), 40000 / std::numbers::pi, 1e-9);
  EXPECT_TRUE(sink.errors.empty());
  EXPECT_TRUE(sink.warnings.empty());
}

// reynolds_tube is reynolds with V from continuity, whatever the density.
TEST(GroupsTest, TubeReynoldsMatchesContinuity) {
  RecordingSink sink;
  for (double rho : {1.2, 850.0, 13534.0}) {
    const double mdot = 0.35, d = 0.0157, mu = 5.5e-4;
    const double v = mdot / (rho * std::numbers::pi * d * d / 4);
    EXPECT_NEAR(ReynoldsTube(mdot, d, mu, sink) / Reynolds(rho, v, d, mu, sink), 1.0, 1e-14);
  }
}

// The hydraulic diameter is 4A/P with P = pi*(D_core + D_shell), and a zero
// core leaves a plain tube (geometry, hand-derived).
TEST(GroupsTest, AnnulusGeometry) {
  RecordingSink sink;
  for (auto [dc, ds] : {std::pair{0.0254, 0.0525}, std::pair{0.1, 0.1001}, std::pair{0.0, 0.3}}) {
    const double a = AreaAnnulus(dc, ds, sink);
    EXPECT_NEAR(4 * a / (std::numbers::pi * (dc + ds)) / DhAnnulus(dc, ds, sink), 1.0, 1e-14);
  }
  EXPECT_DOUBLE_EQ(AreaAnnulus(0, 0.3, sink), std::numbers::pi * 0.09 / 4);
  EXPECT_DOUBLE_EQ(DhAnnulus(0, 0.3, sink), 0.3);
  // A 1e-9 m gap at D = 0.1 m: pi * 1e-9 * (0.2 + 1e-9) / 4, which a
  // difference of squares would get wrong in the seventh digit.
  const double dc = 0.1, ds = 0.1 + 1e-9;
  const long double exact = std::numbers::pi_v<long double> * (static_cast<long double>(ds) - dc) *
                            (static_cast<long double>(ds) + dc) / 4;
  EXPECT_NEAR(AreaAnnulus(dc, ds, sink) / static_cast<double>(exact), 1.0, 1e-14);
  EXPECT_TRUE(sink.errors.empty());
}

TEST(GroupsTest, MeaninglessInputIsAnError) {
  struct Case {
    const char* name;
    std::vector<double> args;
  };
  const Case cases[] = {
      {"reynolds", {0, 1, 0.02, 1e-3}},    {"reynolds", {1000, -1, 0.02, 1e-3}},
      {"reynolds", {1000, 1, 0, 1e-3}},    {"reynolds", {1000, 1, 0.02, 0}},
      {"reynolds", {kNaN, 1, 0.02, 1e-3}}, {"reynolds_tube", {-0.1, 0.02, 1e-3}},
      {"reynolds_tube", {0.1, 0, 1e-3}},   {"reynolds_tube", {0.1, 0.02, -1e-3}},
      {"prandtl", {0, 1e-3, 0.6}},         {"prandtl", {4180, 1e-3, 0}},
      {"h_from_nu", {-1, 0.6, 0.02}},      {"h_from_nu", {10, 0.6, 0}},
      {"dh_annulus", {0.05, 0.05}},        {"dh_annulus", {0.06, 0.05}},
      {"dh_annulus", {-0.01, 0.05}},       {"area_annulus", {0.05, 0.04}},
  };
  for (const auto& c : cases) {
    SCOPED_TRACE(c.name);
    RecordingSink sink;
    EXPECT_TRUE(std::isnan(Call(*FindFunction(c.name), c.args, sink)));
    ASSERT_EQ(sink.errors.size(), 1u);
    EXPECT_EQ(sink.errors[0].rfind(std::string(c.name) + ":", 0), 0u) << sink.errors[0];
  }
  RecordingSink sink;
  DhAnnulus(0.06, 0.05, sink);
  EXPECT_NE(sink.errors[0].find("D_core = 0.06 m, D_shell = 0.05 m"), std::string::npos)
      << sink.errors[0];
}

}  // namespace
}  // namespace heatdeck::library
