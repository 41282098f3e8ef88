// Resampling inference for one contrast: permutation (exact or Monte Carlo) and bootstrap.
#pragma once
#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

// Reassigns the observations of the levels with c_i != 0, keeping group sizes; statistic per
// options.statistic (studentized Welch t by default). Exact when the arrangements are few.
method_result permutation_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

// Resamples with replacement within each level; interval per options.interval; p-value from the
// bootstrap-t distribution (Hall & Wilson 1991).
method_result bootstrap_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

}  // namespace contrasta
