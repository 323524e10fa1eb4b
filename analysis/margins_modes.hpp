// analysis.hpp — the static and linear analyses of a scenario, assembled once for every
// consumer (the command line, the report, the window): neutral and maneuver points both ways,
// margins, stick forces, the free-return band, CG limits; modes held and free.
#pragma once

#include <string>
#include <vector>

#include <nlohmann/json_fwd.hpp>

#include "model/linear.hpp"
#include "model/static.hpp"
#include "model/trim.hpp"
#include "scenario/scenario.hpp"

namespace fp {

struct Pair {
  double closed_form = 0;
  double model = 0;
};

struct MarginsOptions {
  StaticCriteria criteria;          // minimum margin and force per g of the aft CG limits (model/static.hpp)
  bool margin_from_user = false;    // criteria.min_static_margin was set by the user (else a tool default)
  bool force_from_user = false;     // criteria.min_force_per_g was set by the user
  int curve_points = 41;            // stick-force curve points
};

// Stick force against load factor in steady pull-ups at the condition's speed with the tab fixed
// (the one per-g curve of the command line and the report). From n = 1 in steps of dn up to
// n_max; it stops at the last load factor that trims and says why: the wing's stall, the elevator's
// stop, the tab's range (TrimError of model/trim.hpp, limits checked; the throttle is left free,
// since the force per g is defined whether or not the engine can hold the speed), or a trim that
// did not converge (numerical, said as such).
struct PerGPoint {
  double load_factor = 0;  // [-]
  double stick_force = 0;  // [N], pull +
  double elevator = 0;     // [rad]
  double alpha = 0;        // [rad]
};
struct PerGCurve {
  std::vector<PerGPoint> points;
  double n_max = 0;                 // the load factor asked for [-]
  bool complete = false;            // every load factor up to n_max trimmed
  double stop_load_factor = 0;      // the first load factor that did not trim (NaN when complete)
  TrimLimit stop = TrimLimit::none; // what stopped it
  bool numerical = false;           // the stop is a numerical failure, not a limit of the airplane
  std::string stop_reason;          // the trim's own words
};
PerGCurve force_per_g_curve(const Plant& p, const Condition& c, double tab, double n_max = 4.0, double dn = 0.25);

struct Margins {
  double cg = 0;                    // scenario CG [-]
  double trim_speed = 0;            // [m/s]
  double trim_tab = 0;              // [rad] tab of the hands-off trim at the scenario condition
  ClosedForm cf;                    // every closed-form value
  Pair np_fixed, np_free, np_apparent, mp_fixed, mp_free;
  double margin_fixed = 0;          // model: np_fixed - cg
  double margin_free = 0;           // model: np_free - cg
  double margin_apparent = 0;       // model: np_apparent - cg
  double elevator_per_g = 0;        // model [rad/g]
  double force_per_g = 0;           // model, everything included [N/g]
  double force_per_g_aero = 0;      // model, without bobweight, downspring and elevator weight [N/g]
  double force_gradient = 0;        // model dF/dV at trim, tab fixed [N/(m/s)]
  double free_return_low = 0;       // [m/s] lowest speed of the free-return band (NaN: none)
  double free_return_high = 0;      // [m/s]
  double reversal_speed = 0;        // [m/s] a second zero of F_s(V) in the range (NaN: none)
  double speed_lo = 0, speed_hi = 0;// range of the stick-force curve [m/s]
  std::vector<ForcePoint> curve;    // stick force against speed, tab fixed
  CgLimits limits;
  double envelope_forward = 0, envelope_aft = 0;
};

// Throws TrimError (scenario condition cannot be trimmed) or ScenarioError.
Margins compute_margins(const Scenario& s, const MarginsOptions& o = {});

// A friction circuit has two small-disturbance models (model/linear.hpp): slipping (the free
// model, with no friction slope: a smoothing constant never enters) and stuck (the elevator
// moves with the airframe: the held model). Stuck applies while the hinge moment the circuit
// must hold stays within the breakout moment F_b/G; `stuck_alpha_t` is the change of tail angle
// of attack that makes the aerodynamic hinge moment reach it (Ch_alpha q_t S_e c_e dalpha_t).
struct FrictionModels {
  bool applies = false;             // the circuit has friction (circuit.friction > 0) and can float
  bool smooth_law = false;          // the runs use the smoothed (tanh) law
  double breakout_force = 0;        // [N] at the stick
  double breakout_moment = 0;       // F_b / G [N m] at the hinge
  double stuck_alpha_t = 0;         // [rad] tail angle-of-attack change that reaches it (inf: Ch_alpha = 0)
};

struct ModesResult {
  Trim held_trim, free_trim;        // the equilibria linearised about (free: run/run.hpp
                                    // scenario_hands_off_trim; the same as held_trim unless the
                                    // tab is fixed off its hands-off setting)
  LinearModel held_lm, free_lm;
  std::vector<Mode> held, free;
  bool has_free = false;            // false for an irreversible circuit
  FrictionModels friction;
};
ModesResult compute_modes(const Scenario& s);
// The controls of a linearisation about trim t: the stick held at the trim elevator, or free
// with no pilot force (t must then be a hands-off equilibrium: scenario_hands_off_trim).
Controls linear_controls(const Trim& t, bool free);

}  // namespace fp
