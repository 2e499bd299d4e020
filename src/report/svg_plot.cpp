#include "report/svg_plot.h"

#include <algorithm>
#include <cmath>
#include <sstream>

#include <fmt/format.h>
#include <pugixml.hpp>

#include "units/unit.h"

namespace heatdeck::report {

namespace {

// Sober tones that stay apart in greyscale print, each with its own dash
// pattern so that a black-and-white copy still tells the lines apart.
struct Tone {
  const char* color;
  const char* dash;  // "" for solid
};
constexpr Tone kTones[] = {
    {"#b4432f", ""},         // brick: the hot stream, the first series
    {"#2b5d8a", "7 3"},      // steel blue: the cold stream
    {"#3c7a4c", "2 3"},      // green
    {"#7b5a96", "9 3 2 3"},  // violet
    {"#9a7414", "4 2"},      // ochre
    {"#4d4d4d", "1 2"},      // grey
};
constexpr int kToneCount = static_cast<int>(sizeof(kTones) / sizeof(kTones[0]));

constexpr double kFontSize = 11;
constexpr double kCharWidth = 6.2;  // mean advance at kFontSize, for layout estimates
constexpr double kLegendRow = 16;

std::string Num(double v) {
  if (std::fabs(v) < 0.005) v = 0;  // no "-0.0"
  return fmt::format("{:.1f}", v);
}

size_t VisibleLength(const std::string& label) {
  size_t n = 0;
  for (size_t i = 0; i < label.size(); ++i) {
    const unsigned char c = static_cast<unsigned char>(label[i]);
    if (label.compare(i, 2, "_{") == 0) {
      ++i;
      continue;
    }
    if (c == '}') continue;
    if ((c & 0xC0) != 0x80) ++n;  // count code points, not bytes
  }
  return n;
}

// Appends text with "_{...}" drawn as subscripts.
void AppendRichText(pugi::xml_node text, const std::string& label) {
  size_t i = 0;
  while (i < label.size()) {
    const size_t open = label.find("_{", i);
    if (open == std::string::npos) {
      text.append_child(pugi::node_pcdata).set_value(label.substr(i).c_str());
      break;
    }
    if (open > i) text.append_child(pugi::node_pcdata).set_value(label.substr(i, open - i).c_str());
    const size_t close = label.find('}', open + 2);
    const std::string sub =
        label.substr(open + 2, close == std::string::npos ? std::string::npos : close - open - 2);
    pugi::xml_node span = text.append_child("tspan");
    span.append_attribute("baseline-shift") = "sub";
    span.append_attribute("font-size") = "9";
    span.text().set(sub.c_str());
    if (close == std::string::npos) break;
    i = close + 1;
  }
}

pugi::xml_node AddText(pugi::xml_node parent, double x, double y, const std::string& label,
                       const char* anchor) {
  pugi::xml_node t = parent.append_child("text");
  t.append_attribute("x") = Num(x).c_str();
  t.append_attribute("y") = Num(y).c_str();
  if (anchor != nullptr) t.append_attribute("text-anchor") = anchor;
  AppendRichText(t, label);
  return t;
}

pugi::xml_node AddLine(pugi::xml_node parent, double x1, double y1, double x2, double y2) {
  pugi::xml_node l = parent.append_child("line");
  l.append_attribute("x1") = Num(x1).c_str();
  l.append_attribute("y1") = Num(y1).c_str();
  l.append_attribute("x2") = Num(x2).c_str();
  l.append_attribute("y2") = Num(y2).c_str();
  return l;
}

struct Range {
  double lo = INFINITY, hi = -INFINITY;
  void Add(double v) {
    if (!std::isfinite(v)) return;
    lo = std::min(lo, v);
    hi = std::max(hi, v);
  }
  bool empty() const { return lo > hi; }
};

struct LegendItem {
  double x, y;
};

}  // namespace

Axis NiceAxis(double lo, double hi, int target) {
  Axis a;
  if (!std::isfinite(lo) || !std::isfinite(hi)) lo = 0, hi = 1;
  if (lo > hi) std::swap(lo, hi);
  if (lo == hi) {
    const double pad = lo == 0 ? 1.0 : 0.1 * std::fabs(lo);
    lo -= pad;
    hi += pad;
  }
  target = std::max(target, 1);
  const double raw = (hi - lo) / target;
  const double mag = std::pow(10.0, std::floor(std::log10(raw)));
  const double norm = raw / mag;
  const double mult = norm < 1.5 ? 1 : norm < 3 ? 2 : norm < 7 ? 5 : 10;
  a.step = mult * mag;
  // Tick positions are integer multiples of the step, so that no rounding
  // drift accumulates along the axis.
  const double first = std::floor(lo / a.step + 1e-9);
  const double last = std::ceil(hi / a.step - 1e-9);
  a.lo = first * a.step;
  a.hi = last * a.step;
  for (double k = first; k <= last + 0.5; k += 1) a.ticks.push_back(k * a.step);
  return a;
}

std::string TickLabel(double v, double step) {
  if (std::fabs(v) < std::fabs(step) * 1e-9) v = 0;
  const double big = std::max(std::fabs(v), std::fabs(step));
  if (big >= 1e6 || std::fabs(step) < 1e-6) return units::FormatSig(v, 3);
  const int decimals =
      std::max(0, static_cast<int>(std::ceil(-std::log10(std::fabs(step)) - 1e-9)));
  return fmt::format("{:.{}f}", v, decimals);
}

void AppendLinePlot(const LinePlot& plot, pugi::xml_node parent) {
  const double width = plot.width, height = plot.height;

  // Legend rows, laid out first: they take room from the bottom.
  std::vector<LegendItem> legend;
  double lx = 0, ly = 0;
  const double legend_width = width - 70;
  for (const PlotSeries& s : plot.series) {
    const double w = 34 + kCharWidth * static_cast<double>(VisibleLength(s.label));
    if (lx > 0 && lx + w > legend_width) {
      lx = 0;
      ly += kLegendRow;
    }
    legend.push_back({lx, ly});
    lx += w + 14;
  }
  bool any_label = false;
  for (const PlotSeries& s : plot.series) any_label = any_label || !s.label.empty();
  const double legend_h = any_label ? ly + kLegendRow + 4 : 0;

  const double left = 62, right = 18, top = 14, bottom = 44 + legend_h;
  const double x0 = left, x1 = width - right, y0 = top, y1 = height - bottom;

  Range xr, yr;
  for (const PlotSeries& s : plot.series) {
    const size_t n = std::min(s.x.size(), s.y.size());
    for (size_t i = 0; i < n; ++i) {
      if (!std::isfinite(s.y[i])) continue;
      xr.Add(s.x[i]);
      yr.Add(s.y[i]);
    }
  }
  for (const PlotNote& note : plot.notes) {
    xr.Add(note.x);
    yr.Add(note.y);
  }
  if (plot.fix_x) {
    xr.Add(plot.x_min);
    xr.Add(plot.x_max);
  }
  if (xr.empty()) xr = {0, 1};
  if (yr.empty()) yr = {0, 1};
  const Axis ax = plot.fix_x && xr.lo == plot.x_min && xr.hi == plot.x_max
                      ? NiceAxis(plot.x_min, plot.x_max, 5)
                      : NiceAxis(xr.lo, xr.hi, 6);
  const Axis ay = NiceAxis(yr.lo, yr.hi, 5);
  auto px = [&](double x) { return x0 + (x - ax.lo) / (ax.hi - ax.lo) * (x1 - x0); };
  auto py = [&](double y) { return y1 - (y - ay.lo) / (ay.hi - ay.lo) * (y1 - y0); };

  // No xmlns here: inside an HTML document the parser gives <svg> its
  // namespace; LinePlotSvg adds it for a standalone file.
  pugi::xml_node svg = parent.append_child("svg");
  svg.append_attribute("class") = "plot";
  svg.append_attribute("viewBox") = fmt::format("0 0 {} {}", Num(width), Num(height)).c_str();
  svg.append_attribute("width") = Num(width).c_str();
  svg.append_attribute("height") = Num(height).c_str();
  svg.append_attribute("role") = "img";
  svg.append_attribute("font-family") = "DejaVu Sans, Liberation Sans, Arial, sans-serif";
  svg.append_attribute("font-size") = Num(kFontSize).c_str();
  if (!plot.description.empty()) svg.append_child("title").text().set(plot.description.c_str());

  pugi::xml_node frame = svg.append_child("rect");
  frame.append_attribute("class") = "plot-area";
  frame.append_attribute("x") = Num(x0).c_str();
  frame.append_attribute("y") = Num(y0).c_str();
  frame.append_attribute("width") = Num(x1 - x0).c_str();
  frame.append_attribute("height") = Num(y1 - y0).c_str();
  frame.append_attribute("fill") = "#ffffff";
  frame.append_attribute("stroke") = "#8a9099";
  frame.append_attribute("stroke-width") = "0.8";

  pugi::xml_node grid = svg.append_child("g");
  grid.append_attribute("class") = "grid";
  grid.append_attribute("stroke") = "#e2e5e9";
  grid.append_attribute("stroke-width") = "0.6";
  pugi::xml_node xaxis = svg.append_child("g");
  xaxis.append_attribute("class") = "axis x-axis";
  xaxis.append_attribute("fill") = "#333a44";
  pugi::xml_node yaxis = svg.append_child("g");
  yaxis.append_attribute("class") = "axis y-axis";
  yaxis.append_attribute("fill") = "#333a44";
  for (double t : ax.ticks) {
    const double x = px(t);
    if (t != ax.lo && t != ax.hi) AddLine(grid, x, y0, x, y1);
    AddLine(xaxis, x, y1, x, y1 + 4).append_attribute("stroke") = "#8a9099";
    AddText(xaxis, x, y1 + 15, TickLabel(t, ax.step), "middle").append_attribute("class") = "tick";
  }
  for (double t : ay.ticks) {
    const double y = py(t);
    if (t != ay.lo && t != ay.hi) AddLine(grid, x0, y, x1, y);
    AddLine(yaxis, x0 - 4, y, x0, y).append_attribute("stroke") = "#8a9099";
    AddText(yaxis, x0 - 7, y + 3.8, TickLabel(t, ay.step), "end").append_attribute("class") =
        "tick";
  }
  AddText(xaxis, (x0 + x1) / 2, y1 + 33, plot.x_label, "middle").append_attribute("class") =
      "axis-label";
  pugi::xml_node yl = AddText(yaxis, 0, 0, plot.y_label, "middle");
  yl.append_attribute("class") = "axis-label";
  yl.append_attribute("transform") =
      fmt::format("translate({},{}) rotate(-90)", Num(15), Num((y0 + y1) / 2)).c_str();

  for (size_t si = 0; si < plot.series.size(); ++si) {
    const PlotSeries& s = plot.series[si];
    const int tone_index = (s.tone >= 0 ? s.tone : static_cast<int>(si)) % kToneCount;
    const Tone& tone = kTones[tone_index];
    pugi::xml_node g = svg.append_child("g");
    g.append_attribute("class") = "series";
    g.append_attribute("stroke") = tone.color;
    g.append_attribute("fill") = tone.color;
    const size_t n = std::min(s.x.size(), s.y.size());
    // One polyline per run of finite points.
    std::string points;
    auto flush = [&] {
      if (points.empty()) return;
      pugi::xml_node pl = g.append_child("polyline");
      pl.append_attribute("fill") = "none";
      pl.append_attribute("stroke-width") = "1.8";
      pl.append_attribute("stroke-linejoin") = "round";
      if (*tone.dash != '\0') pl.append_attribute("stroke-dasharray") = tone.dash;
      pl.append_attribute("points") = points.c_str();
      points.clear();
    };
    for (size_t i = 0; i < n; ++i) {
      if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i])) {
        flush();
        continue;
      }
      if (!points.empty()) points += ' ';
      points += Num(px(s.x[i])) + "," + Num(py(s.y[i]));
    }
    flush();
    if (s.markers) {
      for (size_t i = 0; i < n; ++i) {
        if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i])) continue;
        pugi::xml_node c = g.append_child("circle");
        c.append_attribute("cx") = Num(px(s.x[i])).c_str();
        c.append_attribute("cy") = Num(py(s.y[i])).c_str();
        c.append_attribute("r") = "2.4";
        c.append_attribute("stroke") = "none";
      }
    }
    if (s.direction != 0 && n >= 2) {
      // Arrowheads at a third and two thirds of the way, along the line.
      for (double at : {1.0 / 3.0, 2.0 / 3.0}) {
        size_t i = static_cast<size_t>(at * static_cast<double>(n - 1));
        i = std::min(i, n - 2);
        if (!std::isfinite(s.y[i]) || !std::isfinite(s.y[i + 1])) continue;
        double ux = px(s.x[i + 1]) - px(s.x[i]), uy = py(s.y[i + 1]) - py(s.y[i]);
        const double len = std::hypot(ux, uy);
        if (len == 0) continue;
        ux /= len;
        uy /= len;
        if ((s.x[i + 1] - s.x[i]) * s.direction < 0) ux = -ux, uy = -uy;
        const double mx = (px(s.x[i]) + px(s.x[i + 1])) / 2, my = (py(s.y[i]) + py(s.y[i + 1])) / 2;
        const double tipx = mx + 6 * ux, tipy = my + 6 * uy;
        const double bx = mx - 5 * ux, by = my - 5 * uy;
        pugi::xml_node arrow = g.append_child("polygon");
        arrow.append_attribute("class") = "flow-arrow";
        arrow.append_attribute("stroke") = "none";
        arrow.append_attribute("points") =
            fmt::format("{},{} {},{} {},{}", Num(tipx), Num(tipy), Num(bx - 4.5 * uy),
                        Num(by + 4.5 * ux), Num(bx + 4.5 * uy), Num(by - 4.5 * ux))
                .c_str();
      }
    }
  }

  if (!plot.notes.empty()) {
    pugi::xml_node notes = svg.append_child("g");
    notes.append_attribute("class") = "notes";
    notes.append_attribute("fill") = "#1f2630";
    for (const PlotNote& note : plot.notes) {
      const double x = px(note.x) + (note.left ? -5 : 5);
      const double y = py(note.y) + (note.below ? 13 : -6);
      AddText(notes, x, y, note.text, note.left ? "end" : "start");
    }
  }

  if (any_label) {
    pugi::xml_node lg = svg.append_child("g");
    lg.append_attribute("class") = "legend";
    lg.append_attribute("fill") = "#1f2630";
    const double base_y = height - legend_h + 8;
    for (size_t si = 0; si < plot.series.size(); ++si) {
      const PlotSeries& s = plot.series[si];
      const Tone& tone = kTones[(s.tone >= 0 ? s.tone : static_cast<int>(si)) % kToneCount];
      const double x = x0 + legend[si].x, y = base_y + legend[si].y;
      pugi::xml_node sw = AddLine(lg, x, y, x + 26, y);
      sw.append_attribute("stroke") = tone.color;
      sw.append_attribute("stroke-width") = "2";
      if (*tone.dash != '\0') sw.append_attribute("stroke-dasharray") = tone.dash;
      AddText(lg, x + 32, y + 3.8, s.label, nullptr);
    }
  }
}

std::string LinePlotSvg(const LinePlot& plot) {
  pugi::xml_document doc;
  AppendLinePlot(plot, doc);
  doc.first_child().prepend_attribute("xmlns") = "http://www.w3.org/2000/svg";
  std::ostringstream out;
  doc.save(out, "  ", pugi::format_default | pugi::format_no_declaration, pugi::encoding_utf8);
  return out.str();
}

}  // namespace heatdeck::report
