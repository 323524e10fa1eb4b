// scenario.hpp — a scenario: the airplane, the flight condition, the run settings, the
// timeline and the gusts, as loaded from TOML files (scenario/scenario.cpp) and checked against the
// key table (scenario/keys.cpp). Every value is SI inside.
//
// Files: an aircraft file (scenarios/aircraft/*.toml) holds [wing], [tail], [elevator],
// [circuit], [propulsion], [mass] and [envelope]; a case file says `include = "aircraft/x.toml"`
// (a path relative to the case file) and may override any of those keys and add [condition],
// [trim], [run], [[event]] and [[gust]]. Values are numbers in SI (angles in radians), or
// strings with an explicit unit: "110 kt", "6500 ft", "3 deg".
#pragma once

#include <string>
#include <vector>

#include "scenario/scenario_types.hpp"

namespace fp {

// Load a case (or aircraft) file. `overrides` are "key=value" strings (--set), applied after the
// files with the same validation. Throws ScenarioError.
Scenario load_scenario(const std::string& path, const std::vector<std::string>& overrides = {});

// Parse from text (used by tests and the fuzz target); `name` stands for the file in messages,
// `base_dir` resolves includes.
Scenario parse_scenario(const std::string& text, const std::string& name, const std::string& base_dir,
                        const std::vector<std::string>& overrides = {});

// Set one key (dotted name as in the files, or an alias such as "cg") to an SI value, with the
// same range checks as the files; `origin` names where the value came from in messages
// (e.g. "--vary"). Throws ScenarioError. Used by sweeps and the window.
void set_value(Scenario& s, const std::string& key, double si_value, const std::string& origin);
// The SI value of a numeric key (throws ScenarioError for an unknown or non-numeric key).
double get_value(const Scenario& s, const std::string& key);

// A value for a numeric key written as text ("0.31", "110 kt", "-0.005 /deg") in SI, with the
// same unit rules as the files; `origin` names where it came from. Throws ScenarioError.
double parse_quantity(const std::string& key, const std::string& text, const std::string& origin);

// Re-derive the values that follow from others: gust starts given as times, and the amplitudes
// (and default gradient distances) of gusts set by a design rule. load/parse and set_value do
// it; call it after changing a gust or the condition in code. Throws ScenarioError.
void derive_gust_values(Scenario& s);

// Check the relations between keys (stops in order, CG envelope, airframe inertia, ...) and
// throw ScenarioError naming the keys. load/parse call it; call it after set_value.
void validate(const Scenario& s);

// An input that is legal but implausible (an elevator larger than its tail, a hinge line far from
// the tail, hinge derivatives of the size of per-degree values, a CG outside the stated envelope).
struct ScenarioWarning {
  KeyOrigin where;      // the file and line that set the key
  std::string key;      // dotted key
  std::string reason;   // what is implausible and why
  std::string what() const;  // "file:line:column: key: reason"
};
// The warnings of a scenario that validate() accepted (used by `check`; the window may show them).
std::vector<ScenarioWarning> plausibility_warnings(const Scenario& s);

// Write the scenario (all keys, SI values with units) as TOML that load_scenario reads back.
std::string to_toml(const Scenario& s);


}  // namespace fp
