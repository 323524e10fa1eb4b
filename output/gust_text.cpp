// gust_text.cpp — what `floatpitch run` adds for gusts and turbulence (summary.json block and
// terminal table) and the multi-seed report (see gust_text.hpp).
#include "output/gust_text.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/static.hpp"
#include "model/units.hpp"
#include "output/outputs.hpp"
#include "output/response_text.hpp"
#include "util/caution.hpp"
#include "output/response_text.hpp"

// ---------------------------------------------------------------------------------------------
// Reports

namespace fp {

using nlohmann::json;

namespace {

json num(double v) { return std::isfinite(v) ? json(v) : json(nullptr); }

const char* shape_name(GustShape g) {
  switch (g) {
    case GustShape::one_minus_cosine: return "one_minus_cosine";
    case GustShape::sharp_edge: return "sharp_edge";
    case GustShape::ramp: return "ramp";
    case GustShape::train: return "train";
  }
  return "?";
}

const char* rule_name(GustRule r) {
  switch (r) {
    case GustRule::amplitude: return "none";
    case GustRule::derived_vc: return "derived_vc";
    case GustRule::derived_vd: return "derived_vd";
    case GustRule::gradient_distance: return "gradient_distance";
  }
  return "?";
}

const char* rule_source(GustRule r) {
  switch (r) {
    case GustRule::amplitude: return "";
    case GustRule::derived_vc:
    case GustRule::derived_vd:
      return "14 CFR 23.333(c) and 23.341(c) before amendment 23-64; CS 23.341 (amendment 4)";
    case GustRule::gradient_distance: return "14 CFR 25.341(a) (transport category)";
  }
  return "";
}

std::string f(double v, int dec) {
  if (!std::isfinite(v)) return "-";
  char b[64];
  std::snprintf(b, sizeof b, "%.*f", dec, v);
  return b;
}

std::string g3(double v) {
  char b[32];
  std::snprintf(b, sizeof b, "%.3g", v);
  return b;
}

struct Summaries {
  std::unique_ptr<CaseSummary> held, free;
};

Summaries summaries(const Scenario& s, const RunOutcome& r, const TuneResult* tune) {
  Summaries out;
  const double alpha_stall = wing_stall(s.airplane.wing.lift).alpha;
  const ResolvedTurbulence rt = resolve_turbulence(s);
  const double from = rt.active ? rt.stats_from : -1.0;
  if (r.held)
    out.held = std::make_unique<CaseSummary>(
        summarize_case(*r.held, alpha_stall, disturbances_over_time(case_scenario(s, tune, Stick::held)), from));
  if (r.free)
    out.free = std::make_unique<CaseSummary>(
        summarize_case(*r.free, alpha_stall, disturbances_over_time(case_scenario(s, tune, Stick::free)), from));
  return out;
}

json turbulence_json(const Scenario& s) {
  const ResolvedTurbulence rt = resolve_turbulence(s);
  if (!rt.active) return nullptr;
  const auto& sp = rt.spec;
  return json{{"model", sp.model == TurbulenceModel::dryden ? "dryden" : "von_karman"},
              {"probability_of_exceedance", rt.probability},
              {"height_m", rt.height},
              {"band", rt.tables.band},
              {"sigma_u_mps", sp.sigma_u},
              {"sigma_w_mps", sp.sigma_w},
              {"scale_u_m", sp.L_u},
              {"scale_w_m", sp.L_w},
              {"tables", {{"sigma_u_mps", rt.tables.sigma_u}, {"sigma_w_mps", rt.tables.sigma_w},
                          {"scale_u_m", rt.tables.L_u}, {"scale_w_m", rt.tables.L_w},
                          {"source", "MIL-F-8785C section 3.7 (intensity against altitude and probability of "
                                     "exceedance; low-altitude model below 1000 ft; 1000-2000 ft linear blend)"}}},
              {"seed", s.turbulence.seed},
              {"spacing_m", sp.dx},
              {"interpolation", "natural cubic spline"},
              {"enters_at_s", s.turbulence.start_time},
              {"statistics_from_s", rt.stats_from}};
}

}  // namespace

json gust_summary_json(const Scenario& s, const RunOutcome& r, const TuneResult* tune) {
  const Summaries sm = summaries(s, r, tune);
  json j;
  j["gust_response"] = comparison_json(sm.held.get(), sm.free.get());
  json gusts = json::array();
  for (std::size_t i = 0; i < s.gusts.size(); ++i) {
    const auto& g = s.gusts[i];
    const GustDesign d = i < s.gust_designs.size() ? s.gust_designs[i] : GustDesign{};
    json e{{"shape", shape_name(g.shape)},
           {"component", g.component == GustComponent::vertical ? "vertical" : "horizontal"},
           {"start_m", g.start},
           {"gradient_distance_m", g.length},
           {"amplitude_true_mps", g.amplitude},
           {"rule", rule_name(d.rule)}};
    if (d.rule != GustRule::amplitude) e["rule_source"] = rule_source(d.rule);
    if (g.shape == GustShape::train) {
      e["count"] = g.count;
      e["spacing_m"] = g.spacing;
    }
    gusts.push_back(e);
  }
  j["gusts"] = gusts;
  json est = json::array();
  for (const auto& e : rule_estimates(s)) {
    est.push_back({{"gust", e.gust + 1},
                   {"rule", e.rule},
                   {"source", "14 CFR 23.341(c) before amendment 23-64; CS 23.341 (amendment 4)"},
                   {"U_de_eas_mps", e.U_de},
                   {"V_e_mps", e.V_e},
                   {"airplane_lift_slope_per_rad", e.lift_slope},
                   {"mu_g", e.estimate.mu_g},
                   {"K_g", e.estimate.K_g},
                   {"delta_n_rule", e.estimate.delta_n},
                   {"delta_n_sharp_edge_quasi_steady", e.sharp_edge},
                   {"delta_n_simulated_held", sm.held ? num(sm.held->response.peak_dn) : json(nullptr)},
                   {"delta_n_simulated_free", sm.free ? num(sm.free->response.peak_dn) : json(nullptr)}});
  }
  j["design_rule_estimates"] = est;
  j["turbulence"] = turbulence_json(s);
  if (tune && tune->active) {
    json grid = json::array();
    for (const auto& p : tune->grid)
      grid.push_back({{"H_m", p.H}, {"amplitude_true_mps", p.amplitude}, {"peak_dn_held", num(p.peak_held)},
                      {"peak_dn_free", num(p.peak_free)}});
    j["tuned_gust"] = {{"gust", tune->gust + 1},
                       {"grid_points", tune->grid_size},
                       {"metric", "peak |load-factor increment|"},
                       {"points", grid},
                       {"held", {{"H_m", num(tune->H_held)}, {"H_ft", num(tune->H_held / units::ft)}, {"peak_dn", num(tune->peak_held)}}},
                       {"free", {{"H_m", num(tune->H_free)}, {"H_ft", num(tune->H_free / units::ft)}, {"peak_dn", num(tune->peak_free)}}},
                       {"note", "each case was run at its own worst gradient distance"}};
  } else {
    j["tuned_gust"] = nullptr;
  }
  j["gust_caution"] =
      "Design-gust amplitudes are certification design conventions, not a forecast of the air the airplane will meet.";
  return j;
}

std::string gust_table(const Scenario& s, const RunOutcome& r, const TuneResult* tune) {
  const Summaries sm = summaries(s, r, tune);
  std::string o = "\n" + comparison_table(sm.held.get(), sm.free.get());
  for (const auto& e : rule_estimates(s)) {
    o += "\ngust " + std::to_string(e.gust + 1) + ", rule " + e.rule + " (14 CFR 23.341(c) before amdt 64 / CS 23.341): U_de " +
         f(e.U_de / units::ft, 1) + " ft/s EAS at V_e " + f(units::to_kt(e.V_e), 1) + " kt, a " + f(e.lift_slope, 2) +
         "/rad: mu_g " + f(e.estimate.mu_g, 2) + ", K_g " + f(e.estimate.K_g, 4) + "\n";
    o += "  load-factor increment: rule " + f(e.estimate.delta_n, 3) + ", quasi-steady sharp edge " + f(e.sharp_edge, 3) +
         ", simulated held " + (sm.held ? f(sm.held->response.peak_dn, 3) : "-") + ", free " +
         (sm.free ? f(sm.free->response.peak_dn, 3) : "-") +
         "\n  (K_g is a plunge-only factor that also stands for the lag of unsteady lift; the simulation has quasi-steady "
         "lift, without that lag, and pitches: expect it above the rule)\n";
  }
  const ResolvedTurbulence rt = resolve_turbulence(s);
  if (rt.active) {
    const auto& sp = rt.spec;
    o += std::string("\nturbulence: ") + (sp.model == TurbulenceModel::dryden ? "Dryden" : "von Karman") + ", P = " +
         g3(rt.probability) + ", height " + f(rt.height / units::ft, 0) + " ft (" + rt.tables.band +
         "): sigma_u " + f(sp.sigma_u / units::ft, 2) + " ft/s, sigma_w " + f(sp.sigma_w / units::ft, 2) + " ft/s, L_u " +
         f(sp.L_u / units::ft, 0) + " ft, L_w " + f(sp.L_w / units::ft, 0) + " ft; seed " + std::to_string(s.turbulence.seed) +
         ", spacing " + f(sp.dx, 2) + " m\n";
  }
  if (tune && tune->active) {
    o += "\ntuned gust (gust " + std::to_string(tune->gust + 1) + "), peak |load-factor increment| against gradient distance H:\n";
    // the grid (both cases at each H), then the refinement of each case around its best point
    const std::vector<TunePoint> pts(tune->grid.begin(),
                                     tune->grid.begin() + static_cast<long>(std::min(tune->grid_size, tune->grid.size())));
    char line[160];
    std::snprintf(line, sizeof line, "  %10s %10s %12s %10s %10s\n", "H [ft]", "H [m]", "U [ft/s TAS]", "held", "free");
    o += line;
    for (const auto& p : pts) {
      std::snprintf(line, sizeof line, "  %10.1f %10.2f %12.2f %10s %10s\n", p.H / units::ft, p.H, p.amplitude / units::ft,
                    f(p.peak_held, 3).c_str(), f(p.peak_free, 3).c_str());
      o += line;
    }
    o += "  refined (Brent's method between the best grid point's neighbours): worst held H = " +
         f(tune->H_held / units::ft, 1) + " ft (peak " + f(tune->peak_held, 3) + "), free H = " +
         f(tune->H_free / units::ft, 1) + " ft (peak " + f(tune->peak_free, 3) + ")\n  the runs and the comparison above were made at each case's own worst H\n";
  }
  bool any_rule = false;
  for (const auto& d : s.gust_designs) any_rule = any_rule || d.rule != GustRule::amplitude;
  if (any_rule) o += "\nDesign-gust amplitudes are certification design conventions, not a forecast.\n";
  return o;
}

// ---------------------------------------------------------------------------------------------
// Seeds report

namespace {

struct Spread {
  double mean = NAN, sd = NAN, min = NAN, max = NAN;
  long n = 0;
};

Spread spread(const std::vector<double>& v) {
  Spread s;
  std::vector<double> x;
  for (double a : v)
    if (std::isfinite(a)) x.push_back(a);
  s.n = static_cast<long>(x.size());
  if (x.empty()) return s;
  double sum = 0.0;
  for (double a : x) sum += a;
  s.mean = sum / static_cast<double>(x.size());
  double ss = 0.0;
  for (double a : x) ss += (a - s.mean) * (a - s.mean);
  s.sd = x.size() > 1 ? std::sqrt(ss / static_cast<double>(x.size() - 1)) : 0.0;
  s.min = *std::min_element(x.begin(), x.end());
  s.max = *std::max_element(x.begin(), x.end());
  return s;
}

struct Metric {
  std::string name;  // JSON/CSV name with its unit
  double (*get)(const CaseSummary&);
};

const std::vector<Metric>& seed_metrics() {
  static const std::vector<Metric> m = [] {
    std::vector<Metric> v;
    v.push_back({"rms_load_factor", [](const CaseSummary& c) { return c.turbulence.rms[st_load_factor]; }});
    v.push_back({"rms_alpha_deg", [](const CaseSummary& c) { return units::to_deg(c.turbulence.rms[st_alpha]); }});
    v.push_back({"rms_pitch_rate_deg_s", [](const CaseSummary& c) { return units::to_deg(c.turbulence.rms[st_q]); }});
    v.push_back({"rms_elevator_deg", [](const CaseSummary& c) { return units::to_deg(c.turbulence.rms[st_elevator]); }});
    v.push_back({"rms_stick_force_N", [](const CaseSummary& c) { return c.turbulence.rms[st_force]; }});
    v.push_back({"peak_abs_load_factor_increment", [](const CaseSummary& c) { return std::abs(c.response.peak_dn); }});
    v.push_back({"peak_alpha_deg", [](const CaseSummary& c) { return units::to_deg(c.response.peak_alpha); }});
    v.push_back({"stall_margin_deg", [](const CaseSummary& c) { return units::to_deg(c.response.stall_margin); }});
    v.push_back({"peak_abs_elevator_float_deg", [](const CaseSummary& c) { return units::to_deg(std::abs(c.response.peak_float)); }});
    v.push_back({"peak_abs_stick_force_N", [](const CaseSummary& c) { return std::abs(c.response.peak_force); }});
    v.push_back({"departure_time_s", [](const CaseSummary& c) { return c.departed ? c.departure_time : NAN; }});
    return v;
  }();
  return m;
}

}  // namespace

SeedsReport seeds_report(const Scenario& s, const SeedsResult& r) {
  SeedsReport out;
  const auto& metrics = seed_metrics();
  // exceedance columns
  std::vector<std::string> ex_names;
  for (std::size_t k = 0; k < st_count; ++k) {
    const auto& ci = stat_channel_info(k);
    for (std::size_t l = 0; l < 3; ++l)
      ex_names.push_back(std::string("exceed_") + ci.name + "_" + f(ci.levels[l] * ci.display, 2) +
                         (std::string(ci.unit) == "-" ? "" : std::string("_") + ci.unit));
  }
  // CSV
  out.csv = "seed,case,departed";
  for (const auto& m : metrics) out.csv += "," + m.name;
  for (const auto& e : ex_names) out.csv += "," + e;
  out.csv += "\n";
  for (const auto& run : r.runs)
    for (int c = 0; c < 2; ++c) {
      if (!(c == 0 ? run.has_held : run.has_free)) continue;
      const CaseSummary& cs = c == 0 ? run.held : run.free;
      out.csv += std::to_string(run.seed) + (c == 0 ? ",held," : ",free,") + (cs.departed ? "1" : "0");
      for (const auto& m : metrics) {
        out.csv += ',';
        out.csv += f(m.get(cs), 6);
      }
      for (std::size_t k = 0; k < st_count; ++k)
        for (std::size_t l = 0; l < 3; ++l) {
          out.csv += ',';
          out.csv += std::to_string(cs.turbulence.exceed[k][l]);
        }
      out.csv += "\n";
    }
  // spreads
  json j{{"tool", "floatpitch"}, {"scenario", s.path}, {"name", s.name}, {"seeds", r.runs.size()},
         {"first_seed", s.turbulence.seed}, {"wall_time_s", r.seconds}, {"turbulence", turbulence_json(s)}, {"caution", kCaution}};
  Spread sp[2][32];
  long departures[2] = {0, 0};
  bool has[2] = {false, false};
  for (int c = 0; c < 2; ++c) {
    json cj = json::object();
    std::vector<std::vector<double>> cols(metrics.size() + ex_names.size());
    for (const auto& run : r.runs) {
      if (!(c == 0 ? run.has_held : run.has_free)) continue;
      has[c] = true;
      const CaseSummary& cs = c == 0 ? run.held : run.free;
      departures[c] += cs.departed ? 1 : 0;
      for (std::size_t m = 0; m < metrics.size(); ++m) cols[m].push_back(metrics[m].get(cs));
      std::size_t e = metrics.size();
      for (std::size_t k = 0; k < st_count; ++k)
        for (std::size_t l = 0; l < 3; ++l) cols[e++].push_back(static_cast<double>(cs.turbulence.exceed[k][l]));
    }
    if (!has[c]) {
      j[c == 0 ? "held" : "free"] = nullptr;
      continue;
    }
    for (std::size_t m = 0; m < cols.size(); ++m) {
      sp[c][m] = spread(cols[m]);
      const std::string& name = m < metrics.size() ? metrics[m].name : ex_names[m - metrics.size()];
      cj[name] = {{"mean", num(sp[c][m].mean)}, {"sd", num(sp[c][m].sd)}, {"min", num(sp[c][m].min)}, {"max", num(sp[c][m].max)}};
    }
    cj["departures"] = departures[c];
    j[c == 0 ? "held" : "free"] = cj;
  }
  if (has[0] && has[1]) {
    json rr = json::object();
    for (std::size_t m = 0; m < metrics.size(); ++m)
      rr[metrics[m].name] = num(free_to_held_ratio(sp[1][m].mean, sp[0][m].mean));
    j["ratio_of_means_free_to_held"] = rr;
  }
  j["statistics"] =
      "per seed: RMS of the increments from trim and peaks over the window after the fade-in; across seeds: mean, "
      "sample standard deviation (sd), min and max (departure_time_s over the runs that departed only; a departed run's "
      "figures end at its departure). Exceedance counts: times |increment| rises above the level. Free "
      "stick force = force to hold the elevator where it floated.";
  j["caution"] =
      "Engineering analysis aid only: results are only as good as the aerodynamic and hinge-moment data, which carry "
      "large uncertainty; no flutter or structural flexibility is modelled; not approved data.";
  out.summary_json = j.dump(2) + "\n";
  // table
  char line[200];
  std::snprintf(line, sizeof line, "%zu seeds from %d, %.2f s wall clock\n\n%-36s %22s %22s %9s\n", r.runs.size(),
                s.turbulence.seed, r.seconds, "mean +- sd over seeds", "held", "free", "free/held");
  out.table = line;
  for (std::size_t m = 0; m < metrics.size(); ++m) {
    auto ms = [&](int c) {
      return has[c] && sp[c][m].n > 0 ? f(sp[c][m].mean, 3) + " +- " + f(sp[c][m].sd, 3) : std::string("-");
    };
    const bool both = has[0] && has[1];
    const std::string ratio = !both ? "" : opposite_signs(sp[1][m].mean, sp[0][m].mean) ? "opp. sign"
                                                                                   : f(free_to_held_ratio(sp[1][m].mean, sp[0][m].mean), 2);
    std::snprintf(line, sizeof line, "%-36s %22s %22s %9s\n", metrics[m].name.c_str(), ms(0).c_str(), ms(1).c_str(),
                  ratio.c_str());
    out.table += line;
  }
  for (std::size_t e = 0; e < ex_names.size(); ++e) {
    const std::size_t m = metrics.size() + e;
    auto ms = [&](int c) { return has[c] ? f(sp[c][m].mean, 1) + " +- " + f(sp[c][m].sd, 1) : std::string("-"); };
    std::snprintf(line, sizeof line, "%-36s %22s %22s\n", ex_names[e].c_str(), ms(0).c_str(), ms(1).c_str());
    out.table += line;
  }
  std::snprintf(line, sizeof line, "departures: held %ld, free %ld (of %zu seeds)\n", departures[0], departures[1],
                r.runs.size());
  out.table += line;
  return out;
}

}  // namespace fp
