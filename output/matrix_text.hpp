// matrix_text.hpp — the conditions matrix (analysis/envelope.hpp) as a terminal table and as
// JSON: one row a corner, a corner that could not be computed as a failure row with its reason.
#pragma once

#include <string>
#include <vector>

#include <nlohmann/json_fwd.hpp>

#include "analysis/envelope.hpp"

namespace fp {

std::string matrix_table(const std::vector<CornerResult>& rs);
nlohmann::json matrix_json(const std::vector<CornerResult>& rs);

}  // namespace fp
