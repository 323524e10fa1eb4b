// test_cautions.cpp — every console output of floatpitch ends with the one-line caution and
// every JSON it writes or prints carries a "caution" key (the cautions of the trade for an
// analysis aid: not approved data, inputs uncertain, no flutter or flexibility, compliance
// belongs to qualified, authorized engineers). Runs the real program on a bundled case.
#include <doctest/doctest.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

#include "util/caution.hpp"

#include <sys/wait.h>  // after the project headers: signal.h defines si_value as a macro

namespace fs = std::filesystem;

namespace {

const std::string kExe = std::string(FP_BINARY_DIR) + "/floatpitch";
const std::string kCase = std::string(FP_SOURCE_DIR) + "/scenarios/orvane_gust.toml";

struct Out {
  int status = -1;
  std::string out, err;
};

Out run(const std::string& args) {
  const fs::path dir = fs::path(FP_BINARY_DIR) / "test_cautions";
  fs::create_directories(dir);
  const std::string errf = (dir / "stderr.txt").string();
  Out r;
  FILE* p = ::popen((kExe + " " + args + " 2> " + errf).c_str(), "r");
  REQUIRE(p != nullptr);
  std::array<char, 4096> buf{};
  while (std::fgets(buf.data(), buf.size(), p)) r.out += buf.data();
  const int st = ::pclose(p);
  r.status = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
  std::ifstream f(errf);
  std::stringstream ss;
  ss << f.rdbuf();
  r.err = ss.str();
  return r;
}

std::string last_line(const std::string& s) {
  std::string t = s;
  while (!t.empty() && t.back() == '\n') t.pop_back();
  const auto k = t.rfind('\n');
  return k == std::string::npos ? t : t.substr(k + 1);
}

nlohmann::json read_json(const fs::path& p) {
  std::ifstream f(p);
  return nlohmann::json::parse(f);
}

}  // namespace

TEST_CASE("every command's console output ends with the caution line") {
  const std::string out = (fs::path(FP_BINARY_DIR) / "test_cautions").string();
  const char* commands[] = {
      "check ", "trim ", "margins ", "modes ", "forces ",
  };
  for (const char* c : commands) {
    CAPTURE(c);
    const Out r = run(std::string(c) + kCase);
    CHECK(r.status == 0);
    // forces prints CSV on stdout: its caution goes to stderr, the CSV stays clean
    if (std::string(c) == "forces ") CHECK(last_line(r.err) == fp::kCautionLine);
    else CHECK(last_line(r.out) == fp::kCautionLine);
  }
  const Out runr = run("run " + kCase + " --out " + out + "/run");
  CHECK(runr.status == 0);
  CHECK(last_line(runr.out) == fp::kCautionLine);
  const Out sw = run("sweep " + kCase + " --vary cg=0.20:0.30:0.05 --jobs 2 --out " + out + "/sweep");
  CHECK(sw.status == 0);
  CHECK(last_line(sw.out) == fp::kCautionLine);
  // a failure ends with it too, on stderr
  const Out bad = run("run " + kCase + " --set mass.cg=7 --out " + out + "/bad");
  CHECK(bad.status == 2);
  CHECK(last_line(bad.err) == fp::kCautionLine);
}

TEST_CASE("every JSON output carries the caution") {
  const fs::path out = fs::path(FP_BINARY_DIR) / "test_cautions";
  for (const char* c : {"check --json ", "trim --json ", "margins --json ", "modes --json "}) {
    CAPTURE(c);
    const Out r = run(std::string(c) + kCase);
    REQUIRE(r.status == 0);
    const auto j = nlohmann::json::parse(r.out);  // nothing but JSON on stdout
    CHECK(j.value("caution", std::string()) == fp::kCaution);
  }
  REQUIRE(run("run " + kCase + " --out " + (out / "run2").string()).status == 0);
  CHECK(read_json(out / "run2" / "summary.json").value("caution", std::string()) == fp::kCaution);
  REQUIRE(run("sweep " + kCase + " --vary cg=0.20:0.30:0.05 --jobs 2 --out " + (out / "sweep2").string()).status == 0);
  CHECK(read_json(out / "sweep2" / "sweep.json").value("caution", std::string()) == fp::kCaution);
}
