// cmd_keys.cpp — `floatpitch keys` (see commands.hpp).
#include "cli/common.hpp"
#include <iostream>

#include "scenario/key_info.hpp"

namespace fp::cmd {

int keys() {
  std::cout << key_reference_markdown();
  return kOk;
}

}  // namespace fp::cmd
