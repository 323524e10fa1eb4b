// cmd_check.cpp — `floatpitch check` (see commands.hpp).
#include "cli/common.hpp"

#include <cmath>
#include <fstream>
#include <thread>
#include <unistd.h>
#include <cstdio>
#include <iostream>
#include <sstream>
#include <stdexcept>

#include <nlohmann/json.hpp>

#include "model/linear.hpp"
#include "model/trim.hpp"
#include "model/units.hpp"
#include "analysis/margins_modes.hpp"
#include "output/atomic_file.hpp"
#include "analysis/gust_studies.hpp"
#include "output/analysis_text.hpp"
#include "output/gust_text.hpp"
#include "output/outputs.hpp"
#include "output/response_text.hpp"
#include "output/sweep_text.hpp"
#include "report/report.hpp"
#include "run/run.hpp"
#include "analysis/sweep.hpp"
#include "scenario/scenario.hpp"

namespace fp::cmd {

using nlohmann::json;

int check(const Common& c) {
  return guarded(c.scenario, [&] {
    const Scenario s = load_scenario(c.scenario, c.set);
    const auto plant = scenario_plant(s);
    const Airplane& a = s.airplane;
    const double W = a.mass.mass * units::g0;
    const double ws = W / a.wing.area;
    const double AR = a.wing.span * a.wing.span / a.wing.area;
    const double lt = tail_arm(a, a.mass.h_cg);
    const double VH = tail_volume(a, a.wing.h_ac);
    const auto stall = wing_stall(a.wing.lift);
    const double rho = isa_at(geopotential_altitude(s.condition.altitude)).density;
    const double Vs = stall_speed(a, s.condition.altitude);
    const auto warnings = plausibility_warnings(s);
    const Condition& fc = s.condition;
    const std::string trim_mode = s.trim.tab_auto ? "tab for zero stick force (hands-off) at the condition"
                                                  : "tab as set, " + std::to_string(units::to_deg(s.trim.tab)).substr(0, 6) + " deg";
    const double xe = a.elevator.mass > 0 ? a.elevator.mass_moment / a.elevator.mass : 0.0;
    const double G = a.circuit.gearing;
    const double Ieff = a.elevator.inertia + a.circuit.stick_mass / (G * G);
    const double qt = a.tail.eta * 0.5 * rho * s.condition.airspeed * s.condition.airspeed;
    const double Kh = -a.elevator.ch_delta * qt * a.elevator.area * a.elevator.chord;
    const double wf = Kh > 0 ? std::sqrt(Kh / Ieff) : 0.0;
    if (c.json) {
      json j{{"scenario", s.path}, {"name", s.name}, {"wing_loading_N_per_m2", ws},
             {"wing_loading_kg_per_m2", ws / units::g0}, {"aspect_ratio", AR}, {"mac_m", a.wing.mac},
             {"tail_volume", VH}, {"tail_arm_from_cg_m", lt}, {"cg_fraction_mac", a.mass.h_cg},
             {"elevator_static_mass_moment_kg_m", a.elevator.mass_moment},
             {"elevator_cg_aft_of_hinge_m", xe}, {"cl_max", stall.CLmax},
             {"alpha_stall_deg", units::to_deg(stall.alpha)}, {"stall_speed_1g_mps", Vs},
             {"elevator_float_frequency_rad_s", wf}, {"reversible", a.circuit.reversible}};
      j["condition"] = {{"mass_kg", a.mass.mass}, {"cg_fraction_mac", a.mass.h_cg}, {"altitude_m", fc.altitude},
                        {"true_airspeed_mps", fc.airspeed}, {"flight_path_deg", units::to_deg(fc.flight_path)},
                        {"trim", s.trim.tab_auto ? "hands_off_tab" : "tab_as_set"},
                        {"tab_deg", s.trim.tab_auto ? json(nullptr) : json(units::to_deg(s.trim.tab))}};
      j["warnings"] = json::array();
      for (const auto& w : warnings)
        j["warnings"].push_back({{"file", w.where.file}, {"line", w.where.line}, {"key", w.key}, {"reason", w.reason}});
      j["caution"] = kCaution;
      std::cout << j.dump(2) << "\n";
      return kOk;
    }
    for (const auto& w : warnings) std::printf("warning: %s\n", w.what().c_str());
    std::printf("%s: %s\n", s.path.c_str(), s.name.c_str());
    std::printf("  flight condition          mass %.1f kg, CG %.1f %% MAC, altitude %.0f m (%.0f ft), %.2f m/s TAS "
                "(%.1f kt), flight path %.1f deg\n",
                a.mass.mass, 100 * a.mass.h_cg, fc.altitude, fc.altitude / units::ft, fc.airspeed,
                units::to_kt(fc.airspeed), units::to_deg(fc.flight_path));
    std::printf("  trim mode                 %s\n", trim_mode.c_str());
    std::printf("  wing loading              %.1f N/m2 (%.1f kg/m2, %.2f lb/ft2)\n", ws, ws / units::g0, ws / units::psf);
    std::printf("  aspect ratio              %.2f\n", AR);
    std::printf("  mean aerodynamic chord    %.3f m\n", a.wing.mac);
    std::printf("  tail volume V_H           %.3f (tail arm from wing a.c. %.3f m)\n", VH, a.tail.x_ac - a.wing.h_ac * a.wing.mac);
    std::printf("  tail arm from CG          %.3f m\n", lt);
    std::printf("  CG                        %.1f %% MAC (envelope %.1f..%.1f %%)\n", 100 * a.mass.h_cg,
                100 * s.envelope.cg_forward, 100 * s.envelope.cg_aft);
    std::printf("  elevator static mass moment %.3f kg m (CG %.1f mm %s the hinge)\n", a.elevator.mass_moment,
                1000 * std::abs(xe), xe >= 0 ? "aft of" : "ahead of");
    std::printf("  CLmax / stall angle       %.2f / %.1f deg; 1 g stall speed %.1f m/s (%.1f kt TAS)\n", stall.CLmax,
                units::to_deg(stall.alpha), Vs, units::to_kt(Vs));
    std::printf("  elevator float frequency  %.1f rad/s (airframe held, at the condition)\n", wf);
    std::printf("  circuit                   %s, gearing %.2f rad/m\n", a.circuit.reversible ? "reversible" : "irreversible", G);
    return kOk;
  }, c.json ? CautionTo::none : CautionTo::out);
}

}  // namespace fp::cmd
