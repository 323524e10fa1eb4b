// common.cpp — see common.hpp.
#include "cli/common.hpp"

#include <thread>

namespace fp::cmd {

int default_jobs(int j) {
  if (j > 0) return j;
  const unsigned n = std::thread::hardware_concurrency();
  return n > 0 ? static_cast<int>(n) : 1;
}

}  // namespace fp::cmd
