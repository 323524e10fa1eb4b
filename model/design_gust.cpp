// design_gust.cpp — the design-gust rules (see design_gust.hpp for the formulas and sources).
#include "design_gust.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "atmosphere.hpp"
#include "units.hpp"

namespace fp {

GustLoadEstimate derived_gust_load(double wing_loading, double mac, double lift_slope, double rho, double V_e,
                                   double U_de) {
  GustLoadEstimate e;
  e.mu_g = 2.0 * wing_loading / (rho * mac * lift_slope * units::g0);
  e.K_g = 0.88 * e.mu_g / (5.3 + e.mu_g);
  e.delta_n = e.K_g * isa::rho0 * V_e * lift_slope * U_de / (2.0 * wing_loading);
  return e;
}

double derived_gust_velocity(bool at_vd, double altitude) {
  if (altitude > 20000.0 * units::ft) return std::numeric_limits<double>::quiet_NaN();
  return (at_vd ? 25.0 : 50.0) * units::ft;
}

double sharp_edged_gust_load(double wing_loading, double lift_slope, double rho, double V, double U) {
  return rho * V * U * lift_slope / (2.0 * wing_loading);
}

double gradient_distance_factor(double H) { return std::pow(H / (350.0 * units::ft), 1.0 / 6.0); }

double gradient_reference_velocity(double altitude) {
  const double h = altitude / units::ft;
  if (h > 15000.0) return std::numeric_limits<double>::quiet_NaN();
  return (56.0 - (56.0 - 44.0) * std::max(h, 0.0) / 15000.0) * units::ft;
}

double eas_to_tas(double v_eas, double rho) { return v_eas * std::sqrt(isa::rho0 / rho); }

}  // namespace fp
