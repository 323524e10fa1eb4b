// response.cpp — gust-response metrics and turbulence statistics (see response.hpp).
#include "analysis/response.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/units.hpp"
#include "analysis/signal.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();

const std::array<StatChannelInfo, st_count> kStat{{
    {"load_factor", "-", 1.0, {0.25, 0.5, 1.0}},
    {"alpha", "deg", 1.0 / units::deg, {1.0 * units::deg, 2.0 * units::deg, 4.0 * units::deg}},
    {"pitch_rate", "deg/s", 1.0 / units::deg, {2.0 * units::deg, 5.0 * units::deg, 10.0 * units::deg}},
    {"elevator", "deg", 1.0 / units::deg, {0.5 * units::deg, 1.0 * units::deg, 2.0 * units::deg}},
    {"stick_force", "N", 1.0, {2.0, 5.0, 10.0}},
}};

}  // namespace

const StatChannelInfo& stat_channel_info(std::size_t c) { return kStat.at(c); }

CaseSummary summarize_case(const CaseResult& c, double alpha_stall, double gusts_over, double stats_from) {
  CaseSummary out;
  out.departed = c.departure.departed;
  out.departure_time = c.departure.time;
  out.departure_criterion = c.departure.criterion;
  out.departure_reason = c.departure.reason;
  const Trace& tr = c.trace;
  const std::size_t n = tr.size();
  ResponseMetrics& m = out.response;
  m.alpha_stall = alpha_stall;
  if (n == 0) return out;
  const auto& t = tr.ch[ch_time];
  const bool free = c.rc.stick == Stick::free;
  const auto& force = tr.ch[free ? ch_hold_force : ch_stick_force];
  const double n0 = tr.ch[ch_load_factor][0], de0 = tr.ch[ch_elevator][0], f0 = force[0];
  for (std::size_t i = 0; i < n; ++i)
    if (std::abs(tr.ch[ch_gust_w_wing][i]) > 1e-12 || std::abs(tr.ch[ch_gust_u_wing][i]) > 1e-12) {
      m.onset = t[i];
      out.gust_seen = true;
      break;
    }
  m.peak_alpha = m.alpha_trim = tr.ch[ch_alpha][0];
  for (std::size_t i = 0; i < n; ++i) {
    const double dn = tr.ch[ch_load_factor][i] - n0;
    if (std::abs(dn) > std::abs(m.peak_dn)) {
      m.peak_dn = dn;
      m.time_peak_dn = t[i];
    }
    m.peak_alpha = std::max(m.peak_alpha, tr.ch[ch_alpha][i]);
    const double dde = tr.ch[ch_elevator][i] - de0;
    if (std::abs(dde) > std::abs(m.peak_float)) m.peak_float = dde;
    const double df = force[i] - f0;
    if (std::abs(df) > std::abs(m.peak_force)) m.peak_force = df;
  }
  m.time_to_peak = m.time_peak_dn - m.onset;
  m.stall_margin = alpha_stall - m.peak_alpha;

  const bool turbulent = stats_from >= 0.0;
  if (!turbulent && !c.departure.departed) {
    const auto& q = tr.ch[ch_q];
    m.damping = log_decrement_damping(t, q, std::max(gusts_over, m.onset));
    double qmax = 0.0;
    for (std::size_t i = 0; i < n; ++i)
      if (t[i] >= m.onset) qmax = std::max(qmax, std::abs(q[i]));
    if (qmax > 0.0) {
      std::size_t last = 0;
      bool any = false;
      for (std::size_t i = 0; i < n; ++i)
        if (t[i] >= m.onset && std::abs(q[i]) > 0.05 * qmax) {
          last = i;
          any = true;
        }
      m.settled = any && last + 1 < n;
      m.settling_time = m.settled ? t[last + 1] - m.onset : nan_;
    }
  } else {
    m.settled = false;
  }

  if (turbulent) {
    TurbulenceStats& s = out.turbulence;
    s.active = true;
    s.from = stats_from;
    s.to = t.back();
    std::array<double, st_count> sum2{};
    std::array<std::array<bool, 3>, st_count> above{};
    long count = 0;
    bool first = true;
    for (std::size_t i = 0; i < n; ++i) {
      if (t[i] < stats_from) continue;
      const std::array<double, st_count> x{tr.ch[ch_load_factor][i] - n0, tr.ch[ch_alpha][i] - tr.ch[ch_alpha][0],
                                           tr.ch[ch_q][i] - tr.ch[ch_q][0], tr.ch[ch_elevator][i] - de0,
                                           force[i] - f0};
      ++count;
      for (std::size_t k = 0; k < st_count; ++k) {
        sum2[k] += x[k] * x[k];
        for (std::size_t l = 0; l < 3; ++l) {
          const bool a = std::abs(x[k]) > kStat[k].levels[l];
          if (a && !above[k][l] && !first) ++s.exceed[k][l];
          above[k][l] = a;
        }
      }
      first = false;
    }
    for (std::size_t k = 0; k < st_count; ++k) s.rms[k] = count > 0 ? std::sqrt(sum2[k] / static_cast<double>(count)) : nan_;
  }
  return out;
}

}  // namespace fp
