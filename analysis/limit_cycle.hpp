// limit_cycle.hpp — a sustained oscillation in a run, found from its time history.
//
// Friction and free play can sustain an oscillation in an airplane whose linear model is stable
// (a limit cycle: Gelb and Vander Velde, Multiple-Input Describing Functions and Nonlinear
// System Design, 1968; Slotine and Li, Applied Nonlinear Control, ch. 5). A run has settled into
// one when, over the quiet part of the run (after its disturbances, and its later half), the
// pitch rate goes through its cycles (cut where its first difference crosses zero upwards, so
// that a slow drift underneath, such as the phugoid, does not hide a fast cycle) at a steady
// period (each cycle within `kPeriodShare` of the mean: a motion with impacts at the ends of a
// free play may alternate between two cycle lengths) for at least `kMinCycles` cycles, and its
// amplitude neither grows nor decays: the fitted trend of the cycle amplitudes below
// `kTrendShare` a cycle, and the mean amplitudes of the first and second halves of the cycles
// within `kHalvesShare` of each other. The amplitudes are the mean over the cycles of half the
// peak-to-peak value within each cycle; `amplitude_spread` says how much single cycles differ.
// Oscillations of the pitch rate below `kFloorQ` are not reported (a floor of detection, not of
// physics: the output says so).
#pragma once

#include "run/run.hpp"

namespace fp {

inline constexpr int kMinCycles = 4;
inline constexpr double kPeriodShare = 0.25;     // [-]
inline constexpr double kTrendShare = 0.01;      // [-] per cycle
inline constexpr double kHalvesShare = 0.10;     // [-]
inline constexpr double kFloorQ = 1.7453292519943295e-4;  // 0.01 deg/s [rad/s]

struct LimitCycle {
  bool found = false;
  double elevator_amplitude = 0;    // half peak-to-peak [rad]
  double q_amplitude = 0;           // [rad/s]
  double load_factor_amplitude = 0; // [-]
  double period = 0;                // [s]
  int cycles = 0;                   // whole cycles measured
  double window_start = 0;          // [s] start of the part of the run read
  double trend_per_cycle = 0;       // relative change of the amplitude per cycle (fitted) [-]
  double amplitude_spread = 0;      // half the range of the cycle amplitudes over their mean [-]
};

// `quiet_from`: the time the run's disturbances are over (scenario/gust_timing.hpp); the window
// is the later of that and the run's half-time, to its end. Runs that departed have none.
LimitCycle detect_limit_cycle(const Trace& tr, double quiet_from, bool departed);

}  // namespace fp
