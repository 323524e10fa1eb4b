// airplane.hpp — the constant description of an airplane and of the flight condition.
//
// Plain structs, SI units and radians, one comment a field: meaning [unit] (allowed range).
// The allowed ranges are enforced by the scenario loader (scenario/keys.cpp), which is the one
// table from which validation and the README's key reference are made; the comments here
// say what the physics means by each field.
//
// Geometry datum: longitudinal stations are distances AFT of the leading edge of the wing's
// mean aerodynamic chord (LEMAC) [m]; vertical positions are distances BELOW the centre of
// gravity [m] (z down, as body axes). Moving the CG therefore moves nothing but the CG.
#pragma once

#include <vector>

namespace fp {

// Lift curve with a smooth stall (see aero.hpp for the blending law).
struct LiftCurve {
  double slope = 5.0;          // lift-curve slope in the linear range [1/rad] (0.5..10)
  double alpha_zero = 0.0;     // zero-lift angle of attack [rad] (-0.3..0.3)
  double alpha_stall = 0.28;   // angle at which the curve leaves the linear law [rad] (0.05..0.6)
  double stall_sharpness = 60; // blending sharpness of the stall [1/rad] (5..200)
  // Optional table of (alpha [rad], CL [-]) pairs; when not empty it replaces the law above
  // (linear interpolation, flat-plate law beyond its ends).
  std::vector<std::pair<double, double>> table;
};

struct WingBody {
  double area = 12.0;          // wing reference area S [m^2] (0.05..200)
  double mac = 1.4;            // mean aerodynamic chord c [m] (0.05..10)
  double span = 9.0;           // wing span b [m] (0.3..60)
  LiftCurve lift;              // wing-body lift curve (a_wb, alpha_0, stall)
  double cd0 = 0.03;           // zero-lift drag coefficient of the whole airplane [-] (0..0.5)
  double k_induced = 0.05;     // induced-drag factor, CD = CD0 + k CL^2 [-] (0..0.5)
  double h_ac = 0.25;          // wing-body aerodynamic centre [fraction of MAC aft of LEMAC] (-0.5..1)
  double z_ac = 0.0;           // wing-body aerodynamic centre below the CG [m] (-5..5)
  double cm_ac = -0.05;        // pitching moment about the wing-body a.c. [-] (-0.5..0.5)
  double cm_alpha_fus = 0.0;   // fuselage pitching-moment slope dCm/dalpha (destabilising > 0) [1/rad] (-2..2)
  double cm_q = -3.0;          // wing-body and fuselage pitch damping dCm/d(q c/2V) [-] (-50..0)
};

// Downwash lag model (DEVELOPERS.md, "The equations"): the tail feels the
// downwash that the wing made about l_t/V earlier.
enum class DownwashLag { none, first_order, chain };

struct Tail {
  double area = 2.2;            // horizontal tail area S_t (including elevator) [m^2] (0.01..50)
  double x_ac = 4.6;            // tail aerodynamic centre, aft of LEMAC [m] (0.1..30)
  double z_ac = -0.3;           // tail aerodynamic centre below the CG [m] (negative = above) (-5..5)
  double incidence = -0.02;     // tail incidence i_t relative to the body x axis [rad] (-0.3..0.3)
  LiftCurve lift;               // tail lift curve a_t (alpha_zero is ignored: symmetric section)
  double eta = 0.9;             // dynamic-pressure ratio q_t/q [-] (0.3..1.2)
  double eps0 = 0.0;            // downwash at zero wing angle of attack [rad] (-0.2..0.2)
  double deps_dalpha = 0.4;     // downwash gradient [-] (0..0.9)
  // downwash lag model; the default four-stage chain puts the short period within about 2 % of a
  // pure convection delay l_wt/V, where one first-order stage is 10-15 % high in frequency
  // (tests/reference/downwash_lag.py)
  DownwashLag lag = DownwashLag::chain;
  int lag_stages = 4;           // stages of the chain (chain only) [-] (1..4)
  double tau_elevator = 0.5;    // elevator effectiveness dalpha_t/ddelta_e [-] (0.05..1)
  double tau_tab = 0.1;         // tab effectiveness dalpha_t/ddelta_tab [-] (0..0.5)
};

// Elevator and its hinge moments. Ch = Ch0 + Ch_alpha alpha_t + Ch_delta delta_e
// + Ch_tab delta_tab + Ch_rate (delta_e_dot c_e / 2V); hinge moment = Ch q_t S_e c_e.
struct Elevator {
  double area = 0.8;            // elevator area aft of the hinge line S_e [m^2] (0.005..20)
  double chord = 0.3;           // elevator mean chord aft of the hinge c_e [m] (0.01..3)
  double x_hinge = 4.45;        // hinge line, aft of LEMAC [m] (0.1..30)
  double z_hinge = -0.3;        // hinge line below the CG [m] (-5..5)
  double ch0 = 0.0;             // hinge-moment coefficient at zero angles [-] (-0.5..0.5)
  double ch_alpha = -0.2;       // dCh/dalpha_t [1/rad] (-2..1)
  double ch_delta = -0.45;      // dCh/ddelta_e [1/rad] (-2..1; 0 only for irreversible circuits)
  double ch_tab = -0.3;         // dCh/ddelta_tab [1/rad] (-2..2)
  double ch_rate = -0.5;        // aerodynamic hinge damping dCh/d(delta_e_dot c_e/2V) [-] (-20..0)
  double delta_min = -0.45;     // trailing-edge-up stop [rad] (-1..0)
  double delta_max = 0.3;       // trailing-edge-down stop [rad] (0..1)
  double mass = 4.0;            // elevator (and tab) mass [kg] (0..200)
  double mass_moment = 0.2;     // static mass moment about the hinge, m_e x_cg, positive when the
                                // centre of mass is aft of the hinge (unbalanced) [kg m] (-20..20)
  double inertia = 0.08;        // moment of inertia about the hinge line [kg m^2] (1e-4..50)
};

// The circuit between stick and elevator, all given where the pilot feels it (at the stick),
// and referred to the hinge through the gearing inside the model.
struct Circuit {
  bool reversible = true;       // false: powered / irreversible circuit: the elevator cannot float, held case only
  double gearing = 1.2;         // elevator angle per stick travel G > 0 [rad/m] (0.1..20);
                                // stick aft (pull) moves the elevator trailing edge up
  double stick_mass = 1.0;      // equivalent mass of stick and circuit moving with it, at the stick [kg] (0..50)
  double damping = 0.0;         // viscous damping at the stick [N s/m] (0..1e4)
  double friction = 0.0;        // Coulomb breakout force at the stick [N] (0..500)
  double friction_speed = 0.005;// stick speed over which friction is smoothed (tanh) [m/s] (1e-5..0.5)
  double centering = 0.0;       // centering spring rate at the stick [N/m] (0..1e5)
  double centering_neutral = 0.0; // elevator angle at which the centering spring is relaxed [rad] (-0.5..0.5)
  double downspring = 0.0;      // downspring preload, a push on the stick [N] (0..500)
  double bobweight = 0.0;       // bobweight push on the stick per g of normal load factor [N/g] (0..500)
  double stop_stiffness = 2e4;  // stop contact stiffness at the hinge [N m/rad] (1..1e7)
  double stop_damping = 50.0;   // stop contact damping at the hinge [N m s/rad] (0..1e5)
  double held_stiffness = 0.0;  // held stick: circuit stiffness between hand and surface at the stick
                                // [N/m] (0 = rigid hold, else 100..1e7)
  double tab_min = -0.35;       // trim-tab range [rad] (-1..0)
  double tab_max = 0.35;        // [rad] (0..1)
  double geared_tab_ratio = 0.0;// tab deflection per elevator deflection (>0 anti-balance,
                                // <0 balance) [-] (-3..3)
};

struct Propulsion {
  double max_thrust = 1500.0;   // full-throttle static thrust at sea level [N] (0..1e5)
  double density_exponent = 1.0;// thrust ~ (rho/rho0)^n [-] (0..2)
  double speed_exponent = 0.0;  // thrust ~ (V/V_ref)^n (0 jet-like, -1 constant power) [-] (-1.5..0)
  double reference_speed = 40.0;// V_ref [m/s] (1..300)
  double z_thrust = 0.0;        // thrust line below the CG (positive gives nose-up moment) [m] (-3..3)
  double angle = 0.0;           // thrust line angle to body x, positive up [rad] (-0.3..0.3)
};

struct MassProperties {
  double mass = 750.0;          // total mass including the elevator [kg] (1..20000)
  double pitch_inertia = 1000.0;// pitch moment of inertia about the CG (elevator at zero) [kg m^2] (0.01..1e6)
  double h_cg = 0.25;           // centre of gravity [fraction of MAC aft of LEMAC] (-0.5..1.5)
};

struct Airplane {
  WingBody wing;
  Tail tail;
  Elevator elevator;
  Circuit circuit;
  Propulsion propulsion;
  MassProperties mass;
};

// The flight condition the airplane is trimmed at.
struct Condition {
  double altitude = 1000.0;     // geometric altitude [m] (0..20000)
  double airspeed = 50.0;       // true airspeed [m/s] (1..300)
  double flight_path = 0.0;     // flight-path angle gamma [rad] (-0.5..0.5)
};

}  // namespace fp
