// The resampling kernels, included once per instruction-set level by the files beside this
// one, each compiled with its own flags and defining CONTRASTA_KERNEL_LEVEL (a namespace
// name). Everything here lives in that namespace and uses only compiler built-ins, intrinsics
// and GCC vector extensions, never an inline function shared with other files: a shared inline
// function compiled for AVX-512 could otherwise be the copy the linker keeps for everyone.
//
// Two ways to compute the same numbers: AVX-512 vectors where the level has them (and AVX2
// vectors for the bootstrap's generators), and plain loops over eight scalar lanes elsewhere
// (which the compiler vectorises as the level allows; 64-byte vector types split into halves
// ran several times slower on AVX2). Definitions every
// level follows exactly (resample_kernels.hpp):
// - words: lane l of eight pcg32 streams gives words l, l+8, l+16, ...;
// - a draw takes the next word w and returns (w * range) >> 32, unless the low half of the
//   product is below the threshold, when it takes the next word instead; a permutation
//   resample takes the stream's next words, a bootstrap resample those of its lane (lockstep);
// - a permutation sum over a sequence x_0..x_{m-1} keeps eight partial sums, lane l adding
//   x_l, x_{l+8}, ... in order from +0.0, with +0.0 added for the positions past m in the last
//   eight, and ends as ((a0+a4)+(a2+a6)) + ((a1+a5)+(a3+a7)); a bootstrap sum adds its entries
//   one by one from +0.0 in the order of the draws; the square of x is x*x (rounded, never
//   fused: the kernels are compiled with -ffp-contract=off).
#include <cstddef>
#include <cstdint>

#include "../resample_kernels.hpp"

#if defined(__AVX512F__) && defined(__AVX512DQ__) && defined(__AVX512VL__)
#define CONTRASTA_KERNEL_AVX512 1
#elif defined(__AVX2__)
#define CONTRASTA_KERNEL_AVX2 1
#endif
#if defined(CONTRASTA_KERNEL_AVX512) || defined(CONTRASTA_KERNEL_AVX2)
// GCC 12's AVX-512 intrinsics start from an undefined register that it then reports as used
// uninitialised (GCC bug 105593, fixed in GCC 13); the pragma covers the header's own lines.
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
#endif
#include <immintrin.h>
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic pop
#endif
#endif

#ifndef CONTRASTA_KERNEL_LEVEL
#error "define CONTRASTA_KERNEL_LEVEL before including kernels/body.hpp"
#endif

namespace contrasta::detail::kernel_levels::CONTRASTA_KERNEL_LEVEL {
namespace {

constexpr std::uint32_t lanes = word_stream::lanes;

// ---- words ----------------------------------------------------------------------------------

// PCG-XSH-RR on a state (pcg32 outputs the state before it advances): xorshift high bits down,
// keep 32, rotate right by the top five bits.
inline std::uint32_t pcg_output(std::uint64_t state) {
  const auto x = static_cast<std::uint32_t>(((state >> 18) ^ state) >> 27);
  const auto rotation = static_cast<unsigned>(state >> 59);
  return (x >> rotation) | (x << ((32 - rotation) & 31));
}

void refill(word_stream& s) {
  const std::uint32_t left = s.end - s.position;
  __builtin_memmove(s.words, s.words + s.position, sizeof(std::uint32_t) * left);
  std::uint32_t steps = (word_stream::capacity - left) / lanes;
  std::uint32_t* out = s.words + left;
  s.position = 0;
  s.end = left + steps * lanes;
#if defined(CONTRASTA_KERNEL_AVX512)
  // Four consecutive states of every lane advance together by four steps at a time: the LCG
  // jumped ahead, s' = A^4 s + c (A^3 + A^2 + A + 1) (Brown 1994, "Random number generation with
  // arbitrary strides"), which gives the same states as four single steps but four independent
  // multiplications (vpmullq) instead of one chain of them.
  constexpr std::uint64_t a = pcg_multiplier, a4 = a * a * a * a, c4 = (1 + a) * (1 + a * a);
  const __m512i increment = _mm512_loadu_si512(s.increment);
  const __m512i m1 = _mm512_set1_epi64(static_cast<long long>(a)), m4 = _mm512_set1_epi64(static_cast<long long>(a4));
  const __m512i k4 = _mm512_mullo_epi64(increment, _mm512_set1_epi64(static_cast<long long>(c4)));
  auto step = [&](__m512i st) { return _mm512_add_epi64(_mm512_mullo_epi64(st, m1), increment); };
  // the output: a dword rotate by the count in each low dword, then the low dwords kept
  auto output = [](__m512i st) {
    const __m512i x = _mm512_srli_epi64(_mm512_xor_si512(_mm512_srli_epi64(st, 18), st), 27);
    return _mm512_cvtepi64_epi32(_mm512_rorv_epi32(x, _mm512_srli_epi64(st, 59)));
  };
  __m512i t[4];
  t[0] = _mm512_loadu_si512(s.state);
  t[1] = step(t[0]);
  t[2] = step(t[1]);
  t[3] = step(t[2]);
  for (; steps >= 4; steps -= 4, out += 4 * lanes)
    for (int k = 0; k < 4; ++k) {
      _mm256_storeu_si256(reinterpret_cast<__m256i*>(out + k * lanes), output(t[k]));
      t[k] = _mm512_add_epi64(_mm512_mullo_epi64(t[k], m4), k4);
    }
  // the last one to three steps, and the state after them
  for (std::uint32_t k = 0; k < steps; ++k) _mm256_storeu_si256(reinterpret_cast<__m256i*>(out + k * lanes), output(t[k]));
  _mm512_storeu_si512(s.state, t[steps]);
#else
  // eight independent lanes: no chain to break
  std::uint64_t state[lanes];
  __builtin_memcpy(state, s.state, sizeof state);
  for (std::uint32_t k = 0; k < steps; ++k, out += lanes)
    for (std::uint32_t l = 0; l < lanes; ++l) {
      out[l] = pcg_output(state[l]);
      state[l] = state[l] * pcg_multiplier + s.increment[l];
    }
  __builtin_memcpy(s.state, state, sizeof state);
#endif
}

// Makes sure `count` words can be read from s.words + s.position.
inline void reserve(word_stream& s, std::uint32_t count) {
  if (s.end - s.position < count) refill(s);
}

inline std::uint32_t next_word(word_stream& s) {
  reserve(s, 1);
  return s.words[s.position++];
}

// The draws of one resample: many at a time when no word of the resample is rejected (the
// usual case: a word is rejected with probability below range / 2^32), else one by one, which
// gives the same indices whenever the fast way applies.
inline void draw(word_stream& s, const draw_plan& plan, std::uint32_t* __restrict index) {
  bool rejected = true;  // more draws than one buffer holds: one by one
  if (plan.count <= word_stream::capacity) {
    reserve(s, plan.count);
    const std::uint32_t* __restrict w = s.words + s.position;
    const std::uint32_t* __restrict range = plan.range;
    const std::uint32_t* __restrict threshold = plan.threshold;
    const std::uint32_t count = plan.count;
#if defined(CONTRASTA_KERNEL_AVX512)
    // Sixteen draws at a time: vpmuludq multiplies the even 32-bit lanes, so the odd words are
    // shifted down for a second product, and the high and low halves are put back in order.
    const __m512i low_half = _mm512_set1_epi64(0xffffffffLL), high_half = _mm512_set1_epi64(~0xffffffffLL);
    const __m128i scale = _mm_cvtsi32_si128(static_cast<int>(plan.scale));
    __mmask16 bad = 0;
    for (std::uint32_t i = 0; i < count; i += 16) {
      const __m512i word = _mm512_loadu_si512(w + i), bound = _mm512_loadu_si512(range + i);
      const __m512i even = _mm512_mul_epu32(word, bound);
      const __m512i odd = _mm512_mul_epu32(_mm512_srli_epi64(word, 32), _mm512_srli_epi64(bound, 32));
      const __m512i drawn = _mm512_or_si512(_mm512_srli_epi64(even, 32), _mm512_and_si512(odd, high_half));
      _mm512_storeu_si512(index + i, _mm512_sll_epi32(drawn, scale));
      const __m512i low = _mm512_or_si512(_mm512_and_si512(even, low_half), _mm512_slli_epi64(odd, 32));
      bad |= _mm512_cmplt_epu32_mask(low, _mm512_loadu_si512(threshold + i));
    }
    rejected = bad != 0;
#else
    std::uint32_t bad = 0;
    for (std::uint32_t i = 0; i < count; ++i) {
      const std::uint64_t product = static_cast<std::uint64_t>(w[i]) * range[i];
      index[i] = static_cast<std::uint32_t>(product >> 32) << plan.scale;
      bad |= static_cast<std::uint32_t>(product) < threshold[i];
    }
    rejected = bad != 0;
#endif
  }
  if (!rejected) {
    s.position += plan.count;
    return;
  }
  for (std::uint32_t i = 0; i < plan.count; ++i) {
    for (;;) {
      const std::uint64_t product = static_cast<std::uint64_t>(next_word(s)) * plan.range[i];
      if (static_cast<std::uint32_t>(product) >= plan.threshold[i]) {
        index[i] = static_cast<std::uint32_t>(product >> 32) << plan.scale;
        break;
      }
    }
  }
}

// ---- sums -----------------------------------------------------------------------------------

#if defined(CONTRASTA_KERNEL_AVX512)
typedef std::int64_t i64x8 __attribute__((vector_size(64)));
typedef double f64x8 __attribute__((vector_size(64)));

// +0.0 in the lanes whose mask bit is 0.
inline f64x8 keep(f64x8 x, __mmask8 mask) {
  return reinterpret_cast<f64x8>(_mm512_maskz_mov_pd(mask, reinterpret_cast<__m512d>(x)));
}
inline double reduce(f64x8 a) {
  return ((a[0] + a[4]) + (a[2] + a[6])) + ((a[1] + a[5]) + (a[3] + a[7]));
}
inline __mmask8 first_lanes(std::uint32_t k) {
  return static_cast<__mmask8>((1U << k) - 1);
}

// Sum and sum of squares of x[0..m).
inline void contiguous_sums(const double* x, std::uint32_t m, double* out) {
  f64x8 sum = {}, square = {};
  std::uint32_t i = 0;
  for (; i + 8 <= m; i += 8) {
    const f64x8 v = reinterpret_cast<f64x8>(_mm512_loadu_pd(x + i));
    sum += v;
    square += v * v;
  }
  if (i < m) {
    const f64x8 v = reinterpret_cast<f64x8>(_mm512_maskz_loadu_pd(first_lanes(m - i), x + i));
    sum += v;
    square += v * v;
  }
  out[0] = reduce(sum);
  out[1] = reduce(square);
}

#else
inline double reduce(const double* a) {
  return ((a[0] + a[4]) + (a[2] + a[6])) + ((a[1] + a[5]) + (a[3] + a[7]));
}

// Sum and sum of squares of x(0..m) in the documented lane order.
template <class Value>
inline void lane_sums(Value x, std::uint32_t m, double* out) {
  double sum[lanes] = {}, square[lanes] = {};
  std::uint32_t i = 0;
  for (; i + lanes <= m; i += lanes)
    for (std::uint32_t l = 0; l < lanes; ++l) {
      const double v = x(i + l);
      sum[l] += v;
      square[l] += v * v;
    }
  if (i < m)
    for (std::uint32_t l = 0; l < lanes; ++l) {
      const double v = i + l < m ? x(i + l) : 0.0;
      sum[l] += v;
      square[l] += v * v;
    }
  out[0] = reduce(sum);
  out[1] = reduce(square);
}

inline void contiguous_sums(const double* x, std::uint32_t m, double* out) {
  lane_sums([x](std::uint32_t i) { return x[i]; }, m, out);
}

#endif

// ---- resamples ------------------------------------------------------------------------------

void draws(word_stream& s, const draw_plan& plan, std::uint64_t count, std::uint32_t* out) {
  for (std::uint64_t r = 0; r < count; ++r, out += plan.count) draw(s, plan, out);
}

void permutation_sums(word_stream& s, const draw_plan& plan, const permutation_shape& shape, double* data,
                      std::uint64_t count, double* out, std::uint32_t* index) {
  for (std::uint64_t r = 0; r < count; ++r) {
    draw(s, plan, index);
    // Fisher-Yates: position n-1-i takes a uniform one of positions [0, n-1-i].
    std::uint32_t position = shape.n;
    for (std::uint32_t i = 0; i < plan.count; ++i) {
      --position;
      const std::uint32_t j = index[i];
      const double picked = data[j];
      data[j] = data[position];
      data[position] = picked;
    }
    std::uint32_t top = shape.n;
    for (std::uint32_t g = 0; g < shape.drawn; ++g) {
      top -= shape.sizes[g];
      contiguous_sums(data + top, shape.sizes[g], out);
      out += 2;
    }
  }
}

// ---- lockstep draws and bootstrap sums ------------------------------------------------------
// (resample_kernels.hpp, lockstep_segment) Lane l of a chunk of eight resamples takes its words
// from generator l of a lane_stream, which these functions advance directly: row k of a
// segment is one step of all eight generators, and draw k of every lane comes from it unless a
// word is rejected.

#if defined(CONTRASTA_KERNEL_AVX512)
// The eight generators in one vector.
struct lane_generators {
  __m512i state, increment, multiplier;
  explicit lane_generators(const lane_stream& s)
      : state(_mm512_loadu_si512(s.state)),
        increment(_mm512_loadu_si512(s.increment)),
        multiplier(_mm512_set1_epi64(static_cast<long long>(pcg_multiplier))) {}
  void store(std::uint64_t* to) const { _mm512_storeu_si512(to, state); }
  void load(const std::uint64_t* from) { state = _mm512_loadu_si512(from); }
  // One row: the eight lanes' draws on [0, range), each times 2^scale, written to out[0..8);
  // non-zero if a lane's word is rejected. PCG-XSH-RR's output sits in each lane's low dword,
  // which is where vpmuludq reads it.
  std::uint32_t row(std::uint32_t range, std::uint32_t threshold, __m128i scale, std::uint64_t* out) {
    const __m512i x = _mm512_srli_epi64(_mm512_xor_si512(_mm512_srli_epi64(state, 18), state), 27);
    const __m512i word = _mm512_rorv_epi32(x, _mm512_srli_epi64(state, 59));
    state = _mm512_add_epi64(_mm512_mullo_epi64(state, multiplier), increment);
    const __m512i product = _mm512_mul_epu32(word, _mm512_set1_epi32(static_cast<int>(range)));
    _mm512_storeu_si512(out, _mm512_sll_epi64(_mm512_srli_epi64(product, 32), scale));
    // the low halves of the products are the even dwords
    return _mm512_mask_cmplt_epu32_mask(0x5555, product, _mm512_set1_epi32(static_cast<int>(threshold)));
  }
};
inline __m128i index_scale(std::uint32_t scale) {
  return _mm_cvtsi32_si128(static_cast<int>(scale));
}
#elif defined(CONTRASTA_KERNEL_AVX2)
// The eight generators in two vectors of four. AVX2 has no 64-bit multiply: the low half of a
// 64-bit product is a_lo b_lo + ((a_hi b_lo + a_lo b_hi) << 32), three 32-bit multiplies, which
// for four lanes still beats four scalar ones with the output function around them.
struct lane_generators {
  __m256i state[2], increment[2];
  explicit lane_generators(const lane_stream& s) {
    for (int h = 0; h < 2; ++h)
      increment[h] = _mm256_loadu_si256(reinterpret_cast<const __m256i*>(s.increment + 4 * h));
    load(s.state);
  }
  void store(std::uint64_t* to) const {
    for (int h = 0; h < 2; ++h) _mm256_storeu_si256(reinterpret_cast<__m256i*>(to + 4 * h), state[h]);
  }
  void load(const std::uint64_t* from) {
    for (int h = 0; h < 2; ++h) state[h] = _mm256_loadu_si256(reinterpret_cast<const __m256i*>(from + 4 * h));
  }
  static __m256i times_multiplier(__m256i a) {
    const __m256i low = _mm256_set1_epi64x(static_cast<long long>(pcg_multiplier & 0xffffffffULL));
    const __m256i high = _mm256_set1_epi64x(static_cast<long long>(pcg_multiplier >> 32));
    const __m256i cross = _mm256_add_epi64(_mm256_mul_epu32(_mm256_srli_epi64(a, 32), low), _mm256_mul_epu32(a, high));
    return _mm256_add_epi64(_mm256_mul_epu32(a, low), _mm256_slli_epi64(cross, 32));
  }
  std::uint32_t row(std::uint32_t range, std::uint32_t threshold, __m128i scale, std::uint64_t* out) {
    const __m256i bound = _mm256_set1_epi32(static_cast<int>(range));
    const __m256i sign = _mm256_set1_epi32(static_cast<int>(0x80000000U));
    const __m256i limit = _mm256_set1_epi32(static_cast<int>(threshold ^ 0x80000000U));
    std::uint32_t bad = 0;
    for (int h = 0; h < 2; ++h) {
      const __m256i st = state[h];
      const __m256i x = _mm256_srli_epi64(_mm256_xor_si256(_mm256_srli_epi64(st, 18), st), 27);
      // rotate the low dwords right by st >> 59; a variable shift by 32 gives 0, as rotation 0 needs
      const __m256i rotation = _mm256_srli_epi64(st, 59);
      const __m256i word = _mm256_or_si256(_mm256_srlv_epi32(x, rotation),
                                           _mm256_sllv_epi32(x, _mm256_sub_epi32(_mm256_set1_epi32(32), rotation)));
      state[h] = _mm256_add_epi64(times_multiplier(st), increment[h]);
      const __m256i product = _mm256_mul_epu32(word, bound);
      _mm256_storeu_si256(reinterpret_cast<__m256i*>(out + 4 * h), _mm256_sll_epi64(_mm256_srli_epi64(product, 32), scale));
      // low half below the threshold, unsigned: both sign bits flipped, then a signed compare
      const __m256i below = _mm256_cmpgt_epi32(limit, _mm256_xor_si256(product, sign));
      bad |= static_cast<std::uint32_t>(_mm256_movemask_ps(_mm256_castsi256_ps(below))) & 0x55U;
    }
    return bad;
  }
};
inline __m128i index_scale(std::uint32_t scale) {
  return _mm_cvtsi32_si128(static_cast<int>(scale));
}
#else
// The eight generators lane by lane (the compiler vectorises what the level allows).
struct lane_generators {
  std::uint64_t state[lanes], increment[lanes];
  explicit lane_generators(const lane_stream& s) {
    __builtin_memcpy(state, s.state, sizeof state);
    __builtin_memcpy(increment, s.increment, sizeof increment);
  }
  void store(std::uint64_t* to) const { __builtin_memcpy(to, state, sizeof state); }
  void load(const std::uint64_t* from) { __builtin_memcpy(state, from, sizeof state); }
  std::uint32_t row(std::uint32_t range, std::uint32_t threshold, std::uint32_t scale, std::uint64_t* out) {
    std::uint32_t word[lanes];
    for (std::uint32_t l = 0; l < lanes; ++l) {
      word[l] = pcg_output(state[l]);
      state[l] = state[l] * pcg_multiplier + increment[l];
    }
    // apart from the words, so that this loop vectorises
    std::uint32_t bad = 0;
    for (std::uint32_t l = 0; l < lanes; ++l) {
      const std::uint64_t product = static_cast<std::uint64_t>(word[l]) * range;
      out[l] = (product >> 32) << scale;
      bad |= static_cast<std::uint32_t>(product) < threshold;
    }
    return bad;
  }
};
inline std::uint32_t index_scale(std::uint32_t scale) {
  return scale;
}
#endif

// After a rejection in rows [first, first + m): the rows again lane by lane, word by word, from
// each lane's state before them (start), which gives the same draws wherever no word was
// rejected; then every lane moves on by as many steps as the hungriest lane took.
inline void redraw_rows(lane_generators& generators, const std::uint64_t* start, const std::uint64_t* increment,
                        const draw_plan& plan, std::uint32_t first, std::uint32_t m, std::uint64_t* index) {
  std::uint32_t rows = 0;
  for (std::uint32_t l = 0; l < lanes; ++l) {
    std::uint64_t state = start[l];
    std::uint32_t steps = 0;
    for (std::uint32_t k = 0; k < m; ++k)
      for (;;) {
        const std::uint64_t product = static_cast<std::uint64_t>(pcg_output(state)) * plan.range[first + k];
        state = state * pcg_multiplier + increment[l];
        ++steps;
        if (static_cast<std::uint32_t>(product) >= plan.threshold[first + k]) {
          index[lanes * k + l] = (product >> 32) << plan.scale;
          break;
        }
      }
    rows = steps > rows ? steps : rows;
  }
  std::uint64_t state[lanes];
  for (std::uint32_t l = 0; l < lanes; ++l) {
    state[l] = start[l];
    for (std::uint32_t k = 0; k < rows; ++k) state[l] = state[l] * pcg_multiplier + increment[l];
  }
  generators.load(state);
}

// Rows [first, first + m) of a chunk into index (index[8 * k + l]: draw first + k of lane l).
inline void draw_rows(lane_generators& generators, const std::uint64_t* increment, const draw_plan& plan,
                      std::uint32_t first, std::uint32_t m, std::uint64_t* index) {
  std::uint64_t start[lanes];
  generators.store(start);
  const auto scale = index_scale(plan.scale);
  const std::uint32_t* const range = plan.range + first;
  const std::uint32_t* const threshold = plan.threshold + first;
  std::uint32_t bad = 0;
  for (std::uint32_t k = 0; k < m; ++k) bad |= generators.row(range[k], threshold[k], scale, index + lanes * k);
  if (bad != 0) redraw_rows(generators, start, increment, plan, first, m, index);
}

typedef double f64x2 __attribute__((vector_size(16)));

// Adds row k's entries to the eight lanes' sums: lane l picks the 16-byte entry (a sum and a sum
// of squares side by side, so one load and one two-wide addition take both) at byte offset
// o[l] of table.
inline void add_row(const char* table, const std::uint64_t* o, f64x2* lane) {
  for (std::uint32_t l = 0; l < lanes; ++l) {  // constant displacements: no index arithmetic
    f64x2 e;
    __builtin_memcpy(&e, table + o[l], sizeof e);
    lane[l] += e;
  }
}

// The sums of group g's rows [low, high) of the current segment (starting at row `first`), added
// to the chunk's sums in out; `during` runs after each row (the next chunk's draws).
template <class During>
inline void group_rows(const bootstrap_shape& shape, const double* entries, std::uint32_t g, std::uint32_t begin,
                       std::uint32_t low, std::uint32_t high, std::uint32_t first, const std::uint64_t* index,
                       double* out, During&& during) {
  const std::uint32_t split = begin + shape.pairs[g];  // pair draws before, single draws after
  double* const group_sums = out + 2 * lanes * g;
  f64x2 lane[lanes];
  for (std::uint32_t l = 0; l < lanes; ++l) lane[l] = f64x2{group_sums[l], group_sums[lanes + l]};
  const char* const pairs = reinterpret_cast<const char*>(entries + 2 * static_cast<std::size_t>(shape.pair_base[g]));
  const char* const singles =
      reinterpret_cast<const char*>(entries + 2 * static_cast<std::size_t>(shape.single_base[g]));
  const std::uint32_t pairs_end = high < split ? high : split;
  for (std::uint32_t k = low; k < pairs_end; ++k) {
    add_row(pairs, index + lanes * (k - first), lane);
    during(k);
  }
  for (std::uint32_t k = low > split ? low : split; k < high; ++k) {
    add_row(singles, index + lanes * (k - first), lane);
    during(k);
  }
  for (std::uint32_t l = 0; l < lanes; ++l) {
    group_sums[l] = lane[l][0];
    group_sums[lanes + l] = lane[l][1];
  }
}

// Chunks of eight resamples. When a resample's draws fit one segment (every group small), the
// next chunk's rows are drawn while this chunk's are summed: the vector work of the draws then
// overlaps the waits of the table loads, and the indices are read long after they were
// stored. Otherwise segment by segment, draws first and then sums, the sums kept in out.
void bootstrap_sums(lane_stream& s, const draw_plan& plan, const bootstrap_shape& shape, const double* entries,
                    std::uint64_t count, double* out, std::uint64_t* scratch) {
  const std::uint32_t groups = shape.groups;
  const std::size_t chunk = 2 * lanes * static_cast<std::size_t>(groups);  // doubles of one chunk
  lane_generators generators(s);
  if (plan.count <= lockstep_segment) {
    std::uint64_t* current = scratch;
    std::uint64_t* next = scratch + lanes * lockstep_segment;
    std::uint64_t start[lanes];
    const auto scale = index_scale(plan.scale);
    if (count > 0) draw_rows(generators, s.increment, plan, 0, plan.count, current);
    for (std::uint64_t r = 0; r < count; r += lanes, out += chunk) {
      for (std::size_t i = 0; i < chunk; ++i) out[i] = 0.0;
      std::uint32_t bad = 0;
      // local copies: the stores of the draws could otherwise alias the plan and be reloaded
      const std::uint32_t* const range = plan.range;
      const std::uint32_t* const threshold = plan.threshold;
      std::uint64_t* const rows = next;
      auto draw_next = [&generators, &bad, range, threshold, scale, rows](std::uint32_t k) {
        bad |= generators.row(range[k], threshold[k], scale, rows + lanes * k);
      };
      const bool more = r + lanes < count;
      if (more) generators.store(start);
      for (std::uint32_t g = 0, begin = 0; g < groups; begin += shape.draws[g], ++g) {
        const std::uint32_t end = begin + shape.draws[g];
        if (more)
          group_rows(shape, entries, g, begin, begin, end, 0, current, out, draw_next);
        else
          group_rows(shape, entries, g, begin, begin, end, 0, current, out, [](std::uint32_t) {});
      }
      if (more && bad != 0) redraw_rows(generators, start, s.increment, plan, 0, plan.count, next);
      std::uint64_t* t = current;
      current = next;
      next = t;
    }
  } else {
    for (std::uint64_t r = 0; r < count; r += lanes, out += chunk) {
      for (std::size_t i = 0; i < chunk; ++i) out[i] = 0.0;
      for (std::uint32_t first = 0; first < plan.count; first += lockstep_segment) {
        const std::uint32_t m = plan.count - first < lockstep_segment ? plan.count - first : lockstep_segment;
        draw_rows(generators, s.increment, plan, first, m, scratch);
        for (std::uint32_t g = 0, begin = 0; g < groups && begin < first + m; begin += shape.draws[g], ++g) {
          const std::uint32_t end = begin + shape.draws[g];
          if (end <= first) continue;
          group_rows(shape, entries, g, begin, begin > first ? begin : first, end < first + m ? end : first + m, first,
                     scratch, out, [](std::uint32_t) {});
        }
      }
    }
  }
  generators.store(s.state);
}

void lockstep_draws(lane_stream& s, const draw_plan& plan, std::uint64_t chunks, std::uint64_t* out) {
  lane_generators generators(s);
  for (std::uint64_t c = 0; c < chunks; ++c)
    for (std::uint32_t first = 0; first < plan.count; first += lockstep_segment) {
      const std::uint32_t m = plan.count - first < lockstep_segment ? plan.count - first : lockstep_segment;
      draw_rows(generators, s.increment, plan, first, m, out + lanes * (c * plan.count + first));
    }
  generators.store(s.state);
}

// ---- quantile brackets ----------------------------------------------------------------------

void bracket_scan(const double* x, std::size_t n, const double* bounds, double* keep0, double* keep1,
                  std::size_t capacity, bracket_pass& out) {
  constexpr std::size_t stretch = 1024;
  std::uint64_t below0 = 0, below1 = 0, end0 = 0, end1 = 0;
  bool unordered = false, stopped = false;
  for (std::size_t start = 0; start < n; start += stretch) {
    if (end0 > capacity || end1 > capacity) {
      stopped = true;
      break;
    }
    const std::size_t stop = start + stretch < n ? start + stretch : n;
#if defined(CONTRASTA_KERNEL_AVX512)
    // eight values at a time: compare masks, their population counts, and a compress that packs
    // the kept values to the front of a vector stored at the buffer's end
    const __m512d low0 = _mm512_set1_pd(bounds[0]), high0 = _mm512_set1_pd(bounds[1]);
    const __m512d low1 = _mm512_set1_pd(bounds[2]), high1 = _mm512_set1_pd(bounds[3]);
    __mmask8 nan = 0;
    for (std::size_t i = start; i < stop; i += 8) {
      const __mmask8 lanes_in = stop - i >= 8 ? __mmask8(0xff) : __mmask8((1U << (stop - i)) - 1);
      const __m512d v = _mm512_maskz_loadu_pd(lanes_in, x + i);
      nan |= _mm512_mask_cmp_pd_mask(lanes_in, v, v, _CMP_UNORD_Q);
      const __mmask8 under0 = _mm512_mask_cmp_pd_mask(lanes_in, v, low0, _CMP_LT_OQ);
      const __mmask8 under1 = _mm512_mask_cmp_pd_mask(lanes_in, v, low1, _CMP_LT_OQ);
      const __mmask8 in0 =
          _mm512_mask_cmp_pd_mask(_mm512_mask_cmp_pd_mask(lanes_in, v, low0, _CMP_GE_OQ), v, high0, _CMP_LE_OQ);
      const __mmask8 in1 =
          _mm512_mask_cmp_pd_mask(_mm512_mask_cmp_pd_mask(lanes_in, v, low1, _CMP_GE_OQ), v, high1, _CMP_LE_OQ);
      below0 += static_cast<unsigned>(__builtin_popcount(under0));
      below1 += static_cast<unsigned>(__builtin_popcount(under1));
      _mm512_storeu_pd(keep0 + end0, _mm512_maskz_compress_pd(in0, v));
      end0 += static_cast<unsigned>(__builtin_popcount(in0));
      _mm512_storeu_pd(keep1 + end1, _mm512_maskz_compress_pd(in1, v));
      end1 += static_cast<unsigned>(__builtin_popcount(in1));
    }
    unordered |= nan != 0;
#else
    // each value written to both buffers and kept by moving the end past it or not: no branch
    // on the data
    const double low0 = bounds[0], high0 = bounds[1], low1 = bounds[2], high1 = bounds[3];
    for (std::size_t i = start; i < stop; ++i) {
      const double v = x[i];
      unordered |= v != v;
      below0 += v < low0;
      below1 += v < low1;
      keep0[end0] = v;
      end0 += (v >= low0) & (v <= high0);
      keep1[end1] = v;
      end1 += (v >= low1) & (v <= high1);
    }
#endif
  }
  out.below[0] = below0;
  out.below[1] = below1;
  out.kept[0] = end0;
  out.kept[1] = end1;
  out.unordered = unordered;
  out.stopped = stopped || end0 > capacity || end1 > capacity;
}

}  // namespace

extern const resample_kernels kernels{
#define CONTRASTA_STRINGIFY2(x) #x
#define CONTRASTA_STRINGIFY(x) CONTRASTA_STRINGIFY2(x)
    CONTRASTA_STRINGIFY(CONTRASTA_KERNEL_LEVEL), refill, draws, permutation_sums, bracket_scan, bootstrap_sums,
    lockstep_draws};
#undef CONTRASTA_STRINGIFY
#undef CONTRASTA_STRINGIFY2

}  // namespace contrasta::detail::kernel_levels::CONTRASTA_KERNEL_LEVEL
