// The deck comparison (Compare) on pairs of decks evaluated in memory, and
// its three renderings.  Expected values and percentages are derived by
// hand beside each assertion from the decks' own literals.
#include "report/diff.h"

#include <atomic>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <memory>
#include <string>

#include <gtest/gtest.h>
#include <unistd.h>
#include <nlohmann/json.hpp>

#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"

namespace heatdeck {
namespace {

namespace fs = std::filesystem;

// A hot-water cooler: Q = m_h·cp_h·(T_h1 − T_h2).
constexpr const char* kOld = R"(title "Cooler"
meta revision "A"
meta prepared "RO"
given m_h  = 0.50 kg/s
given cp_h = 4.19 kJ/(kg*K)
given T_h1 = 80 degC
given T_h2 = 40 degC
dT = T_h1 - T_h2 in K
Q  = m_h * cp_h * dT in kW
old_only = 2 * m_h in kg/s
check Q <= 90 kW
check T_h2 <= 45 degC
check dT > 1 K
case hot: T_h1 = 90 degC
case gone: T_h1 = 85 degC
)";

// The same deck at its next revision: T_h2 lowered to 35 degC, old_only
// removed, C_h and a check on it added, the dT check removed, case `gone`
// replaced by `cold`, the revision letter moved on and `prepared` dropped.
constexpr const char* kNew = R"(title "Cooler"
meta revision "B"
given m_h  = 0.50 kg/s
given cp_h = 4.19 kJ/(kg*K)
given T_h1 = 80 degC
given T_h2 = 35 degC
dT = T_h1 - T_h2 in K
Q  = m_h * cp_h * dT in kW
C_h = m_h * cp_h in W/K
check Q <= 90 kW
check T_h2 <= 45 degC
check C_h > 1 kW/K
case hot: T_h1 = 90 degC
case cold: T_h1 = 70 degC
)";

std::unique_ptr<Session> Evaluated(const std::string& name, const std::string& text) {
  auto s = std::make_unique<Session>();
  const bool ok = s->LoadText(name, text, {}) && s->Evaluate();
  std::string diags;
  for (const Diagnostic* d : s->diagnostics().Sorted()) diags += Render(*d, s->files(), false);
  EXPECT_TRUE(ok) << diags;
  return s;
}

DiffResult CompareTexts(const std::string& old_text, const std::string& new_text) {
  auto o = Evaluated("old.deck", old_text);
  auto n = Evaluated("new.deck", new_text);
  return Compare(o->results(), n->results());
}

const CaseDiff* FindCase(const DiffResult& d, const std::string& name) {
  for (const CaseDiff& c : d.cases) {
    if (c.name == name) return &c;
  }
  return nullptr;
}

TEST(DiffCompare, ChangedInputAndResultsWithPercent) {
  const DiffResult d = CompareTexts(kOld, kNew);
  const CaseDiff* base = FindCase(d, "base");
  ASSERT_NE(base, nullptr);

  ASSERT_EQ(base->inputs.size(), 1u);
  const QuantityChange& t = base->inputs[0];
  EXPECT_EQ(t.name, "T_h2");
  EXPECT_EQ(t.change, QuantityChange::Change::kChanged);
  // 40 degC = 313.15 K, 35 degC = 308.15 K; the change is taken in SI:
  // (308.15 − 313.15)/313.15 = −1.596679 %.
  EXPECT_DOUBLE_EQ(t.old_value.si, 313.15);
  EXPECT_DOUBLE_EQ(t.new_value.si, 308.15);
  ASSERT_TRUE(t.has_percent);
  EXPECT_NEAR(t.percent, -500.0 / 313.15, 1e-12);
  EXPECT_EQ(t.new_value.display.text, "degC");

  // dT: 40 K -> 45 K, +12.5 %; Q = 0.5·4190·dT: 83 800 W -> 94 275 W, +12.5 %.
  ASSERT_EQ(base->results.size(), 2u);
  EXPECT_EQ(base->results[0].name, "dT");
  EXPECT_NEAR(base->results[0].old_value.si, 40.0, 1e-9);
  EXPECT_NEAR(base->results[0].new_value.si, 45.0, 1e-9);
  EXPECT_NEAR(base->results[0].percent, 12.5, 1e-9);
  const QuantityChange& q = base->results[1];
  EXPECT_EQ(q.name, "Q");
  EXPECT_NEAR(q.old_value.si, 83800.0, 1e-6);
  EXPECT_NEAR(q.new_value.si, 94275.0, 1e-6);
  ASSERT_TRUE(q.has_percent);
  EXPECT_NEAR(q.percent, 12.5, 1e-9);
  EXPECT_EQ(q.new_value.display.text, "kW");
  EXPECT_EQ(q.old_value.display.text, "kW");
}

TEST(DiffCompare, AddedAndRemovedQuantities) {
  const DiffResult d = CompareTexts(kOld, kNew);
  const CaseDiff* base = FindCase(d, "base");
  ASSERT_NE(base, nullptr);
  ASSERT_EQ(base->added.size(), 1u);
  EXPECT_EQ(base->added[0].name, "C_h");
  EXPECT_EQ(base->added[0].change, QuantityChange::Change::kAdded);
  EXPECT_FALSE(base->added[0].old_value.present);
  EXPECT_NEAR(base->added[0].new_value.si, 0.5 * 4190.0, 1e-9);  // m_h·cp_h
  ASSERT_EQ(base->removed.size(), 1u);
  EXPECT_EQ(base->removed[0].name, "old_only");
  EXPECT_FALSE(base->removed[0].new_value.present);
  EXPECT_NEAR(base->removed[0].old_value.si, 1.0, 1e-12);  // 2·0.5 kg/s
}

TEST(DiffCompare, CheckOutcomesFlippedAddedAndRemoved) {
  const DiffResult d = CompareTexts(kOld, kNew);
  const CaseDiff* base = FindCase(d, "base");
  ASSERT_NE(base, nullptr);
  // Q <= 90 kW: 83.8 kW passes, 94.275 kW fails.  T_h2 <= 45 degC passes
  // in both and is not listed.  C_h = 2095 W/K > 1 kW/K is new and passes;
  // dT > 1 K is gone (it passed).
  ASSERT_EQ(base->checks.size(), 3u);
  EXPECT_EQ(base->checks[0].expression, "Q <= 90 kW");
  EXPECT_EQ(base->checks[0].old_outcome, CheckOutcome::kPass);
  EXPECT_EQ(base->checks[0].new_outcome, CheckOutcome::kFail);
  EXPECT_EQ(base->checks[1].expression, "C_h > 1 kW/K");
  EXPECT_EQ(base->checks[1].old_outcome, CheckOutcome::kAbsent);
  EXPECT_EQ(base->checks[1].new_outcome, CheckOutcome::kPass);
  EXPECT_EQ(base->checks[2].expression, "dT > 1 K");
  EXPECT_EQ(base->checks[2].old_outcome, CheckOutcome::kPass);
  EXPECT_EQ(base->checks[2].new_outcome, CheckOutcome::kAbsent);
}

TEST(DiffCompare, CasesComparedByName) {
  const DiffResult d = CompareTexts(kOld, kNew);
  ASSERT_EQ(d.cases.size(), 2u);
  EXPECT_EQ(d.cases[0].name, "base");
  EXPECT_EQ(d.cases[1].name, "hot");
  ASSERT_EQ(d.cases_added.size(), 1u);
  EXPECT_EQ(d.cases_added[0], "cold");
  ASSERT_EQ(d.cases_removed.size(), 1u);
  EXPECT_EQ(d.cases_removed[0], "gone");
  // Case hot: T_h1 = 90 degC in both, so T_h1 is not an input change there;
  // T_h2 still moved 40 -> 35 degC, dT 50 K -> 55 K (+10 %), Q 104 750 W ->
  // 115 225 W (+10 %), and Q <= 90 kW fails in both, so it is not listed.
  const CaseDiff& hot = d.cases[1];
  ASSERT_EQ(hot.inputs.size(), 1u);
  EXPECT_EQ(hot.inputs[0].name, "T_h2");
  ASSERT_EQ(hot.results.size(), 2u);
  EXPECT_NEAR(hot.results[1].old_value.si, 104750.0, 1e-6);
  EXPECT_NEAR(hot.results[1].new_value.si, 115225.0, 1e-6);
  EXPECT_NEAR(hot.results[1].percent, 10.0, 1e-9);
  ASSERT_EQ(hot.checks.size(), 2u);  // the added and the removed check only
  EXPECT_EQ(hot.checks[0].expression, "C_h > 1 kW/K");
  EXPECT_EQ(hot.checks[1].expression, "dT > 1 K");
}

TEST(DiffCompare, TitleAndMeta) {
  const DiffResult d = CompareTexts(kOld, kNew);
  EXPECT_FALSE(d.title_changed);
  ASSERT_EQ(d.meta.size(), 2u);
  EXPECT_EQ(d.meta[0].key, "revision");
  EXPECT_EQ(d.meta[0].old_text, "A");
  EXPECT_EQ(d.meta[0].new_text, "B");
  EXPECT_TRUE(d.meta[0].in_old && d.meta[0].in_new);
  EXPECT_EQ(d.meta[1].key, "prepared");
  EXPECT_TRUE(d.meta[1].in_old);
  EXPECT_FALSE(d.meta[1].in_new);

  const DiffResult t = CompareTexts("title \"A\"\ngiven x = 1\n", "title \"B\"\ngiven x = 1\n");
  EXPECT_TRUE(t.title_changed);
  EXPECT_EQ(t.old_title, "A");
  EXPECT_EQ(t.new_title, "B");
  EXPECT_FALSE(t.empty());
}

TEST(DiffCompare, UnchangedDeckIsEmpty) {
  const DiffResult d = CompareTexts(kOld, kOld);
  EXPECT_TRUE(d.empty());
  ASSERT_EQ(d.cases.size(), 3u);  // base, hot, gone: all compared, none changed
  for (const CaseDiff& c : d.cases) EXPECT_TRUE(c.empty()) << c.name;
  EXPECT_TRUE(d.meta.empty());
  EXPECT_TRUE(d.cases_added.empty());
  EXPECT_TRUE(d.cases_removed.empty());
}

TEST(DiffCompare, ToleranceIsOneInTenToTheTwelve) {
  // 1e-13 relative apart: the same value.
  EXPECT_TRUE(CompareTexts("given x = 1\n", "given x = 1.0000000000001\n").empty());
  // 1e-11 relative apart: a change, and the text shows enough digits to
  // tell the two apart.
  const DiffResult d = CompareTexts("given x = 1\n", "given x = 1.00000000001\n");
  ASSERT_EQ(d.cases.size(), 1u);
  ASSERT_EQ(d.cases[0].inputs.size(), 1u);
  EXPECT_NEAR(d.cases[0].inputs[0].percent, 1e-9, 1e-15);
  EXPECT_NE(WriteDiffText(d).find("x  1  ->  1.00000000001  +1e-09%"), std::string::npos)
      << WriteDiffText(d);
}

TEST(DiffCompare, DimensionAndKindChanges) {
  const DiffResult d =
      CompareTexts("given x = 1 m\ny = 2 * x\n", "given x = 1 kg\ngiven y = 2 m\n");
  ASSERT_EQ(d.cases.size(), 1u);
  const CaseDiff& c = d.cases[0];
  ASSERT_EQ(c.inputs.size(), 2u);
  EXPECT_EQ(c.inputs[0].name, "x");
  EXPECT_TRUE(c.inputs[0].dimension_changed);
  EXPECT_FALSE(c.inputs[0].has_percent);
  EXPECT_EQ(c.inputs[0].old_value.si_unit, "m");
  EXPECT_EQ(c.inputs[0].new_value.si_unit, "kg");
  // y: a calculated 2 m became a given 2 m: the same value, listed for its
  // change of kind, without a percentage.
  EXPECT_EQ(c.inputs[1].name, "y");
  EXPECT_EQ(c.inputs[1].old_value.kind, QuantityKind::kCalc);
  EXPECT_EQ(c.inputs[1].new_value.kind, QuantityKind::kGiven);
  EXPECT_FALSE(c.inputs[1].has_percent);
  EXPECT_TRUE(c.results.empty());
  const DiffResult k = CompareTexts("given x = 1 m\ny = 2 * x\n", "given x = 1 m\ngiven y = 3 m\n");
  ASSERT_EQ(k.cases[0].inputs.size(), 1u);
  EXPECT_EQ(k.cases[0].inputs[0].old_value.kind, QuantityKind::kCalc);
  EXPECT_EQ(k.cases[0].inputs[0].new_value.kind, QuantityKind::kGiven);
  EXPECT_NEAR(k.cases[0].inputs[0].percent, 50.0, 1e-12);  // 2 m -> 3 m
  EXPECT_NE(WriteDiffText(k).find("was calc"), std::string::npos);
  // The same number on both sides prints at the usual precision.
  const DiffResult same = CompareTexts("y = 0.1 m\n", "given y = 0.1 m\n");
  EXPECT_NE(WriteDiffText(same).find("y  0.1 m  ->  0.1 m  was calc\n"), std::string::npos)
      << WriteDiffText(same);
}

TEST(DiffCompare, RepeatedCheckTextsPairInOrder) {
  // Two identical checks in the old deck, one in the new: the first pairs
  // with the first, the second is removed.
  const DiffResult d =
      CompareTexts("given x = 1\ncheck x > 0\ncheck x > 0\n", "given x = 1\ncheck x > 0\n");
  ASSERT_EQ(d.cases[0].checks.size(), 1u);
  EXPECT_EQ(d.cases[0].checks[0].old_outcome, CheckOutcome::kPass);
  EXPECT_EQ(d.cases[0].checks[0].new_outcome, CheckOutcome::kAbsent);
}

TEST(DiffCompare, ValueThatFailsToEvaluate) {
  auto o = Evaluated("old.deck", "given x = 1\ny = ln(x)\ncheck y >= 0\n");
  auto n = std::make_unique<Session>();
  ASSERT_TRUE(n->LoadText("new.deck", "given x = -1\ny = ln(x)\ncheck y >= 0\n", {}));
  EXPECT_FALSE(n->Evaluate());  // ln of −1: a runtime error, results still there
  const DiffResult d = Compare(o->results(), n->results());
  const CaseDiff& c = d.cases[0];
  ASSERT_EQ(c.results.size(), 1u);
  EXPECT_TRUE(c.results[0].old_value.evaluated);
  EXPECT_FALSE(c.results[0].new_value.evaluated);
  EXPECT_FALSE(c.results[0].has_percent);
  ASSERT_EQ(c.checks.size(), 1u);
  EXPECT_EQ(c.checks[0].new_outcome, CheckOutcome::kNotEvaluated);
}

// A fresh folder for decks that use a template.
class TempFolder {
 public:
  TempFolder() {
    static std::atomic<int> n{0};
    path_ = fs::temp_directory_path() /
            ("hd-diff-test-" + std::to_string(getpid()) + "-" + std::to_string(n++));
    fs::create_directories(path_);
  }
  ~TempFolder() {
    std::error_code ec;
    fs::remove_all(path_, ec);
  }
  std::string Write(const std::string& name, const std::string& text) const {
    std::ofstream(path_ / name) << text;
    return (path_ / name).string();
  }
  std::string Path(const std::string& name) const { return (path_ / name).string(); }

 private:
  fs::path path_;
};

TEST(DiffCompare, TemplateChecksKeyedByPrefix) {
  TempFolder dir;
  dir.Write("t.deck", "given a = 1 m\ncheck a > 0.5 m\n");
  // The deck's own check has the same text as the template's; only the
  // template's flips (a bound to 0.2 m fails a > 0.5 m).
  auto o = Evaluated(dir.Path("d.deck"),
                     "given a = 1 m\nuse \"t.deck\" as hx with a = a\ncheck a > 0.5 m\n");
  auto n = Evaluated(dir.Path("d.deck"),
                     "given a = 1 m\nuse \"t.deck\" as hx with a = 0.2 m\ncheck a > 0.5 m\n");
  const DiffResult d = Compare(o->results(), n->results());
  ASSERT_EQ(d.cases.size(), 1u);
  ASSERT_EQ(d.cases[0].checks.size(), 1u);
  EXPECT_EQ(d.cases[0].checks[0].prefix, "hx");
  EXPECT_EQ(d.cases[0].checks[0].expression, "a > 0.5 m");
  EXPECT_EQ(d.cases[0].checks[0].old_outcome, CheckOutcome::kPass);
  EXPECT_EQ(d.cases[0].checks[0].new_outcome, CheckOutcome::kFail);
  EXPECT_NE(WriteDiffText(d).find("hx: a > 0.5 m  pass  ->  fail"), std::string::npos)
      << WriteDiffText(d);
}

// ---- Renderings ------------------------------------------------------------

constexpr const char* kSmallOld =
    "meta revision \"A\"\ngiven m = 2 kg\nE = m * 3 J/kg in J\n"
    "check E < 7 J\n";
constexpr const char* kSmallNew =
    "meta revision \"B\"\ngiven m = 2.5 kg\nE = m * 3 J/kg in J\n"
    "F = 2 * E in J\ncheck E < 7 J\n";

TEST(DiffWriters, Text) {
  DiffResult d = CompareTexts(kSmallOld, kSmallNew);
  d.note = "a note";
  // m: 2 -> 2.5 kg, +25 %; E = 3·m: 6 -> 7.5 J, +25 %; F = 15 J new;
  // E < 7 J passes at 6 J, fails at 7.5 J.
  EXPECT_EQ(WriteDiffText(d),
            "old: old.deck\n"
            "new: new.deck\n"
            "note: a note\n"
            "\n"
            "meta revision: \"A\" -> \"B\"\n"
            "\n"
            "case base\n"
            "  inputs changed:\n"
            "    m  2 kg  ->  2.5 kg  +25%\n"
            "  results changed:\n"
            "    E  6 J  ->  7.5 J  +25%\n"
            "  quantities added:\n"
            "    F  calc  15 J\n"
            "  checks changed:\n"
            "    E < 7 J  pass  ->  fail\n");
  EXPECT_EQ(WriteDiffText(CompareTexts(kSmallOld, kSmallOld)),
            "old: old.deck\nnew: new.deck\nno differences\n");
}

TEST(DiffWriters, TextColumnsCountCharactersNotBytes) {
  // "°C" is two bytes and one character; the columns after it stay aligned.
  const DiffResult d = CompareTexts("given T = 40 °C\ncheck T <= 45 °C\n",
                                    "given T = 50 °C\ncheck T <= 45 °C\ncheck T > 1 K\n");
  EXPECT_NE(WriteDiffText(d).find("    T <= 45 °C  pass         ->  fail\n"
                                  "    T > 1 K     (new check)  ->  pass\n"),
            std::string::npos)
      << WriteDiffText(d);
}

TEST(DiffWriters, Markdown) {
  const DiffResult d = CompareTexts(kSmallOld, kSmallNew);
  EXPECT_EQ(WriteDiffMarkdown(d),
            "# Deck differences\n"
            "\n"
            "- Old: `old.deck`\n"
            "- New: `new.deck`\n"
            "\n"
            "## Title block\n"
            "\n"
            "| Field | Old | New |\n"
            "|---|---|---|\n"
            "| revision | A | B |\n"
            "\n"
            "## Case base\n"
            "\n"
            "### Inputs changed\n"
            "\n"
            "| Quantity | Old | New | Change |\n"
            "|---|---:|---:|---:|\n"
            "| `m` | 2 kg | 2.5 kg | +25% |\n"
            "\n"
            "### Results changed\n"
            "\n"
            "| Quantity | Old | New | Change |\n"
            "|---|---:|---:|---:|\n"
            "| `E` | 6 J | 7.5 J | +25% |\n"
            "\n"
            "### Quantities added\n"
            "\n"
            "| Quantity | Kind | Value |\n"
            "|---|---|---:|\n"
            "| `F` | calc | 15 J |\n"
            "\n"
            "### Checks changed\n"
            "\n"
            "| Check | Old | New |\n"
            "|---|---|---|\n"
            "| `E < 7 J` | pass | fail |\n");
  EXPECT_EQ(WriteDiffMarkdown(CompareTexts(kSmallOld, kSmallOld)),
            "# Deck differences\n\n- Old: `old.deck`\n- New: `new.deck`\n\nNo differences.\n");
}

TEST(DiffWriters, Json) {
  const DiffResult d = CompareTexts(kSmallOld, kSmallNew);
  const std::string text = WriteDiffJson(d);
  const nlohmann::json j = nlohmann::json::parse(text);
  EXPECT_EQ(j["tool"], "heatdeck");
  EXPECT_EQ(j["old"], "old.deck");
  EXPECT_EQ(j["new"], "new.deck");
  EXPECT_EQ(j["changed"], true);
  EXPECT_TRUE(j["title"].is_null());
  ASSERT_EQ(j["meta"].size(), 1u);
  EXPECT_EQ(j["meta"][0]["key"], "revision");
  EXPECT_EQ(j["meta"][0]["old"], "A");
  EXPECT_EQ(j["meta"][0]["new"], "B");
  ASSERT_EQ(j["cases"].size(), 1u);
  const auto& c = j["cases"][0];
  EXPECT_EQ(c["name"], "base");
  ASSERT_EQ(c["inputs"].size(), 1u);
  EXPECT_EQ(c["inputs"][0]["name"], "m");
  EXPECT_EQ(c["inputs"][0]["old"]["value"].get<double>(), 2.0);
  EXPECT_EQ(c["inputs"][0]["new"]["value"].get<double>(), 2.5);
  EXPECT_EQ(c["inputs"][0]["new"]["unit"], "kg");
  EXPECT_EQ(c["inputs"][0]["new"]["si_unit"], "kg");
  EXPECT_EQ(c["inputs"][0]["new"]["kind"], "given");
  EXPECT_DOUBLE_EQ(c["inputs"][0]["change_percent"].get<double>(), 25.0);
  ASSERT_EQ(c["results"].size(), 1u);
  EXPECT_DOUBLE_EQ(c["results"][0]["new"]["si_value"].get<double>(), 7.5);
  ASSERT_EQ(c["added"].size(), 1u);
  EXPECT_TRUE(c["added"][0]["old"].is_null());
  EXPECT_TRUE(c["added"][0]["change_percent"].is_null());
  EXPECT_DOUBLE_EQ(c["added"][0]["new"]["value"].get<double>(), 15.0);
  EXPECT_TRUE(c["removed"].empty());
  ASSERT_EQ(c["checks"].size(), 1u);
  EXPECT_EQ(c["checks"][0]["expression"], "E < 7 J");
  EXPECT_EQ(c["checks"][0]["old"], "pass");
  EXPECT_EQ(c["checks"][0]["new"], "fail");
  EXPECT_TRUE(c["checks"][0]["template"].is_null());
  EXPECT_TRUE(j["cases_added"].empty());
  // Deterministic: rendering twice gives the same bytes.
  EXPECT_EQ(WriteDiffJson(CompareTexts(kSmallOld, kSmallNew)), text);
  EXPECT_EQ(nlohmann::json::parse(WriteDiffJson(CompareTexts(kSmallOld, kSmallOld)))["changed"],
            false);
}

}  // namespace
}  // namespace heatdeck
