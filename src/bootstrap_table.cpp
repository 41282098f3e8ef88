// The bootstrap's table of entries (bootstrap_table.hpp).
#include "bootstrap_table.hpp"

namespace contrasta::detail {

bootstrap_table::bootstrap_table(const resampling_pool& pool) {
  constexpr std::size_t largest_paired = 128, pair_budget = 1 << 16;
  std::size_t paired_entries = 0, size = 0;
  for (std::size_t g = 0; g < pool.groups(); ++g) {
    const std::size_t n = pool.n(g);
    if (n >= 2 && n <= largest_paired && paired_entries + n * n <= pair_budget) paired_entries += n * n;
    size += 2 * n;
  }
  entries.reserve(2 * paired_entries + size);
  paired_entries = 0;
  for (std::size_t g = 0; g < pool.groups(); ++g) {
    const observation* x = pool.data.data() + pool.offsets[g];
    const std::size_t n = pool.n(g);
    const auto n32 = static_cast<std::uint32_t>(n);
    const bool paired = n >= 2 && n <= largest_paired && paired_entries + n * n <= pair_budget;
    pair_base.push_back(static_cast<std::uint32_t>(entries.size() / 2));
    if (paired) {
      const std::size_t at = entries.size();
      entries.resize(at + 2 * n * n);
      double* out = entries.data() + at;
      for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j < n; ++j, out += 2) {
          out[0] = x[i].value + x[j].value;
          out[1] = x[i].square + x[j].square;
        }
      paired_entries += n * n;
      pairs.push_back(n32 / 2);
      ranges.insert(ranges.end(), n / 2, n32 * n32);
    } else {
      pairs.push_back(0);
    }
    single_base.push_back(static_cast<std::uint32_t>(entries.size() / 2));
    for (std::size_t i = 0; i < n; ++i) {
      entries.push_back(x[i].value);
      entries.push_back(x[i].square);
    }
    const std::uint32_t singles = paired ? n32 % 2 : n32;
    ranges.insert(ranges.end(), singles, n32);
    draws.push_back(pairs.back() + singles);
  }
}

}  // namespace contrasta::detail
