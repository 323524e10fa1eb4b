// input_summary.hpp — what `floatpitch check` tells about a scenario before any analysis: the
// flight condition, derived sizes (wing loading, aspect ratio, tail volume and arm), the stall,
// the elevator's mass balance and its float frequency, and the plausibility warnings of the
// scenario layer. Computed here once; output/ prints it.
#pragma once

#include <string>
#include <vector>

#include "scenario/scenario.hpp"

namespace fp {

struct InputSummary {
  std::string path, name;
  double mass = 0, cg = 0, altitude = 0, airspeed = 0, flight_path = 0;  // SI, CG fraction of MAC
  bool tab_auto = true;
  double tab = 0;                     // [rad] when not automatic
  double wing_loading = 0;            // W/S [N/m^2]
  double aspect_ratio = 0;            // b^2/S [-]
  double mac = 0;                     // [m]
  double tail_volume = 0;             // about the wing-body a.c. [-]
  double tail_arm_wing = 0;           // wing-body a.c. to tail a.c. [m]
  double tail_arm_cg = 0;             // CG to tail a.c. [m]
  double envelope_forward = 0, envelope_aft = 0;
  double mass_moment = 0;             // elevator static mass moment [kg m]
  double elevator_cg_aft_of_hinge = 0;// [m] (negative ahead)
  double cl_max = 0, alpha_stall = 0; // wing-body [-], [rad]
  double stall_speed = 0;             // 1 g, at the condition's altitude, TAS [m/s]
  double float_frequency = 0;         // elevator with the airframe held [rad/s] (0: not restoring)
  bool reversible = true;
  double gearing = 0;                 // [rad/m]
  std::vector<ScenarioWarning> warnings;
};

// Throws ScenarioError when the scenario's plant cannot be built.
InputSummary summarize_inputs(const Scenario& s);

}  // namespace fp
