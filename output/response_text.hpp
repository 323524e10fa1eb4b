// response_text.hpp — held-versus-free response metrics as JSON and as a terminal table.
#pragma once

#include <string>

#include <nlohmann/json_fwd.hpp>

#include "analysis/response.hpp"

namespace fp {

nlohmann::json case_summary_json(const CaseSummary& c);
nlohmann::json comparison_json(const CaseSummary* held, const CaseSummary* free);
std::string comparison_table(const CaseSummary* held, const CaseSummary* free);

}  // namespace fp
