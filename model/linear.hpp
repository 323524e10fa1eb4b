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
  std::string name;          // short period, phugoid, elevator, downwash lag, pitch divergence,
                             // speed divergence, speed, pitch subsidence, height
  std::complex<double> root; // eigenvalue [1/s] (the one with imag >= 0 of a pair)
  double frequency = 0;      // undamped natural frequency |root| [rad/s]
  double damping = 0;        // damping ratio -re/|root| [-]
  double period = 0;         // 2 pi / imag [s], 0 when real
  double time_to_half = 0;   // ln2/(-re) when stable [s], 0 otherwise
  double time_to_double = 0; // ln2/re when unstable [s], 0 otherwise
  double cycles_to_tenth = 0;// ln10/(2 pi) * imag/(-re) for a damped oscillation, 0 otherwise
  bool oscillatory = false;
  std::vector<double> shape; // |eigenvector| share per state of LinearModel::states (sums to 1)
  bool neutral = false;      // neutral by construction (see modes()): never decides stability
  std::string neutral_reason;// why, when neutral
};

// Eigenvalues of A with their modes named, sorted by frequency (complex pairs once).
//
// The altitude root is neutral by construction when the airplane has a neighbouring trim at
// another altitude with the same controls (thrust independent of density and speed: the same
// CL and L/D fly level at any density, at another airspeed). That is a structural property of
// A, tested without a threshold on the root itself: with r the other states, the neighbouring
// equilibrium per metre is x_r = -A_rr^-1 a_rh and the altitude rate it leaves is the Schur
// complement rho = A_hh + A_hr x_r (det A = det A_rr * rho). When rho vanishes to within the
// finite-difference error of its two terms (relative 1e-5; the Jacobian steps give about 1e-8,
// a thrust that varies with density by 1 % gives 1e-3), the similarity x = T x', T = I + x_r e_h^T
// makes A block triangular: the altitude root is exactly 0 and the other roots are those of
// A_rr - x_r A_hr, computed apart so that a root crossing zero is never confused with it.
// That root is flagged `neutral`. Otherwise every root comes from A.
std::vector<Mode> modes(const LinearModel& lm);

// The root that decides stability, in one place for every consumer (modes, sweeps, the CG
// locus, the report): the largest real part among the roots that count. Roots neutral by
// construction never count (the altitude root above; the earth distance x is not a state of
// the linear model at all, as nothing depends on it without a gust); they are listed with
// their reason.
struct SetAsideRoot {
  std::string mode;
  std::complex<double> root;
  std::string reason;
};
struct StabilityRoot {
  bool found = false;                 // false when no root counts
  std::complex<double> root;          // [1/s] (imag >= 0)
  std::string mode;                   // its name
  bool oscillatory = false;           // a complex pair
  std::vector<SetAsideRoot> set_aside;
};
StabilityRoot deciding_root(const std::vector<Mode>& modes);

}  // namespace fp
