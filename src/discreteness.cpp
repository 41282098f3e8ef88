// Ties and discreteness of the response over all observations together: what a rank method
// sees when it ranks the involved groups jointly.
#include <algorithm>
#include <cmath>

#include "contrasta/diagnostics.hpp"
#include "diagnostic_ranks.hpp"

namespace contrasta {

namespace {

// The facts from the levels, each in ascending order.
ties_summary ties_of(const std::vector<std::span<const double>>& sorted, double centre) {
  ties_summary out;
  std::size_t total = 0, tied = 0;
  double lowest = 0, highest = 0;
  for (auto s : sorted) {
    if (s.empty()) continue;
    if (total == 0 || s.front() < lowest) lowest = s.front();
    if (total == 0 || s.back() > highest) highest = s.back();
    total += s.size();
  }
  if (total == 0) return out;
  // Centred values are exact decimal differences rounded once, so equal inputs stay equal.
  detail::for_each_tie_block(sorted, [&](std::size_t, std::span<const detail::run_position> members) {
    ++out.distinct_values;
    if (members.size() > 1) tied += members.size();
  });
  out.tied_share = static_cast<double>(tied) / static_cast<double>(total);
  out.scale_min = lowest + centre;
  out.scale_max = highest + centre;
  out.integer_values = std::all_of(sorted.begin(), sorted.end(), [&](std::span<const double> s) {
    return std::all_of(s.begin(), s.end(), [&](double v) {
      const double x = v + centre;
      return std::abs(x - std::round(x)) <= 1e-9 * std::max(1.0, std::abs(x));
    });
  });
  // Whole numbers spanning at most 20 units: rating scales (0-10, 1-7, 0-20) and small counts.
  out.small_integer_scale = out.integer_values && (out.scale_max - out.scale_min) <= 20;
  return out;
}

}  // namespace

ties_summary describe_ties(const dataset& data) {
  std::vector<double> sorted(data.values);
  std::sort(sorted.begin(), sorted.end());
  return ties_of({std::span<const double>(sorted)}, data.centre);
}

ties_summary describe_ties(const prepared_data& p) {
  std::vector<std::span<const double>> sorted;
  for (std::size_t i = 0; i < p.data.level_count(); ++i) sorted.push_back(sorted_group(p, i));
  return ties_of(sorted, p.data.centre);
}

}  // namespace contrasta
