// signal.cpp — matrix pencil and log decrement (see signal.hpp).
#include "analysis/signal.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

#include <Eigen/Dense>
#include <Eigen/Eigenvalues>

namespace fp {

std::vector<PencilMode> matrix_pencil(const std::vector<double>& y, double dt, int max_order, double rel_tol) {
  std::vector<PencilMode> out;
  const auto N = static_cast<Eigen::Index>(y.size());
  if (N < 8) return out;
  const Eigen::Index L = N / 3;
  Eigen::MatrixXd Y(N - L, L + 1);
  for (Eigen::Index i = 0; i < N - L; ++i)
    for (Eigen::Index j = 0; j <= L; ++j) Y(i, j) = y[static_cast<std::size_t>(i + j)];
  Eigen::BDCSVD<Eigen::MatrixXd> svd(Y, Eigen::ComputeThinV);
  const auto& sv = svd.singularValues();
  if (sv.size() == 0 || sv(0) <= 0.0) return out;
  Eigen::Index M = 0;
  while (M < sv.size() && M < max_order && sv(M) > rel_tol * sv(0)) ++M;
  if (M == 0) return out;
  const Eigen::MatrixXd Vp = svd.matrixV().leftCols(M);
  const Eigen::MatrixXd V1 = Vp.topRows(L);
  const Eigen::MatrixXd V2 = Vp.bottomRows(L);
  const Eigen::MatrixXd P = V1.completeOrthogonalDecomposition().pseudoInverse() * V2;
  Eigen::EigenSolver<Eigen::MatrixXd> es(P, false);
  const auto z = es.eigenvalues();
  // amplitudes by least squares on the samples
  Eigen::MatrixXcd Z(N, M);
  for (Eigen::Index i = 0; i < M; ++i) {
    std::complex<double> p = 1.0;
    for (Eigen::Index k = 0; k < N; ++k) {
      Z(k, i) = p;
      p *= z(i);
    }
  }
  Eigen::VectorXcd yc(N);
  for (Eigen::Index k = 0; k < N; ++k) yc(k) = y[static_cast<std::size_t>(k)];
  const Eigen::VectorXcd a = Z.colPivHouseholderQr().solve(yc);
  for (Eigen::Index i = 0; i < M; ++i) {
    if (std::abs(z(i)) == 0.0) continue;
    out.push_back({std::log(z(i)) / dt, std::abs(a(i))});
  }
  std::sort(out.begin(), out.end(), [](const PencilMode& p, const PencilMode& q) { return p.s.real() > q.s.real(); });
  return out;
}

double growth_rate(const std::vector<double>& y, double dt, int max_order, double min_share) {
  const auto modes = matrix_pencil(y, dt, max_order);
  double amax = 0.0;
  for (const auto& m : modes) amax = std::max(amax, m.amplitude);
  if (amax <= 0.0) return std::numeric_limits<double>::quiet_NaN();
  for (const auto& m : modes)
    if (m.amplitude >= min_share * amax) return m.s.real();
  return std::numeric_limits<double>::quiet_NaN();
}

double growth_rate_about_offset(const std::vector<double>& y, double dt, int max_order, double min_share) {
  if (y.size() < 3) return std::numeric_limits<double>::quiet_NaN();
  std::vector<double> d(y.size() - 1);
  for (std::size_t k = 0; k + 1 < y.size(); ++k) d[k] = y[k + 1] - y[k];
  auto modes = matrix_pencil(d, dt, max_order);
  double amax = 0.0;
  for (auto& m : modes) {
    const double zm1 = std::abs(std::exp(m.s * dt) - 1.0);
    m.amplitude = zm1 > 0 ? m.amplitude / zm1 : 0.0;
    amax = std::max(amax, m.amplitude);
  }
  if (amax <= 0.0) return std::numeric_limits<double>::quiet_NaN();
  for (const auto& m : modes)
    if (m.amplitude >= min_share * amax) return m.s.real();
  return std::numeric_limits<double>::quiet_NaN();
}

double log_decrement_damping(const std::vector<double>& t, const std::vector<double>& y, double t_from) {
  if (y.size() < 5) return std::numeric_limits<double>::quiet_NaN();
  const double yf = y.back();
  std::vector<double> peaks;
  for (std::size_t i = 1; i + 1 < y.size(); ++i) {
    if (t[i] < t_from) continue;
    const double a = std::abs(y[i - 1] - yf), b = std::abs(y[i] - yf), c = std::abs(y[i + 1] - yf);
    if (b > a && b >= c && b > 1e-12) peaks.push_back(b);
  }
  // successive extrema of |x| are half a period apart: d per half period, doubled
  if (peaks.size() < 2) return std::numeric_limits<double>::quiet_NaN();
  const double d = 2.0 * std::log(peaks[0] / peaks[1]);
  return d / std::sqrt(4.0 * std::numbers::pi * std::numbers::pi + d * d);
}

}  // namespace fp
