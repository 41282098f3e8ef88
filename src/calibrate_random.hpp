// Random draws for the calibration simulation: one pcg32 stream per fixed block of simulated
// datasets, so results do not depend on the thread count. Kept apart from the resampling
// engine's helpers so the two can evolve independently.
#pragma once
#include <cmath>
#include <cstdint>
#include <pcg_random.hpp>

namespace contrasta::detail::calibration {

// SplitMix64 finaliser (Steele, Lea & Flood 2014): spreads nearby seeds before they seed pcg32.
inline std::uint64_t mix(std::uint64_t x) {
  x += 0x9e3779b97f4a7c15ULL;
  x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9ULL;
  x = (x ^ (x >> 27)) * 0x94d049bb133111ebULL;
  return x ^ (x >> 31);
}

inline pcg32 block_stream(std::uint64_t seed, std::uint64_t block) {
  return pcg32(mix(seed ^ mix(block)), block);
}

// Uniform in (0, 1) from 53 random bits (never 0, so log() is safe).
inline double uniform_open(pcg32& rng) {
  const std::uint64_t bits = (static_cast<std::uint64_t>(rng()) << 32 | rng()) >> 11;
  return (static_cast<double>(bits) + 0.5) * 0x1.0p-53;
}

// Standard normal by Box-Muller (Box & Muller 1958); both values of a pair are used.
struct normal_source {
  bool has_spare = false;
  double spare = 0;
  double operator()(pcg32& rng) {
    if (has_spare) {
      has_spare = false;
      return spare;
    }
    const double radius = std::sqrt(-2 * std::log(uniform_open(rng)));
    const double angle = 6.283185307179586476925 * uniform_open(rng);
    spare = radius * std::sin(angle);
    has_spare = true;
    return radius * std::cos(angle);
  }
};

// Uniform integer in [0, range) without modulo bias (Lemire 2019, ACM TOMACS 29:1).
inline std::uint32_t bounded(pcg32& rng, std::uint32_t range) {
  std::uint64_t product = static_cast<std::uint64_t>(rng()) * range;
  auto low = static_cast<std::uint32_t>(product);
  if (low < range) {
    const std::uint32_t threshold = static_cast<std::uint32_t>(-range) % range;
    while (low < threshold) {
      product = static_cast<std::uint64_t>(rng()) * range;
      low = static_cast<std::uint32_t>(product);
    }
  }
  return static_cast<std::uint32_t>(product >> 32);
}

}  // namespace contrasta::detail::calibration
