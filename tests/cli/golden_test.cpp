// Golden tests: the real executable on every deck of tests/cli/golden/ and
// of examples/, compared byte for byte with the expected standard error,
// exit status and (for decks that evaluate) the JSON written by
// `heatdeck run DECK -f json -o -`.  tools/refresh-golden.sh rewrites the
// expected files; tests/cli/golden/README.md says when and how.
//
// Decks whose expected status is 2 (the deck has errors) are held to the
// rules of LANGUAGE.md "Diagnostics and exit codes" beyond their golden
// text: at least one `FILE:LINE:COL: error:` line followed by that source
// line and a caret, nothing on standard output, and `run -o DIR` writes
// nothing into DIR.
//
// Besides the hand-written decks, tests/cli/golden/mutated/ holds decks
// that tools/mutate-examples.py derived from examples/ by breaking them in
// typical ways; they are run the same way from that folder.  Every run has
// a time limit: a deck that hangs the process fails instead of stalling the
// suite.
#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <ostream>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "golden_support.h"
#include "process_runner.h"
#include "test_paths.h"

namespace heatdeck::testing {
namespace {

namespace fs = std::filesystem;

// One deck to run: the folder to run in, the deck as passed on the command
// line (relative, so that messages and the JSON `deck` field are stable),
// and where its expected files live (path without extension).
struct GoldenCase {
  std::string id;
  std::string cwd;
  std::string deck;
  std::string expected;
};

// gtest prints this for a failing case instead of the object's bytes.
void PrintTo(const GoldenCase& g, std::ostream* os) { *os << g.deck; }

std::string GoldenDir() { return RepoDir() + "/tests/cli/golden"; }
std::string MutatedDir() { return GoldenDir() + "/mutated"; }

// Generous: CI also runs this suite under ASan and UBSan on two cores; a
// deck normally takes well under a second.
constexpr double kDeckTimeout = 20;

// The decks of dir, sorted by name.
std::vector<fs::path> DecksIn(const std::string& dir) {
  std::vector<fs::path> decks;
  if (!fs::is_directory(dir)) return decks;
  for (const auto& e : fs::directory_iterator(dir)) {
    if (e.path().extension() == ".deck") decks.push_back(e.path());
  }
  std::sort(decks.begin(), decks.end());
  return decks;
}

std::vector<GoldenCase> AllCases() {
  std::vector<GoldenCase> cases;
  for (const fs::path& p : DecksIn(GoldenDir())) {
    const std::string stem = p.stem().string();
    cases.push_back(
        GoldenCase{stem, GoldenDir(), stem + ".deck", (fs::path(GoldenDir()) / stem).string()});
  }
  for (const fs::path& p : DecksIn(MutatedDir())) {
    const std::string stem = p.stem().string();
    cases.push_back(GoldenCase{"mutated_" + stem, MutatedDir(), stem + ".deck",
                               (fs::path(MutatedDir()) / stem).string()});
  }
  for (const fs::path& p : DecksIn(RepoDir() + "/examples")) {
    const std::string stem = p.stem().string();
    cases.push_back(GoldenCase{"examples_" + stem, RepoDir(), "examples/" + stem + ".deck",
                               (fs::path(GoldenDir()) / "examples" / stem).string()});
  }
  return cases;
}

// The cases expected to exit with `status`, or to write JSON.
std::vector<GoldenCase> CasesWithStatus(int status) {
  std::vector<GoldenCase> v;
  for (const GoldenCase& g : AllCases()) {
    if (fs::exists(g.expected + ".status") && ReadStatus(g.expected + ".status") == status) {
      v.push_back(g);
    }
  }
  return v;
}

std::vector<GoldenCase> CasesWithJson() {
  std::vector<GoldenCase> v;
  for (const GoldenCase& g : AllCases()) {
    if (fs::exists(g.expected + ".json")) v.push_back(g);
  }
  return v;
}

std::string TestName(const ::testing::TestParamInfo<GoldenCase>& info) {
  std::string s = info.param.id;
  for (char& c : s) {
    const bool alnum = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9');
    if (!alnum) c = '_';
  }
  return s;
}

class Golden : public ::testing::TestWithParam<GoldenCase> {};
class GoldenWithErrors : public ::testing::TestWithParam<GoldenCase> {};
class GoldenEvaluated : public ::testing::TestWithParam<GoldenCase> {};

TEST_P(Golden, MatchesExpectedOutput) {
  const GoldenCase& g = GetParam();
  ASSERT_TRUE(fs::exists(g.expected + ".status"))
      << g.deck << " has no expected files; run tools/refresh-golden.sh";
  const int want_status = ReadStatus(g.expected + ".status");
  const std::string want_err = ReadFile(g.expected + ".stderr");
  const bool has_json = fs::exists(g.expected + ".json");

  const ProcessResult r =
      RunHeatdeck({"run", g.deck, "-f", "json", "-o", "-"}, g.cwd, kDeckTimeout);
  ASSERT_FALSE(r.timed_out) << g.deck << " ran longer than " << kDeckTimeout << " s";
  ASSERT_FALSE(r.signalled) << g.deck << " crashed the process (status " << r.status << ")\n"
                            << r.err;
  EXPECT_EQ(r.status, want_status) << r.err;
  EXPECT_EQ(r.err, want_err);
  if (has_json) {
    EXPECT_EQ(r.out, ReadFile(g.expected + ".json"));
  } else {
    EXPECT_EQ(r.out, "") << "no " << g.expected << ".json, so nothing is expected on stdout";
  }
}

// The rules every deck with errors must follow, whatever its golden text.
TEST_P(GoldenWithErrors, IsLocatedAndWritesNothing) {
  const GoldenCase& g = GetParam();
  const std::string source = ReadFile((fs::path(g.cwd) / g.deck).string());

  const ProcessResult check = RunHeatdeck({"check", g.deck}, g.cwd, kDeckTimeout);
  ASSERT_FALSE(check.timed_out) << g.deck << " ran longer than " << kDeckTimeout << " s";
  ASSERT_FALSE(check.signalled) << check.err;
  EXPECT_EQ(check.status, 2);
  std::string why;
  EXPECT_TRUE(HasLocatedError(check.err, g.deck, source, &why)) << why << "\n" << check.err;
  EXPECT_TRUE(check.out.rfind(g.deck + ": ", 0) == 0 &&
              check.out.find(" error") != std::string::npos)
      << "check prints one summary line with the error count, got: " << check.out;

  TempDir out;
  const ProcessResult run = RunHeatdeck({"run", g.deck, "-o", out.path()}, g.cwd, kDeckTimeout);
  ASSERT_FALSE(run.timed_out) << g.deck << " ran longer than " << kDeckTimeout << " s";
  ASSERT_FALSE(run.signalled) << run.err;
  EXPECT_EQ(run.status, 2);
  EXPECT_TRUE(HasLocatedError(run.err, g.deck, source, &why)) << why << "\n" << run.err;
  EXPECT_EQ(run.out, "");
  EXPECT_EQ(out.Entries(), std::vector<std::string>{}) << "a deck with errors must write nothing";
}

// A deck that evaluates writes the same JSON to a file as to stdout, next to
// the other default formats.
TEST_P(GoldenEvaluated, WritesItsReports) {
  const GoldenCase& g = GetParam();
  TempDir out;
  const ProcessResult r = RunHeatdeck({"run", g.deck, "-o", out.path()}, g.cwd, kDeckTimeout);
  ASSERT_FALSE(r.timed_out) << g.deck << " ran longer than " << kDeckTimeout << " s";
  ASSERT_FALSE(r.signalled) << r.err;
  EXPECT_EQ(r.status, ReadStatus(g.expected + ".status")) << r.err;
  const std::string stem = fs::path(g.deck).stem().string();
  EXPECT_EQ(out.Entries(),
            (std::vector<std::string>{stem + ".html", stem + ".json", stem + ".xlsx"}));
  EXPECT_EQ(ReadFile(out.path() + "/" + stem + ".json"), ReadFile(g.expected + ".json"));
}

INSTANTIATE_TEST_SUITE_P(Decks, Golden, ::testing::ValuesIn(AllCases()), TestName);
INSTANTIATE_TEST_SUITE_P(Decks, GoldenWithErrors, ::testing::ValuesIn(CasesWithStatus(2)),
                         TestName);
INSTANTIATE_TEST_SUITE_P(Decks, GoldenEvaluated, ::testing::ValuesIn(CasesWithJson()), TestName);

// Issue 2, "done when": a deck with five different mistakes gets all five
// reported with file:line:col and a caret, exit 2.
TEST(GoldenFolder, FiveMistakesAreAllReportedInOneRun) {
  const std::string deck = "bad_five_mistakes.deck";
  const std::string source = ReadFile(GoldenDir() + "/" + deck);
  const ProcessResult r = RunHeatdeck({"check", deck}, GoldenDir());
  EXPECT_EQ(r.status, 2);
  std::string why;
  EXPECT_TRUE(HasLocatedError(r.err, deck, source, &why)) << why;
  std::vector<int> lines;
  for (size_t at = 0; (at = r.err.find("\n" + deck + ":", at)) != std::string::npos; ++at) {
    lines.push_back(std::atoi(r.err.c_str() + at + 1 + deck.size() + 1));
  }
  if (r.err.rfind(deck + ":", 0) == 0)
    lines.insert(lines.begin(), std::atoi(r.err.c_str() + deck.size() + 1));
  EXPECT_EQ(lines, (std::vector<int>{5, 6, 7, 8, 9})) << r.err;
  EXPECT_EQ(r.out, deck + ": 5 errors\n");
}

// The golden folder keeps its promise: enough malformed decks, and every
// deck has its expected files (an orphaned expected file is a deck that was
// renamed or removed without refreshing).
TEST(GoldenFolder, HoldsAtLeastTwoHundredMalformedDecks) {
  EXPECT_GE(CasesWithStatus(2).size(), 200u);
}

// The mutated corpus is there and mostly broken: a mutation that leaves a
// valid deck is allowed, but a corpus of valid decks would test little.
TEST(GoldenFolder, MutatedCorpusIsMostlyMalformed) {
  size_t decks = 0, malformed = 0;
  for (const fs::path& p : DecksIn(MutatedDir())) {
    ++decks;
    const fs::path status = fs::path(MutatedDir()) / (p.stem().string() + ".status");
    if (fs::exists(status) && ReadStatus(status.string()) == 2) ++malformed;
  }
  EXPECT_GE(decks, 140u) << "run tools/mutate-examples.py, then tools/refresh-golden.sh";
  EXPECT_GE(malformed * 4, decks * 3)
      << malformed << " of " << decks << " mutated decks have errors";
}

TEST(GoldenFolder, EveryExpectedFileBelongsToADeck) {
  for (const std::string& dir : {GoldenDir(), MutatedDir(), GoldenDir() + "/examples"}) {
    const std::string deck_dir = dir == GoldenDir() + "/examples" ? RepoDir() + "/examples" : dir;
    for (const auto& e : fs::directory_iterator(dir)) {
      const std::string ext = e.path().extension().string();
      if (ext != ".stderr" && ext != ".json" && ext != ".status") continue;
      const fs::path deck = fs::path(deck_dir) / (e.path().stem().string() + ".deck");
      EXPECT_TRUE(fs::exists(deck)) << e.path() << " has no deck " << deck;
    }
  }
}

}  // namespace
}  // namespace heatdeck::testing
