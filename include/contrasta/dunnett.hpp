// Dunnett's many-to-one distribution: the joint distribution of T_i = (ybar_i - ybar_0) / SE_i
// for treatments i = 1..m against one control 0 under normal theory with a pooled variance
// estimate on df degrees of freedom. The T_i are correlated with rho_ij = lambda_i lambda_j,
// lambda_i = sqrt(n_i / (n_i + n_0)) (Dunnett 1955, JASA 50:1096-1121).
#pragma once
#include <span>
#include <vector>

namespace contrasta {

// lambda_i = sqrt(n_i / (n_i + n_0)) for each treatment size n_i and control size n_0.
std::vector<double> dunnett_lambdas(std::span<const double> treatment_n, double control_n);

// P(max_i |T_i| <= c) (two_sided) or P(max_i T_i <= c) (one-sided), df > 0 or infinity.
// A negative lambda_i stands for a comparison written control - treatment: the correlations
// are then lambda_i lambda_j with signs, which matters for one-sided probabilities only.
double dunnett_cdf(double c, std::span<const double> lambda, double df, bool two_sided);

// The complement P(max_i |T_i| > c) (or P(max_i T_i > c)), computed directly so that small
// adjusted p-values keep their digits.
double dunnett_sf(double c, std::span<const double> lambda, double df, bool two_sided);

// The critical value c with dunnett_sf(c) = alpha (root finding on the joint probability).
double dunnett_critical(double alpha, std::span<const double> lambda, double df, bool two_sided);

}  // namespace contrasta
