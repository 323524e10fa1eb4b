// test_docs.cpp — the README's scenario key reference is the one the key table produces
// (scenario/keys.cpp is the single source of keys, units, meanings and ranges).
#include <doctest/doctest.h>

#include <fstream>
#include <sstream>
#include <string>

#include "scenario/scenario.hpp"

TEST_CASE("README key reference is in step with the key table") {
  std::ifstream f(std::string(FP_SOURCE_DIR) + "/README.md");
  REQUIRE(f);
  std::stringstream ss;
  ss << f.rdbuf();
  const std::string s = ss.str();
  const std::string b = "<!-- keys:begin -->\n", e = "\n<!-- keys:end -->";
  const auto i = s.find(b), j = s.find(e);
  REQUIRE(i != std::string::npos);
  REQUIRE(j != std::string::npos);
  std::string ref = fp::key_reference_markdown();
  while (!ref.empty() && ref.back() == '\n') ref.pop_back();
  // on a mismatch: run scripts/update_readme_keys.sh
  CHECK(s.substr(i + b.size(), j - i - b.size()) == ref);
}
