// test_docs.cpp — the README's scenario key reference is the one the key table produces
// (scenario/keys.cpp is the single source of keys, units, meanings and ranges).
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "scenario/scenario.hpp"
#include "scenario/key_info.hpp"

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

TEST_CASE("sources cite published works, not the team's notes, and demo airplanes carry coined names") {
  // Comments and tests name the published source itself (title, section, equation); the team's
  // working notes are not in the repository. The bundled airplanes once carried the names of
  // real historic aircraft types (Wren, Tern, Skua): they must keep coined names.
  namespace fs = std::filesystem;
  const std::vector<std::string> notes = {"checks.md", "model.md", "circuit.md", "criteria.md", "flight-data.md",
                                          "architecture.md", "toolchain.md", "style.md"};
  const std::vector<std::string> real_names = {"Wren", "Tern ", "Skua"};
  int files = 0;
  for (const char* dir : {"util", "model", "scenario", "run", "analysis", "output", "report", "cli", "ui", "tests",
                          "bench", "scenarios", "docs", "scripts"}) {
    const fs::path root = fs::path(FP_SOURCE_DIR) / dir;
    if (!fs::exists(root)) continue;
    for (const auto& e : fs::recursive_directory_iterator(root)) {
      if (!e.is_regular_file()) continue;
      const std::string ext = e.path().extension().string();
      if (ext != ".cpp" && ext != ".hpp" && ext != ".toml" && ext != ".md" && ext != ".sh" && ext != ".py") continue;
      if (e.path().filename() == "test_docs.cpp") continue;  // this list itself
      std::ifstream f(e.path());
      std::stringstream ss;
      ss << f.rdbuf();
      const std::string text = ss.str();
      ++files;
      for (const auto& n : notes) {
        CAPTURE(e.path().string());
        CHECK_MESSAGE(text.find(n) == std::string::npos, "cites the team note " << n);
      }
      if (ext == ".toml")
        for (const auto& n : real_names) {
          CAPTURE(e.path().string());
          CHECK_MESSAGE(text.find(n) == std::string::npos, "names a real aircraft type: " << n);
        }
    }
  }
  CHECK(files > 50);
}
