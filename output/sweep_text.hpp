// sweep_text.hpp — a sweep's sweep.json (read back by `merge`), sweep.csv and terminal table.
#pragma once

#include <string>

#include <nlohmann/json_fwd.hpp>

#include "analysis/sweep.hpp"

namespace fp {

nlohmann::json sweep_json(const SweepResult& r);
std::string sweep_csv(const SweepResult& r);
std::string sweep_table(const SweepResult& r);
SweepResult sweep_from_json(const nlohmann::json& j);  // throws std::runtime_error

// Which boundary figures measure the same thing, and so are compared. The closed form (h_n held,
// the apparent point free) is a static criterion: where Cm_alpha, and with it the constant term
// of the characteristic polynomial (det A with the neutral roots set aside), changes sign, i.e.
// where a REAL root passes through zero (Routh-Hurwitz; Etkin and Reid, Dynamics of Flight): it
// is compared with the static crossing. The first crossing of the deciding root and the time
// domain both read the first motion to grow: they are compared with each other. All three (closed
// form, static crossing, time domain) only when the first crossing is real (it is then the static
// crossing); when it is a complex pair the static crossing is not the divergence CG.
inline constexpr const char* kBoundaryComparisons =
    "closed form vs static crossing (a real root through zero); first crossing vs time domain (the first "
    "motion to grow); all three only when the first crossing is real";
struct BoundarySpreads {
  double closed_vs_static;  // |closed form - static crossing| (NaN: no static crossing)
  double first_vs_time;     // |first crossing - time domain| (NaN: either missing)
  double three_way;         // max - min of closed form, static crossing, time domain (NaN unless real)
};
BoundarySpreads boundary_spreads(const Boundary& b);

}  // namespace fp
