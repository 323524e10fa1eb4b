// static.hpp — static longitudinal stability with the stick fixed and free: neutral and
// maneuver points, stick forces, the trim tab and CG limits.
//
// Two independent routes, shown side by side by the tools:
//  * closed form, from the scenario's linear coefficients and the published tail-volume
//    formulas (Etkin and Reid, Dynamics of Flight, sec. 2.4-2.6; USAF Test Pilot School,
//    Flying Qualities Phase, vol. II ch. 5 and 6), with the free-elevator factor
//    F = 1 - tau' Ch_alpha / Ch_delta' (tau' = tau + k tau_tab, Ch_delta' = Ch_delta + k Ch_tab
//    for a geared tab of ratio k);
//  * from the full nonlinear model at the trimmed condition (finite differences of the
//    pitching moment, trims at neighbouring speeds and load factors).
//
// The apparent stick-free neutral point: a hinge moment that does not grow with dynamic
// pressure (the elevator's weight about the hinge, a downspring, a bobweight at 1 g), H_c,
// adds G H_c to the stick force F_s = G eta S_e c_e q Ch, which is otherwise
// A - K q with A = G eta S_e c_e (Ch_delta/Cm_delta)(W/S)(h'_n - h). The gradient at trim,
// dF_s/dV = -2 (A + G H_c)/V, vanishes at
//     h_app = h'_n + H_c / (eta S_e c_e (Ch_delta/Cm_delta) (W/S)),
// aft of h'_n when H_c pushes the trailing edge down. Derived here from the stick-force
// equation of the textbooks above (Etkin and Reid sec. 2.6; USAF TPS vol. II ch. 5), with the
// constant term added.
//
// The CG searches (cg_zero) and the floated elevator use the root finders of model/roots.hpp
// (Boost.Math TOMS 748); a search that does not converge throws SolverFailure (numerical).
//
// All CG-like values are fractions of the MAC aft of its leading edge.
#pragma once

#include <functional>
#include <string>
#include <vector>

#include "dynamics.hpp"
#include "trim.hpp"

namespace fp {

struct ClosedForm {
  double tail_volume = 0;     // V_H = S_t l_t / (S c), l_t from the wing-body a.c. [-]
  double lift_slope = 0;      // airplane lift slope, elevator fixed, a [1/rad]
  double lift_slope_free = 0; // a' with the elevator free [1/rad]
  double free_factor = 0;     // F = 1 - tau' Ch_alpha / Ch_delta' [-]
  double np_fixed = 0;        // h_n
  double np_free = 0;         // h'_n (aerodynamic)
  double np_apparent = 0;     // h_app, with the constant hinge moments
  double hinge_constant = 0;  // H_c at 1 g: weight + downspring + bobweight [N m, TE down +]
  double cm_delta = 0;        // elevator power -eta V_H' a_t tau' (arm from the CG) [1/rad]
  double mu = 0;              // relative density 2m/(rho S c) [-]
  double cm_q = 0;            // airplane pitch damping, elevator fixed [-]
  double cm_q_free = 0;       // with the tail part scaled by F [-]
  double mp_fixed = 0;        // h_m = h_n - Cm_q / (2 mu)
  double mp_free = 0;         // h'_m = h'_n - Cm_q' / (2 mu)
  double force_constant_A = 0;// A = G eta S_e c_e (Ch_delta'/Cm_delta)(W/S)(h'_n - h) [N]
  double force_gradient = 0;  // dF_s/dV at trim = -2 (A + G H_c) / V [N/(m/s)], negative = stable
  double elevator_per_g = 0;  // d delta_e / dn = -(C_W / Cm_delta)(h - h_m) [rad/g]
  double force_per_g_aero = 0;// G eta S_e c_e (Ch_delta'/Cm_delta)(W/S)(h'_m - h) [N/g]
  double force_per_g = 0;     // plus bobweight and the elevator's weight [N/g]
  double free_return_fraction = 0;  // friction band dV/V_trim = F_f / (2 (A + G H_c)) [-] (+-)
};

// Closed-form results at the condition (airspeed and altitude of `c`, CG from the airplane).
// Requires Ch_delta' != 0 (the scenario loader refuses a reversible circuit with Ch_delta = 0).
ClosedForm closed_form(const Airplane& ap, const Condition& c);

// The free-elevator factor F = 1 - tau' Ch_alpha / Ch_delta' with tau' = tau + k tau_tab and
// Ch_delta' = Ch_delta + k Ch_tab for a geared tab of ratio k (Etkin and Reid sec. 2.6; USAF TPS
// vol. II ch. 5): the share of the tail's lift slope left when the elevator floats [-].
double free_elevator_factor(const Airplane& ap);

// The default criteria of the aft CG limits. These are TOOL DEFAULTS, not approved criteria:
// every consumer (command line, report, window) takes them from here, and an output that uses
// them without the user having set them says so ("tool default, not a criterion").
//  * min_static_margin 0.05: a stick-free static margin of 5 % MAC, common practice as a
//    working minimum for light airplanes;
//  * min_force_per_g 13.3 N/g = 3.0 lbf/g: the floor of the centre-stick minimum of stick force
//    per g of MIL-F-8785C (sec. 3.2.2.2.1, table V), from memory.
struct StaticCriteria {
  double min_static_margin = 0.05;  // [-] fraction of MAC
  double min_force_per_g = 13.3;    // [N/g]
};
inline constexpr StaticCriteria kDefaultCriteria{};

// From the full model at a trim (held-elevator trim `t`):
//  fixed: h_cg - dCm/dCL for a change of angle of attack at constant speed, elevator held;
//  free:  the same with the elevator floated to zero quasi-static hinge moment at each angle
//         (tab, geared tab, springs, bobweight and weight at 1 g held constant).
struct ModelNeutralPoints {
  double fixed = 0;
  double free = 0;
};
ModelNeutralPoints model_neutral_points(const Plant& p, const Trim& t);

// Stick force at speed V with the tab fixed (trim held at V), and its curve.
struct ForcePoint {
  double airspeed = 0;     // [m/s]
  double stick_force = 0;  // [N], pull +
  double elevator = 0;     // [rad]
  double alpha = 0;        // [rad]
};
std::vector<ForcePoint> stick_force_curve(const Plant& p, const Condition& c, double tab, double V_lo,
                                          double V_hi, int points);
// dF_s/dV at the condition's speed with the tab fixed [N/(m/s)] (central difference of trims).
double stick_force_gradient(const Plant& p, const Condition& c, double tab);

// Steady pull-up: d delta_e / dn [rad/g] (held) and d F_s / dn at fixed tab [N/g].
struct PerG {
  double elevator_per_g = 0;
  double force_per_g = 0;
};
PerG per_g(const Plant& p, const Condition& c, double tab);

// A copy of the airplane without the constant hinge moments (no elevator mass moment, no
// downspring, no bobweight): its free results are the aerodynamic ones.
Airplane without_constant_hinge_moments(Airplane ap);

// The CG (fraction of MAC) at which f(plant at that CG) is zero: a bracket searched from h0 and
// h0 + step with doubling steps inside the CG range -0.5..1.5 (f is close to linear in the CG for
// all the uses here), then TOMS 748 to tol (model/roots.hpp). Returns NaN when f keeps its sign
// over the CGs at which the airplane trims (f throws TrimError beyond them): no such CG, an
// answer. Throws SolverFailure when the solve does not converge (numerical).
double cg_zero(const Airplane& ap, const std::function<double(const Plant&)>& f, double h0,
               double step = 0.05, double tol = 1e-6);

// CG limits.
struct CgLimit {
  double cg = 0;           // fraction of MAC (NaN when not found)
  std::string reason;      // what sets it
  std::string basis;       // where its criterion comes from: "" (physics alone, e.g. the
                           // neutral point), "set by the user", or "tool default, not a criterion"
};
struct CgLimits {
  CgLimit forward;                 // elevator power at the slowest speed
  CgLimit aft;                     // the most forward of the three below
  CgLimit aft_free_np;             // the stick-free neutral point (model)
  CgLimit aft_margin;              // a minimum stick-free static margin
  CgLimit aft_force_per_g;         // a minimum stick force per g
};
struct CgLimitOptions {
  double min_speed = 0;            // speed of the forward-limit trim (e.g. 1.1 Vs, a flare) [m/s]
  StaticCriteria criteria;         // minimum margin and force per g of the aft limits
  bool margin_from_user = false;   // the minimum margin was set by the user (else a tool default)
  bool force_from_user = false;    // the minimum force per g was set by the user
};
CgLimits cg_limits(const Airplane& ap, const Condition& c, const CgLimitOptions& o);

}  // namespace fp
