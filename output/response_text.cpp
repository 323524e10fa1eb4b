// response_text.cpp — response metrics as text (see response_text.hpp).
#include "output/response_text.hpp"

#include <cmath>
#include <cstdio>
#include <limits>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/units.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();
json num(double v) { return std::isfinite(v) ? json(v) : json(nullptr); }

}  // namespace

bool opposite_signs(double f, double h) { return std::isfinite(f) && std::isfinite(h) && f * h < 0.0; }

double free_to_held_ratio(double f, double h) {
  // a held value that is only the integrator's noise (a million times below the free one,
  // e.g. a held run that stays in trim) gives no ratio either
  if (!std::isfinite(f) || !std::isfinite(h) || h == 0.0 || opposite_signs(f, h)) return nan_;
  if (std::abs(h) <= 1e-6 * std::abs(f)) return nan_;
  return std::abs(f) / std::abs(h);
}

json case_summary_json(const CaseSummary& c) {
  const ResponseMetrics& m = c.response;
  json j{{"peak_load_factor_increment", m.peak_dn},
         {"time_of_peak_s", m.time_peak_dn},
         {"time_to_peak_s", m.time_to_peak},
         {"onset_s", m.onset},
         {"peak_alpha_deg", units::to_deg(m.peak_alpha)},
         {"trim_alpha_deg", units::to_deg(m.alpha_trim)},
         {"alpha_stall_deg", units::to_deg(m.alpha_stall)},
         {"stall_margin_deg", units::to_deg(m.stall_margin)},
         {"peak_elevator_float_deg", units::to_deg(m.peak_float)},
         {"peak_stick_force_N", m.peak_force},
         {"damping_ratio_log_decrement", num(m.damping)},
         {"settling_time_s", num(m.settling_time)},
         {"settled", m.settled},
         {"departed", c.departed},
         {"departure_time_s", c.departed ? json(c.departure_time) : json(nullptr)},
         {"departure_criterion", c.departed ? json(c.departure_criterion) : json(nullptr)},
         {"departure_reason", c.departed ? json(c.departure_reason) : json(nullptr)},
         {"gust_reached_airplane", c.gust_seen}};
  if (c.turbulence.active) {
    const auto& s = c.turbulence;
    json rms = json::object(), ex = json::object();
    for (std::size_t k = 0; k < st_count; ++k) {
      const auto& ci = stat_channel_info(k);
      rms[std::string(ci.name) + "_" + (std::string(ci.unit) == "-" ? "" : ci.unit)] = s.rms[k] * ci.display;
      json levels = json::array();
      for (std::size_t l = 0; l < 3; ++l) levels.push_back({{"level", ci.levels[l] * ci.display}, {"count", s.exceed[k][l]}});
      ex[ci.name] = {{"unit", ci.unit}, {"levels", levels}};
    }
    j["turbulence"] = {{"window_s", {s.from, s.to}}, {"rms", rms}, {"exceedances", ex}};
  }
  return j;
}

namespace {

double ratio(double f, double h) { return free_to_held_ratio(f, h); }

}  // namespace

json comparison_json(const CaseSummary* held, const CaseSummary* free) {
  json j{{"definitions",
          "increments from the trim at t = 0; free stick force = force to hold the elevator where it floated; "
          "damping by log decrement of pitch rate after the disturbances; settling = 5 % band of peak pitch rate; "
          "ratio_free_to_held = |free|/|held|, null where held is 0 or where the two have opposite signs (a ratio "
          "of magnitudes would hide that the free airplane went the other way)"},
         {"held", held ? case_summary_json(*held) : json(nullptr)},
         {"free", free ? case_summary_json(*free) : json(nullptr)}};
  if (held && free) {
    const auto &h = held->response, &f = free->response;
    j["ratio_free_to_held"] = {{"peak_load_factor_increment", num(ratio(f.peak_dn, h.peak_dn))},
                               {"time_to_peak", num(ratio(f.time_to_peak, h.time_to_peak))},
                               {"peak_alpha_increment", num(ratio(f.peak_alpha - f.alpha_trim, h.peak_alpha - h.alpha_trim))},
                               {"stall_margin", num(ratio(f.stall_margin, h.stall_margin))},
                               {"peak_elevator_float", num(ratio(f.peak_float, h.peak_float))},
                               {"peak_stick_force", num(ratio(f.peak_force, h.peak_force))},
                               {"damping_ratio", num(ratio(f.damping, h.damping))},
                               {"settling_time", num(ratio(f.settling_time, h.settling_time))}};
    if (held->turbulence.active && free->turbulence.active) {
      json r = json::object();
      for (std::size_t k = 0; k < st_count; ++k)
        r[std::string("rms_") + stat_channel_info(k).name] = num(ratio(free->turbulence.rms[k], held->turbulence.rms[k]));
      j["ratio_free_to_held"]["turbulence"] = r;
    }
  }
  return j;
}

namespace {

std::string cell(double v, int dec, const char* suffix = "") {
  if (!std::isfinite(v)) return "-";
  char b[64];
  std::snprintf(b, sizeof b, "%.*f%s", dec, v, suffix);
  return b;
}

void row(std::ostringstream& o, const std::string& label, const std::string& h, const std::string& f,
         const std::string& r) {
  char line[256];
  std::snprintf(line, sizeof line, "%-38s %12s %12s %10s\n", label.c_str(), h.c_str(), f.c_str(), r.c_str());
  o << line;
}

}  // namespace

std::string comparison_table(const CaseSummary* held, const CaseSummary* free) {
  std::ostringstream o;
  const ResponseMetrics* h = held ? &held->response : nullptr;
  const ResponseMetrics* f = free ? &free->response : nullptr;
  bool any_opposite = false;
  auto ratio_cell = [&](double fv, double hv) {
    if (!opposite_signs(fv, hv)) return cell(ratio(fv, hv), 2);
    any_opposite = true;
    return std::string("opp. sign");
  };
  auto line = [&](const char* label, auto get, int dec, bool with_ratio = true) {
    const double hv = h ? get(*h) : nan_, fv = f ? get(*f) : nan_;
    row(o, label, cell(hv, dec), cell(fv, dec), with_ratio ? ratio_cell(fv, hv) : "");
  };
  row(o, "gust response", "held", "free", "free/held");
  line("peak load-factor increment [-]", [](const ResponseMetrics& m) { return m.peak_dn; }, 3);
  line("time to peak [s]", [](const ResponseMetrics& m) { return m.time_to_peak; }, 2);
  line("peak angle of attack [deg]", [](const ResponseMetrics& m) { return units::to_deg(m.peak_alpha); }, 2, false);
  line("margin to stall angle [deg]", [](const ResponseMetrics& m) { return units::to_deg(m.stall_margin); }, 2);
  line("peak elevator float [deg]", [](const ResponseMetrics& m) { return units::to_deg(m.peak_float); }, 2);
  line("peak stick force (free: to hold) [N]", [](const ResponseMetrics& m) { return m.peak_force; }, 1);
  {
    // no second peak of q after the gusts: an aperiodic (dead-beat) return, not a missing number
    auto damp = [](const CaseSummary* c) {
      if (!c) return std::string("-");
      if (std::isfinite(c->response.damping)) return cell(c->response.damping, 3);
      return c->departed || c->turbulence.active ? std::string("-") : std::string("aperiodic");
    };
    row(o, "damping ratio (log decrement of q)", damp(held), damp(free),
        ratio_cell(f ? f->damping : nan_, h ? h->damping : nan_));
  }
  line("settling time, 5 % of peak q [s]", [](const ResponseMetrics& m) { return m.settling_time; }, 2);
  const bool turb = (held && held->turbulence.active) || (free && free->turbulence.active);
  if (turb) {
    const TurbulenceStats* sh = held && held->turbulence.active ? &held->turbulence : nullptr;
    const TurbulenceStats* sf = free && free->turbulence.active ? &free->turbulence : nullptr;
    const TurbulenceStats* any = sh ? sh : sf;
    o << "\n";
    row(o, "turbulence, " + cell(any->from, 1) + " to " + cell(any->to, 1) + " s", "held", "free", "free/held");
    for (std::size_t k = 0; k < st_count; ++k) {
      const auto& ci = stat_channel_info(k);
      const double hv = sh ? sh->rms[k] * ci.display : nan_, fv = sf ? sf->rms[k] * ci.display : nan_;
      row(o, std::string("RMS ") + ci.name + " [" + ci.unit + "]", cell(hv, 3), cell(fv, 3), ratio_cell(fv, hv));
    }
    for (std::size_t k = 0; k < st_count; ++k) {
      const auto& ci = stat_channel_info(k);
      for (std::size_t l = 0; l < 3; ++l) {
        const std::string label = std::string("times |") + ci.name + "| > " + cell(ci.levels[l] * ci.display, 2) + " " + ci.unit;
        row(o, label, sh ? std::to_string(sh->exceed[k][l]) : "-", sf ? std::to_string(sf->exceed[k][l]) : "-", "");
      }
    }
  }
  if (any_opposite)
    o << "opp. sign: held and free of opposite sign have no ratio (the free airplane went the other way)\n";
  const bool gusty = (held && held->gust_seen) || (free && free->gust_seen);
  for (const CaseSummary* c : {held, free})
    if (c && c->departed)
      o << (c == held ? "held" : "free") << " departed at " << cell(c->departure_time, 2) << " s (" << c->departure_reason
        << "): the figures above end there"
        << (gusty && !c->gust_seen ? "; it departed before its gust arrived, so they are no gust response" : "") << "\n";
  return o.str();
}

}  // namespace fp
