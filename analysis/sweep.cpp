// sweep.cpp — sweeps, sampling, the divergence boundary (see sweep.hpp).
#include "analysis/sweep.hpp"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <complex>
#include <cstdio>
#include <limits>
#include <mutex>
#include <numbers>
#include <optional>
#include <sstream>
#include <thread>
#include <unistd.h>

#include <boost/math/tools/roots.hpp>
#include <nlohmann/json.hpp>

#include "model/linear.hpp"
#include "model/static.hpp"
#include "model/units.hpp"
#include "scenario/gust_timing.hpp"
#include "util/format.hpp"
#include "util/rng.hpp"
#include "util/parallel.hpp"
#include "run/run.hpp"
#include "analysis/margins_modes.hpp"
#include "analysis/signal.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();


bool is_cg_key(const std::string& k) { return k == "cg" || k == "mass.cg"; }

// The probe of the time-domain boundary: a small vertical 1-cosine gust (0.5 m/s, gradient
// distance 10 chords) that reaches the wing 1 s after the scenario's own disturbances are over
// (at 1 s when it has none).
DiscreteGust probe_gust(const Scenario& s) {
  DiscreteGust g;
  g.shape = GustShape::one_minus_cosine;
  g.component = GustComponent::vertical;
  g.length = 10.0 * s.airplane.wing.mac;
  g.amplitude = 0.5;
  g.start = gust_closing_speed(s) * (disturbances_over_time(s) + 1.0);
  return g;
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

// The deciding root (model/linear.hpp deciding_root) at a CG (retrimmed), held or free.
StabilityRoot root_at(const Scenario& base, double cg, bool free) {
  const Scenario s = at_cg(base, cg);
  const auto plant = scenario_plant(s);
  const Trim t = free ? scenario_hands_off_trim(*plant, s) : scenario_trim(*plant, s);
  return deciding_root(modes(linearise(*plant, t.x, linear_controls(t, free))));
}

// The static indicator (static_indicator) at a CG (retrimmed), held or free, with the mode of
// the largest counted real root (the one that crosses at a static crossing).
double static_at(const Scenario& base, double cg, bool free, std::string* real_mode = nullptr) {
  const Scenario s = at_cg(base, cg);
  const auto plant = scenario_plant(s);
  const Trim t = free ? scenario_hands_off_trim(*plant, s) : scenario_trim(*plant, s);
  const auto ms = modes(linearise(*plant, t.x, linear_controls(t, free)));
  if (real_mode) {
    const Mode* best = nullptr;
    for (const Mode& m : ms)
      if (!m.neutral && !m.oscillatory && (!best || m.root.real() > best->root.real())) best = &m;
    *real_mode = best ? best->name : std::string();
  }
  return static_indicator(ms);
}

// One-line summary of the roots set aside, "" when none.
std::string set_aside_text(const StabilityRoot& r) {
  std::string o;
  for (const auto& a : r.set_aside)
    o += (o.empty() ? "" : "; ") + a.mode + " " + fixed(a.root.real(), 6) + " /s set aside: " + a.reason;
  return o;
}

struct Crossing {
  double cg = nan_;    // NaN when none
  std::string error;   // why the refinement failed ("" when it did not, or when there is no bracket)
};

// Zero crossing of f over the CG grid (first sign change from <= 0 to > 0, in increasing CG),
// refined by Boost.Math: TOMS 748 (Alefeld, Potra and Shi 1995) for a smooth f, bisection for a
// noisy one (the time-domain rate). The CG tolerance is 1e-5 MAC; a refinement that does not
// reach it in max_iter evaluations, or an f that throws, is an error, never a boundary.
template <class F>
Crossing crossing(const std::vector<double>& cg, const std::vector<double>& v, F&& f, bool smooth,
                  std::uintmax_t max_iter) {
  Crossing c;
  for (std::size_t i = 1; i < cg.size(); ++i) {
    if (!std::isfinite(v[i - 1]) || !std::isfinite(v[i])) continue;
    if (!(v[i - 1] <= 0.0 && v[i] > 0.0)) continue;
    auto g = [&](double x) {
      const double y = f(x);
      if (!std::isfinite(y)) throw std::runtime_error("no rate could be read at CG " + fixed(x, 5));
      return y;
    };
    const double tol_cg = 1e-5;
    auto tol = [&](double a, double b) { return std::abs(b - a) <= tol_cg; };
    std::uintmax_t it = max_iter;
    try {
      std::pair<double, double> ab;
      if (smooth && v[i - 1] < 0.0)
        ab = boost::math::tools::toms748_solve(g, cg[i - 1], cg[i], v[i - 1], v[i], tol, it);
      else
        ab = boost::math::tools::bisect(g, cg[i - 1], cg[i], tol, it);
      if (!tol(ab.first, ab.second))
        c.error = "root finding did not converge in " + std::to_string(it) + " evaluations: CG between " +
                  fixed(ab.first, 5) + " and " + fixed(ab.second, 5);
      else
        c.cg = 0.5 * (ab.first + ab.second);
    } catch (const std::exception& e) {
      c.error = "root finding failed between CG " + fixed(cg[i - 1], 4) + " and " + fixed(cg[i], 4) + ": " + e.what();
    } catch (const TrimError& e) {
      c.error = "root finding failed: " + e.message;
    } catch (const ScenarioError& e) {
      c.error = "root finding failed: " + e.what();
    } catch (const NumericalFailure& e) {
      c.error = "root finding failed: numerical failure at t = " + fixed(e.time, 3) + " s: " + e.message;
    }
    return c;
  }
  return c;
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

// The small-motion part of a response for the matrix pencil: y_i = V_a(t_i) - reference, where
// the reference is the run `b` (same time grid) or the trim airspeed; from t0 on, while |y| stays
// below 5 % of the trim airspeed and the angle of attack within 2 deg of the reference,
// decimated to about 300 samples.
struct Samples {
  std::vector<double> y;
  double dt = 0;
};
Samples small_motion(const Trace& a, const Trace* b, const Trim& t, double t0) {
  Samples s;
  const std::size_t n = b ? std::min(a.size(), b->size()) : a.size();
  if (n < 2) return s;
  std::vector<double> y;
  for (std::size_t i = 0; i < n; ++i) {
    if (a.ch[ch_time][i] < t0) continue;
    const double dV = a.ch[ch_airspeed][i] - (b ? b->ch[ch_airspeed][i] : t.airspeed);
    const double da = a.ch[ch_alpha][i] - (b ? b->ch[ch_alpha][i] : t.alpha);
    if (std::abs(dV) > 0.05 * t.airspeed || std::abs(da) > 2.0 * units::deg) break;
    y.push_back(dV);
  }
  const std::size_t k = std::max<std::size_t>(1, y.size() / 300);
  for (std::size_t i = 0; i < y.size(); i += k) s.y.push_back(y[i]);
  s.dt = (a.ch[ch_time][1] - a.ch[ch_time][0]) * static_cast<double>(k);
  return s;
}

double growth_of(const Samples& s) {
  if (s.y.size() < 20) return nan_;
  return growth_rate_about_offset(s.y, s.dt, 6);
}

// Growth rate in a trace of the scenario's own run (sweep --run): the airspeed deviation from
// trim after t0 (the forced part of a persistent disturbance is not removed here; the boundary
// uses time_domain_growth).
double growth_from_trace(const Trace& tr, const Trim& t, double t0) { return growth_of(small_motion(tr, nullptr, t, t0)); }

}  // namespace

// Time-domain growth rate of the airplane's own motion (see sweep.hpp and DEVELOPERS.md,
// "Time-domain divergence boundary"). Two runs from the same trim with the same disturbances
// and events: the scenario as it is (a), and the scenario with a small probe gust after its
// own disturbances (b). Their airspeed difference b - a is, to first order in the probe, the
// free response to the probe about the disturbed motion: the forced part (a persistent
// updraft, the climb and the density drift it brings, turbulence with the same seed) is the
// same in both and cancels. The matrix pencil (Hua and Sarkar 1990) reads the rates of that
// difference about a constant offset (analysis/signal.hpp growth_rate_about_offset): a
// neutral root (a neighbouring trim at another altitude) leaves a constant, which is no growth.
//
// A friction circuit is read without its friction, like the eigenvalue boundary: the circuit's
// small-disturbance models are the slipping one (no friction slope) and the stuck one (the
// elevator moves with the airframe: the held airplane), model/linear.hpp; the free boundary is
// where the slipping model diverges. A smoothing constant of the friction law thus never moves it.
double time_domain_growth(const Scenario& s_in, bool free, double seconds, double tol_scale) {
  Scenario s = s_in;
  s.airplane.circuit.friction = 0.0;
  const auto plant = scenario_plant(s);
  const Trim t = free ? scenario_hands_off_trim(*plant, s) : scenario_trim(*plant, s);
  RunSettings rs = run_settings(s);
  rs.duration = seconds;
  rs.output_step = 0.05;
  rs.rel_tol = 1e-9 * tol_scale;
  rs.abs_tol = 1e-10 * tol_scale;
  const RunCase rc{free ? Stick::free : Stick::held, 0.0};
  Scenario probed = s;
  probed.gusts.push_back(probe_gust(s));
  Simulation b(plant, scenario_gust_field(probed), t, rs, rc, s.events);
  b.run_to_end();
  const double t0 = disturbances_over_time(probed) + 2.0;
  const bool undisturbed = s.gusts.empty() && s.events.empty() && s.turbulence.model == TurbulenceKind::none;
  if (undisturbed) return growth_of(small_motion(b.trace(), nullptr, t, t0));
  Simulation a(plant, scenario_gust_field(s), t, rs, rc, s.events);
  a.run_to_end();
  // the probe can reach the airplane later than its nominal time (the scenario's own
  // disturbance changes the ground speed): the window starts when the two runs part (they are
  // identical, step for step, until then) plus the probe's length and 2 s
  const Trace& ta = a.trace();
  const Trace& tb = b.trace();
  double t1 = t0;
  const double V = gust_closing_speed(s);
  const DiscreteGust pg = probe_gust(s);
  for (std::size_t i = 0; i < std::min(ta.size(), tb.size()); ++i)
    if (ta.ch[ch_airspeed][i] != tb.ch[ch_airspeed][i] || ta.ch[ch_alpha][i] != tb.ch[ch_alpha][i]) {
      const double lt = tail_arm(s.airplane, s.airplane.mass.h_cg);
      t1 = std::max(t0, ta.ch[ch_time][i] + (2.0 * pg.length + lt) / V + 2.0);
      break;
    }
  return growth_of(small_motion(tb, &ta, t, t1));
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
    const auto mh = modes(linearise(*plant, t.x, linear_controls(t, false)));
    const StabilityRoot dh = deciding_root(mh);
    r.max_real_held = dh.found ? dh.root.real() : nan_;
    r.mode_held = dh.mode;
    r.static_held = static_indicator(mh);
    r.set_aside_held = set_aside_text(dh);
    const Mode* sp = find_mode(mh, "short period");
    r.sp_damping_held = sp ? sp->damping : nan_;
    r.sp_frequency_held = sp ? sp->frequency : nan_;
    r.max_real_free = r.static_free = r.sp_damping_free = r.sp_frequency_free = nan_;
    // the free side about its hands-off equilibrium; a fixed tab that trims hands-off nowhere
    // leaves the held side standing and says why in the row's reason
    std::optional<Trim> th;
    if (rev) {
      try {
        th = scenario_hands_off_trim(*plant, s);
      } catch (const TrimError& e) {
        r.reason = "stick free: no hands-off trim with the fixed tab: " + e.message;
      }
    }
    if (th) {
      const auto mf = modes(linearise(*plant, th->x, linear_controls(*th, true)));
      const StabilityRoot df = deciding_root(mf);
      r.max_real_free = df.found ? df.root.real() : nan_;
      r.mode_free = df.mode;
      r.static_free = static_indicator(mf);
      r.set_aside_free = set_aside_text(df);
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
      const double t0 = disturbances_over_time(s) + 2.0;
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
  } catch (const std::exception& e) {
    r.reason = std::string("failed: ") + e.what();
  } catch (...) {
    r.reason = "failed: unknown exception";
  }
  if (!r.ok) {  // a failed row carries its inputs and reason only
    PointResult f;
    f.index = r.index;
    f.inputs = r.inputs;
    f.reason = r.reason;
    return f;
  }
  return r;
}

namespace {

// Does the time-domain boundary hold when the run length or the integration tolerance changes
// tenfold? The growth rate must keep its sign 0.0025 MAC (half the agreement goal) either side
// of it with the tolerance x10 and /10 and with the run ten times as long.
std::string time_domain_check(const Scenario& base, bool free, double cg, double T) {
  const double d = 0.0025;
  struct Variant { double seconds, tol; const char* what; };
  const Variant vs[] = {{T, 10.0, "tolerance x10"}, {T, 0.1, "tolerance /10"}, {10.0 * T, 1.0, "run length x10"}};
  std::string moved;
  for (const auto& v : vs) {
    const double lo = time_domain_growth(at_cg(base, cg - d), free, v.seconds, v.tol);
    const double hi = time_domain_growth(at_cg(base, cg + d), free, v.seconds, v.tol);
    if (!(lo <= 0.0 && hi > 0.0)) moved += std::string(moved.empty() ? "" : ", ") + v.what;
  }
  if (moved.empty()) return "holds within 0.25 % MAC with the tolerance x10 and /10 and the run length x10";
  return "NOT robust: moves by more than 0.25 % MAC with " + moved;
}

// The eigenvalue crossing of one side (the first crossing of the deciding root), what decides
// there, and the static crossing (a real root through zero: the static indicator changes sign).
void eigen_side(const Scenario& base, const std::vector<double>& cg, const std::vector<double>& ev,
                const std::vector<double>& st, bool free, Boundary& b, std::string& err) {
  const Crossing c = crossing(cg, ev, [&](double x) {
    const StabilityRoot s = root_at(base, x, free);
    return s.found ? s.root.real() : nan_;
  }, true, 100);
  b.eigenvalue = c.cg;
  if (!c.error.empty()) err += "eigenvalue: " + c.error + ". ";
  if (!std::isfinite(c.cg) && c.error.empty()) {
    // no crossing: say what the sign is over the range, and over which CGs there was no root
    // to read (a point that does not trim, or, free, no hands-off trim with a fixed tab)
    int neg = 0, pos = 0;
    double lo = nan_, hi = nan_;
    for (std::size_t i = 0; i < cg.size(); ++i) {
      if (!std::isfinite(ev[i])) continue;
      (ev[i] <= 0 ? neg : pos) += 1;
      if (!std::isfinite(lo)) lo = cg[i];
      hi = cg[i];
    }
    const int missing = static_cast<int>(cg.size()) - neg - pos;
    std::string where = std::isfinite(lo) ? "from " + fixed(100 * lo, 2) + " to " + fixed(100 * hi, 2) + " % MAC" : "";
    if (neg > 0 && pos == 0) b.no_crossing = "stable at every CG linearised, " + where;
    else if (pos > 0 && neg == 0) b.no_crossing = "unstable at every CG linearised, " + where + ": the boundary lies forward of the range";
    else if (neg > 0) b.no_crossing = "the deciding root changes sign only from + to - over the range (" + where + ")";
    else b.no_crossing = "no CG of the range could be linearised";
    if (missing > 0 && (neg > 0 || pos > 0))
      b.no_crossing += "; " + std::to_string(missing) + " of " + std::to_string(cg.size()) +
                       " CGs gave no root (see the reasons in sweep.csv)";
  }
  const Crossing sc = crossing(cg, st, [&](double x) { return static_at(base, x, free); }, true, 100);
  b.static_crossing = sc.cg;
  if (!sc.error.empty()) err += "static crossing: " + sc.error + ". ";
  if (std::isfinite(sc.cg)) static_at(base, sc.cg + 1e-4, free, &b.static_mode);
  b.closed_form_applies = std::isfinite(sc.cg);
  if (!b.closed_form_applies)
    b.closed_form_note = "no real root crosses zero in the CG range swept: nothing to compare the static "
                         "(neutral-point) formula with";
  if (!std::isfinite(c.cg)) return;
  // the root that crosses, read just aft of the crossing
  const StabilityRoot s = root_at(base, c.cg + 1e-4, free);
  b.crossing_mode = s.mode;
  b.set_aside = set_aside_text(s);
  b.crossing_oscillatory = s.oscillatory;
  b.crossing_period = s.oscillatory ? 2.0 * std::numbers::pi / s.root.imag() : nan_;
  if (s.oscillatory)
    b.closed_form_note = "the first root to cross zero is a complex pair (" + s.mode + ", period " +
                         fixed(b.crossing_period, 1) + " s) at CG " + fixed(100 * c.cg, 2) +
                         " % MAC: the airplane diverges there, oscillating; " +
                         (std::isfinite(sc.cg) ? std::string("the static crossing is where a real root follows, not the divergence CG")
                                               : std::string("no real root crosses zero in the CG range swept, so the "
                                                             "closed form is not compared"));
}

// The time-domain crossing of one side: growth rates on the grid near the eigenvalue bracket
// (the sign far from it is not in doubt), then the crossing refined by bisection with fresh runs.
void time_side(const Scenario& base, const std::vector<double>& cg, const std::vector<double>& ev, bool free,
               double T, Boundary& b, std::string& err) {
  std::vector<double> g(cg.size(), nan_);
  for (std::size_t i = 0; i < cg.size(); ++i) {
    const bool near = (i + 1 < cg.size() && ev[i] <= 0 && ev[i + 1] > 0) || (i > 0 && ev[i - 1] <= 0 && ev[i] > 0);
    if (!near) { g[i] = ev[i] > 0 ? 1.0 : -1.0; continue; }
    try {
      g[i] = time_domain_growth(at_cg(base, cg[i]), free, T);
    } catch (const NumericalFailure& e) {
      err += "numerical failure at CG " + fixed(cg[i], 4) + ", t = " + fixed(e.time, 3) + " s: " + e.message + ". ";
    } catch (const TrimError& e) {
      err += "CG " + fixed(cg[i], 4) + ": " + e.message + ". ";
    }
  }
  const Crossing c = crossing(cg, g, [&](double x) { return time_domain_growth(at_cg(base, x), free, T); }, false, 60);
  b.time_domain = c.cg;
  if (!c.error.empty()) err += c.error + ". ";
  if (std::isfinite(c.cg)) b.time_domain_check = time_domain_check(base, free, c.cg, T);
}

}  // namespace

void compute_boundary(SweepResult& r, int jobs) {
  r.has_boundary = false;
  if (r.spec.vary.empty() || !is_cg_key(r.spec.vary[0].key) || r.spec.vary.size() != 1) return;
  Scenario base = load_scenario(r.spec.scenario, r.spec.set);
  r.has_boundary = true;
  r.held = r.free = Boundary{};
  std::vector<double> cg, eh, ef, sh, sf;
  for (const auto& p : r.points) {
    if (!p.ok) continue;
    cg.push_back(p.inputs[0]);
    eh.push_back(p.max_real_held);
    ef.push_back(p.max_real_free);
    sh.push_back(p.static_held);
    sf.push_back(p.static_free);
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
  r.held.eigenvalue = r.held.time_domain = r.free.eigenvalue = r.free.time_domain = nan_;
  r.held.static_crossing = r.free.static_crossing = r.held.crossing_period = r.free.crossing_period = nan_;
  // near the boundary the slow root is a few thousandths per second: two minutes of response
  // are needed to read it
  const double T = std::max(r.spec.run_seconds, r.spec.boundary_run_seconds);
  // four independent tasks (eigenvalue and time domain, held and free); a task's failure is
  // kept as its side's error, never thrown
  std::vector<long> tasks = rev ? std::vector<long>{0, 1, 2, 3} : std::vector<long>{0, 2};
  if (!r.spec.time_domain) tasks.resize(rev ? 2 : 1);
  std::string errs[4];
  parallel_for(static_cast<long>(tasks.size()), jobs, [&](long i) {
    const long k = tasks[static_cast<std::size_t>(i)];
    const bool free = k % 2 == 1;
    Boundary& b = free ? r.free : r.held;
    std::string& err = errs[k];
    try {
      if (k < 2) eigen_side(base, cg, free ? ef : eh, free ? sf : sh, free, b, err);
      else time_side(base, cg, free ? ef : eh, free, T, b, err);
    } catch (const std::exception& e) {
      err += std::string(k < 2 ? "eigenvalue: " : "time domain: ") + e.what() + ". ";
    } catch (const NumericalFailure& e) {
      err += "numerical failure at t = " + fixed(e.time, 3) + " s: " + e.message + ". ";
    } catch (const TrimError& e) {
      err += e.message + ". ";
    } catch (const ScenarioError& e) {
      err += e.what() + ". ";
    }
  });
  r.held.error = errs[0] + (errs[2].empty() ? "" : "time domain: " + errs[2]);
  r.free.error = errs[1] + (errs[3].empty() ? "" : "time domain: " + errs[3]);
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
      SeededRng g(spec.seed, static_cast<std::uint64_t>(i));  // one stream a point: independent of --jobs
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
  if (!r.points.empty() && std::none_of(r.points.begin(), r.points.end(), [](const PointResult& p) { return p.ok; })) {
    std::string hint;
    for (const auto& k : r.input_keys)
      if (is_cg_key(k)) hint = " (cg is a fraction of the MAC aft of its leading edge: 0.30 means 30 % MAC)";
    throw ScenarioError{"", 0, 0, r.input_keys.empty() ? "" : r.input_keys[0],
                        "every one of the " + std::to_string(r.points.size()) + " sweep points failed" + hint +
                            "; the first: " + r.points.front().reason};
  }
  if (spec.shard_n == 1 && spec.find_boundary) compute_boundary(r, jobs);
  return r;
}

// ---------------------------------------------------------------------------------------------
// Output

namespace {

}  // namespace

double static_indicator(const std::vector<Mode>& ms) {
  // modes() keeps one root of each pair (imag >= 0) and both of a pair whose imaginary parts lie
  // within its 1e-12 /s of zero: those multiply as complex numbers, to |root|^2 together
  std::complex<double> p = -1.0;
  for (const Mode& m : ms) {
    if (m.neutral) continue;
    if (m.root.imag() >= 1e-12) p *= std::norm(m.root);
    else p *= -m.root;
  }
  return p.real();
}

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
