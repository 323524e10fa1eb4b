// gust.cpp — sampling of the frozen gust field (see gust.hpp).
#include "gust.hpp"

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
  }
  return 0.0;
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
    if (f >= 0.0 && !r.w.empty()) {
      const auto i = static_cast<std::size_t>(f);
      if (i + 1 < r.w.size()) {
        const double a = f - static_cast<double>(i);
        out.w += r.w[i] + a * (r.w[i + 1] - r.w[i]);
        if (i + 1 < r.u.size()) out.u += r.u[i] + a * (r.u[i + 1] - r.u[i]);
      }
    }
  }
  return out;
}

}  // namespace fp
