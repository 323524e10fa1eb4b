// script.hpp — the window's action scripts: a small text format of our own, one action a line,
// that drives the window without a person (tests, benchmarks, demonstrations) and that the
// window writes back when it exports a run, so a session can be replayed.
//
//   # a comment; blank lines are ignored
//   at 0    cg 0.31                      centre of gravity [fraction of MAC] (re-trims, restarts)
//   at 0    set elevator.ch_alpha -0.2   any numeric key, value in the unit the window shows
//   at 1.0  let_go                       free airplane: hands off
//   at 4.0  take_hold                    free airplane: hold the stick where it is
//   at 2.0  gust 1-cosine 6 m/s 25 m     shape (1-cosine, sharp, ramp), amplitude, length,
//   at 2.0  gust ramp -3 kt 40 ft horizontal      and optionally vertical (default) or horizontal
//   at 3.0  tab -2.5 deg                 trim tab setting (deg or rad)
//   at 3.0  pulse 40 N 0.5 s             pilot force on the free stick (N or lbf) for a time (s)
//   at 5.0  reset                        back to the trim, time 0
//   at 0    speed 2                      live speed factor
//   at 0    jump 60                      simulate this many seconds at once
//   at 0    span 30                      seconds of history the time plots show
//   at 0    view superposed              side view: superposed or side_by_side
//   at 0    exaggeration 4               side view: surface deflection exaggeration
//   at 0    panel edit                   left panel shown: scenario, edit, inputs or analysis
//   at 0    roots slow                   complex plane fitted to: airframe (modes without the elevator's), all, slow (|root| < 2 /s)
//   at 9.5  pause                        stop the simulated time
//   at 3    hover 520 400                put the mouse pointer at window pixel (x, y) (shows the readouts)
//
// Times are simulated seconds. Actions run in the order written, each when the simulated time
// reaches its time (times must not decrease). Errors name the file and the line.
#pragma once

#include <string>
#include <vector>

#include "model/gust.hpp"

namespace fpui {

enum class ActionKind {
  let_go, take_hold, gust, tab, pulse, cg, set, reset, speed, jump, span, view, exaggeration, pause, panel, roots, hover
};

struct Action {
  double time = 0.0;          // simulated time [s]
  ActionKind kind = ActionKind::pause;
  fp::DiscreteGust gust{};    // gust (start 0: at the wing now)
  double value = 0.0;         // SI: tab [rad], pulse force [N], cg [-], speed [-], jump/span [s],
                              // exaggeration [-]; set: the value in the key's shown unit
  double duration = 0.0;      // pulse [s]
  std::string key;            // set: the dotted key
  bool superposed = false;    // view
  int panel = 0;              // panel: 0 scenario, 1 edit, 2 inputs, 3 analysis
  int roots = 0;              // roots: 0 airframe, 1 all, 2 slow
  float x = 0, y = 0;         // hover: window pixels
  int line = 0;               // where it was written
};

struct ScriptError {
  std::string message;        // "FILE:LINE: what is wrong"
};

// Parse a script's text; `name` stands for the file in messages. Throws ScriptError.
std::vector<Action> parse_script(const std::string& text, const std::string& name);
// Read and parse a file. Throws ScriptError (also when it cannot be read).
std::vector<Action> load_script(const std::string& path);

// One action as a script line ("at 2.000 gust 1-cosine 6 m/s 25 m"), for the session log.
std::string action_line(const Action& a);

}  // namespace fpui
