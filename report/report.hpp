// report.hpp — the reviewer's report: one self-contained HTML page (inline SVG and CSS, nothing
// fetched) and the CSV and JSON files its plots and tables were drawn from.
//
// make_report() assembles the analyses that already exist (trim, compute_margins,
// compute_modes, run_sweep over the CG and over sampled hinge-moment derivatives, run_scenario
// for each gust) into a ReportData, and report_html() lays it out. Nothing here computes
// physics of its own: every number comes from model/ or analysis/margins_modes, analysis/sweep, run/run.
//
// Same inputs, same files, except the one line that carries the date (the report takes the
// date from SOURCE_DATE_EPOCH when it is set, as reproducible builds do).
#pragma once

#include <cstdint>
#include <limits>
#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "model/trim.hpp"
#include "analysis/margins_modes.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"
#include "analysis/sweep.hpp"
#include "analysis/envelope.hpp"
#include "report/criteria.hpp"

namespace fp {

struct ReportOptions {
  std::string scenario;                 // path as given
  std::vector<std::string> set;         // --set KEY=VALUE
  std::string out;                      // output directory (for the regeneration command)
  std::string cg_range;                 // "FROM:TO" ("" = automatic)
  std::vector<std::string> gusts;       // gust choices (see parse_gust_choice); empty = default
  double hinge_band = 0.25;             // +- fraction of Ch_alpha and Ch_delta (uniform)
  std::vector<std::string> sample;      // KEY=uniform(LO,HI) | KEY=normal(M,SD): replaces the default
  int samples = 40;                     // random samples of the uncertainty band
  std::uint64_t seed = 1;
  double min_margin = kDefaultCriteria.min_static_margin;  // minimum stick-free static margin for the aft CG limit
  double min_force_per_g = kDefaultCriteria.min_force_per_g;  // minimum stick force per g for the aft CG limit [N/g]
  bool pdf = false;
  int jobs = 2;                         // threads for the sweeps and the sampled runs
  std::string basis = kDefaultBasis;    // the certification basis the criteria come from (report/criteria.hpp)
};

// One gust case: a name, the scenario it runs (the base scenario with these gusts), its runs.
struct GustCase {
  std::string id;                       // "g1", "g2", ... (file names)
  std::string title;                    // what it is, in words
  std::string spec;                     // the choice as given on the command line ("" = default)
  Scenario scenario;
  std::unique_ptr<RunOutcome> outcome;
  // what `floatpitch run` writes to summary.json for these runs (output/outputs summary_json with
  // analysis/gust_studies gust_summary_json: peaks, response metrics held beside free, turbulence
  // statistics, design-rule estimates), plus the case's name; the page reads its numbers here
  nlohmann::json summary;
};

// One sample of the uncertainty band with its free response.
struct SampleResponse {
  long index = 0;
  std::vector<double> inputs;           // SI, in the order of UncertaintyResult::keys
  double np_free = 0;                   // model stick-free neutral point [-]
  double max_real_free = 0;             // largest real eigenvalue, free [1/s]
  bool departed = false;
  double departure_time = 0;            // [s] (NaN when none)
  double peak_dn = 0;                   // max |n - 1| of the free run [-]
  double peak_dalpha = 0;               // max |alpha - alpha_trim| of the free run [rad]
  std::string failure;                  // why the sample could not be run ("" when it ran)
};

struct UncertaintyResult {
  std::vector<std::string> keys;        // sampled keys
  std::vector<std::string> spec_text;   // the distributions, as text for the report
  bool default_band = true;             // the report's default band (+- hinge_band on Ch_alpha, Ch_delta)
  SweepResult sampled;                  // run_sweep over the samples (no time runs)
  SweepResult corners;                  // run_sweep over the corners of a uniform box (2 keys), or empty
  bool has_corners = false;
  std::string response_case;            // which gust case the free responses were run with
  double response_seconds = 0;          // length of those runs [s] (the case's, at most 2 minutes
                                        // unless a disturbance starts later)
  std::vector<SampleResponse> responses;
  // the free responses' angle of attack on a coarser grid (every `stride`-th output point), one
  // vector a sample in the order of `responses` (shorter when the sample departed; empty when it
  // could not run)
  std::vector<double> t;                // [s]
  std::vector<std::vector<double>> alpha;  // [rad]
};

struct InputFile {
  std::string path;                     // as the scenario names it
  std::string sha256;
  std::size_t bytes = 0;
};

struct ReportData {
  ReportOptions options;
  std::string command;                  // the one command that regenerates the report
  std::string date;                     // YYYY-MM-DD (UTC)
  std::string version;
  Scenario scenario;
  std::vector<InputFile> files;         // the case file first, then the files it includes
  std::string scenario_toml;            // the resolved scenario (to_toml), written to data/
  Trim trim_held, trim_free, trim_start;
  double stall_speed = 0;               // 1 g, at the condition's altitude [m/s TAS]
  double cl_max = 0;
  double stall_alpha = 0;               // wing-body angle of attack at CLmax (model/trim wing_stall) [rad]
  Margins margins;
  PerGCurve force_per_g;  // stick force against load factor at the hands-off tab, to 3.5 g or where trim ends
  ModesResult modes;
  std::string cg_range_text;            // as used ("0.13:0.44 step 0.01")
  SweepResult cg_sweep;
  std::vector<GustCase> gusts;
  bool default_gust = false;            // the scenario had no disturbance: the report chose one
  UncertaintyResult uncertainty;
  // the stated envelope's corners (analysis/envelope.hpp envelope_corners), each trimmed
  // hands-off and computed by compute_corner: the first page's table
  std::vector<CornerResult> corners;
  bool analysed_in_envelope = true;     // the analysed CG and mass lie within the stated envelope
};

// Parse one --gusts choice and add its gusts to a copy of `base`:
//   "scenario"                       the scenario's own gusts and events (one case)
//   "SHAPE:LENGTH:AMPLITUDE[:vertical|horizontal][@TIME]"
//                                    SHAPE 1-cos | sharp | ramp; LENGTH and AMPLITUDE with units
//                                    ("25 m", "82 ft", "3 m/s", "10 ft/s", "6 kt"); starts at TIME s
//                                    (default 1 s)
// Throws ScenarioError naming --gusts and what is wrong.
GustCase parse_gust_choice(const Scenario& base, const std::string& text, int index);

// Assemble everything (throws ScenarioError, TrimError, NumericalFailure like the commands).
ReportData make_report(const ReportOptions& o);

// A finding: a measured statement with its number, the criterion it is compared with and that
// criterion's published source. An engineering comparison, never a compliance finding.
struct Finding {
  std::string topic;
  std::string measured;      // what the analysis gives, with its number
  std::string criterion;     // the comparison line, with its number (or "no number")
  std::string source;        // where the criterion is published
  std::string source_note;   // how the report holds the source: quoted, from memory, an option
  std::string comparison;    // the comparison, in words
  std::vector<std::string> criteria;  // the rows of the criteria table it compares with (report/criteria.hpp)
};
std::vector<Finding> report_findings(const ReportData& d);

// The page.
std::string report_html(const ReportData& d);

// The files of the report, relative to the output directory: report.html and data/*.
std::vector<std::pair<std::string, std::string>> report_files(const ReportData& d);

// Headless Chromium for --pdf: $FLOATPITCH_CHROMIUM when set, else chromium or chromium-browser
// on the PATH; "" when there is none.
std::string find_chromium();
// Print `html` (a file) to `pdf` with headless Chromium, name resolution disabled so that
// nothing is fetched; the PDF appears whole or not at all. Returns "" on success, else what
// went wrong.
std::string print_pdf(const std::string& chromium, const std::string& html, const std::string& pdf);

// The date line as it appears in report.html (tests remove it to compare two runs).
inline constexpr const char* kReportDateMarker = "class=\"generated\"";

}  // namespace fp
