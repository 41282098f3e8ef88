// The knobs every inference method reads. One plain struct so that every method has the same
// signature: (prepared data, contrast, options) -> method_result.
#pragma once
#include <atomic>
#include <cstdint>
#include <functional>
#include <string>

namespace contrasta {

enum class alternative { two_sided, greater, less };

enum class exact_mode { automatic, always, never };

enum class bootstrap_interval { percentile, bca, studentized };

// The statistic a permutation test recomputes on every reassignment.
enum class permutation_statistic { studentized, raw };

struct analysis_options {
  double conf = 0.95;    // confidence level of the intervals
  double alpha = 0.05;   // level at which conclusions are drawn (tables, agreement marks)
  alternative side = alternative::two_sided;
  double trim = 0.2;     // proportion trimmed from each end for trimmed means (Yuen)
  std::uint64_t resamples = 99'999;  // Monte Carlo permutations / bootstrap resamples
  std::uint64_t seed = 0;            // the seed actually used (the CLI draws one if not given)
  unsigned threads = 0;              // 0 = all hardware threads
  exact_mode exact = exact_mode::automatic;
  std::uint64_t max_arrangements = 20'000'000;  // exact enumeration up to this many reassignments
  bootstrap_interval interval = bootstrap_interval::bca;
  permutation_statistic statistic = permutation_statistic::studentized;
  bool allow_linear = false;  // accept coefficients that do not sum to zero
  // Called now and then by long computations with the fraction done (0..1); may be empty.
  std::function<void(double)> progress;
  // Set by a signal handler to ask long computations to stop; they then throw analysis_error.
  const std::atomic<bool>* cancel = nullptr;
};

std::string to_string(alternative side);
alternative parse_alternative(const std::string& text);

}  // namespace contrasta
