// The studentized range distribution: Q = (max - min of k independent standard normal
// variables) / s, with s^2 an independent chi^2_df / df variable (df = infinity: s = 1). The
// reference distribution of Tukey-Kramer and Games-Howell comparisons.
#pragma once

namespace contrasta {

// P(Q <= q) for k >= 2 groups and df > 0 (std::numeric_limits<double>::infinity() allowed).
// Accurate to about 1e-12 absolute. NaN for k < 2, df <= 0 or NaN arguments.
double studentized_range_cdf(double q, double k, double df);

// P(Q > q), computed directly rather than as 1 - cdf wherever the known-variance tail is below
// 1e-3, so that small upper-tail probabilities (adjusted p-values) keep their relative accuracy (checked to 1e-13 relative for tails down
// to 1e-169; see tests/studentized_range_test.cpp).
double studentized_range_sf(double q, double k, double df);

// The q with P(Q <= q) = prob.
double studentized_range_quantile(double prob, double k, double df);

// The q with P(Q > q) = alpha: the critical value of a simultaneous test at level alpha.
double studentized_range_critical(double alpha, double k, double df);

}  // namespace contrasta
