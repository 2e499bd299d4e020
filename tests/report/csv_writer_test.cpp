// The CSV writer: RFC 4180 quoting, text cells that a spreadsheet would run
// as a formula neutralised with a leading apostrophe inside quotes, and
// numbers (negative ones too) written as plain numbers.
#include "report/csv_writer.h"

#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include <gtest/gtest.h>

namespace heatdeck {
namespace {

TEST(CsvCell, PlainTextStaysAsItIs) {
  EXPECT_EQ(CsvCell("Q [kW]"), "Q [kW]");
  EXPECT_EQ(CsvCell("a=b+c-d@e"), "a=b+c-d@e") << "only the first character matters";
  EXPECT_EQ(CsvCell(""), "");
}

TEST(CsvCell, SeparatorsAndQuotesAreQuoted) {
  EXPECT_EQ(CsvCell("a,b"), "\"a,b\"");
  EXPECT_EQ(CsvCell("say \"hi\""), "\"say \"\"hi\"\"\"");
  EXPECT_EQ(CsvCell("two\nlines"), "\"two\nlines\"");
  EXPECT_EQ(CsvCell("cr\rinside"), "\"cr\rinside\"");
}

TEST(CsvCell, FormulaStartsAreNeutralised) {
  EXPECT_EQ(CsvCell("=1+1"), "\"'=1+1\"");
  EXPECT_EQ(CsvCell("+44 12"), "\"'+44 12\"");
  EXPECT_EQ(CsvCell("-2+3"), "\"'-2+3\"");
  EXPECT_EQ(CsvCell("@SUM(A1:A9)"), "\"'@SUM(A1:A9)\"");
  EXPECT_EQ(CsvCell("\t=cmd"), "\"'\t=cmd\"");
  EXPECT_EQ(CsvCell("\r=cmd"), "\"'\r=cmd\"");
  // Quoting and neutralising together.
  EXPECT_EQ(CsvCell("=HYPERLINK(\"x\",\"y\")"), "\"'=HYPERLINK(\"\"x\"\",\"\"y\"\")\"");
}

// What a CsvWriter writes, through a temporary file.
class CsvOutput : public ::testing::Test {
 protected:
  void SetUp() override {
    file_ = std::tmpfile();
    ASSERT_NE(file_, nullptr);
  }
  void TearDown() override { std::fclose(file_); }
  std::string Text() {
    std::fflush(file_);
    std::rewind(file_);
    std::string s;
    char buf[4096];
    size_t n;
    while ((n = std::fread(buf, 1, sizeof buf, file_)) > 0) s.append(buf, n);
    return s;
  }
  std::FILE* file_ = nullptr;
};

TEST_F(CsvOutput, NegativeNumbersStayNumbersAndErrorsAreText) {
  CsvWriter csv(file_);
  csv.Header({"dT", "Q"}, {"K", "kW"});
  const double row1[] = {-1.5, 2.25};
  csv.Row(row1, 2, "");
  const double row2[] = {-0.001, NAN};
  csv.Row(row2, 2, "-1 is outside the table, = sign");
  EXPECT_TRUE(csv.ok());
  EXPECT_EQ(Text(),
            "dT [K],Q [kW],error\n"
            "-1.5,2.25,\n"
            "-0.001,,\"'-1 is outside the table, = sign\"\n");
}

// AppendRow remembers each column's last number and its text; a repeated
// value, a changed one, a value gone missing and back, and the two zeros
// (equal, but written differently) must each come out as if written fresh.
// Expected text: fmt's shortest round-trip form (hand-derived).
TEST(CsvAppendRow, RepeatedValuesAreWrittenAsFresh) {
  std::string out;
  const double rows[][2] = {{0.25, 1e-7}, {0.25, 1e-7}, {0.5, NAN}, {0.25, 1e-7},
                            {0.0, 3.0},   {-0.0, 3.0},  {0.0, 3.0}};
  for (const auto& r : rows) CsvWriter::AppendRow(&out, r, 2, "");
  EXPECT_EQ(out,
            "0.25,1e-07,\n0.25,1e-07,\n0.5,,\n0.25,1e-07,\n"
            "0,3,\n-0,3,\n0,3,\n");
  // A wider row after a narrower one, and a narrower one after it.
  out.clear();
  const double wide[] = {0.25, 7.5, 12.0};
  CsvWriter::AppendRow(&out, wide, 3, "");
  CsvWriter::AppendRow(&out, wide + 1, 1, "");
  EXPECT_EQ(out, "0.25,7.5,12,\n7.5,\n");
}

}  // namespace
}  // namespace heatdeck
