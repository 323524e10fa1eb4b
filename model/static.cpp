// static.cpp — neutral and maneuver points, stick forces, CG limits (see static.hpp).
#include "static.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>

#include "roots.hpp"
#include "units.hpp"

namespace fp {

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();

Airplane with_cg(Airplane ap, double cg) {
  ap.mass.h_cg = cg;
  return ap;
}

// Airplane lift and pitching-moment coefficients about the CG from one evaluation.
void cl_cm(const Plant& p, const State& x, const Controls& c, double& CL, double& Cm, double* H_aero = nullptr) {
  State d{};
  Eval e;
  derivatives(p, GustField{}, x, c, 0.0, d, &e);
  const double qS = e.qbar * p.ap.wing.area;
  const double lift = -e.Z * std::cos(e.alpha) + e.X * std::sin(e.alpha);
  CL = lift / qS;
  Cm = e.M / (qS * p.ap.wing.mac);
  if (H_aero) *H_aero = e.H_aero;
}

// Elevator floated to zero quasi-static hinge moment at 1 g, at the state x: a bracket from de0
// within the stops' contact (the stop springs make the hinge moment monotonic past the stops),
// then TOMS 748 (model/roots.hpp) to 1e-10 rad.
double float_elevator(const Plant& p, State x, const Controls& c, double de0) {
  auto H = [&](double de) {
    x[sx::de] = de;
    Controls cc = c;
    cc.hold_de = de;
    double CL, Cm, Ha;
    cl_cm(p, x, cc, CL, Cm, &Ha);
    return steady_hinge_moment(p, Ha, de, 1.0);
  };
  const auto& el = p.ap.elevator;
  double a, b, fa, fb;
  struct Never {};
  if (!bracket_root<Never>(H, de0, 0.01, el.delta_min - 0.5, el.delta_max + 0.5, a, b, fa, fb))
    throw SolverFailure{"floated elevator angle", "the quasi-static hinge moment keeps its sign over the elevator's travel"};
  return find_root(H, a, b, fa, fb, 1e-10, "floated elevator angle");
}

}  // namespace

ClosedForm closed_form(const Airplane& ap, const Condition& c) {
  ClosedForm r;
  const auto& w = ap.wing;
  const auto& t = ap.tail;
  const auto& el = ap.elevator;
  const auto& ci = ap.circuit;
  const double S = w.area, cbar = w.mac, h = ap.mass.h_cg;
  const double lt_cg = tail_arm(ap, h);  // from the CG
  r.tail_volume = tail_volume(ap, w.h_ac);  // arm from the wing-body a.c.
  const double VH_cg = tail_volume(ap, h);
  const double k = ci.geared_tab_ratio;
  const double tau = t.tau_elevator + k * t.tau_tab;
  const double chd = el.ch_delta + k * el.ch_tab;
  r.free_factor = free_elevator_factor(ap);
  const double at = t.lift.slope, awb = w.lift.slope, eta = t.eta, de_da = t.deps_dalpha;
  r.lift_slope = awb + eta * (t.area / S) * at * (1.0 - de_da);
  r.lift_slope_free = awb + eta * (t.area / S) * r.free_factor * at * (1.0 - de_da);
  // Etkin and Reid eq. 2.3,25 form: h_n = h_nwb + eta V_H (a_t/a)(1 - deps/dalpha), with the
  // fuselage term dCm/dalpha / a subtracted
  r.np_fixed = w.h_ac + eta * r.tail_volume * (at / r.lift_slope) * (1.0 - de_da) - w.cm_alpha_fus / r.lift_slope;
  r.np_free = w.h_ac + eta * r.tail_volume * (r.free_factor * at / r.lift_slope_free) * (1.0 - de_da) -
              w.cm_alpha_fus / r.lift_slope_free;
  r.cm_delta = -eta * VH_cg * at * tau;
  const double rho = isa_at(geopotential_altitude(c.altitude)).density;
  const double W = ap.mass.mass * units::g0;
  const double WS = W / S;
  const double q = 0.5 * rho * c.airspeed * c.airspeed;
  const double CW = WS / q;
  const double G = ci.gearing;
  r.hinge_constant = constant_hinge_moment(ap);
  const double K = eta * el.area * el.chord * (chd / r.cm_delta) * WS;  // [N m] per unit of MAC
  r.np_apparent = r.np_free + r.hinge_constant / K;
  r.mu = 2.0 * ap.mass.mass / (rho * S * cbar);
  // pitch damping per (q c / 2V): wing-body plus tail, Cm_q,t = -2 eta a_t V_H l_t / c
  const double cmq_t = -2.0 * eta * at * VH_cg * lt_cg / cbar;
  r.cm_q = w.cm_q + cmq_t;
  r.cm_q_free = w.cm_q + r.free_factor * cmq_t;
  r.mp_fixed = r.np_fixed - r.cm_q / (2.0 * r.mu);
  r.mp_free = r.np_free - r.cm_q_free / (2.0 * r.mu);
  r.force_constant_A = G * K * (r.np_free - h);
  r.force_gradient = -2.0 * (r.force_constant_A + G * r.hinge_constant) / c.airspeed;
  r.elevator_per_g = -(CW / r.cm_delta) * (h - r.mp_fixed);
  r.force_per_g_aero = G * K * (r.mp_free - h);
  // the bobweight and the elevator's weight add G d(H)/dn at the stick
  r.force_per_g = r.force_per_g_aero + G * weight_hinge_moment(ap, 0.0, 1.0);
  const double Aeff = r.force_constant_A + G * r.hinge_constant;
  r.free_return_fraction = Aeff != 0.0 ? ci.friction / (2.0 * std::abs(Aeff)) : nan_;
  return r;
}

double free_elevator_factor(const Airplane& ap) {
  const double k = ap.circuit.geared_tab_ratio;
  const double tau = ap.tail.tau_elevator + k * ap.tail.tau_tab;
  const double chd = ap.elevator.ch_delta + k * ap.elevator.ch_tab;
  return 1.0 - tau * ap.elevator.ch_alpha / chd;
}

ModelNeutralPoints model_neutral_points(const Plant& p, const Trim& t) {
  ModelNeutralPoints r;
  const double da = 0.25 * units::deg;
  const double h = p.ap.mass.h_cg;
  double CLp, Cmp, CLm, Cmm;
  Controls c = t.controls;
  c.stick = Stick::held;
  // elevator held
  {
    State xp = steady_state(p, t.airspeed, t.alpha + da, t.theta + da, t.altitude, t.de);
    State xm = steady_state(p, t.airspeed, t.alpha - da, t.theta - da, t.altitude, t.de);
    cl_cm(p, xp, c, CLp, Cmp);
    cl_cm(p, xm, c, CLm, Cmm);
    r.fixed = h - (Cmp - Cmm) / (CLp - CLm);
  }
  // elevator floated at each angle
  {
    State xp = steady_state(p, t.airspeed, t.alpha + da, t.theta + da, t.altitude, t.de);
    State xm = steady_state(p, t.airspeed, t.alpha - da, t.theta - da, t.altitude, t.de);
    const double dep = float_elevator(p, xp, c, t.de);
    const double dem = float_elevator(p, xm, c, t.de);
    xp[sx::de] = dep;
    xm[sx::de] = dem;
    Controls cp = c, cm = c;
    cp.hold_de = dep;
    cm.hold_de = dem;
    cl_cm(p, xp, cp, CLp, Cmp);
    cl_cm(p, xm, cm, CLm, Cmm);
    r.free = h - (Cmp - Cmm) / (CLp - CLm);
  }
  return r;
}

std::vector<ForcePoint> stick_force_curve(const Plant& p, const Condition& c, double tab, double V_lo,
                                          double V_hi, int points) {
  std::vector<ForcePoint> out;
  for (int i = 0; i < points; ++i) {
    Condition ci = c;
    ci.airspeed = V_lo + (V_hi - V_lo) * i / std::max(points - 1, 1);
    TrimRequest r;
    r.condition = ci;
    r.tab = tab;
    r.check_limits = false;
    try {
      const Trim t = trim(p, r);
      out.push_back({ci.airspeed, t.stick_force, t.de, t.alpha});
    } catch (const TrimError&) {
      // a speed that cannot be flown (stall): left out of the curve
    }
  }
  return out;
}

double stick_force_gradient(const Plant& p, const Condition& c, double tab) {
  const double dV = 0.01 * c.airspeed;
  TrimRequest r;
  r.tab = tab;
  r.check_limits = false;
  r.condition = c;
  r.condition.airspeed = c.airspeed + dV;
  const double Fp = trim(p, r).stick_force;
  r.condition.airspeed = c.airspeed - dV;
  const double Fm = trim(p, r).stick_force;
  return (Fp - Fm) / (2.0 * dV);
}

PerG per_g(const Plant& p, const Condition& c, double tab) {
  TrimRequest r;
  r.condition = c;
  r.tab = tab;
  r.check_limits = false;
  const double dn = 0.25;
  r.load_factor = 1.0 + dn;
  const Trim tp = trim(p, r);
  r.load_factor = 1.0 - dn;
  const Trim tm = trim(p, r);
  return {(tp.de - tm.de) / (2.0 * dn), (tp.stick_force - tm.stick_force) / (2.0 * dn)};
}

Airplane without_constant_hinge_moments(Airplane ap) {
  ap.elevator.mass_moment = 0.0;
  ap.circuit.downspring = 0.0;
  ap.circuit.bobweight = 0.0;
  return ap;
}

double cg_zero(const Airplane& ap, const std::function<double(const Plant&)>& f, double h0, double step,
               double tol) {
  auto F = [&](double cg) {
    Plant p;
    try {
      p = make_plant(with_cg(ap, cg));
    } catch (const ModelError& e) {  // an airplane that cannot exist at this CG: outside the search
      throw TrimError{TrimLimit::none, e.message};
    }
    return f(p);
  };
  double a, b, fa, fb;
  // the CG range of the key table (mass.h_cg, -0.5..1.5); TrimError: the airplane does not trim there
  if (!bracket_root<TrimError>(F, h0, step, -0.5, 1.5, a, b, fa, fb)) return nan_;
  try {
    return find_root(F, a, b, fa, fb, tol, "CG of a zero");
  } catch (const TrimError&) {
    return nan_;  // a CG inside the bracket does not trim: no answer rather than a wrong one
  }
}

CgLimits cg_limits(const Airplane& ap, const Condition& c, const CgLimitOptions& o) {
  CgLimits L;
  // forward: elevator at its trailing-edge-up stop in level flight at the slowest speed, sea level
  Condition slow = c;
  slow.altitude = 0.0;
  slow.airspeed = o.min_speed;
  slow.flight_path = 0.0;
  const double de_min = ap.elevator.delta_min;
  L.forward.cg = cg_zero(
      ap,
      [&](const Plant& p) {
        TrimRequest r;
        r.condition = slow;
        r.check_limits = false;
        return trim(p, r).de - de_min;
      },
      ap.mass.h_cg - 0.1);
  char why[200];
  std::snprintf(why, sizeof why,
                "elevator power: trimmed at %.1f kt at sea level (flare near the stall), the elevator reaches "
                "its trailing-edge-up stop",
                units::to_kt(o.min_speed));
  L.forward.reason = why;
  // aft: stick-free neutral point from the model (aerodynamic, tab re-trimmed at each CG)
  auto np_free_at = [&](const Plant& p) {
    const Trim t = trim_free(p, c);
    return model_neutral_points(p, t).free - p.ap.mass.h_cg;
  };
  L.aft_free_np.cg = cg_zero(ap, np_free_at, ap.mass.h_cg);
  L.aft_free_np.reason = "stick-free neutral point (model): zero stick-free static margin";
  const char* const tool_default = "tool default, not a criterion";
  L.forward.basis = "tool default (trim at 1.1 Vs at sea level), not a criterion";
  L.aft_margin.cg = std::isnan(L.aft_free_np.cg) ? nan_ : L.aft_free_np.cg - o.criteria.min_static_margin;
  std::snprintf(why, sizeof why, "minimum stick-free static margin of %.1f %% MAC", 100 * o.criteria.min_static_margin);
  L.aft_margin.reason = why;
  L.aft_margin.basis = o.margin_from_user ? "set by the user" : tool_default;
  L.aft_force_per_g.cg = cg_zero(
      ap,
      [&](const Plant& p) {
        const Trim t = trim_free(p, c);
        return per_g(p, c, t.tab).force_per_g - o.criteria.min_force_per_g;
      },
      ap.mass.h_cg);
  std::snprintf(why, sizeof why, "minimum stick force per g of %.1f N/g", o.criteria.min_force_per_g);
  L.aft_force_per_g.reason = why;
  L.aft_force_per_g.basis = o.force_from_user ? "set by the user" : tool_default;
  L.aft = L.aft_free_np;
  for (const CgLimit* x : {&L.aft_margin, &L.aft_force_per_g})
    if (!std::isnan(x->cg) && (std::isnan(L.aft.cg) || x->cg < L.aft.cg)) L.aft = *x;
  return L;
}

}  // namespace fp
