// plot.cpp — see plot.hpp.
#include "ui/plot.hpp"
#include "util/ticks.hpp"

#include <algorithm>
#include <cstdint>
#include <cstdio>

namespace fpui {

namespace {

PlotTheme g_theme;

// Shown (display) coordinates to screen pixels and back, for one plot area.
struct Mapper {
  double x0 = 0, x1 = 1, y0 = 0, y1 = 1;
  ImVec2 p0, p1;  // top-left, bottom-right of the plot area
  float sx(double x) const { return p0.x + static_cast<float>((x - x0) / (x1 - x0) * (p1.x - p0.x)); }
  float sy(double y) const { return p1.y - static_cast<float>((y - y0) / (y1 - y0) * (p1.y - p0.y)); }
  double ix(float px) const { return x0 + (px - p0.x) / static_cast<double>(p1.x - p0.x) * (x1 - x0); }
  double iy(float py) const { return y0 + (p1.y - py) / static_cast<double>(p1.y - p0.y) * (y1 - y0); }
};

ImFont* small_font() { return g_theme.small_font ? g_theme.small_font : ImGui::GetFont(); }
float small_size() { return small_font()->FontSize; }

ImVec2 text_size(ImFont* f, const char* s) { return f->CalcTextSizeA(f->FontSize, 1e9f, 0.0f, s); }

// The visible index range [i0, i1) of a sorted series for shown x in [lo, hi], one sample of
// margin on each side so lines run to the edges.
void visible_range(const Series& s, double lo, double hi, std::size_t& i0, std::size_t& i1) {
  if (!s.sorted_x || s.n == 0) {
    i0 = 0;
    i1 = s.n;
    return;
  }
  const double f = s.x_factor;
  const double* b = s.x;
  const double* e = s.x + s.n;
  const std::size_t a = static_cast<std::size_t>(std::lower_bound(b, e, lo / f) - b);
  const std::size_t c = static_cast<std::size_t>(std::upper_bound(b, e, hi / f) - b);
  i0 = a > 0 ? a - 1 : 0;
  i1 = std::min(s.n, c + 1);
}

// Value of a sorted series at shown x, linearly interpolated; NaN outside its samples.
double value_at(const Series& s, double x_shown) {
  if (s.n == 0 || !s.sorted_x) return std::numeric_limits<double>::quiet_NaN();
  const double x = x_shown / s.x_factor;
  if (x < s.x[0] || x > s.x[s.n - 1]) return std::numeric_limits<double>::quiet_NaN();
  const std::size_t k = static_cast<std::size_t>(std::lower_bound(s.x, s.x + s.n, x) - s.x);
  if (k == 0) return s.y[0] * s.y_factor;
  const double xa = s.x[k - 1], xb = s.x[k];
  const double w = xb > xa ? (x - xa) / (xb - xa) : 1.0;
  return (s.y[k - 1] + w * (s.y[k] - s.y[k - 1])) * s.y_factor;
}

void dashed_polyline(ImDrawList* dl, const std::vector<ImVec2>& p, ImU32 col, float th) {
  const float on = 7.0f, off = 4.5f;
  float phase = 0.0f;  // distance into the current on+off period
  for (std::size_t i = 1; i < p.size(); ++i) {
    ImVec2 a = p[i - 1];
    const ImVec2 b = p[i];
    const float dx = b.x - a.x, dy = b.y - a.y;
    float len = std::sqrt(dx * dx + dy * dy);
    if (len <= 0.0f) continue;
    const float ux = dx / len, uy = dy / len;
    while (len > 0.0f) {
      const bool drawing = phase < on;
      const float left = drawing ? on - phase : on + off - phase;
      const float d = std::min(left, len);
      const ImVec2 c(a.x + ux * d, a.y + uy * d);
      if (drawing) dl->AddLine(a, c, col, th);
      a = c;
      len -= d;
      phase += d;
      if (phase >= on + off) phase = 0.0f;
    }
  }
}

void draw_marker(ImDrawList* dl, ImVec2 c, Marker m, float r, ImU32 col, bool filled) {
  switch (m) {
    case Marker::none:
      break;
    case Marker::circle:
      if (filled) dl->AddCircleFilled(c, r, col, 12);
      else dl->AddCircle(c, r, col, 12, 1.5f);
      break;
    case Marker::square:
      if (filled) dl->AddRectFilled(ImVec2(c.x - r, c.y - r), ImVec2(c.x + r, c.y + r), col);
      else dl->AddRect(ImVec2(c.x - r, c.y - r), ImVec2(c.x + r, c.y + r), col, 0.0f, 0, 1.5f);
      break;
    case Marker::diamond: {
      const ImVec2 a(c.x, c.y - r * 1.3f), b(c.x + r * 1.3f, c.y), d(c.x, c.y + r * 1.3f), e(c.x - r * 1.3f, c.y);
      if (filled) dl->AddQuadFilled(a, b, d, e, col);
      else dl->AddQuad(a, b, d, e, col, 1.5f);
      break;
    }
    case Marker::cross:
      dl->AddLine(ImVec2(c.x - r, c.y - r), ImVec2(c.x + r, c.y + r), col, 1.5f);
      dl->AddLine(ImVec2(c.x - r, c.y + r), ImVec2(c.x + r, c.y - r), col, 1.5f);
      break;
  }
}

void legend_sample(ImDrawList* dl, ImVec2 a, float w, const Series& s) {
  const ImVec2 b(a.x + w, a.y);
  if (s.line) {
    if (s.dashed) {
      dl->AddLine(a, ImVec2(a.x + w * 0.4f, a.y), s.color, s.thickness);
      dl->AddLine(ImVec2(a.x + w * 0.6f, a.y), b, s.color, s.thickness);
    } else {
      dl->AddLine(a, b, s.color, s.thickness);
    }
  }
  if (s.marker != Marker::none)
    draw_marker(dl, ImVec2(a.x + w * 0.5f, a.y), s.marker, s.marker_size, s.color, s.marker_filled);
}

// Data extent of the series: x over all points, y over the points with x in [xlo, xhi].
using Extent = fp::Extent;  // util/ticks.hpp

void fit_axis(AxisRange& ax, Extent e, double min_span, bool include_zero, int max_ticks, bool snap) {
  if (e.empty()) {
    e.lo = 0.0;
    e.hi = 1.0;
  }
  if (include_zero) {
    e.lo = std::min(e.lo, 0.0);
    e.hi = std::max(e.hi, 0.0);
  }
  double span = e.hi - e.lo;
  const double mid = 0.5 * (e.hi + e.lo);
  if (span < min_span) {
    e.lo = mid - 0.5 * min_span;
    e.hi = mid + 0.5 * min_span;
    span = min_span;
  }
  e.lo -= 0.06 * span;
  e.hi += 0.06 * span;
  if (snap) {
    double step = 1.0;
    nice_ticks(e.lo, e.hi, max_ticks, &step);
    e.lo = std::floor(e.lo / step + 1e-9) * step;
    e.hi = std::ceil(e.hi / step - 1e-9) * step;
  }
  ax.lo = e.lo;
  ax.hi = e.hi;
}

void zoom(AxisRange& ax, double at, double factor) {
  ax.lo = at + (ax.lo - at) * factor;
  ax.hi = at + (ax.hi - at) * factor;
  ax.automatic = false;
}

std::string number_text(double v, int decimals) {
  char buf[64];
  if (std::abs(v) >= 1e6 || (std::abs(v) < 1e-4 && v != 0.0)) std::snprintf(buf, sizeof buf, "%.4g", v);
  else std::snprintf(buf, sizeof buf, "%.*f", std::max(0, decimals), v);
  return buf;
}

}  // namespace

void set_plot_theme(const PlotTheme& t) { g_theme = t; }
const PlotTheme& plot_theme() { return g_theme; }

std::vector<double> nice_ticks(double lo, double hi, int max_ticks, double* step_out) {
  std::vector<double> ticks;
  if (!(hi > lo) || !std::isfinite(lo) || !std::isfinite(hi)) {
    if (step_out) *step_out = 1.0;
    return ticks;
  }
  const double step = fp::tick_step(hi - lo, std::max(max_ticks, 2), fp::TickFit::at_most);  // util/ticks.hpp
  if (step_out) *step_out = step;
  return fp::tick_values(lo, hi, step);
}

std::string tick_text(double v, double step) {
  const int decimals = step >= 1.0 ? 0 : static_cast<int>(std::ceil(-std::log10(step) - 1e-9));
  return number_text(v, decimals);
}

std::vector<std::size_t> reduce_min_max(const double* x, const double* y, std::size_t i0, std::size_t i1,
                                        double x_lo, double x_hi, int columns, double y_tol) {
  std::vector<std::size_t> out;
  if (i1 <= i0 || columns <= 0 || !(x_hi > x_lo)) return out;
  out.reserve(static_cast<std::size_t>(columns) * 2 + 2);
  const double per = columns / (x_hi - x_lo);
  auto push = [&](std::size_t k) {
    if (out.empty() || out.back() < k) out.push_back(k);
  };
  push(i0);
  std::size_t i = i0;
  while (i < i1) {
    // the column of sample i, and the x at which the next column begins
    const double col = std::floor((x[i] - x_lo) * per);
    const double next = x_lo + (col + 1.0) / per;
    std::size_t lo = i, hi = i;
    for (++i; i < i1 && x[i] < next; ++i) {
      if (y[i] < y[lo]) lo = i;
      else if (y[i] > y[hi]) hi = i;
    }
    if (y[hi] - y[lo] <= y_tol) {
      push(lo);  // flat within the tolerance: one point stands for the column
    } else {
      push(std::min(lo, hi));
      push(std::max(lo, hi));
    }
  }
  push(i1 - 1);
  return out;
}

namespace {

// ---- the parts of plot(), in the order it calls them

// Automatic x: the last `x_follow_span` of the data from 0 on, or all the data.
void fit_x(AxisRange& X, const PlotSpec& spec, std::span<const Series> series) {
  if (spec.x_follow_span > 0.0) {
    double end = 0.0;
    for (const auto& s : series)
      if (s.n > 0 && s.sorted_x) end = std::max(end, s.x[s.n - 1] * s.x_factor);
    X.lo = std::max(0.0, end - spec.x_follow_span);
    X.hi = std::max(end, spec.x_follow_span);
  } else {
    Extent ex;
    for (const auto& s : series)
      for (std::size_t i = 0; i < s.n; ++i) ex.add(s.x[i] * s.x_factor);
    fit_axis(X, ex, 1e-9, spec.x_include_zero, 8, false);
  }
}

// Automatic y: the points with x in the shown x range, snapped to round ticks.
void fit_y(AxisRange& Y, const AxisRange& X, const PlotSpec& spec, std::span<const Series> series, int max_ticks) {
  Extent ey;
  for (const auto& s : series) {
    std::size_t i0, i1;
    visible_range(s, X.lo, X.hi, i0, i1);
    for (std::size_t i = i0; i < i1; ++i) {
      const double xs = s.x[i] * s.x_factor;
      if (!s.sorted_x && (xs < X.lo || xs > X.hi)) continue;
      ey.add(s.y[i] * s.y_factor);
    }
  }
  fit_axis(Y, ey, spec.y_min_span, spec.y_include_zero, max_ticks, true);
}

// The y ticks and their labels (the widest label decides the left margin).
struct YTicks {
  std::vector<double> at;
  std::vector<std::string> labels;
  double step = 1.0;
  float width = 0.0f;
};

YTicks y_ticks(double lo, double hi, int max_ticks) {
  YTicks t;
  t.at = nice_ticks(lo, hi, max_ticks, &t.step);
  for (double v : t.at) {
    t.labels.push_back(tick_text(v, t.step));
    t.width = std::max(t.width, text_size(small_font(), t.labels.back().c_str()).x);
  }
  return t;
}

// The mouse on the plot (mapped as it was drawn last): the wheel zooms x (Shift: y), a drag
// pans, a double click goes back to automatic ranges; the hover sets the shared cursor.
// Returns whether the mouse is in the plot area.
bool handle_mouse(const Mapper& m, const PlotSpec& spec, bool hovered, bool active) {
  const ImGuiIO& io = ImGui::GetIO();
  AxisRange& X = *spec.x;
  AxisRange& Y = *spec.y;
  const float W = m.p1.x - m.p0.x, H = m.p1.y - m.p0.y;
  const bool in_area = hovered && io.MousePos.x >= m.p0.x && io.MousePos.x <= m.p1.x &&
                       io.MousePos.y >= m.p0.y && io.MousePos.y <= m.p1.y;
  if (hovered && io.MouseWheel != 0.0f) {
    const double f = std::pow(0.85, static_cast<double>(io.MouseWheel));
    if (io.KeyShift) zoom(Y, m.iy(io.MousePos.y), f);
    else zoom(X, m.ix(io.MousePos.x), f);
  }
  if (active && ImGui::IsMouseDragging(ImGuiMouseButton_Left, 1.0f)) {
    const double dx = io.MouseDelta.x / static_cast<double>(W) * (X.hi - X.lo);
    const double dy = io.MouseDelta.y / static_cast<double>(H) * (Y.hi - Y.lo);
    if (dx != 0.0) {
      X.lo -= dx;
      X.hi -= dx;
      X.automatic = false;
    }
    if (dy != 0.0) {
      Y.lo += dy;
      Y.hi += dy;
      Y.automatic = false;
    }
  }
  if (hovered && ImGui::IsMouseDoubleClicked(ImGuiMouseButton_Left)) {
    X.automatic = true;
    Y.automatic = true;
  }
  if (in_area && spec.cursor) spec.cursor->next = m.ix(io.MousePos.x);
  return in_area;
}

// The title (clipped to the plot's width), the grid, and the tick labels with the x unit.
void draw_axes(ImDrawList* dl, const PlotSpec& spec, const Mapper& m, const YTicks& yt, ImVec2 f0, ImVec2 f1,
               float title_h) {
  ImFont* sf = small_font();
  const float fs = small_size();
  if ((g_theme.background >> IM_COL32_A_SHIFT) & 0xFF) dl->AddRectFilled(m.p0, m.p1, g_theme.background);
  {
    const ImVec4 clip(f0.x, f0.y, f1.x - 2.0f, f0.y + title_h);  // a long title stops at the plot's edge
    dl->AddText(ImGui::GetFont(), ImGui::GetFontSize(), ImVec2(f0.x + 2.0f, f0.y), g_theme.title, spec.title.c_str(),
                nullptr, 0.0f, &clip);
  }
  for (std::size_t k = 0; k < yt.at.size(); ++k) {
    const float y = m.sy(yt.at[k]);
    dl->AddLine(ImVec2(m.p0.x, y), ImVec2(m.p1.x, y), yt.at[k] == 0.0 ? g_theme.zero : g_theme.grid, 1.0f);
    const ImVec2 ts = text_size(sf, yt.labels[k].c_str());
    dl->AddText(sf, fs, ImVec2(m.p0.x - 5.0f - ts.x, y - ts.y * 0.5f), g_theme.text, yt.labels[k].c_str());
  }
  double xstep = 1.0;
  const int x_ticks_max = std::max(2, static_cast<int>((m.p1.x - m.p0.x) / (fs * 4.5f)));
  const std::vector<double> xt = nice_ticks(m.x0, m.x1, x_ticks_max, &xstep);
  const std::string xunit = spec.x_unit.empty() ? std::string() : "[" + spec.x_unit + "]";
  const float xunit_w = text_size(sf, xunit.c_str()).x;
  const float xunit_x = m.p1.x - xunit_w;
  if (!xunit.empty()) dl->AddText(sf, fs, ImVec2(xunit_x, m.p1.y + 3.0f), g_theme.text, xunit.c_str());
  for (double v : xt) {
    const float x = m.sx(v);
    dl->AddLine(ImVec2(x, m.p0.y), ImVec2(x, m.p1.y), v == 0.0 ? g_theme.zero : g_theme.grid, 1.0f);
    const std::string s = tick_text(v, xstep);
    const ImVec2 ts = text_size(sf, s.c_str());
    const float tx = std::clamp(x - ts.x * 0.5f, m.p0.x - 4.0f, m.p1.x - ts.x);
    if (!xunit.empty() && tx + ts.x > xunit_x - 6.0f) continue;  // the unit keeps its place
    dl->AddText(sf, fs, ImVec2(tx, m.p1.y + 3.0f), g_theme.text, s.c_str());
  }
}

// Reference lines with their labels (inside the clip of the plot area).
void draw_ref_lines(ImDrawList* dl, const Mapper& m, std::span<const RefLine> refs) {
  ImFont* sf = small_font();
  const float fs = small_size();
  std::vector<float> label_row_end(3, -1e9f);  // vertical lines' labels go down a row when they would touch
  for (const auto& r : refs) {
    if (r.vertical) {
      const float x = m.sx(r.at);
      std::vector<ImVec2> pts{ImVec2(x, m.p0.y), ImVec2(x, m.p1.y)};
      if (r.dashed) dashed_polyline(dl, pts, r.color, 1.0f);
      else dl->AddLine(pts[0], pts[1], r.color, 1.0f);
      if (!r.label.empty()) {
        const float tw = text_size(sf, r.label.c_str()).x;
        const float tx = x + 3.0f + tw > m.p1.x ? x - 3.0f - tw : x + 3.0f;  // keep it inside
        std::size_t row = 0;
        while (row + 1 < label_row_end.size() && label_row_end[row] > tx - 2.0f) ++row;
        label_row_end[row] = tx + tw;
        dl->AddText(sf, fs, ImVec2(tx, m.p0.y + 1.0f + static_cast<float>(row) * fs), r.color, r.label.c_str());
      }
    } else {
      const float y = m.sy(r.at);
      std::vector<ImVec2> pts{ImVec2(m.p0.x, y), ImVec2(m.p1.x, y)};
      if (r.dashed) dashed_polyline(dl, pts, r.color, 1.0f);
      else dl->AddLine(pts[0], pts[1], r.color, 1.0f);
      if (!r.label.empty()) {
        const ImVec2 ts = text_size(sf, r.label.c_str());
        dl->AddText(sf, fs, ImVec2(m.p1.x - ts.x - 3.0f, y - ts.y - 1.0f), r.color, r.label.c_str());
      }
    }
  }
}

// The screen points of a series' line: a min/max reduction when it has many samples.
void line_points(const Mapper& m, const Series& s, std::size_t i0, std::size_t i1, std::vector<ImVec2>& pts) {
  pts.clear();
  const float W = m.p1.x - m.p0.x, H = m.p1.y - m.p0.y;
  const int columns = std::max(8, static_cast<int>(W / 3.0f));  // a column every 3 px
  if (s.sorted_x && i1 - i0 > static_cast<std::size_t>(2 * columns) && s.x_factor > 0.0) {
    // a column whose samples span less than a pixel is drawn with one point
    const double y_tol = std::abs((m.y1 - m.y0) / static_cast<double>(H) / s.y_factor);
    const auto idx = reduce_min_max(s.x, s.y, i0, i1, m.x0 / s.x_factor, m.x1 / s.x_factor, columns, y_tol);
    pts.reserve(idx.size());
    for (std::size_t k : idx) pts.emplace_back(m.sx(s.x[k] * s.x_factor), m.sy(s.y[k] * s.y_factor));
  } else {
    pts.reserve(i1 - i0);
    for (std::size_t k = i0; k < i1; ++k) {
      const double xv = s.x[k] * s.x_factor, yv = s.y[k] * s.y_factor;
      if (!std::isfinite(xv) || !std::isfinite(yv)) continue;
      pts.emplace_back(m.sx(xv), m.sy(yv));
    }
  }
}

// The series (lines and markers). Returns a sample of what was drawn, to keep the legend off
// the data.
std::vector<ImVec2> draw_series(ImDrawList* dl, const Mapper& m, std::span<const Series> series) {
  std::vector<ImVec2> pts;
  std::vector<ImVec2> drawn;
  for (const auto& s : series) {
    if (s.n == 0) continue;
    std::size_t i0, i1;
    visible_range(s, m.x0, m.x1, i0, i1);
    if (i1 <= i0) continue;
    if (s.line) {
      line_points(m, s, i0, i1, pts);
      drawn.insert(drawn.end(), pts.begin(), pts.end());
      if (pts.size() >= 2) {
        if (s.dashed) dashed_polyline(dl, pts, s.color, s.thickness);
        else dl->AddPolyline(pts.data(), static_cast<int>(pts.size()), s.color, 0, s.thickness);
      }
    }
    if (s.marker != Marker::none) {
      for (std::size_t k = i0; k < i1; ++k) {
        const double xv = s.x[k] * s.x_factor, yv = s.y[k] * s.y_factor;
        if (!std::isfinite(xv) || !std::isfinite(yv)) continue;
        const ImVec2 c(m.sx(xv), m.sy(yv));
        draw_marker(dl, c, s.marker, s.marker_size, s.color, s.marker_filled);
        drawn.push_back(c);
      }
    }
  }
  return drawn;
}

// The shared cursor: a vertical line and the values where it crosses each series. Returns the
// values (NaN where a series has none, all NaN when the cursor is not in this plot).
std::vector<double> draw_cursor(ImDrawList* dl, const Mapper& m, const PlotSpec& spec, std::span<const Series> series) {
  std::vector<double> values(series.size(), std::numeric_limits<double>::quiet_NaN());
  const bool cursor_here = spec.cursor && spec.cursor->valid() && !spec.nearest_readout &&
                           spec.cursor->x >= m.x0 && spec.cursor->x <= m.x1;
  if (!cursor_here) return values;
  const float cx = m.sx(spec.cursor->x);
  dl->AddLine(ImVec2(cx, m.p0.y), ImVec2(cx, m.p1.y), g_theme.cursor, 1.0f);
  for (std::size_t k = 0; k < series.size(); ++k) {
    values[k] = value_at(series[k], spec.cursor->x);
    if (std::isfinite(values[k])) {
      const ImVec2 c(cx, m.sy(values[k]));
      dl->AddCircleFilled(c, 3.0f, series[k].color, 10);
      dl->AddCircle(c, 3.5f, IM_COL32(255, 255, 255, 220), 10, 1.0f);
    }
  }
  return values;
}

// The legend in the corner that hides the fewest drawn points (top right first on a tie), with
// the values at the cursor when there are some.
void draw_legend(ImDrawList* dl, const Mapper& m, const PlotSpec& spec, std::span<const Series> series,
                 const std::vector<double>& values, double ystep, const std::vector<ImVec2>& drawn) {
  ImFont* sf = small_font();
  const float fs = small_size();
  const float sample_w = 22.0f, pad = 4.0f, row = fs + 2.0f;
  float label_w = 0.0f, value_w = 0.0f;
  int rows = 0;
  std::vector<std::string> vtext(series.size());
  const int dec = std::max(0, static_cast<int>(std::ceil(-std::log10(ystep) - 1e-9)) + 1 + spec.y_decimals_extra);
  for (std::size_t k = 0; k < series.size(); ++k) {
    if (!series[k].in_legend) continue;
    ++rows;
    label_w = std::max(label_w, text_size(sf, series[k].label.c_str()).x);
    if (std::isfinite(values[k])) {
      vtext[k] = number_text(values[k], dec);
      value_w = std::max(value_w, text_size(sf, vtext[k].c_str()).x);
    }
  }
  if (rows == 0) return;
  const float w = pad * 3 + sample_w + label_w + (value_w > 0 ? value_w + pad * 2 : 0.0f);
  const float lh = rows * row + pad;
  const ImVec2 corners[4] = {ImVec2(m.p1.x - w - 4.0f, m.p0.y + 4.0f), ImVec2(m.p0.x + 4.0f, m.p0.y + 4.0f),
                             ImVec2(m.p1.x - w - 4.0f, m.p1.y - lh - 4.0f), ImVec2(m.p0.x + 4.0f, m.p1.y - lh - 4.0f)};
  int best = 0;
  std::size_t best_count = SIZE_MAX;
  for (int k = 0; k < 4; ++k) {
    const ImVec2 c0(corners[k].x - 3.0f, corners[k].y - 3.0f), c1(corners[k].x + w + 3.0f, corners[k].y + lh + 3.0f);
    std::size_t count = 0;
    for (const ImVec2& q : drawn) count += q.x >= c0.x && q.x <= c1.x && q.y >= c0.y && q.y <= c1.y;
    if (count < best_count) {
      best_count = count;
      best = k;
    }
  }
  const ImVec2 a = corners[best];
  const ImVec2 b(a.x + w, a.y + lh);
  if (!(a.x > m.p0.x + 20.0f && b.y < m.p1.y)) return;
  if (spec.geometry) {
    spec.geometry->legend0 = a;
    spec.geometry->legend1 = b;
  }
  dl->AddRectFilled(a, b, g_theme.legend_bg);
  float y = a.y + pad * 0.5f;
  for (std::size_t k = 0; k < series.size(); ++k) {
    if (!series[k].in_legend) continue;
    legend_sample(dl, ImVec2(a.x + pad, y + row * 0.5f), sample_w, series[k]);
    dl->AddText(sf, fs, ImVec2(a.x + pad * 2 + sample_w, y), g_theme.text, series[k].label.c_str());
    if (!vtext[k].empty()) {
      const float vw = text_size(sf, vtext[k].c_str()).x;
      dl->AddText(sf, fs, ImVec2(b.x - pad - vw, y), g_theme.title, vtext[k].c_str());
    }
    y += row;
  }
}

// The readout of a scatter plot: the point of any series nearest the mouse (within 14 px,
// ringed), else the mouse's own coordinates.
std::string nearest_point_text(ImDrawList* dl, const Mapper& m, const PlotSpec& spec, std::span<const Series> series) {
  const ImGuiIO& io = ImGui::GetIO();
  char buf[160];
  float best = 14.0f * 14.0f;
  const Series* bs = nullptr;
  std::size_t bi = 0;
  for (const auto& s : series)
    for (std::size_t i = 0; i < s.n; ++i) {
      const float dx = m.sx(s.x[i] * s.x_factor) - io.MousePos.x;
      const float dy = m.sy(s.y[i] * s.y_factor) - io.MousePos.y;
      if (dx * dx + dy * dy < best) {
        best = dx * dx + dy * dy;
        bs = &s;
        bi = i;
      }
    }
  if (!bs) {
    std::snprintf(buf, sizeof buf, "x %s %s\ny %s %s", number_text(m.ix(io.MousePos.x), 3).c_str(),
                  spec.x_unit.c_str(), number_text(m.iy(io.MousePos.y), 3).c_str(), spec.y_unit.c_str());
    return buf;
  }
  std::snprintf(buf, sizeof buf, "%s\nx %s %s\ny %s %s", bs->label.c_str(),
                number_text(bs->x[bi] * bs->x_factor, 3).c_str(), spec.x_unit.c_str(),
                number_text(bs->y[bi] * bs->y_factor, 3).c_str(), spec.y_unit.c_str());
  std::string text = buf;
  if (bs->tag) {
    std::snprintf(buf, sizeof buf, "\n%s %s", bs->tag_name, number_text(bs->tag[bi], bs->tag_decimals).c_str());
    text += buf;
  }
  const ImVec2 c(m.sx(bs->x[bi] * bs->x_factor), m.sy(bs->y[bi] * bs->y_factor));
  dl->AddCircle(c, 6.0f, g_theme.cursor, 14, 1.5f);
  return text;
}

// The readout box beside the mouse in the hovered plot: the time (the legend gives the values)
// or, for a scatter plot, the nearest point.
void draw_readout(ImDrawList* dl, const Mapper& m, const PlotSpec& spec, std::span<const Series> series) {
  const ImGuiIO& io = ImGui::GetIO();
  ImFont* sf = small_font();
  const float fs = small_size();
  std::string text;
  if (spec.nearest_readout) {
    text = nearest_point_text(dl, m, spec, series);
  } else {
    char buf[160];
    std::snprintf(buf, sizeof buf, "%s %s", number_text(m.ix(io.MousePos.x), 2).c_str(), spec.x_unit.c_str());
    text = buf;
  }
  const ImVec2 ts = text_size(sf, text.c_str());
  ImVec2 a(io.MousePos.x + 10.0f, io.MousePos.y - ts.y - 8.0f);
  if (a.x + ts.x + 6.0f > m.p1.x) a.x = io.MousePos.x - ts.x - 16.0f;
  if (a.y < m.p0.y) a.y = io.MousePos.y + 12.0f;
  dl->AddRectFilled(a, ImVec2(a.x + ts.x + 6.0f, a.y + ts.y + 4.0f), IM_COL32(40, 46, 52, 225), 2.0f);
  dl->AddText(sf, fs, ImVec2(a.x + 3.0f, a.y + 2.0f), IM_COL32(245, 245, 240, 255), text.c_str());
}

}  // namespace

void plot(const PlotSpec& spec, std::span<const Series> series, std::span<const RefLine> refs) {
  IM_ASSERT(spec.x && spec.y && "a plot needs its two axes");
  ImDrawList* dl = ImGui::GetWindowDrawList();
  const float fs = small_size();

  ImVec2 size = spec.size;
  const ImVec2 avail = ImGui::GetContentRegionAvail();
  if (size.x <= 0) size.x = avail.x;
  if (size.y <= 0) size.y = avail.y;
  size.x = std::max(size.x, 80.0f);
  size.y = std::max(size.y, 60.0f);
  const ImVec2 f0 = ImGui::GetCursorScreenPos();
  const ImVec2 f1(f0.x + size.x, f0.y + size.y);

  ImGui::PushID(spec.id);
  ImGui::InvisibleButton("##area", size);
  const bool hovered = ImGui::IsItemHovered();
  const bool active = ImGui::IsItemActive();
  ImGui::PopID();

  // layout: title row, y labels on the left, x labels below
  const float title_h = ImGui::GetFontSize() + 3.0f;
  const float xlab_h = fs + 5.0f;
  AxisRange& X = *spec.x;
  AxisRange& Y = *spec.y;

  // automatic ranges
  if (X.automatic) fit_x(X, spec, series);
  if (!(X.hi > X.lo)) X.hi = X.lo + 1.0;
  const float plot_h_guess = size.y - title_h - xlab_h;
  const int y_ticks_max = std::max(2, static_cast<int>(plot_h_guess / (fs * 2.2f)));
  if (Y.automatic) fit_y(Y, X, spec, series, y_ticks_max);
  if (!(Y.hi > Y.lo)) Y.hi = Y.lo + 1.0;

  // y tick labels decide the left margin
  const YTicks yt = y_ticks(Y.lo, Y.hi, y_ticks_max);
  Mapper m;
  m.p0 = ImVec2(f0.x + yt.width + 8.0f, f0.y + title_h);
  m.p1 = ImVec2(f1.x - 4.0f, f1.y - xlab_h);
  if (m.p1.x - m.p0.x < 20.0f || m.p1.y - m.p0.y < 10.0f) return;  // too small to draw
  m.x0 = X.lo;
  m.x1 = X.hi;
  m.y0 = Y.lo;
  m.y1 = Y.hi;

  // the mouse may zoom or pan: the plot is drawn with the ranges it leaves
  const bool in_area = handle_mouse(m, spec, hovered, active);
  m.x0 = X.lo;
  m.x1 = X.hi;
  m.y0 = Y.lo;
  m.y1 = Y.hi;
  if (spec.geometry) *spec.geometry = PlotGeometry{m.p0, m.p1, m.x0, m.x1, m.y0, m.y1, {0, 0}, {0, 0}};

  draw_axes(dl, spec, m, yt, f0, f1, title_h);
  dl->PushClipRect(m.p0, m.p1, true);  // reference lines and series, clipped to the plot area
  draw_ref_lines(dl, m, refs);
  const std::vector<ImVec2> drawn = draw_series(dl, m, series);
  const std::vector<double> values = draw_cursor(dl, m, spec, series);
  dl->PopClipRect();
  dl->AddRect(m.p0, m.p1, g_theme.frame, 0.0f, 0, 1.0f);
  draw_legend(dl, m, spec, series, values, yt.step, drawn);
  if (in_area) draw_readout(dl, m, spec, series);
}

}  // namespace fpui
