// response_text.hpp — held-versus-free response metrics as JSON and as a terminal table.
#pragma once

#include <string>

#include <nlohmann/json_fwd.hpp>

#include "analysis/response.hpp"

namespace fp {

// Free over held, |f| / |h|: NaN where h is 0 (or below 1e-6 |f|: the noise of a held run
// that stays in trim), either is not finite, or the two have opposite signs. Values of opposite sign have no ratio: |f|/|h| would report a free peak of -1.6
// against a held one of +0.9 as "1.8 times larger" and hide that the free airplane went the
// other way. JSON writes such ratios as null, the tables as "opp. sign".
bool opposite_signs(double f, double h);
double free_to_held_ratio(double f, double h);

nlohmann::json case_summary_json(const CaseSummary& c);
nlohmann::json comparison_json(const CaseSummary* held, const CaseSummary* free);
std::string comparison_table(const CaseSummary* held, const CaseSummary* free);

}  // namespace fp
