// circuit.hpp — the circuit's nonlinear elements: friction with stiction (and the smoothed law
// as an option) and the phases a stiction circuit goes through.
//
// Friction acts at the stick (circuit.friction is the breakout force there) and is referred to
// the hinge through the gearing G like every circuit force: a force F at the stick is F/G at
// the hinge.
//
// Stiction (the default for a circuit with friction): the circuit is either stuck or slipping.
//   stuck     the elevator does not move relative to the airframe (delta_e constant, its rate
//             exactly 0); the airframe still moves, so the elevator's inertial coupling still
//             acts: the stuck elevator is a held elevator whose holding moment is supplied by
//             friction. It stays stuck while that moment is within the breakout moment F_b/G.
//   slipping  friction is the sliding force F_s/G (F_s <= F_b), against the relative rate.
// The switches are events located on the integrator's dense output (run/run.cpp): slip ->
// stuck when the relative rate reaches zero and the holding moment needed is within breakout
// (else the slip reverses), stuck -> slip when the holding moment needed exceeds breakout.
// This is the zero-velocity switching of Karnopp, "Computer simulation of stick-slip friction
// in mechanical dynamic systems", J. Dyn. Sys., Meas., Control 107 (1985), with the band
// reduced to the exact zero crossing located as an event; the model classes are those of
// Armstrong-Helouvry, Dupont and Canudas de Wit, Automatica 30 (1994).
//
// Smoothed (option, circuit.friction_law = "smooth"): F_b tanh(v / circuit.friction_speed) at
// stick speed v. It has no stiction: under a load below the breakout the stick creeps at about
// friction_speed * atanh(load / breakout). Its slope at zero speed is numerical, not physical
// damping: the linear models never use it (model/linear.hpp).
#pragma once

namespace fp {

enum class FrictionLaw { stiction, smooth };

// The circuit's nonlinear elements, one member of Airplane (`circuit_nl`); keys in [circuit].
struct CircuitNonlinear {
  FrictionLaw friction_law = FrictionLaw::stiction;  // key circuit.friction_law
  double sliding_friction = 0.0;  // key circuit.sliding_friction (0: equal to the breakout)
  double free_play = 0.0;  // key circuit.free_play (the total angle at the surface)
};

// Free play (backlash) of total angle b at the surface between the stick side of the circuit
// and the elevator. In a run that models it the stick side (stick, cables, the circuit's mass
// stick_mass / G^2, its damping, friction, springs and bobweight) is a degree of freedom of its
// own (state sx::ds, the elevator angle it commands); the elevator (its inertia, weight,
// aerodynamics and the deflection stops) floats within +-b/2 of it. At either end the two sides
// meet in the stops' contact law (contact_moment below, with circuit.stop_stiffness and
// stop_damping): stiff, pushes and never pulls. Held rigidly, the stick side stays where the hand
// holds it and the elevator floats inside the play. Static analyses and the linear models close
// the play (the two sides move together: the model without play).

// One-sided contact at the ends of a travel [lo, hi] of a relative angle x (rate xd): inside it
// nothing acts; beyond an end a stiff spring-damper pushes back, -k (x - end) - c xd, and never
// pulls (0 when the damping term would reverse it) [N m]. Common practice for contact in
// rigid-body simulation (a penalty spring, one-sided, instead of a clamp that would break the
// integrator). The deflection stops and the ends of the free play both use it.
inline double contact_moment(double x, double xd, double lo, double hi, double k, double c) {
  if (x > hi) {
    const double m = -k * (x - hi) - c * xd;
    return m < 0.0 ? m : 0.0;
  }
  if (x < lo) {
    const double m = -k * (x - lo) - c * xd;
    return m > 0.0 ? m : 0.0;
  }
  return 0.0;
}

// The relative angle x = delta_e - stick side at which the play's contact transmits the moment
// C to the elevator at rest (C > 0 trailing edge down): against the lower end for C > 0, the
// upper for C < 0, centred for C = 0 [rad].
inline double play_offset(double C, double play, double k) {
  if (C > 0.0) return -0.5 * play - C / k;
  if (C < 0.0) return 0.5 * play - C / k;
  return 0.0;
}

// What the friction does in one derivative call (model/dynamics.hpp Controls::friction):
//   off       no friction moment: static analyses (trim, floated elevator) and the linear
//             models (the slipping model has no friction slope; the stuck model is the held one)
//   smooth    the tanh law
//   stuck     the elevator is locked to the airframe, friction supplies the holding moment
//   slip_up   slipping with the elevator rate positive (trailing edge moving down)
//   slip_down slipping with the elevator rate negative
enum class FrictionState { off, smooth, stuck, slip_up, slip_down };

// Sliding force in use [N]: circuit.sliding_friction, or the breakout when that is 0.
inline double sliding_force(double breakout, const CircuitNonlinear& nl) {
  return nl.sliding_friction > 0.0 ? nl.sliding_friction : breakout;
}

}  // namespace fp
