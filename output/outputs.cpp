// outputs.cpp — CSV and JSON writers, terminal tables (see outputs.hpp).
#include "output/outputs.hpp"

#include <charconv>
#include <cmath>
#include <cstdio>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/units.hpp"
#include "scenario/gust_timing.hpp"
#include "version.hpp"

namespace fp {

using nlohmann::json;

namespace {

void append_fixed(std::string& out, char* buf, double v, int decimals) {
  static constexpr long long pow10[] = {1, 10, 100, 1000, 10000, 100000, 1000000};
  if (!std::isfinite(v) || std::abs(v) >= 1e12) {
    const auto r = std::to_chars(buf, buf + 40, v);
    out.append(buf, r.ptr);
    return;
  }
  const long long scale = pow10[decimals];
  long long n = std::llround(v * static_cast<double>(scale));
  if (n < 0) {
    out += '-';
    n = -n;
  }
  const long long ip = n / scale, fp = n % scale;
  auto r = std::to_chars(buf, buf + 40, ip);
  out.append(buf, r.ptr);
  if (fp == 0) return;
  char frac[8];
  long long f = fp;
  for (int k = decimals - 1; k >= 0; --k) {
    frac[k] = static_cast<char>('0' + f % 10);
    f /= 10;
  }
  int len = decimals;
  while (len > 0 && frac[len - 1] == '0') --len;
  out += '.';
  out.append(frac, static_cast<std::size_t>(len));
}

}  // namespace

std::string trace_csv(const Trace& tr) {
  std::string out;
  out.reserve(tr.size() * ch_count * 12 + 512);
  for (std::size_t c = 0; c < ch_count; ++c) {
    const auto& ci = channel_info(c);
    out += ci.name;
    out += " [";
    out += ci.unit;
    out += c + 1 < ch_count ? "]," : "]\n";
  }
  // Fixed-point text: time with 4 decimals, every other value with 6 decimals (trailing zeros
  // dropped), formatted through integers, several times faster than printf-style formatting
  // (which dominated long runs); values beyond 1e12 or not finite fall back to std::to_chars.
  char buf[48];
  for (std::size_t i = 0; i < tr.size(); ++i) {
    for (std::size_t c = 0; c < ch_count; ++c) {
      const double v = tr.ch[c][i] * channel_info(c).display;
      append_fixed(out, buf, v, c == ch_time ? 4 : 6);
      out += c + 1 < ch_count ? ',' : '\n';
    }
  }
  return out;
}

Peak peak_of(const Trace& tr, std::size_t c) {
  Peak p;
  if (tr.size() == 0) return p;
  const double k = channel_info(c).display;
  p.max = p.min = tr.ch[c][0] * k;
  for (std::size_t i = 0; i < tr.size(); ++i) {
    const double v = tr.ch[c][i] * k;
    if (v > p.max) { p.max = v; p.time_of_max = tr.ch[ch_time][i]; }
    if (v < p.min) { p.min = v; p.time_of_min = tr.ch[ch_time][i]; }
  }
  return p;
}

json trim_json(const Trim& t) {
  return json{{"airspeed_mps", t.airspeed},
              {"airspeed_kt", units::to_kt(t.airspeed)},
              {"altitude_m", t.altitude},
              {"alpha_deg", units::to_deg(t.alpha)},
              {"theta_deg", units::to_deg(t.theta)},
              {"elevator_deg", units::to_deg(t.de)},
              {"tab_deg", units::to_deg(t.tab)},
              {"throttle", t.throttle},
              {"stick_force_N", t.stick_force},
              {"lift_coefficient", t.CL},
              {"tail_alpha_deg", units::to_deg(t.eval.alpha_t)},
              {"hinge_moment_coefficient", t.eval.Ch}};
}

json case_json(const CaseResult& c) {
  json peaks = json::object();
  for (std::size_t ch = 1; ch < ch_count; ++ch) {
    const Peak p = peak_of(c.trace, ch);
    peaks[channel_info(ch).name] = {{"max", p.max}, {"min", p.min}, {"time_of_max", p.time_of_max},
                                    {"time_of_min", p.time_of_min}, {"unit", channel_info(ch).unit}};
  }
  json j{{"diverged", c.departure.departed},
         {"divergence_time_s", c.departure.departed ? json(c.departure.time) : json(nullptr)},
         {"divergence_reason", c.departure.departed ? json(c.departure.reason) : json(nullptr)},
         {"divergence_criterion", c.departure.departed ? json(c.departure.criterion) : json(nullptr)},
         {"let_go_time_s", c.rc.stick == Stick::free ? json(c.rc.let_go_time) : json(nullptr)},
         {"end_time_s", c.trace.size() ? c.trace.ch[ch_time].back() : 0.0},
         {"peaks", peaks},
         {"solver",
          {{"method", "Dormand-Prince 5(4), dense output"},
           {"steps", c.stats.steps},
           {"derivative_calls", c.stats.derivative_calls},
           {"min_step_s", c.stats.min_step},
           {"max_step_s", c.stats.max_step}}}};
  return j;
}

json summary_json(const Scenario& s, const RunOutcome& o) {
  json j{{"tool", "floatpitch"},
         {"version", FLOATPITCH_VERSION},
         {"scenario", s.path},
         {"name", s.name},
         {"trim", trim_json(o.trim)},
         {"held", o.held ? case_json(*o.held) : json(nullptr)},
         {"free", o.free ? case_json(*o.free) : json(nullptr)},
         {"caution",
          "Engineering analysis aid only: results are only as good as the aerodynamic and hinge-moment "
          "data, which carry large uncertainty; no flutter or structural flexibility is modelled; not "
          "approved data. Flight-test and compliance findings belong to qualified, authorized people "
          "under the applicable airworthiness rules."}};
  const double quiet = disturbances_over_time(s);
  if (o.held) j["held"]["limit_cycle"] = limit_cycle_json(detect_limit_cycle(o.held->trace, quiet, o.held->departure.departed));
  if (o.free) j["free"]["limit_cycle"] = limit_cycle_json(detect_limit_cycle(o.free->trace, quiet, o.free->departure.departed));
  return j;
}

json limit_cycle_json(const LimitCycle& c) {
  if (!c.found) return nullptr;
  return json{{"elevator_amplitude_deg", units::to_deg(c.elevator_amplitude)},
              {"q_amplitude_deg_s", units::to_deg(c.q_amplitude)},
              {"load_factor_amplitude", c.load_factor_amplitude},
              {"period_s", c.period},
              {"cycles", c.cycles},
              {"window_start_s", c.window_start},
              {"amplitude_trend_per_cycle", c.trend_per_cycle},
              {"amplitude_spread", c.amplitude_spread}};
}

std::string limit_cycle_line(const LimitCycle& c) {
  if (!c.found)
    return "no sustained oscillation (limit cycle) from t = " + fixed(c.window_start, 1) +
           " s (pitch-rate amplitudes below 0.01 deg/s are not reported)";
  return "LIMIT CYCLE from t = " + fixed(c.window_start, 1) + " s: period " + fixed(c.period, 2) + " s, elevator +-" +
         fixed(units::to_deg(c.elevator_amplitude), 3) + " deg, pitch rate +-" + fixed(units::to_deg(c.q_amplitude), 3) +
         " deg/s, load factor +-" + fixed(c.load_factor_amplitude, 4) + " (mean of " + std::to_string(c.cycles) +
         " cycles; single cycles differ by up to " + fixed(100.0 * c.amplitude_spread, 0) + " %)";
}

std::string trim_table(const Trim& t, const char* title) {
  std::ostringstream o;
  o << title << "\n";
  o << "  airspeed        " << fixed(t.airspeed, 2) << " m/s (" << fixed(units::to_kt(t.airspeed), 1)
    << " kt TAS) at " << fixed(t.altitude, 0) << " m\n";
  o << "  angle of attack " << fixed(units::to_deg(t.alpha), 2) << " deg   pitch attitude "
    << fixed(units::to_deg(t.theta), 2) << " deg\n";
  o << "  elevator        " << fixed(units::to_deg(t.de), 2) << " deg (TE down +)\n";
  o << "  tab             " << fixed(units::to_deg(t.tab), 2) << " deg (TE down +)\n";
  o << "  throttle        " << fixed(t.throttle, 3) << "\n";
  o << "  stick force     " << fixed(t.stick_force, 2) << " N (pull +)\n";
  return o.str();
}

std::string run_table(const RunOutcome& o, double quiet_from) {
  std::ostringstream s;
  s << trim_table(o.trim, "Trim (start of both runs)");
  const CaseResult* cases[2] = {o.held.get(), o.free.get()};
  const char* names[2] = {"held", "free"};
  char line[256];
  std::snprintf(line, sizeof line, "\n%-34s %16s %16s\n", "quantity", "stick held", "stick free");
  s << line;
  const std::size_t chans[] = {ch_load_factor, ch_alpha, ch_q, ch_theta, ch_airspeed, ch_elevator,
                               ch_stick_force, ch_altitude};
  for (std::size_t ch : chans) {
    const auto& ci = channel_info(ch);
    for (int mm = 0; mm < 2; ++mm) {
      std::string label = std::string(mm == 0 ? "max " : "min ") + ci.label + " [" + ci.unit + "]";
      if (label.size() > 34) label.resize(34);
      char cell[2][48];
      for (int k = 0; k < 2; ++k) {
        if (!cases[k]) {
          std::snprintf(cell[k], sizeof cell[k], "-");
          continue;
        }
        const Peak p = peak_of(cases[k]->trace, ch);
        std::snprintf(cell[k], sizeof cell[k], "%.3f @%.1f", mm == 0 ? p.max : p.min,
                      mm == 0 ? p.time_of_max : p.time_of_min);
      }
      std::snprintf(line, sizeof line, "%-34s %16s %16s\n", label.c_str(), cell[0], cell[1]);
      s << line;
    }
  }
  for (int k = 0; k < 2; ++k) {
    if (!cases[k]) continue;
    s << "\n" << names[k] << ": ";
    if (cases[k]->departure.departed)
      s << "DEPARTED at t = " << fixed(cases[k]->departure.time, 2) << " s (" << cases[k]->departure.reason << ")";
    else
      s << "no departure within " << fixed(cases[k]->trace.size() ? cases[k]->trace.ch[ch_time].back() : 0.0, 1)
        << " s";
    s << "; " << cases[k]->stats.steps << " steps, " << cases[k]->stats.derivative_calls << " derivative calls";
    if (!cases[k]->departure.departed)
      s << "\n  " << limit_cycle_line(detect_limit_cycle(cases[k]->trace, quiet_from, false));
  }
  s << "\n";
  return s.str();
}

}  // namespace fp
