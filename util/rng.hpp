// rng.hpp — the project's one seeded random-number generator with its normal transform.
//
// Engine: std::mt19937_64, whose output sequence the C++ standard fixes ([rand.predef]: the
// 10000th output of a default-constructed engine is 9981545732273789042), so a (seed, stream)
// pair gives the same numbers on every conforming library. The engine's seed is the pair mixed
// by splitmix64 (Steele, Lea and Flood, "Fast splittable pseudorandom number generators",
// OOPSLA 2014), so neighbouring seeds or streams start far apart.
// Uniform deviates: the top 53 bits, (k + 0.5) 2^-53, strictly inside (0, 1).
// Normal deviates: Box-Muller (Box and Muller, Ann. Math. Statist. 29, 1958), both deviates of
// a pair used in turn. std::normal_distribution is not used: its algorithm is not specified,
// so its numbers differ between standard libraries.
#pragma once

#include <cmath>
#include <cstdint>
#include <numbers>
#include <random>

namespace fp {

// splitmix64's output function applied to the pair (seed, stream).
inline std::uint64_t splitmix64_mix(std::uint64_t seed, std::uint64_t stream) {
  std::uint64_t z = seed * 0x9e3779b97f4a7c15ULL + stream * 0xd1b54a32d192ed03ULL + 0x9e3779b97f4a7c15ULL;
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
  return z ^ (z >> 31);
}

class SeededRng {
 public:
  SeededRng(std::uint64_t seed, std::uint64_t stream) : engine_(splitmix64_mix(seed, stream)) {}
  // Uniform on (0, 1), never 0 or 1.
  double uniform() { return (static_cast<double>(engine_() >> 11) + 0.5) * (1.0 / 9007199254740992.0); }
  // Standard normal deviate.
  double normal() {
    if (has_spare_) {
      has_spare_ = false;
      return spare_;
    }
    const double u1 = uniform(), u2 = uniform();
    const double r = std::sqrt(-2.0 * std::log(u1));
    spare_ = r * std::sin(2.0 * std::numbers::pi * u2);
    has_spare_ = true;
    return r * std::cos(2.0 * std::numbers::pi * u2);
  }

 private:
  std::mt19937_64 engine_;
  double spare_ = 0.0;
  bool has_spare_ = false;
};

}  // namespace fp
