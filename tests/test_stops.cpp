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
