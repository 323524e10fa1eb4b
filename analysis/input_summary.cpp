// input_summary.cpp — see input_summary.hpp.
#include "analysis/input_summary.hpp"

#include <cmath>

#include "model/atmosphere.hpp"
#include "model/dynamics.hpp"
#include "model/static.hpp"
#include "model/trim.hpp"
#include "model/units.hpp"
#include "run/run.hpp"

namespace fp {

InputSummary summarize_inputs(const Scenario& s) {
  (void)scenario_plant(s);  // a plant that cannot be built is a ScenarioError naming the keys
  const Airplane& a = s.airplane;
  InputSummary r;
  r.path = s.path;
  r.name = s.name;
  r.mass = a.mass.mass;
  r.cg = a.mass.h_cg;
  r.altitude = s.condition.altitude;
  r.airspeed = s.condition.airspeed;
  r.flight_path = s.condition.flight_path;
  r.tab_auto = s.trim.tab_auto;
  r.tab = s.trim.tab;
  r.wing_loading = a.mass.mass * units::g0 / a.wing.area;
  r.aspect_ratio = a.wing.span * a.wing.span / a.wing.area;
  r.mac = a.wing.mac;
  r.tail_volume = tail_volume(a, a.wing.h_ac);
  r.tail_arm_wing = tail_arm(a, a.wing.h_ac);
  r.tail_arm_cg = tail_arm(a, a.mass.h_cg);
  r.envelope_forward = s.envelope.cg_forward;
  r.envelope_aft = s.envelope.cg_aft;
  r.mass_moment = a.elevator.mass_moment;
  r.elevator_cg_aft_of_hinge = a.elevator.mass > 0 ? a.elevator.mass_moment / a.elevator.mass : 0.0;
  const auto stall = wing_stall(a.wing.lift);
  r.cl_max = stall.CLmax;
  r.alpha_stall = stall.alpha;
  r.stall_speed = stall_speed(a, s.condition.altitude);
  // Elevator float frequency with the airframe held: the hinge-moment equation
  // I_eff delta'' = Ch_delta q_t S_e c_e delta gives omega_e = sqrt(-Ch_delta q_t S_e c_e / I_eff),
  // I_eff = elevator inertia about the hinge + stick mass / G^2 (the circuit referred to the hinge).
  const double rho = isa_at(geopotential_altitude(s.condition.altitude)).density;
  const double G = a.circuit.gearing;
  const double I_eff = a.elevator.inertia + a.circuit.stick_mass / (G * G);
  const double q_t = a.tail.eta * 0.5 * rho * s.condition.airspeed * s.condition.airspeed;
  const double K = -a.elevator.ch_delta * q_t * a.elevator.area * a.elevator.chord;
  r.float_frequency = K > 0 ? std::sqrt(K / I_eff) : 0.0;
  r.reversible = a.circuit.reversible;
  r.gearing = G;
  r.warnings = plausibility_warnings(s);
  return r;
}

}  // namespace fp
