// Calibration on the user's own design: simulate many datasets with the observed group sizes
// and SDs and equal means, run each method on each, and count how often it rejects at alpha
// (the actual type I error), and with an effect, how often it detects it (power).
#pragma once
#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"

namespace contrasta {

enum class error_model {
  normal,     // y = mu_i + s_i z, z standard normal
  residuals,  // y = mu_i + s_i r, r drawn from the pooled standardized residuals of the data
};

std::string to_string(error_model m);

struct calibration_request {
  std::size_t datasets = 2000;
  std::vector<std::string> methods;  // empty: every method of method_names() that runs here
  std::vector<contrast> contrasts;   // empty: all pairs of levels
  std::vector<error_model> models = {error_model::normal, error_model::residuals};
  // Power: the simulated means keep the observed pattern of means, scaled so that the largest
  // difference between two levels equals `effect` (data units).
  std::optional<double> effect;
  // Resamples per simulated dataset for permutation, bootstrap and rank methods (always Monte
  // Carlo here: alpha (resamples + 1) should be a whole number so the test can hold alpha).
  std::uint64_t method_resamples = 199;
};

struct calibration_row {
  std::string method;
  std::string model;  // normal | residuals
  double alpha = 0.05;
  std::size_t datasets = 0;
  std::size_t contrasts = 0;
  // Rejection rate under equal means, averaged over the contrasts, and its Monte Carlo standard
  // error (from the spread of the per-dataset rejection shares, so correlated contrasts count
  // correctly).
  double type1_error = 0;
  double type1_se = 0;
  double worst_type1_error = 0;  // the contrast with the highest rejection rate
  std::string worst_contrast;
  std::optional<double> power;  // with an effect: rejection rate for the largest true contrast
  std::optional<double> power_se;
  std::string power_contrast;
  std::size_t failures = 0;  // method could not run on a simulated dataset (counted as no rejection)
};

struct calibration_report {
  std::vector<calibration_row> rows;  // method by method, each error model in request order
  std::vector<std::string> skipped;   // methods not run, with the reason
  std::uint64_t seed = 0;
  std::size_t datasets = 0;
  std::uint64_t method_resamples = 0;
  std::optional<double> effect;
};

// Deterministic for a seed (options.seed) whatever options.threads: each fixed block of
// datasets draws from its own pcg32 stream.
calibration_report calibrate(const prepared_data& p, const calibration_request& request, const analysis_options& o);

// Binomial-type band: Bradley's (1978) liberal criterion for a robust test's size, alpha/2 to
// 3 alpha/2 (Br. J. Math. Stat. Psychol. 31:144-152).
bool within_bradley_band(double type1_error, double alpha);

}  // namespace contrasta
