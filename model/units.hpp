// units.hpp — the one place where the trade's units meet SI.
//
// Everything below the file, table and screen edges is SI with angles in radians. Degrees, knots, feet,
// pounds and the like appear only at the edges (scenario files, tables, plots, the window),
// and every conversion goes through the factors below. The unit table is also what the
// scenario loader accepts in strings such as "110 kt" or "12 in".
#pragma once

#include <numbers>
#include <optional>
#include <string_view>

namespace fp::units {

// Exact definitions (NIST SP 811, appendix B).
inline constexpr double g0 = 9.80665;             // standard gravity [m/s^2]
inline constexpr double ft = 0.3048;              // [m]
inline constexpr double inch = 0.0254;            // [m]
inline constexpr double nmi = 1852.0;             // [m]
inline constexpr double kt = 1852.0 / 3600.0;     // [m/s]
inline constexpr double mph = 0.44704;            // [m/s]
inline constexpr double kmh = 1.0 / 3.6;          // [m/s]
inline constexpr double fpm = 0.3048 / 60.0;      // [m/s]
inline constexpr double lb = 0.45359237;          // pound mass [kg]
inline constexpr double lbf = 0.45359237 * g0;    // pound force [N]
inline constexpr double kgf = g0;                 // [N]
inline constexpr double slug = lbf / ft;          // [kg]
inline constexpr double deg = std::numbers::pi / 180.0;  // [rad]
inline constexpr double hp = 745.69987158227022;  // mechanical horsepower [W]
inline constexpr double psf = lbf / (ft * ft);    // [Pa]

inline constexpr double to_deg(double rad) { return rad / deg; }
inline constexpr double to_kt(double mps) { return mps / kt; }
inline constexpr double to_ft(double m) { return m / ft; }

// The physical dimension of a parameter. The loader checks that a unit given in a string
// belongs to the dimension the key expects ("3 kt" for a length is an error).
enum class Dim {
  none,            // dimensionless (coefficients, ratios, fractions of MAC)
  length,          // m
  area,            // m^2
  mass,            // kg
  force,           // N
  speed,           // m/s
  angle,           // rad
  per_angle,       // 1/rad (lift slopes, derivatives)
  angular_rate,    // rad/s
  time,            // s
  inertia,         // kg m^2
  mass_moment,     // kg m (static mass moment)
  moment,          // N m
  power,           // W
  stiffness,       // N/m (spring at the stick)
  damping,         // N s/m (damper at the stick)
  angular_stiffness,  // N m/rad
  angular_damping,    // N m s/rad
  gearing,         // rad/m (elevator angle per stick travel)
  pressure,        // Pa
  per_length,      // 1/m
};

const char* dim_name(Dim d);   // "length", ...
const char* si_unit(Dim d);    // "m", ...

// Factor that converts a value given in `unit` to SI for dimension `d`; nullopt when the
// unit is unknown or belongs to another dimension. The empty unit means SI.
std::optional<double> factor(Dim d, std::string_view unit);

// The units accepted for a dimension, comma separated, for error messages and the docs.
const char* accepted_units(Dim d);

}  // namespace fp::units
