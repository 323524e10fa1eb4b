// cli.cpp — the `floatpitch` command line (CLI11 lives in this file only: it is slow to compile).
// Parsing only; the work is in commands.cpp. CLI11's own errors exit with status 2.
#include <CLI/CLI.hpp>

#include "cli/commands.hpp"
#include "version.hpp"

namespace {

void add_common(CLI::App* sub, fp::cmd::Common& c, bool with_json) {
  sub->add_option("scenario", c.scenario, "scenario file (TOML)")->required();
  sub->add_option("--set", c.set, "override a scenario key, KEY=VALUE (repeatable), e.g. --set cg=0.31");
  if (with_json) sub->add_flag("--json", c.json, "print JSON instead of a table");
}

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{"floatpitch: pitch dynamics of a light airplane with its elevator held or free.\n"
               "An engineering analysis aid, not approved data (see the README's cautions)."};
  app.set_version_flag("--version", std::string("floatpitch ") + FLOATPITCH_VERSION);
  app.require_subcommand(1);

  fp::cmd::Common check_o;
  auto* check = app.add_subcommand("check", "validate a scenario and print the derived quantities a reviewer checks first");
  add_common(check, check_o, true);

  fp::cmd::TrimOpts trim_o;
  auto* trim = app.add_subcommand("trim", "trim with the stick held and hands-off");
  add_common(trim, trim_o.common, true);

  fp::cmd::RunOpts run_o;
  auto* run = app.add_subcommand("run", "time-domain run with the stick held and free; writes CSV and summary.json");
  add_common(run, run_o.common, false);
  run->add_option("--controls", run_o.controls, "which cases to run (default: the scenario's run.controls)")
      ->check(CLI::IsMember({"held", "free", "both"}));
  run->add_option("--duration", run_o.duration, "run length [s] (overrides run.duration)")
      ->check(CLI::Range(0.1, 3600.0));
  run->add_option("--out", run_o.out, "output directory (default: out)");
  run->add_flag("--quiet", run_o.quiet, "print nothing on success");
  run->add_option("--seeds", run_o.seeds,
                  "turbulence: run this many seeds (turbulence.seed, +1, ...) in parallel; prints means and spreads, "
                  "writes turbulence.csv (default: turbulence.seeds)")
      ->check(CLI::Range(1, 10000));
  run->add_option("--jobs", run_o.jobs, "threads for --seeds and the tuned-gust search (default: the number of cores)")
      ->check(CLI::Range(1, 256));

  trim->add_option("--tab-for-elevator", trim_o.tab_for_elevator,
                   "hands-off: the tab (and speed) that hold this elevator angle [deg]");
  trim->add_option("--tab-for-alpha", trim_o.tab_for_alpha,
                   "hands-off: the tab (and speed) that hold this angle of attack [deg]");
  trim->add_option("--trim-speed-for-tab", trim_o.speed_for_tab, "hands-off trim speed with this tab [deg]");

  fp::cmd::MarginsOpts margins_o;
  auto* margins = app.add_subcommand("margins", "neutral and maneuver points, margins, stick forces, CG limits");
  add_common(margins, margins_o.common, true);
  margins->add_option("--min-margin", margins_o.min_margin, "minimum stick-free static margin for the aft limit [fraction of MAC]")
      ->check(CLI::Range(0.0, 0.5));
  margins->add_option("--min-force-per-g", margins_o.min_force_per_g, "minimum stick force per g for the aft limit [N/g]")
      ->check(CLI::Range(0.0, 1000.0));

  fp::cmd::ForcesOpts forces_o;
  auto* forces = app.add_subcommand("forces", "stick force against airspeed (tab fixed) and against load factor, as CSV");
  add_common(forces, forces_o.common, false);
  forces->add_option("--out", forces_o.out, "FILE.csv (the per-g line goes to FILE_per_g.csv); default: print");

  fp::cmd::ModesOpts modes_o;
  auto* modes = app.add_subcommand("modes", "linear modes at trim with the stick held and free");
  add_common(modes, modes_o.common, true);
  modes->add_option("--matrices", modes_o.matrices, "write the state-space matrices (CSV) to this directory");

  fp::cmd::SweepOpts sweep_o;
  auto* sweep = app.add_subcommand("sweep", "vary or sample scenario keys; trim, margins, modes (and runs) at each point");
  add_common(sweep, sweep_o.common, false);
  sweep->add_option("--vary", sweep_o.vary, "KEY=FROM:TO:STEP (repeat once for a grid), e.g. cg=0.30:0.42:0.005");
  sweep->add_option("--sample", sweep_o.sample, "KEY=normal(MEAN,SD) or KEY=uniform(LO,HI) (repeatable)");
  sweep->add_option("--samples", sweep_o.samples, "number of random samples")->check(CLI::Range(1, 1000000));
  sweep->add_option("--seed", sweep_o.seed, "random seed (same seed, same samples)");
  sweep->add_option("--run", sweep_o.run, "also run each point held and free for this many seconds")
      ->check(CLI::Range(0.0, 3600.0));
  sweep->add_option("--jobs", sweep_o.jobs, "threads (default: the number of cores)")->check(CLI::Range(1, 256));
  sweep->add_option("--out", sweep_o.out, "output directory (default: sweep)");
  sweep->add_option("--shard", sweep_o.shard, "K/N: run only the points i with i % N == K (join with merge)");

  fp::cmd::MergeOpts merge_o;
  auto* merge = app.add_subcommand("merge", "join the shards of a sweep (their output directories)");
  merge->add_option("dirs", merge_o.dirs, "shard output directories")->required();
  merge->add_option("--out", merge_o.out, "output directory (default: merged)");
  merge->add_option("--jobs", merge_o.jobs, "threads for the boundary refinement")->check(CLI::Range(1, 256));

  fp::cmd::MatrixOpts matrix_o;
  auto* matrix = app.add_subcommand("matrix", "conditions matrix: trim, margins, forces, modes held and free and a "
                                              "release 15 % off trim at every corner, in parallel");
  add_common(matrix, matrix_o.common, true);
  matrix->add_option("--cases", matrix_o.cases, "case file listing the corners (default: the stated envelope's corners)");
  matrix->add_option("--jobs", matrix_o.jobs, "threads (default: the number of cores)")->check(CLI::Range(1, 256));

  auto* keys = app.add_subcommand("keys", "print the scenario key reference (markdown)");

  fp::cmd::ReportOpts report_o;
  auto* report = app.add_subcommand("report", "write the reviewer's report: DIR/report.html (self-contained) and DIR/data/");
  add_common(report, report_o.common, false);
  report->add_option("--out", report_o.out, "output directory (default: report)");
  report->add_option("--cg-range", report_o.cg_range, "FROM:TO: CG range of the sweep, fractions of MAC (default: automatic)");
  report->add_option("--gusts", report_o.gusts,
                     "gust cases (repeatable): scenario, or SHAPE:LENGTH:AMPLITUDE[:vertical|horizontal][@TIME] with "
                     "SHAPE 1-cos|sharp|ramp, e.g. \"1-cos:25 m:3 m/s\" (default: the scenario's own disturbance)");
  report->add_option("--hinge-band", report_o.hinge_band, "uncertainty band: +- percent on Ch_alpha and Ch_delta, uniform (default 25)")
      ->check(CLI::Range(0.0, 99.0));
  report->add_option("--sample", report_o.sample, "KEY=uniform(LO,HI) or KEY=normal(MEAN,SD): replaces the default band (repeatable)");
  report->add_option("--samples", report_o.samples, "random samples of the band (default 40)")->check(CLI::Range(2, 5000));
  report->add_option("--seed", report_o.seed, "random seed (same seed, same samples)");
  report->add_option("--min-margin", report_o.min_margin, "minimum stick-free static margin for the aft CG limit [fraction of MAC]")
      ->check(CLI::Range(0.0, 0.5));
  report->add_option("--min-force-per-g", report_o.min_force_per_g, "minimum stick force per g for the aft CG limit [N/g]")
      ->check(CLI::Range(0.0, 1000.0));
  report->add_option("--basis", report_o.basis,
                     "certification basis of the criteria: part23-pre64 (default), part23-amdt64 or cs23-pre5");
  report->add_flag("--pdf", report_o.pdf, "also print DIR/report.pdf with headless Chromium");
  report->add_option("--jobs", report_o.jobs, "threads (default: the number of cores)")->check(CLI::Range(1, 256));

  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int rc = app.exit(e);
    return rc == 0 ? 0 : fp::cmd::kBadInput;
  }
  if (*check) return fp::cmd::check(check_o);
  if (*trim) return fp::cmd::trim(trim_o);
  if (*run) return fp::cmd::run(run_o);
  if (*margins) {
    margins_o.margin_from_user = margins->get_option("--min-margin")->count() > 0;
    margins_o.force_from_user = margins->get_option("--min-force-per-g")->count() > 0;
    return fp::cmd::margins(margins_o);
  }
  if (*forces) return fp::cmd::forces(forces_o);
  if (*modes) return fp::cmd::modes(modes_o);
  if (*sweep) return fp::cmd::sweep(sweep_o);
  if (*merge) return fp::cmd::merge(merge_o);
  if (*keys) return fp::cmd::keys();
  if (*report) return fp::cmd::report(report_o);
  if (*matrix) return fp::cmd::matrix(matrix_o);
  return fp::cmd::kBadInput;
}
