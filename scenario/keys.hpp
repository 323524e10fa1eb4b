// keys.hpp — the key table of scenario files (private to scenario/).
//
// One entry a key: its dotted name as written in the files, what kind of value it takes, its
// physical dimension, what it means, its allowed range (SI), whether it is required, and where
// it lives in a Scenario. The loader (scenario.cpp) validates and converts with it, validate()
// re-checks ranges with it, to_toml() writes with it, and key_reference_markdown() documents
// it: a key exists, with its unit and range, only through this table.
#pragma once

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "model/units.hpp"
#include "scenario/scenario_types.hpp"

namespace fp::keys {

enum class Kind {
  number,       // a real number, or a string "<number> <unit>"
  integer,      // a whole number
  boolean,      // true or false
  choice,       // one of a list of strings
  text,         // free text
  lift_table,   // array of [alpha, CL] pairs (alpha a number in rad or a string with a unit)
  tab_setting,  // "auto" or an angle
};

struct Key {
  const char* name = "";               // dotted key, "wing.area"
  Kind kind = Kind::number;
  units::Dim dim = units::Dim::none;   // number, integer, tab_setting; lift_table: of alpha
  const char* meaning = "";
  double min = 0, max = 0;             // allowed range, SI
  bool required = false;
  const char* display = "";            // unit for messages and docs ("" = SI)
  bool min_open = false;               // the value must be strictly above min
  bool zero_ok = false;                // 0 is allowed besides [min, max] (0 = off or auto)
  std::vector<const char*> choices{};  // choice: the allowed strings
  const char* note = "";               // the reference's default column for keys without a
                                       // struct default (array entries), or a remark
  // Where the value lives; exactly one is set for keys of a table, none for array entries.
  double& (*num)(Scenario&) = nullptr;
  int& (*integer)(Scenario&) = nullptr;
  bool& (*flag)(Scenario&) = nullptr;
  std::string& (*text)(Scenario&) = nullptr;
  int (*get_choice)(const Scenario&) = nullptr;
  void (*set_choice)(Scenario&, int) = nullptr;
};

// Keys of the tables ([scenario], [wing], ...), in the order of the files and the docs.
std::span<const Key> table_keys();
// Keys of one [[event]] and of one [[gust]] ("event.time", "gust.length", ...).
std::span<const Key> event_keys();
std::span<const Key> gust_keys();

// The table names in order ("scenario", "wing", ...), without the arrays.
const std::vector<std::string>& table_names();

// A table key by its dotted name; aliases ("cg") are resolved when `aliases` is true.
const Key* find(std::string_view name, bool aliases);
// A key of an array entry by its short name ("time") in `list`.
const Key* find_in(std::span<const Key> list, std::string_view short_name);

// The short name of a key ("area" for "wing.area") and its table ("wing"; "" for a key at the
// top of a file, such as "name").
std::string_view short_name(const Key& k);
std::string_view table_of(const Key& k);

// Unit used in messages and docs, and the factor from SI to it (value_si / to_si).
const char* display_unit(const Key& k);
double display_factor(const Key& k);

// Number formatting for messages, docs and files.
std::string fmt(double v);            // about 6 significant digits
std::string fmt_exact(double v);      // shortest text that reads back to the same double

// "0.05..200 m2", or "-57.2958..0 deg (-1..0 rad)" when the display unit is not SI.
std::string range_text(const Key& k);
// What a key allows, as the reference and the report write it (ranges, choices, "auto", ...).
std::string allowed_text(const Key& k);
// A value in the display unit and, when that is not SI, in SI: "110 kt (56.5889 m/s)".
std::string value_text(const Key& k, double si);
// nullopt when `si` is allowed by the key's own range; otherwise what is wrong.
std::optional<std::string> range_problem(const Key& k, double si);

// Edit distance (optimal string alignment) for "did you mean" suggestions.
std::size_t edit_distance(std::string_view a, std::string_view b);
// The nearest of `candidates` to `word`, or "" when none is near enough to be a likely typo.
std::string nearest(std::string_view word, const std::vector<std::string>& candidates);

}  // namespace fp::keys
