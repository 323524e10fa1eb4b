// trim.cpp — Newton's method on the steady equations (see trim.hpp).
#include "trim.hpp"

#include <cmath>
#include <cstdio>
#include <vector>

#include <Eigen/Dense>

#include "roots.hpp"
#include "units.hpp"

namespace fp {

namespace {

enum class Unk { alpha, de, throttle, tab, speed };

std::string fmt(const char* f, double a, double b = 0, double c = 0) {
  char buf[256];
  std::snprintf(buf, sizeof buf, f, a, b, c);
  return buf;
}

struct Problem {
  const Plant& p;
  const TrimRequest& r;
  std::vector<Unk> unk;
  bool force_eq = false;

  // Build state and controls from the unknown vector; evaluate the scaled residuals.
  void setup(const Eigen::VectorXd& z, double& V, double& alpha, double& de, double& thr,
             double& tab) const {
    V = r.condition.airspeed;
    alpha = r.alpha;
    de = r.elevator;
    thr = 0.5;
    tab = r.tab;
    for (std::size_t i = 0; i < unk.size(); ++i) {
      const double v = z(static_cast<Eigen::Index>(i));
      switch (unk[i]) {
        case Unk::alpha: alpha = v; break;
        case Unk::de: de = v; break;
        case Unk::throttle: thr = v; break;
        case Unk::tab: tab = v; break;
        case Unk::speed: V = v; break;
      }
    }
  }

  Trim evaluate(const Eigen::VectorXd& z, Eigen::VectorXd* res) const {
    Trim t;
    double V, alpha, de, thr, tab;
    setup(z, V, alpha, de, thr, tab);
    const double gamma = r.condition.flight_path;
    t.airspeed = V;
    t.alpha = alpha;
    t.theta = alpha + gamma;
    t.de = de;
    t.tab = tab;
    t.throttle = thr;
    t.altitude = r.condition.altitude;
    t.x = steady_state(p, V, alpha, t.theta, r.condition.altitude, de);
    t.x[sx::q] = (r.load_factor - 1.0) * units::g0 / std::max(V, 1.0);
    t.controls = Controls{Stick::held, de, 0.0, tab, thr};
    State d{};
    derivatives(p, GustField{}, t.x, t.controls, 0.0, d, &t.eval);
    t.stick_force = t.eval.stick_force;
    t.CL = -(t.eval.Z - t.eval.thrust * -std::sin(p.ap.propulsion.angle)) /
           std::max(t.eval.qbar * p.ap.wing.area, 1e-9);
    if (res) {
      const double qS = std::max(t.eval.qbar * p.ap.wing.area, 1e-6);
      const auto& el = p.ap.elevator;
      res->resize(static_cast<Eigen::Index>(unk.size()));
      (*res)(0) = d[sx::u] * p.m / qS;
      (*res)(1) = d[sx::w] * p.m / qS;
      (*res)(2) = d[sx::q] * p.ap.mass.pitch_inertia / (qS * p.ap.wing.mac);
      if (force_eq)
        (*res)(3) = t.stick_force /
                    (p.ap.circuit.gearing * std::max(t.eval.qbar_t, 1e-6) * el.area * el.chord);
    }
    return t;
  }
};

}  // namespace

StallPoint wing_stall(const LiftCurve& lc) {
  StallPoint best{0.0, lift_coefficient(lc, 0.0, false)};
  for (double a = 0.0; a <= 1.2; a += 0.001) {
    const double cl = lift_coefficient(lc, a, false);
    if (cl > best.CLmax) best = {a, cl};
  }
  // Brent's method on -CL within one grid step of the best grid point
  const auto m = find_minimum([&lc](double a) { return -lift_coefficient(lc, a, false); }, best.alpha - 0.001,
                              best.alpha + 0.001, "angle of attack of the wing's CLmax");
  if (-m.second >= best.CLmax) best = {m.first, -m.second};
  return best;
}

double stall_speed(const Airplane& ap, double altitude, double n) {
  const double rho = isa_at(geopotential_altitude(altitude)).density;
  return std::sqrt(2.0 * n * ap.mass.mass * units::g0 / (rho * ap.wing.area * wing_stall(ap.wing.lift).CLmax));
}

namespace {

// Newton's method did not converge: name the cause when the last iterate shows one (a nameable
// limit is a result about the airplane; only what is left is a numerical failure).
TrimError why_no_trim(const Plant& p, const TrimRequest& r, const Trim& t, double CLreq, double residual, int it) {
  const auto& ap = p.ap;
  const auto stall = wing_stall(ap.wing.lift);
  const bool hands_off = r.solve_tab || r.zero_force;
  const auto& el = ap.elevator;
  if (r.fix_elevator && (r.elevator > el.delta_max || r.elevator < el.delta_min))
    return {TrimLimit::elevator_stop,
            fmt("no trim: the elevator asked for (%.1f deg) is beyond its stops %.1f..%.1f deg",
                units::to_deg(r.elevator), units::to_deg(el.delta_min), units::to_deg(el.delta_max))};
  if (r.fix_alpha && r.alpha > stall.alpha)
    return {TrimLimit::stall, fmt("no trim: the angle of attack asked for (%.1f deg) is past the wing's stall at %.1f deg",
                                  units::to_deg(r.alpha), units::to_deg(stall.alpha))};
  if (CLreq > stall.CLmax)
    return {TrimLimit::stall,
            fmt("no trim: the condition needs a lift coefficient of about %.2f, above the wing's maximum %.2f (stall "
                "at %.1f deg): it is past CLmax",
                CLreq, stall.CLmax, units::to_deg(stall.alpha))};
  if (t.alpha > stall.alpha)
    return {TrimLimit::stall,
            fmt("no trim: the solution runs past the wing's stall (angle of attack %.1f deg, stall at %.1f deg; CLmax "
                "%.2f)",
                units::to_deg(t.alpha), units::to_deg(stall.alpha), stall.CLmax)};
  if (t.de > el.delta_max || t.de < el.delta_min)
    return {TrimLimit::elevator_stop,
            fmt(hands_off ? "no trim: the elevator floats to its stop (%.1f deg, stops %.1f..%.1f deg): no hands-off "
                            "trim at this condition"
                          : "no trim: it needs %.1f deg of elevator, beyond the stops %.1f..%.1f deg",
                units::to_deg(t.de), units::to_deg(el.delta_min), units::to_deg(el.delta_max))};
  const auto& ci = ap.circuit;
  if (r.solve_tab && (t.tab > ci.tab_max || t.tab < ci.tab_min))
    return {TrimLimit::tab_stop,
            fmt("no trim: the tab runs out (it would need %.1f deg, range %.1f..%.1f deg)", units::to_deg(t.tab),
                units::to_deg(ci.tab_min), units::to_deg(ci.tab_max))};
  if (t.throttle > 1.0 || t.throttle < 0.0)
    return {TrimLimit::throttle,
            fmt("no trim: Newton's method ran away to %.0f m/s, where it would need a throttle setting of %.2f "
                "(outside 0..1), without balancing the airplane: no trim found within the engine's thrust at this "
                "flight-path angle",
                t.airspeed, t.throttle)};
  return {TrimLimit::no_convergence,
          fmt("no trim: Newton's method did not converge (residual %.2e after %.0f iterations) and no limit of the "
              "airplane explains it: a numerical failure",
              residual, static_cast<double>(it))};
}

}  // namespace

Trim trim(const Plant& p, const TrimRequest& r) {
  Problem pb{p, r, {}, false};
  pb.unk = {Unk::alpha, Unk::de, Unk::throttle};
  if (r.fix_elevator) pb.unk[1] = Unk::speed;
  if (r.fix_alpha) pb.unk[0] = Unk::speed;
  if (r.solve_tab) {
    pb.unk.push_back(Unk::tab);
    pb.force_eq = true;
  } else if (r.zero_force) {
    pb.unk.push_back(Unk::speed);
    pb.force_eq = true;
  }
  const std::size_t n = pb.unk.size();
  const auto& ap = p.ap;

  // initial guess from the lift needed
  const double V0 = r.condition.airspeed;
  const double rho = isa_at(geopotential_altitude(r.condition.altitude)).density;
  const double CLreq = r.load_factor * p.m * units::g0 * std::cos(r.condition.flight_path) /
                       (0.5 * rho * V0 * V0 * ap.wing.area);
  const double a_guess = r.fix_alpha ? r.alpha : ap.wing.lift.alpha_zero + CLreq / ap.wing.lift.slope;
  const double D0 = 0.5 * rho * V0 * V0 * ap.wing.area * (ap.wing.cd0 + ap.wing.k_induced * CLreq * CLreq) +
                    p.m * units::g0 * std::sin(r.condition.flight_path);
  Eigen::VectorXd z(static_cast<Eigen::Index>(n)), scale(static_cast<Eigen::Index>(n));
  for (std::size_t i = 0; i < n; ++i) {
    const auto k = static_cast<Eigen::Index>(i);
    switch (pb.unk[i]) {
      case Unk::alpha: z(k) = a_guess; scale(k) = 0.05; break;
      case Unk::de: z(k) = r.fix_elevator ? r.elevator : 0.0; scale(k) = 0.05; break;
      case Unk::throttle: z(k) = ap.propulsion.max_thrust > 0 ? D0 / ap.propulsion.max_thrust : 0.0; scale(k) = 0.1; break;
      case Unk::tab: z(k) = r.tab; scale(k) = 0.05; break;
      case Unk::speed: z(k) = V0; scale(k) = 0.1 * V0; break;
    }
  }

  Eigen::VectorXd res;
  pb.evaluate(z, &res);
  int it = 0;
  bool ok = false;
  for (; it < 60; ++it) {
    if (res.lpNorm<Eigen::Infinity>() < 1e-11) {
      ok = true;
      break;
    }
    Eigen::MatrixXd J(static_cast<Eigen::Index>(n), static_cast<Eigen::Index>(n));
    for (std::size_t j = 0; j < n; ++j) {
      const auto k = static_cast<Eigen::Index>(j);
      const double h = 1e-6 * scale(k);
      Eigen::VectorXd zp = z, zm = z, rp, rm;
      zp(k) += h;
      zm(k) -= h;
      pb.evaluate(zp, &rp);
      pb.evaluate(zm, &rm);
      J.col(k) = (rp - rm) / (2 * h);
    }
    Eigen::VectorXd dz = J.fullPivLu().solve(-res);
    if (!dz.allFinite()) break;
    // limit the step to a few scales per iteration, then halve while the residual grows
    const double worst = (dz.array().abs() / scale.array()).maxCoeff();
    if (worst > 4.0) dz *= 4.0 / worst;
    double lam = 1.0;
    Eigen::VectorXd zn, rn;
    for (int ls = 0; ls < 20; ++ls) {
      zn = z + lam * dz;
      pb.evaluate(zn, &rn);
      if (rn.allFinite() && rn.norm() < res.norm()) break;
      lam *= 0.5;
    }
    if (!rn.allFinite()) break;
    z = zn;
    res = rn;
  }
  Trim t = pb.evaluate(z, nullptr);
  t.iterations = it;

  if (!ok) throw why_no_trim(p, r, t, CLreq, res.lpNorm<Eigen::Infinity>(), it);
  const auto stall = wing_stall(ap.wing.lift);
  if (!r.check_limits) return t;
  if (t.alpha > stall.alpha)
    throw TrimError{TrimLimit::stall,
                    fmt("no trim: it needs an angle of attack of %.1f deg, past the wing's stall at %.1f deg",
                        units::to_deg(t.alpha), units::to_deg(stall.alpha))};
  const auto& el = ap.elevator;
  if (t.de > el.delta_max || t.de < el.delta_min)
    throw TrimError{TrimLimit::elevator_stop,
                    fmt("no trim: it needs %.1f deg of elevator, outside the stops %.1f..%.1f deg",
                        units::to_deg(t.de), units::to_deg(el.delta_min), units::to_deg(el.delta_max))};
  const auto& ci = ap.circuit;
  if (t.tab > ci.tab_max + 1e-12 || t.tab < ci.tab_min - 1e-12)
    throw TrimError{TrimLimit::tab_stop,
                    fmt("no trim: it needs a tab setting of %.1f deg, outside the tab range %.1f..%.1f deg",
                        units::to_deg(t.tab), units::to_deg(ci.tab_min), units::to_deg(ci.tab_max))};
  if (r.check_throttle && (t.throttle > 1.0 + 1e-9 || t.throttle < -1e-9))
    throw TrimError{TrimLimit::throttle,
                    fmt("no trim: it needs a throttle setting of %.3f, outside 0..1 (more thrust than the "
                        "engine has, or a descent too steep for idle)",
                        t.throttle)};
  if (t.airspeed <= 0.0)
    throw TrimError{TrimLimit::no_convergence, "no trim: the airspeed came out non-positive"};
  return t;
}

Trim trim_held(const Plant& p, const Condition& c, double tab) {
  TrimRequest r;
  r.condition = c;
  r.tab = tab;
  return trim(p, r);
}

Trim trim_free(const Plant& p, const Condition& c) {
  TrimRequest r;
  r.condition = c;
  r.solve_tab = true;
  return trim(p, r);
}

}  // namespace fp
