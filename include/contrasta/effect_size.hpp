// Standardized effect sizes of a contrast, with confidence intervals: how large the contrast is
// in SD units, which a p-value does not say.
#pragma once
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"

namespace contrasta {

struct standardized_effect {
  std::string kind;           // "standardized" (pooled SD) | "bonett" (unequal variances)
  double estimate = 0;        // scaled contrast / standardizer
  double ci_low = 0, ci_high = 0;  // at options.conf (one end infinite for one-sided requests)
  double standardizer = 0;    // the SD the contrast is divided by
  double se = 0;              // the large-sample SE of the estimate (Bonett); NaN for the nct interval
  std::optional<double> df;   // the noncentral t df (pooled), absent for Bonett's normal interval
  std::string interval;       // words: how the interval was made
};

struct effect_size_result {
  // Coefficients rescaled so that sum abs(c_i) = 2, which makes the scaled contrast a
  // difference between two (weighted) averages of means whatever the written coefficients.
  std::vector<double> scaled_coefficients;
  double scale = 0;           // scaled = scale * written
  double scaled_contrast = 0; // sum scaled_i ybar_i, in data units
  double conf = 0.95;
  standardized_effect standardized;  // Steiger & Fouladi 1997; Kline 2013
  standardized_effect bonett;        // Bonett 2008
  std::vector<std::string> notes;    // why a field is missing, what the scaling did
};

// Both standardized effect sizes of a contrast:
//  - standardized: d = psi' / s_p with psi' = sum c'_i ybar_i (c' scaled so sum abs(c'_i) = 2)
//    and s_p = sqrt(MSE) over all k levels. The interval inverts the noncentral t distribution
//    of t = d / sqrt(sum c'_i^2 / n_i) with df N - k in its noncentrality (Steiger & Fouladi 1997);
//    the ends are multiplied back by sqrt(sum c'_i^2 / n_i).
//  - bonett: phi = psi' / sigma* with sigma*^2 = sum s_i^2 / k (the unweighted mean of the k level
//    variances, which does not assume they are equal), and the interval phi +- z SE with
//    SE^2 = phi^2 sum (s_i^4 / (n_i - 1)) / (2 k^2 sigma*^4) + sum (c'_i^2 s_i^2 / (n_i - 1)) / sigma*^2
//    (Bonett 2008, Psychol. Methods 13:99-109, between-subjects case).
// Fields that the data do not allow (no error df, a level of one, a constant response, a linear
// combination that is not a contrast) are NaN with a note saying why; this never throws for data.
effect_size_result effect_sizes(const prepared_data& p, const contrast& c, const analysis_options& o);

// The noncentrality parameters (low, high) of a noncentral t with `df` whose cdf at `t` is
// (1 + conf)/2 and (1 - conf)/2 (two-sided); for `greater` only the low end is finite, found at
// cdf = conf, for `less` only the high end at cdf = 1 - conf (Steiger & Fouladi 1997).
std::pair<double, double> noncentrality_limits(double t, double df, double conf, alternative side);

}  // namespace contrasta
