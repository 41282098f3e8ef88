// What permutation and bootstrap share: the pool of observations taking part, contrast
// statistics from group sums, the fixed-block parallel driver, progress and cancellation.
#pragma once
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <functional>
#include <span>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta::detail {

// An observation with its square, stored side by side so that one load brings both sums'
// terms in.
struct observation {
  double value, square;
};

// The observations of the levels taking part in a resampling run, group by group, shifted by
// their pooled mean: a contrast's difference and the within-group sums of squares do not change
// under a common shift, and the shift keeps sum(y^2) - (sum y)^2/n well conditioned.
struct resampling_pool {
  std::vector<std::size_t> levels;   // dataset level of each group, in group order
  std::vector<std::size_t> offsets;  // group g occupies [offsets[g], offsets[g+1])
  std::vector<observation> data;
  double shift = 0;  // pooled mean of the centred values that was subtracted
  double total = 0, total_square = 0;

  std::size_t groups() const { return levels.size(); }
  std::size_t size() const { return data.size(); }
  std::size_t n(std::size_t g) const { return offsets[g + 1] - offsets[g]; }
  std::vector<std::size_t> sizes() const;
};

// The levels with a non-zero coefficient in any of the contrasts, in level order.
std::vector<std::size_t> involved_levels(std::span<const contrast> family);

resampling_pool make_pool(const prepared_data& p, std::span<const std::size_t> levels);

// A contrast over the pool's groups with its factors precomputed:
// psi = sum c_g S_g / n_g and Welch V = sum c_g^2 (Q_g - S_g^2/n_g) / (n_g (n_g - 1)).
struct contrast_terms {
  std::vector<std::size_t> groups;      // pool groups with c_g != 0
  std::vector<double> mean_weight;      // c_g / n_g
  std::vector<double> inverse_n;        // 1 / n_g
  std::vector<double> variance_weight;  // c_g^2 / (n_g (n_g - 1)); NaN when n_g = 1
};

contrast_terms make_terms(const contrast& c, const resampling_pool& pool);

// Difference psi and Welch variance V of a contrast from per-group sums S_g and Q_g.
struct difference_and_variance {
  double difference, variance;
};
inline difference_and_variance evaluate(const contrast_terms& t, const double* sum, const double* sum_square) {
  double d = 0, v = 0;
  for (std::size_t i = 0; i < t.groups.size(); ++i) {
    const std::size_t g = t.groups[i];
    d += t.mean_weight[i] * sum[g];
    // the within-group sum of squares cannot be negative; rounding can make it so
    const double ss = std::max(0.0, sum_square[g] - sum[g] * sum[g] * t.inverse_n[i]);
    v += t.variance_weight[i] * ss;
  }
  return {d, v};
}

// The same for the eight resamples of a bootstrap chunk (resample_kernels.hpp: per group, the
// eight lanes' sums, then their sums of squares): d[l] and v[l] are evaluate() of lane l, in
// the same order of operations, eight lanes at a time so that the compiler can vectorise.
inline void evaluate_chunk(const contrast_terms& t, const double* chunk, double* __restrict d,
                           double* __restrict v) {
  constexpr std::size_t lanes = 8;
  for (std::size_t l = 0; l < lanes; ++l) d[l] = v[l] = 0;
  for (std::size_t i = 0; i < t.groups.size(); ++i) {
    const double* sum = chunk + 2 * lanes * t.groups[i];
    const double* sum_square = sum + lanes;
    const double mean_weight = t.mean_weight[i], variance_weight = t.variance_weight[i], inverse_n = t.inverse_n[i];
    for (std::size_t l = 0; l < lanes; ++l) {
      d[l] += mean_weight * sum[l];
      v[l] += variance_weight * std::max(0.0, sum_square[l] - sum[l] * sum[l] * inverse_n);
    }
  }
}

// The studentized statistic d / sqrt(V), with the conventions of resample.hpp for V = 0.
inline double studentized_value(double d, double v) {
  if (v > 0) return d / std::sqrt(v);
  if (d == 0) return 0.0;
  return std::copysign(HUGE_VAL, d);
}

// "At least as extreme as the observed statistic", with a relative tolerance so that
// arrangements equal to the observed one up to rounding count (methods.md, section 2).
struct extremeness {
  alternative side = alternative::two_sided;
  double observed = 0;
  double tolerance = 0;  // absolute: relative_tolerance * |observed| (0 when infinite)

  extremeness(alternative s, double obs, double relative_tolerance = 1e-12)
      : side(s), observed(obs), tolerance(std::isfinite(obs) ? relative_tolerance * std::abs(obs) : 0.0) {}
  bool operator()(double t) const {
    switch (side) {
      case alternative::greater:
        return t >= observed - tolerance;
      case alternative::less:
        return t <= observed + tolerance;
      default:
        return std::abs(t) >= std::abs(observed) - tolerance;
    }
  }
};

// Number of worker threads for options.threads (0 = all the hardware offers).
int thread_count(const analysis_options& o);

// Runs body(block) for block = 0..blocks-1 on the options' threads. Blocks are the unit of
// reproducibility (each draws from its own stream); the caller combines their results in block
// order. Reports progress through o.progress (serialised, at most about 200 calls, and only
// once the run has lasted a second, then 1.0 at the end) and, when
// o.cancel is set, stops early and throws analysis_error.
void run_blocks(std::uint64_t blocks, const analysis_options& o, const std::function<void(std::uint64_t)>& body);

}  // namespace contrasta::detail
