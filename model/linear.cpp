// linear.cpp — central-difference Jacobian and named modes (see linear.hpp).
#include "linear.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

#include <Eigen/Eigenvalues>

namespace fp {

namespace {

// Typical size of each state, for the difference steps.
double state_scale(std::size_t i, double V) {
  switch (i) {
    case sx::u: case sx::w: return V;
    case sx::q: return 1.0;
    case sx::h: return 100.0;
    default: return 1.0;  // angles [rad]
  }
}

}  // namespace

LinearModel linearise(const Plant& p, const State& x0, const Controls& c, double step_scale) {
  LinearModel lm;
  const bool rigid = c.stick == Stick::held && p.ap.circuit.held_stiffness == 0.0;
  for (std::size_t i : {sx::u, sx::w, sx::q, sx::theta, sx::h}) lm.states.push_back(i);
  if (!rigid) {
    lm.states.push_back(sx::de);
    lm.states.push_back(sx::de_dot);
  }
  for (int k = 0; k < lag_states(p); ++k) lm.states.push_back(sx::eps0 + static_cast<std::size_t>(k));
  const auto n = static_cast<Eigen::Index>(lm.states.size());
  const double V = std::hypot(x0[sx::u], x0[sx::w]);
  lm.V = V;
  const GustField none;
  lm.A.resize(n, n);
  for (Eigen::Index j = 0; j < n; ++j) {
    const std::size_t sj = lm.states[static_cast<std::size_t>(j)];
    const double h = step_scale * state_scale(sj, V);
    State xp = x0, xm = x0, fp_{}, fm{};
    xp[sj] += h;
    xm[sj] -= h;
    derivatives(p, none, xp, c, 0.0, fp_);
    derivatives(p, none, xm, c, 0.0, fm);
    for (Eigen::Index i = 0; i < n; ++i) {
      const std::size_t si = lm.states[static_cast<std::size_t>(i)];
      lm.A(i, j) = (fp_[si] - fm[si]) / (2.0 * h);
    }
  }
  // inputs: tab, and pilot force (free) or held elevator (held)
  lm.input_names = {"tab", rigid || c.stick == Stick::held ? "held_elevator" : "pilot_force"};
  lm.input_units = {"rad", rigid || c.stick == Stick::held ? "rad" : "N"};
  lm.B.resize(n, 2);
  for (int k = 0; k < 2; ++k) {
    Controls cp = c, cm = c;
    State xp = x0, xm = x0;
    double h = step_scale;
    if (k == 0) {
      cp.tab += h;
      cm.tab -= h;
    } else if (c.stick == Stick::free) {
      h = 1e-3;
      cp.pilot_force += h;
      cm.pilot_force -= h;
    } else {
      cp.hold_de += h;
      cm.hold_de -= h;
      if (rigid) {
        xp[sx::de] += h;
        xm[sx::de] -= h;
      }
    }
    State fp_{}, fm{};
    derivatives(p, none, xp, cp, 0.0, fp_);
    derivatives(p, none, xm, cm, 0.0, fm);
    for (Eigen::Index i = 0; i < n; ++i) {
      const std::size_t si = lm.states[static_cast<std::size_t>(i)];
      lm.B(i, k) = (fp_[si] - fm[si]) / (2.0 * h);
    }
  }
  return lm;
}

std::vector<Mode> modes(const LinearModel& lm) {
  Eigen::EigenSolver<Eigen::MatrixXd> es(lm.A, true);
  const auto& ev = es.eigenvalues();
  const auto& vec = es.eigenvectors();
  const auto n = lm.A.rows();
  std::vector<Mode> out;
  for (Eigen::Index k = 0; k < n; ++k) {
    const std::complex<double> r = ev(k);
    if (r.imag() < -1e-12) continue;  // keep one of each pair
    Mode m;
    m.root = {r.real(), std::abs(r.imag()) < 1e-12 ? 0.0 : r.imag()};
    m.oscillatory = m.root.imag() != 0.0;
    m.frequency = std::abs(m.root);
    m.damping = m.frequency > 0 ? -m.root.real() / m.frequency : 0.0;
    m.period = m.oscillatory ? 2.0 * std::numbers::pi / m.root.imag() : 0.0;
    if (m.root.real() < 0) m.time_to_half = std::log(2.0) / -m.root.real();
    if (m.root.real() > 0) m.time_to_double = std::log(2.0) / m.root.real();
    if (m.oscillatory && m.root.real() < 0)
      m.cycles_to_tenth = std::log(10.0) / (2.0 * std::numbers::pi) * m.root.imag() / -m.root.real();
    // eigenvector shares on normalised states: u/V and w/V as angles, q/|lambda| as an
    // angle, de, de_dot/|lambda|, h |lambda| / V
    const double lam = std::max(m.frequency, 1e-6);
    const double Vref = std::max(lm.V, 1.0);
    double total = 0.0;
    m.shape.assign(static_cast<std::size_t>(n), 0.0);
    for (Eigen::Index i = 0; i < n; ++i) {
      const std::size_t s = lm.states[static_cast<std::size_t>(i)];
      double v = std::abs(vec(i, k));
      if (s == sx::u || s == sx::w) v /= Vref;
      else if (s == sx::q || s == sx::de_dot) v /= lam;
      else if (s == sx::h) v *= lam / Vref;
      m.shape[static_cast<std::size_t>(i)] = v * v;
      total += v * v;
    }
    for (auto& v : m.shape) v /= total > 0 ? total : 1.0;
    double sh_u = 0, sh_a = 0, sh_th = 0, sh_h = 0, sh_e = 0, sh_lag = 0;
    for (Eigen::Index i = 0; i < n; ++i) {
      const std::size_t s = lm.states[static_cast<std::size_t>(i)];
      const double v = m.shape[static_cast<std::size_t>(i)];
      if (s == sx::u) sh_u += v;
      else if (s == sx::w) sh_a += v;
      else if (s == sx::q || s == sx::theta) sh_th += v;
      else if (s == sx::h) sh_h += v;
      else if (s == sx::de || s == sx::de_dot) sh_e += v;
      else sh_lag += v;
    }
    // the altitude follows the flight path (h' = V (theta - alpha)); the downwash lag follows
    // alpha: name from the remaining groups
    const double rest = sh_u + sh_a + sh_lag + sh_th + sh_e;
    const double su = sh_u / rest, sa = (sh_a + sh_lag) / rest, st = sh_th / rest, se = sh_e / rest;
    if (se > 0.5) m.name = "elevator";
    else if (m.oscillatory) m.name = sa > su ? "short period" : "phugoid";
    else if (sh_h > 0.5 && m.frequency < 0.05) m.name = "height";
    else if (m.root.real() > 0) m.name = su > sa + st ? "speed divergence" : "pitch divergence";
    else if (su > 0.5) m.name = "speed";
    else m.name = "pitch subsidence";
    out.push_back(m);
  }
  std::sort(out.begin(), out.end(), [](const Mode& a, const Mode& b) { return a.frequency < b.frequency; });
  return out;
}

}  // namespace fp
