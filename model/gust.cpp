// gust.cpp — sampling of the frozen gust field (see gust.hpp).
#include "gust.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace fp {

double gust_shape_value(const DiscreteGust& g, double s) {
  if (s < 0.0) return 0.0;
  switch (g.shape) {
    case GustShape::one_minus_cosine:
      if (s > 2.0 * g.length) return 0.0;
      return 0.5 * g.amplitude * (1.0 - std::cos(std::numbers::pi * s / g.length));
    case GustShape::sharp_edge:
      return g.amplitude;
    case GustShape::ramp:
      return s >= g.length ? g.amplitude : g.amplitude * s / g.length;
    case GustShape::train: {
      if (g.count < 1 || !(g.spacing > 0.0)) return 0.0;
      // the gusts k whose span [k spacing, k spacing + 2H] contains s
      const double last = std::min(std::floor(s / g.spacing), static_cast<double>(g.count - 1));
      const double first = std::max(0.0, std::ceil((s - 2.0 * g.length) / g.spacing));
      double v = 0.0;
      for (double k = first; k <= last; k += 1.0) {
        const double sk = s - k * g.spacing;
        v += 0.5 * g.amplitude * (1.0 - std::cos(std::numbers::pi * sk / g.length));
      }
      return v;
    }
  }
  return 0.0;
}

namespace {

// Second derivatives of the natural cubic spline through y (uniform spacing dx): the
// tridiagonal system m_{i-1} + 4 m_i + m_{i+1} = 6 (y_{i-1} - 2 y_i + y_{i+1}) / dx^2,
// m_0 = m_{n-1} = 0, solved by the Thomas algorithm (de Boor, A Practical Guide to Splines,
// ch. IV; Press et al., Numerical Recipes, sec. 3.3).
std::vector<double> spline_second_derivatives(const std::vector<double>& y, double dx) {
  const std::size_t n = y.size();
  std::vector<double> m(n, 0.0);
  if (n < 3) return m;
  std::vector<double> c(n, 0.0), d(n, 0.0);
  const double k = 6.0 / (dx * dx);
  for (std::size_t i = 1; i + 1 < n; ++i) {
    const double rhs = k * (y[i - 1] - 2.0 * y[i] + y[i + 1]);
    const double denom = 4.0 - (i > 1 ? c[i - 1] : 0.0);
    c[i] = 1.0 / denom;
    d[i] = (rhs - (i > 1 ? d[i - 1] : 0.0)) / denom;
  }
  for (std::size_t i = n - 2; i >= 1; --i) {
    m[i] = d[i] - c[i] * m[i + 1];
    if (i == 1) break;
  }
  return m;
}

// The record's value at fractional index f (0 <= f, i + 1 < size).
inline double read(const std::vector<double>& y, const std::vector<double>& m, std::size_t i, double a,
                   double dx, bool spline) {
  const double lin = y[i] + a * (y[i + 1] - y[i]);
  if (!spline) return lin;
  // cubic spline between samples i and i+1 (Numerical Recipes eq. 3.3.3)
  const double b = 1.0 - a;
  return lin + ((b * b * b - b) * m[i] + (a * a * a - a) * m[i + 1]) * (dx * dx) / 6.0;
}

}  // namespace

void TurbulenceRecord::prepare_spline() {
  u2 = spline_second_derivatives(u, dx);
  w2 = spline_second_derivatives(w, dx);
}

GustSample GustField::at(double X, double t) const {
  const double xs = X + front_speed * t;
  GustSample out;
  for (const auto& g : gusts) {
    const double v = gust_shape_value(g, xs - g.start);
    if (g.component == GustComponent::vertical)
      out.w += v;
    else
      out.u += v;
  }
  if (turbulence) {
    const auto& r = *turbulence;
    const double f = (xs - r.x0) / r.dx;
    const std::size_t n = std::max(r.u.size(), r.w.size());
    if (f >= 0.0 && f < static_cast<double>(n)) {
      const auto i = static_cast<std::size_t>(f);
      if (i + 1 < n) {
        const double a = f - static_cast<double>(i);
        const bool spline = r.interpolation == Interpolation::cubic_spline;
        if (!r.w.empty()) out.w += read(r.w, r.w2, i, a, r.dx, spline && r.w2.size() == r.w.size());
        if (!r.u.empty()) out.u += read(r.u, r.u2, i, a, r.dx, spline && r.u2.size() == r.u.size());
      }
    }
  }
  return out;
}

}  // namespace fp
