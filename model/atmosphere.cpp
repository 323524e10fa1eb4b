// atmosphere.cpp — ISA layers 0-11 km (lapse -6.5 K/km) and 11-20 km (isothermal),
// 20-32 km (+1 K/km), hydrostatic pressure with g0 (geopotential form).
#include "atmosphere.hpp"

#include <cmath>
#include <stdexcept>

#include "units.hpp"

namespace fp {

AtmosphereState isa_at(double H) {
  using namespace isa;
  const double g = units::g0;
  double T = 0.0, p = 0.0;
  if (H <= 11000.0) {
    const double L = -0.0065;
    T = T0 + L * H;
    p = p0 * std::pow(T / T0, -g / (L * R));
  } else {
    const double T11 = 216.65;
    const double p11 = p0 * std::pow(T11 / T0, -g / (-0.0065 * R));
    if (H <= 20000.0) {
      T = T11;
      p = p11 * std::exp(-g * (H - 11000.0) / (R * T11));
    } else {
      const double p20 = p11 * std::exp(-g * 9000.0 / (R * T11));
      const double L = 0.001;
      T = T11 + L * (H - 20000.0);
      p = p20 * std::pow(T / T11, -g / (L * R));
    }
  }
  const double rho = p / (R * T);
  return {T, p, rho, std::sqrt(gamma * R * T)};
}

double geopotential_altitude(double z) { return isa::earth_radius * z / (isa::earth_radius + z); }

double calibrated_airspeed(double tas, double z) {
  const AtmosphereState a = isa_at(geopotential_altitude(z));
  const double M = tas / a.sound_speed;
  if (!(M < 1.0)) throw std::domain_error("calibrated_airspeed: supersonic (M >= 1)");
  const double g = isa::gamma, e = g / (g - 1.0);
  const double qc = a.pressure * (std::pow(1.0 + 0.5 * (g - 1.0) * M * M, e) - 1.0);
  const AtmosphereState s0 = isa_at(0.0);
  // at sea level: q_c = p0 ((1 + (gamma-1)/2 (V/a0)^2)^e - 1), solved for V
  return s0.sound_speed * std::sqrt(2.0 / (g - 1.0) * (std::pow(qc / s0.pressure + 1.0, 1.0 / e) - 1.0));
}

}  // namespace fp
