// margins_modes.cpp — static and linear analyses of a scenario (see analysis.hpp).
#include "analysis/margins_modes.hpp"

#include <cmath>
#include <cstdio>
#include <limits>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/roots.hpp"
#include "model/units.hpp"
#include "run/run.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();

// Speed at which the fixed-tab stick force equals `target`, between a and b (TOMS 748,
// model/roots.hpp, to 1e-4 m/s). NaN when the force minus target has the same sign at both ends
// or a speed in between does not trim (no such speed: an answer); SolverFailure when the solve
// does not converge (numerical).
double speed_for_force(const Plant& p, const Condition& c, double tab, double target, double a, double b) {
  auto f = [&](double V) {
    Condition ci = c;
    ci.airspeed = V;
    TrimRequest r;
    r.condition = ci;
    r.tab = tab;
    r.check_limits = false;
    return trim(p, r).stick_force - target;
  };
  try {
    const double fa = f(a), fb = f(b);
    if (fa * fb > 0) return nan_;
    return find_root(f, a, b, fa, fb, 1e-4, "speed at a given stick force");
  } catch (const TrimError&) {
    return nan_;
  }
}

}  // namespace

Margins compute_margins(const Scenario& s, const MarginsOptions& o) {
  Margins m;
  const auto plant = scenario_plant(s);
  const Plant& p = *plant;
  const Condition& c = s.condition;
  m.cg = s.airplane.mass.h_cg;
  m.trim_speed = c.airspeed;
  m.envelope_forward = s.envelope.cg_forward;
  m.envelope_aft = s.envelope.cg_aft;
  m.cf = closed_form(s.airplane, c);
  const Trim tf = trim_free(p, c);  // the hands-off trim at the scenario condition
  m.trim_tab = tf.tab;
  const ModelNeutralPoints mn = model_neutral_points(p, tf);
  m.np_fixed = {m.cf.np_fixed, mn.fixed};
  m.np_free = {m.cf.np_free, mn.free};
  // apparent: the CG where the fixed-tab stick-force gradient vanishes, tab re-trimmed at each CG
  const double app = cg_zero(
      s.airplane,
      [&](const Plant& pp) {
        const Trim t = trim_free(pp, c);
        return stick_force_gradient(pp, c, t.tab);
      },
      m.cg);
  m.np_apparent = {m.cf.np_apparent, app};
  // maneuver points: where d(delta_e)/dn vanishes (fixed), where dF/dn vanishes with the
  // constant hinge moments removed (free, aerodynamic)
  const double mpf = cg_zero(
      s.airplane, [&](const Plant& pp) { return per_g(pp, c, trim_free(pp, c).tab).elevator_per_g; }, m.cg);
  const double mpfree = cg_zero(
      without_constant_hinge_moments(s.airplane),
      [&](const Plant& pp) { return per_g(pp, c, trim_free(pp, c).tab).force_per_g; }, m.cg);
  m.mp_fixed = {m.cf.mp_fixed, mpf};
  m.mp_free = {m.cf.mp_free, mpfree};
  m.margin_fixed = mn.fixed - m.cg;
  m.margin_free = mn.free - m.cg;
  m.margin_apparent = app - m.cg;
  const PerG pg = per_g(p, c, tf.tab);
  m.elevator_per_g = pg.elevator_per_g;
  m.force_per_g = pg.force_per_g;
  {
    const Plant pa = make_plant(without_constant_hinge_moments(s.airplane));
    m.force_per_g_aero = per_g(pa, c, trim_free(pa, c).tab).force_per_g;
  }
  m.force_gradient = stick_force_gradient(p, c, tf.tab);
  // the speed range of the curve: the stated envelope, else 1.2 Vs to 1.6 V_trim
  const double Vs = stall_speed(s.airplane, c.altitude);
  m.speed_lo = s.envelope.min_speed > 0 ? s.envelope.min_speed : 1.2 * Vs;
  m.speed_hi = s.envelope.max_speed > 0 ? s.envelope.max_speed : 1.6 * c.airspeed;
  m.curve = stick_force_curve(p, c, tf.tab, m.speed_lo, m.speed_hi, o.curve_points);
  // a second zero of the force in the range (force reversal)
  m.reversal_speed = nan_;
  for (std::size_t i = 1; i < m.curve.size(); ++i) {
    const auto& a = m.curve[i - 1];
    const auto& b = m.curve[i];
    if (a.stick_force * b.stick_force < 0) {
      double Vz = speed_for_force(p, c, tf.tab, 0.0, a.airspeed, b.airspeed);
      if (std::isnan(Vz))  // a speed in between did not trim: the chord of the two points
        Vz = a.airspeed - a.stick_force * (b.airspeed - a.airspeed) / (b.stick_force - a.stick_force);
      if (std::abs(Vz - c.airspeed) > 0.02 * c.airspeed) {
        m.reversal_speed = Vz;
        break;
      }
    }
  }
  // free-return band: speeds around trim where the force is below the friction breakout
  const double Ff = s.airplane.circuit.friction;
  m.free_return_low = m.free_return_high = nan_;
  if (Ff > 0 && m.force_gradient < 0) {
    m.free_return_low = speed_for_force(p, c, tf.tab, Ff, std::max(m.speed_lo, 0.5 * c.airspeed), c.airspeed);
    m.free_return_high = speed_for_force(p, c, tf.tab, -Ff, c.airspeed, std::min(m.speed_hi, 2.0 * c.airspeed));
  }
  CgLimitOptions lo;
  // forward limit: flared near the stall, 1.1 Vs at sea level (no ground effect in the model,
  // which would ask for still more up elevator)
  lo.min_speed = 1.1 * stall_speed(s.airplane, 0.0);
  lo.criteria = o.criteria;
  lo.margin_from_user = o.margin_from_user;
  lo.force_from_user = o.force_from_user;
  m.limits = cg_limits(s.airplane, c, lo);
  return m;
}

PerGCurve force_per_g_curve(const Plant& p, const Condition& c, double tab, double n_max, double dn) {
  PerGCurve out;
  out.n_max = n_max;
  out.stop_load_factor = nan_;
  const int steps = static_cast<int>(std::floor((n_max - 1.0) / dn + 1e-9));
  for (int i = 0; i <= steps; ++i) {
    TrimRequest r;
    r.condition = c;
    r.tab = tab;
    r.load_factor = 1.0 + dn * i;
    r.check_throttle = false;
    try {
      const Trim t = trim(p, r);
      out.points.push_back({r.load_factor, t.stick_force, t.de, t.alpha});
    } catch (const TrimError& e) {
      out.stop_load_factor = r.load_factor;
      out.stop = e.limit;
      out.numerical = e.limit == TrimLimit::no_convergence;
      out.stop_reason = e.message;
      return out;
    }
  }
  out.complete = true;
  return out;
}

Controls linear_controls(const Trim& t, bool free) {
  Controls c = t.controls;
  c.stick = free ? Stick::free : Stick::held;
  if (free) c.pilot_force = 0.0;
  return c;
}

ModesResult compute_modes(const Scenario& s) {
  ModesResult r;
  const auto plant = scenario_plant(s);
  r.held_trim = scenario_trim(*plant, s);
  r.held_lm = linearise(*plant, r.held_trim.x, linear_controls(r.held_trim, false));
  r.held = modes(r.held_lm);
  if (plant->ap.circuit.reversible) {
    r.free_trim = scenario_hands_off_trim(*plant, s);
    r.free_lm = linearise(*plant, r.free_trim.x, linear_controls(r.free_trim, true));
    r.free = modes(r.free_lm);
    r.has_free = true;
    const auto& ci = plant->ap.circuit;
    if (ci.friction > 0.0) {
      auto& f = r.friction;
      f.applies = true;
      f.smooth_law = plant->ap.circuit_nl.friction_law == FrictionLaw::smooth;
      f.breakout_force = ci.friction;
      f.breakout_moment = ci.friction / ci.gearing;
      State d{};
      Eval e;
      derivatives(*plant, GustField{}, r.free_trim.x, linear_controls(r.free_trim, true), 0.0, d, &e);
      const auto& el = plant->ap.elevator;
      const double per_rad = std::abs(el.ch_alpha) * e.qbar_t * el.area * el.chord;
      f.stuck_alpha_t = per_rad > 0.0 ? f.breakout_moment / per_rad : std::numeric_limits<double>::infinity();
    }
  }
  return r;
}

}  // namespace fp
