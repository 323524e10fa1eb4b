// commands.cpp — subcommands of `floatpitch` (see commands.hpp).
#include "cli/commands.hpp"

#include <cmath>
#include <fstream>
#include <thread>
#include <unistd.h>
#include <cstdio>
#include <iostream>
#include <sstream>
#include <stdexcept>

#include <nlohmann/json.hpp>

#include "model/linear.hpp"
#include "model/trim.hpp"
#include "model/units.hpp"
#include "analysis/margins_modes.hpp"
#include "output/atomic_file.hpp"
#include "analysis/gust_studies.hpp"
#include "output/analysis_text.hpp"
#include "output/gust_text.hpp"
#include "output/outputs.hpp"
#include "output/response_text.hpp"
#include "output/sweep_text.hpp"
#include "report/report.hpp"
#include "run/run.hpp"
#include "analysis/sweep.hpp"
#include "scenario/scenario.hpp"

namespace fp::cmd {

using nlohmann::json;

namespace {

// Run `body`, mapping the project's error types to messages and exit statuses.
template <class F>
int guarded(const std::string& scenario, F&& body) {
  try {
    return body();
  } catch (const ScenarioError& e) {
    std::cerr << "error: " << e.what() << "\n";
    return kBadInput;
  } catch (const TrimError& e) {
    std::cerr << "error: " << scenario << ": " << e.message << "\n";
    return kBadInput;
  } catch (const NumericalFailure& e) {
    std::cerr << "numerical failure (a failure of the integration, not a result about the airplane) at t = "
              << e.time << " s: " << e.message << "\n  state:";
    for (std::size_t i = 0; i < e.state.size(); ++i) std::cerr << " " << state_names[i] << "=" << e.state[i];
    std::cerr << "\nnothing was written.\n";
    return kNumerical;
  } catch (const std::runtime_error& e) {
    std::cerr << "error: " << e.what() << "\n";
    return kBadInput;
  }
}

}  // namespace

int check(const Common& c) {
  return guarded(c.scenario, [&] {
    const Scenario s = load_scenario(c.scenario, c.set);
    const auto plant = scenario_plant(s);
    const Airplane& a = s.airplane;
    const double W = a.mass.mass * units::g0;
    const double ws = W / a.wing.area;
    const double AR = a.wing.span * a.wing.span / a.wing.area;
    const double lt = a.tail.x_ac - a.mass.h_cg * a.wing.mac;
    const double VH = a.tail.area * (a.tail.x_ac - a.wing.h_ac * a.wing.mac) / (a.wing.area * a.wing.mac);
    const auto stall = wing_stall(a.wing.lift);
    const double rho = isa_at(geopotential_altitude(s.condition.altitude)).density;
    const double Vs = std::sqrt(2.0 * W / (rho * a.wing.area * stall.CLmax));
    const double xe = a.elevator.mass > 0 ? a.elevator.mass_moment / a.elevator.mass : 0.0;
    const double G = a.circuit.gearing;
    const double Ieff = a.elevator.inertia + a.circuit.stick_mass / (G * G);
    const double qt = a.tail.eta * 0.5 * rho * s.condition.airspeed * s.condition.airspeed;
    const double Kh = -a.elevator.ch_delta * qt * a.elevator.area * a.elevator.chord;
    const double wf = Kh > 0 ? std::sqrt(Kh / Ieff) : 0.0;
    if (c.json) {
      json j{{"scenario", s.path}, {"name", s.name}, {"wing_loading_N_per_m2", ws},
             {"wing_loading_kg_per_m2", ws / units::g0}, {"aspect_ratio", AR}, {"mac_m", a.wing.mac},
             {"tail_volume", VH}, {"tail_arm_from_cg_m", lt}, {"cg_fraction_mac", a.mass.h_cg},
             {"elevator_static_mass_moment_kg_m", a.elevator.mass_moment},
             {"elevator_cg_aft_of_hinge_m", xe}, {"cl_max", stall.CLmax},
             {"alpha_stall_deg", units::to_deg(stall.alpha)}, {"stall_speed_1g_mps", Vs},
             {"elevator_float_frequency_rad_s", wf}, {"reversible", a.circuit.reversible}};
      std::cout << j.dump(2) << "\n";
      return kOk;
    }
    std::printf("%s: %s\n", s.path.c_str(), s.name.c_str());
    std::printf("  wing loading              %.1f N/m2 (%.1f kg/m2, %.2f lb/ft2)\n", ws, ws / units::g0, ws / units::psf);
    std::printf("  aspect ratio              %.2f\n", AR);
    std::printf("  mean aerodynamic chord    %.3f m\n", a.wing.mac);
    std::printf("  tail volume V_H           %.3f (tail arm from wing a.c. %.3f m)\n", VH, a.tail.x_ac - a.wing.h_ac * a.wing.mac);
    std::printf("  tail arm from CG          %.3f m\n", lt);
    std::printf("  CG                        %.1f %% MAC (envelope %.1f..%.1f %%)\n", 100 * a.mass.h_cg,
                100 * s.envelope.cg_forward, 100 * s.envelope.cg_aft);
    std::printf("  elevator static mass moment %.3f kg m (CG %.1f mm %s the hinge)\n", a.elevator.mass_moment,
                1000 * std::abs(xe), xe >= 0 ? "aft of" : "ahead of");
    std::printf("  CLmax / stall angle       %.2f / %.1f deg; 1 g stall speed %.1f m/s (%.1f kt TAS)\n", stall.CLmax,
                units::to_deg(stall.alpha), Vs, units::to_kt(Vs));
    std::printf("  elevator float frequency  %.1f rad/s (airframe held, at the condition)\n", wf);
    std::printf("  circuit                   %s, gearing %.2f rad/m\n", a.circuit.reversible ? "reversible" : "irreversible", G);
    return kOk;
  });
}

int trim(const TrimOpts& o) {
  return guarded(o.common.scenario, [&] {
    const Scenario s = load_scenario(o.common.scenario, o.common.set);
    const auto plant = scenario_plant(s);
    const bool inverse = !std::isnan(o.tab_for_elevator) || !std::isnan(o.tab_for_alpha) || !std::isnan(o.speed_for_tab);
    if (inverse && !plant->ap.circuit.reversible)
      throw ScenarioError{s.path, 0, 0, "circuit.reversible",
                          "the circuit is irreversible: there is no hands-off trim and the tab carries no stick force"};
    if (inverse) {
      TrimRequest r;
      r.condition = s.condition;
      const char* title = "";
      std::string label;
      if (!std::isnan(o.tab_for_elevator)) {
        r.fix_elevator = true;
        r.elevator = o.tab_for_elevator * units::deg;
        r.solve_speed = true;
        r.solve_tab = true;
        title = "Hands-off trim holding the elevator at the given angle (speed and tab solved):";
      } else if (!std::isnan(o.tab_for_alpha)) {
        r.fix_alpha = true;
        r.alpha = o.tab_for_alpha * units::deg;
        r.solve_speed = true;
        r.solve_tab = true;
        title = "Hands-off trim at the given angle of attack (speed and tab solved):";
      } else {
        r.tab = o.speed_for_tab * units::deg;
        r.zero_force = true;
        r.solve_speed = true;
        title = "Hands-off trim speed for the given tab:";
      }
      const Trim t = fp::trim(*plant, r);
      if (o.common.json) {
        std::cout << json{{"scenario", s.path}, {"hands_off", trim_json(t)}}.dump(2) << "\n";
        return kOk;
      }
      std::cout << trim_table(t, title);
      return kOk;
    }
    const Trim held = trim_held(*plant, s.condition, s.trim.tab_auto ? 0.0 : s.trim.tab);
    std::unique_ptr<Trim> free;
    if (plant->ap.circuit.reversible) free = std::make_unique<Trim>(trim_free(*plant, s.condition));
    if (o.common.json) {
      json j{{"scenario", s.path},
             {"held", trim_json(held)},
             {"free", free ? trim_json(*free) : json(nullptr)}};
      std::cout << j.dump(2) << "\n";
      return kOk;
    }
    std::cout << trim_table(held, s.trim.tab_auto ? "Stick held, tab at 0:" : "Stick held, tab as set:");
    if (free) std::cout << trim_table(*free, "Hands off (tab for zero stick force):");
    else std::cout << "No hands-off trim: the circuit is irreversible.\n";
    return kOk;
  });
}

namespace {
int default_jobs(int j);
}  // namespace

int run(const RunOpts& o) {
  return guarded(o.common.scenario, [&] {
    std::vector<std::string> set = o.common.set;
    if (o.duration >= 0) set.push_back("run.duration=" + std::to_string(o.duration));
    const Scenario s = load_scenario(o.common.scenario, set);
    ControlsChoice which = s.run.controls;
    if (o.controls == "held") which = ControlsChoice::held;
    else if (o.controls == "free") which = ControlsChoice::free;
    else if (o.controls == "both") which = ControlsChoice::both;
    // several turbulence seeds: statistics only (analysis/gust_studies.hpp)
    const int seeds = o.seeds > 0 ? o.seeds : s.turbulence.seeds;
    if (o.seeds > 0 && s.turbulence.model == TurbulenceKind::none)
      throw ScenarioError{s.path, 0, 0, "turbulence.model",
                          "--seeds needs continuous turbulence: set turbulence.model to \"dryden\" or \"von_karman\""};
    if (seeds > 1 && s.turbulence.model != TurbulenceKind::none) {
      const SeedsReport rep = seeds_report(s, run_seeds(s, which, seeds, default_jobs(o.jobs), !o.quiet));
      OutputSet out(o.out);
      out.add("turbulence.csv", rep.csv);
      out.add("summary.json", rep.summary_json);
      out.commit();
      if (!o.quiet)
        std::cout << s.path << ": " << s.name << "\n\n" << rep.table << "wrote " << o.out << "/{turbulence.csv,summary.json}\n";
      return kOk;
    }
    TuneResult tune;
    const RunOutcome r = tuned_gust_index(s) >= 0 ? run_scenario_tuned(s, which, default_jobs(o.jobs), !o.quiet, tune)
                                                  : run_scenario(s, which);
    OutputSet out(o.out);
    if (r.held) out.add("held.csv", trace_csv(r.held->trace));
    if (r.free) out.add("free.csv", trace_csv(r.free->trace));
    json summary = summary_json(s, r);
    summary.update(gust_summary_json(s, r, &tune));
    out.add("summary.json", summary.dump(2) + "\n");
    out.commit();
    if (!o.quiet) {
      std::cout << s.path << ": " << s.name << "\n\n" << run_table(r) << gust_table(s, r, &tune);
      std::cout << "wrote " << o.out << "/{" << (r.held ? "held.csv," : "") << (r.free ? "free.csv," : "")
                << "summary.json}\n";
    }
    return kOk;
  });
}

int margins(const MarginsOpts& o) {
  return guarded(o.common.scenario, [&] {
    const Scenario s = load_scenario(o.common.scenario, o.common.set);
    if (!s.airplane.circuit.reversible)
      throw ScenarioError{s.path, 0, 0, "circuit.reversible",
                          "the circuit is irreversible: there are no stick-free margins (use `modes` for the held case)"};
    MarginsOptions mo;
    mo.min_static_margin = o.min_margin;
    mo.min_force_per_g = o.min_force_per_g;
    const Margins m = compute_margins(s, mo);
    if (o.common.json) {
      json j = margins_json(m);
      j["scenario"] = s.path;
      std::cout << j.dump(2) << "\n";
    } else {
      std::cout << s.path << ": " << s.name << "\n" << margins_table(m);
    }
    return kOk;
  });
}

int forces(const ForcesOpts& o) {
  return guarded(o.common.scenario, [&] {
    const Scenario s = load_scenario(o.common.scenario, o.common.set);
    if (!s.airplane.circuit.reversible)
      throw ScenarioError{s.path, 0, 0, "circuit.reversible", "the circuit is irreversible: the pilot feels no hinge moment"};
    const Margins m = compute_margins(s);
    std::ostringstream a, b;
    a << "airspeed [m/s],airspeed [kt],stick_force [N],elevator [deg],alpha [deg]\n";
    for (const auto& f : m.curve)
      a << f.airspeed << "," << units::to_kt(f.airspeed) << "," << f.stick_force << "," << units::to_deg(f.elevator)
        << "," << units::to_deg(f.alpha) << "\n";
    const auto plant = scenario_plant(s);
    b << "load_factor [-],stick_force [N],elevator [deg]\n";
    for (int i = 0; i <= 12; ++i) {
      TrimRequest r;
      r.condition = s.condition;
      r.tab = m.trim_tab;
      r.load_factor = 1.0 + 0.25 * i;
      r.check_limits = false;
      const Trim t = fp::trim(*plant, r);
      b << r.load_factor << "," << t.stick_force << "," << units::to_deg(t.de) << "\n";
    }
    if (o.out.empty()) {
      std::cout << "# stick force against airspeed, tab fixed at " << units::to_deg(m.trim_tab) << " deg\n"
                << a.str() << "\n# stick force against load factor (steady pull-up at the trim speed)\n" << b.str();
      return kOk;
    }
    std::string per_g = o.out;
    const auto dot = per_g.rfind(".csv");
    per_g = (dot != std::string::npos ? per_g.substr(0, dot) : per_g) + "_per_g.csv";
    write_file_atomic(o.out, a.str());
    write_file_atomic(per_g, b.str());
    std::cout << "wrote " << o.out << " and " << per_g << "\n";
    return kOk;
  });
}

int modes(const ModesOpts& o) {
  return guarded(o.common.scenario, [&] {
    const Scenario s = load_scenario(o.common.scenario, o.common.set);
    const ModesResult r = compute_modes(s);
    if (!o.matrices.empty()) {
      OutputSet out(o.matrices);
      out.add("A_held.csv", matrix_csv(r.held_lm, false));
      out.add("B_held.csv", matrix_csv(r.held_lm, true));
      if (r.has_free) {
        out.add("A_free.csv", matrix_csv(r.free_lm, false));
        out.add("B_free.csv", matrix_csv(r.free_lm, true));
      }
      out.commit();
    }
    if (o.common.json) {
      json j = modes_json(r);
      j["scenario"] = s.path;
      std::cout << j.dump(2) << "\n";
    } else {
      std::cout << s.path << ": " << s.name << "\n" << modes_table(r);
      if (!o.matrices.empty()) std::cout << "wrote the state-space matrices to " << o.matrices << "/\n";
    }
    return kOk;
  });
}

namespace {
int default_jobs(int j) {
  if (j > 0) return j;
  const unsigned n = std::thread::hardware_concurrency();
  return n > 0 ? static_cast<int>(n) : 1;
}
}  // namespace

int sweep(const SweepOpts& o) {
  return guarded(o.common.scenario, [&] {
    SweepSpec spec;
    spec.scenario = o.common.scenario;
    spec.set = o.common.set;
    const Scenario base = load_scenario(spec.scenario, spec.set);
    for (const auto& v : o.vary) spec.vary.push_back(parse_vary(base, v));
    for (const auto& v : o.sample) spec.sample.push_back(parse_sample(base, v));
    spec.samples = o.samples;
    spec.seed = o.seed;
    spec.run_seconds = o.run;
    if (!o.shard.empty()) {
      const auto slash = o.shard.find('/');
      try {
        if (slash == std::string::npos) throw std::invalid_argument("");
        spec.shard_k = std::stoi(o.shard.substr(0, slash));
        spec.shard_n = std::stoi(o.shard.substr(slash + 1));
      } catch (const std::logic_error&) {
        throw ScenarioError{"", 0, 0, "", "--shard expects K/N, e.g. 0/4; got \"" + o.shard + "\""};
      }
    }
    const SweepResult r = run_sweep(spec, default_jobs(o.jobs), true);
    OutputSet out(o.out);
    out.add("sweep.csv", sweep_csv(r));
    out.add("sweep.json", sweep_json(r).dump(2) + "\n");
    out.commit();
    std::cout << spec.scenario << "\n" << sweep_table(r) << "wrote " << o.out << "/sweep.csv and " << o.out
              << "/sweep.json\n";
    return kOk;
  });
}

int merge(const MergeOpts& o) {
  return guarded("", [&] {
    SweepResult all;
    std::vector<bool> seen;
    for (std::size_t d = 0; d < o.dirs.size(); ++d) {
      const std::string path = o.dirs[d] + "/sweep.json";
      std::ifstream f(path);
      if (!f) throw std::runtime_error("cannot read " + path);
      json j;
      try {
        f >> j;
      } catch (const json::exception& e) {
        throw std::runtime_error(path + ": " + e.what());
      }
      SweepResult r = sweep_from_json(j);
      if (d == 0) {
        all = r;
        all.points.clear();
        all.spec.shard_k = 0;
        all.spec.shard_n = 1;
        seen.assign(static_cast<std::size_t>(r.total_points), false);
      } else if (r.spec.scenario != all.spec.scenario || r.total_points != all.total_points ||
                 r.input_keys != all.input_keys) {
        throw std::runtime_error(path + ": not a shard of the same sweep as " + o.dirs[0]);
      }
      for (auto& p : r.points) {
        if (p.index < 0 || p.index >= all.total_points) throw std::runtime_error(path + ": point index out of range");
        if (seen[static_cast<std::size_t>(p.index)])
          throw std::runtime_error(path + ": point " + std::to_string(p.index) + " appears in two shards");
        seen[static_cast<std::size_t>(p.index)] = true;
        all.points.push_back(p);
      }
    }
    for (std::size_t i = 0; i < seen.size(); ++i)
      if (!seen[i]) throw std::runtime_error("point " + std::to_string(i) + " is missing: a shard was not given");
    std::sort(all.points.begin(), all.points.end(), [](const PointResult& a, const PointResult& b) { return a.index < b.index; });
    compute_boundary(all, default_jobs(o.jobs));
    OutputSet out(o.out);
    out.add("sweep.csv", sweep_csv(all));
    out.add("sweep.json", sweep_json(all).dump(2) + "\n");
    out.commit();
    std::cout << sweep_table(all) << "wrote " << o.out << "/sweep.csv and " << o.out << "/sweep.json\n";
    return kOk;
  });
}

int report(const ReportOpts& o) {
  return guarded(o.common.scenario, [&] {
    ReportOptions r;
    r.scenario = o.common.scenario;
    r.set = o.common.set;
    r.out = o.out;
    r.cg_range = o.cg_range;
    r.gusts = o.gusts;
    r.hinge_band = o.hinge_band / 100.0;
    r.sample = o.sample;
    r.samples = o.samples;
    r.seed = o.seed;
    r.min_margin = o.min_margin;
    r.min_force_per_g = o.min_force_per_g;
    r.pdf = o.pdf;
    r.jobs = default_jobs(o.jobs);
    const ReportData d = make_report(r);
    OutputSet out(o.out);
    const auto files = report_files(d);
    for (const auto& [name, content] : files) out.add(name, content);
    out.commit();
    std::cout << "wrote " << o.out << "/report.html and " << files.size() - 1 << " data files in " << o.out << "/data/\n";
    if (o.pdf) {
      const std::string chromium = find_chromium();
      if (chromium.empty()) {
        std::cout << "--pdf: no PDF written: headless Chromium is not installed (looked for chromium and "
                     "chromium-browser on the PATH, and $FLOATPITCH_CHROMIUM). Open report.html in a browser and "
                     "print it, or install Chromium (Debian: apt-get install chromium).\n";
      } else {
        const std::string err = print_pdf(chromium, o.out + "/report.html", o.out + "/report.pdf");
        if (!err.empty()) {
          std::cerr << "error: --pdf: " << err << "; report.html and data/ are written, report.pdf is not\n";
          return kBadInput;
        }
        std::cout << "wrote " << o.out << "/report.pdf\n";
      }
    }
    return kOk;
  });
}

int keys() {
  std::cout << key_reference_markdown();
  return kOk;
}

}  // namespace fp::cmd
