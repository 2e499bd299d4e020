// Line plots as SVG, built as a DOM (pugixml) so that every label is
// escaped by construction: the report's sweep plots and temperature
// profiles.  Deterministic: the same plot gives the same bytes.
#pragma once

#include <string>
#include <vector>

namespace pugi {
class xml_node;
}

namespace heatdeck::report {

// Labels may mark subscripts as "_{...}": "T_{h1} [°C]" draws h1 lowered.
struct PlotSeries {
  std::string label;         // in the legend; no legend when every label is empty
  std::vector<double> x, y;  // equal lengths; a non-finite y breaks the line
  // Flow direction drawn as arrowheads on the line: +1 towards larger x,
  // -1 towards smaller x, 0 none.
  int direction = 0;
  bool markers = false;  // a dot at every point
  int tone = -1;         // palette entry; -1: the series' position
};

// A text placed at a data point (e.g. an inlet temperature).
struct PlotNote {
  double x = 0, y = 0;
  std::string text;
  bool left = false;  // text ends at the point instead of starting there
  bool below = false;
};

struct LinePlot {
  std::string x_label;  // with the unit: "T_{c1} [°C]"
  std::string y_label;
  std::vector<PlotSeries> series;
  std::vector<PlotNote> notes;
  std::string description;           // the SVG <title>, for screen readers
  double width = 520, height = 300;  // user units of the viewBox
  // Axis ranges forced to include these (e.g. 0 … 1 for a fraction).
  bool fix_x = false;
  double x_min = 0, x_max = 1;
};

// An axis range rounded outwards to a step of 1, 2 or 5 × 10^k with about
// `target` intervals; ticks are lo, lo + step, … hi.  A zero range is
// widened around its value (by 1 when the value is 0, else 10 % of it).
struct Axis {
  double lo = 0, hi = 1, step = 1;
  std::vector<double> ticks;
};
Axis NiceAxis(double lo, double hi, int target = 5);

// A tick value printed with just the decimals its step needs ("0.2",
// "0.05", "40"); from a million up, or for steps below 1e-6, with three
// significant digits (units::FormatSig: "2500000", "1.00e+07"); never "-0".
std::string TickLabel(double v, double step);

// Appends the plot as an <svg> element to parent.
void AppendLinePlot(const LinePlot& plot, pugi::xml_node parent);
// The plot as a standalone SVG document.
std::string LinePlotSvg(const LinePlot& plot);

}  // namespace heatdeck::report
