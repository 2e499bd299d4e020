// Structure tests of the workbook: what a reviewer finds where.  The
// workbooks are written by the heatdeck binary and read back through
// tests/report/xlsx_recalc.py (see xlsx_test_support.h).  Values are
// compared with heatdeck's own JSON results of the same deck, or with
// values derived by hand in the comments; that the formulas recalculate to
// those values is xlsx_recalc_test.cpp's job.
#include <chrono>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <regex>
#include <string>
#include <thread>
#include <vector>

#include <gtest/gtest.h>

#include "xlsx_test_support.h"

namespace heatdeck::testing {
namespace {

using nlohmann::json;

// The JSON quantity called name in case c.
json Quantity(const json& results, const std::string& name, size_t c = 0) {
  for (const auto& q : results["cases"][c]["quantities"]) {
    if (q["name"] == name) return q;
  }
  ADD_FAILURE() << "no quantity " << name;
  return json::object();
}

double Num(const json& cell) { return cell.contains("v") ? cell["v"].get<double>() : NAN; }

// The workbook of a deck, written and read back once for all tests of a suite.
struct Written {
  explicit Written(const std::string& deck_name) : dir("xlsx_" + deck_name) {
    deck = DataDeck(deck_name + ".deck");
    const std::string path = WriteWorkbook(deck, dir.path());
    if (!path.empty()) book = DumpWorkbook(path);
    results = JsonResults(deck);
  }
  TempFolder dir;
  std::string deck;
  json book = json::object();
  json results;
};

class XlsxFirstDeck : public ::testing::Test {
 protected:
  static void SetUpTestSuite() { written_ = new Written("xlsx_first"); }
  static void TearDownTestSuite() {
    delete written_;
    written_ = nullptr;
  }
  void SetUp() override {
    calc_ = Sheet(book_, "Calculation");
    ASSERT_NE(calc_, nullptr);
  }
  static inline Written* written_ = nullptr;
  const json& book_ = written_->book;
  const json& results_ = written_->results;
  const json* calc_ = nullptr;
};

TEST_F(XlsxFirstDeck, SheetsInOrder) {
  ASSERT_EQ(book_["sheets"].size(), 2u);
  EXPECT_EQ(book_["sheets"][0]["name"], "Summary");
  EXPECT_EQ(book_["sheets"][1]["name"], "Calculation");
}

TEST_F(XlsxFirstDeck, EveryQuantityHasANamedSiCellInItsRow) {
  for (const auto& q : results_["cases"][0]["quantities"]) {
    const std::string name = q["name"];
    const std::string ref = NamedCell(book_, name);  // no name here needs mapping
    ASSERT_FALSE(ref.empty()) << name;
    EXPECT_EQ(ref[0], 'C') << name;
    const std::string row = RowOf(ref);
    EXPECT_EQ(CellAt(*calc_, "A" + row)["v"], name);
    EXPECT_EQ(CellAt(*calc_, "D" + row)["v"],
              q["si_unit"].get<std::string>().empty() ? "1" : q["si_unit"].get<std::string>());
    // Cached values are heatdeck's, SI and display (16 significant digits).
    EXPECT_NEAR(Num(CellAt(*calc_, ref)), q["si_value"].get<double>(),
                1e-15 * std::fabs(q["si_value"].get<double>()))
        << name;
    EXPECT_NEAR(Num(CellAt(*calc_, "E" + row)), q["value"].get<double>(),
                1e-15 * std::fabs(q["value"].get<double>()))
        << name;
  }
}

TEST_F(XlsxFirstDeck, SectionOrderWithTitleRows) {
  // "Process data" comes before m_h, "Rating" between UA and C_h.
  int process = -1, rating = -1;
  for (const auto& [ref, cell] : (*calc_)["cells"].items()) {
    if (ref.rfind("A", 0) != 0 || !cell.contains("v") || !cell["v"].is_string()) continue;
    if (cell["v"] == "Process data") process = std::stoi(RowOf(ref));
    if (cell["v"] == "Rating") rating = std::stoi(RowOf(ref));
  }
  const int m_h = std::stoi(RowOf(NamedCell(book_, "m_h")));
  const int ua = std::stoi(RowOf(NamedCell(book_, "UA")));
  const int c_h = std::stoi(RowOf(NamedCell(book_, "C_h")));
  const int t_c2 = std::stoi(RowOf(NamedCell(book_, "T_c2")));
  EXPECT_LT(process, m_h);
  EXPECT_LT(ua, rating);
  EXPECT_LT(rating, c_h);
  EXPECT_LT(c_h, t_c2);
}

TEST_F(XlsxFirstDeck, InputsAreNumbersWithAStyleAndANote) {
  const json m_h = CellAt(*calc_, NamedCell(book_, "m_h"));
  const json t_h1 = CellAt(*calc_, NamedCell(book_, "T_h1"));
  const json c_h = CellAt(*calc_, NamedCell(book_, "C_h"));
  EXPECT_FALSE(m_h.contains("f"));
  EXPECT_EQ(Num(m_h), 0.5);
  EXPECT_EQ(Num(t_h1), 353.15);  // 80 degC in K
  EXPECT_TRUE(c_h.contains("f"));
  // Inputs share one style, different from a formula cell's.
  EXPECT_EQ(m_h["s"], t_h1["s"]);
  EXPECT_NE(m_h["s"], c_h["s"]);
  const std::string note = (*calc_)["notes"][NamedCell(book_, "m_h")];
  EXPECT_NE(note.find("You may change this value"), std::string::npos) << note;
  EXPECT_FALSE((*calc_)["notes"].contains(NamedCell(book_, "C_h")));
}

TEST_F(XlsxFirstDeck, FormulasReadLikeTheDeck) {
  // C_h = m_h * cp_h = 0.5 kg/s * 4190 J/(kg*K) = 2095 W/K exactly.
  const json c_h = CellAt(*calc_, NamedCell(book_, "C_h"));
  EXPECT_EQ(c_h["f"], "m_h*cp_h");
  EXPECT_EQ(Num(c_h), 2095.0);
  EXPECT_EQ(CellAt(*calc_, NamedCell(book_, "C_min"))["f"], "MIN(C_h,C_c)");
  EXPECT_EQ(CellAt(*calc_, NamedCell(book_, "Q"))["f"], "eps*C_min*(T_h1-T_c1)");
  EXPECT_EQ(CellAt(*calc_, NamedCell(book_, "T_h2"))["f"], "T_h1-Q/C_h");
  // eff_counter has a closed form: a formula over NTU and Cr, no value.
  const std::string eps = CellAt(*calc_, NamedCell(book_, "eps"))["f"];
  EXPECT_EQ(eps.rfind("IF(Cr=1,NTU/(1+NTU),", 0), 0u) << eps;
  // Display cells convert the SI cell: (SI - offset) / factor.
  const std::string q_row = RowOf(NamedCell(book_, "Q"));
  EXPECT_EQ(CellAt(*calc_, "E" + q_row)["f"], "Q/1000");
  EXPECT_EQ(CellAt(*calc_, "F" + q_row)["v"], "kW");
  const std::string t_row = RowOf(NamedCell(book_, "T_h2"));
  EXPECT_EQ(CellAt(*calc_, "E" + t_row)["f"], "T_h2-273.15");
  EXPECT_EQ(CellAt(*calc_, "F" + t_row)["v"], "degC");
}

TEST_F(XlsxFirstDeck, CheckRowsAreFormulas) {
  // check T_h2 <= 45 degC: both sides, verdict and margin as formulas.
  const std::string ref = NamedCell(book_, "check_1");
  ASSERT_EQ(ref[0], 'F');
  const std::string r = RowOf(ref);
  EXPECT_EQ(CellAt(*calc_, "A" + r)["v"], "T_h2 <= 45 degC");
  EXPECT_EQ(CellAt(*calc_, "C" + r)["f"], "T_h2");
  EXPECT_EQ(CellAt(*calc_, "E" + r)["f"], "318.15");
  EXPECT_EQ(CellAt(*calc_, ref)["f"], "IF(C" + r + "<=E" + r + ",\"PASS\",\"FAIL\")");
  EXPECT_EQ(CellAt(*calc_, ref)["v"], "PASS");
  EXPECT_EQ(CellAt(*calc_, "G" + r)["f"], "E" + r + "-C" + r);
  const json& chk = results_["cases"][0]["checks"][0];
  EXPECT_NEAR(Num(CellAt(*calc_, "G" + r)), chk["margin"].get<double>(), 1e-12);
  // check T_h2 - T_c1 >= 5 K
  const std::string r2 = RowOf(NamedCell(book_, "check_2"));
  EXPECT_EQ(CellAt(*calc_, "C" + r2)["f"], "T_h2-T_c1");
  EXPECT_EQ(CellAt(*calc_, "F" + r2)["f"], "IF(C" + r2 + ">=E" + r2 + ",\"PASS\",\"FAIL\")");
  EXPECT_EQ(CellAt(*calc_, "G" + r2)["f"], "C" + r2 + "-E" + r2);
}

TEST_F(XlsxFirstDeck, SummaryHasTitleBlockVerdictAndCaution) {
  const json* s = Sheet(book_, "Summary");
  ASSERT_NE(s, nullptr);
  std::string all;
  bool countif = false;
  for (const auto& [ref, cell] : (*s)["cells"].items()) {
    if (cell.contains("v") && cell["v"].is_string()) all += cell["v"].get<std::string>() + "\n";
    if (cell.contains("f") && cell["f"].get<std::string>().rfind("COUNTIF(", 0) == 0) {
      countif = true;
    }
  }
  EXPECT_NE(all.find("Jacket-water cooler C-2: rating at summer design"), std::string::npos);
  EXPECT_NE(all.find("TC-0042"), std::string::npos);
  EXPECT_NE(all.find("competent engineer"), std::string::npos);
  EXPECT_NE(all.find("Local codes"), std::string::npos);
  EXPECT_NE(all.find("Calculation no."), std::string::npos);  // meta number's label
  EXPECT_NE(all.find("Prepared"), std::string::npos);
  EXPECT_NE(all.find("Every check passes"), std::string::npos);
  EXPECT_TRUE(countif);
}

TEST(XlsxWriter, SameDeckSameBytesAndTheDeckDateInTheProperties) {
  TempFolder a("xlsx_a"), b("xlsx_b");
  const std::string deck = DataDeck("xlsx_language.deck");
  const std::string pa = WriteWorkbook(deck, a.path());
  // A second later, so that a clock reading (one-second resolution in
  // zip entries and document properties) would show.
  std::this_thread::sleep_for(std::chrono::milliseconds(1100));
  const std::string pb = WriteWorkbook(deck, b.path());
  ASSERT_FALSE(pa.empty());
  ASSERT_FALSE(pb.empty());
  EXPECT_EQ(ReadFile(pa), ReadFile(pb));
  // meta date "2026-03-14"
  const json book = DumpWorkbook(pa);
  EXPECT_NE(book["core"].get<std::string>().find(
                "<dcterms:created xsi:type=\"dcterms:W3CDTF\">2026-03-14T00:00:00Z"),
            std::string::npos)
      << book["core"];
}

TEST(XlsxWriter, WithoutADateThePropertiesHoldAFixedOne) {
  TempFolder dir("xlsx_nodate");
  const std::string path = WriteWorkbook(DataDeck("xlsx_first.deck"), dir.path());
  ASSERT_FALSE(path.empty());
  const json book = DumpWorkbook(path);
  EXPECT_NE(book["core"].get<std::string>().find(">2000-01-01T00:00:00Z<"), std::string::npos)
      << book["core"];
}

class XlsxLanguageDeck : public ::testing::Test {
 protected:
  static void SetUpTestSuite() { written_ = new Written("xlsx_language"); }
  static void TearDownTestSuite() {
    delete written_;
    written_ = nullptr;
  }
  void SetUp() override {
    calc_ = Sheet(book_, "Calculation");
    ASSERT_NE(calc_, nullptr);
  }
  static inline Written* written_ = nullptr;
  const json& book_ = written_->book;
  const json* calc_ = nullptr;
};

TEST_F(XlsxLanguageDeck, NamesThatASpreadsheetWouldMisreadAreMapped) {
  // Hand-derived from the rule in src/report/xlsx_formula.h.
  const std::pair<const char*, const char*> mapped[] = {
      {"A1", "q_A1"}, {"R2C3", "q_R2C3"}, {"LN", "q_LN"},         {"PI", "q_PI"},
      {"R", "q_R"},   {"C", "q_C"},       {"dp1", "q_dp1"},       {"T", "T"},
      {"t", "t_2"},   {"x", "x"},         {"check_1", "check_1"}, {"hx.T2", "hx.T2"},
  };
  for (const auto& [quantity, name] : mapped) {
    const std::string ref = NamedCell(book_, name);
    ASSERT_FALSE(ref.empty()) << name;
    EXPECT_EQ(CellAt(*calc_, "A" + RowOf(ref))["v"], quantity) << name;
  }
  // Unsafe spellings are never defined.
  for (const char* bad : {"A1", "R2C3", "LN", "PI", "R", "C", "dp1"}) {
    EXPECT_EQ(NamedCell(book_, bad), "") << bad;
  }
  // The first check's name is taken by a quantity.
  EXPECT_EQ(CellAt(*calc_, NamedCell(book_, "check_1_2"))["v"], "PASS");
  // n15 = A1 / (1 m^2) + R2C3 * LN - PI / R + C
  EXPECT_EQ(CellAt(*calc_, NamedCell(book_, "q_n15"))["f"], "q_A1/1+q_R2C3*q_LN-q_PI/q_R+q_C");
  // dT = hx.T2 - hx.T1: template names keep their dots.
  EXPECT_EQ(CellAt(*calc_, NamedCell(book_, "dT"))["f"], "hx.T2-hx.T1");
}

TEST_F(XlsxLanguageDeck, TextThatLooksLikeAFormulaStaysText) {
  const std::string x_row = RowOf(NamedCell(book_, "x"));
  const std::string y_row = RowOf(NamedCell(book_, "y"));
  for (const auto& [ref, want] :
       std::vector<std::pair<std::string, std::string>>{{"B" + x_row, "=1+1 must stay text"},
                                                        {"G" + x_row, "+44 is not a formula"},
                                                        {"B" + y_row, "-0.5 must stay text"},
                                                        {"G" + y_row, "@x must stay text"}}) {
    const json cell = CellAt(*calc_, ref);
    EXPECT_FALSE(cell.contains("f")) << ref;
    EXPECT_EQ(cell["t"], "s") << ref;
    EXPECT_EQ(cell["v"], want) << ref;
  }
  bool meta_as_text = false;
  for (const auto& [ref, cell] : (*Sheet(book_, "Summary"))["cells"].items()) {
    if (cell.contains("v") && cell["v"] == "=1+2 stays text") {
      meta_as_text = !cell.contains("f") && cell["t"] == "s";
    }
  }
  EXPECT_TRUE(meta_as_text);
}

TEST_F(XlsxLanguageDeck, EachCaseHasASheetWithLocalNames) {
  // case warm: T = 330 K, x = 1.7
  ASSERT_EQ(book_["sheets"].size(), 3u);
  EXPECT_EQ(book_["sheets"][2]["name"], "Case warm");
  const json& warm = book_["sheets"][2];
  const std::string x = NamedCell(book_, "x", 2);
  const std::string t = NamedCell(book_, "T", 2);
  ASSERT_FALSE(x.empty());
  EXPECT_EQ(Num(CellAt(warm, x)), 1.7);
  EXPECT_EQ(Num(CellAt(warm, t)), 330.0);
  EXPECT_EQ(Num(CellAt(*calc_, NamedCell(book_, "x"))), 1.5);
  EXPECT_NE(warm["notes"][x].get<std::string>().find("Case 'warm' sets this value"),
            std::string::npos);
  // The same formula text; the sheet-local name makes it read the case's cells.
  // n2 = (-x)^2 = 2.89 at x = 1.7, so `check n2 == 2.25` fails in this case.
  EXPECT_EQ(CellAt(warm, NamedCell(book_, "q_n2", 2))["f"], "(-x)^2");
  EXPECT_NEAR(Num(CellAt(warm, NamedCell(book_, "q_n2", 2))), 2.89, 1e-12);
  EXPECT_EQ(CellAt(warm, NamedCell(book_, "check_2", 2))["v"], "FAIL");
  bool a_check_fails = false;
  for (const auto& [ref, cell] : (*Sheet(book_, "Summary"))["cells"].items()) {
    a_check_fails = a_check_fails || (cell.contains("v") && cell["v"] == "A check fails");
  }
  EXPECT_TRUE(a_check_fails);
}

class XlsxValuesDeck : public ::testing::Test {
 protected:
  static void SetUpTestSuite() { written_ = new Written("xlsx_values"); }
  static void TearDownTestSuite() {
    delete written_;
    written_ = nullptr;
  }
  static inline Written* written_ = nullptr;
  const json& book = written_->book;
  const json& results = written_->results;
};

TEST_F(XlsxValuesDeck, ValuesWithoutAClosedFormCarryANote) {
  ASSERT_NE(Sheet(book, "Calculation"), nullptr);
  const json& calc = *Sheet(book, "Calculation");
  const std::pair<const char*, const char*> value_only[] = {
      {"f_w", "f_colebrook() has no closed form"},
      {"rho_w", "water_rho() has no closed form"},
      {"e_x", "eff_cross_unmixed() has no closed form"},
      {"F_x", "fcorr_cross() has no closed form"},
      {"cp_o", "oil.cp() is a linear interpolation in the table oil"},
      {"m_o",
       "found by a bracketed root search between 0.05 and 5 kg/s so that "
       "m_o * cp_o * 10 K = Q_req"},
      {"dp_2", "f_colebrook() has no closed form"},
  };
  for (const auto& [name, why] : value_only) {
    const std::string ref = NamedCell(book, name);
    ASSERT_FALSE(ref.empty()) << name;
    const json cell = CellAt(calc, ref);
    EXPECT_FALSE(cell.contains("f")) << name;
    EXPECT_NEAR(Num(cell), Quantity(results, name)["si_value"].get<double>(),
                1e-15 * std::fabs(Num(cell)))
        << name;
    const std::string note = calc["notes"].contains(ref) ? calc["notes"][ref] : "";
    EXPECT_NE(note.find("heatdeck's value, not a formula"), std::string::npos) << name;
    EXPECT_NE(note.find(why), std::string::npos) << name << ": " << note;
  }
  // Formulas read the value cells: dp_w's formula reads f_w.
  EXPECT_EQ(CellAt(calc, NamedCell(book, "dp_w"))["f"].get<std::string>().find("f_w"), 0u);
  // A check side without a closed form is a value too.
  const std::string r = RowOf(NamedCell(book, "check_2"));
  EXPECT_FALSE(CellAt(calc, "C" + r).contains("f"));
  EXPECT_TRUE(CellAt(calc, "F" + r).contains("f"));
}

TEST_F(XlsxValuesDeck, SweepSheetWithAChartPerResult) {
  // sweep m_w from 0.8 to 1.4 kg/s step 0.2 (4 values) and T_w over 26, 32
  // degC: 8 points, the first swept input varying fastest in the table.
  const json* sweep = Sheet(book, "Sweep");
  ASSERT_NE(sweep, nullptr);
  EXPECT_EQ(CellAt(*sweep, "A4")["v"], "m_w [kg/s]");
  EXPECT_EQ(CellAt(*sweep, "B4")["v"], "T_w [degC]");
  const double m_w[] = {0.8, 1.0, 1.2, 1.4, 0.8, 1.0, 1.2, 1.4};
  const double t_w[] = {26, 26, 26, 26, 32, 32, 32, 32};
  for (int i = 0; i < 8; ++i) {
    EXPECT_NEAR(Num(CellAt(*sweep, "A" + std::to_string(5 + i))), m_w[i], 1e-12) << i;
    EXPECT_NEAR(Num(CellAt(*sweep, "B" + std::to_string(5 + i))), t_w[i], 1e-12) << i;
  }
  EXPECT_FALSE(CellAt(*sweep, "A13").contains("v"));
  ASSERT_FALSE(book["charts"].empty());
  // Each chart plots a result against m_w, one series per T_w.
  const std::string chart = book["charts"].begin().value();
  EXPECT_NE(chart.find("<c:scatterChart>"), std::string::npos);
  EXPECT_NE(chart.find("Sweep!$A$5:$A$8"), std::string::npos);
  EXPECT_NE(chart.find("Sweep!$A$9:$A$12"), std::string::npos);
  EXPECT_NE(chart.find("T_w = 26.00 degC"), std::string::npos);
}

// Every kind of text a deck carries (title, meta, section, narrative,
// descriptions, sources, check and case descriptions), each beginning with
// a character that makes a spreadsheet read a formula: all of it reaches
// every sheet as text, never as a formula.
TEST(XlsxWriter, DeckTextBeginningWithAFormulaSignIsTextOnEverySheet) {
  Written w("xlsx_injection");
  const std::vector<std::string> texts = {"=HYPERLINK(\"http://example.invalid\",\"title\")",
                                          "+project 1",
                                          "-prepared by",
                                          "@status",
                                          "=section",
                                          "=narrative(1)",
                                          "=description of m",
                                          "@source of m",
                                          "+description of cp",
                                          "-source of cp",
                                          "-description of C",
                                          "=check description",
                                          "+case description"};
  std::map<std::string, int> seen;
  for (const auto& sheet : w.book["sheets"]) {
    for (const auto& [ref, cell] : sheet["cells"].items()) {
      if (!cell.contains("v") || !cell["v"].is_string()) continue;
      const std::string v = cell["v"];
      for (const std::string& t : texts) {
        if (v.find(t) == std::string::npos) continue;
        ++seen[t];
        const std::string where = sheet["name"].get<std::string>() + "!" + ref;
        EXPECT_FALSE(cell.contains("f")) << where << " holds a formula: " << cell.dump();
        EXPECT_EQ(cell["t"], "s") << where << " is not a text cell: " << cell.dump();
      }
    }
  }
  for (const std::string& t : texts)
    EXPECT_GT(seen[t], 0) << "'" << t << "' is not in the workbook";
  // The title heads the summary, the calculation and the case's sheet.
  EXPECT_EQ(seen[texts[0]], 3);
}

// A description longer than a cell holds (40 000 bytes of two-byte 'é'):
// the cell keeps what fits, cut between characters, and ends by saying it
// was cut.
TEST(XlsxWriter, TextLongerThanACellHoldsIsCutVisibly) {
  TempFolder dir("xlsx_long_text");
  std::string long_text = "Start of a long description ";
  while (long_text.size() < 40000) long_text += "\xC3\xA9";  // é
  const std::string deck = dir.path() + "/long.deck";
  {
    std::ofstream f(deck, std::ios::binary);
    f << "title \"Long text\"\ngiven m = 1 kg/s \"" << long_text << "\"\nQ = m * 2 J/kg\n";
  }
  const std::string path = WriteWorkbook(deck, dir.path());
  ASSERT_FALSE(path.empty());
  const json book = DumpWorkbook(path);
  int cut = 0;
  for (const auto& sheet : book["sheets"]) {
    for (const auto& [ref, cell] : sheet["cells"].items()) {
      if (!cell.contains("v") || !cell["v"].is_string()) continue;
      const std::string v = cell["v"];
      if (v.rfind("Start of a long description", 0) != 0) continue;
      ++cut;
      EXPECT_LE(v.size(), 32767u) << ref;
      const std::string tail = "the HTML report has the whole text]";
      ASSERT_GE(v.size(), tail.size());
      EXPECT_EQ(v.substr(v.size() - tail.size()), tail) << ref;
      // Only whole characters before the note: "é" pairs, then " … [cut".
      const size_t note = v.find(" \xE2\x80\xA6 [cut");
      ASSERT_NE(note, std::string::npos) << ref;
      EXPECT_EQ((note - 28) % 2, 0u) << ref;  // 28 bytes of "Start of …description "
    }
  }
  EXPECT_GT(cut, 0) << "the description is not in the workbook";
}

}  // namespace
}  // namespace heatdeck::testing
