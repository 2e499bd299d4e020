// Family 'resistance': conduction, film and fouling resistances, radiation.
#include "library/resistance.h"

#include <gtest/gtest.h>

#include <cmath>
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

constexpr double kPi = std::numbers::pi;

TEST(ResistanceTest, ReferenceRows) {
  const RowTally checks = testing::RunCheckRows("resistance");
  EXPECT_EQ(checks.failed, 0);
  EXPECT_EQ(checks.functions_run, (std::set<std::string>{"res_plane", "res_cyl", "res_sphere",
                                                         "res_film", "res_fouling", "h_rad"}));
  const RowTally errors = testing::RunErrorRows("resistance");
  EXPECT_EQ(errors.failed, 0);
  EXPECT_GT(errors.run, 0);
  const RowTally sheet = testing::RunSpreadsheetRows("resistance");
  EXPECT_EQ(sheet.failed, 0);
  EXPECT_EQ(sheet.run, checks.run);
}

TEST(ResistanceTest, Signatures) {
  struct Expected {
    const char* name;
    std::vector<units::Dimension> args;
    units::Dimension result;
  };
  const Expected expected[] = {
      {"res_plane", {dim::kLength, dim::kConductivity, dim::kArea}, dim::kThermalResistance},
      {"res_cyl",
       {dim::kLength, dim::kLength, dim::kConductivity, dim::kLength},
       dim::kThermalResistance},
      {"res_sphere", {dim::kLength, dim::kLength, dim::kConductivity}, dim::kThermalResistance},
      {"res_film", {dim::kHeatTransferCoeff, dim::kArea}, dim::kThermalResistance},
      {"res_fouling", {dim::kFoulingResistance, dim::kArea}, dim::kThermalResistance},
      {"h_rad", {dim::kOne, dim::kTemperature, dim::kTemperature}, dim::kHeatTransferCoeff},
  };
  for (const auto& e : expected) {
    SCOPED_TRACE(e.name);
    const FunctionInfo* f = FindFunction(e.name);
    ASSERT_NE(f, nullptr);
    EXPECT_STREQ(f->family, "resistance");
    ASSERT_EQ(f->args.size(), e.args.size());
    for (size_t i = 0; i < e.args.size(); ++i) EXPECT_TRUE(f->args[i].dim == e.args[i]) << i;
    EXPECT_TRUE(f->result == e.result);
    EXPECT_NE(f->spreadsheet, nullptr);
  }
  // h_rad takes absolute temperatures; nothing else here has a kind.
  const FunctionInfo* h = FindFunction("h_rad");
  EXPECT_EQ(h->args[0].kind, units::TempKind::kNone);
  EXPECT_EQ(h->args[1].kind, units::TempKind::kAbsolute);
  EXPECT_EQ(h->args[2].kind, units::TempKind::kAbsolute);
  EXPECT_EQ(FindFunction("res_cyl")->args[0].kind, units::TempKind::kNone);
  // The results follow from the formulas' dimensions.
  EXPECT_TRUE(dim::kLength / (dim::kConductivity * dim::kArea) == dim::kThermalResistance);
  EXPECT_TRUE(dim::kFoulingResistance / dim::kArea == dim::kThermalResistance);
}

TEST(ResistanceTest, HandValues) {
  RecordingSink sink;
  // 0.01 m / (0.5 W/(m*K) * 2 m^2) = 0.01 K/W.
  EXPECT_NEAR(ResPlane(0.01, 0.5, 2, sink), 0.01, 1e-17);
  // 1/(100 W/(m^2*K) * 2 m^2) = 0.005 K/W.
  EXPECT_NEAR(ResFilm(100, 2, sink), 0.005, 1e-17);
  // ln(e) = 1: D_out = e*D_in gives 1/(2*pi*k*L).
  EXPECT_NEAR(ResCyl(0.02, 0.02 * std::numbers::e, 1, 1, sink), 1 / (2 * kPi), 1e-15);
  // r_in = 0.5 m, r_out = 1 m: (2 - 1)/(4*pi*1) = 1/(4 pi).
  EXPECT_NEAR(ResSphere(1, 2, 1, sink), 1 / (4 * kPi), 1e-15);
  EXPECT_EQ(ResFouling(0, 3, sink), 0.0);
  EXPECT_TRUE(sink.errors.empty());
}

// A cylinder wall thin against its diameter is a plane wall of the mean
// area (hand): with y = t/D_m, D_m = D_i + t, D_o/D_i = (1 + y)/(1 - y), so
// ln(D_o/D_i) = 2 artanh(y) = 2y (1 + y^2/3 + ...) and R = t/(k*pi*D_m*L)
// to (t/D)^2.  At t/D = 1e-8 a naive log(D_o/D_i) can be off by 5e-9
// relative (the quotient's rounding, 1.1e-16, over ln = 2e-8); log1p is not.
TEST(ResistanceTest, ThinCylinderIsAPlaneWall) {
  RecordingSink sink;
  const double d_in = 1.0, d_out = 1.0 + 2e-8, k = 16, l = 3;
  const double t = (d_out - d_in) / 2;  // exact: the thickness actually passed
  const double plane = ResPlane(t, k, kPi * (d_in + t) * l, sink);
  EXPECT_NEAR(ResCyl(d_in, d_out, k, l, sink) / plane, 1.0, 1e-12);
}

// A spherical shell is exactly a plane wall of the geometric-mean area
// pi*D_in*D_out: (2/D_i - 2/D_o)/(4 pi k) = t/(k pi D_i D_o), t = (D_o-D_i)/2.
TEST(ResistanceTest, SphereIsAPlaneWallOfGeometricMeanArea) {
  RecordingSink sink;
  for (auto [di, d_o] : {std::pair{0.1, 0.2}, std::pair{1.0, 1.0 + 1e-7}}) {
    const double plane = ResPlane((d_o - di) / 2, 0.05, kPi * di * d_o, sink);
    EXPECT_NEAR(ResSphere(di, d_o, 0.05, sink) / plane, 1.0, 1e-14);
  }
}

// h_rad*(T_s - T_sur) is the net grey-body exchange eps*sigma*(T_s^4 -
// T_sur^4): at 500 K / 300 K, sigma*(500^4 - 300^4) = 3084.683683936 W/m^2
// (hand: 5.670374419e-8 * 5.44e10); at equal temperatures the limit is
// 4*sigma*T^3 = 6.12400437252 W/(m^2*K) at 300 K (hand).
TEST(ResistanceTest, RadiationCoefficient) {
  RecordingSink sink;
  EXPECT_NEAR(HRad(0.7, 500, 300, sink) * 200, 0.7 * 3084.683683936, 1e-9);
  EXPECT_NEAR(HRad(1.0, 300, 300, sink), 6.12400437252, 1e-10);
  EXPECT_EQ(HRad(0.0, 500, 300, sink), 0.0);
  // Symmetric in the two temperatures.
  EXPECT_EQ(HRad(0.9, 400, 350, sink), HRad(0.9, 350, 400, sink));
  EXPECT_TRUE(sink.errors.empty());
}

TEST(ResistanceTest, MeaninglessInputIsAnError) {
  struct Case {
    const char* name;
    std::vector<double> args;
  };
  const Case cases[] = {
      {"res_plane", {0, 1, 1}},         {"res_plane", {0.01, -1, 1}},
      {"res_plane", {0.01, 1, 0}},      {"res_cyl", {0.02, 0.02, 16, 1}},
      {"res_cyl", {0.02, 0.025, 0, 1}}, {"res_cyl", {0.02, 0.025, 16, 0}},
      {"res_sphere", {0.2, 0.1, 1}},    {"res_sphere", {0, 0.1, 1}},
      {"res_sphere", {0.1, 0.2, -2}},   {"res_film", {0, 1}},
      {"res_film", {10, -1}},           {"res_fouling", {-1e-4, 1}},
      {"res_fouling", {1e-4, 0}},       {"h_rad", {1.2, 400, 300}},
      {"h_rad", {-0.1, 400, 300}},      {"h_rad", {0.8, -1, 300}},
      {"h_rad", {0.8, 400, -300}},
  };
  for (const auto& c : cases) {
    SCOPED_TRACE(c.name);
    RecordingSink sink;
    EXPECT_TRUE(std::isnan(Call(*FindFunction(c.name), c.args, sink)));
    ASSERT_EQ(sink.errors.size(), 1u);
    EXPECT_EQ(sink.errors[0].rfind(std::string(c.name) + ":", 0), 0u) << sink.errors[0];
  }
  RecordingSink sink;
  ResCyl(0.05, 0.04, 50, 1, sink);
  ASSERT_EQ(sink.errors.size(), 1u);
  EXPECT_NE(sink.errors[0].find("D_in = 0.05 m, D_out = 0.04 m"), std::string::npos)
      << sink.errors[0];
  EXPECT_NE(sink.errors[0].find("D_out > D_in > 0"), std::string::npos) << sink.errors[0];
}

}  // namespace
}  // namespace heatdeck::library
