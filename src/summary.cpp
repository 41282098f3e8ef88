#include "contrasta/summary.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace contrasta {
namespace {
constexpr double nan = std::numeric_limits<double>::quiet_NaN();

// Neumaier's compensated summation: the error of each addition is carried along.
struct compensated_sum {
  double sum = 0, compensation = 0;
  void add(double x) {
    double t = sum + x;
    if (std::abs(sum) >= std::abs(x))
      compensation += (sum - t) + x;
    else
      compensation += (x - t) + sum;
    sum = t;
  }
  double value() const { return sum + compensation; }
};
}  // namespace

double accurate_mean(std::span<const double> x) {
  if (x.empty()) return nan;
  compensated_sum s;
  for (double v : x) s.add(v);
  double mean = s.value() / static_cast<double>(x.size());
  // Second pass: the mean of the residuals corrects the rounding of the first pass.
  compensated_sum r;
  for (double v : x) r.add(v - mean);
  return mean + r.value() / static_cast<double>(x.size());
}

double sum_squared_deviations(std::span<const double> x, double mean) {
  compensated_sum s, d;
  for (double v : x) {
    double e = v - mean;
    s.add(e * e);
    d.add(e);
  }
  // Corrected two-pass formula (Chan, Golub & LeVeque 1983): subtract (sum e)^2 / n.
  double n = static_cast<double>(x.size());
  return std::max(0.0, s.value() - d.value() * d.value() / n);
}

double median_of(std::span<const double> x) {
  if (x.empty()) return nan;
  std::vector<double> v(x.begin(), x.end());
  std::size_t mid = v.size() / 2;
  std::nth_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(mid), v.end());
  double upper = v[mid];
  if (v.size() % 2 == 1) return upper;
  double lower = *std::max_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(mid));
  return lower + (upper - lower) / 2;
}

namespace {
std::size_t trimmed_count(std::size_t n, double trim) {
  // g = floor(trim n), guarded against 0.2 * 10 = 1.9999999 style rounding.
  return static_cast<std::size_t>(std::floor(trim * static_cast<double>(n) + 1e-9));
}
}  // namespace

double trimmed_mean_of(std::span<const double> x, double trim) {
  if (x.empty()) return nan;
  std::vector<double> v(x.begin(), x.end());
  std::sort(v.begin(), v.end());
  std::size_t g = trimmed_count(v.size(), trim);
  if (2 * g >= v.size()) return median_of(x);
  return accurate_mean(std::span<const double>(v.data() + g, v.size() - 2 * g));
}

double winsorized_variance_of(std::span<const double> x, double trim) {
  if (x.size() < 2) return nan;
  std::vector<double> v(x.begin(), x.end());
  std::sort(v.begin(), v.end());
  std::size_t n = v.size(), g = trimmed_count(n, trim);
  if (2 * g >= n) return 0.0;
  for (std::size_t i = 0; i < g; ++i) {
    v[i] = v[g];
    v[n - 1 - i] = v[n - 1 - g];
  }
  double m = accurate_mean(v);
  return sum_squared_deviations(v, m) / static_cast<double>(n - 1);
}

std::vector<group_summary> summarize(const dataset& data, double trim) {
  std::vector<group_summary> out;
  out.reserve(data.level_count());
  for (std::size_t i = 0; i < data.level_count(); ++i) {
    auto x = data.group(i);
    group_summary s;
    s.level = data.levels[i];
    s.n = x.size();
    s.n_missing = i < data.missing.size() ? data.missing[i] : 0;
    s.trim = trim;
    s.trimmed_per_side = trimmed_count(s.n, trim);
    if (s.n == 0) {
      s.mean = s.median = s.trimmed_mean = s.min = s.max = nan;
      s.centred_mean = s.centred_median = s.centred_trimmed_mean = nan;
      s.variance = s.sd = s.winsorized_variance = nan;
      out.push_back(s);
      continue;
    }
    s.centred_mean = accurate_mean(x);
    s.sum_squares = sum_squared_deviations(x, s.centred_mean);
    s.variance = s.n > 1 ? s.sum_squares / static_cast<double>(s.n - 1) : nan;
    s.sd = std::sqrt(s.variance);
    s.centred_median = median_of(x);
    s.centred_trimmed_mean = trimmed_mean_of(x, trim);
    s.winsorized_variance = winsorized_variance_of(x, trim);
    auto [lo, hi] = std::minmax_element(x.begin(), x.end());
    s.mean = data.centre + s.centred_mean;
    s.median = data.centre + s.centred_median;
    s.trimmed_mean = data.centre + s.centred_trimmed_mean;
    s.min = data.centre + *lo;
    s.max = data.centre + *hi;
    out.push_back(s);
  }
  return out;
}

}  // namespace contrasta
