#include "report/svg_plot.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <string>
#include <vector>

#include <gtest/gtest.h>
#include <pugixml.hpp>

namespace heatdeck::report {
namespace {

TEST(NiceAxisTest, RoundsOutwardToOneTwoFive) {
  // 0 … 0.93 in about five steps: raw step 0.186 -> 0.2, range 0 … 1.
  Axis a = NiceAxis(0, 0.93, 5);
  EXPECT_DOUBLE_EQ(a.step, 0.2);
  EXPECT_DOUBLE_EQ(a.lo, 0);
  EXPECT_DOUBLE_EQ(a.hi, 1.0);
  ASSERT_EQ(a.ticks.size(), 6u);
  EXPECT_NEAR(a.ticks[3], 0.6, 1e-12);

  // 17.3 … 81.2: raw step 12.78 -> 10, range 10 … 90.
  a = NiceAxis(17.3, 81.2, 5);
  EXPECT_DOUBLE_EQ(a.step, 10);
  EXPECT_DOUBLE_EQ(a.lo, 10);
  EXPECT_DOUBLE_EQ(a.hi, 90);
  EXPECT_EQ(a.ticks.size(), 9u);

  // 0 … 2.6e6: raw 5.2e5 -> 5e5.
  a = NiceAxis(0, 2.6e6, 5);
  EXPECT_DOUBLE_EQ(a.step, 5e5);
  EXPECT_DOUBLE_EQ(a.hi, 3e6);

  // Reversed bounds are swapped; negative ranges round outward too.
  a = NiceAxis(-3.2, -11.9, 4);
  EXPECT_DOUBLE_EQ(a.step, 2);
  EXPECT_DOUBLE_EQ(a.lo, -12);
  EXPECT_DOUBLE_EQ(a.hi, -2);
}

TEST(NiceAxisTest, ZeroRangeIsWidened) {
  Axis a = NiceAxis(5, 5, 5);  // 4.5 … 5.5: raw 0.2 -> step 0.2
  EXPECT_DOUBLE_EQ(a.step, 0.2);
  EXPECT_LE(a.lo, 4.5);
  EXPECT_GE(a.hi, 5.5);
  a = NiceAxis(0, 0, 5);  // -1 … 1
  EXPECT_LE(a.lo, -1);
  EXPECT_GE(a.hi, 1);
  EXPECT_GT(a.ticks.size(), 2u);
}

TEST(TickLabelTest, DecimalsFollowTheStep) {
  EXPECT_EQ(TickLabel(0.30000000000000004, 0.1), "0.3");
  EXPECT_EQ(TickLabel(0.4, 0.2), "0.4");
  EXPECT_EQ(TickLabel(0.05, 0.05), "0.05");
  EXPECT_EQ(TickLabel(40, 10), "40");
  EXPECT_EQ(TickLabel(-1e-17, 0.2), "0.0");  // never "-0.0"
  EXPECT_EQ(TickLabel(-1e-17, 10), "0");
  EXPECT_EQ(TickLabel(2.5e6, 5e5), "2500000");
  EXPECT_EQ(TickLabel(1e7, 5e6), "1.00e+07");
}

struct Parsed {
  pugi::xml_document doc;
  pugi::xml_node svg;
};

void Parse(const std::string& text, Parsed* p) {
  const pugi::xml_parse_result ok = p->doc.load_string(text.c_str());
  ASSERT_TRUE(ok) << ok.description();
  p->svg = p->doc.child("svg");
  ASSERT_TRUE(p->svg);
}

std::vector<std::string> TickTexts(pugi::xml_node svg, const char* axis_class) {
  std::vector<std::string> out;
  const std::string q = std::string("//g[@class='axis ") + axis_class + "']/text[@class='tick']";
  for (const pugi::xpath_node& n : svg.select_nodes(q.c_str()))
    out.push_back(n.node().text().get());
  return out;
}

LinePlot TwoStreams() {
  LinePlot plot;
  plot.x_label = "Fraction of area";
  plot.y_label = "T [°C]";
  plot.fix_x = true;
  PlotSeries hot, cold;
  hot.label = "Hot <b>&amp; T_{h1}";
  cold.label = "Cold";
  for (int i = 0; i <= 10; ++i) {
    const double x = i / 10.0;
    hot.x.push_back(x);
    cold.x.push_back(x);
    hot.y.push_back(80 - 30 * x);
    cold.y.push_back(47 - 27 * x);
  }
  hot.direction = 1;
  cold.direction = -1;
  plot.series = {hot, cold};
  plot.notes.push_back({0, 80, "80.0 °C", false, false});
  return plot;
}

TEST(LinePlotTest, AxesTicksAndLabels) {
  Parsed p;
  Parse(LinePlotSvg(TwoStreams()), &p);
  EXPECT_STREQ(p.svg.attribute("xmlns").value(), "http://www.w3.org/2000/svg");
  // x: exactly 0 … 1 in steps of 0.2; y: 20 … 80 (data 20 … 80) in steps of 10.
  EXPECT_EQ(TickTexts(p.svg, "x-axis"),
            (std::vector<std::string>{"0.0", "0.2", "0.4", "0.6", "0.8", "1.0"}));
  EXPECT_EQ(TickTexts(p.svg, "y-axis"),
            (std::vector<std::string>{"20", "30", "40", "50", "60", "70", "80"}));
  const pugi::xml_node xl =
      p.svg.select_node("//g[@class='axis x-axis']/text[@class='axis-label']").node();
  EXPECT_STREQ(xl.text().get(), "Fraction of area");
  const pugi::xml_node yl =
      p.svg.select_node("//g[@class='axis y-axis']/text[@class='axis-label']").node();
  EXPECT_STREQ(yl.text().get(), "T [°C]");
  EXPECT_NE(std::string(yl.attribute("transform").value()).find("rotate(-90)"), std::string::npos);

  // Ticks lie inside the plot area, left to right, the first at its left edge.
  const pugi::xml_node area = p.svg.child("rect");
  const double x0 = std::atof(area.attribute("x").value());
  const double w = std::atof(area.attribute("width").value());
  double last = -1;
  int n = 0;
  for (const pugi::xpath_node& t :
       p.svg.select_nodes("//g[@class='axis x-axis']/text[@class='tick']")) {
    const double x = std::atof(t.node().attribute("x").value());
    if (n++ == 0) EXPECT_NEAR(x, x0, 0.05);
    EXPECT_GT(x, last);
    EXPECT_LE(x, x0 + w + 0.05);
    last = x;
  }
  EXPECT_NEAR(last, x0 + w, 0.05);
}

TEST(LinePlotTest, SeriesArrowsLegendAndEscaping) {
  const std::string svg = LinePlotSvg(TwoStreams());
  Parsed p;
  Parse(svg, &p);
  const auto lines = p.svg.select_nodes("//g[@class='series']/polyline");
  ASSERT_EQ(lines.size(), 2u);
  // 11 points each.
  std::string pts = lines.first().node().attribute("points").value();
  EXPECT_EQ(std::count(pts.begin(), pts.end(), ','), 11);
  // Two arrowheads per stream that has a direction.
  EXPECT_EQ(p.svg.select_nodes("//polygon[@class='flow-arrow']").size(), 4u);
  // The hot line falls from left to right: its first point is highest (smallest y).
  const double y_first = std::atof(pts.substr(pts.find(',') + 1).c_str());
  const double y_last = std::atof(pts.substr(pts.rfind(',') + 1).c_str());
  EXPECT_LT(y_first, y_last);
  // Legend: both labels, the subscript as a lowered tspan, markup kept as text.
  const auto legend = p.svg.select_nodes("//g[@class='legend']/text");
  ASSERT_EQ(legend.size(), 2u);
  const pugi::xml_node hot = legend.first().node();
  EXPECT_STREQ(hot.first_child().value(), "Hot <b>&amp; T");
  EXPECT_STREQ(hot.child("tspan").text().get(), "h1");
  EXPECT_STREQ(hot.child("tspan").attribute("baseline-shift").value(), "sub");
  EXPECT_EQ(svg.find("<b>"), std::string::npos);
  EXPECT_NE(svg.find("&lt;b&gt;&amp;amp;"), std::string::npos);
  EXPECT_EQ(p.svg.select_nodes("//g[@class='notes']/text").size(), 1u);
}

TEST(LinePlotTest, NonFiniteValuesBreakTheLine) {
  LinePlot plot;
  PlotSeries s;
  s.x = {1, 2, 3, 4, 5};
  s.y = {1, 2, NAN, 4, 5};
  s.markers = true;
  plot.series = {s};
  Parsed p;
  Parse(LinePlotSvg(plot), &p);
  EXPECT_EQ(p.svg.select_nodes("//g[@class='series']/polyline").size(), 2u);
  EXPECT_EQ(p.svg.select_nodes("//g[@class='series']/circle").size(), 4u);
}

TEST(LinePlotTest, SameInputSameBytes) {
  EXPECT_EQ(LinePlotSvg(TwoStreams()), LinePlotSvg(TwoStreams()));
}

}  // namespace
}  // namespace heatdeck::report
