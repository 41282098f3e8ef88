// Orthogonality of a family of contrasts for the design at hand, and the decomposition of the
// between-groups sum of squares into one-degree-of-freedom contrast sums of squares.
#pragma once
#include <cstddef>
#include <span>
#include <string>
#include <utility>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/prepared.hpp"

namespace contrasta {

// Two contrasts c, d are orthogonal for group sizes n when sum c_i d_i / n_i = 0: their
// estimates are then uncorrelated under a common variance. Relative tolerance 1e-9 of
// sqrt(sum c_i^2/n_i sum d_i^2/n_i).
bool orthogonal_for_design(const contrast& a, const contrast& b, std::span<const std::size_t> n);

// The correlation of the two estimates under a common variance:
// sum c_i d_i / n_i / sqrt(sum c_i^2 / n_i sum d_i^2 / n_i). NaN when a level with a non-zero
// coefficient has no observations.
double design_correlation(const contrast& a, const contrast& b, std::span<const std::size_t> n);

struct contrast_sum_of_squares {
  std::string name;
  double estimate = 0;        // psi = sum c_i ybar_i
  double sum_of_squares = 0;  // SS_c = psi^2 / sum c_i^2 / n_i, one degree of freedom
  double share = 0;           // SS_c / SS_between
};

struct orthogonality_report {
  // True when every pair of the contrasts is orthogonal for this design.
  bool mutually_orthogonal = true;
  // Index pairs (into the contrasts) that are not orthogonal, with their design correlation.
  std::vector<std::pair<std::size_t, std::size_t>> non_orthogonal_pairs;
  std::vector<double> non_orthogonal_correlations;
  // One per contrast whose coefficients sum to zero (linear combinations are left out).
  std::vector<contrast_sum_of_squares> sums_of_squares;
  double ss_between = 0;
  double ss_contrasts = 0;   // sum of the SS_c
  // For a mutually orthogonal set, SS_between - ss_contrasts is what the set leaves out (zero
  // for a complete set of k - 1 contrasts among the levels with data). NaN otherwise, since
  // the SS_c of correlated contrasts do not add.
  double ss_remainder = 0;
  bool complete = false;      // mutually orthogonal and k - 1 of them: the SS_c add up to SS_between
};

// The orthogonality report of a family for the prepared data (the writers show it beside the
// ANOVA table).
orthogonality_report orthogonality(const prepared_data& p, const std::vector<contrast>& contrasts);

}  // namespace contrasta
