// fuzz_scenario.cpp — libFuzzer entry for the scenario loader.
//
// Whatever the bytes, parse_scenario must either return a Scenario or throw ScenarioError; any
// other exception, a crash, a sanitizer report or a hang is a bug. An input that starts with
// '@' carries a --set item on its first line (after the '@'), so the override parser is fuzzed
// too. A scenario that was accepted must also survive to_toml and read back: failing that is a
// bug of the writer, and stops the fuzzer.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>
#include <vector>

#include "scenario/scenario.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  std::string text(reinterpret_cast<const char*>(data), size);
  std::vector<std::string> overrides;
  if (!text.empty() && text[0] == '@') {
    const auto nl = text.find('\n');
    overrides.push_back(text.substr(1, nl == std::string::npos ? std::string::npos : nl - 1));
    text = nl == std::string::npos ? std::string() : text.substr(nl + 1);
  }
  fp::Scenario s;
  try {
    // Relative includes resolve against a directory that does not exist.
    s = fp::parse_scenario(text, "fuzz.toml", "/nonexistent-floatpitch-fuzz", overrides);
  } catch (const fp::ScenarioError& e) {
    (void)e.what();
    return 0;
  }
  try {
    (void)fp::parse_scenario(fp::to_toml(s), "written.toml", "/nonexistent-floatpitch-fuzz");
  } catch (const fp::ScenarioError&) {
    std::abort();  // an accepted scenario that does not read back after writing
  }
  return 0;
}
