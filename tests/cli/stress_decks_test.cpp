// Malformed decks too large to keep as golden files: 10 000 nested
// parentheses, lines of a megabyte.  They are written to a temporary folder
// and run there.  A deck with errors must give exit status 2, a located
// diagnostic and no output file; whatever the input, the process must end
// by itself, never by a signal, and within a time limit.
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "golden_support.h"
#include "process_runner.h"

namespace heatdeck::testing {
namespace {

constexpr size_t kMegabyte = 1u << 20;
// Per run; generous, as CI also runs this under ASan and UBSan on two cores.
constexpr double kTimeout = 20;

struct Outcome {
  ProcessResult check;
  ProcessResult run;
  std::vector<std::string> written;  // what `run -o DIR` left in DIR
};

// Writes text to DIR/name and runs `check` and `run -o OUT` on it.
Outcome RunDeck(const std::string& name, const std::string& text) {
  TempDir dir;
  {
    std::ofstream f(dir.path() + "/" + name, std::ios::binary);
    f << text;
  }
  TempDir out;
  Outcome o;
  o.check = RunHeatdeck({"check", name}, dir.path(), kTimeout);
  o.run = RunHeatdeck({"run", name, "-o", out.path()}, dir.path(), kTimeout);
  o.written = out.Entries();
  EXPECT_FALSE(o.check.timed_out || o.run.timed_out)
      << name << ": heatdeck ran longer than " << kTimeout << " s";
  return o;
}

void ExpectRejected(const Outcome& o, const std::string& name, const std::string& text,
                    const std::string& message) {
  for (const ProcessResult* r : {&o.check, &o.run}) {
    ASSERT_FALSE(r->signalled) << "killed by signal " << r->status - 128;
    EXPECT_EQ(r->status, 2);
    std::string why;
    EXPECT_TRUE(HasLocatedError(r->err, name, text, &why)) << why;
    EXPECT_NE(r->err.find(message), std::string::npos) << r->err.substr(0, 2000);
  }
  EXPECT_TRUE(o.written.empty()) << "a deck with errors must write nothing";
}

TEST(StressDecks, TenThousandNestedParentheses) {
  const std::string text = "x = " + std::string(10000, '(') + "1" + std::string(10000, ')') + "\n";
  const Outcome o = RunDeck("nested.deck", text);
  ExpectRejected(o, "nested.deck", text, "nested.deck:1:");
  EXPECT_NE(o.check.err.find("error: expression nested too deeply (limit 200 levels)"),
            std::string::npos)
      << o.check.err.substr(0, 2000);
}

TEST(StressDecks, TenThousandUnaryMinuses) {
  const std::string text = "x = " + std::string(10000, '-') + "1\n";
  const Outcome o = RunDeck("minus.deck", text);
  ExpectRejected(o, "minus.deck", text, "error: expression nested too deeply");
}

TEST(StressDecks, MegabyteUnknownUnitIsReportedBriefly) {
  const std::string text = "given x = 1 " + std::string(kMegabyte, 'a') + "\n";
  const Outcome o = RunDeck("unit.deck", text);
  ExpectRejected(o, "unit.deck", text, "unit.deck:1:13: error: unknown unit 'aaaa");
  // The quote of the line is cut to 200 characters; the message should not
  // repeat the megabyte either.
  EXPECT_LT(o.check.err.size(), 10000u) << "stderr holds " << o.check.err.size() << " bytes";
}

TEST(StressDecks, MegabyteUnterminatedString) {
  const std::string text = "title \"" + std::string(kMegabyte, 'b') + "\ngiven m = 1 kg/s\n";
  const Outcome o = RunDeck("string.deck", text);
  ExpectRejected(o, "string.deck", text,
                 "string.deck:1:7: error: unterminated string: missing closing '\"'");
}

TEST(StressDecks, MegabyteCommentLineIsAValidDeck) {
  const std::string text = "# " + std::string(kMegabyte, 'c') + "\ngiven m = 1 kg/s\n";
  const Outcome o = RunDeck("comment.deck", text);
  ASSERT_FALSE(o.check.signalled);
  EXPECT_EQ(o.check.status, 0) << o.check.err.substr(0, 2000);
  EXPECT_EQ(o.check.out, "comment.deck: 1 quantities, 0 checks: 0 passed, 0 failed\n");
}

TEST(StressDecks, TenMegabyteLineOfAnUnknownName) {
  const std::string text = "given m = 1 kg/s\nx = m * " + std::string(10 * kMegabyte, 'n') + "\n";
  const Outcome o = RunDeck("tenmb.deck", text);
  ExpectRejected(o, "tenmb.deck", text, "tenmb.deck:2:9: error: unknown name 'nnnn");
  EXPECT_LT(o.check.err.size(), 10000u) << "stderr holds " << o.check.err.size() << " bytes";
}

TEST(StressDecks, TenMegabyteDescriptionIsAValidDeckWithItsReports) {
  // No spreadsheet cell holds 10 MB of text (the workbook keeps the first
  // 32 767 characters); the HTML report keeps it whole.
  const std::string description(10 * kMegabyte, 'd');
  const std::string text = "given m = 1 kg/s \"" + description + "\"\nC = m * 2 kJ/kg in kW\n";
  TempDir dir;
  {
    std::ofstream f(dir.path() + "/tenmb_text.deck", std::ios::binary);
    f << text;
  }
  TempDir out;
  const ProcessResult r =
      RunHeatdeck({"run", "tenmb_text.deck", "-o", out.path()}, dir.path(), kTimeout);
  ASSERT_FALSE(r.timed_out) << "heatdeck ran longer than " << kTimeout << " s";
  ASSERT_FALSE(r.signalled) << r.err.substr(0, 2000);
  EXPECT_EQ(r.status, 0) << r.err.substr(0, 2000);
  EXPECT_LT(r.err.size(), 10000u) << "stderr holds " << r.err.size() << " bytes";
  EXPECT_EQ(out.Entries(),
            (std::vector<std::string>{"tenmb_text.html", "tenmb_text.json", "tenmb_text.xlsx"}));
  std::ifstream html(out.path() + "/tenmb_text.html", std::ios::binary);
  const std::string page((std::istreambuf_iterator<char>(html)), std::istreambuf_iterator<char>());
  EXPECT_NE(page.find(description), std::string::npos);
}

// A sum of many terms is a long line, not a deep nesting to the author, but
// the parser builds it as a left-leaning tree as deep as it has terms.  It
// must be evaluated or rejected with a located error -- not crash.
void ExpectEvaluatedOrRejected(const std::string& name, const std::string& text) {
  const Outcome o = RunDeck(name, text);
  for (const ProcessResult* r : {&o.check, &o.run}) {
    ASSERT_FALSE(r->signalled) << name << " killed the process with signal " << r->status - 128
                               << "\n"
                               << r->err.substr(0, 2000);
    EXPECT_TRUE(r->status == 0 || r->status == 2) << r->err.substr(0, 2000);
    if (r->status == 2) {
      std::string why;
      EXPECT_TRUE(HasLocatedError(r->err, name, text, &why)) << why;
    }
  }
  if (o.run.status == 2) {
    EXPECT_TRUE(o.written.empty());
  }
}

std::string SumOfOnes(size_t terms) {
  std::string text = "x = 1";
  text.reserve(terms * 2 + 8);
  for (size_t i = 1; i < terms; ++i) text += "+1";
  return text + "\n";
}

TEST(StressDecks, SumOfTenThousandTermsDoesNotCrash) {
  ExpectEvaluatedOrRejected("sum10k.deck", SumOfOnes(10000));
}

TEST(StressDecks, MegabyteSumDoesNotCrash) {
  ExpectEvaluatedOrRejected("sum1mb.deck", SumOfOnes(kMegabyte / 2));
}

}  // namespace
}  // namespace heatdeck::testing
