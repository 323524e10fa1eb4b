// plot.hpp — the one plot widget of the window, drawn on ImGui's draw list.
//
// A plot has an x and a y axis (AxisRange, which several plots may share: the time plots share
// their time axis), ticks with labels, a title that carries the unit, a legend, and any number
// of series: lines (solid or dashed) and/or markers. Long series are reduced to a min/max pair
// per pixel column before drawing, so a 60 s history at 100 Hz costs about as much as the plot
// is wide. The mouse: hovering shows a readout (a shared cursor across plots of one group);
// the wheel zooms x (Shift: y), dragging pans, a double click goes back to automatic ranges.
// The time plots and the complex plane of the modes both use it.
#pragma once

#include <cmath>
#include <cstddef>
#include <limits>
#include <span>
#include <string>
#include <vector>

#include <imgui.h>

namespace fpui {

struct AxisRange {
  double lo = 0.0, hi = 1.0;
  bool automatic = true;  // fitted to the data each frame until the user zooms or pans
};

// The hover position shared by a group of plots. The hovered plot writes `next`; every plot
// of the group draws the cursor at `x` (last frame's position), so the order of drawing does
// not matter.
struct Cursor {
  double x = std::numeric_limits<double>::quiet_NaN();
  double next = std::numeric_limits<double>::quiet_NaN();
  void new_frame() {
    x = next;
    next = std::numeric_limits<double>::quiet_NaN();
  }
  bool valid() const { return !std::isnan(x); }
};

enum class Marker { none, circle, square, diamond, cross };

struct Series {
  std::string label;            // legend text
  const double* x = nullptr;    // n values
  const double* y = nullptr;    // n values
  std::size_t n = 0;
  double x_factor = 1.0;        // shown x = x[i] * x_factor
  double y_factor = 1.0;        // shown y = y[i] * y_factor
  ImU32 color = IM_COL32(0, 0, 0, 255);
  float thickness = 1.5f;
  bool dashed = false;
  bool line = true;             // joined by a line
  Marker marker = Marker::none; // drawn at each point (markers are not decimated)
  float marker_size = 3.5f;
  bool marker_filled = true;
  bool sorted_x = true;         // x increasing: binary search, decimation, interpolated readout
  const double* tag = nullptr;  // optional value per point shown by the readout (e.g. the CG)
  const char* tag_name = "";
  int tag_decimals = 3;
  bool in_legend = true;
};

// A straight reference line (zero, an event time, the imaginary axis).
struct RefLine {
  bool vertical = true;
  double at = 0.0;              // in shown units
  ImU32 color = IM_COL32(0, 0, 0, 96);
  std::string label;            // drawn at the top (vertical) or the right end (horizontal)
  bool dashed = true;
};

// Where a plot was drawn (for tests that read the screenshot back).
struct PlotGeometry {
  ImVec2 p0, p1;                // plot area, window pixels (top-left, bottom-right)
  double x0 = 0, x1 = 1, y0 = 0, y1 = 1;  // shown ranges
  ImVec2 legend0{0, 0}, legend1{0, 0};    // the legend box (empty when none was drawn)
};

struct PlotSpec {
  const char* id = "plot";      // unique ImGui id inside the current window
  std::string title;            // e.g. "angle of attack [deg]"
  std::string x_unit;           // e.g. "s"; shown at the end of the x axis and in the readout
  std::string y_unit;           // shown in the readout
  ImVec2 size{0, 0};            // 0 = all the available width / height
  AxisRange* x = nullptr;       // required (may be shared)
  AxisRange* y = nullptr;       // required
  Cursor* cursor = nullptr;     // optional (may be shared)
  double x_follow_span = 0.0;   // > 0: automatic x shows the last `span` of the data from 0 on
  double y_min_span = 1e-9;     // smallest automatic y span (shown units)
  bool y_include_zero = false;  // automatic y always includes 0
  bool x_include_zero = false;  // automatic x always includes 0
  bool nearest_readout = false; // readout of the nearest point (scatter) instead of values at x
  int y_decimals_extra = 0;     // extra decimals in the readout
  PlotGeometry* geometry = nullptr;  // optional: receives where the plot area was drawn
};

// Colours and the small font used by every plot.
struct PlotTheme {
  ImU32 background = IM_COL32(0, 0, 0, 0);       // plot area fill (transparent: none drawn)
  ImU32 frame = IM_COL32(170, 166, 156, 255);
  ImU32 grid = IM_COL32(226, 223, 215, 255);
  ImU32 zero = IM_COL32(160, 156, 146, 255);
  ImU32 text = IM_COL32(50, 56, 62, 255);
  ImU32 title = IM_COL32(28, 35, 43, 255);
  ImU32 cursor = IM_COL32(60, 110, 108, 200);
  ImU32 legend_bg = IM_COL32(255, 255, 255, 215);
  ImFont* small_font = nullptr;  // tick labels, legend (null: current font)
};
void set_plot_theme(const PlotTheme& t);
const PlotTheme& plot_theme();

// Draw one plot at the cursor position of the current ImGui window.
void plot(const PlotSpec& spec, std::span<const Series> series, std::span<const RefLine> refs = {});

// Round tick positions covering [lo, hi] with at most about `max_ticks` ticks, the step a
// 1, 2 or 5 times a power of ten. Returns the ticks inside [lo, hi]; `step` receives the step.
std::vector<double> nice_ticks(double lo, double hi, int max_ticks, double* step = nullptr);

// Text of a tick value for a given step (enough decimals to tell neighbours apart).
std::string tick_text(double v, double step);

// Indices of a min/max reduction of samples [i0, i1) of a sorted series onto `columns`
// equal columns of x between x_lo and x_hi: the first and the last sample, and for each
// column its lowest and highest sample, in index order without repeats; a column whose samples
// span no more than y_tol is given by its lowest sample alone. Exposed for the tests.
std::vector<std::size_t> reduce_min_max(const double* x, const double* y, std::size_t i0, std::size_t i1,
                                        double x_lo, double x_hi, int columns, double y_tol = 0.0);

}  // namespace fpui
