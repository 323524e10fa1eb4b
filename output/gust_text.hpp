// gust_text.hpp — what `floatpitch run` adds for gusts and turbulence (a summary.json block and
// the terminal table: held beside free, the rule estimates, the turbulence levels, the search)
// and the multi-seed report.
#pragma once

#include <string>

#include <nlohmann/json_fwd.hpp>

#include "analysis/gust_studies.hpp"

namespace fp {

// What `floatpitch run` adds for gusts and turbulence: a JSON block for summary.json and the
// terminal table (held beside free, the rule estimates, the turbulence levels, the search).
nlohmann::json gust_summary_json(const Scenario& s, const RunOutcome& r, const TuneResult* tune);
std::string gust_table(const Scenario& s, const RunOutcome& r, const TuneResult* tune);

// The multi-seed results: summary.json, turbulence.csv (one row per seed and case), table.
struct SeedsReport {
  std::string summary_json;
  std::string csv;
  std::string table;
};
SeedsReport seeds_report(const Scenario& s, const SeedsResult& r);

}  // namespace fp
