// gusts.cpp — turbulence records of scenarios, rule estimates, tuned gusts, seed runs
// (see gusts.hpp).
#include "analysis/gust_studies.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <limits>

#include "model/atmosphere.hpp"
#include "model/static.hpp"
#include "model/trim.hpp"
#include "model/units.hpp"
#include "util/parallel.hpp"

#include <boost/math/tools/minima.hpp>
#include <nlohmann/json.hpp>

namespace fp {

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();


}  // namespace

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
  constexpr std::uintmax_t max_refine_runs = 30;
  Progress pr(progress, tasks + static_cast<long>(max_refine_runs * cases.size()), "runs", "tuned gust");
  parallel_for_rethrow(tasks, jobs, [&](long k) {
    auto& p = r.grid[static_cast<std::size_t>(k / static_cast<long>(cases.size()))];
    const Stick st = cases[static_cast<std::size_t>(k % static_cast<long>(cases.size()))];
    double amp = 0.0;
    const double v = peak_increment(s, r.gust, p.H, st, &amp);
    (st == Stick::held ? p.peak_held : p.peak_free) = v;
    p.amplitude = amp;
    pr.tick();
  });
  // refinement in log H between the neighbours of the best grid point
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
    // Brent's minimisation (Brent, Algorithms for Minimization without Derivatives, 1973, ch. 5;
    // Boost.Math brent_find_minima) of -peak in log H, to 2^-10 relative in log H.
    std::uintmax_t iters = max_refine_runs;
    boost::math::tools::brent_find_minima([&](double lh) { return -eval(lh); }, lo, hi, 10, iters);
    if (iters >= max_refine_runs)
      throw NumericalFailure{0.0, State{}, "tuned-gust search: Brent's minimisation did not converge in " +
                                               std::to_string(max_refine_runs) + " runs"};
    for (std::size_t k = extra[ci].size(); k < max_refine_runs; ++k) pr.tick();  // the bar ends full
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
  const double gusts_over = disturbances_over_time(s);
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
    Simulation sim(plant, std::move(g), trim, run_settings(c), RunCase{st, c.run.let_go_time}, c.events);
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

namespace fp {

Scenario case_scenario(const Scenario& s, const TuneResult* tune, Stick st) {
  if (!tune || !tune->active) return s;
  const double H = st == Stick::held ? tune->H_held : tune->H_free;
  return std::isfinite(H) ? with_gust_length(s, tune->gust, H) : s;
}

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

}  // namespace fp
