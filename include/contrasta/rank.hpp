// Rank-based comparisons: mid-ranks and tie counts, Mann-Whitney U with its exact null
// distribution, the Hodges-Lehmann shift, Brunner-Munzel, rank contrasts and Dunn's z.
#pragma once
#include <cstddef>
#include <optional>
#include <span>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

// ---- methods: (prepared data, contrast, options) -> method_result -------------------------

// Permutation test of the studentized contrast of mid-ranks (Conover & Iman 1981): mid-ranks
// computed once on the pooled levels with c_i != 0, then the permutation engine on the ranks.
// estimate = sum c_i (mean mid-rank of level i).
method_result rank_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);
// Mann-Whitney U of the positive-coefficient level (statistic), with the Hodges-Lehmann shift
// and its distribution-free interval (Lehmann 1975) as estimate and interval, in data units
// times the positive coefficient.
method_result mann_whitney_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);
// Brunner-Munzel test; estimate = P(X<Y) + P(X=Y)/2, X the positive-coefficient level.
method_result brunner_munzel_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);
// Dunn's z for a contrast of mean ranks, ranks over all levels, tie corrected (Dunn 1964).
method_result dunn_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

// ---- building blocks on plain samples --------------------------------------------------------

// Mid-ranks (1-based; tied values share the mean of the ranks they occupy), in input order.
std::vector<double> midranks(std::span<const double> x);

// Sizes of the groups of equal values of x, in increasing order of the value.
std::vector<std::size_t> tie_counts(std::span<const double> x);

// sum (t^3 - t) over the groups of equal values: the tie term of Kruskal-Wallis, Mann-Whitney
// and Dunn.
double tie_term(std::span<const double> x);

// The exact null distribution of Mann-Whitney U for samples of m and n without ties:
// cdf[u] = P(U <= u), u = 0..m n. Counted exactly in 128-bit integers as the coefficients of
// the Gaussian binomial [m+n choose m]_q; empty when C(m+n, m) is too large to count exactly
// (about 2^124), where callers use the normal approximation.
std::vector<double> mann_whitney_null_cdf(std::size_t m, std::size_t n);

struct mann_whitney_test {
  double u = 0;  // U of the first sample: #(x > y) + #(x = y)/2
  double p_value = 0;
  bool exact = false;  // exact null distribution (no ties); else normal approximation
  double z = 0;        // the continuity- and tie-corrected z of the normal approximation
};

// Mann-Whitney test of x against y. side: greater = x tends to be larger. With mode automatic
// the exact distribution is used when min(m, n) <= 8 and there are no ties (the rule of
// scipy.stats.mannwhitneyu(method="auto")); always = exact whenever there are no ties;
// never = normal approximation with tie and continuity corrections.
mann_whitney_test mann_whitney(std::span<const double> x, std::span<const double> y, alternative side,
                               exact_mode mode = exact_mode::automatic);

// The k-th smallest (1-based) of the m n differences x_i - y_j, without forming them:
// bisection over the doubles with a two-pointer count, O((m + n) log) per call.
// x and y must be sorted ascending.
double kth_pairwise_difference(std::span<const double> x_sorted, std::span<const double> y_sorted, std::size_t k);

struct shift_estimate {
  double estimate = 0;       // median of the pairwise differences x_i - y_j
  double low = 0, high = 0;  // interval ends (-inf/+inf where the data cannot bound it)
  std::size_t order = 0;     // k: the interval is [D_(k), D_(mn+1-k)] (one end for one-sided)
  double coverage = 0;       // the achieved confidence (exact) or its normal approximation
};

// Hodges-Lehmann shift of x against y (Hodges & Lehmann 1963) and the distribution-free
// interval of Lehmann (1975): order statistics D_(k), D_(mn+1-k) of the pairwise differences,
// k the largest with P(U <= k-1) <= (1-conf)/2 under the exact null distribution of U (when
// `exact`), else from the normal approximation k = floor(mn/2 + 1/2 - z sqrt(mn(m+n+1)/12)).
shift_estimate hodges_lehmann_shift(std::span<const double> x, std::span<const double> y, double conf, alternative side,
                                    bool exact);

struct relative_effect_test {
  double estimate = 0;  // P(X<Y) + P(X=Y)/2 for X from x, Y from y
  double se = 0;
  double statistic = 0;  // Brunner-Munzel W = (estimate - 1/2)/se (scipy's sign)
  double df = 0;
  double p_value = 0;
  double ci_low = 0, ci_high = 0;
};

// Brunner & Munzel (2000) test of P(X<Y) + P(X=Y)/2 = 1/2 with the t approximation.
// side: greater = x tends to be larger (estimate below 1/2), as scipy.stats.brunnermunzel.
relative_effect_test brunner_munzel(std::span<const double> x, std::span<const double> y, double conf,
                                    alternative side);

}  // namespace contrasta
