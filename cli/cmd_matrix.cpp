// cmd_matrix.cpp — `floatpitch matrix` (see commands.hpp).
#include "cli/common.hpp"

#include <iostream>

#include <nlohmann/json.hpp>

#include "analysis/envelope.hpp"
#include "output/matrix_text.hpp"
#include "scenario/matrix_case.hpp"
#include "scenario/scenario.hpp"
#include "util/caution.hpp"

namespace fp::cmd {

using nlohmann::json;

int matrix(const MatrixOpts& o) {
  return guarded(o.common.scenario, [&] {
    const Scenario s = load_scenario(o.common.scenario, o.common.set);
    std::vector<Corner> corners;
    if (o.cases.empty()) {
      corners = envelope_corners(s);
    } else {
      const MatrixCase mc = load_matrix_case(o.cases);
      if (mc.envelope) corners = envelope_corners(s);
      corners.insert(corners.end(), mc.corners.begin(), mc.corners.end());
    }
    const auto rs = run_matrix(s, corners, default_jobs(o.jobs), !o.common.json);
    if (o.common.json) {
      json j = {{"scenario", s.path}, {"cases", o.cases}, {"corners", matrix_json(rs)}, {"caution", kCaution}};
      std::cout << j.dump(2) << "\n";
    } else {
      std::cout << s.path << ": " << s.name << " \u2014 " << rs.size() << " corners, each trimmed hands-off\n"
                << matrix_table(rs);
    }
    return kOk;
  }, o.common.json ? CautionTo::none : CautionTo::out);
}

}  // namespace fp::cmd
