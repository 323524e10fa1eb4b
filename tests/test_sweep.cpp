// test_sweep.cpp — sweeps are deterministic, shards join to the whole, failing points are rows,
// and the three divergence-boundary methods agree on a linear-aerodynamics airplane.
#include <doctest/doctest.h>

#include <cmath>

#include <nlohmann/json.hpp>

#include "model/static.hpp"
#include "scenario/scenario.hpp"
#include "analysis/sweep.hpp"
#include "output/sweep_text.hpp"

using namespace fp;

namespace {
const std::string kLinear = std::string(FP_SOURCE_DIR) + "/tests/data/linear_airplane.toml";
const std::string kDemo = std::string(FP_SOURCE_DIR) + "/scenarios/orvane_gust.toml";

SweepSpec cg_sweep(const std::string& file, double from, double to, double step) {
  SweepSpec s;
  s.scenario = file;
  const Scenario base = load_scenario(file);
  s.vary.push_back(parse_vary(base, "cg=" + std::to_string(from) + ":" + std::to_string(to) + ":" + std::to_string(step)));
  return s;
}
}  // namespace

TEST_CASE("the three boundary methods agree within 0.005 MAC on a linear-aerodynamics airplane") {
  // Acceptance criterion of the sweep work: closed form (Etkin and Reid sec. 2.4-2.6 with the
  // constant-hinge-moment term derived in model/static.hpp), eigenvalue crossing and the
  // time-domain growth rate (matrix pencil, Hua and Sarkar 1990) must agree within 0.005 MAC.
  const SweepResult r = run_sweep(cg_sweep(kLinear, 0.40, 0.54, 0.02), 2, false);
  REQUIRE(r.has_boundary);
  for (const Boundary* b : {&r.held, &r.free}) {
    REQUIRE(std::isfinite(b->closed_form));
    REQUIRE(std::isfinite(b->eigenvalue));
    REQUIRE(std::isfinite(b->time_domain));
    CHECK(std::abs(b->eigenvalue - b->closed_form) < 0.005);
    CHECK(std::abs(b->time_domain - b->eigenvalue) < 0.005);
    CHECK(std::abs(b->time_domain - b->closed_form) < 0.005);
  }
  // the hands-off airplane diverges first, and the constant hinge moment (elevator weight)
  // puts its divergence aft of the aerodynamic stick-free neutral point
  CHECK(r.free.eigenvalue < r.held.eigenvalue - 0.02);
  CHECK(r.free.eigenvalue > r.free.closed_form_aerodynamic);
}

TEST_CASE("sweep results do not depend on the number of threads") {
  // Determinism (common practice): same numbers and row order whatever --jobs is.
  SweepSpec s = cg_sweep(kDemo, 0.20, 0.34, 0.02);
  s.run_seconds = 5.0;
  const auto a = sweep_json(run_sweep(s, 1, false));
  const auto b = sweep_json(run_sweep(s, 2, false));
  CHECK(a.dump() == b.dump());
  CHECK(a["points"].size() == 8);
}

TEST_CASE("shards merged equal the whole") {
  SweepSpec s = cg_sweep(kLinear, 0.40, 0.54, 0.02);
  const SweepResult whole = run_sweep(s, 2, false);
  SweepResult merged;
  for (int k = 0; k < 3; ++k) {
    SweepSpec sk = s;
    sk.shard_k = k;
    sk.shard_n = 3;
    const SweepResult part = sweep_from_json(sweep_json(run_sweep(sk, 1, false)));  // through the file format
    if (k == 0) {
      merged = part;
      merged.points.clear();
      merged.spec.shard_k = 0;
      merged.spec.shard_n = 1;
    }
    for (const auto& p : part.points) merged.points.push_back(p);
  }
  std::sort(merged.points.begin(), merged.points.end(), [](const PointResult& x, const PointResult& y) { return x.index < y.index; });
  compute_boundary(merged, 2);
  CHECK(sweep_json(merged).dump() == sweep_json(whole).dump());
}

TEST_CASE("a point that cannot be trimmed is a row with its reason") {
  SweepSpec s;
  s.scenario = kDemo;
  const Scenario base = load_scenario(kDemo);
  s.vary.push_back(parse_vary(base, "condition.airspeed=20:40:10"));
  const SweepResult r = run_sweep(s, 2, false);
  REQUIRE(r.points.size() == 3);
  CHECK_FALSE(r.points[0].ok);  // 20 m/s: below the stall speed
  CHECK(r.points[0].reason.find("stall") != std::string::npos);
  CHECK(r.points[2].ok);
  const std::string csv = sweep_csv(r);
  CHECK(csv.find("stall") != std::string::npos);
}

TEST_CASE("sampling: same seed, same samples, and the band brackets the nominal neutral point") {
  SweepSpec s;
  s.scenario = kDemo;
  const Scenario base = load_scenario(kDemo);
  s.sample.push_back(parse_sample(base, "elevator.ch_alpha=uniform(-0.22,-0.12)"));
  s.sample.push_back(parse_sample(base, "elevator.ch_delta=normal(-0.37,0.03)"));
  s.samples = 24;
  s.seed = 7;
  const auto a = sweep_json(run_sweep(s, 2, false));
  const auto b = sweep_json(run_sweep(s, 1, false));
  CHECK(a.dump() == b.dump());
  s.seed = 8;
  const auto c = sweep_json(run_sweep(s, 2, false));
  CHECK(a["points"][0]["inputs"].dump() != c["points"][0]["inputs"].dump());
  const auto& band = a["band"]["neutral_point_free"];
  const double nominal = closed_form(base.airplane, base.condition).np_free;
  CHECK(band["min"].get<double>() < nominal);
  CHECK(band["max"].get<double>() > nominal);
  CHECK(a["band"]["worst"]["inputs"].contains("elevator.ch_alpha"));
  // a more negative Ch_alpha floats the elevator more: the worst sample sits at the negative end
  CHECK(a["band"]["worst"]["inputs"]["elevator.ch_alpha"].get<double>() < -0.17);
}

TEST_CASE("bad sweep specifications are errors") {
  const Scenario base = load_scenario(kDemo);
  CHECK_THROWS_AS(parse_vary(base, "cg=0.3:0.2:0.01"), ScenarioError);
  CHECK_THROWS_AS(parse_vary(base, "cg=0.3:0.4"), ScenarioError);
  CHECK_THROWS_AS(parse_vary(base, "wing.aera=1:2:0.5"), ScenarioError);
  CHECK_THROWS_AS(parse_sample(base, "elevator.ch_alpha=gamma(1,2)"), ScenarioError);
}

TEST_CASE("a sweep with no crossing says which sign the deciding root keeps, and where no root was read") {
  // Forward of the closed-form stick-free point (Etkin and Reid sec. 2.4-2.6, model/static.hpp)
  // by more than 0.05 MAC the airplane is statically stable held and free, so a sweep there
  // must report no crossing as "stable at every CG" (common practice: a static margin of 5 %
  // MAC leaves the phugoid and short period stable on a conventional airplane).
  const SweepResult r = run_sweep(cg_sweep(kLinear, 0.20, 0.30, 0.05), 2, false);
  REQUIRE(r.has_boundary);
  REQUIRE(r.free.closed_form > 0.35);
  for (const Boundary* b : {&r.held, &r.free}) {
    CHECK_FALSE(std::isfinite(b->eigenvalue));
    CHECK(b->no_crossing.rfind("stable at every CG linearised, from 20.00 to 30.00 % MAC", 0) == 0);
  }
  // a crossing leaves the note empty
  const SweepResult c = run_sweep(cg_sweep(kLinear, 0.40, 0.54, 0.02), 2, false);
  CHECK(std::isfinite(c.held.eigenvalue));
  CHECK(c.held.no_crossing.empty());
}
