// test_limit_cycle.cpp — the limit-cycle detector (analysis/limit_cycle.hpp) against signals
// whose amplitude and period are known in closed form: a steady sinusoid is a sustained
// oscillation of that amplitude and period; a damped or growing one, whose amplitude changes by
// exp(sigma T) a cycle, is not (the definition of a limit cycle as a periodic motion that
// neither grows nor decays: Slotine and Li, Applied Nonlinear Control, sec. 2.2 and 5.1).
#include <doctest/doctest.h>

#include <array>
#include <cmath>
#include <complex>
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/limit_cycle.hpp"
#include "output/outputs.hpp"
#include "scenario/scenario.hpp"

using namespace fp;

namespace {

// A trace whose pitch rate, elevator and load factor oscillate at period T with amplitudes
// (A_q, A_e, A_n) times exp(sigma t), about offsets.
Trace sinusoid(double T, double Aq, double Ae, double An, double sigma, double duration = 40.0) {
  Trace tr;
  const double w = 2.0 * std::acos(-1.0) / T;
  for (double t = 0.0; t <= duration + 1e-9; t += 0.005) {
    std::array<double, ch_count> r{};
    const double g = std::exp(sigma * t);
    r[ch_time] = t;
    r[ch_q] = 0.001 + Aq * g * std::sin(w * t);
    r[ch_elevator] = -0.02 + Ae * g * std::sin(w * t + 0.7);
    r[ch_load_factor] = 1.0 + An * g * std::sin(w * t + 0.3);
    tr.push(r);
  }
  return tr;
}

}  // namespace

TEST_CASE("a steady oscillation is a limit cycle with its own amplitude and period") {
  const Trace tr = sinusoid(1.7, 0.02, 0.004, 0.05, 0.0);
  const LimitCycle c = detect_limit_cycle(tr, 5.0, false);
  REQUIRE(c.found);
  CHECK(c.period == doctest::Approx(1.7).epsilon(1e-4));
  // half peak-to-peak of samples 5 ms apart: within A (1 - cos(w dt/2)) of the amplitude
  CHECK(c.q_amplitude == doctest::Approx(0.02).epsilon(2e-4));
  CHECK(c.elevator_amplitude == doctest::Approx(0.004).epsilon(2e-4));
  CHECK(c.load_factor_amplitude == doctest::Approx(0.05).epsilon(2e-4));
  CHECK(c.cycles >= kMinCycles);
  CHECK(c.window_start == doctest::Approx(20.0));  // the later half of the run
}

TEST_CASE("a decaying or a growing oscillation is not a limit cycle, nor is a departed run") {
  // 10 % a cycle either way: far beyond the 1 % a cycle the detector calls steady
  const double T = 1.7, s = std::log(1.1) / T;
  CHECK_FALSE(detect_limit_cycle(sinusoid(T, 0.02, 0.004, 0.05, -s), 0.0, false).found);
  CHECK_FALSE(detect_limit_cycle(sinusoid(T, 0.02, 0.004, 0.05, s), 0.0, false).found);
  CHECK_FALSE(detect_limit_cycle(sinusoid(T, 0.02, 0.004, 0.05, 0.0), 0.0, true).found);
  // below the detection floor of 0.01 deg/s
  CHECK_FALSE(detect_limit_cycle(sinusoid(T, 1e-5, 1e-6, 1e-5, 0.0), 0.0, false).found);
  // too few cycles in the window
  CHECK_FALSE(detect_limit_cycle(sinusoid(10.0, 0.02, 0.004, 0.05, 0.0), 0.0, false).found);
}

// The bundled worn-circuit case: hands off, the elevator buzzes in the free play while the
// stick side stays stuck, a sustained oscillation that the same airplane without the play does
// not have. summary.json carries it under free -> limit_cycle (null when none).
TEST_CASE("the worn-circuit case: a hands-off limit cycle that the model without free play misses") {
  const std::string f = std::string(FP_SOURCE_DIR) + "/scenarios/orvane_worn_circuit.toml";
  const Scenario s = load_scenario(f);
  const RunOutcome o = run_scenario(s, ControlsChoice::both);
  const nlohmann::json j = summary_json(s, o);
  REQUIRE(j["free"]["limit_cycle"].is_object());
  const auto& c = j["free"]["limit_cycle"];
  for (const char* k : {"elevator_amplitude_deg", "q_amplitude_deg_s", "load_factor_amplitude", "period_s"})
    CHECK(c[k].is_number());
  // the elevator stays inside the play (1 deg in all), and the cycle is the elevator's own
  // fast motion (the stick-free elevator mode of the closed circuit has a period near 0.3 s)
  CHECK(c["elevator_amplitude_deg"].get<double>() > 0.0);
  CHECK(c["elevator_amplitude_deg"].get<double>() < 0.5);
  CHECK(c["period_s"].get<double>() > 0.2);
  CHECK(c["period_s"].get<double>() < 0.6);
  CHECK(j["held"]["limit_cycle"].is_null());

  const Scenario closed = load_scenario(f, {"circuit.free_play=0"});
  const RunOutcome oc = run_scenario(closed, ControlsChoice::free);
  CHECK(summary_json(closed, oc)["free"]["limit_cycle"].is_null());
}

// A position servo with friction-dominated backlash, the describing-function example of the
// trade: linear part L(s) = K / (s (s + 1)^2) from the backlash's output x to its input m (unity
// negative feedback), backlash of total width b (x stays put until m is b/2 away, then follows
// it). The describing function of that backlash (Gelb and Vander Velde, Multiple-Input
// Describing Functions and Nonlinear System Design, 1968, table entry for friction-controlled
// backlash; the same formula in the python-control library, friction_backlash_nonlinearity):
//   N(A) = (1 + f(1 - b/A)) / 2 - j (2 b/A - (b/A)^2) / pi,  f(u) = (2/pi)(asin u + u sqrt(1 - u^2)),
// and the harmonic balance L(jw) N(A) = -1 predict the stable limit cycle (A, w). The loop is
// simulated here with a fixed-step fourth-order Runge-Kutta (the backlash updated between steps:
// test-local, not the program's integrator), the detector reads its m(t), and the two must agree
// within the method's accuracy: for a linear part that filters the harmonics this well (-60 dB a
// decade), a few per cent in frequency and about ten in amplitude (Gelb and Vander Velde, ch. 2,
// on the accuracy of the describing function; Slotine and Li, sec. 5.5).
TEST_CASE("servo loop with backlash: the detector's limit cycle against the describing function") {
  const double pi = std::acos(-1.0), K = 1.5, b = 0.2;
  auto f = [&](double u) { return 2.0 / pi * (std::asin(u) + u * std::sqrt(1.0 - u * u)); };
  auto N = [&](double A) {
    const double r = b / A;
    return std::complex<double>(0.5 * (1.0 + f(1.0 - r)), -(2.0 * r - r * r) / pi);
  };
  // phase balance: -90 deg - 2 atan(w) = -180 deg - arg N(A); gain balance: K |N| = w (1 + w^2)
  auto w_of = [&](double A) { return std::tan(0.5 * (0.5 * pi + std::arg(N(A)))); };
  auto gain = [&](double A) {
    const double w = w_of(A);
    return K * std::abs(N(A)) - w * (1.0 + w * w);
  };
  // the stable intersection: the gain balance falls through zero with growing amplitude
  double lo = 0.3, hi = 1.0;
  REQUIRE(gain(lo) > 0.0);
  REQUIRE(gain(hi) < 0.0);
  for (int i = 0; i < 100; ++i) {
    const double mid = 0.5 * (lo + hi);
    (gain(mid) > 0.0 ? lo : hi) = mid;
  }
  const double A_df = 0.5 * (lo + hi), T_df = 2.0 * pi / w_of(A_df);

  // the loop: z1' = -z1 + u, z2' = -z2 + z1, m' = z2, u = -K x; backlash x(m)
  double z1 = 0.0, z2 = 0.0, m = 0.5, x = 0.0;
  const double dt = 1e-3;
  Trace tr;
  for (long k = 0; k <= 600000; ++k) {
    if (k % 10 == 0) {
      std::array<double, ch_count> r{};
      r[ch_time] = k * dt;
      r[ch_q] = m;  // the detector reads the pitch-rate channel: here the backlash's input
      r[ch_elevator] = x;
      r[ch_load_factor] = z2;
      tr.push(r);
    }
    const double u = -K * x;
    auto d = [&](const std::array<double, 3>& s) { return std::array<double, 3>{-s[0] + u, -s[1] + s[0], s[1]}; };
    const std::array<double, 3> s0{z1, z2, m};
    auto add = [](const std::array<double, 3>& a, const std::array<double, 3>& v, double h) {
      return std::array<double, 3>{a[0] + h * v[0], a[1] + h * v[1], a[2] + h * v[2]};
    };
    const auto k1 = d(s0), k2 = d(add(s0, k1, 0.5 * dt)), k3 = d(add(s0, k2, 0.5 * dt)), k4 = d(add(s0, k3, dt));
    z1 += dt / 6.0 * (k1[0] + 2.0 * k2[0] + 2.0 * k3[0] + k4[0]);
    z2 += dt / 6.0 * (k1[1] + 2.0 * k2[1] + 2.0 * k3[1] + k4[1]);
    m += dt / 6.0 * (k1[2] + 2.0 * k2[2] + 2.0 * k3[2] + k4[2]);
    if (m - x > 0.5 * b) x = m - 0.5 * b;
    else if (m - x < -0.5 * b) x = m + 0.5 * b;
  }
  const LimitCycle c = detect_limit_cycle(tr, 0.0, false);
  REQUIRE(c.found);
  CAPTURE(A_df);
  CAPTURE(T_df);
  CHECK(c.period == doctest::Approx(T_df).epsilon(0.05));
  CHECK(c.q_amplitude == doctest::Approx(A_df).epsilon(0.10));
  // the backlash's output swings by the input's amplitude less half the play
  CHECK(c.elevator_amplitude == doctest::Approx(c.q_amplitude - 0.5 * b).epsilon(0.02));
}
