// common.hpp — what every subcommand shares: the mapping of the project's error types to
// messages and exit statuses, the default thread count, and the closing caution line.
#pragma once

#include <iostream>
#include <stdexcept>
#include <string>

#include "cli/commands.hpp"
#include "model/roots.hpp"
#include "model/trim.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"
#include "util/caution.hpp"

namespace fp::cmd {

// The same without the caution line (called by guarded).
template <class F>
int guarded_body(const std::string& scenario, F&& body) {
  try {
    return body();
  } catch (const ScenarioError& e) {
    std::cerr << "error: " << e.what() << "\n";
    return kBadInput;
  } catch (const TrimError& e) {
    if (e.limit == TrimLimit::no_convergence) {  // no limit of the airplane explains it: numerics
      std::cerr << "numerical failure (of the trim solver, not a result about the airplane): " << scenario << ": "
                << e.message << "\n";
      return kNumerical;
    }
    std::cerr << "error: " << scenario << ": " << e.message << "\n";
    return kBadInput;
  } catch (const SolverFailure& e) {
    std::cerr << "numerical failure (a one-dimensional solver, not a result about the airplane): " << scenario
              << ": " << e.quantity << ": " << e.message << "\n";
    return kNumerical;
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


// Where a command's closing caution line goes: stdout after its text, stderr when stdout
// carries data (CSV) that a line of prose would spoil, or nowhere when asked to be quiet.
enum class CautionTo { out, err, none };

// Run `body`, mapping the project's error types to messages and exit statuses. Every command
// ends with the one-line caution (util/caution.hpp), on failure too (on stderr then).
template <class F>
int guarded(const std::string& scenario, F&& body, CautionTo where = CautionTo::out) {
  const int rc = guarded_body(scenario, body);
  if (rc != kOk) std::cerr << kCautionLine << "\n";
  else if (where == CautionTo::out) std::cout << kCautionLine << "\n";
  else if (where == CautionTo::err) std::cerr << kCautionLine << "\n";
  return rc;
}

// The number of threads: j when given, else the number of cores.
int default_jobs(int j);

}  // namespace fp::cmd
