// Per-level descriptive statistics, computed once from a dataset and shared by every method.
#pragma once
#include <cstddef>
#include <span>
#include <vector>

#include "contrasta/dataset.hpp"

namespace contrasta {

struct group_summary {
  std::string level;
  std::size_t n = 0;
  std::size_t n_missing = 0;
  // Location statistics in the units of the data (centre added back).
  double mean = 0, median = 0, trimmed_mean = 0, min = 0, max = 0;
  // The same locations on the centred scale: methods use these so that differences keep full
  // precision.
  double centred_mean = 0, centred_median = 0, centred_trimmed_mean = 0;
  double variance = 0;             // divisor n - 1 (NaN when n < 2)
  double sd = 0;
  double sum_squares = 0;          // sum (y - mean)^2, two-pass with compensation
  double trim = 0.2;               // the proportion used for trimmed_mean and winsorized_variance
  std::size_t trimmed_per_side = 0;  // g = floor(trim n)
  double winsorized_variance = 0;  // divisor n - 1
};

// Summaries of every level. `trim` sets the trimmed mean and winsorized variance.
std::vector<group_summary> summarize(const dataset& data, double trim = 0.2);

// The summary of one level, given that level's observations in ascending order (prepare sorts
// each level once and shares the sorted copy with the summaries and the diagnostics).
group_summary summarize_level(const dataset& data, std::size_t level, std::span<const double> sorted, double trim);

// Accurate helpers on a sample, used by the summaries and by resampling code.
double accurate_mean(std::span<const double> x);                 // two-pass corrected mean
double sum_squared_deviations(std::span<const double> x, double mean);  // compensated
double median_of(std::span<const double> x);                     // copies, nth_element
double trimmed_mean_of(std::span<const double> x, double trim);
double winsorized_variance_of(std::span<const double> x, double trim);
// The same three on a sample already in ascending order (no copy, no sort for the first two);
// each gives exactly the value of its unsorted twin.
double median_of_sorted(std::span<const double> sorted);
double trimmed_mean_of_sorted(std::span<const double> sorted, double trim);
double winsorized_variance_of_sorted(std::span<const double> sorted, double trim);
// |y - centre| for every y of an ascending sample, in ascending order, in one linear pass.
std::vector<double> sorted_absolute_deviations(std::span<const double> sorted, double centre);

}  // namespace contrasta
