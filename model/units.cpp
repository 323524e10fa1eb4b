// units.cpp — unit table for the scenario edge (see units.hpp).
#include "units.hpp"

#include <array>

namespace fp::units {
namespace {

struct Entry {
  Dim dim;
  std::string_view name;
  double to_si;
};

constexpr double deg_ = deg;

// One row a spelling. Dimensionless keys accept "%" for convenience (0.25 = "25 %").
constexpr std::array table{
    Entry{Dim::none, "%", 0.01},
    Entry{Dim::length, "m", 1.0},       Entry{Dim::length, "cm", 0.01},
    Entry{Dim::length, "mm", 0.001},    Entry{Dim::length, "km", 1000.0},
    Entry{Dim::length, "ft", ft},       Entry{Dim::length, "in", inch},
    Entry{Dim::length, "nmi", nmi},
    Entry{Dim::area, "m2", 1.0},        Entry{Dim::area, "ft2", ft * ft},
    Entry{Dim::area, "in2", inch * inch}, Entry{Dim::area, "cm2", 1e-4},
    Entry{Dim::mass, "kg", 1.0},        Entry{Dim::mass, "g", 0.001},
    Entry{Dim::mass, "lb", lb},         Entry{Dim::mass, "slug", slug},
    Entry{Dim::force, "N", 1.0},        Entry{Dim::force, "kN", 1000.0},
    Entry{Dim::force, "lbf", lbf},      Entry{Dim::force, "daN", 10.0},
    Entry{Dim::force, "kgf", kgf},
    Entry{Dim::speed, "m/s", 1.0},      Entry{Dim::speed, "kt", kt},
    Entry{Dim::speed, "km/h", kmh},     Entry{Dim::speed, "mph", mph},
    Entry{Dim::speed, "ft/s", ft},      Entry{Dim::speed, "fpm", fpm},
    Entry{Dim::angle, "rad", 1.0},      Entry{Dim::angle, "deg", deg_},
    Entry{Dim::per_angle, "/rad", 1.0}, Entry{Dim::per_angle, "/deg", 1.0 / deg_},
    Entry{Dim::angular_rate, "rad/s", 1.0}, Entry{Dim::angular_rate, "deg/s", deg_},
    Entry{Dim::time, "s", 1.0},         Entry{Dim::time, "ms", 0.001},
    Entry{Dim::time, "min", 60.0},
    Entry{Dim::inertia, "kg m2", 1.0},  Entry{Dim::inertia, "slug ft2", slug * ft * ft},
    Entry{Dim::inertia, "lb in2", lb * inch * inch}, Entry{Dim::inertia, "lb ft2", lb * ft * ft},
    Entry{Dim::mass_moment, "kg m", 1.0}, Entry{Dim::mass_moment, "lb in", lb * inch},
    Entry{Dim::mass_moment, "lb ft", lb * ft}, Entry{Dim::mass_moment, "g cm", 1e-5},
    Entry{Dim::moment, "N m", 1.0},     Entry{Dim::moment, "lbf in", lbf * inch},
    Entry{Dim::moment, "lbf ft", lbf * ft},
    Entry{Dim::power, "W", 1.0},        Entry{Dim::power, "kW", 1000.0},
    Entry{Dim::power, "hp", hp},
    Entry{Dim::stiffness, "N/m", 1.0},  Entry{Dim::stiffness, "lbf/in", lbf / inch},
    Entry{Dim::stiffness, "N/mm", 1000.0},
    Entry{Dim::damping, "N s/m", 1.0},  Entry{Dim::damping, "lbf s/in", lbf / inch},
    Entry{Dim::angular_stiffness, "N m/rad", 1.0}, Entry{Dim::angular_stiffness, "N m/deg", 1.0 / deg_},
    Entry{Dim::angular_damping, "N m s/rad", 1.0},
    Entry{Dim::gearing, "rad/m", 1.0},  Entry{Dim::gearing, "deg/in", deg_ / inch},
    Entry{Dim::gearing, "deg/m", deg_}, Entry{Dim::gearing, "deg/cm", deg_ / 0.01},
    Entry{Dim::pressure, "Pa", 1.0},    Entry{Dim::pressure, "hPa", 100.0},
    Entry{Dim::pressure, "psf", psf},
    Entry{Dim::per_length, "/m", 1.0},  Entry{Dim::per_length, "/ft", 1.0 / ft},
};

}  // namespace

const char* dim_name(Dim d) {
  switch (d) {
    case Dim::none: return "dimensionless";
    case Dim::length: return "length";
    case Dim::area: return "area";
    case Dim::mass: return "mass";
    case Dim::force: return "force";
    case Dim::speed: return "speed";
    case Dim::angle: return "angle";
    case Dim::per_angle: return "per angle";
    case Dim::angular_rate: return "angular rate";
    case Dim::time: return "time";
    case Dim::inertia: return "moment of inertia";
    case Dim::mass_moment: return "static mass moment";
    case Dim::moment: return "moment";
    case Dim::power: return "power";
    case Dim::stiffness: return "stiffness";
    case Dim::damping: return "damping";
    case Dim::angular_stiffness: return "angular stiffness";
    case Dim::angular_damping: return "angular damping";
    case Dim::gearing: return "gearing";
    case Dim::pressure: return "pressure";
    case Dim::per_length: return "per length";
  }
  return "?";
}

const char* si_unit(Dim d) {
  switch (d) {
    case Dim::none: return "-";
    case Dim::length: return "m";
    case Dim::area: return "m2";
    case Dim::mass: return "kg";
    case Dim::force: return "N";
    case Dim::speed: return "m/s";
    case Dim::angle: return "rad";
    case Dim::per_angle: return "/rad";
    case Dim::angular_rate: return "rad/s";
    case Dim::time: return "s";
    case Dim::inertia: return "kg m2";
    case Dim::mass_moment: return "kg m";
    case Dim::moment: return "N m";
    case Dim::power: return "W";
    case Dim::stiffness: return "N/m";
    case Dim::damping: return "N s/m";
    case Dim::angular_stiffness: return "N m/rad";
    case Dim::angular_damping: return "N m s/rad";
    case Dim::gearing: return "rad/m";
    case Dim::pressure: return "Pa";
    case Dim::per_length: return "/m";
  }
  return "?";
}

std::optional<double> factor(Dim d, std::string_view unit) {
  if (unit.empty()) return 1.0;
  for (const auto& e : table)
    if (e.dim == d && e.name == unit) return e.to_si;
  return std::nullopt;
}

const char* accepted_units(Dim d) {
  switch (d) {
    case Dim::none: return "a plain number, or \"%\"";
    case Dim::length: return "m, cm, mm, km, ft, in, nmi";
    case Dim::area: return "m2, cm2, ft2, in2";
    case Dim::mass: return "kg, g, lb, slug";
    case Dim::force: return "N, kN, daN, kgf, lbf";
    case Dim::speed: return "m/s, kt, km/h, mph, ft/s, fpm";
    case Dim::angle: return "rad, deg";
    case Dim::per_angle: return "/rad, /deg";
    case Dim::angular_rate: return "rad/s, deg/s";
    case Dim::time: return "s, ms, min";
    case Dim::inertia: return "kg m2, slug ft2, lb ft2, lb in2";
    case Dim::mass_moment: return "kg m, lb in, lb ft, g cm";
    case Dim::moment: return "N m, lbf in, lbf ft";
    case Dim::power: return "W, kW, hp";
    case Dim::stiffness: return "N/m, N/mm, lbf/in";
    case Dim::damping: return "N s/m, lbf s/in";
    case Dim::angular_stiffness: return "N m/rad, N m/deg";
    case Dim::angular_damping: return "N m s/rad";
    case Dim::gearing: return "rad/m, deg/m, deg/cm, deg/in";
    case Dim::pressure: return "Pa, hPa, psf";
    case Dim::per_length: return "/m, /ft";
  }
  return "";
}

}  // namespace fp::units
