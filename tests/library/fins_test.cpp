// Family 'fins': fin parameter and fin efficiencies.
#include "library/fins.h"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <set>
#include <string>
#include <vector>

#include "library/reference_rows.h"
#include "library/registry.h"
#include "library/spreadsheet_eval.h"

namespace heatdeck::library {
namespace {

namespace dim = units::dim;
using testing::RowTally;

TEST(FinsTest, ReferenceRows) {
  const RowTally checks = testing::RunCheckRows("fins");
  EXPECT_EQ(checks.failed, 0);
  EXPECT_EQ(checks.functions_run,
            (std::set<std::string>{"fin_m", "fin_m_thin", "fin_eff_adiabatic", "fin_eff_rect",
                                   "fin_eff_pin", "fin_eff_annular", "fin_eff_array"}));
  EXPECT_EQ(testing::RunErrorRows("fins").failed, 0);
  const RowTally sheet = testing::RunSpreadsheetRows("fins");
  EXPECT_EQ(sheet.failed, 0);
  EXPECT_EQ(sheet.run, checks.run);
}

TEST(FinsTest, Signatures) {
  const units::Dimension h = dim::kHeatTransferCoeff, k = dim::kConductivity, l = dim::kLength;
  struct Expected {
    const char* name;
    std::vector<units::Dimension> args;
    units::Dimension result;
  };
  const Expected expected[] = {
      {"fin_m", {h, l, k, dim::kArea}, dim::kPerLength},
      {"fin_m_thin", {h, k, l}, dim::kPerLength},
      {"fin_eff_adiabatic", {dim::kPerLength, l}, dim::kOne},
      {"fin_eff_rect", {h, k, l, l}, dim::kOne},
      {"fin_eff_pin", {h, k, l, l}, dim::kOne},
      {"fin_eff_annular", {h, k, l, l, l}, dim::kOne},
      {"fin_eff_array", {dim::kOne, dim::kArea, dim::kArea}, dim::kOne},
  };
  for (const auto& e : expected) {
    SCOPED_TRACE(e.name);
    const FunctionInfo* f = FindFunction(e.name);
    ASSERT_NE(f, nullptr);
    EXPECT_STREQ(f->family, "fins");
    ASSERT_EQ(f->args.size(), e.args.size());
    for (size_t i = 0; i < e.args.size(); ++i) EXPECT_TRUE(f->args[i].dim == e.args[i]) << i;
    EXPECT_TRUE(f->result == e.result);
    EXPECT_NE(f->spreadsheet, nullptr);
  }
  // m^2 = h*P/(k*A_c) is 1/m^2.
  EXPECT_TRUE(h * l / (k * dim::kArea) == dim::kPerLength.Pow(2));
}

// fin_m_thin is fin_m of a plate of width w with P = 2w, A_c = w*t.
TEST(FinsTest, ThinFinParameterIsThePlateLimit) {
  RecordingSink sink;
  for (double w : {0.05, 1.0, 3.0}) {
    EXPECT_NEAR(FinM(55, 2 * w, 205, w * 2e-4, sink) / FinMThin(55, 205, 2e-4, sink), 1.0, 1e-15);
  }
  // Hand: 2*50/(200*0.001) = 500, sqrt(500) = 22.360679774997898.
  EXPECT_NEAR(FinMThin(50, 200, 0.001, sink), 22.360679774997898, 1e-13);
}

// tanh(x)/x -> 1 - x^2/3 as x -> 0 and -> 1/x for large x (tanh(50) = 1 in
// double); no 0/0 at m = 0.
TEST(FinsTest, AdiabaticLimits) {
  RecordingSink sink;
  EXPECT_EQ(FinEffAdiabatic(0, 0.05, sink), 1.0);
  EXPECT_NEAR(FinEffAdiabatic(1e-4, 0.1, sink), 1 - 1e-10 / 3, 1e-16);
  EXPECT_NEAR(FinEffAdiabatic(500, 0.1, sink), 0.02, 1e-17);
  // Across the switch to the series at m*L = 1e-4, compared with long double.
  for (double x : {0.99999e-4, 1e-4, 1.00001e-4, 3e-4}) {
    const long double exact = std::tanh(static_cast<long double>(x)) / x;
    EXPECT_NEAR(FinEffAdiabatic(x, 1.0, sink), static_cast<double>(exact), 2e-16) << x;
  }
  EXPECT_TRUE(sink.errors.empty());
}

// The corrected-length fins are the adiabatic fin on L_c, with m from
// fin_m_thin (rectangular) or from fin_m with P = pi*D, A_c = pi*D^2/4 (pin).
TEST(FinsTest, CorrectedLengthFins) {
  RecordingSink sink;
  const double h = 80, k = 180, t = 0.0015, l = 0.03;
  EXPECT_NEAR(FinEffRect(h, k, t, l, sink),
              FinEffAdiabatic(FinMThin(h, k, t, sink), l + t / 2, sink), 1e-15);
  const double d = 0.004, pi = std::numbers::pi;
  EXPECT_NEAR(FinEffPin(h, k, d, l, sink),
              FinEffAdiabatic(FinM(h, pi * d, k, pi * d * d / 4, sink), l + d / 4, sink), 1e-15);
  EXPECT_EQ(FinEffRect(0, k, t, l, sink), 1.0);
  EXPECT_EQ(FinEffPin(0, k, d, l, sink), 1.0);
  EXPECT_NEAR(FinEffRect(1e-12, k, t, l, sink), 1.0, 1e-14);
  EXPECT_TRUE(sink.errors.empty());
}

// As r_2/r_1 -> 1 with the fin length fixed, the annular fin becomes a
// straight fin.  mpmath (50 digits, Bessel I/K) gives a relative gap of
// -6.6e-4*(1 m/r_1) for this fin; the values at r_1 = 1e4 m exercise the
// large-argument branch (m*r_1 = 5e5).
TEST(FinsTest, AnnularTendsToStraightFin) {
  RecordingSink sink;
  const double h = 50, k = 200, t = 0.001, l = 0.02;
  const double rect = FinEffRect(h, k, t, l, sink);
  double previous_gap = 1;
  for (double r_1 : {1.0, 10.0, 100.0, 1e4}) {
    const double gap = (rect - FinEffAnnular(h, k, t, r_1, r_1 + l, sink)) / rect;
    EXPECT_GT(gap, 0) << r_1;
    EXPECT_LT(gap, 1e-3 / r_1) << r_1;
    EXPECT_LT(gap, previous_gap / 9) << r_1;
    previous_gap = gap;
  }
  // mpmath 1.2.1, 50 digits: 0.93538386808784501.
  EXPECT_NEAR(FinEffAnnular(h, k, t, 1e4, 1e4 + l, sink), 0.93538386808784501, 1e-11);
  EXPECT_TRUE(sink.errors.empty());
}

TEST(FinsTest, AnnularSmallAndZeroFinParameter) {
  RecordingSink sink;
  EXPECT_EQ(FinEffAnnular(0, 200, 0.001, 0.0125, 0.025, sink), 1.0);
  EXPECT_NEAR(FinEffAnnular(1e-9, 200, 0.001, 0.0125, 0.025, sink), 1.0, 1e-11);
  EXPECT_NEAR(FinEffAnnular(1e-300, 200, 0.001, 0.0125, 0.025, sink), 1.0, 1e-15);
  EXPECT_TRUE(sink.errors.empty());
}

// Fins whose Bessel arguments straddle and pass the switch to Hankel's
// expansion at 500 and the overflow of I (about 713).  Expected values:
// mpmath 1.2.1 besseli/besselk at 50 digits, same closed form.
TEST(FinsTest, AnnularLargeBesselArguments) {
  struct Case {
    double h, k, t, r_1, r_2, expected;  // m*r_1, m*r_2c in the comment
  };
  const Case cases[] = {
      {5000, 20, 0.0005, 0.05, 0.0555, 0.16608988938706125},     // 50, 55.75
      {20000, 15, 0.0002, 0.06, 0.09, 0.007290437218272124},     // 219, 329
      {20000, 10, 0.0002, 0.1, 0.1116, 0.018075623730334703},    // 447, 499.5
      {20000, 10, 0.0002, 0.1, 0.1118, 0.017755057943706107},    // 447, 500.4
      {20000, 10, 0.0002, 0.135, 0.156, 0.0098374713209685652},  // 604, 698
      {20000, 10, 0.0002, 0.18, 0.2, 0.010542974640215823},      // 805, 895
  };
  for (const auto& c : cases) {
    RecordingSink sink;
    EXPECT_NEAR(FinEffAnnular(c.h, c.k, c.t, c.r_1, c.r_2, sink) / c.expected, 1.0, 1e-12)
        << c.r_1 << " " << c.r_2;
    EXPECT_TRUE(sink.errors.empty());
  }
}

TEST(FinsTest, ArrayEfficiency) {
  RecordingSink sink;
  EXPECT_EQ(FinEffArray(0.7, 0, 5, sink), 1.0);                      // no fins
  EXPECT_NEAR(FinEffArray(0.7, 5, 5, sink), 0.7, 1e-15);             // all fin
  EXPECT_NEAR(FinEffArray(0.6, 9, 10, sink), 1 - 0.9 * 0.4, 1e-15);  // hand: 0.64
  EXPECT_TRUE(sink.errors.empty());
}

// The spreadsheet forms take the h = 0 branch instead of dividing by zero.
TEST(FinsTest, SpreadsheetZeroFinParameter) {
  for (const char* name : {"fin_eff_rect", "fin_eff_pin", "fin_eff_annular", "fin_eff_adiabatic"}) {
    const FunctionInfo* f = FindFunction(name);
    std::vector<double> args(f->args.size(), 0.01);
    args[0] = 0;
    if (f->args.size() == 5) args[4] = 0.02;  // r_2 > r_1
    double value = 0;
    std::string error;
    ASSERT_TRUE(testing::SpreadsheetEval::Evaluate(f->spreadsheet, args, &value, &error)) << error;
    EXPECT_EQ(value, 1.0) << name;
  }
}

TEST(FinsTest, MeaninglessInputIsAnError) {
  struct Case {
    const char* name;
    std::vector<double> args;
  };
  const Case cases[] = {
      {"fin_m", {-1, 0.1, 200, 1e-4}},
      {"fin_m", {25, 0, 200, 1e-4}},
      {"fin_m", {25, 0.1, 0, 1e-4}},
      {"fin_m", {25, 0.1, 200, 0}},
      {"fin_m_thin", {25, 200, 0}},
      {"fin_m_thin", {-25, 200, 0.001}},
      {"fin_eff_adiabatic", {-1, 0.05}},
      {"fin_eff_adiabatic", {10, 0}},
      {"fin_eff_rect", {25, 200, 0, 0.02}},
      {"fin_eff_rect", {25, 200, 0.002, -0.02}},
      {"fin_eff_rect", {25, 0, 0.002, 0.02}},
      {"fin_eff_pin", {25, 200, 0, 0.05}},
      {"fin_eff_pin", {25, 200, 0.005, 0}},
      {"fin_eff_annular", {50, 200, 0.001, 0.025, 0.025}},
      {"fin_eff_annular", {50, 200, 0.001, 0.025, 0.0125}},
      {"fin_eff_annular", {50, 200, 0.001, 0, 0.025}},
      {"fin_eff_annular", {50, 200, 0, 0.0125, 0.025}},
      {"fin_eff_annular", {-50, 200, 0.001, 0.0125, 0.025}},
      {"fin_eff_array", {1.1, 1, 2}},
      {"fin_eff_array", {0.8, 3, 2}},
      {"fin_eff_array", {0.8, -1, 2}},
      {"fin_eff_array", {0.8, 0, 0}},
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
