// envelope.hpp — the conditions matrix: at each corner of a list (the stated envelope's corners,
// or the corners a case file names) the hands-off trim, the margins and stick forces, the stick
// force per g, the modes held and free, and the sudden release of the force that holds the
// airplane 15 % above and below its trim speed, run in parallel. A corner that cannot be
// computed (it does not trim, a solver fails) is that corner's failure row, never a crash.
//
// Each corner is computed from the base scenario alone (corner_scenario), so a corner computed
// by itself and the same corner inside a matrix run give the same numbers, bit for bit, whatever
// the number of threads.
#pragma once

#include <limits>
#include <string>
#include <vector>

#include "analysis/margins_modes.hpp"
#include "scenario/matrix_case.hpp"  // Corner
#include "scenario/scenario.hpp"

namespace fp {

// The corners of the stated envelope: forward and aft CG limits (envelope.cg_forward, cg_aft)
// at the lightest and heaviest stated mass (envelope.mass_min, mass_max; one mass when they are
// equal or unstated), at the scenario's altitude and trim speed.
std::vector<Corner> envelope_corners(const Scenario& s);

// Whether a CG and a mass lie within the scenario's stated envelope (CG limits, and masses when
// stated; the one test the report and the matrix use).
bool within_envelope(const Scenario& s, double cg, double mass);

// The base scenario with the corner's values, trimmed hands-off (trim.tab = auto), validated.
// The pitch inertia is the base scenario's at every mass. Throws ScenarioError.
Scenario corner_scenario(const Scenario& base, const Corner& c);

// The sudden release (stick let go) from a speed off trim, the tab left at the hands-off setting
// of the trim speed, the stick held at the elevator that holds the off-trim speed in level
// flight (throttle re-trimmed for it), released 1 s into the run, run for `release_seconds`.
struct Release {
  double offset = 0;            // fraction of the trim speed (+0.15 above, -0.15 below) [-]
  double start_speed = 0;       // true airspeed held before the release [m/s]
  double force = 0;             // stick force held before the release, pull + [N]
  double seconds = 0;           // length of the run after the release [s]
  bool departed = false;        // a departure bound of the run was crossed (run/run.hpp)
  double time = std::numeric_limits<double>::quiet_NaN();  // of the departure, after the release [s]
  std::string criterion;        // the departure's criterion name ("" when none)
  std::string reason;           // in words
  // The response reached the stall (angle of attack beyond the wing's stall angle, or airspeed
  // below the 1 g stall speed): from there on the result is beyond the model's validity, and a
  // departure there is a stall, not a divergence.
  bool stall = false;
  double v_min = 0, v_max = 0;  // airspeed range after the release [m/s]
  double n_min = 0, n_max = 0;  // load factor range after the release [-]
  double alpha_max = 0;         // largest angle of attack after the release [rad]
  std::string failure;          // "" when it ran; else why not (trim, numerical failure)
};
inline constexpr double release_seconds = 120.0;
inline constexpr double release_offset = 0.15;

// What one corner gives.
struct CornerResult {
  Corner corner;                // as asked
  double cg = 0, mass = 0, altitude = 0, airspeed = 0;  // as computed (SI)
  double calibrated = 0;        // calibrated airspeed of the trim speed [m/s]
  bool in_envelope = true;      // CG within the stated limits and mass within the stated masses
  bool ok = false;
  std::string failure;          // why the corner could not be computed ("" when ok)
  Margins margins;              // compute_margins at the corner
  double stall_speed = 0;       // 1 g, true airspeed [m/s]
  double limit_load_factor = 0; // envelope.limit_load_factor [-]
  // stick force at the limit load factor, the per-g slope at trim times (n_limit - 1) [N]
  double force_at_limit = 0;
  Mode worst_held, worst_free;  // the deciding root's mode (model/linear.hpp deciding_root)
  bool has_sp_held = false, has_sp_free = false;
  Mode sp_held, sp_free;        // the oscillatory short-period mode, when there is one
  Release release_up, release_down;  // +15 % and -15 % of the trim speed
};

// Throws nothing: a corner that cannot be computed comes back with ok = false and its reason.
CornerResult compute_corner(const Scenario& base, const Corner& c);

// Every corner, in parallel on `jobs` threads, with the progress bar (util/parallel.hpp) when
// `progress`; results in the order of `corners`, independent of the thread count.
std::vector<CornerResult> run_matrix(const Scenario& base, const std::vector<Corner>& corners, int jobs, bool progress);

}  // namespace fp
