// gust_field.hpp — the turbulence a scenario's runs fly through: the [turbulence] table resolved
// into intensities and scale lengths, and the seeded record generated from it.
#pragma once

#include <memory>

#include "model/turbulence.hpp"
#include "scenario/gust_timing.hpp"
#include "scenario/scenario.hpp"

namespace fp {

// gust_closing_speed (the speed at which the airplane moves through the field) lives in
// scenario/gust_timing.hpp, included here for its consumers.

// What the scenario's [turbulence] table asks for, resolved: intensities and scale lengths
// from the height and severity (or the overrides), the record's extent and spacing.
struct ResolvedTurbulence {
  bool active = false;
  TurbulenceSpec spec;          // what make_turbulence_record generates (seed included)
  TurbulenceLevels tables;      // the published values before overrides
  double probability = 0;       // probability of exceedance used [-]
  double height = 0;            // height above ground used [m]
  double closing_speed = 0;     // speed at which the airplane moves through the field [m/s]
  double stats_from = 0;        // statistics start here: entry plus fade-in [s]
};
ResolvedTurbulence resolve_turbulence(const Scenario& s);

// The record for the scenario's [turbulence] (null when turbulence.model = "none").
std::shared_ptr<const TurbulenceRecord> scenario_turbulence(const Scenario& s);

}  // namespace fp
