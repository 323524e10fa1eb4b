// format.cpp — number formatting (see format.hpp).
#include "util/format.hpp"

#include <cstdio>

namespace fp {

std::string fixed(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

}  // namespace fp
