#include "resample_intervals.hpp"

#include <algorithm>
#include <cmath>

#include "contrasta/result.hpp"
#include "distributions.hpp"

namespace contrasta::detail {

double quantile_linear(std::vector<double>& x, double q) {
  if (x.empty() || std::isnan(q)) return not_available;
  q = std::clamp(q, 0.0, 1.0);
  const double h = static_cast<double>(x.size() - 1) * q;
  const auto lo = static_cast<std::size_t>(std::floor(h));
  std::nth_element(x.begin(), x.begin() + static_cast<std::ptrdiff_t>(lo), x.end());
  const double a = x[lo];
  if (lo + 1 >= x.size()) return a;
  const double b = *std::min_element(x.begin() + static_cast<std::ptrdiff_t>(lo) + 1, x.end());
  const double t = h - static_cast<double>(lo);
  return t == 0 ? a : a + (b - a) * t;
}

double bca_acceleration(const prepared_data& p, const contrast& c) {
  double numerator = 0, denominator = 0;
  for (std::size_t level = 0; level < c.coefficients.size(); ++level) {
    const double cg = c.coefficients[level];
    if (cg == 0) continue;
    const auto n = static_cast<double>(p.data.n(level));
    const double mean = p.groups[level].centred_mean;
    double u2 = 0, u3 = 0;
    for (double y : p.data.group(level)) {
      const double u = cg * (y - mean);
      u2 += u * u;
      u3 += u * u * u;
    }
    numerator += u3 / (n * n * n);
    denominator += u2 / (n * n);
  }
  return denominator > 0 ? numerator / (6 * std::pow(denominator, 1.5)) : 0.0;
}

double bca_bias(const std::vector<double>& deviations) {
  std::uint64_t below = 0, at_or_below = 0;
  for (double d : deviations) {
    below += d < 0;
    at_or_below += d <= 0;
  }
  const double share =
      (static_cast<double>(below) + static_cast<double>(at_or_below)) / (2.0 * static_cast<double>(deviations.size()));
  if (share <= 0) return -HUGE_VAL;
  if (share >= 1) return HUGE_VAL;
  return boost::math::quantile(normal(), share);
}

double bca_level(double bias, double acceleration, double z_alpha) {
  if (std::isinf(bias)) return bias > 0 ? 1.0 : 0.0;
  const double shifted = bias + z_alpha;
  const double z = bias + shifted / (1 - acceleration * shifted);
  if (std::isinf(z)) return z > 0 ? 1.0 : 0.0;
  return boost::math::cdf(normal(), z);
}

}  // namespace contrasta::detail
