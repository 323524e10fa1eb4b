// bench_main.cpp — speed figures, printed by Google Benchmark (goals live here, not in tests).
//   run_pair:   one 60 s held-and-free run of the demo scenario, CSV text included
//               (goal: under 3 ms for the pair on one core)
//   derivative: one call of the derivative function (calls per second as a counter)
//   turbulence_20_seeds: 20 seeds x 300 s of turbulence held and free (goal: under 2 s on 2 cores)
// Run: ./build/floatpitch-bench  (add --benchmark_repetitions=10 for medians)
#include <benchmark/benchmark.h>

#include "model/dynamics.hpp"
#include "analysis/gust_studies.hpp"
#include "output/outputs.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"
#include "analysis/sweep.hpp"

#ifndef FP_SOURCE_DIR
#define FP_SOURCE_DIR "."
#endif

namespace {

const fp::Scenario& demo() {
  static const fp::Scenario s = fp::load_scenario(FP_SOURCE_DIR "/scenarios/orvane_gust.toml",
                                                  {"run.duration=60"});
  return s;
}

void run_pair(benchmark::State& st) {
  const auto& s = demo();
  long calls = 0;
  for (auto _ : st) {
    const fp::RunOutcome r = fp::run_scenario(s, fp::ControlsChoice::both);
    std::string a = fp::trace_csv(r.held->trace), b = fp::trace_csv(r.free->trace);
    benchmark::DoNotOptimize(a.data());
    benchmark::DoNotOptimize(b.data());
    calls += r.held->stats.derivative_calls + r.free->stats.derivative_calls;
  }
  st.counters["derivative_calls_per_pair"] =
      benchmark::Counter(static_cast<double>(calls) / static_cast<double>(st.iterations()));
}
BENCHMARK(run_pair)->Unit(benchmark::kMillisecond);

// The same pair without writing the CSV text (integration and output rows only).
void run_pair_no_csv(benchmark::State& st) {
  const auto& s = demo();
  for (auto _ : st) {
    const fp::RunOutcome r = fp::run_scenario(s, fp::ControlsChoice::both);
    benchmark::DoNotOptimize(r.held->trace.size());
  }
}
BENCHMARK(run_pair_no_csv)->Unit(benchmark::kMillisecond);

// The circuit's nonlinear elements (model/circuit.hpp): the same 60 s held-and-free pair of the
// demo with (0) no friction, (1) the smoothed friction law, (2) stiction, (3) stiction and 1 deg
// of free play. Goal: (3) at most 1.5 times (0) and (1).
void circuit_nonlinear(benchmark::State& st) {
  static const char* variants[4][2] = {{"circuit.friction=0", "circuit.free_play=0"},
                                       {"circuit.friction_law=smooth", "circuit.free_play=0"},
                                       {"circuit.friction_law=stiction", "circuit.free_play=0"},
                                       {"circuit.friction_law=stiction", "circuit.free_play=1deg"}};
  const auto v = static_cast<std::size_t>(st.range(0));
  const fp::Scenario s = fp::load_scenario(FP_SOURCE_DIR "/scenarios/orvane_gust.toml",
                                           {"run.duration=60", variants[v][0], variants[v][1]});
  long calls = 0, switches = 0;
  for (auto _ : st) {
    const fp::RunOutcome r = fp::run_scenario(s, fp::ControlsChoice::both);
    calls += r.held->stats.derivative_calls + r.free->stats.derivative_calls;
    switches += r.free->stats.friction_switches;
  }
  const auto it = static_cast<double>(st.iterations());
  st.counters["derivative_calls_per_pair"] = benchmark::Counter(static_cast<double>(calls) / it);
  st.counters["friction_switches"] = benchmark::Counter(static_cast<double>(switches) / it);
}
BENCHMARK(circuit_nonlinear)->DenseRange(0, 3)->Unit(benchmark::kMillisecond);

void derivative(benchmark::State& st) {
  const auto& s = demo();
  const auto plant = fp::scenario_plant(s);
  const fp::Trim t = fp::scenario_trim(*plant, s);
  fp::Controls c = t.controls;
  c.stick = fp::Stick::free;
  const fp::GustField g = fp::scenario_gust_field(s);
  fp::State d{};
  for (auto _ : st) {
    fp::derivatives(*plant, g, t.x, c, 1.0, d);
    benchmark::DoNotOptimize(d.data());
  }
  st.counters["calls_per_s"] = benchmark::Counter(static_cast<double>(st.iterations()), benchmark::Counter::kIsRate);
}
BENCHMARK(derivative);

// A CG sweep of 100 points with trim, margins, modes and a 30 s held-and-free run each, on the
// machine's cores (goal: under 1 s on 2 cores). Args: jobs, and 1 to include the refinement of
// the three-way divergence boundary (eigenvalue and time-domain bisections) on top.
void cg_sweep_100(benchmark::State& st) {
  fp::SweepSpec spec;
  spec.scenario = FP_SOURCE_DIR "/scenarios/orvane_gust.toml";
  const fp::Scenario base = fp::load_scenario(spec.scenario);
  spec.vary.push_back(fp::parse_vary(base, "cg=0.20:0.3980:0.002"));
  spec.run_seconds = 30.0;
  spec.find_boundary = st.range(1) != 0;
  const int jobs = static_cast<int>(st.range(0));
  for (auto _ : st) {
    fp::SweepResult r = fp::run_sweep(spec, jobs, false);
    benchmark::DoNotOptimize(r.points.data());
    st.counters["points"] = static_cast<double>(r.points.size());
  }
}
BENCHMARK(cg_sweep_100)->Args({1, 0})->Args({2, 0})->Args({2, 1})->Unit(benchmark::kMillisecond)->UseRealTime();

// Turbulence: 20 seeds x 300 s of moderate Dryden turbulence, held and free (40 runs), with the
// statistics of each (goal: under 2 s on 2 cores). Arg: jobs. The scenario's tolerances
// (rel 1e-5, abs 1e-6) and 50 Hz output are those of scenarios/orvane_turbulence.toml.
void turbulence_20_seeds(benchmark::State& st) {
  const fp::Scenario s = fp::load_scenario(FP_SOURCE_DIR "/scenarios/orvane_turbulence.toml");
  const int jobs = static_cast<int>(st.range(0));
  for (auto _ : st) {
    const fp::SeedsResult r = fp::run_seeds(s, fp::ControlsChoice::both, 20, jobs, false);
    benchmark::DoNotOptimize(r.runs.data());
    st.counters["runs"] = 2.0 * static_cast<double>(r.runs.size());
  }
}
BENCHMARK(turbulence_20_seeds)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(3);

}  // namespace

BENCHMARK_MAIN();
