// Ties and discreteness of the response over all observations together: what a rank method
// sees when it ranks the involved groups jointly.
#include <algorithm>
#include <cmath>

#include "contrasta/diagnostics.hpp"

namespace contrasta {

ties_summary describe_ties(const dataset& data) {
  ties_summary out;
  if (data.values.empty()) return out;
  // Centred values are exact decimal differences rounded once, so equal inputs stay equal.
  std::vector<double> sorted(data.values);
  std::sort(sorted.begin(), sorted.end());
  std::size_t tied = 0;
  for (std::size_t i = 0; i < sorted.size();) {
    std::size_t j = i + 1;
    while (j < sorted.size() && sorted[j] == sorted[i]) ++j;
    ++out.distinct_values;
    if (j - i > 1) tied += j - i;
    i = j;
  }
  out.tied_share = static_cast<double>(tied) / static_cast<double>(sorted.size());
  out.scale_min = sorted.front() + data.centre;
  out.scale_max = sorted.back() + data.centre;
  out.integer_values = std::all_of(sorted.begin(), sorted.end(), [&](double v) {
    const double x = v + data.centre;
    return std::abs(x - std::round(x)) <= 1e-9 * std::max(1.0, std::abs(x));
  });
  // Whole numbers spanning at most 20 units: rating scales (0-10, 1-7, 0-20) and small counts.
  out.small_integer_scale = out.integer_values && (out.scale_max - out.scale_min) <= 20;
  return out;
}

}  // namespace contrasta
