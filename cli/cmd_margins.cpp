// cmd_margins.cpp — `floatpitch margins` (see commands.hpp).
#include "cli/common.hpp"

#include <iostream>

#include <nlohmann/json.hpp>

#include "analysis/margins_modes.hpp"
#include "output/analysis_text.hpp"
#include "scenario/scenario.hpp"
#include "util/caution.hpp"

namespace fp::cmd {

using nlohmann::json;

int margins(const MarginsOpts& o) {
  return guarded(o.common.scenario, [&] {
    const Scenario s = load_scenario(o.common.scenario, o.common.set);
    if (!s.airplane.circuit.reversible)
      throw ScenarioError{s.path, 0, 0, "circuit.reversible",
                          "the circuit is irreversible: there are no stick-free margins (use `modes` for the held case)"};
    MarginsOptions mo;
    mo.criteria = {o.min_margin, o.min_force_per_g};
    mo.margin_from_user = o.margin_from_user;
    mo.force_from_user = o.force_from_user;
    const Margins m = compute_margins(s, mo);
    if (o.common.json) {
      json j = margins_json(m);
      j["caution"] = kCaution;
      j["scenario"] = s.path;
      std::cout << j.dump(2) << "\n";
    } else {
      std::cout << s.path << ": " << s.name << "\n" << margins_table(m);
    }
    return kOk;
  }, o.common.json ? CautionTo::none : CautionTo::out);
}

}  // namespace fp::cmd
