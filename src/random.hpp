// Random numbers for resampling: one pcg32 stream per fixed block of work, unbiased bounded
// integers (Lemire 2019, "Fast random integer generation in an interval", ACM TOMACS 29:1,
// with its batched variant, Brackett-Rozinsky & Lemire 2024), and a portable uniform double.
//
// The stream of a block depends only on (seed, block index), never on the thread that runs it,
// so results are the same for any thread count.
#pragma once
#include <cstdint>
#include <pcg_random.hpp>
#include <span>
#include <vector>

namespace contrasta::detail {

__extension__ using uint128 = unsigned __int128;  // GCC/Clang extension, for exact products

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

// Several bounded integers from one 64-bit word (Brackett-Rozinsky & Lemire 2024, "Batched
// ranged random integer generation", Softw. Pract. Exper.): ranges r_1..r_k with product
// P <= 2^64 are drawn as the successive high words of x*r_1, low*r_2, ...; since
// x*P = (the mixed-radix number of the draws) * 2^64 + the final low word, this is Lemire's
// method for the single range P, exactly uniform after rejecting final low words below
// 2^64 mod P. A resampling run draws the same sequence of ranges for every resample, so the
// batches and their rejection thresholds are planned once.
struct draw_batch {
  std::uint32_t first = 0, count = 0;  // ranges[first .. first + count)
  std::uint64_t product = 1;
  std::uint64_t threshold = 0;  // 2^64 mod product
};

// Groups consecutive ranges into batches with product <= 2^56, so that a batch is redrawn with
// probability below 2^-8.
inline std::vector<draw_batch> plan_batches(std::span<const std::uint32_t> ranges) {
  std::vector<draw_batch> plan;
  draw_batch current;
  auto close = [&] {
    current.threshold = (0 - current.product) % current.product;
    plan.push_back(current);
  };
  for (std::size_t i = 0; i < ranges.size(); ++i) {
    const auto r = static_cast<std::uint64_t>(ranges[i]);
    if (current.count > 0 && static_cast<uint128>(current.product) * r > (1ULL << 56)) {
      close();
      current = draw_batch{static_cast<std::uint32_t>(i), 0, 1, 0};
    }
    current.product *= r;
    ++current.count;
  }
  if (current.count > 0) close();
  return plan;
}

// The random source of one block of resamples: four pcg32 streams used in turn, batch by
// batch, so that the four linear-congruential recurrences run side by side in the processor
// instead of one long dependency chain. All four streams belong to the block (derived from
// seed, block index and the kind of work, so that a permutation run and a bootstrap run with
// one seed use unrelated streams), so results still do not depend on the thread count.
struct block_random {
  pcg32 lanes[4];
  block_random(std::uint64_t seed, std::uint64_t block, std::uint64_t kind)
      : lanes{lane(seed, block, kind, 0), lane(seed, block, kind, 1), lane(seed, block, kind, 2),
              lane(seed, block, kind, 3)} {}
  static pcg32 lane(std::uint64_t seed, std::uint64_t block, std::uint64_t kind, std::uint64_t k) {
    return block_stream(seed, (kind << 60) | ((block << 2) + k));  // block < 2^58
  }
};

// Fills out[i] uniformly in [0, ranges[i]) for every i, batch by batch; batch b uses lane
// b mod 4. The lanes are copied into locals so that their states stay in registers.
inline void draw_bounded(block_random& random, const std::uint32_t* ranges, std::span<const draw_batch> plan,
                         std::uint32_t* out) {
  pcg32 l0 = random.lanes[0], l1 = random.lanes[1], l2 = random.lanes[2], l3 = random.lanes[3];
  auto one = [ranges, out](pcg32& rng, const draw_batch& batch) {
    // locals: the stores to `out` could otherwise alias the batch fields and force reloads
    const std::uint32_t* __restrict r = ranges + batch.first;
    std::uint32_t* __restrict o = out + batch.first;
    const std::uint32_t count = batch.count;
    const std::uint64_t threshold = batch.threshold;
    for (;;) {
      std::uint64_t low = bits64(rng);
      for (std::uint32_t i = 0; i < count; ++i) {
        const uint128 wide = static_cast<uint128>(low) * r[i];
        o[i] = static_cast<std::uint32_t>(wide >> 64);
        low = static_cast<std::uint64_t>(wide);
      }
      if (low >= threshold) return;
    }
  };
  std::size_t b = 0;
  for (; b + 4 <= plan.size(); b += 4) {
    one(l0, plan[b]);
    one(l1, plan[b + 1]);
    one(l2, plan[b + 2]);
    one(l3, plan[b + 3]);
  }
  if (b < plan.size()) one(l0, plan[b++]);
  if (b < plan.size()) one(l1, plan[b++]);
  if (b < plan.size()) one(l2, plan[b++]);
  random.lanes[0] = l0;
  random.lanes[1] = l1;
  random.lanes[2] = l2;
  random.lanes[3] = l3;
}

// Uniform double in [0, 1) with 53 random bits: the same value on every platform.
inline double uniform01(pcg32& rng) {
  return static_cast<double>(bits64(rng) >> 11) * 0x1.0p-53;
}

}  // namespace contrasta::detail
