#include "report/report_common.h"

#include <cmath>
#include <memory>
#include <string>

#include <gtest/gtest.h>

#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"

namespace heatdeck::report {
namespace {

// A deck whose results follow by hand: Q = 2 kg/s * 4000 J/(kg K) * 10 K
// = 80 kW; check 1 passes with 20 kW to spare, check 2 fails by 10 K.
constexpr char kDeck[] = R"(title "Report helpers"
meta number "T-1"
meta revision "A"
meta date "2026-01-02"
meta prepared "AB"
meta site "North"
section "Inputs"
given m  = 2 kg/s          "Mass flow"  source "Test source"
given cp = 4 kJ/(kg*K)
given T1 = 20 degC
given T2 = 30 degC
given D  = 22 mm
section "Duty"
Q = m * cp * (T2 - T1) in kW "Duty"
A = (D^2 * pi / 4) in mm^2
Nu = nu_dittus_boelter(5000, 5, 0.4)
check Q <= 100 kW "duty limit"
check T2 >= 40 degC "fails"
)";

std::unique_ptr<Session> Evaluate(const std::string& text, const SessionOptions& options = {}) {
  auto s = std::make_unique<Session>();
  const bool loaded = s->LoadText("input.deck", text, options);
  if (loaded) s->Evaluate();
  std::string diags;
  for (const Diagnostic* d : s->diagnostics().Sorted()) diags += Render(*d, s->files(), false);
  EXPECT_TRUE(loaded) << diags;
  return s;
}

int Find(const Session& s, const char* name) {
  const int q = s.model().Find(name);
  EXPECT_GE(q, 0) << name;
  return q;
}

TEST(SymbolTest, SplitsSubscriptsAndGreek) {
  Symbol s = SplitSymbol("T_h1");
  EXPECT_EQ(s.base, "T");
  EXPECT_EQ(s.subscript, "h1");
  EXPECT_EQ(s.prefix, "");
  EXPECT_EQ(SplitSymbol("eps").base, "ε");
  EXPECT_EQ(SplitSymbol("eta_f").base, "η");
  EXPECT_EQ(SplitSymbol("eta_f").subscript, "f");
  EXPECT_EQ(SplitSymbol("rho").base, "ρ");
  EXPECT_EQ(SplitSymbol("mu_w").base, "μ");
  EXPECT_EQ(SplitSymbol("alpha").base, "α");
  EXPECT_EQ(SplitSymbol("lambda").base, "λ");
  EXPECT_EQ(SplitSymbol("sigma_sb").base, "σ");
  EXPECT_EQ(SplitSymbol("theta").base, "θ");
  EXPECT_EQ(SplitSymbol("DeltaT_lm").base, "ΔT");
  EXPECT_EQ(SplitSymbol("DeltaT_lm").subscript, "lm");
  EXPECT_EQ(SplitSymbol("Delta_p").base, "Δ");
  // Words that only start like a Greek letter stay as written.
  EXPECT_EQ(SplitSymbol("mult").base, "mult");
  EXPECT_EQ(SplitSymbol("Nu").base, "Nu");
  EXPECT_EQ(SplitSymbol("eta2").base, "η2");
  Symbol t = SplitSymbol("hx.T_h_in");
  EXPECT_EQ(t.prefix, "hx.");
  EXPECT_EQ(t.base, "T");
  EXPECT_EQ(t.subscript, "h,in");
  EXPECT_EQ(SplitSymbol("q_lambda").subscript, "λ");
}

TEST(SymbolTest, PlainTextUsesUnicodeSubscriptsWhenAllExist) {
  EXPECT_EQ(SymbolText("T_h1"), "Tₕ₁");
  EXPECT_EQ(SymbolText("eps"), "ε");
  // 'c' has no subscript character: the underscore stays.
  EXPECT_EQ(SymbolText("T_c1"), "T_c1");
}

TEST(UnitTextTest, PrettyUnits) {
  EXPECT_EQ(PrettyUnit("m^2"), "m²");
  EXPECT_EQ(PrettyUnit("W/(m^2*K)"), "W/(m²·K)");
  EXPECT_EQ(PrettyUnit("degC"), "°C");
  EXPECT_EQ(PrettyUnit("degF"), "°F");
  EXPECT_EQ(PrettyUnit("ddegC"), "Δ°C");
  EXPECT_EQ(PrettyUnit("um"), "µm");
  EXPECT_EQ(PrettyUnit("s^-1"), "s⁻¹");
  EXPECT_EQ(PrettyUnit("kJ/(kg*degC)"), "kJ/(kg·°C)");
  EXPECT_EQ(PrettyUnit("m^3/h"), "m³/h");
  EXPECT_EQ(PrettyUnit("%"), "%");
  EXPECT_EQ(PrettyUnit(""), "");
  EXPECT_EQ(PrettyUnit("kW"), "kW");
}

TEST(NumberTextTest, InputsAndResults) {
  EXPECT_EQ(FormatResult(79.0712), "79.07");
  EXPECT_EQ(FormatResult(2095), "2095");
  EXPECT_EQ(FormatResult(1.8e-5), "1.800e-05");
  EXPECT_EQ(FormatResult(NAN), "—");
  EXPECT_EQ(FormatInput(85.0), "85");
  EXPECT_EQ(FormatInput(0.6000000000000001), "0.6");
  EXPECT_EQ(FormatInput(1.25e-5), "1.25e-05");
  EXPECT_EQ(FormatInput(-3.5), "-3.5");
  EXPECT_EQ(WithUnit("80", "degC"), "80 °C");
  EXPECT_EQ(WithUnit("0.7", ""), "0.7");
}

TEST(QuantityTextTest, GivensAsWrittenResultsAtFourDigits) {
  auto s = Evaluate(kDeck);
  const Results& r = s->results();
  const Model& m = s->model();
  ASSERT_EQ(r.cases.size(), 1u);
  const CaseResult& c = r.cases[0];
  EXPECT_EQ(QuantityValueText(m, c, Find(*s, "m")), "2");
  EXPECT_EQ(QuantityValueText(m, c, Find(*s, "T1")), "20");
  // 2 kg/s * 4000 J/(kg K) * 10 K = 80 000 W, shown in kW.
  EXPECT_EQ(QuantityValueText(m, c, Find(*s, "Q")), "80.00");
  // pi/4 * 22^2 mm^2 = 380.13 mm^2 (hand-derived).
  EXPECT_EQ(QuantityValueText(m, c, Find(*s, "A")), "380.1");
}

TEST(QuantityTextTest, SymbolicAndSubstitutedExpressions) {
  auto s = Evaluate(kDeck);
  const Model& m = s->model();
  const CaseResult& c = s->results().cases[0];
  const Quantity& q = m.quantities[static_cast<size_t>(Find(*s, "Q"))];
  EXPECT_EQ(SymbolicText(m, *q.expr), "m * cp * (T2 - T1)");
  EXPECT_EQ(SubstitutedText(m, c, *q.expr), "(2 kg/s) * (4 kJ/(kg·K)) * (30 °C - 20 °C)");
  // A power's base with a unit is grouped: (22 mm)^2, not 22 mm^2.
  const Quantity& a = m.quantities[static_cast<size_t>(Find(*s, "A"))];
  EXPECT_EQ(SubstitutedText(m, c, *a.expr), "(22 mm)^2 * pi / 4");
}

TEST(CheckTextTest, SidesMarginsAndTally) {
  auto s = Evaluate(kDeck);
  const Model& m = s->model();
  const CaseResult& c = s->results().cases[0];
  ASSERT_EQ(m.checks.size(), 2u);
  const CheckSides a = SidesOf(m.checks[0], c.checks[0]);
  ASSERT_TRUE(a.shown);
  EXPECT_EQ(a.lhs, "80.00");
  EXPECT_EQ(a.rhs, "100.0");
  EXPECT_EQ(a.margin, "20.00");  // 100 kW - 80 kW
  EXPECT_EQ(a.unit, "kW");
  EXPECT_EQ(CheckVerdict(c.checks[0]), Verdict::kPass);
  const CheckSides b = SidesOf(m.checks[1], c.checks[1]);
  ASSERT_TRUE(b.shown);
  EXPECT_EQ(b.lhs, "30.00");
  EXPECT_EQ(b.rhs, "40.00");
  EXPECT_EQ(b.margin, "-10.00");  // 30 degC - 40 degC, an interval
  EXPECT_EQ(b.unit, "degC");
  EXPECT_EQ(b.margin_unit, "ddegC");
  EXPECT_EQ(CheckVerdict(c.checks[1]), Verdict::kFail);
  const CheckTally t = Tally(m, c);
  EXPECT_EQ(t.passed, 1);
  EXPECT_EQ(t.failed, 1);
  EXPECT_EQ(t.not_evaluated, 0);
  // Re = 5000 is below the Dittus-Boelter range (Re >= 10000): one warning.
  EXPECT_EQ(t.warnings, 1);
  EXPECT_EQ(MessagesOf(c, Find(*s, "Nu"), QuantityMessage::Kind::kWarning).size(), 1u);
}

TEST(MetaTest, FixedFieldsAndOthers) {
  auto s = Evaluate(kDeck);
  const Results& r = s->results();
  EXPECT_EQ(MetaValue(r, "number"), "T-1");
  EXPECT_EQ(MetaValue(r, "date"), "2026-01-02");
  EXPECT_EQ(MetaValue(r, "client"), "");
  EXPECT_TRUE(IsPlacedMetaKey("prepared"));
  EXPECT_TRUE(IsPlacedMetaKey("status"));
  EXPECT_FALSE(IsPlacedMetaKey("site"));
  ASSERT_EQ(TitleFields().size(), 6u);
  EXPECT_STREQ(TitleFields()[0].key, "project");
  ASSERT_EQ(SignOffRoles().size(), 3u);
  EXPECT_STREQ(SignOffRoles()[2].key, "approved");

  SessionOptions o;
  o.date = "2027-05-06";  // the option wins over `meta date`
  auto s2 = Evaluate(kDeck, o);
  EXPECT_EQ(MetaValue(s2->results(), "date"), "2027-05-06");
}

TEST(UsedTest, MethodsUnitsAndSections) {
  auto s = Evaluate(kDeck);
  const Model& m = s->model();
  const auto methods = MethodsUsed(m);
  ASSERT_EQ(methods.size(), 1u);
  EXPECT_STREQ(methods[0]->name, "nu_dittus_boelter");
  const auto used = UnitsUsed(m);
  auto find = [&](const std::string& text) -> const UnitUse* {
    for (const UnitUse& u : used) {
      if (u.text == text) return &u;
    }
    return nullptr;
  };
  // SI factors and offsets (SI brochure, 9th ed.: 0 degC = 273.15 K).
  const UnitUse* c = find("degC");
  ASSERT_NE(c, nullptr);
  EXPECT_EQ(c->factor, 1.0);
  EXPECT_EQ(c->offset, 273.15);
  EXPECT_EQ(c->si_unit, "K");
  const UnitUse* kw = find("kW");
  ASSERT_NE(kw, nullptr);
  EXPECT_EQ(kw->factor, 1000.0);
  const UnitUse* mm = find("mm");
  ASSERT_NE(mm, nullptr);
  EXPECT_EQ(mm->factor, 1e-3);
  ASSERT_NE(find("mm^2"), nullptr);
  EXPECT_DOUBLE_EQ(find("mm^2")->factor, 1e-6);
  for (size_t i = 1; i < used.size(); ++i) EXPECT_LT(used[i - 1].text, used[i].text);

  const std::vector<int> numbers = SectionNumbers(m);
  ASSERT_EQ(numbers.size(), m.sections.size());
  int last = 0;
  for (size_t i = 0; i < numbers.size(); ++i) {
    if (numbers[i] == 0) {
      EXPECT_FALSE(SectionShown(m.sections[i]));
      continue;
    }
    EXPECT_EQ(numbers[i], ++last);
  }
  EXPECT_EQ(last, 2);  // "Inputs" and "Duty"
}

}  // namespace
}  // namespace heatdeck::report
