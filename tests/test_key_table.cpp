// test_key_table.cpp — the key table (scenario/keys.cpp) is the only text of the meanings,
// units and ranges of scenario keys: the report's input rows come from it. These checks compare
// the report against the table itself, key by key, so a row that the report wrote on its own
// (or a key it left out) fails.
#include <doctest/doctest.h>

#include <array>
#include <cstdio>
#include <fstream>
#include <sstream>
#include <string>

#include "scenario/key_info.hpp"
#include "scenario/scenario.hpp"

#include <sys/wait.h>  // after the project headers: signal.h defines si_value as a macro

namespace {

int run_command(const std::string& cmd) {
  FILE* p = ::popen((cmd + " > /dev/null 2>&1").c_str(), "r");
  if (!p) return -1;
  const int st = ::pclose(p);
  return WIFEXITED(st) ? WEXITSTATUS(st) : -1;
}

std::string read_all(const std::string& path) {
  std::ifstream f(path);
  std::stringstream ss;
  ss << f.rdbuf();
  return ss.str();
}

std::string html_escape(const std::string& s) {
  std::string o;
  for (char c : s) {
    if (c == '&') o += "&amp;";
    else if (c == '<') o += "&lt;";
    else if (c == '>') o += "&gt;";
    else if (c == '"') o += "&quot;";
    else o += c;
  }
  return o;
}

}  // namespace

TEST_CASE("the report lists every input key with the key table's meaning and value") {
  const std::string dir = std::string(FP_BINARY_DIR) + "/test_key_table/report";
  REQUIRE(run_command(std::string(FP_BINARY_DIR) + "/floatpitch report " + FP_SOURCE_DIR +
                      "/scenarios/orvane_gust.toml --samples 4 --jobs 2 --out " + dir) == 0);
  const std::string html = read_all(dir + "/report.html");
  const fp::Scenario s = fp::load_scenario(std::string(FP_SOURCE_DIR) + "/scenarios/orvane_gust.toml", {});
  const auto rows = fp::key_values(s);
  REQUIRE(rows.size() > 60);  // the airplane, condition, trim and run tables
  int checked = 0;
  for (const auto& kv : rows) {
    if (kv.table == "scenario" || kv.name == "name") continue;
    CAPTURE(kv.name);
    const std::string row = "<code>" + html_escape(kv.name) + "</code></td><td>" + html_escape(kv.meaning) +
                            "</td><td>" + html_escape(kv.value) + "</td>";
    CHECK(html.find(row) != std::string::npos);
    ++checked;
  }
  CHECK(checked > 60);
  // a value the scenario sets (mass.cg = 0.27 in this case) is the one shown, not a default
  CHECK(html.find("<code>mass.cg</code></td><td>") != std::string::npos);
  bool found_cg = false;
  for (const auto& kv : rows)
    if (kv.name == "mass.cg") found_cg = kv.value == "0.27";
  CHECK(found_cg);
}
