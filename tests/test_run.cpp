// test_run.cpp — run verdicts (departure criteria), the timing of a scenario's disturbances, the
// free-to-held ratio, the seeded generator and the axis ticks. The source of each check is named
// beside it; the airplanes are invented (tests/support.hpp, scenarios/aircraft), their numbers
// are not what is checked.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <limits>
#include <memory>
#include <string>
#include <vector>

#include "model/trim.hpp"
#include "model/units.hpp"
#include "output/response_text.hpp"
#include "run/gust_field.hpp"
#include "run/run.hpp"
#include "scenario/gust_timing.hpp"
#include "scenario/scenario.hpp"
#include "support.hpp"
#include "util/rng.hpp"
#include "util/ticks.hpp"

using namespace fp;
using doctest::Approx;

namespace {

// The motor-glider let go with its tab 1 deg off the hands-off trim at 5 s: before the
// departure criteria below existed it flew past the vertical, to five times its trim speed and
// below sea level, and was reported as "no departure".
const char* kTabDive = R"(include = "aircraft/corrimo_mg.toml"
[scenario]
name = "tab offset, hands off"
[condition]
altitude = "2000 ft"
airspeed = "65 kt"
[trim]
tab = "auto"
[run]
duration = 40.0
let_go_time = 2.0
controls = "free"
[[event]]
time = 5.0
action = "tab"
tab = "1 deg"
)";

Scenario tab_dive() {
  const std::string dir = (std::filesystem::path(FP_SOURCE_DIR) / "scenarios").string();
  return parse_scenario(kTabDive, "tab_dive.toml", dir);
}

// Every bound out of the way (the widest values the key table allows), so that one at a time
// can be tested.
void open_all_bounds(Scenario& s) {
  s.run.alpha_limit = 1.5;
  s.run.q_limit = 10.0;
  s.run.min_airspeed_ratio = 0.05;
  s.run.max_airspeed_ratio = 20.0;
  s.envelope.max_speed = 0.0;
  s.run.floor_altitude = -1000.0;
  s.run.theta_limit = units::deg * 180.0;
  s.run.load_factor_max = 20.0;
  s.run.load_factor_min = -20.0;
}

// The recorded grid (the CSV) agrees with the verdict: every row before the departure time is
// within the bound, a row at or after it (the grid row that found it) is beyond, and the time
// is no more than one output step after the last row within.
void check_crossing(const CaseResult& c, std::size_t ch, double bound, bool above, bool absolute = false) {
  const Trace& tr = c.trace;
  REQUIRE(c.departure.departed);
  const double td = c.departure.time;
  auto value = [&](std::size_t i) { return absolute ? std::abs(tr.ch[ch][i]) : tr.ch[ch][i]; };
  auto beyond = [&](double v) { return above ? v > bound : v < bound; };
  double last_within = 0.0;
  for (std::size_t i = 0; i < tr.size(); ++i) {
    if (tr.ch[ch_time][i] < td) {
      CHECK_FALSE(beyond(value(i)));
      last_within = tr.ch[ch_time][i];
    } else {
      CHECK(beyond(value(i)));
    }
  }
  CHECK(td > last_within);
  CHECK(td <= last_within + (tr.ch[ch_time][1] - tr.ch[ch_time][0]) + 1e-9);
}

}  // namespace

TEST_CASE("departure: the airspeed criterion reads the air-relative airspeed the CSV prints") {
  // A sharp-edged tail gust of 0.6 V takes the wing's airspeed to 0.4 V at once (the air-relative
  // speed is the speed minus the gust, state.hpp sign conventions) while the airplane's speed
  // over the ground has not changed: the 50 % criterion must fire when the wing meets the
  // gust, at t = (start - wing offset) / V (frozen field, model/gust.hpp).
  const Airplane a = test::plain_airplane();
  const Condition c = test::cruise(55.0, 1000.0);
  const auto plant = std::make_shared<const Plant>(make_plant(a));
  const Trim trim = trim_held(*plant, c, 0.0);
  GustField g;
  DiscreteGust d;
  d.shape = GustShape::sharp_edge;
  d.component = GustComponent::horizontal;
  d.amplitude = 0.6 * trim.airspeed;
  d.start = 100.0;
  g.gusts.push_back(d);
  RunSettings rs;
  rs.duration = 5.0;
  rs.output_step = 0.01;
  Simulation sim(plant, g, trim, rs, RunCase{Stick::held, 0.0}, {});
  sim.run_to_end();
  const Departure& dep = sim.departure();
  REQUIRE(dep.departed);
  CHECK(dep.criterion == "underspeed");
  const double th = trim.x[sx::theta];
  const double t_wing = (d.start - (plant->rW_x * std::cos(th) + plant->rW_z * std::sin(th))) / trim.airspeed;
  CHECK(dep.time == Approx(t_wing).epsilon(1e-6));
  // the CSV's airspeed (output_row, the evaluation that writes the CSV): within on every
  // recorded row, below half the trim speed in the state the run stopped in
  const Trace& tr = sim.trace();
  REQUIRE(tr.size() >= 2);
  for (std::size_t i = 0; i < tr.size(); ++i)
    if (tr.ch[ch_time][i] < dep.time) CHECK(tr.ch[ch_airspeed][i] >= 0.5 * trim.airspeed);
  const auto last = output_row(*plant, g, sim.time(), sim.state(), sim.controls());
  CHECK(last[ch_airspeed] < 0.5 * trim.airspeed);
  // the speed over the ground (the state's u, w) is still about the trim speed
  CHECK(std::hypot(sim.state()[sx::u], sim.state()[sx::w]) > 0.9 * trim.airspeed);
}

TEST_CASE("departure: the hands-off tab dive is called before it leaves the sky") {
  // Common practice: a run that pitches past the vertical, reaches five times its trim speed
  // and goes below sea level has departed long before; with the default bounds the verdict must
  // come while the airplane is still above ground, less than vertical and below twice trim.
  const Scenario s = tab_dive();
  const RunOutcome o = run_scenario(s, ControlsChoice::free);
  REQUIRE(o.free);
  const CaseResult& c = *o.free;
  REQUIRE(c.departure.departed);
  CHECK(c.departure.time > 5.0);
  CHECK(c.departure.time < 40.0);
  const Trace& tr = c.trace;
  for (std::size_t i = 0; i < tr.size(); ++i) {
    CHECK(tr.ch[ch_altitude][i] > 0.0);
    CHECK(std::abs(tr.ch[ch_theta][i]) < units::deg * 90.0);
    CHECK(tr.ch[ch_airspeed][i] < 2.0 * o.trim.airspeed);
  }
  INFO("criterion: ", c.departure.criterion, ", reason: ", c.departure.reason);
  CHECK_FALSE(c.departure.reason.empty());
}

TEST_CASE("departure: each stated bound is called where the recorded output crosses it") {
  Scenario s = tab_dive();
  open_all_bounds(s);
  const double V0 = s.condition.airspeed;
  SUBCASE("overspeed beyond the aircraft's stated envelope.max_speed") {
    s.envelope.max_speed = 1.3 * V0;
    const RunOutcome o = run_scenario(s, ControlsChoice::free);
    CHECK(o.free->departure.criterion == "overspeed");
    CHECK(o.free->departure.reason.find("envelope.max_speed") != std::string::npos);
    check_crossing(*o.free, ch_airspeed, 1.3 * V0, true);
  }
  SUBCASE("overspeed beyond the stated multiple of trim when no envelope speed is stated") {
    s.run.max_airspeed_ratio = 1.3;
    const RunOutcome o = run_scenario(s, ControlsChoice::free);
    CHECK(o.free->departure.criterion == "overspeed");
    check_crossing(*o.free, ch_airspeed, 1.3 * o.trim.airspeed, true);
  }
  SUBCASE("floor altitude") {
    s.run.floor_altitude = s.condition.altitude - 100.0;
    const RunOutcome o = run_scenario(s, ControlsChoice::free);
    CHECK(o.free->departure.criterion == "floor");
    check_crossing(*o.free, ch_altitude, s.run.floor_altitude, false);
  }
  SUBCASE("pitch attitude") {
    s.run.theta_limit = units::deg * 30.0;
    const RunOutcome o = run_scenario(s, ControlsChoice::free);
    CHECK(o.free->departure.criterion == "pitch_attitude");
    check_crossing(*o.free, ch_theta, units::deg * 30.0, true, true);
  }
}

TEST_CASE("the bundled let-go case: hands off with the tab set for a lower speed, the airplane slows") {
  // Stick-free speed stability (positive stick-free static margin, as `floatpitch margins`
  // reports for this airplane): let go with the tab set for a lower speed, the airplane settles
  // towards a lower speed in a phugoid and does not depart (e.g. Perkins and Hage, Airplane
  // Performance, Stability and Control, 1949, ch. 5, stick-free stability). Held, it stays.
  const Scenario s = load_scenario((std::filesystem::path(FP_SOURCE_DIR) / "scenarios" / "corrimo_letgo.toml").string());
  const RunOutcome o = run_scenario(s, ControlsChoice::both);
  REQUIRE(o.held);
  REQUIRE(o.free);
  CHECK_FALSE(o.held->departure.departed);
  CHECK_FALSE(o.free->departure.departed);
  CHECK(o.trim.stick_force < 0.0);  // held at 65 kt with the tab for 60 kt: a push
  const Trace& tr = o.free->trace;
  double sum = 0;
  long n = 0;
  for (std::size_t i = 0; i < tr.size(); ++i)
    if (tr.ch[ch_time][i] >= tr.ch[ch_time].back() - 60.0) {
      sum += tr.ch[ch_airspeed][i];
      ++n;
    }
  REQUIRE(n > 0);
  const double mean = sum / static_cast<double>(n);
  CHECK(mean < o.trim.airspeed - 1.0);
  CHECK(mean > 0.8 * o.trim.airspeed);
  const Trace& th = o.held->trace;
  double worst = 0.0;
  for (std::size_t i = 0; i < th.size(); ++i) worst = std::max(worst, std::abs(th.ch[ch_airspeed][i] - o.trim.airspeed));
  CHECK(worst < 1e-3 * o.trim.airspeed);
}

TEST_CASE("departure: a trim already beyond a bound is bad input naming the key") {
  Scenario s = tab_dive();
  s.run.floor_altitude = s.condition.altitude + 10.0;
  try {
    (void)run_scenario(s, ControlsChoice::free);
    FAIL("no error");
  } catch (const ScenarioError& e) {
    CHECK(e.key == "run.floor_altitude");
    CHECK(e.message.find("beyond") != std::string::npos);
  }
}

TEST_CASE("free-to-held ratio: magnitudes of the same sign, none for opposite signs") {
  // hand computations: |-1.2| / |-0.6| = 2; a free -1.625 against a held +0.918 has no ratio
  CHECK(free_to_held_ratio(-1.2, -0.6) == Approx(2.0));
  CHECK(free_to_held_ratio(0.9, 0.3) == Approx(3.0));
  CHECK(std::isnan(free_to_held_ratio(-1.625, 0.918)));
  CHECK(std::isnan(free_to_held_ratio(1.0, 0.0)));
  CHECK(std::isnan(free_to_held_ratio(0.1, 1e-9)));  // a held run that stayed in trim: noise only
  CHECK(opposite_signs(-1.625, 0.918));
  CHECK_FALSE(opposite_signs(-1.625, -0.918));
  CaseSummary h, f;
  h.response.peak_dn = 0.918;
  f.response.peak_dn = -1.625;
  const std::string table = comparison_table(&h, &f);
  CHECK(table.find("opp. sign") != std::string::npos);
  CHECK(table.find("1.77") == std::string::npos);
}

TEST_CASE("end of the disturbances: a train counts to its last gust and the tail's gust is zero from then on") {
  Scenario s;
  s.airplane = test::plain_airplane();
  s.condition = test::cruise(55.0, 1000.0);
  s.gust_front_speed = 5.0;
  DiscreteGust g;
  g.shape = GustShape::train;
  g.count = 3;
  g.spacing = 40.0;
  g.length = 10.0;
  g.amplitude = 2.0;
  g.start = 100.0;
  s.gusts.push_back(g);
  s.events.push_back(Event{2.0, EventKind::tab, 0.01, 0.0, 0});
  // by hand: closing speed 55 + 5 = 60 m/s; the train ends at 100 + 2 x 40 + 2 x 10 = 200 m;
  // CG to tail a.c. 4.8 - 0.25 x 1.3 = 4.475 m: (200 + 4.475) / 60 s
  CHECK(gust_closing_speed(s) == Approx(60.0));
  const double t_end = (200.0 + 4.475) / 60.0;
  CHECK(disturbances_over_time(s) == Approx(t_end));
  // the gust field the runs fly through agrees: at the tail's position (X + front t, the tail
  // 4.475 m behind the CG at zero attitude) the field is zero after t_end and not just before
  const GustField f = scenario_gust_field(s);
  auto tail_gust = [&](double t) { return f.at(55.0 * t - 4.475, t).w; };
  CHECK(tail_gust(t_end + 1e-3) == 0.0);
  CHECK(std::abs(tail_gust(t_end - 0.05)) > 0.01);
  // a later event is the end
  s.events.push_back(Event{5.0, EventKind::pulse, 10.0, 1.5, 0});
  CHECK(disturbances_over_time(s) == Approx(6.5));
}

TEST_CASE("closing speed: the gust start times and the turbulence record use the same one") {
  const std::string dir = (std::filesystem::path(FP_SOURCE_DIR) / "scenarios").string();
  const Scenario s = parse_scenario(R"(include = "aircraft/corrimo_mg.toml"
[condition]
altitude = 600.0
airspeed = 40.0
flight_path = -0.05
[run]
gust_front_speed = 3.0
[turbulence]
model = "dryden"
[[gust]]
shape = "one_minus_cosine"
length = 15.0
amplitude = 2.0
start_time = 4.0
)",
                                    "closing.toml", dir);
  // by hand: 40 cos(-0.05) + 3 m/s
  const double V = 40.0 * std::cos(-0.05) + 3.0;
  CHECK(gust_closing_speed(s) == Approx(V));
  CHECK(s.gusts[0].start == Approx(V * 4.0));
  CHECK(resolve_turbulence(s).closing_speed == Approx(V));
}

TEST_CASE("seeded normal deviates: moments and the one-sigma fraction of the normal law") {
  // Normal law: mean 0, variance 1, P(|z| < 1) = 0.682689 (any table of the normal
  // distribution); with n = 200000 the sampling errors are about 0.0022, 0.0032 and 0.0010.
  SeededRng r(7, 3);
  const int n = 200000;
  double sum = 0, sum2 = 0;
  long inside = 0;
  for (int i = 0; i < n; ++i) {
    const double z = r.normal();
    sum += z;
    sum2 += z * z;
    inside += std::abs(z) < 1.0 ? 1 : 0;
  }
  CHECK(std::abs(sum / n) < 0.01);
  CHECK(sum2 / n == Approx(1.0).epsilon(0.015));
  CHECK(static_cast<double>(inside) / n == Approx(0.682689).epsilon(0.007));
  // the same (seed, stream) repeats; another stream differs
  SeededRng a(7, 3), b(7, 3), c(7, 4);
  const double x = a.uniform();
  CHECK(x == b.uniform());
  CHECK(x != c.uniform());
  CHECK(x > 0.0);
  CHECK(x < 1.0);
}

TEST_CASE("axis ticks: 1-2-5 steps, nearest or at most the target count") {
  // by hand: range 7 over 6 intervals is a raw step of 1.17: nearest 1, at most 6 intervals 2
  CHECK(tick_step(7.0, 6, TickFit::nearest) == Approx(1.0));
  CHECK(tick_step(7.0, 6, TickFit::at_most) == Approx(2.0));
  // raw 0.04: nearest 0.05 (4 is above the 3.5 switch), at most: 0.05
  CHECK(tick_step(0.4, 10, TickFit::nearest) == Approx(0.05));
  CHECK(tick_step(0.4, 10, TickFit::at_most) == Approx(0.05));
  const std::vector<double> v = tick_values(-0.3, 1.05, 0.5);
  REQUIRE(v.size() == 3);
  CHECK(v[0] == 0.0);
  CHECK(std::signbit(v[0]) == false);
  CHECK(v[1] == Approx(0.5));
  CHECK(v[2] == Approx(1.0));
}

TEST_CASE("report: a sampled run that fails keeps its reason in its row") {
  // Samples with the CG far forward cannot be trimmed (the tab range runs out): each such row of
  // uncertainty_responses.csv must say why, and carry no number that looks computed.
  const std::string exe = std::string(FP_BINARY_DIR) + "/floatpitch";
  const std::filesystem::path out = std::filesystem::path(FP_BINARY_DIR) / "test_run" / "report_failures";
  std::filesystem::remove_all(out);
  const std::string cmd = exe + " report " + std::string(FP_SOURCE_DIR) + "/scenarios/orvane_aft_cg.toml --out " +
                          out.string() + " --samples 10 --sample 'cg=uniform(-0.5,0.3)' --jobs 2 > /dev/null 2>&1";
  REQUIRE(std::system(cmd.c_str()) == 0);
  std::ifstream in(out / "data" / "uncertainty_responses.csv");
  REQUIRE(in);
  std::string header;
  std::getline(in, header);
  CHECK(header.substr(header.rfind(',') + 1) == "failure");
  int failed = 0, ran = 0;
  for (std::string line; std::getline(in, line);) {
    const auto q = line.find('"');
    if (q == std::string::npos) {
      ++ran;
      continue;
    }
    ++failed;
    CHECK(line.find("trim") != std::string::npos);
    // index,cg,np_free,max_real_free,...: the free neutral point and root are empty
    std::vector<std::string> cells;
    std::stringstream ls(line.substr(0, q));
    for (std::string c; std::getline(ls, c, ',');) cells.push_back(c);
    REQUIRE(cells.size() >= 4);
    CHECK(cells[2].empty());
    CHECK(cells[3].empty());
  }
  CHECK(failed > 0);
  CHECK(ran > 0);
}
