// test_static_shared.cpp — the quantities of the static analyses that have one home (constant
// hinge moment, tail volume, steady downwash, free-elevator factor, stall speed, the default
// criteria), the root and minimum finders on Boost.Math, the per-g curve that stops where the
// airplane stops trimming, and the trim's named causes. Each check names what it is checked
// against.
#include <doctest/doctest.h>

#include <cmath>

#include "analysis/margins_modes.hpp"
#include "model/roots.hpp"
#include "model/static.hpp"
#include "model/trim.hpp"
#include "model/units.hpp"
#include "support.hpp"

using namespace fp;
using doctest::Approx;

TEST_CASE("constant hinge moment: elevator weight, downspring and bobweight by hand") {
  Airplane a = test::plain_airplane();
  a.elevator.mass = 3.0;
  a.elevator.mass_moment = 0.1;  // kg m, CG aft of the hinge
  a.circuit.downspring = 10.0;   // N push at the stick
  a.circuit.bobweight = 5.0;     // N/g push at the stick
  // virtual work on the circuit F dx + H d(delta_e) = 0 with delta_e = -G x gives H = F/G for a
  // push F (model/state.hpp, Etkin and Reid sec. 2.6): H_c = S_e g0 + D/G + B/G
  // = 0.1*9.80665 + 10/3 + 5/3 = 5.980665 N m (hand computation)
  CHECK(constant_hinge_moment(a) == Approx(5.980665).epsilon(1e-9));
  // at 2 g with the elevator at 0.2 rad: S_e cos(0.2) 2 g0 + 2 B/G = 0.1*0.980067*19.6133 + 10/3
  // = 1.922234 + 3.333333 = 5.255567 N m (hand computation)
  CHECK(weight_hinge_moment(a, 0.2, 2.0) == Approx(5.255567).epsilon(1e-6));
  // closed_form reports the same H_c (one home)
  CHECK(closed_form(a, test::cruise(55.0)).hinge_constant == Approx(5.980665).epsilon(1e-9));
}

TEST_CASE("tail arm, tail volume and steady downwash by hand") {
  const Airplane a = test::plain_airplane();
  // l_t = 4.8 - 0.25*1.3 = 4.475 m; V_H = 2.4*4.475/(12*1.3) = 0.688462 (Etkin and Reid sec. 2.4)
  CHECK(tail_arm(a, 0.25) == Approx(4.475).epsilon(1e-12));
  CHECK(tail_volume(a, 0.25) == Approx(0.688462).epsilon(1e-6));
  // from a CG at 0.35: l_t = 4.8 - 0.455 = 4.345 m, V_H = 2.4*4.345/15.6 = 0.668462
  CHECK(tail_volume(a, 0.35) == Approx(0.668462).epsilon(1e-6));
  Tail t = a.tail;
  t.eps0 = 0.01;
  t.deps_dalpha = 0.45;
  // eps = eps0 + (deps/dalpha) alpha = 0.01 + 0.45*0.1 = 0.055 rad (Etkin and Reid sec. 2.4)
  CHECK(steady_downwash(t, 0.1) == Approx(0.055).epsilon(1e-12));
}

TEST_CASE("free-elevator factor with a geared tab by hand") {
  Airplane a = test::plain_airplane();
  a.tail.tau_elevator = 0.5;
  a.tail.tau_tab = 0.1;
  a.elevator.ch_alpha = -0.2;
  a.elevator.ch_delta = -0.45;
  a.elevator.ch_tab = -0.3;
  a.circuit.geared_tab_ratio = 0.5;
  // tau' = 0.5 + 0.5*0.1 = 0.55; Ch_delta' = -0.45 + 0.5*(-0.3) = -0.6;
  // F = 1 - tau' Ch_alpha / Ch_delta' = 1 - 0.55*0.2/0.6 = 0.816667 (Etkin and Reid sec. 2.6)
  CHECK(free_elevator_factor(a) == Approx(0.816667).epsilon(1e-6));
  CHECK(closed_form(a, test::cruise(55.0)).free_factor == Approx(0.816667).epsilon(1e-6));
}

TEST_CASE("stall speed and CLmax of a tabulated lift curve by hand") {
  Airplane a = test::plain_airplane();
  // the table ends at 0.96 rad, where the flat-plate law 2 sin^2(a) cos(a) that continues it
  // (model/dynamics.cpp) peaks, so nothing beyond the table rises above 0.5
  a.wing.lift.table = {{0.0, 0.2}, {0.2, 1.0}, {0.3, 1.4}, {0.4, 1.2}, {0.96, 0.5}};
  // linear interpolation peaks at the table's vertex: CLmax 1.4 at 0.3 rad
  const StallPoint st = wing_stall(a.wing.lift);
  CHECK(st.CLmax == Approx(1.4).epsilon(1e-9));
  CHECK(st.alpha == Approx(0.3).epsilon(1e-6));
  // V_s = sqrt(2 n m g0 / (rho S CLmax)), sea-level ISA density 1.225 kg/m3 (ISO 2533):
  // sqrt(2*750*9.80665/(1.225*12*1.4)) = 26.7352 m/s (hand computation)
  CHECK(stall_speed(a, 0.0) == Approx(26.7352).epsilon(1e-5));
  // at n g the stall speed grows as sqrt(n) (the same lift equation)
  CHECK(stall_speed(a, 0.0, 2.0) == Approx(26.7352 * std::sqrt(2.0)).epsilon(1e-5));
}

TEST_CASE("default force per g criterion is 3 lbf/g") {
  // 3.0 lbf/g in N/g: 3 * 4.4482216 = 13.34 N/g (the pound-force, NIST SP 811); the default is
  // written 13.3 N/g
  CHECK(kDefaultCriteria.min_force_per_g == Approx(3.0 * 4.4482216).epsilon(0.005));
}

TEST_CASE("root and minimum finders: converge, and say so when they do not") {
  // the fixed point of cos: x = cos x at 0.7390851332151607 (the Dottie number, from memory)
  const double x = find_root([](double v) { return std::cos(v) - v; }, 0.0, 1.0, 1e-13, "test root");
  CHECK(x == Approx(0.7390851332151607).epsilon(1e-12));
  // no sign change in the interval: a SolverFailure, not a number
  CHECK_THROWS_AS(find_root([](double v) { return v * v + 1.0; }, -1.0, 1.0, 1e-9, "no root"), SolverFailure);
  // too few iterations for the tolerance: a SolverFailure
  CHECK_THROWS_AS(find_root([](double v) { return std::cos(v) - v; }, 0.0, 1.0, 1e-15, "starved", 2), SolverFailure);
  // minimum of (v - 1.3)^2 + 2 at 1.3 (calculus)
  const auto m = find_minimum([](double v) { return (v - 1.3) * (v - 1.3) + 2.0; }, 0.0, 3.0, "test minimum");
  CHECK(m.first == Approx(1.3).epsilon(1e-6));
  CHECK(m.second == Approx(2.0).epsilon(1e-12));
  double a, b, fa, fb;
  struct Never {};
  // bracket search walks from 0 towards the root at 5 of v - 5
  REQUIRE(bracket_root<Never>([](double v) { return v - 5.0; }, 0.0, 0.1, -10.0, 10.0, a, b, fa, fb));
  CHECK(a <= 5.0);
  CHECK(b >= 5.0);
  // a function that keeps its sign over the allowed interval: no bracket (an answer, not a failure)
  CHECK_FALSE(bracket_root<Never>([](double v) { return v - 50.0; }, 0.0, 0.1, -10.0, 10.0, a, b, fa, fb));
}

TEST_CASE("cg_zero finds the stick-fixed neutral point of the closed form within the model's spread") {
  // the CG at which the fixed-elevator dCm/dCL vanishes is the neutral point (Etkin and Reid
  // sec. 2.3); the closed form gives 0.507929 for this airplane (test_static.cpp, by hand)
  const Airplane a = test::plain_airplane();
  const Condition c = test::cruise(55.0);
  const double np = cg_zero(
      a,
      [&](const Plant& p) {
        const Trim t = trim_held(p, c, 0.0);
        return model_neutral_points(p, t).fixed - p.ap.mass.h_cg;
      },
      0.3);
  CHECK(np == Approx(0.507929).epsilon(0.02));
}

TEST_CASE("per-g curve stops at the stall, not with an error") {
  // At 40 m/s and 1000 m the test airplane's wing reaches CLmax near n = q S CLmax / W: the
  // curve must stop there and say it is the stall (the lift equation n W = q S CL, Etkin and
  // Reid sec. 2.2; the tail's share of lift is a few per cent).
  Airplane a = test::plain_airplane();
  a.wing.lift.alpha_stall = 16.0 * units::deg;
  a.wing.lift.stall_sharpness = 60.0;
  const Plant p = make_plant(a);
  const Condition c = test::cruise(40.0);
  const Trim tf = trim_free(p, c);
  const PerGCurve pg = force_per_g_curve(p, c, tf.tab, 4.0, 0.05);
  REQUIRE_FALSE(pg.complete);
  CHECK(pg.stop == TrimLimit::stall);
  CHECK_FALSE(pg.numerical);
  REQUIRE(pg.points.size() >= 2);
  CHECK(pg.stop_load_factor == Approx(pg.points.back().load_factor + 0.05));
  const double rho = isa_at(geopotential_altitude(1000.0)).density;
  const double n_stall = 0.5 * rho * 40.0 * 40.0 * a.wing.area * wing_stall(a.wing.lift).CLmax / (a.mass.mass * units::g0);
  CHECK(pg.points.back().load_factor <= n_stall * 1.1);
  CHECK(pg.stop_load_factor >= n_stall * 0.85);
  // the force grows with n (a pull per g, stable airplane: USAF TPS vol. II ch. 6)
  CHECK(pg.points.back().stick_force > pg.points.front().stick_force);
}

TEST_CASE("trim names the cause: the tab runs out") {
  // a hands-off trim whose tab range is too small for the condition: the cause is the tab
  Airplane a = test::plain_airplane();
  a.circuit.tab_min = -0.2 * units::deg;
  a.circuit.tab_max = 0.2 * units::deg;
  a.mass.h_cg = 0.10;  // forward CG: needs a large nose-up tab
  const Plant p = make_plant(a);
  try {
    (void)trim_free(p, test::cruise(40.0));
    FAIL("expected a TrimError");
  } catch (const TrimError& e) {
    CHECK(e.limit == TrimLimit::tab_stop);
    CHECK(e.message.find("tab") != std::string::npos);
  }
}

TEST_CASE("a tenfold change of the CG search tolerance does not move the answer") {
  // a numerical setting must not decide a physical answer (common practice: change it tenfold
  // both ways; the answers agree to the coarsest tolerance)
  const Airplane a = test::plain_airplane();
  const Condition c = test::cruise(55.0);
  const auto f = [&](const Plant& p) {
    const Trim t = trim_free(p, c);
    return model_neutral_points(p, t).free - p.ap.mass.h_cg;
  };
  const double coarse = cg_zero(a, f, 0.3, 0.05, 1e-5);
  const double nominal = cg_zero(a, f, 0.3, 0.05, 1e-6);
  const double fine = cg_zero(a, f, 0.3, 0.05, 1e-7);
  REQUIRE(std::isfinite(nominal));
  CHECK(std::abs(coarse - nominal) < 1e-5);
  CHECK(std::abs(fine - nominal) < 1e-6);
  // and a tenfold change of the first step of the bracket search
  CHECK(std::abs(cg_zero(a, f, 0.3, 0.005, 1e-6) - nominal) < 2e-6);
  CHECK(std::abs(cg_zero(a, f, 0.3, 0.5, 1e-6) - nominal) < 2e-6);
}
