// options.cpp — the window's command line, parsed with CLI11 (see options.hpp). This is the
// one file of the window that includes CLI11: it is slow to compile.
#include "ui/options.hpp"

#include <cstdlib>
#include <iostream>
#include <vector>

#include <CLI/CLI.hpp>

namespace fpui {

namespace {

// A whole number within [lo, hi] written alone in `s`.
bool parse_int(const std::string& s, long lo, long hi, long& out) {
  char* end = nullptr;
  const long v = std::strtol(s.c_str(), &end, 10);
  if (s.empty() || *end != '\0' || v < lo || v > hi) return false;
  out = v;
  return true;
}

// "WxH" within 640x480 .. 8192x8192.
bool parse_size(const std::string& s, unsigned& w, unsigned& h) {
  long wl = 0, hl = 0;
  const auto p = s.find('x');
  if (p == std::string::npos || !parse_int(s.substr(0, p), 640, 8192, wl) || !parse_int(s.substr(p + 1), 480, 8192, hl))
    return false;
  w = static_cast<unsigned>(wl);
  h = static_cast<unsigned>(hl);
  return true;
}

}  // namespace

int parse_options(int argc, char** argv, Options& opt) {
  CLI::App app{"The window of floatpitch: one scenario flown with the stick held and with the stick free, side by\n"
               "side, from the same trim.",
               "floatpitch-view"};
  // what is left over is named in our own words after parsing: an unknown option, or a
  // second scenario
  app.allow_extras();
  app.set_help_flag("-h,--help", "this text");
  std::string frames, size;
  app.add_option("SCENARIO", opt.scenario, "a scenario file (.toml) to open")->type_name("FILE");
  // --frames and --size are read as text and checked here: CLI11 would read "010" as octal
  app.add_option("--frames", frames, "run N frames without a person, then exit (0..1000000)")
      ->type_name("N")
      ->check(CLI::Validator(
          [](std::string& s) {
            long n = 0;
            return parse_int(s, 0, 1000000, n) ? std::string() : "takes a whole number 0..1000000";
          },
          "", "N"));
  app.add_option("--screenshot", opt.screenshot, "write the last frame as a PNG")->type_name("FILE");
  app.add_option("--script", opt.script, "actions at simulated times (see ui/README.md)")->type_name("FILE");
  app.add_option("--frame-log", opt.frame_log, "write each frame's time [ms]; prints the median at exit")
      ->type_name("FILE");
  app.add_option("--csv-dir", opt.csv_dir, "write the run (held.csv, free.csv, scenario, actions) at exit")
      ->type_name("DIR");
  app.add_option("--layout", opt.layout, "write where the time plots were drawn (for tests)")->type_name("FILE");
  app.add_option("--size", size, "window size in pixels (default 1280x800)")
      ->type_name("WxH")
      ->check(CLI::Validator(
          [](std::string& s) {
            unsigned w = 0, h = 0;
            return parse_size(s, w, h) ? std::string() : "takes WxH, from 640x480 to 8192x8192";
          },
          "", "WxH"));

  auto bad_usage = [&](const std::string& what) {
    std::cerr << "floatpitch-view: " << what << "\n" << app.help();
    return 2;
  };
  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp&) {
    std::cout << app.help();
    return 0;
  } catch (const CLI::ParseError& e) {
    return bad_usage(e.what());
  }
  if (const std::vector<std::string> extra = app.remaining(); !extra.empty()) {
    const std::string& x = extra.front();
    if (!x.empty() && x[0] == '-') return bad_usage("unknown option " + x);
    return bad_usage("one scenario at a time (" + opt.scenario + ", then " + x + ")");
  }
  if (long n = 0; !frames.empty() && parse_int(frames, 0, 1000000, n)) opt.frames = static_cast<int>(n);
  if (!size.empty()) parse_size(size, opt.width, opt.height);
  if (!opt.screenshot.empty() && opt.screenshot.size() < 5) return bad_usage("--screenshot needs a .png file name");
  return -1;
}

}  // namespace fpui
