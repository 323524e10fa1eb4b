// support.hpp — test airplanes built in code. Their data are invented for the tests (plausible
// light-airplane magnitudes); what the tests check against are published formulas, named
// beside each check, not these numbers.
#pragma once

#include "model/airplane.hpp"
#include "model/units.hpp"

namespace fp::test {

// A conventional light airplane, linear-ish aerodynamics (high stall angles), elevator with
// no mass moment and no circuit springs unless a test adds them.
inline Airplane plain_airplane() {
  Airplane a;
  const double d = units::deg;
  a.wing.area = 12.0;
  a.wing.mac = 1.3;
  a.wing.span = 9.0;
  a.wing.lift.slope = 4.8;
  a.wing.lift.alpha_zero = -2.0 * d;
  a.wing.lift.alpha_stall = 30.0 * d;
  a.wing.lift.stall_sharpness = 200.0;
  a.wing.cd0 = 0.03;
  a.wing.k_induced = 0.05;
  a.wing.h_ac = 0.25;
  a.wing.z_ac = 0.0;
  a.wing.cm_ac = -0.05;
  a.wing.cm_alpha_fus = 0.0;
  a.wing.cm_q = -2.0;
  a.tail.area = 2.4;
  a.tail.x_ac = 4.8;
  a.tail.z_ac = 0.0;
  a.tail.incidence = -1.0 * d;
  a.tail.lift.slope = 3.6;
  a.tail.lift.alpha_stall = 30.0 * d;
  a.tail.lift.stall_sharpness = 200.0;
  a.tail.eta = 0.9;
  a.tail.eps0 = 0.0;
  a.tail.deps_dalpha = 0.4;
  a.tail.lag = DownwashLag::none;
  a.tail.tau_elevator = 0.5;
  a.tail.tau_tab = 0.08;
  a.elevator.area = 0.8;
  a.elevator.chord = 0.33;
  a.elevator.x_hinge = 4.65;
  a.elevator.z_hinge = 0.0;
  a.elevator.ch0 = 0.0;
  a.elevator.ch_alpha = -0.17;
  a.elevator.ch_delta = -0.38;
  a.elevator.ch_tab = -0.23;
  a.elevator.ch_rate = -1.0;
  a.elevator.delta_min = -25.0 * d;
  a.elevator.delta_max = 15.0 * d;
  a.elevator.mass = 0.0;
  a.elevator.mass_moment = 0.0;
  a.elevator.inertia = 0.12;
  a.circuit.gearing = 3.0;
  a.circuit.stick_mass = 1.5;
  a.circuit.damping = 20.0;
  a.circuit.friction = 0.0;
  a.circuit.tab_min = -20.0 * d;
  a.circuit.tab_max = 20.0 * d;
  a.propulsion.max_thrust = 2000.0;
  a.propulsion.density_exponent = 1.0;
  a.propulsion.speed_exponent = 0.0;
  a.propulsion.reference_speed = 40.0;
  a.propulsion.z_thrust = 0.0;
  a.mass.mass = 750.0;
  a.mass.pitch_inertia = 1100.0;
  a.mass.h_cg = 0.25;
  return a;
}

inline Condition cruise(double V = 55.0, double h = 1000.0) {
  Condition c;
  c.airspeed = V;
  c.altitude = h;
  c.flight_path = 0.0;
  return c;
}

}  // namespace fp::test
