// script.cpp — see script.hpp.
#include "ui/script.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <sstream>

#include "model/units.hpp"

namespace fpui {

namespace {

using fp::units::Dim;

struct LineParser {
  const std::string& file;
  int line;
  std::vector<std::string> words;
  std::size_t next = 0;

  [[noreturn]] void fail(const std::string& what) const {
    throw ScriptError{file + ":" + std::to_string(line) + ": " + what};
  }
  bool more() const { return next < words.size(); }
  const std::string& word(const char* what) {
    if (!more()) fail(std::string("missing ") + what);
    return words[next++];
  }
  double number(const char* what) {
    const std::string& w = word(what);
    std::size_t used = 0;
    double v = 0.0;
    try {
      v = std::stod(w, &used);
    } catch (const std::exception&) {
      used = 0;
    }
    if (used != w.size() || !std::isfinite(v)) fail(std::string("expected ") + what + ", found \"" + w + "\"");
    return v;
  }
  // A number followed by a unit of dimension d (the unit is required unless `unit_optional`).
  double quantity(const char* what, Dim d, bool unit_optional = false) {
    const double v = number(what);
    if (!more()) {
      if (unit_optional) return v;
      fail(std::string("missing the unit of ") + what + " (one of " + fp::units::accepted_units(d) + ")");
    }
    const std::string& u = words[next];
    const auto f = fp::units::factor(d, u);
    if (!f) {
      if (unit_optional && (u == "vertical" || u == "horizontal")) return v;
      fail("\"" + u + "\" is not a unit of " + fp::units::dim_name(d) + " (use one of " +
           fp::units::accepted_units(d) + ")");
    }
    ++next;
    const double si = v * *f;  // a finite number can overflow in its unit's conversion (1e308 lbf)
    if (!std::isfinite(si)) fail(std::string(what) + " is out of range in SI units");
    return si;
  }
  void done() const {
    if (more()) fail("unexpected \"" + words[next] + "\" at the end of the line");
  }
};

fp::GustShape shape_of(LineParser& p) {
  const std::string& s = p.word("gust shape (1-cosine, sharp or ramp)");
  if (s == "1-cosine" || s == "one_minus_cosine") return fp::GustShape::one_minus_cosine;
  if (s == "sharp" || s == "sharp_edge") return fp::GustShape::sharp_edge;
  if (s == "ramp") return fp::GustShape::ramp;
  p.fail("unknown gust shape \"" + s + "\" (use 1-cosine, sharp or ramp)");
}

std::string num(double v) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.6g", v);
  return buf;
}

}  // namespace

std::vector<Action> parse_script(const std::string& text, const std::string& name) {
  std::vector<Action> out;
  std::istringstream in(text);
  std::string raw;
  int line_no = 0;
  double last_time = 0.0;
  while (std::getline(in, raw)) {
    ++line_no;
    const auto hash = raw.find('#');
    if (hash != std::string::npos) raw.erase(hash);
    std::istringstream ws(raw);
    LineParser p{name, line_no, {}, 0};
    for (std::string w; ws >> w;) p.words.push_back(w);
    if (p.words.empty()) continue;
    if (p.words[0] != "at") p.fail("a line starts with \"at <time>\", found \"" + p.words[0] + "\"");
    p.next = 1;
    Action a;
    a.line = line_no;
    a.time = p.number("the time in seconds");
    if (a.time < 0.0) p.fail("the time must not be negative");
    if (a.time < last_time) p.fail("times must not decrease (the line before says " + num(last_time) + " s)");
    last_time = a.time;
    const std::string verb = p.word("an action");
    if (verb == "let_go") {
      a.kind = ActionKind::let_go;
    } else if (verb == "take_hold") {
      a.kind = ActionKind::take_hold;
    } else if (verb == "gust") {
      a.kind = ActionKind::gust;
      a.gust.shape = shape_of(p);
      a.gust.amplitude = p.quantity("the gust amplitude", Dim::speed);
      a.gust.length = p.quantity("the gust length", Dim::length);
      a.gust.start = 0.0;
      if (p.more()) {
        const std::string& c = p.word("component");
        if (c == "vertical") a.gust.component = fp::GustComponent::vertical;
        else if (c == "horizontal") a.gust.component = fp::GustComponent::horizontal;
        else p.fail("unknown gust component \"" + c + "\" (use vertical or horizontal)");
      }
      if (!(a.gust.length > 0.0)) p.fail("the gust length must be more than 0");
      if (std::abs(a.gust.amplitude) > 50.0) p.fail("the gust amplitude must be within +-50 m/s");
    } else if (verb == "tab") {
      a.kind = ActionKind::tab;
      a.value = p.quantity("the tab angle", Dim::angle);
    } else if (verb == "pulse") {
      a.kind = ActionKind::pulse;
      a.value = p.quantity("the pilot force", Dim::force);
      a.duration = p.quantity("the pulse duration", Dim::time);
      if (!(a.duration > 0.0)) p.fail("the pulse duration must be more than 0");
    } else if (verb == "cg") {
      a.kind = ActionKind::cg;
      a.value = p.number("the CG as a fraction of the MAC");
    } else if (verb == "set") {
      a.kind = ActionKind::set;
      a.key = p.word("a key");
      a.value = p.number("the value (in the unit the window shows)");
    } else if (verb == "reset") {
      a.kind = ActionKind::reset;
    } else if (verb == "speed") {
      a.kind = ActionKind::speed;
      a.value = p.number("the speed factor");
      if (!(a.value >= 0.05 && a.value <= 20.0)) p.fail("the speed factor must be within 0.05..20");
    } else if (verb == "jump") {
      a.kind = ActionKind::jump;
      a.value = p.number("the seconds to simulate at once");
      if (!(a.value > 0.0 && a.value <= 3600.0)) p.fail("jump takes 0..3600 s");
    } else if (verb == "span") {
      a.kind = ActionKind::span;
      a.value = p.number("the plotted span in seconds");
      if (!(a.value >= 1.0 && a.value <= 3600.0)) p.fail("span takes 1..3600 s");
    } else if (verb == "view") {
      a.kind = ActionKind::view;
      const std::string& v = p.word("superposed or side_by_side");
      if (v == "superposed") a.superposed = true;
      else if (v == "side_by_side") a.superposed = false;
      else p.fail("unknown view \"" + v + "\" (use superposed or side_by_side)");
    } else if (verb == "exaggeration") {
      a.kind = ActionKind::exaggeration;
      a.value = p.number("the exaggeration factor");
      if (!(a.value >= 1.0 && a.value <= 20.0)) p.fail("the exaggeration factor must be within 1..20");
    } else if (verb == "pause") {
      a.kind = ActionKind::pause;
    } else if (verb == "panel") {
      a.kind = ActionKind::panel;
      const std::string& v = p.word("scenario, edit, inputs or analysis");
      const char* names[] = {"scenario", "edit", "inputs", "analysis"};
      a.panel = -1;
      for (int i = 0; i < 4; ++i)
        if (v == names[i]) a.panel = i;
      if (a.panel < 0) p.fail("unknown panel \"" + v + "\" (use scenario, edit, inputs or analysis)");
    } else if (verb == "hover") {
      a.kind = ActionKind::hover;
      const double x = p.number("x in pixels"), y = p.number("y in pixels");
      // a pixel position beyond any screen (and beyond float's range: a cast would be undefined)
      if (std::abs(x) > 1e6 || std::abs(y) > 1e6) p.fail("hover takes pixel positions within +-1e6");
      a.x = static_cast<float>(x);
      a.y = static_cast<float>(y);
    } else if (verb == "roots") {
      a.kind = ActionKind::roots;
      const std::string& v = p.word("airframe, all or slow");
      if (v == "airframe") a.roots = 0;
      else if (v == "all") a.roots = 1;
      else if (v == "slow") a.roots = 2;
      else p.fail("unknown roots view \"" + v + "\" (use airframe, all or slow)");
    } else {
      p.fail("unknown action \"" + verb +
             "\" (let_go, take_hold, gust, tab, pulse, cg, set, reset, speed, jump, span, view, "
             "exaggeration, pause, panel, roots, hover)");
    }
    p.done();
    out.push_back(a);
  }
  return out;
}

std::vector<Action> load_script(const std::string& path) {
  std::ifstream f(path, std::ios::binary);
  if (!f) throw ScriptError{path + ": cannot be read"};
  std::ostringstream ss;
  ss << f.rdbuf();
  return parse_script(ss.str(), path);
}

std::string action_line(const Action& a) {
  // milliseconds as the window logs them; a time too large for that (a script may name any
  // finite time) in exponent form, which the parser reads back (%.3f of 1e75 would not fit)
  char t[48];
  std::snprintf(t, sizeof t, a.time < 1e9 ? "at %.3f " : "at %.6e ", a.time);
  std::string s = t;
  switch (a.kind) {
    case ActionKind::let_go: return s + "let_go";
    case ActionKind::take_hold: return s + "take_hold";
    case ActionKind::gust: {
      const char* shape = a.gust.shape == fp::GustShape::one_minus_cosine ? "1-cosine"
                          : a.gust.shape == fp::GustShape::sharp_edge     ? "sharp"
                                                                          : "ramp";
      return s + "gust " + shape + " " + num(a.gust.amplitude) + " m/s " + num(a.gust.length) + " m " +
             (a.gust.component == fp::GustComponent::vertical ? "vertical" : "horizontal");
    }
    case ActionKind::tab: return s + "tab " + num(fp::units::to_deg(a.value)) + " deg";
    case ActionKind::pulse: return s + "pulse " + num(a.value) + " N " + num(a.duration) + " s";
    case ActionKind::cg: return s + "cg " + num(a.value);
    case ActionKind::set: return s + "set " + a.key + " " + num(a.value);
    case ActionKind::reset: return s + "reset";
    case ActionKind::speed: return s + "speed " + num(a.value);
    case ActionKind::jump: return s + "jump " + num(a.value);
    case ActionKind::span: return s + "span " + num(a.value);
    case ActionKind::view: return s + "view " + (a.superposed ? "superposed" : "side_by_side");
    case ActionKind::exaggeration: return s + "exaggeration " + num(a.value);
    case ActionKind::pause: return s + "pause";
    case ActionKind::panel: {
      const char* names[] = {"scenario", "edit", "inputs", "analysis"};
      return s + "panel " + names[std::clamp(a.panel, 0, 3)];
    }
    case ActionKind::hover: return s + "hover " + num(a.x) + " " + num(a.y);
    case ActionKind::roots: return s + "roots " + (a.roots == 1 ? "all" : a.roots == 2 ? "slow" : "airframe");
  }
  return s;
}

}  // namespace fpui
