// Unit conversions checked against ../shared/reference/unit_checks.csv.  Each
// row names its own source (pint 0.19.2 with International Table Btu/kcal).
#include <cmath>
#include <string>

#include <gtest/gtest.h>

#include "reference_csv.h"
#include "units/unit.h"

namespace heatdeck::units {
namespace {

TEST(UnitReferenceTest, EveryRowOfUnitChecksConverts) {
  const auto rows = heatdeck::testing::LoadReference("unit_checks.csv");
  ASSERT_FALSE(rows.empty());
  for (const auto& row : rows) {
    const std::string& from_text = row.at("from_unit");
    const std::string& to_text = row.at("to_unit");
    SCOPED_TRACE(row.at("value") + " " + from_text + " -> " + to_text + " (" + row.at("source") +
                 ")");
    Unit from;
    Unit to;
    UnitError error;
    ASSERT_TRUE(ParseUnit(from_text, &from, &error)) << error.message;
    ASSERT_TRUE(ParseUnit(to_text, &to, &error)) << error.message;
    ASSERT_EQ(from.dim, to.dim) << from.dim.SiUnit() << " vs " << to.dim.SiUnit();

    const double got = to.FromSi(from.ToSi(std::stod(row.at("value"))));
    const double expected = std::stod(row.at("expected"));
    const double rel_tol = std::stod(row.at("rel_tol"));
    const double bound = expected == 0 ? rel_tol : rel_tol * std::fabs(expected);
    EXPECT_LE(std::fabs(got - expected), bound) << "got " << got << ", expected " << expected;
  }
}

}  // namespace
}  // namespace heatdeck::units
