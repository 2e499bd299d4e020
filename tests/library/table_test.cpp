#include "library/table.h"

#include <cmath>
#include <string>
#include <vector>

#include <gtest/gtest.h>

namespace heatdeck::library {
namespace {

// Parses text that must fail; returns the errors as "line:col: message".
std::vector<std::string> Errors(std::string_view text) {
  Table table;
  std::vector<TableError> errors;
  EXPECT_FALSE(ParseTableCsv(text, &table, &errors)) << text;
  std::vector<std::string> out;
  for (const TableError& e : errors) {
    out.push_back(std::to_string(e.line) + ":" + std::to_string(e.column) + ": " + e.message);
  }
  return out;
}

Table Parse(std::string_view text) {
  Table table;
  std::vector<TableError> errors;
  EXPECT_TRUE(ParseTableCsv(text, &table, &errors)) << text;
  for (const TableError& e : errors) {
    ADD_FAILURE() << e.line << ":" << e.column << ": " << e.message;
  }
  return table;
}

constexpr std::string_view kOil =
    "# supplier data, rev 3\n"
    "T [degC], cp [kJ/(kg*K)], mu [Pa*s], Pr []\n"
    "20, 1.90, 0.080, 1000\n"
    "\n"
    "60, 2.06, 0.020, 300\n"
    "100, 2.22, 0.008, 120\n";

TEST(TableParse, ReadsHeaderUnitsAndConvertsToSi) {
  const Table t = Parse(kOil);
  ASSERT_EQ(t.columns.size(), 4u);
  EXPECT_EQ(t.columns[0].name, "T");
  EXPECT_EQ(t.columns[1].name, "cp");
  EXPECT_EQ(t.columns[3].name, "Pr");
  EXPECT_EQ(t.columns[0].unit.dim, units::dim::kTemperature);
  EXPECT_EQ(t.columns[1].unit.dim, units::dim::kSpecificHeat);
  EXPECT_EQ(t.columns[2].unit.dim, units::dim::kViscosity);
  EXPECT_TRUE(t.columns[3].unit.dim.dimensionless());
  // Hand-converted: degC + 273.15, kJ * 1000.
  ASSERT_EQ(t.columns[0].si.size(), 3u);
  EXPECT_DOUBLE_EQ(t.columns[0].si[0], 293.15);
  EXPECT_DOUBLE_EQ(t.columns[0].si[2], 373.15);
  EXPECT_DOUBLE_EQ(t.columns[1].si[1], 2060.0);
  EXPECT_DOUBLE_EQ(t.columns[3].si[2], 120.0);
  EXPECT_EQ(t.Find("mu"), 2);
  EXPECT_EQ(t.Find("T"), 0);
  EXPECT_EQ(t.Find("k"), -1);
}

TEST(TableParse, AcceptsQuotesCrLfBomAndTrailingNewlines) {
  const Table t = Parse(
      "\xEF\xBB\xBF\"x [m]\",\"y [1]\"\r\n"
      "  # comment after spaces\r\n"
      "\"1\", 2\r\n"
      "+2.5e0,\"-4\"\r\n"
      "\r\n");
  ASSERT_EQ(t.columns.size(), 2u);
  EXPECT_EQ(t.columns[0].name, "x");
  EXPECT_EQ(t.columns[1].name, "y");
  EXPECT_EQ(t.columns[1].si, (std::vector<double>{2, -4}));
  EXPECT_EQ(t.columns[0].si, (std::vector<double>{1, 2.5}));
}

TEST(TableInterpolate, ExactAtNodesAndLinearBetween) {
  const Table t = Parse(kOil);
  const int cp = t.Find("cp");
  double v = 0;
  // Nodes return the stored value itself.
  for (size_t i = 0; i < 3; ++i) {
    ASSERT_TRUE(t.Interpolate(cp, t.columns[0].si[i], &v));
    EXPECT_EQ(v, t.columns[1].si[i]);
  }
  // Midpoint of 20 and 60 degC: (1900 + 2060)/2 = 1980 J/(kg K).
  ASSERT_TRUE(t.Interpolate(cp, 313.15, &v));
  EXPECT_NEAR(v, 1980.0, 1e-9);
  // A quarter of the way from 60 to 100 degC (70 degC): 0.020 + 0.25*(0.008-0.020) = 0.017.
  ASSERT_TRUE(t.Interpolate(t.Find("mu"), 343.15, &v));
  EXPECT_NEAR(v, 0.017, 1e-12);
  // 90 degC on Pr: 300 + 0.75*(120-300) = 165.
  ASSERT_TRUE(t.Interpolate(t.Find("Pr"), 363.15, &v));
  EXPECT_NEAR(v, 165.0, 1e-9);
}

TEST(TableInterpolate, OutsideTheRangeOrBadColumnIsFalse) {
  const Table t = Parse(kOil);
  double v = -1;
  EXPECT_FALSE(t.Interpolate(1, 293.14, &v));
  EXPECT_FALSE(t.Interpolate(1, 373.16, &v));
  EXPECT_FALSE(t.Interpolate(1, std::nan(""), &v));
  EXPECT_FALSE(t.Interpolate(0, 300, &v));
  EXPECT_FALSE(t.Interpolate(4, 300, &v));
  EXPECT_FALSE(t.Interpolate(-1, 300, &v));
  EXPECT_EQ(v, -1);  // untouched
}

TEST(TableParseErrors, EmptyAndHeaderOnly) {
  EXPECT_EQ(Errors(""), (std::vector<std::string>{"1:1: no header row: the table is empty"}));
  EXPECT_EQ(Errors("# only a comment\n\n"),
            (std::vector<std::string>{"1:1: no header row: the table is empty"}));
  EXPECT_EQ(Errors("T [K], cp [J/(kg*K)]\n300, 1000\n"),
            (std::vector<std::string>{"1:1: the table has 1 data row; at least 2 are needed"}));
  EXPECT_EQ(Errors("#\nT [K], cp [J/(kg*K)]\n"),
            (std::vector<std::string>{"2:1: the table has 0 data rows; at least 2 are needed"}));
}

TEST(TableParseErrors, MalformedHeaderCells) {
  EXPECT_EQ(Errors("T [K], cp\n1, 2\n3, 4\n"),
            (std::vector<std::string>{"1:8: header cell 'cp' has no unit: write 'name [unit]' "
                                      "('[]' for a plain number)"}));
  EXPECT_EQ(Errors("T [K, cp [1]\n1, 2\n3, 4\n"),
            (std::vector<std::string>{"1:3: header cell 'T [K': '[' without a closing ']'"}));
  EXPECT_EQ(Errors("T [K] x, cp [1]\n1, 2\n3, 4\n"),
            (std::vector<std::string>{"1:7: header cell 'T [K] x': unexpected text after ']'"}));
  EXPECT_EQ(Errors("[K], cp [1]\n1, 2\n3, 4\n"),
            (std::vector<std::string>{"1:1: header cell '[K]' has no column name before '['"}));
  EXPECT_EQ(Errors("T [K], 2cp [1]\n1, 2\n3, 4\n"),
            (std::vector<std::string>{"1:8: column name '2cp' is not a name (ASCII letters, "
                                      "digits and '_', not starting with a digit)"}));
  EXPECT_EQ(Errors("T [K], cp [1], cp [1]\n1, 2, 3\n3, 4, 5\n"),
            (std::vector<std::string>{"1:16: duplicate column name 'cp'"}));
  EXPECT_EQ(Errors("T [K]\n1\n3\n"),
            (std::vector<std::string>{
                "1:1: the header needs an argument column and at least one value column"}));
}

TEST(TableParseErrors, UnknownUnitIsLocatedInsideTheBrackets) {
  const std::vector<std::string> errors = Errors("T [K], mu [ Pa*zz ]\n1, 2\n3, 4\n");
  ASSERT_EQ(errors.size(), 1u);
  // "mu [ Pa*zz ]" starts at column 8, the unit text at column 13, and the
  // unit parser points 3 bytes into "Pa*zz".  The wording after the column
  // name is the unit parser's.
  const std::string& e = errors[0];
  EXPECT_EQ(e.rfind("1:16: column 'mu': ", 0), 0u) << e;
  EXPECT_NE(e.find("zz"), std::string::npos) << e;
}

TEST(TableParseErrors, BadRowsAreLocatedAtTheCell) {
  EXPECT_EQ(Errors("T [K], cp [1]\n1, 2\n3, x2\n"),
            (std::vector<std::string>{"3:4: 'x2' is not a number (column 'cp')"}));
  EXPECT_EQ(Errors("T [K], cp [1]\n1, 2\n3,\n"),
            (std::vector<std::string>{"3:3: empty cell in column 'cp'"}));
  EXPECT_EQ(Errors("T [K], cp [1]\n1, 2\n3, inf\n"),
            (std::vector<std::string>{"3:4: 'inf' is not a number (column 'cp')"}));
  EXPECT_EQ(Errors("T [K], cp [1]\n1, 2\n3, 4, 5\n"),
            (std::vector<std::string>{"3:7: row has 3 cells but the header has 2 columns"}));
  EXPECT_EQ(Errors("T [K], cp [1]\n1, 2\n3\n"),
            (std::vector<std::string>{"3:2: row has 1 cell but the header has 2 columns"}));
  EXPECT_EQ(Errors("T [K], cp [1]\n1, 2\n\"3, 4\n"),
            (std::vector<std::string>{"3:1: unterminated quoted cell"}));
  EXPECT_EQ(Errors("\"T [K], cp [1]\n1, 2\n3, 4\n"),
            (std::vector<std::string>{"1:1: unterminated quoted cell"}));
  EXPECT_EQ(Errors("T [K], cp [1]\n1, 2\n\"3\"x, 4\n"),
            (std::vector<std::string>{"3:4: unexpected text after the closing quote of a cell"}));
}

TEST(TableParseErrors, ArgumentMustIncreaseStrictly) {
  EXPECT_EQ(Errors("T [K], cp [1]\n1, 2\n3, 4\n3, 5\n2, 6\n"),
            (std::vector<std::string>{
                "4:1: the argument column 'T' must increase strictly: 3 follows 3 on line 3",
                "5:1: the argument column 'T' must increase strictly: 2 follows 3 on line 4"}));
}

TEST(TableParseErrors, CollectsEveryErrorAndLeavesTheTableUntouched) {
  Table table;
  table.columns.push_back({"keep", {}, {1.0}});
  std::vector<TableError> errors;
  EXPECT_FALSE(ParseTableCsv("T [K], cp\n1, a\n0, 2, 3\n", &table, &errors));
  ASSERT_EQ(errors.size(), 4u);
  EXPECT_EQ(errors[0].line, 1);  // cp has no unit
  EXPECT_EQ(errors[1].line, 2);  // 'a'
  EXPECT_EQ(errors[2].line, 3);  // ragged
  EXPECT_EQ(errors[3].line, 3);  // 0 after 1
  ASSERT_EQ(table.columns.size(), 1u);
  EXPECT_EQ(table.columns[0].name, "keep");
}

}  // namespace
}  // namespace heatdeck::library
