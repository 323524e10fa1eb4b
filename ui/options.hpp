// options.hpp — the window's command line: what it asks for, and the parser (options.cpp,
// the one file of the window that includes CLI11: it is slow to compile).
#pragma once

#include <string>

namespace fpui {

struct Options {
  std::string scenario;         // file to open at start ("" = none)
  int frames = -1;              // >= 0: run this many frames, then exit (headless)
  std::string screenshot;       // PNG written after the last frame
  std::string script;           // action script
  std::string frame_log;        // per-frame times [ms]
  std::string csv_dir;          // the run's CSVs written at exit
  std::string layout;           // where the plots were drawn, for the tests
  unsigned width = 1280, height = 800;
  bool fixed_step() const { return frames >= 0 || !script.empty(); }
};

// Parse the command line into `opt`. Returns -1 to go on, or the exit status: 0 after --help
// (the help printed on stdout), 2 after bad usage (the message and a hint on stderr).
int parse_options(int argc, char** argv, Options& opt);

}  // namespace fpui
