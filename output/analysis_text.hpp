// analysis_text.hpp — margins and modes as JSON, terminal tables and state-space CSV.
#pragma once

#include <string>

#include <nlohmann/json_fwd.hpp>

#include "analysis/margins_modes.hpp"

namespace fp {

nlohmann::json margins_json(const Margins& m);
std::string margins_table(const Margins& m);
// One line saying where the stick force per g curve stops and why (or that it is complete).
std::string per_g_stop_text(const PerGCurve& c);
nlohmann::json modes_json(const ModesResult& r);
std::string modes_table(const ModesResult& r);
// Which linear model of a friction circuit applies, and at what disturbance size ("" without friction).
std::string friction_models_text(const FrictionModels& f);
// State-space matrices as CSV (first row: column names with units; first column: row names).
std::string matrix_csv(const LinearModel& lm, bool inputs);

}  // namespace fp
