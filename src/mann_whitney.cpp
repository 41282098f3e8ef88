// Mann-Whitney U (Mann & Whitney 1947): exact null distribution without ties, normal
// approximation with tie and continuity corrections otherwise, and the method wrapper that adds
// the Hodges-Lehmann shift.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>

#include "contrasta/error.hpp"
#include "contrasta/rank.hpp"
#include "distributions.hpp"

namespace contrasta {

namespace {
__extension__ typedef __int128 count_type;

// log2 C(m+n, m), to decide whether the arrangements can be counted exactly.
double log2_binomial(std::size_t m, std::size_t n) {
  const double a = static_cast<double>(m), b = static_cast<double>(n);
  return (std::lgamma(a + b + 1) - std::lgamma(a + 1) - std::lgamma(b + 1)) / std::log(2.0);
}

double normal_upper_tail(double z) {
  return boost::math::cdf(boost::math::complement(detail::normal(0, 1), z));
}
}  // namespace

std::vector<double> mann_whitney_null_cdf(std::size_t m, std::size_t n) {
  if (m > n) std::swap(m, n);
  // Signed 128-bit counts: the largest intermediate is below 2 C(m+n, m).
  if (log2_binomial(m, n) > 124) return {};
  const std::size_t top = m * n;
  // Room for the intermediate product of degree i n + i before the division.
  std::vector<count_type> c(top + m + 1, 0);
  c[0] = 1;
  // The counts of U are the coefficients of [m+n choose m]_q = prod_{i=1..m} (1 - q^(n+i)) /
  // (1 - q^i); each partial product [n+i choose i]_q has non-negative integer coefficients.
  std::size_t degree = 0;
  for (std::size_t i = 1; i <= m; ++i) {
    const std::size_t up = n + i;
    for (std::size_t j = degree + up; j >= up; --j) c[j] -= c[j - up];
    // The division runs over the whole product so that its top i terms cancel to zero.
    for (std::size_t j = i; j <= degree + up; ++j) c[j] += c[j - i];
    degree += n;
  }
  std::vector<double> cdf(top + 1);
  count_type running = 0, total = 0;
  for (std::size_t j = 0; j <= top; ++j) total += c[j];
  for (std::size_t j = 0; j <= top; ++j) {
    running += c[j];
    cdf[j] = static_cast<double>(running) / static_cast<double>(total);
  }
  return cdf;
}

mann_whitney_test mann_whitney(std::span<const double> x, std::span<const double> y, alternative side,
                               exact_mode mode) {
  const std::size_t m = x.size(), n = y.size();
  if (m == 0 || n == 0) throw analysis_error("Mann-Whitney needs at least one observation in each level");
  std::vector<double> pooled(x.begin(), x.end());
  pooled.insert(pooled.end(), y.begin(), y.end());
  const std::vector<double> ranks = midranks(pooled);
  double rank_sum = 0;
  for (std::size_t i = 0; i < m; ++i) rank_sum += ranks[i];
  const double mn = static_cast<double>(m) * static_cast<double>(n);
  mann_whitney_test r;
  r.u = rank_sum - static_cast<double>(m) * static_cast<double>(m + 1) / 2;  // Mann & Whitney 1947
  const double u_other = mn - r.u;
  const double ties = tie_term(pooled);
  // The statistic whose upper tail is the p-value, and the factor (as scipy: two-sided doubles
  // the upper tail of the larger U).
  const double u_tail = side == alternative::greater ? r.u
                        : side == alternative::less  ? u_other
                                                     : std::max(r.u, u_other);
  const double factor = side == alternative::two_sided ? 2.0 : 1.0;

  bool use_exact = false;
  if (ties == 0 && mode != exact_mode::never) use_exact = mode == exact_mode::always || std::min(m, n) <= 8;
  std::vector<double> cdf;
  if (use_exact) {
    cdf = mann_whitney_null_cdf(m, n);
    use_exact = !cdf.empty();
  }
  const double total = static_cast<double>(m + n);
  const double sd = std::sqrt(mn / 12 * ((total + 1) - ties / (total * (total - 1))));
  r.z = (r.u - mn / 2) / sd;
  if (use_exact) {
    r.exact = true;
    // P(U >= u) = P(U <= mn - u) by the symmetry of the null distribution.
    const auto k = static_cast<std::size_t>(mn - u_tail);
    r.p_value = factor * cdf[k];
  } else {
    // Continuity correction: the upper tail of a lattice statistic starts half a unit below it.
    const double z_tail = (u_tail - mn / 2 - 0.5) / sd;
    r.p_value = factor * normal_upper_tail(z_tail);
  }
  r.p_value = std::min(1.0, std::max(0.0, r.p_value));
  return r;
}

method_result mann_whitney_contrast(const prepared_data& p, const contrast& c, const analysis_options& o) {
  const auto [first, second] = c.two_levels();
  if (first == std::size_t(-1) || second == std::size_t(-1))
    throw analysis_error("mann-whitney compares two levels: give a contrast such as 'a - b' (contrast '" + c.name +
                         "' involves other levels)");
  const dataset& data = p.data;
  const std::span<const double> x = data.group(first), y = data.group(second);
  const mann_whitney_test test = mann_whitney(x, y, o.side, o.exact);
  const shift_estimate shift = hodges_lehmann_shift(x, y, o.conf, o.side, test.exact);
  const double scale = c.coefficients[first];  // the contrast a - b at coefficient +scale/-scale
  const std::string& a = data.levels[first];
  const std::string& b = data.levels[second];

  method_result r;
  r.method = "mann-whitney";
  char buffer[160];
  std::snprintf(buffer, sizeof buffer, " times %g", scale);
  r.estimand = "Hodges-Lehmann shift " + a + " - " + b + " (median of the pairwise differences)" +
               (scale != 1 ? std::string(buffer) : std::string());
  r.estimate = scale * shift.estimate;
  r.ci_low = scale * shift.low;
  r.ci_high = scale * shift.high;
  r.statistic_name = "U";
  r.statistic = test.u;
  r.p_value = test.p_value;
  r.exact = test.exact;
  r.null_hypothesis = "the distributions of " + a + " and " + b + " are identical (the test is sensitive to P(" + a +
                      " > " + b + ") differing from P(" + a + " < " + b + "))";
  if (test.exact) {
    r.notes.push_back("exact null distribution of U (no ties)");
  } else {
    std::snprintf(buffer, sizeof buffer, "normal approximation with tie and continuity corrections, z = %.4g", test.z);
    r.notes.push_back(buffer);
    if (o.exact == exact_mode::always)
      r.notes.push_back("exact distribution not used: it holds without ties only (and up to about 2^124 arrangements)");
  }
  if (shift.order == 0) {
    r.notes.push_back("too few observations to bound the shift at this confidence (Lehmann 1975 order statistics)");
  } else {
    std::snprintf(buffer, sizeof buffer,
                  "shift interval from the pairwise differences of order %zu, achieved confidence %.4f%s", shift.order,
                  shift.coverage, test.exact ? "" : " (normal approximation)");
    r.notes.push_back(buffer);
  }
  r.notes.push_back("the shift interval assumes the two distributions differ only by a shift");
  return r;
}

}  // namespace contrasta
