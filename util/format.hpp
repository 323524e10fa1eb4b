// format.hpp — number formatting shared by messages, tables and reports.
#pragma once

#include <string>

namespace fp {

// "12.3" style: v with `decimals` digits after the point (printf %.*f).
std::string fixed(double v, int decimals);

// s without the spaces and tabs at its ends.
std::string trim_ws(const std::string& s);

}  // namespace fp
