// cmd_forces.cpp — `floatpitch forces` (see commands.hpp).
#include "cli/common.hpp"

#include <iostream>
#include <sstream>
#include <string>

#include "analysis/margins_modes.hpp"
#include "model/units.hpp"
#include "output/analysis_text.hpp"
#include "output/atomic_file.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"

namespace fp::cmd {

int forces(const ForcesOpts& o) {
  return guarded(o.common.scenario, [&] {
    const Scenario s = load_scenario(o.common.scenario, o.common.set);
    if (!s.airplane.circuit.reversible)
      throw ScenarioError{s.path, 0, 0, "circuit.reversible", "the circuit is irreversible: the pilot feels no hinge moment"};
    const Margins m = compute_margins(s);
    std::ostringstream a, b;
    a << "airspeed [m/s],airspeed [kt],stick_force [N],elevator [deg],alpha [deg]\n";
    for (const auto& f : m.curve)
      a << f.airspeed << "," << units::to_kt(f.airspeed) << "," << f.stick_force << "," << units::to_deg(f.elevator)
        << "," << units::to_deg(f.alpha) << "\n";
    const auto plant = scenario_plant(s);
    const PerGCurve pg = force_per_g_curve(*plant, s.condition, m.trim_tab);
    b << "load_factor [-],stick_force [N],elevator [deg]\n";
    for (const auto& q : pg.points)
      b << q.load_factor << "," << q.stick_force << "," << units::to_deg(q.elevator) << "\n";
    const std::string stop = per_g_stop_text(pg);
    if (o.out.empty()) {
      std::cout << "# stick force against airspeed, tab fixed at " << units::to_deg(m.trim_tab) << " deg\n"
                << a.str() << "\n# stick force against load factor (steady pull-up at the trim speed)\n" << b.str()
                << "# " << stop << "\n";
      return kOk;
    }
    std::string per_g = o.out;
    const auto dot = per_g.rfind(".csv");
    per_g = (dot != std::string::npos ? per_g.substr(0, dot) : per_g) + "_per_g.csv";
    write_file_atomic(o.out, a.str());
    write_file_atomic(per_g, b.str());
    std::cout << "wrote " << o.out << " and " << per_g << "\n" << stop << "\n";
    return kOk;
  }, o.out.empty() ? CautionTo::err : CautionTo::out);
}

}  // namespace fp::cmd
