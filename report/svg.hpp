// svg.hpp — small plots as inline SVG for the report: axes with "nice" ticks, units in the
// axis labels, legends, reference lines, shaded spans and bands, line and marker series, and a
// row chart (intervals on one axis, e.g. margins as bars on the MAC).
//
// The output is plain SVG 1.1 text with no script, no external reference and no font file: the
// report embeds it as it is. Series styles are chosen so that they stay distinct when printed
// in grey: the first is dark and solid, the second light and dashed, the third mid-grey and
// dotted; markers differ in shape and fill as well. The window draws its own plots (ui/); only
// the data are shared.
//
// Everything is deterministic: same plot, same text (numbers are printed with fixed decimals).
#pragma once

#include <limits>
#include <string>
#include <utility>
#include <vector>

namespace fp::svg {

inline constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

enum class Style {
  first,      // dark, solid (e.g. stick held)
  second,     // light, dashed (e.g. stick free)
  third,      // mid-grey, dotted (e.g. a closed-form line)
  reference,  // thin grey dash-dot (criteria, boundaries)
  faint,      // thin, very light solid (many samples drawn under the others)
};

enum class Marker { none, dot, ring, square, cross, diamond };

// A series: NaN in x or y breaks the line (a gap).
struct Series {
  std::string label;                 // legend text ("" = not in the legend)
  std::vector<double> x, y;
  Style style = Style::first;
  bool line = true;                  // draw the polyline
  Marker marker = Marker::none;      // and/or a marker at each point
};

// A shaded band between two curves on the same x (e.g. the min/max of sampled responses).
struct Band {
  std::string label;
  std::vector<double> x, lo, hi;
};

// A straight reference line across the plot area, labelled at its end.
struct RefLine {
  bool vertical = false;
  double at = 0;
  std::string label;
  Style style = Style::reference;
};

// A shaded span of x (of_y: a span of y), labelled at its top. Spans do not widen the
// automatic axis ranges: they are clipped to them.
struct Span {
  double from = 0, to = 0;
  std::string label;
  bool of_y = false;
  bool dark = false;                 // a slightly darker fill (e.g. an "unstable" region)
};

// A short text at a data point, with a small tick mark.
struct Note {
  double x = 0, y = 0;
  std::string text;
  bool left = false;                 // text to the left of the point
  bool dot = true;                   // mark the point itself
};

struct Axis {
  std::string label;                 // "angle of attack"
  std::string unit;                  // "deg" ("" for none; "-" prints as dimensionless)
  double min = kNaN, max = kNaN;     // NaN: from the data (rounded out to ticks); the automatic y
                                     // range uses only the points inside the x range
  bool include_zero = false;         // widen the automatic range to include 0
  double pct = 1.0;                  // tick labels are value * pct (e.g. 100 for % MAC)
};

struct Plot {
  std::string id;                    // unique within the page (clip-path ids are made from it)
  double width = 680, height = 280;  // [px] of the whole figure
  std::string title;
  Axis x, y;
  std::vector<Series> series;
  std::vector<Band> bands;
  std::vector<RefLine> refs;
  std::vector<Span> spans;
  std::vector<Note> notes;
  std::string description;           // for the <title> element (screen readers)
};

std::string render(const Plot& p);

// A chart of rows on one axis (the x axis): each row carries intervals drawn as bars and marks
// drawn as ticks with a label, e.g. one row a CG with its bars to the neutral points.
struct RowBar {
  double from = 0, to = 0;
  Style style = Style::first;
  std::string label;                 // printed beside the bar ("" = none)
};
struct RowMark {
  double at = 0;
  std::string label;
};
struct Row {
  std::string label;
  std::vector<RowBar> bars;
  std::vector<RowMark> marks;
};
struct RowChart {
  std::string id;
  double width = 680;
  std::string title;
  Axis x;
  std::vector<Row> rows;
  std::vector<RefLine> refs;         // vertical lines through all rows
  std::vector<Span> spans;           // spans of x through all rows
  std::vector<std::pair<Style, std::string>> legend;
  std::string description;
};

std::string render(const RowChart& c);

// Ticks at 1, 2 or 5 times a power of ten, about `target` of them, covering [lo, hi].
struct Ticks {
  std::vector<double> values;
  double step = 1;
  int decimals = 0;                  // decimals that print the step exactly
};
Ticks nice_ticks(double lo, double hi, int target = 6);

// A number with `decimals` decimals and a typographic minus sign (U+2212); "-0" prints as "0".
std::string number(double v, int decimals);

// The SVG is meant to sit inline in an HTML page (the HTML parser gives it the SVG namespace),
// so it carries no xmlns attribute and no reference to anything outside itself.

// Escape &, <, >, " for XML text and attributes.
std::string escape(const std::string& s);

}  // namespace fp::svg
