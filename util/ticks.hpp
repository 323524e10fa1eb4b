// ticks.hpp — axis ticks at 1, 2 or 5 times a power of ten: the one home for the report's SVG
// plots, the window's plots and the report's tables of steps.
//
// The step is 1, 2, 5 or 10 times the power of ten below the raw step (range / target), the
// "1-2-5" series of common practice for graph scales. Two ways of choosing among them:
//   nearest: the member nearest the raw step on a log scale (about `target` intervals; the
//            switch points 1.5, 3.5 and 7.5 are those the report has always used),
//   at_most: the smallest member not below the raw step (never more than `target` intervals).
// Tick values are whole multiples of the step inside [lo, hi] (a tolerance of 1e-9 step at the
// ends), with -0 written as 0.
#pragma once

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

namespace fp {

// The extent of some data: the smallest and largest finite value added (empty until one is).
struct Extent {
  double lo = std::numeric_limits<double>::infinity();
  double hi = -std::numeric_limits<double>::infinity();
  void add(double v) {
    if (!std::isfinite(v)) return;
    lo = std::min(lo, v);
    hi = std::max(hi, v);
  }
  bool empty() const { return !(lo <= hi); }
};

enum class TickFit { nearest, at_most };

// The tick step for `target` intervals over `range` (> 0, finite); 1 for a bad range.
inline double tick_step(double range, int target, TickFit fit) {
  if (!(range > 0.0) || !std::isfinite(range)) return 1.0;
  const double raw = range / std::max(1, target);
  const double p = std::pow(10.0, std::floor(std::log10(raw)));
  const double m = raw / p;
  if (fit == TickFit::nearest) return (m < 1.5 ? 1.0 : m < 3.5 ? 2.0 : m < 7.5 ? 5.0 : 10.0) * p;
  for (double k : {1.0, 2.0, 5.0}) {
    if (k * p >= raw * (1.0 - 1e-12)) return k * p;
  }
  return 10.0 * p;
}

// The multiples of `step` inside [lo, hi] (at most 1000 of them).
inline std::vector<double> tick_values(double lo, double hi, double step) {
  std::vector<double> v;
  if (!(hi >= lo) || !std::isfinite(lo) || !std::isfinite(hi) || !(step > 0.0)) return v;
  const double a = std::ceil(lo / step - 1e-9), b = std::floor(hi / step + 1e-9);
  for (double k = a; k <= b && v.size() < 1000; k += 1.0) {
    const double x = k * step;
    v.push_back(std::abs(x) < 1e-12 * step ? 0.0 : x);
  }
  return v;
}

}  // namespace fp
