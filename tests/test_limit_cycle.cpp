// test_limit_cycle.cpp — the limit-cycle detector (analysis/limit_cycle.hpp) against signals
// whose amplitude and period are known in closed form: a steady sinusoid is a sustained
// oscillation of that amplitude and period; a damped or growing one, whose amplitude changes by
// exp(sigma T) a cycle, is not (the definition of a limit cycle as a periodic motion that
// neither grows nor decays: Slotine and Li, Applied Nonlinear Control, sec. 2.2 and 5.1).
#include <doctest/doctest.h>

#include <cmath>
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
