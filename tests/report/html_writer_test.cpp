#include "report/html_writer.h"

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <memory>
#include <string>
#include <vector>

#include <gtest/gtest.h>
#include <pugixml.hpp>

#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"

namespace heatdeck {
namespace {

// Hand-derived results: Q = 2 kg/s * 4 kJ/(kg K) * (30 - 20) K = 80 kW;
// T_out = 30 degC + 80 kW / (3 kg/s * 4 kJ/(kg K)) = 36.67 degC.
// Check C1 passes by 20 kW, C2 fails (30 degC < 40 degC), C3 passes.
// Descriptions, narrative and meta carry markup that must stay text.
constexpr char kDeck[] = R"deck(title "Cooler <E-1> & friends"
meta number "TC-0042"
meta revision "B"
meta date "2026-01-02"
meta client "Client & Co"
meta prepared "RO"
meta site "<script>alert('meta')</script>"
meta link "javascript:alert(1)"

section "Process data"

> Narrative with <script>alert('n')</script> & an "ampersand".

given m_h = 2 kg/s        "Hot flow <script>alert('d')</script>" source "Heat balance & P&ID"
given cp  = 4 kJ/(kg*K)   "Specific heat"
given T_1 = 20 degC       "Inlet"
given T_2 = 30 degC       "Outlet"  source "javascript:alert(2)"
given m_c = 3 kg/s
given eps_f = 0.5         "Fin efficiency"

section "Duty"

Q     = m_h * cp * (T_2 - T_1)   in kW    "Duty"
T_out = T_2 + Q / (m_c * cp)     in degC  "Cold outlet"
Nu    = nu_dittus_boelter(5000, 5, 0.4)   "Nusselt number"
check Q <= 100 kW       "Duty limit"
check T_2 >= 40 degC    "Outlet hot enough"
check eps_f > 0.3
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

std::string Html(const Results& r) {
  std::string out, error;
  EXPECT_TRUE(WriteHtml(r, &out, &error)) << error;
  return out;
}

// The report is HTML5 written by an XML serializer: apart from the doctype
// it is well-formed XML, which is what lets the test read it back by
// structure.
struct Parsed {
  pugi::xml_document doc;
  pugi::xml_node html;
};

void Parse(const std::string& text, Parsed* p) {
  ASSERT_EQ(text.rfind("<!DOCTYPE html>\n", 0), 0u);
  const pugi::xml_parse_result ok =
      p->doc.load_string(text.c_str(), pugi::parse_default | pugi::parse_doctype);
  ASSERT_TRUE(ok) << ok.description() << " at " << ok.offset;
  p->html = p->doc.child("html");
  ASSERT_TRUE(p->html);
}

// All text under a node, as a browser would show it (whitespace as is).
std::string TextOf(pugi::xml_node n) {
  std::string s;
  for (pugi::xml_node c : n.children()) {
    if (c.type() == pugi::node_pcdata || c.type() == pugi::node_cdata)
      s += c.value();
    else
      s += TextOf(c);
  }
  return s;
}

pugi::xml_node One(pugi::xml_node root, const char* xpath) {
  return root.select_node(xpath).node();
}

TEST(HtmlWriterTest, TitleBlockAndSignOff) {
  auto s = Evaluate(kDeck);
  Parsed p;
  Parse(Html(s->results()), &p);
  EXPECT_EQ(TextOf(One(p.html, "//head/title")), "Cooler <E-1> & friends — TC-0042 · Rev. B");
  EXPECT_EQ(TextOf(One(p.html, "//header[@class='title-block']/h1")), "Cooler <E-1> & friends");
  auto field = [&](const char* key) {
    const std::string q = std::string("//div[@class='field'][@data-key='") + key + "']/div[2]";
    return TextOf(One(p.html, q.c_str()));
  };
  EXPECT_EQ(field("number"), "TC-0042");
  EXPECT_EQ(field("revision"), "B");
  EXPECT_EQ(field("date"), "2026-01-02");
  EXPECT_EQ(field("client"), "Client & Co");
  EXPECT_EQ(field("project"), "—");  // a fixed place, empty
  EXPECT_EQ(field("status"), "—");
  // Other meta keys are listed, as text.
  const auto others = p.html.select_nodes("//table[@class='other-fields']/tbody/tr");
  ASSERT_EQ(others.size(), 2u);
  EXPECT_EQ(TextOf(others.first().node()), "site<script>alert('meta')</script>");
  // Sign-off: the prepared name, and blanks to sign where empty.
  EXPECT_EQ(TextOf(One(p.html, "//tr[@data-role='prepared']/td[2]")), "RO");
  EXPECT_STREQ(One(p.html, "//tr[@data-role='checked']/td[2]").attribute("class").value(), "blank");
  EXPECT_EQ(p.html.select_nodes("//tr[@data-role='approved']/td[@class='blank']").size(), 3u);
  // Running head with title, number and revision.
  EXPECT_EQ(TextOf(One(p.html, "//div[@class='running-head']")),
            "Cooler <E-1> & friendsTC-0042 · Rev. B");
  // The caution is there.
  EXPECT_NE(TextOf(One(p.html, "//aside[@class='caution']")).find("competent engineer"),
            std::string::npos);
}

TEST(HtmlWriterTest, ChecksSummaryComesFirstAndCounts) {
  auto s = Evaluate(kDeck);
  Parsed p;
  Parse(Html(s->results()), &p);
  const pugi::xml_node verdict = One(p.html, "//section[@id='verdict']");
  ASSERT_TRUE(verdict);
  EXPECT_STREQ(verdict.attribute("class").value(), "verdict bad");
  auto count = [&](const char* key) {
    const std::string q = std::string(".//span[@data-count='") + key + "']/b";
    return TextOf(verdict.select_node(q.c_str()).node());
  };
  EXPECT_EQ(count("passed"), "2");
  EXPECT_EQ(count("failed"), "1");
  // nu_dittus_boelter at Re = 5000 is below its range (Re >= 10000).
  EXPECT_EQ(count("warnings"), "1");
  EXPECT_EQ(TextOf(verdict.child("div")), "1 of 3 check results FAIL");
  // The failed check is named and linked to its row.
  const pugi::xml_node link = verdict.select_node(".//ul[@class='failed-checks']/li/a").node();
  EXPECT_STREQ(link.attribute("href").value(), "#check-2");
  // The verdict precedes every calculation section.
  bool seen_verdict = false;
  for (pugi::xml_node n : One(p.html, "//main").children()) {
    if (std::string(n.attribute("id").value()) == "verdict") seen_verdict = true;
    if (std::string(n.attribute("class").value()) == "calc-section") {
      EXPECT_TRUE(seen_verdict);
    }
  }
}

TEST(HtmlWriterTest, InputsTable) {
  auto s = Evaluate(kDeck);
  Parsed p;
  Parse(Html(s->results()), &p);
  const auto rows = p.html.select_nodes("//table[@class='inputs']/tbody/tr");
  ASSERT_EQ(rows.size(), 6u);
  std::vector<std::string> names;
  for (const auto& r : rows) names.push_back(r.node().attribute("data-name").value());
  EXPECT_EQ(names, (std::vector<std::string>{"m_h", "cp", "T_1", "T_2", "m_c", "eps_f"}));
  const pugi::xml_node mh = rows.first().node();
  // Symbol m with subscript h; description; value as written; unit; source.
  EXPECT_EQ(TextOf(One(mh, "td[1]/span[@class='sym']")), "mh");
  EXPECT_EQ(TextOf(One(mh, "td[1]//sub")), "h");
  EXPECT_EQ(TextOf(One(mh, "td[2]")), "Hot flow <script>alert('d')</script>");
  EXPECT_EQ(TextOf(One(mh, "td[3]")), "2");
  EXPECT_EQ(TextOf(One(mh, "td[4]")), "kg/s");
  EXPECT_EQ(TextOf(One(mh, "td[5]")), "Heat balance & P&ID");
  const pugi::xml_node cp = rows[1].node();
  EXPECT_EQ(TextOf(One(cp, "td[4]")), "kJ/(kg·K)");
  const pugi::xml_node t1 = rows[2].node();
  EXPECT_EQ(TextOf(One(t1, "td[4]")), "°C");
  // Leading Greek word as its letter, the rest as subscript.
  const pugi::xml_node eps = rows[5].node();
  EXPECT_EQ(TextOf(One(eps, "td[1]/span[@class='sym']")), "εf");
}

TEST(HtmlWriterTest, EquationBlockShowsSymbolsValuesAndResult) {
  auto s = Evaluate(kDeck);
  Parsed p;
  Parse(Html(s->results()), &p);
  const pugi::xml_node eq = One(p.html, "//div[@class='eq'][@data-name='Q']");
  ASSERT_TRUE(eq);
  EXPECT_EQ(TextOf(One(eq, "div[@class='eq-head']")), "Duty");
  // Symbolic: m_h · cp · (T_2 − T_1), with m_h as msub.
  const pugi::xml_node sym = One(eq, ".//span[@class='symbolic']/math");
  ASSERT_TRUE(sym);
  EXPECT_EQ(TextOf(sym), "mh·cp·(T2−T1)");
  EXPECT_TRUE(One(sym, ".//msub[mi='m']"));
  // Substituted in display units, each value with its unit.
  const pugi::xml_node sub = One(eq, ".//span[@class='substituted']/math");
  ASSERT_TRUE(sub);
  std::vector<std::string> numbers;
  for (const auto& n : sub.select_nodes(".//mn")) numbers.push_back(n.node().text().get());
  EXPECT_EQ(numbers, (std::vector<std::string>{"2", "4", "30", "20"}));
  std::vector<std::string> units;
  for (const auto& n : sub.select_nodes(".//mtext[@class='u']"))
    units.push_back(n.node().text().get());
  EXPECT_EQ(units, (std::vector<std::string>{"kg/s", "kJ/(kg·K)", "°C", "°C"}));
  // Result with its unit on one line (no-break space).
  EXPECT_EQ(TextOf(One(eq, ".//span[@class='result']")), "80.00\u00a0kW");

  // A quotient becomes a fraction with the values in it.
  const pugi::xml_node tout = One(p.html, "//div[@class='eq'][@data-name='T_out']");
  EXPECT_TRUE(One(tout, ".//span[@class='substituted']//mfrac"));
  EXPECT_EQ(TextOf(One(tout, ".//span[@class='result']")), "36.67\u00a0°C");

  // A library call names its method and published source, and its warning
  // is shown inline.
  const pugi::xml_node nu = One(p.html, "//div[@class='eq'][@data-name='Nu']");
  const std::string notes = TextOf(One(nu, "div[@class='eq-notes']"));
  EXPECT_NE(notes.find("nu_dittus_boelter"), std::string::npos);
  EXPECT_NE(notes.find("Dittus & Boelter (1930)"), std::string::npos);
  EXPECT_TRUE(One(nu, ".//div[@class='msg warning']"));
}

TEST(HtmlWriterTest, ChecksTable) {
  auto s = Evaluate(kDeck);
  Parsed p;
  Parse(Html(s->results()), &p);
  const auto rows = p.html.select_nodes("//table[@class='checks']/tbody/tr");
  ASSERT_EQ(rows.size(), 3u);
  const pugi::xml_node c1 = rows[0].node();
  EXPECT_STREQ(c1.attribute("data-verdict").value(), "pass");
  EXPECT_EQ(TextOf(One(c1, "td[@class='num sides']")), "80.00\u00a0kW ≤ 100.0\u00a0kW");
  EXPECT_EQ(TextOf(One(c1, "td[@class='num margin']")), "20.00\u00a0kW");
  EXPECT_EQ(TextOf(One(c1, ".//div[@class='small']")), "Duty limit");
  const pugi::xml_node c2 = rows[1].node();
  EXPECT_STREQ(c2.attribute("class").value(), "failed");
  EXPECT_STREQ(c2.attribute("id").value(), "check-2");
  EXPECT_EQ(TextOf(One(c2, "td[@class='num margin']")), "−10.00\u00a0Δ°C");
  EXPECT_EQ(TextOf(One(c2, ".//span[@class='badge fail']")), "FAIL");
  const pugi::xml_node c3 = rows[2].node();
  EXPECT_EQ(TextOf(One(c3, "td[@class='num sides']")), "0.5000 > 0.3000");
}

TEST(HtmlWriterTest, EverythingFromTheDeckIsText) {
  auto s = Evaluate(kDeck);
  const std::string html = Html(s->results());
  Parsed p;
  Parse(html, &p);
  EXPECT_TRUE(p.html.select_nodes("//script").empty());
  EXPECT_EQ(html.find("<script"), std::string::npos);
  EXPECT_NE(html.find("&lt;script&gt;alert('d')&lt;/script&gt;"), std::string::npos);
  EXPECT_NE(html.find("Heat balance &amp; P&amp;ID"), std::string::npos);
  EXPECT_EQ(TextOf(One(p.html, "//p[@class='narrative']")),
            "Narrative with <script>alert('n')</script> & an \"ampersand\".");
  // Nothing is fetched and no link leaves the document.
  for (const auto& a : p.html.select_nodes("//*[@href or @src]")) {
    const std::string v = a.node().attribute("href") ? a.node().attribute("href").value()
                                                     : a.node().attribute("src").value();
    EXPECT_EQ(v.rfind("#", 0), 0u) << v;
    EXPECT_EQ(v.find("http"), std::string::npos);
    EXPECT_EQ(v.find("javascript:"), std::string::npos);
  }
  EXPECT_TRUE(p.html.select_nodes("//link").empty());
  EXPECT_TRUE(p.html.select_nodes("//img").empty());
  EXPECT_TRUE(p.html.select_nodes("//iframe").empty());
  EXPECT_EQ(html.find("@import"), std::string::npos);
  EXPECT_EQ(html.find("url("), std::string::npos);
}

TEST(HtmlWriterTest, PrintRules) {
  auto s = Evaluate(kDeck);
  const std::string html = Html(s->results());
  Parsed p;
  Parse(html, &p);
  const std::string css = TextOf(One(p.html, "//head/style"));
  EXPECT_NE(css.find("@page"), std::string::npos);
  EXPECT_NE(css.find("@media print"), std::string::npos);
  EXPECT_NE(css.find("position: fixed"), std::string::npos);
  // Each equation block is kept whole on a page.
  const size_t eq = css.find(".eq {");
  ASSERT_NE(eq, std::string::npos);
  EXPECT_NE(css.substr(eq, css.find('}', eq) - eq).find("break-inside: avoid"), std::string::npos);
  // The page table repeats its spacer row under the running head.
  EXPECT_TRUE(One(p.html, "//table[@class='page']/thead//div[@class='page-spacer']"));
}

TEST(HtmlWriterTest, SameResultsSameBytes) {
  auto a = Evaluate(kDeck);
  auto b = Evaluate(kDeck);
  const std::string ha = Html(a->results());
  EXPECT_EQ(ha, Html(b->results()));
  EXPECT_EQ(ha, Html(a->results()));
}

TEST(HtmlWriterTest, CasesSideBySide) {
  const std::string deck = std::string(kDeck) +
                           "case hot \"Hotter outlet\": T_2 = 45 degC\n"
                           "case slow: m_c = 6 kg/s\n";
  auto s = Evaluate(deck);
  ASSERT_EQ(s->results().cases.size(), 3u);
  Parsed p;
  Parse(Html(s->results()), &p);
  const pugi::xml_node table = One(p.html, "//section[@id='cases']/table");
  ASSERT_TRUE(table);
  std::vector<std::string> heads;
  for (const auto& th : table.select_nodes("thead/tr/th")) heads.push_back(TextOf(th.node()));
  EXPECT_EQ(heads, (std::vector<std::string>{"Quantity", "Unit", "base", "hot", "slow"}));
  std::vector<std::string> differing;
  for (const auto& tr : table.select_nodes("tbody/tr[@data-name]"))
    differing.push_back(tr.node().attribute("data-name").value());
  // Inputs T_2 and m_c, then the results that read them (Nu does not).
  EXPECT_EQ(differing, (std::vector<std::string>{"T_2", "m_c", "Q", "T_out"}));
  const pugi::xml_node t2 = One(table, "tbody/tr[@data-name='T_2']");
  EXPECT_EQ(TextOf(One(t2, "td[3]")), "30");
  EXPECT_EQ(TextOf(One(t2, "td[4]")), "45");
  EXPECT_STREQ(One(t2, "td[4]").attribute("class").value(), "num changed");
  EXPECT_STREQ(One(t2, "td[5]").attribute("class").value(), "num");
  // Q = 2 * 4 * 25 = 200 kW in case hot.
  EXPECT_EQ(TextOf(One(table, "tbody/tr[@data-name='Q']/td[4]")), "200.0");
  // Check outcomes per case: C2 (T_2 >= 40 degC) passes only in case hot.
  std::vector<std::string> c2;
  for (const auto& b : table.select_nodes("tbody/tr[td[1][starts-with(., 'C2')]]/td/span"))
    c2.push_back(TextOf(b.node()));
  EXPECT_EQ(c2, (std::vector<std::string>{"Outlet hot enough", "FAIL", "PASS", "FAIL"}));
  // The summary has one row per case.
  EXPECT_EQ(p.html.select_nodes("//table[@class='case-tally']/tbody/tr").size(), 3u);
}

TEST(HtmlWriterTest, SweepTableAndPlots) {
  auto s = Evaluate(kDeck);
  // The evaluator does not keep sweep rows yet; a hand-made sweep over T_2
  // checks that the writer lays one out (values by hand: Q = 8 kW/K * (T_2
  // - 20 K)).
  Results r = s->results();
  const Model& m = s->model();
  SweepResult sw;
  const int t2 = m.Find("T_2"), q = m.Find("Q"), cp = m.Find("cp");
  sw.swept = {t2};
  sw.columns = {t2, q, cp};
  for (double t : {25.0, 30.0, 35.0}) {
    sw.rows.push_back({273.15 + t, 8000.0 * (t - 20.0), 4000.0});
    sw.row_errors.push_back("");
  }
  sw.points = sw.rows.size();
  r.sweeps.push_back(sw);
  Parsed p;
  Parse(Html(r), &p);
  const pugi::xml_node sec = One(p.html, "//section[@id='sweeps']");
  ASSERT_TRUE(sec);
  const auto rows = sec.select_nodes(".//table[@class='sweep-table']/tbody/tr");
  ASSERT_EQ(rows.size(), 3u);
  EXPECT_EQ(TextOf(One(rows[0].node(), "td[2]")), "25");
  EXPECT_EQ(TextOf(One(rows[0].node(), "td[3]")), "40.00");  // kW
  EXPECT_EQ(TextOf(One(rows[2].node(), "td[3]")), "120.0");
  // cp does not change over the study: named once, not tabulated or plotted.
  EXPECT_EQ(sec.select_nodes(".//table[@class='sweep-table']/thead/tr/th").size(), 3u);
  const auto plots = sec.select_nodes(".//figure[@class='sweep-plot']/svg");
  ASSERT_EQ(plots.size(), 1u);
  const pugi::xml_node svg = plots.first().node();
  EXPECT_EQ(TextOf(One(svg, ".//g[@class='axis x-axis']/text[@class='axis-label']")), "T2 [°C]");
  EXPECT_EQ(TextOf(One(svg, ".//g[@class='axis y-axis']/text[@class='axis-label']")), "Q [kW]");
  EXPECT_EQ(svg.select_nodes(".//g[@class='series']/circle").size(), 3u);
  EXPECT_TRUE(One(p.html, "//nav//a[@href='#sweeps']"));
}

TEST(HtmlWriterTest, GridSweepPlotsOneLinePerValueOfTheSecondInput) {
  // A 3 x 2 grid evaluated by the pipeline.  By hand: T_out = T_2 + 8 kW/K *
  // (T_2 - 20 K) / (m_c * 4 kJ/(kg K)), e.g. 36.67 degC at 30 degC, 3 kg/s.
  auto s = Evaluate(
      "given m_h = 2 kg/s\n"
      "given cp = 4 kJ/(kg*K)\n"
      "given T_1 = 20 degC\n"
      "given T_2 = 30 degC\n"
      "given m_c = 3 kg/s\n"
      "Q = m_h * cp * (T_2 - T_1) in kW \"Duty\"\n"
      "T_out = T_2 + Q / (m_c * cp) in degC \"Cold outlet\"\n"
      "sweep T_2 over 30 degC, 35 degC, 40 degC\n"
      "sweep m_c over 3 kg/s, 6 kg/s\n");
  ASSERT_EQ(s->results().sweeps.size(), 1u);
  Parsed p;
  Parse(Html(s->results()), &p);
  const pugi::xml_node sec = One(p.html, "//section[@id='sweeps']");
  const auto rows = sec.select_nodes(".//table[@class='sweep-table']/tbody/tr");
  ASSERT_EQ(rows.size(), 6u);
  EXPECT_EQ(TextOf(One(rows[0].node(), "td[2]")), "30");
  EXPECT_EQ(TextOf(One(rows[0].node(), "td[3]")), "3");
  EXPECT_EQ(TextOf(rows[0].node()), "130380.0036.67");
  const auto plots = sec.select_nodes(".//figure[@class='sweep-plot']");
  ASSERT_EQ(plots.size(), 2u);  // Q and T_out
  const pugi::xml_node tout = plots[1].node();
  EXPECT_EQ(TextOf(One(tout, "figcaption")), "Tout — Cold outlet");
  const auto lines = tout.select_nodes(".//g[@class='series']/polyline");
  ASSERT_EQ(lines.size(), 2u);
  const auto legend = tout.select_nodes(".//g[@class='legend']/text");
  ASSERT_EQ(legend.size(), 2u);
  EXPECT_EQ(TextOf(legend[0].node()), "mc = 3 kg/s");
  EXPECT_EQ(TextOf(legend[1].node()), "mc = 6 kg/s");
  EXPECT_EQ(tout.select_nodes(".//g[@class='series']/circle").size(), 6u);
}

TEST(HtmlWriterTest, AppendixListsFilesUnitsMethodsAndWarnings) {
  auto s = Evaluate(kDeck);
  Parsed p;
  Parse(Html(s->results()), &p);
  const pugi::xml_node app = One(p.html, "//section[@id='appendix']");
  ASSERT_TRUE(app);
  const auto files = app.select_nodes(".//table[@class='files']/tbody/tr");
  ASSERT_EQ(files.size(), 1u);
  EXPECT_EQ(TextOf(One(files[0].node(), "td[1]")), "input.deck");
  EXPECT_EQ(TextOf(One(files[0].node(), "td[2]")), s->results().files[0].sha256);
  EXPECT_EQ(TextOf(One(files[0].node(), "td[2]")).size(), 64u);
  // degC: factor 1, offset 273.15 (SI brochure); kJ/(kg*K): factor 1000.
  const pugi::xml_node degc = One(app, ".//table[@class='units']/tbody/tr[td[2]/code='degC']");
  ASSERT_TRUE(degc);
  EXPECT_EQ(TextOf(One(degc, "td[1]")), "°C");
  EXPECT_EQ(TextOf(One(degc, "td[4]")), "1");
  EXPECT_EQ(TextOf(One(degc, "td[5]")), "273.15");
  EXPECT_EQ(TextOf(One(app, ".//table[@class='units']/tbody/tr[td[2]/code='kJ/(kg*K)']/td[4]")),
            "1000");
  const auto methods = app.select_nodes(".//table[@class='methods']/tbody/tr");
  ASSERT_EQ(methods.size(), 1u);
  EXPECT_EQ(TextOf(One(methods[0].node(), "td[1]")), "nu_dittus_boelter");
  const auto warnings = app.select_nodes(".//table[@class='warnings']/tbody/tr");
  ASSERT_EQ(warnings.size(), 1u);
  EXPECT_EQ(TextOf(One(warnings[0].node(), "td[3]")), "warning");
  EXPECT_NE(TextOf(One(warnings[0].node(), "td[4]")).find("Re = 5000"), std::string::npos);
}

TEST(HtmlWriterTest, ValuesThatCouldNotBeEvaluated) {
  auto s = std::make_unique<Session>();
  ASSERT_TRUE(s->LoadText("input.deck",
                          "given x = -4\n"
                          "y = sqrt(x) \"Root\"\n"
                          "check y > 1\n",
                          {}));
  EXPECT_FALSE(s->Evaluate());  // sqrt of a negative number is a located error
  Parsed p;
  Parse(Html(s->results()), &p);
  const pugi::xml_node eq = One(p.html, "//div[@class='eq'][@data-name='y']");
  EXPECT_EQ(TextOf(One(eq, ".//span[@class='result']")), "not evaluated");
  EXPECT_TRUE(One(eq, ".//div[@class='msg error']"));
  EXPECT_STREQ(One(p.html, "//section[@id='verdict']").attribute("class").value(), "verdict bad");
  EXPECT_STREQ(One(p.html, "//table[@class='checks']/tbody/tr").attribute("data-verdict").value(),
               "not evaluated");
}

// Temperatures from the deck itself: hot 80 -> 40 degC, cold 20 -> 50 degC.
constexpr char kProfileDeck[] = R"deck(title "Profile"
section "Streams"
given T_h1 = 80 degC
given T_h2 = 40 degC
given T_c1 = 20 degC
given T_c2 = 50 degC
profile counter: hot T_h1 to T_h2, cold T_c1 to T_c2 "Cooler profile"
)deck";

// The x of an arrowhead's tip minus the x of its base's middle: positive when
// it points to larger x.
double ArrowDirection(pugi::xml_node polygon) {
  double x[3], y[3];
  const std::string pts = polygon.attribute("points").value();
  const char* c = pts.c_str();
  for (int i = 0; i < 3; ++i) {
    char* end = nullptr;
    x[i] = std::strtod(c, &end);
    y[i] = std::strtod(end + 1, &end);
    c = end;
  }
  (void)y;
  return x[0] - (x[1] + x[2]) / 2;
}

TEST(HtmlWriterTest, ProfileFigureFromTheDecksTemperatures) {
  auto s = Evaluate(kProfileDeck);
  Parsed p;
  Parse(Html(s->results()), &p);
  const pugi::xml_node fig = One(p.html, "//figure[@class='profile']");
  ASSERT_TRUE(fig);
  EXPECT_EQ(TextOf(fig.child("figcaption")), "Cooler profile. Arrows show the direction of flow.");
  const pugi::xml_node svg = fig.child("svg");
  ASSERT_TRUE(svg);
  EXPECT_EQ(svg.select_nodes(".//g[@class='series']/polyline").size(), 2u);
  const auto legend = svg.select_nodes(".//g[@class='legend']/text");
  ASSERT_EQ(legend.size(), 2u);
  EXPECT_EQ(TextOf(legend[0].node()), "Hot stream: Th1 80 °C → Th2 40 °C");
  EXPECT_EQ(TextOf(legend[1].node()), "Cold stream: Tc1 20 °C → Tc2 50 °C");
  // x runs 0 … 1 (fraction of area); y covers 20 … 80 degC.
  std::vector<std::string> xt;
  for (const auto& t : svg.select_nodes(".//g[@class='axis x-axis']/text[@class='tick']"))
    xt.push_back(TextOf(t.node()));
  ASSERT_FALSE(xt.empty());
  EXPECT_EQ(xt.front(), "0.0");
  EXPECT_EQ(xt.back(), "1.0");
  EXPECT_EQ(TextOf(One(svg, ".//g[@class='axis y-axis']/text[@class='axis-label']")), "T [°C]");
  // Counterflow: the hot stream flows towards x = 1, the cold one back.
  const auto series = svg.select_nodes(".//g[@class='series']");
  ASSERT_EQ(series.size(), 2u);
  for (const auto& a : series[0].node().select_nodes("polygon[@class='flow-arrow']"))
    EXPECT_GT(ArrowDirection(a.node()), 0);
  const auto cold_arrows = series[1].node().select_nodes("polygon[@class='flow-arrow']");
  ASSERT_EQ(cold_arrows.size(), 2u);
  for (const auto& a : cold_arrows) EXPECT_LT(ArrowDirection(a.node()), 0);

  // Parallel flow: both streams flow towards x = 1.
  std::string parallel = kProfileDeck;
  parallel.replace(parallel.find("profile counter"), 15, "profile parallel");
  parallel.replace(parallel.find("T_c2 = 50 degC"), 14, "T_c2 = 35 degC");
  auto s2 = Evaluate(parallel);
  Parsed p2;
  Parse(Html(s2->results()), &p2);
  const auto arrows =
      p2.html.select_nodes("//figure[@class='profile']//polygon[@class='flow-arrow']");
  ASSERT_EQ(arrows.size(), 4u);
  for (const auto& a : arrows) EXPECT_GT(ArrowDirection(a.node()), 0);
}

TEST(HtmlWriterTest, ProfileWithATemperatureCrossIsNotDrawn) {
  std::string deck = kProfileDeck;
  // Counterflow with the cold outlet above the hot inlet: 80 - 90 < 0.
  deck.replace(deck.find("T_c2 = 50 degC"), 14, "T_c2 = 90 degC");
  auto s = Evaluate(deck);
  Parsed p;
  Parse(Html(s->results()), &p);
  const pugi::xml_node fig = One(p.html, "//figure[@class='profile']");
  ASSERT_TRUE(fig);
  EXPECT_FALSE(fig.child("svg"));
  EXPECT_NE(TextOf(One(fig, "div[@class='msg error']")).find("temperature cross"),
            std::string::npos);
}

TEST(HtmlWriterTest, NoProfileStatementNoFigure) {
  auto s = Evaluate(kDeck);
  Parsed p;
  Parse(Html(s->results()), &p);
  EXPECT_TRUE(p.html.select_nodes("//figure").empty());
}

TEST(HtmlWriterTest, TemplateQuantitiesByFullName) {
  const std::filesystem::path dir =
      std::filesystem::path(::testing::TempDir()) / "heatdeck_html_template_test";
  std::filesystem::create_directories(dir);
  std::ofstream(dir / "part.deck") << "given a = 2 m \"Side\"\n"
                                      "given k = 3\n"
                                      "A = a * a * k in m^2 \"Area\"\n";
  std::ofstream(dir / "main.deck") << "given s = 4 m\n"
                                      "use \"part.deck\" as hx with a = s\n";
  auto session = std::make_unique<Session>();
  ASSERT_TRUE(session->Load((dir / "main.deck").string(), {}));
  session->Evaluate();
  Parsed p;
  Parse(Html(session->results()), &p);
  const pugi::xml_node eq = One(p.html, "//div[@data-name='hx.A']");
  ASSERT_TRUE(eq);
  EXPECT_EQ(TextOf(One(eq, "span[@class='ref']")), "template hx, line 3");
  // Names inside the template's expression carry its prefix.
  EXPECT_EQ(TextOf(One(eq, ".//span[@class='symbolic']/math")), "hx.a·hx.a·hx.k");
  // 4 m * 4 m * 3 = 48 m^2.
  EXPECT_EQ(TextOf(One(eq, ".//span[@class='result']")), "48.00\u00a0m²");
  // The unbound input keeps its default and says so.
  EXPECT_EQ(TextOf(One(p.html, "//tr[@data-name='hx.k']//span[@class='badge tag']")),
            "template default");
  std::filesystem::remove_all(dir);
}

}  // namespace
}  // namespace heatdeck
