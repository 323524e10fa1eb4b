// commands.hpp — the work behind each `floatpitch` subcommand. cli.cpp parses the command
// line (CLI11) and calls these; each returns the process exit status:
//   0 success, 2 bad input (scenario, option, or a condition that cannot be trimmed),
//   3 numerical failure (the integrator failed: not a result about the airplane).
#pragma once

#include <string>
#include <vector>

namespace fp::cmd {

inline constexpr int kOk = 0;
inline constexpr int kBadInput = 2;
inline constexpr int kNumerical = 3;

struct Common {
  std::string scenario;
  std::vector<std::string> set;  // --set KEY=VALUE
  bool json = false;
};

int check(const Common& c);

struct TrimOpts {
  Common common;
};
int trim(const TrimOpts& o);

struct RunOpts {
  Common common;
  std::string controls;      // "", held, free, both
  double duration = -1;      // < 0: the scenario's
  std::string out = "out";
  bool quiet = false;
};
int run(const RunOpts& o);

int keys();

}  // namespace fp::cmd
