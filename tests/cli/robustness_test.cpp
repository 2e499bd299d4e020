// The command line under failure and hostile input, run as a user runs it:
//
//  - outputs are atomic: a run that fails (a deck error, a format that
//    cannot be written) writes no new file, leaves the previous good
//    reports in the -o folder byte for byte, and leaves no temporary file;
//  - `use` and `table` read only inside the deck's folder (and the template
//    library) unless --allow-path names another folder: `..`, absolute
//    paths and symbolic links that lead outside are refused with a located
//    error and exit 2;
//  - the limits against oversized input (--max-file-size, --max-depth,
//    --max-statements, --max-points) stop a deck with a clear error and exit
//    2, and the same deck passes when the limit is raised;
//  - every example deck gives the same bytes in every format, run after
//    run and whatever the number of threads;
//  - text from the deck stays text in the HTML report.
#include <algorithm>
#include <cctype>
#include <chrono>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "golden_support.h"
#include "process_runner.h"
#include "test_paths.h"

namespace heatdeck::testing {
namespace {

namespace fs = std::filesystem;
using nlohmann::json;

constexpr double kTimeout = 60;  // seconds per run; runs here take well under one

void WriteText(const std::string& path, const std::string& text) {
  fs::create_directories(fs::path(path).parent_path());
  std::ofstream f(path, std::ios::binary);
  f << text;
  ASSERT_TRUE(f.good()) << "cannot write " << path;
}

// Runs heatdeck; fails the test when the process was killed or hung.
ProcessResult Heatdeck(const std::vector<std::string>& args, const std::string& cwd) {
  ProcessResult r = RunHeatdeck(args, cwd, kTimeout);
  EXPECT_FALSE(r.timed_out) << "heatdeck ran longer than " << kTimeout << " s";
  EXPECT_FALSE(r.signalled) << "heatdeck was killed by signal " << r.status - 128 << "\n" << r.err;
  return r;
}

// Every file in a folder (recursively) with its bytes; names relative to it.
std::map<std::string, std::string> Snapshot(const std::string& dir) {
  std::map<std::string, std::string> files;
  for (const auto& e : fs::recursive_directory_iterator(dir)) {
    const std::string rel = fs::relative(e.path(), dir).string();
    files[rel] = e.is_regular_file() ? ReadFile(e.path().string()) : std::string("<folder>");
  }
  return files;
}

std::vector<std::string> Names(const std::map<std::string, std::string>& files) {
  std::vector<std::string> names;
  for (const auto& [name, bytes] : files) names.push_back(name);
  return names;
}

// The SI value of quantity `name` in the base case of heatdeck's JSON.
double SiValue(const std::string& json_text, const std::string& name) {
  const json j = json::parse(json_text, nullptr, false);
  if (j.is_discarded()) {
    ADD_FAILURE() << "not JSON: " << json_text.substr(0, 500);
    return NAN;
  }
  for (const auto& q : j["cases"][0]["quantities"]) {
    if (q["name"] == name) return q["si_value"].get<double>();
  }
  ADD_FAILURE() << "no quantity " << name;
  return NAN;
}

// ---------------------------------------------------------------------------
// The time limit of RunHeatdeck itself: a run past it is killed and flagged.

TEST(TimeLimit, RunPastItsLimitIsKilledAndReported) {
  TempDir dir;
  // 10^8 sweep points on one thread: seconds of work, far past the limit.
  WriteText(dir.path() + "/long.deck",
            "given L = 1 m\nA = L * L in m^2\nsweep L from 1 m to 1e8 m step 1 m\n");
  const auto start = std::chrono::steady_clock::now();
  const ProcessResult r =
      RunHeatdeck({"check", "long.deck", "--max-points", "1e9", "-j", "1"}, dir.path(), 0.3);
  const double took =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  EXPECT_TRUE(r.timed_out);
  EXPECT_TRUE(r.signalled);
  EXPECT_EQ(r.status, 128 + 9);
  EXPECT_LT(took, 10.0) << "the child was not stopped at its limit";

  const ProcessResult quick =
      RunHeatdeck({"check", "long.deck", "--max-points", "99"}, dir.path(), 20);
  EXPECT_FALSE(quick.timed_out);
  EXPECT_FALSE(quick.signalled);
  EXPECT_EQ(quick.status, 2) << quick.err;
}

// ---------------------------------------------------------------------------
// Atomic outputs

constexpr const char* kSweepDeck = R"deck(title "Plate cooler P-4 (invented)"
given m = 0.40 kg/s       "Water flow"
given cp = 4.19 kJ/(kg*K)
given dT = 12 K
Q = m * cp * dT in kW     "Duty"
check Q < 30 kW           "Within the plate pack rating"
sweep m from 0.2 kg/s to 0.5 kg/s step 0.1 kg/s
)deck";

class AtomicOutput : public ::testing::Test {
 protected:
  void SetUp() override {
    WriteText(deck_dir_.path() + "/cooler.deck", kSweepDeck);
    const ProcessResult r = Heatdeck({"run", "cooler.deck", "-o", out_.path(), "-f",
                                      "html,md,xlsx,json,csv", "--date", "2025-02-03"},
                                     deck_dir_.path());
    ASSERT_EQ(r.status, 0) << r.err;
    before_ = Snapshot(out_.path());
    ASSERT_EQ(Names(before_), (std::vector<std::string>{"cooler.csv", "cooler.html", "cooler.json",
                                                        "cooler.md", "cooler.xlsx"}));
  }

  TempDir deck_dir_;
  TempDir out_;
  std::map<std::string, std::string> before_;
};

TEST_F(AtomicOutput, DeckWithErrorsLeavesThePreviousReportsUntouched) {
  WriteText(deck_dir_.path() + "/cooler.deck", std::string(kSweepDeck) + "Q2 = Q * m_typo in kW\n");
  const ProcessResult r = Heatdeck(
      {"run", "cooler.deck", "-o", out_.path(), "-f", "html,md,xlsx,json,csv"}, deck_dir_.path());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("cooler.deck:8:10: error: unknown name 'm_typo'"), std::string::npos)
      << r.err;
  EXPECT_EQ(r.out, "");
  // Same names (nothing new, no temporary left) and the same bytes.
  EXPECT_EQ(Snapshot(out_.path()), before_);
}

TEST_F(AtomicOutput, FormatThatCannotBeWrittenLeavesItsPreviousFileAndNoTemporary) {
  // The same deck without its sweep: CSV (sweep rows) cannot be written
  // any more, while JSON can.
  std::string text = kSweepDeck;
  text.erase(text.find("sweep"));
  WriteText(deck_dir_.path() + "/cooler.deck", text);
  const ProcessResult r =
      Heatdeck({"run", "cooler.deck", "-o", out_.path(), "-f", "json,csv", "--date", "2025-02-03"},
               deck_dir_.path());
  EXPECT_EQ(r.status, 3) << "a format that cannot be written is trouble, not a deck error";
  EXPECT_NE(r.err.find("cooler.csv: "), std::string::npos) << r.err;
  const auto after = Snapshot(out_.path());
  EXPECT_EQ(Names(after), Names(before_)) << "no new file, no temporary left behind";
  EXPECT_EQ(after.at("cooler.csv"), before_.at("cooler.csv"));
  // The format that could be written was: the sweep is gone from the JSON.
  EXPECT_NE(after.at("cooler.json"), before_.at("cooler.json"));
  EXPECT_EQ(after.at("cooler.json").find("\"m\": 0.2"), std::string::npos);
  EXPECT_EQ(after.at("cooler.html"), before_.at("cooler.html"));
}

TEST_F(AtomicOutput, TargetThatIsAFolderFailsWithoutDebris) {
  // Something in the way of the workbook: a folder of that name.
  fs::remove(out_.path() + "/cooler.xlsx");
  WriteText(out_.path() + "/cooler.xlsx/keep.txt", "mine");
  const auto in_the_way = Snapshot(out_.path());
  const ProcessResult r =
      Heatdeck({"run", "cooler.deck", "-o", out_.path(), "-f", "xlsx", "--date", "2025-02-03"},
               deck_dir_.path());
  EXPECT_EQ(r.status, 3);
  EXPECT_NE(r.err.find("cooler.xlsx: "), std::string::npos) << r.err;
  EXPECT_EQ(Snapshot(out_.path()), in_the_way) << "the folder and the other reports untouched";
}

TEST_F(AtomicOutput, OneBadDeckAmongGoodOnesWritesOnlyTheGoodOnes) {
  WriteText(deck_dir_.path() + "/broken.deck", "given a = 1 m\nb = a + 1 kg\n");
  TempDir out;
  const ProcessResult r = Heatdeck(
      {"run", "broken.deck", "cooler.deck", "-o", out.path(), "-f", "json"}, deck_dir_.path());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("broken.deck:2:5: error: "), std::string::npos) << r.err;
  EXPECT_EQ(out.Entries(), std::vector<std::string>{"cooler.json"});
  EXPECT_EQ(r.out, "wrote " + out.path() + "/cooler.json\n");
}

// ---------------------------------------------------------------------------
// Paths: what `use` and `table` may read

constexpr const char* kTemplate = R"deck(title "Plate area"
given a = 2 m
given b = 3 m
A = a * b in m^2
)deck";

constexpr const char* kTable = "T [degC], cp [kJ/(kg*K)]\n20, 1.0\n60, 3.0\n";

// A work folder holding the deck's folder `deck/` and, beside it, `outside/`
// with a template and a table.  The decks below reach for those.
class Paths : public ::testing::Test {
 protected:
  void SetUp() override {
    root_ = fs::canonical(tmp_.path()).string();
    deck_ = root_ + "/deck";
    outside_ = root_ + "/outside";
    WriteText(outside_ + "/tpl.deck", kTemplate);
    WriteText(outside_ + "/props.csv", kTable);
    // A folder whose name starts like the allowed one: not inside it.
    WriteText(root_ + "/outside_more/tpl.deck", kTemplate);
    fs::create_directories(deck_);
  }

  // A deck using template `tpl` and table `table`, written to deck/NAME.
  std::string Deck(const std::string& name, const std::string& tpl, const std::string& table) {
    const std::string text = "use \"" + tpl + "\" as p with a = 4 m\n" + "table oil = \"" + table +
                             "\"\n" + "given T = 40 degC\n" + "cp = oil.cp(T) in kJ/(kg*K)\n" +
                             "A2 = 2 * p.A in m^2\n";
    WriteText(deck_ + "/" + name, text);
    return text;
  }

  // `check` refuses the deck: exit 2, both statements located at their
  // path strings, the reason named.
  void ExpectRefused(const std::string& name, const std::string& text,
                     const std::vector<std::string>& extra = {}) {
    std::vector<std::string> args = {"check", name};
    args.insert(args.end(), extra.begin(), extra.end());
    const ProcessResult r = Heatdeck(args, deck_);
    EXPECT_EQ(r.status, 2) << r.err;
    std::string why;
    EXPECT_TRUE(HasLocatedError(r.err, name, text, &why)) << why << "\n" << r.err;
    EXPECT_NE(r.err.find(name + ":1:5: error: cannot use '"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find(name + ":2:13: error: cannot read table '"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("lies outside the deck's folder"), std::string::npos) << r.err;

    TempDir out;
    std::vector<std::string> run = {"run", name, "-o", out.path()};
    run.insert(run.end(), extra.begin(), extra.end());
    const ProcessResult w = Heatdeck(run, deck_);
    EXPECT_EQ(w.status, 2) << w.err;
    EXPECT_EQ(out.Entries(), std::vector<std::string>{});
  }

  // With the folder allowed the deck evaluates, reading the outside files:
  // A = 4 m * 3 m = 12 m^2, so A2 = 24 m^2; cp at 40 degC lies halfway
  // between 1.0 and 3.0 kJ/(kg*K).
  void ExpectReads(const std::string& name, const std::vector<std::string>& allow) {
    std::vector<std::string> args = {"run", name, "-f", "json", "-o", "-"};
    args.insert(args.end(), allow.begin(), allow.end());
    const ProcessResult r = Heatdeck(args, deck_);
    ASSERT_EQ(r.status, 0) << r.err;
    EXPECT_DOUBLE_EQ(SiValue(r.out, "A2"), 24.0);
    EXPECT_DOUBLE_EQ(SiValue(r.out, "cp"), 2000.0);
  }

  TempDir tmp_;
  std::string root_, deck_, outside_;
};

TEST_F(Paths, ParentFolderIsRefusedUnlessAllowed) {
  const std::string text = Deck("up.deck", "../outside/tpl.deck", "../outside/props.csv");
  ExpectRefused("up.deck", text);
  ExpectReads("up.deck", {"--allow-path", outside_});
  // A relative --allow-path is taken from the current folder.
  ExpectReads("up.deck", {"--allow-path", "../outside"});
}

TEST_F(Paths, AbsolutePathIsRefusedUnlessAllowed) {
  const std::string text = Deck("abs.deck", outside_ + "/tpl.deck", outside_ + "/props.csv");
  ExpectRefused("abs.deck", text);
  ExpectReads("abs.deck", {"--allow-path", outside_});
}

TEST_F(Paths, SymbolicLinkLeadingOutsideIsRefusedUnlessAllowed) {
  fs::create_directory_symlink(outside_, deck_ + "/linked");
  fs::create_symlink(outside_ + "/tpl.deck", deck_ + "/tpl_link.deck");
  const std::string a = Deck("dirlink.deck", "linked/tpl.deck", "linked/props.csv");
  ExpectRefused("dirlink.deck", a);
  ExpectReads("dirlink.deck", {"--allow-path", outside_});
  fs::create_symlink(outside_ + "/props.csv", deck_ + "/props_link.csv");
  const std::string b = Deck("filelink.deck", "tpl_link.deck", "props_link.csv");
  ExpectRefused("filelink.deck", b);
  ExpectReads("filelink.deck", {"--allow-path", outside_});
}

TEST_F(Paths, PathsThatStayInsideAreRead) {
  fs::copy_file(outside_ + "/tpl.deck", deck_ + "/tpl.deck");
  WriteText(deck_ + "/sub/props.csv", kTable);
  Deck("inside.deck", "sub/../tpl.deck", "./sub/props.csv");
  ExpectReads("inside.deck", {});
}

TEST_F(Paths, AllowingOneFolderAllowsNoOther) {
  // outside_more/ starts with the allowed folder's name but is not inside it.
  const std::string a = Deck("near.deck", "../outside_more/tpl.deck", "../outside/props.csv");
  const ProcessResult r = Heatdeck({"check", "near.deck", "--allow-path", outside_}, deck_);
  EXPECT_EQ(r.status, 2);
  std::string why;
  EXPECT_TRUE(HasLocatedError(r.err, "near.deck", a, &why)) << why;
  EXPECT_NE(r.err.find("near.deck:1:5: error: cannot use '../outside_more/tpl.deck': '" + root_ +
                       "/outside_more/tpl.deck' lies outside"),
            std::string::npos)
      << r.err;
  EXPECT_EQ(r.err.find("near.deck:2:"), std::string::npos) << "the table is allowed\n" << r.err;

  // A link inside the allowed folder leads out of it again.
  fs::create_directory_symlink(root_ + "/outside_more", outside_ + "/back");
  const std::string b = Deck("back.deck", "../outside/back/tpl.deck", "../outside/props.csv");
  const ProcessResult s = Heatdeck({"check", "back.deck", "--allow-path", outside_}, deck_);
  EXPECT_EQ(s.status, 2);
  EXPECT_TRUE(HasLocatedError(s.err, "back.deck", b, &why)) << why;
  EXPECT_NE(s.err.find("back.deck:1:5: error: cannot use"), std::string::npos) << s.err;
}

// ---------------------------------------------------------------------------
// Limits against oversized input

// Runs `check` with the given limit option: over it the deck is refused
// with exit 2 and `message`, raised it passes.
struct LimitRun {
  ProcessResult over;
  ProcessResult raised;
};

LimitRun CheckWithLimit(const TempDir& dir, const std::string& name, const std::string& text,
                        const std::string& option, const std::string& low,
                        const std::string& high) {
  WriteText(dir.path() + "/" + name, text);
  LimitRun l;
  l.over = Heatdeck({"check", name, option, low}, dir.path());
  l.raised = Heatdeck({"check", name, option, high}, dir.path());
  return l;
}

TEST(Limits, MaxFileSize) {
  TempDir dir;
  const std::string text = "given m = 0.5 kg/s\nC = m * 4.19 kJ/(kg*K) in W/K\n";
  const std::string size = std::to_string(text.size());
  const LimitRun l = CheckWithLimit(dir, "small.deck", text, "--max-file-size",
                                    std::to_string(text.size() - 1), size);
  EXPECT_EQ(l.over.status, 2);
  EXPECT_NE(l.over.err.find("cannot read 'small.deck': the file is " + size +
                            " bytes, over the limit of " + std::to_string(text.size() - 1) +
                            " bytes (raise it with --max-file-size)"),
            std::string::npos)
      << l.over.err;
  EXPECT_EQ(l.raised.status, 0) << l.raised.err;
  EXPECT_EQ(l.raised.out, "small.deck: 2 quantities, 0 checks: 0 passed, 0 failed\n");

  // A table larger than the limit is refused where the deck names it.
  const std::string table = "T [degC], cp [kJ/(kg*K)]\n" + std::string(4000, '#') + "\n20, 1\n";
  WriteText(dir.path() + "/big.csv", table);
  const std::string deck = "table t = \"big.csv\"\ngiven T = 20 degC\ncp = t.cp(T)\n";
  WriteText(dir.path() + "/table.deck", deck);
  const ProcessResult r = Heatdeck({"check", "table.deck", "--max-file-size", "1000"}, dir.path());
  EXPECT_EQ(r.status, 2);
  std::string why;
  EXPECT_TRUE(HasLocatedError(r.err, "table.deck", deck, &why)) << why << "\n" << r.err;
  EXPECT_NE(r.err.find("table.deck:1:11: error: "), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("over the limit of 1000 bytes"), std::string::npos) << r.err;
}

TEST(Limits, MaxDepth) {
  TempDir dir;
  const std::string text =
      "given a = 2 m\nx = 3 * " + std::string(30, '(') + "a" + std::string(30, ')') + " in m\n";
  const LimitRun l = CheckWithLimit(dir, "deep.deck", text, "--max-depth", "20", "100");
  EXPECT_EQ(l.over.status, 2);
  std::string why;
  EXPECT_TRUE(HasLocatedError(l.over.err, "deep.deck", text, &why)) << why << "\n" << l.over.err;
  EXPECT_NE(l.over.err.find("deep.deck:2:"), std::string::npos) << l.over.err;
  EXPECT_NE(l.over.err.find("error: expression nested too deeply (limit 20 levels)"),
            std::string::npos)
      << l.over.err;
  EXPECT_EQ(l.raised.status, 0) << l.raised.err;
}

TEST(Limits, MaxStatements) {
  TempDir dir;
  std::string text = "given q0 = 1 W\n";
  for (int i = 1; i < 50; ++i) {
    text += "q" + std::to_string(i) + " = q" + std::to_string(i - 1) + " + 1 W\n";
  }
  const LimitRun l = CheckWithLimit(dir, "many.deck", text, "--max-statements", "10", "50");
  EXPECT_EQ(l.over.status, 2);
  std::string why;
  EXPECT_TRUE(HasLocatedError(l.over.err, "many.deck", text, &why)) << why << "\n" << l.over.err;
  EXPECT_NE(l.over.err.find("many.deck:11:1: error: too many statements (limit 10); raise it with "
                            "--max-statements"),
            std::string::npos)
      << l.over.err;
  EXPECT_EQ(l.raised.status, 0) << l.raised.err;
  EXPECT_EQ(l.raised.out, "many.deck: 50 quantities, 0 checks: 0 passed, 0 failed\n");
}

TEST(Limits, MaxPoints) {
  TempDir dir;
  // 0.1 m to 10 m by 0.1 m: 100 points; two such sweeps: a grid of 10 000.
  const std::string one =
      "given L = 1 m\ngiven W = 1 m\nA = L * W in m^2\n"
      "sweep L from 0.1 m to 10 m step 0.1 m\n";
  const LimitRun l = CheckWithLimit(dir, "sweep.deck", one, "--max-points", "99", "100");
  EXPECT_EQ(l.over.status, 2);
  std::string why;
  EXPECT_TRUE(HasLocatedError(l.over.err, "sweep.deck", one, &why)) << why << "\n" << l.over.err;
  EXPECT_NE(l.over.err.find("sweep.deck:4:1: error: the sweep of 'L' has 100 points, over the "
                            "limit of 99 (raise it with --max-points)"),
            std::string::npos)
      << l.over.err;
  EXPECT_EQ(l.raised.status, 0) << l.raised.err;

  const std::string grid = one + "sweep W from 0.1 m to 10 m step 0.1 m\n";
  const LimitRun g = CheckWithLimit(dir, "grid.deck", grid, "--max-points", "9999", "10000");
  EXPECT_EQ(g.over.status, 2);
  EXPECT_TRUE(HasLocatedError(g.over.err, "grid.deck", grid, &why)) << why << "\n" << g.over.err;
  EXPECT_NE(g.over.err.find("grid.deck:5:1: error: the sweep grid has 10000 points, over the "
                            "limit of 9999"),
            std::string::npos)
      << g.over.err;
  EXPECT_EQ(g.raised.status, 0) << g.raised.err;
}

// ---------------------------------------------------------------------------
// Determinism: the example decks, every format, any number of threads

std::vector<std::string> ExampleDecks() {
  std::vector<std::string> names;
  for (const auto& e : fs::directory_iterator(RepoDir() + "/examples")) {
    if (e.path().extension() == ".deck") names.push_back(e.path().stem().string());
  }
  std::sort(names.begin(), names.end());
  return names;
}

bool HasSweep(const std::string& text) {
  std::istringstream in(text);
  std::string line;
  while (std::getline(in, line)) {
    if (line.rfind("sweep ", 0) == 0) return true;
  }
  return false;
}

class Determinism : public ::testing::TestWithParam<std::string> {};

TEST_P(Determinism, SameBytesRunAfterRunAndWhateverTheThreads) {
  const std::string deck = "examples/" + GetParam() + ".deck";
  const bool sweep = HasSweep(ReadFile(RepoDir() + "/" + deck));
  const std::string formats = sweep ? "html,md,xlsx,json,csv" : "html,md,xlsx,json";
  std::map<std::string, std::string> first;
  int status = -1;
  for (const std::vector<std::string>& jobs :
       std::vector<std::vector<std::string>>{{}, {}, {"-j", "1"}, {"-j", "2"}, {"-j", "4"}}) {
    TempDir out;
    std::vector<std::string> args = {"run", deck,    "-o",     out.path(),
                                     "-f",  formats, "--date", "2025-03-04"};
    args.insert(args.end(), jobs.begin(), jobs.end());
    const ProcessResult r = Heatdeck(args, RepoDir());
    ASSERT_TRUE(r.status == 0 || r.status == 1) << r.err;
    const auto files = Snapshot(out.path());
    if (status < 0) {
      status = r.status;
      first = files;
      EXPECT_EQ(files.size(), sweep ? 5u : 4u);
      continue;
    }
    EXPECT_EQ(r.status, status);
    ASSERT_EQ(Names(files), Names(first));
    for (const auto& [name, bytes] : first) {
      EXPECT_TRUE(files.at(name) == bytes)
          << name << " differs with " << (jobs.empty() ? "the default threads" : jobs[1]);
    }
  }
}

INSTANTIATE_TEST_SUITE_P(Examples, Determinism, ::testing::ValuesIn(ExampleDecks()),
                         [](const ::testing::TestParamInfo<std::string>& info) {
                           std::string name = info.param;
                           for (char& c : name) {
                             if (!std::isalnum(static_cast<unsigned char>(c))) c = '_';
                           }
                           return name;
                         });

// ---------------------------------------------------------------------------
// Text from the deck stays text in the HTML report

TEST(Injection, HtmlReportShowsDeckTextAsText) {
  TempDir dir;
  const std::string text = R"deck(title "<script>alert('t')</script> & co"
meta project "<img src=x onerror=alert('p')>"
meta prepared "A&B <b>bold</b>"
section "</section><iframe src=evil>"
> Narrative with <style>body{display:none}</style> and <a href="javascript:x">a link</a>.
given m = 0.5 kg/s  "<svg onload=alert('d')>"  source "\"quoted\" <source>"
given cp = 4.19 kJ/(kg*K)
C = m * cp in W/K   "</td></tr><tr><td>injected"
check C > 1 kW/K    "<marquee>check</marquee>"
case hot "<object data=x>": m = 0.6 kg/s
)deck";
  WriteText(dir.path() + "/inj.deck", text);
  TempDir out;
  const ProcessResult r = Heatdeck(
      {"run", "inj.deck", "-o", out.path(), "-f", "html", "--date", "2025-03-04"}, dir.path());
  ASSERT_EQ(r.status, 0) << r.err;
  const std::string html = ReadFile(out.path() + "/inj.html");
  for (const char* tag :
       {"<script", "<img", "<iframe", "<svg onload", "<marquee", "<object", "<b>bold",
        "<a href=\"javascript", "</td></tr><tr><td>injected", "</section><iframe"}) {
    EXPECT_EQ(html.find(tag), std::string::npos) << "raw markup from the deck: " << tag;
  }
  for (const char* shown :
       {"&lt;script&gt;alert('t')&lt;/script&gt; &amp; co", "&lt;img src=x onerror=alert('p')&gt;",
        "A&amp;B &lt;b&gt;bold&lt;/b&gt;", "&lt;/section&gt;&lt;iframe src=evil&gt;",
        "&lt;style&gt;body{display:none}&lt;/style&gt;", "&lt;svg onload=alert('d')&gt;",
        "&lt;source&gt;", "&lt;/td&gt;&lt;/tr&gt;&lt;tr&gt;&lt;td&gt;injected",
        "&lt;marquee&gt;check&lt;/marquee&gt;", "&lt;object data=x&gt;"}) {
    EXPECT_NE(html.find(shown), std::string::npos) << "missing, escaped: " << shown;
  }
}

}  // namespace
}  // namespace heatdeck::testing
