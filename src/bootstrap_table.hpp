// The entries the bootstrap kernel draws from (resample_kernels.hpp, bootstrap_shape): pair
// entries for the groups small enough that their n^2 pairs stay in the processor's cache (at
// most 128 observations, and 2^16 pair entries, 1 MB, in all), single entries for every group.
// Which groups get pairs depends on the group sizes alone, so results do not depend on the
// machine.
#pragma once
#include <cstdint>
#include <vector>

#include "resample_core.hpp"
#include "resample_kernels.hpp"

namespace contrasta::detail {

struct bootstrap_table {
  std::vector<double> entries;  // (sum, sum of squares) side by side
  std::vector<std::uint32_t> draws, pairs, pair_base, single_base;
  std::vector<std::uint32_t> ranges;  // the draws of one resample, in order

  explicit bootstrap_table(const resampling_pool& pool);
  bootstrap_shape shape() const {
    return {static_cast<std::uint32_t>(draws.size()), draws.data(), pairs.data(), pair_base.data(), single_base.data()};
  }
};

}  // namespace contrasta::detail
