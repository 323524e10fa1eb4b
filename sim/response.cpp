// response.cpp — gust-response metrics and turbulence statistics (see response.hpp).
#include "sim/response.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/units.hpp"
#include "sim/signal.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();
json num(double v) { return std::isfinite(v) ? json(v) : json(nullptr); }

const std::array<StatChannelInfo, st_count> kStat{{
    {"load_factor", "-", 1.0, {0.25, 0.5, 1.0}},
    {"alpha", "deg", 1.0 / units::deg, {1.0 * units::deg, 2.0 * units::deg, 4.0 * units::deg}},
    {"pitch_rate", "deg/s", 1.0 / units::deg, {2.0 * units::deg, 5.0 * units::deg, 10.0 * units::deg}},
    {"elevator", "deg", 1.0 / units::deg, {0.5 * units::deg, 1.0 * units::deg, 2.0 * units::deg}},
    {"stick_force", "N", 1.0, {2.0, 5.0, 10.0}},
}};

}  // namespace

const StatChannelInfo& stat_channel_info(std::size_t c) { return kStat.at(c); }

double gusts_passed_time(const Scenario& s) {
  const double V = s.condition.airspeed * std::cos(s.condition.flight_path) + s.gust_front_speed;
  const double tail = s.airplane.tail.x_ac - s.airplane.mass.h_cg * s.airplane.wing.mac;  // CG to tail a.c.
  double t = 0.0;
  for (const auto& g : s.gusts) {
    double len = g.length;
    if (g.shape == GustShape::one_minus_cosine) len = 2.0 * g.length;
    if (g.shape == GustShape::train) len = (g.count - 1) * g.spacing + 2.0 * g.length;
    if (g.shape == GustShape::sharp_edge) len = 0.0;  // never passes; its onset is what matters
    t = std::max(t, (g.start + len + tail) / V);
  }
  return t;
}

CaseSummary summarize_case(const CaseResult& c, double alpha_stall, double gusts_over, double stats_from) {
  CaseSummary out;
  out.departed = c.departure.departed;
  out.departure_time = c.departure.time;
  out.departure_reason = c.departure.reason;
  const Trace& tr = c.trace;
  const std::size_t n = tr.size();
  ResponseMetrics& m = out.response;
  m.alpha_stall = alpha_stall;
  if (n == 0) return out;
  const auto& t = tr.ch[ch_time];
  const bool free = c.rc.stick == Stick::free;
  const auto& force = tr.ch[free ? ch_hold_force : ch_stick_force];
  const double n0 = tr.ch[ch_load_factor][0], de0 = tr.ch[ch_elevator][0], f0 = force[0];
  for (std::size_t i = 0; i < n; ++i)
    if (std::abs(tr.ch[ch_gust_w_wing][i]) > 1e-12 || std::abs(tr.ch[ch_gust_u_wing][i]) > 1e-12) {
      m.onset = t[i];
      break;
    }
  m.peak_alpha = m.alpha_trim = tr.ch[ch_alpha][0];
  for (std::size_t i = 0; i < n; ++i) {
    const double dn = tr.ch[ch_load_factor][i] - n0;
    if (std::abs(dn) > std::abs(m.peak_dn)) {
      m.peak_dn = dn;
      m.time_peak_dn = t[i];
    }
    m.peak_alpha = std::max(m.peak_alpha, tr.ch[ch_alpha][i]);
    const double dde = tr.ch[ch_elevator][i] - de0;
    if (std::abs(dde) > std::abs(m.peak_float)) m.peak_float = dde;
    const double df = force[i] - f0;
    if (std::abs(df) > std::abs(m.peak_force)) m.peak_force = df;
  }
  m.time_to_peak = m.time_peak_dn - m.onset;
  m.stall_margin = alpha_stall - m.peak_alpha;

  const bool turbulent = stats_from >= 0.0;
  if (!turbulent && !c.departure.departed) {
    const auto& q = tr.ch[ch_q];
    m.damping = log_decrement_damping(t, q, std::max(gusts_over, m.onset));
    double qmax = 0.0;
    for (std::size_t i = 0; i < n; ++i)
      if (t[i] >= m.onset) qmax = std::max(qmax, std::abs(q[i]));
    if (qmax > 0.0) {
      std::size_t last = 0;
      bool any = false;
      for (std::size_t i = 0; i < n; ++i)
        if (t[i] >= m.onset && std::abs(q[i]) > 0.05 * qmax) {
          last = i;
          any = true;
        }
      m.settled = any && last + 1 < n;
      m.settling_time = m.settled ? t[last + 1] - m.onset : nan_;
    }
  } else {
    m.settled = false;
  }

  if (turbulent) {
    TurbulenceStats& s = out.turbulence;
    s.active = true;
    s.from = stats_from;
    s.to = t.back();
    std::array<double, st_count> sum2{};
    std::array<std::array<bool, 3>, st_count> above{};
    long count = 0;
    bool first = true;
    for (std::size_t i = 0; i < n; ++i) {
      if (t[i] < stats_from) continue;
      const std::array<double, st_count> x{tr.ch[ch_load_factor][i] - n0, tr.ch[ch_alpha][i] - tr.ch[ch_alpha][0],
                                           tr.ch[ch_q][i] - tr.ch[ch_q][0], tr.ch[ch_elevator][i] - de0,
                                           force[i] - f0};
      ++count;
      for (std::size_t k = 0; k < st_count; ++k) {
        sum2[k] += x[k] * x[k];
        for (std::size_t l = 0; l < 3; ++l) {
          const bool a = std::abs(x[k]) > kStat[k].levels[l];
          if (a && !above[k][l] && !first) ++s.exceed[k][l];
          above[k][l] = a;
        }
      }
      first = false;
    }
    for (std::size_t k = 0; k < st_count; ++k) s.rms[k] = count > 0 ? std::sqrt(sum2[k] / static_cast<double>(count)) : nan_;
  }
  return out;
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
         {"departure_time_s", c.departed ? json(c.departure_time) : json(nullptr)}};
  if (c.turbulence.active) {
    const auto& s = c.turbulence;
    json rms = json::object(), ex = json::object();
    for (std::size_t k = 0; k < st_count; ++k) {
      const auto& ci = kStat[k];
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

double ratio(double f, double h) {
  if (!std::isfinite(f) || !std::isfinite(h) || h == 0.0) return nan_;
  return std::abs(f) / std::abs(h);
}

}  // namespace

json comparison_json(const CaseSummary* held, const CaseSummary* free) {
  json j{{"definitions",
          "increments from the trim at t = 0; free stick force = force to hold the elevator where it floated; "
          "damping by log decrement of pitch rate after the gusts; settling = 5 % band of peak pitch rate"},
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
        r[std::string("rms_") + kStat[k].name] = num(ratio(free->turbulence.rms[k], held->turbulence.rms[k]));
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
  auto line = [&](const char* label, auto get, int dec, bool with_ratio = true) {
    const double hv = h ? get(*h) : nan_, fv = f ? get(*f) : nan_;
    row(o, label, cell(hv, dec), cell(fv, dec), with_ratio ? cell(ratio(fv, hv), 2) : "");
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
        cell(ratio(f ? f->damping : nan_, h ? h->damping : nan_), 2));
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
      const auto& ci = kStat[k];
      const double hv = sh ? sh->rms[k] * ci.display : nan_, fv = sf ? sf->rms[k] * ci.display : nan_;
      row(o, std::string("RMS ") + ci.name + " [" + ci.unit + "]", cell(hv, 3), cell(fv, 3), cell(ratio(fv, hv), 2));
    }
    for (std::size_t k = 0; k < st_count; ++k) {
      const auto& ci = kStat[k];
      for (std::size_t l = 0; l < 3; ++l) {
        const std::string label = std::string("times |") + ci.name + "| > " + cell(ci.levels[l] * ci.display, 2) + " " + ci.unit;
        row(o, label, sh ? std::to_string(sh->exceed[k][l]) : "-", sf ? std::to_string(sf->exceed[k][l]) : "-", "");
      }
    }
  }
  for (const CaseSummary* c : {held, free})
    if (c && c->departed)
      o << (c == held ? "held" : "free") << " departed at " << cell(c->departure_time, 2) << " s: the figures above end there\n";
  return o.str();
}

}  // namespace fp
