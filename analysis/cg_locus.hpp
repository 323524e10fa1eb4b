// cg_locus.hpp — how the linear modes of a scenario's airplane move as its centre of gravity
// moves (the root locus the window draws), and the divergence indicator taken from them.
//
// Each point re-trims the airplane at its CG and takes the modes held and free exactly as
// compute_modes (analysis/margins_modes.hpp) does for the scenario itself.
//
// The divergence indicator is the deciding root of model/linear.hpp deciding_root (the one
// definition for every consumer: roots neutral by construction are set aside there); it counts
// as a divergence above kDivergenceThreshold, well above the finite-difference noise of the
// Jacobian.
#pragma once

#include <limits>
#include <string>
#include <vector>

#include "analysis/margins_modes.hpp"
#include "scenario/scenario.hpp"

namespace fp {

inline constexpr double kDivergenceThreshold = 1e-5;  // [1/s]

struct LocusPoint {
  double cg = 0.0;       // [fraction of MAC]
  bool ok = false;       // trimmed and linearised
  std::string error;     // why not (the key table's or the trim's message)
  ModesResult modes;     // held, and free when has_free
  StabilityRoot held_root, free_root;  // deciding roots (free: found = false when !has_free)
};

// Modes at `points` CG positions evenly from cg_from to cg_to.
std::vector<LocusPoint> cg_root_locus(const Scenario& s, double cg_from, double cg_to, int points);

// Real part of the deciding root (deciding_root) [1/s] (-inf when there is none); `mode`
// receives its name.
double largest_real_root(const std::vector<Mode>& modes, std::string* mode = nullptr);

}  // namespace fp
