// test_gusts.cpp — gusts and turbulence against published formulas, spectra and tables, and the
// held-versus-free numbers against their definitions. The source of each check is named beside
// it; the test airplanes (tests/support.hpp) are invented, their numbers are not what is checked.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <limits>
#include <memory>
#include <numbers>
#include <vector>

#include <unsupported/Eigen/FFT>

#include "model/atmosphere.hpp"
#include "model/design_gust.hpp"
#include "model/dynamics.hpp"
#include "model/trim.hpp"
#include "model/turbulence.hpp"
#include "model/units.hpp"
#include "analysis/gust_studies.hpp"
#include "output/outputs.hpp"
#include "analysis/response.hpp"
#include "run/run.hpp"
#include "scenario/scenario.hpp"
#include "analysis/signal.hpp"
#include "support.hpp"

using namespace fp;
using doctest::Approx;

namespace {

constexpr double pi = std::numbers::pi;

RunSettings settings(double duration, double step) {
  RunSettings r;
  r.duration = duration;
  r.output_step = step;
  r.rel_tol = 1e-10;
  r.abs_tol = 1e-11;
  return r;
}

// The test airplane with its pitch held fixed by a huge pitch inertia, no downwash (so the
// tail does not feel the wing's gust through the wake) and no lag: plunge only.
Airplane plunge_airplane() {
  Airplane a = test::plain_airplane();
  a.mass.pitch_inertia = 1e9;
  a.tail.deps_dalpha = 0.0;
  a.tail.lag = DownwashLag::none;
  return a;
}

struct Flown {
  std::shared_ptr<const Plant> plant;
  Trim trim;
  Trace trace;
};

Flown fly(const Airplane& a, const Condition& c, const GustField& g, Stick stick, double duration, double step) {
  Flown f;
  f.plant = std::make_shared<const Plant>(make_plant(a));
  f.trim = trim_free(*f.plant, c);
  Simulation sim(f.plant, g, f.trim, settings(duration, step), RunCase{stick, 0.0}, {});
  sim.run_to_end();
  f.trace = sim.trace();
  return f;
}

// Earth-X distance from the wing-body a.c. to the tail a.c. at attitude theta [m].
double wing_to_tail(const Plant& p, double theta) {
  return (p.rW_x - p.rT_x) * std::cos(theta) + (p.rW_z - p.rT_z) * std::sin(theta);
}

// Time at which y first rises through `level`, linearly interpolated on the grid.
double first_crossing(const std::vector<double>& t, const std::vector<double>& y, double level) {
  for (std::size_t i = 1; i < y.size(); ++i)
    if (y[i - 1] < level && y[i] >= level) return t[i - 1] + (level - y[i - 1]) / (y[i] - y[i - 1]) * (t[i] - t[i - 1]);
  return NAN;
}

// One-sided spatial PSD estimate by Welch's method (Welch, IEEE Trans. Audio Electroacoust.
// AU-15, 1967): Hann window, 50 % overlap, normalised so that its integral over 0..pi/dx is the
// variance: P(Omega_k) = (dx/pi) |sum w_n x_n e^{-i Omega_k n dx}|^2 / sum w_n^2.
std::vector<double> welch(const std::vector<double>& x, double dx, std::size_t nseg, std::vector<double>& Omega) {
  std::vector<double> w(nseg), acc(nseg / 2 + 1, 0.0);
  double w2 = 0.0;
  for (std::size_t n = 0; n < nseg; ++n) {
    w[n] = 0.5 * (1.0 - std::cos(2.0 * pi * static_cast<double>(n) / static_cast<double>(nseg)));
    w2 += w[n] * w[n];
  }
  Eigen::FFT<double> fft;
  std::vector<double> seg(nseg);
  std::vector<std::complex<double>> X;
  long count = 0;
  for (std::size_t s = 0; s + nseg <= x.size(); s += nseg / 2) {
    double mean = 0.0;
    for (std::size_t n = 0; n < nseg; ++n) mean += x[s + n];
    mean /= static_cast<double>(nseg);
    for (std::size_t n = 0; n < nseg; ++n) seg[n] = (x[s + n] - mean) * w[n];
    fft.fwd(X, seg);
    for (std::size_t k = 0; k < acc.size(); ++k) acc[k] += std::norm(X[k]);
    ++count;
  }
  Omega.resize(acc.size());
  for (std::size_t k = 0; k < acc.size(); ++k) {
    Omega[k] = 2.0 * pi * static_cast<double>(k) / (static_cast<double>(nseg) * dx);
    acc[k] *= dx / (pi * w2 * static_cast<double>(count));
  }
  return acc;
}

double variance(const std::vector<double>& x) {
  double m = 0.0, s = 0.0;
  for (double v : x) m += v;
  m /= static_cast<double>(x.size());
  for (double v : x) s += (v - m) * (v - m);
  return s / static_cast<double>(x.size());
}

// Integral of a one-sided spectrum over 0..inf: with x = L Omega = e^y, composite Simpson on
// y in [-25, 35] (the parts left out are below 1e-10 of the total for these spectra).
template <class F>
double integrate_spectrum(F phi, double L) {
  const int n = 60000;
  const double y0 = -25.0, y1 = 35.0, h = (y1 - y0) / n;
  double s = 0.0;
  for (int i = 0; i <= n; ++i) {
    const double Om = std::exp(y0 + i * h) / L;
    const double wgt = (i == 0 || i == n) ? 1.0 : (i % 2 ? 4.0 : 2.0);
    s += wgt * phi(Om) * Om;  // d Omega = Omega dy
  }
  return s * h / 3.0;
}

}  // namespace

// ---------------------------------------------------------------------------------------------
// The gust field

TEST_CASE("the tail meets the wing's gust one travel time later (frozen field)") {
  // Source: the frozen-field (Taylor) hypothesis on which the MIL-F-8785C section 3.7 turbulence
  // model and the discrete gusts of 14 CFR 23.341 / 25.341 rest: the field depends on position
  // along the path only, so the tail's signal is the wing's delayed by distance / speed. Checked to
  // the output grid's resolution.
  const Airplane a = test::plain_airplane();
  const Condition c = test::cruise(55.0, 1000.0);
  const double step = 0.005;
  SUBCASE("a 1-cosine gust: every crossing and the peak") {
    GustField g;
    g.gusts.push_back(DiscreteGust{GustShape::one_minus_cosine, GustComponent::vertical, 30.0, 15.0, 4.0});
    const Flown f = fly(a, c, g, Stick::held, 3.0, step);
    const auto& t = f.trace.ch[ch_time];
    // level flight: the ground speed along X is V cos(gamma) = V
    const double expected = wing_to_tail(*f.plant, f.trim.theta) / c.airspeed;
    for (double level : {0.5, 1.0, 2.0, 3.0, 3.9}) {
      CAPTURE(level);
      const double tw = first_crossing(t, f.trace.ch[ch_gust_w_wing], level);
      const double tt = first_crossing(t, f.trace.ch[ch_gust_w_tail], level);
      CHECK(std::abs((tt - tw) - expected) < step);
    }
    const Peak pw = peak_of(f.trace, ch_gust_w_wing), pt = peak_of(f.trace, ch_gust_w_tail);
    CHECK(pw.max == Approx(4.0).epsilon(1e-3));
    CHECK(pt.max == Approx(4.0).epsilon(1e-3));
    CHECK(std::abs((pt.time_of_max - pw.time_of_max) - expected) <= step + 1e-9);
  }
  SUBCASE("Dryden turbulence: the lag of the cross-correlation peak") {
    TurbulenceSpec sp;
    sp.sigma_u = 1.5;
    sp.sigma_w = 1.5;
    sp.L_u = sp.L_w = 60.0;
    sp.x0 = -50.0;
    sp.length = 1200.0;
    sp.dx = 0.5;
    sp.seed = 7;
    GustField g;
    g.turbulence = make_turbulence_record(sp);
    const Flown f = fly(a, c, g, Stick::held, 15.0, step);
    const double expected = wing_to_tail(*f.plant, f.trim.theta) / c.airspeed;
    for (auto [wing, tail] : {std::pair{ch_gust_w_wing, ch_gust_w_tail}, std::pair{ch_gust_u_wing, ch_gust_u_tail}}) {
      const auto& yw = f.trace.ch[wing];
      const auto& yt = f.trace.ch[tail];
      double best = -1e300;
      int best_lag = 0;
      for (int lag = 0; lag < 40; ++lag) {
        double s = 0.0;
        for (std::size_t i = 0; i + static_cast<std::size_t>(lag) < yw.size(); ++i) s += yw[i] * yt[i + static_cast<std::size_t>(lag)];
        if (s > best) {
          best = s;
          best_lag = lag;
        }
      }
      CHECK(std::abs(best_lag * step - expected) <= step);
    }
  }
}

TEST_CASE("a 1-cosine train is the sum of its gusts") {
  // Source: definition of the train (superposition of 1-cosine gusts of 14 CFR 25.341(a)(2) form).
  DiscreteGust tr{GustShape::train, GustComponent::vertical, 0.0, 10.0, 3.0, 4, 35.0};
  DiscreteGust one{GustShape::one_minus_cosine, GustComponent::vertical, 0.0, 10.0, 3.0};
  for (double spacing : {35.0, 12.0}) {  // apart, and overlapping
    tr.spacing = spacing;
    for (double s = -5.0; s < 200.0; s += 0.37) {
      double sum = 0.0;
      for (int k = 0; k < 4; ++k) sum += gust_shape_value(one, s - k * spacing);
      CHECK(gust_shape_value(tr, s) == Approx(sum).epsilon(1e-12));
    }
  }
}

TEST_CASE("a gust of zero velocity leaves the trimmed airplane exactly as without it") {
  // Source: a property of the model: the gust enters only through the air-relative velocity,
  // so a field that adds 0 m/s everywhere must give the same numbers, bit for bit, as no field.
  const Airplane a = test::plain_airplane();
  const Condition c = test::cruise();
  GustField zero;
  zero.gusts.push_back(DiscreteGust{GustShape::one_minus_cosine, GustComponent::vertical, 20.0, 15.0, 0.0});
  zero.gusts.push_back(DiscreteGust{GustShape::sharp_edge, GustComponent::horizontal, 40.0, 1.0, 0.0});
  auto rec = std::make_shared<TurbulenceRecord>();
  rec->x0 = -20.0;
  rec->dx = 1.0;
  rec->u.assign(2000, 0.0);
  rec->w.assign(2000, 0.0);
  rec->interpolation = Interpolation::cubic_spline;
  rec->prepare_spline();
  zero.turbulence = rec;
  for (Stick s : {Stick::held, Stick::free}) {
    CAPTURE(static_cast<int>(s));
    const Flown with = fly(a, c, zero, s, 10.0, 0.05);
    const Flown without = fly(a, c, GustField{}, s, 10.0, 0.05);
    REQUIRE(with.trace.size() == without.trace.size());
    for (std::size_t ch = 0; ch < ch_count; ++ch)
      for (std::size_t i = 0; i < with.trace.size(); ++i) REQUIRE(with.trace.ch[ch][i] == without.trace.ch[ch][i]);
    // and it stays trimmed (trim residual only)
    const auto& n = with.trace.ch[ch_load_factor];
    for (double v : n) CHECK(std::abs(v - n.front()) < 1e-6);
  }
}

// ---------------------------------------------------------------------------------------------
// Gust load factors

TEST_CASE("sharp-edged gust with pitch fixed: the quasi-steady load-factor increment") {
  // Source: quasi-steady sharp-edged gust formula delta n = rho V U a / (2 W/S), before the
  // airplane has moved (e.g. the basis of the gust load formula of 14 CFR 23.341 with K_g = 1).
  // Applied to each surface as it enters the gust (the tail l/V after the wing), with a the
  // surface's own lift slope referred to the wing area; the two add to the airplane's slope
  // a = a_wb + eta a_t S_t / S (no downwash). Pitch held fixed by a huge pitch inertia; within 2 %.
  const Airplane a = plunge_airplane();
  const Condition c = test::cruise(55.0, 1000.0);
  const double U = 2.0;
  GustField g;
  g.gusts.push_back(DiscreteGust{GustShape::sharp_edge, GustComponent::vertical, 8.0, 1.0, U});
  const Flown f = fly(a, c, g, Stick::held, 0.3, 0.0005);
  const double rho = isa_at(geopotential_altitude(c.altitude)).density;
  const double ws = a.mass.mass * units::g0 / a.wing.area;
  const double a_wb = a.wing.lift.slope;
  const double a_t = a.tail.eta * a.tail.lift.slope * a.tail.area / a.wing.area;
  const auto& n = f.trace.ch[ch_load_factor];
  auto jump_at = [&](std::size_t ch) {
    const auto& gs = f.trace.ch[ch];
    for (std::size_t i = 1; i < gs.size(); ++i)
      if (gs[i] > 0.5 * U && gs[i - 1] < 0.5 * U) return n[i] - n[i - 1];
    return std::numeric_limits<double>::quiet_NaN();
  };
  const double dn_wing = jump_at(ch_gust_w_wing), dn_tail = jump_at(ch_gust_w_tail);
  // the formula written out here (not the program's function, which is checked against it below)
  auto formula = [&](double slope) { return rho * c.airspeed * U * slope / (2.0 * ws); };
  const double f_wing = formula(a_wb), f_tail = formula(a_t);
  MESSAGE("sharp edge: wing " << dn_wing << " (formula " << f_wing << "), tail " << dn_tail << " (formula " << f_tail
                              << "), sum " << dn_wing + dn_tail << " (formula with a = " << a_wb + a_t << ": "
                              << formula(a_wb + a_t) << ")");
  // 2 %: the jump is read between two output samples 0.5 ms apart, in which the airplane already
  // plunges (its normal acceleration decays with time constant 2m/(rho V S a) ~ 0.4 s: 0.1 %) and
  // the gust's change of the airspeed, sqrt(V^2 + U^2) - V, is second order (U^2/2V^2 ~ 0.07 %)
  CHECK(dn_wing == Approx(f_wing).epsilon(0.02));
  CHECK(dn_tail == Approx(f_tail).epsilon(0.02));
  CHECK(dn_wing + dn_tail == Approx(formula(a_wb + a_t)).epsilon(0.02));
  CHECK(sharp_edged_gust_load(ws, a_wb, rho, c.airspeed, U) == Approx(f_wing).epsilon(1e-12));  // the rule estimate's function
}

TEST_CASE("1-cosine gust, plunge only: against the quasi-steady plunge equation and the K_g rule") {
  // Sources: (1) the quasi-steady plunge equation, derived here [D] from the lift-curve slopes:
  //     m dv/dt = (rho V / 2) [S a_wb (U(x_w) - v) + eta S_t a_t (U(x_t) - v)],  delta n = m dv/dt / (m g),
  // the wing and the tail each meeting the gust at its own position, integrated independently
  // below (classical RK4); the simulation must agree within 2 %.
  // (2) 14 CFR 23.341(c) (before amdt 64) / CS 23.341: delta n = K_g rho0 V_e a U_de / (2 W/S) with
  // K_g = 0.88 mu_g / (5.3 + mu_g), for a 1-cosine gust 25 chords long (H = 12.5 c; from memory).
  // They differ by design: K_g (Pratt and Walker, NACA Report 1206) also stands for the lag of
  // unsteady lift (Kussner and Wagner functions), which a quasi-steady model leaves out, so the
  // simulation lies ABOVE the rule: 8.5 % for mu_g near 16 by the plunge equation alone
  // (computed for this test with SciPy solve_ivp), the tail's later entry changing it a little.
  const Airplane a = plunge_airplane();
  const Condition c = test::cruise(55.0, 1000.0);
  const double H = 12.5 * a.wing.mac, U = 3.0, start = 20.0;
  GustField g;
  g.gusts.push_back(DiscreteGust{GustShape::one_minus_cosine, GustComponent::vertical, start, H, U});
  const Flown f = fly(a, c, g, Stick::held, 3.0, 0.002);
  double peak = 0.0;
  for (double v : f.trace.ch[ch_load_factor]) peak = std::max(peak, v - f.trace.ch[ch_load_factor].front());

  // (1) the plunge equation
  const Plant& p = *f.plant;
  const double rho = isa_at(geopotential_altitude(c.altitude)).density, V = c.airspeed, m = a.mass.mass;
  const double kw = 0.5 * rho * V * a.wing.area * a.wing.lift.slope;
  const double kt = 0.5 * rho * V * a.tail.eta * a.tail.area * a.tail.lift.slope;
  const double xw0 = p.rW_x, xt0 = p.rT_x;  // at t = 0, theta small
  const DiscreteGust gg = g.gusts[0];
  auto accel = [&](double t, double v) {
    return (kw * (gust_shape_value(gg, xw0 + V * t - start) - v) + kt * (gust_shape_value(gg, xt0 + V * t - start) - v)) / m;
  };
  double v = 0.0, qs_peak = 0.0;
  const double h = 1e-4;
  for (double t = 0.0; t < 3.0; t += h) {
    const double k1 = accel(t, v), k2 = accel(t + h / 2, v + h / 2 * k1), k3 = accel(t + h / 2, v + h / 2 * k2),
                 k4 = accel(t + h, v + h * k3);
    v += h / 6 * (k1 + 2 * k2 + 2 * k3 + k4);
    qs_peak = std::max(qs_peak, accel(t + h, v) / units::g0);
  }
  CHECK(peak == Approx(qs_peak).epsilon(0.02));

  // (2) the rule
  const double ws = m * units::g0 / a.wing.area;
  const double a_plane = a.wing.lift.slope + a.tail.eta * a.tail.lift.slope * a.tail.area / a.wing.area;
  const double V_e = V * std::sqrt(rho / isa::rho0), U_e = U * std::sqrt(rho / isa::rho0);
  const GustLoadEstimate e = derived_gust_load(ws, a.wing.mac, a_plane, rho, V_e, U_e);
  const double ratio = peak / e.delta_n;
  MESSAGE("1-cosine H = 12.5 c, plunge only: simulated " << peak << ", quasi-steady plunge equation " << qs_peak
                                                         << ", rule (mu_g " << e.mu_g << ", K_g " << e.K_g << ") "
                                                         << e.delta_n << ": simulated/rule = " << ratio);
  CHECK(ratio > 1.0);   // above the rule: no unsteady-lift lag in a quasi-steady model
  CHECK(ratio < 1.15);  // but by no more than the plunge equation's 8.5 % and the tail's share
}

TEST_CASE("the light-airplane gust rule: the worked numbers") {
  // Source: 14 CFR 23.341(c) before amendment 23-64 / CS 23.341 (amendment 4) formula; worked
  // numbers derived from it (project brief, checks section 3): W/S 17 psf, c 4.9 ft, a 4.8/rad,
  // sea level, 140 kt EAS, U_de 50 ft/s give mu_g 18.90, K_g 0.6873, delta n 2.728.
  // The 2.728 is the rule's imperial form n = 1 + K_g U_de V a / (498 W/S) (V in kt, U in ft/s,
  // W/S in psf; the 498 from memory), whose constant is rounded: the exact rho0/2 of the SI form
  // used here gives 2.7248, 0.1 % lower. Both are checked.
  const GustLoadEstimate e = derived_gust_load(17.0 * units::psf, 4.9 * units::ft, 4.8, isa::rho0,
                                               140.0 * units::kt, 50.0 * units::ft);
  CHECK(std::abs(e.mu_g - 18.90) < 0.005);
  CHECK(std::abs(e.K_g - 0.6873) < 0.00005);
  CHECK(std::abs(e.K_g * 50.0 * 140.0 * 4.8 / (498.0 * 17.0) - 2.728) < 0.0005);  // the imperial form
  CHECK(e.delta_n == Approx(2.728).epsilon(0.0015));                             // ours, within its rounding
  // the exact constant: 2 / (rho0 [slug/ft3] * 1.68781 [ft/s per kt]) = 498.5
  const double rho0_slug_ft3 = isa::rho0 / (units::slug / std::pow(units::ft, 3));
  const double exact_498 = 2.0 / (rho0_slug_ft3 * (units::kt / units::ft));
  CHECK(exact_498 == Approx(498.5).epsilon(1e-4));
  CHECK(e.delta_n == Approx(e.K_g * 50.0 * 140.0 * 4.8 / (exact_498 * 17.0)).epsilon(1e-12));
  // U_de of 23.333(c): 50 ft/s at V_C, 25 ft/s at V_D, sea level to 20000 ft
  CHECK(derived_gust_velocity(false, 0.0) == Approx(15.24));
  CHECK(derived_gust_velocity(true, 6000.0) == Approx(7.62));
  CHECK(std::isnan(derived_gust_velocity(false, 20001.0 * units::ft)));
  // equivalent to true airspeed: U_true = U_e sqrt(rho0/rho) (definition of EAS)
  CHECK(eas_to_tas(10.0, isa::rho0 / 4.0) == Approx(20.0));
}

TEST_CASE("gradient-distance family: (H/350 ft)^(1/6)") {
  // Source: 14 CFR 25.341(a) form U_ds = U_ref F_g (H/350)^(1/6) (formula from memory, H range
  // 30-350 ft published); values derived in the project brief (checks section 3).
  const double H[] = {30, 60, 100, 200, 350}, f[] = {0.664, 0.745, 0.812, 0.911, 1.0};
  for (int i = 0; i < 5; ++i) CHECK(std::abs(gradient_distance_factor(H[i] * units::ft) - f[i]) < 0.0005);
  // U_ref 56 ft/s EAS at sea level, 44 ft/s at 15000 ft (from memory), linear between
  CHECK(gradient_reference_velocity(0.0) / units::ft == Approx(56.0));
  CHECK(gradient_reference_velocity(7500.0 * units::ft) / units::ft == Approx(50.0));
  CHECK(std::isnan(gradient_reference_velocity(16000.0 * units::ft)));
}

// ---------------------------------------------------------------------------------------------
// Continuous turbulence

TEST_CASE("turbulence spectra: normalisation and the shaping filters") {
  // Source: MIL-F-8785C section 3.7 spectra; with this normalisation the one-sided integral is
  // sigma^2 (derived in the project brief, checks section 2). Dryden filters (MIL-F-8785C) reproduce
  // their spectrum exactly for white noise of intensity pi: |H|^2 = Phi, and the filter's
  // stationary variance is sigma^2 (a filter without the 1/pi in its gain would give sigma^2/pi).
  const double sigma = 2.0;
  for (double L : {30.0, 533.4}) {
    CAPTURE(L);
    for (auto m : {TurbulenceModel::dryden, TurbulenceModel::von_karman}) {
      CHECK(integrate_spectrum([&](double O) { return spectrum_u(m, sigma, L, O); }, L) == Approx(4.0).epsilon(2e-4));
      CHECK(integrate_spectrum([&](double O) { return spectrum_w(m, sigma, L, O); }, L) == Approx(4.0).epsilon(2e-4));
    }
    const auto fu = shaping_filter_u(TurbulenceModel::dryden, sigma, L);
    const auto fw = shaping_filter_w(TurbulenceModel::dryden, sigma, L);
    for (double OL : {0.0, 0.01, 0.3, 1.0, 3.0, 30.0}) {
      const double O = OL / L;
      CHECK(filter_spectrum(fu, O) == Approx(spectrum_u(TurbulenceModel::dryden, sigma, L, O)).epsilon(1e-12));
      CHECK(filter_spectrum(fw, O) == Approx(spectrum_w(TurbulenceModel::dryden, sigma, L, O)).epsilon(1e-12));
    }
    CHECK(filter_variance(fu) == Approx(sigma * sigma).epsilon(1e-9));
    CHECK(filter_variance(fw) == Approx(sigma * sigma).epsilon(1e-9));
  }
}

TEST_CASE("von Karman rational approximations: variance 3-4 % low, shape close up to Omega L = 10") {
  // Source: the approximating filters and the statement "variance 3-4 % low" of the project brief
  // (checks section 2; the filter coefficients from memory); the spectra of MIL-F-8785C 3.7.
  // Measured here: u 3.1 %, w 3.8 % low. The brief also says "shape within 1-2 % up to
  // Omega L = 10"; that is NOT what these coefficients give: w is 4.4 % low at Omega L = 5 and
  // u 2.8 % low at 2, so the shape check below is 5 %.
  const double sigma = 1.0, L = 762.0;
  const auto fu = shaping_filter_u(TurbulenceModel::von_karman, sigma, L);
  const auto fw = shaping_filter_w(TurbulenceModel::von_karman, sigma, L);
  const double vu = filter_variance(fu), vw = filter_variance(fw);
  MESSAGE("von Karman approximation variances: u " << vu << ", w " << vw);
  CHECK(vu > 0.96);
  CHECK(vu < 0.97);
  CHECK(vw > 0.96);
  CHECK(vw < 0.97);
  for (double OL = 0.0; OL <= 10.0; OL += 0.05) {
    const double O = OL / L;
    CHECK(filter_spectrum(fu, O) == Approx(spectrum_u(TurbulenceModel::von_karman, sigma, L, O)).epsilon(0.05));
    CHECK(filter_spectrum(fw, O) == Approx(spectrum_w(TurbulenceModel::von_karman, sigma, L, O)).epsilon(0.05));
  }
}

TEST_CASE("Dryden record: Welch spectrum, variance, reproducibility") {
  // Sources: the Dryden spectra of MIL-F-8785C 3.7 (the published Phi, not our filter) over the
  // band 0.5 <= Omega L <= 10, estimated by Welch's method; the variance sigma^2 (the oracle of
  // the 1/pi trap, checks section 2). Statistical tolerances: 2^20 samples at dx = L/20 hold
  // about 52000 scale lengths, so the sample variance has a relative standard deviation of
  // about sqrt(2 L / (N dx)) = 0.6 %: 3 % is 5 of them. Welch with 1024-sample segments averages
  // about 2000 segments, about 2.3 % per frequency bin; over each of the bands below (5 to 30
  // bins) 6 % is 4 to 6 standard deviations, and the Hann window's smoothing and the aliasing at
  // Omega L = 10 add under 1 %.
  const double sigma = 1.7, L = 300.0, dx = L / 20.0;
  const std::size_t N = std::size_t{1} << 20;
  for (auto comp : {0, 1}) {
    CAPTURE(comp);
    SeededRng rng(42, static_cast<std::uint64_t>(comp + 1));
    const auto f = comp == 0 ? shaping_filter_u(TurbulenceModel::dryden, sigma, L)
                             : shaping_filter_w(TurbulenceModel::dryden, sigma, L);
    const std::vector<double> x = generate_samples(f, dx, N, rng);
    CHECK(variance(x) == Approx(sigma * sigma).epsilon(0.03));
    std::vector<double> Om;
    const std::vector<double> P = welch(x, dx, 1024, Om);
    const double bands[][2] = {{0.5, 1.0}, {1.0, 2.0}, {2.0, 4.0}, {4.0, 10.0}};
    for (const auto& b : bands) {
      double est = 0.0, ref = 0.0;
      for (std::size_t k = 0; k < Om.size(); ++k) {
        const double OL = Om[k] * L;
        if (OL < b[0] || OL >= b[1]) continue;
        est += P[k];
        ref += comp == 0 ? spectrum_u(TurbulenceModel::dryden, sigma, L, Om[k])
                         : spectrum_w(TurbulenceModel::dryden, sigma, L, Om[k]);
      }
      CAPTURE(b[0]);
      CHECK(est / ref == Approx(1.0).epsilon(0.06));
    }
  }
  SUBCASE("same seed, same record; another seed, another") {
    // Source: the requirement itself (reproducible fields): bit-for-bit equality; an unrelated
    // seed gives an uncorrelated record (|correlation| below 4 / sqrt(effective samples)).
    TurbulenceSpec sp;
    sp.sigma_u = sp.sigma_w = 1.0;
    sp.L_u = sp.L_w = 50.0;
    sp.length = 50000.0;
    sp.dx = 1.0;
    sp.seed = 11;
    const auto a = make_turbulence_record(sp), b = make_turbulence_record(sp);
    CHECK(a->u == b->u);
    CHECK(a->w == b->w);
    CHECK(a->w2 == b->w2);
    sp.seed = 12;
    const auto c = make_turbulence_record(sp);
    double sab = 0.0, saa = 0.0, scc = 0.0;
    for (std::size_t i = 0; i < a->w.size(); ++i) {
      sab += a->w[i] * c->w[i];
      saa += a->w[i] * a->w[i];
      scc += c->w[i] * c->w[i];
    }
    CHECK(a->w != c->w);
    CHECK(std::abs(sab / std::sqrt(saa * scc)) < 4.0 / std::sqrt(50000.0 / 50.0 / 2.0));
    // leaving one component out does not change the other (one stream each)
    sp.seed = 11;
    sp.sigma_u = 0.0;
    const auto d = make_turbulence_record(sp);
    CHECK(d->u.empty());
    CHECK(d->w == a->w);
  }
}

TEST_CASE("turbulence intensities and scale lengths against height") {
  // Source: MIL-F-8785C section 3.7: low-altitude formulas (values at 100, 200, 500 ft derived in
  // the project brief, checks section 2: L_u 505.2, 725.8, 944.7 ft; sigma_u/sigma_w 1.716, 1.537,
  // 1.236), W20 = 15/30/45 kt; the intensity table against altitude and probability of
  // exceedance (moderate = 1e-3 from memory); the 1000-2000 ft linear blend is common practice.
  const double hs[] = {100, 200, 500}, Lu[] = {505.2, 725.8, 944.7}, ratio[] = {1.716, 1.537, 1.236};
  for (int i = 0; i < 3; ++i) {
    const auto l = turbulence_levels(TurbulenceModel::dryden, hs[i] * units::ft, 1e-3);
    CHECK(std::abs(l.L_u / units::ft - Lu[i]) < 0.1);
    CHECK(l.L_w / units::ft == Approx(hs[i]));
    CHECK(std::abs(l.sigma_u / l.sigma_w - ratio[i]) < 0.0005);
    CHECK(l.sigma_w == Approx(0.1 * 30.0 * units::kt));  // moderate: W20 = 30 kt
  }
  CHECK(turbulence_levels(TurbulenceModel::dryden, 200 * units::ft, 1e-2).sigma_w == Approx(1.5 * units::kt));
  CHECK(turbulence_levels(TurbulenceModel::dryden, 200 * units::ft, 1e-5).sigma_w == Approx(4.5 * units::kt));
  // medium/high altitude: the table, linear in altitude
  const auto m = turbulence_levels(TurbulenceModel::dryden, 7500 * units::ft, severity_probability(Severity::moderate));
  CHECK(m.sigma_w / units::ft == Approx(10.1));
  CHECK(m.sigma_u == m.sigma_w);
  CHECK(m.L_w / units::ft == Approx(1750.0));
  CHECK(turbulence_levels(TurbulenceModel::von_karman, 7500 * units::ft, 1e-3).L_u / units::ft == Approx(2500.0));
  CHECK(turbulence_levels(TurbulenceModel::dryden, 5625 * units::ft, 1e-3).sigma_w / units::ft == Approx(10.35));
  CHECK(turbulence_levels(TurbulenceModel::dryden, 25000 * units::ft, 1e-5).sigma_w / units::ft == Approx(20.0));
  CHECK(turbulence_levels(TurbulenceModel::dryden, 15000 * units::ft, 1e-2).sigma_w / units::ft == Approx(4.6));
  // the blend at 1500 ft: halfway between the low-altitude value at 1000 ft (sigma 0.1 W20,
  // L = 1000 ft) and the table at 2000 ft (9.6 + (10.6 - 9.6) 250/2000 ft/s, L = 1750 ft)
  const auto b = turbulence_levels(TurbulenceModel::dryden, 1500 * units::ft, 1e-3);
  const double lo = 0.1 * 30.0 * units::kt / units::ft, hi = 9.6 + 1.0 * 250.0 / 2000.0;
  CHECK(b.sigma_w / units::ft == Approx(0.5 * (lo + hi)));
  CHECK(b.L_w / units::ft == Approx(1375.0));
}

TEST_CASE("turbulence intensity against altitude: every entry of the published table") {
  // Source: MIL-F-8785C figure 7 (repeated in MIL-HDBK-1797), RMS turbulence intensity sigma
  // (ft/s) against altitude for the probabilities of exceedance 1e-2, 1e-3 and 1e-5, as its curves
  // are tabulated at 500 ... 45000 ft in several independent public reproductions that agree to
  // every digit (looked up with the search tool; the figure itself was not seen). Light, moderate
  // and severe = 1e-2, 1e-3, 1e-5 (from memory, as the key table says). Two-sided and exact to the
  // printed digit (1e-9 relative): any entry that differs, or a row taken for another, fails.
  const double alt_ft[] = {500, 1750, 3750, 7500, 15000, 25000, 35000, 45000};
  const double published[3][8] = {{6.6, 6.9, 7.4, 6.7, 4.6, 2.7, 0.4, 0.0},
                                  {8.6, 9.6, 10.6, 10.1, 8.0, 6.6, 5.0, 4.2},
                                  {15.6, 17.6, 23.0, 23.6, 22.1, 20.0, 16.0, 15.1}};
  const double prob[] = {1e-2, 1e-3, 1e-5};
  for (int r = 0; r < 3; ++r)
    for (int k = 0; k < 8; ++k) {
      if (alt_ft[k] < 2000.0) continue;  // below 2000 ft the low-altitude model and the blend apply
      CAPTURE(alt_ft[k]);
      CAPTURE(prob[r]);
      const auto l = turbulence_levels(TurbulenceModel::dryden, alt_ft[k] * units::ft, prob[r]);
      CHECK(l.sigma_w / units::ft == Approx(published[r][k]).epsilon(1e-9).scale(1.0));
      CHECK(l.sigma_u == Approx(l.sigma_w).epsilon(1e-12));
    }
  // between the tabulated altitudes the curves are read linearly (common practice)
  CHECK(turbulence_levels(TurbulenceModel::dryden, 30000 * units::ft, 1e-5).sigma_w / units::ft == Approx(18.0));
}

// ---------------------------------------------------------------------------------------------
// Responses

TEST_CASE("response metrics of a known damped oscillation") {
  // Source: logarithmic decrement of a damped oscillation, zeta = d / sqrt(4 pi^2 + d^2) (common
  // practice; e.g. vibration textbooks); settling by the 5 % band (Ogata, Modern Control
  // Engineering, sec. 5-3): for q = exp(-zeta w t) sin(w_d t) the last excursion above 5 % of the
  // peak lies within a half period before the envelope reaches 5 % of the peak.
  const double zeta = 0.25, w = 6.0, wd = w * std::sqrt(1 - zeta * zeta), dt = 0.001;
  CaseResult c;
  c.rc.stick = Stick::held;
  for (int i = 0; i <= 10000; ++i) {
    const double t = i * dt, te = t - 1.0;
    std::array<double, ch_count> row{};
    row[ch_time] = t;
    row[ch_q] = te > 0 ? std::exp(-zeta * w * te) * std::sin(wd * te) : 0.0;
    row[ch_load_factor] = 1.0 + 0.5 * row[ch_q];
    row[ch_gust_w_wing] = te >= 0 && te < 0.2 ? 1.0 : 0.0;
    row[ch_alpha] = 0.05;
    c.trace.push(row);
  }
  const CaseSummary s = summarize_case(c, 0.25, 1.2, -1.0);
  CHECK(s.response.onset == Approx(1.0));
  CHECK(s.response.damping == Approx(zeta).epsilon(0.01));
  double qmax = 0;
  for (double v : c.trace.ch[ch_q]) qmax = std::max(qmax, std::abs(v));
  const double t_env = std::log(1.0 / (0.05 * qmax)) / (zeta * w);  // envelope exp(-zeta w t) down to 5 % of qmax
  const double half = pi / wd;
  CHECK(s.response.settling_time <= t_env + 2 * dt);
  CHECK(s.response.settling_time >= t_env - half - 2 * dt);
  // peak of 1 + 0.5 q: at the first maximum of q, t = atan(sqrt(1-z^2)/z)/w_d after the onset
  CHECK(s.response.time_to_peak == Approx(std::atan(std::sqrt(1 - zeta * zeta) / zeta) / wd).epsilon(0.01));
  CHECK(s.response.stall_margin == Approx(0.2));
}

TEST_CASE("hold force: zero at the hands-off trim, the hinge moment of an updraft by hand") {
  // Source: definitions: the hands-off trim is the state of zero stick force (14 CFR 23.161 trim
  // requirement wording, "without ... force" from memory). In an updraft the force to hold the
  // elevator still is the gearing times the change of the aerodynamic hinge moment (virtual work,
  // F_stick = G H for a massless circuit: Etkin and Reid, Dynamics of Flight, sec. 2.6, from
  // memory), computed here by hand from the flow angles at the trim state: thin-airfoil hinge
  // moment Ch = Ch_alpha alpha_t (Ch_trim = 0 hands off), quasi-steady downwash.
  Airplane a = test::plain_airplane();
  // the elevator and stick nearly massless, so that the hinge carries no inertial reaction of the
  // airframe's acceleration in the gust (with the test airplane's 0.12 kg m2, I_h q' would be
  // about a tenth of the aerodynamic change, by estimate)
  a.elevator.mass = 0.0;
  a.elevator.mass_moment = 0.0;
  a.elevator.inertia = 1e-6;
  a.circuit.stick_mass = 1e-6;
  const Plant p = make_plant(a);
  const Trim t = trim_free(p, test::cruise());
  Controls c = t.controls;
  c.stick = Stick::free;
  CHECK(std::abs(hold_force(p, GustField{}, 0.0, t.x, c)) < 1e-6);
  const double U = 3.0;  // updraft [m/s]; the sharp edge started 100 m behind: wing and tail inside
  GustField g;
  g.gusts.push_back(DiscreteGust{GustShape::sharp_edge, GustComponent::vertical, -100.0, 1.0, U});
  // by hand: the air moves up at U; in body axes (x forward, z down, pitched theta) the relative
  // wind gains (-U sin theta, +U cos theta); q = 0 at trim, so wing and tail see the same angle
  const double th = t.x[sx::theta], u = t.x[sx::u], w = t.x[sx::w];
  const double ur = u - U * std::sin(th), wr = w + U * std::cos(th);
  const double alpha0 = std::atan2(w, u), alpha1 = std::atan2(wr, ur);
  const double V1 = std::hypot(ur, wr);
  const double dalpha_t = (alpha1 - alpha0) * (1.0 - a.tail.deps_dalpha);  // the tail angle net of the downwash
  const double rho = t.eval.atm.density;
  const double H = a.tail.eta * 0.5 * rho * V1 * V1 * a.elevator.area * a.elevator.chord * a.elevator.ch_alpha * dalpha_t;
  const double F_hand = a.circuit.gearing * H;  // pull positive; Ch_alpha < 0: an updraft pushes the elevator TE up
  // 1e-3: the inertial terms left (1e-6 kg m2 and kg against a few N) and the trim's residual
  // hinge moment (< 1e-6 N m) are far below it; a sign error in either factor is a 200 % miss
  c.stick = Stick::held;
  const auto row = output_row(p, g, 0.0, t.x, c);
  MESSAGE("hold force in a 3 m/s updraft: " << row[ch_hold_force] << " N, by hand " << F_hand << " N");
  CHECK(F_hand < 0.0);  // the updraft raises the trailing edge: a push holds it
  CHECK(row[ch_hold_force] == Approx(F_hand).epsilon(1e-3));
  c.stick = Stick::free;  // with the stick free the same force holds the elevator where it is
  CHECK(hold_force(p, g, 0.0, t.x, c) == Approx(F_hand).epsilon(1e-3));
}

// ---------------------------------------------------------------------------------------------
// Scenarios

namespace {

const std::string kAirplane = R"TOML(name = "Test Petrel (fictional)"

[wing]
area = 12.0
mac = 1.3
span = 9.0

[tail]
area = 2.2
x_ac = 4.6
z_ac = -0.3

[elevator]
area = 0.8
chord = 0.3
x_hinge = 4.45
z_hinge = -0.3
mass = 4.0
mass_moment = 0.05
inertia = 0.08

[mass]
mass = 750.0
pitch_inertia = 1000.0
cg = 0.25

[condition]
altitude = "3000 ft"
airspeed = "105 kt"

[run]
duration = 10.0
)TOML";

ScenarioError load_error(const std::string& text) {
  try {
    (void)parse_scenario(text, "case.toml", "");
  } catch (const ScenarioError& e) {
    return e;
  }
  FAIL("no error for:\n" << text);
  return {};
}

std::string with_altitude(std::string text, const std::string& alt) {
  const std::string from = "altitude = \"3000 ft\"";
  text.replace(text.find(from), from.size(), "altitude = " + alt);
  return text;
}

int line_of(const std::string& text, const std::string& what) {
  const auto at = text.find(what);
  return at == std::string::npos ? -1 : 1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<long>(at), '\n'));
}

}  // namespace

TEST_CASE("gust and turbulence keys: bad input names file, line, key and what is allowed") {
  // Source: the project's input contract (errors name file, line, key and the allowed values).
  SUBCASE("unknown severity") {
    const std::string t = kAirplane + "\n[turbulence]\nmodel = \"dryden\"\nseverity = \"extreme\"\n";
    const auto e = load_error(t);
    CHECK(e.key == "turbulence.severity");
    CHECK(e.line == line_of(t, "severity ="));
    CHECK(e.message.find("\"light\", \"moderate\", \"severe\"") != std::string::npos);
  }
  SUBCASE("probability outside the table") {
    const auto e = load_error(kAirplane + "\n[turbulence]\nmodel = \"dryden\"\nprobability = 0.5\n");
    CHECK(e.key == "turbulence.probability");
    CHECK(e.message.find("0.5") != std::string::npos);
  }
  SUBCASE("turbulence that starts after the run ends") {
    const auto e = load_error(kAirplane + "\n[turbulence]\nmodel = \"dryden\"\nstart_time = 11\n");
    CHECK(e.key == "turbulence.start_time");
    CHECK(e.message.find("after the end of the run") != std::string::npos);
  }
  SUBCASE("negative gradient distance") {
    const std::string t = kAirplane + "\n[[gust]]\nlength = -5\namplitude = 3\nstart = 10\n";
    const auto e = load_error(t);
    CHECK(e.key == "gust.length");
    CHECK(e.line == line_of(t, "length = -5"));
  }
  SUBCASE("a train without its spacing, and count on a single gust") {
    const std::string t = kAirplane + "\n[[gust]]\nshape = \"train\"\ncount = 3\nlength = 10\namplitude = 3\nstart = 10\n";
    CHECK(load_error(t).key == "gust.spacing");
    const std::string t2 = kAirplane + "\n[[gust]]\ncount = 3\nlength = 10\namplitude = 3\nstart = 10\n";
    const auto e2 = load_error(t2);
    CHECK(e2.key == "gust.count");
    CHECK(e2.line == line_of(t2, "count = 3"));
  }
  SUBCASE("a rule and an amplitude together") {
    const std::string t = kAirplane + "\n[[gust]]\nrule = \"derived_vc\"\namplitude = 3\nstart = 10\n";
    const auto e = load_error(t);
    CHECK(e.key == "gust.amplitude");
    CHECK(e.line == line_of(t, "amplitude = 3"));
  }
  SUBCASE("a rule above the heights it is given for") {
    const auto e = load_error(with_altitude(kAirplane, "\"21000 ft\"") + "\n[[gust]]\nrule = \"derived_vc\"\nstart = 10\n");
    CHECK(e.key == "gust.rule");
    CHECK(e.message.find("20000 ft") != std::string::npos);
  }
  SUBCASE("a tuned-gust range the wrong way round, and half a range") {
    CHECK(load_error(kAirplane + "\n[[gust]]\nlength = 10\namplitude = 3\nstart = 10\ntune_min = 50\ntune_max = 20\n").key ==
          "gust.tune_max");
    CHECK(load_error(kAirplane + "\n[[gust]]\nlength = 10\namplitude = 3\nstart = 10\ntune_min = 50\n").key ==
          "gust.tune_max");
  }
  SUBCASE("a gust that starts after the run ends") {
    const auto e = load_error(kAirplane + "\n[[gust]]\nlength = 10\namplitude = 3\nstart_time = 12\n");
    CHECK(e.key == "gust.start_time");
  }
}

TEST_CASE("rule gusts: amplitude from the rule, as true airspeed, and the estimate printed beside") {
  // Sources: 14 CFR 23.333(c) (U_de = 50 ft/s EAS at V_C) and 23.341(c) before amdt 64 / CS 23.341
  // (K_g formula; H = 12.5 c for the rule's 1-cosine gust, from memory); the definition of EAS,
  // U_true = U_EAS sqrt(rho0 / rho); 14 CFR 25.341(a) for the gradient-distance family.
  const std::string t = kAirplane + "\n[[gust]]\nrule = \"derived_vc\"\nstart_time = 1\n\n[[gust]]\nrule = "
                                    "\"gradient_distance\"\nlength = \"100 ft\"\nstart_time = 5\n";
  const Scenario s = parse_scenario(t, "case.toml", "");
  const double rho = isa_at(geopotential_altitude(3000 * units::ft)).density;
  REQUIRE(s.gusts.size() == 2);
  CHECK(s.gusts[0].length == Approx(12.5 * 1.3));
  CHECK(s.gusts[0].amplitude == Approx(50 * units::ft * std::sqrt(isa::rho0 / rho)));
  // 56 ft/s at sea level to 44 ft/s at 15000 ft: 53.6 ft/s at 3000 ft, times (100/350)^(1/6)
  CHECK(s.gusts[1].amplitude == Approx(53.6 * units::ft * std::pow(100.0 / 350.0, 1.0 / 6.0) * std::sqrt(isa::rho0 / rho)));
  const auto est = rule_estimates(s);
  REQUIRE(est.size() == 1);
  const double ws = 750.0 * units::g0 / 12.0;
  const double V_e = 105 * units::kt * std::sqrt(rho / isa::rho0);
  const GustLoadEstimate e = derived_gust_load(ws, 1.3, est[0].lift_slope, rho, V_e, 50 * units::ft);
  CHECK(est[0].estimate.delta_n == Approx(e.delta_n));
  CHECK(est[0].U_de == Approx(50 * units::ft));
  // the writer keeps the rule, not a number: reading back gives the same gusts
  const Scenario r = parse_scenario(to_toml(s), "back.toml", "");
  REQUIRE(r.gusts.size() == 2);
  CHECK(r.gusts[0].amplitude == s.gusts[0].amplitude);
  CHECK(r.gusts[1].amplitude == s.gusts[1].amplitude);
  CHECK(r.gusts[0].length == s.gusts[0].length);
  // a higher condition changes the true amplitude through set_value
  Scenario h = s;
  set_value(h, "condition.altitude", 6000 * units::ft, "test");
  CHECK(h.gusts[0].amplitude > s.gusts[0].amplitude);
}

TEST_CASE("tuned-gust search finds the worst gradient distance") {
  // Source: definition of the tuned gust (the gradient distance giving the largest response,
  // searched over a range as 14 CFR 25.341(a) asks; wording from memory): the search's answer must
  // be at least as bad as every point of an independent finer grid, within 0.5 %.
  const std::string t = kAirplane + "\n[[gust]]\nlength = 20\namplitude = 4\nstart_time = 0.5\ntune_min = 5\n"
                                    "tune_max = 120\ntune_points = 6\n";
  Scenario s = parse_scenario(t, "case.toml", "");
  s.run.duration = 5.0;
  s.run.output_step = 0.005;
  const TuneResult r = tune_gust(s, ControlsChoice::both, 2, false);
  REQUIRE(r.active);
  for (int k = 0; k <= 24; ++k) {
    const double H = 5.0 * std::pow(24.0, k / 24.0);
    const RunOutcome o = run_scenario(with_gust_length(s, 0, H), ControlsChoice::both);
    for (int c = 0; c < 2; ++c) {
      const auto& n = (c == 0 ? o.held : o.free)->trace.ch[ch_load_factor];
      double peak = 0.0;
      for (double v : n) peak = std::max(peak, std::abs(v - n.front()));
      CAPTURE(H);
      CHECK(peak <= (c == 0 ? r.peak_held : r.peak_free) * 1.005);
    }
  }
  // and not inflated: the peak the search reports is the peak of a run flown at the gradient
  // distance it reports (an independent run at that H; 1e-6: the same deterministic run, held and
  // free flown together here and apart in the search)
  const RunOutcome oh = run_scenario(with_gust_length(s, 0, r.H_held), ControlsChoice::both);
  const RunOutcome of = run_scenario(with_gust_length(s, 0, r.H_free), ControlsChoice::both);
  for (int c = 0; c < 2; ++c) {
    const auto& n = (c == 0 ? oh.held : of.free)->trace.ch[ch_load_factor];
    double peak = 0.0;
    for (double v : n) peak = std::max(peak, std::abs(v - n.front()));
    CHECK(peak == Approx(c == 0 ? r.peak_held : r.peak_free).epsilon(1e-6));
  }
  MESSAGE("tuned: held H = " << r.H_held << " m (" << r.peak_held << "), free H = " << r.H_free << " m (" << r.peak_free << ")");
}

TEST_CASE("seed runs do not depend on the number of threads") {
  // Source: the reproducibility requirement (same seed, same field; results written per index).
  Scenario s = parse_scenario(kAirplane + "\n[turbulence]\nmodel = \"dryden\"\nseed = 5\n", "case.toml", "");
  s.run.duration = 8.0;
  s.run.rel_tol = 1e-6;
  s.run.abs_tol = 1e-7;
  const SeedsResult a = run_seeds(s, ControlsChoice::both, 3, 1, false);
  const SeedsResult b = run_seeds(s, ControlsChoice::both, 3, 2, false);
  REQUIRE(a.runs.size() == 3);
  for (std::size_t i = 0; i < 3; ++i) {
    CHECK(a.runs[i].seed == 5 + static_cast<long>(i));
    for (std::size_t k = 0; k < st_count; ++k) {
      CHECK(a.runs[i].held.turbulence.rms[k] == b.runs[i].held.turbulence.rms[k]);
      CHECK(a.runs[i].free.turbulence.rms[k] == b.runs[i].free.turbulence.rms[k]);
    }
  }
  CHECK(a.runs[0].held.turbulence.rms[st_load_factor] != a.runs[1].held.turbulence.rms[st_load_factor]);
}
