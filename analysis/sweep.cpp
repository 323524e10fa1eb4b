// sweep.cpp — sweeps, sampling, the divergence boundary (see sweep.hpp).
#include "analysis/sweep.hpp"

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
#include "util/format.hpp"
#include "util/parallel.hpp"
#include "run/run.hpp"
#include "analysis/signal.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();

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

}  // namespace fp
