// signal.hpp — reading modal content out of time histories.
//
// growth_rate(): the exponential rate of the slowest-decaying (or fastest-growing) motion in
// a sampled signal, by the matrix pencil method (Y. Hua and T. K. Sarkar, "Matrix pencil
// method for estimating parameters of exponentially damped/undamped sinusoids in noise",
// IEEE Trans. ASSP 38(5), 1990): the signal is modelled as a sum of M damped exponentials
// y_k = sum_i a_i z_i^k; the z_i are the eigenvalues of the pencil of two shifted Hankel
// matrices, reduced to rank M by a singular value decomposition; the rates are ln(z_i)/dt.
// Used for the time-domain divergence boundary: it reads a root of +0.01/s from a minute
// of response without waiting for the motion to double.
#pragma once

#include <complex>
#include <vector>

namespace fp {

struct PencilMode {
  std::complex<double> s;  // continuous-time root [1/s]
  double amplitude = 0;    // |a_i| of the fitted sum [signal units]
};

// Fit up to `max_order` damped exponentials to y (uniformly sampled every dt). Modes whose
// singular values fall below rel_tol times the largest are dropped. Sorted by real part,
// largest first.
std::vector<PencilMode> matrix_pencil(const std::vector<double>& y, double dt, int max_order = 8,
                                      double rel_tol = 1e-7);

// The largest real part among the fitted modes whose amplitude is at least `min_share` of the
// largest amplitude [1/s]; NaN when the signal is (numerically) zero.
double growth_rate(const std::vector<double>& y, double dt, int max_order = 8, double min_share = 0.02);

// The same about a constant offset: y_k = c + sum a_i z_i^k. The first difference
// d_k = y_{k+1} - y_k = sum a_i (z_i - 1) z_i^k has the same z_i and no constant, so the pencil
// of d gives the z_i, and the amplitudes in y are those of d divided by |z_i - 1|. A constant
// is no motion (it neither grows nor decays: an airplane with a neutral altitude root settles
// at a neighbouring trim), so it never counts.
double growth_rate_about_offset(const std::vector<double>& y, double dt, int max_order = 8, double min_share = 0.02);

// Logarithmic decrement damping ratio from successive peaks of an oscillation about its final
// value (common practice: zeta = d / sqrt(4 pi^2 + d^2), d = ln(x_k / x_{k+1})); NaN when fewer
// than two peaks.
double log_decrement_damping(const std::vector<double>& t, const std::vector<double>& y, double t_from);

}  // namespace fp
