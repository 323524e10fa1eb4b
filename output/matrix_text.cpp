// matrix_text.cpp — the conditions matrix as text and JSON (see matrix_text.hpp).
#include "output/matrix_text.hpp"

#include <cmath>
#include <cstdio>

#include <nlohmann/json.hpp>

#include "model/units.hpp"
#include "util/format.hpp"

namespace fp {

using nlohmann::json;

namespace {

std::string f(double v, int d) { return std::isfinite(v) ? fixed(v, d) : std::string("-"); }

std::string release_text(const Release& r) {
  if (!r.failure.empty()) return "not run";
  std::string s;
  if (r.stall) {
    s = "STALL";
    if (r.departed) s.append(" ").append(f(r.time, 1)).append(" s");
    s.append(" (beyond model)");
  } else if (r.departed) {
    s.append("departs ").append(f(r.time, 1)).append(" s (").append(r.criterion).append(")");
  } else {
    s.append("n ").append(f(r.n_min, 2)).append("..").append(f(r.n_max, 2));
  }
  return s;
}

json release_json(const Release& r) {
  json j = {{"offset", r.offset},
            {"start_speed_kt", units::to_kt(r.start_speed)},
            {"force_held_N", r.force},
            {"force_held_lbf", r.force / units::lbf},
            {"seconds", r.seconds},
            {"departed", r.departed},
            {"stall_beyond_model_validity", r.stall},
            {"criterion", r.criterion},
            {"reason", r.reason},
            {"failure", r.failure}};
  j["time_s"] = std::isfinite(r.time) ? json(r.time) : json(nullptr);
  if (r.failure.empty()) {
    j["n_min"] = r.n_min;
    j["n_max"] = r.n_max;
    j["airspeed_min_kt"] = units::to_kt(r.v_min);
    j["airspeed_max_kt"] = units::to_kt(r.v_max);
    j["alpha_max_deg"] = units::to_deg(r.alpha_max);
  }
  return j;
}

}  // namespace

std::string matrix_table(const std::vector<CornerResult>& rs) {
  std::string o;
  char b[512];
  std::snprintf(b, sizeof b, "%-30s %6s %6s %5s %5s %7s %8s %7s %6s %8s %11s %10s  %s\n", "corner", "CG%MAC", "kg", "KTAS",
                "KCAS", "SMfree%", "dF/dV", "return", "F/g", "F@n_lim", "zeta sp h/f", "root free", "release +15 % | -15 %");
  o += b;
  std::snprintf(b, sizeof b, "%-30s %6s %6s %5s %5s %7s %8s %7s %6s %8s %11s %10s\n", "", "", "", "", "", "", "lbf/kt",
                "+-%", "N/g", "lbf", "", "1/s");
  o += b;
  for (const auto& r : rs) {
    std::string label = r.corner.label.size() > 30 ? r.corner.label.substr(0, 29) + "~" : r.corner.label;
    if (!r.ok) {
      std::snprintf(b, sizeof b, "%-30s %6s %6s  FAILED: %s\n", label.c_str(), f(100 * r.cg, 1).c_str(),
                    f(r.mass, 0).c_str(), r.failure.c_str());
      o += b;
      continue;
    }
    const Margins& m = r.margins;
    std::string ret = "-";
    if (std::isfinite(m.free_return_low))
      ret = f(100 * std::max(m.trim_speed - m.free_return_low, m.free_return_high - m.trim_speed) / m.trim_speed, 1);
    const std::string z = (r.has_sp_held ? f(r.sp_held.damping, 2) : std::string("aper")) + "/" +
                          (r.has_sp_free ? f(r.sp_free.damping, 2) : std::string("aper"));
    std::snprintf(b, sizeof b, "%-30s %6s %6s %5s %5s %7s %8s %7s %6s %8s %11s %10s  %s | %s%s\n", label.c_str(),
                  f(100 * r.cg, 1).c_str(), f(r.mass, 0).c_str(), f(units::to_kt(r.airspeed), 0).c_str(),
                  f(units::to_kt(r.calibrated), 0).c_str(), f(100 * m.margin_free, 1).c_str(),
                  f(m.force_gradient * units::kt / units::lbf, 3).c_str(), ret.c_str(), f(m.force_per_g, 1).c_str(),
                  f(r.force_at_limit / units::lbf, 1).c_str(), z.c_str(), f(r.worst_free.root.real(), 4).c_str(),
                  release_text(r.release_up).c_str(), release_text(r.release_down).c_str(),
                  r.in_envelope ? "" : "  (outside the stated envelope)");
    o += b;
  }
  return o;
}

json matrix_json(const std::vector<CornerResult>& rs) {
  json a = json::array();
  for (const auto& r : rs) {
    json j = {{"label", r.corner.label}, {"cg", r.cg}, {"mass_kg", r.mass}, {"altitude_ft", units::to_ft(r.altitude)},
              {"airspeed_tas_kt", units::to_kt(r.airspeed)}, {"in_envelope", r.in_envelope}, {"ok", r.ok},
              {"failure", r.failure}};
    if (r.ok) {
      const Margins& m = r.margins;
      j["airspeed_cas_kt"] = units::to_kt(r.calibrated);
      j["stall_speed_tas_kt"] = units::to_kt(r.stall_speed);
      j["static_margin_fixed"] = m.margin_fixed;
      j["static_margin_free"] = m.margin_free;
      j["trim_tab_deg"] = units::to_deg(m.trim_tab);
      j["force_gradient_N_per_kt"] = m.force_gradient * units::kt;
      j["force_gradient_lbf_per_kt"] = m.force_gradient * units::kt / units::lbf;
      j["free_return_low_kt"] = std::isfinite(m.free_return_low) ? json(units::to_kt(m.free_return_low)) : json(nullptr);
      j["free_return_high_kt"] = std::isfinite(m.free_return_high) ? json(units::to_kt(m.free_return_high)) : json(nullptr);
      j["force_per_g_N"] = m.force_per_g;
      j["force_per_g_lbf"] = m.force_per_g / units::lbf;
      j["limit_load_factor"] = r.limit_load_factor;
      j["force_at_limit_N"] = r.force_at_limit;
      j["force_at_limit_lbf"] = r.force_at_limit / units::lbf;
      j["short_period_damping_held"] = r.has_sp_held ? json(r.sp_held.damping) : json(nullptr);
      j["short_period_damping_free"] = r.has_sp_free ? json(r.sp_free.damping) : json(nullptr);
      j["deciding_root_held"] = {{"mode", r.worst_held.name}, {"real", r.worst_held.root.real()}, {"imag", r.worst_held.root.imag()}};
      j["deciding_root_free"] = {{"mode", r.worst_free.name}, {"real", r.worst_free.root.real()}, {"imag", r.worst_free.root.imag()}};
      j["release_up"] = release_json(r.release_up);
      j["release_down"] = release_json(r.release_down);
    }
    a.push_back(j);
  }
  return a;
}

}  // namespace fp
