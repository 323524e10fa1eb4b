// test_cli.cpp — the command line as a user meets it: exit statuses, messages, outputs written
// whole or not at all, and the demo cases doing what they are for.
#include <doctest/doctest.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <sys/wait.h>

#include <nlohmann/json.hpp>

namespace fs = std::filesystem;

namespace {

const std::string kExe = std::string(FP_BINARY_DIR) + "/floatpitch";
const std::string kSrc = FP_SOURCE_DIR;

struct Result {
  int status = -1;
  std::string out;  // stdout and stderr together
};

Result run(const std::string& args) {
  Result r;
  const std::string cmd = kExe + " " + args + " 2>&1";
  FILE* p = ::popen(cmd.c_str(), "r");
  REQUIRE(p != nullptr);
  std::array<char, 4096> buf{};
  while (std::fgets(buf.data(), buf.size(), p)) r.out += buf.data();
  const int st = ::pclose(p);
  r.status = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
  return r;
}

fs::path temp_dir(const std::string& name) {
  const fs::path d = fs::path(FP_BINARY_DIR) / "test_cli" / name;
  fs::remove_all(d);
  fs::create_directories(d);
  return d;
}

// A case file that includes the demo trainer, with `extra` appended.
std::string case_file(const fs::path& dir, const std::string& extra) {
  const fs::path f = dir / "case.toml";
  std::ofstream(f) << "include = \"" << kSrc << "/scenarios/aircraft/orvane_t2.toml\"\n"
                   << "[condition]\naltitude = \"3000 ft\"\nairspeed = \"105 kt\"\n"
                   << extra;
  return f.string();
}

}  // namespace

TEST_CASE("bad input: a clear message and exit status 2, nothing written") {
  struct Bad {
    const char* name;
    std::string extra;     // appended to the case file
    std::string args;      // extra command-line arguments
    const char* expect1;   // pieces the message must contain
    const char* expect2;
  };
  const Bad cases[] = {
      {"unknown key (typo)", "[run]\ndurration = 10\n", "", "durration", "duration"},
      {"wrong type", "[run]\nduration = true\n", "", "run.duration", "6:"},
      {"unknown unit", "[run]\nduration = \"10 parsecs\"\n", "", "parsecs", "run.duration"},
      {"out of range", "[mass]\ncg = 2.5\n", "", "mass.cg", "1.5"},
      {"event outside the run", "[run]\nduration = 10\n[[event]]\ntime = 20\naction = \"let_go\"\n", "", "event",
       "10"},
      {"untrimmable condition (below the stall speed)", "", "--set condition.airspeed=30kt", "stall", "no trim"},
      {"bad --set value", "", "--set mass.cg=abc", "mass.cg", "--set"},
      {"irreversible circuit asked to float", "[circuit]\nreversible = false\n", "--controls free", "irreversible",
       "held case only"},
      {"sliding friction above the breakout", "[circuit]\nsliding_friction = \"5 N\"\n", "",
       "circuit.sliding_friction", "at most the breakout"},
      {"sliding friction's line", "[circuit]\nsliding_friction = \"5 N\"\n", "", "case.toml:6", "circuit.friction"},
      {"unknown friction law", "[circuit]\nfriction_law = \"sticky\"\n", "", "circuit.friction_law", "stiction"},
      {"negative free play", "[circuit]\nfree_play = \"-1 deg\"\n", "", "circuit.free_play", "case.toml:6"},
      {"free play without a stick mass", "[circuit]\nfree_play = \"1 deg\"\nstick_mass = 0\n", "", "circuit.free_play",
       "stick_mass > 0"},
  };
  for (const auto& b : cases) {
    CAPTURE(b.name);
    const fs::path d = temp_dir("bad");
    const std::string f = case_file(d, b.extra);
    const fs::path out = d / "out";
    const Result r = run("run " + f + " " + b.args + " --out " + out.string());
    CAPTURE(r.out);
    CHECK(r.status == 2);
    CHECK(r.out.find(b.expect1) != std::string::npos);
    CHECK(r.out.find(b.expect2) != std::string::npos);
    CHECK_FALSE(fs::exists(out));
  }
  SUBCASE("a missing file") {
    const Result r = run("check /nonexistent/floatpitch/case.toml");
    CHECK(r.status == 2);
    CHECK(r.out.find("/nonexistent/floatpitch/case.toml") != std::string::npos);
  }
  SUBCASE("an unknown option") {
    const Result r = run("run " + kSrc + "/scenarios/orvane_gust.toml --frobnicate");
    CHECK(r.status == 2);
    CHECK(r.out.find("frobnicate") != std::string::npos);
  }
}

TEST_CASE("floatpitch run writes the documented files and columns") {
  const fs::path d = temp_dir("run");
  const Result r = run("run " + kSrc + "/scenarios/orvane_gust.toml --out " + d.string() + " --quiet");
  REQUIRE(r.status == 0);
  for (const char* f : {"held.csv", "free.csv", "summary.json"}) CHECK(fs::exists(d / f));
  std::ifstream csv(d / "free.csv");
  std::string header;
  std::getline(csv, header);
  for (const char* col : {"time [s]", "airspeed [m/s]", "alpha [deg]", "q [deg/s]", "theta [deg]", "altitude [m]",
                          "load_factor [-]", "elevator [deg]", "elevator_rate [deg/s]", "tab [deg]", "stick_force [N]",
                          "hinge_moment [N m]", "alpha_tail [deg]", "gust_w_wing [m/s]", "gust_w_tail [m/s]"})
    CHECK(header.find(col) != std::string::npos);
  const auto j = nlohmann::json::parse(std::ifstream(d / "summary.json"));
  CHECK(j.contains("trim"));
  for (const char* c : {"held", "free"}) {
    CHECK(j[c]["diverged"].is_boolean());
    CHECK(j[c].contains("divergence_time_s"));
    CHECK(j[c]["peaks"]["load_factor"].contains("max"));
    CHECK(j[c]["peaks"]["load_factor"].contains("time_of_max"));
  }
}

TEST_CASE("aft-CG demo: held stays, free diverges") {
  // The demo's CG lies between the stick-free and stick-fixed neutral points (see `margins`).
  const fs::path d = temp_dir("aft");
  const Result r = run("run " + kSrc + "/scenarios/orvane_aft_cg.toml --out " + d.string() + " --quiet");
  REQUIRE(r.status == 0);
  const auto j = nlohmann::json::parse(std::ifstream(d / "summary.json"));
  CHECK(j["held"]["diverged"] == false);
  CHECK(j["free"]["diverged"] == true);
  CHECK(j["free"]["divergence_time_s"].get<double>() > 1.0);
  const Result m = run("margins " + kSrc + "/scenarios/orvane_aft_cg.toml --json");
  REQUIRE(m.status == 0);
  const auto mj = nlohmann::json::parse(m.out);
  CHECK(mj["static_margin_fixed"].get<double>() > 0.0);
  CHECK(mj["static_margin_free"].get<double>() < 0.0);
  for (const char* k : {"neutral_point_fixed", "neutral_point_free", "apparent_neutral_point_free"}) {
    CHECK(mj[k]["closed_form"].is_number());
    CHECK(mj[k]["model"].is_number());
  }
  CHECK(mj["cg_limits"]["forward"].contains("reason"));
  CHECK(mj["cg_limits"]["aft"].contains("reason"));
}

TEST_CASE("modes: held beside free, with the JSON keys documented") {
  const Result r = run("modes " + kSrc + "/scenarios/orvane_gust.toml --json");
  REQUIRE(r.status == 0);
  const auto j = nlohmann::json::parse(r.out);
  bool sp_held = false, sp_free = false, elev = false, ph = false;
  for (const auto& m : j["held"]) {
    CHECK(m.contains("frequency_rad_s"));
    CHECK(m.contains("damping_ratio"));
    CHECK((m.contains("time_to_half_s") || m.contains("time_to_double_s")));
    sp_held |= m["name"] == "short period";
    ph |= m["name"] == "phugoid";
  }
  for (const auto& m : j["free"]) {
    sp_free |= m["name"] == "short period";
    elev |= m["name"] == "elevator";
  }
  CHECK(sp_held);
  CHECK(sp_free);
  CHECK(elev);  // the free elevator adds its own mode
  CHECK(ph);
}

TEST_CASE("forces runs on every bundled case and says where the per-g curve stops") {
  // the per-g curve is trimmed in steady pull-ups at the trim speed: it must stop at the last
  // load factor that trims (the stall, a stop or the tab) instead of failing (exit 0)
  int cases = 0;
  for (const auto& e : fs::directory_iterator(kSrc + "/scenarios")) {
    if (e.path().extension() != ".toml") continue;
    ++cases;
    CAPTURE(e.path().string());
    const Result r = run("forces " + e.path().string());
    CAPTURE(r.out);
    CHECK(r.status == 0);
    CHECK(r.out.find("load_factor [-],stick_force [N]") != std::string::npos);
    CHECK(r.out.find("per-g curve") != std::string::npos);
  }
  CHECK(cases >= 4);
}

TEST_CASE("margins: CG limits from tool defaults say so, limits the user set do not") {
  const std::string f = kSrc + "/scenarios/orvane_gust.toml";
  const Result d = run("margins " + f);
  REQUIRE(d.status == 0);
  CHECK(d.out.find("tool default, not a criterion") != std::string::npos);
  const Result dj = run("margins " + f + " --json");
  REQUIRE(dj.status == 0);
  const auto j = nlohmann::json::parse(dj.out);
  CHECK(j["cg_limits"]["aft_candidates"]["minimum_static_margin"]["basis"] == "tool default, not a criterion");
  CHECK(j["cg_limits"]["aft_candidates"]["minimum_stick_force_per_g"]["basis"] == "tool default, not a criterion");
  const Result u = run("margins " + f + " --json --min-margin 0.05 --min-force-per-g 13.3");
  REQUIRE(u.status == 0);
  const auto ju = nlohmann::json::parse(u.out);
  CHECK(ju["cg_limits"]["aft_candidates"]["minimum_static_margin"]["basis"] == "set by the user");
  CHECK(ju["cg_limits"]["aft_candidates"]["minimum_stick_force_per_g"]["basis"] == "set by the user");
}

TEST_CASE("check warns on implausible but legal inputs and shows the flight condition") {
  struct Case {
    const char* name;
    std::string extra;   // appended to the case file
    const char* key;     // the key the warning names
    const char* reason;  // a piece of the reason
  };
  // each bound is explained beside its check in scenario/scenario.cpp (plausibility_warnings)
  const Case cases[] = {
      {"elevator larger than the tail (2.2 m2)", "[elevator]\narea = 3.0\n", "elevator.area", "larger than"},
      {"hinge line 3.4 m aft of the tail a.c.", "[elevator]\nx_hinge = 8.0\n", "elevator.x_hinge", "aft"},
      {"Ch_delta typed per degree as a plain number", "[elevator]\nch_delta = -0.0065\n", "elevator.ch_delta", "/deg"},
      {"CG outside the stated envelope 0.15..0.30", "[mass]\ncg = 0.33\n", "mass.cg", "envelope"},
  };
  for (const auto& c : cases) {
    CAPTURE(c.name);
    const fs::path d = temp_dir("check_warn");
    const std::string f = case_file(d, c.extra);
    const Result r = run("check " + f);
    CAPTURE(r.out);
    CHECK(r.status == 0);
    const auto w = r.out.find("warning: " + f + ":");  // file and line
    REQUIRE(w != std::string::npos);
    const std::string line = r.out.substr(w, r.out.find('\n', w) - w);
    CHECK(line.find(c.key) != std::string::npos);
    CHECK(line.find(c.reason) != std::string::npos);
  }
  SUBCASE("the demo case: no warning, and the flight condition") {
    const Result r = run("check " + kSrc + "/scenarios/orvane_gust.toml");
    CAPTURE(r.out);
    CHECK(r.status == 0);
    CHECK(r.out.find("warning:") == std::string::npos);
    for (const char* piece : {"flight condition", "kg", "% MAC", "altitude", "TAS", "trim mode"})
      CHECK(r.out.find(piece) != std::string::npos);
  }
}

TEST_CASE("trim names the cause instead of a bare non-convergence") {
  const std::string f = kSrc + "/scenarios/orvane_gust.toml";
  // the Orvane T2's elevator stops are -25..15 deg (scenarios/aircraft/orvane_t2.toml)
  const Result beyond = run("trim " + f + " --tab-for-elevator -30");
  CAPTURE(beyond.out);
  CHECK(beyond.status == 2);
  CHECK(beyond.out.find("beyond its stops") != std::string::npos);
  // 14 deg trailing edge down held hands-off in level flight: the solution runs away to speeds
  // far beyond the engine's thrust; the message says so rather than "did not converge"
  const Result runaway = run("trim " + f + " --tab-for-elevator 14");
  CAPTURE(runaway.out);
  CHECK(runaway.status == 2);
  CHECK(runaway.out.find("throttle") != std::string::npos);
  CHECK(runaway.out.find("did not converge") == std::string::npos);
}
