// Mid-ranks over several samples taken together, and the tie correction that goes with them;
// shared by the Fligner-Killeen and Kruskal-Wallis tests.
#pragma once
#include <algorithm>
#include <cstddef>
#include <numeric>
#include <span>
#include <vector>

namespace contrasta::detail {

struct pooled_ranks {
  std::vector<double> ranks;  // mid-ranks (1-based), in the order the samples were given
  double tie_sum = 0;         // sum over tie groups of t^3 - t
};

// Ranks the concatenation of `samples`; tied values share the mean of the ranks they span.
template <class Samples>
pooled_ranks rank_together(const Samples& samples) {
  std::vector<double> all;
  for (const auto& s : samples) all.insert(all.end(), s.begin(), s.end());
  std::vector<std::size_t> order(all.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return all[a] < all[b]; });
  pooled_ranks out;
  out.ranks.assign(all.size(), 0);
  for (std::size_t i = 0; i < order.size();) {
    std::size_t j = i + 1;
    while (j < order.size() && all[order[j]] == all[order[i]]) ++j;
    const double mid = 0.5 * static_cast<double>(i + 1 + j);  // mean of ranks i+1..j
    for (std::size_t m = i; m < j; ++m) out.ranks[order[m]] = mid;
    const double t = static_cast<double>(j - i);
    out.tie_sum += t * t * t - t;
    i = j;
  }
  return out;
}

}  // namespace contrasta::detail
