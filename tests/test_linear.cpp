// test_linear.cpp — linear modes against published approximations and the nonlinear model.
#include <doctest/doctest.h>

#include <cmath>
#include <memory>
#include <numbers>

#include "model/linear.hpp"
#include "model/static.hpp"
#include "model/trim.hpp"
#include "model/units.hpp"
#include "run/run.hpp"
#include "analysis/signal.hpp"
#include "support.hpp"

using namespace fp;
using doctest::Approx;

namespace {
const Mode* named(const std::vector<Mode>& ms, const char* n) {
  for (const auto& m : ms)
    if (m.name == n) return &m;
  return nullptr;
}
}  // namespace

TEST_CASE("Jacobian steps lie in the flat region") {
  // Halving the central-difference steps moves the eigenvalues by less than 1e-5 relative to
  // the largest (common practice for finite-difference linearisation).
  Airplane a = test::plain_airplane();
  a.tail.lag = DownwashLag::first_order;
  a.elevator.mass = 4.0;
  a.elevator.mass_moment = 0.1;
  const Plant p = make_plant(a);
  const Trim t = trim_free(p, test::cruise());
  for (Stick s : {Stick::held, Stick::free}) {
    Controls c = t.controls;
    c.stick = s;
    const auto m1 = modes(linearise(p, t.x, c, 1e-5));
    const auto m2 = modes(linearise(p, t.x, c, 5e-6));
    REQUIRE(m1.size() == m2.size());
    double scale = 0;
    for (const auto& m : m1) scale = std::max(scale, std::abs(m.root));
    for (std::size_t i = 0; i < m1.size(); ++i) CHECK(std::abs(m1[i].root - m2[i].root) < 1e-5 * scale);
  }
}

TEST_CASE("short period against the two-state approximation") {
  // Two-state short period (Nelson, Flight Stability and Automatic Control, sec. 4.4; Etkin and
  // Reid sec. 6.3; from memory for the notation):
  //   omega_n^2 = Z_a M_q / V - M_a,  2 zeta omega_n = -(Z_a/V + M_q + M_adot)
  // with Z_a = -(CL_a + CD0) Q S / m, M_a = Cm_a Q S c / I_y, M_q = Cm_q (c/2V) Q S c / I_y. Every
  // derivative is written here by hand from the textbook build-up (nothing from the program's
  // closed forms): CL_a = a_wb + eta a_t (S_t/S)(1 - deps/dalpha); Cm_a = -CL_a (h_n - h) with
  // h_n = h_acwb + eta V_H (a_t/CL_a)(1 - deps/dalpha), V_H from the wing-body a.c. (Etkin and Reid
  // sec. 2.3); Cm_q = Cm_q,wb - 2 eta a_t V_H,cg l_t/c with the arm from the CG (Nelson sec. 3.5,
  // tail contribution); M_adot = 0 for quasi-steady downwash (lag "none"; the lag laws are checked
  // against the textbook alpha-dot term in tests/reference/downwash_lag.py).
  // Tolerances from the terms the approximation leaves out: the speed coupling, of relative size
  // (omega_phugoid/omega_sp)^2 ~ (0.2/5)^2 ~ 0.2 %; Z_q (the tail's lift from pitch rate, relative
  // to m V: eta a_t (S_t/S) Q S l_t / (m V^2) ~ 1 %) and Z_de; the trim angle between body and
  // stability axes (alpha_0^2 ~ 0.2 %). 3 % on omega_n and 5 % on zeta (the damping is the
  // difference of the terms, so their relative errors add) leave margin above those and below
  // any dropped or sign-flipped term: the tail's pitch damping alone is ~70 % of M_q here.
  Airplane a = test::plain_airplane();
  a.tail.lag = DownwashLag::none;
  a.mass.h_cg = 0.30;
  const Condition c = test::cruise(55.0);
  const Plant p = make_plant(a);
  const Trim t = trim_held(p, c, 0.0);
  const auto ms = modes(linearise(p, t.x, t.controls));
  const Mode* sp = named(ms, "short period");
  REQUIRE(sp != nullptr);
  const double rho = 1.225 * std::pow(1.0 - 0.0065 * c.altitude / 288.15, 4.2559);  // ISA troposphere (1000 m: geopotential - geometric = 0.16 m)
  const double V = c.airspeed, Q = 0.5 * rho * V * V, S = a.wing.area, cb = a.wing.mac, m = a.mass.mass;
  const double Iy = a.mass.pitch_inertia;
  const double St = a.tail.area, at = a.tail.lift.slope, eta = a.tail.eta, ed = a.tail.deps_dalpha;
  const double CLa = a.wing.lift.slope + eta * at * (St / S) * (1.0 - ed);
  const double lt_ac = a.tail.x_ac - a.wing.h_ac * cb, lt_cg = a.tail.x_ac - a.mass.h_cg * cb;
  const double VH_ac = St * lt_ac / (S * cb), VH_cg = St * lt_cg / (S * cb);
  const double hn = a.wing.h_ac + eta * VH_ac * (at / CLa) * (1.0 - ed);
  const double Cma = -CLa * (hn - a.mass.h_cg);
  const double Cmq = a.wing.cm_q - 2.0 * eta * at * VH_cg * lt_cg / cb;
  const double Za = -(CLa + a.wing.cd0) * Q * S / m;
  const double Ma = Cma * Q * S * cb / Iy;
  const double Mq = Cmq * (cb / (2 * V)) * Q * S * cb / Iy;
  const double Mad = 0.0;  // quasi-steady downwash: no alpha-dot term
  const double wn = std::sqrt(Za * Mq / V - Ma);
  const double zeta = -(Za / V + Mq + Mad) / (2 * wn);
  MESSAGE("short period: model " << sp->frequency << " rad/s, zeta " << sp->damping << "; two-state " << wn << ", " << zeta);
  CHECK(sp->frequency == Approx(wn).epsilon(0.03));
  CHECK(sp->damping == Approx(zeta).epsilon(0.05));
}

TEST_CASE("the nonlinear response to a small disturbance matches the linear model") {
  // Small-disturbance theory (Etkin and Reid ch. 4): for a small held-elevator step the phugoid of
  // the nonlinear response has the period and damping of the linear phugoid. Period from the
  // peaks of the airspeed deviation, damping by the logarithmic decrement. Stated tolerance:
  // 2 % on the period, 10 % on the damping ratio.
  Airplane a = test::plain_airplane();
  a.mass.h_cg = 0.25;
  const auto p = std::make_shared<const Plant>(make_plant(a));
  const Trim t = trim_held(*p, test::cruise(50.0), 0.0);
  const Mode* ph = nullptr;
  const auto ms = modes(linearise(*p, t.x, t.controls));
  ph = named(ms, "phugoid");
  REQUIRE(ph != nullptr);
  RunSettings rs;
  rs.duration = 4.0 * ph->period;
  rs.output_step = 0.02;
  rs.rel_tol = 1e-10;
  rs.abs_tol = 1e-11;
  Simulation sim(p, GustField{}, t, rs, RunCase{Stick::held, 0.0}, {Event{0.5, EventKind::elevator, -0.1 * units::deg, 1.0, 1}});
  sim.run_to_end();
  const auto& tr = sim.trace();
  std::vector<double> tt, dv;
  for (std::size_t i = 0; i < tr.size(); ++i) {
    tt.push_back(tr.ch[ch_time][i]);
    dv.push_back(tr.ch[ch_airspeed][i] - t.airspeed);
  }
  // maxima of the airspeed deviation after the input
  std::vector<double> tp, vp;
  for (std::size_t i = 1; i + 1 < dv.size(); ++i)
    if (tt[i] > 5.0 && dv[i] > dv[i - 1] && dv[i] >= dv[i + 1]) {
      tp.push_back(tt[i]);
      vp.push_back(dv[i]);
    }
  REQUIRE(tp.size() >= 3);
  const double period = (tp[2] - tp[0]) / 2.0;
  CHECK(period == Approx(ph->period).epsilon(0.02));
  const double d = std::log(vp[0] / vp[1]);
  const double zeta = d / std::sqrt(4.0 * std::numbers::pi * std::numbers::pi + d * d);
  CHECK(zeta == Approx(ph->damping).epsilon(0.10));
}

TEST_CASE("matrix pencil recovers known exponential rates") {
  // Hua and Sarkar (1990): a noise-free sum of damped exponentials is recovered exactly (to
  // rounding) when the model order is at least the number of components.
  std::vector<double> y;
  const double dt = 0.1;
  for (int k = 0; k < 400; ++k) {
    const double t = k * dt;
    y.push_back(0.7 * std::exp(0.01 * t) + std::exp(-0.3 * t) * std::cos(2.0 * t));
  }
  const auto m = matrix_pencil(y, dt, 6);
  REQUIRE(!m.empty());
  CHECK(m[0].s.real() == Approx(0.01).epsilon(1e-5));
  CHECK(growth_rate(y, dt, 6) == Approx(0.01).epsilon(1e-5));
  bool found = false;
  for (const auto& x : m)
    if (std::abs(x.s.real() + 0.3) < 1e-6 && std::abs(std::abs(x.s.imag()) - 2.0) < 1e-6) found = true;
  CHECK(found);
  // a slowly decaying signal gives a negative rate
  std::vector<double> z;
  for (int k = 0; k < 400; ++k) z.push_back(std::exp(-0.02 * k * dt));
  CHECK(growth_rate(z, dt, 4) == Approx(-0.02).epsilon(1e-5));
}
