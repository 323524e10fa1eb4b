// gust_timing.cpp — see gust_timing.hpp.
#include "scenario/gust_timing.hpp"

#include <algorithm>
#include <cmath>

#include "model/dynamics.hpp"

namespace fp {

double gust_closing_speed(const Scenario& s) {
  return s.condition.airspeed * std::cos(s.condition.flight_path) + s.gust_front_speed;
}

double disturbances_over_time(const Scenario& s) {
  const double V = gust_closing_speed(s);
  // CG to the tail a.c. along the body axis (the last point of the airplane to meet a gust)
  const Airplane& a = s.airplane;
  const double tail = tail_arm(a, a.mass.h_cg);
  double t = 0.0;
  for (const auto& g : s.gusts) {
    double len = 0.0;
    switch (g.shape) {
      case GustShape::one_minus_cosine: len = 2.0 * g.length; break;
      case GustShape::train: len = std::max(0, g.count - 1) * g.spacing + 2.0 * g.length; break;
      case GustShape::ramp: len = g.length; break;
      case GustShape::sharp_edge: len = 0.0; break;
    }
    t = std::max(t, (g.start + len + tail) / V);
  }
  for (const auto& e : s.events) t = std::max(t, e.time + e.duration);
  return t;
}

}  // namespace fp
