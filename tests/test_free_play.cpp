// test_free_play.cpp — free play (backlash) between the stick side and the elevator, on the
// project's one integration path.
//
// Checks, each against mechanics written here from a named source:
//   * Inside the play no moment acts between the two sides: with the stick held rigidly and no
//     aerodynamics, the elevator turns at a constant rate relative to the airframe (the hinge
//     moment is zero, so by conservation of angular momentum about the CG the airframe and the
//     elevator keep their rates; Meriam and Kraige, Dynamics, plane kinetics of rigid bodies),
//     so it crosses from the middle to an end in (b/2)/rate.
//   * At an end, the stops' contact law (a linear spring k, no damping here) turns it back: a
//     half cycle of the mass-spring oscillator, pi sqrt(I/k) long, with the greatest penetration
//     rate sqrt(I/k) (energy: I rate^2 / 2 = k d^2 / 2; any vibrations text, e.g. Den Hartog,
//     Mechanical Vibrations, ch. 1), and the rate comes back reversed and undiminished.
//   * Held, the stick force inside the play is zero (no contact, no circuit springs).
//   * Hands off with friction, a stuck stick side does not creep while the elevator floats in the
//     play (the definition of stiction: Karnopp 1985).
#include <doctest/doctest.h>

#include <cmath>
#include <memory>

#include "model/dynamics.hpp"
#include "model/trim.hpp"
#include "run/run.hpp"
#include "support.hpp"

using namespace fp;

namespace {

constexpr double kPlay = 2.0 * units::deg;

}  // namespace

TEST_CASE("held stick with free play: the elevator crosses the play freely and bounces off its ends") {
  Airplane a = test::plain_airplane();
  a.circuit.damping = 0.0;
  a.circuit.stop_damping = 0.0;
  a.circuit.stop_stiffness = 2.0e4;
  a.circuit_nl.free_play = kPlay;
  auto p = std::make_shared<Plant>(make_plant(a));
  p->aerodynamics = false;
  p->thrust = false;
  const double k = a.circuit.stop_stiffness;
  const double I = p->I_ecg * p->I_B / (p->I_B + p->I_ecg);  // the relative angle's inertia, stick side pinned
  const double rate = 0.5;                                   // [rad/s] relative, at the start
  Trim t;
  t.airspeed = 55.0;
  t.x = steady_state(*p, 55.0, 0.0, 0.0, 2000.0, 0.0);
  t.x[sx::de_dot] = rate;
  t.controls.stick = Stick::held;
  t.controls.throttle = 0.0;
  RunSettings rs;
  rs.duration = 0.2;
  rs.output_step = 1e-5;
  rs.rel_tol = 1e-11;
  rs.abs_tol = 1e-13;
  rs.alpha_limit = 1.5;
  rs.max_airspeed_ratio = 20.0;
  Simulation sim(p, GustField{}, t, rs, RunCase{Stick::held, 0.0}, {});
  // the start puts the stick side where the (zero) trim moment is carried: centred
  REQUIRE(sim.state()[sx::ds] == 0.0);
  sim.run_to_end();
  REQUIRE_FALSE(sim.departure().departed);
  const Trace& tr = sim.trace();
  const double t_hit = 0.5 * kPlay / rate;
  const double t_contact = std::acos(-1.0) * std::sqrt(I / k);
  const double depth = rate * std::sqrt(I / k);
  double max_de = -1.0, t_max = 0.0;
  for (std::size_t i = 0; i < tr.size(); ++i) {
    const double ti = tr.ch[ch_time][i], de = tr.ch[ch_elevator][i];
    if (ti < t_hit - 1e-4) {
      CHECK(std::abs(de - rate * ti) < 1e-7);           // free inside the play
      CHECK(std::abs(tr.ch[ch_stick_force][i]) < 1e-9);  // nothing to hold
    }
    if (ti < t_hit + t_contact && de > max_de) {  // the first contact
      max_de = de;
      t_max = ti;
    }
  }
  // deepest at the middle of the contact, as deep as the energy allows
  CHECK(std::abs(max_de - (0.5 * kPlay + depth)) < 1e-6);
  CHECK(std::abs(t_max - (t_hit + 0.5 * t_contact)) < 2e-5);
  // back at the end after pi sqrt(I/k), then free at the same rate reversed
  const double t_back = t_hit + t_contact;
  for (std::size_t i = 0; i < tr.size(); ++i) {
    const double ti = tr.ch[ch_time][i];
    if (ti > t_back + 1e-4 && ti < t_back + kPlay / rate - 1e-4)
      CHECK(std::abs(tr.ch[ch_elevator][i] - (0.5 * kPlay - rate * (ti - t_back))) < 1e-6);
  }
}

TEST_CASE("hands off with friction and free play: the stuck stick side never creeps, the elevator floats") {
  Airplane a = test::plain_airplane();
  a.elevator.mass = 3.0;
  a.elevator.mass_moment = 0.15;  // unbalanced: its weight and the gust move it inside the play
  a.elevator.inertia = 0.12;
  a.circuit.friction = 30.0;      // far above what the small gust asks of the stick side
  a.circuit_nl.free_play = kPlay;
  auto plant = std::make_shared<const Plant>(make_plant(a));
  const Trim t = trim_free(*plant, test::cruise());
  GustField g;
  DiscreteGust dg;
  dg.start = 55.0;
  dg.length = 15.0;
  dg.amplitude = 1.0;
  g.gusts.push_back(dg);
  RunSettings rs;
  rs.duration = 6.0;
  rs.output_step = 0.005;
  Simulation sim(plant, g, t, rs, RunCase{Stick::free, 0.0}, {});
  const double ds0 = sim.state()[sx::ds];
  // the elevator starts at its trimmed angle, within the play of the stick side
  CHECK(sim.state()[sx::de] == t.de);
  CHECK(std::abs(t.de - ds0) <= 0.5 * kPlay + 1e-6);
  double de_lo = 1e9, de_hi = -1e9;
  while (sim.advance_to(sim.time() + 0.05)) {
    CHECK(sim.state()[sx::ds] == ds0);
    CHECK(sim.state()[sx::ds_dot] == 0.0);
    de_lo = std::min(de_lo, sim.state()[sx::de]);
    de_hi = std::max(de_hi, sim.state()[sx::de]);
  }
  REQUIRE_FALSE(sim.departure().departed);
  CHECK(sim.stats().friction_switches == 0);
  CHECK(de_hi - de_lo > 0.1 * units::deg);  // the elevator did float in the play
  CHECK(de_hi - de_lo < kPlay + 0.5 * units::deg);
}
