// sweep_text.cpp — sweeps as JSON (and back, for merging shards), CSV and a terminal table.
#include "output/sweep_text.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/units.hpp"
#include "output/outputs.hpp"
#include "util/caution.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();
json num(double v) { return std::isfinite(v) ? json(v) : json(nullptr); }
double val(const json& j) { return j.is_number() ? j.get<double>() : nan_; }

}  // namespace

BoundarySpreads boundary_spreads(const Boundary& b) {
  BoundarySpreads s{nan_, nan_, nan_};
  s.closed_vs_static = b.closed_form_applies ? std::abs(b.closed_form - b.static_crossing) : nan_;
  s.first_vs_time = std::abs(b.eigenvalue - b.time_domain);
  if (std::isfinite(b.eigenvalue) && !b.crossing_oscillatory && b.closed_form_applies)
    s.three_way = std::max({b.closed_form, b.static_crossing, b.time_domain}) -
                  std::min({b.closed_form, b.static_crossing, b.time_domain});
  return s;
}

namespace {

json band_json(const Band& b) {
  return json{{"n", b.n}, {"min", num(b.min)}, {"p5", num(b.p5)}, {"p50", num(b.p50)}, {"p95", num(b.p95)}, {"max", num(b.max)}};
}

const char* kColumns[] = {"index", "ok", "reason", "cg", "trim_alpha_deg", "trim_elevator_deg", "trim_tab_deg",
                          "np_fixed_closed_form", "np_free_closed_form", "np_apparent_closed_form", "np_fixed_model",
                          "np_free_model", "static_margin_fixed", "static_margin_free", "stick_force_gradient_N_per_mps",
                          "max_real_held_per_s", "max_real_free_per_s", "static_indicator_held", "static_indicator_free", "deciding_mode_held", "deciding_mode_free",
                          "roots_set_aside_held", "roots_set_aside_free", "sp_damping_held", "sp_damping_free",
                          "sp_frequency_held_rad_s", "sp_frequency_free_rad_s", "ran", "diverged_held", "diverged_free",
                          "divergence_time_held_s", "divergence_time_free_s", "peak_dn_held", "peak_dn_free",
                          "peak_dalpha_held_deg", "peak_dalpha_free_deg", "growth_held_per_s", "growth_free_per_s"};

json point_json(const PointResult& p, const std::vector<std::string>& keys) {
  json in = json::object();
  for (std::size_t i = 0; i < keys.size() && i < p.inputs.size(); ++i) in[keys[i]] = p.inputs[i];
  if (!p.ok) {  // a failed point has its inputs and reason, and nothing computed (blank, not 0)
    json f{{"index", p.index}, {"inputs", in}, {"ok", false}, {"reason", p.reason}, {"ran", false}};
    for (const char* c : kColumns)
      if (!f.contains(c)) f[c] = nullptr;
    return f;
  }
  auto text = [](const std::string& t) { return t.empty() ? json(nullptr) : json(t); };
  return json{{"index", p.index},
              {"inputs", in},
              {"ok", p.ok},
              {"reason", p.reason.empty() ? json(nullptr) : json(p.reason)},
              {"cg", num(p.cg)},
              {"trim_alpha_deg", num(p.trim_alpha_deg)},
              {"trim_elevator_deg", num(p.trim_elevator_deg)},
              {"trim_tab_deg", num(p.trim_tab_deg)},
              {"np_fixed_closed_form", num(p.np_fixed_cf)},
              {"np_free_closed_form", num(p.np_free_cf)},
              {"np_apparent_closed_form", num(p.np_apparent_cf)},
              {"np_fixed_model", num(p.np_fixed)},
              {"np_free_model", num(p.np_free)},
              {"static_margin_fixed", num(p.np_fixed - p.cg)},
              {"static_margin_free", num(p.np_free - p.cg)},
              {"stick_force_gradient_N_per_mps", num(p.force_gradient)},
              {"max_real_held_per_s", num(p.max_real_held)},
              {"max_real_free_per_s", num(p.max_real_free)},
              {"static_indicator_held", num(p.static_held)},
              {"static_indicator_free", num(p.static_free)},
              {"deciding_mode_held", text(p.mode_held)},
              {"deciding_mode_free", text(p.mode_free)},
              {"roots_set_aside_held", text(p.set_aside_held)},
              {"roots_set_aside_free", text(p.set_aside_free)},
              {"sp_damping_held", num(p.sp_damping_held)},
              {"sp_damping_free", num(p.sp_damping_free)},
              {"sp_frequency_held_rad_s", num(p.sp_frequency_held)},
              {"sp_frequency_free_rad_s", num(p.sp_frequency_free)},
              {"ran", p.ran},
              {"diverged_held", p.ran ? json(p.diverged_held) : json(nullptr)},
              {"diverged_free", p.ran ? json(p.diverged_free) : json(nullptr)},
              {"divergence_time_held_s", num(p.divergence_time_held)},
              {"divergence_time_free_s", num(p.divergence_time_free)},
              {"peak_dn_held", p.ran ? num(p.peak_dn_held) : json(nullptr)},
              {"peak_dn_free", p.ran ? num(p.peak_dn_free) : json(nullptr)},
              {"peak_dalpha_held_deg", p.ran ? num(p.peak_dalpha_held_deg) : json(nullptr)},
              {"peak_dalpha_free_deg", p.ran ? num(p.peak_dalpha_free_deg) : json(nullptr)},
              {"growth_held_per_s", p.ran ? num(p.growth_held) : json(nullptr)},
              {"growth_free_per_s", p.ran ? num(p.growth_free) : json(nullptr)}};
}

PointResult point_from_json(const json& j, const std::vector<std::string>& keys) {
  PointResult p;
  p.index = j.at("index").get<long>();
  for (const auto& k : keys) p.inputs.push_back(val(j.at("inputs").at(k)));
  p.ok = j.at("ok").get<bool>();
  if (j.contains("reason") && j["reason"].is_string()) p.reason = j["reason"].get<std::string>();
  p.cg = val(j["cg"]);
  p.trim_alpha_deg = val(j["trim_alpha_deg"]);
  p.trim_elevator_deg = val(j["trim_elevator_deg"]);
  p.trim_tab_deg = val(j["trim_tab_deg"]);
  p.np_fixed_cf = val(j["np_fixed_closed_form"]);
  p.np_free_cf = val(j["np_free_closed_form"]);
  p.np_apparent_cf = val(j["np_apparent_closed_form"]);
  p.np_fixed = val(j["np_fixed_model"]);
  p.np_free = val(j["np_free_model"]);
  p.force_gradient = val(j["stick_force_gradient_N_per_mps"]);
  p.max_real_held = val(j["max_real_held_per_s"]);
  p.max_real_free = val(j["max_real_free_per_s"]);
  p.static_held = j.contains("static_indicator_held") ? val(j["static_indicator_held"]) : nan_;
  p.static_free = j.contains("static_indicator_free") ? val(j["static_indicator_free"]) : nan_;
  auto str = [&](const char* k) { return j.contains(k) && j[k].is_string() ? j[k].get<std::string>() : std::string(); };
  p.mode_held = str("deciding_mode_held");
  p.mode_free = str("deciding_mode_free");
  p.set_aside_held = str("roots_set_aside_held");
  p.set_aside_free = str("roots_set_aside_free");
  p.sp_damping_held = val(j["sp_damping_held"]);
  p.sp_damping_free = val(j["sp_damping_free"]);
  p.sp_frequency_held = val(j["sp_frequency_held_rad_s"]);
  p.sp_frequency_free = val(j["sp_frequency_free_rad_s"]);
  p.ran = j["ran"].get<bool>();
  if (p.ran) {
    p.diverged_held = j["diverged_held"].is_boolean() && j["diverged_held"].get<bool>();
    p.diverged_free = j["diverged_free"].is_boolean() && j["diverged_free"].get<bool>();
    p.divergence_time_held = val(j["divergence_time_held_s"]);
    p.divergence_time_free = val(j["divergence_time_free_s"]);
    p.peak_dn_held = val(j["peak_dn_held"]);
    p.peak_dn_free = val(j["peak_dn_free"]);
    p.peak_dalpha_held_deg = val(j["peak_dalpha_held_deg"]);
    p.peak_dalpha_free_deg = val(j["peak_dalpha_free_deg"]);
    p.growth_held = val(j["growth_held_per_s"]);
    p.growth_free = val(j["growth_free_per_s"]);
  }
  return p;
}

}  // namespace

json sweep_json(const SweepResult& r) {
  json spec{{"scenario", r.spec.scenario}, {"set", r.spec.set}, {"samples", r.spec.samples},
            {"seed", r.spec.seed}, {"run_seconds", r.spec.run_seconds},
            {"boundary_run_seconds", r.spec.boundary_run_seconds},
            {"shard", std::to_string(r.spec.shard_k) + "/" + std::to_string(r.spec.shard_n)}};
  json vary = json::array(), sample = json::array();
  for (const auto& v : r.spec.vary) vary.push_back({{"key", v.key}, {"from", v.from}, {"to", v.to}, {"step", v.step}});
  for (const auto& s : r.spec.sample)
    sample.push_back({{"key", s.key}, {"distribution", s.dist == Distribution::normal ? "normal" : "uniform"},
                      {"a", s.a}, {"b", s.b}});
  spec["vary"] = vary;
  spec["sample"] = sample;
  json pts = json::array();
  for (const auto& p : r.points) pts.push_back(point_json(p, r.input_keys));
  json j{{"tool", "floatpitch"}, {"spec", spec}, {"input_keys", r.input_keys}, {"total_points", r.total_points},
         {"points", pts}, {"caution", kCaution}};
  if (r.has_boundary) {
    auto b = [](const Boundary& x, bool free) {
      const BoundarySpreads sp = boundary_spreads(x);
      auto text = [](const std::string& t) { return t.empty() ? json(nullptr) : json(t); };
      json o{{"closed_form", num(x.closed_form)}, {"static_crossing", num(x.static_crossing)},
             {"static_crossing_mode", text(x.static_mode)}, {"eigenvalue", num(x.eigenvalue)},
             {"first_crossing_mode", text(x.crossing_mode)},
             {"first_crossing_oscillatory", std::isfinite(x.eigenvalue) ? json(x.crossing_oscillatory) : json(nullptr)},
             {"first_crossing_period_s", num(x.crossing_period)}, {"time_domain", num(x.time_domain)},
             {"closed_form_applies", x.closed_form_applies}, {"closed_form_note", text(x.closed_form_note)}, {"no_crossing", text(x.no_crossing)},
             {"crossing_mode", text(x.crossing_mode)}, {"roots_set_aside", text(x.set_aside)},
             {"time_domain_check", text(x.time_domain_check)}, {"error", text(x.error)},
             {"spread_static", num(sp.closed_vs_static)}, {"spread_dynamic", num(sp.first_vs_time)},
             {"spread", num(sp.three_way)}, {"comparisons", kBoundaryComparisons}};
      if (free) o["closed_form_aerodynamic"] = num(x.closed_form_aerodynamic);
      return o;
    };
    j["boundary"] = {{"held", b(r.held, false)}, {"free", b(r.free, true)}};
  } else {
    j["boundary"] = nullptr;
  }
  if (!r.spec.sample.empty()) {
    std::vector<double> np, spd, pk;
    const PointResult* worst = nullptr;
    for (const auto& p : r.points) {
      if (!p.ok) continue;
      np.push_back(p.np_free);
      spd.push_back(p.sp_damping_free);
      if (p.ran) pk.push_back(p.peak_dn_free);
      if (!worst || p.np_free - p.cg < worst->np_free - worst->cg) worst = &p;
    }
    json band{{"neutral_point_free", band_json(band_of(np))},
              {"short_period_damping_free", band_json(band_of(spd))},
              {"peak_load_factor_increment_free", pk.empty() ? json(nullptr) : band_json(band_of(pk))}};
    if (worst) {
      json in = json::object();
      for (std::size_t i = 0; i < r.input_keys.size(); ++i) in[r.input_keys[i]] = worst->inputs[i];
      band["worst"] = {{"index", worst->index}, {"inputs", in}, {"neutral_point_free", worst->np_free},
                       {"static_margin_free", worst->np_free - worst->cg},
                       {"criterion", "lowest stick-free static margin"}};
    }
    j["band"] = band;
  }
  return j;
}

SweepResult sweep_from_json(const json& j) {
  SweepResult r;
  try {
    const auto& sp = j.at("spec");
    r.spec.scenario = sp.at("scenario").get<std::string>();
    r.spec.set = sp.at("set").get<std::vector<std::string>>();
    r.spec.samples = sp.at("samples").get<int>();
    r.spec.seed = sp.at("seed").get<std::uint64_t>();
    r.spec.run_seconds = sp.at("run_seconds").get<double>();
    r.spec.boundary_run_seconds = sp.at("boundary_run_seconds").get<double>();
    for (const auto& v : sp.at("vary"))
      r.spec.vary.push_back({v.at("key").get<std::string>(), v.at("from").get<double>(), v.at("to").get<double>(),
                             v.at("step").get<double>()});
    for (const auto& s : sp.at("sample"))
      r.spec.sample.push_back({s.at("key").get<std::string>(),
                               s.at("distribution").get<std::string>() == "normal" ? Distribution::normal
                                                                                   : Distribution::uniform,
                               s.at("a").get<double>(), s.at("b").get<double>()});
    r.input_keys = j.at("input_keys").get<std::vector<std::string>>();
    r.total_points = j.at("total_points").get<long>();
    for (const auto& p : j.at("points")) r.points.push_back(point_from_json(p, r.input_keys));
  } catch (const json::exception& e) {
    throw std::runtime_error(std::string("not a sweep.json written by floatpitch: ") + e.what());
  }
  return r;
}

std::string sweep_csv(const SweepResult& r) {
  std::ostringstream o;
  o.precision(10);
  // the inputs first, under their keys; a standard column of the same name (cg) is not
  // repeated, so every header name is unique
  std::vector<const char*> cols;
  for (const char* c : kColumns)
    if (std::find(r.input_keys.begin(), r.input_keys.end(), c) == r.input_keys.end()) cols.push_back(c);
  for (const auto& k : r.input_keys) o << k << ",";
  for (std::size_t i = 0; i < cols.size(); ++i) o << cols[i] << (i + 1 < cols.size() ? "," : "\n");
  for (const auto& p : r.points) {
    const json j = point_json(p, r.input_keys);
    for (const auto& k : r.input_keys) o << j["inputs"][k].get<double>() << ",";
    for (std::size_t i = 0; i < cols.size(); ++i) {
      const auto& v = j[cols[i]];
      if (v.is_null()) o << "";
      else if (v.is_boolean()) o << (v.get<bool>() ? "1" : "0");
      else if (v.is_string()) {
        std::string s = v.get<std::string>();
        for (auto& ch : s)
          if (ch == '"') ch = '\'';
        o << '"' << s << '"';
      } else o << v.get<double>();
      o << (i + 1 < cols.size() ? "," : "\n");
    }
  }
  return o.str();
}

std::string sweep_table(const SweepResult& r) {
  std::ostringstream o;
  long ok = 0;
  for (const auto& p : r.points) ok += p.ok;
  o << r.points.size() << " points (" << ok << " trimmed, " << r.points.size() - ok << " failed, see reasons in sweep.csv)";
  if (r.spec.shard_n > 1) o << ", shard " << r.spec.shard_k << "/" << r.spec.shard_n << " of " << r.total_points;
  o << "\n";
  if (r.has_boundary) {
    auto pc = [](double v) { return std::isfinite(v) ? fixed(100 * v, 2) : std::string("not found"); };
    char line[240];
    o << "\nhands-off divergence boundary (CG, % MAC):\n";
    std::snprintf(line, sizeof line, "  %-11s %12s %14s %14s %-22s %12s\n", "", "closed form", "static cross.",
                  "first crossing", "(its mode)", "time domain");
    o << line;
    auto mode = [](const Boundary& b) {
      if (!std::isfinite(b.eigenvalue)) return std::string("-");
      return b.crossing_oscillatory ? "osc., period " + fixed(b.crossing_period, 0) + " s" : std::string("real");
    };
    for (const auto& [name, b] : {std::pair<const char*, const Boundary*>{"stick held", &r.held}, {"stick free", &r.free}}) {
      std::string m = "(";  // built piece by piece: gcc 12's -Wrestrict misreads a chain of + here
      m += mode(*b);
      m += ')';
      std::snprintf(line, sizeof line, "  %-11s %12s %14s %14s %-22s %12s\n", name, pc(b->closed_form).c_str(),
                    pc(b->static_crossing).c_str(), pc(b->eigenvalue).c_str(), m.c_str(), pc(b->time_domain).c_str());
      o << line;
    }
    o << "  compared: " << kBoundaryComparisons << "\n";
    o << "  (free closed form includes the constant hinge moments; aerodynamic stick-free neutral point "
      << pc(r.free.closed_form_aerodynamic) << ")\n";
    for (const auto& [name, b] : {std::pair<const char*, const Boundary*>{"held", &r.held}, {"free", &r.free}}) {
      const BoundarySpreads sp = boundary_spreads(*b);
      o << "  " << name << ": closed form - static crossing "
        << (std::isfinite(sp.closed_vs_static) ? fixed(100 * (b->closed_form - b->static_crossing), 2) : "-")
        << ", first crossing - time domain "
        << (std::isfinite(sp.first_vs_time) ? fixed(100 * (b->eigenvalue - b->time_domain), 2) : "-") << " % MAC\n";
      if (!b->crossing_mode.empty())
        o << "  " << name << ": the first root to cross zero is the " << b->crossing_mode << "\n";
      if (!b->static_mode.empty())
        o << "  " << name << ": the real root that crosses at the static crossing is the " << b->static_mode << "\n";
      if (!b->no_crossing.empty()) o << "  " << name << ": no crossing: " << b->no_crossing << "\n";
      if (!b->closed_form_note.empty()) o << "  " << name << ": NOTE " << b->closed_form_note << "\n";
      if (!b->set_aside.empty()) o << "  " << name << ": " << b->set_aside << "\n";
      if (!b->time_domain_check.empty()) o << "  " << name << ": time domain " << b->time_domain_check << "\n";
      if (!b->error.empty()) o << "  " << name << ": " << b->error << "\n";
    }
  }
  if (!r.spec.sample.empty()) {
    const json j = sweep_json(r);
    const auto& b = j["band"];
    auto line = [&](const char* name, const json& x, double scale, int dec) {
      if (x.is_null()) return;
      auto f = [&](const json& v) { return v.is_null() ? std::string("-") : fixed(v.get<double>() * scale, dec); };
      o << "  " << name << ": min " << f(x["min"]) << "  p5 " << f(x["p5"]) << "  median " << f(x["p50"]) << "  p95 "
        << f(x["p95"]) << "  max " << f(x["max"]) << "\n";
    };
    o << "\nuncertainty band over " << r.points.size() << " samples:\n";
    line("stick-free neutral point [% MAC]", b["neutral_point_free"], 100.0, 2);
    line("free short-period damping [-]  ", b["short_period_damping_free"], 1.0, 3);
    line("peak free load-factor increment", b["peak_load_factor_increment_free"], 1.0, 3);
    if (b.contains("worst")) o << "  worst sample: " << b["worst"].dump() << "\n";
  }
  return o.str();
}

}  // namespace fp
