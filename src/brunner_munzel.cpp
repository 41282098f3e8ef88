// The Brunner-Munzel test of stochastic equality under unequal rank variances
// (Brunner & Munzel 2000, Biom. J. 42:17-25), and its method wrapper.
#include <algorithm>
#include <cmath>
#include <limits>

#include "contrasta/error.hpp"
#include "contrasta/rank.hpp"
#include "distributions.hpp"

namespace contrasta {

namespace {
double mean_of(std::span<const double> v) {
  double s = 0;
  for (double a : v) s += a;
  return s / static_cast<double>(v.size());
}

// Sample variance (divisor n - 1) of the placements R_k - R_k^(i) (pooled rank minus the rank
// within the own sample): S_i^2 of Brunner & Munzel (2000), eq. for sigma_i^2.
double placement_variance(std::span<const double> pooled_ranks, std::span<const double> own_ranks) {
  const double pooled_mean = mean_of(pooled_ranks), own_mean = mean_of(own_ranks);
  double ss = 0;
  for (std::size_t k = 0; k < pooled_ranks.size(); ++k) {
    const double d = pooled_ranks[k] - own_ranks[k] - pooled_mean + own_mean;
    ss += d * d;
  }
  return ss / static_cast<double>(pooled_ranks.size() - 1);
}
}  // namespace

relative_effect_test brunner_munzel(std::span<const double> x, std::span<const double> y, double conf,
                                    alternative side) {
  const std::size_t m = x.size(), n = y.size();
  if (m < 2 || n < 2)
    throw analysis_error("Brunner-Munzel needs at least two observations in each level; use rank or mann-whitney");
  std::vector<double> pooled(x.begin(), x.end());
  pooled.insert(pooled.end(), y.begin(), y.end());
  const std::vector<double> ranks = midranks(pooled);
  const std::span<const double> rx(ranks.data(), m), ry(ranks.data() + m, n);
  const std::vector<double> own_x = midranks(x), own_y = midranks(y);
  const double dm = static_cast<double>(m), dn = static_cast<double>(n), total = dm + dn;
  const double sx = placement_variance(rx, own_x), sy = placement_variance(ry, own_y);
  const double mean_rx = mean_of(rx), mean_ry = mean_of(ry);

  relative_effect_test r;
  // p = (mean pooled rank of y - (n+1)/2) / m = P(X<Y) + P(X=Y)/2 (Brunner & Munzel 2000).
  r.estimate = (mean_ry - (dn + 1) / 2) / dm;
  const double spread = dm * sx + dn * sy;
  r.se = std::sqrt(spread) / (dm * dn);
  // W = m n (mean R_y - mean R_x) / (N sqrt(m S_x^2 + n S_y^2)); written this way (as scipy
  // does) rather than (p - 1/2)/se so that p near 1/2 keeps its digits.
  r.statistic = dm * dn * (mean_ry - mean_rx) / (total * std::sqrt(spread));
  r.df = spread * spread / ((dm * sx) * (dm * sx) / (dm - 1) + (dn * sy) * (dn * sy) / (dn - 1));
  if (!(r.df > 0)) r.df = std::numeric_limits<double>::quiet_NaN();

  const detail::students_t t(std::isnan(r.df) ? 1.0 : r.df);
  auto upper = [&](double w) { return boost::math::cdf(boost::math::complement(t, w)); };
  if (std::isnan(r.df)) {
    r.p_value = std::numeric_limits<double>::quiet_NaN();
  } else if (side == alternative::two_sided) {
    // 2 P(T > |W|) directly: scipy's 2 min(cdf, 1 - cdf) loses digits below 1e-6.
    r.p_value = std::min(1.0, 2 * upper(std::abs(r.statistic)));
  } else if (side == alternative::greater) {
    r.p_value = upper(-r.statistic);  // x larger: the estimate falls below 1/2, W negative
  } else {
    r.p_value = upper(r.statistic);
  }

  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double tail = side == alternative::two_sided ? (1 - conf) / 2 : 1 - conf;
  const double q = std::isnan(r.df) ? nan : boost::math::quantile(boost::math::complement(t, tail));
  // The interval p +- t se (Brunner & Munzel 2000), kept inside [0, 1] where p lives. For
  // `greater` (x larger) the one-sided interval bounds p from above, and vice versa.
  r.ci_low = side == alternative::greater ? 0.0 : std::max(0.0, r.estimate - q * r.se);
  r.ci_high = side == alternative::less ? 1.0 : std::min(1.0, r.estimate + q * r.se);
  if (std::isnan(q)) {
    if (side != alternative::greater) r.ci_low = nan;
    if (side != alternative::less) r.ci_high = nan;
  }
  return r;
}

}  // namespace contrasta

namespace contrasta {

method_result brunner_munzel_contrast(const prepared_data& p, const contrast& c, const analysis_options& o) {
  const auto [first, second] = c.two_levels();
  if (first == std::size_t(-1) || second == std::size_t(-1))
    throw analysis_error("brunner-munzel compares two levels: give a contrast such as 'a - b' (contrast '" + c.name +
                         "' involves other levels)");
  const dataset& data = p.data;
  const relative_effect_test test = brunner_munzel(data.group(first), data.group(second), o.conf, o.side);
  const std::string& a = data.levels[first];
  const std::string& b = data.levels[second];
  method_result r;
  r.method = "brunner-munzel";
  r.estimand = "relative effect P(" + a + " < " + b + ") + P(" + a + " = " + b + ")/2";
  r.estimate = test.estimate;
  r.se = test.se;
  r.statistic_name = "W";
  r.statistic = test.statistic;
  r.df = test.df;
  r.p_value = test.p_value;
  r.ci_low = test.ci_low;
  r.ci_high = test.ci_high;
  r.null_hypothesis =
      "the two distributions are stochastically equal: P(" + a + " < " + b + ") + P(" + a + " = " + b + ")/2 = 1/2";
  r.notes.push_back("an estimate below 1/2 means " + a + " tends to be larger; W has the sign of estimate - 1/2");
  if (!(test.se > 0))
    r.notes.push_back(
        "the placement variances are zero (the levels do not overlap or are constant): no t approximation; use rank");
  else if (std::min(data.n(first), data.n(second)) < 10)
    r.notes.push_back(
        "fewer than 10 observations in a level: the t approximation may be liberal; the rank method gives an exact "
        "permutation p-value");
  return r;
}

}  // namespace contrasta
