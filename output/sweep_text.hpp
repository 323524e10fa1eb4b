// sweep_text.hpp — a sweep's sweep.json (read back by `merge`), sweep.csv and terminal table.
#pragma once

#include <string>

#include <nlohmann/json_fwd.hpp>

#include "analysis/sweep.hpp"

namespace fp {

nlohmann::json sweep_json(const SweepResult& r);
std::string sweep_csv(const SweepResult& r);
std::string sweep_table(const SweepResult& r);
SweepResult sweep_from_json(const nlohmann::json& j);  // throws std::runtime_error

}  // namespace fp
