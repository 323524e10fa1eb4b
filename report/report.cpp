// report.cpp — assembling the reviewer's report from the existing analyses (see report.hpp).
// The page itself is laid out in report_html.cpp.
#include "report/report.hpp"
#include "scenario/gust_timing.hpp"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <thread>

#include <fcntl.h>
#include <signal.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <nlohmann/json.hpp>
#include <toml++/toml.h>

#include "model/units.hpp"
#include "analysis/gust_studies.hpp"
#include "scenario/keys.hpp"
#include "output/analysis_text.hpp"
#include "output/gust_text.hpp"
#include "output/outputs.hpp"
#include "output/response_text.hpp"
#include "output/sweep_text.hpp"
#include "util/parallel.hpp"
#include "util/sha256.hpp"
#include "util/format.hpp"
#include "util/ticks.hpp"
#include "report/svg.hpp"
#include "version.hpp"

namespace fp {

namespace fs = std::filesystem;
using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();



ScenarioError option_error(const std::string& option, const std::string& message) {
  return ScenarioError{"", 0, 0, "", option + ": " + message};
}

// "<number> <unit>" in SI for dimension d; the unit may be omitted (SI).
double quantity(const std::string& text, units::Dim d, const std::string& option, const std::string& what) {
  const std::string t = trim_ws(text);
  std::size_t used = 0;
  double v = 0;
  try {
    v = std::stod(t, &used);
  } catch (const std::logic_error&) {
    throw option_error(option, what + " \"" + t + "\" is not a number with a unit, e.g. \"25 m\"");
  }
  const std::string unit = trim_ws(t.substr(used));
  const auto f = units::factor(d, unit);
  if (!f)
    throw option_error(option, what + " \"" + t + "\": unknown unit \"" + unit + "\" for a " + units::dim_name(d) +
                                   "; use one of " + units::accepted_units(d));
  return v * *f;
}

std::string shell_quote(const std::string& a) {
  if (!a.empty() && a.find_first_not_of("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789_-./:=,+%@") ==
                        std::string::npos)
    return a;
  std::string q = "'";
  for (char c : a) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return q + "'";
}

std::string fmt_g(double v) {
  char b[40];
  std::snprintf(b, sizeof b, "%.6g", v);
  return b;
}

std::string today_utc() {
  std::time_t t = std::time(nullptr);
  if (const char* e = std::getenv("SOURCE_DATE_EPOCH")) {
    char* end = nullptr;
    const long long v = std::strtoll(e, &end, 10);
    if (end && *end == '\0' && v >= 0) t = static_cast<std::time_t>(v);
  }
  std::tm tm{};
  gmtime_r(&t, &tm);
  char b[32];
  std::strftime(b, sizeof b, "%Y-%m-%d", &tm);
  return b;
}

std::string read_all(const std::string& path) {
  std::ifstream f(path, std::ios::binary);
  if (!f) throw std::runtime_error("cannot read " + path);
  std::ostringstream ss;
  ss << f.rdbuf();
  return ss.str();
}

// The case file and the files it includes, in include order (the loader has already checked
// the chain: no cycles, at most 16 deep).
std::vector<InputFile> input_files(const std::string& path) {
  std::vector<InputFile> out;
  std::string p = path;
  for (int depth = 0; depth < 17 && !p.empty(); ++depth) {
    InputFile f;
    f.path = p;
    const std::string text = read_all(p);
    f.sha256 = sha256_hex(text);
    f.bytes = text.size();
    out.push_back(f);
    std::string next;
    try {
      const toml::table root = toml::parse(std::string_view(text), std::string_view(p));
      if (const auto* inc = root.get_as<std::string>("include")) {
        fs::path q(inc->get());
        if (q.is_relative()) q = fs::path(p).parent_path() / q;
        next = q.lexically_normal().string();
      }
    } catch (const toml::parse_error&) {
    }
    p = next;
  }
  return out;
}

std::string shape_words(const DiscreteGust& g) {
  const char* shape = g.shape == GustShape::one_minus_cosine ? "1-cosine"
                      : g.shape == GustShape::sharp_edge     ? "sharp-edged"
                      : g.shape == GustShape::ramp           ? "ramp"
                                                             : "train of 1-cosine";
  const char* comp = g.component == GustComponent::vertical ? "vertical" : "horizontal";
  std::string s = std::string(shape) + " " + comp + (g.shape == GustShape::train ? " gusts" : " gust");
  if (g.shape == GustShape::train)
    s = std::string("train of ") + std::to_string(g.count) + " 1-cosine " + comp + " gusts " +
        svg::number(g.spacing, 1) + " m apart";
  s += ", " + svg::number(g.amplitude, 2) + " m/s (" + svg::number(g.amplitude / units::ft, 1) + " ft/s)";
  if (g.shape != GustShape::sharp_edge)
    s += ", gradient distance " + svg::number(g.length, 1) + " m (" + svg::number(g.length / units::ft, 0) + " ft)";
  return s;
}

std::string describe_gusts(const Scenario& s) {
  std::string d;
  const double V = gust_closing_speed(s);
  for (std::size_t i = 0; i < s.gusts.size(); ++i) {
    if (!d.empty()) d += "; ";
    d += shape_words(s.gusts[i]) + ", reaching the CG at " + svg::number(s.gusts[i].start / V, 2) + " s";
  }
  if (!s.events.empty()) d += (d.empty() ? "" : "; ") + std::to_string(s.events.size()) + " timeline event(s)";
  const ResolvedTurbulence rt = resolve_turbulence(s);
  if (rt.active) {
    d += (d.empty() ? "" : "; ") + std::string(rt.spec.model == TurbulenceModel::dryden ? "Dryden" : "von K\u00e1rm\u00e1n") +
         " turbulence, \u03c3_w " + svg::number(rt.spec.sigma_w, 2) + " m/s, \u03c3_u " + svg::number(rt.spec.sigma_u, 2) +
         " m/s, seed " + std::to_string(rt.spec.seed);
    if (s.turbulence.seeds > 1)
      d += " (the first of the scenario's " + std::to_string(s.turbulence.seeds) + " seeds; `floatpitch run` runs them all)";
  }
  return d.empty() ? std::string("no disturbance") : d;
}

// A vertical 1-cosine gust reaching the CG at `t0`.
DiscreteGust timed_gust(const Scenario& s, GustShape shape, GustComponent comp, double H, double U, double t0) {
  DiscreteGust g;
  g.shape = shape;
  g.component = comp;
  g.length = H;
  g.amplitude = U;
  g.start = gust_closing_speed(s) * t0;
  return g;
}

void check_gust(const DiscreteGust& g, const std::string& text) {
  const auto gk = keys::gust_keys();
  if (auto why = keys::range_problem(*keys::find_in(gk, "length"), g.length))
    throw option_error("--gusts " + text, "gradient distance: " + *why);
  if (auto why = keys::range_problem(*keys::find_in(gk, "amplitude"), g.amplitude))
    throw option_error("--gusts " + text, "amplitude: " + *why);
}

}  // namespace

GustCase parse_gust_choice(const Scenario& base, const std::string& text0, int index) {
  GustCase c;
  c.id = "g" + std::to_string(index + 1);
  c.spec = text0;
  const std::string text = trim_ws(text0);
  Scenario s = base;
  if (text == "scenario") {
    if (base.gusts.empty() && base.events.empty() && base.turbulence.model == TurbulenceKind::none)
      throw option_error("--gusts scenario", "the scenario has no [[gust]], no [[event]] and no [turbulence]: give a "
                                             "gust, e.g. --gusts \"1-cos:25 m:3 m/s\"");
    c.title = "The scenario's own disturbance: " + describe_gusts(base);
    c.scenario = s;
    return c;
  }
  // the chosen gust alone: the scenario's gusts, rule settings and turbulence are left out
  s.gusts.clear();
  s.gust_start_times.clear();
  s.gust_designs.clear();
  s.turbulence.model = TurbulenceKind::none;
  {
    std::string body = text;
    double t0 = 1.0;
    if (const auto at = body.find('@'); at != std::string::npos) {
      t0 = quantity(body.substr(at + 1), units::Dim::time, "--gusts " + text, "start time");
      body = body.substr(0, at);
      if (!(t0 >= 0.0)) throw option_error("--gusts " + text, "the start time must not be negative");
    }
    std::vector<std::string> parts;
    std::stringstream ss(body);
    for (std::string p; std::getline(ss, p, ':');) parts.push_back(trim_ws(p));
    if (parts.size() < 3 || parts.size() > 4)
      throw option_error("--gusts " + text,
                         "expected scenario or SHAPE:LENGTH:AMPLITUDE[:vertical|horizontal][@TIME], "
                         "e.g. \"1-cos:25 m:3 m/s\" or \"sharp:0:2 m/s:vertical@2\"");
    GustShape shape;
    if (parts[0] == "1-cos" || parts[0] == "one_minus_cosine") shape = GustShape::one_minus_cosine;
    else if (parts[0] == "sharp" || parts[0] == "sharp_edge") shape = GustShape::sharp_edge;
    else if (parts[0] == "ramp") shape = GustShape::ramp;
    else
      throw option_error("--gusts " + text, "unknown shape \"" + parts[0] + "\"; use 1-cos, sharp or ramp");
    GustComponent comp = GustComponent::vertical;
    if (parts.size() == 4) {
      if (parts[3] == "vertical") comp = GustComponent::vertical;
      else if (parts[3] == "horizontal") comp = GustComponent::horizontal;
      else throw option_error("--gusts " + text, "unknown component \"" + parts[3] + "\"; use vertical or horizontal");
    }
    double H = shape == GustShape::sharp_edge && (parts[1] == "0" || parts[1] == "-")
                   ? 1.0
                   : quantity(parts[1], units::Dim::length, "--gusts " + text, "gradient distance");
    const double U = quantity(parts[2], units::Dim::speed, "--gusts " + text, "amplitude");
    s.gusts.push_back(timed_gust(s, shape, comp, H, U, t0));
    s.gust_start_times.push_back(std::nullopt);
    check_gust(s.gusts.back(), text);
    c.title = shape_words(s.gusts.back()) + ", reaching the CG at " + svg::number(t0, 2) + " s";
  }
  try {
    validate(s);
  } catch (ScenarioError& e) {
    e.message = "--gusts " + text + ": " + e.message;
    throw;
  }
  c.scenario = s;
  return c;
}

namespace {

// Section 5: the CG sweep with the boundary, over the scenario's range or --cg-range.
void report_cg_sweep(ReportData& d, const Scenario& s, const ReportOptions& o) {
  {
    double from, to;
    if (o.cg_range.empty()) {
      from = std::min({s.envelope.cg_forward, s.airplane.mass.h_cg}) - 0.02;
      to = std::max({s.envelope.cg_aft, s.airplane.mass.h_cg, d.margins.np_fixed.model, d.margins.np_fixed.closed_form}) +
           0.04;
    } else {
      const auto colon = o.cg_range.find(':');
      if (colon == std::string::npos)
        throw option_error("--cg-range " + o.cg_range, "expected FROM:TO in fractions of the MAC, e.g. 0.15:0.45");
      try {
        std::size_t u1 = 0, u2 = 0;
        const std::string a = trim_ws(o.cg_range.substr(0, colon)), b = trim_ws(o.cg_range.substr(colon + 1));
        from = std::stod(a, &u1);
        to = std::stod(b, &u2);
        if (u1 != a.size() || u2 != b.size()) throw std::invalid_argument("");
      } catch (const std::logic_error&) {
        throw option_error("--cg-range " + o.cg_range, "expected two numbers FROM:TO in fractions of the MAC, e.g. 0.15:0.45");
      }
      if (!(to > from)) throw option_error("--cg-range " + o.cg_range, "TO must be aft of (greater than) FROM");
      const auto& k = *keys::find("mass.cg", false);
      if (auto why = keys::range_problem(k, from)) throw option_error("--cg-range " + o.cg_range, "FROM: " + *why);
      if (auto why = keys::range_problem(k, to)) throw option_error("--cg-range " + o.cg_range, "TO: " + *why);
    }
    const double step = tick_step(to - from, 30, TickFit::nearest);
    from = std::floor(from / step + 1e-9) * step;
    to = std::ceil(to / step - 1e-9) * step;
    d.cg_range_text = fmt_g(from) + " to " + fmt_g(to) + " in steps of " + fmt_g(step);
    SweepSpec sp;
    sp.scenario = o.scenario;
    sp.set = o.set;
    sp.vary.push_back(VarySpec{"mass.cg", from, to, step});
    d.cg_sweep = run_sweep(sp, o.jobs, false);
  }

}

// Section 6: the gust cases (the scenario's own disturbance, the --gusts choices, or a default
// gust) run held and free.
void report_gusts(ReportData& d, const Scenario& s, const ReportOptions& o) {
  if (o.gusts.empty()) {
    if (!s.gusts.empty() || !s.events.empty() || s.turbulence.model != TurbulenceKind::none) {
      d.gusts.push_back(parse_gust_choice(s, "scenario", 0));
      d.gusts.back().spec = "";
    } else {
      GustCase c;
      c.id = "g1";
      Scenario sg = s;
      sg.gusts.push_back(timed_gust(s, GustShape::one_minus_cosine, GustComponent::vertical, 10.0 * s.airplane.wing.mac,
                                    1.0, 1.0));
      sg.gust_start_times.push_back(std::nullopt);
      validate(sg);
      c.scenario = sg;
      c.title = "The report's default disturbance (the scenario has none): " + shape_words(sg.gusts.back()) +
                ", reaching the CG at 1 s";
      d.gusts.push_back(std::move(c));
      d.default_gust = true;
    }
  } else {
    for (std::size_t i = 0; i < o.gusts.size(); ++i) d.gusts.push_back(parse_gust_choice(s, o.gusts[i], static_cast<int>(i)));
  }
  for (auto& g : d.gusts) {
    g.outcome = std::make_unique<RunOutcome>(run_scenario(g.scenario, ControlsChoice::both));
    g.summary = summary_json(g.scenario, *g.outcome);
    g.summary.update(gust_summary_json(g.scenario, *g.outcome, nullptr));
    g.summary["gust_case"] = {{"id", g.id}, {"title", g.title}, {"choice", g.spec}};
  }

}

// Section 7: the hinge-moment uncertainty band, its samples and their hands-off runs.
void report_uncertainty(ReportData& d, const Scenario& s, const ReportOptions& o) {
  {
    UncertaintyResult& u = d.uncertainty;
    std::vector<SampleSpec> specs;
    if (o.sample.empty()) {
      u.default_band = true;
      for (const char* k : {"elevator.ch_alpha", "elevator.ch_delta"}) {
        const double v = get_value(s, k);
        const double a = v * (1.0 - o.hinge_band), b = v * (1.0 + o.hinge_band);
        specs.push_back(SampleSpec{k, Distribution::uniform, std::min(a, b), std::max(a, b)});
      }
    } else {
      u.default_band = false;
      for (const auto& t : o.sample) specs.push_back(parse_sample(s, t));
    }
    for (const auto& sp : specs) {
      u.keys.push_back(sp.key);
      const auto* k = keys::find(sp.key, true);
      const bool per_angle = k && k->dim == units::Dim::per_angle;  // shown per degree, as the demo files write them
      const double f = per_angle ? 1.0 / units::deg : k ? keys::display_factor(*k) : 1.0;
      const std::string unit = per_angle ? "/deg" : k ? keys::display_unit(*k) : "";
      const double v = get_value(s, sp.key);
      std::string t = sp.key + ": ";
      if (sp.dist == Distribution::uniform)
        t += "uniform from " + fmt_g(sp.a / f) + " to " + fmt_g(sp.b / f);
      else
        t += "normal, mean " + fmt_g(sp.a / f) + ", standard deviation " + fmt_g(sp.b / f);
      t += (unit.empty() || unit == std::string("-") ? "" : " " + unit) + " (nominal " + fmt_g(v / f) + ")";
      u.spec_text.push_back(t);
    }
    SweepSpec sp;
    sp.scenario = o.scenario;
    sp.set = o.set;
    sp.sample = specs;
    sp.samples = o.samples;
    sp.seed = o.seed;
    u.sampled = run_sweep(sp, o.jobs, false);
    const bool box = !specs.empty() && specs.size() <= 2 &&
                     std::all_of(specs.begin(), specs.end(),
                                 [](const SampleSpec& x) { return x.dist == Distribution::uniform && x.b > x.a; });
    if (box) {
      SweepSpec cs;
      cs.scenario = o.scenario;
      cs.set = o.set;
      for (const auto& x : specs) cs.vary.push_back(VarySpec{x.key, x.a, x.b, x.b - x.a});
      u.corners = run_sweep(cs, o.jobs, false);
      u.has_corners = true;
    }
    // free responses to the first gust case, one per sample
    const GustCase& gc = d.gusts.front();
    u.response_case = gc.title;
    // long runs (minutes of turbulence) are cut to two minutes, or a minute after the last
    // gust or event begins, whichever is longer: the band is about the response, not the record
    {
      const double V = gust_closing_speed(gc.scenario);
      double last = 0.0;
      for (const auto& g : gc.scenario.gusts) last = std::max(last, g.start / V);
      for (const auto& e : gc.scenario.events) last = std::max(last, e.time);
      u.response_seconds = std::min(gc.scenario.run.duration, std::max(120.0, last + 60.0));
    }
    std::vector<std::unique_ptr<CaseResult>> runs(u.sampled.points.size());
    std::vector<SampleResponse> resp(u.sampled.points.size());
    parallel_for(static_cast<long>(u.sampled.points.size()), std::max(1, o.jobs), [&](long i) {
      const PointResult& p = u.sampled.points[static_cast<std::size_t>(i)];
      SampleResponse& r = resp[static_cast<std::size_t>(i)];
      r.index = p.index;
      r.inputs = p.inputs;
      r.np_free = p.np_free;
      r.max_real_free = p.max_real_free;
      r.departure_time = r.peak_dn = r.peak_dalpha = nan_;
      if (!p.ok) {
        r.failure = p.reason;  // the sweep point's own failure (trim, scenario)
        r.np_free = r.max_real_free = nan_;  // not computed: no zeros in the bands
        return;
      }
      try {
        Scenario sc = gc.scenario;
        sc.run.duration = u.response_seconds;
        for (std::size_t k = 0; k < u.keys.size(); ++k) set_value(sc, u.keys[k], p.inputs[k], "--sample");
        validate(sc);
        RunOutcome ro = run_scenario(sc, ControlsChoice::free);
        const Trace& tr = ro.free->trace;
        r.departed = ro.free->departure.departed;
        r.departure_time = r.departed ? ro.free->departure.time : nan_;
        r.peak_dn = r.peak_dalpha = 0.0;
        for (std::size_t k = 0; k < tr.size(); ++k) {
          r.peak_dn = std::max(r.peak_dn, std::abs(tr.ch[ch_load_factor][k] - 1.0));
          r.peak_dalpha = std::max(r.peak_dalpha, std::abs(tr.ch[ch_alpha][k] - ro.trim.alpha));
        }
        runs[static_cast<std::size_t>(i)] = std::move(ro.free);
      } catch (const ScenarioError& e) {
        r.failure = e.what();
      } catch (const TrimError& e) {
        r.failure = "trim: " + e.message;
      } catch (const NumericalFailure& e) {
        r.failure = "numerical failure at t = " + svg::number(e.time, 3) + " s: " + e.message;
      } catch (const std::exception& e) {
        r.failure = std::string("error: ") + e.what();
      } catch (...) {
        r.failure = "error of an unknown kind";
      }
    });
    u.responses = resp;
    // the angles of attack on a grid of about 0.05 s (enough for a plot; the CSVs of section 6
    // keep the full grid of the nominal runs)
    const double dt = gc.scenario.run.output_step;
    const std::size_t stride = std::max<std::size_t>(1, static_cast<std::size_t>(std::lround(0.05 / dt)));
    std::size_t n = 0;
    for (const auto& r : runs)
      if (r) n = std::max(n, (r->trace.size() + stride - 1) / stride);
    u.t.resize(n);
    for (std::size_t k = 0; k < n; ++k) u.t[k] = static_cast<double>(k * stride) * dt;
    u.alpha.resize(runs.size());
    for (std::size_t i = 0; i < runs.size(); ++i) {
      if (!runs[i]) continue;
      const Trace& tr = runs[i]->trace;
      for (std::size_t k = 0; k < tr.size(); k += stride) u.alpha[i].push_back(tr.ch[ch_alpha][k]);
    }
  }
}

}  // namespace

ReportData make_report(const ReportOptions& o) {
  ReportData d;
  d.options = o;
  d.version = FLOATPITCH_VERSION;
  d.date = today_utc();
  const Scenario s = load_scenario(o.scenario, o.set);
  d.scenario = s;
  if (!s.airplane.circuit.reversible)
    throw ScenarioError{s.path, 0, 0, "circuit.reversible",
                        "the report compares the stick held and free, and this circuit is irreversible (powered): "
                        "the elevator cannot float: held case only. Use `floatpitch modes` and "
                        "`floatpitch run --controls held` for the held airplane"};
  if (!(o.hinge_band >= 0.0 && o.hinge_band < 1.0)) throw option_error("--hinge-band", "expects 0 <= band < 100 (%)");
  if (o.samples < 2 || o.samples > 5000) throw option_error("--samples", "expects 2..5000 samples");
  if (!find_basis(o.basis)) {
    std::string allowed;
    for (const auto& b : bases()) allowed += (allowed.empty() ? "" : ", ") + std::string(b.key);
    throw option_error("--basis " + o.basis, "unknown certification basis; use one of " + allowed);
  }

  // the one command that regenerates the report
  {
    std::string c = "floatpitch report " + shell_quote(o.scenario) + " --out " + shell_quote(o.out);
    for (const auto& x : o.set) c += " --set " + shell_quote(x);
    if (!o.cg_range.empty()) c += " --cg-range " + shell_quote(o.cg_range);
    for (const auto& g : o.gusts) c += " --gusts " + shell_quote(g);
    if (o.hinge_band != 0.25) c += " --hinge-band " + fmt_g(100.0 * o.hinge_band);
    for (const auto& x : o.sample) c += " --sample " + shell_quote(x);
    if (o.samples != 40) c += " --samples " + std::to_string(o.samples);
    if (o.seed != 1) c += " --seed " + std::to_string(o.seed);
    if (o.min_margin != kDefaultCriteria.min_static_margin) c += " --min-margin " + fmt_g(o.min_margin);
    if (o.min_force_per_g != kDefaultCriteria.min_force_per_g) c += " --min-force-per-g " + fmt_g(o.min_force_per_g);
    if (o.basis != kDefaultBasis) c += " --basis " + shell_quote(o.basis);
    if (o.pdf) c += " --pdf";
    d.command = c;
  }
  d.files = input_files(s.path);
  d.scenario_toml = to_toml(s);

  // 2. trim
  const auto plant = scenario_plant(s);
  d.trim_held = trim_held(*plant, s.condition, s.trim.tab_auto ? 0.0 : s.trim.tab);
  d.trim_free = trim_free(*plant, s.condition);
  d.trim_start = scenario_trim(*plant, s);
  {
    const auto st = wing_stall(s.airplane.wing.lift);
    d.cl_max = st.CLmax;
    d.stall_alpha = st.alpha;
    d.stall_speed = stall_speed(s.airplane, s.condition.altitude);
  }

  // 3. static
  MarginsOptions mo;
  mo.criteria = {o.min_margin, o.min_force_per_g};
  d.margins = compute_margins(s, mo);
  d.force_per_g = force_per_g_curve(*plant, s.condition, d.margins.trim_tab, 3.5, 0.25);

  // 4. dynamic
  d.modes = compute_modes(s);

  // 0. the stated envelope's corners (the first page)
  d.corners = run_matrix(s, envelope_corners(s), o.jobs, false);
  d.analysed_in_envelope = within_envelope(s, s.airplane.mass.h_cg, s.airplane.mass.mass);

  report_cg_sweep(d, s, o);
  report_gusts(d, s, o);
  report_uncertainty(d, s, o);

  return d;
}

std::string find_chromium() {
  if (const char* e = std::getenv("FLOATPITCH_CHROMIUM"); e && *e) return ::access(e, X_OK) == 0 ? e : "";
  const char* path = std::getenv("PATH");
  std::stringstream ss(path ? path : "/usr/bin:/bin");
  std::vector<std::string> dirs;
  for (std::string p; std::getline(ss, p, ':');) dirs.push_back(p.empty() ? "." : p);
  for (const char* name : {"chromium", "chromium-browser"})
    for (const auto& dir : dirs) {
      const std::string c = dir + "/" + name;
      if (::access(c.c_str(), X_OK) == 0) return c;
    }
  return "";
}

extern "C" char** environ;

std::string print_pdf(const std::string& chromium, const std::string& html, const std::string& pdf) {
  std::error_code ec;
  const fs::path in = fs::absolute(html, ec);
  const fs::path out = fs::absolute(pdf, ec);
  const fs::path tmp = out.parent_path() / ("." + out.filename().string() + ".tmp" + std::to_string(::getpid()));
  char profile_tpl[] = "/tmp/floatpitch-chromium-XXXXXX";
  const char* profile = ::mkdtemp(profile_tpl);
  if (!profile) return "cannot create a temporary profile directory for Chromium";
  std::vector<std::string> args = {chromium,
                                   "--headless",
                                   "--disable-gpu",
                                   "--disable-quic",
                                   "--no-first-run",
                                   "--disable-background-networking",
                                   "--disable-component-update",
                                   "--disable-sync",
                                   "--host-resolver-rules=MAP * ~NOTFOUND",
                                   std::string("--user-data-dir=") + profile,
                                   "--no-pdf-header-footer",
                                   "--print-to-pdf=" + tmp.string(),
                                   "file://" + in.string()};
  if (::geteuid() == 0) args.insert(args.begin() + 1, "--no-sandbox");  // Chromium refuses to run as root otherwise
  std::vector<char*> argv;
  for (auto& a : args) argv.push_back(a.data());
  argv.push_back(nullptr);
  posix_spawn_file_actions_t fa;
  posix_spawn_file_actions_init(&fa);
  posix_spawn_file_actions_addopen(&fa, 1, "/dev/null", O_WRONLY, 0);
  posix_spawn_file_actions_addopen(&fa, 2, "/dev/null", O_WRONLY, 0);
  pid_t pid = 0;
  const int rc = posix_spawn(&pid, chromium.c_str(), &fa, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&fa);
  std::string err;
  if (rc != 0) {
    err = "cannot start " + chromium;
  } else {
    int status = 0;
    bool done = false;
    for (int i = 0; i < 1200 && !done; ++i) {  // at most two minutes
      const pid_t w = ::waitpid(pid, &status, WNOHANG);
      if (w == pid) done = true;
      else ::usleep(100000);
    }
    if (!done) {
      ::kill(pid, SIGKILL);
      ::waitpid(pid, &status, 0);
      err = "Chromium did not finish printing within two minutes";
    } else if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) {
      err = "Chromium failed to print (exit status " + std::to_string(WIFEXITED(status) ? WEXITSTATUS(status) : -1) + ")";
    } else if (!fs::exists(tmp) || fs::file_size(tmp, ec) < 1000) {
      err = "Chromium wrote no PDF";
    }
  }
  if (err.empty()) {
    fs::rename(tmp, out, ec);
    if (ec) err = "cannot move the PDF into place: " + ec.message();
  }
  fs::remove(tmp, ec);
  fs::remove_all(profile, ec);
  return err;
}

}  // namespace fp
