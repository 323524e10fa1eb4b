// cmd_sweep.cpp — `floatpitch sweep` and `floatpitch merge` (see commands.hpp).
#include "cli/common.hpp"

#include <algorithm>
#include <fstream>
#include <iostream>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "analysis/sweep.hpp"
#include "output/atomic_file.hpp"
#include "output/sweep_text.hpp"
#include "scenario/scenario.hpp"
#include "util/caution.hpp"

namespace fp::cmd {

using nlohmann::json;

int sweep(const SweepOpts& o) {
  return guarded(o.common.scenario, [&] {
    SweepSpec spec;
    spec.scenario = o.common.scenario;
    spec.set = o.common.set;
    const Scenario base = load_scenario(spec.scenario, spec.set);
    for (const auto& v : o.vary) spec.vary.push_back(parse_vary(base, v));
    for (const auto& v : o.sample) spec.sample.push_back(parse_sample(base, v));
    spec.samples = o.samples;
    spec.seed = o.seed;
    spec.run_seconds = o.run;
    if (!o.shard.empty()) {
      const auto slash = o.shard.find('/');
      try {
        if (slash == std::string::npos) throw std::invalid_argument("");
        spec.shard_k = std::stoi(o.shard.substr(0, slash));
        spec.shard_n = std::stoi(o.shard.substr(slash + 1));
      } catch (const std::logic_error&) {
        throw ScenarioError{"", 0, 0, "", "--shard expects K/N, e.g. 0/4; got \"" + o.shard + "\""};
      }
    }
    const SweepResult r = run_sweep(spec, default_jobs(o.jobs), true);
    OutputSet out(o.out);
    out.add("sweep.csv", sweep_csv(r));
    out.add("sweep.json", sweep_json(r).dump(2) + "\n");
    out.commit();
    std::cout << spec.scenario << "\n" << sweep_table(r) << "wrote " << o.out << "/sweep.csv and " << o.out
              << "/sweep.json\n";
    return kOk;
  });
}

int merge(const MergeOpts& o) {
  return guarded("", [&] {
    SweepResult all;
    std::vector<bool> seen;
    for (std::size_t d = 0; d < o.dirs.size(); ++d) {
      const std::string path = o.dirs[d] + "/sweep.json";
      std::ifstream f(path);
      if (!f) throw std::runtime_error("cannot read " + path);
      json j;
      try {
        f >> j;
      } catch (const json::exception& e) {
        throw std::runtime_error(path + ": " + e.what());
      }
      SweepResult r = sweep_from_json(j);
      if (d == 0) {
        all = r;
        all.points.clear();
        all.spec.shard_k = 0;
        all.spec.shard_n = 1;
        seen.assign(static_cast<std::size_t>(r.total_points), false);
      } else if (r.spec.scenario != all.spec.scenario || r.total_points != all.total_points ||
                 r.input_keys != all.input_keys) {
        throw std::runtime_error(path + ": not a shard of the same sweep as " + o.dirs[0]);
      }
      for (auto& p : r.points) {
        if (p.index < 0 || p.index >= all.total_points) throw std::runtime_error(path + ": point index out of range");
        if (seen[static_cast<std::size_t>(p.index)])
          throw std::runtime_error(path + ": point " + std::to_string(p.index) + " appears in two shards");
        seen[static_cast<std::size_t>(p.index)] = true;
        all.points.push_back(p);
      }
    }
    for (std::size_t i = 0; i < seen.size(); ++i)
      if (!seen[i]) throw std::runtime_error("point " + std::to_string(i) + " is missing: a shard was not given");
    std::sort(all.points.begin(), all.points.end(), [](const PointResult& a, const PointResult& b) { return a.index < b.index; });
    compute_boundary(all, default_jobs(o.jobs));
    OutputSet out(o.out);
    out.add("sweep.csv", sweep_csv(all));
    out.add("sweep.json", sweep_json(all).dump(2) + "\n");
    out.commit();
    std::cout << sweep_table(all) << "wrote " << o.out << "/sweep.csv and " << o.out << "/sweep.json\n";
    return kOk;
  });
}

}  // namespace fp::cmd
