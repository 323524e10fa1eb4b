// dynamics.hpp — equations of motion of the airframe with a floating elevator.
//
// Two rigid bodies joined at the hinge: the airframe (3 degrees of freedom in the vertical
// plane) and the elevator with the circuit parts that move with it (1 degree of freedom).
// Newton-Euler for each body, written about the airplane's CG with the elevator at zero
// (point O, fixed in the airframe):
//
//   force:   m_B a_B + m_e a_e                       = F_aero + F_thrust + m g
//   moment:  I_B q' + m_B rB x a_B + I_e,cg (q' + de'') + m_e r_e x a_e = M_aero + M_thrust + D x g
//   hinge:   I_e,cg (q' + de'') + m_e rho x a_e + I_c de''    = H_aero + H_circuit + H_pilot + S rho^ x g
//
// a_B, a_e are the inertial accelerations of the airframe's and the elevator's centres of mass,
// written from the unknowns (a_O, q', de'') by rigid-body kinematics in the rotating body frame
// (centripetal and Coriolis terms included); rho is the hinge-to-elevator-CG vector, r_e the
// elevator CG from O, D = m_B rB + m_e r_e the shift of the whole airplane's first moment when
// the elevator deflects, I_c the circuit inertia referred to the hinge (stick mass / G^2).
// The equations are affine in the four unknowns; the 4x4 system is built and solved at every
// call (Eigen, partial-pivot LU). With the stick held rigidly, de'' = 0 and the hinge equation
// gives the pilot's force instead (3x3). Rigid-body mechanics: Meriam and Kraige, Engineering
// Mechanics: Dynamics, plane kinetics of rigid bodies (moment about a point, eq. 6/1-6/3);
// body-axis kinematics: Etkin and Reid, Dynamics of Flight, section 4.
#pragma once

#include "airplane.hpp"
#include "atmosphere.hpp"
#include "gust.hpp"
#include "state.hpp"

namespace fp {

// Thrown by make_plant for an airplane that is not physically possible (e.g. an airframe
// inertia that comes out negative). scenario/ turns it into a user error naming the keys.
struct ModelError {
  const char* keys;      // the scenario keys involved
  const char* message;   // what is wrong
};

// Airplane plus quantities derived from it once (constant while a run lasts).
struct Plant {
  Airplane ap;
  double m = 0;        // total mass [kg]
  double m_B = 0;      // airframe mass without the elevator [kg]
  double m_e = 0;      // elevator mass [kg]
  double S_e = 0;      // elevator static mass moment about the hinge [kg m]
  double I_B = 0;      // airframe pitch inertia about its own CG [kg m^2]
  double I_ecg = 0;    // elevator inertia about its own CG [kg m^2]
  double I_c = 0;      // circuit inertia referred to the hinge [kg m^2]
  double rB_x = 0, rB_z = 0;  // airframe CG from O [m] (body axes)
  double rH_x = 0, rH_z = 0;  // hinge from O [m]
  double rW_x = 0, rW_z = 0;  // wing-body a.c. from O [m]
  double rT_x = 0, rT_z = 0;  // tail a.c. from O [m]
  double l_wt = 0;     // wing a.c. to tail a.c. distance [m]
  bool aerodynamics = true;   // test switches (energy check): aerodynamic forces on/off
  bool thrust = true;         // thrust on/off
};

Plant make_plant(const Airplane& ap);

// The airplane's CG position along x from O for a CG change: make_plant places O at the
// scenario CG, so every position above is relative to it.

enum class Stick { held, free };

// Pilot and power settings, constant between timeline events.
struct Controls {
  Stick stick = Stick::held;
  double hold_de = 0.0;      // elevator angle at which the stick is held [rad]
  double pilot_force = 0.0;  // pilot's force on the free stick, pull positive [N]
  double tab = 0.0;          // trim-tab setting (the geared part is added) [rad]
  double throttle = 0.5;     // [-] 0..1 (may exceed 1 only in trim diagnostics)
  FrictionState friction = FrictionState::off;  // what the circuit friction does (circuit.hpp);
                             // off for static analyses and linear models, set by the run
  bool play = false;         // the run models the free play (circuit.hpp): the stick side is a
                             // degree of freedom (sx::ds); off for static analyses and linear
                             // models (the play closed). Held rigidly, hold_de is the stick side's angle
};

// Everything computed in one derivative call, grouped by stage.
struct Eval {
  // air data
  AtmosphereState atm{};
  double V = 0, alpha = 0, qbar = 0;          // at the wing-body a.c. [m/s, rad, Pa]
  double V_t = 0, alpha_t = 0, qbar_t = 0;    // tail: local speed, tail angle of attack, eta*q [.., rad, Pa]
  double eps = 0;                              // downwash at the tail [rad]
  double tab = 0;                              // total tab deflection [rad]
  GustSample gust_wing{}, gust_tail{};
  // coefficients
  double CL_wb = 0, CD = 0, Cm_wb = 0, CL_t = 0, Ch = 0;
  // forces and moments (body axes, about O)
  double X = 0, Z = 0, M = 0;                  // aerodynamic + thrust [N, N, N m]
  double thrust = 0;                           // [N]
  double H_aero = 0;                           // aerodynamic hinge moment [N m]
  double H_circuit = 0;                        // circuit hinge moment (springs, friction, stops, bobweight at this n) [N m]
  double H_friction = 0;                       // friction hinge moment acting; stuck: the moment needed to
                                               // hold the elevator still relative to the airframe [N m]
  double stick_force = 0;                      // pilot's force, pull positive [N]
  double load_factor = 0;                      // [-]
  // accelerations
  double u_dot = 0, w_dot = 0, q_dot = 0, de_ddot = 0;
};

// The derivative: a pure function of (plant, gust field, state, controls, time).
// Writes dx/dt; when `out` is not null, also every intermediate quantity.
void derivatives(const Plant& p, const GustField& gust, const State& x, const Controls& c,
                 double t, State& dxdt, Eval* out = nullptr);

// Hinge moment of the circuit at elevator angle de and rate ded (damping, centering spring,
// downspring, stops; not the friction, see below, nor the bobweight, which depends on the load
// factor) [N m].
double circuit_hinge_moment(const Airplane& ap, double de, double ded);
// Its parts: on the stick side (damping, centering spring, downspring) at the stick side's angle
// ds and rate dsd, and at the surface (the deflection stops) [N m].
double stick_side_moment(const Airplane& ap, double ds, double dsd);
double stop_moment(const Airplane& ap, double de, double ded);
// Moment on the elevator from the contact at the ends of the free play, at the relative angle
// rel = delta_e - stick side and its rate (circuit.hpp contact_moment) [N m].
double play_contact_moment(const Airplane& ap, double rel, double rel_rate);

// Friction hinge moment for a friction state that sets it (off: 0; smooth: the tanh law at the
// rate ded; slip_up / slip_down: the sliding force against the slip; stuck: 0, as the moment is
// whatever holds the elevator, which derivatives() computes into Eval::H_friction) [N m].
double friction_hinge_moment(const Airplane& ap, FrictionState fs, double ded);

// True when the elevator does not move relative to the airframe under these controls: the
// stick held rigidly, or a stiction circuit stuck.
bool elevator_locked(const Airplane& ap, const Controls& c);

// Quasi-static hinge moment in steady flight at load factor n (no elevator motion): the
// aerodynamic hinge moment H_aero plus the circuit's, the bobweight's B n / G and the
// elevator's own weight about the hinge, S_e cos(de) n g0 (the apparent gravity of steady flight
// at n g acts along body z). Its zero is the floated elevator of the static analyses [N m].
double steady_hinge_moment(const Plant& p, double H_aero, double de, double n);

// Hinge moment of the elevator's own weight and of the bobweight in steady flight at load factor
// n with the elevator at de: S_e cos(de) n g0 + B n / G (the apparent gravity of steady flight at
// n g acts along body z; the bobweight pushes B per g at the stick, B/G at the hinge) [N m, TE down +].
double weight_hinge_moment(const Airplane& ap, double de, double n);

// The constant hinge moment H_c at 1 g with the elevator at zero: the elevator's weight about the
// hinge, the downspring and the bobweight, H_c = S_e g0 + D/G + B/G [N m, TE down +]. It does not
// grow with dynamic pressure, which is what moves the apparent stick-free neutral point (static.hpp).
double constant_hinge_moment(const Airplane& ap);

// Steady downwash at the tail for a wing angle of attack alpha: eps = eps0 + (deps/dalpha) alpha
// [rad] (Etkin and Reid, Dynamics of Flight, sec. 2.4, the linear downwash law).
inline double steady_downwash(const Tail& t, double alpha) { return t.eps0 + t.deps_dalpha * alpha; }

// Tail arm l_t = x_ac,t - x_ref c from a reference point at x_ref (fraction of the MAC aft of its
// leading edge), and the horizontal tail volume V_H = S_t l_t / (S c) with that arm (Etkin and
// Reid, sec. 2.4: the arm from the wing-body a.c., x_ref = wing.h_ac; the static analyses also use
// the arm from the CG for the elevator power and the tail's pitch damping) [m, -].
inline double tail_arm(const Airplane& ap, double x_ref) { return ap.tail.x_ac - x_ref * ap.wing.mac; }
inline double tail_volume(const Airplane& ap, double x_ref) {
  return ap.tail.area * tail_arm(ap, x_ref) / (ap.wing.area * ap.wing.mac);
}

// Number of downwash lag states in use for this plant (0..4).
int lag_states(const Plant& p);

// Hinge moment from the tab setting: the tab actually on the surface for a given elevator.
inline double total_tab(const Circuit& c, double tab_setting, double de) {
  return tab_setting + c.geared_tab_ratio * de;
}

// Lift coefficient of a lift curve at angle alpha (with stall). Used by the wing and tail.
double lift_coefficient(const LiftCurve& lc, double alpha, bool symmetric);

// A state for steady flight at (V, alpha, theta, de) at altitude h, lag states at their steady values.
State steady_state(const Plant& p, double V, double alpha, double theta, double h, double de);

}  // namespace fp
