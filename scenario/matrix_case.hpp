// matrix_case.hpp — the case file of `floatpitch matrix`: which corners of the conditions matrix
// to compute. A corner changes the base scenario's CG, mass, altitude or trim speed; a case
// lists corners one by one ([[corner]]), as a grid (every combination of the lists in [grid]),
// and/or asks for the stated envelope's corners (envelope = true). Example:
//
//   envelope = true                 # forward and aft CG limits at the stated masses
//   [grid]                          # every combination (a list left out keeps the scenario's value)
//   cg = [0.20, 0.30]               # fraction of MAC
//   mass = ["800 kg", "950 kg"]     # numbers are SI; strings carry a unit
//   altitude = ["0 ft", "8000 ft"]
//   airspeed = ["90 kt", "110 kt"]  # trim speed, true airspeed
//   [[corner]]
//   label = "aft limit, climb speed"
//   cg = 0.33
//   airspeed = "75 kt"
//
// Bad input throws ScenarioError naming the file, line, key and what is allowed.
#pragma once

#include <limits>
#include <string>
#include <vector>

namespace fp {

// One corner: what it changes in the base scenario (NaN = leave the scenario's own value).
struct Corner {
  std::string label;                                          // e.g. "aft CG, heaviest"
  double cg = std::numeric_limits<double>::quiet_NaN();       // [-] fraction of MAC
  double mass = std::numeric_limits<double>::quiet_NaN();     // [kg]
  double altitude = std::numeric_limits<double>::quiet_NaN(); // geometric [m]
  double airspeed = std::numeric_limits<double>::quiet_NaN(); // trim speed, true airspeed [m/s]
};

struct MatrixCase {
  std::string path;
  bool envelope = false;        // add the stated envelope's corners
  std::vector<Corner> corners;  // the grid's corners, then the [[corner]] entries, in file order
};

// Reads and checks a case file (the ranges are the scenario keys' own: mass.cg, mass.mass,
// condition.altitude, condition.airspeed). At least one corner or envelope = true.
MatrixCase load_matrix_case(const std::string& path);
// The same from text (tests; `path` names it in messages).
MatrixCase parse_matrix_case(const std::string& text, const std::string& path);

}  // namespace fp
