// sweep.hpp — parameter sweeps, random sampling for uncertainty, and the hands-off
// divergence boundary.
//
// A sweep varies one or two scenario keys over a grid (KEY=FROM:TO:STEP), or samples keys from
// distributions (normal, uniform) with a seeded generator. Each point is independent: trim,
// static margins (closed form and model), modes held and free, and optionally a time-domain
// run held and free. Points run in parallel on a pool of threads; results are stored by point
// index, so the numbers and row order do not depend on the number of threads. A point that
// cannot be set or trimmed is a row with its reason.
//
// Sharding: --shard K/N keeps the points whose index i satisfies i % N == K; `merge` joins the
// shards' sweep.json files and recomputes everything derived from the whole set (the boundary
// and the bands) exactly as a single run would.
//
// Boundary (when the CG is varied): for the stick held and free, the CG at which the airplane
// starts to diverge, three ways: closed form (h_n held; the apparent free point h_app free),
// eigenvalue (the deciding root of model/linear.hpp deciding_root crossing zero, bracketed on
// the grid then refined by Boost.Math TOMS 748), time domain (growth rate of the airplane's own
// motion read from two runs, by the matrix pencil, crossing zero, bracketed then bisected; see
// time_domain_growth). Besides that first crossing, the static crossing: the CG where a REAL
// root passes through zero, i.e. where det A with the neutral roots set aside (the product of
// the counted roots, the constant term of the characteristic polynomial) changes sign
// (Routh-Hurwitz: a real root crosses zero exactly when that coefficient does; a complex pair
// crosses when a Hurwitz determinant does). The closed form (a static criterion) is compared
// with the static crossing; the first crossing (eigenvalue) with the time domain. When the first
// crossing is a complex pair, the airplane diverges there (oscillatory, with its period), aft
// of which the static crossing is only where a real root follows.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include <nlohmann/json_fwd.hpp>

#include "scenario/scenario.hpp"

namespace fp {

struct Mode;  // model/linear.hpp

struct VarySpec {
  std::string key;     // as given (alias allowed)
  double from = 0, to = 0, step = 0;  // SI
};

enum class Distribution { normal, uniform };
struct SampleSpec {
  std::string key;
  Distribution dist = Distribution::normal;
  double a = 0, b = 0;  // normal: mean, sd; uniform: low, high (SI)
};

struct SweepSpec {
  std::string scenario;              // path
  std::vector<std::string> set;      // --set overrides
  std::vector<VarySpec> vary;        // grid (at most two)
  std::vector<SampleSpec> sample;    // random sampling
  int samples = 0;
  std::uint64_t seed = 1;
  double run_seconds = 0;            // 0: no time-domain run per point
  double boundary_run_seconds = 120; // runs for the time-domain boundary (at least this long)
  int shard_k = 0, shard_n = 1;
  bool find_boundary = true;         // refine the divergence boundary when the CG is varied
  bool time_domain = true;           // with the time-domain method (runs; the slow part)
};

// Parse "KEY=FROM:TO:STEP" (values may carry units: "cg=0.30:0.42:0.005",
// "condition.airspeed=90 kt:130 kt:10 kt"). Throws ScenarioError (origin "--vary").
VarySpec parse_vary(const Scenario& s, const std::string& text);
// Parse "KEY=normal(MEAN,SD)" or "KEY=uniform(LO,HI)". Throws ScenarioError (origin "--sample").
SampleSpec parse_sample(const Scenario& s, const std::string& text);

struct PointResult {
  long index = 0;
  std::vector<double> inputs;        // SI values of the varied/sampled keys
  bool ok = false;
  std::string reason;                // when not ok; on a trimmed point, why a side is missing
  double trim_alpha_deg = 0, trim_elevator_deg = 0, trim_tab_deg = 0;  // [deg] (kept in the file's unit)
  double np_fixed_cf = 0, np_free_cf = 0, np_apparent_cf = 0, np_fixed = 0, np_free = 0;
  double cg = 0;
  double force_gradient = 0;         // [N/(m/s)] model, tab fixed
  double max_real_held = 0, max_real_free = 0;       // real part of the deciding root [1/s]
  // static indicator: -prod(-root) over the counted roots (pairs as |root|^2), i.e. -(-1)^n det A
  // with the neutral roots set aside: < 0 while no real root is positive, > 0 with an odd number
  double static_held = 0, static_free = 0;
  std::string mode_held, mode_free;                   // its mode
  std::string set_aside_held, set_aside_free;         // roots set aside and why ("" when none)
  double sp_damping_held = 0, sp_damping_free = 0;   // NaN when no short-period pair
  double sp_frequency_held = 0, sp_frequency_free = 0;
  bool ran = false;
  bool diverged_held = false, diverged_free = false;
  double divergence_time_held = 0, divergence_time_free = 0;  // NaN when none
  double peak_dn_held = 0, peak_dn_free = 0;          // max |n - 1|
  double peak_dalpha_held_deg = 0, peak_dalpha_free_deg = 0;  // max |alpha - alpha_trim| [deg]
  double growth_held = 0, growth_free = 0;            // matrix-pencil rate [1/s]
};

struct Boundary {
  double closed_form = 0, eigenvalue = 0, time_domain = 0;  // fractions of MAC (NaN: not found)
  double closed_form_aerodynamic = 0;                       // free: h'_n without the speed term
  double static_crossing = 0;        // CG where a real root crosses zero (NaN: none in the range)
  bool closed_form_applies = true;   // false when no static crossing was found to compare it with
  std::string closed_form_note;      // why not, or a warning when the first crossing is oscillatory
  std::string crossing_mode;         // the deciding root's mode just aft of the eigenvalue crossing
  bool crossing_oscillatory = false; // that root is a complex pair
  double crossing_period = 0;        // its period [s] (NaN when real)
  std::string static_mode;           // the real root's mode just aft of the static crossing
  std::string set_aside;             // roots set aside there, with the reason
  std::string time_domain_check;     // whether the time-domain boundary holds for tenfold settings
  std::string no_crossing;           // when the deciding root crosses nowhere in the range: stable
                                     // (or unstable) at every CG that could be linearised, and where
                                     // it could not ("" when it crosses)
  std::string error;                 // why a method failed ("" when none did)
};

struct SweepResult {
  SweepSpec spec;
  std::vector<std::string> input_keys;
  long total_points = 0;             // before sharding
  std::vector<PointResult> points;   // sorted by index
  bool has_boundary = false;
  Boundary held, free;
};

// Run the sweep; progress on standard error (a bar on a terminal, plain lines otherwise).
// Throws ScenarioError for a bad spec.
SweepResult run_sweep(const SweepSpec& spec, int jobs, bool progress);

// Recompute the boundary from a complete set of points (used by run_sweep and merge).
void compute_boundary(SweepResult& r, int jobs);


// Min, 5th, 50th and 95th percentile and max of the finite values (linear interpolation between
// order statistics); used for the uncertainty bands of sweeps and of the report.
struct Band {
  double min, p5, p50, p95, max;  // NaN when there is no finite value
  long n = 0;                     // number of finite values
};
Band band_of(std::vector<double> v);

// The static indicator of a set of modes (see PointResult::static_held): -prod(-root) over the
// roots that are not neutral, a complex pair counted once as |root|^2.
double static_indicator(const std::vector<Mode>& modes);

// Evaluate one point (exposed for tests).
PointResult evaluate_point(const Scenario& base, const std::vector<std::string>& keys,
                           const std::vector<double>& values, double run_seconds, long index);

// Growth rate of the airplane's own motion [1/s], held or free, at a scenario (time domain): the
// difference between a run with a small probe gust after the scenario's own disturbances and a
// run without it, read by the matrix pencil about a constant offset (see sweep.cpp).
// `tol_scale` multiplies the integration tolerances (1e-9 relative, 1e-10 absolute).
// Throws NumericalFailure, TrimError.
double time_domain_growth(const Scenario& s, bool free, double seconds, double tol_scale = 1.0);

}  // namespace fp
