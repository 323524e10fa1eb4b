// keys.cpp — the one table of scenario keys (see keys.hpp), its helpers, and the key
// reference that the README shows, made from the table.
//
// Ranges are those written beside each field in model/airplane.hpp and scenario/scenario.hpp;
// where a field has no written range (array entries, the gust front) the range chosen here is
// stated in the table and so in the docs.
#include "scenario/keys.hpp"

#include "scenario/key_info.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <numbers>

namespace fp::keys {

using units::Dim;

namespace {

// Accessors into a Scenario. A captureless lambda converts to the plain function pointer the
// table holds.
#define FP_NUM(expr) [](Scenario& s) -> double& { return s.expr; }
#define FP_INT(expr) [](Scenario& s) -> int& { return s.expr; }
#define FP_FLAG(expr) [](Scenario& s) -> bool& { return s.expr; }
#define FP_TEXT(expr) [](Scenario& s) -> std::string& { return s.expr; }

constexpr double pi = std::numbers::pi;

std::vector<Key> make_table_keys() {
  std::vector<Key> t = {
      // top of the file, before any table
      {.name = "name", .kind = Kind::text, .meaning = "name of the airplane (at the top of the aircraft file)",
       .text = FP_TEXT(aircraft_name)},
      // [scenario]
      {.name = "scenario.name", .kind = Kind::text, .meaning = "short name of the case, used in reports and titles",
       .text = FP_TEXT(name)},
      {.name = "scenario.description", .kind = Kind::text, .meaning = "what the case shows, one or two sentences",
       .text = FP_TEXT(description)},

      // [wing]
      {.name = "wing.area", .dim = Dim::area, .meaning = "wing reference area S", .min = 0.05, .max = 200,
       .required = true, .num = FP_NUM(airplane.wing.area)},
      {.name = "wing.mac", .dim = Dim::length, .meaning = "mean aerodynamic chord c (the reference of every CG and neutral-point fraction)",
       .min = 0.05, .max = 10, .required = true, .num = FP_NUM(airplane.wing.mac)},
      {.name = "wing.span", .dim = Dim::length, .meaning = "wing span b", .min = 0.3, .max = 60, .required = true,
       .num = FP_NUM(airplane.wing.span)},
      {.name = "wing.lift_slope", .dim = Dim::per_angle, .meaning = "wing-body lift-curve slope in the linear range",
       .min = 0.5, .max = 10, .num = FP_NUM(airplane.wing.lift.slope)},
      {.name = "wing.alpha_zero", .dim = Dim::angle, .meaning = "wing-body zero-lift angle of attack (body axis)",
       .min = -0.3, .max = 0.3, .display = "deg", .num = FP_NUM(airplane.wing.lift.alpha_zero)},
      {.name = "wing.alpha_stall", .dim = Dim::angle, .meaning = "angle at which the wing-body lift leaves its linear law",
       .min = 0.05, .max = 0.6, .display = "deg", .num = FP_NUM(airplane.wing.lift.alpha_stall)},
      {.name = "wing.stall_sharpness", .dim = Dim::per_angle, .meaning = "how abruptly the wing-body lift blends into the post-stall law",
       .min = 5, .max = 200, .num = FP_NUM(airplane.wing.lift.stall_sharpness)},
      {.name = "wing.cl_table", .kind = Kind::lift_table, .dim = Dim::angle,
       .meaning = "optional table of [alpha, CL] pairs, alpha strictly increasing; replaces the lift law above "
                  "(linear between rows, flat-plate law beyond the ends)",
       .min = -pi, .max = pi, .display = "deg", .note = "none (the lift law)"},
      {.name = "wing.cd0", .meaning = "zero-lift drag coefficient of the whole airplane", .min = 0, .max = 0.5,
       .num = FP_NUM(airplane.wing.cd0)},
      {.name = "wing.k_induced", .meaning = "induced-drag factor k in CD = CD0 + k CL^2", .min = 0, .max = 0.5,
       .num = FP_NUM(airplane.wing.k_induced)},
      {.name = "wing.h_ac", .meaning = "wing-body aerodynamic centre, fraction of MAC aft of its leading edge",
       .min = -0.5, .max = 1, .num = FP_NUM(airplane.wing.h_ac)},
      {.name = "wing.z_ac", .dim = Dim::length, .meaning = "wing-body aerodynamic centre below the CG (negative above)",
       .min = -5, .max = 5, .num = FP_NUM(airplane.wing.z_ac)},
      {.name = "wing.cm_ac", .meaning = "pitching-moment coefficient about the wing-body aerodynamic centre",
       .min = -0.5, .max = 0.5, .num = FP_NUM(airplane.wing.cm_ac)},
      {.name = "wing.cm_alpha_fus", .dim = Dim::per_angle, .meaning = "fuselage pitching-moment slope (positive destabilises)",
       .min = -2, .max = 2, .num = FP_NUM(airplane.wing.cm_alpha_fus)},
      {.name = "wing.cm_q", .meaning = "wing-body and fuselage pitch damping dCm/d(q c/2V)", .min = -50, .max = 0,
       .num = FP_NUM(airplane.wing.cm_q)},

      // [tail]
      {.name = "tail.area", .dim = Dim::area, .meaning = "horizontal tail area S_t, elevator included", .min = 0.01,
       .max = 50, .required = true, .num = FP_NUM(airplane.tail.area)},
      {.name = "tail.x_ac", .dim = Dim::length, .meaning = "tail aerodynamic centre, aft of the MAC leading edge",
       .min = 0.1, .max = 30, .required = true, .num = FP_NUM(airplane.tail.x_ac)},
      {.name = "tail.z_ac", .dim = Dim::length, .meaning = "tail aerodynamic centre below the CG (negative above)",
       .min = -5, .max = 5, .required = true, .num = FP_NUM(airplane.tail.z_ac)},
      {.name = "tail.incidence", .dim = Dim::angle, .meaning = "tail incidence relative to the body x axis",
       .min = -0.3, .max = 0.3, .display = "deg", .num = FP_NUM(airplane.tail.incidence)},
      {.name = "tail.lift_slope", .dim = Dim::per_angle, .meaning = "tail lift-curve slope a_t (symmetric section)",
       .min = 0.5, .max = 10, .num = FP_NUM(airplane.tail.lift.slope)},
      {.name = "tail.alpha_stall", .dim = Dim::angle, .meaning = "tail angle of attack at which its lift leaves the linear law",
       .min = 0.05, .max = 0.6, .display = "deg", .num = FP_NUM(airplane.tail.lift.alpha_stall)},
      {.name = "tail.stall_sharpness", .dim = Dim::per_angle, .meaning = "how abruptly the tail lift blends into the post-stall law",
       .min = 5, .max = 200, .num = FP_NUM(airplane.tail.lift.stall_sharpness)},
      {.name = "tail.eta", .meaning = "tail dynamic-pressure ratio q_t/q", .min = 0.3, .max = 1.2,
       .num = FP_NUM(airplane.tail.eta)},
      {.name = "tail.eps0", .dim = Dim::angle, .meaning = "downwash at zero wing angle of attack", .min = -0.2,
       .max = 0.2, .display = "deg", .num = FP_NUM(airplane.tail.eps0)},
      {.name = "tail.deps_dalpha", .meaning = "downwash gradient d(epsilon)/d(alpha)", .min = 0, .max = 0.9,
       .num = FP_NUM(airplane.tail.deps_dalpha)},
      {.name = "tail.downwash_lag", .kind = Kind::choice,
       .meaning = "how the tail's delay behind the wing's downwash is modelled: none, one first-order stage, "
                  "or a chain of stages approaching a pure delay (the default chain of 4 stages gives a short period within "
                  "a few % of a pure delay; one first-order stage is 10-15 % high in frequency)",
       .choices = {"none", "first_order", "chain"},
       .get_choice = [](const Scenario& s) { return static_cast<int>(s.airplane.tail.lag); },
       .set_choice = [](Scenario& s, int i) { s.airplane.tail.lag = static_cast<DownwashLag>(i); }},
      {.name = "tail.lag_stages", .kind = Kind::integer, .meaning = "number of stages of the chain (chain only)",
       .min = 1, .max = 4, .integer = FP_INT(airplane.tail.lag_stages)},
      {.name = "tail.tau_elevator", .meaning = "elevator effectiveness d(alpha_t)/d(delta_e)", .min = 0.05, .max = 1,
       .num = FP_NUM(airplane.tail.tau_elevator)},
      {.name = "tail.tau_tab", .meaning = "tab effectiveness d(alpha_t)/d(delta_tab)", .min = 0, .max = 0.5,
       .num = FP_NUM(airplane.tail.tau_tab)},

      // [elevator]
      {.name = "elevator.area", .dim = Dim::area, .meaning = "elevator area aft of the hinge line S_e", .min = 0.005,
       .max = 20, .required = true, .num = FP_NUM(airplane.elevator.area)},
      {.name = "elevator.chord", .dim = Dim::length, .meaning = "elevator mean chord aft of the hinge c_e", .min = 0.01,
       .max = 3, .required = true, .num = FP_NUM(airplane.elevator.chord)},
      {.name = "elevator.x_hinge", .dim = Dim::length, .meaning = "hinge line, aft of the MAC leading edge", .min = 0.1,
       .max = 30, .required = true, .num = FP_NUM(airplane.elevator.x_hinge)},
      {.name = "elevator.z_hinge", .dim = Dim::length, .meaning = "hinge line below the CG (negative above)", .min = -5,
       .max = 5, .required = true, .num = FP_NUM(airplane.elevator.z_hinge)},
      {.name = "elevator.ch0", .meaning = "hinge-moment coefficient at zero angles", .min = -0.5, .max = 0.5,
       .num = FP_NUM(airplane.elevator.ch0)},
      {.name = "elevator.ch_alpha", .dim = Dim::per_angle, .meaning = "hinge-moment slope with tail angle of attack dCh/d(alpha_t)",
       .min = -2, .max = 1, .num = FP_NUM(airplane.elevator.ch_alpha)},
      {.name = "elevator.ch_delta", .dim = Dim::per_angle,
       .meaning = "hinge-moment slope with elevator deflection dCh/d(delta_e); 0 only for an irreversible circuit",
       .min = -2, .max = 1, .num = FP_NUM(airplane.elevator.ch_delta)},
      {.name = "elevator.ch_tab", .dim = Dim::per_angle, .meaning = "hinge-moment slope with tab deflection dCh/d(delta_tab)",
       .min = -2, .max = 2, .num = FP_NUM(airplane.elevator.ch_tab)},
      {.name = "elevator.ch_rate", .meaning = "aerodynamic hinge damping dCh/d(delta_e_dot c_e/2V)", .min = -20, .max = 0,
       .num = FP_NUM(airplane.elevator.ch_rate)},
      {.name = "elevator.delta_min", .dim = Dim::angle, .meaning = "trailing-edge-up stop (below 0)", .min = -1,
       .max = 0, .display = "deg", .num = FP_NUM(airplane.elevator.delta_min)},
      {.name = "elevator.delta_max", .dim = Dim::angle, .meaning = "trailing-edge-down stop (above 0)", .min = 0,
       .max = 1, .display = "deg", .num = FP_NUM(airplane.elevator.delta_max)},
      {.name = "elevator.mass", .dim = Dim::mass, .meaning = "elevator and tab mass", .min = 0, .max = 200,
       .required = true, .num = FP_NUM(airplane.elevator.mass)},
      {.name = "elevator.mass_moment", .dim = Dim::mass_moment,
       .meaning = "static mass moment about the hinge, positive when the centre of mass is aft of it (unbalanced)",
       .min = -20, .max = 20, .required = true, .num = FP_NUM(airplane.elevator.mass_moment)},
      {.name = "elevator.inertia", .dim = Dim::inertia, .meaning = "moment of inertia about the hinge line",
       .min = 1e-4, .max = 50, .required = true, .num = FP_NUM(airplane.elevator.inertia)},

      // [circuit]
      {.name = "circuit.reversible", .kind = Kind::boolean,
       .meaning = "true for a mechanical circuit; false for a powered (irreversible) one, whose elevator cannot float: held case only",
       .flag = FP_FLAG(airplane.circuit.reversible)},
      {.name = "circuit.gearing", .dim = Dim::gearing,
       .meaning = "elevator angle per stick travel; a pull moves the trailing edge up", .min = 0.1, .max = 20,
       .display = "deg/in", .num = FP_NUM(airplane.circuit.gearing)},
      {.name = "circuit.stick_mass", .dim = Dim::mass, .meaning = "equivalent mass of stick and circuit, at the stick",
       .min = 0, .max = 50, .num = FP_NUM(airplane.circuit.stick_mass)},
      {.name = "circuit.damping", .dim = Dim::damping, .meaning = "viscous damping at the stick", .min = 0, .max = 1e4,
       .num = FP_NUM(airplane.circuit.damping)},
      {.name = "circuit.friction", .dim = Dim::force, .meaning = "Coulomb breakout force at the stick", .min = 0,
       .max = 500, .num = FP_NUM(airplane.circuit.friction)},
      {.name = "circuit.friction_law", .kind = Kind::choice,
       .meaning = "friction law: stiction (stuck until the holding moment exceeds the breakout, then sliding; "
                  "the elevator does not creep) or smooth (tanh law over circuit.friction_speed: the stick creeps "
                  "under any load below the breakout)",
       .choices = {"stiction", "smooth"},
       .get_choice = [](const Scenario& s) { return static_cast<int>(s.airplane.circuit_nl.friction_law); },
       .set_choice = [](Scenario& s, int i) { s.airplane.circuit_nl.friction_law = static_cast<FrictionLaw>(i); }},
      {.name = "circuit.sliding_friction", .dim = Dim::force,
       .meaning = "sliding (kinetic) friction force at the stick, at most the breakout circuit.friction; 0 = equal "
                  "to the breakout (stiction law only)",
       .min = 0.001, .max = 500, .zero_ok = true, .num = FP_NUM(airplane.circuit_nl.sliding_friction)},
      {.name = "circuit.free_play", .dim = Dim::angle,
       .meaning = "total free play (backlash) between the stick side and the elevator, as an angle at the surface; "
                  "the elevator floats inside it, also with the stick held; its ends meet in the stops' contact "
                  "law (circuit.stop_stiffness, stop_damping); needs circuit.stick_mass > 0",
       .min = 0, .max = 0.2, .display = "deg", .num = FP_NUM(airplane.circuit_nl.free_play)},
      {.name = "circuit.friction_speed", .dim = Dim::speed,
       .meaning = "smooth friction law only: stick speed over which the friction force is smoothed (tanh law)",
       .min = 1e-5, .max = 0.5, .num = FP_NUM(airplane.circuit.friction_speed)},
      {.name = "circuit.centering", .dim = Dim::stiffness, .meaning = "centering spring rate at the stick", .min = 0,
       .max = 1e5, .num = FP_NUM(airplane.circuit.centering)},
      {.name = "circuit.centering_neutral", .dim = Dim::angle,
       .meaning = "elevator angle at which the centering spring is relaxed", .min = -0.5, .max = 0.5,
       .display = "deg", .num = FP_NUM(airplane.circuit.centering_neutral)},
      {.name = "circuit.downspring", .dim = Dim::force, .meaning = "downspring preload, a push on the stick", .min = 0,
       .max = 500, .num = FP_NUM(airplane.circuit.downspring)},
      {.name = "circuit.bobweight", .dim = Dim::force, .meaning = "bobweight push on the stick per g of load factor",
       .min = 0, .max = 500, .note = "per g", .num = FP_NUM(airplane.circuit.bobweight)},
      {.name = "circuit.stop_stiffness", .dim = Dim::angular_stiffness, .meaning = "stiffness of the stop contact, at the hinge",
       .min = 1, .max = 1e7, .num = FP_NUM(airplane.circuit.stop_stiffness)},
      {.name = "circuit.stop_damping", .dim = Dim::angular_damping, .meaning = "damping of the stop contact, at the hinge",
       .min = 0, .max = 1e5, .num = FP_NUM(airplane.circuit.stop_damping)},
      {.name = "circuit.held_stiffness", .dim = Dim::stiffness,
       .meaning = "held stick: circuit stiffness between hand and surface, at the stick (0 = rigid hold)", .min = 100,
       .max = 1e7, .zero_ok = true, .num = FP_NUM(airplane.circuit.held_stiffness)},
      {.name = "circuit.tab_min", .dim = Dim::angle, .meaning = "trim tab's lower limit (below 0)", .min = -1,
       .max = 0, .display = "deg", .num = FP_NUM(airplane.circuit.tab_min)},
      {.name = "circuit.tab_max", .dim = Dim::angle, .meaning = "trim tab's upper limit (above 0)", .min = 0, .max = 1,
       .display = "deg", .num = FP_NUM(airplane.circuit.tab_max)},
      {.name = "circuit.geared_tab_ratio",
       .meaning = "geared tab deflection per elevator deflection (positive anti-balance, negative balance)", .min = -3,
       .max = 3, .num = FP_NUM(airplane.circuit.geared_tab_ratio)},

      // [propulsion]
      {.name = "propulsion.max_thrust", .dim = Dim::force, .meaning = "full-throttle static thrust at sea level",
       .min = 0, .max = 1e5, .num = FP_NUM(airplane.propulsion.max_thrust)},
      {.name = "propulsion.density_exponent", .meaning = "thrust scales with (rho/rho0)^n", .min = 0, .max = 2,
       .num = FP_NUM(airplane.propulsion.density_exponent)},
      {.name = "propulsion.speed_exponent",
       .meaning = "thrust scales with (V/V_ref)^n: 0 jet-like, -1 constant power", .min = -1.5, .max = 0,
       .num = FP_NUM(airplane.propulsion.speed_exponent)},
      {.name = "propulsion.reference_speed", .dim = Dim::speed, .meaning = "reference speed V_ref of the thrust law",
       .min = 1, .max = 300, .display = "kt", .num = FP_NUM(airplane.propulsion.reference_speed)},
      {.name = "propulsion.z_thrust", .dim = Dim::length,
       .meaning = "thrust line below the CG (positive gives a nose-up moment)", .min = -3, .max = 3,
       .num = FP_NUM(airplane.propulsion.z_thrust)},
      {.name = "propulsion.angle", .dim = Dim::angle, .meaning = "thrust line angle to body x, positive up",
       .min = -0.3, .max = 0.3, .display = "deg", .num = FP_NUM(airplane.propulsion.angle)},

      // [mass]
      {.name = "mass.mass", .dim = Dim::mass, .meaning = "total mass, elevator included", .min = 1, .max = 20000,
       .required = true, .num = FP_NUM(airplane.mass.mass)},
      {.name = "mass.pitch_inertia", .dim = Dim::inertia,
       .meaning = "pitch moment of inertia about the CG, elevator at zero", .min = 0.01, .max = 1e6,
       .required = true, .num = FP_NUM(airplane.mass.pitch_inertia)},
      {.name = "mass.cg", .meaning = "centre of gravity, fraction of MAC aft of its leading edge (alias: cg)",
       .min = -0.5, .max = 1.5, .required = true, .num = FP_NUM(airplane.mass.h_cg)},

      // [envelope]
      {.name = "envelope.cg_forward", .meaning = "forward CG limit, fraction of MAC", .min = -0.5, .max = 1.5,
       .num = FP_NUM(envelope.cg_forward)},
      {.name = "envelope.cg_aft", .meaning = "aft CG limit, fraction of MAC", .min = -0.5, .max = 1.5,
       .num = FP_NUM(envelope.cg_aft)},
      {.name = "envelope.min_speed", .dim = Dim::speed,
       .meaning = "slowest speed the envelope covers, e.g. 1.3 V_S (0 = chosen from the stall)", .min = 1,
       .max = 300, .display = "kt", .zero_ok = true, .num = FP_NUM(envelope.min_speed)},
      {.name = "envelope.max_speed", .dim = Dim::speed, .meaning = "fastest speed of the envelope, V_NE or V_D (0 = chosen)",
       .min = 1, .max = 300, .display = "kt", .zero_ok = true, .num = FP_NUM(envelope.max_speed)},
      // [envelope] weights and load factor: the corners the report and `floatpitch matrix` cover
      {.name = "envelope.mass_min", .dim = Dim::mass,
       .meaning = "lightest mass of the stated envelope, a corner of the report and of `matrix` (0 = mass.mass)",
       .min = 1, .max = 20000, .zero_ok = true, .num = FP_NUM(envelope.mass_min)},
      {.name = "envelope.mass_max", .dim = Dim::mass,
       .meaning = "heaviest mass of the stated envelope, the maximum weight W of the stick-force criteria (0 = mass.mass)",
       .min = 1, .max = 20000, .zero_ok = true, .num = FP_NUM(envelope.mass_max)},
      {.name = "envelope.limit_load_factor",
       .meaning = "positive limit maneuvering load factor of the airplane's category, where the maneuvering stick "
                  "force is read (default 3.8: normal category, flaps up, 14 CFR Part 23 Appendix A Table 1, 1-1-14 "
                  "edition)",
       .min = 1.5, .max = 10, .num = FP_NUM(envelope.limit_load_factor)},

      // [condition]
      {.name = "condition.altitude", .dim = Dim::length, .meaning = "geometric altitude of the trim condition",
       .min = 0, .max = 20000, .required = true, .display = "ft", .num = FP_NUM(condition.altitude)},
      {.name = "condition.airspeed", .dim = Dim::speed, .meaning = "true airspeed of the trim condition", .min = 1,
       .max = 300, .required = true, .display = "kt", .num = FP_NUM(condition.airspeed)},
      {.name = "condition.flight_path", .dim = Dim::angle, .meaning = "flight-path angle, climb positive", .min = -0.5,
       .max = 0.5, .display = "deg", .num = FP_NUM(condition.flight_path)},

      // [trim]
      {.name = "trim.tab", .kind = Kind::tab_setting, .dim = Dim::angle,
       .meaning = "\"auto\" sets the tab for zero stick force at the trim condition; an angle fixes it "
                  "(within circuit.tab_min..tab_max)",
       .min = -1, .max = 1, .display = "deg", .note = "\"auto\""},

      // [run]
      {.name = "run.duration", .dim = Dim::time, .meaning = "length of the run", .min = 0.1, .max = 3600,
       .num = FP_NUM(run.duration)},
      {.name = "run.output_step", .dim = Dim::time, .meaning = "step of the output grid", .min = 1e-4, .max = 10,
       .num = FP_NUM(run.output_step)},
      {.name = "run.rel_tol", .meaning = "integrator relative tolerance", .min = 1e-12, .max = 1e-3,
       .num = FP_NUM(run.rel_tol)},
      {.name = "run.abs_tol", .meaning = "integrator absolute tolerance (state units)", .min = 1e-14, .max = 1e-3,
       .num = FP_NUM(run.abs_tol)},
      {.name = "run.alpha_limit", .dim = Dim::angle, .meaning = "angle of attack beyond which the airplane has departed",
       .min = 0.1, .max = 1.5, .display = "deg", .num = FP_NUM(run.alpha_limit)},
      {.name = "run.q_limit", .dim = Dim::angular_rate, .meaning = "pitch rate beyond which the airplane has departed",
       .min = 0.1, .max = 10, .display = "deg/s", .num = FP_NUM(run.q_limit)},
      {.name = "run.min_airspeed_ratio", .meaning = "airspeed below this fraction of the trim speed counts as departed",
       .min = 0.05, .max = 0.95, .num = FP_NUM(run.min_airspeed_ratio)},
      {.name = "run.max_airspeed_ratio",
       .meaning = "airspeed above this multiple of the trim speed counts as departed (overspeed) when the aircraft "
                  "file states no envelope.max_speed; with one, above envelope.max_speed",
       .min = 1.05, .max = 20, .num = FP_NUM(run.max_airspeed_ratio)},
      {.name = "run.floor_altitude", .dim = Dim::length,
       .meaning = "altitude below which the airplane has departed (0: the ground of the flat-Earth model); at most "
                  "the condition's altitude",
       .min = -1000, .max = 30000, .num = FP_NUM(run.floor_altitude)},
      {.name = "run.theta_limit", .dim = Dim::angle, .meaning = "pitch attitude beyond which the airplane has departed",
       .min = 5.0 * units::deg, .max = 180.0 * units::deg, .display = "deg", .num = FP_NUM(run.theta_limit)},
      {.name = "run.load_factor_max",
       .meaning = "load factor above which the airplane has departed (default: ultimate, 1.5 x 3.8, of the normal "
                  "category)",
       .min = 1.1, .max = 20, .num = FP_NUM(run.load_factor_max)},
      {.name = "run.load_factor_min",
       .meaning = "load factor below which the airplane has departed (default: ultimate, 1.5 x -1.52, of the normal "
                  "category)",
       .min = -20, .max = 0.9, .num = FP_NUM(run.load_factor_min)},
      {.name = "run.controls", .kind = Kind::choice,
       .meaning = "cases to run: stick held, stick free, or both side by side (irreversible circuit: held only)",
       .choices = {"held", "free", "both"},
       .note = "\"both\" (\"held\" for an irreversible circuit)",
       .get_choice = [](const Scenario& s) { return static_cast<int>(s.run.controls); },
       .set_choice = [](Scenario& s, int i) { s.run.controls = static_cast<ControlsChoice>(i); }},
      {.name = "run.let_go_time", .dim = Dim::time, .meaning = "free case: time at which the pilot lets go (at most run.duration)",
       .min = 0, .max = 3600, .num = FP_NUM(run.let_go_time)},
      {.name = "run.gust_front_speed", .dim = Dim::speed,
       .meaning = "speed at which the whole gust field moves towards the airplane (a gust front)", .min = 0,
       .max = 100, .num = FP_NUM(gust_front_speed)},

      // [turbulence] (docs/gusts.md; model/turbulence.hpp)
      {.name = "turbulence.model", .kind = Kind::choice,
       .meaning = "continuous turbulence: none, the Dryden spectra, or the von Karman spectra (rational "
                  "approximation, variance 3-4 % low)",
       .choices = {"none", "dryden", "von_karman"},
       .get_choice = [](const Scenario& s) { return static_cast<int>(s.turbulence.model); },
       .set_choice = [](Scenario& s, int i) { s.turbulence.model = static_cast<TurbulenceKind>(i); }},
      {.name = "turbulence.severity", .kind = Kind::choice,
       .meaning = "intensity from the published tables: light (probability of exceedance 1e-2), moderate (1e-3), "
                  "severe (1e-5); at low altitude the wind at 20 ft is 15, 30, 45 kt",
       .choices = {"light", "moderate", "severe"},
       .get_choice = [](const Scenario& s) { return static_cast<int>(s.turbulence.severity); },
       .set_choice = [](Scenario& s, int i) { s.turbulence.severity = static_cast<TurbulenceSeverity>(i); }},
      {.name = "turbulence.probability",
       .meaning = "probability of exceedance instead of severity (0 = use severity); between the tabulated "
                  "1e-2, 1e-3 and 1e-5 the intensity is interpolated in log10(P)",
       .min = 1e-5, .max = 1e-2, .zero_ok = true, .num = FP_NUM(turbulence.probability)},
      {.name = "turbulence.components", .kind = Kind::choice,
       .meaning = "which components to generate: both, vertical (w) only, horizontal (u, along the path) only",
       .choices = {"both", "vertical", "horizontal"},
       .get_choice = [](const Scenario& s) { return static_cast<int>(s.turbulence.components); },
       .set_choice = [](Scenario& s, int i) { s.turbulence.components = static_cast<TurbulenceComponents>(i); }},
      {.name = "turbulence.sigma_u", .dim = Dim::speed,
       .meaning = "longitudinal intensity sigma_u, true airspeed (0 = from height and severity)", .min = 0.01,
       .max = 30, .display = "ft/s", .zero_ok = true, .num = FP_NUM(turbulence.sigma_u)},
      {.name = "turbulence.sigma_w", .dim = Dim::speed,
       .meaning = "vertical intensity sigma_w, true airspeed (0 = from height and severity)", .min = 0.01, .max = 30,
       .display = "ft/s", .zero_ok = true, .num = FP_NUM(turbulence.sigma_w)},
      {.name = "turbulence.scale_u", .dim = Dim::length, .meaning = "longitudinal scale length L_u (0 = from height)",
       .min = 1, .max = 1e5, .display = "ft", .zero_ok = true, .num = FP_NUM(turbulence.scale_u)},
      {.name = "turbulence.scale_w", .dim = Dim::length, .meaning = "vertical scale length L_w (0 = from height)",
       .min = 1, .max = 1e5, .display = "ft", .zero_ok = true, .num = FP_NUM(turbulence.scale_w)},
      {.name = "turbulence.height", .dim = Dim::length,
       .meaning = "height above ground used for intensities and scale lengths (0 = condition.altitude)", .min = 3,
       .max = 20000, .display = "ft", .zero_ok = true, .num = FP_NUM(turbulence.height)},
      {.name = "turbulence.seed", .kind = Kind::integer, .meaning = "random seed: the same seed gives the same field",
       .min = 0, .max = 2147483647, .integer = FP_INT(turbulence.seed)},
      {.name = "turbulence.seeds", .kind = Kind::integer,
       .meaning = "number of seeds `floatpitch run` uses (seed, seed+1, ...), run in parallel, with means and "
                  "spreads (--seeds overrides)",
       .min = 1, .max = 10000, .integer = FP_INT(turbulence.seeds)},
      {.name = "turbulence.spacing", .dim = Dim::length,
       .meaning = "sample spacing of the generated record (0 = half the wing-to-tail distance, at most a tenth "
                  "of the smaller scale length); read between samples by a cubic spline",
       .min = 0.01, .max = 100, .zero_ok = true, .num = FP_NUM(turbulence.spacing)},
      {.name = "turbulence.start_time", .dim = Dim::time,
       .meaning = "time at which the CG enters the turbulence (at most run.duration)", .min = 0, .max = 3600,
       .num = FP_NUM(turbulence.start_time)},
      {.name = "turbulence.fade_in", .dim = Dim::time,
       .meaning = "time over which the turbulence rises to full strength (half cosine); statistics start after it",
       .min = 0, .max = 600, .num = FP_NUM(turbulence.fade_in)},
  };
  return t;
}

std::vector<Key> make_event_keys() {
  return {
      {.name = "event.time", .dim = Dim::time, .meaning = "when the event happens (0..run.duration)", .min = 0,
       .max = 3600, .required = true, .note = "required"},
      {.name = "event.action", .kind = Kind::choice,
       .meaning = "let_go and take_hold (free case), tab (both cases), pulse (free case: a pilot force for a "
                  "time), elevator (held case: the held stick moves the elevator)",
       .required = true, .choices = {"let_go", "take_hold", "tab", "pulse", "elevator"}, .note = "required"},
      {.name = "event.tab", .dim = Dim::angle, .meaning = "action tab: the new tab setting (within circuit.tab_min..tab_max)",
       .min = -1, .max = 1, .display = "deg", .note = "required by tab"},
      {.name = "event.force", .dim = Dim::force, .meaning = "action pulse: pilot force on the stick, pull positive",
       .min = -2000, .max = 2000, .note = "required by pulse"},
      {.name = "event.duration", .dim = Dim::time,
       .meaning = "pulse: how long the force lasts (> 0); elevator: how long the input lasts (0 = a step that stays)",
       .min = 0, .max = 3600, .note = "required by pulse; 0 for elevator"},
      {.name = "event.elevator", .dim = Dim::angle, .meaning = "action elevator: elevator change from trim, trailing edge down positive",
       .min = -1, .max = 1, .display = "deg", .note = "required by elevator"},
  };
}

std::vector<Key> make_gust_keys() {
  return {
      {.name = "gust.shape", .kind = Kind::choice,
       .meaning = "one_minus_cosine: (A/2)(1 - cos(pi s/H)) over 2H; sharp_edge: A from the start on; "
                  "ramp: rises linearly to A over H; train: `count` 1-cosine gusts, `spacing` apart",
       .choices = {"one_minus_cosine", "sharp_edge", "ramp", "train"}, .note = "\"one_minus_cosine\""},
      {.name = "gust.component", .kind = Kind::choice,
       .meaning = "vertical (up positive) or horizontal (along the flight path, a tail gust positive)",
       .choices = {"vertical", "horizontal"}, .note = "\"vertical\""},
      {.name = "gust.length", .dim = Dim::length,
       .meaning = "gradient distance H (1-cosine: start to peak; ramp: the rise)", .min = 0, .max = 1e4,
       .required = true, .min_open = true, .note = "required; a derived rule: 12.5 MAC"},
      {.name = "gust.amplitude", .dim = Dim::speed, .meaning = "peak gust velocity A, true airspeed", .min = -50,
       .max = 50, .required = true, .display = "kt", .note = "required unless a rule is given"},
      {.name = "gust.rule", .kind = Kind::choice,
       .meaning = "amplitude from a design rule instead (EAS, converted to true airspeed at the altitude): "
                  "derived_vc / derived_vd = U_de 50 / 25 ft/s of 14 CFR 23.333(c) and 23.341(c) before amdt 64, "
                  "CS 23.341 (up to 20000 ft); gradient_distance = U_ref F_g (H/350 ft)^(1/6) of 14 CFR 25.341(a) "
                  "(transport category; up to 15000 ft). Design conventions, not a forecast",
       .choices = {"none", "derived_vc", "derived_vd", "gradient_distance"}, .note = "\"none\""},
      {.name = "gust.design_velocity", .dim = Dim::speed,
       .meaning = "with a rule: its reference velocity U_de or U_ref, EAS, replacing the rule's value (negative = "
                  "a down gust)",
       .min = -50, .max = 50, .display = "ft/s", .note = "the rule's"},
      {.name = "gust.alleviation", .meaning = "rule gradient_distance: flight profile alleviation factor F_g",
       .min = 0, .max = 1, .min_open = true, .note = "1"},
      {.name = "gust.count", .kind = Kind::integer, .meaning = "shape train: number of 1-cosine gusts", .min = 1,
       .max = 1000, .note = "required by train"},
      {.name = "gust.spacing", .dim = Dim::length,
       .meaning = "shape train: distance from the start of one gust to the start of the next", .min = 0,
       .max = 1e5, .min_open = true, .note = "required by train"},
      {.name = "gust.tune_min", .dim = Dim::length,
       .meaning = "tuned-gust search: smallest gradient distance H tried (with tune_max; one gust at most)",
       .min = 0, .max = 1e4, .min_open = true, .note = "none"},
      {.name = "gust.tune_max", .dim = Dim::length,
       .meaning = "tuned-gust search: largest gradient distance H tried (more than tune_min)", .min = 0,
       .max = 1e4, .min_open = true, .note = "none"},
      {.name = "gust.tune_points", .kind = Kind::integer,
       .meaning = "tuned-gust search: grid points (log-spaced) before the refinement", .min = 3, .max = 200,
       .note = "12"},
      {.name = "gust.start", .dim = Dim::length,
       .meaning = "distance along the path, from the CG's position at time 0, at which the gust begins",
       .min = 0, .max = 1e7, .note = "one of start, start_time"},
      {.name = "gust.start_time", .dim = Dim::time,
       .meaning = "time at which the gust's leading edge reaches the CG; start = (V cos(gamma) + front speed) * "
                  "start_time",
       .min = 0, .max = 3600, .note = "one of start, start_time"},
  };
}

#undef FP_NUM
#undef FP_INT
#undef FP_FLAG
#undef FP_TEXT

const std::vector<Key>& all_table_keys() {
  static const std::vector<Key> t = make_table_keys();
  return t;
}
const std::vector<Key>& all_event_keys() {
  static const std::vector<Key> t = make_event_keys();
  return t;
}
const std::vector<Key>& all_gust_keys() {
  static const std::vector<Key> t = make_gust_keys();
  return t;
}

struct Alias {
  std::string_view alias, key;
};
constexpr Alias aliases[] = {{"cg", "mass.cg"}};

}  // namespace

std::span<const Key> table_keys() { return all_table_keys(); }
std::span<const Key> event_keys() { return all_event_keys(); }
std::span<const Key> gust_keys() { return all_gust_keys(); }

const std::vector<std::string>& table_names() {
  static const std::vector<std::string> names = [] {
    std::vector<std::string> n;
    for (const auto& k : all_table_keys()) {
      std::string t(table_of(k));
      if (!t.empty() && std::find(n.begin(), n.end(), t) == n.end()) n.push_back(t);
    }
    return n;
  }();
  return names;
}

const Key* find(std::string_view name, bool with_aliases) {
  if (with_aliases)
    for (const auto& a : aliases)
      if (a.alias == name) name = a.key;
  for (const auto& k : all_table_keys())
    if (name == k.name) return &k;
  return nullptr;
}

const Key* find_in(std::span<const Key> list, std::string_view short_nm) {
  for (const auto& k : list)
    if (short_name(k) == short_nm) return &k;
  return nullptr;
}

std::string_view short_name(const Key& k) {
  std::string_view n = k.name;
  const auto dot = n.find('.');
  return dot == std::string_view::npos ? n : n.substr(dot + 1);
}

std::string_view table_of(const Key& k) {
  std::string_view n = k.name;
  const auto dot = n.find('.');
  return dot == std::string_view::npos ? std::string_view{} : n.substr(0, dot);
}

const char* display_unit(const Key& k) {
  return *k.display ? k.display : (k.dim == Dim::none ? "" : units::si_unit(k.dim));
}

double display_factor(const Key& k) {
  if (!*k.display) return 1.0;
  const auto f = units::factor(k.dim, k.display);
  return f ? *f : 1.0;
}

std::string fmt(double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.6g", v);
  return buf;
}

std::string fmt_exact(double v) {
  char buf[64];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

namespace {

std::string with_unit(const std::string& number, const char* unit) {
  return *unit ? number + " " + unit : number;
}

std::string range_in(const Key& k, double f, const char* unit) {
  const std::string lo = fmt(k.min / f), hi = fmt(k.max / f);
  std::string r = k.min_open ? "more than " + lo + ", up to " + hi : lo + ".." + hi;
  if (k.zero_ok) r = "0, or " + r;
  return with_unit(r, unit);
}

}  // namespace

std::string range_text(const Key& k) {
  const char* du = display_unit(k);
  const double f = display_factor(k);
  std::string r = range_in(k, f, du);
  if (f != 1.0) r += " (" + range_in(k, 1.0, units::si_unit(k.dim)) + ")";
  return r;
}

std::string allowed_text(const Key& k) {
  switch (k.kind) {
    case Kind::number:
    case Kind::integer: return range_text(k);
    case Kind::boolean: return "true, false";
    case Kind::choice: {
      std::string r;
      for (const char* c : k.choices) r += (r.empty() ? "\"" : ", \"") + std::string(c) + "\"";
      return r;
    }
    case Kind::text: return "any ASCII text";
    case Kind::lift_table: return "alpha " + range_text(k) + ", at least 2 rows";
    case Kind::tab_setting: return "\"auto\", or " + range_text(k);
  }
  return "";
}

std::string value_text(const Key& k, double si) {
  const double f = display_factor(k);
  std::string r = with_unit(fmt(si / f), display_unit(k));
  if (f != 1.0) r += " (" + with_unit(fmt(si), units::si_unit(k.dim)) + ")";
  return r;
}

std::optional<std::string> range_problem(const Key& k, double si) {
  if (!std::isfinite(si)) return std::string("must be a finite number");
  if (k.kind == Kind::integer && si != std::floor(si)) return "must be a whole number, " + range_text(k);
  if (k.zero_ok && si == 0.0) return std::nullopt;
  const bool low = k.min_open ? si <= k.min : si < k.min;
  if (low || si > k.max) return value_text(k, si) + " is outside the allowed range " + range_text(k);
  return std::nullopt;
}

std::size_t edit_distance(std::string_view a, std::string_view b) {
  // Optimal string alignment: Levenshtein plus the swap of two neighbours ("aera" -> "area").
  const std::size_t n = a.size(), m = b.size();
  std::vector<std::vector<std::size_t>> d(n + 1, std::vector<std::size_t>(m + 1));
  for (std::size_t i = 0; i <= n; ++i) d[i][0] = i;
  for (std::size_t j = 0; j <= m; ++j) d[0][j] = j;
  for (std::size_t i = 1; i <= n; ++i)
    for (std::size_t j = 1; j <= m; ++j) {
      const std::size_t cost = a[i - 1] == b[j - 1] ? 0 : 1;
      d[i][j] = std::min({d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost});
      if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1])
        d[i][j] = std::min(d[i][j], d[i - 2][j - 2] + 1);
    }
  return d[n][m];
}

std::string nearest(std::string_view word, const std::vector<std::string>& candidates) {
  // Long words are compared only by a prefix: a typo is short, and this keeps the cost bounded
  // whatever the input.
  if (word.size() > 64) word = word.substr(0, 64);
  const std::size_t allowed = word.size() <= 3 ? 1 : word.size() <= 6 ? 2 : 3;
  std::string best;
  std::size_t best_d = allowed + 1;
  for (const auto& c : candidates) {
    const std::size_t d = edit_distance(word, c);
    if (d < best_d) {
      best_d = d;
      best = c;
    }
  }
  return best;
}

}  // namespace fp::keys

// ---------------------------------------------------------------------------------------
// The key reference for the README, made from the table.

namespace fp {

namespace {

std::string default_text(const keys::Key& k) {
  using keys::Kind;
  if (k.required) return "required";
  const bool stored = k.num || k.integer || k.flag || k.text || k.get_choice;
  if (!stored) return k.note;  // array entries and keys with a special default
  Scenario d;
  switch (k.kind) {
    case Kind::number: return keys::value_text(k, k.num(d));
    case Kind::integer: return std::to_string(k.integer(d));
    case Kind::boolean: return k.flag(d) ? "true" : "false";
    case Kind::choice:
      if (!*k.note) return std::string("\"") + k.choices[static_cast<std::size_t>(k.get_choice(d))] + "\"";
      return k.note;
    case Kind::text: return "\"\"";
    case Kind::lift_table:
    case Kind::tab_setting: return k.note;
  }
  return "";
}


std::string unit_text(const keys::Key& k) {
  using keys::Kind;
  if (k.kind == Kind::lift_table) return "rad, -";
  if (k.kind != Kind::number && k.kind != Kind::tab_setting) return "";
  std::string u = units::si_unit(k.dim);
  if (*k.note && k.kind == Kind::number && std::string_view(k.note) == "per g") u += " per g";
  return u;
}

void table_rows(std::string& out, std::span<const keys::Key> list) {
  for (const auto& k : list)
    out += "| `" + std::string(k.name) + "` | " + unit_text(k) + " | " + k.meaning + " | " + keys::allowed_text(k) +
           " | " + default_text(k) + " |\n";
}

}  // namespace

std::string key_reference_markdown() {
  std::string out;
  out +=
      "Values are numbers in SI units with angles in radians (integers are accepted), or strings "
      "\"<number> <unit>\" such as \"110 kt\", \"6500 ft\" or \"3 deg\". Keys without a table (`name`, "
      "`include`) come at the top of a file, before any table. A file may say "
      "`include = \"relative/path.toml\"`: the included file is read first and the including file "
      "overrides its keys (a whole array such as `[[event]]` or `wing.cl_table` is replaced, not "
      "merged); `--set key=value` overrides both. The alias `cg` stands for `mass.cg`.\n\n";
  out += "| key | unit (SI) | meaning | allowed range | default |\n|---|---|---|---|---|\n";
  table_rows(out, keys::table_keys());
  out += "\nEach `[[event]]` (sorted by time when loaded):\n\n";
  out += "| key | unit (SI) | meaning | allowed range | default |\n|---|---|---|---|---|\n";
  table_rows(out, keys::event_keys());
  out += "\nEach `[[gust]]` (give exactly one of `start` and `start_time`; it must begin before the run ends):\n\n";
  out += "| key | unit (SI) | meaning | allowed range | default |\n|---|---|---|---|---|\n";
  table_rows(out, keys::gust_keys());
  out += "\nUnits accepted in strings, by dimension:\n\n| dimension | SI | accepted |\n|---|---|---|\n";
  const units::Dim dims[] = {units::Dim::none, units::Dim::length, units::Dim::area, units::Dim::mass,
                             units::Dim::force, units::Dim::speed, units::Dim::angle, units::Dim::per_angle,
                             units::Dim::angular_rate, units::Dim::time, units::Dim::inertia,
                             units::Dim::mass_moment, units::Dim::stiffness, units::Dim::damping,
                             units::Dim::angular_stiffness, units::Dim::angular_damping, units::Dim::gearing};
  for (auto d : dims)
    out += std::string("| ") + units::dim_name(d) + " | " + units::si_unit(d) + " | " + units::accepted_units(d) +
           " |\n";
  return out;
}

}  // namespace fp
