// cmd_trim.cpp — `floatpitch trim` (see commands.hpp).
#include "cli/common.hpp"

#include <cmath>
#include <iostream>
#include <memory>
#include <string>

#include <nlohmann/json.hpp>

#include "model/trim.hpp"
#include "model/units.hpp"
#include "output/outputs.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"
#include "util/caution.hpp"

namespace fp::cmd {

using nlohmann::json;

int trim(const TrimOpts& o) {
  return guarded(o.common.scenario, [&] {
    const Scenario s = load_scenario(o.common.scenario, o.common.set);
    const auto plant = scenario_plant(s);
    const bool inverse = !std::isnan(o.tab_for_elevator) || !std::isnan(o.tab_for_alpha) || !std::isnan(o.speed_for_tab);
    if (inverse && !plant->ap.circuit.reversible)
      throw ScenarioError{s.path, 0, 0, "circuit.reversible",
                          "the circuit is irreversible: there is no hands-off trim and the tab carries no stick force"};
    if (inverse) {
      TrimRequest r;
      r.condition = s.condition;
      const char* title = "";
      std::string label;
      if (!std::isnan(o.tab_for_elevator)) {
        r.fix_elevator = true;
        r.elevator = o.tab_for_elevator * units::deg;
        r.solve_speed = true;
        r.solve_tab = true;
        title = "Hands-off trim holding the elevator at the given angle (speed and tab solved):";
      } else if (!std::isnan(o.tab_for_alpha)) {
        r.fix_alpha = true;
        r.alpha = o.tab_for_alpha * units::deg;
        r.solve_speed = true;
        r.solve_tab = true;
        title = "Hands-off trim at the given angle of attack (speed and tab solved):";
      } else {
        r.tab = o.speed_for_tab * units::deg;
        r.zero_force = true;
        r.solve_speed = true;
        title = "Hands-off trim speed for the given tab:";
      }
      const Trim t = fp::trim(*plant, r);
      if (o.common.json) {
        std::cout << json{{"scenario", s.path}, {"hands_off", trim_json(t)}, {"caution", kCaution}}.dump(2) << "\n";
        return kOk;
      }
      std::cout << trim_table(t, title);
      return kOk;
    }
    const Trim held = trim_held(*plant, s.condition, s.trim.tab_auto ? 0.0 : s.trim.tab);
    std::unique_ptr<Trim> free;
    if (plant->ap.circuit.reversible) free = std::make_unique<Trim>(trim_free(*plant, s.condition));
    if (o.common.json) {
      json j{{"scenario", s.path},
             {"held", trim_json(held)},
             {"free", free ? trim_json(*free) : json(nullptr)},
             {"caution", kCaution}};
      std::cout << j.dump(2) << "\n";
      return kOk;
    }
    std::cout << trim_table(held, s.trim.tab_auto ? "Stick held, tab at 0:" : "Stick held, tab as set:");
    if (free) std::cout << trim_table(*free, "Hands off (tab for zero stick force):");
    else std::cout << "No hands-off trim: the circuit is irreversible.\n";
    return kOk;
  }, o.common.json ? CautionTo::none : CautionTo::out);
}

}  // namespace fp::cmd
