// test_envelope.cpp — the envelope, not one point: the criteria table (every finding cites only
// its rows, the page shows it, the quoted 14 CFR 23.155 line by hand), calibrated airspeed
// against the incompressible limit, the conditions matrix (a corner alone equals the same corner
// inside a parallel matrix run, bit for bit; a corner that cannot be computed is a failure row),
// the matrix case file's bad input, and the report's first page built around the stated envelope.
#include <doctest/doctest.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/envelope.hpp"
#include "model/atmosphere.hpp"
#include "model/trim.hpp"
#include "model/units.hpp"
#include "report/criteria.hpp"
#include "scenario/matrix_case.hpp"
#include "scenario/scenario.hpp"

#include "shell.hpp"  // after the project's headers (see there)

namespace fs = std::filesystem;

namespace {

using fp::test::Out;
using fp::test::shell;
using fp::test::slurp;

const std::string kExe = std::string(FP_BINARY_DIR) + "/floatpitch";
const std::string kSrc = FP_SOURCE_DIR;
const std::string kAft = kSrc + "/scenarios/orvane_aft_cg.toml";

// Bit-for-bit equality of two doubles (NaN equal to NaN of the same bits).
bool same(double a, double b) { return std::memcmp(&a, &b, sizeof a) == 0; }

void check_same_release(const fp::Release& a, const fp::Release& b) {
  CHECK(same(a.force, b.force));
  CHECK(same(a.v_min, b.v_min));
  CHECK(same(a.v_max, b.v_max));
  CHECK(same(a.n_min, b.n_min));
  CHECK(same(a.n_max, b.n_max));
  CHECK(same(a.alpha_max, b.alpha_max));
  CHECK(same(a.time, b.time));
  CHECK(a.departed == b.departed);
  CHECK(a.stall == b.stall);
  CHECK(a.failure == b.failure);
}

}  // namespace

TEST_CASE("criteria table: every topic of every basis names rows of the one table, texts are quoted or absent") {
  for (const auto& b : fp::bases()) {
    CAPTURE(b.key);
    const auto rows = fp::criteria_for(b.key);
    std::set<std::string> shown;
    for (const auto* c : rows) shown.insert(c->id);
    for (const fp::Topic t :
         {fp::Topic::static_stability, fp::Topic::force_slope, fp::Topic::free_return, fp::Topic::maneuver_force,
          fp::Topic::short_period, fp::Topic::release, fp::Topic::divergence, fp::Topic::cg_limits, fp::Topic::boundary,
          fp::Topic::uncertainty}) {
      const auto ids = fp::criteria_ids(b.key, t);
      CHECK_FALSE(ids.empty());
      for (const auto& id : ids) {
        CAPTURE(id);
        CHECK(fp::find_criterion(id) != nullptr);
        CHECK(shown.count(id) == 1);  // a finding of this basis cites only rows the page shows
      }
    }
  }
  for (const auto& c : fp::criteria_table()) {
    CAPTURE(c.id);
    const std::string text = c.text, src = c.source;
    if (c.status == fp::TextStatus::verbatim || c.status == fp::TextStatus::verbatim_partial) {
      CHECK_FALSE(text.empty());
      CHECK_FALSE(src.empty());  // a quoted text names the copy it was taken from
    } else {
      CHECK(text.empty());  // no text where none was retrieved: never a paraphrase
      CHECK_FALSE(std::string(c.text_note).empty());
    }
    CHECK(src.find("http") == std::string::npos);  // the page names no URL it could fetch
  }
}

TEST_CASE("criteria: the 14 CFR 23.155(a)(2) stick-force line by hand from the quoted text") {
  // "For stick controls, W/140 (where W is the maximum weight) or 15 pounds, whichever is greater,
  // except that it need not be greater than 35 pounds" (14 CFR 23.155(a)(2), 1-1-14 edition)
  const auto* c = fp::find_criterion("14 CFR 23.155");
  REQUIRE(c != nullptr);
  CHECK(std::string(c->text).find("W/140 (where W is the maximum weight) or 15 pounds") != std::string::npos);
  CHECK(fp::stick_force_minimum_23_155_lbf(1653.0) == doctest::Approx(15.0));        // 1653/140 = 11.8 < 15
  CHECK(fp::stick_force_minimum_23_155_lbf(3500.0) == doctest::Approx(25.0));        // 3500/140
  CHECK(fp::stick_force_minimum_23_155_lbf(2800.0) == doctest::Approx(20.0));        // 2800/140
  CHECK(fp::stick_force_minimum_23_155_lbf(6000.0) == doctest::Approx(35.0));        // 42.9, capped at 35
}

TEST_CASE("calibrated airspeed: equals TAS at sea level, tends to EAS at low Mach, above it by compressibility") {
  // At sea level ISA the indicator's calibration is the true airspeed (common practice).
  CHECK(fp::calibrated_airspeed(50.0, 0.0) == doctest::Approx(50.0).epsilon(1e-12));
  CHECK(fp::calibrated_airspeed(120.0, 0.0) == doctest::Approx(120.0).epsilon(1e-12));
  // Aloft, CAS lies just above EAS = TAS sqrt(rho/rho0): the impact pressure grows faster than
  // the dynamic pressure with Mach (q_c = q (1 + M^2/4 + ...), isentropic flow, common practice).
  const double z = 3048.0, tas = 60.0;
  const auto a = fp::isa_at(fp::geopotential_altitude(z));
  const double eas = tas * std::sqrt(a.density / fp::isa::rho0);
  const double cas = fp::calibrated_airspeed(tas, z);
  CHECK(cas > eas);
  // first order: CAS/EAS = sqrt((1 + M^2/4) / (1 + M0^2/4)), M0 the sea-level Mach of the CAS
  const double M = tas / a.sound_speed, M0 = cas / fp::isa_at(0.0).sound_speed;
  CHECK(cas / eas == doctest::Approx(std::sqrt((1 + M * M / 4) / (1 + M0 * M0 / 4))).epsilon(1e-4));
  CHECK_THROWS(fp::calibrated_airspeed(400.0, 0.0));
}

TEST_CASE("matrix: a corner alone equals the same corner inside a parallel matrix run, bit for bit") {
  const fp::Scenario s = fp::load_scenario(kAft, {});
  auto corners = fp::envelope_corners(s);
  REQUIRE(corners.size() == 4);  // aft and forward CG at the heaviest, then at the lightest stated mass
  CHECK(corners[0].cg == s.envelope.cg_aft);
  CHECK(corners[1].cg == s.envelope.cg_forward);
  CHECK(corners[0].mass == s.envelope.mass_max);
  CHECK(corners[2].mass == s.envelope.mass_min);
  fp::Corner slow;  // a trim speed below the 1 g stall speed cannot be trimmed: a failure row
  slow.label = "below the stall";
  slow.airspeed = 0.5 * fp::stall_speed(s.airplane, s.condition.altitude);
  corners.push_back(slow);
  const auto all = fp::run_matrix(s, corners, 2, false);
  REQUIRE(all.size() == 5);
  CHECK_FALSE(all[4].ok);
  CHECK_FALSE(all[4].failure.empty());
  for (std::size_t i = 0; i < 4; ++i) {
    CAPTURE(i);
    const fp::CornerResult one = fp::compute_corner(s, corners[i]);
    const fp::CornerResult& in = all[i];
    REQUIRE(one.ok);
    REQUIRE(in.ok);
    CHECK(in.in_envelope);
    CHECK(same(one.margins.margin_free, in.margins.margin_free));
    CHECK(same(one.margins.margin_fixed, in.margins.margin_fixed));
    CHECK(same(one.margins.force_gradient, in.margins.force_gradient));
    CHECK(same(one.margins.force_per_g, in.margins.force_per_g));
    CHECK(same(one.margins.free_return_low, in.margins.free_return_low));
    CHECK(same(one.margins.free_return_high, in.margins.free_return_high));
    CHECK(same(one.force_at_limit, in.force_at_limit));
    CHECK(same(one.calibrated, in.calibrated));
    CHECK(same(one.worst_free.root.real(), in.worst_free.root.real()));
    CHECK(same(one.worst_held.root.real(), in.worst_held.root.real()));
    CHECK(same(one.sp_held.damping, in.sp_held.damping));
    check_same_release(one.release_up, in.release_up);
    check_same_release(one.release_down, in.release_down);
    // the held force before the release: a pull above trim is a push (F < 0) and below a pull
    // with a stable stick-force slope (the sign convention of model/state.hpp)
    if (in.margins.force_gradient < 0) {
      CHECK(in.release_up.force < 0);
      CHECK(in.release_down.force > 0);
    }
    // the force at the limit load factor is the per-g slope times (n - 1)
    CHECK(in.force_at_limit == doctest::Approx(in.margins.force_per_g * (s.envelope.limit_load_factor - 1.0)));
  }
  // the aft corner is less stable hands-off than the forward one
  CHECK(all[0].margins.margin_free < all[1].margins.margin_free);
}

TEST_CASE("matrix case file: grid, corners, envelope, bad input names file, line and key") {
  SUBCASE("a grid makes every combination, in SI") {
    const auto mc = fp::parse_matrix_case(
        "envelope = true\n[grid]\ncg = [0.2, 0.3]\naltitude = [\"0 ft\", \"1000 ft\", \"2000 ft\"]\n"
        "[[corner]]\nlabel = \"slow\"\nairspeed = \"80 kt\"\n",
        "case.toml");
    CHECK(mc.envelope);
    REQUIRE(mc.corners.size() == 7);
    std::set<std::pair<double, double>> seen;
    for (std::size_t i = 0; i < 6; ++i) seen.insert({mc.corners[i].cg, mc.corners[i].altitude});
    CHECK(seen.size() == 6);
    CHECK(seen.count({0.3, 2000 * 0.3048}) == 1);  // 1 ft = 0.3048 m (international foot)
    CHECK(mc.corners[6].label == "slow");
    CHECK(mc.corners[6].airspeed == doctest::Approx(80 * 1852.0 / 3600.0));
    CHECK(std::isnan(mc.corners[6].cg));
  }
  SUBCASE("bad input") {
    auto err = [](const std::string& text) -> fp::ScenarioError {
      try {
        fp::parse_matrix_case(text, "case.toml");
      } catch (const fp::ScenarioError& e) {
        return e;
      }
      FAIL("no error");
      return {};
    };
    auto e = err("[grid]\nmass = [\"800 furlongs\"]\n");
    CHECK(e.file == "case.toml");
    CHECK(e.line == 2);
    CHECK(e.key == "grid.mass");
    CHECK(e.message.find("unknown unit") != std::string::npos);
    e = err("[[corner]]\ncg = 3.0\n");
    CHECK(e.key == "corner.cg");
    CHECK(e.message.find("mass.cg") != std::string::npos);
    e = err("[[corner]]\nlabel = \"x\"\n");
    CHECK(e.key == "corner");
    e = err("envelope = false\n");
    CHECK(e.message.find("no corner") != std::string::npos);
    e = err("corners = 1\n");
    CHECK(e.key == "corners");
  }
}

TEST_CASE("floatpitch matrix: the envelope's corners and a case file, bad input exits 2") {
  const Out r = ::shell(kExe + " matrix " + kAft + " --json --jobs 2");
  CAPTURE(r.text);
  REQUIRE(r.status == 0);
  const auto j = nlohmann::json::parse(r.text);
  REQUIRE(j["corners"].size() == 4);
  CHECK(j.contains("caution"));
  for (const auto& c : j["corners"]) CHECK(c["ok"] == true);
  // the bundled case: the envelope's 4 corners and a grid of 1 CG x 2 altitudes x 2 speeds
  const Out c = ::shell(kExe + " matrix " + kAft + " --json --cases " + kSrc + "/scenarios/matrix/orvane_corners.toml");
  REQUIRE(c.status == 0);
  const auto cj = nlohmann::json::parse(c.text);
  REQUIRE(cj["corners"].size() == 8);
  // the first four are the envelope's, identical to the run without the case file
  for (int k = 0; k < 4; ++k) CHECK(cj["corners"][k] == j["corners"][k]);
  const Out bad = ::shell(kExe + " matrix " + kAft + " --cases /nonexistent/case.toml");
  CHECK(bad.status == 2);
  CHECK(bad.text.find("/nonexistent/case.toml") != std::string::npos);
}

TEST_CASE("floatpitch report: the first page is the stated envelope, the criteria table, findings cite only its rows") {
  const fs::path out = fs::path(FP_BINARY_DIR) / "test_envelope" / "rep";
  fs::remove_all(out);
  const Out r = ::shell(kExe + " report " + kAft + " --out " + out.string() + " --jobs 2 --samples 4");
  CAPTURE(r.text);
  REQUIRE(r.status == 0);
  const std::string html = slurp(out / "report.html");
  const auto first = html.substr(0, html.find("id=\"s1\""));
  // the demo's CG (38 % MAC) lies aft of its stated aft limit (30 %): page one says so
  CHECK(first.find("The analysed point lies outside the stated envelope") != std::string::npos);
  CHECK(first.find("The stated envelope against the criteria") != std::string::npos);
  CHECK(first.find("aft CG") != std::string::npos);
  CHECK(first.find("forward CG") != std::string::npos);
  CHECK(first.find(" CAS (") != std::string::npos);  // speeds in CAS beside TAS
  CHECK(first.find(" lbf (") != std::string::npos);  // forces in lbf beside N
  // the criteria table: every row of the basis on the page, once
  const auto tab_at = html.find("<table id=\"criteria\"");
  REQUIRE(tab_at != std::string::npos);
  const std::string table = html.substr(tab_at, html.find("</table>", tab_at) - tab_at);
  for (const auto* c : fp::criteria_for(fp::kDefaultBasis)) {
    CAPTURE(c->id);
    CHECK(table.find("<b>" + std::string(c->id) + "</b>") != std::string::npos);
  }
  // the quoted texts are on the page as quoted
  CHECK(table.find("W/140 (where W is the maximum weight) or 15 pounds, whichever is greater") != std::string::npos);
  // every finding cites rows of that table, and only those
  const auto findings = nlohmann::json::parse(slurp(out / "data/findings.json"));
  REQUIRE(findings["findings"].size() >= 6);
  for (const auto& f : findings["findings"]) {
    CAPTURE(f.dump());
    REQUIRE(f["criteria"].size() >= 1);
    for (const auto& id : f["criteria"]) CHECK(table.find("<b>" + id.get<std::string>() + "</b>") != std::string::npos);
  }
  // the envelope finding's worst corner is the first column of the page's table
  const std::string worst = findings["findings"][0]["measured"].get<std::string>();
  const auto head = first.find("<th>criterion, line");
  REQUIRE(head != std::string::npos);
  const auto th2 = first.find("<th>", head + 4);
  const std::string col1 = first.substr(th2 + 4, first.find("<br>", th2) - th2 - 4);
  CAPTURE(col1);
  CHECK(worst.find("Worst of 4 corners: " + col1) != std::string::npos);
  // the corners' data file has a row a corner
  const std::string csv = slurp(out / "data/envelope_corners.csv");
  CHECK(std::count(csv.begin(), csv.end(), '\n') == 5);
}

TEST_CASE("matrix: the release verdicts hold when the integrator tolerance is ten times tighter and looser") {
  // a numerical setting must not decide a physical answer (the project's rule): the release's
  // load-factor range and verdict at the aft corner, with run.rel_tol / 10 and * 10
  const fp::Scenario s = fp::load_scenario(kAft, {});
  const auto corners = fp::envelope_corners(s);
  const fp::CornerResult ref = fp::compute_corner(s, corners[0]);
  REQUIRE(ref.ok);
  for (const double f : {0.1, 10.0}) {
    CAPTURE(f);
    fp::Scenario t = s;
    t.run.rel_tol = s.run.rel_tol * f;
    const fp::CornerResult r = fp::compute_corner(t, corners[0]);
    REQUIRE(r.ok);
    for (const auto& [a, b] : {std::pair{&ref.release_up, &r.release_up}, std::pair{&ref.release_down, &r.release_down}}) {
      CHECK(a->departed == b->departed);
      CHECK(a->stall == b->stall);
      CHECK(b->n_max == doctest::Approx(a->n_max).epsilon(1e-3));
      CHECK(b->n_min == doctest::Approx(a->n_min).epsilon(1e-3));
      CHECK(b->v_min == doctest::Approx(a->v_min).epsilon(1e-3));
    }
  }
}
