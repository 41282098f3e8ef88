// Mid-ranks and tie counts: the common first step of every rank method.
#include <algorithm>
#include <numeric>

#include "contrasta/rank.hpp"

namespace contrasta {

std::vector<double> midranks(std::span<const double> x) {
  std::vector<std::size_t> order(x.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return x[a] < x[b]; });
  std::vector<double> ranks(x.size());
  for (std::size_t i = 0; i < order.size();) {
    std::size_t j = i + 1;
    while (j < order.size() && x[order[j]] == x[order[i]]) ++j;
    // Positions i..j-1 (0-based) hold ranks i+1..j; the mid-rank is their mean.
    const double mid = 0.5 * static_cast<double>(i + 1 + j);
    for (std::size_t t = i; t < j; ++t) ranks[order[t]] = mid;
    i = j;
  }
  return ranks;
}

std::vector<std::size_t> tie_counts(std::span<const double> x) {
  std::vector<double> sorted(x.begin(), x.end());
  std::sort(sorted.begin(), sorted.end());
  std::vector<std::size_t> counts;
  for (std::size_t i = 0; i < sorted.size();) {
    std::size_t j = i + 1;
    while (j < sorted.size() && sorted[j] == sorted[i]) ++j;
    counts.push_back(j - i);
    i = j;
  }
  return counts;
}

double tie_term(std::span<const double> x) {
  double sum = 0;
  for (std::size_t t : tie_counts(x)) {
    const double d = static_cast<double>(t);
    sum += d * d * d - d;
  }
  return sum;
}

}  // namespace contrasta
