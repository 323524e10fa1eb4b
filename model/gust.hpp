// gust.hpp — the gust field the airplane flies through.
//
// A frozen field along the flight path: its value depends on the earth distance X of the
// point where it is sampled (the wing-body a.c. and the tail a.c. each sample it at their
// own position, so the tail meets a gust about l_t/V after the wing). Optionally the whole
// field moves towards the airplane at `front_speed` (a gust front): it is then sampled at
// X + front_speed * t. The field is constant data; sampling it is a pure function.
//
// Components: w positive UP (an up-gust), u positive along +X (a tail gust, lowering the
// airspeed). See model/state.hpp for all sign conventions.
#pragma once

#include <memory>
#include <vector>

namespace fp {

enum class GustShape {
  one_minus_cosine,  // U = (A/2)(1 - cos(pi s/H)) for 0 <= s <= 2H (14 CFR 25.341(a) form)
  sharp_edge,        // U = A for s >= 0
  ramp,              // U = A s/H for 0 <= s <= H, A beyond
  train,             // `count` 1-cosine gusts, each starting `spacing` after the one before
                     // (they add where they overlap)
};

enum class GustComponent { vertical, horizontal };

struct DiscreteGust {
  GustShape shape = GustShape::one_minus_cosine;
  GustComponent component = GustComponent::vertical;
  double start = 0.0;      // earth distance X at which the gust begins [m]
  double length = 30.0;    // gradient distance H (1-cosine: distance to the peak; ramp: rise) [m]
  double amplitude = 5.0;  // peak velocity [m/s] (vertical: up positive)
  int count = 1;           // train: number of 1-cosine gusts [-]
  double spacing = 0.0;    // train: distance from the start of one gust to the start of the next [m]
};

// How a turbulence record is read between its samples.
enum class Interpolation {
  linear,        // continuous, with a kink at every sample
  cubic_spline,  // natural cubic spline: continuous slope and curvature (the integrator's
                 // error estimate is not upset at every sample)
};

// A sampled record of continuous turbulence along X: value i belongs to X = x0 + i*dx,
// interpolated between samples, zero outside the record. u and w are either empty (the
// component is absent) or of the same length.
struct TurbulenceRecord {
  double x0 = 0.0;            // [m]
  double dx = 1.0;            // sample spacing [m]
  std::vector<double> u;      // longitudinal component [m/s]
  std::vector<double> w;      // vertical component, up positive [m/s]
  Interpolation interpolation = Interpolation::linear;
  std::vector<double> u2, w2; // cubic_spline: second derivatives at the samples [m/s per m^2]
                              // (filled by prepare_spline)
  // Fill u2 and w2 for the cubic spline (natural end conditions).
  void prepare_spline();
};

struct GustSample {
  double u = 0.0;  // along +X [m/s]
  double w = 0.0;  // up [m/s]
};

struct GustField {
  std::vector<DiscreteGust> gusts;
  std::shared_ptr<const TurbulenceRecord> turbulence;  // null: none
  double front_speed = 0.0;   // speed at which the field moves towards the airplane [m/s]

  bool empty() const { return gusts.empty() && !turbulence; }
  // Field value at earth distance X and time t.
  GustSample at(double X, double t) const;
};

// Value of one discrete gust shape at distance s past its start (0 before the start).
double gust_shape_value(const DiscreteGust& g, double s);

}  // namespace fp
