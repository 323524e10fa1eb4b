// outputs.hpp — what runs write: CSV time histories (header cells "name [unit]", display
// units: angles and angular rates in degrees, everything else SI) and JSON summaries.
#pragma once

#include <string>

#include <nlohmann/json_fwd.hpp>

#include "analysis/limit_cycle.hpp"
#include "run/run.hpp"
#include "util/format.hpp"

namespace fp {

std::string trace_csv(const Trace& tr);

struct Peak {
  double max = 0, min = 0, time_of_max = 0, time_of_min = 0;  // display units, s
};
Peak peak_of(const Trace& tr, std::size_t channel);

// JSON objects (display units named in the keys or in a "unit" field).
nlohmann::json trim_json(const Trim& t);
nlohmann::json case_json(const CaseResult& c);
nlohmann::json summary_json(const Scenario& s, const RunOutcome& o);

// Human-readable held-versus-free table of a run (for the terminal); `quiet_from` is when the
// run's disturbances are over (scenario/gust_timing.hpp), where the limit-cycle search starts.
std::string run_table(const RunOutcome& o, double quiet_from = 0.0);

// A limit cycle (analysis/limit_cycle.hpp) as summary.json's `limit_cycle` (null when none)
// and as the run table's line.
nlohmann::json limit_cycle_json(const LimitCycle& c);
std::string limit_cycle_line(const LimitCycle& c);
std::string trim_table(const Trim& t, const char* title);


}  // namespace fp
