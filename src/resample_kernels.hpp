// The inner loops of Monte Carlo resampling, compiled once per instruction-set level and picked
// at run time (quality.md P1, P3): random words from eight pcg32 streams side by side, bounded
// integers by Lemire's multiply-shift, then the group sums of each resample.
//
// Every level computes the same numbers bit for bit: the integer work is exact, and the sums
// are defined lane by lane (kernels/body.hpp), so the vector width only changes how many
// lanes one instruction handles, never the order of the additions. Results therefore depend on
// (seed, block) alone: not on the thread count and not on the processor.
#pragma once
#include <cstddef>
#include <cstdint>

namespace contrasta::detail {

// Eight pcg32 streams (O'Neill 2014, PCG-XSH-RR 64/32) read as one stream of 32-bit words:
// word k is output k / 8 of lane k % 8. The words are made eight at a time into a buffer.
struct word_stream {
  static constexpr std::uint32_t lanes = 8;
  static constexpr std::uint32_t capacity = 4096;  // words per refill
  static constexpr std::uint32_t padding = 64;     // readable words beyond the end (vector tails)
  std::uint64_t state[lanes];
  std::uint64_t increment[lanes];  // odd: pcg32's stream constant
  std::uint32_t position = 0, end = 0;
  alignas(64) std::uint32_t words[capacity + padding] = {};
};

// Eight pcg32 streams side by side for the lockstep draws of the bootstrap, which advance the
// generators themselves and keep no buffer: lane l's words are its own pcg32 outputs in order.
struct lane_stream {
  static constexpr std::uint32_t lanes = 8;
  alignas(64) std::uint64_t state[lanes];
  std::uint64_t increment[lanes];  // odd: pcg32's stream constant
};

// pcg32's multiplier (the 64-bit LCG multiplier of pcg-cpp, from L'Ecuyer 1999).
inline constexpr std::uint64_t pcg_multiplier = 6364136223846793005ULL;

// The bounded draws of one resample, in the order they use words: draw i is uniform on
// [0, range[i]). threshold[i] = 2^32 mod range[i]: a word whose product with range[i] has a low
// half below it is rejected and the next word is tried (Lemire 2019, ACM TOMACS 29:1, Alg. 5).
// Both arrays hold `count` entries and then padding up to a multiple of 16 with range 1 and
// threshold 0 (never rejected, never used). A draw gives its index multiplied by 2^scale (the
// bootstrap wants byte offsets of 16-byte entries: scale 4).
struct draw_plan {
  const std::uint32_t* range = nullptr;
  const std::uint32_t* threshold = nullptr;
  std::uint32_t count = 0;
  std::uint32_t scale = 0;
};

// Lockstep draws (the bootstrap): resamples are made eight at a time, and resample l of such a
// chunk takes its words from lane l of a lane_stream alone, so that one step of the eight
// generators gives the k-th draws of all eight resamples. The draws of a resample are cut into
// segments of lockstep_segment draws (the last may be shorter); in a segment each lane takes
// its next word for each draw, and tries the following word after a rejection, as above. The
// segment then moves every generator on by as many steps as the hungriest lane took, the others
// skipping the rest of their words. While no word is rejected (nearly always: a word is
// rejected with probability below range / 2^32), a segment of m draws takes exactly m steps,
// and the vector code needs no branch.
inline constexpr std::uint32_t lockstep_segment = 128;

// A permutation resample reassigns the N pooled observations: a partial Fisher-Yates shuffle
// (Durstenfeld 1964) fills positions N-1, N-2, ... from a uniform position in [0, i], group 0
// takes the first sizes[0] positions filled, group 1 the next sizes[1], and so on for the
// `drawn` groups; the last group keeps what is left and its sums follow from the totals.
struct permutation_shape {
  std::uint32_t n = 0;      // pooled observations
  std::uint32_t drawn = 0;  // groups filled by the shuffle (all but the last)
  const std::uint32_t* sizes = nullptr;
};

// A bootstrap resample draws n_g values with replacement from each group g. The values come as
// entries of a table, each a (sum, sum of squares) pair: one entry per observation (x, x*x),
// and for a small group also one per ordered pair of observations (x_i + x_j, x_i*x_i + x_j*x_j),
// entry i * n + j, so that one draw on [0, n^2) stands for two independent draws on [0, n)
// (Efron & Tibshirani 1993: the bootstrap sum is that of n independent uniform picks; how they
// are grouped in the addition does not change the law). Group g makes draws[g] draws, in the
// lockstep order above: the first pairs[g] pick entries pair_base[g] + k, the rest
// single_base[g] + k. A group's (sum, sum of squares) starts from (+0.0, +0.0) and adds its
// entries one by one in the order of the draws.
struct bootstrap_shape {
  std::uint32_t groups = 0;
  const std::uint32_t* draws = nullptr;
  const std::uint32_t* pairs = nullptr;
  const std::uint32_t* pair_base = nullptr;
  const std::uint32_t* single_base = nullptr;
};

// What one pass over values x finds for two brackets [low_k, high_k] (quantiles_linear in
// resample_intervals.cpp): how many values lie below each, and the values inside each, in the
// order of x. The pass looks at its values 1024 at a time and stops before a stretch if a
// buffer already holds more than `capacity` values (the caller then selects in full).
struct bracket_pass {
  std::uint64_t below[2] = {0, 0};
  std::uint64_t kept[2] = {0, 0};
  bool unordered = false;  // a NaN was seen
  bool stopped = false;    // a buffer filled up: the counts are incomplete
};

// One instruction-set level's kernels. Permutation output rows: per resample, (sum, sum of
// squares) of each drawn group in order, 2 * drawn doubles; the bootstrap's layout is below.
struct resample_kernels {
  const char* level;
  // Makes words until the buffer holds `capacity` of them from position on.
  void (*refill)(word_stream& stream);
  // `count` resamples' draws of the plan, one row of plan.count indices each (out holds
  // count * plan.count + 16): the draws the two kernels below make, for tests.
  void (*draws)(word_stream& stream, const draw_plan& plan, std::uint64_t count, std::uint32_t* out);
  // `count` reassignments of data[0..n) (n + 8 doubles readable), continuing from its order.
  // scratch holds plan.count + 16 indices.
  void (*permutation_sums)(word_stream& stream, const draw_plan& plan, const permutation_shape& shape, double* data,
                           std::uint64_t count, double* out, std::uint32_t* scratch);
  // The pass of bracket_pass over x[0..n); bounds = {low_0, high_0, low_1, high_1}; keep0 and
  // keep1 hold capacity + 1032 values.
  void (*bracket_scan)(const double* x, std::size_t n, const double* bounds, double* keep0, double* keep1,
                       std::size_t capacity, bracket_pass& out);
  // `count` resamples with replacement within each group, in lockstep chunks of eight; entries
  // as in bootstrap_shape, the plan's scale 4. For chunk c, group g and lane l the sum is
  // out[(c * groups + g) * 16 + l] and the sum of squares 8 places further (a chunk's unused
  // lanes are drawn and written too); scratch holds 16 * lockstep_segment indices.
  void (*bootstrap_sums)(lane_stream& stream, const draw_plan& plan, const bootstrap_shape& shape,
                         const double* entries, std::uint64_t count, double* out, std::uint64_t* scratch);
  // The lockstep draws of `chunks` chunks of eight resamples (for tests): draw k of lane l of
  // chunk c is out[(c * plan.count + k) * 8 + l], times 2^scale.
  void (*lockstep_draws)(lane_stream& stream, const draw_plan& plan, std::uint64_t chunks, std::uint64_t* out);
};

// The fastest level this processor runs.
const resample_kernels& best_kernels();

// Every level this processor runs, fastest first, ending with the portable one (for tests
// that check the levels agree bit for bit). Returns how many were written to out (at most 4).
std::size_t available_kernels(const resample_kernels** out);

}  // namespace contrasta::detail
