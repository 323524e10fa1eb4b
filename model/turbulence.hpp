// turbulence.hpp — continuous turbulence: spectra, shaping filters in the distance domain,
// intensities and scale lengths against height, and the seeded generation of a frozen record.
//
// Spectra (one-sided, spatial frequency Omega [rad/m], integral over 0..inf = sigma^2),
// MIL-F-8785C section 3.7 and MIL-HDBK-1797:
//   Dryden      Phi_u = sigma_u^2 (2 L_u/pi) / (1 + (L_u Omega)^2)
//               Phi_w = sigma_w^2 (L_w/pi) (1 + 3 (L_w Omega)^2) / (1 + (L_w Omega)^2)^2
//   von Karman  Phi_u = sigma_u^2 (2 L_u/pi) / (1 + (1.339 L_u Omega)^2)^(5/6)
//               Phi_w = sigma_w^2 (L_w/pi) (1 + 8/3 (1.339 L_w Omega)^2) / (1 + (1.339 L_w Omega)^2)^(11/6)
//
// Shaping filters, written in the distance domain (p = d/dX, so p = s/V of the time-domain
// filters): H(p) = sigma sqrt(k L / pi) N(L p) / D(L p), k = 2 for u and 1 for w. Driven by
// white noise of two-sided intensity pi per unit distance, the output's one-sided spectrum
// is |H(i Omega)|^2: with these gains the noise must have intensity pi, not 1 (a filter
// written without the 1/pi expects unit intensity). Dryden: exact; von Karman: the rational
// approximations below (their variance is 3-4 % below sigma^2).
//
// Generation: the filter is realised in state space (x' = A x + B n, y = C x, all filters
// here are strictly proper) and sampled EXACTLY at spacing dx: x_{k+1} = Ad x_k + e_k with
// Ad = exp(A dx) and e_k ~ N(0, Qd), Qd = P - Ad P Ad^T, where P is the stationary covariance
// (A P + P A^T + pi B B^T = 0). The samples therefore have exactly the covariance of the
// continuous process at their spacing, whatever dx (no Euler step, no 1/dt noise scaling),
// and the record starts in the stationary state (no transient). Standard result for sampling
// a linear system driven by white noise (e.g. Gelb, Applied Optimal Estimation, sec. 4.2,
// discrete equivalent of a continuous system).
//
// Random numbers: util/rng.hpp SeededRng (std::mt19937_64, whose sequence the C++ standard fixes, and a
// Box-Muller transform; std::normal_distribution is not specified bit for bit),
// one stream per component derived from the seed: the same seed gives the same record.
#pragma once

#include "util/rng.hpp"

#include <cstdint>
#include <memory>
#include <random>
#include <vector>

#include "gust.hpp"

namespace fp {

enum class TurbulenceModel { dryden, von_karman };

// One-sided spatial spectra as published [m^2/s^2 per rad/m].
double spectrum_u(TurbulenceModel m, double sigma, double L, double Omega);
double spectrum_w(TurbulenceModel m, double sigma, double L, double Omega);

// A rational shaping filter in the distance domain:
//   H(p) = gain * (sum num[k] (L p)^k) / (sum den[k] (L p)^k),  degree(num) < degree(den).
struct ShapingFilter {
  double gain = 0;           // sigma sqrt(k L / pi) [m/s * sqrt(m)]
  double L = 1;              // scale length [m]
  std::vector<double> num;   // ascending powers of (L p)
  std::vector<double> den;   // ascending powers of (L p), den[0] = 1
};

// The filter for the longitudinal (u) or vertical (w) component.
ShapingFilter shaping_filter_u(TurbulenceModel m, double sigma, double L);
ShapingFilter shaping_filter_w(TurbulenceModel m, double sigma, double L);

// |H(i Omega)|^2: the one-sided spectrum of the filter's output for noise of intensity pi.
double filter_spectrum(const ShapingFilter& f, double Omega);

// Stationary variance of the filter's output (C P C^T) [m^2/s^2].
double filter_variance(const ShapingFilter& f);

// The exactly sampled filter: state transition over dx and the factor of the noise covariance.
struct SampledFilter {
  int n = 0;                        // states (1..3)
  double Ad[3][3]{};                // exp(A dx)
  double F[3][3]{};                 // F F^T = Qd
  double P0[3][3]{};                // F0 F0^T = P (stationary start)
  double C[3]{};                    // output row
};
SampledFilter sample_filter(const ShapingFilter& f, double dx);

// Output samples y_0..y_{count-1} of the filter at spacing dx, from the stationary state.
std::vector<double> generate_samples(const ShapingFilter& f, double dx, std::size_t count, SeededRng& rng);

// What to generate for a run.
struct TurbulenceSpec {
  TurbulenceModel model = TurbulenceModel::dryden;
  double sigma_u = 0, sigma_w = 0;  // intensities [m/s] (0: that component is left out)
  double L_u = 1, L_w = 1;          // scale lengths [m]
  double x0 = 0;                    // distance of the first sample [m]
  double length = 0;                // distance covered by the record [m]
  double dx = 1;                    // sample spacing [m]
  double x_start = 0;               // the field is zero before this distance [m]
  double fade = 0;                  // and rises to full strength over this distance (half cosine) [m]
  std::uint64_t seed = 1;
  Interpolation interpolation = Interpolation::cubic_spline;
};

// The record: samples of u and w along X (each component its own stream of the seed).
std::shared_ptr<TurbulenceRecord> make_turbulence_record(const TurbulenceSpec& s);

// Intensities and scale lengths against height above ground and probability of exceedance
// (MIL-F-8785C section 3.7; see turbulence.cpp for the table and the bands).
struct TurbulenceLevels {
  double sigma_u = 0, sigma_w = 0;  // [m/s]
  double L_u = 0, L_w = 0;          // [m]
  const char* band = "";            // "low altitude", "blend 1000-2000 ft", "medium/high altitude"
};
// height [m] above ground (clamped to 10 ft .. 45000 ft), probability 1e-5..1e-2.
TurbulenceLevels turbulence_levels(TurbulenceModel m, double height, double probability);

// Probability of exceedance of a named severity: light 1e-2, moderate 1e-3, severe 1e-5.
enum class Severity { light, moderate, severe };
double severity_probability(Severity s);

}  // namespace fp
