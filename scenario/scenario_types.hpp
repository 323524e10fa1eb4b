// scenario_types.hpp — the data of a scenario: the airplane, the flight condition, the run
// settings, the timeline, the gusts and turbulence, where each key came from, and the error type
// of user input. Plain data: the key table (keys.*) points into it, the loader (scenario.*) fills
// it, and neither needs the other's header for that (the key table depends on these types only).
// Every value is SI inside.
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

#include "model/airplane.hpp"
#include "model/gust.hpp"

namespace fp {

// A user error in a scenario or command-line value: where, which key, and what is allowed.
// The command line prints what() and exits with status 2.
struct ScenarioError {
  std::string file;     // path as given ("" for --set values)
  int line = 0;         // 1-based, 0 when unknown
  int column = 0;       // 1-based, 0 when unknown
  std::string key;      // dotted key, "" when the error is not about one key
  std::string message;  // what is wrong and what is allowed
  std::string what() const;  // "file:line:column: key: message"
};

enum class EventKind {
  let_go,       // free case: the pilot lets go of the stick (force zero)
  take_hold,    // free case: the pilot takes hold and holds the stick where it is
  tab,          // both cases: the trim tab moves to `value` [rad]
  pulse,        // free case: pilot force `value` [N, pull +] for `duration` [s]
  elevator,     // held case: the held stick moves the elevator by `value` [rad] for `duration` [s]
                // (duration 0: a step that stays)
};

struct Event {
  double time = 0;       // [s]
  EventKind kind = EventKind::let_go;
  double value = 0;      // see EventKind
  double duration = 0;   // [s]
  int line = 0;          // where it was written (for error messages)
};

enum class ControlsChoice { held, free, both };

struct RunSettings {
  double duration = 30.0;  // key run.duration
  double output_step = 0.01;  // key run.output_step
  double rel_tol = 1e-8;  // key run.rel_tol
  double abs_tol = 1e-9;  // key run.abs_tol
  double alpha_limit = 0.35;  // key run.alpha_limit
  double q_limit = 2.0;  // key run.q_limit
  double min_airspeed_ratio = 0.5;  // key run.min_airspeed_ratio
  // Further departure bounds (run/run.hpp "Departure criteria"; DEVELOPERS.md "Run verdicts").
  // Airspeeds are the air-relative true airspeed the CSV prints.
  double max_airspeed_ratio = 2.0;  // key run.max_airspeed_ratio
  double floor_altitude = 0.0;  // key run.floor_altitude
  double theta_limit = 1.0471975511965976;  // key run.theta_limit
  double load_factor_max = 5.7;  // key run.load_factor_max
  double load_factor_min = -2.28;  // key run.load_factor_min
  double dive_speed = 0.0;       // not a key: envelope.max_speed, copied in by run_settings()
                                 // (run/run.hpp); 0 = use max_airspeed_ratio [m/s]
  ControlsChoice controls = ControlsChoice::both;  // key run.controls
  double let_go_time = 0.0;  // key run.let_go_time
};

struct TrimSettings {
  bool tab_auto = true;  // key trim.tab ("auto", or an angle)
  double tab = 0.0;  // key trim.tab
};

// The stated CG envelope of the airplane (fractions of MAC), for the margins and the report.
struct Envelope {
  double cg_forward = 0.15;  // key envelope.cg_forward
  double cg_aft = 0.35;  // key envelope.cg_aft
  double min_speed = 0.0;  // key envelope.min_speed
  double max_speed = 0.0;  // key envelope.max_speed
  // The weights of the stated envelope and the category's limit load factor: the corners that
  // the report and `floatpitch matrix` cover (analysis/envelope.hpp).
  double mass_min = 0.0;  // key envelope.mass_min
  double mass_max = 0.0;  // key envelope.mass_max
  double limit_load_factor = 3.8;  // key envelope.limit_load_factor
};

// Continuous turbulence ([turbulence]; see model/turbulence.hpp and docs/gusts.md).
enum class TurbulenceKind { none, dryden, von_karman };
enum class TurbulenceSeverity { light, moderate, severe };
enum class TurbulenceComponents { both, vertical, horizontal };

struct TurbulenceSettings {
  TurbulenceKind model = TurbulenceKind::none;  // key turbulence.model
  TurbulenceSeverity severity = TurbulenceSeverity::moderate;  // key turbulence.severity
  double probability = 0.0;  // key turbulence.probability
  TurbulenceComponents components = TurbulenceComponents::both;  // key turbulence.components
  double sigma_u = 0.0;  // key turbulence.sigma_u
  double sigma_w = 0.0;  // key turbulence.sigma_w
  double scale_u = 0.0;  // key turbulence.scale_u
  double scale_w = 0.0;  // key turbulence.scale_w
  double height = 0.0;  // key turbulence.height
  int seed = 1;  // key turbulence.seed
  int seeds = 1;  // key turbulence.seeds
  double spacing = 0.0;  // key turbulence.spacing
  double start_time = 0.0;  // key turbulence.start_time
  double fade_in = 2.0;  // key turbulence.fade_in
};

// How a [[gust]]'s amplitude is set: given, or by a published design rule (docs/gusts.md).
enum class GustRule {
  amplitude,          // gust.amplitude as written (true airspeed)
  derived_vc,         // U_de = 50 ft/s EAS at V_C, 14 CFR 23.333(c) / 23.341(c) before amdt 64, CS 23.341
  derived_vd,         // U_de = 25 ft/s EAS at V_D, the same rule
  gradient_distance,  // U_ref F_g (H/350 ft)^(1/6) EAS, 14 CFR 25.341(a) (a transport-category convention)
};

// Per [[gust]] (same order as Scenario::gusts): the rule and the tuned-gust search.
struct GustDesign {
  GustRule rule = GustRule::amplitude;  // key gust.rule
  double design_velocity = 0.0;  // key gust.design_velocity
  double alleviation = 1.0;  // key gust.alleviation
  bool length_auto = false;  // key gust.length (set when a derived rule has no gust.length: H = 12.5 MAC)
  double tune_min = 0.0;  // key gust.tune_min
  double tune_max = 0.0;  // key gust.tune_max
  int tune_points = 12;  // key gust.tune_points
};

// Where a key's value came from, so that errors about relations between keys can point at
// the file and line that set each of them.
struct KeyOrigin {
  std::string file;     // the file that set it ("" when it did not come from a file)
  int line = 0;         // 1-based, 0 when unknown
  int column = 0;       // 1-based, 0 when unknown
  std::string via;      // "" for files; otherwise where it came from ("--set", "--vary", ...)
};

struct Scenario {
  std::string path;              // the case file as given
  std::string name;              // [scenario] name
  std::string description;       // [scenario] description
  std::string aircraft_name;     // from the aircraft file's name key
  Airplane airplane;
  Condition condition;
  TrimSettings trim;
  RunSettings run;
  Envelope envelope;
  std::vector<Event> events;     // sorted by time
  std::vector<DiscreteGust> gusts;
  double gust_front_speed = 0.0; // [m/s]
  // Per gust (same order as `gusts`): the start_time [s] when the file gave the gust's start as
  // a time; its `start` is then derived as (V cos(gamma) + gust_front_speed) * start_time, and
  // re-derived when set_value changes the airspeed, the flight path or the front speed.
  // nullopt (or missing entries) when the start was given as a distance.
  std::vector<std::optional<double>> gust_start_times;
  // Per gust (same order as `gusts`; missing entries: amplitude as given, no search). The
  // amplitude of a rule gust is derived from the rule, the altitude and the gradient distance,
  // and re-derived like the starts given as times.
  std::vector<GustDesign> gust_designs;
  TurbulenceSettings turbulence;
  // Where each key was set: dotted keys ("wing.area"), "event[i]" and "gust[i]" (0-based)
  // for the entries of the arrays. Filled by the loader and set_value; used in messages only.
  std::map<std::string, KeyOrigin> origins;
};

}  // namespace fp
