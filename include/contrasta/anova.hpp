// The classical one-way analysis of variance table.
#pragma once
#include <vector>

#include "contrasta/dataset.hpp"
#include "contrasta/summary.hpp"

namespace contrasta {

struct anova_table {
  double ss_between = 0, ss_within = 0, ss_total = 0;
  double df_between = 0, df_within = 0;
  double ms_between = 0, ms_within = 0;
  double f = 0, p_value = 0;
  double r_squared = 0, residual_sd = 0;
};

// Sums of squares from the centred data (location-invariant, full precision).
anova_table one_way_anova(const std::vector<group_summary>& groups);

}  // namespace contrasta
