#include <cmath>
#include <numbers>
#include <set>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "units/unit.h"

namespace heatdeck::units {
namespace {

double Factor(const std::string& text) {
  Unit u;
  UnitError error;
  EXPECT_TRUE(ParseUnit(text, &u, &error)) << text << ": " << error.message;
  return u.factor;
}

void ExpectRel(double got, double expected, double rel) {
  EXPECT_NEAR(got, expected, std::fabs(expected) * rel);
}

// SI factors printed by pint 0.19.2 (python3-pint, run offline), e.g.
// Quantity(1, 'hp').to('W').
TEST(UnitRegistryTest, FactorsAgreeWithPint) {
  ExpectRel(Factor("hp"), 745.6998715822701, 1e-15);
  ExpectRel(Factor("atm"), 101325.0, 1e-15);
  ExpectRel(Factor("gal"), 0.0037854117839999993, 1e-15);
  ExpectRel(Factor("mi"), 1609.344, 1e-15);
  ExpectRel(Factor("yd"), 0.9144, 1e-15);
  ExpectRel(Factor("cal"), 4.1868, 1e-15);  // pint 'international_calorie'
  ExpectRel(Factor("P"), 0.1, 1e-15);
  ExpectRel(Factor("lbf"), 4.4482216152605005, 1e-15);
  ExpectRel(Factor("psi"), 6894.7572931683635, 1e-15);
  ExpectRel(Factor("deg"), 0.017453292519943295, 1e-15);
  ExpectRel(Factor("t"), 1000.0, 1e-15);
  ExpectRel(Factor("d"), 86400.0, 1e-15);
  ExpectRel(Factor("Btu"), 1055.0558526200002, 1e-15);  // 'international_british_thermal_unit'
  ExpectRel(Factor("kW*h"), 3600000.0, 1e-15);          // pint 'kWh'
  ExpectRel(Factor("in^3"), 0.016387063999999993e-3, 1e-15);
}

// Definitions (hand-derived; NIST SP 811 appendix B, from memory).
TEST(UnitRegistryTest, FactorsAgreeWithTheirDefinitions) {
  ExpectRel(Factor("in"), 0.0254, 0);
  ExpectRel(Factor("lb"), 0.45359237, 0);
  EXPECT_EQ(Factor("lb"), Factor("lbm"));
  EXPECT_EQ(Factor("h"), Factor("hr"));
  // lbf = lbm * standard gravity 9.80665 m/s^2.
  ExpectRel(Factor("lbf"), 0.45359237 * 9.80665, 1e-15);
  ExpectRel(Factor("psi"), Factor("lbf/in^2"), 1e-15);
  // Mechanical horsepower = 550 ft*lbf/s (common practice for "hp").
  ExpectRel(Factor("hp"), 550 * Factor("ft*lbf/s"), 1e-15);
  // Ton of refrigeration = 12000 Btu/h.
  ExpectRel(Factor("TR"), 12000 * Factor("Btu/h"), 1e-15);
  // US gallon = 231 cubic inches.
  ExpectRel(Factor("gal"), 231 * Factor("in^3"), 1e-15);
  ExpectRel(Factor("L"), Factor("dm^3"), 1e-15);
  ExpectRel(Factor("kcal"), 1000 * Factor("cal"), 1e-15);
  // IT Btu/(lbm*degF) is exactly 1 IT kcal/(kg*K) (definition of the IT Btu).
  ExpectRel(Factor("Btu/(lbm*degF)"), Factor("kcal/(kg*K)"), 1e-13);
  ExpectRel(Factor("cP"), Factor("mPa*s"), 1e-15);
  ExpectRel(Factor("bar"), Factor("kPa") * 100, 1e-15);
  ExpectRel(Factor("deg") * 180, std::numbers::pi, 1e-15);
  ExpectRel(Factor("Hz"), Factor("1/s"), 0);
}

TEST(UnitRegistryTest, ListUnitsCoversTheLanguage) {
  const std::vector<UnitListing> list = ListUnits();
  ASSERT_FALSE(list.empty());
  std::set<std::string> symbols;
  for (const UnitListing& l : list) {
    EXPECT_TRUE(symbols.insert(l.symbol).second) << "duplicate " << l.symbol;
  }
  // LANGUAGE.md "Quantities and units": the units a deck may use.
  for (const char* s :
       {"m",   "in", "ft",  "yd",  "mi",  "kg",   "g",    "t",    "lb",    "lbm",   "s",
        "min", "h",  "hr",  "d",   "K",   "degC", "degF", "R",    "ddegC", "ddegF", "N",
        "lbf", "Pa", "bar", "atm", "psi", "J",    "cal",  "kcal", "Btu",   "W",     "hp",
        "TR",  "L",  "gal", "mol", "Hz",  "%",    "rad",  "deg",  "cP",    "P"}) {
    EXPECT_EQ(symbols.count(s), 1u) << s;
  }
}

TEST(UnitRegistryTest, EveryListedSymbolParsesBackToItsFactor) {
  for (const UnitListing& l : ListUnits()) {
    SCOPED_TRACE(l.symbol);
    Unit u;
    UnitError error;
    ASSERT_TRUE(ParseUnit(l.symbol, &u, &error)) << error.message;
    EXPECT_EQ(u.factor, l.factor);
    EXPECT_EQ(u.offset, l.offset);
    EXPECT_EQ(u.dim.SiUnit(), l.si_unit);
    EXPECT_EQ(u.text, l.symbol);
    EXPECT_FALSE(l.name.empty());
    if (l.prefixable) {
      Unit k;
      ASSERT_TRUE(ParseUnit("k" + l.symbol, &k, &error)) << error.message;
      EXPECT_DOUBLE_EQ(k.factor, 1e3 * l.factor);
    }
  }
}

TEST(UnitRegistryTest, PrefixableSet) {
  std::set<std::string> prefixable;
  for (const UnitListing& l : ListUnits()) {
    if (l.prefixable) prefixable.insert(l.symbol);
  }
  const std::set<std::string> expected = {"m", "g",  "s",   "K", "A", "cd", "mol", "Hz",
                                          "N", "Pa", "bar", "J", "W", "L",  "rad"};
  EXPECT_EQ(prefixable, expected);
}

TEST(UnitRegistryTest, TemperatureEntries) {
  for (const UnitListing& l : ListUnits()) {
    if (l.symbol == "degC") {
      EXPECT_EQ(l.offset, 273.15);
      EXPECT_EQ(l.factor, 1.0);
    } else if (l.symbol == "degF") {
      EXPECT_DOUBLE_EQ(l.offset, 459.67 * 5 / 9);
      EXPECT_DOUBLE_EQ(l.factor, 5.0 / 9.0);
    } else {
      EXPECT_EQ(l.offset, 0.0) << l.symbol;
    }
  }
}

TEST(SuggestUnitsTest, CaseInsensitiveMatchesFirst) {
  EXPECT_EQ(SuggestUnits("kw").front(), "kW");
  EXPECT_EQ(SuggestUnits("btu").front(), "Btu");
  EXPECT_EQ(SuggestUnits("KG").front(), "kg");
  EXPECT_EQ(SuggestUnits("degc").front(), "degC");
  EXPECT_EQ(SuggestUnits("pa").front(), "Pa");
  // Same letters, different case: the closer case first.
  EXPECT_EQ(SuggestUnits("mw"), (std::vector<std::string>{"mW", "MW"}));
}

TEST(SuggestUnitsTest, EditDistance) {
  EXPECT_EQ(SuggestUnits("Bto").front(), "Btu");
  EXPECT_EQ(SuggestUnits("lbs"), (std::vector<std::string>{"lb", "lbm", "lbf"}));
  EXPECT_EQ(SuggestUnits("psig").front(), "psi");
  EXPECT_EQ(SuggestUnits("mins").front(), "min");
  EXPECT_EQ(SuggestUnits("gall").front(), "gal");
  EXPECT_EQ(SuggestUnits("deggC").front(), "degC");
  // Transposition counts as one edit.
  EXPECT_EQ(SuggestUnits("But").front(), "Btu");
  EXPECT_EQ(SuggestUnits("mlo").front(), "mol");
  // Unicode spellings are compared in their ASCII form.
  EXPECT_EQ(SuggestUnits("\xC2\xB0"
                         "c")
                .front(),
            "degC");
}

TEST(SuggestUnitsTest, NothingCloseMeansNoSuggestion) {
  EXPECT_TRUE(SuggestUnits("x").empty());
  EXPECT_TRUE(SuggestUnits("furlong").empty());
  EXPECT_TRUE(SuggestUnits("").empty());
  for (const char* s : {"kq", "zz", "bananas", "mtr", "W/m"}) {
    EXPECT_LE(SuggestUnits(s).size(), 3u) << s;
  }
}

}  // namespace
}  // namespace heatdeck::units
