// key_info.hpp — a read-only public view of the scenario key table for editors (the window):
// for each numeric key its dotted name, table, meaning, display unit and allowed range as
// text. Values themselves are read and written with get_value / set_value (scenario.hpp),
// which do the checking; this view only describes the keys.
#pragma once

#include <string>
#include <vector>

#include "scenario/scenario.hpp"

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

// The key reference (markdown table: key, unit, meaning, allowed range) for the README and
// `floatpitch keys`.
std::string key_reference_markdown();

// The numeric keys of the tables ([wing], [tail], ..., [run]) in the order of the files.
const std::vector<KeyInfo>& numeric_key_info();

// One key of a scenario with its value, as the key table describes it (the report's input
// rows): every key of the given tables, in the order of the files.
struct KeyValue {
  std::string name;          // dotted key, "wing.area"
  std::string table;         // "wing"
  std::string meaning;       // from the key table
  std::string value;         // in the display unit, with the SI value beside it where it differs
  std::string range;         // allowed values ("" for free text)
};
// tables: which tables to list ("wing", "tail", ...); empty: all of them.
std::vector<KeyValue> key_values(const Scenario& s, const std::vector<std::string>& tables = {});

}  // namespace fp
