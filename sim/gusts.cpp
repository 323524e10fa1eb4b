// gusts.cpp — turbulence records of scenarios, rule estimates, tuned gusts, seed runs
// (see gusts.hpp).
#include "sim/gusts.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <limits>

#include "model/atmosphere.hpp"
#include "model/static.hpp"
#include "model/trim.hpp"
#include "model/units.hpp"
#include "sim/parallel.hpp"

#include <nlohmann/json.hpp>

namespace fp {

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();

double closing_speed(const Scenario& s) {
  return s.condition.airspeed * std::cos(s.condition.flight_path) + s.gust_front_speed;
}

}  // namespace

ResolvedTurbulence resolve_turbulence(const Scenario& s) {
  ResolvedTurbulence r;
  const TurbulenceSettings& t = s.turbulence;
  if (t.model == TurbulenceKind::none) return r;
  r.active = true;
  const TurbulenceModel m = t.model == TurbulenceKind::dryden ? TurbulenceModel::dryden : TurbulenceModel::von_karman;
  r.probability = t.probability > 0.0 ? t.probability : severity_probability(static_cast<Severity>(t.severity));
  r.height = t.height > 0.0 ? t.height : s.condition.altitude;
  r.tables = turbulence_levels(m, r.height, r.probability);
  r.closing_speed = closing_speed(s);
  TurbulenceSpec& sp = r.spec;
  sp.model = m;
  sp.sigma_u = t.sigma_u > 0.0 ? t.sigma_u : r.tables.sigma_u;
  sp.sigma_w = t.sigma_w > 0.0 ? t.sigma_w : r.tables.sigma_w;
  sp.L_u = t.scale_u > 0.0 ? t.scale_u : r.tables.L_u;
  sp.L_w = t.scale_w > 0.0 ? t.scale_w : r.tables.L_w;
  if (t.components == TurbulenceComponents::vertical) sp.sigma_u = 0.0;
  if (t.components == TurbulenceComponents::horizontal) sp.sigma_w = 0.0;
  // The field is sampled at X + front_speed t by points from the tail (behind the CG) to the
  // wing: cover the tail's position at t = 0 to the wing's at the end, with a margin for the
  // airspeed changes the turbulence itself causes.
  const Airplane& ap = s.airplane;
  const double wing_tail = ap.tail.x_ac - ap.wing.h_ac * ap.wing.mac;
  const double cg_tail = std::abs(ap.tail.x_ac - ap.mass.h_cg * ap.wing.mac);
  // default spacing: half the wing-to-tail distance, so that the shortest wavelength the
  // record holds (2 dx) is the distance between the surfaces; at most a tenth of the smaller
  // scale length (low altitude).
  sp.dx = t.spacing > 0.0 ? t.spacing : std::max(0.01, std::min(wing_tail / 2.0, 0.1 * std::min(sp.L_u, sp.L_w)));
  sp.x0 = -(cg_tail + 20.0);
  sp.length = 1.1 * r.closing_speed * s.run.duration + 2.0 * cg_tail + 100.0;
  sp.x_start = r.closing_speed * t.start_time;
  sp.fade = r.closing_speed * t.fade_in;
  sp.seed = static_cast<std::uint64_t>(t.seed);
  sp.interpolation = Interpolation::cubic_spline;
  r.stats_from = t.start_time + t.fade_in;
  return r;
}

std::shared_ptr<const TurbulenceRecord> scenario_turbulence(const Scenario& s) {
  const ResolvedTurbulence r = resolve_turbulence(s);
  if (!r.active || (r.spec.sigma_u <= 0.0 && r.spec.sigma_w <= 0.0)) return nullptr;
  return make_turbulence_record(r.spec);
}

std::vector<RuleEstimate> rule_estimates(const Scenario& s) {
  std::vector<RuleEstimate> out;
  const Airplane& ap = s.airplane;
  const double rho = isa_at(geopotential_altitude(s.condition.altitude)).density;
  const double ws = ap.mass.mass * units::g0 / ap.wing.area;
  const double a = closed_form(ap, s.condition).lift_slope;
  const double V_e = s.condition.airspeed * std::sqrt(rho / isa::rho0);
  for (std::size_t i = 0; i < s.gusts.size() && i < s.gust_designs.size(); ++i) {
    const GustDesign& d = s.gust_designs[i];
    if (d.rule != GustRule::derived_vc && d.rule != GustRule::derived_vd) continue;
    if (s.gusts[i].component != GustComponent::vertical) continue;
    RuleEstimate e;
    e.gust = i;
    e.rule = d.rule == GustRule::derived_vc ? "derived_vc" : "derived_vd";
    e.U_de = s.gusts[i].amplitude * std::sqrt(rho / isa::rho0);  // back to EAS
    e.V_e = V_e;
    e.lift_slope = a;
    e.estimate = derived_gust_load(ws, ap.wing.mac, a, rho, V_e, e.U_de);
    e.sharp_edge = sharp_edged_gust_load(ws, a, rho, s.condition.airspeed, s.gusts[i].amplitude);
    out.push_back(e);
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Tuned gust

int tuned_gust_index(const Scenario& s) {
  for (std::size_t i = 0; i < s.gusts.size() && i < s.gust_designs.size(); ++i)
    if (s.gust_designs[i].tune_max > 0.0) return static_cast<int>(i);
  return -1;
}

Scenario with_gust_length(const Scenario& s, std::size_t gust, double H) {
  Scenario c = s;
  c.gusts[gust].length = H;
  if (gust < c.gust_designs.size()) c.gust_designs[gust].length_auto = false;
  derive_gust_values(c);
  return c;
}

namespace {

// Peak |delta n| of one case of the scenario with the tuned gust at H.
double peak_increment(const Scenario& s, std::size_t gust, double H, Stick stick, double* amplitude) {
  const Scenario c = with_gust_length(s, gust, H);
  if (amplitude) *amplitude = c.gusts[gust].amplitude;
  const RunOutcome r = run_scenario(c, stick == Stick::held ? ControlsChoice::held : ControlsChoice::free);
  const CaseResult& cr = stick == Stick::held ? *r.held : *r.free;
  const auto& n = cr.trace.ch[ch_load_factor];
  double peak = 0.0;
  for (double v : n) peak = std::max(peak, std::abs(v - n.front()));
  return peak;
}

}  // namespace

TuneResult tune_gust(const Scenario& s, ControlsChoice which, int jobs, bool progress) {
  TuneResult r;
  const int idx = tuned_gust_index(s);
  if (idx < 0) return r;
  r.active = true;
  r.gust = static_cast<std::size_t>(idx);
  const GustDesign& d = s.gust_designs[r.gust];
  const int np = std::max(3, d.tune_points);
  std::vector<Stick> cases;
  if (which != ControlsChoice::free) cases.push_back(Stick::held);
  if (which != ControlsChoice::held) cases.push_back(Stick::free);
  // log-spaced grid
  r.grid.resize(static_cast<std::size_t>(np));
  r.grid_size = r.grid.size();
  for (int k = 0; k < np; ++k)
    r.grid[static_cast<std::size_t>(k)].H = d.tune_min * std::pow(d.tune_max / d.tune_min, static_cast<double>(k) / (np - 1));
  const long tasks = static_cast<long>(np) * static_cast<long>(cases.size());
  const int golden_iterations = 10;
  Progress pr(progress, tasks + golden_iterations * static_cast<long>(cases.size()), "runs", "tuned gust");
  parallel_for_rethrow(tasks, jobs, [&](long k) {
    auto& p = r.grid[static_cast<std::size_t>(k / static_cast<long>(cases.size()))];
    const Stick st = cases[static_cast<std::size_t>(k % static_cast<long>(cases.size()))];
    double amp = 0.0;
    const double v = peak_increment(s, r.gust, p.H, st, &amp);
    (st == Stick::held ? p.peak_held : p.peak_free) = v;
    p.amplitude = amp;
    pr.tick();
  });
  // golden-section refinement in log H between the neighbours of the best grid point
  std::vector<TunePoint> extra[2];
  double bestH[2] = {nan_, nan_}, bestV[2] = {nan_, nan_};
  parallel_for_rethrow(static_cast<long>(cases.size()), jobs, [&](long ci) {
    const Stick st = cases[static_cast<std::size_t>(ci)];
    auto val = [&](const TunePoint& p) { return st == Stick::held ? p.peak_held : p.peak_free; };
    std::size_t b = 0;
    for (std::size_t k = 1; k < r.grid.size(); ++k)
      if (val(r.grid[k]) > val(r.grid[b])) b = k;
    double H = r.grid[b].H, V = val(r.grid[b]);
    double lo = std::log(r.grid[b > 0 ? b - 1 : 0].H), hi = std::log(r.grid[std::min(b + 1, r.grid.size() - 1)].H);
    const double g = (std::sqrt(5.0) - 1.0) / 2.0;
    auto eval = [&](double lh) {
      TunePoint p;
      p.H = std::exp(lh);
      double amp = 0.0;
      const double v = peak_increment(s, r.gust, p.H, st, &amp);
      p.amplitude = amp;
      (st == Stick::held ? p.peak_held : p.peak_free) = v;
      extra[ci].push_back(p);
      pr.tick();
      if (v > V) {
        V = v;
        H = p.H;
      }
      return v;
    };
    double x1 = hi - g * (hi - lo), x2 = lo + g * (hi - lo);
    double f1 = eval(x1), f2 = eval(x2);
    for (int it = 2; it < golden_iterations; ++it) {
      if (f1 > f2) {
        hi = x2;
        x2 = x1;
        f2 = f1;
        x1 = hi - g * (hi - lo);
        f1 = eval(x1);
      } else {
        lo = x1;
        x1 = x2;
        f1 = f2;
        x2 = lo + g * (hi - lo);
        f2 = eval(x2);
      }
    }
    bestH[ci] = H;
    bestV[ci] = V;
  });
  for (std::size_t ci = 0; ci < cases.size(); ++ci) {
    for (const auto& p : extra[ci]) r.grid.push_back(p);
    if (cases[ci] == Stick::held) {
      r.H_held = bestH[ci];
      r.peak_held = bestV[ci];
    } else {
      r.H_free = bestH[ci];
      r.peak_free = bestV[ci];
    }
  }
  return r;
}

// ---------------------------------------------------------------------------------------------
// Seeds

SeedsResult run_seeds(const Scenario& s, ControlsChoice which, int seeds, int jobs, bool progress) {
  SeedsResult out;
  const auto t0 = std::chrono::steady_clock::now();
  const auto plant = scenario_plant(s);
  const Trim trim = scenario_trim(*plant, s);
  const double alpha_stall = wing_stall(s.airplane.wing.lift).alpha;
  const double gusts_over = gusts_passed_time(s);
  const ResolvedTurbulence rt = resolve_turbulence(s);
  const double stats_from = rt.active ? rt.stats_from : -1.0;
  std::vector<Stick> cases;
  if (which != ControlsChoice::free) cases.push_back(Stick::held);
  if (which != ControlsChoice::held) cases.push_back(Stick::free);
  out.runs.resize(static_cast<std::size_t>(seeds));
  for (std::size_t i = 0; i < out.runs.size(); ++i)
    out.runs[i].seed = static_cast<long>(s.turbulence.seed) + static_cast<long>(i);
  const long nc = static_cast<long>(cases.size());
  Progress pr(progress, seeds * nc, "runs", "seeds");
  parallel_for_rethrow(seeds * nc, jobs, [&](long k) {
    const auto i = static_cast<std::size_t>(k / nc);
    const Stick st = cases[static_cast<std::size_t>(k % nc)];
    Scenario c = s;
    c.turbulence.seed = static_cast<int>(static_cast<long>(s.turbulence.seed) + static_cast<long>(i));
    GustField g = scenario_gust_field(c);
    Simulation sim(plant, std::move(g), trim, c.run, RunCase{st, c.run.let_go_time}, c.events);
    sim.run_to_end();
    CaseResult cr;
    cr.rc = RunCase{st, c.run.let_go_time};
    cr.trace = sim.trace();
    cr.departure = sim.departure();
    cr.stats = sim.stats();
    SeedRun& sr = out.runs[i];
    (st == Stick::held ? sr.held : sr.free) = summarize_case(cr, alpha_stall, gusts_over, stats_from);
    (st == Stick::held ? sr.has_held : sr.has_free) = true;
    pr.tick();
  });
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

}  // namespace fp

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

// The scenario a case actually flew (a tuned gust at that case's gradient distance).
Scenario case_scenario(const Scenario& s, const TuneResult* tune, Stick st) {
  if (!tune || !tune->active) return s;
  const double H = st == Stick::held ? tune->H_held : tune->H_free;
  return std::isfinite(H) ? with_gust_length(s, tune->gust, H) : s;
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
        summarize_case(*r.held, alpha_stall, gusts_passed_time(case_scenario(s, tune, Stick::held)), from));
  if (r.free)
    out.free = std::make_unique<CaseSummary>(
        summarize_case(*r.free, alpha_stall, gusts_passed_time(case_scenario(s, tune, Stick::free)), from));
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

RunOutcome run_scenario_tuned(const Scenario& s, ControlsChoice which, int jobs, bool progress, TuneResult& tune) {
  tune = tune_gust(s, which, jobs, progress);
  RunOutcome out;
  if (which != ControlsChoice::free) {
    RunOutcome r = run_scenario(case_scenario(s, &tune, Stick::held), ControlsChoice::held);
    out.trim = r.trim;
    out.held = std::move(r.held);
  }
  if (which != ControlsChoice::held) {
    RunOutcome r = run_scenario(case_scenario(s, &tune, Stick::free), ControlsChoice::free);
    if (!out.held) out.trim = r.trim;
    out.free = std::move(r.free);
  }
  return out;
}

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
    o += "  refined (golden section between the best grid point's neighbours): worst held H = " +
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
         {"first_seed", s.turbulence.seed}, {"wall_time_s", r.seconds}, {"turbulence", turbulence_json(s)}};
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
      rr[metrics[m].name] = num(sp[0][m].mean != 0.0 ? sp[1][m].mean / sp[0][m].mean : NAN);
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
    const std::string ratio = has[0] && has[1] && sp[0][m].mean != 0.0 ? f(sp[1][m].mean / sp[0][m].mean, 2) : "";
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
