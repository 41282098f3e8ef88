// Pieces of bootstrap intervals that are worth checking on their own.
#pragma once
#include <cstdint>
#include <span>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/prepared.hpp"

namespace contrasta::detail {

// The sample quantile with linear interpolation between order statistics at position
// (B - 1) q (Hyndman & Fan 1996, definition 7; numpy's default). Reorders x.
double quantile_linear(std::span<double> x, double q);

// quantile_linear at several levels with one pass over x for all of them (a sorted sample
// brackets each order statistic needed, and only the values inside a bracket are selected);
// the same values as quantile_linear, level by level. NaN levels give not_available. May
// reorder x. The pass runs on up to `threads` threads; the values do not depend on it.
std::vector<double> quantiles_linear(std::span<double> x, std::span<const double> levels, int threads = 1);

// The BCa acceleration of a contrast of means from the jackknife over all observations
// (Efron & Tibshirani 1993 eq. 14.15 in the multi-sample form of scipy.stats.bootstrap): leaving
// out y_i of group j moves psi by c_j (ybar_j - y_i)/(n_j - 1), so
// U_ji = (n_j - 1)(psi_dot - psi_(i)) = c_j (y_i - ybar_j) and
// a = sum_j sum_i U_ji^3 / n_j^3 / (6 (sum_j sum_i U_ji^2 / n_j^2)^(3/2)).
double bca_acceleration(const prepared_data& p, const contrast& c);

// The BCa bias correction z0 = Phi^-1(share of psi* below psi), ties counted half (the 'mean'
// convention of scipy.stats.bootstrap; Efron & Tibshirani 1993 eq. 14.14), from the deviations
// psi* - psi. +-infinity when every deviation lies on one side.
double bca_bias(std::span<const double> deviations);
// The same from the counts of deviations below zero and at or below zero among `resamples`.
double bca_bias(std::uint64_t below, std::uint64_t at_or_below, std::uint64_t resamples);
inline double bca_bias(const std::vector<double>& deviations) {
  return bca_bias(std::span<const double>(deviations));
}

// The BCa probability for a tail probability z_alpha = Phi^-1(alpha) (Efron 1987, eq. 2.3):
// Phi(z0 + (z0 + z_alpha) / (1 - a (z0 + z_alpha))).
double bca_level(double bias, double acceleration, double z_alpha);

}  // namespace contrasta::detail
