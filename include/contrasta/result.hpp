// The one result type every inference method returns, so that writers, the multiplicity step
// and the method-agreement table never care which method ran.
#pragma once
#include <array>
#include <cstdint>
#include <limits>
#include <optional>
#include <string>
#include <vector>

namespace contrasta {

inline constexpr double not_available = std::numeric_limits<double>::quiet_NaN();

struct method_result {
  std::string method;            // pooled | welch | trimmed | permutation | bootstrap | rank | ...
  std::string estimand;          // words: what `estimate` estimates ("mean contrast", ...)
  double estimate = not_available;
  double se = not_available;
  std::string statistic_name;    // t, z, U, W, ...
  double statistic = not_available;
  std::optional<double> df;      // absent where no df applies
  double p_value = not_available;
  double p_adjusted = not_available;  // set by the family step; equals p_value with no adjustment
  double ci_low = not_available, ci_high = not_available;  // at options.conf, unadjusted
  // Simultaneous interval from the family step, where the adjustment defines one.
  std::optional<double> simultaneous_low, simultaneous_high;
  std::string null_hypothesis;   // words: the null this method tests
  // Resampling only.
  std::optional<std::uint64_t> resamples;
  bool exact = false;
  std::optional<std::array<double, 2>> p_interval;  // 99% Monte Carlo interval of p
  // Batch mode: adjusted across responses.
  std::optional<double> p_adjusted_across;
  std::vector<std::string> notes;  // caveats worth printing ("normal approximation, ties")
};

}  // namespace contrasta
