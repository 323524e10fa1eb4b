// roots.hpp — the one-dimensional root and minimum finders of the static analyses, on
// Boost.Math: TOMS 748 for roots in a bracket (Alefeld, Potra and Shi, ACM TOMS 21(3) 1995,
// algorithm 748; boost/math/tools/roots.hpp) and Brent's method for minima (Brent, Algorithms
// for Minimization without Derivatives, 1973, ch. 5; boost/math/tools/minima.hpp).
//
// A finder that runs out of iterations throws SolverFailure: a failure of the numerics, never a
// result about the airplane (the command line reports it with exit status 3). A bracket that
// cannot be found inside the allowed interval is an answer ("no such point in the range"), not
// a failure: bracket_root returns false then.
#pragma once

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <stdexcept>
#include <string>
#include <utility>

#include <boost/math/policies/policy.hpp>
#include <boost/math/tools/minima.hpp>
#include <boost/math/tools/roots.hpp>

namespace fp {

// A one-dimensional solve that did not converge: a numerical failure, never a property of the
// airplane. A std::runtime_error so that every generic handler (a sweep's worker, the window)
// reports it with its own words instead of losing it.
struct SolverFailure : std::runtime_error {
  SolverFailure(std::string q, std::string m)
      : std::runtime_error("numerical failure of a one-dimensional solver (not a property of the airplane): " + q +
                           ": " + m),
        quantity(std::move(q)),
        message(std::move(m)) {}
  std::string quantity;  // what was sought, e.g. "CG of zero stick-free margin"
  std::string message;   // why it stopped
};

namespace roots_detail {
// Errors inside Boost.Math (e.g. no sign change) come back as exceptions we turn into SolverFailure.
using Policy = boost::math::policies::policy<boost::math::policies::evaluation_error<boost::math::policies::throw_on_error>>;
}  // namespace roots_detail

// Root of f in [a, b] (f(a), f(b) of opposite signs or one of them zero) to |x_hi - x_lo| <= x_tol.
template <class F>
double find_root(F&& f, double a, double b, double fa, double fb, double x_tol, const std::string& quantity,
                 std::uintmax_t max_iter = 100) {
  if (fa == 0.0) return a;
  if (fb == 0.0) return b;
  if (!(fa * fb < 0.0))
    throw SolverFailure{quantity, "the interval given to the root finder has no sign change"};
  const std::uintmax_t limit = max_iter;
  std::uintmax_t it = max_iter;
  auto tol = [x_tol](double lo, double hi) { return std::abs(hi - lo) <= x_tol; };
  std::pair<double, double> r;
  try {
    r = boost::math::tools::toms748_solve(f, a, b, fa, fb, tol, it, roots_detail::Policy());
  } catch (const std::exception& e) {
    throw SolverFailure{quantity, std::string("TOMS 748 stopped: ") + e.what()};
  }
  if (it >= limit && !tol(r.first, r.second))
    throw SolverFailure{quantity, "TOMS 748 did not converge in " + std::to_string(limit) + " iterations (bracket " +
                                      std::to_string(r.first) + " .. " + std::to_string(r.second) + ")"};
  return 0.5 * (r.first + r.second);
}

template <class F>
double find_root(F&& f, double a, double b, double x_tol, const std::string& quantity,
                 std::uintmax_t max_iter = 100) {
  return find_root(f, a, b, f(a), f(b), x_tol, quantity, max_iter);
}

// A bracket of a root of f, searched from x0 and x0 + step: each new point is the secant
// estimate from the last two points, overshot by 5 % of the secant step (so that a nearly
// linear f is bracketed at once), the step at most 4 times the last spacing, never leaving
// [lo, hi]; a flat secant doubles the step instead. `f` may throw E to say "cannot be evaluated
// here" (e.g. a CG at which the airplane does not trim): the point is moved halfway back, up to
// 8 times. Returns false when no sign change is found (f keeps its sign over the part of
// [lo, hi] it could evaluate). On true, [a, b] holds the bracket with fa = f(a), fb = f(b).
template <class E, class F>
bool bracket_root(F&& f, double x0, double step, double lo, double hi, double& a, double& b, double& fa, double& fb) {
  double xa = x0, xb = std::clamp(x0 + step, lo, hi);
  if (xb == xa) xb = std::clamp(x0 - step, lo, hi);
  double fxa, fxb;
  try {
    fxa = f(xa);
    fxb = f(xb);
  } catch (const E&) {
    return false;
  }
  auto done = [&](double x1, double f1, double x2, double f2) {
    a = std::min(x1, x2), b = std::max(x1, x2);
    fa = x1 < x2 ? f1 : f2, fb = x1 < x2 ? f2 : f1;
    return true;
  };
  for (int i = 0; i < 60; ++i) {
    if (fxa * fxb <= 0.0) return done(xa, fxa, xb, fxb);
    if (std::abs(fxa) < std::abs(fxb)) std::swap(xa, xb), std::swap(fxa, fxb);  // xb: the smaller |f|
    const double spacing = std::abs(xb - xa);
    double x;
    if (fxb != fxa) {
      const double xs = xb - fxb * (xb - xa) / (fxb - fxa);
      x = xs + 0.05 * (xs - xb);
      x = std::clamp(x, xb - 4.0 * spacing, xb + 4.0 * spacing);
    } else {
      x = xb + 2.0 * (xb - xa);
    }
    x = std::clamp(x, lo, hi);
    if (x == xb || !std::isfinite(x)) return false;
    double fx = 0.0;
    bool ok = false;
    for (int k = 0; k < 8 && !ok; ++k) {
      try {
        fx = f(x);
        ok = true;
      } catch (const E&) {
        x = 0.5 * (x + xb);
      }
    }
    if (!ok) return false;
    xa = xb, fxa = fxb;
    xb = x, fxb = fx;
  }
  return false;
}

// Minimum of f on [a, b] by Brent's method to about bits binary digits.
template <class F>
std::pair<double, double> find_minimum(F&& f, double a, double b, const std::string& quantity, int bits = 40,
                                       std::uintmax_t max_iter = 200) {
  std::uintmax_t it = max_iter;
  const auto r = boost::math::tools::brent_find_minima(f, a, b, bits, it);
  if (it >= max_iter) throw SolverFailure{quantity, "Brent's minimiser did not converge in " + std::to_string(max_iter) + " iterations"};
  return r;
}

}  // namespace fp
