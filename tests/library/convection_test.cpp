// Family 'convection': Nusselt correlations and the Petukhov friction factor.
#include "library/convection.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <numbers>
#include <set>
#include <string>
#include <vector>

#include "library/reference_rows.h"
#include "library/registry.h"

namespace heatdeck::library {
namespace {

namespace dim = units::dim;
using testing::RowTally;

bool Contains(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

TEST(ConvectionTest, ReferenceRows) {
  const RowTally checks = testing::RunCheckRows("convection");
  EXPECT_EQ(checks.failed, 0);
  EXPECT_EQ(
      checks.functions_run,
      (std::set<std::string>{"nu_dittus_boelter", "nu_sieder_tate", "f_petukhov", "nu_gnielinski",
                             "nu_gnielinski_f", "nu_hausen", "nu_tube", "nu_churchill_bernstein",
                             "nu_churchill_chu_plate", "nu_churchill_chu_cyl"}));
  const RowTally errors = testing::RunErrorRows("convection");
  EXPECT_EQ(errors.failed, 0);
  EXPECT_GT(errors.run, 0);
  const RowTally sheet = testing::RunSpreadsheetRows("convection");
  EXPECT_EQ(sheet.failed, 0);
  EXPECT_EQ(sheet.run, checks.run);
}

TEST(ConvectionTest, Signatures) {
  const units::Dimension one = dim::kOne, l = dim::kLength, mu = dim::kViscosity;
  struct Expected {
    const char* name;
    std::vector<units::Dimension> args;
  };
  const Expected expected[] = {
      {"nu_dittus_boelter", {one, one, one}},
      {"nu_sieder_tate", {one, one, mu, mu}},
      {"f_petukhov", {one}},
      {"nu_gnielinski", {one, one}},
      {"nu_gnielinski_f", {one, one, one}},
      {"nu_hausen", {one, one, l, l}},
      {"nu_tube", {one, one, l, l}},
      {"nu_churchill_bernstein", {one, one}},
      {"nu_churchill_chu_plate", {one, one}},
      {"nu_churchill_chu_cyl", {one, one}},
  };
  for (const auto& e : expected) {
    SCOPED_TRACE(e.name);
    const FunctionInfo* f = FindFunction(e.name);
    ASSERT_NE(f, nullptr);
    EXPECT_STREQ(f->family, "convection");
    ASSERT_EQ(f->args.size(), e.args.size());
    for (size_t i = 0; i < e.args.size(); ++i) EXPECT_TRUE(f->args[i].dim == e.args[i]) << i;
    EXPECT_TRUE(f->result == one);
    EXPECT_NE(f->spreadsheet, nullptr);
  }
}

TEST(ConvectionTest, HandValues) {
  RecordingSink sink;
  // 1e5^0.8 = 1e4 exactly, Pr = 1: 0.023e4 = 230 and 0.027e4 = 270.
  EXPECT_NEAR(NuDittusBoelter(1e5, 1, 0.4, sink), 230, 1e-10);
  EXPECT_NEAR(NuSiederTate(1e5, 1, 1e-3, 1e-3, sink), 270, 1e-10);
  // Viscosity ratio 2^0.14 multiplies Sieder-Tate.
  EXPECT_NEAR(NuSiederTate(1e5, 1, 2e-3, 1e-3, sink), 270 * std::pow(2.0, 0.14), 1e-10);
  // Re = e^10: bracket 0.79*10 - 1.64 = 6.26, f = 1/39.1876; with Pr = 1 the
  // Gnielinski denominator is 1, Nu = (f/8)(e^10 - 1000) = 67.069895179874235
  // (mpmath 50 digits of the same hand expression).
  const double re = std::exp(10.0);
  EXPECT_NEAR(FPetukhov(re, sink), 1 / 39.1876, 1e-16);
  EXPECT_NEAR(NuGnielinski(re, 1, sink), 67.069895179874235, 1e-11);
  // Hausen: Gz = (0.1/1)*1000*10 = 1000, Gz^(2/3) = 100:
  // 3.66 + 66.8/5 = 17.02; Gz = 0 leaves the fully developed 3.66.
  EXPECT_NEAR(NuHausen(1000, 10, 0.1, 1, sink), 17.02, 1e-12);
  EXPECT_NEAR(NuHausen(0, 10, 0.1, 1, sink), 3.66, 1e-15);
  // Churchill-Bernstein at Re = 282000, Pr = 0.4, where both brackets are 2:
  // 0.3 + 0.62 sqrt(282000) 0.4^(1/3) 2^(0.8 - 0.25) = 355.46983352311899
  // (mpmath 50 digits of that reduced form).
  EXPECT_NEAR(NuChurchillBernstein(282000, 0.4, sink), 355.46983352311899, 1e-10);
  // Churchill-Chu at Ra = 0 leaves the squared constant: 0.825^2, 0.6^2.
  EXPECT_NEAR(NuChurchillChuPlate(0, 0.7, sink), 0.680625, 1e-15);
  EXPECT_NEAR(NuChurchillChuCyl(0, 0.7, sink), 0.36, 1e-15);
  EXPECT_TRUE(sink.errors.empty());
  EXPECT_TRUE(sink.warnings.empty());
}

// nu_gnielinski is nu_gnielinski_f with the Petukhov factor.
TEST(ConvectionTest, GnielinskiWithPetukhovFactor) {
  RecordingSink sink;
  for (double re : {4000.0, 2.3e4, 1e6}) {
    for (double pr : {0.7, 5.0, 600.0}) {
      EXPECT_NEAR(NuGnielinski(re, pr, sink) / NuGnielinskiF(re, pr, FPetukhov(re, sink), sink),
                  1.0, 1e-15);
    }
  }
  EXPECT_TRUE(sink.warnings.empty());
}

TEST(ConvectionTest, TubeRegimesAndNotes) {
  const double pr = 5, d = 0.01, l = 1;
  {
    RecordingSink sink;
    RecordingSink ref;
    EXPECT_EQ(NuTube(1000, pr, d, l, sink), NuHausen(1000, pr, d, l, ref));
    EXPECT_EQ(sink.notes, std::vector<std::string>{"laminar (Hausen)"});
    EXPECT_TRUE(sink.warnings.empty());
  }
  {
    RecordingSink sink;
    RecordingSink ref;
    EXPECT_EQ(NuTube(5e4, pr, d, l, sink), NuGnielinski(5e4, pr, ref));
    EXPECT_EQ(sink.notes, std::vector<std::string>{"turbulent (Gnielinski)"});
    EXPECT_TRUE(sink.warnings.empty());
  }
  {
    // Halfway (Re = 6150, gamma = 1/2): the mean of the two end values.
    RecordingSink sink;
    RecordingSink ref;  // NuHausen warns at 2300, which is its limit
    const double mean = (NuHausen(2300, pr, d, l, ref) + NuGnielinski(1e4, pr, ref)) / 2;
    EXPECT_NEAR(NuTube(6150, pr, d, l, sink), mean, 1e-13 * mean);
    ASSERT_EQ(sink.notes.size(), 1u);
    EXPECT_TRUE(Contains(sink.notes[0], "transition")) << sink.notes[0];
    EXPECT_TRUE(sink.warnings.empty());
  }
}

// Continuous where the regime changes: the value just below each limit
// approaches the value at it.
TEST(ConvectionTest, TubeIsContinuousAtRegimeLimits) {
  for (double pr : {0.7, 5.0, 150.0}) {
    for (double limit : {2300.0, 10000.0}) {
      RecordingSink sink;
      const double below = NuTube(std::nextafter(limit, 0.0), pr, 0.02, 2.0, sink);
      const double at = NuTube(limit, pr, 0.02, 2.0, sink);
      EXPECT_NEAR(below / at, 1.0, 1e-12) << "Pr " << pr << " Re " << limit;
    }
  }
}

TEST(ConvectionTest, TubeWarnings) {
  {
    RecordingSink sink;
    NuTube(5e4, 3000, 0.02, 2, sink);
    ASSERT_EQ(sink.warnings.size(), 1u);
    EXPECT_TRUE(Contains(sink.warnings[0], "Pr = 3000")) << sink.warnings[0];
    EXPECT_TRUE(Contains(sink.warnings[0], "0.5 <= Pr <= 2000")) << sink.warnings[0];
    EXPECT_TRUE(Contains(sink.warnings[0], "Gnielinski 1976")) << sink.warnings[0];
  }
  {
    RecordingSink sink;  // laminar: Hausen has no Pr limit
    NuTube(500, 3000, 0.02, 2, sink);
    EXPECT_TRUE(sink.warnings.empty());
  }
  {
    RecordingSink sink;
    NuTube(6e6, 1, 0.02, 2, sink);
    EXPECT_EQ(sink.warnings.size(), 1u);
  }
}

// Each warning names the range, the value and the source.
TEST(ConvectionTest, WarningTexts) {
  struct Case {
    const char* name;
    std::vector<double> args;
    std::vector<std::string> parts;
  };
  const Case cases[] = {
      {"nu_dittus_boelter",
       {3000, 5, 0.4},
       {"Re = 3000", "Re >= 10000", "Dittus & Boelter 1930", "Incropera"}},
      {"nu_dittus_boelter", {2e4, 200, 0.3}, {"Pr = 200", "0.6 <= Pr <= 160"}},
      {"nu_dittus_boelter", {2e4, 5, 0.35}, {"n = 0.35", "0.4", "0.3"}},
      {"nu_sieder_tate", {5000, 5, 1e-3, 5e-4}, {"Re = 5000", "Re >= 10000", "Sieder & Tate 1936"}},
      {"nu_sieder_tate", {2e4, 0.5, 1e-3, 5e-4}, {"Pr = 0.5", "0.7 <= Pr <= 16700"}},
      {"f_petukhov", {2000}, {"Re = 2000", "3000 <= Re <= 5e6", "Petukhov 1970"}},
      {"f_petukhov", {1e7}, {"Re = 1e+07", "3000 <= Re <= 5e6"}},
      {"nu_gnielinski", {2000, 5}, {"Re = 2000", "3000 <= Re <= 5e6", "Gnielinski 1976"}},
      {"nu_gnielinski", {1e4, 0.3}, {"Pr = 0.3", "0.5 <= Pr <= 2000"}},
      {"nu_gnielinski_f", {2500, 5, 0.05}, {"Re = 2500", "Gnielinski 1976"}},
      {"nu_hausen", {3000, 5, 0.02, 1}, {"Re = 3000", "Re < 2300", "Hausen 1943"}},
      {"nu_churchill_bernstein",
       {0.1, 0.7},
       {"0.07", "Re*Pr >= 0.2", "Churchill & Bernstein 1977"}},
      {"nu_churchill_chu_cyl", {1e13, 0.7}, {"Ra = 1e+13", "Ra <= 1e12", "Churchill & Chu 1975"}},
  };
  for (const auto& c : cases) {
    SCOPED_TRACE(c.name);
    RecordingSink sink;
    EXPECT_TRUE(std::isfinite(Call(*FindFunction(c.name), c.args, sink)));
    EXPECT_TRUE(sink.errors.empty());
    ASSERT_EQ(sink.warnings.size(), 1u);
    for (const auto& part : c.parts) {
      EXPECT_TRUE(Contains(sink.warnings[0], part)) << sink.warnings[0] << " lacks " << part;
    }
  }
}

TEST(ConvectionTest, InRangeCallsDoNotWarn) {
  RecordingSink sink;
  NuDittusBoelter(1e4, 160, 0.3, sink);
  NuSiederTate(1e4, 16700, 1e-3, 1e-3, sink);
  FPetukhov(5e6, sink);
  NuGnielinski(5e6, 0.5, sink);
  NuHausen(2299, 1000, 0.01, 1, sink);
  NuChurchillBernstein(1e7, 0.7, sink);
  NuChurchillChuPlate(1e15, 0.7, sink);  // all Ra
  NuChurchillChuCyl(1e12, 0.7, sink);
  EXPECT_TRUE(sink.warnings.empty()) << sink.warnings[0];
  EXPECT_TRUE(sink.errors.empty());
}

TEST(ConvectionTest, MeaninglessInputIsAnError) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  struct Case {
    const char* name;
    std::vector<double> args;
  };
  const Case cases[] = {
      {"nu_dittus_boelter", {0, 5, 0.4}},
      {"nu_dittus_boelter", {1e4, -5, 0.4}},
      {"nu_dittus_boelter", {1e4, 5, nan}},
      {"nu_sieder_tate", {1e4, 5, 0, 1e-3}},
      {"nu_sieder_tate", {1e4, 5, 1e-3, 0}},
      {"f_petukhov", {0}},
      {"f_petukhov", {7.9}},  // 0.79 ln(7.9) - 1.64 < 0
      {"nu_gnielinski", {1000, 5}},
      {"nu_gnielinski", {1e4, 0}},
      {"nu_gnielinski", {1100, 1e-4}},  // denominator 1 - 12.7 sqrt(f/8) < 0
      {"nu_gnielinski_f", {1e4, 5, 0}},
      {"nu_hausen", {-1, 5, 0.02, 1}},
      {"nu_hausen", {1000, 5, 0, 1}},
      {"nu_hausen", {1000, 5, 0.02, 0}},
      {"nu_tube", {-1, 5, 0.02, 1}},
      {"nu_tube", {1e4, 0, 0.02, 1}},
      {"nu_tube", {1e4, 5, 0.02, -1}},
      {"nu_churchill_bernstein", {0, 0.7}},
      {"nu_churchill_chu_plate", {-1, 0.7}},
      {"nu_churchill_chu_cyl", {1e5, 0}},
  };
  for (const auto& c : cases) {
    SCOPED_TRACE(c.name);
    RecordingSink sink;
    EXPECT_TRUE(std::isnan(Call(*FindFunction(c.name), c.args, sink)));
    ASSERT_EQ(sink.errors.size(), 1u);
    EXPECT_EQ(sink.errors[0].rfind(std::string(c.name) + ":", 0), 0u) << sink.errors[0];
    EXPECT_TRUE(sink.notes.empty());
  }
}

}  // namespace
}  // namespace heatdeck::library
