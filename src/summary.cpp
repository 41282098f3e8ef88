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

namespace {

// The midpoint of the two middle values as numpy.median forms it, (a + b) / 2: the rounding
// decides whether the two middle deviations |y - median| tie, and Fligner-Killeen's ranks (and
// so agreement with scipy.stats.fligner) depend on that. a + (b - a) / 2 rounds differently.
// Only when a + b overflows is the other form used.
double middle_of(double a, double b) {
  const double sum = a + b;
  return std::isfinite(sum) ? sum / 2 : a + (b - a) / 2;
}

}  // namespace

double median_of_sorted(std::span<const double> sorted) {
  if (sorted.empty()) return nan;
  const std::size_t mid = sorted.size() / 2;
  const double upper = sorted[mid];
  if (sorted.size() % 2 == 1) return upper;
  const double lower = sorted[mid - 1];
  return middle_of(lower, upper);
}

double median_of(std::span<const double> x) {
  if (x.empty()) return nan;
  std::vector<double> v(x.begin(), x.end());
  std::size_t mid = v.size() / 2;
  std::nth_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(mid), v.end());
  double upper = v[mid];
  if (v.size() % 2 == 1) return upper;
  // The largest of the lower half is the order statistic below v[mid], as in median_of_sorted.
  double lower = *std::max_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(mid));
  return middle_of(lower, upper);
}

namespace {
std::size_t trimmed_count(std::size_t n, double trim) {
  // g = floor(trim n), guarded against 0.2 * 10 = 1.9999999 style rounding.
  return static_cast<std::size_t>(std::floor(trim * static_cast<double>(n) + 1e-9));
}

std::vector<double> sorted_copy(std::span<const double> x) {
  std::vector<double> v(x.begin(), x.end());
  std::sort(v.begin(), v.end());
  return v;
}
}  // namespace

double trimmed_mean_of_sorted(std::span<const double> sorted, double trim) {
  if (sorted.empty()) return nan;
  const std::size_t g = trimmed_count(sorted.size(), trim);
  if (2 * g >= sorted.size()) return median_of_sorted(sorted);
  return accurate_mean(sorted.subspan(g, sorted.size() - 2 * g));
}

double winsorized_variance_of_sorted(std::span<const double> sorted, double trim) {
  if (sorted.size() < 2) return nan;
  const std::size_t n = sorted.size(), g = trimmed_count(n, trim);
  if (2 * g >= n) return 0.0;
  std::vector<double> v(sorted.begin(), sorted.end());
  for (std::size_t i = 0; i < g; ++i) {
    v[i] = v[g];
    v[n - 1 - i] = v[n - 1 - g];
  }
  double m = accurate_mean(v);
  return sum_squared_deviations(v, m) / static_cast<double>(n - 1);
}

std::vector<double> sorted_absolute_deviations(std::span<const double> sorted, double centre) {
  // Below the centre |y - c| falls as y rises, above it it rises (rounding is monotone), so the
  // deviations are two sorted runs: walk down from the centre and up from it, taking the smaller.
  const std::size_t n = sorted.size();
  const std::size_t split = static_cast<std::size_t>(std::lower_bound(sorted.begin(), sorted.end(), centre) - sorted.begin());
  std::vector<double> out;
  out.reserve(n);
  std::size_t down = split, up = split;
  while (down > 0 && up < n) {
    const double below = std::abs(sorted[down - 1] - centre), above = std::abs(sorted[up] - centre);
    if (below <= above) {
      out.push_back(below);
      --down;
    } else {
      out.push_back(above);
      ++up;
    }
  }
  for (; down > 0; --down) out.push_back(std::abs(sorted[down - 1] - centre));
  for (; up < n; ++up) out.push_back(std::abs(sorted[up] - centre));
  return out;
}

double trimmed_mean_of(std::span<const double> x, double trim) {
  return trimmed_mean_of_sorted(sorted_copy(x), trim);
}

double winsorized_variance_of(std::span<const double> x, double trim) {
  return winsorized_variance_of_sorted(sorted_copy(x), trim);
}

group_summary summarize_level(const dataset& data, std::size_t level, std::span<const double> sorted, double trim) {
  const auto x = data.group(level);
  group_summary s;
  s.level = data.levels[level];
  s.n = x.size();
  s.n_missing = level < data.missing.size() ? data.missing[level] : 0;
  s.trim = trim;
  s.trimmed_per_side = trimmed_count(s.n, trim);
  if (s.n == 0) {
    s.mean = s.median = s.trimmed_mean = s.min = s.max = nan;
    s.centred_mean = s.centred_median = s.centred_trimmed_mean = nan;
    s.variance = s.sd = s.winsorized_variance = nan;
    return s;
  }
  s.centred_mean = accurate_mean(x);
  s.sum_squares = sum_squared_deviations(x, s.centred_mean);
  s.variance = s.n > 1 ? s.sum_squares / static_cast<double>(s.n - 1) : nan;
  s.sd = std::sqrt(s.variance);
  s.centred_median = median_of_sorted(sorted);
  s.centred_trimmed_mean = trimmed_mean_of_sorted(sorted, trim);
  s.winsorized_variance = winsorized_variance_of_sorted(sorted, trim);
  auto [lo, hi] = std::minmax_element(x.begin(), x.end());
  s.mean = data.centre + s.centred_mean;
  s.median = data.centre + s.centred_median;
  s.trimmed_mean = data.centre + s.centred_trimmed_mean;
  s.min = data.centre + *lo;
  s.max = data.centre + *hi;
  return s;
}

std::vector<group_summary> summarize(const dataset& data, double trim) {
  std::vector<group_summary> out;
  out.reserve(data.level_count());
  for (std::size_t i = 0; i < data.level_count(); ++i) out.push_back(summarize_level(data, i, sorted_copy(data.group(i)), trim));
  return out;
}

}  // namespace contrasta
