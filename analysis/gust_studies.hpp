// gust_studies.hpp — gust studies of a scenario: the design-rule load factor printed beside the simulation's, the tuned-gust search
// and the multi-seed turbulence runs.
#pragma once

#include <cmath>
#include <memory>
#include <string>
#include <vector>

#include "model/design_gust.hpp"
#include "model/turbulence.hpp"
#include "analysis/response.hpp"
#include "run/gust_field.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"

namespace fp {

// The light-airplane gust rule's load factor for each [[gust]] with rule derived_vc or
// derived_vd, for comparison with the simulation (model/design_gust.hpp).
struct RuleEstimate {
  std::size_t gust = 0;         // index in Scenario::gusts
  std::string rule;             // "derived_vc" or "derived_vd"
  double U_de = 0;              // [m/s EAS]
  double V_e = 0;               // [m/s EAS]
  double lift_slope = 0;        // whole airplane, elevator fixed [1/rad]
  GustLoadEstimate estimate;    // mu_g, K_g, delta n
  double sharp_edge = 0;        // quasi-steady sharp-edged delta n (K_g = 1) [-]
};
std::vector<RuleEstimate> rule_estimates(const Scenario& s);

// Tuned-gust search: the gradient distance H of the scenario's tuned gust that gives the
// largest peak load-factor increment, held and free separately. A log-spaced grid over
// [tune_min, tune_max], then Brent's minimisation of -peak in log H between the best point's
// neighbours (Boost.Math brent_find_minima; NumericalFailure when it does not converge).
// A rule gust keeps its rule at every H (gradient_distance: the amplitude follows H^(1/6)).
struct TunePoint {
  double H = 0;                 // [m]
  double amplitude = 0;         // [m/s TAS]
  double peak_held = NAN, peak_free = NAN;  // peak |delta n| [-]
};
struct TuneResult {
  bool active = false;
  std::size_t gust = 0;
  std::vector<TunePoint> grid;  // the grid (first grid_size entries), then the refinement points
  std::size_t grid_size = 0;
  double H_held = NAN, peak_held = NAN, H_free = NAN, peak_free = NAN;
};
// Index of the tuned gust, or -1.
int tuned_gust_index(const Scenario& s);
TuneResult tune_gust(const Scenario& s, ControlsChoice which, int jobs, bool progress);
// The scenario with the tuned gust at gradient distance H.
Scenario with_gust_length(const Scenario& s, std::size_t gust, double H);

// Multi-seed turbulence runs: each seed held and free, in parallel.
struct SeedRun {
  long seed = 0;
  bool has_held = false, has_free = false;
  CaseSummary held, free;
};
struct SeedsResult {
  std::vector<SeedRun> runs;    // in seed order
  double seconds = 0;           // wall-clock time of the runs [s]
};
SeedsResult run_seeds(const Scenario& s, ControlsChoice which, int seeds, int jobs, bool progress);

// `floatpitch run` with a tuned gust: the search, then each case run at its own worst H
// (held and free may differ). `tune` receives the search.
RunOutcome run_scenario_tuned(const Scenario& s, ControlsChoice which, int jobs, bool progress, TuneResult& tune);

// The scenario a case actually flew (a tuned gust at that case's gradient distance).
Scenario case_scenario(const Scenario& s, const TuneResult* tune, Stick st);

}  // namespace fp
