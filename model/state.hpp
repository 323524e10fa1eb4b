// state.hpp — the state layout and the sign conventions, written once.
//
// Sign conventions (used by every file of the project):
//   * Body axes: x forward, z down (y to the right wing). Earth axes: X forward along the
//     initial track, altitude h up. Flat, non-rotating Earth.
//   * theta (pitch attitude) and q (pitch rate) positive nose up; alpha positive nose up
//     relative to the air.
//   * Elevator deflection delta_e positive trailing edge DOWN (its pitching moment is nose
//     down); the tab likewise. A trailing-edge-down rotation of the elevator is a rotation
//     in the same sense as nose-up pitch, so the elevator's inertial angle is theta + delta_e.
//   * Hinge moment positive when it drives the trailing edge down.
//   * Stick position positive aft (pull); stick force positive pull. The gearing G > 0 is
//     elevator angle per stick travel with delta_e = -G x_stick (a pull raises the trailing
//     edge). Virtual work on a massless, frictionless circuit, F dx + H d(delta_e) = 0, gives
//     the force that holds it: F_stick = G * H. So a positive (trailing-edge-down) hinge
//     moment needs a pull. In the equations of motion the pilot's force F adds the hinge
//     moment -F/G.
//   * CG and neutral points: fractions of the MAC aft of its leading edge. Static margin =
//     neutral point minus CG (positive = stable).
//   * Gust velocities: w_g positive UP (an up-gust raises the angle of attack), u_g positive
//     along the flight direction (a tail gust lowers the airspeed).
//   * Load factor n = -(aerodynamic + thrust force along body z)/(m g0): 1 in level flight.
//
// The state vector is a std::array of fixed size; each entry has a named index below.
#pragma once

#include <array>
#include <cstddef>

namespace fp {

namespace sx {
inline constexpr std::size_t u = 0;        // body-axis velocity along x [m/s]
inline constexpr std::size_t w = 1;        // body-axis velocity along z (down) [m/s]
inline constexpr std::size_t q = 2;        // pitch rate, nose up [rad/s]
inline constexpr std::size_t theta = 3;    // pitch attitude, nose up [rad]
inline constexpr std::size_t x = 4;        // distance along the earth X axis [m]
inline constexpr std::size_t h = 5;        // altitude, up [m]
inline constexpr std::size_t de = 6;       // elevator deflection, trailing edge down [rad]
inline constexpr std::size_t de_dot = 7;   // elevator rate relative to the airframe [rad/s]
inline constexpr std::size_t eps0 = 8;     // downwash lag stages (up to 4) [rad]
inline constexpr std::size_t max_lag_stages = 4;
// Free play (model/circuit.hpp): the stick side of the circuit, referred to the surface, is a
// degree of freedom of its own in runs that model the play; otherwise it is unused (0).
inline constexpr std::size_t ds = 12;      // stick side: the elevator angle the stick commands [rad]
inline constexpr std::size_t ds_dot = 13;  // its rate relative to the airframe [rad/s]
inline constexpr std::size_t count = 14;
}  // namespace sx

using State = std::array<double, sx::count>;

// Name and unit of each entry (SI), for the state-space CSVs and error messages.
inline constexpr std::array<const char*, sx::count> state_names{
    "u", "w", "q", "theta", "x", "h", "delta_e", "delta_e_dot", "eps_lag1", "eps_lag2",
    "eps_lag3", "eps_lag4", "stick_side", "stick_side_dot"};
inline constexpr std::array<const char*, sx::count> state_units{
    "m/s", "m/s", "rad/s", "rad", "m", "m", "rad", "rad/s", "rad", "rad", "rad", "rad", "rad", "rad/s"};

}  // namespace fp
