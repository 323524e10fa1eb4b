// key_info.hpp — a read-only public view of the scenario key table for editors (the window):
// for each numeric key its dotted name, table, meaning, display unit and allowed range as
// text. Values themselves are read and written with get_value / set_value (scenario.hpp),
// which do the checking; this view only describes the keys.
#pragma once

#include <string>
#include <vector>

namespace fp {

struct KeyInfo {
  std::string name;          // dotted key as in the files, "wing.area"
  std::string table;         // "wing"
  std::string meaning;       // what it means
  std::string unit;          // unit shown to people ("" for a plain number)
  double si_per_unit = 1.0;  // SI value = shown value * si_per_unit
  std::string range;         // allowed range as the error messages write it
  bool integer = false;      // a whole number
};

// The numeric keys of the tables ([wing], [tail], ..., [run]) in the order of the files.
const std::vector<KeyInfo>& numeric_key_info();

}  // namespace fp
