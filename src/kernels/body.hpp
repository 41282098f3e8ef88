// The resampling kernels, included once per instruction-set level by the files beside this
// one, each compiled with its own flags and defining CONTRASTA_KERNEL_LEVEL (a namespace
// name). Everything here lives in that namespace and uses only compiler built-ins, intrinsics
// and GCC vector extensions, never an inline function shared with other files: a shared inline
// function compiled for AVX-512 could otherwise be the copy the linker keeps for everyone.
//
// Two ways to compute the same numbers: AVX-512 vectors where the level has them, and plain
// loops over eight scalar lanes elsewhere (which the compiler vectorises as the level allows;
// 64-byte vector types split into halves ran several times slower on AVX2). Definitions every
// level follows exactly (resample_kernels.hpp):
// - words: lane l of eight pcg32 streams gives words l, l+8, l+16, ...;
// - a draw takes the next word w and returns (w * range) >> 32, unless the low half of the
//   product is below the threshold, when it takes the next word instead;
// - a sum over a sequence x_0..x_{m-1} keeps eight partial sums, lane l adding x_l, x_{l+8},
//   ... in order from +0.0, with +0.0 added for the positions past m in the last eight, and
//   ends as ((a0+a4)+(a2+a6)) + ((a1+a5)+(a3+a7)); the square of x is x*x (rounded, never
//   fused: the kernels are compiled with -ffp-contract=off).
#include <cstddef>
#include <cstdint>

#include "../resample_kernels.hpp"

#if defined(__AVX512F__) && defined(__AVX512DQ__) && defined(__AVX512VL__)
#define CONTRASTA_KERNEL_AVX512 1
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

// The entries of one group's resample summed in lane order: draw i picks the 16-byte entry
// (a sum and a sum of squares side by side, so one load and one two-wide addition take both)
// at byte offset offset[i] from the group's pair entries for its first `pairs` draws, from its
// single entries for the rest; lane i mod 8 adds it.
typedef double f64x2 __attribute__((vector_size(16)));
inline void entry_sums(const char* pair_entries, const char* single_entries, const std::uint32_t* offset,
                       std::uint32_t draws, std::uint32_t pairs, double* out) {
  f64x2 lane[lanes] = {};
  auto entry = [](const char* at) {
    f64x2 e;
    __builtin_memcpy(&e, at, sizeof e);
    return e;
  };
  // a group has pair draws and at most one single one (odd n), or single draws only
  const std::uint32_t main = pairs > 0 ? pairs : draws;
  const char* const table = pairs > 0 ? pair_entries : single_entries;
  std::uint32_t i = 0;
  for (; i + lanes <= main; i += lanes) {
    const std::uint32_t* o = offset + i;  // constant displacements below, no index arithmetic
    for (std::uint32_t l = 0; l < lanes; ++l) lane[l] += entry(table + o[l]);
  }
  // the last, partial eight: lanes past the end add a zero entry, which leaves a sum that
  // started at +0.0 unchanged (so the sums are those of the definition), and keeps every lane
  // index fixed so that the lanes stay in registers
  if (i < draws) {
    static constexpr double zero[2] = {0.0, 0.0};
    for (std::uint32_t l = 0; l < lanes; ++l) {
      const std::uint32_t k = i + l;
      const char* at = k < main    ? table + offset[k]
                       : k < draws ? single_entries + offset[k]
                                   : reinterpret_cast<const char*>(zero);
      lane[l] += entry(at);
    }
  }
  const f64x2 total = ((lane[0] + lane[4]) + (lane[2] + lane[6])) + ((lane[1] + lane[5]) + (lane[3] + lane[7]));
  out[0] = total[0];
  out[1] = total[1];
}

// The draws of a whole resample first, then the sums: loads that read an index stored just
// before stall on store forwarding, so fusing the two passes was slower (bench/RESULTS.md).
void bootstrap_sums(word_stream& s, const draw_plan& plan, const bootstrap_shape& shape, const double* entries,
                    std::uint64_t count, double* out, std::uint32_t* index) {
  const std::uint32_t groups = shape.groups;
  for (std::uint64_t r = 0; r < count; ++r, out += 2 * groups) {
    draw(s, plan, index);
    for (std::uint32_t g = 0, first = 0; g < groups; first += shape.draws[g], ++g)
      entry_sums(reinterpret_cast<const char*>(entries + 2 * static_cast<std::size_t>(shape.pair_base[g])),
                 reinterpret_cast<const char*>(entries + 2 * static_cast<std::size_t>(shape.single_base[g])),
                 index + first, shape.draws[g], shape.pairs[g], out + 2 * g);
  }
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
    CONTRASTA_STRINGIFY(CONTRASTA_KERNEL_LEVEL), refill, draws, permutation_sums, bracket_scan, bootstrap_sums};
#undef CONTRASTA_STRINGIFY
#undef CONTRASTA_STRINGIFY2

}  // namespace contrasta::detail::kernel_levels::CONTRASTA_KERNEL_LEVEL
