// report_html.cpp — the reviewer's report as one HTML page (see report.hpp): the findings, the
// page layout, the plots (report/svg) and the data files written beside it.
//
// The page carries its own CSS and inline SVG; it references nothing outside itself (no
// script, font, image or style sheet), so it opens offline and prints the same everywhere.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <numbers>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/units.hpp"
#include "output/analysis_text.hpp"
#include "output/gust_text.hpp"
#include "output/outputs.hpp"
#include "output/response_text.hpp"
#include "output/sweep_text.hpp"
#include "report/report.hpp"
#include "scenario/gust_timing.hpp"
#include "analysis/response.hpp"
#include "util/sha256.hpp"
#include "report/svg.hpp"
#include "scenario/key_info.hpp"
#include "util/caution.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();
using svg::number;
std::string esc(const std::string& s) { return svg::escape(s); }
std::string pct(double v, int dec = 1) { return number(100.0 * v, dec); }
std::string degs(double rad, int dec = 2) { return number(units::to_deg(rad), dec); }
std::string plus(double v, int dec) {
  std::string s = number(v, dec);
  return (v > 0 && s.find_first_not_of("0.") != std::string::npos) ? "+" + s : s;
}
std::string plus_pct(double v, int dec = 1) { return plus(100.0 * v, dec); }

const Mode* find_mode(const std::vector<Mode>& ms, const std::string& name) {
  for (const auto& m : ms)
    if (m.name == name) return &m;
  return nullptr;
}
// The deciding root (model/linear.hpp deciding_root, the one definition) as its mode.
const Mode* max_real_mode(const std::vector<Mode>& ms) {
  const StabilityRoot d = deciding_root(ms);
  for (const auto& m : ms)
    if (d.found && !m.neutral && m.root == d.root && m.name == d.mode) return &m;
  return nullptr;
}

// Linear interpolation of y(x) at `at` over finite pairs (x increasing); NaN outside.
double interp(const std::vector<double>& x, const std::vector<double>& y, double at) {
  for (std::size_t i = 1; i < x.size(); ++i) {
    if (!std::isfinite(y[i - 1]) || !std::isfinite(y[i])) continue;
    if (at >= x[i - 1] - 1e-12 && at <= x[i] + 1e-12) {
      const double f = x[i] > x[i - 1] ? (at - x[i - 1]) / (x[i] - x[i - 1]) : 0.0;
      return y[i - 1] + f * (y[i] - y[i - 1]);
    }
  }
  return nan_;
}

// The root's time constant in words: "doubles in 5.2 s", "halves in 0.35 s".
std::string time_words(const Mode& m) {
  if (m.root.real() > 0) return "doubles in " + number(m.time_to_double, 1) + " s";
  if (m.root.real() < 0) return "halves in " + number(m.time_to_half, m.time_to_half < 10 ? 2 : 0) + " s";
  return "neutral";
}

std::string root_text(const Mode& m) {
  std::string s = plus(m.root.real(), 4);
  if (m.oscillatory) s += " \u00b1 " + number(m.root.imag(), 3) + "i";
  return s;
}

struct Table {
  std::vector<std::string> head;        // HTML
  std::vector<bool> numeric;            // per column: right-aligned numbers
  std::vector<std::vector<std::string>> rows;  // HTML
  std::string cls;
  std::string tail;                     // raw rows appended to the body (e.g. with colspan)
};

std::string table_html(const Table& t) {
  std::string o = "<table" + (t.cls.empty() ? std::string() : " class=\"" + t.cls + "\"") + ">\n<thead><tr>";
  for (std::size_t i = 0; i < t.head.size(); ++i)
    o += std::string("<th") + (i < t.numeric.size() && t.numeric[i] ? " class=\"n\"" : "") + ">" + t.head[i] + "</th>";
  o += "</tr></thead>\n<tbody>\n";
  for (const auto& r : t.rows) {
    o += "<tr>";
    for (std::size_t i = 0; i < r.size(); ++i)
      o += std::string("<td") + (i < t.numeric.size() && t.numeric[i] ? " class=\"n\"" : "") + ">" + r[i] + "</td>";
    o += "</tr>\n";
  }
  return o + t.tail + "</tbody></table>\n";
}

// Facts the summary, the findings and the sections share.
struct Facts {
  double cg = 0;
  const Mode* held_worst = nullptr;
  const Mode* free_worst = nullptr;
  const Mode* sp_held = nullptr;
  const Mode* sp_free = nullptr;
  bool held_stable = false, free_stable = false;
  const GustCase* g1 = nullptr;
};

Facts facts_of(const ReportData& d) {
  Facts f;
  f.cg = d.scenario.airplane.mass.h_cg;
  f.held_worst = max_real_mode(d.modes.held);
  f.free_worst = max_real_mode(d.modes.free);
  f.sp_held = find_mode(d.modes.held, "short period");
  f.sp_free = find_mode(d.modes.free, "short period");
  f.held_stable = f.held_worst && f.held_worst->root.real() < 0;
  f.free_stable = f.free_worst && f.free_worst->root.real() < 0;
  f.g1 = d.gusts.empty() ? nullptr : &d.gusts.front();
  return f;
}

std::vector<double> column(const SweepResult& r, double PointResult::*m) {
  std::vector<double> v;
  for (const auto& p : r.points) v.push_back(p.ok ? p.*m : nan_);
  return v;
}
std::vector<double> cg_column(const SweepResult& r) {
  std::vector<double> v;
  for (const auto& p : r.points) v.push_back(p.inputs.empty() ? nan_ : p.inputs[0]);
  return v;
}

// Model neutral points at a CG, interpolated along the CG sweep (they move a little with the CG).
double np_at(const ReportData& d, double cg, bool free) {
  const auto x = cg_column(d.cg_sweep);
  const double v = interp(x, column(d.cg_sweep, free ? &PointResult::np_free : &PointResult::np_fixed), cg);
  if (std::isfinite(v)) return v;
  return free ? d.margins.np_free.model : d.margins.np_fixed.model;
}

using Band5 = Band;  // percentiles as in sweep.json (analysis/sweep.hpp band_of)

const SampleResponse* worst_response(const UncertaintyResult& u) {
  const SampleResponse* w = nullptr;
  for (const auto& r : u.responses)
    if (std::isfinite(r.max_real_free) && (!w || r.max_real_free > w->max_real_free)) w = &r;
  return w;
}
const SampleResponse* lowest_np(const UncertaintyResult& u) {
  const SampleResponse* w = nullptr;
  for (const auto& r : u.responses)
    if (std::isfinite(r.np_free) && (!w || r.np_free < w->np_free)) w = &r;
  return w;
}

std::string inputs_text(const UncertaintyResult& u, const std::vector<double>& in) {
  std::string s;
  for (std::size_t k = 0; k < u.keys.size() && k < in.size(); ++k) {
    if (!s.empty()) s += ", ";
    const bool per_angle = u.keys[k].find(".ch_") != std::string::npos;
    s += u.keys[k] + " = " + (per_angle ? number(in[k] * units::deg, 5) + " /deg" : number(in[k], 5));
  }
  return s;
}

// The stick-force slope over the 23.175(b) speed range (the wider of +-15 % and +-40 kt).
struct SlopeCheck {
  double lo = 0, hi = 0;                 // the range asked for [m/s]
  double covered_lo = 0, covered_hi = 0; // the part the curve covers [m/s]
  int stable = 0, unstable = 0;          // curve segments with dF/dV < 0 and > 0
  double worst = nan_;                   // largest (least stable) slope in the range [N/(m/s)]
};
SlopeCheck slope_check(const Margins& m) {
  SlopeCheck c;
  const double V = m.trim_speed;
  const double dv = std::max(0.15 * V, 40.0 * units::kt);
  c.lo = V - dv;
  c.hi = V + dv;
  c.covered_lo = std::numeric_limits<double>::infinity();
  c.covered_hi = -std::numeric_limits<double>::infinity();
  for (std::size_t i = 1; i < m.curve.size(); ++i) {
    const auto& a = m.curve[i - 1];
    const auto& b = m.curve[i];
    if (b.airspeed < c.lo || a.airspeed > c.hi) continue;
    c.covered_lo = std::min(c.covered_lo, a.airspeed);
    c.covered_hi = std::max(c.covered_hi, b.airspeed);
    const double s = (b.stick_force - a.stick_force) / (b.airspeed - a.airspeed);
    if (s < 0) ++c.stable; else ++c.unstable;
    c.worst = std::isfinite(c.worst) ? std::max(c.worst, s) : s;
  }
  return c;
}

std::string kt(double mps, int dec = 0) { return number(units::to_kt(mps), dec) + " kt"; }

// ---- the stated envelope's corners against the criteria (the first page) ----

// One comparison at one corner: the figure, the line it is compared with, the margin to it.
struct CornerCheck {
  std::string column;     // what is compared (the column head)
  std::string ids;        // the criteria table rows it compares with
  std::string figure;     // HTML
  std::string line;       // the criterion's line, HTML
  std::string margin;     // HTML ("" when there is no number to compare with)
  int side = 0;           // +1 on the criterion's side, -1 on the other side, 0 no comparison
  CornerCheck(std::string c, std::string i) : column(std::move(c)), ids(std::move(i)) {}
};

std::string join_ids(const std::vector<std::string>& v) {
  std::string s;
  for (const auto& x : v) s += (s.empty() ? "" : ", ") + x;
  return s;
}

std::string lbf_n(double N, int dec = 1) { return number(N / units::lbf, dec) + " lbf (" + number(N, 0) + " N)"; }

// The release after the stick is let go 15 % off trim, in words; a departure that reached the stall
// is called a stall and marked beyond the model's validity.
std::string release_words(const Release& r) {
  const std::string head = std::string(r.offset > 0 ? "+" : "\u2212") + number(100 * std::abs(r.offset), 0) + " %: ";
  if (!r.failure.empty()) return head + "not run (" + esc(r.failure) + ")";
  std::string s = head + "a " + (r.force < 0 ? "push" : "pull") + " of " + number(std::abs(r.force) / units::lbf, 1) +
                  " lbf released, ";
  if (r.stall)
    s += "<b>stall</b>" + (r.departed ? " at " + number(r.time, 1) + " s" : std::string()) +
         " (beyond the model's validity)";
  else if (r.departed)
    s += "<b>departs</b> at " + number(r.time, 1) + " s (" + esc(r.reason) + ")";
  else
    s += "n " + number(r.n_min, 2) + " to " + number(r.n_max, 2) + ", no departure in " + number(r.seconds, 0) + " s";
  return s;
}

std::vector<CornerCheck> corner_checks(const ReportData& d, const CornerResult& c) {
  std::vector<CornerCheck> out;
  const std::string& basis = d.options.basis;
  const Margins& m = c.margins;
  {
    CornerCheck k{"stick-free static margin", join_ids(criteria_ids(basis, Topic::static_stability))};
    k.figure = plus_pct(m.margin_free) + " % MAC";
    k.line = "&gt; 0 (stable)";
    k.margin = plus_pct(m.margin_free) + " % MAC";
    k.side = m.margin_free > 0 ? 1 : -1;
    out.push_back(k);
  }
  {
    CornerCheck k{"stick-force slope at trim, tab fixed", join_ids(criteria_ids(basis, Topic::force_slope))};
    const double g = m.force_gradient * units::kt;  // N per kt of true airspeed
    k.figure = plus(g / units::lbf, 2) + " lbf/kt (" + plus(g, 2) + " N/kt)";
    k.line = "&lt; 0 (a pull below trim)";
    k.margin = plus(-g / units::lbf, 2) + " lbf/kt";
    k.side = g < 0 ? 1 : -1;
    out.push_back(k);
  }
  {
    CornerCheck k{"free-return band with friction", join_ids(criteria_ids(basis, Topic::free_return))};
    const double Ff = d.scenario.airplane.circuit.friction;
    k.line = "within 10 % of trim (figure from memory: text not retrieved)";
    if (Ff <= 0) {
      k.figure = "no friction in the circuit";
    } else if (std::isfinite(m.free_return_low)) {
      const double w = std::max(m.trim_speed - m.free_return_low, m.free_return_high - m.trim_speed) / m.trim_speed;
      k.figure = "\u00b1" + number(100 * w, 1) + " % of trim";
      k.margin = plus(100 * (0.10 - w), 1) + " % of trim";
      k.side = w <= 0.10 ? 1 : -1;
    } else {
      k.figure = "no return (slope not stable)";
      k.side = -1;
    }
    out.push_back(k);
  }
  {
    CornerCheck k{"stick force at n = " + number(c.limit_load_factor, 1), join_ids(criteria_ids(basis, Topic::maneuver_force))};
    k.figure = lbf_n(c.force_at_limit);
    if (basis == kDefaultBasis) {
      const double W_lb = (d.scenario.envelope.mass_max > 0 ? d.scenario.envelope.mass_max : d.scenario.airplane.mass.mass) /
                          0.45359237;
      const double need = stick_force_minimum_23_155_lbf(W_lb) * units::lbf;
      k.line = "\u2265 " + lbf_n(need) + " (stick, W " + number(W_lb, 0) + " lb)";
      k.margin = plus((c.force_at_limit - need) / units::lbf, 1) + " lbf";
      k.side = c.force_at_limit >= need ? 1 : -1;
    } else {
      const double need = d.options.min_force_per_g * (c.limit_load_factor - 1.0);
      k.line = "\u2265 " + lbf_n(need) + " (option --min-force-per-g; the basis states no figure)";
      k.margin = plus((c.force_at_limit - need) / units::lbf, 1) + " lbf";
      k.side = c.force_at_limit >= need ? 1 : -1;
    }
    out.push_back(k);
  }
  {
    CornerCheck k{"short-period damping \u03b6 held / free", join_ids(criteria_ids(basis, Topic::short_period))};
    auto z = [](bool has, const Mode& md) { return has ? number(md.damping, 2) : std::string("aperiodic"); };
    k.figure = z(c.has_sp_held, c.sp_held) + " / " + z(c.has_sp_free, c.sp_free);
    k.line = "\u2265 0.35 (MIL-F-8785C level 1, guidance, from memory)";
    if (c.has_sp_held && c.has_sp_free) {
      const double lo = std::min(c.sp_held.damping, c.sp_free.damping);
      k.margin = plus(lo - 0.35, 2);
      k.side = lo >= 0.35 ? 1 : -1;
    }
    out.push_back(k);
  }
  {
    CornerCheck k{"release \u00b115 % off trim, stick let go", join_ids(criteria_ids(basis, Topic::release))};
    k.figure = release_words(c.release_up) + "<br>" + release_words(c.release_down);
    k.line = "no dangerous response (no number)";
    const bool bad = c.release_up.departed || c.release_up.stall || c.release_down.departed || c.release_down.stall;
    k.side = bad ? -1 : 0;
    out.push_back(k);
  }
  {
    CornerCheck k{"deciding root, stick free", join_ids(criteria_ids(basis, Topic::divergence))};
    const Mode& w = c.worst_free;
    const double re = w.root.real();
    k.figure = plus(re, 4) + " 1/s (" + esc(w.name) + (re > 0 ? ", doubles in " + number(w.time_to_double, 1) + " s" : std::string()) + ")";
    k.line = "if unstable, doubling in \u2265 55 s (MIL-F-8785C phugoid level 3, guidance, from memory)";
    if (re > 0) {
      k.margin = plus(w.time_to_double - 55.0, 1) + " s";
      k.side = w.time_to_double >= 55.0 ? 1 : -1;
    } else {
      k.margin = "stable";
      k.side = 1;
    }
    out.push_back(k);
  }
  return out;
}

int outside_count(const std::vector<CornerCheck>& ks) {
  int n = 0;
  for (const auto& k : ks) n += k.side < 0;
  return n;
}

// The corners, worst first: a corner that could not be computed first (nothing is known of it),
// then by the number of comparisons on the wrong side of their line, then by the stick-free
// static margin, smallest first. The one ordering of the first page's table and of its finding.
std::vector<const CornerResult*> corners_worst_first(const ReportData& d) {
  std::vector<std::pair<int, const CornerResult*>> v;
  for (const auto& c : d.corners) v.push_back({c.ok ? outside_count(corner_checks(d, c)) : 1000, &c});
  std::stable_sort(v.begin(), v.end(), [](const auto& a, const auto& b) {
    if (a.first != b.first) return a.first > b.first;
    const double ma = a.second->ok ? a.second->margins.margin_free : -1e9;
    const double mb = b.second->ok ? b.second->margins.margin_free : -1e9;
    return ma < mb;
  });
  std::vector<const CornerResult*> out;
  for (const auto& x : v) out.push_back(x.second);
  return out;
}


}  // namespace

// ---------------------------------------------------------------------------------------------
// Findings

namespace {
// The rows of the criteria table a finding compares with, its source and how the table holds it.
void cite(Finding& x, const ReportData& d, Topic t) {
  x.criteria = criteria_ids(d.options.basis, t);
  x.source.clear();
  x.source_note.clear();
  for (const auto& id : x.criteria) {
    const Criterion* c = find_criterion(id);
    if (!c) continue;  // never: criteria_ids returns rows of the table (a test checks it)
    x.source += (x.source.empty() ? "" : "; ") + id + " (" + c->document + ")";
    const char* how = c->status == TextStatus::verbatim           ? "quoted in the criteria table"
                      : c->status == TextStatus::verbatim_partial ? "quoted in part in the criteria table"
                      : c->status == TextStatus::not_available    ? "text not retrieved: see the criteria table"
                                                                  : "not a published criterion";
    x.source_note += (x.source_note.empty() ? "" : "; ") + id + ": " + how;
  }
}
}  // namespace

// Findings 1-3: static stability, the stick-force slope, the free-return band.
void findings_static(std::vector<Finding>& out, const ReportData& d, const Facts& f) {
  [[maybe_unused]] const Margins& m = d.margins;
  [[maybe_unused]] const double cg = f.cg;
  // 1. static stability, stick fixed and free, at the analysed CG
  {
    Finding x;
    x.topic = "Static stability at the analysed CG";
    x.measured = "At CG " + pct(cg) + " % MAC the static margin is " + plus_pct(m.margin_fixed) +
                 " % MAC with the stick fixed and " + plus_pct(m.margin_free) +
                 " % MAC with the stick free (model; closed form " + plus_pct(m.cf.np_fixed - cg) + " and " +
                 plus_pct(m.cf.np_free - cg) + " % MAC).";
    x.criterion = "Static longitudinal stability with the controls free, as the basis's sections in the criteria table "
                  "ask; they state no margin in % MAC. Read here as a positive stick-free static margin.";
    cite(x, d, Topic::static_stability);
    x.comparison = m.margin_free < 0
                       ? "The stick-free margin is negative: with the stick free this CG lies aft of the neutral "
                         "point, the opposite of the stable condition that the wording describes."
                       : "The stick-free margin is positive: on the same side as the stable condition that the "
                         "wording describes.";
    out.push_back(x);
  }
  // 2. stick-force slope over the 23.175(b) range
  {
    const SlopeCheck c = slope_check(m);
    Finding x;
    x.topic = "Stick force against speed, tab fixed at the hands-off setting";
    x.measured = "Slope at trim " + plus(m.force_gradient * units::kt, 3) + " N/kt (model; closed form " +
                 plus(m.cf.force_gradient * units::kt, 3) + " N/kt; negative means a pull is needed below trim). Over " +
                 kt(std::max(c.lo, c.covered_lo)) + " to " + kt(std::min(c.hi, c.covered_hi)) + ", " +
                 std::to_string(c.stable) + " of " + std::to_string(c.stable + c.unstable) +
                 " curve segments have a stable slope.";
    x.criterion = "A stable slope of stick force against speed over the greater of \u00b115 % of the trim speed or "
                  "\u00b140 kt (" + kt(c.lo) + " to " + kt(c.hi) + " here, true airspeed), the range of 14 CFR "
                  "23.175(b)(1) quoted in the criteria table (without its free-return extension).";
    cite(x, d, Topic::force_slope);
    x.comparison = c.unstable == 0 ? "The modelled slope is stable over the whole range covered."
                                   : "The modelled slope is unstable (a push needed below trim) over part or all of "
                                     "the range: the opposite sign to the slope the rule asks for.";
    if (c.covered_lo > c.lo + 1e-6 || c.covered_hi < c.hi - 1e-6)
      x.comparison += " The curve covers only the stated envelope's speeds, not the whole range.";
    out.push_back(x);
  }
  // 3. free-return band
  {
    Finding x;
    x.topic = "Return to trim speed with friction";
    const double Ff = d.scenario.airplane.circuit.friction;
    if (std::isfinite(m.free_return_low)) {
      const double w = std::max(m.trim_speed - m.free_return_low, m.free_return_high - m.trim_speed) / m.trim_speed;
      x.measured = "With a breakout force of " + number(Ff, 1) + " N the stick force stays below the friction between " +
                   kt(m.free_return_low, 1) + " and " + kt(m.free_return_high, 1) + ", up to " + number(100 * w, 1) +
                   " % from the trim speed.";
      x.comparison = w <= 0.075 ? "Inside the 7.5 % band." : w <= 0.10 ? "Inside the 10 % band, outside 7.5 %." : "Wider than the 10 % band.";
    } else {
      x.measured = Ff > 0 ? "No free-return band: the stick-force slope at trim is not stable, so the speed does not "
                            "return on release."
                          : "No friction in the circuit (circuit.friction = 0): no free-return band to compare.";
      x.comparison = Ff > 0 ? "The speed does not return towards trim at all: outside any band." : "Not applicable.";
    }
    x.criterion = "On slow release of the stick the speed returns to within 10 % of the trim speed: a figure from "
                  "memory of the free-return paragraph, whose text could not be retrieved (see the criteria table).";
    cite(x, d, Topic::free_return);
    out.push_back(x);
  }
}

// Findings 4-6: the divergence, short-period damping, stick force per g.
void findings_dynamic(std::vector<Finding>& out, const ReportData& d, const Facts& f) {
  [[maybe_unused]] const Margins& m = d.margins;
  [[maybe_unused]] const double cg = f.cg;
  // 4. dynamic stability held and free: the divergence
  if (f.held_worst && f.free_worst) {
    Finding x;
    x.topic = "Aperiodic stability, stick held and free";
    x.measured = "Largest real part of any root: " + plus(f.held_worst->root.real(), 4) + " 1/s held (" +
                 f.held_worst->name + ", " + time_words(*f.held_worst) + "), " + plus(f.free_worst->root.real(), 4) +
                 " 1/s free (" + f.free_worst->name + ", " + time_words(*f.free_worst) + ").";
    x.criterion = "For scale: the fastest phugoid divergence that MIL-F-8785C admits, even at level 3, doubles its "
                  "amplitude in 55 s. A military specification's level for a different mode, not a civil rule.";
    cite(x, d, Topic::divergence);
    if (f.free_worst->root.real() > 0)
      x.comparison = "Hands-off, a disturbance doubles in " + number(f.free_worst->time_to_double, 1) + " s, " +
                     (f.free_worst->time_to_double < 55 ? "faster than" : "slower than") + " that 55 s line.";
    else
      x.comparison = "Hands-off, every root is stable: no divergence to compare.";
    if (f.held_worst->root.real() > 0)
      x.comparison += " With the stick held the airplane diverges too (doubling in " +
                      number(f.held_worst->time_to_double, 1) + " s).";
    out.push_back(x);
  }
  // 5. short-period damping
  {
    Finding x;
    x.topic = "Short-period damping";
    std::string held = f.sp_held ? "held \u03b6 = " + number(f.sp_held->damping, 3) + " (" +
                                       (f.sp_held->cycles_to_tenth > 0 ? number(f.sp_held->cycles_to_tenth, 2) + " cycles to one tenth" : "no cycle") + ")"
                                 : "held: no oscillatory short-period mode";
    std::string free = f.sp_free ? "free \u03b6 = " + number(f.sp_free->damping, 3) + " (" +
                                       (f.sp_free->cycles_to_tenth > 0 ? number(f.sp_free->cycles_to_tenth, 2) + " cycles to one tenth" : "no cycle") + ")"
                                 : "free: no oscillatory short-period mode (the pitch motion has become aperiodic)";
    x.measured = "At CG " + pct(cg) + " % MAC: " + held + "; " + free + ".";
    x.criterion = "The basis's short-period paragraph (see the criteria table) states no number. For a number: "
                  "MIL-F-8785C category A and C, level 1, \u03b6 from 0.35 to 1.30 (from memory; guidance, not a civil rule).";
    cite(x, d, Topic::short_period);
    auto in = [](const Mode* md) { return md && md->damping >= 0.35 && md->damping <= 1.30; };
    std::string c;
    c += f.sp_held ? std::string("Held: ") + (in(f.sp_held) ? "inside" : "outside") + " the 0.35 to 1.30 range. "
                   : "Held: no short-period oscillation to compare. ";
    c += f.sp_free ? std::string("Free: ") + (in(f.sp_free) ? "inside" : "outside") + " the range."
                   : "Free: no short-period oscillation to compare; see the aperiodic roots above.";
    x.comparison = c;
    out.push_back(x);
  }
  // 6. stick force per g
  {
    Finding x;
    x.topic = "Stick force per g";
    x.measured = "Steady pull-up at " + kt(m.trim_speed) + ": " + number(m.force_per_g, 1) + " N/g (" +
                 number(m.force_per_g / units::lbf, 1) + " lbf/g) with everything included, " +
                 number(m.force_per_g_aero, 1) + " N/g from the hinge-moment aerodynamics alone (closed form " +
                 number(m.cf.force_per_g, 1) + " N/g).";
    const double nl = d.scenario.envelope.limit_load_factor;
    const double at_limit = m.force_per_g * (nl - 1.0);
    x.measured += " At the limit load factor " + number(nl, 1) + " (envelope.limit_load_factor) that is " +
                  number(at_limit / units::lbf, 1) + " lbf (" + number(at_limit, 0) + " N), linear in n from the slope at trim.";
    x.criterion = "The minimum set for the aft CG limit in this report: " + number(d.options.min_force_per_g, 1) +
                  " N/g (" + number(d.options.min_force_per_g / units::lbf, 1) + " lbf/g), an option of the tool.";
    x.comparison = m.force_per_g >= d.options.min_force_per_g ? "Above the minimum set." : "Below the minimum set.";
    if (d.options.basis == kDefaultBasis) {
      const double W_lb = (d.scenario.envelope.mass_max > 0 ? d.scenario.envelope.mass_max : d.scenario.airplane.mass.mass) /
                          0.45359237;
      const double need = stick_force_minimum_23_155_lbf(W_lb) * units::lbf;
      x.criterion += " And 14 CFR 23.155(a)(2), quoted in the criteria table: for stick controls W/140 or 15 pounds, "
                     "whichever is greater, need not exceed 35 pounds; here W = " + number(W_lb, 0) + " lb gives " +
                     number(need / units::lbf, 1) + " lbf (" + number(need, 0) + " N).";
      x.comparison += std::string(" At the limit load factor the force is ") + (at_limit >= need ? "above" : "below") +
                      " the 23.155 line by " + number(std::abs(at_limit - need) / units::lbf, 1) + " lbf.";
    }
    cite(x, d, Topic::maneuver_force);
    out.push_back(x);
  }
}

// Findings 7-9: the CG envelope against the limits, the divergence boundary, the uncertainty.
void findings_limits(std::vector<Finding>& out, const ReportData& d, const Facts& f) {
  [[maybe_unused]] const Margins& m = d.margins;
  [[maybe_unused]] const double cg = f.cg;
  // 7. CG envelope against the limits computed here
  {
    Finding x;
    x.topic = "Stated CG envelope against the limits found here";
    x.measured = "Forward limit " + pct(m.limits.forward.cg) + " % MAC (" + m.limits.forward.reason + "); aft limit " +
                 pct(m.limits.aft.cg) + " % MAC (" + m.limits.aft.reason + "). Stated envelope " +
                 pct(m.envelope_forward) + " to " + pct(m.envelope_aft) + " % MAC.";
    x.criterion = "The stated envelope should lie inside the limits; the aft limit here uses a minimum stick-free static "
                  "margin of " + pct(d.options.min_margin) + " % MAC and the stick force per g above.";
    cite(x, d, Topic::cg_limits);
    const bool fwd_ok = !std::isfinite(m.limits.forward.cg) || m.envelope_forward >= m.limits.forward.cg;
    const bool aft_ok = std::isfinite(m.limits.aft.cg) && m.envelope_aft <= m.limits.aft.cg;
    x.comparison = std::string(fwd_ok ? "Forward end inside" : "Forward end outside") + " (" +
                   plus_pct(m.envelope_forward - m.limits.forward.cg) + " % MAC from its limit); " +
                   (aft_ok ? "aft end inside" : "aft end outside") + " (" + plus_pct(m.limits.aft.cg - m.envelope_aft) +
                   " % MAC to its limit).";
    if (cg < m.envelope_forward || cg > m.envelope_aft)
      x.comparison += " The analysed CG (" + pct(cg) + " % MAC) lies outside the stated envelope.";
    out.push_back(x);
  }
  // 8. divergence boundary
  if (d.cg_sweep.has_boundary) {
    const Boundary& b = d.cg_sweep.free;
    Finding x;
    x.topic = "Hands-off divergence boundary";
    x.measured = "The hands-off airplane starts to diverge at CG " + pct(b.eigenvalue, 2) + " % MAC (eigenvalue" +
                 (b.crossing_oscillatory ? ", an oscillatory divergence of period " + number(b.crossing_period, 0) + " s"
                                         : std::string()) +
                 "), " + pct(b.time_domain, 2) + " % MAC (time response). A real root crosses zero at " +
                 pct(b.static_crossing, 2) + " % MAC, against " + pct(b.closed_form, 2) +
                 " % MAC from the closed form with the constant hinge moments (" + pct(b.closed_form_aerodynamic, 2) +
                 " % MAC without). With the stick held: " + pct(d.cg_sweep.held.eigenvalue, 2) + " % MAC (eigenvalue).";
    x.criterion = "The stated aft CG limit, " + pct(m.envelope_aft) + " % MAC (the airplane's own data).";
    cite(x, d, Topic::boundary);
    x.comparison = std::isfinite(b.eigenvalue)
                       ? "The boundary lies " + number(100 * std::abs(b.eigenvalue - m.envelope_aft), 1) + " % MAC " +
                             (b.eigenvalue >= m.envelope_aft ? "aft of" : "forward of") + " the stated aft limit."
                       : "No boundary found in the CG range swept.";
    out.push_back(x);
  }
  // 9. uncertainty
  {
    const UncertaintyResult& u = d.uncertainty;
    std::vector<double> np;
    for (const auto& r : u.responses) np.push_back(r.np_free);
    const Band5 b = band_of(np);
    if (b.n > 0) {
      Finding x;
      x.topic = "Stick-free neutral point over the hinge-moment uncertainty";
      x.measured = "Over " + std::to_string(b.n) + " samples (" + (u.default_band ? "Ch_alpha and Ch_delta \u00b1" +
                   number(100 * d.options.hinge_band, 0) + " %, uniform" : std::string("the bands given")) +
                   ") the stick-free neutral point lies between " + pct(b.min) + " and " + pct(b.max) +
                   " % MAC (5 to 95 %: " + pct(b.p5) + " to " + pct(b.p95) + ").";
      // the worst case is the worst of the samples and of the band's corners (the table of section 7),
      // so that the finding and the table give the same figure
      double worst = b.min;
      bool from_corner = false;
      if (u.has_corners)
        for (const auto& p : u.corners.points)
          if (p.ok && p.np_free < worst) {
            worst = p.np_free;
            from_corner = true;
          }
      x.measured += " At the stated aft limit the smallest stick-free margin is " + plus_pct(worst - m.envelope_aft, 2) +
                    " % MAC (" + (from_corner ? "at a corner of the band, section 7's table" : "among the samples") + ").";
      x.criterion = "Zero stick-free margin, and the minimum of " + pct(d.options.min_margin) +
                    " % MAC used for the aft limit (an option of the tool).";
      cite(x, d, Topic::uncertainty);
      x.comparison = worst - m.envelope_aft >= d.options.min_margin
                         ? "Every sample and corner keeps at least the minimum margin at the stated aft limit."
                         : worst - m.envelope_aft >= 0
                               ? "Part of the band falls below the minimum margin at the stated aft limit, none below zero."
                               : "Part of the band puts the stick-free neutral point forward of the stated aft limit.";
      out.push_back(x);
    }
  }
}

// Finding 0: the stated envelope's corners, the worst first (the first page's table).
void findings_envelope(std::vector<Finding>& out, const ReportData& d) {
  const auto order = corners_worst_first(d);
  if (order.empty()) return;
  const CornerResult& w = *order.front();
  Finding x;
  x.topic = "The stated envelope's corners";
  std::string where = d.analysed_in_envelope ? "The analysed point lies within the stated envelope. "
                                             : "The analysed point (CG " + pct(d.scenario.airplane.mass.h_cg) + " % MAC, " +
                                                   number(d.scenario.airplane.mass.mass, 0) +
                                                   " kg) lies OUTSIDE the stated envelope. ";
  if (!w.ok) {
    x.measured = where + "The corner " + w.corner.label + " could not be computed: " + w.failure + ".";
    x.comparison = "Nothing is known of that corner: it cannot be compared.";
  } else {
    const auto ks = corner_checks(d, w);
    std::string outside;
    for (const auto& k : ks)
      if (k.side < 0) outside += (outside.empty() ? "" : "; ") + k.column + " (" + k.ids + ")";
    x.measured = where + "Worst of " + std::to_string(order.size()) + " corners: " + w.corner.label + " (CG " + pct(w.cg) +
                 " % MAC, " + number(w.mass, 0) + " kg), stick-free static margin " + plus_pct(w.margins.margin_free) +
                 " % MAC, with " + std::to_string(outside_count(ks)) + " comparison(s) on the other side of their line" +
                 (outside.empty() ? "." : ": " + outside + ".");
    x.comparison = outside.empty() ? "Every comparison at every corner is on the side of its line, where it has one."
                                   : "At that corner the figures listed are on the other side of the lines they are "
                                     "compared with (first page, the corners table).";
  }
  x.criterion = "Each criterion of the first page's table at each corner of the stated envelope.";
  std::vector<std::string> ids;
  for (const Topic t : {Topic::static_stability, Topic::force_slope, Topic::free_return, Topic::maneuver_force,
                        Topic::short_period, Topic::release, Topic::divergence, Topic::boundary})
    for (const auto& id : criteria_ids(d.options.basis, t))
      if (std::find(ids.begin(), ids.end(), id) == ids.end()) ids.push_back(id);
  cite(x, d, Topic::boundary);
  x.criteria = ids;
  x.source = "the criteria table (section 9): " + join_ids(ids);
  x.source_note = "each row says whether its text is quoted";
  out.push_back(x);
}

std::vector<Finding> report_findings(const ReportData& d) {
  std::vector<Finding> out;
  const Facts f = facts_of(d);
  findings_envelope(out, d);
  findings_static(out, d, f);
  findings_dynamic(out, d, f);
  findings_limits(out, d, f);
  return out;
}

// ---------------------------------------------------------------------------------------------
// Plots

namespace {

svg::Series line(const std::string& label, std::vector<double> x, std::vector<double> y, svg::Style st,
                 svg::Marker mk = svg::Marker::none) {
  svg::Series s;
  s.label = label;
  s.x = std::move(x);
  s.y = std::move(y);
  s.style = st;
  s.marker = mk;
  return s;
}

svg::Series points(const std::string& label, std::vector<double> x, std::vector<double> y, svg::Style st,
                   svg::Marker mk) {
  svg::Series s = line(label, std::move(x), std::move(y), st, mk);
  s.line = false;
  return s;
}

// CG and neutral points on the MAC, with the margins drawn as bars from each CG.
std::string mac_chart(const ReportData& d, const std::string& id) {
  const Margins& m = d.margins;
  svg::RowChart c;
  c.id = id;
  c.title = "Static margins on the mean aerodynamic chord";
  c.x.label = "position on the MAC, aft of its leading edge";
  c.x.unit = "% MAC";
  c.x.pct = 100.0;
  c.legend = {{svg::Style::first, "margin, stick fixed (CG to fixed neutral point)"},
              {svg::Style::second, "margin, stick free"}};
  struct R {
    std::string label;
    double cg;
  };
  std::vector<R> rows = {{"stated forward limit", m.envelope_forward}, {"stated aft limit", m.envelope_aft}};
  const double cg = d.scenario.airplane.mass.h_cg;
  if (std::abs(cg - m.envelope_forward) > 1e-9 && std::abs(cg - m.envelope_aft) > 1e-9)
    rows.push_back({"analysed CG", cg});
  std::sort(rows.begin(), rows.end(), [](const R& a, const R& b) { return a.cg < b.cg; });
  for (const auto& r : rows) {
    svg::Row row;
    row.label = r.label + " " + pct(r.cg) + " %";
    const double nf = np_at(d, r.cg, false), nr = np_at(d, r.cg, true);
    row.bars.push_back({r.cg, nf, svg::Style::first, plus_pct(nf - r.cg) + " fixed"});
    row.bars.push_back({r.cg, nr, svg::Style::second, plus_pct(nr - r.cg) + " free"});
    row.marks.push_back({r.cg, ""});
    c.rows.push_back(row);
  }
  c.refs.push_back({true, m.np_fixed.model, "fixed NP " + pct(m.np_fixed.model), svg::Style::reference});
  c.refs.push_back({true, m.np_free.model, "free NP " + pct(m.np_free.model), svg::Style::reference});
  c.spans.push_back({m.envelope_forward, m.envelope_aft, "stated CG envelope", false, false});
  c.x.min = std::min({0.0, m.envelope_forward - 0.05});
  c.x.max = std::max({m.np_fixed.model, cg, m.envelope_aft}) + 0.10;
  c.description = "Bars from each CG to the stick-fixed and stick-free neutral points (model).";
  return svg::render(c);
}

std::vector<double> channel(const Trace& tr, std::size_t ch) {
  std::vector<double> v(tr.size());
  const double k = channel_info(ch).display;
  for (std::size_t i = 0; i < tr.size(); ++i) v[i] = tr.ch[ch][i] * k;
  return v;
}

std::string time_plot(const GustCase& g, std::size_t ch, const std::string& id, double width, double height,
                      double t_max, bool legend) {
  const RunOutcome& o = *g.outcome;
  svg::Plot p;
  p.id = id;
  p.width = width;
  p.height = height;
  const auto& ci = channel_info(ch);
  std::string title = ci.label;
  if (!title.empty()) title[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(title[0])));
  p.title = title;
  p.x = {"time", "s"};
  p.y = {ci.label, ci.unit};
  if (ch == ch_load_factor) p.y.label = "load factor n";
  if (ch == ch_stick_force) p.y.label = "stick force, pull +";
  if (ch == ch_elevator) p.y.label = "elevator, TE down +";
  p.x.min = 0;
  if (t_max > 0) p.x.max = t_max;
  const bool wide = width > 500;
  if (o.held) p.series.push_back(line(legend ? (wide ? "stick held" : "held") : "", channel(o.held->trace, ch_time), channel(o.held->trace, ch), svg::Style::first));
  // hands off the stick force is zero by definition: show the force it would take to hold the
  // elevator where it floated (what the pilot feels on taking hold again)
  const std::size_t ch_free = ch == ch_stick_force ? ch_hold_force : ch;
  if (o.free)
    p.series.push_back(line(legend ? (wide ? "stick free (hands off)" : (ch == ch_stick_force ? "free: to hold" : "free")) : "",
                            channel(o.free->trace, ch_time), channel(o.free->trace, ch_free), svg::Style::second));
  if (o.free && o.free->departure.departed && (t_max <= 0 || o.free->departure.time <= t_max))
    p.refs.push_back({true, o.free->departure.time, "free: departs", svg::Style::reference});
  if (o.held && o.held->departure.departed && (t_max <= 0 || o.held->departure.time <= t_max))
    p.refs.push_back({true, o.held->departure.time, "held: departs", svg::Style::reference});
  p.description = std::string(ci.label) + " against time, stick held and free";
  return svg::render(p);
}

std::string complex_plane(const ReportData& d, const std::string& id, bool zoom) {
  svg::Plot p;
  p.id = id;
  p.height = 300;
  p.x = {"real part", "1/s"};
  p.y = {"imaginary part", "rad/s"};
  std::vector<double> hx, hy, fx, fy;
  double xmin = 0, xmax = 0, ymax = 0;
  for (const auto& m : d.modes.held) {
    hx.push_back(m.root.real());
    hy.push_back(m.root.imag());
  }
  for (const auto& m : d.modes.free) {
    fx.push_back(m.root.real());
    fy.push_back(m.root.imag());
  }
  auto consider = [&](const std::vector<Mode>& ms) {
    for (const auto& m : ms) {
      if (zoom && std::abs(m.root) > 1.0) continue;
      xmin = std::min(xmin, m.root.real());
      xmax = std::max(xmax, m.root.real());
      ymax = std::max(ymax, m.root.imag());
    }
  };
  consider(d.modes.held);
  consider(d.modes.free);
  if (zoom) {
    p.title = "Roots near the origin (|root| below 1 rad/s)";
    p.x.min = 1.25 * std::min(xmin, -0.1);
    p.x.max = std::max(0.1, 1.3 * xmax);
    p.y.max = std::max(0.2, 1.3 * ymax);
    p.y.min = -0.06 * p.y.max;  // roots on the real axis fully visible
  } else {
    p.title = "All roots (upper half-plane; pairs appear once)";
    p.x.max = std::max(0.5, 1.3 * xmax);
    p.y.max = std::max(1.0, 1.15 * ymax);
    p.y.min = -0.06 * p.y.max;
    // damping-ratio lines through the origin: zeta = 0.35 (MIL-F-8785C level 1, cat. A and C, lower end)
    const double z = 0.35, slope = std::sqrt(1 - z * z) / z;
    const double x_end = std::min(xmin * 1.1, -1.0);
    p.series.push_back(line("", {0.0, x_end}, {0.0, -x_end * slope}, svg::Style::reference));
    const double yl = std::min(0.85 * p.y.max, -x_end * slope * 0.9);
    p.notes.push_back({-yl / slope, yl, "\u03b6 = 0.35", true, false});
  }
  p.spans.push_back({0.0, 1e9, "unstable", false, true});
  p.series.push_back(points("stick held", hx, hy, svg::Style::first, svg::Marker::dot));
  p.series.push_back(points("stick free", fx, fy, svg::Style::second, svg::Marker::square));
  p.description = "Eigenvalues of the linearised model at trim, stick held and free";
  return svg::render(p);
}

std::string sweep_plot(const ReportData& d, const std::string& id, bool damping) {
  const SweepResult& r = d.cg_sweep;
  svg::Plot p;
  p.id = id;
  p.height = 290;
  p.x = {"CG", "% MAC"};
  p.x.pct = 100;
  const auto cg = cg_column(r);
  if (damping) {
    p.title = "Short-period damping ratio against CG";
    p.y = {"short-period damping ratio \u03b6", "-"};
    p.y.min = 0;
    p.series.push_back(line("stick held", cg, column(r, &PointResult::sp_damping_held), svg::Style::first, svg::Marker::dot));
    p.series.push_back(line("stick free", cg, column(r, &PointResult::sp_damping_free), svg::Style::second, svg::Marker::square));
    p.refs.push_back({false, 0.35, "\u03b6 = 0.35: MIL-F-8785C level 1 lower end (cat. A, C)", svg::Style::reference});
    double ymax = 1.0;
    for (double v : column(r, &PointResult::sp_damping_held)) if (std::isfinite(v)) ymax = std::max(ymax, v);
    for (double v : column(r, &PointResult::sp_damping_free)) if (std::isfinite(v)) ymax = std::max(ymax, v);
    p.y.max = std::min(2.0, std::ceil(ymax * 10 + 0.5) / 10);
  } else {
    p.title = "Largest real part of the roots against CG";
    p.y = {"largest real part", "1/s"};
    p.series.push_back(line("stick held", cg, column(r, &PointResult::max_real_held), svg::Style::first, svg::Marker::dot));
    p.series.push_back(line("stick free", cg, column(r, &PointResult::max_real_free), svg::Style::second, svg::Marker::square));
    p.refs.push_back({false, 0.0, "above zero: diverges", svg::Style::reference});
    if (r.has_boundary) {
      if (std::isfinite(r.free.eigenvalue))
        p.refs.push_back({true, r.free.eigenvalue, "free diverges aft of " + pct(r.free.eigenvalue, 1), svg::Style::reference});
      if (std::isfinite(r.held.eigenvalue))
        p.refs.push_back({true, r.held.eigenvalue, "held diverges aft of " + pct(r.held.eigenvalue, 1), svg::Style::reference});
    }
  }
  p.spans.push_back({d.margins.envelope_forward, d.margins.envelope_aft, "stated envelope", false, false});
  const double c0 = d.scenario.airplane.mass.h_cg;
  p.refs.push_back({true, c0, "analysed CG", svg::Style::third});
  p.description = p.title + ", stick held and free";
  return svg::render(p);
}

}  // namespace

// ---------------------------------------------------------------------------------------------
// The page

namespace {

constexpr const char* kStyle = R"CSS(
@page { size: A4; margin: 13mm 13mm 15mm 13mm; }
* { box-sizing: border-box; }
html { background: #fff; }
body { font-family: "DejaVu Sans", "Liberation Sans", Arial, Helvetica, sans-serif; font-size: 10pt; line-height: 1.42;
       color: #111; max-width: 740px; margin: 24px auto; padding: 0 10px; }
h1 { font-size: 19pt; line-height: 1.2; margin: 2px 0 4px; }
h2 { font-size: 13.5pt; margin: 26px 0 8px; padding-bottom: 3px; border-bottom: 2px solid #1c2b4a; break-after: avoid; }
h3 { font-size: 11pt; margin: 16px 0 6px; break-after: avoid; }
p { margin: 5px 0 8px; }
.kicker { font-size: 9pt; letter-spacing: 0.06em; text-transform: uppercase; color: #444; margin: 0; }
.sub { font-size: 10.5pt; color: #222; margin: 0 0 2px; }
.generated { font-size: 9pt; color: #444; margin: 0 0 8px; }
.caution { border: 2px solid #111; padding: 7px 11px; margin: 10px 0 12px; background: #f7f7f7; font-size: 9.5pt; break-inside: avoid; }
.caution strong { text-transform: uppercase; letter-spacing: 0.04em; }
.verdict { border-left: 6px solid #1c2b4a; background: #f1f3f7; padding: 7px 12px; margin: 8px 0 10px; font-size: 11pt; break-inside: avoid; }
.verdict b { font-weight: bold; }
table { border-collapse: collapse; width: 100%; font-size: 9pt; margin: 6px 0 10px; break-inside: avoid; }
th, td { border-bottom: 1px solid #d2d2d2; padding: 2.5px 6px; text-align: left; vertical-align: top; }
thead th { border-bottom: 1.6px solid #333; background: #eef0f3; font-weight: bold; }
th.n { text-align: right; }
td.n { text-align: right; white-space: nowrap; font-variant-numeric: tabular-nums; }
td.wrap { text-align: left; white-space: normal; }
table.kv td:first-child { width: 42%; color: #222; }
table.compact td, table.compact th { padding: 1.5px 5px; }
table.inputs td:first-child { white-space: nowrap; }
figure { margin: 8px 0 12px; break-inside: avoid; }
figcaption { font-size: 8.8pt; color: #333; margin-top: 2px; }
svg.plot { display: block; max-width: 100%; height: auto; }
.grid2 { display: grid; grid-template-columns: 1fr 1fr; gap: 4px 10px; }
.grid2 > * { min-width: 0; }
.grid2 svg.plot { width: 100%; }
table.first30 td:first-child { width: 30%; }
table.first40 td:first-child { width: 40%; }
.cmd { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 8.6pt; background: #f3f3f3; padding: 5px 8px;
       white-space: pre-wrap; word-break: break-all; border: 1px solid #ddd; }
code, .mono { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 8.6pt; word-break: break-all; }
ol.findings { padding-left: 20px; }
ol.findings li { margin: 0 0 9px; break-inside: avoid; }
ol.findings .t { font-weight: bold; }
ol.findings .k { color: #333; font-size: 8.8pt; }
nav ol { columns: 2; font-size: 9.5pt; margin: 4px 0; }
a { color: #1c2b4a; }
.note { font-size: 9pt; color: #333; }
.muted { color: #555; }
.page { break-before: page; }
@media print {
  body { max-width: none; margin: 0; padding: 0; font-size: 9.5pt; }
  a { text-decoration: none; color: inherit; }
  h2 { margin-top: 16px; }
}
)CSS";

struct Page {
  std::string html;
  int figure = 0;
  std::string fig(const std::string& svg_text, const std::string& caption) {
    ++figure;
    return "<figure>" + svg_text + "<figcaption><b>Figure " + std::to_string(figure) + ".</b> " + caption +
           "</figcaption></figure>\n";
  }
};

std::string modes_table_html(const std::vector<Mode>& ms) {
  Table t;
  t.head = {"mode", "root [1/s]", "\u03c9<sub>n</sub> [rad/s]", "\u03b6 [-]", "period [s]", "time to half / double [s]",
            "cycles to \u2152"};
  t.numeric = {false, true, true, true, true, true, true};
  t.cls = "compact";
  for (const auto& m : ms) {
    std::string th = "\u2013";
    if (m.root.real() < 0) th = number(m.time_to_half, m.time_to_half < 10 ? 2 : 0) + " (half)";
    if (m.root.real() > 0) th = "<b>" + number(m.time_to_double, 2) + " (double)</b>";
    t.rows.push_back({esc(m.name), root_text(m), number(m.frequency, 3), number(m.damping, 3),
                      m.oscillatory ? number(m.period, 2) : "\u2013", th,
                      m.cycles_to_tenth > 0 ? number(m.cycles_to_tenth, 2) : "\u2013"});
  }
  return table_html(t);
}

// The numbers of one gust case, held beside free, from its summary (what `floatpitch run`
// writes): response metrics, the design rule's estimate, turbulence statistics.
std::string gust_tables(const GustCase& g) {
  const json& j = g.summary;
  std::string h;
  const json& gr = j.value("gust_response", json::object());
  const json& H = gr.value("held", json());
  const json& F = gr.value("free", json());
  const json& R = gr.value("ratio_free_to_held", json::object());
  auto v = [](const json& o, const char* k) { return o.is_object() && o.contains(k) && o[k].is_number() ? o[k].get<double>() : nan_; };
  Table t;
  t.head = {"gust response", "stick held", "stick free", "free / held"};
  t.numeric = {false, true, true, true};
  t.cls = "first40";
  auto row = [&](const std::string& label, const char* key, int dec, const char* ratio_key) {
    const double r = ratio_key ? v(R, ratio_key) : nan_;
    t.rows.push_back({label, number(v(H, key), dec), number(v(F, key), dec), ratio_key ? number(r, 2) : ""});
  };
  row("peak load-factor increment [-]", "peak_load_factor_increment", 3, "peak_load_factor_increment");
  row("time to peak, from the gust's onset [s]", "time_to_peak_s", 2, "time_to_peak");
  row("peak angle of attack [deg]", "peak_alpha_deg", 2, nullptr);
  row("margin to the stall angle [deg]", "stall_margin_deg", 2, "stall_margin");
  row("peak elevator float [deg]", "peak_elevator_float_deg", 2, "peak_elevator_float");
  row("peak stick force (free: force to hold) [N]", "peak_stick_force_N", 1, "peak_stick_force");
  row("damping ratio, log decrement of pitch rate [-]", "damping_ratio_log_decrement", 3, "damping_ratio");
  row("settling time, 5 % of peak pitch rate [s]", "settling_time_s", 2, "settling_time");
  auto outc = [](const CaseResult* c) {
    if (!c) return std::string("\u2013");
    if (c->departure.departed) return "<b>departs at " + number(c->departure.time, 2) + " s</b>: " + esc(c->departure.reason);
    return "no departure within " + number(c->trace.ch[ch_time].back(), 0) + " s";
  };
  const RunOutcome& o = *g.outcome;
  t.tail = "<tr><td>outcome</td><td colspan=\"3\" class=\"wrap\">held: " + outc(o.held.get()) + "<br>free: " +
           outc(o.free.get()) + "</td></tr>\n";
  h += table_html(t);
  if (gr.contains("definitions")) h += "<p class=\"note\">Definitions: " + esc(gr["definitions"].get<std::string>()) + ".</p>\n";
  // the light-airplane gust rule beside the simulation, for rule gusts
  if (j.contains("design_rule_estimates") && j["design_rule_estimates"].is_array() && !j["design_rule_estimates"].empty()) {
    Table r;
    r.head = {"gust", "rule", "U<sub>de</sub> [m/s EAS]", "\u03bc<sub>g</sub>", "K<sub>g</sub>", "\u0394n rule",
              "\u0394n simulated, held", "\u0394n simulated, free"};
    r.numeric = {false, false, true, true, true, true, true, true};
    for (const auto& e : j["design_rule_estimates"])
      r.rows.push_back({std::to_string(e.value("gust", 0)), esc(e.value("rule", std::string())), number(v(e, "U_de_eas_mps"), 2),
                        number(v(e, "mu_g"), 2), number(v(e, "K_g"), 3), number(v(e, "delta_n_rule"), 3),
                        number(v(e, "delta_n_simulated_held"), 3), number(v(e, "delta_n_simulated_free"), 3)});
    h += "<p>The light-airplane gust rule's load factor (14 CFR 23.341(c) before amendment 23-64; CS 23.341, "
         "amendment 4) beside the simulated peaks:</p>\n" + table_html(r);
  }
  // turbulence statistics
  if (j.contains("turbulence") && !j["turbulence"].is_null() && H.is_object() && H.contains("turbulence")) {
    const json& tz = j["turbulence"];
    const json& th = H["turbulence"];
    const json& tf = F.is_object() && F.contains("turbulence") ? F["turbulence"] : json();
    h += "<h3>Turbulence statistics, held beside free</h3>\n<p>" +
         esc(std::string(tz.value("model", std::string()) == "dryden" ? "Dryden" : "von K\u00e1rm\u00e1n")) +
         " turbulence, \u03c3<sub>u</sub> " + number(v(tz, "sigma_u_mps"), 2) + " m/s, \u03c3<sub>w</sub> " +
         number(v(tz, "sigma_w_mps"), 2) + " m/s, scale lengths " + number(v(tz, "scale_u_m"), 0) + " m and " +
         number(v(tz, "scale_w_m"), 0) + " m; statistics over " + number(th["window_s"][0].get<double>(), 1) + " to " +
         number(th["window_s"][1].get<double>(), 1) + " s, increments from trim.</p>\n";
    Table s;
    s.head = {"RMS of the increment", "stick held", "stick free", "free / held"};
    s.numeric = {false, true, true, true};
    s.cls = "first40";
    const json& rr = R.value("turbulence", json::object());
    for (std::size_t k = 0; k < st_count; ++k) {
      const auto& ci = stat_channel_info(k);
      const std::string key = std::string(ci.name) + "_" + (std::string(ci.unit) == "-" ? "" : ci.unit);
      s.rows.push_back({esc(std::string(ci.name) + " [" + ci.unit + "]"), number(v(th["rms"], key.c_str()), 3),
                        tf.is_object() ? number(v(tf["rms"], key.c_str()), 3) : "\u2013",
                        number(v(rr, ("rms_" + std::string(ci.name)).c_str()), 2)});
    }
    h += table_html(s);
    Table e;
    e.head = {"times the increment rises above", "stick held", "stick free"};
    e.numeric = {false, true, true};
    e.cls = "first40";
    for (std::size_t k = 0; k < st_count; ++k) {
      const auto& ci = stat_channel_info(k);
      for (std::size_t l = 0; l < 3; ++l) {
        const double level = ci.levels[l] * ci.display;
        auto cnt = [&](const json& side) -> std::string {
          if (!side.is_object()) return "\u2013";
          return std::to_string(side["exceedances"][ci.name]["levels"][l]["count"].template get<long>());
        };
        const std::string unit = std::string(ci.unit) == "-" ? "" : " " + std::string(ci.unit);
        e.rows.push_back({esc(std::string(ci.name) + " " + number(level, 2) + unit), cnt(th), cnt(tf)});
      }
    }
    h += table_html(e);
  }
  return h;
}


}  // namespace

namespace {

struct DataFile {
  std::string name;     // relative to the output directory
  std::string what;     // for the list on the page
  std::string content;
};

std::string csv_num(double v) {
  if (!std::isfinite(v)) return "";
  char b[40];
  std::snprintf(b, sizeof b, "%.9g", v);
  return b;
}

std::vector<DataFile> data_files(const ReportData& d) {
  std::vector<DataFile> f;
  const auto dump = [](json j) {  // every JSON file carries the caution
    if (j.is_object() && !j.contains("caution")) j["caution"] = kCaution;
    return j.dump(2) + "\n";
  };
  f.push_back({"data/scenario_resolved.toml", "the scenario as analysed: every key after includes and overrides",
               d.scenario_toml});
  {
    json files = json::array();
    for (const auto& x : d.files) files.push_back({{"path", x.path}, {"bytes", x.bytes}, {"sha256", x.sha256}});
    const auto& o = d.options;
    json j{{"tool", "floatpitch"}, {"version", d.version}, {"command", d.command}, {"files", files},
           {"options", {{"set", o.set}, {"cg_range", o.cg_range}, {"cg_range_used", d.cg_range_text}, {"gusts", o.gusts},
                        {"hinge_band", o.hinge_band}, {"sample", o.sample}, {"samples", o.samples}, {"seed", o.seed},
                        {"min_margin", o.min_margin}, {"min_force_per_g_N", o.min_force_per_g}}},
           {"caution", kCaution}};
    f.push_back({"data/inputs.json", "input files with their SHA-256, tool version, options, the regenerating command",
                 dump(j)});
  }
  {
    std::string c =
        "corner,cg,mass_kg,in_envelope,computed,failure,tas_kt,cas_kt,static_margin_fixed,static_margin_free,"
        "force_gradient_N_per_kt,free_return_low_kt,free_return_high_kt,force_per_g_N,limit_load_factor,force_at_limit_N,"
        "sp_damping_held,sp_damping_free,deciding_root_free_per_s,deciding_mode_free,";
    for (const char* r : {"release_up", "release_down"})
      c += std::string(r) + "_force_N," + r + "_departed," + r + "_stall," + r + "_time_s," + r + "_n_min," + r +
           "_n_max," + r + "_v_min_kt," + r + "_v_max_kt,";
    c.back() = '\n';
    auto q = [](const std::string& x) {
      std::string o = "\"";
      for (char ch : x) o += ch == '"' ? std::string("\"\"") : std::string(1, ch);
      return o + "\"";
    };
    for (const auto& x : d.corners) {
      const Margins& m = x.margins;
      c += q(x.corner.label) + "," + csv_num(x.cg) + "," + csv_num(x.mass) + "," + (x.in_envelope ? "1" : "0") + "," +
           (x.ok ? "1" : "0") + "," + q(x.failure) + "," + csv_num(units::to_kt(x.airspeed)) + ",";
      if (!x.ok) {
        c += std::string(28, ',') + "\n";  // the 29 columns after tas_kt, empty
        continue;
      }
      c += csv_num(units::to_kt(x.calibrated)) + "," + csv_num(m.margin_fixed) + "," + csv_num(m.margin_free) + "," +
           csv_num(m.force_gradient * units::kt) + "," + csv_num(units::to_kt(m.free_return_low)) + "," +
           csv_num(units::to_kt(m.free_return_high)) + "," + csv_num(m.force_per_g) + "," + csv_num(x.limit_load_factor) +
           "," + csv_num(x.force_at_limit) + "," + (x.has_sp_held ? csv_num(x.sp_held.damping) : "") + "," +
           (x.has_sp_free ? csv_num(x.sp_free.damping) : "") + "," + csv_num(x.worst_free.root.real()) + "," +
           q(x.worst_free.name) + ",";
      for (const Release* r : {&x.release_up, &x.release_down})
        c += csv_num(r->force) + "," + (r->departed ? "1" : "0") + "," + (r->stall ? "1" : "0") + "," + csv_num(r->time) +
             "," + csv_num(r->n_min) + "," + csv_num(r->n_max) + "," + csv_num(units::to_kt(r->v_min)) + "," +
             csv_num(units::to_kt(r->v_max)) + ",";
      c.back() = '\n';
    }
    f.push_back({"data/envelope_corners.csv", "first page: the stated envelope's corners, each trimmed hands-off", c});
    json cj = json::array();
    for (const Criterion* x : criteria_for(d.options.basis))
      cj.push_back({{"id", x->id}, {"title", x->title}, {"document", x->document}, {"text", x->text},
                    {"text_status", x->status == TextStatus::verbatim           ? "verbatim"
                                    : x->status == TextStatus::verbatim_partial ? "verbatim, partial"
                                    : x->status == TextStatus::not_available    ? "not available"
                                                                                : "not applicable"},
                    {"text_note", x->text_note}, {"source", x->source}, {"compared", x->compared}});
    f.push_back({"data/criteria.json", "section 9: the criteria table of the basis",
                 dump(json{{"basis", d.options.basis}, {"criteria", cj}, {"caution", kCaution}})});
  }
  f.push_back({"data/trim.json", "section 2: trims held, hands-off, and the start of the runs",
               dump(json{{"held", trim_json(d.trim_held)}, {"hands_off", trim_json(d.trim_free)},
                         {"run_start", trim_json(d.trim_start)}})});
  f.push_back({"data/margins.json", "section 3: neutral and maneuver points, margins, forces, CG limits",
               dump(margins_json(d.margins))});
  {
    std::string c = "airspeed [m/s],airspeed [kt],stick_force [N],elevator [deg],alpha [deg]\n";
    for (const auto& p : d.margins.curve)
      c += csv_num(p.airspeed) + "," + csv_num(units::to_kt(p.airspeed)) + "," + csv_num(p.stick_force) + "," +
           csv_num(units::to_deg(p.elevator)) + "," + csv_num(units::to_deg(p.alpha)) + "\n";
    f.push_back({"data/stick_force_speed.csv", "section 3: stick force against speed, tab fixed", c});
    std::string g = "load_factor [-],stick_force [N]\n";
    for (const auto& pt : d.force_per_g.points) g += csv_num(pt.load_factor) + "," + csv_num(pt.stick_force) + "\n";
    f.push_back({"data/stick_force_per_g.csv", "section 3: stick force against load factor", g});
  }
  f.push_back({"data/modes.json", "section 4: roots and modes held and free", dump(modes_json(d.modes))});
  {
    std::string c = "case,mode,real [1/s],imag [rad/s],frequency [rad/s],damping [-],period [s],time_to_half [s],"
                    "time_to_double [s],cycles_to_tenth [-]\n";
    auto add = [&](const char* which, const std::vector<Mode>& ms) {
      for (const auto& m : ms)
        c += std::string(which) + "," + m.name + "," + csv_num(m.root.real()) + "," + csv_num(m.root.imag()) + "," +
             csv_num(m.frequency) + "," + csv_num(m.damping) + "," + (m.oscillatory ? csv_num(m.period) : "") + "," +
             (m.root.real() < 0 ? csv_num(m.time_to_half) : "") + "," + (m.root.real() > 0 ? csv_num(m.time_to_double) : "") +
             "," + (m.cycles_to_tenth > 0 ? csv_num(m.cycles_to_tenth) : "") + "\n";
    };
    add("held", d.modes.held);
    add("free", d.modes.free);
    f.push_back({"data/roots.csv", "section 4: the roots of the complex-plane plots", c});
  }
  f.push_back({"data/cg_sweep.csv", "section 5: every CG point (margins, roots, damping)", sweep_csv(d.cg_sweep)});
  f.push_back({"data/cg_sweep.json", "section 5: the same with the divergence boundary by three methods",
               dump(sweep_json(d.cg_sweep))});
  for (const auto& g : d.gusts) {
    const RunOutcome& o = *g.outcome;
    if (o.held) f.push_back({"data/gust_" + g.id + "_held.csv", "section 6: " + g.id + " time history, stick held", trace_csv(o.held->trace)});
    if (o.free) f.push_back({"data/gust_" + g.id + "_free.csv", "section 6: " + g.id + " time history, hands off", trace_csv(o.free->trace)});
    json j = summary_json(g.scenario, o);
    j["gust_case"] = {{"id", g.id}, {"title", g.title}, {"choice", g.spec}};
    f.push_back({"data/gust_" + g.id + "_summary.json", "section 6: " + g.id + " peaks, departures, solver figures", dump(j)});
  }
  const UncertaintyResult& u = d.uncertainty;
  f.push_back({"data/uncertainty_samples.csv", "section 7: each sample's inputs, neutral points and roots", sweep_csv(u.sampled)});
  f.push_back({"data/uncertainty_samples.json", "section 7: the same with the bands", dump(sweep_json(u.sampled))});
  if (u.has_corners)
    f.push_back({"data/uncertainty_corners.csv", "section 7: the corners of the band", sweep_csv(u.corners)});
  {
    std::string c = "index";
    for (const auto& k : u.keys) c += "," + k;
    c += ",np_free,max_real_free [1/s],departed,departure_time [s],peak_dn [-],peak_dalpha [deg],failure\n";
    for (const auto& r : u.responses) {
      c += std::to_string(r.index);
      for (double v : r.inputs) {
        c += ',';
        c += csv_num(v);
      }
      c += "," + csv_num(r.np_free) + "," + csv_num(r.max_real_free) + "," + (r.departed ? "1" : "0") + "," +
           csv_num(r.departure_time) + "," + csv_num(r.peak_dn) + "," + csv_num(units::to_deg(r.peak_dalpha)) + ",";
      std::string why = r.failure;  // quoted, as sweep.csv writes its reasons
      std::replace(why.begin(), why.end(), '"', '\'');
      c += (why.empty() ? std::string() : "\"" + why + "\"") + "\n";
    }
    f.push_back({"data/uncertainty_responses.csv", "section 7: each sample's hands-off run", c});
    std::string e = "time [s]";
    for (std::size_t i = 0; i < u.responses.size(); ++i) e += ",alpha sample " + std::to_string(u.responses[i].index) + " [deg]";
    e += "\n";
    for (std::size_t k = 0; k < u.t.size(); ++k) {
      e += csv_num(u.t[k]);
      for (const auto& a : u.alpha) {
        e += ',';
        if (k < a.size()) e += csv_num(units::to_deg(a[k]));
      }
      e += "\n";
    }
    f.push_back({"data/uncertainty_alpha.csv", "section 7: each sample's hands-off angle of attack (every " +
                 csv_num(u.t.size() > 1 ? u.t[1] - u.t[0] : 0.0) + " s; empty after it departs)", e});
  }
  {
    json j = json::array();
    for (const auto& x : report_findings(d))
      j.push_back({{"topic", x.topic}, {"measured", x.measured}, {"criterion", x.criterion}, {"source", x.source},
                   {"source_note", x.source_note}, {"comparison", x.comparison}, {"criteria", x.criteria}});
    f.push_back({"data/findings.json", "section 8: the findings", dump(json{{"findings", j}, {"caution", kCaution}})});
  }
  return f;
}

std::string page(const ReportData& d, const std::vector<DataFile>& files);

}  // namespace

std::string report_html(const ReportData& d) { return page(d, data_files(d)); }

std::vector<std::pair<std::string, std::string>> report_files(const ReportData& d) {
  auto df = data_files(d);
  std::vector<std::pair<std::string, std::string>> out;
  out.emplace_back("report.html", page(d, df));
  for (auto& x : df) out.emplace_back(x.name, std::move(x.content));
  return out;
}

namespace {

// What every section of the page reads: the report's data and the facts drawn from it once.
struct PageCtx {
  const ReportData& d;
  const std::vector<DataFile>& files;
  Facts f;
  double rho = 0;    // density at the condition [kg/m^3]
  double Veas = 0;   // equivalent airspeed of the condition [m/s]
  int sweep_root_fig = 0;  // figure number of the sweep's root plot (cited by later sections)
};

// The names the section bodies use, bound from the context.
#define FP_PAGE_NAMES(c)                                         \
  [[maybe_unused]] const ReportData& d = (c).d;                  \
  [[maybe_unused]] const std::vector<DataFile>& files = (c).files; \
  [[maybe_unused]] const Facts& f = (c).f;                       \
  [[maybe_unused]] const Margins& m = d.margins;                 \
  [[maybe_unused]] const Scenario& s = d.scenario;               \
  [[maybe_unused]] const Airplane& a = s.airplane;               \
  [[maybe_unused]] const double cg = (c).f.cg;                   \
  [[maybe_unused]] const double rho = (c).rho;                   \
  [[maybe_unused]] const double Veas = (c).Veas;                 \
  [[maybe_unused]] int& sweep_root_fig = (c).sweep_root_fig;     \
  std::string& h = pg.html

// Section: the stated envelope's corners against the criteria (the first page).
void page_envelope(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"envelope\">The stated envelope against the criteria</h2>\n";
  const Basis* basis = find_basis(d.options.basis);
  if (!d.analysed_in_envelope) {
    const double m0 = a.mass.mass;
    const double lo = s.envelope.mass_min > 0 ? s.envelope.mass_min : m0, hi = s.envelope.mass_max > 0 ? s.envelope.mass_max : m0;
    h += "<div class=\"verdict\"><b>The analysed point lies outside the stated envelope</b>: CG " + pct(cg) + " % MAC, " +
         number(m0, 0) + " kg, against the stated CG limits " + pct(s.envelope.cg_forward) + " to " +
         pct(s.envelope.cg_aft) + " % MAC and " +
         (lo == hi ? "the one mass of the case (no mass range stated)" : "masses " + number(lo, 0) + " to " + number(hi, 0) + " kg") +
         ". Sections 1 to 8 analyse that point; the table below is the stated envelope's.</div>\n";
  }
  const auto order = corners_worst_first(d);
  const CornerResult* first_ok = nullptr;
  for (const auto* x : order)
    if (x->ok) {
      first_ok = x;
      break;
    }
  h += "<p>Certification basis: <b>" + esc(basis ? basis->name : d.options.basis) + "</b> (option --basis). Each corner "
       "is trimmed hands-off at " + number(units::to_ft(s.condition.altitude), 0) + " ft" +
       (first_ok ? ", " + kt(first_ok->calibrated) + " CAS (" + kt(first_ok->airspeed) + " TAS)" : std::string()) +
       ", and the corners are ordered worst first: the most comparisons on the other side of their line, then the "
       "smallest stick-free margin. Each cell gives the figure and, below it, the margin to the line. The lines and "
       "the rows of the criteria table (section 9) they come from are in the first column; a rule whose text could "
       "not be retrieved is named but not quoted there.</p>\n";
  Table t;
  t.cls = "compact";
  t.head = {"criterion, line (criteria table rows)"};
  for (const auto* x : order)
    t.head.push_back(esc(x->corner.label) + "<br><span class=\"muted\">CG " + pct(x->cg) + " % MAC, " + number(x->mass, 0) +
                     " kg" + (x->in_envelope ? "" : ", outside") + "</span>");
  if (!first_ok) {
    std::vector<std::string> r = {"could not be computed"};
    for (const auto* x : order) r.push_back(esc(x->failure));
    t.rows.push_back(r);
  } else {
    const auto lines = corner_checks(d, *first_ok);
    std::vector<std::vector<CornerCheck>> checks;
    for (const auto* x : order) checks.push_back(x->ok ? corner_checks(d, *x) : std::vector<CornerCheck>{});
    for (std::size_t i = 0; i < lines.size(); ++i) {
      std::vector<std::string> r = {"<b>" + esc(lines[i].column) + "</b><br><span class=\"muted\">" + lines[i].line + "; " +
                                    esc(lines[i].ids) + "</span>"};
      for (std::size_t j = 0; j < order.size(); ++j) {
        if (!order[j]->ok) {
          r.push_back(i == 0 ? "could not be computed: " + esc(order[j]->failure) : std::string("\u2013"));
          continue;
        }
        const CornerCheck& k = checks[j][i];
        std::string cell = k.side < 0 ? "<b>" + k.figure + "</b>" : k.figure;
        if (!k.margin.empty()) cell += "<br><span class=\"muted\">margin " + k.margin + "</span>";
        if (k.side < 0) cell += "<br><b>other side of the line</b>";
        r.push_back(cell);
      }
      t.rows.push_back(r);
    }
  }
  h += table_html(t);
  h += "<p class=\"note\">Stick force per g and at the limit load factor from the steady pull-up at the trim speed (the "
       "force at n is the slope at trim times n \u2212 1); the release holds the speed 15 % above or below trim with the "
       "tab at the hands-off setting and the throttle re-trimmed for level flight, then lets the stick go and runs " +
       number(release_seconds, 0) + " s. A response that reaches the stall is called a stall and lies beyond the "
       "model's validity. Data: <code>data/envelope_corners.csv</code>.</p>\n";
}

// The criteria table of the basis (section 9), with the texts quoted where a copy was found.
std::string criteria_table_html(const ReportData& d) {
  std::string o = "<table id=\"criteria\" class=\"compact\">\n<thead><tr><th>row</th><th>kind, document</th><th>text "
                  "(verbatim where shown)</th><th>source of the text</th></tr></thead>\n<tbody>\n";
  for (const Criterion* c : criteria_for(d.options.basis)) {
    const char* kind = c->kind == CriterionKind::rule       ? "rule of the basis"
                       : c->kind == CriterionKind::guidance ? "guidance (not a civil rule)"
                       : c->kind == CriterionKind::option   ? "option of this tool (not a criterion)"
                                                            : "input data (not a criterion)";
    std::string text;
    if (c->status == TextStatus::verbatim || c->status == TextStatus::verbatim_partial)
      text = "<q>" + esc(c->text) + "</q>";
    else if (c->status == TextStatus::not_available)
      text = "<i>Text not available</i>";
    else
      text = "<i>No published text</i>";
    if (*c->text_note) text += "<br><span class=\"muted\">" + esc(c->text_note) + "</span>";
    text += "<br><span class=\"muted\">Compared here: " + esc(c->compared) + "</span>";
    o += "<tr><td><b>" + esc(c->id) + "</b><br>" + esc(c->title) + "</td><td>" + kind + "<br>" + esc(c->document) +
         "</td><td>" + text + "</td><td>" + (*c->source ? "<code>" + esc(c->source) + "</code>" : std::string("\u2013")) +
         "</td></tr>\n";
  }
  return o + "</tbody></table>\n";
}

// Section: title and first-page summary.
void page_summary(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<header>\n<p class=\"kicker\">floatpitch \u00b7 pitch stability with the elevator held and free</p>\n";
  h += "<h1>" + esc(s.name) + "</h1>\n";
  h += "<p class=\"sub\">" + esc(s.aircraft_name) + " \u00b7 CG " + pct(cg) + " % MAC \u00b7 " +
       number(units::to_ft(s.condition.altitude), 0) + " ft, " + kt(s.condition.airspeed) + " TAS (" + kt(Veas) +
       " EAS) \u00b7 " + number(a.mass.mass, 0) + " kg</p>\n";
  h += "<p " + std::string(kReportDateMarker) + ">Generated " + esc(d.date) + " (UTC) by floatpitch " + esc(d.version) + "</p>\n";
  h += "</header>\n";
  h += "<div class=\"caution\"><strong>Caution.</strong> " + std::string(kCaution) + "</div>\n";

  page_envelope(pg, c);
  h += "<h2 id=\"summary\">At a glance: the analysed point</h2>\n";
  {
    std::string v = "At CG " + pct(cg) + " % MAC and " + kt(s.condition.airspeed) + " the airplane is <b>" +
                    std::string(f.held_stable ? "stable with the stick held" : "unstable with the stick held") +
                    "</b> and <b>" + (f.free_stable ? "stable with the stick free" : "diverges with the stick free") +
                    "</b>.";
    h += "<div class=\"verdict\">" + v + "</div>\n";
    Table t;
    t.head = {"", "stick held (fixed)", "stick free (hands off)"};
    t.numeric = {false, true, true};
    t.rows.push_back({"static margin, model [% MAC]", plus_pct(m.margin_fixed), plus_pct(m.margin_free)});
    t.rows.push_back({"neutral point, model [% MAC]", pct(m.np_fixed.model), pct(m.np_free.model)});
    if (f.held_worst && f.free_worst) {
      t.rows.push_back({"largest real part of the roots [1/s]", plus(f.held_worst->root.real(), 4) + " (" + esc(f.held_worst->name) + ")",
                        plus(f.free_worst->root.real(), 4) + " (" + esc(f.free_worst->name) + ")"});
      t.rows.push_back({"time to half or double", time_words(*f.held_worst), time_words(*f.free_worst)});
    }
    auto sp = [](const Mode* md) {
      return md ? "\u03b6 " + number(md->damping, 2) + ", " + number(md->frequency, 2) + " rad/s"
                : std::string("none (aperiodic)");
    };
    t.rows.push_back({"short period", sp(f.sp_held), sp(f.sp_free)});
    if (d.cg_sweep.has_boundary)
      t.rows.push_back({"diverges for CG aft of [% MAC] (eigenvalue)", pct(d.cg_sweep.held.eigenvalue, 2),
                        pct(d.cg_sweep.free.eigenvalue, 2)});
    if (f.g1) {
      const RunOutcome& o = *f.g1->outcome;
      auto outc = [&](const CaseResult* c) {
        if (!c) return std::string("\u2013");
        if (c->departure.departed) {
          // a departure that reached the stall is a stall, and beyond the model's validity
          double amax = -1e9;
          for (const double al : c->trace.ch[ch_alpha]) amax = std::max(amax, al);
          const bool stall = c->departure.criterion == "angle_of_attack" || amax >= d.stall_alpha;
          return "<b>departs at " + number(c->departure.time, 1) + " s</b>" +
                 (stall ? std::string(" (a stall: beyond the model's validity)") : std::string());
        }
        return "no departure in " + number(c->trace.size() ? c->trace.ch[ch_time].back() : 0.0, 0) + " s";
      };
      t.rows.push_back({"gust run (Figure 2)", outc(o.held.get()), outc(o.free.get())});
    }
    h += table_html(t);

    // why
    std::string why = "<p><b>Why.</b> ";
    why += "A floating elevator follows the tail's angle of attack and so takes away part of the tail's lift slope: by "
           "the free-elevator factor F = 1 \u2212 \u03c4\u00b7Ch<sub>\u03b1</sub>/Ch<sub>\u03b4</sub> = " +
           number(m.cf.free_factor, 3) + " in the closed form (\u03c4 = " + number(a.tail.tau_elevator, 2) +
           ", Ch<sub>\u03b1</sub> = " + number(a.elevator.ch_alpha * units::deg, 4) + " /deg, Ch<sub>\u03b4</sub> = " +
           number(a.elevator.ch_delta * units::deg, 4) + " /deg). That moves the neutral point forward from " +
           pct(m.np_fixed.model) + " % MAC (stick fixed) to " + pct(m.np_free.model) + " % MAC (stick free). ";
    if (cg > m.np_free.model && cg < m.np_fixed.model)
      why += "The CG at " + pct(cg) + " % MAC lies between the two: " + pct(m.np_fixed.model - cg) +
             " % MAC ahead of the fixed neutral point, so the held airplane is stable, and " + pct(cg - m.np_free.model) +
             " % MAC aft of the free one, so hands-off it is not. ";
    else if (cg < m.np_free.model)
      why += "The CG at " + pct(cg) + " % MAC lies ahead of both, so both cases have a positive static margin. ";
    else
      why += "The CG at " + pct(cg) + " % MAC lies aft of both neutral points. ";
    if (f.free_worst && f.free_worst->root.real() > 0)
      why += "Hands-off the " + esc(f.free_worst->name) + " root is " + plus(f.free_worst->root.real(), 4) +
             " 1/s: a disturbance doubles every " + number(f.free_worst->time_to_double, 1) + " s. ";
    if (f.g1 && f.g1->outcome->free && f.g1->outcome->free->departure.departed)
      why += "In the gust run (Figure 2) the free airplane leaves the flight envelope at " +
             number(f.g1->outcome->free->departure.time, 1) + " s (" + esc(f.g1->outcome->free->departure.reason) + ")" +
             (f.g1->outcome->held && !f.g1->outcome->held->departure.departed ? " while the held one settles." : ".");
    why += "</p>\n";
    h += why;
    h += pg.fig(mac_chart(d, "fig-mac"),
                "Stick-fixed (dark, solid) and stick-free (light, dashed) static margins at the stated CG limits and at the "
                "analysed CG. The black tick marks each CG; its bars run to the neutral points (model), and a bar pointing forward "
                "(to the left) is a negative margin.");
    if (f.g1) {
      double tmax = 0;
      if (f.g1->outcome->held) tmax = std::max(tmax, f.g1->outcome->held->trace.ch[ch_time].back());
      if (f.g1->outcome->free) tmax = std::max(tmax, f.g1->outcome->free->trace.ch[ch_time].back());
      h += pg.fig(time_plot(*f.g1, ch_alpha, "fig-first-alpha", 680, 260, tmax, true),
                  "Angle of attack through disturbance " + esc(f.g1->id) + " of section 6, stick held (dark, solid) and "
                  "hands off (light, dashed). " + esc(f.g1->id) + ": " + esc(f.g1->title) + ".");
    }
    if (d.cg_sweep.has_boundary) {
      sweep_root_fig = pg.figure + 1;
      h += pg.fig(sweep_plot(d, "fig-sweep-root", false),
                  "Largest real part of the roots against CG (section 5), stick held (dark) and free (light, dashed). Above "
                  "zero the airplane diverges; the dash-dot lines mark where each case crosses zero, the dotted line the "
                  "analysed CG.");
    }
  }
  h += "<nav><b>Contents</b><ol>"
       "<li><a href=\"#s1\">What was analysed</a></li><li><a href=\"#s2\">Trim, held and hands-off</a></li>"
       "<li><a href=\"#s3\">Static stability</a></li><li><a href=\"#s4\">Dynamic stability</a></li>"
       "<li><a href=\"#s5\">CG sweep and the divergence boundary</a></li><li><a href=\"#s6\">Gusts</a></li>"
       "<li><a href=\"#s7\">Uncertainty of the hinge moments</a></li><li><a href=\"#s8\">Findings</a></li>"
       "<li><a href=\"#s9\">Criteria, method and cautions</a></li></ol></nav>\n";
}

// Every input of the airplane and the case, with its meaning and allowed values as the key table
// (scenario/keys.cpp) defines them: the report writes no parameter text of its own.
std::string inputs_table_html(const Scenario& s) {
  Table t;
  t.head = {"key", "meaning", "value", "allowed"};
  t.cls = "compact inputs";
  for (const KeyValue& kv : key_values(s)) {
    if (kv.table == "scenario" || kv.name == "name") continue;  // shown above
    t.rows.push_back({"<code>" + esc(kv.name) + "</code>", esc(kv.meaning), esc(kv.value), esc(kv.range)});
  }
  return "<h3>Every input</h3>\n<p class=\"note\">As analysed, after includes and overrides; meanings, units and "
         "allowed values are those of the key table that checks every scenario file.</p>\n" + table_html(t);
}

// Section: 1. what was analysed.
void page_what(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"s1\" class=\"page\">1. What was analysed</h2>\n";
  {
    Table t;
    t.head = {"item", "value"};
    t.cls = "kv compact";
    auto row = [&](const std::string& k, const std::string& v) { t.rows.push_back({k, v}); };
    const double xe = a.elevator.mass > 0 ? a.elevator.mass_moment / a.elevator.mass : 0.0;
    const double W = a.mass.mass * units::g0;
    row("airplane", esc(s.aircraft_name));
    row("scenario", esc(s.name) + (s.description.empty() ? "" : "<br><span class=\"note\">" + esc(s.description) + "</span>"));
    row("mass, pitch inertia", number(a.mass.mass, 1) + " kg, " + number(a.mass.pitch_inertia, 0) + " kg m\u00b2");
    row("wing", number(a.wing.area, 2) + " m\u00b2, MAC " + number(a.wing.mac, 3) + " m, span " + number(a.wing.span, 2) +
                    " m; wing loading " + number(W / a.wing.area, 0) + " N/m\u00b2");
    row("CG (analysed) and stated envelope", pct(cg) + " % MAC; envelope " + pct(s.envelope.cg_forward) + " to " +
                                                 pct(s.envelope.cg_aft) + " % MAC");
    row("condition", number(s.condition.altitude, 0) + " m (" + number(units::to_ft(s.condition.altitude), 0) + " ft) ISA, " +
                         number(s.condition.airspeed, 2) + " m/s (" + kt(s.condition.airspeed, 1) + ") TAS, " + kt(Veas, 1) +
                         " EAS, flight path " + degs(s.condition.flight_path, 1) + " deg");
    row("1 g stall at this altitude", kt(d.stall_speed, 1) + " TAS (C<sub>L max</sub> " + number(d.cl_max, 2) + ")");
    row("tail volume, elevator CG", "tail volume " + number(m.cf.tail_volume, 3) + "; elevator CG " +
                                         number(1000 * std::abs(xe), 0) + " mm " + (xe >= 0 ? "aft of" : "ahead of") +
                                         " the hinge");
    row("tool", "floatpitch " + esc(d.version));
    h += table_html(t);
    h += inputs_table_html(s);
    h += "<h3>Input files</h3>\n";
    Table ft;
    ft.head = {"file", "bytes", "SHA-256"};
    ft.numeric = {false, true, false};
    ft.cls = "compact";
    for (const auto& x : d.files) ft.rows.push_back({"<code>" + esc(x.path) + "</code>", std::to_string(x.bytes), "<code>" + x.sha256 + "</code>"});
    h += table_html(ft);
    if (!d.options.set.empty()) {
      std::string sets;
      for (const auto& x : d.options.set) sets += (sets.empty() ? "" : ", ") + ("<code>" + esc(x) + "</code>");
      h += "<p>Overrides on the command line: " + sets + ".</p>\n";
    }
    h += "<p>The resolved scenario (every key, after includes and overrides) is in <code>data/scenario_resolved.toml</code>. "
         "This command, run from the same directory with the same files, regenerates the report and its data:</p>\n";
    h += "<div class=\"cmd\">" + esc(d.command) + "</div>\n";
  }
}

// Section: 2. trim.
void page_trim(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"s2\">2. Trim, held and hands-off</h2>\n";
  {
    Table t;
    t.head = {"", std::string("stick held, tab ") + (s.trim.tab_auto ? "at 0" : "as set"), "hands off (tab for zero force)"};
    t.numeric = {false, true, true};
    auto r = [&](const std::string& k, const std::string& a1, const std::string& b1) { t.rows.push_back({k, a1, b1}); };
    const Trim& th = d.trim_held;
    const Trim& tf = d.trim_free;
    r("airspeed [kt TAS]", number(units::to_kt(th.airspeed), 1), number(units::to_kt(tf.airspeed), 1));
    r("angle of attack [deg]", degs(th.alpha), degs(tf.alpha));
    r("pitch attitude [deg]", degs(th.theta), degs(tf.theta));
    r("elevator [deg, TE down +]", degs(th.de), degs(tf.de));
    r("tab [deg, TE down +]", degs(th.tab), degs(tf.tab));
    r("stick force [N, pull +]", number(th.stick_force, 2), number(tf.stick_force, 2));
    r("throttle [-]", number(th.throttle, 3), number(tf.throttle, 3));
    r("lift coefficient [-]", number(th.CL, 3), number(tf.CL, 3));
    r("tail angle of attack [deg]", degs(th.eval.alpha_t), degs(tf.eval.alpha_t));
    r("hinge-moment coefficient [-]", number(th.eval.Ch, 4), number(tf.eval.Ch, 4));
    h += table_html(t);
    h += "<p class=\"note\">Both time runs of section 6 start from the " +
         std::string(s.trim.tab_auto ? "hands-off trim (tab " + degs(d.trim_start.tab) + " deg, elevator " + degs(d.trim_start.de) + " deg)"
                                     : "trim with the tab as set") +
         "; the held run then holds the stick where it is, the free run lets go of it.</p>\n";
  }
}

// Section: 3. static.
void page_static(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"s3\">3. Static stability</h2>\n";
  {
    h += "<h3>Neutral and maneuver points</h3>\n";
    Table t;
    t.head = {"% MAC", "closed form", "model", "model \u2212 closed form"};
    t.numeric = {false, true, true, true};
    auto r = [&](const std::string& k, const Pair& p) {
      t.rows.push_back({k, pct(p.closed_form, 2), pct(p.model, 2), plus_pct(p.model - p.closed_form, 2)});
    };
    r("neutral point, stick fixed", m.np_fixed);
    r("neutral point, stick free (aerodynamic)", m.np_free);
    r("apparent stick-free point (with the constant hinge moments)", m.np_apparent);
    r("maneuver point, stick fixed", m.mp_fixed);
    r("maneuver point, stick free", m.mp_free);
    t.rows.push_back({"static margin at the analysed CG, fixed / free / apparent",
                      plus_pct(m.cf.np_fixed - cg, 2) + " / " + plus_pct(m.cf.np_free - cg, 2) + " / " + plus_pct(m.cf.np_apparent - cg, 2),
                      plus_pct(m.margin_fixed, 2) + " / " + plus_pct(m.margin_free, 2) + " / " + plus_pct(m.margin_apparent, 2), ""});
    h += table_html(t);
    h += "<p class=\"note\">Closed form: tail-volume formulas with the free-elevator factor F = " + number(m.cf.free_factor, 3) +
         " (lift slope " + number(m.cf.lift_slope, 3) + " /rad fixed, " + number(m.cf.lift_slope_free, 3) +
         " /rad free; elevator power Cm<sub>\u03b4</sub> " + number(m.cf.cm_delta, 3) + " /rad; relative density \u03bc " +
         number(m.cf.mu, 1) + "). Model: slopes of the full nonlinear model at trim. The apparent point includes the hinge "
         "moments that do not grow with dynamic pressure (elevator weight, downspring, bobweight at 1 g: " +
         number(m.cf.hinge_constant, 3) + " N m here); the stick-force gradient vanishes there.</p>\n";

    h += "<h3>Margins across the stated CG envelope</h3>\n";
    Table mt;
    mt.head = {"CG [% MAC]", "margin fixed [% MAC]", "margin free [% MAC]", "distance to the hands-off boundary [% MAC]"};
    mt.numeric = {false, true, true, true};
    mt.cls = "first30";
    for (double c : {m.envelope_forward, m.envelope_aft, cg}) {
      const std::string lab = c == cg ? "analysed CG " + pct(c) : (c == m.envelope_forward ? "stated forward limit " : "stated aft limit ") + pct(c);
      mt.rows.push_back({lab, plus_pct(np_at(d, c, false) - c), plus_pct(np_at(d, c, true) - c),
                         d.cg_sweep.has_boundary ? plus_pct(d.cg_sweep.free.eigenvalue - c) : "\u2013"});
      if (c == cg && (cg == m.envelope_forward || cg == m.envelope_aft)) mt.rows.pop_back();
    }
    h += table_html(mt);

    h += "<h3>Stick force against speed</h3>\n";
    {
      svg::Plot p;
      p.id = "fig-force-speed";
      p.title = "Stick force against airspeed, tab fixed at the hands-off setting";
      p.x = {"airspeed (TAS)", "kt"};
      p.y = {"stick force, pull +", "N"};
      p.y.include_zero = true;
      std::vector<double> vx, vf;
      for (const auto& c : m.curve) {
        vx.push_back(units::to_kt(c.airspeed));
        vf.push_back(c.stick_force);
      }
      p.series.push_back(line("model (steady trims at each speed)", vx, vf, svg::Style::first));
      const SlopeCheck sc = slope_check(m);
      p.spans.push_back({units::to_kt(sc.lo), units::to_kt(sc.hi), "23.175(b) speed range", false, false});
      if (std::isfinite(m.free_return_low))
        p.spans.push_back({units::to_kt(m.free_return_low), units::to_kt(m.free_return_high), "free-return band", false, true});
      p.notes.push_back({units::to_kt(m.trim_speed), 0.0, "trim " + kt(m.trim_speed), false});
      h += pg.fig(svg::render(p),
                  "Stick force to hold each speed in steady flight with the tab left at its hands-off setting for " +
                      kt(m.trim_speed) + ". Gradient at trim " + plus(m.force_gradient * units::kt, 3) + " N/kt (model), " +
                      plus(m.cf.force_gradient * units::kt, 3) + " N/kt (closed form); negative means a pull below trim. " +
                      (std::isfinite(m.free_return_low)
                           ? "Free-return band (friction " + number(a.circuit.friction, 1) + " N): " + kt(m.free_return_low, 1) + " to " + kt(m.free_return_high, 1) + "."
                           : "No free-return band: " + std::string(a.circuit.friction > 0 ? "the gradient is not stable." : "no friction.")) +
                      (std::isfinite(m.reversal_speed) ? " The force reverses at " + kt(m.reversal_speed, 1) + "." : ""));
    }
    h += "<h3>Stick force per g</h3>\n";
    {
      svg::Plot p;
      p.id = "fig-force-g";
      p.title = "Stick force in a steady pull-up";
      p.height = 240;
      p.x = {"load factor n", "-"};
      p.y = {"stick force, pull +", "N"};
      p.y.include_zero = true;
      std::vector<double> nx, fy;
      for (const auto& pt : d.force_per_g.points) {
        nx.push_back(pt.load_factor);
        fy.push_back(pt.stick_force);
      }
      p.series.push_back(line("model, tab at the hands-off setting", nx, fy, svg::Style::first, svg::Marker::dot));
      h += pg.fig(svg::render(p),
                  "Stick force against load factor at " + kt(m.trim_speed) + ": " + number(m.force_per_g, 1) + " N/g (" +
                      number(m.force_per_g / units::lbf, 2) + " lbf/g) at 1 g with everything included; " +
                      number(m.force_per_g_aero, 1) + " N/g from the aerodynamic hinge moments alone; closed form " +
                      number(m.cf.force_per_g, 1) + " N/g. Elevator per g: " + degs(m.elevator_per_g, 2) + " deg/g. " +
                      esc(per_g_stop_text(d.force_per_g)));
    }
    h += "<h3>CG limits and what sets each</h3>\n";
    {
      Table t;
      t.head = {"limit", "CG [% MAC]", "set by"};
      t.numeric = {false, true, false};
      auto set_by = [](const CgLimit& l) { return esc(l.reason) + (l.basis.empty() ? "" : " <i>[" + esc(l.basis) + "]</i>"); };
      t.rows.push_back({"forward", pct(m.limits.forward.cg), set_by(m.limits.forward)});
      t.rows.push_back({"<b>aft</b>", "<b>" + pct(m.limits.aft.cg) + "</b>", set_by(m.limits.aft)});
      t.rows.push_back({"\u2003aft candidate: stick-free neutral point", pct(m.limits.aft_free_np.cg), set_by(m.limits.aft_free_np)});
      t.rows.push_back({"\u2003aft candidate: minimum static margin", pct(m.limits.aft_margin.cg), set_by(m.limits.aft_margin)});
      t.rows.push_back({"\u2003aft candidate: minimum stick force per g", pct(m.limits.aft_force_per_g.cg), set_by(m.limits.aft_force_per_g)});
      t.rows.push_back({"stated envelope", pct(m.envelope_forward) + " to " + pct(m.envelope_aft), "the airplane's data ([envelope])"});
      h += table_html(t);
      h += "<p class=\"note\">The minimum static margin (" + pct(d.options.min_margin) + " % MAC) and stick force per g (" +
           number(d.options.min_force_per_g, 1) + " N/g) are options of this report (<code>--min-margin</code>, "
           "<code>--min-force-per-g</code>), not published criteria.</p>\n";
    }
  }
}

// Section: 4. dynamic.
void page_dynamic(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"s4\">4. Dynamic stability</h2>\n";
  {
    h += "<p>Roots of the full model linearised at the trim of section 2 (central-difference Jacobian); modes are named from "
         "their eigenvectors.</p>\n";
    h += "<h3>Stick held</h3>\n" + modes_table_html(d.modes.held);
    h += "<h3>Stick free</h3>\n" + modes_table_html(d.modes.free);
    h += pg.fig(complex_plane(d, "fig-roots-all", false),
                "Roots in the complex plane: stick held (dark dots) and stick free (light squares). The shaded half-plane is "
                "unstable; the line marks a damping ratio of 0.35.");
    h += pg.fig(complex_plane(d, "fig-roots-slow", true),
                "The slow roots (phugoid, speed, divergence) near the origin, same symbols.");
    h += "<h3>Short period: cycles to damp to one tenth</h3>\n";
    Table t;
    t.head = {"", "\u03b6 [-]", "\u03c9<sub>n</sub> [rad/s]", "cycles to \u2152", "MIL-F-8785C level 1, cat. A and C (0.35 to 1.30)"};
    t.numeric = {false, true, true, true, false};
    auto r = [&](const std::string& k, const Mode* md) {
      if (!md) {
        t.rows.push_back({k, "\u2013", "\u2013", "\u2013", "no oscillatory short-period mode: the pitch motion is aperiodic"});
        return;
      }
      const bool in = md->damping >= 0.35 && md->damping <= 1.30;
      t.rows.push_back({k, number(md->damping, 3), number(md->frequency, 3),
                        md->cycles_to_tenth > 0 ? number(md->cycles_to_tenth, 2) : "\u2013", in ? "inside" : "outside"});
    };
    r("stick held", f.sp_held);
    r("stick free", f.sp_free);
    h += table_html(t);
    h += "<p class=\"note\">Cycles to one tenth N = ln 10/(2\u03c0) \u00b7 \u03c9<sub>d</sub>/|\u03c3|; for reference, N = 0.5, 1, 2, 3 "
         "correspond to \u03b6 = 0.591, 0.344, 0.180, 0.121. 14 CFR 23.181(a) asks that short-period oscillations be "
         "\u201cheavily damped\u201d with the controls free and fixed and gives no number.</p>\n";
  }
}

// Section: 5. CG sweep.
void page_cg_sweep(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"s5\">5. CG sweep and the hands-off divergence boundary</h2>\n";
  {
    const SweepResult& r = d.cg_sweep;
    h += "<p>The scenario retrimmed at each CG from " + esc(d.cg_range_text) + " (fractions of the MAC, " +
         std::to_string(r.points.size()) + " points), with the roots held and free at each.</p>\n";
    if (r.has_boundary)
      h += "<p>Figure " + std::to_string(sweep_root_fig) +
           " in the summary shows the largest real part of the roots against CG, held and free.</p>\n";
    else
      h += pg.fig(sweep_plot(d, "fig-sweep-root", false),
                  "Largest real part of the roots against CG, stick held (dark) and free (light, dashed). Above zero the "
                  "airplane diverges.");
    h += pg.fig(sweep_plot(d, "fig-sweep-damping", true),
                "Short-period damping ratio against CG (gaps: no oscillatory short-period mode at that CG).");
    if (r.has_boundary) {
      Table t;
      t.head = {"CG where the airplane starts to diverge [% MAC]", "closed form", "static crossing",
                "first crossing", "time response", "closed form - static", "first - time"};
      t.numeric = {false, true, true, true, true, true, true};
      auto row = [](const char* name, const Boundary& b, const std::string& cf) {
        const BoundarySpreads sp = boundary_spreads(b);
        const std::string first = pct(b.eigenvalue, 2) +
            (b.crossing_oscillatory ? "<br><span class=\"muted\">oscillatory, period " + number(b.crossing_period, 0) + " s</span>"
                                    : std::string());
        return std::vector<std::string>{name, cf, pct(b.static_crossing, 2), first, pct(b.time_domain, 2),
                                        number(100 * sp.closed_vs_static, 2), number(100 * sp.first_vs_time, 2)};
      };
      t.rows.push_back(row("stick held", r.held, pct(r.held.closed_form, 2)));
      t.rows.push_back(row("stick free", r.free, pct(r.free.closed_form, 2) + "<br><span class=\"muted\">aerodynamic only " +
                                                     pct(r.free.closed_form_aerodynamic, 2) + "</span>"));
      h += table_html(t);
      h += "<p class=\"note\">Closed form: the stick-fixed neutral point (held) and the apparent stick-free point with the "
           "constant hinge moments (free). Eigenvalue: the largest real root crossing zero, bisected between grid points. "
           "Time response: the growth rate of the slow motion read from time runs by the matrix-pencil method, crossing zero. "
           "The closed form leaves out the speed and downwash-lag couplings that the other two include. Static crossing: "
           "where a real root passes through zero (det A, neutral roots set aside, changes sign). Compared: " +
           std::string(kBoundaryComparisons) + ".</p>\n";
    }
  }
}

// Section: 6. gusts.
void page_gusts(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"s6\">6. Gusts</h2>\n";
  {
    if (d.default_gust) h += "<p class=\"note\">The scenario has no gust or event: the report uses a small gust of its own (below).</p>\n";
    bool any_turbulence = false;
    for (const auto& g : d.gusts) any_turbulence |= g.summary.contains("turbulence") && !g.summary["turbulence"].is_null();
    for (const auto& g : d.gusts) {
      const RunOutcome& o = *g.outcome;
      h += "<h3>" + esc(g.id) + ": " + esc(g.title) + "</h3>\n";
      double tmax = 0;
      if (o.held) tmax = std::max(tmax, o.held->trace.ch[ch_time].back());
      if (o.free) tmax = std::max(tmax, o.free->trace.ch[ch_time].back());
      std::string grid = "<div class=\"grid2\">";
      grid += time_plot(g, ch_alpha, "fig-" + g.id + "-alpha", 360, 230, tmax, true);
      grid += time_plot(g, ch_load_factor, "fig-" + g.id + "-n", 360, 230, tmax, true);
      grid += time_plot(g, ch_elevator, "fig-" + g.id + "-de", 360, 230, tmax, true);
      grid += time_plot(g, ch_stick_force, "fig-" + g.id + "-fs", 360, 230, tmax, true);
      grid += "</div>";
      ++pg.figure;
      h += "<figure>" + grid + "<figcaption><b>Figure " + std::to_string(pg.figure) +
           ".</b> Time histories, stick held (dark, solid) and hands off (light, dashed): angle of attack, load factor, "
           "elevator (trailing edge down positive) and stick force (pull positive): held, the force the pilot applies; "
           "hands off, the force it would take to hold the elevator where it floated.</figcaption></figure>\n";
      // a close view of the gust's passage
      const double t_gust = disturbances_over_time(g.scenario);
      const double tz = std::min(tmax, std::max(4.0, std::ceil(t_gust + 4.0)));
      if (t_gust > 0 && tz < 0.6 * tmax) {
        std::string z = "<div class=\"grid2\">";
        z += time_plot(g, ch_alpha, "fig-" + g.id + "-alpha-z", 360, 230, tz, false);
        z += time_plot(g, ch_load_factor, "fig-" + g.id + "-n-z", 360, 230, tz, false);
        z += "</div>";
        ++pg.figure;
        h += "<figure>" + z + "<figcaption><b>Figure " + std::to_string(pg.figure) + ".</b> The first " + number(tz, 0) +
             " s of the same runs: the gust's passage.</figcaption></figure>\n";
      }
      h += gust_tables(g);
    }
    if (!any_turbulence)
      h += "<h3>Turbulence</h3>\n<p>Turbulence statistics: not requested. No case above flies through continuous "
           "turbulence (the scenario has no <code>[turbulence]</code> table, or a chosen gust replaced it).</p>\n";
  }
}

// Section: 7. uncertainty.
// Section 7: the corners of the band (each derivative at its ends).
void page_uncertainty_corners(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  const UncertaintyResult& u = d.uncertainty;
  if (u.has_corners) {
    Table c;
    for (const auto& k : u.keys) {
      const bool pa = k.find(".ch_") != std::string::npos;
      c.head.push_back(esc(k) + (pa ? " [/deg]" : ""));
      c.numeric.push_back(true);
    }
    for (const char* x : {"neutral point free [% MAC]", "margin at the stated aft limit [% MAC]", "largest real root free [1/s]"}) {
      c.head.push_back(x);
      c.numeric.push_back(true);
    }
    for (const auto& p : u.corners.points) {
      std::vector<std::string> row;
      for (std::size_t k = 0; k < u.keys.size(); ++k)
        row.push_back(number(u.keys[k].find(".ch_") != std::string::npos ? p.inputs[k] * units::deg : p.inputs[k], 5));
      if (!p.ok) {
        row.push_back("\u2013");
        row.push_back("\u2013");
        row.push_back(esc(p.reason));
      } else {
        row.push_back(pct(p.np_free, 2));
        row.push_back(plus_pct(p.np_free - m.envelope_aft, 2));
        row.push_back(plus(p.max_real_free, 4));
      }
      c.rows.push_back(row);
    }
    h += "<p>The corners of the band, where the extremes of a monotonic effect lie:</p>\n" + table_html(c);
  }
}

// Section 7: the band of the free time response.
void page_uncertainty_time(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  const UncertaintyResult& u = d.uncertainty;
  if (!u.t.empty() && f.g1 && f.g1->outcome->free) {
    svg::Plot p;
    p.id = "fig-band-alpha";
    p.title = "Hands-off angle of attack of every sample";
    p.x = {"time", "s"};
    p.y = {"angle of attack", "deg"};
    bool first = true;
    for (const auto& al : u.alpha) {
      if (al.empty()) continue;
      std::vector<double> x(u.t.begin(), u.t.begin() + static_cast<long>(std::min(al.size(), u.t.size()))), y;
      for (double v : al) y.push_back(units::to_deg(v));
      y.resize(x.size());
      p.series.push_back(line(first ? "each sample, hands off" : "", x, y, svg::Style::faint));
      first = false;
    }
    if (f.g1->outcome->held)
      p.series.insert(p.series.begin(), line("nominal, stick held", channel(f.g1->outcome->held->trace, ch_time),
                                             channel(f.g1->outcome->held->trace, ch_alpha), svg::Style::first));
    p.series.insert(p.series.begin() + (f.g1->outcome->held ? 1 : 0),
                    line("nominal, hands off", channel(f.g1->outcome->free->trace, ch_time),
                         channel(f.g1->outcome->free->trace, ch_alpha), svg::Style::second));
    p.x.min = 0;
    h += pg.fig(svg::render(p), "Angle of attack of each sample flown hands-off through the same disturbance (thin grey "
                                "lines; a line ends where its sample departs), with the nominal runs held (dark) and "
                                "hands-off (light, dashed).");
  }
}

// Section 7: the stick-free neutral point against the sampled hinge derivatives.
void page_uncertainty_np(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  const UncertaintyResult& u = d.uncertainty;
  // neutral point against Ch_alpha/Ch_delta when both are sampled
  const auto ia = std::find(u.keys.begin(), u.keys.end(), "elevator.ch_alpha");
  const auto id = std::find(u.keys.begin(), u.keys.end(), "elevator.ch_delta");
  if (ia != u.keys.end() && id != u.keys.end()) {
    const std::size_t ka = static_cast<std::size_t>(ia - u.keys.begin()), kd = static_cast<std::size_t>(id - u.keys.begin());
    std::vector<double> rx, ry;
    for (const auto& r : u.responses) {
      if (!std::isfinite(r.np_free)) continue;
      rx.push_back(r.inputs[ka] / r.inputs[kd]);
      ry.push_back(r.np_free);
    }
    svg::Plot p;
    p.id = "fig-band-np";
    p.title = "Stick-free neutral point of each sample";
    p.height = 250;
    p.x = {"Ch\u03b1 / Ch\u03b4", "-"};
    p.y = {"stick-free neutral point", "% MAC"};
    p.y.pct = 100;
    p.series.push_back(points("samples", rx, ry, svg::Style::first, svg::Marker::dot));
    p.series.push_back(points("nominal", {a.elevator.ch_alpha / a.elevator.ch_delta}, {m.np_free.model}, svg::Style::second,
                              svg::Marker::diamond));
    p.refs.push_back({false, m.envelope_aft, "stated aft limit " + pct(m.envelope_aft), svg::Style::reference});
    p.refs.push_back({false, cg, "analysed CG " + pct(cg), svg::Style::third});
    h += pg.fig(svg::render(p), "The free-elevator factor depends on the ratio Ch\u03b1/Ch\u03b4: the larger the ratio, "
                                "the more of the tail the floating elevator gives away, and the further forward the "
                                "stick-free neutral point.");
  }
}

void page_uncertainty(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"s7\">7. Uncertainty of the hinge moments</h2>\n";
  {
    const UncertaintyResult& u = d.uncertainty;
    std::string specs;
    for (const auto& t : u.spec_text) specs += "<li><code>" + esc(t) + "</code></li>";
    h += "<p>Hinge-moment derivatives are among the least certain inputs of a design. " +
         std::string(u.default_band ? "The report's default band: Ch<sub>\u03b1</sub> and Ch<sub>\u03b4</sub> each \u00b1" +
                                          number(100 * d.options.hinge_band, 0) +
                                          " % of their nominal values, uniform and independent (change it with "
                                          "<code>--hinge-band</code>, or give other bands with <code>--sample</code>):"
                                    : "The bands given on the command line:") +
         "</p><ul>" + specs + "</ul>\n";
    h += "<p>" + std::to_string(u.sampled.points.size()) + " random samples (seed " + std::to_string(d.options.seed) +
         "), each retrimmed with its neutral points and roots, and each flown hands-off through the disturbance of " +
         esc(d.gusts.front().id) + " for " + number(u.response_seconds, 0) + " s.</p>\n";
    std::vector<double> np, root, dn, dep;
    for (const auto& r : u.responses) {
      np.push_back(r.np_free);
      root.push_back(r.max_real_free);
      dn.push_back(r.peak_dn);
      dep.push_back(r.departure_time);
    }
    const Band5 bnp = band_of(np), broot = band_of(root), bdn = band_of(dn), bdep = band_of(dep);
    Table t;
    t.head = {"stick free", "nominal", "min", "5 %", "median", "95 %", "max"};
    t.numeric = {false, true, true, true, true, true, true};
    auto row = [&](const std::string& k, double nominal, const Band5& b, double scale, int dec, double shift = 0) {
      auto v = [&](double x) { return number(scale * (x - shift), dec); };
      t.rows.push_back({k, v(nominal), v(b.min), v(b.p5), v(b.p50), v(b.p95), v(b.max)});
    };
    t.cls = "first40";
    row("neutral point [% MAC]", m.np_free.model, bnp, 100, 2);
    row("margin at the stated aft limit [% MAC]", m.np_free.model, bnp, 100, 2, m.envelope_aft);
    row("margin at the analysed CG [% MAC]", m.np_free.model, bnp, 100, 2, cg);
    row("largest real root [1/s]", f.free_worst ? f.free_worst->root.real() : nan_, broot, 1, 4);
    double nominal_dn = nan_, nominal_dep = nan_;
    if (f.g1 && f.g1->outcome->free) {
      nominal_dn = 0;
      const auto& tr = f.g1->outcome->free->trace;
      for (std::size_t i = 0; i < tr.size(); ++i) nominal_dn = std::max(nominal_dn, std::abs(tr.ch[ch_load_factor][i] - 1.0));
      if (f.g1->outcome->free->departure.departed) nominal_dep = f.g1->outcome->free->departure.time;
    }
    row("peak |n \u2212 1| in the run [-]", nominal_dn, bdn, 1, 3);
    row("departure time [s] (" + std::to_string(bdep.n) + " of " + std::to_string(u.responses.size()) + " samples depart)",
        nominal_dep, bdep, 1, 1);
    h += table_html(t);
    const SampleResponse* wr = worst_response(u);
    const SampleResponse* wn = lowest_np(u);
    if (wn || wr) {
      h += "<p><b>Worst cases among the samples.</b> ";
      if (wn)
        h += "Most forward stick-free neutral point: " + pct(wn->np_free, 2) + " % MAC (sample " + std::to_string(wn->index) +
             ", " + esc(inputs_text(u, wn->inputs)) + "). ";
      if (wr)
        h += "Fastest hands-off divergence: root " + plus(wr->max_real_free, 4) + " 1/s" +
             (wr->max_real_free > 0 ? ", doubling in " + number(std::log(2.0) / wr->max_real_free, 1) + " s" : std::string()) +
             " (sample " + std::to_string(wr->index) + ", " + esc(inputs_text(u, wr->inputs)) + ").";
      h += "</p>\n";
    }
    page_uncertainty_corners(pg, c);
    page_uncertainty_time(pg, c);
    page_uncertainty_np(pg, c);
  }
}

// Section: 8. findings.
void page_findings(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"s8\">8. Findings</h2>\n";
  h += "<p>Each finding states what the analysis gives and compares it with a published line or a stated option. These are "
       "engineering comparisons to support a qualified reviewer; they are not compliance findings, which belong to "
       "qualified, authorized people under the applicable airworthiness rules.</p>\n<ol class=\"findings\">\n";
  for (const auto& x : report_findings(d)) {
    h += "<li><span class=\"t\">" + esc(x.topic) + ".</span> " + esc(x.measured) + "<br><span class=\"k\">Compared with:</span> " +
         esc(x.criterion) + "<br><span class=\"k\">Source:</span> " + esc(x.source) + " <span class=\"muted\">(" +
         esc(x.source_note) + ")</span><br><span class=\"k\">Comparison:</span> " + esc(x.comparison) + "</li>\n";
  }
  h += "</ol>\n";
}

// Section: 9. cautions and method.
void page_method(Page& pg, PageCtx& c) {
  FP_PAGE_NAMES(c);
  h += "<h2 id=\"s9\">9. Criteria, method and cautions</h2>\n";
  {
    h += "<p>The criteria the findings and the first page compare with, in one table: the sections of the chosen "
         "certification basis with the document and amendment of the copy quoted, the military flying-qualities "
         "specification as labelled guidance, and the report's own options and input data, which are not criteria. A "
         "rule's text is quoted verbatim where a public copy could be retrieved; otherwise the row says that the text was "
         "not available and the report does not paraphrase it.</p>\n";
    h += criteria_table_html(d);
    h += "<p class=\"note\">Method in brief: two rigid bodies (airframe and elevator with its circuit) integrated together by "
         "an error-controlled Dormand\u2013Prince 5(4) method; the tail samples the gust at its own position; closed-form "
         "neutral and maneuver points from the tail-volume formulas with the free-elevator factor (Etkin and Reid, "
         "<i>Dynamics of Flight</i>, section 2.6); linear modes from a central-difference Jacobian of the full model at trim. "
         "The contributor guide (DEVELOPERS.md) gives the equations and conventions.</p>\n";
    h += "<h3>Data files</h3>\n<p class=\"note\">Every plot and table above was drawn from the files in <code>data/</code> "
         "beside this page:</p>\n<ul class=\"note\">";
    for (const auto& df : files) h += "<li><code>" + esc(df.name) + "</code>: " + esc(df.what) + "</li>";
    h += "</ul>\n";
  }
}

#undef FP_PAGE_NAMES

std::string page(const ReportData& d, const std::vector<DataFile>& files) {
  PageCtx c{d, files, facts_of(d)};
  const Scenario& s = d.scenario;
  c.rho = isa_at(geopotential_altitude(s.condition.altitude)).density;
  c.Veas = s.condition.airspeed * std::sqrt(c.rho / isa_at(0.0).density);
  Page pg;
  std::string& h = pg.html;
  h += "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n";
  h += "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n";
  h += "<meta name=\"generator\" content=\"floatpitch " + esc(d.version) + "\">\n";
  h += "<title>" + esc(s.name) + " \u2014 pitch stability, stick held and free</title>\n";
  h += "<style>" + std::string(kStyle) + "</style>\n</head>\n<body>\n";
  page_summary(pg, c);
  page_what(pg, c);
  page_trim(pg, c);
  page_static(pg, c);
  page_dynamic(pg, c);
  page_cg_sweep(pg, c);
  page_gusts(pg, c);
  page_uncertainty(pg, c);
  page_findings(pg, c);
  page_method(pg, c);
  h += "<div class=\"caution\"><strong>Caution.</strong> " + std::string(kCaution) + "</div>\n";
  h += "</body>\n</html>\n";
  return h;
}

}  // namespace

}  // namespace fp
