// fuzz_script.cpp — libFuzzer entry for the window's action-script parser (ui/script.cpp).
//
// Whatever the bytes, parse_script must either return actions or throw ScriptError; any other
// exception, a crash, a sanitizer report or a hang is a bug. Every accepted action must also
// survive the session log: its action_line (what the window writes back when it exports a run)
// must parse again, alone, to one action of the same kind; failing that stops the fuzzer.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>
#include <vector>

#include "ui/script.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  std::vector<fpui::Action> actions;
  try {
    actions = fpui::parse_script(text, "fuzz.script");
  } catch (const fpui::ScriptError& e) {
    (void)e.message.size();
    return 0;
  }
  for (const auto& a : actions) {
    try {
      const auto back = fpui::parse_script(fpui::action_line(a), "log.script");
      if (back.size() != 1 || back[0].kind != a.kind) std::abort();
    } catch (const fpui::ScriptError&) {
      std::abort();  // an accepted action that the session log cannot replay
    }
  }
  return 0;
}
