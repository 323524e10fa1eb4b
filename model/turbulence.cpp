// turbulence.cpp — spectra, shaping filters, exact sampling, intensities (see turbulence.hpp).
#include "turbulence.hpp"

#include <algorithm>
#include <cmath>
#include <complex>
#include <numbers>

#include <Eigen/Dense>
#include <unsupported/Eigen/MatrixFunctions>

#include "units.hpp"

namespace fp {

namespace {

constexpr double pi = std::numbers::pi;
constexpr double vk = 1.339;  // von Karman's constant in the published spectra

}  // namespace

double spectrum_u(TurbulenceModel m, double sigma, double L, double Omega) {
  const double s2 = sigma * sigma, x = L * Omega;
  if (m == TurbulenceModel::dryden) return s2 * (2.0 * L / pi) / (1.0 + x * x);
  return s2 * (2.0 * L / pi) / std::pow(1.0 + (vk * x) * (vk * x), 5.0 / 6.0);
}

double spectrum_w(TurbulenceModel m, double sigma, double L, double Omega) {
  const double s2 = sigma * sigma, x = L * Omega;
  if (m == TurbulenceModel::dryden) return s2 * (L / pi) * (1.0 + 3.0 * x * x) / ((1.0 + x * x) * (1.0 + x * x));
  const double y = (vk * x) * (vk * x);
  return s2 * (L / pi) * (1.0 + (8.0 / 3.0) * y) / std::pow(1.0 + y, 11.0 / 6.0);
}

// Dryden filters: MIL-F-8785C section 3.7 (the time-domain forms with s = V p). von Karman:
// rational approximations of the published spectra (from memory, as given in the project's
// brief; their variance is 3-4 % below sigma^2, see the tests).
ShapingFilter shaping_filter_u(TurbulenceModel m, double sigma, double L) {
  ShapingFilter f;
  f.gain = sigma * std::sqrt(2.0 * L / pi);
  f.L = L;
  if (m == TurbulenceModel::dryden) {
    f.num = {1.0};
    f.den = {1.0, 1.0};
  } else {
    f.num = {1.0, 0.25};
    f.den = {1.0, 1.357, 0.1987};
  }
  return f;
}

ShapingFilter shaping_filter_w(TurbulenceModel m, double sigma, double L) {
  ShapingFilter f;
  f.gain = sigma * std::sqrt(L / pi);
  f.L = L;
  if (m == TurbulenceModel::dryden) {
    f.num = {1.0, std::sqrt(3.0)};
    f.den = {1.0, 2.0, 1.0};  // (1 + L p)^2
  } else {
    f.num = {1.0, 2.7478, 0.3398};
    f.den = {1.0, 2.9958, 1.9754, 0.1539};
  }
  return f;
}

double filter_spectrum(const ShapingFilter& f, double Omega) {
  const std::complex<double> z(0.0, f.L * Omega);
  std::complex<double> n = 0.0, d = 0.0, zk = 1.0;
  for (std::size_t k = 0; k < std::max(f.num.size(), f.den.size()); ++k) {
    if (k < f.num.size()) n += f.num[k] * zk;
    if (k < f.den.size()) d += f.den[k] * zk;
    zk *= z;
  }
  return std::norm(f.gain * n / d);
}

namespace {

// Controllable canonical realisation in distance X of H(p) = gain N(Lp)/D(Lp).
struct Realisation {
  Eigen::MatrixXd A;
  Eigen::VectorXd B, C;
};

Realisation realise(const ShapingFilter& f) {
  const int n = static_cast<int>(f.den.size()) - 1;
  Realisation r;
  r.A = Eigen::MatrixXd::Zero(n, n);
  r.B = Eigen::VectorXd::Zero(n);
  r.C = Eigen::VectorXd::Zero(n);
  // polynomials in p: coefficient k multiplied by L^k; monic denominator
  std::vector<double> a(static_cast<std::size_t>(n) + 1), b(static_cast<std::size_t>(n), 0.0);
  double Lk = 1.0;
  for (int k = 0; k <= n; ++k) {
    a[static_cast<std::size_t>(k)] = f.den[static_cast<std::size_t>(k)] * Lk;
    if (k < n && static_cast<std::size_t>(k) < f.num.size()) b[static_cast<std::size_t>(k)] = f.num[static_cast<std::size_t>(k)] * Lk;
    Lk *= f.L;
  }
  const double an = a[static_cast<std::size_t>(n)];
  for (int i = 0; i + 1 < n; ++i) r.A(i, i + 1) = 1.0;
  for (int k = 0; k < n; ++k) {
    r.A(n - 1, k) = -a[static_cast<std::size_t>(k)] / an;
    r.C(k) = f.gain * b[static_cast<std::size_t>(k)] / an;
  }
  r.B(n - 1) = 1.0;
  return r;
}

// Stationary covariance: A P + P A^T + pi B B^T = 0, solved through the Kronecker form.
Eigen::MatrixXd stationary_covariance(const Realisation& r) {
  const int n = static_cast<int>(r.A.rows());
  const Eigen::MatrixXd I = Eigen::MatrixXd::Identity(n, n);
  Eigen::MatrixXd K = Eigen::MatrixXd::Zero(n * n, n * n);
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) {
      // vec(A P) = (I kron A) vec(P); vec(P A^T) = (A kron I) vec(P)
      K.block(i * n, j * n, n, n) += I(i, j) * r.A;
      K.block(i * n, j * n, n, n) += r.A(i, j) * I;
    }
  const Eigen::MatrixXd Q = pi * r.B * r.B.transpose();
  const Eigen::VectorXd q = Eigen::Map<const Eigen::VectorXd>(Q.data(), n * n);
  const Eigen::VectorXd p = K.fullPivLu().solve(-q);
  Eigen::MatrixXd P = Eigen::Map<const Eigen::MatrixXd>(p.data(), n, n);
  return 0.5 * (P + P.transpose());
}

// A factor F with F F^T = M for a symmetric positive semi-definite M (eigenvalues below zero
// from rounding are set to zero).
Eigen::MatrixXd psd_factor(const Eigen::MatrixXd& M) {
  Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> es(0.5 * (M + M.transpose()));
  Eigen::VectorXd ev = es.eigenvalues().cwiseMax(0.0).cwiseSqrt();
  return es.eigenvectors() * ev.asDiagonal();
}

}  // namespace

double filter_variance(const ShapingFilter& f) {
  const Realisation r = realise(f);
  const Eigen::MatrixXd P = stationary_covariance(r);
  return r.C.dot(P * r.C);
}

SampledFilter sample_filter(const ShapingFilter& f, double dx) {
  const Realisation r = realise(f);
  const Eigen::MatrixXd P = stationary_covariance(r);
  const Eigen::MatrixXd Ad = (r.A * dx).exp();
  const Eigen::MatrixXd Qd = P - Ad * P * Ad.transpose();
  const Eigen::MatrixXd F = psd_factor(Qd), F0 = psd_factor(P);
  SampledFilter s;
  s.n = static_cast<int>(r.A.rows());
  for (int i = 0; i < s.n; ++i) {
    s.C[i] = r.C(i);
    for (int j = 0; j < s.n; ++j) {
      s.Ad[i][j] = Ad(i, j);
      s.F[i][j] = F(i, j);
      s.P0[i][j] = F0(i, j);
    }
  }
  return s;
}

std::vector<double> generate_samples(const ShapingFilter& f, double dx, std::size_t count, SeededRng& rng) {
  const SampledFilter s = sample_filter(f, dx);
  const int n = s.n;
  double x[3] = {0, 0, 0}, z[3], xn[3];
  for (int i = 0; i < n; ++i) z[i] = rng.normal();
  for (int i = 0; i < n; ++i) {
    x[i] = 0.0;
    for (int j = 0; j < n; ++j) x[i] += s.P0[i][j] * z[j];
  }
  std::vector<double> y(count);
  for (std::size_t k = 0; k < count; ++k) {
    double v = 0.0;
    for (int i = 0; i < n; ++i) v += s.C[i] * x[i];
    y[k] = v;
    for (int i = 0; i < n; ++i) z[i] = rng.normal();
    for (int i = 0; i < n; ++i) {
      double a = 0.0;
      for (int j = 0; j < n; ++j) a += s.Ad[i][j] * x[j] + s.F[i][j] * z[j];
      xn[i] = a;
    }
    for (int i = 0; i < n; ++i) x[i] = xn[i];
  }
  return y;
}

std::shared_ptr<TurbulenceRecord> make_turbulence_record(const TurbulenceSpec& s) {
  auto r = std::make_shared<TurbulenceRecord>();
  r->x0 = s.x0;
  r->dx = s.dx;
  r->interpolation = s.interpolation;
  const auto count = static_cast<std::size_t>(std::ceil(s.length / s.dx)) + 2;
  // one stream per component, so that leaving one out does not change the other
  if (s.sigma_w > 0.0) {
    SeededRng rng(s.seed, 1);
    r->w = generate_samples(shaping_filter_w(s.model, s.sigma_w, s.L_w), s.dx, count, rng);
  }
  if (s.sigma_u > 0.0) {
    SeededRng rng(s.seed, 2);
    r->u = generate_samples(shaping_filter_u(s.model, s.sigma_u, s.L_u), s.dx, count, rng);
  }
  // zero before x_start, a half-cosine rise over `fade`
  auto shape = [&](double X) {
    if (X < s.x_start) return 0.0;
    if (s.fade <= 0.0 || X >= s.x_start + s.fade) return 1.0;
    return 0.5 * (1.0 - std::cos(pi * (X - s.x_start) / s.fade));
  };
  for (std::size_t i = 0; i < count; ++i) {
    const double k = shape(s.x0 + static_cast<double>(i) * s.dx);
    if (k == 1.0) continue;
    if (!r->w.empty()) r->w[i] *= k;
    if (!r->u.empty()) r->u[i] *= k;
  }
  if (r->interpolation == Interpolation::cubic_spline) r->prepare_spline();
  return r;
}

// ---------------------------------------------------------------------------------------------
// Intensities and scale lengths, MIL-F-8785C section 3.7 (also MIL-HDBK-1797):
//  * low altitude, h < 1000 ft: L_w = h, L_u = h / (0.177 + 0.000823 h)^1.2 (h in ft);
//    sigma_w = 0.1 W20, sigma_u = sigma_w / (0.177 + 0.000823 h)^0.4; W20 (wind at 20 ft) =
//    15 kt light, 30 kt moderate, 45 kt severe. The formulas are used from 10 ft up.
//  * medium/high altitude, h > 2000 ft: L = 1750 ft (Dryden), 2500 ft (von Karman), all
//    components; sigma_u = sigma_w from the table of intensity against altitude and
//    probability of exceedance below, linear in altitude between its columns, held beyond
//    45000 ft.
//  * 1000-2000 ft: linear interpolation in height between the two (common practice).
// Severity to probability (light 1e-2, moderate 1e-3, severe 1e-5) is from memory; between
// the three tabulated probabilities, sigma (and W20) are interpolated linearly in log10(P):
// this project's choice, stated in the docs.

namespace {

constexpr double table_alt_ft[] = {500, 1750, 3750, 7500, 15000, 25000, 35000, 45000};
constexpr double table_sigma_fps[3][8] = {
    {6.6, 6.9, 7.4, 6.7, 4.6, 2.7, 0.4, 0.0},         // P = 1e-2 (light)
    {8.6, 9.6, 10.6, 10.1, 8.0, 6.6, 5.0, 4.2},       // P = 1e-3 (moderate)
    {15.6, 17.6, 23.0, 23.6, 22.1, 20.0, 16.0, 15.1}  // P = 1e-5 (severe)
};
constexpr double w20_kt[3] = {15.0, 30.0, 45.0};

// Rows and weight for log10(P) (clamped to the tabulated -5..-2): value = row i0 + a (row i1 - row i0).
void row_weights(double probability, int& i0, int& i1, double& a) {
  const double lp = std::clamp(std::log10(probability), -5.0, -2.0);
  if (lp >= -3.0) {
    i0 = 0;
    i1 = 1;
    a = (-2.0 - lp) / 1.0;
  } else {
    i0 = 1;
    i1 = 2;
    a = (-3.0 - lp) / 2.0;
  }
}

double interp_row(const double* row, double h_ft) {
  const auto n = std::size(table_alt_ft);
  if (h_ft <= table_alt_ft[0]) return row[0];
  if (h_ft >= table_alt_ft[n - 1]) return row[n - 1];
  std::size_t i = 0;
  while (h_ft > table_alt_ft[i + 1]) ++i;
  const double t = (h_ft - table_alt_ft[i]) / (table_alt_ft[i + 1] - table_alt_ft[i]);
  return row[i] + t * (row[i + 1] - row[i]);
}

TurbulenceLevels low_altitude(double h_ft, double w20_fps) {
  const double k = 0.177 + 0.000823 * h_ft;
  TurbulenceLevels l;
  l.L_w = h_ft * units::ft;
  l.L_u = h_ft / std::pow(k, 1.2) * units::ft;
  l.sigma_w = 0.1 * w20_fps * units::ft;
  l.sigma_u = l.sigma_w / std::pow(k, 0.4);
  l.band = "low altitude";
  return l;
}

TurbulenceLevels medium_high(TurbulenceModel m, double h_ft, double probability) {
  int i0, i1;
  double a;
  row_weights(probability, i0, i1, a);
  const double s0 = interp_row(table_sigma_fps[i0], h_ft), s1 = interp_row(table_sigma_fps[i1], h_ft);
  TurbulenceLevels l;
  l.sigma_u = l.sigma_w = (s0 + a * (s1 - s0)) * units::ft;
  l.L_u = l.L_w = (m == TurbulenceModel::dryden ? 1750.0 : 2500.0) * units::ft;
  l.band = "medium/high altitude";
  return l;
}

}  // namespace

double severity_probability(Severity s) {
  switch (s) {
    case Severity::light: return 1e-2;
    case Severity::moderate: return 1e-3;
    case Severity::severe: return 1e-5;
  }
  return 1e-3;
}

TurbulenceLevels turbulence_levels(TurbulenceModel m, double height, double probability) {
  const double h_ft = std::clamp(height / units::ft, 10.0, 45000.0);
  int i0, i1;
  double a;
  row_weights(probability, i0, i1, a);
  const double w20 = (w20_kt[i0] + a * (w20_kt[i1] - w20_kt[i0])) * units::kt / units::ft;  // [ft/s]
  if (h_ft <= 1000.0) return low_altitude(h_ft, w20);
  if (h_ft >= 2000.0) return medium_high(m, h_ft, probability);
  const TurbulenceLevels lo = low_altitude(1000.0, w20), hi = medium_high(m, 2000.0, probability);
  const double t = (h_ft - 1000.0) / 1000.0;
  TurbulenceLevels l;
  l.sigma_u = lo.sigma_u + t * (hi.sigma_u - lo.sigma_u);
  l.sigma_w = lo.sigma_w + t * (hi.sigma_w - lo.sigma_w);
  l.L_u = lo.L_u + t * (hi.L_u - lo.L_u);
  l.L_w = lo.L_w + t * (hi.L_w - lo.L_w);
  l.band = "blend 1000-2000 ft";
  return l;
}

}  // namespace fp
