// airplane.hpp — the constant description of an airplane and of the flight condition.
//
// Plain structs, SI units and radians. Each field's comment names the scenario key that sets it;
// the key table (scenario/keys.cpp, printed by `floatpitch keys` and in the README) is the one
// text of every key's meaning, unit, allowed range and default. Nothing here repeats it, and
// tests/docs/param_pointers.py keeps the two in step (every pointer names a key that sets this
// very field; every key that sets a field here is named beside it).
//
// Geometry datum: longitudinal stations are distances AFT of the leading edge of the wing's
// mean aerodynamic chord (LEMAC) [m]; vertical positions are distances BELOW the centre of
// gravity [m] (z down, as body axes). Moving the CG therefore moves nothing but the CG.
#pragma once

#include <vector>

#include "model/circuit.hpp"

namespace fp {

// Lift curve with a smooth stall (model/dynamics.cpp has the blending law).
struct LiftCurve {
  double slope = 5.0;  // key wing.lift_slope, tail.lift_slope
  double alpha_zero = 0.0;  // key wing.alpha_zero (the tail section is symmetric: no tail key)
  double alpha_stall = 0.28;  // key wing.alpha_stall, tail.alpha_stall
  double stall_sharpness = 60;  // key wing.stall_sharpness, tail.stall_sharpness
  std::vector<std::pair<double, double>> table;  // key wing.cl_table (empty: the law above)
};

struct WingBody {
  double area = 12.0;  // key wing.area
  double mac = 1.4;  // key wing.mac
  double span = 9.0;  // key wing.span
  LiftCurve lift;  // key wing.lift_slope, wing.alpha_zero, wing.alpha_stall, wing.stall_sharpness, wing.cl_table
  double cd0 = 0.03;  // key wing.cd0
  double k_induced = 0.05;  // key wing.k_induced
  double h_ac = 0.25;  // key wing.h_ac
  double z_ac = 0.0;  // key wing.z_ac
  double cm_ac = -0.05;  // key wing.cm_ac
  double cm_alpha_fus = 0.0;  // key wing.cm_alpha_fus
  double cm_q = -3.0;  // key wing.cm_q
};

// Downwash lag model (DEVELOPERS.md, "The equations"): the tail feels the
// downwash that the wing made about l_t/V earlier.
enum class DownwashLag { none, first_order, chain };

struct Tail {
  double area = 2.2;  // key tail.area
  double x_ac = 4.6;  // key tail.x_ac
  double z_ac = -0.3;  // key tail.z_ac
  double incidence = -0.02;  // key tail.incidence
  LiftCurve lift;  // key tail.lift_slope, tail.alpha_stall, tail.stall_sharpness
  double eta = 0.9;  // key tail.eta
  double eps0 = 0.0;  // key tail.eps0
  double deps_dalpha = 0.4;  // key tail.deps_dalpha
  // the default four-stage chain puts the short period within about 2 % of a pure convection
  // delay l_t/V (tests/reference/downwash_lag.py)
  DownwashLag lag = DownwashLag::chain;  // key tail.downwash_lag
  int lag_stages = 4;  // key tail.lag_stages
  double tau_elevator = 0.5;  // key tail.tau_elevator
  double tau_tab = 0.1;  // key tail.tau_tab
};

// Elevator and its hinge moments. Ch = Ch0 + Ch_alpha alpha_t + Ch_delta delta_e
// + Ch_tab delta_tab + Ch_rate (delta_e_dot c_e / 2V); hinge moment = Ch q_t S_e c_e.
struct Elevator {
  double area = 0.8;  // key elevator.area
  double chord = 0.3;  // key elevator.chord
  double x_hinge = 4.45;  // key elevator.x_hinge
  double z_hinge = -0.3;  // key elevator.z_hinge
  double ch0 = 0.0;  // key elevator.ch0
  double ch_alpha = -0.2;  // key elevator.ch_alpha
  double ch_delta = -0.45;  // key elevator.ch_delta
  double ch_tab = -0.3;  // key elevator.ch_tab
  double ch_rate = -0.5;  // key elevator.ch_rate
  double delta_min = -0.45;  // key elevator.delta_min
  double delta_max = 0.3;  // key elevator.delta_max
  double mass = 4.0;  // key elevator.mass
  double mass_moment = 0.2;  // key elevator.mass_moment
  double inertia = 0.08;  // key elevator.inertia
};

// The circuit between stick and elevator, all given where the pilot feels it (at the stick),
// and referred to the hinge through the gearing inside the model.
struct Circuit {
  bool reversible = true;  // key circuit.reversible
  double gearing = 1.2;  // key circuit.gearing
  double stick_mass = 1.0;  // key circuit.stick_mass
  double damping = 0.0;  // key circuit.damping
  double friction = 0.0;  // key circuit.friction
  double friction_speed = 0.005;  // key circuit.friction_speed
  double centering = 0.0;  // key circuit.centering
  double centering_neutral = 0.0;  // key circuit.centering_neutral
  double downspring = 0.0;  // key circuit.downspring
  double bobweight = 0.0;  // key circuit.bobweight
  double stop_stiffness = 2e4;  // key circuit.stop_stiffness
  double stop_damping = 50.0;  // key circuit.stop_damping
  double held_stiffness = 0.0;  // key circuit.held_stiffness
  double tab_min = -0.35;  // key circuit.tab_min
  double tab_max = 0.35;  // key circuit.tab_max
  double geared_tab_ratio = 0.0;  // key circuit.geared_tab_ratio
};

struct Propulsion {
  double max_thrust = 1500.0;  // key propulsion.max_thrust
  double density_exponent = 1.0;  // key propulsion.density_exponent
  double speed_exponent = 0.0;  // key propulsion.speed_exponent
  double reference_speed = 40.0;  // key propulsion.reference_speed
  double z_thrust = 0.0;  // key propulsion.z_thrust
  double angle = 0.0;  // key propulsion.angle
};

struct MassProperties {
  double mass = 750.0;  // key mass.mass
  double pitch_inertia = 1000.0;  // key mass.pitch_inertia
  double h_cg = 0.25;  // key mass.cg
};

struct Airplane {
  WingBody wing;
  Tail tail;
  Elevator elevator;
  Circuit circuit;
  CircuitNonlinear circuit_nl;  // the circuit's nonlinear elements (circuit.hpp)
  Propulsion propulsion;
  MassProperties mass;
};

// The flight condition the airplane is trimmed at.
struct Condition {
  double altitude = 1000.0;  // key condition.altitude
  double airspeed = 50.0;  // key condition.airspeed
  double flight_path = 0.0;  // key condition.flight_path
};

}  // namespace fp
