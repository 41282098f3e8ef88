// Random numbers for resampling: pcg32 streams per fixed block of work, unbiased bounded
// integers (Lemire 2019, "Fast random integer generation in an interval", ACM TOMACS 29:1),
// the word streams of the vector kernels, and a portable uniform double.
//
// The stream of a block depends only on (seed, block index), never on the thread that runs it,
// so results are the same for any thread count.
#pragma once
#include <cstdint>
#include <pcg_random.hpp>
#include <span>
#include <vector>

#include "resample_kernels.hpp"

namespace contrasta::detail {

// SplitMix64 finaliser (Steele, Lea & Flood 2014): decorrelates nearby seeds and block indices
// before they become pcg32 state.
inline std::uint64_t splitmix64(std::uint64_t x) {
  x += 0x9e3779b97f4a7c15ULL;
  x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9ULL;
  x = (x ^ (x >> 27)) * 0x94d049bb133111ebULL;
  return x ^ (x >> 31);
}

// The random stream of block `block` of a run seeded with `seed`: a distinct pcg32 sequence
// (stream selector = block index) started at a state mixed from both.
inline pcg32 block_stream(std::uint64_t seed, std::uint64_t block) {
  return pcg32(splitmix64(seed ^ splitmix64(block)), block);
}

// Uniform integer in [0, range), range >= 1, without modulo bias (Lemire 2019, Algorithm 5:
// multiply-shift, rejecting the few low products that would over-represent some values).
inline std::uint32_t bounded(pcg32& rng, std::uint32_t range) {
  std::uint64_t product = static_cast<std::uint64_t>(rng()) * range;
  auto low = static_cast<std::uint32_t>(product);
  if (low < range) {
    const std::uint32_t threshold = static_cast<std::uint32_t>(-range) % range;  // 2^32 mod range
    while (low < threshold) {
      product = static_cast<std::uint64_t>(rng()) * range;
      low = static_cast<std::uint32_t>(product);
    }
  }
  return static_cast<std::uint32_t>(product >> 32);
}

// 64 random bits from two pcg32 outputs (high word first, a fixed, portable order).
inline std::uint64_t bits64(pcg32& rng) {
  const std::uint64_t high = rng();
  return (high << 32) | rng();
}

// pcg32 with its state and increment readable: pcg-cpp keeps them protected, and the vector kernels advance
// the same recurrence from it (resample_kernels.hpp).
struct open_pcg32 : pcg32 {
  explicit open_pcg32(const pcg32& p) : pcg32(p) {}
  std::uint64_t state() const { return state_; }
  std::uint64_t stream_increment() const { return increment(); }
};

// The eight pcg32 streams of one block of resamples, derived from the seed, the block index
// and the kind of work (so that a permutation run and a bootstrap run with one seed use
// unrelated streams), never from the thread that runs the block.
inline void start_lanes(lane_stream& lanes, std::uint64_t seed, std::uint64_t block, std::uint64_t kind) {
  for (std::uint64_t k = 0; k < lane_stream::lanes; ++k) {
    const open_pcg32 lane(block_stream(seed, (kind << 60) | ((block << 3) + k)));  // block < 2^57
    lanes.state[k] = lane.state();
    lanes.increment[k] = lane.stream_increment();
  }
}

// The word stream of one block: the same eight streams, read in turn.
inline void start_words(word_stream& words, std::uint64_t seed, std::uint64_t block, std::uint64_t kind) {
  lane_stream lanes;
  start_lanes(lanes, seed, block, kind);
  for (std::uint32_t k = 0; k < word_stream::lanes; ++k) {
    words.state[k] = lanes.state[k];
    words.increment[k] = lanes.increment[k];
  }
  words.position = words.end = 0;
}

// The draws of a plan: ranges with their rejection thresholds 2^32 mod range, padded to a
// multiple of sixteen with range 1 and threshold 0 (resample_kernels.hpp, draw_plan).
struct draw_ranges {
  std::vector<std::uint32_t> range, threshold;
  explicit draw_ranges(std::span<const std::uint32_t> ranges, std::uint32_t index_scale = 0) : scale(index_scale) {
    for (std::uint32_t r : ranges) {
      range.push_back(r);
      threshold.push_back((0U - r) % r);
    }
    while (range.size() % 16 != 0) {
      range.push_back(1);
      threshold.push_back(0);
    }
    count = static_cast<std::uint32_t>(ranges.size());
  }
  draw_plan plan() const { return {range.data(), threshold.data(), count, scale}; }
  std::uint32_t scale = 0, count = 0;
};

// Uniform double in [0, 1) with 53 random bits: the same value on every platform.
inline double uniform01(pcg32& rng) {
  return static_cast<double>(bits64(rng) >> 11) * 0x1.0p-53;
}

}  // namespace contrasta::detail
