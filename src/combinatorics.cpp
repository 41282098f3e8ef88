#include "combinatorics.hpp"

#include <numeric>

namespace contrasta::detail {

std::uint64_t binomial(std::uint64_t n, std::uint64_t k) {
  if (k > n) return 0;
  if (k > n - k) k = n - k;
  uint128 r = 1;
  for (std::uint64_t i = 1; i <= k; ++i) {
    // r * (n - k + i) / i is exact at every step: r is C(n - k + i - 1, i - 1).
    r = r * (n - k + i) / i;
    if (r > UINT64_MAX) return saturated;
  }
  return static_cast<std::uint64_t>(r);
}

std::uint64_t multinomial(std::span<const std::size_t> sizes) {
  std::uint64_t total = 0, result = 1;
  for (std::size_t n : sizes) {
    total += n;
    const std::uint64_t b = binomial(total, n);
    if (b == saturated) return saturated;
    const uint128 r = static_cast<uint128>(result) * b;
    if (r > UINT64_MAX) return saturated;
    result = static_cast<std::uint64_t>(r);
  }
  return result;
}

std::uint64_t revolving_door_rank(std::span<const std::uint32_t> subset) {
  std::uint64_t rank = 0;
  for (std::size_t i = 0; i < subset.size(); ++i) rank = binomial(subset[i] + 1ULL, i + 1) - 1 - rank;
  return rank;
}

void revolving_door_unrank(std::uint64_t rank, std::uint32_t n, std::span<std::uint32_t> out) {
  // Inverts the rank recursion from the largest element down: c_t is the x with
  // C(x, t) <= rank < C(x + 1, t); the rest has rank C(c_t + 1, t) - 1 - rank.
  std::uint64_t x = n;
  for (std::size_t t = out.size(); t >= 1; --t) {
    while (x > 0 && binomial(x - 1, t) > rank) --x;
    // now C(x - 1, t) <= rank < C(x, t): the largest element is x - 1
    const std::uint64_t top = x - 1;
    out[t - 1] = static_cast<std::uint32_t>(top);
    rank = binomial(top + 1, t) - 1 - rank;
    x = top;
  }
}

}  // namespace contrasta::detail
