// limit_cycle.cpp — sustained oscillations in a run (see limit_cycle.hpp).
#include "analysis/limit_cycle.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <vector>

namespace fp {

namespace {

// Half peak-to-peak of channel values between samples i0 and i1 (inclusive).
double half_range(const std::vector<double>& y, std::size_t i0, std::size_t i1) {
  const auto [lo, hi] = std::minmax_element(y.begin() + static_cast<std::ptrdiff_t>(i0),
                                            y.begin() + static_cast<std::ptrdiff_t>(i1) + 1);
  return 0.5 * (*hi - *lo);
}

}  // namespace

LimitCycle detect_limit_cycle(const Trace& tr, double quiet_from, bool departed) {
  LimitCycle r;
  const std::size_t n = tr.size();
  if (departed || n < 8) return r;
  const auto& t = tr.ch[ch_time];
  const auto& q = tr.ch[ch_q];
  const double t0 = std::max(quiet_from, 0.5 * (t.front() + t.back()));
  r.window_start = t0;
  std::size_t a = 0;
  while (a < n && t[a] < t0) ++a;
  if (n - a < 8) return r;
  // Cycles are cut at the upward zero crossings of the pitch rate's first difference (its
  // acceleration, up to the sample step): differencing weakens a slow motion underneath (the
  // phugoid) by its frequency ratio, so that a fast cycle is not lost in its drift.
  std::vector<double> tc;
  std::vector<std::size_t> ic;
  for (std::size_t i = a + 2; i < n; ++i) {
    const double y0 = q[i - 1] - q[i - 2], y1 = q[i] - q[i - 1];
    if (y0 < 0.0 && y1 >= 0.0) {
      tc.push_back(t[i - 1] + (t[i] - t[i - 1]) * (-y0) / (y1 - y0));
      ic.push_back(i);
    }
  }
  const int cycles = static_cast<int>(tc.size()) - 1;
  if (cycles < kMinCycles) return r;
  std::vector<double> per(static_cast<std::size_t>(cycles)), amp(static_cast<std::size_t>(cycles));
  double Ae = 0.0, An = 0.0;
  for (int k = 0; k < cycles; ++k) {
    const auto ks = static_cast<std::size_t>(k);
    per[ks] = tc[ks + 1] - tc[ks];
    amp[ks] = half_range(q, ic[ks], ic[ks + 1]);
    Ae += half_range(tr.ch[ch_elevator], ic[ks], ic[ks + 1]) / cycles;
    An += half_range(tr.ch[ch_load_factor], ic[ks], ic[ks + 1]) / cycles;
  }
  // a steady period: every cycle within the share of the mean (a motion with impacts may
  // alternate between two cycle lengths, which is still one sustained oscillation)
  const double T = (tc.back() - tc.front()) / cycles;
  for (double p : per)
    if (std::abs(p - T) > kPeriodShare * T) return r;
  // a steady amplitude: no trend (below), and the mean of each half of the cycles alike
  const double A = std::accumulate(amp.begin(), amp.end(), 0.0) / cycles;
  if (!(A >= kFloorQ)) return r;
  const auto half = static_cast<std::ptrdiff_t>(cycles / 2);
  const double A1 = std::accumulate(amp.begin(), amp.begin() + half, 0.0) / static_cast<double>(half);
  const double A2 = std::accumulate(amp.end() - half, amp.end(), 0.0) / static_cast<double>(half);
  if (std::abs(A2 - A1) > kHalvesShare * A) return r;
  const auto [amin, amax] = std::minmax_element(amp.begin(), amp.end());
  r.amplitude_spread = 0.5 * (*amax - *amin) / A;
  // least-squares slope of ln(amplitude) against the cycle index
  double sx = 0, sy = 0, sxx = 0, sxy = 0;
  for (int k = 0; k < cycles; ++k) {
    const double x = k, y = std::log(amp[static_cast<std::size_t>(k)]);
    sx += x;
    sy += y;
    sxx += x * x;
    sxy += x * y;
  }
  const double slope = (cycles * sxy - sx * sy) / (cycles * sxx - sx * sx);
  r.trend_per_cycle = std::expm1(slope);
  if (std::abs(r.trend_per_cycle) > kTrendShare) return r;
  r.found = true;
  r.cycles = cycles;
  r.period = T;
  r.q_amplitude = A;
  r.elevator_amplitude = Ae;
  r.load_factor_amplitude = An;
  return r;
}

}  // namespace fp
