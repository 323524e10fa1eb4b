// gusts.hpp — the gust and turbulence side of a scenario: the turbulence record a run flies
// through, the design-rule load factor printed beside the simulation's, the tuned-gust search
// and the multi-seed turbulence runs.
#pragma once

#include <cmath>
#include <memory>
#include <string>
#include <vector>

#include <nlohmann/json_fwd.hpp>

#include "model/design_gust.hpp"
#include "model/turbulence.hpp"
#include "sim/response.hpp"
#include "sim/run.hpp"
#include "sim/scenario.hpp"

namespace fp {

// What the scenario's [turbulence] table asks for, resolved: intensities and scale lengths
// from the height and severity (or the overrides), the record's extent and spacing.
struct ResolvedTurbulence {
  bool active = false;
  TurbulenceSpec spec;          // what make_turbulence_record generates (seed included)
  TurbulenceLevels tables;      // the published values before overrides
  double probability = 0;       // probability of exceedance used [-]
  double height = 0;            // height above ground used [m]
  double closing_speed = 0;     // speed at which the airplane moves through the field [m/s]
  double stats_from = 0;        // statistics start here: entry plus fade-in [s]
};
ResolvedTurbulence resolve_turbulence(const Scenario& s);

// The record for the scenario's [turbulence] (null when turbulence.model = "none").
std::shared_ptr<const TurbulenceRecord> scenario_turbulence(const Scenario& s);

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
// [tune_min, tune_max], then golden-section refinement between the best point's neighbours.
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

// What `floatpitch run` adds for gusts and turbulence: a JSON block for summary.json and the
// terminal table (held beside free, the rule estimates, the turbulence levels, the search).
nlohmann::json gust_summary_json(const Scenario& s, const RunOutcome& r, const TuneResult* tune);
std::string gust_table(const Scenario& s, const RunOutcome& r, const TuneResult* tune);

// The multi-seed results: summary.json, turbulence.csv (one row per seed and case), table.
struct SeedsReport {
  std::string summary_json;
  std::string csv;
  std::string table;
};
SeedsReport seeds_report(const Scenario& s, const SeedsResult& r);

}  // namespace fp
