// Counting, ranking and unranking combinations, and the revolving-door Gray code over them.
//
// The revolving-door order of the t-subsets of {0, ..., n-1} is defined recursively
// (Kreher & Stinson 1999, Combinatorial Algorithms, section 2.3.3; Knuth, TAOCP 4A, 7.2.1.3):
//   R(n, t) = R(n-1, t), then R(n-1, t-1) reversed with n-1 added to every subset,
// so that consecutive subsets differ by exactly one element leaving and one entering. Exact
// permutation tests walk it to update running sums in O(1) per reassignment, and split it
// across threads by unranking the first subset of each block.
#pragma once
#include <cstdint>
#include <span>
#include <vector>

namespace contrasta::detail {

inline constexpr std::uint64_t saturated = UINT64_MAX;

__extension__ using uint128 = unsigned __int128;  // GCC/Clang extension, for exact products

// C(n, k), saturated at UINT64_MAX when it does not fit.
std::uint64_t binomial(std::uint64_t n, std::uint64_t k);

// N! / prod n_i!, saturated at UINT64_MAX.
std::uint64_t multinomial(std::span<const std::size_t> sizes);

// Rank of a t-subset (ascending elements) in revolving-door order:
// rank(c_1 < ... < c_t) = C(c_t + 1, t) - 1 - rank(c_1 < ... < c_{t-1}), rank(empty) = 0,
// which follows from the recursive definition above.
std::uint64_t revolving_door_rank(std::span<const std::uint32_t> subset);

// The subset of rank `rank` (ascending) among the t-subsets of {0..n-1}, t = out.size().
void revolving_door_unrank(std::uint64_t rank, std::uint32_t n, std::span<std::uint32_t> out);

// Steps a subset to its successor in revolving-door order (Knuth's Algorithm R, TAOCP 4A
// 7.2.1.3). `c` holds the t ascending elements followed by the sentinel n (size t + 1), t >= 1.
// Reports the element that left and the one that entered. Must not be called on the last
// subset (the caller counts: there are C(n, t) - 1 steps).
struct door_swap {
  std::uint32_t out, in;
};
inline door_swap revolving_door_next(std::span<std::uint32_t> c);

inline door_swap revolving_door_next(std::span<std::uint32_t> c) {
  // Knuth's Algorithm R with c_1..c_t stored in c[0..t-1] and c_{t+1} = n in c[t]. Inline: the
  // exact enumeration calls it once per reassignment.
  const std::size_t t = c.size() - 1;
  std::uint32_t* const base = c.data();
  auto at = [base](std::size_t j) -> std::uint32_t& { return base[j - 1]; };  // at(j) is c_j
  std::size_t j = 2;
  if (t % 2 == 1) {
    if (at(1) + 1 < at(2)) {
      const std::uint32_t old = at(1);
      at(1) = old + 1;
      return {old, old + 1};
    }
  } else {
    if (at(1) > 0) {
      const std::uint32_t old = at(1);
      at(1) = old - 1;
      return {old, old - 1};
    }
    goto increase;
  }
  for (;;) {
    // R4: try to decrease c_j (here c_j = c_{j-1} + 1).
    if (at(j) >= j) {
      const std::uint32_t out = at(j);
      at(j) = at(j - 1);
      at(j - 1) = static_cast<std::uint32_t>(j - 2);
      return {out, static_cast<std::uint32_t>(j - 2)};
    }
    ++j;
  increase:
    // R5: try to increase c_j (here c_{j-1} = j - 2).
    if (at(j) + 1 < at(j + 1)) {
      const std::uint32_t out = at(j - 1);
      at(j - 1) = at(j);
      at(j) = at(j) + 1;
      return {out, at(j)};
    }
    ++j;
  }
}

}  // namespace contrasta::detail
