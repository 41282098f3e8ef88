// Outliers by the modified z-score rule (Iglewicz & Hoaglin 1993): M = 0.6745 (y - median)/MAD,
// flagged when |M| > 3.5. 0.6745 is the 0.75 quantile of the standard normal, so M is on the
// scale of a z-score for normal data.
#include <algorithm>
#include <cmath>

#include "contrasta/diagnostics.hpp"
#include "contrasta/summary.hpp"

namespace contrasta {

namespace {

// The modified z-scores of x, given x in ascending order too.
std::vector<double> modified_z_scores_sorted(std::span<const double> x, std::span<const double> sorted) {
  std::vector<double> z(x.size(), not_available);
  if (x.empty()) return z;
  const double median = median_of_sorted(sorted);
  const double mad = median_of_sorted(sorted_absolute_deviations(sorted, median));
  if (!(mad > 0)) return z;  // more than half the values tie at the median: the rule is silent
  for (std::size_t i = 0; i < x.size(); ++i) z[i] = 0.6745 * (x[i] - median) / mad;
  return z;
}

template <class Sorted>
std::vector<outlier> outliers_of(const dataset& data, double threshold, Sorted&& sorted_level) {
  std::vector<outlier> out;
  for (std::size_t level = 0; level < data.level_count(); ++level) {
    const auto values = data.group(level);
    const auto rows = data.group_rows(level);
    const auto z = modified_z_scores_sorted(values, sorted_level(level));
    for (std::size_t i = 0; i < values.size(); ++i) {
      if (std::abs(z[i]) > threshold) out.push_back({level, rows[i], values[i] + data.centre, z[i]});
    }
  }
  return out;
}

}  // namespace

std::vector<double> modified_z_scores(std::span<const double> x) {
  std::vector<double> sorted(x.begin(), x.end());
  std::sort(sorted.begin(), sorted.end());
  return modified_z_scores_sorted(x, sorted);
}

std::vector<outlier> find_outliers(const dataset& data, double threshold) {
  std::vector<double> sorted;
  return outliers_of(data, threshold, [&](std::size_t level) {
    const auto x = data.group(level);
    sorted.assign(x.begin(), x.end());
    std::sort(sorted.begin(), sorted.end());
    return std::span<const double>(sorted);
  });
}

std::vector<outlier> find_outliers(const prepared_data& p, double threshold) {
  return outliers_of(p.data, threshold, [&](std::size_t level) { return sorted_group(p, level); });
}

}  // namespace contrasta
