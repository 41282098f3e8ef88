// Standard families of contrasts (the --family option).
#pragma once
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "contrasta/contrast.hpp"

namespace contrasta {

// kind: all-pairs | versus=LEVEL | helmert | trend[=x1,x2,...] | trend-weighted[=...] |
// adjacent | grand-mean. `n` (per level) is used by the n-weighted trend set.
//   trend: orthogonal polynomial contrasts (linear, quadratic, ...) over the level values x
//     (given, else the level names when all are numbers, else 1..k), orthogonal with unit
//     weights: the classical set, orthogonal for this design only when the n_i are equal.
//   trend-weighted: orthogonal with weights n_i, c_i = n_i p(x_i): mutually orthogonal for the
//     design (sum c_i c'_i / n_i = 0), so their sums of squares add up to the between-groups SS
//     (the sequential polynomial regression on the observations).
//   Each trend is scaled to sum |c_i| = 2 with a positive last coefficient.
std::vector<contrast> make_family(std::string_view kind, const std::vector<std::string>& levels,
                                  const std::vector<std::size_t>& n);

std::vector<contrast> all_pairs(const std::vector<std::string>& levels);

// Orthogonal polynomial contrasts of degree 1 .. (levels with weight > 0) - 1 for level values
// x under the inner product sum w_i a_i b_i; coefficients c_i = w_i p_d(x_i), each scaled to
// sum |c_i| = 2 with a positive last non-zero coefficient.
std::vector<std::vector<double>> orthogonal_polynomial_contrasts(std::span<const double> x, std::span<const double> weight);

}  // namespace contrasta
