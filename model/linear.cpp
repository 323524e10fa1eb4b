// linear.cpp — central-difference Jacobian and named modes (see linear.hpp).
#include "linear.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

#include <Eigen/Eigenvalues>
#include "units.hpp"
#include <Eigen/LU>

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

// Relative size of the altitude Schur complement below which the altitude root is neutral by
// construction (see linear.hpp): the finite-difference error of the Jacobian is about 1e-8
// relative, a thrust that varies by 1 % of the density's variation gives about 1e-3.
constexpr double kNeutralRelativeTolerance = 1e-5;

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

namespace {

// Root, its figures and its eigenvector shares on normalised states: u/V and w/V as angles,
// q/|lambda| as an angle, de, de_dot/|lambda|, h |lambda| / V.
Mode make_mode(const LinearModel& lm, std::complex<double> r, const Eigen::VectorXcd& vec) {
  Mode m;
  m.root = {r.real(), std::abs(r.imag()) < 1e-12 ? 0.0 : std::abs(r.imag())};
  m.oscillatory = m.root.imag() != 0.0;
  m.frequency = std::abs(m.root);
  m.damping = m.frequency > 0 ? -m.root.real() / m.frequency : 0.0;
  m.period = m.oscillatory ? 2.0 * std::numbers::pi / m.root.imag() : 0.0;
  if (m.root.real() < 0) m.time_to_half = std::log(2.0) / -m.root.real();
  if (m.root.real() > 0) m.time_to_double = std::log(2.0) / m.root.real();
  if (m.oscillatory && m.root.real() < 0)
    m.cycles_to_tenth = std::log(10.0) / (2.0 * std::numbers::pi) * m.root.imag() / -m.root.real();
  const double lam = std::max(m.frequency, 1e-6);
  const double Vref = std::max(lm.V, 1.0);
  const auto n = static_cast<Eigen::Index>(lm.states.size());
  double total = 0.0;
  m.shape.assign(static_cast<std::size_t>(n), 0.0);
  for (Eigen::Index i = 0; i < n; ++i) {
    const std::size_t s = lm.states[static_cast<std::size_t>(i)];
    double v = std::abs(vec(i));
    if (s == sx::u || s == sx::w) v /= Vref;
    else if (s == sx::q || s == sx::de_dot) v /= lam;
    else if (s == sx::h) v *= lam / Vref;
    m.shape[static_cast<std::size_t>(i)] = v * v;
    total += v * v;
  }
  for (auto& v : m.shape) v /= total > 0 ? total : 1.0;
  return m;
}

// Frequencies the two airframe oscillations would have by the classical approximations [rad/s]:
// short period from the (w, q) block, omega^2 = |Z_w M_q - M_w u0| (Nelson, "Flight Stability
// and Automatic Control", sec. 4.4; Etkin and Reid, "Dynamics of Flight", sec. 6.3), phugoid
// by Lanchester, omega = sqrt(2) g / V (Etkin and Reid sec. 6.3; Nelson sec. 4.3).
struct Approx { double sp = 0, ph = 0; };
Approx approximations(const LinearModel& lm) {
  Approx a;
  Eigen::Index iw = -1, iq = -1;
  for (std::size_t i = 0; i < lm.states.size(); ++i) {
    if (lm.states[i] == sx::w) iw = static_cast<Eigen::Index>(i);
    if (lm.states[i] == sx::q) iq = static_cast<Eigen::Index>(i);
  }
  if (iw >= 0 && iq >= 0)
    a.sp = std::sqrt(std::abs(lm.A(iw, iw) * lm.A(iq, iq) - lm.A(iw, iq) * lm.A(iq, iw)));
  a.ph = lm.V > 0 ? std::sqrt(2.0) * units::g0 / lm.V : 0.0;
  return a;
}

// Name from the eigenvector shares. The altitude follows the flight path (h' = V (theta -
// alpha)) and is left out. The downwash-lag stages are a chain driven by alpha: a root whose
// shape lies mostly in them is the lag's own ("downwash lag"), not the short period. An
// airframe oscillation is the short period or the phugoid by which of the two approximate
// frequencies it lies nearer on a logarithmic scale (they are an order of magnitude apart on
// a light airplane); the shares alone (alpha against speed) named a slow hands-off
// oscillation of 10 s "short period".
std::string name_mode(const LinearModel& lm, const Mode& m) {
  double sh_u = 0, sh_a = 0, sh_th = 0, sh_h = 0, sh_e = 0, sh_lag = 0;
  for (std::size_t i = 0; i < lm.states.size(); ++i) {
    const std::size_t s = lm.states[i];
    const double v = m.shape[i];
    if (s == sx::u) sh_u += v;
    else if (s == sx::w) sh_a += v;
    else if (s == sx::q || s == sx::theta) sh_th += v;
    else if (s == sx::h) sh_h += v;
    else if (s == sx::de || s == sx::de_dot) sh_e += v;
    else sh_lag += v;
  }
  const double rest = sh_u + sh_a + sh_lag + sh_th + sh_e;
  const double su = sh_u / rest, sa = sh_a / rest, st = sh_th / rest, se = sh_e / rest, sl = sh_lag / rest;
  if (se > 0.5) return "elevator";
  if (sl > 0.5) return "downwash lag";
  if (m.oscillatory) {
    const Approx ap = approximations(lm);
    if (ap.sp > 0 && ap.ph > 0 && ap.sp > ap.ph)
      return std::abs(std::log(m.frequency / ap.sp)) < std::abs(std::log(m.frequency / ap.ph)) ? "short period" : "phugoid";
    return sa > su ? "short period" : "phugoid";
  }
  if (sh_h > 0.5 && m.frequency < 0.05) return "height";
  if (m.root.real() > 0) return su > sa + st ? "speed divergence" : "pitch divergence";
  if (su > 0.5) return "speed";
  return "pitch subsidence";
}

// The neighbouring-trim test of modes() (see linear.hpp): the equilibrium shift per metre of
// altitude x_r (over all states, 0 at h) when the altitude root is neutral by construction.
bool neutral_altitude(const LinearModel& lm, Eigen::Index ih, Eigen::VectorXd& shift, double& ratio) {
  const Eigen::Index n = lm.A.rows();
  if (ih < 0 || n < 2) return false;
  std::vector<Eigen::Index> r;
  for (Eigen::Index i = 0; i < n; ++i)
    if (i != ih) r.push_back(i);
  const auto nr = static_cast<Eigen::Index>(r.size());
  Eigen::MatrixXd Arr(nr, nr);
  Eigen::VectorXd arh(nr), ahr(nr);
  for (Eigen::Index i = 0; i < nr; ++i) {
    arh(i) = lm.A(r[static_cast<std::size_t>(i)], ih);
    ahr(i) = lm.A(ih, r[static_cast<std::size_t>(i)]);
    for (Eigen::Index j = 0; j < nr; ++j) Arr(i, j) = lm.A(r[static_cast<std::size_t>(i)], r[static_cast<std::size_t>(j)]);
  }
  const Eigen::FullPivLU<Eigen::MatrixXd> lu(Arr);
  if (!lu.isInvertible()) return false;
  const Eigen::VectorXd xr = lu.solve(-arh);
  const double rho = lm.A(ih, ih) + ahr.dot(xr);
  const double scale = std::abs(lm.A(ih, ih)) + ahr.cwiseAbs().dot(xr.cwiseAbs());
  ratio = scale > 0 ? std::abs(rho) / scale : 0.0;
  if (!(scale > 0) || ratio > kNeutralRelativeTolerance) return false;
  shift = Eigen::VectorXd::Zero(n);
  for (Eigen::Index i = 0; i < nr; ++i) shift(r[static_cast<std::size_t>(i)]) = xr(i);
  return true;
}

}  // namespace

std::vector<Mode> modes(const LinearModel& lm) {
  const auto n = lm.A.rows();
  Eigen::Index ih = -1;
  for (Eigen::Index i = 0; i < n; ++i)
    if (lm.states[static_cast<std::size_t>(i)] == sx::h) ih = i;
  std::vector<std::pair<std::complex<double>, Eigen::VectorXcd>> pairs;  // roots with eigenvectors
  Eigen::VectorXd shift;
  double ratio = 0;
  const bool neutral = neutral_altitude(lm, ih, shift, ratio);
  if (!neutral) {
    Eigen::EigenSolver<Eigen::MatrixXd> es(lm.A, true);
    const Eigen::MatrixXcd vec = es.eigenvectors();
    for (Eigen::Index k = 0; k < n; ++k) pairs.emplace_back(es.eigenvalues()(k), vec.col(k));
  } else {
    // A' = T^-1 A T with T = I + shift e_h^T: column h of A' is (numerically) zero
    Eigen::MatrixXd T = Eigen::MatrixXd::Identity(n, n), Ti = T;
    T.col(ih) += shift;
    Ti.col(ih) -= shift;
    const Eigen::MatrixXd Ap = Ti * lm.A * T;
    std::vector<Eigen::Index> r;
    for (Eigen::Index i = 0; i < n; ++i)
      if (i != ih) r.push_back(i);
    const auto nr = static_cast<Eigen::Index>(r.size());
    Eigen::MatrixXd Arr(nr, nr);
    for (Eigen::Index i = 0; i < nr; ++i)
      for (Eigen::Index j = 0; j < nr; ++j) Arr(i, j) = Ap(r[static_cast<std::size_t>(i)], r[static_cast<std::size_t>(j)]);
    Eigen::EigenSolver<Eigen::MatrixXd> es(Arr, true);
    const Eigen::MatrixXcd vec = es.eigenvectors();
    for (Eigen::Index k = 0; k < nr; ++k) {
      const std::complex<double> lam = es.eigenvalues()(k);
      Eigen::VectorXcd vp = Eigen::VectorXcd::Zero(n);
      std::complex<double> hrow = 0.0;
      for (Eigen::Index i = 0; i < nr; ++i) {
        vp(r[static_cast<std::size_t>(i)]) = vec(i, k);
        hrow += Ap(ih, r[static_cast<std::size_t>(i)]) * vec(i, k);
      }
      vp(ih) = std::abs(lam) > 0 ? hrow / lam : 0.0;  // h' row of A' v' = lam v'
      pairs.emplace_back(lam, T.cast<std::complex<double>>() * vp);
    }
    Eigen::VectorXcd v0 = shift.cast<std::complex<double>>();
    v0(ih) = 1.0;
    pairs.emplace_back(0.0, v0);
  }
  std::vector<Mode> out;
  for (const auto& [r, vec] : pairs) {
    if (r.imag() < -1e-12) continue;  // keep one of each pair
    Mode m = make_mode(lm, r, vec);
    m.name = name_mode(lm, m);
    out.push_back(m);
  }
  if (neutral) {
    Mode& m = out.back();
    m.name = "height";
    m.neutral = true;
    m.neutral_reason = "altitude root, neutral by construction: a neighbouring trim exists at every altitude "
                       "(thrust independent of density and speed); not a pitch motion";
  }
  // one short period and one phugoid: when two airframe oscillations take the same name, the
  // one nearer its classical approximation keeps it and the other is the "third oscillatory"
  // mode that a floating elevator can make at aft CG (Etkin and Reid's name for it; from memory)
  const Approx ap = approximations(lm);
  for (const auto& [name, ref] : {std::pair<const char*, double>{"short period", ap.sp}, {"phugoid", ap.ph}}) {
    Mode* keep = nullptr;
    for (Mode& m : out) {
      if (m.name != name || !(ref > 0)) continue;
      if (!keep) { keep = &m; continue; }
      Mode* other = &m;
      if (std::abs(std::log(m.frequency / ref)) < std::abs(std::log(keep->frequency / ref))) std::swap(keep, other);
      other->name = "third oscillatory";
    }
  }
  std::sort(out.begin(), out.end(), [](const Mode& a, const Mode& b) { return a.frequency < b.frequency; });
  return out;
}

StabilityRoot deciding_root(const std::vector<Mode>& ms) {
  StabilityRoot s;
  for (const Mode& m : ms) {
    if (m.neutral) {
      s.set_aside.push_back({m.name, m.root, m.neutral_reason});
      continue;
    }
    if (!s.found || m.root.real() > s.root.real()) {
      s.found = true;
      s.root = m.root;
      s.mode = m.name;
      s.oscillatory = m.oscillatory;
    }
  }
  return s;
}

}  // namespace fp
