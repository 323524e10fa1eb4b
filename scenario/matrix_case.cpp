// matrix_case.cpp — reading the case file of `floatpitch matrix` (see matrix_case.hpp).
#include "scenario/matrix_case.hpp"

#include <cmath>
#include <fstream>
#include <sstream>

#include <toml++/toml.h>

#include "model/units.hpp"
#include "scenario/keys.hpp"
#include "scenario/scenario_types.hpp"

namespace fp {

namespace {

// The four quantities a corner may set, with the scenario key whose range and unit they share.
struct Field {
  const char* name;       // in the case file
  const char* key;        // the scenario key
  double Corner::*member;
};
constexpr Field kFields[] = {{"cg", "mass.cg", &Corner::cg},
                             {"mass", "mass.mass", &Corner::mass},
                             {"altitude", "condition.altitude", &Corner::altitude},
                             {"airspeed", "condition.airspeed", &Corner::airspeed}};

[[noreturn]] void fail(const std::string& path, const toml::node* n, const std::string& key, const std::string& msg) {
  const int line = n ? static_cast<int>(n->source().begin.line) : 0;
  const int col = n ? static_cast<int>(n->source().begin.column) : 0;
  throw ScenarioError{path, line, col, key, msg};
}

// A number (SI) or a string "<number> <unit>", within the scenario key's range.
double value_of(const std::string& path, const toml::node& n, const std::string& where, const Field& f) {
  const keys::Key& k = *keys::find(f.key, false);
  double v = 0;
  if (auto x = n.value<double>()) {
    v = *x;
  } else if (auto t = n.value<std::string>()) {
    std::size_t used = 0;
    try {
      v = std::stod(*t, &used);
    } catch (const std::logic_error&) {
      fail(path, &n, where, "\"" + *t + "\" is not a number with a unit; allowed: " + keys::allowed_text(k));
    }
    std::string unit = t->substr(used);
    unit.erase(0, unit.find_first_not_of(' '));
    while (!unit.empty() && unit.back() == ' ') unit.pop_back();
    const auto fac = units::factor(k.dim, unit);
    if (!fac)
      fail(path, &n, where,
           "unknown unit \"" + unit + "\" for a " + units::dim_name(k.dim) + "; use one of " + units::accepted_units(k.dim));
    v *= *fac;
  } else {
    fail(path, &n, where, "expects a number or a string with a unit; allowed: " + keys::allowed_text(k));
  }
  if (auto why = keys::range_problem(k, v)) fail(path, &n, where, *why + " (the range of " + std::string(f.key) + ")");
  return v;
}

std::string number_text(double v) { return keys::fmt(v); }

}  // namespace

MatrixCase parse_matrix_case(const std::string& text, const std::string& path) {
  MatrixCase mc;
  mc.path = path;
  toml::table root;
  try {
    root = toml::parse(std::string_view(text), std::string_view(path));
  } catch (const toml::parse_error& e) {
    throw ScenarioError{path, static_cast<int>(e.source().begin.line), static_cast<int>(e.source().begin.column), "",
                        std::string(e.description())};
  }
  for (const auto& [k, v] : root) {
    const std::string key(k.str());
    if (key != "envelope" && key != "grid" && key != "corner")
      fail(path, &v, key, "unknown key; a matrix case has envelope = true|false, a [grid] table and [[corner]] entries");
  }
  if (const auto* e = root.get("envelope")) {
    const auto b = e->value<bool>();
    if (!b) fail(path, e, "envelope", "expects true or false");
    mc.envelope = *b;
  }
  if (const auto* g = root.get("grid")) {
    const auto* gt = g->as_table();
    if (!gt) fail(path, g, "grid", "expects a table [grid] of lists: cg, mass, altitude, airspeed");
    std::vector<std::vector<double>> lists(std::size(kFields));
    for (const auto& [k, v] : *gt) {
      const std::string key = "grid." + std::string(k.str());
      std::size_t fi = std::size(kFields);
      for (std::size_t i = 0; i < std::size(kFields); ++i)
        if (k.str() == kFields[i].name) fi = i;
      if (fi == std::size(kFields)) fail(path, &v, key, "unknown key; allowed: cg, mass, altitude, airspeed");
      const auto* arr = v.as_array();
      if (!arr || arr->empty()) fail(path, &v, key, "expects a non-empty list, e.g. [0.20, 0.30] or [\"0 ft\", \"8000 ft\"]");
      for (const auto& x : *arr) lists[fi].push_back(value_of(path, x, key, kFields[fi]));
    }
    std::size_t n = 1;
    for (auto& l : lists) {
      if (l.empty()) l.push_back(std::nan(""));  // the scenario's own value
      n *= l.size();
    }
    if (n > 10000) fail(path, g, "grid", "makes " + std::to_string(n) + " corners; at most 10000");
    bool any = false;
    for (const auto& l : lists) any = any || std::isfinite(l.front());
    if (any)
      for (std::size_t i = 0; i < n; ++i) {
        Corner c;
        std::size_t r = i;
        std::string label;
        for (std::size_t fi = 0; fi < std::size(kFields); ++fi) {
          const auto& l = lists[fi];
          const double v = l[r % l.size()];
          r /= l.size();
          c.*(kFields[fi].member) = v;
          if (std::isfinite(v)) {
            const keys::Key& k = *keys::find(kFields[fi].key, false);
            // "cg 0.3", then the quantities with their units only: "cg 0.3, 1000 ft, 85 kt"
            const std::string u = keys::display_unit(k);
            const bool unitless = u.empty() || u == "-";
            if (!label.empty()) label += ", ";
            if (unitless) label.append(kFields[fi].name).append(" ");
            label += number_text(v / keys::display_factor(k));
            if (!unitless) label.append(" ").append(u);
          }
        }
        c.label = label;
        mc.corners.push_back(c);
      }
  }
  if (const auto* cs = root.get("corner")) {
    const auto* arr = cs->as_array();
    if (!arr || !arr->is_array_of_tables()) fail(path, cs, "corner", "expects [[corner]] entries");
    int idx = 0;
    for (const auto& e : *arr) {
      ++idx;
      const auto& t = *e.as_table();
      Corner c;
      bool any = false;
      for (const auto& [k, v] : t) {
        const std::string key = "corner." + std::string(k.str());
        if (k.str() == "label") {
          const auto s = v.value<std::string>();
          if (!s) fail(path, &v, key, "expects a string");
          c.label = *s;
          continue;
        }
        std::size_t fi = std::size(kFields);
        for (std::size_t i = 0; i < std::size(kFields); ++i)
          if (k.str() == kFields[i].name) fi = i;
        if (fi == std::size(kFields)) fail(path, &v, key, "unknown key; allowed: label, cg, mass, altitude, airspeed");
        c.*(kFields[fi].member) = value_of(path, v, key, kFields[fi]);
        any = true;
      }
      if (!any) fail(path, &e, "corner", "entry " + std::to_string(idx) + " sets none of cg, mass, altitude, airspeed");
      if (c.label.empty()) c.label = "corner " + std::to_string(idx);
      mc.corners.push_back(c);
    }
  }
  if (mc.corners.empty() && !mc.envelope)
    throw ScenarioError{path, 0, 0, "", "the case lists no corner: give envelope = true, a [grid] or [[corner]] entries"};
  return mc;
}

MatrixCase load_matrix_case(const std::string& path) {
  std::ifstream f(path, std::ios::binary);
  if (!f) throw ScenarioError{path, 0, 0, "", "cannot read the matrix case file"};
  std::ostringstream ss;
  ss << f.rdbuf();
  return parse_matrix_case(ss.str(), path);
}

}  // namespace fp
