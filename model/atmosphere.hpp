// atmosphere.hpp — International Standard Atmosphere (ISO 2533:1975 = ICAO Doc 7488 =
// U.S. Standard Atmosphere 1976 below 32 km), troposphere and lower stratosphere layers,
// geopotential altitude input. Valid from -2 km to 32 km; the scenario limits altitude to
// 0..20 km.
#pragma once

namespace fp {

struct AtmosphereState {
  double temperature;  // [K]
  double pressure;     // [Pa]
  double density;      // [kg/m^3]
  double sound_speed;  // [m/s]
};

namespace isa {
inline constexpr double T0 = 288.15;           // sea-level temperature [K]
inline constexpr double p0 = 101325.0;         // sea-level pressure [Pa]
inline constexpr double rho0 = 1.225;          // sea-level density [kg/m^3]
inline constexpr double R = 287.05287;         // specific gas constant of air [J/(kg K)]
inline constexpr double gamma = 1.4;           // ratio of specific heats [-]
inline constexpr double earth_radius = 6356766.0;  // for geopotential altitude [m]
}  // namespace isa

// ISA at geopotential altitude H [m].
AtmosphereState isa_at(double H);

// Geopotential altitude [m] from geometric altitude [m] (ISO 2533 eq. 8).
double geopotential_altitude(double z_geometric);

// Calibrated airspeed [m/s] from true airspeed [m/s] at geometric altitude z [m], ISA: the
// impact pressure of isentropic subsonic flow at the altitude, q_c = p ((1 + (gamma-1)/2 M^2)^
// (gamma/(gamma-1)) - 1), read back as the speed that gives the same q_c at sea-level ISA (the
// calibration law of an airspeed indicator; the isentropic pitot relation, common practice).
// Subsonic only: throws std::domain_error at M >= 1. Equals the true airspeed at sea level.
double calibrated_airspeed(double tas, double z_geometric);

}  // namespace fp
