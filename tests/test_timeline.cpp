// test_timeline.cpp — the controls timeline's physics: the free case starts held and lets go at
// let_go_time; after let go the pilot's force is zero; take_hold holds the elevator where it is;
// a pilot force pulse on the free stick accelerates the surface by -F/G over the inertia about
// the hinge. Expected values are written here from the definitions and Newton's law for the
// elevator about its hinge (with the stick mass m_s referred to the hinge as m_s / G^2: virtual
// work, common practice for reversible circuits).
#include <doctest/doctest.h>

#include <cmath>
#include <memory>

#include "model/dynamics.hpp"
#include "model/trim.hpp"
#include "run/run.hpp"
#include "support.hpp"

using namespace fp;
using doctest::Approx;

TEST_CASE("pilot force on the free stick: hinge acceleration -F/G over the inertia about the hinge") {
  // With no static mass moment the hinge equation is (I_h + m_s/G^2) de'' + I_h q' = H - F/G;
  // the airframe's q' changes only through the elevator's reaction, I_h de''/I_y ~ 1e-4 of it:
  // the change of de'' from a force F is -(F/G)/(I_h + m_s/G^2) within 1e-3.
  Airplane a = test::plain_airplane();
  a.elevator.mass_moment = 0.0;
  const Plant p = make_plant(a);
  const State x = steady_state(p, 55.0, 0.05, 0.05, 1000.0, -0.02);
  Controls c;
  c.stick = Stick::free;
  State d0{}, d1{};
  derivatives(p, GustField{}, x, c, 0.0, d0);
  const double F = 20.0;  // [N] pull
  c.pilot_force = F;
  derivatives(p, GustField{}, x, c, 0.0, d1);
  const double G = a.circuit.gearing;
  const double I = a.elevator.inertia + a.circuit.stick_mass / (G * G);
  const double expected = -(F / G) / I;  // a pull raises the trailing edge
  CHECK(expected < 0.0);
  CHECK(d1[sx::de_dot] - d0[sx::de_dot] == Approx(expected).epsilon(1e-3));
}

TEST_CASE("timeline: held until let_go_time, free after, and take_hold keeps the elevator where it is") {
  Airplane a = test::plain_airplane();
  const auto p = std::make_shared<const Plant>(make_plant(a));
  // trimmed held with the tab off its hands-off setting: letting go must move the elevator
  const Trim t = trim_held(*p, test::cruise(), 2.0 * units::deg);
  RunSettings rs;
  rs.duration = 4.0;
  rs.output_step = 0.01;
  rs.rel_tol = 1e-10;
  rs.abs_tol = 1e-11;
  const double t_go = 1.0, t_hold = 2.5;
  Simulation sim(p, GustField{}, t, rs, RunCase{Stick::free, t_go}, {Event{t_hold, EventKind::take_hold, 0, 0, 0}});
  sim.run_to_end();
  const auto& tr = sim.trace();
  REQUIRE(tr.size() > 300);
  const auto& tt = tr.ch[ch_time];
  const auto& de = tr.ch[ch_elevator];
  const auto& F = tr.ch[ch_stick_force];
  double de_go = 0, de_hold = 0, moved = 0;
  for (std::size_t i = 0; i < tr.size(); ++i) {
    CAPTURE(tt[i]);
    if (tt[i] < t_go - 1e-9) {
      CHECK(de[i] == Approx(de.front()).epsilon(1e-12).scale(1e-12));  // held: the elevator stays
      CHECK(F[i] == Approx(F.front()).epsilon(1e-6));                  // with the trim's force
      de_go = de[i];
    } else if (tt[i] > t_go + 1e-9 && tt[i] < t_hold - 1e-9) {
      CHECK(std::abs(F[i]) < 1e-9);  // let go: no pilot force
      moved = std::max(moved, std::abs(de[i] - de_go));
      de_hold = de[i];
    } else if (tt[i] > t_hold + 0.011) {
      // held where it was at take_hold (the last sample before it is within one output step)
      CHECK(std::abs(de[i] - de_hold) <= std::abs(de_hold - de[i - 1]) + 1e-9);
      CHECK(de[i] == Approx(de.back()).epsilon(1e-12).scale(1e-12));
    }
  }
  CHECK(std::abs(F.front()) > 1.0);  // the held trim off hands-off needs a force
  CHECK(moved > 1e-3 * std::abs(de_go) + 1e-6);  // and letting go moved the elevator
}
