// Assumption diagnostics: tests of equal variances, Shapiro-Wilk normality, bias-corrected
// shape, outliers by the modified z-score, ties and discreteness, and the balance of spreads
// and group sizes. Everything here describes the data; nothing decides (see recommend.hpp).
#pragma once
#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "contrasta/overall.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

// A test of equal spread has the same shape as an overall test of means: a statistic, its
// degrees of freedom (df2 absent for chi-square tests) and a p-value.
using variance_test = overall_test;

using sample_list = std::vector<std::span<const double>>;

// Centre from which Levene-type absolute deviations are taken.
enum class levene_centre {
  mean,     // Levene 1960
  median,   // Brown & Forsythe 1974 (JASA 69:364-367)
  trimmed,  // the 10% trimmed mean, also in Brown & Forsythe 1974
};

// One-way ANOVA F on z_ij = |y_ij - centre_i| over all observations, F(k-1, N-k).
// `trim` is the proportion cut from each end for levene_centre::trimmed.
variance_test levene_test(const sample_list& groups, levene_centre centre, double trim = 0.1);

// Bartlett 1937: chi-square(k-1) on the log pooled variance against the log group variances,
// with the usual scaling constant C = 1 + (sum 1/(n_i-1) - 1/(N-k)) / (3(k-1)).
variance_test bartlett_test(const sample_list& groups);

// Fligner-Killeen median-centred test (Conover, Johnson & Johnson 1981): the absolute deviations
// from the group medians are ranked over all groups, scored by Phi^-1(1/2 + r/(2(N+1))), and the
// between-group sum of squares of the mean scores is referred to chi-square(k-1).
variance_test fligner_test(const sample_list& groups);

// Levene (mean, median, 10% trimmed), Bartlett and Fligner-Killeen for the levels of `p`.
std::vector<variance_test> variance_tests(const prepared_data& p);

struct shapiro_wilk_result {
  double w = not_available;
  double p_value = not_available;
  std::size_t n = 0;
};

// Shapiro-Wilk W with Royston's approximations for the coefficients and the p-value
// (Royston 1995, Appl. Stat. 44:547-551, algorithm AS R94). Defined for 3 <= n <= 5000 and a
// non-zero range; NaN fields otherwise.
shapiro_wilk_result shapiro_wilk(std::span<const double> x);

// Royston's p-value for a given W and n (the second half of AS R94); 3 <= n <= 5000.
double shapiro_wilk_p_value(double w, std::size_t n);

struct normality_test {
  std::optional<std::size_t> level;  // absent: the pooled within-group residuals
  std::string test = "shapiro-wilk";
  std::size_t n = 0;
  double statistic = not_available;
  double p_value = not_available;
};

// Shapiro-Wilk per level with 3 <= n <= 5000, then on the pooled residuals y - mean_i.
std::vector<normality_test> normality_tests(const prepared_data& p);

// Bias-corrected sample skewness G1 = g1 sqrt(n(n-1))/(n-2) (Joanes & Gill 1998, The
// Statistician 47:183-189); NaN for n < 3 or zero variance.
double sample_skewness(std::span<const double> x);
// Bias-corrected excess kurtosis G2 = ((n+1) g2 + 6)(n-1)/((n-2)(n-3)) (Joanes & Gill 1998);
// NaN for n < 4 or zero variance.
double sample_excess_kurtosis(std::span<const double> x);

struct group_shape {
  std::size_t level = 0;
  std::size_t n = 0;
  double skewness = not_available;
  double excess_kurtosis = not_available;
};

std::vector<group_shape> describe_shapes(const prepared_data& p);

// Residuals standardized within their level, (y - ybar_i)/s_i over levels with n >= 2 and
// s_i > 0, pooled: the common shape of the errors once locations and scales are removed.
std::vector<double> standardized_residuals(const prepared_data& p);

struct residual_shape {
  std::size_t n = 0;
  double skewness = not_available;         // G1 of the standardized residuals
  double excess_kurtosis = not_available;  // G2 of the standardized residuals
};

residual_shape describe_residual_shape(const prepared_data& p);

// Modified z-score 0.6745 (y - median)/MAD with MAD the median absolute deviation from the
// median (Iglewicz & Hoaglin 1993, How to Detect and Handle Outliers). NaN when MAD is zero.
std::vector<double> modified_z_scores(std::span<const double> x);

struct outlier {
  std::size_t level = 0;
  std::uint64_t row = 0;  // line of the input file (1 = header)
  double value = 0;       // in the units of the data
  double robust_z = 0;    // the modified z-score within its level
};

// Observations whose modified z-score within their level exceeds `threshold` in absolute value
// (3.5 by Iglewicz & Hoaglin's rule), in level then row order.
std::vector<outlier> find_outliers(const dataset& data, double threshold = 3.5);
// The same from prepared data, reading its sorted levels (no sort).
std::vector<outlier> find_outliers(const prepared_data& p, double threshold = 3.5);

// Facts about ties and discreteness over all observations together (rank methods rank them
// together).
struct ties_summary {
  std::size_t distinct_values = 0;
  double tied_share = 0;                // share of observations whose value occurs more than once
  bool integer_values = false;          // every value is a whole number
  double scale_min = 0, scale_max = 0;  // smallest and largest value, data units
  // Whole numbers on a short range (at most 21 distinct points: 0-10 and 0-20 rating scales,
  // counts of a few): common practice for "treat as discrete".
  bool small_integer_scale = false;
};

ties_summary describe_ties(const dataset& data);
// The same from prepared data, merging its sorted levels (no sort).
ties_summary describe_ties(const prepared_data& p);

// Balance of spreads and of group sizes.
struct spread_balance {
  double sd_ratio = not_available;  // largest SD / smallest SD over levels with n >= 2
  double n_ratio = not_available;   // largest n / smallest n
  std::size_t smallest_n = 0, largest_n = 0;
  std::size_t smallest_n_level = 0;
  std::size_t largest_sd_level = 0, smallest_sd_level = 0;
  // Pearson correlation of n_i with s_i^2 over the levels (NaN when the n or the variances are
  // all equal); negative when the larger variances sit in the smaller groups.
  double size_variance_correlation = not_available;
  bool larger_variances_in_smaller_groups = false;
  // Over all pairs of levels: the smallest ratio of the pooled standard error of the difference,
  // sqrt(MSE (1/n_i + 1/n_j)), to the separate-variances one, sqrt(s_i^2/n_i + s_j^2/n_j).
  // Below 1 the pooled t is too large for that pair and rejects too often (Box 1954).
  double pooled_se_ratio = not_available;
  std::size_t pooled_se_pair_first = 0, pooled_se_pair_second = 0;
};

spread_balance describe_spread(const prepared_data& p);

struct diagnostics_report {
  std::vector<variance_test> variance;
  std::vector<normality_test> normality;
  std::vector<group_shape> shapes;
  residual_shape residuals;
  std::vector<outlier> outliers;
  ties_summary ties;
  spread_balance spread;
};

diagnostics_report diagnose(const prepared_data& p);

}  // namespace contrasta
