// Contrasts of means under normal theory: pooled variance (classical) and Welch-Satterthwaite.
#pragma once
#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

// SE^2 = MSE sum c_i^2/n_i with MSE over all k groups, df = N - k (Scheffe 1959).
method_result pooled_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

// SE^2 = sum c_i^2 s_i^2/n_i over groups with c_i != 0, Satterthwaite df
// (Welch 1947; Satterthwaite 1946).
method_result welch_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

// The Welch-Satterthwaite degrees of freedom for variance components v_i = c_i^2 s_i^2 / n_i with
// df_i = n_i - 1: (sum v_i)^2 / sum v_i^2 / df_i.
double satterthwaite_df(std::span<const double> components, std::span<const double> component_df);

// Fills p_value, ci_low and ci_high of a t-based result from estimate, se and df, for the
// requested alternative and confidence (a shared step of pooled, Welch and Yuen).
void complete_t_result(method_result& r, double df, const analysis_options& o);

}  // namespace contrasta
