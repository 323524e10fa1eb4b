// input_text.cpp — see input_text.hpp.
#include "output/input_text.hpp"

#include <cmath>
#include <cstdarg>
#include <cstdio>

#include <nlohmann/json.hpp>

#include "model/units.hpp"

namespace fp {

using nlohmann::json;

namespace {

void line(std::string& o, const char* fmt, ...) {
  char buf[512];
  va_list ap;
  va_start(ap, fmt);
  std::vsnprintf(buf, sizeof buf, fmt, ap);
  va_end(ap);
  o += buf;
}

}  // namespace

std::string input_summary_text(const InputSummary& in) {
  std::string o;
  for (const auto& w : in.warnings) o += "warning: " + w.what() + "\n";
  o += in.path + ": " + in.name + "\n";
  line(o, "  flight condition          mass %.1f kg, CG %.1f %% MAC, altitude %.0f m (%.0f ft), %.2f m/s TAS "
          "(%.1f kt), flight path %.1f deg\n",
       in.mass, 100 * in.cg, in.altitude, in.altitude / units::ft, in.airspeed, units::to_kt(in.airspeed),
       units::to_deg(in.flight_path));
  if (in.tab_auto) line(o, "  trim mode                 tab for zero stick force (hands-off) at the condition\n");
  else line(o, "  trim mode                 tab as set, %.2f deg\n", units::to_deg(in.tab));
  line(o, "  wing loading              %.1f N/m2 (%.1f kg/m2, %.2f lb/ft2)\n", in.wing_loading,
       in.wing_loading / units::g0, in.wing_loading / units::psf);
  line(o, "  aspect ratio              %.2f\n", in.aspect_ratio);
  line(o, "  mean aerodynamic chord    %.3f m\n", in.mac);
  line(o, "  tail volume V_H           %.3f (tail arm from wing a.c. %.3f m)\n", in.tail_volume, in.tail_arm_wing);
  line(o, "  tail arm from CG          %.3f m\n", in.tail_arm_cg);
  line(o, "  CG                        %.1f %% MAC (envelope %.1f..%.1f %%)\n", 100 * in.cg,
       100 * in.envelope_forward, 100 * in.envelope_aft);
  line(o, "  elevator static mass moment %.3f kg m (CG %.1f mm %s the hinge)\n", in.mass_moment,
       1000 * std::abs(in.elevator_cg_aft_of_hinge), in.elevator_cg_aft_of_hinge >= 0 ? "aft of" : "ahead of");
  line(o, "  CLmax / stall angle       %.2f / %.1f deg; 1 g stall speed %.1f m/s (%.1f kt TAS)\n", in.cl_max,
       units::to_deg(in.alpha_stall), in.stall_speed, units::to_kt(in.stall_speed));
  line(o, "  elevator float frequency  %.1f rad/s (airframe held, at the condition)\n", in.float_frequency);
  line(o, "  circuit                   %s, gearing %.2f rad/m\n", in.reversible ? "reversible" : "irreversible",
       in.gearing);
  return o;
}

json input_summary_json(const InputSummary& in) {
  json j{{"scenario", in.path}, {"name", in.name}, {"wing_loading_N_per_m2", in.wing_loading},
         {"wing_loading_kg_per_m2", in.wing_loading / units::g0}, {"aspect_ratio", in.aspect_ratio},
         {"mac_m", in.mac}, {"tail_volume", in.tail_volume}, {"tail_arm_from_cg_m", in.tail_arm_cg},
         {"cg_fraction_mac", in.cg}, {"elevator_static_mass_moment_kg_m", in.mass_moment},
         {"elevator_cg_aft_of_hinge_m", in.elevator_cg_aft_of_hinge}, {"cl_max", in.cl_max},
         {"alpha_stall_deg", units::to_deg(in.alpha_stall)}, {"stall_speed_1g_mps", in.stall_speed},
         {"elevator_float_frequency_rad_s", in.float_frequency}, {"reversible", in.reversible}};
  j["condition"] = {{"mass_kg", in.mass}, {"cg_fraction_mac", in.cg}, {"altitude_m", in.altitude},
                    {"true_airspeed_mps", in.airspeed}, {"flight_path_deg", units::to_deg(in.flight_path)},
                    {"trim", in.tab_auto ? "hands_off_tab" : "tab_as_set"},
                    {"tab_deg", in.tab_auto ? json(nullptr) : json(units::to_deg(in.tab))}};
  j["warnings"] = json::array();
  for (const auto& w : in.warnings)
    j["warnings"].push_back({{"file", w.where.file}, {"line", w.where.line}, {"key", w.key}, {"reason", w.reason}});
  return j;
}

}  // namespace fp
