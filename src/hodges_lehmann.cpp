// The Hodges-Lehmann shift estimate (Hodges & Lehmann 1963) and Lehmann's (1975)
// distribution-free interval from the order statistics of the pairwise differences.
#include <algorithm>
#include <bit>
#include <cmath>
#include <cstdint>
#include <limits>

#include "contrasta/error.hpp"
#include "contrasta/rank.hpp"
#include "distributions.hpp"

namespace contrasta {

namespace {
// A key that orders doubles as integers (negative doubles reversed), so bisection over the
// keys visits every double between two values.
std::int64_t order_key(double v) {
  const auto bits = std::bit_cast<std::int64_t>(v);
  return bits >= 0 ? bits : std::numeric_limits<std::int64_t>::min() - bits;
}
double from_key(std::int64_t key) {
  return std::bit_cast<double>(key >= 0 ? key : std::numeric_limits<std::int64_t>::min() - key);
}

// Number of pairs with fl(x_i - y_j) <= v. For fixed j the rounded difference is monotone in
// x_i (rounding is monotone), so one pointer sweeps y from the largest difference down.
std::size_t count_at_most(std::span<const double> x, std::span<const double> y, double v) {
  std::size_t count = 0, j = 0;  // j = first index of y with x_i - y_j <= v
  for (double xi : x) {
    while (j < y.size() && !(xi - y[j] <= v)) ++j;
    count += y.size() - j;
  }
  return count;
}
}  // namespace

double kth_pairwise_difference(std::span<const double> x, std::span<const double> y, std::size_t k) {
  if (x.empty() || y.empty() || k == 0 || k > x.size() * y.size())
    throw analysis_error("pairwise difference order out of range");
  std::int64_t lo = order_key(x.front() - y.back()), hi = order_key(x.back() - y.front());
  // Smallest double v with at least k differences <= v; that v is itself a difference.
  while (lo < hi) {
    // Unsigned width: hi - lo can exceed the signed range.
    const auto mid = static_cast<std::int64_t>(static_cast<std::uint64_t>(lo) +
                                               (static_cast<std::uint64_t>(hi) - static_cast<std::uint64_t>(lo)) / 2);
    if (count_at_most(x, y, from_key(mid)) >= k)
      hi = mid;
    else
      lo = mid + 1;
  }
  double v = from_key(lo);
  return v == 0 ? 0.0 : v;  // no negative zero
}

shift_estimate hodges_lehmann_shift(std::span<const double> x, std::span<const double> y, double conf, alternative side,
                                    bool exact) {
  const std::size_t m = x.size(), n = y.size();
  if (m == 0 || n == 0) throw analysis_error("the Hodges-Lehmann shift needs at least one observation in each level");
  std::vector<double> xs(x.begin(), x.end()), ys(y.begin(), y.end());
  std::sort(xs.begin(), xs.end());
  std::sort(ys.begin(), ys.end());
  const std::size_t mn = m * n;
  shift_estimate r;
  r.estimate = mn % 2 == 1
                   ? kth_pairwise_difference(xs, ys, (mn + 1) / 2)
                   : 0.5 * (kth_pairwise_difference(xs, ys, mn / 2) + kth_pairwise_difference(xs, ys, mn / 2 + 1));

  // Tail probability allowed below the lower end (Lehmann 1975: P(U <= k-1) for the interval
  // [D_(k), D_(mn+1-k)]).
  const double tail = side == alternative::two_sided ? (1 - conf) / 2 : 1 - conf;
  std::size_t k = 0;
  double below = 0;  // P(U <= k-1) at the chosen k
  std::vector<double> cdf = exact ? mann_whitney_null_cdf(m, n) : std::vector<double>{};
  if (!cdf.empty()) {
    while (k < cdf.size() && cdf[k] <= tail) ++k;  // k-1 = last u with P(U <= u) <= tail
    below = k > 0 ? cdf[k - 1] : 0;
  } else {
    const double dmn = static_cast<double>(mn);
    const double sigma = std::sqrt(dmn * static_cast<double>(m + n + 1) / 12);
    const double z = boost::math::quantile(boost::math::complement(detail::normal(0, 1), tail));
    const double kk = std::floor(dmn / 2 + 0.5 - z * sigma);
    k = kk >= 1 ? static_cast<std::size_t>(kk) : 0;
    if (k > (mn + 1) / 2) k = (mn + 1) / 2;
    below = k > 0 ? boost::math::cdf(detail::normal(0, 1), (static_cast<double>(k) - 0.5 - dmn / 2) / sigma) : 0;
  }
  r.order = k;
  const double inf = std::numeric_limits<double>::infinity();
  const double lower_end = k > 0 ? kth_pairwise_difference(xs, ys, k) : -inf;
  const double upper_end = k > 0 ? kth_pairwise_difference(xs, ys, mn + 1 - k) : inf;
  r.low = side == alternative::less ? -inf : lower_end;
  r.high = side == alternative::greater ? inf : upper_end;
  r.coverage = k > 0 ? 1 - (side == alternative::two_sided ? 2 : 1) * below : 1.0;
  return r;
}

}  // namespace contrasta
