// scenario.cpp — reading, checking and writing scenario files (see scenario.hpp).
//
// Order of reading: the bytes are checked first (ASCII text, at most 1 MiB: toml++ 3.3 is not
// safe on every non-ASCII input, so none reaches it), then parsed; an `include` is read before
// the keys of the file that names it, so the including file overrides; `--set` values come
// last. Every value goes through the key table (keys.cpp): its type, unit and range. When all
// is read, required keys are checked, derived values filled in (gust starts given as times,
// the default cases of an irreversible circuit) and validate() checks the relations between
// keys and asks the model whether the airplane is physically possible.
#include "scenario/scenario.hpp"
#include "scenario/gust_timing.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <toml++/toml.h>

#include "model/atmosphere.hpp"
#include "model/design_gust.hpp"
#include "model/dynamics.hpp"
#include "model/units.hpp"
#include "scenario/keys.hpp"

namespace fp {

std::string ScenarioError::what() const {
  std::string r = file;
  if (line > 0) {
    r += (r.empty() ? "line " : ":") + std::to_string(line);
    if (column > 0) r += ":" + std::to_string(column);
  }
  if (!key.empty()) r += (r.empty() ? "" : ": ") + key;
  r += (r.empty() ? "" : ": ") + message;
  return r;
}

namespace {

namespace fs = std::filesystem;
using keys::Key;
using keys::Kind;

constexpr std::size_t max_file_bytes = std::size_t{1} << 20;
constexpr int max_include_depth = 16;
constexpr double cl_limit = 5.0;  // |CL| allowed in wing.cl_table

[[noreturn]] void fail(const KeyOrigin& o, std::string key, std::string message) {
  if (!o.via.empty()) message += " (from " + o.via + ")";
  throw ScenarioError{o.file, o.line, o.column, std::move(key), std::move(message)};
}

KeyOrigin origin_of(const std::string& file, const toml::source_region& r) {
  return KeyOrigin{file, static_cast<int>(r.begin.line), static_cast<int>(r.begin.column), ""};
}

std::string in_quotes(std::string_view s) {
  if (s.size() > 80) return "\"" + std::string(s.substr(0, 77)) + "...\"";
  return "\"" + std::string(s) + "\"";
}

std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
  return s;
}

// Scenario files are ASCII text: printable characters, tab, line feed and carriage return.
void check_bytes(std::string_view text, const std::string& file, const char* what) {
  if (text.size() > max_file_bytes)
    throw ScenarioError{file, 0, 0, "",
                        "larger than 1 MiB (" + std::to_string(text.size()) + " bytes): not a scenario file"};
  int line = 1, col = 1;
  for (unsigned char c : text) {
    if (c >= 0x80 || c == 0x7f || (c < 0x20 && c != '\t' && c != '\n' && c != '\r')) {
      char hex[8];
      std::snprintf(hex, sizeof hex, "0x%02X", static_cast<unsigned>(c));
      const std::string kind = c >= 0x80 ? "non-ASCII byte " : "control character ";
      throw ScenarioError{file, line, col, "",
                          kind + hex + ": " + what +
                              " (write units in letters, e.g. \"deg\" rather than a degree sign)"};
    }
    if (c == '\n') {
      ++line;
      col = 1;
    } else {
      ++col;
    }
  }
}

// toml++ 3.3 takes two things for granted (an assertion in debug builds, an optimiser
// assumption in some release builds) instead of reporting them: that a table header starts
// with a key ("[=x]" or "[[" at the end of a line break that), and that no '}' stands where an
// array expects a value ("[}"). So the text is scanned here the way the parser reads it
// (strings, comments, brackets of values, headers at the start of a line) and those two are
// reported before the parser sees them. Anything else malformed is left to the parser.
void check_brackets(std::string_view t, const std::string& file) {
  enum class In { code, comment, basic, literal, ml_basic, ml_literal };
  const auto key_start = [](char c) {
    return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '_' || c == '-' ||
           c == '"' || c == '\'';
  };
  const auto skip_blanks = [&t](std::size_t& j) {
    const std::size_t from = j;
    while (j < t.size() && (t[j] == ' ' || t[j] == '\t')) ++j;
    return j > from;
  };
  // Length of the run of quote characters `q` at i (a closing """ may be followed by up to two
  // more quotes, which belong to the string).
  const auto quotes_at = [&t](std::size_t i, char q) {
    std::size_t n = 0;
    while (i + n < t.size() && t[i + n] == q) ++n;
    return n;
  };
  In st = In::code;
  std::vector<char> open;   // open brackets and braces of values, innermost last
  bool line_start = true;   // nothing but blanks so far on this line
  int line = 1;
  std::size_t line_begin = 0;
  for (std::size_t i = 0; i < t.size(); ++i) {
    const char c = t[i];
    if (c == '\n') {
      ++line;
      line_begin = i + 1;
      line_start = true;
      if (st == In::comment || st == In::basic || st == In::literal) st = In::code;
      continue;
    }
    switch (st) {
      case In::comment: continue;
      case In::basic:
      case In::ml_basic:
        if (c == '\\') {
          if (i + 1 < t.size() && t[i + 1] != '\n') ++i;
        } else if (c == '"') {
          const std::size_t n = quotes_at(i, '"');
          if (st == In::basic) {
            st = In::code;
          } else if (n >= 3) {
            i += std::min<std::size_t>(n, 5) - 1;
            st = In::code;
          }
        }
        continue;
      case In::literal:
      case In::ml_literal:
        if (c == '\'') {
          const std::size_t n = quotes_at(i, '\'');
          if (st == In::literal) {
            st = In::code;
          } else if (n >= 3) {
            i += std::min<std::size_t>(n, 5) - 1;
            st = In::code;
          }
        }
        continue;
      case In::code: break;
    }
    if (c == ' ' || c == '\t' || c == '\r') continue;
    const bool at_line_start = line_start;
    line_start = false;
    if (c == '#') {
      st = In::comment;
    } else if (c == '"' || c == '\'') {
      const bool multi = quotes_at(i, c) >= 3;
      st = c == '"' ? (multi ? In::ml_basic : In::basic) : (multi ? In::ml_literal : In::literal);
      if (multi) i += 2;
    } else if (c == '[' && open.empty() && at_line_start) {
      std::size_t j = i + 1;
      const bool blank = skip_blanks(j);
      if (j < t.size() && t[j] == '[') {
        if (blank) continue;  // "[ [": the parser reports that itself
        ++j;
        skip_blanks(j);
      }
      if (j < t.size() && t[j] != ']' && !key_start(t[j]))
        throw ScenarioError{file, line, static_cast<int>(j - line_begin + 1), "",
                            "TOML syntax: a table header must start with a name, as in [wing] or [[event]]"};
      i = j - 1;
    } else if (c == '[' || c == '{') {
      open.push_back(c);
    } else if (c == ']' && !open.empty() && open.back() == '[') {
      open.pop_back();
    } else if (c == '}' && !open.empty()) {
      if (open.back() == '[')
        throw ScenarioError{file, line, static_cast<int>(i - line_begin + 1), "",
                            "TOML syntax: '}' inside an array (only an inline table { ... } ends with '}')"};
      open.pop_back();
    }
  }
}

// Read at most 1 MiB of a regular file (never a device, a pipe or a kernel file that could
// block or be endless).
std::string read_limited(const fs::path& p, const KeyOrigin& o, const std::string& key) {
  std::error_code ec;
  const auto st = fs::status(p, ec);
  if (ec || !fs::exists(st)) fail(o, key, "cannot find the file " + in_quotes(p.string()));
  if (!fs::is_regular_file(st)) fail(o, key, in_quotes(p.string()) + " is not a regular file");
  const fs::path canon = fs::weakly_canonical(p, ec);
  const std::string cs = ec ? p.string() : canon.string();
  for (const char* sys : {"/proc/", "/sys/", "/dev/"})
    if (cs.rfind(sys, 0) == 0) fail(o, key, in_quotes(p.string()) + " is a system file, not a scenario file");
  std::ifstream f(p, std::ios::binary);
  if (!f) fail(o, key, "cannot open the file " + in_quotes(p.string()));
  std::string data(max_file_bytes + 1, '\0');
  f.read(data.data(), static_cast<std::streamsize>(data.size()));
  data.resize(static_cast<std::size_t>(f.gcount()));
  if (f.bad()) fail(o, key, "cannot read the file " + in_quotes(p.string()));
  if (data.size() > max_file_bytes) fail(o, key, in_quotes(p.string()) + " is larger than 1 MiB: not a scenario file");
  return data;
}

const char* type_words(const toml::node& n) {
  switch (n.type()) {
    case toml::node_type::table: return "a table";
    case toml::node_type::array: return "an array";
    case toml::node_type::string: return "a string";
    case toml::node_type::integer: return "an integer";
    case toml::node_type::floating_point: return "a floating-point number";
    case toml::node_type::boolean: return "a boolean";
    case toml::node_type::date: return "a date";
    case toml::node_type::time: return "a time";
    case toml::node_type::date_time: return "a date-time";
    case toml::node_type::none: break;
  }
  return "nothing";
}

std::string unit_hint(const Key& k) {
  if (k.dim == units::Dim::none) return "a plain number, or a string with \"%\" such as \"25 %\"";
  return std::string("a number in ") + units::si_unit(k.dim) + ", or a string \"<number> <unit>\" with one of: " +
         units::accepted_units(k.dim);
}

std::string choices_text(const Key& k) {
  std::string r;
  for (const char* c : k.choices) r += (r.empty() ? "\"" : ", \"") + std::string(c) + "\"";
  return r;
}

// "<number> <unit>" to SI for the key's dimension.
double quantity_from_text(const Key& k, const std::string& key, std::string_view text, const KeyOrigin& o) {
  const std::string_view t = trim(text);
  const char* b = t.data();
  const char* e = b + t.size();
  const char* p = b;
  if (p != e && *p == '+') ++p;
  double v = 0;
  const auto r = std::from_chars(p, e, v);
  if (r.ec == std::errc::invalid_argument || (p != b && p != e && *p == '-'))
    fail(o, key, "expects " + unit_hint(k) + "; got " + in_quotes(t));
  if (r.ec == std::errc::result_out_of_range) fail(o, key, "the number in " + in_quotes(t) + " is out of range");
  // One space between words of a unit ("kg m2"), whatever the spacing written.
  std::string unit;
  for (std::string_view rest = trim(std::string_view(r.ptr, static_cast<std::size_t>(e - r.ptr)));
       !rest.empty();) {
    const auto sp = rest.find_first_of(" \t");
    if (!unit.empty()) unit += ' ';
    unit += rest.substr(0, sp);
    rest = sp == std::string_view::npos ? std::string_view{} : trim(rest.substr(sp));
  }
  const auto f = units::factor(k.dim, unit);
  if (!f) {
    using units::Dim;
    for (int d = static_cast<int>(Dim::none); d <= static_cast<int>(Dim::per_length); ++d) {
      const auto other = static_cast<Dim>(d);
      if (other != k.dim && units::factor(other, unit))
        fail(o, key,
             "unit " + in_quotes(unit) + " is a unit of " + units::dim_name(other) + ", but " + key + " is " +
                 (k.dim == Dim::none ? std::string("dimensionless: write a plain number, or \"%\"")
                                     : std::string("measured in units of ") + units::dim_name(k.dim) +
                                           "; use one of: " + units::accepted_units(k.dim)));
    }
    if (k.dim == Dim::none)
      fail(o, key, "unknown unit " + in_quotes(unit) + ": " + key + " is dimensionless; write a plain number, or \"%\"");
    fail(o, key,
         "unknown unit " + in_quotes(unit) + "; " + key + " is measured in units of " + units::dim_name(k.dim) +
             ": use one of " + units::accepted_units(k.dim));
  }
  const double si = v * *f;
  if (!std::isfinite(si)) fail(o, key, "must be a finite number; got " + in_quotes(t));
  return si;
}

double number_of(const Key& k, const std::string& key, const toml::node& n, const KeyOrigin& o) {
  if (const auto* i = n.as_integer()) return static_cast<double>(i->get());
  if (const auto* f = n.as_floating_point()) {
    if (!std::isfinite(f->get())) fail(o, key, "must be a finite number, not inf or nan");
    return f->get();
  }
  if (const auto* s = n.as_string()) return quantity_from_text(k, key, s->get(), o);
  fail(o, key, "expects " + unit_hint(k) + "; got " + type_words(n));
}

void check_range(const Key& k, const std::string& key, double si, const KeyOrigin& o) {
  if (auto why = keys::range_problem(k, si)) fail(o, key, *why);
}

int choice_of(const Key& k, const std::string& key, const toml::node& n, const KeyOrigin& o) {
  const auto* s = n.as_string();
  if (!s) fail(o, key, "expects one of " + choices_text(k) + " (a string); got " + type_words(n));
  for (std::size_t i = 0; i < k.choices.size(); ++i)
    if (s->get() == k.choices[i]) return static_cast<int>(i);
  std::vector<std::string> cands(k.choices.begin(), k.choices.end());
  const std::string near = keys::nearest(s->get(), cands);
  fail(o, key,
       in_quotes(s->get()) + " is not allowed; use one of " + choices_text(k) +
           (near.empty() ? "" : " (did you mean \"" + near + "\"?)"));
}

std::vector<std::string> short_names(std::span<const Key> list, std::string_view table) {
  std::vector<std::string> r;
  for (const auto& k : list)
    if (table.empty() || keys::table_of(k) == table) r.emplace_back(keys::short_name(k));
  return r;
}

std::vector<std::string> all_dotted_names() {
  std::vector<std::string> r;
  for (const auto& k : keys::table_keys()) r.emplace_back(k.name);
  return r;
}

std::string join(const std::vector<std::string>& v) {
  std::string r;
  for (const auto& s : v) r += (r.empty() ? "" : ", ") + s;
  return r;
}

// The "did you mean" part for an unknown key `word` of table `table` ("" at the top level).
std::string suggestion(std::string_view table, std::string_view word) {
  // A typo within the same table ...
  if (!table.empty()) {
    const std::string near = keys::nearest(word, short_names(keys::table_keys(), table));
    if (!near.empty()) return "did you mean \"" + near + "\"?";
  }
  // ... or the right key in the wrong table ...
  for (const auto& k : keys::table_keys()) {
    if (keys::short_name(k) != word) continue;
    if (keys::table_of(k).empty()) return "did you mean " + std::string(k.name) + " (at the top of the file, before any table)?";
    return "did you mean " + std::string(k.name) + " (in [" + std::string(keys::table_of(k)) + "])?";
  }
  // ... or a typo in the whole dotted name.
  const std::string dotted = table.empty() ? std::string(word) : std::string(table) + "." + std::string(word);
  const std::string near = keys::nearest(dotted, all_dotted_names());
  if (!near.empty()) return "did you mean " + near + "?";
  return "";
}

// Put the events in time order, keeping each one's origin with it.
void sort_events(Scenario& s) {
  std::vector<std::pair<Event, KeyOrigin>> v;
  for (std::size_t i = 0; i < s.events.size(); ++i) {
    const auto it = s.origins.find("event[" + std::to_string(i) + "]");
    v.emplace_back(s.events[i], it == s.origins.end() ? KeyOrigin{} : it->second);
  }
  std::stable_sort(v.begin(), v.end(), [](const auto& a, const auto& b) { return a.first.time < b.first.time; });
  for (std::size_t i = 0; i < v.size(); ++i) {
    s.events[i] = v[i].first;
    s.origins["event[" + std::to_string(i) + "]"] = v[i].second;
  }
}

// Gust starts given as times become distances: the field is sampled at X + front_speed t and
// the CG is at X = V cos(gamma) t, so the leading edge reaches the CG at t when
// start = (V cos(gamma) + front_speed) t.
void derive_gust_starts(Scenario& s) {
  const double closing = gust_closing_speed(s);
  for (std::size_t i = 0; i < s.gusts.size() && i < s.gust_start_times.size(); ++i)
    if (s.gust_start_times[i]) s.gusts[i].start = closing * *s.gust_start_times[i];
}

// Amplitudes (and default gradient distances) of gusts set by a design rule: the rule's
// velocity is an equivalent airspeed, applied as true airspeed at the condition's density
// (model/design_gust.hpp). Throws ScenarioError when the rule gives no value at the altitude.
void derive_gust_amplitudes(Scenario& s) {
  const double rho = isa_at(geopotential_altitude(s.condition.altitude)).density;
  for (std::size_t i = 0; i < s.gusts.size() && i < s.gust_designs.size(); ++i) {
    const GustDesign& d = s.gust_designs[i];
    DiscreteGust& g = s.gusts[i];
    if (d.rule == GustRule::amplitude) continue;
    if (d.length_auto) g.length = 12.5 * s.airplane.wing.mac;
    const auto it = s.origins.find("gust[" + std::to_string(i) + "]");
    const KeyOrigin o = it != s.origins.end() ? it->second : KeyOrigin{s.path, 0, 0, ""};
    const std::string which = "[[gust]] number " + std::to_string(i + 1);
    const double alt_ft = s.condition.altitude / units::ft;
    double U_eas = 0.0;
    if (d.rule == GustRule::gradient_distance) {
      const double ref = d.design_velocity != 0.0 ? d.design_velocity : gradient_reference_velocity(s.condition.altitude);
      if (std::isnan(ref))
        fail(o, "gust.rule",
             which + ": the gradient_distance rule's U_ref is given here only up to 15000 ft (condition.altitude is " +
                 keys::fmt(alt_ft) + " ft): give gust.design_velocity");
      U_eas = ref * d.alleviation * gradient_distance_factor(g.length);
    } else {
      const double ref = d.design_velocity != 0.0 ? d.design_velocity
                                                  : derived_gust_velocity(d.rule == GustRule::derived_vd, s.condition.altitude);
      if (std::isnan(ref))
        fail(o, "gust.rule",
             which + ": the derived gust velocities of 23.333(c) are given here only up to 20000 ft (condition.altitude "
                     "is " + keys::fmt(alt_ft) + " ft): give gust.design_velocity");
      U_eas = ref;
    }
    g.amplitude = eas_to_tas(U_eas, rho);
  }
}

// ---------------------------------------------------------------------------------------
// The loader: one per load, holding the scenario being filled.

class Loader {
 public:
  explicit Loader(std::string top_file) : top_(std::move(top_file)) { s_.path = top_; }

  void push_file(const std::string& canonical, const std::string& shown) { chain_.push_back({canonical, shown}); }

  // Parse one file's text (its includes first) and apply its keys.
  void read_text(const std::string& text, const std::string& file, const std::string& base_dir, int depth) {
    check_bytes(text, file, "scenario files are ASCII text");
    check_brackets(text, file);
    toml::table root;
    try {
      root = toml::parse(std::string_view(text), std::string_view(file));
    } catch (const toml::parse_error& e) {
      throw ScenarioError{file, static_cast<int>(e.source().begin.line), static_cast<int>(e.source().begin.column),
                          "", "TOML syntax: " + std::string(e.description())};
    }
    if (const toml::node* inc = root.get("include")) {
      const KeyOrigin o = origin_of(file, inc->source());
      const auto* p = inc->as_string();
      if (!p) fail(o, "include", std::string("expects the path of a file (a string), relative to this file; got ") +
                                     type_words(*inc));
      include(p->get(), base_dir, o, depth);
    }
    file_ = file;
    apply_root(root);
  }

  // One --set item "key=value".
  void apply_override(const std::string& item) {
    const KeyOrigin o{"", 0, 0, "--set " + item};
    try {
      check_bytes(item, "", "--set values are ASCII text");
    } catch (ScenarioError& e) {
      // A --set item has no line: say which character instead.
      e.message += " (character " + std::to_string(e.column) + " of --set " + in_quotes(item) + ")";
      e.line = e.column = 0;
      throw;
    }
    if (item.find_first_of("\r\n") != std::string::npos) fail(o, "", "a --set value is one line");
    const auto eq = item.find('=');
    if (eq == std::string::npos) fail(o, "", "--set expects key=value, e.g. condition.airspeed=\"110 kt\"");
    const std::string key(trim(std::string_view(item).substr(0, eq)));
    const std::string value(trim(std::string_view(item).substr(eq + 1)));
    if (key == "include" || key.rfind("event", 0) == 0 || key.rfind("gust", 0) == 0)
      fail(o, key, "cannot be set with --set: edit include, [[event]] and [[gust]] in the file");
    const Key* k = keys::find(key, true);
    if (!k) {
      const auto dot = key.find('.');
      const std::string s = dot == std::string::npos
                                ? suggestion("", key)
                                : suggestion(std::string_view(key).substr(0, dot), std::string_view(key).substr(dot + 1));
      fail(o, key, "unknown key" + (s.empty() ? std::string("; see the key reference") : "; " + s));
    }
    if (value.empty()) fail(o, k->name, "has no value after '='");
    // The value in TOML syntax when it is one (a number, "a string", true, an array); otherwise
    // the bare text stands for a string, so that --set condition.airspeed=110 kt works.
    toml::table parsed;
    const toml::node* node = nullptr;
    try {
      parsed = toml::parse(std::string_view("v = " + value));
      node = parsed.get("v");
    } catch (const toml::parse_error&) {
      node = nullptr;
    }
    toml::value<std::string> bare(value);
    override_ = o;
    in_override_ = true;
    apply(*k, node ? *node : static_cast<const toml::node&>(bare), o);
    in_override_ = false;
  }

  Scenario finish() {
    for (const auto& k : keys::table_keys()) {
      if (!k.required || s_.origins.count(k.name)) continue;
      const std::string table(keys::table_of(k));
      const auto it = table_pos_.find(table);
      const KeyOrigin where = it != table_pos_.end() ? it->second : KeyOrigin{top_, 0, 0, ""};
      fail(where, k.name,
           "missing required key " + std::string(keys::short_name(k)) + " in [" + table + "]: " + k.meaning +
               ", allowed " + keys::range_text(k) + "; add it to [" + table + "] or give --set " + k.name + "=VALUE");
    }
    if (!s_.airplane.circuit.reversible && !s_.origins.count("run.controls")) s_.run.controls = ControlsChoice::held;
    derive_gust_starts(s_);
    derive_gust_amplitudes(s_);
    sort_events(s_);
    validate(s_);
    return std::move(s_);
  }

 private:
  KeyOrigin at(const toml::node& n) const { return in_override_ ? override_ : origin_of(file_, n.source()); }

  void include(const std::string& rel, const std::string& base_dir, const KeyOrigin& o, int depth) {
    if (depth + 1 >= max_include_depth) fail(o, "include", "includes are nested too deep (at most 16 files)");
    fs::path p(rel);
    if (p.is_relative() && !base_dir.empty()) p = fs::path(base_dir) / p;
    std::error_code ec;
    fs::path canon = fs::weakly_canonical(p, ec);
    if (ec) canon = p.lexically_normal();
    for (const auto& [c, shown] : chain_)
      if (c == canon.string()) {
        std::string cycle;
        for (const auto& f : chain_) cycle += f.second + " -> ";
        fail(o, "include", "include cycle: " + cycle + p.string());
      }
    const std::string text = read_limited(p, o, "include");
    chain_.push_back({canon.string(), p.string()});
    read_text(text, p.string(), p.parent_path().string(), depth + 1);
    chain_.pop_back();
  }

  void apply_root(const toml::table& root) {
    for (auto&& [k, v] : root) {
      const std::string name(k.str());
      if (name == "include") continue;
      if (name == "event" || name == "gust") {
        apply_array(name, v, origin_of(file_, k.source()));
        continue;
      }
      if (const Key* top = keys::find(name, false); top && keys::table_of(*top).empty()) {
        apply(*top, v, at(v));
        continue;
      }
      const auto& tables = keys::table_names();
      const bool known = std::find(tables.begin(), tables.end(), name) != tables.end();
      if (!known) {
        std::vector<std::string> cands = tables;
        cands.push_back("event");
        cands.push_back("gust");
        std::string near = keys::nearest(name, cands);
        std::string hint = near.empty() ? suggestion("", name) : "did you mean [" + near + "]?";
        fail(origin_of(file_, k.source()), name,
             std::string(v.is_table() ? "unknown table" : "unknown key") + (hint.empty() ? "" : "; " + hint) +
                 " (at the top of a file only include and name are allowed; tables: " + join(cands) + ")");
      }
      const auto* tbl = v.as_table();
      if (!tbl) fail(at(v), name, "must be a table: write [" + name + "] on a line of its own, then its keys");
      table_pos_[name] = origin_of(file_, tbl->source());
      for (auto&& [k2, v2] : *tbl) {
        const std::string dotted = name + "." + std::string(k2.str());
        const Key* key = keys::find(dotted, false);
        if (!key) {
          const std::string hint = suggestion(name, k2.str());
          fail(origin_of(file_, k2.source()), dotted,
               "unknown key in [" + name + "]" +
                   (hint.empty() ? "; its keys are: " + join(short_names(keys::table_keys(), name)) : "; " + hint));
        }
        apply(*key, v2, at(v2));
      }
    }
  }

  void apply(const Key& k, const toml::node& n, const KeyOrigin& o) {
    const std::string key = k.name;
    switch (k.kind) {
      case Kind::number: {
        const double v = number_of(k, key, n, o);
        check_range(k, key, v, o);
        k.num(s_) = v;
        break;
      }
      case Kind::integer: {
        const auto* i = n.as_integer();
        if (!i) fail(o, key, "expects a whole number, " + keys::range_text(k) + "; got " + type_words(n));
        check_range(k, key, static_cast<double>(i->get()), o);
        k.integer(s_) = static_cast<int>(i->get());
        break;
      }
      case Kind::boolean: {
        const auto* b = n.as_boolean();
        if (!b) fail(o, key, std::string("expects true or false; got ") + type_words(n));
        k.flag(s_) = b->get();
        break;
      }
      case Kind::choice: k.set_choice(s_, choice_of(k, key, n, o)); break;
      case Kind::text: {
        const auto* t = n.as_string();
        if (!t) fail(o, key, std::string("expects a string; got ") + type_words(n));
        k.text(s_) = t->get();
        break;
      }
      case Kind::lift_table: s_.airplane.wing.lift.table = lift_table(k, key, n, o); break;
      case Kind::tab_setting: {
        const auto* t = n.as_string();
        if (t && trim(t->get()) == "auto") {
          s_.trim.tab_auto = true;
        } else {
          const double v = number_of(k, key, n, o);
          check_range(k, key, v, o);
          s_.trim.tab_auto = false;
          s_.trim.tab = v;
        }
        break;
      }
    }
    s_.origins[key] = o;
  }

  std::vector<std::pair<double, double>> lift_table(const Key& k, const std::string& key, const toml::node& n,
                                                    const KeyOrigin& o) {
    const auto* a = n.as_array();
    if (!a)
      fail(o, key, std::string("expects an array of [alpha, CL] rows, e.g. [[\"-4 deg\", -0.1], [\"12 deg\", 1.3]]; "
                               "got ") + type_words(n));
    if (a->size() < 2) fail(o, key, "needs at least 2 rows [alpha, CL]");
    std::vector<std::pair<double, double>> rows;
    for (std::size_t i = 0; i < a->size(); ++i) {
      const toml::node& e = *a->get(i);
      const KeyOrigin ro = at(e);
      const std::string row = "row " + std::to_string(i + 1);
      const auto* pair = e.as_array();
      if (!pair || pair->size() != 2) fail(ro, key, row + " must be a pair [alpha, CL]");
      const KeyOrigin ao = at(*pair->get(0));
      const double alpha = number_of(k, key, *pair->get(0), ao);
      if (auto why = keys::range_problem(k, alpha)) fail(ao, key, row + ": alpha " + *why);
      const toml::node& cn = *pair->get(1);
      const KeyOrigin co = at(cn);
      if (!cn.is_number()) fail(co, key, row + ": CL expects a plain number; got " + type_words(cn));
      const double cl = cn.is_integer() ? static_cast<double>(cn.as_integer()->get()) : cn.as_floating_point()->get();
      if (!std::isfinite(cl) || std::fabs(cl) > cl_limit)
        fail(co, key, row + ": CL = " + keys::fmt(cl) + " is outside the allowed range -5..5");
      if (!rows.empty() && alpha <= rows.back().first)
        fail(ao, key,
             row + ": alpha must increase strictly from row to row; " + keys::value_text(k, alpha) + " follows " +
                 keys::value_text(k, rows.back().first));
      rows.emplace_back(alpha, cl);
    }
    return rows;
  }

  // [[event]] and [[gust]]: the array replaces what an included file gave.
  void apply_array(const std::string& name, const toml::node& v, const KeyOrigin& ko) {
    const auto* arr = v.as_array();
    if (!arr) {
      if (v.is_table()) fail(ko, name, "write [[" + name + "]] (an array of tables, one per " + name + "), not [" + name + "]");
      fail(ko, name, "must be an array of tables: [[" + name + "]] once per " + name);
    }
    if (name == "event") {
      s_.events.clear();
    } else {
      s_.gusts.clear();
      s_.gust_start_times.clear();
      s_.gust_designs.clear();
    }
    for (auto it = s_.origins.begin(); it != s_.origins.end();)
      it = it->first.rfind(name + "[", 0) == 0 ? s_.origins.erase(it) : std::next(it);
    for (std::size_t i = 0; i < arr->size(); ++i) {
      const toml::node& e = *arr->get(i);
      const auto* t = e.as_table();
      const KeyOrigin eo = at(e);
      if (!t) fail(eo, name, "each entry must be a table ([[" + name + "]] and its keys); got " + std::string(type_words(e)));
      s_.origins[name + "[" + std::to_string(i) + "]"] = eo;
      if (name == "event")
        s_.events.push_back(event_of(*t, eo, i));
      else
        gust_of(*t, eo, i);
    }
  }

  // The keys of one array entry, each checked against `list`.
  std::map<std::string, const toml::node*> entry_keys(const toml::table& t, std::span<const Key> list,
                                                      const std::string& name) {
    std::map<std::string, const toml::node*> got;
    for (auto&& [k, v] : t) {
      const std::string sn(k.str());
      if (!keys::find_in(list, sn)) {
        const std::string near = keys::nearest(sn, short_names(list, ""));
        fail(origin_of(file_, k.source()), name + "." + sn,
             "unknown key in [[" + name + "]]" +
                 (near.empty() ? "; its keys are: " + join(short_names(list, "")) : "; did you mean \"" + near + "\"?"));
      }
      got[sn] = &v;
    }
    return got;
  }

  double entry_number(std::span<const Key> list, const std::string& sn, const toml::node& n) {
    const Key& k = *keys::find_in(list, sn);
    const KeyOrigin o = at(n);
    const double v = number_of(k, k.name, n, o);
    check_range(k, k.name, v, o);
    return v;
  }

  Event event_of(const toml::table& t, const KeyOrigin& eo, std::size_t index) {
    const auto list = keys::event_keys();
    const auto got = entry_keys(t, list, "event");
    const std::string which = "[[event]] number " + std::to_string(index + 1);
    for (const char* req : {"time", "action"})
      if (!got.count(req)) fail(eo, std::string("event.") + req, which + " has no " + req);
    Event e;
    e.line = eo.line;
    e.time = entry_number(list, "time", *got.at("time"));
    const Key& ak = *keys::find_in(list, "action");
    e.kind = static_cast<EventKind>(choice_of(ak, ak.name, *got.at("action"), at(*got.at("action"))));
    // What each action takes besides time and action, and which of those it needs.
    struct Takes {
      std::vector<std::string> allowed, required;
    };
    Takes takes;
    switch (e.kind) {
      case EventKind::let_go:
      case EventKind::take_hold: break;
      case EventKind::tab: takes = {{"tab"}, {"tab"}}; break;
      case EventKind::pulse: takes = {{"force", "duration"}, {"force", "duration"}}; break;
      case EventKind::elevator: takes = {{"elevator", "duration"}, {"elevator"}}; break;
    }
    const std::string action = ak.choices[static_cast<std::size_t>(e.kind)];
    for (const auto& [sn, node] : got) {
      if (sn == "time" || sn == "action") continue;
      if (std::find(takes.allowed.begin(), takes.allowed.end(), sn) == takes.allowed.end())
        fail(at(*node), "event." + sn,
             "does not apply to action \"" + action + "\" (" +
                 (takes.allowed.empty() ? std::string("it takes only time and action")
                                        : "it takes time, action and " + join(takes.allowed)) +
                 ")");
    }
    for (const auto& r : takes.required)
      if (!got.count(r)) fail(eo, "event." + r, which + ": action \"" + action + "\" needs " + r);
    if (got.count("tab")) e.value = entry_number(list, "tab", *got.at("tab"));
    if (got.count("force")) e.value = entry_number(list, "force", *got.at("force"));
    if (got.count("elevator")) e.value = entry_number(list, "elevator", *got.at("elevator"));
    if (got.count("duration")) {
      e.duration = entry_number(list, "duration", *got.at("duration"));
      if (e.kind == EventKind::pulse && e.duration <= 0)
        fail(at(*got.at("duration")), "event.duration", "a pulse needs a duration above 0 s");
    }
    return e;
  }

  void gust_of(const toml::table& t, const KeyOrigin& eo, std::size_t index) {
    const auto list = keys::gust_keys();
    const auto got = entry_keys(t, list, "gust");
    const std::string which = "[[gust]] number " + std::to_string(index + 1);
    GustDesign d;
    if (got.count("rule")) {
      const Key& k = *keys::find_in(list, "rule");
      d.rule = static_cast<GustRule>(choice_of(k, k.name, *got.at("rule"), at(*got.at("rule"))));
    }
    const bool derived = d.rule == GustRule::derived_vc || d.rule == GustRule::derived_vd;
    if (!got.count("length") && !derived)
      fail(eo, "gust.length", which + " has no length (only a derived_vc or derived_vd rule supplies one: 12.5 MAC)");
    if (d.rule == GustRule::amplitude && !got.count("amplitude"))
      fail(eo, "gust.amplitude", which + " has no amplitude (give one, or a rule)");
    if (d.rule != GustRule::amplitude && got.count("amplitude"))
      fail(at(*got.at("amplitude")), "gust.amplitude",
           which + ": give either amplitude or rule, not both (gust.design_velocity changes a rule's velocity)");
    if (d.rule == GustRule::amplitude)
      for (const char* k : {"design_velocity", "alleviation"})
        if (got.count(k)) fail(at(*got.at(k)), std::string("gust.") + k, which + ": applies only with gust.rule");
    if (d.rule != GustRule::gradient_distance && got.count("alleviation"))
      fail(at(*got.at("alleviation")), "gust.alleviation", which + ": applies only with rule = \"gradient_distance\"");
    if (got.count("design_velocity")) {
      d.design_velocity = entry_number(list, "design_velocity", *got.at("design_velocity"));
      if (d.design_velocity == 0.0)
        fail(at(*got.at("design_velocity")), "gust.design_velocity", which + ": must not be 0 (leave it out for the rule's value)");
    }
    if (got.count("alleviation")) d.alleviation = entry_number(list, "alleviation", *got.at("alleviation"));
    d.length_auto = !got.count("length");
    const bool has_start = got.count("start") > 0, has_time = got.count("start_time") > 0;
    if (has_start == has_time)
      fail(has_start ? at(*got.at("start_time")) : eo, "gust.start",
           which + " needs exactly one of start (a distance) and start_time (a time)");
    DiscreteGust g;
    if (got.count("shape")) {
      const Key& k = *keys::find_in(list, "shape");
      g.shape = static_cast<GustShape>(choice_of(k, k.name, *got.at("shape"), at(*got.at("shape"))));
    }
    if (got.count("component")) {
      const Key& k = *keys::find_in(list, "component");
      g.component = static_cast<GustComponent>(choice_of(k, k.name, *got.at("component"), at(*got.at("component"))));
    }
    if (got.count("length")) g.length = entry_number(list, "length", *got.at("length"));
    if (got.count("amplitude")) g.amplitude = entry_number(list, "amplitude", *got.at("amplitude"));
    const bool train = g.shape == GustShape::train;
    for (const char* k : {"count", "spacing"}) {
      if (train && !got.count(k)) fail(eo, std::string("gust.") + k, which + ": shape \"train\" needs " + k);
      if (!train && got.count(k))
        fail(at(*got.at(k)), std::string("gust.") + k, which + ": applies only to shape \"train\"");
    }
    if (train) {
      const Key& ck = *keys::find_in(list, "count");
      const toml::node& cn = *got.at("count");
      const auto* ci = cn.as_integer();
      if (!ci) fail(at(cn), ck.name, "expects a whole number, " + keys::range_text(ck) + "; got " + type_words(cn));
      check_range(ck, ck.name, static_cast<double>(ci->get()), at(cn));
      g.count = static_cast<int>(ci->get());
      g.spacing = entry_number(list, "spacing", *got.at("spacing"));
    }
    const bool tmin = got.count("tune_min") > 0, tmax = got.count("tune_max") > 0;
    if (tmin != tmax)
      fail(at(*got.at(tmin ? "tune_min" : "tune_max")), tmin ? "gust.tune_max" : "gust.tune_min",
           which + ": a tuned-gust search needs both tune_min and tune_max");
    if (got.count("tune_points") && !tmin)
      fail(at(*got.at("tune_points")), "gust.tune_points", which + ": applies only with tune_min and tune_max");
    if (tmin) {
      d.tune_min = entry_number(list, "tune_min", *got.at("tune_min"));
      d.tune_max = entry_number(list, "tune_max", *got.at("tune_max"));
      if (got.count("tune_points")) {
        const Key& pk = *keys::find_in(list, "tune_points");
        const toml::node& pn = *got.at("tune_points");
        const auto* pi = pn.as_integer();
        if (!pi) fail(at(pn), pk.name, "expects a whole number, " + keys::range_text(pk) + "; got " + type_words(pn));
        check_range(pk, pk.name, static_cast<double>(pi->get()), at(pn));
        d.tune_points = static_cast<int>(pi->get());
      }
    }
    std::optional<double> start_time;
    if (has_start) g.start = entry_number(list, "start", *got.at("start"));
    if (has_time) start_time = entry_number(list, "start_time", *got.at("start_time"));
    s_.gusts.push_back(g);
    s_.gust_start_times.push_back(start_time);
    s_.gust_designs.push_back(d);
  }

  Scenario s_;
  std::string top_;
  std::string file_;                                        // the file whose keys are being applied
  std::vector<std::pair<std::string, std::string>> chain_;  // files being read: canonical, as shown
  std::map<std::string, KeyOrigin> table_pos_;              // last [table] header seen, per table
  KeyOrigin override_;
  bool in_override_ = false;
};

Scenario load_text(Loader& L, const std::string& text, const std::string& name, const std::string& base_dir,
                   const std::vector<std::string>& overrides) {
  L.read_text(text, name, base_dir, 0);
  for (const auto& o : overrides) L.apply_override(o);
  return L.finish();
}

}  // namespace

Scenario load_scenario(const std::string& path, const std::vector<std::string>& overrides) {
  const fs::path p(path);
  const std::string text = read_limited(p, KeyOrigin{path, 0, 0, ""}, "");
  Loader L(path);
  std::error_code ec;
  const fs::path canon = fs::weakly_canonical(p, ec);
  L.push_file(ec ? p.lexically_normal().string() : canon.string(), path);
  return load_text(L, text, path, p.parent_path().string(), overrides);
}

Scenario parse_scenario(const std::string& text, const std::string& name, const std::string& base_dir,
                        const std::vector<std::string>& overrides) {
  Loader L(name);
  return load_text(L, text, name, base_dir, overrides);
}

// ---------------------------------------------------------------------------------------
// Single keys by name (sweeps, the window).

namespace {

const Key& numeric_key(const std::string& key, const KeyOrigin& o) {
  const Key* k = keys::find(key, true);
  if (!k) {
    const auto dot = key.find('.');
    const std::string s = dot == std::string::npos
                              ? suggestion("", key)
                              : suggestion(std::string_view(key).substr(0, dot), std::string_view(key).substr(dot + 1));
    fail(o, key, "unknown key" + (s.empty() ? std::string() : "; " + s));
  }
  if (k->kind != Kind::number && k->kind != Kind::integer && k->kind != Kind::tab_setting)
    fail(o, k->name, "is not a numeric key");
  return *k;
}

}  // namespace

void set_value(Scenario& s, const std::string& key, double si_value, const std::string& origin) {
  const KeyOrigin o{"", 0, 0, origin};
  const Key& k = numeric_key(key, o);
  check_range(k, k.name, si_value, o);
  switch (k.kind) {
    case Kind::number: k.num(s) = si_value; break;
    case Kind::integer: k.integer(s) = static_cast<int>(si_value); break;
    case Kind::tab_setting:
      s.trim.tab_auto = false;
      s.trim.tab = si_value;
      break;
    default: break;
  }
  s.origins[k.name] = o;
  derive_gust_starts(s);
  derive_gust_amplitudes(s);
}

void derive_gust_values(Scenario& s) {
  derive_gust_starts(s);
  derive_gust_amplitudes(s);
}

double get_value(const Scenario& s, const std::string& key) {
  const KeyOrigin o{"", 0, 0, ""};
  const Key& k = numeric_key(key, o);
  // The accessors hand out references for writing; reading through them changes nothing.
  Scenario& m = const_cast<Scenario&>(s);
  switch (k.kind) {
    case Kind::number: return k.num(m);
    case Kind::integer: return k.integer(m);
    case Kind::tab_setting:
      if (s.trim.tab_auto) fail(o, k.name, "is \"auto\": the tab is found by the trim, it has no set value");
      return s.trim.tab;
    default: break;
  }
  return 0.0;
}

// No range check here: the text may be a step or a spread rather than a value of the key
// (set_value checks the values it is given).
double parse_quantity(const std::string& key, const std::string& text, const std::string& origin) {
  const KeyOrigin o{"", 0, 0, origin};
  const Key& k = numeric_key(key, o);
  return quantity_from_text(k, k.name, text, o);
}

// ---------------------------------------------------------------------------------------
// Relations between keys, and the model's own checks.

namespace {

// Where a key was set (the loader's origins), for messages about relations between keys.
struct Where {
  const Scenario& s;
  KeyOrigin operator()(const std::string& key) const {
    const auto it = s.origins.find(key);
    return it != s.origins.end() ? it->second : KeyOrigin{s.path, 0, 0, ""};
  }
  // the first of the keys that was set somewhere
  KeyOrigin any(std::initializer_list<const char*> ks) const {
    for (const char* k : ks)
      if (s.origins.count(k)) return (*this)(k);
    return KeyOrigin{s.path, 0, 0, ""};
  }
};

std::string angle_text(double v) {
  static const Key& angle_key = *keys::find("elevator.delta_min", false);
  return keys::value_text(angle_key, v);
}

// Each key on its own (values may have been set in code rather than read from a file).
void validate_each_key(const Scenario& s, const Where& where) {
  Scenario& m = const_cast<Scenario&>(s);  // read through the table's accessors only
  for (const auto& k : keys::table_keys()) {
    const std::string key = k.name;
    switch (k.kind) {
      case Kind::number: check_range(k, key, k.num(m), where(key)); break;
      case Kind::integer: check_range(k, key, k.integer(m), where(key)); break;
      case Kind::tab_setting:
        if (!s.trim.tab_auto) check_range(k, key, s.trim.tab, where(key));
        break;
      case Kind::choice: {
        const int c = k.get_choice(s);
        if (c < 0 || static_cast<std::size_t>(c) >= k.choices.size())
          fail(where(key), key, "has no valid value; use one of " + choices_text(k));
        break;
      }
      case Kind::lift_table: {
        const auto& t = s.airplane.wing.lift.table;
        if (t.size() == 1) fail(where(key), key, "needs at least 2 rows [alpha, CL]");
        for (std::size_t i = 0; i < t.size(); ++i) {
          if (auto why = keys::range_problem(k, t[i].first)) fail(where(key), key, "alpha " + *why);
          if (!std::isfinite(t[i].second) || std::fabs(t[i].second) > cl_limit)
            fail(where(key), key, "CL = " + keys::fmt(t[i].second) + " is outside the allowed range -5..5");
          if (i > 0 && t[i].first <= t[i - 1].first)
            fail(where(key), key, "alpha must increase strictly from row to row");
        }
        break;
      }
      case Kind::boolean:
      case Kind::text: break;
    }
  }
}

// Stops, tab range, envelope, reversibility, run times.
void validate_relations(const Scenario& s, const Where& where) {
  const auto deg = angle_text;
  const auto& ap = s.airplane;
  const auto& el = ap.elevator;
  const auto& ci = ap.circuit;

  if (!(el.delta_min < 0.0))
    fail(where("elevator.delta_min"), "elevator.delta_min",
         "the trailing-edge-up stop must be below 0 (delta_min < 0 < delta_max); got " + deg(el.delta_min));
  if (!(el.delta_max > 0.0))
    fail(where("elevator.delta_max"), "elevator.delta_max",
         "the trailing-edge-down stop must be above 0 (delta_min < 0 < delta_max); got " + deg(el.delta_max));
  if (!(ci.tab_min < ci.tab_max))
    fail(where.any({"circuit.tab_max", "circuit.tab_min"}), "circuit.tab_min, circuit.tab_max",
         "the tab range is empty: tab_min (" + deg(ci.tab_min) + ") must be below tab_max (" + deg(ci.tab_max) + ")");
  if (s.airplane.circuit_nl.sliding_friction > ci.friction)
    fail(where.any({"circuit.sliding_friction", "circuit.friction"}), "circuit.sliding_friction",
         "= " + keys::fmt(s.airplane.circuit_nl.sliding_friction) + " N is above the breakout force circuit.friction = " +
             keys::fmt(ci.friction) + " N: the sliding force must be at most the breakout (0 = equal to it)");
  if (s.airplane.circuit_nl.free_play > 0.0 && ci.stick_mass <= 0.0)
    fail(where.any({"circuit.free_play", "circuit.stick_mass"}), "circuit.free_play",
         "= " + deg(s.airplane.circuit_nl.free_play) +
             " needs circuit.stick_mass > 0: with free play the stick side is a body of its own (got stick_mass = 0)");
  if (!(s.envelope.cg_forward < s.envelope.cg_aft))
    fail(where.any({"envelope.cg_aft", "envelope.cg_forward"}), "envelope.cg_forward, envelope.cg_aft",
         "the forward CG limit (" + keys::fmt(s.envelope.cg_forward) + ") must be ahead of, i.e. less than, the aft limit (" +
             keys::fmt(s.envelope.cg_aft) + ")");
  if (s.envelope.min_speed > 0.0 && s.envelope.max_speed > 0.0 && !(s.envelope.min_speed < s.envelope.max_speed))
    fail(where.any({"envelope.max_speed", "envelope.min_speed"}), "envelope.min_speed, envelope.max_speed",
         "the envelope's min_speed must be below its max_speed");
  if (s.envelope.mass_min > 0.0 && s.envelope.mass_max > 0.0 && !(s.envelope.mass_min <= s.envelope.mass_max))
    fail(where.any({"envelope.mass_max", "envelope.mass_min"}), "envelope.mass_min, envelope.mass_max",
         "the envelope's lightest mass (" + keys::fmt(s.envelope.mass_min) + " kg) must not exceed its heaviest (" +
             keys::fmt(s.envelope.mass_max) + " kg)");
  if (ci.reversible && el.ch_delta == 0.0)
    fail(where.any({"elevator.ch_delta", "circuit.reversible"}), "elevator.ch_delta",
         "is 0 while circuit.reversible = true: the floating elevator's angle and the stick-free neutral point divide "
         "by ch_delta, so a reversible circuit needs a non-zero value (typically negative, e.g. -0.45 /rad); only an "
         "irreversible circuit (circuit.reversible = false) may have 0");
  if (!ci.reversible && s.run.controls != ControlsChoice::held)
    fail(where.any({"run.controls", "circuit.reversible"}), "run.controls",
         std::string("= \"") + (s.run.controls == ControlsChoice::free ? "free" : "both") +
             "\" asks for a stick-free case, but in an irreversible circuit (circuit.reversible = false) "
             "the elevator cannot float: held case only; use \"held\"");
  if (s.run.let_go_time > s.run.duration)
    fail(where.any({"run.let_go_time", "run.duration"}), "run.let_go_time",
         "= " + keys::fmt(s.run.let_go_time) + " s is after the end of the run (run.duration = " +
             keys::fmt(s.run.duration) + " s)");
  if (s.run.output_step > s.run.duration)
    fail(where.any({"run.output_step", "run.duration"}), "run.output_step",
         "= " + keys::fmt(s.run.output_step) + " s is longer than the run (run.duration = " + keys::fmt(s.run.duration) +
             " s)");
  if (!s.trim.tab_auto && (s.trim.tab < ci.tab_min || s.trim.tab > ci.tab_max))
    fail(where("trim.tab"), "trim.tab",
         "= " + deg(s.trim.tab) + " is outside the tab's range circuit.tab_min..tab_max = " + deg(ci.tab_min) + ".." +
             deg(ci.tab_max));

}

void validate_timeline(const Scenario& s, const Where& where) {
  const auto& ci = s.airplane.circuit;
  const auto deg = angle_text;
  // The timeline.
  const auto ev_keys = keys::event_keys();
  const char* action_names[] = {"let_go", "take_hold", "tab", "pulse", "elevator"};
  for (std::size_t i = 0; i < s.events.size(); ++i) {
    const Event& e = s.events[i];
    KeyOrigin o = where("event[" + std::to_string(i) + "]");
    if (o.line == 0 && e.line > 0) o.line = e.line;
    const int kind = static_cast<int>(e.kind);
    if (kind < 0 || kind > 4) fail(o, "event.action", "has no valid value");
    const std::string what = std::string("the \"") + action_names[kind] + "\" event at " + keys::fmt(e.time) + " s";
    if (!std::isfinite(e.time) || e.time < 0.0 || e.time > s.run.duration)
      fail(o, "event.time",
           what + " is outside the run: events happen from 0 to run.duration = " + keys::fmt(s.run.duration) +
               " s (a pulse may end after the run, but must start within it)");
    const auto check = [&](const char* sn, double v) {
      if (auto why = keys::range_problem(*keys::find_in(ev_keys, sn), v)) fail(o, std::string("event.") + sn, *why);
    };
    switch (e.kind) {
      case EventKind::let_go:
      case EventKind::take_hold: break;
      case EventKind::tab:
        check("tab", e.value);
        if (e.value < ci.tab_min || e.value > ci.tab_max)
          fail(o, "event.tab",
               what + " moves the tab to " + deg(e.value) + ", outside circuit.tab_min..tab_max = " + deg(ci.tab_min) +
                   ".." + deg(ci.tab_max));
        break;
      case EventKind::pulse:
        check("force", e.value);
        check("duration", e.duration);
        if (!(e.duration > 0.0)) fail(o, "event.duration", what + ": a pulse needs a duration above 0 s");
        break;
      case EventKind::elevator:
        check("elevator", e.value);
        check("duration", e.duration);
        break;
    }
    if (!ci.reversible && (e.kind == EventKind::let_go || e.kind == EventKind::take_hold || e.kind == EventKind::pulse))
      fail(o, "event.action",
           what + " belongs to the stick-free case, and an irreversible circuit (circuit.reversible = false) has "
                  "none: use tab or elevator events");
  }

}

void validate_gusts(const Scenario& s, const Where& where) {
  // The gusts: each must begin within the run.
  const auto gu_keys = keys::gust_keys();
  const double closing = gust_closing_speed(s);
  const double reach = closing * s.run.duration;
  for (std::size_t i = 0; i < s.gusts.size(); ++i) {
    const DiscreteGust& g = s.gusts[i];
    const KeyOrigin o = where("gust[" + std::to_string(i) + "]");
    const std::string which = "[[gust]] number " + std::to_string(i + 1);
    const auto check = [&](const char* sn, double v) {
      if (auto why = keys::range_problem(*keys::find_in(gu_keys, sn), v))
        fail(o, std::string("gust.") + sn, which + ": " + *why);
    };
    const int shape = static_cast<int>(g.shape), comp = static_cast<int>(g.component);
    if (shape < 0 || shape > 3 || comp < 0 || comp > 1) fail(o, "gust.shape", which + " has no valid shape or component");
    if (g.shape == GustShape::train) {
      if (auto why = keys::range_problem(*keys::find_in(gu_keys, "count"), g.count)) fail(o, "gust.count", which + ": " + *why);
      check("spacing", g.spacing);
    }
    if (i < s.gust_designs.size()) {
      const GustDesign& d = s.gust_designs[i];
      const int rule = static_cast<int>(d.rule);
      if (rule < 0 || rule > 3) fail(o, "gust.rule", which + " has no valid rule");
      if (d.design_velocity != 0.0) check("design_velocity", d.design_velocity);
      check("alleviation", d.alleviation);
      if (d.tune_min != 0.0 || d.tune_max != 0.0) {
        check("tune_min", d.tune_min);
        check("tune_max", d.tune_max);
        if (auto why = keys::range_problem(*keys::find_in(gu_keys, "tune_points"), d.tune_points))
          fail(o, "gust.tune_points", which + ": " + *why);
        if (!(d.tune_min < d.tune_max))
          fail(o, "gust.tune_max",
               which + ": tune_max (" + keys::fmt(d.tune_max) + " m) must be more than tune_min (" + keys::fmt(d.tune_min) +
                   " m)");
        if (g.shape != GustShape::one_minus_cosine && g.shape != GustShape::train)
          fail(o, "gust.tune_min", which + ": the tuned-gust search varies a 1-cosine gradient distance: use shape "
                                           "\"one_minus_cosine\" or \"train\"");
        for (std::size_t j = 0; j < i && j < s.gust_designs.size(); ++j)
          if (s.gust_designs[j].tune_max > 0.0)
            fail(o, "gust.tune_min", which + ": only one gust may be tuned (gust number " + std::to_string(j + 1) +
                                         " is tuned already)");
      }
    }
    check("length", g.length);
    check("amplitude", g.amplitude);
    const bool timed = i < s.gust_start_times.size() && s.gust_start_times[i].has_value();
    if (timed) check("start_time", *s.gust_start_times[i]);
    check("start", g.start);
    if (g.start > reach) {
      const std::string how =
          timed ? "starts at start_time = " + keys::fmt(*s.gust_start_times[i]) + " s"
                : "starts " + keys::fmt(g.start) + " m along the path";
      fail(o, timed ? "gust.start_time" : "gust.start",
           which + " " + how + ", after the run ends: in run.duration = " + keys::fmt(s.run.duration) +
               " s the airplane covers only " + keys::fmt(reach) + " m of it (V cos(gamma) = " +
               keys::fmt(s.condition.airspeed * std::cos(s.condition.flight_path)) + " m/s" +
               (s.gust_front_speed > 0 ? " plus the gust front's " + keys::fmt(s.gust_front_speed) + " m/s" : "") + ")");
    }
  }

}

// Turbulence, and whether the airplane is physically possible.
void validate_turbulence_and_model(const Scenario& s, const Where& where) {
  const auto& ap = s.airplane;
  // Turbulence: it must begin within the run.
  if (s.turbulence.model != TurbulenceKind::none && s.turbulence.start_time > s.run.duration)
    fail(where.any({"turbulence.start_time", "run.duration"}), "turbulence.start_time",
         "= " + keys::fmt(s.turbulence.start_time) + " s is after the end of the run (run.duration = " +
             keys::fmt(s.run.duration) + " s)");

  // Is the airplane physically possible? The model says which keys are at fault.
  try {
    (void)make_plant(ap);
  } catch (const ModelError& e) {
    std::string first(e.keys);
    first = first.substr(0, first.find(','));
    fail(where(first), e.keys, e.message);
  }
}

}  // namespace

void validate(const Scenario& s) {
  const Where where{s};
  validate_each_key(s, where);
  validate_relations(s, where);
  validate_timeline(s, where);
  validate_gusts(s, where);
  validate_turbulence_and_model(s, where);
}

std::string ScenarioWarning::what() const {
  return ScenarioError{where.file, where.line, where.column, key, reason}.what();
}

// Implausible but legal inputs. Each check says what it compares and why the bound holds.
std::vector<ScenarioWarning> plausibility_warnings(const Scenario& s) {
  const Where where{s};
  std::vector<ScenarioWarning> w;
  const auto warn = [&](const std::string& key, std::string reason) {
    KeyOrigin o = where(key);
    if (!o.via.empty()) reason += " (from " + o.via + ")";
    w.push_back({o, key, std::move(reason)});
  };
  const auto& ap = s.airplane;
  const auto& el = ap.elevator;
  const auto& t = ap.tail;
  // tail.area includes the elevator (model/airplane.hpp): the elevator's area aft of the hinge
  // is a part of it (geometry)
  if (el.area > t.area)
    warn("elevator.area", "= " + keys::fmt(el.area) + " m2 is larger than the whole horizontal tail (tail.area = " +
                              keys::fmt(t.area) + " m2, which includes the elevator)");
  // the hinge line and the tail's a.c. both lie on the tail's chord, which is shorter than
  // sqrt(S_t) for any tail aspect ratio above 1 (c = S/b = sqrt(S/AR)): geometry
  const double reach = std::sqrt(t.area);
  const double gap = el.x_hinge - t.x_ac;
  if (std::abs(gap) > reach)
    warn("elevator.x_hinge", "= " + keys::fmt(el.x_hinge) + " m puts the hinge line " + keys::fmt(std::abs(gap)) +
                                 " m " + (gap > 0 ? "aft" : "ahead") + " of the tail's a.c. (tail.x_ac = " +
                                 keys::fmt(t.x_ac) + " m); both lie on the tail's chord, which is shorter than sqrt(tail.area) = " +
                                 keys::fmt(reach) + " m for any tail aspect ratio above 1");
  // hinge-moment derivatives are a few tenths per radian (USAF TPS, Flying Qualities Phase vol.
  // II ch. 5; Etkin and Reid sec. 2.6 examples: about -0.1 .. -0.9 /rad); a value 57 times too
  // small is what a per-degree figure typed as a plain number gives
  const std::pair<const char*, double> hinge_derivatives[] = {
      {"elevator.ch_alpha", el.ch_alpha}, {"elevator.ch_delta", el.ch_delta}, {"elevator.ch_tab", el.ch_tab}};
  for (const auto& [key, v] : hinge_derivatives)
    if (v != 0.0 && std::abs(v) < 0.03)
      warn(key, "= " + keys::fmt(v) + " /rad is the size of a per-degree value (hinge-moment derivatives are about "
                "0.1 .. 0.9 /rad); if it was meant per degree, write \"" + keys::fmt(v) + " /deg\"");
  if (ap.mass.h_cg < s.envelope.cg_forward || ap.mass.h_cg > s.envelope.cg_aft)
    warn("mass.cg", "= " + keys::fmt(ap.mass.h_cg) + " (fraction of MAC) is outside the stated envelope " +
                        keys::fmt(s.envelope.cg_forward) + " .. " + keys::fmt(s.envelope.cg_aft) +
                        " (envelope.cg_forward .. envelope.cg_aft)");
  return w;
}

// ---------------------------------------------------------------------------------------
// Writing.

namespace {

std::string toml_string(const std::string& v) {
  std::string r = "\"";
  for (unsigned char c : v) {
    switch (c) {
      case '"': r += "\\\""; break;
      case '\\': r += "\\\\"; break;
      case '\n': r += "\\n"; break;
      case '\t': r += "\\t"; break;
      case '\r': r += "\\r"; break;
      default:
        if (c < 0x20 || c == 0x7f) {
          char buf[8];
          std::snprintf(buf, sizeof buf, "\\u%04X", static_cast<unsigned>(c));
          r += buf;
        } else if (c >= 0x80) {
          r += '?';  // scenario files are ASCII: the loader would refuse the byte
        } else {
          r += static_cast<char>(c);
        }
    }
  }
  return r + "\"";
}

// The spelling of choice i; an invalid value (only possible for a scenario built in code and
// not validated) is written as "?", which the loader will refuse with a clear message.
const char* choice_name(const Key& k, int i) {
  return i >= 0 && static_cast<std::size_t>(i) < k.choices.size() ? k.choices[static_cast<std::size_t>(i)] : "?";
}

std::string number_line(const Key& k, std::string_view name, double v) {
  std::string line = std::string(name) + " = " + keys::fmt_exact(v);
  if (k.dim != units::Dim::none) {
    line += "  # " + std::string(units::si_unit(k.dim));
    if (keys::display_factor(k) != 1.0) line += " (" + keys::fmt(v / keys::display_factor(k)) + " " + keys::display_unit(k) + ")";
  }
  return line + "\n";
}

}  // namespace

std::string to_toml(const Scenario& s) {
  Scenario& m = const_cast<Scenario&>(s);  // read through the table's accessors only
  std::string out =
      "# Scenario written out in full: every key, numbers in SI units with angles in radians.\n";
  std::vector<std::string> tables{""};  // the keys at the top of the file come first
  tables.insert(tables.end(), keys::table_names().begin(), keys::table_names().end());
  for (const auto& table : tables) {
    if (!table.empty()) out += "\n[" + table + "]\n";
    for (const auto& k : keys::table_keys()) {
      if (keys::table_of(k) != table) continue;
      const std::string_view sn = keys::short_name(k);
      switch (k.kind) {
        case Kind::number: out += number_line(k, sn, k.num(m)); break;
        case Kind::integer: out += std::string(sn) + " = " + std::to_string(k.integer(m)) + "\n"; break;
        case Kind::boolean: out += std::string(sn) + " = " + (k.flag(m) ? "true" : "false") + "\n"; break;
        case Kind::choice:
          out += std::string(sn) + " = \"" + choice_name(k, k.get_choice(s)) + "\"\n";
          break;
        case Kind::text: out += std::string(sn) + " = " + toml_string(k.text(m)) + "\n"; break;
        case Kind::lift_table: {
          const auto& t = s.airplane.wing.lift.table;
          if (t.empty()) break;
          out += std::string(sn) + " = [  # [alpha (rad), CL]\n";
          for (const auto& [a, cl] : t) out += "  [" + keys::fmt_exact(a) + ", " + keys::fmt_exact(cl) + "],\n";
          out += "]\n";
          break;
        }
        case Kind::tab_setting:
          if (s.trim.tab_auto)
            out += std::string(sn) + " = \"auto\"\n";
          else
            out += number_line(k, sn, s.trim.tab);
          break;
      }
    }
  }
  const auto ev = keys::event_keys();
  for (const auto& e : s.events) {
    out += "\n[[event]]\n" + number_line(*keys::find_in(ev, "time"), "time", e.time);
    out += std::string("action = \"") + choice_name(*keys::find_in(ev, "action"), static_cast<int>(e.kind)) + "\"\n";
    switch (e.kind) {
      case EventKind::let_go:
      case EventKind::take_hold: break;
      case EventKind::tab: out += number_line(*keys::find_in(ev, "tab"), "tab", e.value); break;
      case EventKind::pulse:
        out += number_line(*keys::find_in(ev, "force"), "force", e.value);
        out += number_line(*keys::find_in(ev, "duration"), "duration", e.duration);
        break;
      case EventKind::elevator:
        out += number_line(*keys::find_in(ev, "elevator"), "elevator", e.value);
        out += number_line(*keys::find_in(ev, "duration"), "duration", e.duration);
        break;
    }
  }
  const auto gu = keys::gust_keys();
  for (std::size_t i = 0; i < s.gusts.size(); ++i) {
    const auto& g = s.gusts[i];
    out += "\n[[gust]]\n";
    out += std::string("shape = \"") + choice_name(*keys::find_in(gu, "shape"), static_cast<int>(g.shape)) + "\"\n";
    out += std::string("component = \"") +
           choice_name(*keys::find_in(gu, "component"), static_cast<int>(g.component)) + "\"\n";
    const GustDesign d = i < s.gust_designs.size() ? s.gust_designs[i] : GustDesign{};
    if (!d.length_auto) out += number_line(*keys::find_in(gu, "length"), "length", g.length);
    if (d.rule == GustRule::amplitude) {
      out += number_line(*keys::find_in(gu, "amplitude"), "amplitude", g.amplitude);
    } else {
      out += std::string("rule = \"") + choice_name(*keys::find_in(gu, "rule"), static_cast<int>(d.rule)) + "\"\n";
      if (d.design_velocity != 0.0)
        out += number_line(*keys::find_in(gu, "design_velocity"), "design_velocity", d.design_velocity);
      if (d.rule == GustRule::gradient_distance)
        out += number_line(*keys::find_in(gu, "alleviation"), "alleviation", d.alleviation);
    }
    if (g.shape == GustShape::train) {
      out += "count = " + std::to_string(g.count) + "\n";
      out += number_line(*keys::find_in(gu, "spacing"), "spacing", g.spacing);
    }
    if (d.tune_max > 0.0) {
      out += number_line(*keys::find_in(gu, "tune_min"), "tune_min", d.tune_min);
      out += number_line(*keys::find_in(gu, "tune_max"), "tune_max", d.tune_max);
      out += "tune_points = " + std::to_string(d.tune_points) + "\n";
    }
    if (i < s.gust_start_times.size() && s.gust_start_times[i])
      out += number_line(*keys::find_in(gu, "start_time"), "start_time", *s.gust_start_times[i]);
    else
      out += number_line(*keys::find_in(gu, "start"), "start", g.start);
  }
  return out;
}

}  // namespace fp
