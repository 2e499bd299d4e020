// `heatdeck diff` run as a process: two deck files, and `--rev` against a
// git repository made by the test; the three formats; the exit statuses of
// LANGUAGE.md "Diagnostics and exit codes" applied to the new deck.
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "process_runner.h"

namespace heatdeck::testing {
namespace {

namespace fs = std::filesystem;

void Write(const fs::path& path, const std::string& text) {
  fs::create_directories(path.parent_path());
  std::ofstream f(path, std::ios::binary);
  f << text;
  ASSERT_TRUE(f.good()) << path;
}

// Q = m·cp·ΔT with ΔT fixed at 40 K; the check holds while Q <= 100 kW.
std::string Deck(const std::string& m, const std::string& revision) {
  return "title \"Heater\"\n"
         "meta revision \"" +
         revision +
         "\"\n"
         "given m  = " +
         m +
         "\n"
         "given cp = 4 kJ/(kg*K)\n"
         "given dT = 40 K\n"
         "Q = m * cp * dT in kW\n"
         "check Q <= 100 kW\n";
}

// Runs git in dir; the test's identity is given on the command line so
// that no global configuration is needed.
int Git(const std::string& dir, const std::string& args) {
  const std::string cmd = "git -C '" + dir +
                          "' -c user.name=test -c user.email=test@example.invalid "
                          "-c commit.gpgsign=false " +
                          args + " >/dev/null 2>&1";
  return std::system(cmd.c_str());
}

TEST(DiffCli, TwoFilesText) {
  TempDir dir;
  Write(fs::path(dir.path()) / "old.deck", Deck("0.5 kg/s", "A"));
  Write(fs::path(dir.path()) / "new.deck", Deck("0.6 kg/s", "B"));
  const ProcessResult r = RunHeatdeck({"diff", "old.deck", "new.deck"}, dir.path());
  // m: 0.5 -> 0.6 kg/s, +20 %; Q = m·4000·40: 80 kW -> 96 kW, +20 %; the
  // check Q <= 100 kW passes on both sides, so no check is listed and the
  // status is 0.
  EXPECT_EQ(r.status, 0) << r.err;
  EXPECT_EQ(r.out,
            "old: old.deck\n"
            "new: new.deck\n"
            "\n"
            "meta revision: \"A\" -> \"B\"\n"
            "\n"
            "case base\n"
            "  inputs changed:\n"
            "    m  0.5 kg/s  ->  0.6 kg/s  +20%\n"
            "  results changed:\n"
            "    Q  80 kW  ->  96 kW  +20%\n");
  EXPECT_EQ(r.err, "");
  // The same bytes every time.
  EXPECT_EQ(RunHeatdeck({"diff", "old.deck", "new.deck"}, dir.path()).out, r.out);
}

TEST(DiffCli, CheckFailingInNewDeckGivesStatusOne) {
  TempDir dir;
  Write(fs::path(dir.path()) / "old.deck", Deck("0.5 kg/s", "A"));
  Write(fs::path(dir.path()) / "new.deck", Deck("0.7 kg/s", "A"));
  // Q = 0.7·4000·40 = 112 kW > 100 kW: the check flips to fail.
  const ProcessResult r = RunHeatdeck({"diff", "old.deck", "new.deck"}, dir.path());
  EXPECT_EQ(r.status, 1) << r.err;
  EXPECT_NE(r.out.find("    Q  80 kW  ->  112 kW  +40%\n"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("  checks changed:\n    Q <= 100 kW  pass  ->  fail\n"), std::string::npos)
      << r.out;
  // The other way round the new deck passes: status 0.
  const ProcessResult back = RunHeatdeck({"diff", "new.deck", "old.deck"}, dir.path());
  EXPECT_EQ(back.status, 0) << back.err;
  EXPECT_NE(back.out.find("Q <= 100 kW  fail  ->  pass"), std::string::npos) << back.out;
}

TEST(DiffCli, UnchangedDeck) {
  TempDir dir;
  Write(fs::path(dir.path()) / "a.deck", Deck("0.5 kg/s", "A"));
  const ProcessResult r = RunHeatdeck({"diff", "a.deck", "a.deck"}, dir.path());
  EXPECT_EQ(r.status, 0) << r.err;
  EXPECT_EQ(r.out, "old: a.deck\nnew: a.deck\nno differences\n");
}

TEST(DiffCli, MarkdownAndJson) {
  TempDir dir;
  Write(fs::path(dir.path()) / "old.deck", Deck("0.5 kg/s", "A"));
  Write(fs::path(dir.path()) / "new.deck", Deck("0.7 kg/s", "A"));
  const ProcessResult md = RunHeatdeck({"diff", "-f", "md", "old.deck", "new.deck"}, dir.path());
  EXPECT_EQ(md.status, 1) << md.err;
  EXPECT_EQ(md.out.rfind("# Deck differences\n", 0), 0u) << md.out;
  EXPECT_NE(md.out.find("| `Q` | 80 kW | 112 kW | +40% |\n"), std::string::npos) << md.out;
  EXPECT_NE(md.out.find("| `Q <= 100 kW` | pass | fail |\n"), std::string::npos) << md.out;

  const ProcessResult js = RunHeatdeck({"diff", "old.deck", "new.deck", "-f", "json"}, dir.path());
  EXPECT_EQ(js.status, 1) << js.err;
  const nlohmann::json j = nlohmann::json::parse(js.out);
  EXPECT_EQ(j["old"], "old.deck");
  EXPECT_EQ(j["changed"], true);
  const auto& q = j["cases"][0]["results"][0];
  EXPECT_EQ(q["name"], "Q");
  EXPECT_DOUBLE_EQ(q["old"]["si_value"].get<double>(), 80000.0);   // 0.5·4000·40 W
  EXPECT_DOUBLE_EQ(q["new"]["si_value"].get<double>(), 112000.0);  // 0.7·4000·40 W
  EXPECT_NEAR(q["change_percent"].get<double>(), 40.0, 1e-9);
  EXPECT_EQ(j["cases"][0]["checks"][0]["new"], "fail");
}

TEST(DiffCli, DeckErrorsGiveStatusTwo) {
  TempDir dir;
  Write(fs::path(dir.path()) / "good.deck", Deck("0.5 kg/s", "A"));
  Write(fs::path(dir.path()) / "bad.deck", "given x = 1 m\ny = x + 1 kg\n");
  for (const auto& args : {std::vector<std::string>{"diff", "good.deck", "bad.deck"},
                           std::vector<std::string>{"diff", "bad.deck", "good.deck"}}) {
    const ProcessResult r = RunHeatdeck(args, dir.path());
    EXPECT_EQ(r.status, 2) << args[1];
    EXPECT_EQ(r.out, "") << args[1];
    EXPECT_NE(r.err.find("bad.deck:2:5: error: cannot add m and kg"), std::string::npos) << r.err;
  }
}

TEST(DiffCli, UsageAndFileTroubleGiveStatusThree) {
  TempDir dir;
  Write(fs::path(dir.path()) / "a.deck", Deck("0.5 kg/s", "A"));
  const std::vector<std::vector<std::string>> bad = {
      {"diff", "a.deck"},                             // one deck without --rev
      {"diff", "a.deck", "a.deck", "a.deck"},         // three decks
      {"diff", "a.deck", "missing.deck"},             // no such file
      {"diff", "-f", "xml", "a.deck", "a.deck"},      // unknown format
      {"diff", "--rev", "HEAD", "a.deck", "a.deck"},  // --rev takes one deck
      {"diff", "--rev", "HEAD", "a.deck"},            // not in a git repository
  };
  for (const auto& args : bad) {
    const ProcessResult r = RunHeatdeck(args, dir.path());
    std::string line;
    for (const auto& a : args) line += a + " ";
    EXPECT_EQ(r.status, 3) << line << "\n" << r.err;
    EXPECT_EQ(r.out, "") << line;
    EXPECT_NE(r.err.find("heatdeck"), std::string::npos) << line;
  }
}

TEST(DiffCli, RevisionThroughGit) {
  TempDir repo;
  const fs::path calc = fs::path(repo.path()) / "calc";
  Write(calc / "heater.deck", Deck("0.5 kg/s", "A"));
  ASSERT_EQ(Git(repo.path(), "init -q"), 0);
  ASSERT_EQ(Git(repo.path(), "add calc/heater.deck"), 0);
  ASSERT_EQ(Git(repo.path(), "commit -q -m first"), 0);

  // Unchanged working tree: nothing differs.
  ProcessResult r = RunHeatdeck({"diff", "--rev", "HEAD", "calc/heater.deck"}, repo.path());
  EXPECT_EQ(r.status, 0) << r.err;
  EXPECT_EQ(r.out, "old: HEAD:calc/heater.deck\nnew: calc/heater.deck\nno differences\n");

  // Edit, then compare with the committed version, from the repository top
  // and from inside the deck's folder: the old side is named by its path
  // in the repository either way.
  Write(calc / "heater.deck", Deck("0.7 kg/s", "B"));
  r = RunHeatdeck({"diff", "--rev", "HEAD", "calc/heater.deck"}, repo.path());
  EXPECT_EQ(r.status, 1) << r.err;  // Q = 112 kW fails Q <= 100 kW
  EXPECT_EQ(r.out.rfind("old: HEAD:calc/heater.deck\nnew: calc/heater.deck\n", 0), 0u) << r.out;
  EXPECT_NE(r.out.find("    m  0.5 kg/s  ->  0.7 kg/s  +40%\n"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("Q <= 100 kW  pass  ->  fail"), std::string::npos) << r.out;
  r = RunHeatdeck({"diff", "--rev", "HEAD", "heater.deck", "-f", "json"}, calc.string());
  EXPECT_EQ(r.status, 1) << r.err;
  const nlohmann::json j = nlohmann::json::parse(r.out);
  EXPECT_EQ(j["old"], "HEAD:calc/heater.deck");
  EXPECT_EQ(j["new"], "heater.deck");
  EXPECT_EQ(j["note"], "");  // the deck reads no other file

  // A revision that does not exist, and a deck git does not know.
  r = RunHeatdeck({"diff", "--rev", "no-such-rev", "calc/heater.deck"}, repo.path());
  EXPECT_EQ(r.status, 3);
  EXPECT_NE(r.err.find("heatdeck: git: "), std::string::npos) << r.err;
  Write(calc / "untracked.deck", Deck("0.5 kg/s", "A"));
  r = RunHeatdeck({"diff", "--rev", "HEAD", "calc/untracked.deck"}, repo.path());
  EXPECT_EQ(r.status, 3);
  EXPECT_EQ(r.out, "");
}

TEST(DiffCli, RevisionReadsTemplatesFromCurrentFiles) {
  TempDir repo;
  // The template sets the design limit; the deck binds its input.
  Write(fs::path(repo.path()) / "limit.deck", "given Q = 1 kW\ncheck Q <= 100 kW\n");
  Write(fs::path(repo.path()) / "heater.deck",
        Deck("0.5 kg/s", "A") + "use \"limit.deck\" as lim with Q = Q\n");
  ASSERT_EQ(Git(repo.path(), "init -q"), 0);
  ASSERT_EQ(Git(repo.path(), "add limit.deck heater.deck"), 0);
  ASSERT_EQ(Git(repo.path(), "commit -q -m first"), 0);
  // Only the template changes: the limit drops to 50 kW.  The old version
  // of the deck is read from git but its template from the current file,
  // so both sides see the new limit and the output says so.
  Write(fs::path(repo.path()) / "limit.deck", "given Q = 1 kW\ncheck Q <= 50 kW\n");
  const ProcessResult r = RunHeatdeck({"diff", "--rev", "HEAD", "heater.deck"}, repo.path());
  EXPECT_EQ(r.status, 1) << r.err;  // Q = 80 kW fails the template's Q <= 50 kW
  EXPECT_EQ(r.out,
            "old: HEAD:heater.deck\n"
            "new: heater.deck\n"
            "note: the old version's templates and tables are read from the current files, not "
            "from HEAD\n"
            "no differences\n");
}

}  // namespace
}  // namespace heatdeck::testing
