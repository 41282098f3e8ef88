// Outliers by the modified z-score rule (Iglewicz & Hoaglin 1993): M = 0.6745 (y - median)/MAD,
// flagged when |M| > 3.5. 0.6745 is the 0.75 quantile of the standard normal, so M is on the
// scale of a z-score for normal data.
#include <cmath>

#include "contrasta/diagnostics.hpp"
#include "contrasta/summary.hpp"

namespace contrasta {

std::vector<double> modified_z_scores(std::span<const double> x) {
  std::vector<double> z(x.size(), not_available);
  if (x.empty()) return z;
  const double median = median_of(x);
  std::vector<double> absolute(x.size());
  for (std::size_t i = 0; i < x.size(); ++i) absolute[i] = std::abs(x[i] - median);
  const double mad = median_of(absolute);
  if (!(mad > 0)) return z;  // more than half the values tie at the median: the rule is silent
  for (std::size_t i = 0; i < x.size(); ++i) z[i] = 0.6745 * (x[i] - median) / mad;
  return z;
}

std::vector<outlier> find_outliers(const dataset& data, double threshold) {
  std::vector<outlier> out;
  for (std::size_t level = 0; level < data.level_count(); ++level) {
    const auto values = data.group(level);
    const auto rows = data.group_rows(level);
    const auto z = modified_z_scores(values);
    for (std::size_t i = 0; i < values.size(); ++i) {
      if (std::abs(z[i]) > threshold) out.push_back({level, rows[i], values[i] + data.centre, z[i]});
    }
  }
  return out;
}

}  // namespace contrasta
