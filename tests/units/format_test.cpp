#include <cmath>
#include <cstdlib>
#include <limits>
#include <string>

#include <gtest/gtest.h>

#include "units/unit.h"

namespace heatdeck::units {
namespace {

// Expected texts are hand-rounded decimal values.
TEST(FormatSigTest, PlainFormInsideRange) {
  EXPECT_EQ(FormatSig(25.357961, 4), "25.36");
  EXPECT_EQ(FormatSig(0.20173, 4), "0.2017");
  EXPECT_EQ(FormatSig(948.479, 4), "948.5");
  EXPECT_EQ(FormatSig(-3.14159, 3), "-3.14");
  EXPECT_EQ(FormatSig(1.0, 4), "1.000");
  EXPECT_EQ(FormatSig(99.96, 4), "99.96");
  EXPECT_EQ(FormatSig(99.96, 3), "100");
  EXPECT_EQ(FormatSig(123.456, 2), "120");
  EXPECT_EQ(FormatSig(0.5, 1), "0.5");
}

TEST(FormatSigTest, IntegerPartPrintedInFull) {
  EXPECT_EQ(FormatSig(1234567, 4), "1235000");
  EXPECT_EQ(FormatSig(9999999, 7), "9999999");
  EXPECT_EQ(FormatSig(-250000, 3), "-250000");
}

TEST(FormatSigTest, TrailingZerosKept) {
  EXPECT_EQ(FormatSig(0.0001, 3), "0.000100");
  EXPECT_EQ(FormatSig(2.5e-4, 4), "0.0002500");
  EXPECT_EQ(FormatSig(12, 5), "12.000");
}

TEST(FormatSigTest, ExponentFormOutsideRange) {
  EXPECT_EQ(FormatSig(1.8e-5, 4), "1.800e-05");
  EXPECT_EQ(FormatSig(9.99e-5, 3), "9.99e-05");
  EXPECT_EQ(FormatSig(1e7, 3), "1.00e+07");
  EXPECT_EQ(FormatSig(-6.02214076e23, 4), "-6.022e+23");
  EXPECT_EQ(FormatSig(5.670374419e-8, 3), "5.67e-08");
}

TEST(FormatSigTest, RangeDecidedOnRoundedValue) {
  // 9999999.6 rounds to 1.000e7 at four digits: outside the plain range.
  EXPECT_EQ(FormatSig(9999999.6, 4), "1.000e+07");
  // 9.9996e-5 rounds to 1.000e-4: inside it.
  EXPECT_EQ(FormatSig(9.9996e-5, 4), "0.0001000");
}

TEST(FormatSigTest, SpecialValues) {
  EXPECT_EQ(FormatSig(0.0, 4), "0");
  EXPECT_EQ(FormatSig(-0.0, 4), "0");
  EXPECT_EQ(FormatSig(std::numeric_limits<double>::quiet_NaN(), 4), "nan");
  EXPECT_EQ(FormatSig(std::numeric_limits<double>::infinity(), 4), "inf");
  EXPECT_EQ(FormatSig(-std::numeric_limits<double>::infinity(), 4), "-inf");
}

TEST(FormatSigTest, DigitCountClamped) {
  EXPECT_EQ(FormatSig(25.3, 0), "30");                   // read as one digit
  EXPECT_EQ(FormatSig(0.1, 40), "0.10000000000000001");  // 17 digits at most
}

TEST(FormatExactTest, ShortestRoundTrip) {
  EXPECT_EQ(FormatExact(0.1), "0.1");
  EXPECT_EQ(FormatExact(1e-300), "1e-300");
  EXPECT_EQ(FormatExact(100.0), "100");
  EXPECT_EQ(FormatExact(-2.5), "-2.5");
  EXPECT_EQ(FormatExact(0.1 + 0.2), "0.30000000000000004");
  EXPECT_EQ(FormatExact(std::numeric_limits<double>::quiet_NaN()), "nan");
  EXPECT_EQ(FormatExact(-std::numeric_limits<double>::infinity()), "-inf");
}

TEST(FormatExactTest, ReadsBackExactly) {
  for (double v : {1.0 / 3.0, 293.15, 4.4482216152605, 1055.05585262 / 3600, 6.02214076e23,
                   std::numeric_limits<double>::denorm_min(), std::numeric_limits<double>::max()}) {
    const std::string text = FormatExact(v);
    EXPECT_EQ(std::strtod(text.c_str(), nullptr), v) << text;
  }
}

}  // namespace
}  // namespace heatdeck::units
