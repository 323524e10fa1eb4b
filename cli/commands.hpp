// commands.hpp — the work behind each `floatpitch` subcommand. cli.cpp parses the command
// line (CLI11) and calls these; each returns the process exit status:
//   0 success, 2 bad input (scenario, option, or a condition that cannot be trimmed),
//   3 numerical failure (the integrator failed: not a result about the airplane).
#pragma once

#include <cmath>
#include <string>
#include <vector>

#include "model/static.hpp"  // StaticCriteria: the default criteria of the CG limits

namespace fp::cmd {

inline constexpr int kOk = 0;
inline constexpr int kBadInput = 2;
inline constexpr int kNumerical = 3;

struct Common {
  std::string scenario;
  std::vector<std::string> set;  // --set KEY=VALUE
  bool json = false;
};

int check(const Common& c);

struct TrimOpts {
  Common common;
  double tab_for_elevator = NAN;   // [deg]: tab that holds this elevator hands-off (speed solved)
  double tab_for_alpha = NAN;      // [deg]: tab that holds this angle of attack hands-off
  double speed_for_tab = NAN;      // [deg]: hands-off trim speed with this tab
};
int trim(const TrimOpts& o);

struct RunOpts {
  Common common;
  std::string controls;      // "", held, free, both
  double duration = -1;      // < 0: the scenario's
  std::string out = "out";
  bool quiet = false;
  int seeds = 0;             // turbulence: number of seeds (0: the scenario's turbulence.seeds)
  int jobs = 0;              // threads for seeds and the tuned-gust search (0: the number of cores)
};
int run(const RunOpts& o);

struct MarginsOpts {
  Common common;
  double min_margin = kDefaultCriteria.min_static_margin;     // [-] for the aft CG limit
  double min_force_per_g = kDefaultCriteria.min_force_per_g;  // [N/g] for the aft CG limit
  bool margin_from_user = false;   // --min-margin given (else the limit is a tool default)
  bool force_from_user = false;    // --min-force-per-g given
};
int margins(const MarginsOpts& o);

struct ForcesOpts {
  Common common;
  std::string out;                 // FILE.csv (FILE_per_g.csv beside it); empty: print
};
int forces(const ForcesOpts& o);

struct ModesOpts {
  Common common;
  std::string matrices;            // directory for the state-space CSVs; empty: none
};
int modes(const ModesOpts& o);

struct SweepOpts {
  Common common;
  std::vector<std::string> vary;    // KEY=FROM:TO:STEP
  std::vector<std::string> sample;  // KEY=normal(M,SD) | KEY=uniform(LO,HI)
  int samples = 0;
  unsigned long seed = 1;
  double run = 0;                   // seconds of time-domain run per point (0: none)
  int jobs = 0;                     // 0: the number of cores
  std::string out = "sweep";
  std::string shard;                // "K/N"
};
int sweep(const SweepOpts& o);

struct MergeOpts {
  std::vector<std::string> dirs;
  std::string out = "merged";
  int jobs = 0;
};
int merge(const MergeOpts& o);

int keys();

struct ReportOpts {
  Common common;
  std::string out = "report";
  std::string cg_range;             // FROM:TO (fractions of MAC); empty: automatic
  std::vector<std::string> gusts;   // gust choices; empty: the scenario's disturbance
  double hinge_band = 25;           // +- % on Ch_alpha and Ch_delta (uniform)
  std::vector<std::string> sample;  // KEY=uniform(LO,HI) | KEY=normal(M,SD): replaces the default band
  int samples = 40;
  unsigned long seed = 1;
  double min_margin = kDefaultCriteria.min_static_margin;     // [-] for the aft CG limit
  double min_force_per_g = kDefaultCriteria.min_force_per_g;  // [N/g] for the aft CG limit
  bool pdf = false;
  int jobs = 0;                     // 0: the number of cores
  std::string basis = "part23-pre64";  // certification basis of the criteria (report/criteria.hpp)
};
int report(const ReportOpts& o);

// `floatpitch matrix`: the conditions matrix (analysis/envelope.hpp) over the corners of a case
// file (scenario/matrix_case.hpp), or over the stated envelope's corners when none is given.
struct MatrixOpts {
  Common common;
  std::string cases;                // matrix case file ("" = the stated envelope's corners)
  int jobs = 0;                     // 0: the number of cores
};
int matrix(const MatrixOpts& o);

}  // namespace fp::cmd
