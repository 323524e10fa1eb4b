// svg.cpp — small SVG plots for the report (see svg.hpp).
#include "report/svg.hpp"
#include "util/ticks.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace fp::svg {

namespace {

constexpr const char* kFont = "font-family=\"sans-serif\"";

struct Look {
  const char* stroke;
  double width;
  const char* dash;   // "" = solid
};

// Distinct in grey-scale print: dark solid, light dashed, mid dotted, thin dash-dot.
Look look(Style s) {
  switch (s) {
    case Style::first: return {"#1c2b4a", 2.0, ""};
    case Style::second: return {"#e08a2e", 2.2, "7 4"};
    case Style::third: return {"#6f6f6f", 1.6, "2 3"};
    case Style::reference: return {"#4a4a4a", 1.0, "6 3 1.5 3"};
    case Style::faint: return {"#c4c4c4", 0.9, ""};
  }
  return {"#000", 1.0, ""};
}

std::string f1(double v) {
  char b[32];
  std::snprintf(b, sizeof b, "%.1f", v);
  return std::string(b) == "-0.0" ? "0.0" : b;
}

std::string stroke_attrs(Style s) {
  const Look l = look(s);
  std::string a = "stroke=\"" + std::string(l.stroke) + "\" stroke-width=\"" + f1(l.width) + "\" fill=\"none\"";
  if (*l.dash) a += " stroke-dasharray=\"" + std::string(l.dash) + "\"";
  return a;
}

std::string text(double x, double y, const std::string& s, const char* anchor = "start", int size = 11,
                 const char* extra = "") {
  return "<text x=\"" + f1(x) + "\" y=\"" + f1(y) + "\" " + kFont + " font-size=\"" + std::to_string(size) +
         "\" text-anchor=\"" + anchor + "\"" + extra + ">" + escape(s) + "</text>\n";
}

// Text with a white halo so that it stays legible over lines.
std::string halo_text(double x, double y, const std::string& s, const char* anchor, int size = 10) {
  return text(x, y, s, anchor, size,
              " fill=\"#222\" stroke=\"#fff\" stroke-width=\"3\" stroke-linejoin=\"round\" paint-order=\"stroke\"");
}

std::string marker_svg(Marker m, Style s, double x, double y) {
  const Look l = look(s);
  const std::string c = l.stroke;
  const std::string X = f1(x), Y = f1(y);
  switch (m) {
    case Marker::none: return "";
    case Marker::dot:
      return "<circle cx=\"" + X + "\" cy=\"" + Y + "\" r=\"3.6\" fill=\"" + c + "\"/>\n";
    case Marker::ring:
      return "<circle cx=\"" + X + "\" cy=\"" + Y + "\" r=\"4\" fill=\"#fff\" stroke=\"" + c +
             "\" stroke-width=\"1.8\"/>\n";
    case Marker::square:
      return "<rect x=\"" + f1(x - 4) + "\" y=\"" + f1(y - 4) + "\" width=\"8\" height=\"8\" fill=\"#fff\" stroke=\"" + c +
             "\" stroke-width=\"1.8\"/>\n";
    case Marker::cross:
      return "<path d=\"M" + f1(x - 4) + " " + f1(y - 4) + "L" + f1(x + 4) + " " + f1(y + 4) + "M" + f1(x - 4) + " " +
             f1(y + 4) + "L" + f1(x + 4) + " " + f1(y - 4) + "\" stroke=\"" + c + "\" stroke-width=\"1.8\"/>\n";
    case Marker::diamond:
      return "<path d=\"M" + X + " " + f1(y - 5) + "L" + f1(x + 5) + " " + Y + "L" + X + " " + f1(y + 5) + "L" +
             f1(x - 5) + " " + Y + "Z\" fill=\"" + c + "\"/>\n";
  }
  return "";
}

std::string axis_title(const Axis& a) {
  if (a.unit.empty()) return a.label;
  return a.label + " [" + a.unit + "]";
}

using Range = Extent;  // util/ticks.hpp

// The axis range: given, or the data's rounded out to ticks.
Ticks resolve(const Axis& a, Range r, double& lo, double& hi, int target) {
  if (a.include_zero) r.add(0.0);
  if (r.empty()) r = Range{0.0, 1.0};
  lo = std::isfinite(a.min) ? a.min : r.lo;
  hi = std::isfinite(a.max) ? a.max : r.hi;
  if (!(hi > lo)) {
    const double d = std::abs(lo) > 0 ? 0.1 * std::abs(lo) : 1.0;
    lo -= d;
    hi += d;
  }
  Ticks t = nice_ticks(lo * a.pct, hi * a.pct, target);
  // round an automatic end out to a tick
  if (!std::isfinite(a.min)) lo = std::floor(lo * a.pct / t.step + 1e-9) * t.step / a.pct;
  if (!std::isfinite(a.max)) hi = std::ceil(hi * a.pct / t.step - 1e-9) * t.step / a.pct;
  t = nice_ticks(lo * a.pct, hi * a.pct, target);
  std::vector<double> in;
  for (double v : t.values)
    if (v >= lo * a.pct - 1e-9 * t.step && v <= hi * a.pct + 1e-9 * t.step) in.push_back(v);
  t.values = in;
  return t;
}

// Keep the points that change the picture: per pixel column (of the figure's own coordinates)
// the first, lowest, highest and last point, in their order (the line looks the same, peaks
// are kept).
std::vector<std::pair<double, double>> decimate(const std::vector<std::pair<double, double>>& pts) {
  if (pts.size() < 200) return pts;
  std::vector<std::pair<double, double>> out;
  std::size_t i = 0;
  while (i < pts.size()) {
    const double col = std::floor(pts[i].first);  // pixel columns
    std::size_t j = i, lo = i, hi = i;
    while (j < pts.size() && std::floor(pts[j].first) == col) {
      if (pts[j].second < pts[lo].second) lo = j;
      if (pts[j].second > pts[hi].second) hi = j;
      ++j;
    }
    std::size_t keep[4] = {i, std::min(lo, hi), std::max(lo, hi), j - 1};
    std::size_t last = static_cast<std::size_t>(-1);
    for (std::size_t k : keep)
      if (k != last) {
        out.push_back(pts[k]);
        last = k;
      }
    i = j;
  }
  return out;
}

}  // namespace

std::string escape(const std::string& s) {
  std::string o;
  o.reserve(s.size());
  for (char c : s) {
    switch (c) {
      case '&': o += "&amp;"; break;
      case '<': o += "&lt;"; break;
      case '>': o += "&gt;"; break;
      case '"': o += "&quot;"; break;
      default: o += c;
    }
  }
  return o;
}

std::string number(double v, int decimals) {
  if (std::isnan(v)) return "n/a";
  if (std::isinf(v)) return v > 0 ? "\u221e" : "\u2212\u221e";
  char b[64];
  std::snprintf(b, sizeof b, "%.*f", std::max(0, decimals), v);
  std::string s = b;
  if (s[0] == '-') {
    if (s.find_first_not_of("-0.") == std::string::npos) return s.substr(1);  // "-0.00"
    return "\u2212" + s.substr(1);
  }
  return s;
}

Ticks nice_ticks(double lo, double hi, int target) {
  Ticks t;
  if (!(hi > lo) || !std::isfinite(lo) || !std::isfinite(hi)) {
    t.values = {lo};
    return t;
  }
  t.step = tick_step(hi - lo, target, TickFit::nearest);  // util/ticks.hpp
  t.decimals = std::max(0, static_cast<int>(-std::floor(std::log10(t.step) + 1e-9)));
  t.values = tick_values(lo, hi, t.step);
  return t;
}

namespace {

// Append "<cmd>x y" to an SVG path (piece by piece: gcc 12's -Wrestrict misreads a chain of
// string + here).
void path_point(std::string& d, const char* cmd, double x, double y) {
  d += cmd;
  d += f1(x);
  d += ' ';
  d += f1(y);
}

// One legend entry of a plot.
struct LegendEntry {
  std::string label;
  Style style;
  bool line;
  Marker marker;
  bool band;
};

// The plot area in pixels, the data ranges shown and their ticks.
struct Frame {
  double W = 0, H = 0, L = 0, R = 0, T = 0, B = 0;  // size and plot area [px]
  double x0 = 0, x1 = 1, y0 = 0, y1 = 1;            // data ranges shown
  Ticks tx, ty;
  double sx(double x) const { return L + (x - x0) / (x1 - x0) * (R - L); }
  double sy(double y) const { return B - (y - y0) / (y1 - y0) * (B - T); }
};

std::vector<LegendEntry> legend_of(const Plot& p) {
  std::vector<LegendEntry> legend;
  for (const auto& b : p.bands)
    if (!b.label.empty()) legend.push_back({b.label, Style::second, false, Marker::none, true});
  for (const auto& s : p.series)
    if (!s.label.empty()) legend.push_back({s.label, s.style, s.line, s.marker, false});
  return legend;
}

// The plot area and the ranges: x from everything drawn, y from what lies inside the x range.
Frame frame_of(const Plot& p, bool has_legend) {
  Frame f;
  f.W = p.width;
  f.H = p.height;
  f.L = 66;
  f.R = f.W - 20;
  f.T = has_legend ? 50 : 30;
  f.B = f.H - 42;
  const double L = f.L, R = f.R, T = f.T, B = f.B;

  Range rx;
  for (const auto& s : p.series)
    for (std::size_t i = 0; i < s.x.size() && i < s.y.size(); ++i)
      if (std::isfinite(s.x[i]) && std::isfinite(s.y[i])) rx.add(s.x[i]);
  for (const auto& b : p.bands)
    for (double x : b.x) rx.add(x);
  for (const auto& r : p.refs)
    if (r.vertical) rx.add(r.at);
  double& x0 = f.x0;
  double& x1 = f.x1;
  double& y0 = f.y0;
  double& y1 = f.y1;
  f.tx = resolve(p.x, rx, x0, x1, std::max(3, static_cast<int>((R - L) / 80)));
  // the y range from what lies inside the x range
  auto inside = [&](double x) { return x >= x0 - 1e-12 * std::abs(x0) && x <= x1 + 1e-12 * std::abs(x1); };
  Range ry;
  for (const auto& s : p.series)
    for (std::size_t i = 0; i < s.x.size() && i < s.y.size(); ++i)
      if (std::isfinite(s.x[i]) && inside(s.x[i])) ry.add(s.y[i]);
  for (const auto& b : p.bands)
    for (std::size_t i = 0; i < b.x.size(); ++i)
      if (inside(b.x[i])) {
        ry.add(b.lo[i]);
        ry.add(b.hi[i]);
      }
  for (const auto& r : p.refs)
    if (!r.vertical) ry.add(r.at);
  f.ty = resolve(p.y, ry, y0, y1, std::max(3, static_cast<int>((B - T) / 45)));
  return f;
}

void draw_legend(std::string& o, const Frame& f, const std::vector<LegendEntry>& legend) {
  [[maybe_unused]] const double W = f.W, H = f.H, L = f.L, R = f.R, T = f.T, B = f.B;
  [[maybe_unused]] const double x0 = f.x0, x1 = f.x1, y0 = f.y0, y1 = f.y1;
  [[maybe_unused]] const Ticks& tx = f.tx;
  [[maybe_unused]] const Ticks& ty = f.ty;
  [[maybe_unused]] auto sx = [&](double x) { return f.sx(x); };
  [[maybe_unused]] auto sy = [&](double y) { return f.sy(y); };
  if (!legend.empty()) {
    double lx = L;
    const double ly = 36;
    for (const auto& e : legend) {
      const double w = 34 + 6.2 * static_cast<double>(e.label.size()) + 18;
      if (lx + w > W - 4 && lx > L) break;  // no room: the caption says the rest
      if (e.band) {
        o += "<rect x=\"" + f1(lx) + "\" y=\"" + f1(ly - 7) + "\" width=\"26\" height=\"10\" fill=\"" +
             look(Style::second).stroke + "\" fill-opacity=\"0.28\"/>\n";
      } else {
        if (e.line)
          o += "<path d=\"M" + f1(lx) + " " + f1(ly - 2) + "H" + f1(lx + 26) + "\" " + stroke_attrs(e.style) + "/>\n";
        o += marker_svg(e.marker, e.style, lx + 13, ly - 2);
      }
      o += text(lx + 32, ly + 2, e.label, "start", 11, " fill=\"#222\"");
      lx += w;
    }
  }

}

// Shaded spans, the grid, the zero lines and the span labels.
void draw_backdrop(std::string& o, const Plot& p, const Frame& f) {
  [[maybe_unused]] const double W = f.W, H = f.H, L = f.L, R = f.R, T = f.T, B = f.B;
  [[maybe_unused]] const double x0 = f.x0, x1 = f.x1, y0 = f.y0, y1 = f.y1;
  [[maybe_unused]] const Ticks& tx = f.tx;
  [[maybe_unused]] const Ticks& ty = f.ty;
  [[maybe_unused]] auto sx = [&](double x) { return f.sx(x); };
  [[maybe_unused]] auto sy = [&](double y) { return f.sy(y); };
  for (const auto& s : p.spans) {
    const std::string fill = s.dark ? "#e2e5ea" : "#eef1f5";
    if (s.of_y) {
      const double a = sy(std::max(s.from, s.to)), b = sy(std::min(s.from, s.to));
      o += "<rect x=\"" + f1(L) + "\" y=\"" + f1(std::max(a, T)) + "\" width=\"" + f1(R - L) + "\" height=\"" +
           f1(std::max(0.0, std::min(b, B) - std::max(a, T))) + "\" fill=\"" + fill + "\"/>\n";
    } else {
      const double a = std::max(L, sx(std::min(s.from, s.to))), b = std::min(R, sx(std::max(s.from, s.to)));
      o += "<rect x=\"" + f1(a) + "\" y=\"" + f1(T) + "\" width=\"" + f1(std::max(0.0, b - a)) + "\" height=\"" +
           f1(B - T) + "\" fill=\"" + fill + "\"/>\n";
    }
  }
  std::string grid;
  for (double v : tx.values) grid += "M" + f1(sx(v / p.x.pct)) + " " + f1(T) + "V" + f1(B);
  for (double v : ty.values) grid += "M" + f1(L) + " " + f1(sy(v / p.y.pct)) + "H" + f1(R);
  o += "<path d=\"" + grid + "\" stroke=\"#dcdcdc\" stroke-width=\"0.8\" fill=\"none\"/>\n";
  if (y0 < 0 && y1 > 0)
    o += "<path d=\"M" + f1(L) + " " + f1(sy(0)) + "H" + f1(R) + "\" stroke=\"#9a9a9a\" stroke-width=\"1\"/>\n";
  if (x0 < 0 && x1 > 0)
    o += "<path d=\"M" + f1(sx(0)) + " " + f1(T) + "V" + f1(B) + "\" stroke=\"#9a9a9a\" stroke-width=\"1\"/>\n";
  for (const auto& s : p.spans)
    if (!s.label.empty()) {
      const double xm = s.of_y ? R - 4 : std::clamp(0.5 * (sx(s.from) + sx(s.to)), L + 30, R - 30);
      const double ym = s.of_y ? std::clamp(sy(std::max(s.from, s.to)) + 12, T + 12, B - 4) : T + 12;
      o += halo_text(xm, ym, s.label, s.of_y ? "end" : "middle");
    }

}

// Bands and series, clipped to the plot area.
void draw_data(std::string& o, const Plot& p, const Frame& f, const std::string& clip) {
  [[maybe_unused]] const double W = f.W, H = f.H, L = f.L, R = f.R, T = f.T, B = f.B;
  [[maybe_unused]] const double x0 = f.x0, x1 = f.x1, y0 = f.y0, y1 = f.y1;
  [[maybe_unused]] const Ticks& tx = f.tx;
  [[maybe_unused]] const Ticks& ty = f.ty;
  [[maybe_unused]] auto sx = [&](double x) { return f.sx(x); };
  [[maybe_unused]] auto sy = [&](double y) { return f.sy(y); };
  o += "<g clip-path=\"url(#" + escape(clip) + ")\">\n";
  for (const auto& b : p.bands) {
    std::string d;
    std::vector<std::pair<double, double>> up, dn;
    auto flush = [&] {
      if (up.size() >= 2) {
        d += "M";
        for (std::size_t i = 0; i < up.size(); ++i) path_point(d, i ? "L" : "", up[i].first, up[i].second);
        for (std::size_t i = dn.size(); i-- > 0;) path_point(d, "L", dn[i].first, dn[i].second);
        d += "Z";
      }
      up.clear();
      dn.clear();
    };
    for (std::size_t i = 0; i < b.x.size(); ++i) {
      if (!std::isfinite(b.x[i]) || !std::isfinite(b.lo[i]) || !std::isfinite(b.hi[i])) {
        flush();
        continue;
      }
      up.emplace_back(sx(b.x[i]), sy(b.hi[i]));
      dn.emplace_back(sx(b.x[i]), sy(b.lo[i]));
    }
    flush();
    if (!d.empty())
      o += "<path d=\"" + d + "\" fill=\"" + look(Style::second).stroke + "\" fill-opacity=\"0.28\" stroke=\"none\"/>\n";
  }
  // lines of the later series first, so that the first series (held) is drawn on top
  for (std::size_t k = p.series.size(); k-- > 0;) {
    const auto& s = p.series[k];
    if (!s.line) continue;
    std::string d;
    std::vector<std::pair<double, double>> run;
    auto flush = [&] {
      const auto pts = decimate(run);
      if (pts.size() >= 2) {
        for (std::size_t i = 0; i < pts.size(); ++i) path_point(d, i ? "L" : "M", pts[i].first, pts[i].second);
      }
      run.clear();
    };
    for (std::size_t i = 0; i < s.x.size() && i < s.y.size(); ++i) {
      if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i])) {
        flush();
        continue;
      }
      // keep far-off points inside a sane pixel range (the clip path trims the rest)
      run.emplace_back(sx(s.x[i]), std::clamp(sy(s.y[i]), T - 2000.0, B + 2000.0));
    }
    flush();
    if (!d.empty())
      o += "<path d=\"" + d + "\" " + stroke_attrs(s.style) + " stroke-linejoin=\"round\" stroke-linecap=\"round\"/>\n";
  }
  for (std::size_t k = p.series.size(); k-- > 0;) {
    const auto& s = p.series[k];
    if (s.marker == Marker::none) continue;
    for (std::size_t i = 0; i < s.x.size() && i < s.y.size(); ++i) {
      if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i])) continue;
      const double X = sx(s.x[i]), Y = sy(s.y[i]);
      if (X < L - 6 || X > R + 6 || Y < T - 6 || Y > B + 6) continue;
      o += marker_svg(s.marker, s.style, X, Y);
    }
  }
  o += "</g>\n";

}

// Reference lines (labels staggered so that neighbours do not overlap) and notes.
void draw_refs(std::string& o, const Plot& p, const Frame& f) {
  [[maybe_unused]] const double W = f.W, H = f.H, L = f.L, R = f.R, T = f.T, B = f.B;
  [[maybe_unused]] const double x0 = f.x0, x1 = f.x1, y0 = f.y0, y1 = f.y1;
  [[maybe_unused]] const Ticks& tx = f.tx;
  [[maybe_unused]] const Ticks& ty = f.ty;
  [[maybe_unused]] auto sx = [&](double x) { return f.sx(x); };
  [[maybe_unused]] auto sy = [&](double y) { return f.sy(y); };
  std::vector<const RefLine*> vref;
  for (const auto& r : p.refs) {
    if (r.vertical) {
      vref.push_back(&r);
      continue;
    }
    if (r.at < y0 || r.at > y1) continue;
    const double Y = sy(r.at);
    o += "<path d=\"M" + f1(L) + " " + f1(Y) + "H" + f1(R) + "\" " + stroke_attrs(r.style) + "/>\n";
    if (!r.label.empty()) o += halo_text(R - 4, Y - 4, r.label, "end");
  }
  std::sort(vref.begin(), vref.end(), [](const RefLine* a, const RefLine* b) { return a->at < b->at; });
  double last_x = -1e9;
  int level = 0;
  for (const RefLine* r : vref) {
    if (r->at < x0 || r->at > x1) continue;
    const double X = sx(r->at);
    o += "<path d=\"M" + f1(X) + " " + f1(T) + "V" + f1(B) + "\" " + stroke_attrs(r->style) + "/>\n";
    if (r->label.empty()) continue;
    level = (X - last_x < 110) ? level + 1 : 0;
    last_x = X;
    const bool right = X < L + 0.6 * (R - L);
    o += halo_text(right ? X + 4 : X - 4, T + 12 + 13 * (level % 4), r->label, right ? "start" : "end");
  }
  for (const auto& n : p.notes) {
    if (n.x < x0 || n.x > x1 || n.y < y0 || n.y > y1) continue;
    const double X = sx(n.x), Y = sy(n.y);
    if (n.dot) o += "<circle cx=\"" + f1(X) + "\" cy=\"" + f1(Y) + "\" r=\"2.5\" fill=\"#111\"/>\n";
    o += halo_text(n.left ? X - 6 : X + 6, Y - 6, n.text, n.left ? "end" : "start");
  }

}

// The frame, the ticks with their numbers, the axis titles.
void draw_axes(std::string& o, const Plot& p, const Frame& f) {
  [[maybe_unused]] const double W = f.W, H = f.H, L = f.L, R = f.R, T = f.T, B = f.B;
  [[maybe_unused]] const double x0 = f.x0, x1 = f.x1, y0 = f.y0, y1 = f.y1;
  [[maybe_unused]] const Ticks& tx = f.tx;
  [[maybe_unused]] const Ticks& ty = f.ty;
  [[maybe_unused]] auto sx = [&](double x) { return f.sx(x); };
  [[maybe_unused]] auto sy = [&](double y) { return f.sy(y); };
  o += "<rect x=\"" + f1(L) + "\" y=\"" + f1(T) + "\" width=\"" + f1(R - L) + "\" height=\"" + f1(B - T) +
       "\" fill=\"none\" stroke=\"#444\" stroke-width=\"1\"/>\n";
  std::string ticks;
  for (double v : tx.values) {
    const double X = sx(v / p.x.pct);
    path_point(ticks, "M", X, B);
    ticks += "v5";
    o += text(X, B + 17, number(v, tx.decimals), "middle", 11, " fill=\"#222\"");
  }
  for (double v : ty.values) {
    const double Y = sy(v / p.y.pct);
    path_point(ticks, "M", L, Y);
    ticks += "h-5";
    o += text(L - 8, Y + 4, number(v, ty.decimals), "end", 11, " fill=\"#222\"");
  }
  o += "<path d=\"" + ticks + "\" stroke=\"#444\" stroke-width=\"1\"/>\n";
  o += text(0.5 * (L + R), H - 8, axis_title(p.x), "middle", 12, " fill=\"#111\"");
  o += "<text transform=\"translate(15 " + f1(0.5 * (T + B)) + ") rotate(-90)\" " + kFont +
       " font-size=\"12\" text-anchor=\"middle\" fill=\"#111\">" + escape(axis_title(p.y)) + "</text>\n";
}

}  // namespace

std::string render(const Plot& p) {
  const std::vector<LegendEntry> legend = legend_of(p);
  const Frame f = frame_of(p, !legend.empty());
  const double W = f.W, H = f.H, L = f.L, R = f.R, T = f.T, B = f.B;
  const std::string clip = "clip-" + p.id;

  std::string o;
  o += "<svg class=\"plot\" id=\"" + escape(p.id) + "\" viewBox=\"0 0 " + f1(W) +
       " " + f1(H) + "\" width=\"" + f1(W) + "\" height=\"" + f1(H) + "\" role=\"img\">\n";
  o += "<title>" + escape(p.description.empty() ? p.title : p.description) + "</title>\n";
  o += "<defs><clipPath id=\"" + escape(clip) + "\"><rect x=\"" + f1(L) + "\" y=\"" + f1(T) + "\" width=\"" +
       f1(R - L) + "\" height=\"" + f1(B - T) + "\"/></clipPath></defs>\n";
  o += "<rect x=\"0\" y=\"0\" width=\"" + f1(W) + "\" height=\"" + f1(H) + "\" fill=\"#fff\"/>\n";
  o += text(8, 17, p.title, "start", 13, " font-weight=\"bold\" fill=\"#111\"");

  if (!legend.empty()) draw_legend(o, f, legend);
  draw_backdrop(o, p, f);
  draw_data(o, p, f, clip);
  draw_refs(o, p, f);
  draw_axes(o, p, f);
  o += "</svg>\n";
  return o;
}

std::string render(const RowChart& c) {
  const double W = c.width;
  const double Lbl = 170, L = Lbl + 12, R = W - 24;
  const double T = c.legend.empty() ? 64 : 86;
  const double rowh = 40;
  const double B = T + rowh * static_cast<double>(c.rows.size());
  const double H = B + (c.spans.empty() ? 40 : 56);

  Range rx;
  for (const auto& r : c.rows) {
    for (const auto& b : r.bars) {
      rx.add(b.from);
      rx.add(b.to);
    }
    for (const auto& m : r.marks) rx.add(m.at);
  }
  for (const auto& r : c.refs) rx.add(r.at);
  for (const auto& s : c.spans) {
    rx.add(s.from);
    rx.add(s.to);
  }
  double x0, x1;
  const Ticks tx = resolve(c.x, rx, x0, x1, std::max(3, static_cast<int>((R - L) / 70)));
  auto sx = [&](double x) { return L + (x - x0) / (x1 - x0) * (R - L); };

  std::string o;
  o += "<svg class=\"plot\" id=\"" + escape(c.id) + "\" viewBox=\"0 0 " + f1(W) +
       " " + f1(H) + "\" width=\"" + f1(W) + "\" height=\"" + f1(H) + "\" role=\"img\">\n";
  o += "<title>" + escape(c.description.empty() ? c.title : c.description) + "</title>\n";
  o += "<rect x=\"0\" y=\"0\" width=\"" + f1(W) + "\" height=\"" + f1(H) + "\" fill=\"#fff\"/>\n";
  o += text(8, 17, c.title, "start", 13, " font-weight=\"bold\" fill=\"#111\"");
  if (!c.legend.empty()) {
    double lx = L;
    for (const auto& [st, label] : c.legend) {
      const Look l = look(st);
      const std::string fill = st == Style::first ? l.stroke : "#fff";
      o += "<rect x=\"" + f1(lx) + "\" y=\"30\" width=\"24\" height=\"10\" fill=\"" + fill + "\" stroke=\"" + l.stroke +
           "\" stroke-width=\"1.5\"" + (st == Style::first ? "" : " stroke-dasharray=\"4 2\"") + "/>\n";
      o += text(lx + 30, 39, label, "start", 11, " fill=\"#222\"");
      lx += 30 + 6.2 * static_cast<double>(label.size()) + 22;
    }
  }
  for (const auto& s : c.spans) {
    const double a = std::max(L, sx(std::min(s.from, s.to))), b = std::min(R, sx(std::max(s.from, s.to)));
    o += "<rect x=\"" + f1(a) + "\" y=\"" + f1(T) + "\" width=\"" + f1(std::max(0.0, b - a)) + "\" height=\"" +
         f1(B - T) + "\" fill=\"" + (s.dark ? "#e2e5ea" : "#eef1f5") + "\"/>\n";
    if (!s.label.empty()) o += halo_text(0.5 * (a + b), B + 31, s.label, "middle");
  }
  std::string grid;
  for (double v : tx.values) grid += "M" + f1(sx(v / c.x.pct)) + " " + f1(T) + "V" + f1(B);
  o += "<path d=\"" + grid + "\" stroke=\"#dcdcdc\" stroke-width=\"0.8\" fill=\"none\"/>\n";
  // reference lines and their labels (staggered above the rows)
  std::vector<const RefLine*> vref;
  for (const auto& r : c.refs) vref.push_back(&r);
  std::sort(vref.begin(), vref.end(), [](const RefLine* a, const RefLine* b) { return a->at < b->at; });
  double last_x = -1e9;
  int level = 0;
  for (const RefLine* r : vref) {
    if (r->at < x0 || r->at > x1) continue;
    const double X = sx(r->at);
    o += "<path d=\"M" + f1(X) + " " + f1(T - 4) + "V" + f1(B) + "\" " + stroke_attrs(r->style) + "/>\n";
    level = (X - last_x < 120) ? level + 1 : 0;
    last_x = X;
    const double y = T - 8 - 12 * (level % 2);
    o += halo_text(X, y, r->label, "middle");
  }
  for (std::size_t i = 0; i < c.rows.size(); ++i) {
    const auto& r = c.rows[i];
    const double yc = T + rowh * (static_cast<double>(i) + 0.5);
    if (i > 0)
      o += "<path d=\"M8 " + f1(T + rowh * static_cast<double>(i)) + "H" + f1(R) +
           "\" stroke=\"#eeeeee\" stroke-width=\"1\"/>\n";
    o += text(Lbl, yc + 4, r.label, "end", 11, " fill=\"#111\"");
    const double n = static_cast<double>(r.bars.size());
    for (std::size_t k = 0; k < r.bars.size(); ++k) {
      const auto& b = r.bars[k];
      const double h = 9;
      const double y = yc - 0.5 * h * n - 1 * (n - 1) + (h + 2) * static_cast<double>(k);
      const double a = sx(std::min(b.from, b.to)), e = sx(std::max(b.from, b.to));
      const Look l = look(b.style);
      const std::string fill = b.style == Style::first ? l.stroke : "#fff";
      o += "<rect x=\"" + f1(a) + "\" y=\"" + f1(y) + "\" width=\"" + f1(std::max(1.0, e - a)) + "\" height=\"" + f1(h) +
           "\" fill=\"" + fill + "\" stroke=\"" + l.stroke + "\" stroke-width=\"1.5\"" +
           (b.style == Style::first ? "" : " stroke-dasharray=\"4 2\"") + "/>\n";
      if (!b.label.empty()) {
        const bool fits_right = e + 6 + 6.0 * static_cast<double>(b.label.size()) < R;
        o += halo_text(fits_right ? e + 5 : a - 5, y + h - 1, b.label, fits_right ? "start" : "end");
      }
    }
    for (const auto& m : r.marks) {
      const double X = sx(m.at);
      o += "<path d=\"M" + f1(X) + " " + f1(yc - 13) + "V" + f1(yc + 13) + "\" stroke=\"#111\" stroke-width=\"2\"/>\n";
      if (!m.label.empty()) o += halo_text(X, yc + 16 + 9, m.label, "middle");
    }
  }
  o += "<path d=\"M" + f1(L) + " " + f1(B) + "H" + f1(R) + "\" stroke=\"#444\" stroke-width=\"1\"/>\n";
  std::string ticks;
  for (double v : tx.values) {
    const double X = sx(v / c.x.pct);
    path_point(ticks, "M", X, B);
    ticks += "v5";
    o += text(X, B + 17, number(v, tx.decimals), "middle", 11, " fill=\"#222\"");
  }
  o += "<path d=\"" + ticks + "\" stroke=\"#444\" stroke-width=\"1\"/>\n";
  o += text(0.5 * (L + R), H - 6, axis_title(c.x), "middle", 12, " fill=\"#111\"");
  o += "</svg>\n";
  return o;
}

}  // namespace fp::svg
