// session.hpp — what the window flies: the last valid scenario, its plant and trim, and two
// simulations started from the same trim, one with the stick held and one free.
//
// The window never edits a running model: an edit is made on a copy of the scenario, checked
// (set_value, validate, the plant, the trim) and only then installed, which restarts both
// airplanes from the new trim. A refused edit leaves everything as it was and returns the
// message the command line would print. Live inputs (gust, let go, tab, pulse) go to the
// simulations through Simulation::apply_now / add_gust_now at the current simulated time, and
// are logged as script lines (script.hpp) so that an exported run can be replayed.
#pragma once

#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "model/trim.hpp"
#include "analysis/cg_locus.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"
#include "ui/script.hpp"

namespace fpui {

// The simulations run open-ended in the window: their end is the longest run the key table
// allows. "All at once" runs to the scenario's own run.duration.
inline constexpr double kLiveHorizon = 3600.0;  // [s]

class Session {
 public:
  // Load a scenario file. Returns the error message (empty on success); on failure the
  // session keeps what it had.
  std::string load(const std::string& path);
  // Install a scenario (already loaded). Returns the error message, empty on success.
  std::string install(const fp::Scenario& s);
  // Edit a copy of the scenario with `change`, validate it and install it. Returns the error
  // message (empty on success); on failure nothing changes.
  std::string edit(const std::function<void(fp::Scenario&)>& change);
  // Set one numeric key to an SI value (the key table checks it).
  std::string set_key(const std::string& key, double si_value);

  bool loaded() const { return held_ != nullptr; }
  // Counts installs: changes whenever the scenario (and so the trim, modes and locus) changes.
  int generation() const { return generation_; }
  const fp::Scenario& scenario() const { return scenario_; }
  const fp::Trim& trim() const { return trim_; }
  const fp::Plant& plant() const { return *plant_; }
  const fp::ModesResult& modes() const { return modes_; }
  // Neutral and maneuver points, margins (analysis/margins_modes.hpp); null when they could not be
  // computed, with the reason in margins_error().
  const fp::Margins* margins() const { return margins_ ? &*margins_ : nullptr; }
  const std::string& margins_error() const { return margins_error_; }
  // Margins take many trims: while the CG slider is dragged, install with margins deferred
  // and call refresh_margins() when it is let go.
  void set_defer_margins(bool d) { defer_margins_ = d; }
  void refresh_margins();
  bool margins_stale() const { return margins_stale_; }
  const std::vector<fp::LocusPoint>& locus() const { return locus_; }
  double locus_from() const { return locus_from_; }
  double locus_to() const { return locus_to_; }
  bool has_free() const { return free_ != nullptr; }

  // Both airplanes back to the trim at time 0 (the live log is cleared).
  void reset();
  // Advance both airplanes to simulated time t (those still flying).
  void advance_to(double t);
  double time() const { return t_; }
  // Run both to the scenario's run.duration from the trim.
  void run_all_at_once();

  // Live inputs at the current time.
  void gust_now(const fp::DiscreteGust& g);
  void let_go();
  void take_hold();
  bool free_is_held() const;        // the free airplane's stick is held (before let go / after take hold)
  void set_tab(double tab);         // both airplanes [rad], within the circuit's tab range
  double tab() const;               // current tab setting [rad]
  void pulse(double force, double duration);  // free airplane [N, s]
  void log(const Action& a);        // add a line to the live log (an action done by a script)

  const fp::Simulation* held() const { return held_.get(); }
  const fp::Simulation* free() const { return free_.get(); }
  // A numerical failure of a simulation (not a result about the airplane); empty when none.
  const std::string& held_failure() const { return held_failure_; }
  const std::string& free_failure() const { return free_failure_; }
  const std::vector<Action>& live_log() const { return log_; }

  // Files of the current run for export: held.csv, free.csv, scenario.toml, actions.fps.
  std::vector<std::pair<std::string, std::string>> export_files() const;

 private:
  void recompute_locus();
  void step_one(std::unique_ptr<fp::Simulation>& sim, std::string& failure, double t);

  fp::Scenario scenario_;
  std::shared_ptr<const fp::Plant> plant_;
  fp::Trim trim_;
  fp::GustField gust_;
  fp::ModesResult modes_;
  std::optional<fp::Margins> margins_;
  std::string margins_error_;
  bool defer_margins_ = false;
  bool margins_stale_ = false;
  std::vector<fp::LocusPoint> locus_;
  double locus_from_ = 0.0, locus_to_ = 0.0;
  std::string locus_key_;           // the scenario (without its CG) the locus was made for
  std::unique_ptr<fp::Simulation> held_, free_;
  std::string held_failure_, free_failure_;
  double t_ = 0.0;
  int generation_ = 0;
  std::vector<Action> log_;
};

}  // namespace fpui
