// Trimmed-mean (Yuen) contrasts.
#pragma once
#include <cstddef>
#include <span>

#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

// Yuen 1974 generalised to any contrast: trimmed means, winsorized variances, Welch-type df.
// d_i = (n_i - 1) s_wi^2 / (h_i (h_i - 1)), SE^2 = sum c_i^2 d_i,
// df = (sum c_i^2 d_i)^2 / sum (c_i^2 d_i)^2 / (h_i - 1), over the levels with c_i != 0.
method_result trimmed_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

// g = floor(gamma n) observations trimmed from each end. gamma is taken as the decimal the user
// wrote: 0.29 * 100 is 28.999999999999996 in binary floating point, and still trims 29.
// Throws usage_error unless 0 <= gamma < 0.5.
std::size_t trim_count(std::size_t n, double trim);

struct trimmed_sample {
  std::size_t n = 0;
  std::size_t trimmed_per_side = 0;  // g
  std::size_t kept = 0;              // h = n - 2 g
  double trimmed_mean = 0;           // mean of the h middle order statistics
  double winsorized_variance = 0;    // divisor n - 1, the g extremes set to their neighbours
};

// Trimmed mean and winsorized variance of one sample (Tukey & McLaughlin 1963; Yuen 1974).
trimmed_sample trim_sample(std::span<const double> x, double trim);

}  // namespace contrasta
