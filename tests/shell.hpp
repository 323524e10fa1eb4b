// shell.hpp — running the command-line program from a test: a shell command's exit status and
// its output (standard output and error together), and a file read whole. Include it after the
// project's headers (<sys/wait.h> brings <signal.h>, which defines si_value as a macro).
#pragma once

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include <doctest/doctest.h>
#include <sys/wait.h>

namespace fp::test {

struct Out {
  int status = -1;
  std::string text;  // stdout and stderr together
};

inline Out shell(const std::string& cmd) {
  Out r;
  FILE* p = ::popen((cmd + " 2>&1").c_str(), "r");
  REQUIRE(p != nullptr);
  std::array<char, 4096> buf{};
  while (std::fgets(buf.data(), buf.size(), p)) r.text += buf.data();
  const int st = ::pclose(p);
  r.status = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
  return r;
}

inline std::string slurp(const std::filesystem::path& p) {
  std::ifstream f(p, std::ios::binary);
  std::ostringstream ss;
  ss << f.rdbuf();
  return ss.str();
}

}  // namespace fp::test
