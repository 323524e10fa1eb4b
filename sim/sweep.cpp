// sweep.cpp — sweeps, sampling, the divergence boundary (see sweep.hpp).
#include "sweep.hpp"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <limits>
#include <mutex>
#include <numbers>
#include <sstream>
#include <thread>
#include <unistd.h>

#include <nlohmann/json.hpp>

#include "model/linear.hpp"
#include "model/static.hpp"
#include "model/units.hpp"
#include "sim/outputs.hpp"
#include "sim/parallel.hpp"
#include "sim/run.hpp"
#include "sim/signal.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();
json num(double v) { return std::isfinite(v) ? json(v) : json(nullptr); }
double val(const json& j) { return j.is_number() ? j.get<double>() : nan_; }

std::string trim_ws(const std::string& s) {
  const auto b = s.find_first_not_of(" \t");
  const auto e = s.find_last_not_of(" \t");
  return b == std::string::npos ? std::string() : s.substr(b, e - b + 1);
}

bool is_cg_key(const std::string& k) { return k == "cg" || k == "mass.cg"; }

// splitmix64 (Steele, Lea, Flood, "Fast splittable pseudorandom number generators", OOPSLA
// 2014): a per-point generator seeded by (seed, index), so that samples do not depend on the
// order or the thread in which points run.
struct SplitMix {
  std::uint64_t s;
  std::uint64_t next() {
    std::uint64_t z = (s += 0x9e3779b97f4a7c15ULL);
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    return z ^ (z >> 31);
  }
  double uniform() { return (static_cast<double>(next() >> 11) + 0.5) * (1.0 / 9007199254740992.0); }
  double normal() {  // Box-Muller
    const double u1 = uniform(), u2 = uniform();
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(2.0 * std::numbers::pi * u2);
  }
};

// Time after which the scenario's disturbances are over: gusts passed, events done [s].
double disturbance_end(const Scenario& s) {
  const double V = s.condition.airspeed * std::cos(s.condition.flight_path);
  const double lt = s.airplane.tail.x_ac - s.airplane.mass.h_cg * s.airplane.wing.mac;
  double t = 0.0;
  for (const auto& g : s.gusts) {
    const double len = g.shape == GustShape::one_minus_cosine ? 2.0 * g.length : g.length;
    t = std::max(t, (g.start + len + lt) / V);
  }
  for (const auto& e : s.events) t = std::max(t, e.time + e.duration);
  return t;
}

// The scenario with a disturbance: its own, or a small vertical 1-cosine gust when it has
// none (1 m/s, gradient distance 10 chords, starting at 1 s), so that the motion is excited.
Scenario with_disturbance(Scenario s) {
  if (s.gusts.empty() && s.events.empty()) {
    DiscreteGust g;
    g.shape = GustShape::one_minus_cosine;
    g.component = GustComponent::vertical;
    g.length = 10.0 * s.airplane.wing.mac;
    g.amplitude = 1.0;
    g.start = s.condition.airspeed * std::cos(s.condition.flight_path) * 1.0;
    s.gusts.push_back(g);
  }
  return s;
}

double max_real(const std::vector<Mode>& ms) {
  double m = -std::numeric_limits<double>::infinity();
  for (const auto& x : ms) m = std::max(m, x.root.real());
  return m;
}

const Mode* find_mode(const std::vector<Mode>& ms, const char* name) {
  for (const auto& m : ms)
    if (m.name == name) return &m;
  return nullptr;
}

Scenario at_cg(const Scenario& base, double cg) {
  Scenario s = base;
  set_value(s, "mass.cg", cg, "--vary");
  return s;
}

// Largest real eigenvalue at a CG (retrimmed), held or free.
double eig_at(const Scenario& base, double cg, bool free) {
  const Scenario s = at_cg(base, cg);
  const auto plant = scenario_plant(s);
  const Trim t = scenario_trim(*plant, s);
  Controls c = t.controls;
  c.stick = free ? Stick::free : Stick::held;
  c.pilot_force = 0.0;
  return max_real(modes(linearise(*plant, t.x, c)));
}

// Zero crossing of f over the CG grid (first sign change from <= 0 to > 0, in increasing
// CG), refined by bisection. NaN when there is none.
template <class F>
double crossing(const std::vector<double>& cg, const std::vector<double>& v, F&& f, int iterations) {
  for (std::size_t i = 1; i < cg.size(); ++i) {
    if (!std::isfinite(v[i - 1]) || !std::isfinite(v[i])) continue;
    if (v[i - 1] <= 0.0 && v[i] > 0.0) {
      double a = cg[i - 1], b = cg[i];
      for (int k = 0; k < iterations; ++k) {
        const double m = 0.5 * (a + b);
        double fm;
        try {
          fm = f(m);
        } catch (...) {
          break;
        }
        if (!std::isfinite(fm)) break;
        if (fm > 0.0) b = m; else a = m;
      }
      return 0.5 * (a + b);
    }
  }
  return nan_;
}

}  // namespace

VarySpec parse_vary(const Scenario& s, const std::string& text) {
  VarySpec v;
  const auto eq = text.find('=');
  if (eq == std::string::npos)
    throw ScenarioError{"", 0, 0, "", "--vary " + text + ": expected KEY=FROM:TO:STEP, e.g. cg=0.30:0.42:0.01"};
  v.key = trim_ws(text.substr(0, eq));
  std::vector<std::string> parts;
  std::stringstream ss(text.substr(eq + 1));
  for (std::string p; std::getline(ss, p, ':');) parts.push_back(trim_ws(p));
  if (parts.size() != 3)
    throw ScenarioError{"", 0, 0, v.key, "--vary expects FROM:TO:STEP (three values), got \"" + text.substr(eq + 1) + "\""};
  (void)get_value(s, v.key);  // an unknown or non-numeric key fails here with its message
  v.from = parse_quantity(v.key, parts[0], "--vary");
  v.to = parse_quantity(v.key, parts[1], "--vary");
  v.step = parse_quantity(v.key, parts[2], "--vary");
  if (!(v.step > 0.0)) throw ScenarioError{"", 0, 0, v.key, "--vary: STEP must be positive"};
  if (v.to < v.from) throw ScenarioError{"", 0, 0, v.key, "--vary: TO must not be below FROM"};
  if ((v.to - v.from) / v.step > 100000) throw ScenarioError{"", 0, 0, v.key, "--vary: more than 100000 points"};
  return v;
}

SampleSpec parse_sample(const Scenario& s, const std::string& text) {
  SampleSpec r;
  const auto eq = text.find('=');
  const auto lp = text.find('(');
  const auto rp = text.rfind(')');
  const auto comma = text.find(',', lp == std::string::npos ? 0 : lp);
  if (eq == std::string::npos || lp == std::string::npos || rp == std::string::npos || comma == std::string::npos ||
      !(eq < lp && lp < comma && comma < rp))
    throw ScenarioError{"", 0, 0, "", "--sample " + text + ": expected KEY=normal(MEAN,SD) or KEY=uniform(LO,HI)"};
  r.key = trim_ws(text.substr(0, eq));
  const std::string dist = trim_ws(text.substr(eq + 1, lp - eq - 1));
  if (dist == "normal") r.dist = Distribution::normal;
  else if (dist == "uniform") r.dist = Distribution::uniform;
  else throw ScenarioError{"", 0, 0, r.key, "--sample: unknown distribution \"" + dist + "\"; use normal or uniform"};
  (void)get_value(s, r.key);
  r.a = parse_quantity(r.key, trim_ws(text.substr(lp + 1, comma - lp - 1)), "--sample");
  r.b = parse_quantity(r.key, trim_ws(text.substr(comma + 1, rp - comma - 1)), "--sample");
  if (r.dist == Distribution::normal && !(r.b >= 0)) throw ScenarioError{"", 0, 0, r.key, "--sample: SD must not be negative"};
  if (r.dist == Distribution::uniform && !(r.b >= r.a)) throw ScenarioError{"", 0, 0, r.key, "--sample: HI must not be below LO"};
  return r;
}

namespace {

// Growth rate of the slow motion in a trace: the airspeed deviation from trim once the
// disturbance is over (after t0) and while the motion is still small, decimated to about 300
// samples, through the matrix pencil.
double growth_from_trace(const Trace& tr, const Trim& t, double t0) {
  if (tr.size() < 2) return nan_;
  const double dt = tr.ch[ch_time][1] - tr.ch[ch_time][0];
  std::vector<double> y;
  for (std::size_t i = 0; i < tr.size(); ++i) {
    if (tr.ch[ch_time][i] < t0) continue;
    const double dV = tr.ch[ch_airspeed][i] - t.airspeed;
    const double da = tr.ch[ch_alpha][i] - t.alpha;
    if (std::abs(dV) > 0.05 * t.airspeed || std::abs(da) > 2.0 * units::deg) break;
    y.push_back(dV);
  }
  const std::size_t k = std::max<std::size_t>(1, y.size() / 300);
  std::vector<double> yd;
  for (std::size_t i = 0; i < y.size(); i += k) yd.push_back(y[i]);
  if (yd.size() < 20) return nan_;
  return growth_rate(yd, dt * static_cast<double>(k), 6);
}

}  // namespace

double time_domain_growth(const Scenario& s0, bool free, double seconds) {
  const Scenario s = with_disturbance(s0);
  const auto plant = scenario_plant(s);
  const Trim t = scenario_trim(*plant, s);
  RunSettings rs = s.run;
  rs.duration = seconds;
  rs.output_step = 0.05;
  rs.rel_tol = std::min(rs.rel_tol, 1e-9);
  rs.abs_tol = std::min(rs.abs_tol, 1e-10);
  Simulation sim(plant, scenario_gust_field(s), t, rs, RunCase{free ? Stick::free : Stick::held, 0.0}, s.events);
  sim.run_to_end();
  return growth_from_trace(sim.trace(), t, disturbance_end(s) + 2.0);
}

PointResult evaluate_point(const Scenario& base, const std::vector<std::string>& keys,
                           const std::vector<double>& values, double run_seconds, long index) {
  PointResult r;
  r.index = index;
  r.inputs = values;
  try {
    Scenario s = base;
    for (std::size_t i = 0; i < keys.size(); ++i) set_value(s, keys[i], values[i], "--vary");
    validate(s);
    const auto plant = scenario_plant(s);
    const Trim t = scenario_trim(*plant, s);
    r.cg = s.airplane.mass.h_cg;
    r.trim_alpha_deg = units::to_deg(t.alpha);
    r.trim_elevator_deg = units::to_deg(t.de);
    r.trim_tab_deg = units::to_deg(t.tab);
    const ClosedForm cf = closed_form(s.airplane, s.condition);
    r.np_fixed_cf = cf.np_fixed;
    r.np_free_cf = cf.np_free;
    r.np_apparent_cf = cf.np_apparent;
    const bool rev = s.airplane.circuit.reversible;
    const Trim tf = rev ? trim_free(*plant, s.condition) : t;
    const ModelNeutralPoints mn = model_neutral_points(*plant, tf);
    r.np_fixed = mn.fixed;
    r.np_free = rev ? mn.free : nan_;
    r.force_gradient = rev ? stick_force_gradient(*plant, s.condition, tf.tab) : nan_;
    Controls c = t.controls;
    c.stick = Stick::held;
    const auto mh = modes(linearise(*plant, t.x, c));
    r.max_real_held = max_real(mh);
    const Mode* sp = find_mode(mh, "short period");
    r.sp_damping_held = sp ? sp->damping : nan_;
    r.sp_frequency_held = sp ? sp->frequency : nan_;
    r.max_real_free = r.sp_damping_free = r.sp_frequency_free = nan_;
    if (rev) {
      c.stick = Stick::free;
      c.pilot_force = 0;
      const auto mf = modes(linearise(*plant, t.x, c));
      r.max_real_free = max_real(mf);
      const Mode* spf = find_mode(mf, "short period");
      r.sp_damping_free = spf ? spf->damping : nan_;
      r.sp_frequency_free = spf ? spf->frequency : nan_;
    }
    if (run_seconds > 0) {
      Scenario sr = s;
      sr.run.duration = run_seconds;
      r.ran = true;
      const RunOutcome o = run_scenario(sr, rev ? ControlsChoice::both : ControlsChoice::held);
      auto fill = [&](const CaseResult* cr, bool& div, double& dt, double& dn, double& da) {
        if (!cr) { div = false; dt = dn = da = nan_; return; }
        div = cr->departure.departed;
        dt = div ? cr->departure.time : nan_;
        dn = da = 0.0;
        for (std::size_t i = 0; i < cr->trace.size(); ++i) {
          dn = std::max(dn, std::abs(cr->trace.ch[ch_load_factor][i] - 1.0));
          da = std::max(da, units::to_deg(std::abs(cr->trace.ch[ch_alpha][i] - t.alpha)));
        }
      };
      fill(o.held.get(), r.diverged_held, r.divergence_time_held, r.peak_dn_held, r.peak_dalpha_held_deg);
      fill(o.free.get(), r.diverged_free, r.divergence_time_free, r.peak_dn_free, r.peak_dalpha_free_deg);
      // the slow motion's rate read from these same runs (scenario's own disturbance)
      const double t0 = disturbance_end(s) + 2.0;
      r.growth_held = o.held ? growth_from_trace(o.held->trace, o.trim, t0) : nan_;
      r.growth_free = o.free ? growth_from_trace(o.free->trace, o.trim, t0) : nan_;
    }
    r.ok = true;
  } catch (const ScenarioError& e) {
    r.reason = e.what();
  } catch (const TrimError& e) {
    r.reason = e.message;
  } catch (const NumericalFailure& e) {
    r.reason = "numerical failure at t = " + fixed(e.time, 3) + " s: " + e.message;
  }
  return r;
}

void compute_boundary(SweepResult& r, int jobs) {
  r.has_boundary = false;
  if (r.spec.vary.empty() || !is_cg_key(r.spec.vary[0].key) || r.spec.vary.size() != 1) return;
  Scenario base = load_scenario(r.spec.scenario, r.spec.set);
  r.has_boundary = true;
  std::vector<double> cg, eh, ef;
  for (const auto& p : r.points) {
    if (!p.ok) continue;
    cg.push_back(p.inputs[0]);
    eh.push_back(p.max_real_held);
    ef.push_back(p.max_real_free);
  }
  const bool rev = base.airplane.circuit.reversible;
  // closed form: h_n held; free, the apparent point h_app (iterated: its elevator power uses
  // the arm from the CG), and the aerodynamic h'_n beside it
  const ClosedForm cf0 = closed_form(base.airplane, base.condition);
  r.held.closed_form = cf0.np_fixed;
  r.held.closed_form_aerodynamic = cf0.np_fixed;
  double happ = cf0.np_apparent;
  for (int i = 0; i < 5; ++i) happ = closed_form(at_cg(base, happ).airplane, base.condition).np_apparent;
  r.free.closed_form = rev ? happ : nan_;
  r.free.closed_form_aerodynamic = rev ? cf0.np_free : nan_;
  // eigenvalue crossing, and the time-domain growth rate crossing, each refined by bisection
  double res[4] = {nan_, nan_, nan_, nan_};
  // near the boundary the slow root is a few thousandths per second: two minutes of response
  // are needed to read it (60 s biases the matrix-pencil estimate by about +0.001/s)
  const double T = std::max(r.spec.run_seconds, r.spec.boundary_run_seconds);
  parallel_for(rev ? 4 : 2, jobs, [&](long k) {
    const bool free = k % 2 == 1;
    if (k < 2) {
      res[k] = crossing(cg, free ? ef : eh, [&](double x) { return eig_at(base, x, free); }, 30);
    } else {
      // growth rates on the grid near the eigenvalue bracket (all grid points when no bracket)
      std::vector<double> g(cg.size(), nan_);
      for (std::size_t i = 0; i < cg.size(); ++i) {
        const auto& ev = free ? ef : eh;
        const bool near = (i + 1 < cg.size() && ev[i] <= 0 && ev[i + 1] > 0) || (i > 0 && ev[i - 1] <= 0 && ev[i] > 0);
        if (!near) { g[i] = ev[i] > 0 ? 1.0 : -1.0; continue; }  // sign from far away is not in doubt
        g[i] = time_domain_growth(at_cg(base, cg[i]), free, T);
      }
      res[k] = crossing(cg, g, [&](double x) { return time_domain_growth(at_cg(base, x), free, T); }, 16);
    }
  });
  r.held.eigenvalue = res[0];
  r.free.eigenvalue = res[1];
  r.held.time_domain = res[2];
  r.free.time_domain = res[3];
}

SweepResult run_sweep(const SweepSpec& spec, int jobs, bool progress) {
  SweepResult r;
  r.spec = spec;
  const Scenario base = load_scenario(spec.scenario, spec.set);
  if (spec.vary.size() > 2) throw ScenarioError{"", 0, 0, "", "--vary: at most two keys (a grid for two)"};
  if (!spec.vary.empty() && !spec.sample.empty())
    throw ScenarioError{"", 0, 0, "", "use either --vary (a grid) or --sample (random sampling), not both"};
  if (!spec.sample.empty() && spec.samples <= 0) throw ScenarioError{"", 0, 0, "", "--sample needs --samples N (N > 0)"};
  if (spec.shard_n < 1 || spec.shard_k < 0 || spec.shard_k >= spec.shard_n)
    throw ScenarioError{"", 0, 0, "", "--shard K/N needs 0 <= K < N"};
  std::vector<std::vector<double>> grid;  // values per point
  for (const auto& v : spec.vary) r.input_keys.push_back(v.key);
  for (const auto& v : spec.sample) r.input_keys.push_back(v.key);
  auto axis = [](const VarySpec& v) {
    std::vector<double> a;
    const long n = static_cast<long>(std::floor((v.to - v.from) / v.step + 1e-9)) + 1;
    for (long i = 0; i < n; ++i) a.push_back(v.from + static_cast<double>(i) * v.step);
    return a;
  };
  if (spec.vary.size() == 1) {
    for (double x : axis(spec.vary[0])) grid.push_back({x});
  } else if (spec.vary.size() == 2) {
    for (double x : axis(spec.vary[0]))
      for (double y : axis(spec.vary[1])) grid.push_back({x, y});
  } else if (!spec.sample.empty()) {
    for (long i = 0; i < spec.samples; ++i) {
      SplitMix g{spec.seed * 0x100000001b3ULL + static_cast<std::uint64_t>(i)};
      std::vector<double> v;
      for (const auto& sm : spec.sample)
        v.push_back(sm.dist == Distribution::normal ? sm.a + sm.b * g.normal() : sm.a + (sm.b - sm.a) * g.uniform());
      grid.push_back(v);
    }
  } else {
    grid.push_back({});  // the scenario itself
  }
  r.total_points = static_cast<long>(grid.size());
  std::vector<long> mine;
  for (long i = 0; i < r.total_points; ++i)
    if (i % spec.shard_n == spec.shard_k) mine.push_back(i);
  r.points.resize(mine.size());
  Progress pr(progress, static_cast<long>(mine.size()));
  parallel_for(static_cast<long>(mine.size()), jobs, [&](long k) {
    const long i = mine[static_cast<std::size_t>(k)];
    r.points[static_cast<std::size_t>(k)] =
        evaluate_point(base, r.input_keys, grid[static_cast<std::size_t>(i)], spec.run_seconds, i);
    pr.tick();
  });
  if (spec.shard_n == 1 && spec.find_boundary) compute_boundary(r, jobs);
  return r;
}

// ---------------------------------------------------------------------------------------------
// Output

namespace {

}  // namespace

Band band_of(std::vector<double> v) {
  Band b{nan_, nan_, nan_, nan_, nan_, 0};
  v.erase(std::remove_if(v.begin(), v.end(), [](double x) { return !std::isfinite(x); }), v.end());
  b.n = static_cast<long>(v.size());
  if (v.empty()) return b;
  std::sort(v.begin(), v.end());
  auto pc = [&](double p) {  // linear interpolation between order statistics
    const double x = p * static_cast<double>(v.size() - 1);
    const auto i = static_cast<std::size_t>(std::floor(x));
    const std::size_t j = std::min(i + 1, v.size() - 1);
    return v[i] + (x - static_cast<double>(i)) * (v[j] - v[i]);
  };
  b.min = v.front();
  b.max = v.back();
  b.p5 = pc(0.05);
  b.p50 = pc(0.5);
  b.p95 = pc(0.95);
  return b;
}

namespace {

json band_json(const Band& b) {
  return json{{"n", b.n}, {"min", num(b.min)}, {"p5", num(b.p5)}, {"p50", num(b.p50)}, {"p95", num(b.p95)}, {"max", num(b.max)}};
}

const char* kColumns[] = {"index", "ok", "reason", "cg", "trim_alpha_deg", "trim_elevator_deg", "trim_tab_deg",
                          "np_fixed_closed_form", "np_free_closed_form", "np_apparent_closed_form", "np_fixed_model",
                          "np_free_model", "static_margin_fixed", "static_margin_free", "stick_force_gradient_N_per_mps",
                          "max_real_held_per_s", "max_real_free_per_s", "sp_damping_held", "sp_damping_free",
                          "sp_frequency_held_rad_s", "sp_frequency_free_rad_s", "ran", "diverged_held", "diverged_free",
                          "divergence_time_held_s", "divergence_time_free_s", "peak_dn_held", "peak_dn_free",
                          "peak_dalpha_held_deg", "peak_dalpha_free_deg", "growth_held_per_s", "growth_free_per_s"};

json point_json(const PointResult& p, const std::vector<std::string>& keys) {
  json in = json::object();
  for (std::size_t i = 0; i < keys.size() && i < p.inputs.size(); ++i) in[keys[i]] = p.inputs[i];
  return json{{"index", p.index},
              {"inputs", in},
              {"ok", p.ok},
              {"reason", p.ok ? json(nullptr) : json(p.reason)},
              {"cg", num(p.cg)},
              {"trim_alpha_deg", num(p.trim_alpha_deg)},
              {"trim_elevator_deg", num(p.trim_elevator_deg)},
              {"trim_tab_deg", num(p.trim_tab_deg)},
              {"np_fixed_closed_form", num(p.np_fixed_cf)},
              {"np_free_closed_form", num(p.np_free_cf)},
              {"np_apparent_closed_form", num(p.np_apparent_cf)},
              {"np_fixed_model", num(p.np_fixed)},
              {"np_free_model", num(p.np_free)},
              {"static_margin_fixed", num(p.np_fixed - p.cg)},
              {"static_margin_free", num(p.np_free - p.cg)},
              {"stick_force_gradient_N_per_mps", num(p.force_gradient)},
              {"max_real_held_per_s", num(p.max_real_held)},
              {"max_real_free_per_s", num(p.max_real_free)},
              {"sp_damping_held", num(p.sp_damping_held)},
              {"sp_damping_free", num(p.sp_damping_free)},
              {"sp_frequency_held_rad_s", num(p.sp_frequency_held)},
              {"sp_frequency_free_rad_s", num(p.sp_frequency_free)},
              {"ran", p.ran},
              {"diverged_held", p.ran ? json(p.diverged_held) : json(nullptr)},
              {"diverged_free", p.ran ? json(p.diverged_free) : json(nullptr)},
              {"divergence_time_held_s", num(p.divergence_time_held)},
              {"divergence_time_free_s", num(p.divergence_time_free)},
              {"peak_dn_held", p.ran ? num(p.peak_dn_held) : json(nullptr)},
              {"peak_dn_free", p.ran ? num(p.peak_dn_free) : json(nullptr)},
              {"peak_dalpha_held_deg", p.ran ? num(p.peak_dalpha_held_deg) : json(nullptr)},
              {"peak_dalpha_free_deg", p.ran ? num(p.peak_dalpha_free_deg) : json(nullptr)},
              {"growth_held_per_s", p.ran ? num(p.growth_held) : json(nullptr)},
              {"growth_free_per_s", p.ran ? num(p.growth_free) : json(nullptr)}};
}

PointResult point_from_json(const json& j, const std::vector<std::string>& keys) {
  PointResult p;
  p.index = j.at("index").get<long>();
  for (const auto& k : keys) p.inputs.push_back(val(j.at("inputs").at(k)));
  p.ok = j.at("ok").get<bool>();
  if (!p.ok) p.reason = j.at("reason").get<std::string>();
  p.cg = val(j["cg"]);
  p.trim_alpha_deg = val(j["trim_alpha_deg"]);
  p.trim_elevator_deg = val(j["trim_elevator_deg"]);
  p.trim_tab_deg = val(j["trim_tab_deg"]);
  p.np_fixed_cf = val(j["np_fixed_closed_form"]);
  p.np_free_cf = val(j["np_free_closed_form"]);
  p.np_apparent_cf = val(j["np_apparent_closed_form"]);
  p.np_fixed = val(j["np_fixed_model"]);
  p.np_free = val(j["np_free_model"]);
  p.force_gradient = val(j["stick_force_gradient_N_per_mps"]);
  p.max_real_held = val(j["max_real_held_per_s"]);
  p.max_real_free = val(j["max_real_free_per_s"]);
  p.sp_damping_held = val(j["sp_damping_held"]);
  p.sp_damping_free = val(j["sp_damping_free"]);
  p.sp_frequency_held = val(j["sp_frequency_held_rad_s"]);
  p.sp_frequency_free = val(j["sp_frequency_free_rad_s"]);
  p.ran = j["ran"].get<bool>();
  if (p.ran) {
    p.diverged_held = j["diverged_held"].is_boolean() && j["diverged_held"].get<bool>();
    p.diverged_free = j["diverged_free"].is_boolean() && j["diverged_free"].get<bool>();
    p.divergence_time_held = val(j["divergence_time_held_s"]);
    p.divergence_time_free = val(j["divergence_time_free_s"]);
    p.peak_dn_held = val(j["peak_dn_held"]);
    p.peak_dn_free = val(j["peak_dn_free"]);
    p.peak_dalpha_held_deg = val(j["peak_dalpha_held_deg"]);
    p.peak_dalpha_free_deg = val(j["peak_dalpha_free_deg"]);
    p.growth_held = val(j["growth_held_per_s"]);
    p.growth_free = val(j["growth_free_per_s"]);
  }
  return p;
}

}  // namespace

json sweep_json(const SweepResult& r) {
  json spec{{"scenario", r.spec.scenario}, {"set", r.spec.set}, {"samples", r.spec.samples},
            {"seed", r.spec.seed}, {"run_seconds", r.spec.run_seconds},
            {"boundary_run_seconds", r.spec.boundary_run_seconds},
            {"shard", std::to_string(r.spec.shard_k) + "/" + std::to_string(r.spec.shard_n)}};
  json vary = json::array(), sample = json::array();
  for (const auto& v : r.spec.vary) vary.push_back({{"key", v.key}, {"from", v.from}, {"to", v.to}, {"step", v.step}});
  for (const auto& s : r.spec.sample)
    sample.push_back({{"key", s.key}, {"distribution", s.dist == Distribution::normal ? "normal" : "uniform"},
                      {"a", s.a}, {"b", s.b}});
  spec["vary"] = vary;
  spec["sample"] = sample;
  json pts = json::array();
  for (const auto& p : r.points) pts.push_back(point_json(p, r.input_keys));
  json j{{"tool", "floatpitch"}, {"spec", spec}, {"input_keys", r.input_keys}, {"total_points", r.total_points},
         {"points", pts}};
  if (r.has_boundary) {
    auto b = [](const Boundary& x, bool free) {
      json o{{"closed_form", num(x.closed_form)}, {"eigenvalue", num(x.eigenvalue)}, {"time_domain", num(x.time_domain)}};
      if (free) o["closed_form_aerodynamic"] = num(x.closed_form_aerodynamic);
      const double lo = std::min({x.closed_form, x.eigenvalue, x.time_domain});
      const double hi = std::max({x.closed_form, x.eigenvalue, x.time_domain});
      o["spread"] = num(hi - lo);
      return o;
    };
    j["boundary"] = {{"held", b(r.held, false)}, {"free", b(r.free, true)}};
  } else {
    j["boundary"] = nullptr;
  }
  if (!r.spec.sample.empty()) {
    std::vector<double> np, spd, pk;
    const PointResult* worst = nullptr;
    for (const auto& p : r.points) {
      if (!p.ok) continue;
      np.push_back(p.np_free);
      spd.push_back(p.sp_damping_free);
      if (p.ran) pk.push_back(p.peak_dn_free);
      if (!worst || p.np_free - p.cg < worst->np_free - worst->cg) worst = &p;
    }
    json band{{"neutral_point_free", band_json(band_of(np))},
              {"short_period_damping_free", band_json(band_of(spd))},
              {"peak_load_factor_increment_free", pk.empty() ? json(nullptr) : band_json(band_of(pk))}};
    if (worst) {
      json in = json::object();
      for (std::size_t i = 0; i < r.input_keys.size(); ++i) in[r.input_keys[i]] = worst->inputs[i];
      band["worst"] = {{"index", worst->index}, {"inputs", in}, {"neutral_point_free", worst->np_free},
                       {"static_margin_free", worst->np_free - worst->cg},
                       {"criterion", "lowest stick-free static margin"}};
    }
    j["band"] = band;
  }
  return j;
}

SweepResult sweep_from_json(const json& j) {
  SweepResult r;
  try {
    const auto& sp = j.at("spec");
    r.spec.scenario = sp.at("scenario").get<std::string>();
    r.spec.set = sp.at("set").get<std::vector<std::string>>();
    r.spec.samples = sp.at("samples").get<int>();
    r.spec.seed = sp.at("seed").get<std::uint64_t>();
    r.spec.run_seconds = sp.at("run_seconds").get<double>();
    r.spec.boundary_run_seconds = sp.at("boundary_run_seconds").get<double>();
    for (const auto& v : sp.at("vary"))
      r.spec.vary.push_back({v.at("key").get<std::string>(), v.at("from").get<double>(), v.at("to").get<double>(),
                             v.at("step").get<double>()});
    for (const auto& s : sp.at("sample"))
      r.spec.sample.push_back({s.at("key").get<std::string>(),
                               s.at("distribution").get<std::string>() == "normal" ? Distribution::normal
                                                                                   : Distribution::uniform,
                               s.at("a").get<double>(), s.at("b").get<double>()});
    r.input_keys = j.at("input_keys").get<std::vector<std::string>>();
    r.total_points = j.at("total_points").get<long>();
    for (const auto& p : j.at("points")) r.points.push_back(point_from_json(p, r.input_keys));
  } catch (const json::exception& e) {
    throw std::runtime_error(std::string("not a sweep.json written by floatpitch: ") + e.what());
  }
  return r;
}

std::string sweep_csv(const SweepResult& r) {
  std::ostringstream o;
  o.precision(10);
  for (const auto& k : r.input_keys) o << k << ",";
  for (std::size_t i = 0; i < std::size(kColumns); ++i) o << kColumns[i] << (i + 1 < std::size(kColumns) ? "," : "\n");
  for (const auto& p : r.points) {
    const json j = point_json(p, r.input_keys);
    for (const auto& k : r.input_keys) o << j["inputs"][k].get<double>() << ",";
    for (std::size_t i = 0; i < std::size(kColumns); ++i) {
      const auto& v = j[kColumns[i]];
      if (v.is_null()) o << "";
      else if (v.is_boolean()) o << (v.get<bool>() ? "1" : "0");
      else if (v.is_string()) {
        std::string s = v.get<std::string>();
        for (auto& ch : s)
          if (ch == '"') ch = '\'';
        o << '"' << s << '"';
      } else o << v.get<double>();
      o << (i + 1 < std::size(kColumns) ? "," : "\n");
    }
  }
  return o.str();
}

std::string sweep_table(const SweepResult& r) {
  std::ostringstream o;
  long ok = 0;
  for (const auto& p : r.points) ok += p.ok;
  o << r.points.size() << " points (" << ok << " trimmed, " << r.points.size() - ok << " failed, see reasons in sweep.csv)";
  if (r.spec.shard_n > 1) o << ", shard " << r.spec.shard_k << "/" << r.spec.shard_n << " of " << r.total_points;
  o << "\n";
  if (r.has_boundary) {
    auto pc = [](double v) { return std::isfinite(v) ? fixed(100 * v, 2) : std::string("not found"); };
    char line[200];
    o << "\nhands-off divergence boundary (CG, % MAC):\n";
    std::snprintf(line, sizeof line, "  %-12s %14s %14s %14s\n", "", "closed form", "eigenvalue", "time domain");
    o << line;
    std::snprintf(line, sizeof line, "  %-12s %14s %14s %14s\n", "stick held", pc(r.held.closed_form).c_str(),
                  pc(r.held.eigenvalue).c_str(), pc(r.held.time_domain).c_str());
    o << line;
    std::snprintf(line, sizeof line, "  %-12s %14s %14s %14s\n", "stick free", pc(r.free.closed_form).c_str(),
                  pc(r.free.eigenvalue).c_str(), pc(r.free.time_domain).c_str());
    o << line;
    o << "  (free closed form includes the constant hinge moments; aerodynamic stick-free neutral point "
      << pc(r.free.closed_form_aerodynamic) << ")\n";
  }
  if (!r.spec.sample.empty()) {
    const json j = sweep_json(r);
    const auto& b = j["band"];
    auto line = [&](const char* name, const json& x, double scale, int dec) {
      if (x.is_null()) return;
      auto f = [&](const json& v) { return v.is_null() ? std::string("-") : fixed(v.get<double>() * scale, dec); };
      o << "  " << name << ": min " << f(x["min"]) << "  p5 " << f(x["p5"]) << "  median " << f(x["p50"]) << "  p95 "
        << f(x["p95"]) << "  max " << f(x["max"]) << "\n";
    };
    o << "\nuncertainty band over " << r.points.size() << " samples:\n";
    line("stick-free neutral point [% MAC]", b["neutral_point_free"], 100.0, 2);
    line("free short-period damping [-]  ", b["short_period_damping_free"], 1.0, 3);
    line("peak free load-factor increment", b["peak_load_factor_increment_free"], 1.0, 3);
    if (b.contains("worst")) o << "  worst sample: " << b["worst"].dump() << "\n";
  }
  return o.str();
}

}  // namespace fp
