// side_view.cpp — see side_view.hpp.
#include "ui/side_view.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <vector>

#include <SFML/Graphics/RenderStates.hpp>
#include <SFML/Graphics/Text.hpp>
#include <SFML/Graphics/VertexArray.hpp>
#include <SFML/Graphics/View.hpp>

#include "model/units.hpp"

namespace fpui {

namespace {

using V2 = sf::Vector2f;

// ---------------------------------------------------------------------------------------------
// Colours (our own palette; held dark, free light, so they stay apart in grey-scale)

struct Palette {
  sf::Color fill, wing, line, surface, glass;
};
const Palette kHeld{{92, 106, 126}, {64, 78, 98}, {24, 38, 60}, {44, 62, 88}, {170, 190, 204}};
const Palette kFree{{246, 208, 150}, {236, 184, 110}, {196, 106, 14}, {226, 146, 44}, {252, 236, 206}};
const sf::Color kInk{40, 46, 52};
const sf::Color kMuted{120, 124, 128};
const sf::Color kGust{34, 120, 150};
const sf::Color kCg{30, 30, 30};
const sf::Color kWarn{178, 92, 0};

sf::Color with_alpha(sf::Color c, sf::Uint8 a) {
  c.a = a;
  return c;
}

// ---------------------------------------------------------------------------------------------
// Drawing helpers

void add_tri(sf::VertexArray& va, V2 a, V2 b, V2 c, sf::Color col) {
  va.append({a, col});
  va.append({b, col});
  va.append({c, col});
}

// A thick line strip as triangles (open or closed).
void thick_line(sf::VertexArray& va, const std::vector<V2>& p, float w, sf::Color col, bool closed = false) {
  const std::size_t n = p.size();
  if (n < 2) return;
  const std::size_t segs = closed ? n : n - 1;
  for (std::size_t i = 0; i < segs; ++i) {
    const V2 a = p[i], b = p[(i + 1) % n];
    V2 d = b - a;
    const float len = std::sqrt(d.x * d.x + d.y * d.y);
    if (len < 1e-4f) continue;
    d /= len;
    const V2 nrm(-d.y * w * 0.5f, d.x * w * 0.5f);
    const V2 ext = d * (w * 0.5f);  // overlap the joints a little
    add_tri(va, a - nrm - ext, a + nrm - ext, b + nrm + ext, col);
    add_tri(va, a - nrm - ext, b + nrm + ext, b - nrm + ext, col);
  }
}

void dashed_line(sf::VertexArray& va, const std::vector<V2>& p, float w, sf::Color col, float on, float off,
                 bool closed = false) {
  const std::size_t n = p.size();
  if (n < 2) return;
  float phase = 0.0f;
  const std::size_t segs = closed ? n : n - 1;
  for (std::size_t i = 0; i < segs; ++i) {
    V2 a = p[i];
    const V2 b = p[(i + 1) % n];
    V2 d = b - a;
    float len = std::sqrt(d.x * d.x + d.y * d.y);
    if (len < 1e-4f) continue;
    d /= len;
    while (len > 0.0f) {
      const bool drawing = phase < on;
      const float step = std::min(len, drawing ? on - phase : on + off - phase);
      const V2 c = a + d * step;
      if (drawing) thick_line(va, {a, c}, w, col);
      a = c;
      len -= step;
      phase += step;
      if (phase >= on + off) phase = 0.0f;
    }
  }
}

// A polygon given as an upper and a lower boundary sampled at the same stations (x-monotone in
// its own frame): filled as a strip of triangles.
void fill_band(sf::VertexArray& va, const std::vector<V2>& upper, const std::vector<V2>& lower, sf::Color col) {
  for (std::size_t i = 1; i < upper.size() && i < lower.size(); ++i) {
    add_tri(va, upper[i - 1], lower[i - 1], upper[i], col);
    add_tri(va, upper[i], lower[i - 1], lower[i], col);
  }
}

void fill_convex(sf::VertexArray& va, const std::vector<V2>& p, sf::Color col) {
  for (std::size_t i = 2; i < p.size(); ++i) add_tri(va, p[0], p[i - 1], p[i], col);
}

std::vector<V2> outline_of(const std::vector<V2>& upper, const std::vector<V2>& lower) {
  std::vector<V2> o(upper.begin(), upper.end());
  o.insert(o.end(), lower.rbegin(), lower.rend());
  return o;
}

void arrow(sf::VertexArray& va, V2 from, V2 to, float w, sf::Color col) {
  V2 d = to - from;
  const float len = std::sqrt(d.x * d.x + d.y * d.y);
  if (len < 2.0f) return;
  d /= len;
  const float head = std::min(9.0f, len * 0.5f);
  const V2 base = to - d * head;
  thick_line(va, {from, base}, w, col);
  const V2 nrm(-d.y, d.x);
  add_tri(va, to, base + nrm * (head * 0.55f), base - nrm * (head * 0.55f), col);
}

// NACA four-digit symmetric half-thickness at x/c (thickness ratio t): the published section
// formula, used here only for the outline of the schematic.
double half_thickness(double xc, double t) {
  xc = std::clamp(xc, 0.0, 1.0);
  return 5.0 * t *
         (0.2969 * std::sqrt(xc) - 0.1260 * xc - 0.3516 * xc * xc + 0.2843 * xc * xc * xc -
          0.1036 * xc * xc * xc * xc);
}

// ---------------------------------------------------------------------------------------------
// Geometry in body axes: x forward from the CG, z down from the CG [m].

struct Body {
  double x_cg_aft = 0;     // CG aft of LEMAC [m]
  double bx(double x_aft) const { return x_cg_aft - x_aft; }
};

// Body axes [m] to the screen, for one airplane: attitude theta about the CG at `c`.
struct ToScreen {
  V2 c;
  float scale = 10.0f;     // px per m
  double ct = 1, st = 0;
  V2 operator()(double x, double z) const {
    const double X = x * ct + z * st;   // earth forward
    const double Z = -x * st + z * ct;  // earth down
    return {c.x + static_cast<float>(X) * scale, c.y + static_cast<float>(Z) * scale};
  }
};

// Rotate (x, z) about the point (hx, hz) by a trailing-edge-down angle d (the sense of
// nose-up pitch: see model/state.hpp).
void rotate_about(double& x, double& z, double hx, double hz, double d) {
  const double dx = x - hx, dz = z - hz;
  x = hx + dx * std::cos(d) + dz * std::sin(d);
  z = hz - dx * std::sin(d) + dz * std::cos(d);
}

struct Sizes {
  double x_nose_aft, x_end_aft, len, height, cs;  // [m]
};

Sizes sizes_of(const fp::Airplane& ap) {
  Sizes s;
  const double ce = ap.elevator.chord;
  s.cs = std::max(1.4 * ce, 0.25 * ap.wing.mac);
  s.x_end_aft = ap.elevator.x_hinge + 0.3 * ce;
  s.x_nose_aft = -0.36 * std::max(ap.elevator.x_hinge, 1.0);
  s.len = s.x_end_aft - s.x_nose_aft;
  s.height = 0.15 * s.len;
  return s;
}

// Fuselage outline: (station fraction, top, bottom) in units of the height, about a centreline
// that runs at the CG height forward and drops or rises to the hinge line at the tail.
constexpr std::array<std::array<double, 3>, 11> kProfile{{{0.00, -0.16, 0.16},
                                                          {0.03, -0.34, 0.38},
                                                          {0.10, -0.42, 0.46},
                                                          {0.20, -0.44, 0.50},
                                                          {0.27, -0.46, 0.50},
                                                          {0.34, -0.70, 0.50},
                                                          {0.45, -0.72, 0.46},
                                                          {0.55, -0.56, 0.40},
                                                          {0.70, -0.42, 0.26},
                                                          {0.85, -0.32, 0.14},
                                                          {1.00, -0.26, 0.06}}};

struct AirplaneDraw {
  const fp::Airplane& ap;
  Body body;
  Sizes sz;
  double centre_z(double s) const {
    const double zt = ap.elevator.z_hinge;
    return s < 0.45 ? 0.0 : zt * (s - 0.45) / 0.55;
  }
  double station_aft(double s) const { return sz.x_nose_aft + s * sz.len; }
  // profile at station s (interpolated)
  void profile(double s, double& top, double& bot) const {
    for (std::size_t i = 1; i < kProfile.size(); ++i)
      if (s <= kProfile[i][0] || i + 1 == kProfile.size()) {
        const auto& a = kProfile[i - 1];
        const auto& b = kProfile[i];
        const double w = std::clamp((s - a[0]) / (b[0] - a[0]), 0.0, 1.0);
        top = centre_z(s) + (a[1] + w * (b[1] - a[1])) * sz.height;
        bot = centre_z(s) + (a[2] + w * (b[2] - a[2])) * sz.height;
        return;
      }
  }
};

// Stabiliser, elevator and tab, the elevator and the tab deflected (exaggerated) about their
// hinges. `reference`: also the elevator's chord line at zero deflection, dashed.
void draw_tail(sf::VertexArray& va, const AirplaneDraw& A, const ToScreen& S, const Pose& pose, double exaggeration,
               const Palette& pal, bool ghost, bool reference) {
  const fp::Airplane& ap = A.ap;
  const sf::Uint8 alpha = ghost ? 150 : 255;
  const sf::Color wing = with_alpha(pal.wing, alpha), surf = with_alpha(pal.surface, alpha);
  const float lw = reference ? 1.4f : 1.6f;
  auto outline = [&](const std::vector<V2>& p, bool closed) {
    if (ghost) dashed_line(va, p, lw, pal.line, 6.0f, 4.0f, closed);
    else thick_line(va, p, lw, pal.line, closed);
  };
  const double ce = ap.elevator.chord, cs = A.sz.cs, ct = cs + ce;
  const double xh = ap.elevator.x_hinge, zh = ap.elevator.z_hinge;
  const double hx = A.body.bx(xh);
  const double de = pose.de * exaggeration;
  const double dtab = pose.tab * exaggeration;
  const double tab_hinge = xh + 0.75 * ce;  // the tab is the last quarter of the elevator chord
  if (reference)
    dashed_line(va, {S(hx, zh), S(A.body.bx(xh + 1.3 * ce), zh)}, 1.0f, kMuted, 4.0f, 3.0f);
  auto section = [&](double from, double to, int n, int part, std::vector<V2>& u, std::vector<V2>& l) {
    for (int i = 0; i <= n; ++i) {
      const double xa = from + (to - from) * i / n;  // aft of LEMAC
      const double xc = (xa - (xh - cs)) / ct;
      const double y = std::max(half_thickness(xc, 0.12) * ct, 0.012 * ct);
      double xu = A.body.bx(xa), zu = zh - y, xl = A.body.bx(xa), zl = zh + y;
      if (part >= 1) {
        rotate_about(xu, zu, hx, zh, de);
        rotate_about(xl, zl, hx, zh, de);
      }
      if (part == 2) {
        double thx = A.body.bx(tab_hinge), thz = zh;
        rotate_about(thx, thz, hx, zh, de);
        rotate_about(xu, zu, thx, thz, dtab);
        rotate_about(xl, zl, thx, thz, dtab);
      }
      u.push_back(S(xu, zu));
      l.push_back(S(xl, zl));
    }
  };
  std::vector<V2> su, sl, eu, el, tu, tl;
  section(xh - cs, xh, 14, 0, su, sl);
  section(xh, tab_hinge, 10, 1, eu, el);
  section(tab_hinge, xh + ce, 5, 2, tu, tl);
  fill_band(va, su, sl, wing);
  outline(outline_of(su, sl), true);
  fill_band(va, eu, el, surf);
  outline(outline_of(eu, el), true);
  fill_band(va, tu, tl, surf);
  outline(outline_of(tu, tl), true);
  const V2 hp = S(hx, zh);  // the hinge
  fill_convex(va, {hp + V2(-2, -2), hp + V2(2, -2), hp + V2(2, 2), hp + V2(-2, 2)}, pal.line);
}

void draw_airplane(sf::VertexArray& va, const AirplaneDraw& A, const ToScreen& S, const Pose& pose,
                   double exaggeration, const Palette& pal, bool ghost) {
  const fp::Airplane& ap = A.ap;
  const sf::Uint8 alpha = ghost ? 150 : 255;
  const sf::Color fill = with_alpha(pal.fill, alpha), wing = with_alpha(pal.wing, alpha);
  const sf::Color glass = with_alpha(pal.glass, alpha);
  const float lw = 1.6f;
  auto outline = [&](const std::vector<V2>& p, bool closed) {
    if (ghost) dashed_line(va, p, lw, pal.line, 6.0f, 4.0f, closed);
    else thick_line(va, p, lw, pal.line, closed);
  };

  // fin (behind the fuselage)
  {
    double top_end, bot_end, top_a, bot_a;
    A.profile(1.0, top_end, bot_end);
    A.profile(0.80, top_a, bot_a);
    const double fin_h = 0.15 * A.sz.len;
    const double xa = A.body.bx(A.station_aft(0.80)), xe = A.body.bx(A.station_aft(1.0));
    const double xt0 = A.body.bx(A.station_aft(0.93)), xt1 = A.body.bx(A.station_aft(1.0) + 0.02 * A.sz.len);
    std::vector<V2> fin{S(xa, top_a), S(xt0, top_end - fin_h), S(xt1, top_end - fin_h), S(xe, bot_end)};
    fill_convex(va, fin, wing);
    outline(fin, true);
  }
  // fuselage
  std::vector<V2> up, lo;
  for (int i = 0; i <= 36; ++i) {
    const double s = i / 36.0;
    double t, b;
    A.profile(s, t, b);
    const double x = A.body.bx(A.station_aft(s));
    up.push_back(S(x, t));
    lo.push_back(S(x, b));
  }
  fill_band(va, up, lo, fill);
  // canopy glass
  {
    std::vector<V2> gu, gl;
    for (int i = 0; i <= 12; ++i) {
      const double s = 0.285 + (0.53 - 0.285) * i / 12.0;
      double t, b;
      A.profile(s, t, b);
      const double belt = A.centre_z(s) - 0.47 * A.sz.height;
      const double x = A.body.bx(A.station_aft(s));
      gu.push_back(S(x, t + 0.04 * A.sz.height));
      gl.push_back(S(x, std::max(belt, t + 0.04 * A.sz.height)));
    }
    fill_band(va, gu, gl, glass);
  }
  outline(outline_of(up, lo), true);
  // spinner and the propeller disc seen edge on
  {
    const double xn = A.body.bx(A.sz.x_nose_aft);
    const double zc = A.centre_z(0.0) + 0.0 * A.sz.height;
    const double r = 0.12 * A.sz.height, l = 0.035 * A.sz.len;
    fill_convex(va, {S(xn, zc - r), S(xn + l, zc), S(xn, zc + r)}, with_alpha(pal.line, alpha));
    const double R = 0.85 * A.sz.height;
    thick_line(va, {S(xn - 0.004 * A.sz.len, zc - R), S(xn - 0.004 * A.sz.len, zc + R)}, 2.0f, with_alpha(kMuted, alpha));
  }
  // wing section at the MAC
  {
    const double c = ap.wing.mac, z = ap.wing.z_ac;
    std::vector<V2> wu, wl;
    for (int i = 0; i <= 16; ++i) {
      const double xc = std::pow(i / 16.0, 1.6);
      const double y = half_thickness(xc, 0.15) * c;
      wu.push_back(S(A.body.bx(xc * c), z - y));
      wl.push_back(S(A.body.bx(xc * c), z + y));
    }
    fill_band(va, wu, wl, wing);
    outline(outline_of(wu, wl), true);
  }
  draw_tail(va, A, S, pose, exaggeration, pal, ghost, false);
  // CG symbol: a quartered circle
  {
    const V2 c = S(0.0, 0.0);
    const float r = 6.0f;
    for (int q = 0; q < 4; ++q) {
      const sf::Color col = (q % 2 == 0) ? kCg : sf::Color(250, 250, 250);
      std::vector<V2> fan{c};
      for (int i = 0; i <= 6; ++i) {
        const double a = (q * 90.0 + i * 15.0) * fp::units::deg;
        fan.emplace_back(c.x + r * static_cast<float>(std::cos(a)), c.y - r * static_cast<float>(std::sin(a)));
      }
      fill_convex(va, fan, col);
    }
  }
}

// Gust arrows at a surface point (earth axes): the air arrives at the point.
void gust_arrows(sf::VertexArray& va, V2 at, double w, double u, float px_per_mps) {
  const float lim = 70.0f;
  if (std::abs(w) > 0.05) {
    const float len = std::clamp(static_cast<float>(w) * px_per_mps, -lim, lim);
    arrow(va, at + V2(0, len + (w > 0 ? 8.0f : -8.0f)), at + V2(0, w > 0 ? 6.0f : -6.0f), 2.2f, kGust);
  }
  if (std::abs(u) > 0.05) {
    const float len = std::clamp(static_cast<float>(u) * px_per_mps, -lim, lim);
    arrow(va, at - V2(len + (u > 0 ? 8.0f : -8.0f), 0), at - V2(u > 0 ? 6.0f : -6.0f, 0), 2.2f, kGust);
  }
}

std::string fmt1(const char* f, double v) {
  char b[64];
  std::snprintf(b, sizeof b, f, v);
  return b;
}

// ---------------------------------------------------------------------------------------------
// The parts of SideView::draw

// The texts of the view, drawn after the shapes; a pale box goes behind the bold ones and those
// asked for, so that captions stay readable over the airplanes. Without a font, none is drawn.
class Labels {
 public:
  explicit Labels(const sf::Font* font) : font_(font) {}
  void add(const std::string& s, float x, float y, unsigned size, sf::Color col, float align = 0.0f, bool bold = false,
           bool box = false) {
    if (!font_) return;
    sf::Text t(sf::String::fromUtf8(s.begin(), s.end()), *font_, size);
    t.setFillColor(col);
    if (bold) t.setStyle(sf::Text::Bold);
    const sf::FloatRect b = t.getLocalBounds();
    t.setPosition(std::round(x - align * b.width), std::round(y));
    texts_.push_back(t);
    if (box || bold) boxed_.push_back(t.getGlobalBounds());
  }
  // Width of a text (a guess without a font).
  float width(const char* s, unsigned size) const {
    return font_ ? sf::Text(s, *font_, size).getLocalBounds().width : 30.0f;
  }
  void draw(sf::RenderTarget& target) const {
    sf::VertexArray boxes(sf::Triangles);
    for (const auto& b : boxed_)
      fill_convex(boxes, {V2(b.left - 3, b.top - 2), V2(b.left + b.width + 3, b.top - 2),
                          V2(b.left + b.width + 3, b.top + b.height + 3), V2(b.left - 3, b.top + b.height + 3)},
                  sf::Color(240, 243, 244, 200));
    target.draw(boxes);
    for (const auto& t : texts_) target.draw(t);
  }

 private:
  const sf::Font* font_;
  std::vector<sf::Text> texts_;
  std::vector<sf::FloatRect> boxed_;
};

// Where one airplane is drawn: side by side, each in its half; superposed, both in the whole
// sky (the free one dashed).
struct Slot {
  const Pose* pose;
  const Palette* pal;
  const char* name;
  sf::FloatRect r;
  bool ghost;
};

std::vector<Slot> slots_of(const sf::FloatRect& sky, const Pose* held, const Pose* free, bool superposed) {
  std::vector<Slot> slots;
  if (superposed || !free) {
    slots.push_back({held, &kHeld, "HELD", sky, false});
    if (free) slots.push_back({free, &kFree, "FREE", sky, true});
  } else {
    const float w = sky.width * 0.5f;
    slots.push_back({held, &kHeld, "HELD", sf::FloatRect(sky.left, sky.top, w, sky.height), false});
    slots.push_back({free, &kFree, "FREE", sf::FloatRect(sky.left + w, sky.top, w, sky.height), false});
  }
  return slots;
}

// What every slot shares: the sky, the heights of its bands, the scale of the airplanes.
struct SkyLayout {
  sf::FloatRect sky;
  float label_h = 0, inset_h = 0, plane_h = 0, scale = 0;  // [px], [px per m]
  bool superposed = false;
  double exaggeration = 1.0;
};

// The caption and the readout of one airplane, at the top of its slot.
void slot_caption(Labels& labels, const Slot& sl, std::size_t k, bool superposed) {
  const Pose& p = *sl.pose;
  const float tx = sl.r.left + 8.0f;
  const float ty = sl.r.top + 4.0f + (superposed ? 34.0f * static_cast<float>(k) : 0.0f);
  labels.add(std::string(sl.name) + "  " + p.state, tx, ty, 12, sl.pal->line, 0.0f, true);
  char b[200];
  if (sl.r.width >= 300.0f || superposed) {
    std::snprintf(b, sizeof b, "θ %+.1f°   α %+.1f°   δe %+.1f°   tab %+.1f°", fp::units::to_deg(p.theta),
                  fp::units::to_deg(p.alpha), fp::units::to_deg(p.de), fp::units::to_deg(p.tab));
    labels.add(b, tx, ty + 16.0f, 11, kInk, 0.0f, false, true);
  } else {  // narrow: the readout on two lines
    std::snprintf(b, sizeof b, "θ %+.1f°  α %+.1f°", fp::units::to_deg(p.theta), fp::units::to_deg(p.alpha));
    labels.add(b, tx, ty + 15.0f, 10, kInk, 0.0f, false, true);
    std::snprintf(b, sizeof b, "δe %+.1f°  tab %+.1f°", fp::units::to_deg(p.de), fp::units::to_deg(p.tab));
    labels.add(b, tx, ty + 27.0f, 10, kInk, 0.0f, false, true);
  }
}

// The tail magnified at the foot of the slot, in body axes, with the elevator's zero line.
void tail_inset(sf::VertexArray& va, Labels& labels, const AirplaneDraw& A, const Slot& sl, std::size_t k,
                const SkyLayout& L) {
  const fp::Airplane& ap = A.ap;
  const double ct = A.sz.cs + ap.elevator.chord;
  const float iw = std::min(0.5f * sl.r.width, 230.0f);
  const float iscale = static_cast<float>(iw / (1.45 * ct));
  const float ix = sl.r.left + 10.0f + static_cast<float>(A.sz.cs) * iscale;
  const float iy = L.sky.top + L.sky.height - L.inset_h * 0.5f - 2.0f;
  ToScreen T;
  T.scale = iscale;
  T.c = V2(ix - static_cast<float>(A.body.bx(ap.elevator.x_hinge)) * iscale,
           iy - static_cast<float>(ap.elevator.z_hinge) * iscale);
  draw_tail(va, A, T, *sl.pose, L.exaggeration, *sl.pal, sl.ghost, k == 0 || !L.superposed);
  if (k == 0 || !L.superposed) {
    char tb[64];
    std::snprintf(tb, sizeof tb, "tail ×%.0f", iscale / L.scale);
    labels.add(tb, sl.r.left + 10.0f, L.sky.top + L.sky.height - L.inset_h - 2.0f, 10, kMuted);
  }
}

// One airplane in its slot: the horizon, the airplane at its attitude, the flight-path
// direction, the gusts at the wing and the tail, the caption, and the tail magnified.
void draw_slot(sf::VertexArray& va, Labels& labels, const AirplaneDraw& A, const Slot& sl, std::size_t k,
               const SkyLayout& L) {
  const fp::Airplane& ap = A.ap;
  const Pose& p = *sl.pose;
  // CG placed so that the fuselage is centred
  const double mid_body = A.body.bx(A.sz.x_nose_aft + 0.5 * A.sz.len);
  ToScreen S;
  S.c = V2(sl.r.left + sl.r.width * 0.47f - static_cast<float>(mid_body) * L.scale,
           sl.r.top + L.label_h + L.plane_h * 0.58f);
  S.scale = L.scale;
  S.ct = std::cos(p.theta);
  S.st = std::sin(p.theta);
  if (k == 0 || !L.superposed) {
    // horizon through the CG, and the flight-path direction (relative wind)
    dashed_line(va, {V2(sl.r.left + 6, S.c.y), V2(sl.r.left + sl.r.width - 6, S.c.y)}, 1.0f,
                sf::Color(150, 150, 146), 5.0f, 5.0f);
  }
  const double gamma = p.theta - p.alpha;
  const float vlen = static_cast<float>(A.body.bx(A.sz.x_nose_aft)) * L.scale + 26.0f;
  const V2 vdir(static_cast<float>(std::cos(gamma)), static_cast<float>(-std::sin(gamma)));
  draw_airplane(va, A, S, p, L.exaggeration, *sl.pal, sl.ghost);
  arrow(va, S.c + vdir * (vlen - 20.0f), S.c + vdir * vlen, 1.4f, with_alpha(sl.pal->line, 220));
  labels.add("V", S.c.x + vdir.x * vlen - 4.0f, S.c.y + vdir.y * vlen - 19.0f, 11, sl.pal->line);
  // gusts at the wing and the tail aerodynamic centres
  const V2 wing_ac = S(A.body.bx(ap.wing.h_ac * ap.wing.mac), ap.wing.z_ac);
  const V2 tail_ac = S(A.body.bx(ap.tail.x_ac), ap.tail.z_ac);
  gust_arrows(va, wing_ac, p.gust_w_wing, p.gust_u_wing, 6.0f);
  gust_arrows(va, tail_ac, p.gust_w_tail, p.gust_u_tail, 6.0f);
  if (std::abs(p.gust_w_wing) > 0.05)
    labels.add(fmt1("%.1f m/s", p.gust_w_wing), wing_ac.x + 6.0f, wing_ac.y + (p.gust_w_wing > 0 ? 22.0f : -36.0f), 11,
               kGust);
  if (std::abs(p.gust_w_tail) > 0.05)
    labels.add(fmt1("%.1f m/s", p.gust_w_tail), tail_ac.x + 6.0f, tail_ac.y + (p.gust_w_tail > 0 ? 22.0f : -36.0f), 11,
               kGust);
  slot_caption(labels, sl, k, L.superposed);
  tail_inset(va, labels, A, sl, k, L);
}

// Fractions of the MAC to the bar's pixels.
struct MacScale {
  double lo = 0.0, hi = 1.0;
  float x0 = 0, x1 = 1;
  float operator()(double f) const { return x0 + static_cast<float>((f - lo) / (hi - lo)) * (x1 - x0); }
};

// The neutral and maneuver points below the bar: labels in one row, spread so that none
// overlaps, each joined to its mark.
void point_marks(sf::VertexArray& va, Labels& labels, const MacScale& X, float by, float right, const MacMarks& marks) {
  struct M {
    double at;
    const char* label;
    sf::Color col;
  };
  std::vector<M> ms{{marks.np_fixed, "Nfix", kHeld.line},
                    {marks.np_free, "Nfree", kFree.line},
                    {marks.np_apparent, "Napp", kWarn},
                    {marks.mp_fixed, "Mfix", kHeld.surface},
                    {marks.mp_free, "Mfree", kFree.surface}};
  ms.erase(std::remove_if(ms.begin(), ms.end(), [](const M& m) { return !std::isfinite(m.at); }), ms.end());
  std::sort(ms.begin(), ms.end(), [](const M& a, const M& b) { return a.at < b.at; });
  std::vector<float> lw(ms.size()), lx(ms.size());
  float end = -1e9f;
  for (std::size_t i = 0; i < ms.size(); ++i) {
    lw[i] = labels.width(ms[i].label, 10);
    lx[i] = std::max(X(ms[i].at) - 0.5f * lw[i], end + 6.0f);
    end = lx[i] + lw[i];
  }
  const float over = end - right;
  if (over > 0)
    for (auto& x : lx) x -= over;
  for (std::size_t i = 0; i < ms.size(); ++i) {
    const M& m = ms[i];
    if (!std::isfinite(m.at)) continue;
    const float x = X(m.at);
    fill_convex(va, {V2(x, by + 5), V2(x + 4, by + 12), V2(x - 4, by + 12)}, m.col);
    const float cx = lx[i] + 0.5f * lw[i];
    thick_line(va, {V2(x, by + 12), V2(cx, by + 19)}, 1.0f, with_alpha(m.col, 150));
    labels.add(m.label, lx[i], by + 19, 10, m.col);
  }
}

// The MAC bar: the chord from its leading to its trailing edge, the CG envelope on it, the CG
// above it, the neutral and maneuver points below it.
void mac_bar(sf::VertexArray& va, Labels& labels, const sf::FloatRect& area, float strip_h, const MacMarks& marks) {
  const float y0 = area.top + area.height - strip_h;
  thick_line(va, {V2(area.left, y0), V2(area.left + area.width, y0)}, 1.0f, sf::Color(200, 196, 186));
  MacScale X;
  auto widen = [&](double v) {
    if (std::isfinite(v)) {
      X.lo = std::min(X.lo, v - 0.03);
      X.hi = std::max(X.hi, v + 0.03);
    }
  };
  widen(marks.cg);
  if (marks.have_points)
    for (double v : {marks.np_fixed, marks.np_free, marks.np_apparent, marks.mp_fixed, marks.mp_free}) widen(v);
  X.x0 = area.left + 92.0f;
  X.x1 = area.left + area.width - 30.0f;
  const float by = y0 + 26.0f;
  labels.add("MAC", area.left + 10.0f, by - 9.0f, 12, kInk, 0.0f, true);
  fill_convex(va, {V2(area.left + 10, by + 12), V2(area.left + 20, by + 12), V2(area.left + 20, by + 18),
                   V2(area.left + 10, by + 18)},
              sf::Color(160, 196, 170));
  labels.add("envelope", area.left + 24.0f, by + 8.0f, 10, sf::Color(60, 110, 76));
  fill_convex(va, {V2(X(0), by - 4), V2(X(1), by - 4), V2(X(1), by + 4), V2(X(0), by + 4)}, sf::Color(214, 211, 202));
  fill_convex(va,
              {V2(X(marks.envelope_forward), by - 4), V2(X(marks.envelope_aft), by - 4),
               V2(X(marks.envelope_aft), by + 4), V2(X(marks.envelope_forward), by + 4)},
              sf::Color(160, 196, 170));
  thick_line(va, {V2(X(0), by - 4), V2(X(1), by - 4), V2(X(1), by + 4), V2(X(0), by + 4)}, 1.0f, kMuted, true);
  for (int i = 1; i < 10; ++i) {
    const float x = X(i / 10.0);
    thick_line(va, {V2(x, by - 4), V2(x, by + (i == 5 ? 1.0f : -1.0f))}, 1.0f, kMuted);
  }
  labels.add("LE 0", X(0) - 4.0f, by - 7.0f, 10, kMuted, 1.0f);
  labels.add("1 TE", X(1) + 4.0f, by - 7.0f, 10, kMuted);
  // CG above the bar
  {
    const float x = X(marks.cg);
    fill_convex(va, {V2(x, by - 5), V2(x - 5, by - 14), V2(x + 5, by - 14)}, kCg);
    char b[48];
    std::snprintf(b, sizeof b, "CG %.3f", marks.cg);
    labels.add(b, x + 7, by - 25, 11, kCg, 0.0f, true);
  }
  if (marks.have_points) {
    point_marks(va, labels, X, by, area.left + area.width - 6.0f, marks);
    if (!marks.note.empty()) labels.add(marks.note, area.left + 10.0f, by + 22.0f, 10, kMuted);
  } else {
    labels.add("neutral points: " + (marks.missing.empty() ? std::string("not available in this build") : marks.missing),
               X(0.0), by + 14, 11, kWarn);
  }
}

}  // namespace

std::string find_font_file(bool bold) {
  const char* name = bold ? "DejaVuSans-Bold.ttf" : "DejaVuSans.ttf";
  for (const char* dir : {"/usr/share/fonts/truetype/dejavu/", "/usr/share/fonts/dejavu/",
                          "/usr/share/fonts/TTF/", "/usr/local/share/fonts/"}) {
    const std::string p = std::string(dir) + name;
    std::error_code ec;
    if (std::filesystem::exists(p, ec)) return p;
  }
  return {};
}

SideView::SideView() {
  const std::string f = find_font_file();
  font_ok_ = !f.empty() && font_.loadFromFile(f);
}

void SideView::draw(sf::RenderTarget& target, const sf::FloatRect& area, const fp::Airplane& ap, const Pose* held,
                    const Pose* free, bool superposed, double exaggeration, const MacMarks& marks) {
  const sf::Vector2u ts = target.getSize();
  sf::View view(sf::FloatRect(area.left, area.top, area.width, area.height));
  view.setViewport(sf::FloatRect(area.left / ts.x, area.top / ts.y, area.width / ts.x, area.height / ts.y));
  target.setView(view);

  sf::VertexArray va(sf::Triangles);
  Labels labels(font_ok_ ? &font_ : nullptr);

  // no fill of the whole area (every filled pixel costs a software renderer): a thin frame
  thick_line(va, {V2(area.left, area.top), V2(area.left + area.width, area.top), V2(area.left + area.width, area.top + area.height),
                  V2(area.left, area.top + area.height)},
             1.0f, sf::Color(214, 210, 200), true);

  const float strip_h = 64.0f;
  SkyLayout L;
  L.sky = sf::FloatRect(area.left, area.top, area.width, area.height - strip_h);
  L.superposed = superposed;
  L.exaggeration = exaggeration;
  const AirplaneDraw A{ap, Body{ap.mass.h_cg * ap.wing.mac}, sizes_of(ap)};
  const std::vector<Slot> slots = slots_of(L.sky, held, free, superposed);
  const float region_w = slots.back().r.width;
  L.label_h = superposed && free ? 68.0f : slots.back().r.width < 300.0f ? 42.0f : 36.0f;
  L.inset_h = 50.0f;
  L.plane_h = L.sky.height - L.label_h - L.inset_h;
  L.scale = static_cast<float>(std::min(0.74 * region_w / A.sz.len, L.plane_h / (0.42 * A.sz.len)));
  for (std::size_t k = 0; k < slots.size(); ++k)
    if (slots[k].pose) draw_slot(va, labels, A, slots[k], k, L);
  char ex[80];
  std::snprintf(ex, sizeof ex, "deflections drawn ×%.0f, attitude true", exaggeration);
  labels.add(ex, L.sky.left + L.sky.width - 8.0f, L.sky.top + L.sky.height - 16.0f, 10, kMuted, 1.0f);
  mac_bar(va, labels, area, strip_h, marks);

  target.draw(va);
  labels.draw(target);
  target.setView(target.getDefaultView());
}

}  // namespace fpui
