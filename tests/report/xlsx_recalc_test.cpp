// The independent recalculation test (issue: the auditable workbook): a
// spreadsheet engine outside the project, LibreOffice Calc run headless,
// recalculates heatdeck's workbooks after their cached values are removed,
// and every formula cell must equal heatdeck's value to 1e-9 relative; then
// an input is changed in the workbook and the recalculated cells must equal
// what heatdeck computes for the changed deck.  The work is done by
// tests/report/xlsx_recalc.py (its header says exactly how); this test
// picks the decks and runs it.
//
// Skipped, with a message, only when `soffice` is not installed
// (Debian: apt-get install libreoffice-calc-nogui); CI installs it.
#include <algorithm>
#include <filesystem>
#include <iostream>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "xlsx_test_support.h"

namespace heatdeck::testing {
namespace {

TEST(XlsxRecalc, LibreOfficeRecalculatesTheWorkbooksToHeatdecksValues) {
  std::string out;
  if (RunCommand("command -v soffice 2>&1", &out) != 0) {
    GTEST_SKIP() << "LibreOffice (soffice) is not installed, so the workbook cannot be "
                    "recalculated independently: apt-get install libreoffice-calc-nogui";
  }
  ASSERT_TRUE(std::filesystem::exists(HD_BINARY))
      << "the heatdeck binary is missing (build the heatdeck target): " << HD_BINARY;

  // Every example deck, changing its first given by 10 %; then the test
  // decks, each with an input that moves most of its results.
  std::vector<std::string> decks;
  std::vector<std::string> examples;
  for (const auto& entry : std::filesystem::directory_iterator(RepoDir() + "/examples")) {
    if (entry.path().extension() == ".deck") examples.push_back(entry.path().string());
  }
  std::sort(examples.begin(), examples.end());
  for (const std::string& e : examples) decks.push_back(e + "|auto");
  decks.push_back(DataDeck("xlsx_first.deck") + "|m_h=0.65 kg/s");
  decks.push_back(DataDeck("xlsx_language.deck") + "|x=1.6");
  decks.push_back(DataDeck("xlsx_library.deck") + "|Re_t=31000");
  decks.push_back(DataDeck("xlsx_values.deck") + "|m_w=1.2 kg/s");

  TempFolder work("xlsx_recalc");
  std::string command = "python3 " + Quote(RepoDir() + "/tests/report/xlsx_recalc.py") +
                        " check --heatdeck " + Quote(HD_BINARY) + " --workdir " +
                        Quote(work.path());
  for (const std::string& d : decks) command += " " + Quote(d);
  const int status = RunCommand(command + " 2>&1", &out);
  std::cout << out;
  EXPECT_EQ(status, 0) << out;
  // The script reports every deck; a deck it skipped would be a silent pass.
  for (const std::string& d : decks) {
    const std::string path = d.substr(0, d.find('|'));
    EXPECT_NE(out.find(path + ": with "), std::string::npos) << path << " was not checked";
  }
  EXPECT_NE(out.find("\n0 mismatches"), std::string::npos);
}

}  // namespace
}  // namespace heatdeck::testing
