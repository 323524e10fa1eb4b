// test_friction_smooth.cpp — the smoothed friction law (circuit.friction_law = "smooth") against the
// law written here. The friction
// acts on the stick: a force of the breakout size F_f opposing the stick's motion (Coulomb, common
// practice for control-circuit friction), smoothed over the speed v_s as F = -F_f tanh(x'/v_s)
// (the smoothed option; the default law is stiction, tests/test_friction.cpp). With delta_e = -G x (stick aft
// positive, trailing edge down positive) the stick speed is x' = -delta_e'/G, and a force F on the
// stick appears at the hinge as -F/G (virtual work, F_stick = G H). So the hinge moment of the
// friction is H_f = (F_f/G) tanh(-delta_e'/(G v_s)): it opposes the surface's motion, of size
// F_f/G once the stick moves much faster than v_s.
#include <doctest/doctest.h>

#include <cmath>

#include "model/dynamics.hpp"
#include "support.hpp"

using namespace fp;

TEST_CASE("smoothed friction: breakout force at the stick, opposing its motion, F_f / G at the hinge") {
  Airplane a = test::plain_airplane();
  a.circuit.damping = 0.0;  // only the friction acts in the circuit here
  a.circuit.centering = 0.0;
  a.circuit.downspring = 0.0;
  a.circuit.friction = 8.0;         // [N] breakout at the stick
  a.circuit.friction_speed = 0.02;  // [m/s]
  a.circuit_nl.friction_law = FrictionLaw::smooth;
  const double G = a.circuit.gearing, Ff = 8.0, vs = 0.02;
  auto H_hand = [&](double ded) {
    const double x_dot = -ded / G;          // stick speed, aft positive
    const double F = -Ff * std::tanh(x_dot / vs);  // friction force on the stick, opposing x_dot
    return -F / G;                          // its hinge moment (virtual work)
  };
  for (double ded : {-2.0, -0.3, -0.01, 0.0, 0.005, 0.3, 2.0}) {
    CAPTURE(ded);
    const double H = friction_hinge_moment(a, FrictionState::smooth, ded);
    CHECK(H == doctest::Approx(H_hand(ded)).epsilon(1e-12).scale(1e-12));
    if (ded != 0.0) CHECK(H * ded < 0.0);  // dissipative: it takes power from the surface's motion
  }
  // fast motion: the full breakout, trailing edge down motion (stick forward) resisted
  CHECK(friction_hinge_moment(a, FrictionState::smooth, 2.0) == doctest::Approx(-Ff / G).epsilon(1e-9));
  // a load of half the breakout lets the stick creep at v_s atanh(1/2) (the documented creep)
  const double ded_creep = G * vs * std::atanh(0.5);
  CHECK(friction_hinge_moment(a, FrictionState::smooth, ded_creep) == doctest::Approx(-0.5 * Ff / G).epsilon(1e-9));
  // the breakout is a force at the stick: doubling the gearing halves it at the hinge
  Airplane b = a;
  b.circuit.gearing = 2.0 * G;
  CHECK(friction_hinge_moment(b, FrictionState::smooth, 100.0) == doctest::Approx(-Ff / (2.0 * G)).epsilon(1e-9));
}
