// Rank-based comparisons.
#pragma once
#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

// Permutation test of the studentized contrast of mid-ranks (Conover & Iman 1981).
method_result rank_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);
// Mann-Whitney U of the positive-coefficient level, with the Hodges-Lehmann shift.
method_result mann_whitney_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);
// Brunner-Munzel test; estimate = P(X<Y) + P(X=Y)/2, X the positive-coefficient level.
method_result brunner_munzel_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);
// Dunn's z for a pairwise contrast on the ranks of all levels, tie corrected (Dunn 1964).
method_result dunn_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

}  // namespace contrasta
