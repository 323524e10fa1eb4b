// test_stops.cpp — the deflection stops as contact: a spring-damper that pushes the surface back
// inside its travel and never pulls (common practice for contact in rigid-body simulation: a
// penalty spring, one-sided, instead of a clamp that would break the integrator). Expected values
// are the contact law written here: H = -k (de - de_stop) - c de_dot while it pushes back, 0
// inside the travel, and 0 rather than a pull when the damping term would reverse it.
#include <doctest/doctest.h>

#include "model/dynamics.hpp"
#include "support.hpp"

using namespace fp;

TEST_CASE("both deflection stops push the surface back and never pull") {
  Airplane a = test::plain_airplane();
  a.circuit.damping = 0.0;  // only the stops act in the circuit here
  a.circuit.centering = 0.0;
  a.circuit.downspring = 0.0;
  a.circuit.friction = 0.0;
  const double k = a.circuit.stop_stiffness, c = a.circuit.stop_damping;
  const double lo = a.elevator.delta_min, hi = a.elevator.delta_max;
  const double e = 0.01;  // [rad] into the stop
  SUBCASE("inside the travel nothing acts") {
    CHECK(circuit_hinge_moment(a, 0.5 * (lo + hi), 0.0) == doctest::Approx(0.0));
  }
  SUBCASE("past the trailing-edge-up stop (delta_min) the stop pushes trailing edge down") {
    const double H = circuit_hinge_moment(a, lo - e, 0.0);
    CHECK(H > 0.0);
    CHECK(H == doctest::Approx(k * e).epsilon(1e-12));
    // moving further into the stop adds the damping; moving out fast it may not pull
    CHECK(circuit_hinge_moment(a, lo - e, -0.1) == doctest::Approx(k * e + c * 0.1).epsilon(1e-12));
    CHECK(circuit_hinge_moment(a, lo - e, 10.0) == doctest::Approx(0.0));
  }
  SUBCASE("past the trailing-edge-down stop (delta_max) the stop pushes trailing edge up") {
    const double H = circuit_hinge_moment(a, hi + e, 0.0);
    CHECK(H < 0.0);
    CHECK(H == doctest::Approx(-k * e).epsilon(1e-12));
    CHECK(circuit_hinge_moment(a, hi + e, 0.1) == doctest::Approx(-k * e - c * 0.1).epsilon(1e-12));
    CHECK(circuit_hinge_moment(a, hi + e, -10.0) == doctest::Approx(0.0));
  }
}

namespace {

Eval eval_at(const Airplane& a, double de, Stick stick, double hold_offset = 0.0) {
  const Plant p = make_plant(a);
  const State x = steady_state(p, 55.0, 0.05, 0.05, 1000.0, de);
  Controls c;
  c.stick = stick;
  c.hold_de = de - hold_offset;
  State d{};
  Eval e;
  derivatives(p, GustField{}, x, c, 0.0, d, &e);
  return e;
}

}  // namespace

TEST_CASE("a geared tab changes the hinge-moment slope to Ch_delta + k Ch_tab") {
  // Geared tab: the tab turns k radians per radian of elevator, so the hinge-moment slope with
  // the elevator is Ch_delta + k Ch_tab (balance for k Ch_tab of opposite sign to Ch_delta;
  // Etkin and Reid, sec. 2.6, for the tab terms; common practice for the gearing).
  Airplane a = test::plain_airplane();
  a.circuit.geared_tab_ratio = 0.5;
  const double d = 0.02;
  const Eval e0 = eval_at(a, 0.0, Stick::held), e1 = eval_at(a, d, Stick::held);
  const double slope = (e1.Ch - e0.Ch) / d;
  CHECK(slope == doctest::Approx(a.elevator.ch_delta + 0.5 * a.elevator.ch_tab).epsilon(1e-9));
  CHECK(e1.tab == doctest::Approx(0.5 * d));
}

TEST_CASE("the bobweight adds its force per g to the force that holds the stick") {
  // A bobweight of B newtons per g pulls the stick forward: the pilot who holds the stick at n g
  // must pull B n more (stick force pull positive). Held rigidly, the stick force from the hinge
  // equation differs by B n between the same airplane with and without it, n read from the model.
  Airplane a = test::plain_airplane();
  const Eval e0 = eval_at(a, -0.02, Stick::held);
  a.circuit.bobweight = 5.0;
  const Eval e1 = eval_at(a, -0.02, Stick::held);
  // n at this (not trimmed) state is what the model reports; the body's own acceleration sets it
  CHECK(e1.stick_force - e0.stick_force == doctest::Approx(5.0 * e1.load_factor).epsilon(0.02));
  CHECK(e1.stick_force - e0.stick_force > 0.0);
}

TEST_CASE("cable stretch: the held stick's force grows with the stretch, pull when the surface is trailing edge down of the hand") {
  // A circuit of stiffness K, referred to the stick [N/m], between the hand (holding where the
  // elevator would be at hold_de) and the surface at de: the stretch at the stick is
  // (de - hold_de) / G with the gearing G, so the stick force is F = K (de - hold_de) / G, pull
  // positive (the surface trailing edge down of the hand pushes the stick forward: the hand pulls).
  Airplane a = test::plain_airplane();
  a.circuit.held_stiffness = 300.0;  // [N/m] at the stick
  const double off = 0.01;           // [rad] surface trailing edge down of the hand
  const Eval e = eval_at(a, -0.02, Stick::held, off);
  CHECK(e.stick_force == doctest::Approx(300.0 * off / a.circuit.gearing).epsilon(1e-9));
}
