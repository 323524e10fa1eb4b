// envelope.cpp — the conditions matrix (see envelope.hpp).
#include "analysis/envelope.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "model/atmosphere.hpp"
#include "model/roots.hpp"
#include "run/run.hpp"
#include "util/parallel.hpp"

namespace fp {

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();

double mass_or(double v, double fallback) { return v > 0.0 ? v : fallback; }

// The deciding root's mode (model/linear.hpp deciding_root, the one definition of which roots count).
Mode deciding_mode(const std::vector<Mode>& ms) {
  const StabilityRoot r = deciding_root(ms);
  for (const auto& m : ms)
    if (r.found && m.name == r.mode && m.root == r.root) return m;
  Mode none;
  none.name = "none";
  none.root = {nan_, 0.0};
  return none;
}

bool find_short_period(const std::vector<Mode>& ms, Mode& out) {
  for (const auto& m : ms)
    if (m.name == "short period" && m.oscillatory) {
      out = m;
      return true;
    }
  return false;
}

// The sudden release from a speed off trim (see Release in envelope.hpp).
Release release_from(const Scenario& s, const Plant& plant, std::shared_ptr<const Plant> pp, double tab,
                     double stall_alpha, double offset) {
  Release r;
  r.offset = offset;
  r.seconds = release_seconds;
  Condition c = s.condition;
  c.airspeed = s.condition.airspeed * (1.0 + offset);
  r.start_speed = c.airspeed;
  Trim t;
  try {
    t = trim_held(plant, c, tab);
  } catch (const TrimError& e) {
    r.failure = "the off-trim speed cannot be held: " + e.message;
    return r;
  }
  r.force = t.stick_force;
  RunSettings rs = run_settings(s);
  const double t_release = 1.0;
  rs.duration = t_release + release_seconds;
  const double Vs = stall_speed(s.airplane, s.condition.altitude);
  try {
    Simulation sim(std::move(pp), GustField{}, t, rs, RunCase{Stick::free, t_release}, {});
    sim.run_to_end();
    const Trace& tr = sim.trace();
    r.v_min = r.n_min = std::numeric_limits<double>::infinity();
    r.v_max = r.n_max = r.alpha_max = -std::numeric_limits<double>::infinity();
    for (std::size_t k = 0; k < tr.size(); ++k) {
      if (tr.ch[ch_time][k] < t_release) continue;
      r.v_min = std::min(r.v_min, tr.ch[ch_airspeed][k]);
      r.v_max = std::max(r.v_max, tr.ch[ch_airspeed][k]);
      r.n_min = std::min(r.n_min, tr.ch[ch_load_factor][k]);
      r.n_max = std::max(r.n_max, tr.ch[ch_load_factor][k]);
      r.alpha_max = std::max(r.alpha_max, tr.ch[ch_alpha][k]);
    }
    const Departure& d = sim.departure();
    r.departed = d.departed;
    if (d.departed) {
      r.time = d.time - t_release;
      r.criterion = d.criterion;
      r.reason = d.reason;
    }
    r.stall = r.alpha_max >= stall_alpha || r.v_min < Vs || (d.departed && d.criterion == "angle_of_attack");
  } catch (const NumericalFailure& e) {
    r.failure = "numerical failure at t = " + std::to_string(e.time) + " s: " + e.message;
  }
  return r;
}

}  // namespace

bool within_envelope(const Scenario& s, double cg, double mass) {
  const double m0 = s.airplane.mass.mass;
  const double lo = mass_or(s.envelope.mass_min, m0), hi = mass_or(s.envelope.mass_max, m0);
  return cg >= s.envelope.cg_forward && cg <= s.envelope.cg_aft && mass >= lo && mass <= hi;
}

std::vector<Corner> envelope_corners(const Scenario& s) {
  const double m0 = s.airplane.mass.mass;
  const double lo = mass_or(s.envelope.mass_min, m0), hi = mass_or(s.envelope.mass_max, m0);
  std::vector<Corner> out;
  for (const double m : lo == hi ? std::vector<double>{hi} : std::vector<double>{hi, lo})
    for (const bool aft : {true, false}) {
      Corner c;
      c.cg = aft ? s.envelope.cg_aft : s.envelope.cg_forward;
      c.mass = m;
      c.label = std::string(aft ? "aft CG" : "forward CG") + (lo == hi ? "" : m == hi ? ", heaviest" : ", lightest");
      out.push_back(c);
    }
  return out;
}

Scenario corner_scenario(const Scenario& base, const Corner& c) {
  Scenario s = base;
  if (std::isfinite(c.cg)) s.airplane.mass.h_cg = c.cg;
  if (std::isfinite(c.mass)) s.airplane.mass.mass = c.mass;
  if (std::isfinite(c.altitude)) s.condition.altitude = c.altitude;
  if (std::isfinite(c.airspeed)) s.condition.airspeed = c.airspeed;
  s.trim.tab_auto = true;  // each corner trimmed hands-off, as the rules' conditions are flown
  s.gusts.clear();
  s.gust_start_times.clear();
  s.gust_designs.clear();
  s.events.clear();
  s.turbulence.model = TurbulenceKind::none;
  validate(s);
  return s;
}

CornerResult compute_corner(const Scenario& base, const Corner& c) {
  CornerResult r;
  r.corner = c;
  r.cg = std::isfinite(c.cg) ? c.cg : base.airplane.mass.h_cg;
  r.mass = std::isfinite(c.mass) ? c.mass : base.airplane.mass.mass;
  r.altitude = std::isfinite(c.altitude) ? c.altitude : base.condition.altitude;
  r.airspeed = std::isfinite(c.airspeed) ? c.airspeed : base.condition.airspeed;
  r.limit_load_factor = base.envelope.limit_load_factor;
  r.in_envelope = within_envelope(base, r.cg, r.mass);
  try {
    const Scenario s = corner_scenario(base, c);
    r.calibrated = calibrated_airspeed(r.airspeed, r.altitude);
    r.stall_speed = stall_speed(s.airplane, s.condition.altitude);
    r.margins = compute_margins(s);
    r.force_at_limit = r.margins.force_per_g * (r.limit_load_factor - 1.0);
    const ModesResult mr = compute_modes(s);
    r.worst_held = deciding_mode(mr.held);
    r.has_sp_held = find_short_period(mr.held, r.sp_held);
    if (mr.has_free) {
      r.worst_free = deciding_mode(mr.free);
      r.has_sp_free = find_short_period(mr.free, r.sp_free);
    }
    const auto plant = scenario_plant(s);
    const double stall_alpha = wing_stall(s.airplane.wing.lift).alpha;
    if (s.airplane.circuit.reversible) {
      r.release_up = release_from(s, *plant, plant, r.margins.trim_tab, stall_alpha, +release_offset);
      r.release_down = release_from(s, *plant, plant, r.margins.trim_tab, stall_alpha, -release_offset);
    } else {
      r.release_up.failure = r.release_down.failure = "irreversible circuit: the elevator cannot float";
    }
    r.ok = true;
  } catch (const ScenarioError& e) {
    r.failure = e.what();
  } catch (const TrimError& e) {
    r.failure = "trim: " + e.message;
  } catch (const NumericalFailure& e) {
    r.failure = "numerical failure at t = " + std::to_string(e.time) + " s: " + e.message;
  } catch (const SolverFailure& e) {
    r.failure = e.what();
  } catch (const std::exception& e) {
    r.failure = std::string("error: ") + e.what();
  } catch (...) {
    r.failure = "error of an unknown kind";
  }
  return r;
}

std::vector<CornerResult> run_matrix(const Scenario& base, const std::vector<Corner>& corners, int jobs, bool progress) {
  std::vector<CornerResult> out(corners.size());
  Progress pr(progress, static_cast<long>(corners.size()), "corners", "matrix");
  parallel_for(static_cast<long>(corners.size()), std::max(1, jobs), [&](long i) {
    out[static_cast<std::size_t>(i)] = compute_corner(base, corners[static_cast<std::size_t>(i)]);
    pr.tick();
  });
  return out;
}

}  // namespace fp
