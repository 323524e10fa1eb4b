// test_maneuver_climb.cpp — the stick-fixed maneuver point against the textbook formula written
// here and the model's own elevator per g, and trim on a climbing or descending path against the
// kinematics of the flight path.
#include <doctest/doctest.h>

#include <cmath>

#include "model/dynamics.hpp"
#include "model/static.hpp"
#include "model/trim.hpp"
#include "model/units.hpp"
#include "support.hpp"

using namespace fp;
using doctest::Approx;

TEST_CASE("stick-fixed maneuver point: h_m = h_n - Cm_q / (2 mu), where the elevator per g vanishes") {
  // Etkin and Reid, Dynamics of Flight, sec. 3.3 (section number from memory), and the USAF Test
  // Pilot School, Flying Qualities Phase, vol. II ch. 6 (definition: h_m is the CG at which the
  // elevator per g is zero): h_m = h_n - Cm_q/(2 mu), mu = 2 m/(rho S c), Cm_q = Cm_q,wb -
  // 2 eta a_t V_H l_t/c (Nelson sec. 3.5, tail arm from the CG). Every term written here by hand.
  const Airplane a = test::plain_airplane();
  const Condition c = test::cruise(55.0);
  const double rho = 1.225 * std::pow(1.0 - 0.0065 * c.altitude / 288.15, 4.2559);  // ISA troposphere
  const double S = a.wing.area, cb = a.wing.mac, m = a.mass.mass;
  const double St = a.tail.area, at = a.tail.lift.slope, eta = a.tail.eta, ed = a.tail.deps_dalpha;
  const double CLa = a.wing.lift.slope + eta * at * (St / S) * (1.0 - ed);
  const double hn = a.wing.h_ac + eta * (St * (a.tail.x_ac - a.wing.h_ac * cb) / (S * cb)) * (at / CLa) * (1.0 - ed);
  const double mu = 2.0 * m / (rho * S * cb);
  auto hm_at = [&](double h) {  // the tail's arm, hence Cm_q, depends on the CG
    const double lt = a.tail.x_ac - h * cb;
    const double Cmq = a.wing.cm_q - 2.0 * eta * at * (St * lt / (S * cb)) * lt / cb;
    return hn - Cmq / (2.0 * mu);
  };
  double hm = 0.5;
  for (int i = 0; i < 50; ++i) hm = hm_at(hm);  // fixed point in h (a contraction: dCm_q/dh / 2 mu ~ 0.1)
  const ClosedForm cf = closed_form([&] { Airplane x = a; x.mass.h_cg = hm; return x; }(), c);
  MESSAGE("stick-fixed maneuver point: by hand " << hm << ", closed form " << cf.mp_fixed << ", neutral point " << hn);
  CHECK(hm > hn);  // aft of the neutral point: the pitch damping adds to the stability in a pull-up
  // 1e-5: the same formula, the closed form evaluated at that CG; the density here is taken at
  // 1000 m geometric, the program's at 1000 m geometric converted to geopotential (0.16 m lower:
  // 1.6e-5 of rho, of mu and of the shift h_m - h_n, ~1e-6 of h_m)
  CHECK(cf.mp_fixed == Approx(hm).epsilon(1e-5));
  // the model: elevator per g changes sign across h_m (a pull-up needs up elevator ahead of it).
  // 0.015 MAC either side (measured: the model's zero lies 0.0086 MAC aft of the formula): the
  // closed form takes the tail volume and Cm_q at one CG and leaves out the trim angle's geometry
  // and the change of the tail's dynamic pressure and downwash in the pull-up (first order)
  auto de_per_g = [&](double h) {
    Airplane x = a;
    x.mass.h_cg = h;
    const Plant p = make_plant(x);
    return per_g(p, c, trim_free(p, c).tab).elevator_per_g;
  };
  const double ahead = de_per_g(hm - 0.015), behind = de_per_g(hm + 0.015);
  MESSAGE("elevator per g at h_m -+ 0.015: " << ahead << ", " << behind << " rad/g");
  CHECK(ahead < 0.0);  // trailing edge up per g ahead of the maneuver point
  CHECK(behind > 0.0);
}

TEST_CASE("trim on a climbing or descending path: theta = alpha + gamma, and the airplane follows the path") {
  // Kinematics of the flight path (Etkin and Reid sec. 4.2, common notation): gamma = theta - alpha
  // in steady straight flight, and the height changes at V sin(gamma). The trim is an equilibrium.
  const Airplane a = test::plain_airplane();
  const Plant p = make_plant(a);
  for (double gamma : {-0.06, 0.04}) {
    CAPTURE(gamma);
    Condition c = test::cruise(55.0);
    c.flight_path = gamma;
    const Trim t = trim_held(p, c, 0.0);
    CHECK(t.theta - t.alpha == Approx(gamma).epsilon(1e-9).scale(1e-12));
    State d{};
    derivatives(p, GustField{}, t.x, t.controls, 0.0, d);
    CHECK(d[sx::h] == Approx(t.airspeed * std::sin(gamma)).epsilon(1e-6));
    CHECK(std::abs(d[sx::u]) < 1e-6);
    CHECK(std::abs(d[sx::w]) < 1e-6);
    CHECK(std::abs(d[sx::q]) < 1e-6);
  }
}
