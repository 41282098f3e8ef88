// The data as every method sees it: the dataset with its summaries and ANOVA table, computed
// once.
#pragma once
#include <span>
#include <vector>

#include "contrasta/anova.hpp"
#include "contrasta/dataset.hpp"
#include "contrasta/summary.hpp"

namespace contrasta {

struct prepared_data {
  dataset data;
  std::vector<group_summary> groups;
  anova_table anova;
  // Each level's observations in ascending order, laid out like data.values (same offsets).
  std::vector<double> sorted;
};

prepared_data prepare(dataset data, double trim = 0.2);

// Level `level`'s observations in ascending order (from prepare).
std::span<const double> sorted_group(const prepared_data& p, std::size_t level);

// Per-level sample sizes, a convenience for families and planning.
std::vector<std::size_t> group_sizes(const prepared_data& p);

}  // namespace contrasta
