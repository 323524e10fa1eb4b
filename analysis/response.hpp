// response.hpp — the numbers that compare a held run with a free one: peaks, time to peak,
// damping and settling of a gust response, and the statistics of a run in turbulence.
//
// Definitions (stated here, in the JSON and in docs/gusts.md):
//  * Increments are measured from the trim at t = 0 (the first sample of the run).
//  * Onset: the first sample at which the gust at the wing is not zero (0 without gusts).
//  * Peak load-factor increment: the largest |n - n_trim| (signed value kept); time to peak:
//    its time minus the onset.
//  * Peak angle of attack and its margin to the stall: the largest alpha, and alpha_stall
//    (angle of CLmax of the wing-body lift curve, model/trim.hpp wing_stall) minus it.
//  * Peak elevator float: the largest |delta_e - delta_e,trim|.
//  * Peak stick force: held, the largest |stick force - trim force|; free, the largest force
//    the pilot would need to hold the elevator where it floated (the hold_force channel).
//  * Damping: the logarithmic decrement of the pitch rate after the disturbances are over
//    (scenario/gust_timing.hpp; analysis/signal.hpp log_decrement_damping; common practice). Pitch rate is used because
//    the short period shows in it and the phugoid hardly does.
//  * Settling time: from the onset to the last time |q| is above 5 % of its peak (the 5 %
//    band of control practice, e.g. Ogata, Modern Control Engineering, sec. 5-3).
//  * Turbulence statistics over [turbulence start + fade-in, end]: RMS of the increments from
//    trim of load factor, angle of attack, pitch rate, elevator and stick force (free: the
//    hold force), and exceedance counts: how many times |increment| rises above each level.
#pragma once

#include <cmath>
#include <array>
#include <string>
#include <vector>

#include <nlohmann/json_fwd.hpp>

#include "run/run.hpp"
#include "scenario/gust_timing.hpp"

namespace fp {

struct ResponseMetrics {
  double onset = 0;             // [s]
  double peak_dn = 0;           // signed, largest |n - n_trim| [-]
  double time_peak_dn = 0;      // [s] absolute
  double time_to_peak = 0;      // [s] from the onset
  double peak_alpha = 0;        // [rad]
  double alpha_trim = 0;        // [rad]
  double alpha_stall = 0;       // [rad]
  double stall_margin = 0;      // alpha_stall - peak_alpha [rad]
  double peak_float = 0;        // signed, largest |delta_e - trim| [rad]
  double peak_force = 0;        // signed, largest |F - F_trim| (free: hold force) [N]
  double damping = NAN;         // log-decrement damping ratio of q after the gusts [-]
  double settling_time = NAN;   // from the onset [s]; NaN when |q| never leaves the band
  bool settled = true;          // false when q is still outside the band at the end
};

// Channels of the turbulence statistics and their exceedance levels (SI).
enum StatChannel : std::size_t { st_load_factor, st_alpha, st_q, st_elevator, st_force, st_count };
struct StatChannelInfo {
  const char* name;             // JSON and CSV name
  const char* unit;             // display unit
  double display;               // SI * display = shown
  std::array<double, 3> levels; // SI
};
const StatChannelInfo& stat_channel_info(std::size_t c);

struct TurbulenceStats {
  bool active = false;
  double from = 0, to = 0;      // window [s]
  std::array<double, st_count> rms{};                  // SI
  std::array<std::array<long, 3>, st_count> exceed{};  // counts per level
};

struct CaseSummary {
  ResponseMetrics response;
  TurbulenceStats turbulence;
  bool departed = false;
  double departure_time = 0;
  std::string departure_criterion;  // run/run.hpp departure criteria ("" when not departed)
  std::string departure_reason;
  bool gust_seen = false;           // a gust reached the wing before the run ended
};

// `gusts_over`: the moment the scenario's disturbances are over (disturbances_over_time) [s];
// `stats_from`: start of the turbulence window (negative: no turbulence) [s].
CaseSummary summarize_case(const CaseResult& c, double alpha_stall, double gusts_over, double stats_from);

// The moment the disturbances are over (`gusts_over` above): scenario/gust_timing.hpp
// disturbances_over_time, the one definition.

// JSON (display units in the key names) and terminal tables, held beside free.

}  // namespace fp
