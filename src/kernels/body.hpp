// The resampling kernels, included once per instruction-set level by the files beside this
// one, each compiled with its own -march and defining CONTRASTA_KERNEL_LEVEL (a namespace
// name). Everything here lives in that namespace and uses only compiler built-ins and GCC
// vector extensions, never an inline function shared with other files: a shared inline
// function compiled for AVX-512 could otherwise be the copy the linker keeps for everyone.
//
// Definitions every level follows exactly (resample_kernels.hpp):
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

#if defined(__AVX512F__)
// GCC 12's AVX-512 intrinsics start from an undefined register that it then reports as used
// uninitialised (GCC bug 105593, fixed in GCC 13); the pragma covers the header's own lines.
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
#include <immintrin.h>
#pragma GCC diagnostic pop
#endif

#ifndef CONTRASTA_KERNEL_LEVEL
#error "define CONTRASTA_KERNEL_LEVEL before including kernels/body.hpp"
#endif

// The 64-byte vectors below never cross a function boundary that another file sees (every
// function taking or returning one is internal and inlined), so the ABI note is moot.
#pragma GCC diagnostic ignored "-Wpsabi"

namespace contrasta::detail::kernel_levels::CONTRASTA_KERNEL_LEVEL {
namespace {

typedef std::uint64_t u64x8 __attribute__((vector_size(64)));
typedef std::int64_t i64x8 __attribute__((vector_size(64)));
typedef std::uint32_t u32x8 __attribute__((vector_size(32)));
typedef double f64x8 __attribute__((vector_size(64)));

inline u32x8 load_u32(const std::uint32_t* p) {
  u32x8 v;
  __builtin_memcpy(&v, p, sizeof v);
  return v;
}
inline void store_u32(std::uint32_t* p, u32x8 v) {
  __builtin_memcpy(p, &v, sizeof v);
}
inline f64x8 load_f64(const double* p) {
  f64x8 v;
  __builtin_memcpy(&v, p, sizeof v);
  return v;
}
inline u64x8 widen(u32x8 v) {
  return __builtin_convertvector(v, u64x8);
}

// +0.0 in the lanes whose mask is 0 (a bitwise and: -0.0 stays -0.0 only where kept).
inline f64x8 keep(f64x8 x, i64x8 mask) {
  return reinterpret_cast<f64x8>(reinterpret_cast<i64x8>(x) & mask);
}

inline double reduce(f64x8 a) {
  return ((a[0] + a[4]) + (a[2] + a[6])) + ((a[1] + a[5]) + (a[3] + a[7]));
}

constexpr i64x8 lane_index = {0, 1, 2, 3, 4, 5, 6, 7};

// Eight doubles at base[index[l]]: eight scalar loads. (The gather instructions were slower on
// the processors we measured: AVX-512 and AVX2 gathers took 1.5x and 2x as long in the P3
// bootstrap, bench/RESULTS.md.)
inline f64x8 gather(const double* base, u32x8 index) {
  return f64x8{base[index[0]], base[index[1]], base[index[2]], base[index[3]],
               base[index[4]], base[index[5]], base[index[6]], base[index[7]]};
}

// ---- words ----------------------------------------------------------------------------------

// PCG-XSH-RR on a state (pcg32 outputs the state before it advances): xorshift high bits down,
// keep 32, rotate right by the top five bits.
inline u32x8 pcg_output(u64x8 state) {
  const u64x8 x = (((state >> 18) ^ state) >> 27) & 0xffffffffULL;
  const u64x8 rotation = state >> 59;
  return __builtin_convertvector(((x >> rotation) | (x << ((32 - rotation) & 31))) & 0xffffffffULL, u32x8);
}

void refill(word_stream& s) {
  const std::uint32_t left = s.end - s.position;
  __builtin_memmove(s.words, s.words + s.position, sizeof(std::uint32_t) * left);
  u64x8 state, increment;
  __builtin_memcpy(&state, s.state, sizeof state);
  __builtin_memcpy(&increment, s.increment, sizeof increment);
  std::uint32_t steps = (word_stream::capacity - left) / word_stream::lanes;
  std::uint32_t* out = s.words + left;
  s.position = 0;
  s.end = left + steps * word_stream::lanes;
  // Four consecutive states of every lane advance together by four steps at a time: the LCG
  // jumped ahead, s' = A^4 s + c (A^3 + A^2 + A + 1) (Brown 1994, "Random number generation with
  // arbitrary strides"), which gives the same states as four single steps but four independent
  // multiplications instead of one chain of them.
  constexpr std::uint64_t a = pcg_multiplier, a4 = a * a * a * a;
  const u64x8 c4 = increment * ((1 + a) * (1 + a * a));
  u64x8 s0 = state, s1 = s0 * a + increment, s2 = s1 * a + increment, s3 = s2 * a + increment;
#if defined(__AVX512F__) && defined(__AVX512DQ__)
  // the same steps in AVX-512 instructions: a dword rotate by the count in each low dword,
  // vpmullq for the 64-bit products, vpmovqd to keep the low words
  auto output = [](__m512i st) {
    const __m512i x = _mm512_srli_epi64(_mm512_xor_si512(_mm512_srli_epi64(st, 18), st), 27);
    return _mm512_cvtepi64_epi32(_mm512_rorv_epi32(x, _mm512_srli_epi64(st, 59)));
  };
  __m512i t0 = reinterpret_cast<__m512i>(s0), t1 = reinterpret_cast<__m512i>(s1), t2 = reinterpret_cast<__m512i>(s2),
          t3 = reinterpret_cast<__m512i>(s3);
  const __m512i m4 = _mm512_set1_epi64(static_cast<long long>(a4)), k4 = reinterpret_cast<__m512i>(c4);
  for (; steps >= 4; steps -= 4, out += 4 * word_stream::lanes) {
    _mm256_storeu_si256(reinterpret_cast<__m256i*>(out), output(t0));
    _mm256_storeu_si256(reinterpret_cast<__m256i*>(out + 8), output(t1));
    _mm256_storeu_si256(reinterpret_cast<__m256i*>(out + 16), output(t2));
    _mm256_storeu_si256(reinterpret_cast<__m256i*>(out + 24), output(t3));
    t0 = _mm512_add_epi64(_mm512_mullo_epi64(t0, m4), k4);
    t1 = _mm512_add_epi64(_mm512_mullo_epi64(t1, m4), k4);
    t2 = _mm512_add_epi64(_mm512_mullo_epi64(t2, m4), k4);
    t3 = _mm512_add_epi64(_mm512_mullo_epi64(t3, m4), k4);
  }
  s0 = reinterpret_cast<u64x8>(t0);
  s1 = reinterpret_cast<u64x8>(t1);
  s2 = reinterpret_cast<u64x8>(t2);
  s3 = reinterpret_cast<u64x8>(t3);
#else
  for (; steps >= 4; steps -= 4, out += 4 * word_stream::lanes) {
    store_u32(out, pcg_output(s0));
    store_u32(out + 8, pcg_output(s1));
    store_u32(out + 16, pcg_output(s2));
    store_u32(out + 24, pcg_output(s3));
    s0 = s0 * a4 + c4;
    s1 = s1 * a4 + c4;
    s2 = s2 * a4 + c4;
    s3 = s3 * a4 + c4;
  }
#endif
  // the last one to three steps, and the state after them
  const u64x8 next[4] = {s0, s1, s2, s3};
  for (std::uint32_t i = 0; i < steps; ++i) store_u32(out + 8 * i, pcg_output(next[i]));
  __builtin_memcpy(s.state, &next[steps], sizeof state);
}

// Makes sure `count` words can be read from s.words + s.position.
inline void reserve(word_stream& s, std::uint32_t count) {
  if (s.end - s.position < count) refill(s);
}

inline std::uint32_t next_word(word_stream& s) {
  reserve(s, 1);
  return s.words[s.position++];
}

// The draws of one resample: eight at a time when no word of the resample is rejected (the
// usual case: a word is rejected with probability below range / 2^32), else one by one, which
// gives the same indices whenever the fast way applies.
inline void draw(word_stream& s, const draw_plan& plan, std::uint32_t* __restrict index) {
  std::int64_t any = 0;  // negative when a word is rejected
  if (plan.count > word_stream::capacity) {
    any = -1;  // more draws than one buffer holds: one by one
  } else {
    reserve(s, plan.count);
    const std::uint32_t* __restrict w = s.words + s.position;
    const std::uint32_t* __restrict range = plan.range;
    const std::uint32_t* __restrict threshold = plan.threshold;
    const std::uint32_t count = plan.count;
#if defined(__AVX512F__)
    // Sixteen draws at a time: vpmuludq multiplies the even 32-bit lanes, so the odd words are
    // shifted down for a second product, and the high and low halves are put back in order.
    const __m512i low_half = _mm512_set1_epi64(0xffffffffLL), high_half = _mm512_set1_epi64(~0xffffffffLL);
    __mmask16 rejected = 0;
    for (std::uint32_t i = 0; i < count; i += 16) {
      const __m512i word = _mm512_loadu_si512(w + i), bound = _mm512_loadu_si512(range + i);
      const __m512i even = _mm512_mul_epu32(word, bound);
      const __m512i odd = _mm512_mul_epu32(_mm512_srli_epi64(word, 32), _mm512_srli_epi64(bound, 32));
      _mm512_storeu_si512(index + i, _mm512_or_si512(_mm512_srli_epi64(even, 32), _mm512_and_si512(odd, high_half)));
      const __m512i low = _mm512_or_si512(_mm512_and_si512(even, low_half), _mm512_slli_epi64(odd, 32));
      rejected |= _mm512_cmplt_epu32_mask(low, _mm512_loadu_si512(threshold + i));
    }
    any = rejected ? -1 : 0;
#else
    i64x8 low_minus_threshold = {};
    for (std::uint32_t i = 0; i < count; i += 8) {
      const u64x8 product = widen(load_u32(w + i)) * widen(load_u32(range + i));
      store_u32(index + i, __builtin_convertvector(product >> 32, u32x8));
      low_minus_threshold |= reinterpret_cast<i64x8>(product & 0xffffffffULL) -
                             reinterpret_cast<i64x8>(widen(load_u32(threshold + i)));
    }
    for (int l = 0; l < 8; ++l) any |= low_minus_threshold[l];
#endif
  }
  if (any >= 0) {
    s.position += plan.count;
    return;
  }
  for (std::uint32_t i = 0; i < plan.count; ++i) {
    for (;;) {
      const std::uint64_t product = static_cast<std::uint64_t>(next_word(s)) * plan.range[i];
      if (static_cast<std::uint32_t>(product) >= plan.threshold[i]) {
        index[i] = static_cast<std::uint32_t>(product >> 32);
        break;
      }
    }
  }
}

// ---- sums -----------------------------------------------------------------------------------

// Sum and sum of squares of x[0..m), with x[m..m+8) readable.
inline void contiguous_sums(const double* x, std::uint32_t m, double* out) {
  f64x8 sum = {}, square = {};
  std::uint32_t i = 0;
  for (; i + 8 <= m; i += 8) {
    const f64x8 v = load_f64(x + i);
    sum += v;
    square += v * v;
  }
  if (i < m) {
    const f64x8 v = keep(load_f64(x + i), lane_index < (i64x8{} + static_cast<std::int64_t>(m - i)));
    sum += v;
    square += v * v;
  }
  out[0] = reduce(sum);
  out[1] = reduce(square);
}

// Sum and sum of squares of values[index[0..m)], with index[m..m+8) readable.
inline void gathered_sums(const double* values, const std::uint32_t* index, std::uint32_t m, double* out) {
  f64x8 sum = {}, square = {};
  std::uint32_t i = 0;
  for (; i + 8 <= m; i += 8) {
    const f64x8 v = gather(values, load_u32(index + i));
    sum += v;
    square += v * v;
  }
  if (i < m) {
    const i64x8 mask = lane_index < (i64x8{} + static_cast<std::int64_t>(m - i));
    // past m the indices belong to the next group: read values[0] there instead
    const u32x8 safe = load_u32(index + i) & __builtin_convertvector(mask, u32x8);
    const f64x8 v = keep(gather(values, safe), mask);
    sum += v;
    square += v * v;
  }
  out[0] = reduce(sum);
  out[1] = reduce(square);
}

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

// The draws of a whole resample first, then the sums: loads that read an index stored just
// before stall on store forwarding, so fusing the two passes was slower (bench/RESULTS.md).
void bootstrap_sums(word_stream& s, const draw_plan& plan, const bootstrap_shape& shape, const double* values,
                    std::uint64_t count, double* out, std::uint32_t* index) {
  const std::uint32_t groups = shape.groups;
  const std::uint32_t* const sizes = shape.sizes;
  const std::uint32_t* const offsets = shape.offsets;
  for (std::uint64_t r = 0; r < count; ++r, out += 2 * groups) {
    draw(s, plan, index);
    for (std::uint32_t g = 0, first = 0; g < groups; first += sizes[g], ++g)
      gathered_sums(values + offsets[g], index + first, sizes[g], out + 2 * g);
  }
}

}  // namespace

extern const resample_kernels kernels{
#define CONTRASTA_STRINGIFY2(x) #x
#define CONTRASTA_STRINGIFY(x) CONTRASTA_STRINGIFY2(x)
    CONTRASTA_STRINGIFY(CONTRASTA_KERNEL_LEVEL), refill, draws, permutation_sums, bootstrap_sums};
#undef CONTRASTA_STRINGIFY
#undef CONTRASTA_STRINGIFY2

}  // namespace contrasta::detail::kernel_levels::CONTRASTA_KERNEL_LEVEL
