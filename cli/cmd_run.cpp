// cmd_run.cpp — `floatpitch run` (see commands.hpp).
#include "cli/common.hpp"

#include <iostream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "analysis/gust_studies.hpp"
#include "output/atomic_file.hpp"
#include "output/gust_text.hpp"
#include "output/outputs.hpp"
#include "scenario/gust_timing.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"
#include "util/caution.hpp"

namespace fp::cmd {

using nlohmann::json;

int run(const RunOpts& o) {
  return guarded(o.common.scenario, [&] {
    std::vector<std::string> set = o.common.set;
    if (o.duration >= 0) set.push_back("run.duration=" + std::to_string(o.duration));
    const Scenario s = load_scenario(o.common.scenario, set);
    ControlsChoice which = s.run.controls;
    if (o.controls == "held") which = ControlsChoice::held;
    else if (o.controls == "free") which = ControlsChoice::free;
    else if (o.controls == "both") which = ControlsChoice::both;
    // several turbulence seeds: statistics only (analysis/gust_studies.hpp)
    const int seeds = o.seeds > 0 ? o.seeds : s.turbulence.seeds;
    if (o.seeds > 0 && s.turbulence.model == TurbulenceKind::none)
      throw ScenarioError{s.path, 0, 0, "turbulence.model",
                          "--seeds needs continuous turbulence: set turbulence.model to \"dryden\" or \"von_karman\""};
    if (seeds > 1 && s.turbulence.model != TurbulenceKind::none) {
      const SeedsReport rep = seeds_report(s, run_seeds(s, which, seeds, default_jobs(o.jobs), !o.quiet));
      OutputSet out(o.out);
      out.add("turbulence.csv", rep.csv);
      out.add("summary.json", rep.summary_json);
      out.commit();
      if (!o.quiet)
        std::cout << s.path << ": " << s.name << "\n\n" << rep.table << "wrote " << o.out << "/{turbulence.csv,summary.json}\n";
      return kOk;
    }
    TuneResult tune;
    const RunOutcome r = tuned_gust_index(s) >= 0 ? run_scenario_tuned(s, which, default_jobs(o.jobs), !o.quiet, tune)
                                                  : run_scenario(s, which);
    OutputSet out(o.out);
    if (r.held) out.add("held.csv", trace_csv(r.held->trace));
    if (r.free) out.add("free.csv", trace_csv(r.free->trace));
    json summary = summary_json(s, r);
    summary["caution"] = kCaution;
    summary.update(gust_summary_json(s, r, &tune));
    out.add("summary.json", summary.dump(2) + "\n");
    out.commit();
    if (!o.quiet) {
      std::cout << s.path << ": " << s.name << "\n\n" << run_table(r, disturbances_over_time(s)) << gust_table(s, r, &tune);
      std::cout << "wrote " << o.out << "/{" << (r.held ? "held.csv," : "") << (r.free ? "free.csv," : "")
                << "summary.json}\n";
    }
    return kOk;
  }, o.quiet ? CautionTo::none : CautionTo::out);
}

}  // namespace fp::cmd
