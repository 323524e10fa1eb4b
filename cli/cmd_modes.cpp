// cmd_modes.cpp — `floatpitch modes` (see commands.hpp).
#include "cli/common.hpp"

#include <iostream>

#include <nlohmann/json.hpp>

#include "analysis/margins_modes.hpp"
#include "output/analysis_text.hpp"
#include "output/atomic_file.hpp"
#include "scenario/scenario.hpp"
#include "util/caution.hpp"

namespace fp::cmd {

using nlohmann::json;

int modes(const ModesOpts& o) {
  return guarded(o.common.scenario, [&] {
    const Scenario s = load_scenario(o.common.scenario, o.common.set);
    const ModesResult r = compute_modes(s);
    if (!o.matrices.empty()) {
      OutputSet out(o.matrices);
      out.add("A_held.csv", matrix_csv(r.held_lm, false));
      out.add("B_held.csv", matrix_csv(r.held_lm, true));
      if (r.has_free) {
        out.add("A_free.csv", matrix_csv(r.free_lm, false));
        out.add("B_free.csv", matrix_csv(r.free_lm, true));
      }
      out.commit();
    }
    if (o.common.json) {
      json j = modes_json(r);
      j["caution"] = kCaution;
      j["scenario"] = s.path;
      std::cout << j.dump(2) << "\n";
    } else {
      std::cout << s.path << ": " << s.name << "\n" << modes_table(r);
      if (!o.matrices.empty()) std::cout << "wrote the state-space matrices to " << o.matrices << "/\n";
    }
    return kOk;
  }, o.common.json ? CautionTo::none : CautionTo::out);
}

}  // namespace fp::cmd
