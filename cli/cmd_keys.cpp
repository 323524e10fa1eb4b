// cmd_keys.cpp — `floatpitch keys` (see commands.hpp).
#include "cli/common.hpp"
#include "scenario/key_info.hpp"

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

int keys() {
  std::cout << key_reference_markdown();
  return kOk;
}

}  // namespace fp::cmd
