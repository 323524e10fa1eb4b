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
