// linear.hpp — small-disturbance model of the full nonlinear equations at a trim, and its modes.
//
// The Jacobian A = df/dx is taken by central differences with a step scaled to each state
// (scale * 1e-5 by default), over the states that take part in the pitch dynamics: x (earth
// distance) is left out (nothing depends on it without a gust), and so are the elevator states
// with the stick held rigidly and the unused downwash-lag stages. The altitude h is kept (the
// density gradient couples it weakly into the phugoid).
//
// Modes are named from their eigenvectors, not their order (see name_mode in linear.cpp):
// the share of each eigenvector in (elevator), (alpha via w, q), (u, theta), h.
#pragma once

#include <complex>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "dynamics.hpp"

namespace fp {

struct LinearModel {
  std::vector<std::size_t> states;   // indices into State (see state.hpp) in matrix order
  Eigen::MatrixXd A;                 // d(xdot)/dx [SI]
  Eigen::MatrixXd B;                 // d(xdot)/d(input): columns tab [rad], pilot force [N] (free) or
                                     // held elevator [rad] (held)
  std::vector<std::string> input_names;
  std::vector<std::string> input_units;
  double V = 0;                      // trim airspeed, for normalising eigenvectors [m/s]
};

// Linearise about the state x0 with controls c (the stick held or free as in c).
LinearModel linearise(const Plant& p, const State& x0, const Controls& c, double step_scale = 1e-5);

struct Mode {
  std::string name;          // short period, phugoid, elevator, pitch divergence, speed, height, other
  std::complex<double> root; // eigenvalue [1/s] (the one with imag >= 0 of a pair)
  double frequency = 0;      // undamped natural frequency |root| [rad/s]
  double damping = 0;        // damping ratio -re/|root| [-]
  double period = 0;         // 2 pi / imag [s], 0 when real
  double time_to_half = 0;   // ln2/(-re) when stable [s], 0 otherwise
  double time_to_double = 0; // ln2/re when unstable [s], 0 otherwise
  double cycles_to_tenth = 0;// ln10/(2 pi) * imag/(-re) for a damped oscillation, 0 otherwise
  bool oscillatory = false;
  std::vector<double> shape; // |eigenvector| share per state of LinearModel::states (sums to 1)
};

// Eigenvalues of A with their modes named, sorted by frequency (complex pairs once).
std::vector<Mode> modes(const LinearModel& lm);

}  // namespace fp
