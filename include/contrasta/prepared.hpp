// The data as every method sees it: the dataset with its summaries and ANOVA table, computed
// once.
#pragma once
#include <vector>

#include "contrasta/anova.hpp"
#include "contrasta/dataset.hpp"
#include "contrasta/summary.hpp"

namespace contrasta {

struct prepared_data {
  dataset data;
  std::vector<group_summary> groups;
  anova_table anova;
};

prepared_data prepare(dataset data, double trim = 0.2);

// Per-level sample sizes, a convenience for families and planning.
std::vector<std::size_t> group_sizes(const prepared_data& p);

}  // namespace contrasta
