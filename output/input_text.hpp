// input_text.hpp — `floatpitch check`'s summary of a scenario as text and JSON.
#pragma once

#include <string>

#include <nlohmann/json_fwd.hpp>

#include "analysis/input_summary.hpp"

namespace fp {

std::string input_summary_text(const InputSummary& in);  // warnings first, then the summary
nlohmann::json input_summary_json(const InputSummary& in);

}  // namespace fp
