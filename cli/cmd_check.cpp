// cmd_check.cpp — `floatpitch check` (see commands.hpp).
#include "cli/common.hpp"

#include <iostream>

#include <nlohmann/json.hpp>

#include "analysis/input_summary.hpp"
#include "output/input_text.hpp"
#include "scenario/scenario.hpp"

namespace fp::cmd {

using nlohmann::json;

int check(const Common& c) {
  return guarded(c.scenario, [&] {
    const InputSummary in = summarize_inputs(load_scenario(c.scenario, c.set));
    if (c.json) {
      json j = input_summary_json(in);
      j["caution"] = kCaution;
      std::cout << j.dump(2) << "\n";
    } else {
      std::cout << input_summary_text(in);
    }
    return kOk;
  }, c.json ? CautionTo::none : CautionTo::out);
}

}  // namespace fp::cmd
