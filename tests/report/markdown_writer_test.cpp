#include "report/markdown_writer.h"

#include <memory>
#include <set>
#include <sstream>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"

namespace heatdeck {
namespace {

// Hand-derived: C_h = 2 kg/s * 4 kJ/(kg K) = 8 kW/K; Q = C_h * (80 - 30) K =
// 400 kW; T_c2 = 15 degC + 400 kW / (5 kg/s * 4 kJ/(kg K)) = 35 degC;
// A = 400 kW / (0.5 kW/(m^2 K) * 25 K) = 32 m^2.  Check C1 (Q <= 500 kW)
// passes; C2 (T_c2 <= 30 degC) fails by 5 K.
constexpr char kDeck[] = R"deck(title "Duty | rating <draft>"
meta number "MD-1"
meta revision "A"
meta prepared "RO"
meta reviewer "J. *Doe*"

section "Inputs"

> Both streams are water; *no* [links](javascript:alert(1)) here.

given m_h  = 2 kg/s           "Hot flow | main"   source "Heat balance <rev 2>"
given cp   = 4 kJ/(kg*K)      "Specific heat"
given T_h1 = 80 degC          "Hot inlet"
given T_h2 = 30 degC          "Hot outlet"
given m_c  = 5 kg/s           "Cold flow"
given T_c1 = 15 degC          "Cold inlet"
given U    = 0.5 kW/(m^2*K)
given dT_m = 25 K             "Mean temperature difference"

section "Duty"

C_h  = m_h * cp                in kW/K
Q    = C_h * (T_h1 - T_h2)     in kW     "Duty"
T_c2 = T_c1 + Q / (m_c * cp)   in degC   "Cold outlet"
A    = Q / (U * dT_m)          in m^2    "Area"
check Q <= 500 kW        "Duty within rating"
check T_c2 <= 30 degC    "Cold outlet limit"
)deck";

std::unique_ptr<Session> Evaluate(const std::string& text) {
  auto s = std::make_unique<Session>();
  const bool loaded = s->LoadText("input.deck", text, {});
  if (loaded) s->Evaluate();
  std::string diags;
  for (const Diagnostic* d : s->diagnostics().Sorted()) diags += Render(*d, s->files(), false);
  EXPECT_TRUE(loaded) << diags;
  return s;
}

std::string Markdown(const Results& r) {
  std::string out, error;
  EXPECT_TRUE(WriteMarkdown(r, &out, &error)) << error;
  return out;
}

std::vector<std::string> Lines(const std::string& text) {
  std::vector<std::string> out;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) out.push_back(line);
  return out;
}

bool HasLine(const std::string& text, const std::string& line) {
  for (const std::string& l : Lines(text)) {
    if (l == line) return true;
  }
  return false;
}

std::string Replace(std::string s, const std::string& from, const std::string& to) {
  const size_t at = s.find(from);
  EXPECT_NE(at, std::string::npos) << from;
  if (at != std::string::npos) s.replace(at, from.size(), to);
  return s;
}

TEST(MarkdownWriterTest, Content) {
  auto s = Evaluate(kDeck);
  const std::string md = Markdown(s->results());
  EXPECT_EQ(md.rfind("# Duty \\| rating \\<draft\\>\n", 0), 0u);
  EXPECT_TRUE(HasLine(md, "| Calculation no. | MD-1 |"));
  EXPECT_TRUE(HasLine(md, "| Revision | A |"));
  EXPECT_TRUE(HasLine(md, "| Project |  |"));
  EXPECT_TRUE(HasLine(md, "| reviewer | J. \\*Doe\\* |"));
  EXPECT_TRUE(HasLine(md, "| Prepared | RO |  |  |"));
  EXPECT_TRUE(HasLine(md, "| Checked |  |  |  |"));
  EXPECT_TRUE(HasLine(md, "**1 of 2 check results FAIL.** 1 passed, 1 failed, 0 warnings."));
  EXPECT_TRUE(HasLine(md, "- C2: Cold outlet limit"));
  EXPECT_NE(md.find("> **Caution.** "), std::string::npos);
  // Inputs: one row each, as written, with the pretty unit and source.
  EXPECT_TRUE(HasLine(md, "| `m_h` | Hot flow \\| main | 2 | kg/s | Heat balance \\<rev 2\\> |"));
  EXPECT_TRUE(HasLine(md, "| `U` |  | 0.5 | kW/(m²·K) |  |"));
  // Calculations: symbol, equation, values put in, result, unit.
  EXPECT_TRUE(
      HasLine(md,
              "| `Q` | `C_h * (T_h1 - T_h2)` | `(8.000 kW/K) * (80 °C - 30 °C)` | **400.0** "
              "| kW | Duty |  |"));
  EXPECT_TRUE(HasLine(md,
                      "| `T_c2` | `T_c1 + Q / (m_c * cp)` | `15 °C + 400.0 kW / ((5 kg/s) * (4 "
                      "kJ/(kg·K)))` | **35.00** | °C | Cold outlet |  |"));
  EXPECT_TRUE(HasLine(md,
                      "| `A` | `Q / (U * dT_m)` | `400.0 kW / ((0.5 kW/(m²·K)) * 25 K)` | "
                      "**32.00** | m² | Area |  |"));
  // Checks with both sides, margin and verdict.
  EXPECT_TRUE(HasLine(md,
                      "| C1 | `Q <= 500 kW` | 400.0 kW ≤ 500.0 kW | 100.0 kW | pass | Duty within "
                      "rating |"));
  EXPECT_TRUE(HasLine(md,
                      "| C2 | `T_c2 <= 30 °C` | 35.00 °C ≤ 30.00 °C | -5.000 Δ°C | **FAIL** | "
                      "Cold outlet limit |"));
  // Appendix: the deck's hash, units with SI factors.
  EXPECT_TRUE(HasLine(md, "| input.deck | `" + s->results().files[0].sha256 + "` |"));
  EXPECT_TRUE(HasLine(md, "| °C | `degC` | K | 1 | 273.15 |"));
  EXPECT_TRUE(HasLine(md, "| kW/(m²·K) | `kW/(m^2*K)` | W/(m²·K) | 1000 |  |"));
  EXPECT_NE(md.find("No library method is used."), std::string::npos);
}

TEST(MarkdownWriterTest, DeckTextCannotMakeMarkup) {
  auto s = Evaluate(kDeck);
  const std::string md = Markdown(s->results());
  EXPECT_TRUE(
      HasLine(md, "Both streams are water; \\*no\\* \\[links\\](javascript:alert(1)) here."));
  EXPECT_EQ(md.find("<draft>"), std::string::npos);
  EXPECT_EQ(md.find("<rev 2>"), std::string::npos);
  // Every table row has as many cells as its header: no '|' from the deck
  // opened a cell.
  size_t cells = 0;
  for (const std::string& line : Lines(md)) {
    if (line.empty() || line[0] != '|') {
      cells = 0;
      continue;
    }
    size_t n = 0;
    for (size_t i = 0; i < line.size(); ++i) {
      if (line[i] == '\\') {
        ++i;
        continue;
      }
      n += line[i] == '|';
    }
    if (cells == 0) cells = n;
    EXPECT_EQ(n, cells) << line;
  }
}

TEST(MarkdownWriterTest, SameResultsSameBytes) {
  auto a = Evaluate(kDeck);
  auto b = Evaluate(kDeck);
  EXPECT_EQ(Markdown(a->results()), Markdown(b->results()));
}

// Changing one input changes the lines of that input, of the results that
// depend on it and of the checks that read them, plus the deck's hash, and
// nothing else.
TEST(MarkdownWriterTest, OneInputChangedGivesAMinimalDiff) {
  auto before = Evaluate(kDeck);
  // T_c1 feeds T_c2 and check C2 only.
  auto after = Evaluate(Replace(kDeck, "T_c1 = 15 degC", "T_c1 = 12 degC"));
  const std::vector<std::string> a = Lines(Markdown(before->results()));
  const std::vector<std::string> b = Lines(Markdown(after->results()));
  ASSERT_EQ(a.size(), b.size());
  std::set<std::string> changed;
  for (size_t i = 0; i < a.size(); ++i) {
    if (a[i] == b[i]) continue;
    // Each changed line is a table row; its first cell names what changed.
    ASSERT_EQ(a[i].rfind("| ", 0), 0u) << a[i];
    changed.insert(a[i].substr(2, a[i].find(" |") - 2));
  }
  // T_c2 = 12 + 20 = 32 degC: still failing C2, so the summary is unchanged.
  EXPECT_EQ(changed, (std::set<std::string>{"`T_c1`", "`T_c2`", "C2", "input.deck"}));
  EXPECT_TRUE(HasLine(Markdown(after->results()),
                      "| C2 | `T_c2 <= 30 °C` | 32.00 °C ≤ 30.00 °C | -2.000 Δ°C | **FAIL** | "
                      "Cold outlet limit |"));

  // An input with many dependents: U feeds A only; m_h feeds C_h, Q, T_c2
  // and both checks.
  auto wide = Evaluate(Replace(kDeck, "m_h  = 2 kg/s", "m_h  = 2.2 kg/s"));
  const std::vector<std::string> c = Lines(Markdown(wide->results()));
  ASSERT_EQ(a.size(), c.size());
  std::set<std::string> changed2;
  for (size_t i = 0; i < a.size(); ++i) {
    if (a[i] == c[i]) continue;
    if (a[i].rfind("| ", 0) != 0) {
      // Outside tables only the summary may change (C1 still passes, C2
      // still fails here, so nothing is expected).
      ADD_FAILURE() << "unexpected change: " << a[i] << " -> " << c[i];
      continue;
    }
    changed2.insert(a[i].substr(2, a[i].find(" |") - 2));
  }
  EXPECT_EQ(changed2, (std::set<std::string>{"`m_h`", "`C_h`", "`Q`", "`T_c2`", "`A`", "C1", "C2",
                                             "input.deck"}));
}

TEST(MarkdownWriterTest, CasesAndSweeps) {
  const std::string deck = std::string(kDeck) + "case cold \"Colder water\": T_c1 = 5 degC\n";
  auto s = Evaluate(deck);
  Results r = s->results();
  ASSERT_EQ(r.cases.size(), 2u);
  // A hand-made sweep (the evaluator does not keep sweep rows yet).
  const Model& m = s->model();
  SweepResult sw;
  sw.swept = {m.Find("T_c1")};
  sw.columns = {m.Find("T_c1"), m.Find("T_c2")};
  sw.rows = {{283.15, 303.15}, {288.15, 308.15}};
  sw.row_errors = {"", "outside <range>"};
  sw.points = 2;
  r.sweeps.push_back(sw);
  const std::string md = Markdown(r);
  EXPECT_NE(md.find("## Cases compared"), std::string::npos);
  EXPECT_TRUE(HasLine(md, "| Quantity | Unit | base | cold |"));
  EXPECT_TRUE(HasLine(md, "| `T_c1` | °C | 15 | **5** |"));
  // T_c2 = 5 + 20 = 25 degC in case cold: C2 passes there.
  EXPECT_TRUE(HasLine(md, "| `T_c2` | °C | 35.00 | **25.00** |"));
  EXPECT_TRUE(HasLine(md, "| C2 | Cold outlet limit | **FAIL** | pass |"));
  EXPECT_TRUE(HasLine(md, "| base | 1 | 1 | 0 | 0 |"));
  EXPECT_TRUE(HasLine(md, "| cold | 2 | 0 | 0 | 0 |"));
  EXPECT_NE(md.find("## Parameter study"), std::string::npos);
  EXPECT_TRUE(HasLine(md, "| 1 | 10 | 30.00 |  |"));
  EXPECT_TRUE(HasLine(md, "| 2 | 15 | 35.00 | outside \\<range\\> |"));
}

TEST(MarkdownWriterTest, ProfileAsATable) {
  // Counterflow, hot 80 -> 40 degC, cold 20 -> 50 degC: at x = 0 (hot inlet)
  // the cold stream leaves at 50 degC; at x = 1 it enters at 20 degC.
  auto s = Evaluate(
      "given T_h1 = 80 degC\n"
      "given T_h2 = 40 degC\n"
      "given T_c1 = 20 degC\n"
      "given T_c2 = 50 degC\n"
      "profile counter: hot T_h1 to T_h2, cold T_c1 to T_c2 \"Cooler profile\"\n");
  const std::string md = Markdown(s->results());
  EXPECT_TRUE(HasLine(md, "**Figure: Cooler profile**"));
  EXPECT_TRUE(HasLine(md, "| x | Hot [°C] | Cold [°C] |"));
  EXPECT_TRUE(HasLine(md, "| 0 | 80.00 | 50.00 |"));
  EXPECT_TRUE(HasLine(md, "| 1 | 40.00 | 20.00 |"));
}

}  // namespace
}  // namespace heatdeck
