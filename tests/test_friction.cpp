// test_friction.cpp — friction with stiction on the project's one integration path (run/run.cpp).
//
// Checks against published results, each named beside its check:
//   * Coulomb-damped oscillator (Den Hartog, Mechanical Vibrations, 4th ed., sec. 8.6 "Coulomb
//     damping"; also Meirovitch, Elements of Vibration Analysis): with a spring k and a constant
//     friction F, each half cycle is a free oscillation about the offset +-F/k, so the amplitude
//     drops by 2F/k per half cycle, the half period is pi sqrt(I/k) as without friction, and the
//     motion stops at the first turning point within |x| <= F/k. With a breakout F_b above the
//     sliding F_s the loss per half cycle is 2 F_s/k and the motion stops at the first turning
//     point where the spring's moment k|x| is within F_b (the same argument, the breakout only
//     deciding whether it restarts: Armstrong-Helouvry, Dupont and Canudas de Wit, Automatica 30,
//     1994, sec. 2 on static and Coulomb friction).
//   * No creep: stuck, the elevator angle relative to the airframe is exactly constant while the
//     moment needed to hold it stays below breakout (the definition of stiction; Karnopp, J. Dyn.
//     Sys., Meas., Control 107, 1985).
// The oscillator is the elevator itself on a centering spring, aerodynamics and thrust off
// (Plant::aerodynamics, Plant::thrust), a massless-balanced surface (mass moment 0): the
// airplane falls freely, so no weight moment acts about the hinge, and the relative angle's
// inertia is I_c + I_e I_B / (I_B + I_e) (the airframe turns back as the elevator turns:
// angular momentum about the CG is conserved without external moment; Meriam and Kraige,
// Dynamics, plane kinetics of rigid bodies).
#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <memory>
#include <string>
#include <vector>

#include "analysis/margins_modes.hpp"
#include "model/dynamics.hpp"
#include "model/trim.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"
#include "support.hpp"

using namespace fp;

namespace {

struct Oscillator {
  std::shared_ptr<Plant> plant;
  double k = 0;      // spring at the hinge [N m/rad]
  double I = 0;      // inertia of the relative angle [kg m^2]
};

// The elevator on a centering spring of `centering` N/m at the stick, friction F_b (breakout)
// and F_s (sliding) at the stick; nothing else acts about the hinge.
Oscillator oscillator(double centering, double breakout, double sliding) {
  Airplane a = test::plain_airplane();
  a.circuit.damping = 0.0;
  a.circuit.centering = centering;
  a.circuit.friction = breakout;
  a.circuit_nl.friction_law = FrictionLaw::stiction;
  a.circuit_nl.sliding_friction = sliding;
  Oscillator o;
  o.plant = std::make_shared<Plant>(make_plant(a));
  o.plant->aerodynamics = false;
  o.plant->thrust = false;
  const double G = a.circuit.gearing;
  o.k = centering / (G * G);
  const Plant& p = *o.plant;
  o.I = p.I_c + p.I_ecg * p.I_B / (p.I_B + p.I_ecg);
  return o;
}

RunSettings free_fall_settings(double duration, double step) {
  RunSettings rs;
  rs.duration = duration;
  rs.output_step = step;
  rs.rel_tol = 1e-11;
  rs.abs_tol = 1e-13;
  rs.alpha_limit = 1.5;           // the airframe falls freely: its angle of attack grows
  rs.max_airspeed_ratio = 20.0;
  rs.floor_altitude = -1000.0;
  return rs;
}

Trace release(const Oscillator& o, double de0, double duration, SolverStats* stats = nullptr) {
  Trim t;
  t.airspeed = 55.0;
  t.x = steady_state(*o.plant, 55.0, 0.0, 0.0, 2000.0, de0);
  t.controls.stick = Stick::free;
  t.controls.throttle = 0.0;
  Simulation sim(o.plant, GustField{}, t, free_fall_settings(duration, 1e-4), RunCase{Stick::free, 0.0}, {});
  sim.run_to_end();
  REQUIRE_FALSE(sim.departure().departed);
  if (stats) *stats = sim.stats();
  return sim.trace();
}

struct Turn {
  double t, x;
};
// Turning points of the elevator (extrema of the sampled angle), then the angle it rests at.
std::vector<Turn> turning_points(const Trace& tr) {
  const auto& x = tr.ch[ch_elevator];
  const auto& tt = tr.ch[ch_time];
  std::vector<Turn> r;
  r.push_back({tt[0], x[0]});
  for (std::size_t i = 1; i + 1 < x.size(); ++i) {
    const double a = x[i] - x[i - 1], b = x[i + 1] - x[i];
    if ((a > 0 && b < 0) || (a < 0 && b > 0) || (a != 0 && b == 0)) r.push_back({tt[i], x[i]});
  }
  return r;
}

}  // namespace

TEST_CASE("Coulomb-damped elevator: 2F/k lost per half cycle, rest within F/k (Den Hartog)") {
  // k = 900 / 3^2 = 100 N m/rad at the hinge; F = 6 N / 3 = 2 N m: F/k = 0.02 rad
  const Oscillator o = oscillator(900.0, 6.0, 0.0);
  const double Fk = (6.0 / 3.0) / o.k;
  REQUIRE(Fk == doctest::Approx(0.02));
  const double x0 = 0.15;
  SolverStats st;
  const Trace tr = release(o, x0, 1.5, &st);
  const auto turns = turning_points(tr);
  // Den Hartog: x_{n+1} = -(|x_n| - 2F/k) sign(x_n) while |x_n| > F/k:
  // 0.15, -0.11, 0.07, -0.03, 0.01 (0.01 <= 0.02: rests there)
  std::vector<double> expect{x0};
  while (std::abs(expect.back()) > Fk) {
    const double xn = expect.back();
    expect.push_back(-(std::abs(xn) - 2.0 * Fk) * (xn > 0 ? 1.0 : -1.0));
  }
  REQUIRE(expect.size() == 5);
  REQUIRE(turns.size() == expect.size());
  const double half_period = std::acos(-1.0) * std::sqrt(o.I / o.k);
  for (std::size_t i = 0; i < expect.size(); ++i) {
    CAPTURE(i);
    // sampling at 1e-4 s misses a turning point by at most a (dt)^2 / 2 ~ 3e-7 rad
    CHECK(std::abs(turns[i].x - expect[i]) < 1e-6);
    if (i > 0) CHECK(std::abs((turns[i].t - turns[i - 1].t) - half_period) < 2.5e-4);
  }
  // at rest: within F/k, and exactly still (stuck) to the end of the run
  const double rest = tr.ch[ch_elevator].back();
  CHECK(std::abs(rest) <= Fk);
  const double t_rest = turns.back().t + 1e-3;
  for (std::size_t i = 0; i < tr.size(); ++i)
    if (tr.ch[ch_time][i] > t_rest) {
      CHECK(tr.ch[ch_elevator][i] == rest);
      CHECK(tr.ch[ch_elevator_rate][i] == 0.0);
    }
  // four slip -> stuck-or-reverse switches at the turning points
  CHECK(st.friction_switches == 4);
}

TEST_CASE("breakout above the sliding force: loss 2 F_s/k a half cycle, rest once k|x| <= F_b") {
  // sliding 3 N, breakout 9 N at the stick: F_s/k = 0.01, F_b/k = 0.03 rad
  const Oscillator o = oscillator(900.0, 9.0, 3.0);
  const double Fs = 0.01, Fb = 0.03;
  const double x0 = 0.1;
  const Trace tr = release(o, x0, 1.5);
  const auto turns = turning_points(tr);
  std::vector<double> expect{x0};
  while (std::abs(expect.back()) > Fb) {
    const double xn = expect.back();
    expect.push_back(-(std::abs(xn) - 2.0 * Fs) * (xn > 0 ? 1.0 : -1.0));
  }
  // 0.1, -0.08, 0.06, -0.04, 0.02 (k|x| = 2 N m <= F_b/G = 3 N m: stays)
  REQUIRE(expect.size() == 5);
  REQUIRE(turns.size() == expect.size());
  for (std::size_t i = 0; i < expect.size(); ++i) {
    CAPTURE(i);
    CHECK(std::abs(turns[i].x - expect[i]) < 1e-6);
  }
  CHECK(std::abs(tr.ch[ch_elevator].back() - expect.back()) < 1e-6);
}

TEST_CASE("a spring below breakout never moves a stuck elevator (no creep)") {
  // released at 0.015 rad: k x = 1.5 N m below the breakout 2 N m: it must not move at all
  const Oscillator o = oscillator(900.0, 6.0, 0.0);
  SolverStats st;
  const Trace tr = release(o, 0.015, 1.0, &st);
  for (std::size_t i = 0; i < tr.size(); ++i) CHECK(tr.ch[ch_elevator][i] == 0.015);
  CHECK(st.friction_switches == 0);
}

namespace {

// The plain airplane trimmed hands off with friction in its circuit, let go at once, in a small
// vertical 1-cosine gust; returns the run's trace and statistics.
struct FlownCase {
  Trace trace;
  SolverStats stats;
  double trim_de = 0;
};
FlownCase fly_free(FrictionLaw law, double breakout, double gust, std::vector<Event> events = {}) {
  Airplane a = test::plain_airplane();
  a.circuit.friction = breakout;
  a.circuit.friction_speed = 0.005;
  a.circuit_nl.friction_law = law;
  auto plant = std::make_shared<const Plant>(make_plant(a));
  const Trim t = trim_free(*plant, test::cruise());
  GustField g;
  if (gust != 0.0) {
    DiscreteGust dg;
    dg.start = 55.0;  // the wing meets it about 1 s after the start
    dg.length = 15.0;
    dg.amplitude = gust;
    g.gusts.push_back(dg);
  }
  RunSettings rs;
  rs.duration = 8.0;
  rs.output_step = 0.01;
  Simulation sim(plant, g, t, rs, RunCase{Stick::free, 0.0}, std::move(events));
  sim.run_to_end();
  REQUIRE_FALSE(sim.departure().departed);
  return FlownCase{sim.trace(), sim.stats(), t.de};
}

}  // namespace

TEST_CASE("hands off below breakout the elevator angle stays exactly constant while the airframe moves") {
  // 20 N breakout at the stick; a 0.3 m/s gust and a 10 N pull for 2 s stay below it
  const std::vector<Event> pull{Event{3.0, EventKind::pulse, 10.0, 2.0, 1}};
  const FlownCase f = fly_free(FrictionLaw::stiction, 20.0, 0.3, pull);
  double q_max = 0.0;
  for (std::size_t i = 0; i < f.trace.size(); ++i) {
    CHECK(f.trace.ch[ch_elevator][i] == f.trim_de);  // exact: no creep
    q_max = std::max(q_max, std::abs(f.trace.ch[ch_q][i]));
  }
  CHECK(q_max > 1e-3);  // the airframe did respond to the gust (about 0.1 deg/s and more)
  CHECK(f.stats.friction_switches == 0);

  SUBCASE("the smoothed law lets the same elevator creep (what stiction removes)") {
    const FlownCase s = fly_free(FrictionLaw::smooth, 20.0, 0.3, pull);
    double drift = 0.0;
    for (double de : s.trace.ch[ch_elevator]) drift = std::max(drift, std::abs(de - s.trim_de));
    CHECK(drift > 1e-5);
  }
  SUBCASE("a pull above breakout makes it slip, and it sticks again after") {
    const std::vector<Event> big{Event{3.0, EventKind::pulse, 60.0, 1.0, 1}};
    const FlownCase b = fly_free(FrictionLaw::stiction, 20.0, 0.0, big);
    double moved = 0.0;
    for (double de : b.trace.ch[ch_elevator]) moved = std::max(moved, std::abs(de - b.trim_de));
    CHECK(moved > 1e-3);
    CHECK(b.stats.friction_switches >= 2);
    // before the pull nothing moved
    for (std::size_t i = 0; i < b.trace.size() && b.trace.ch[ch_time][i] < 3.0; ++i)
      CHECK(b.trace.ch[ch_elevator][i] == b.trim_de);
  }
}

// The linear models of a friction circuit (model/linear.hpp; analysis/margins_modes.hpp): the
// stick-free model is the slipping one, with no friction slope, so neither the friction nor a
// smoothing constant of the smoothed law may move a root: with the law's speed ten times smaller
// or larger, and with no friction at all, the roots must be the same numbers. (Before, the slope
// of the tanh law entered as viscous damping and moved the hands-off boundary by 15 % MAC.)
TEST_CASE("a smoothing constant never moves the stick-free modes of a friction circuit") {
  const std::string f = std::string(FP_SOURCE_DIR) + "/scenarios/orvane_gust.toml";
  auto roots = [&](std::vector<std::string> sets) {
    const Scenario s = load_scenario(f, sets);
    const ModesResult m = compute_modes(s);
    std::vector<std::complex<double>> r;
    for (const auto& x : m.free) r.push_back(x.root);
    return std::make_pair(r, m.friction);
  };
  for (const char* cg : {"mass.cg=0.25", "mass.cg=0.33"}) {
    CAPTURE(cg);
    const auto base = roots({cg, "circuit.friction=9N", "circuit.friction_law=smooth", "circuit.friction_speed=0.02"});
    const auto slow = roots({cg, "circuit.friction=9N", "circuit.friction_law=smooth", "circuit.friction_speed=0.002"});
    const auto fast = roots({cg, "circuit.friction=9N", "circuit.friction_law=smooth", "circuit.friction_speed=0.2"});
    const auto stic = roots({cg, "circuit.friction=9N", "circuit.friction_law=stiction"});
    const auto none = roots({cg, "circuit.friction=0"});
    REQUIRE(base.first.size() == none.first.size());
    for (std::size_t i = 0; i < base.first.size(); ++i) {
      CHECK(base.first[i] == none.first[i]);
      CHECK(slow.first[i] == none.first[i]);
      CHECK(fast.first[i] == none.first[i]);
      CHECK(stic.first[i] == none.first[i]);
    }
    // which model applies: stuck below the breakout moment F_b/G
    CHECK(base.second.applies);
    CHECK_FALSE(none.second.applies);
    const double G = load_scenario(f, {cg}).airplane.circuit.gearing;
    CHECK(base.second.breakout_moment == doctest::Approx(9.0 / G));
  }
}
