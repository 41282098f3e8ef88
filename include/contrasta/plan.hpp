// Planning a trial: the power of planned contrasts, the sample size that reaches a target power,
// the smallest contrast a design can detect, and the allocation of units that makes a contrast's
// estimate most precise.
#pragma once
#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"

namespace contrasta {

// The test the trial will be analysed with.
enum class planned_test {
  pooled,  // pooled-variance t, df = N - k (Scheffe 1959); assumes one common SD
  welch,   // Welch t with Satterthwaite df from the anticipated per-level SDs (Welch 1947)
};

std::string to_string(planned_test test);
planned_test parse_planned_test(const std::string& text);  // "pooled" | "welch", else usage_error

struct power_request {
  planned_test test = planned_test::pooled;
  double alpha = 0.05;
  alternative side = alternative::two_sided;
};

// What the design implies for one contrast under the anticipated means and SDs.
struct contrast_power {
  double contrast_value = 0;  // psi = sum c_i mu_i under the anticipated means
  double se = 0;              // the standard error the test's statistic divides by
  double df = 0;              // N - k (pooled) or Satterthwaite (welch)
  double ncp = 0;             // noncentrality psi / se
  double critical = 0;        // critical t of the test (positive; the test rejects beyond it)
  double power = 0;           // probability that the test rejects
};

// Power of the t test of contrast `coefficients` (one per level) when the true means are
// `means`, the true SDs `sds` and level i gets n[i] units. Levels with n[i] = 0 are left out of
// the trial; they must have a zero coefficient. Noncentral t: Cohen 1988, ch. 2; Kirk,
// Experimental Design, sec. 4.
//  - pooled: ncp = psi / sqrt(sigma^2 sum c_i^2/n_i), df = N - k, where sigma^2 is the
//    anticipated common variance (with unequal `sds`, their (n_i - 1)-weighted mean, the value
//    the pooled mean square estimates).
//  - welch: ncp = psi / sqrt(sum c_i^2 sigma_i^2/n_i), df = Satterthwaite on c_i^2 sigma_i^2/n_i
//    with n_i - 1 each (an approximation that treats the Welch statistic as noncentral t).
// Throws analysis_error when the design cannot be analysed (a Welch level of one unit, no error
// df, a non-positive SD).
contrast_power power_of_contrast(std::span<const double> coefficients, std::span<const double> means,
                                 std::span<const double> sds, std::span<const std::size_t> n,
                                 const power_request& request);

// Probability that a t test at `alpha` rejects when its statistic is noncentral t(df, ncp).
// Two-sided: P(T > t_{1-alpha/2}) + P(T < -t_{1-alpha/2}); greater: P(T > t_{1-alpha});
// less: P(T < -t_{1-alpha}).
double t_test_power(double ncp, double df, double alpha, alternative side);

// The smallest true contrast (in data units, with the sign the alternative looks for; positive
// for two-sided) that the design detects with probability `target_power`.
double detectable_contrast(std::span<const double> coefficients, std::span<const double> sds,
                           std::span<const std::size_t> n, const power_request& request,
                           double target_power);

struct sample_size {
  std::vector<std::size_t> n;      // units per level
  std::size_t base = 0;            // the n of the level with the smallest ratio
  contrast_power achieved;         // at n
  double power_one_less = 0;       // power with base - 1 (NaN when base - 1 is not analysable)
  bool reached = false;            // false when max_base was hit first
};

// Smallest design n_i = ceil(base * ratio_i / min ratio) with power >= target, over integer
// base (the ratios are kept up to rounding up; zero ratios leave a level out). Power grows with
// every n_i, so the search doubles base and then bisects; the result satisfies
// power(base) >= target > power(base - 1).
sample_size smallest_sample_size(std::span<const double> coefficients, std::span<const double> means,
                                 std::span<const double> sds, std::span<const double> ratios,
                                 const power_request& request, double target_power,
                                 std::size_t max_base = 1'000'000);

// Integer allocation of `total` units minimising the variance sum c_i^2 sigma_i^2 / n_i of the
// contrast estimate (the continuous optimum is n_i proportional to abs(c_i) sigma_i, a
// Neyman-type allocation). Each level with c_i != 0 gets at least `minimum` units, levels with
// c_i = 0 get none. The objective is separable and convex in n_i, so adding units one at a time
// where they reduce the variance most gives the exact integer optimum (greedy marginal
// allocation), not just a rounding of the proportions. Throws analysis_error when `total` is too
// small for the minimum.
std::vector<std::size_t> optimal_allocation(std::span<const double> coefficients, std::span<const double> sds,
                                            std::size_t total, std::size_t minimum = 2);

struct allocated_sample_size {
  std::size_t total = 0;
  std::vector<std::size_t> n;
  contrast_power achieved;
  double power_one_less = 0;  // power of the optimal allocation of total - 1 units
  bool reached = false;
};

// Smallest total whose optimal allocation reaches the target power. The greedy allocation of
// total + 1 extends that of total by one unit, so power grows with the total and bisection is
// exact.
allocated_sample_size smallest_allocated_total(std::span<const double> coefficients, std::span<const double> means,
                                               std::span<const double> sds, const power_request& request,
                                               double target_power, std::size_t max_total = 10'000'000);

// Checks the analytic power by simulation: normal data with the anticipated means and SDs are
// generated `simulations` times, analysed by the engine's own method (run_method with "pooled"
// or "welch"), and the rejections at alpha counted. Normal deviates come from pcg32 streams
// seeded by `seed` (Box-Muller on 53-bit uniforms).
struct simulated_power {
  std::uint64_t simulations = 0;
  std::uint64_t rejections = 0;
  double power = 0;
  double low = 0, high = 0;  // 99% Clopper-Pearson interval
  std::uint64_t seed = 0;
};

simulated_power simulate_power(std::span<const double> coefficients, std::span<const double> means,
                               std::span<const double> sds, std::span<const std::size_t> n,
                               const power_request& request, std::uint64_t simulations, std::uint64_t seed);

// A whole planning request: anticipated truth, the contrasts that matter, and what to solve for.
enum class planning_goal {
  power,              // power (and detectable contrast) of each contrast at the given n
  sample_size,        // smallest n reaching target_power, keeping the ratios
  allocation,         // variance-minimising allocation of a fixed total
  allocated_total,    // smallest total reaching target_power with the variance-minimising allocation
};

struct planning_request {
  std::vector<std::string> levels;
  std::vector<double> means;     // anticipated means, one per level (empty: not given)
  std::vector<double> sds;       // anticipated SDs, one per level
  std::vector<contrast> contrasts;
  power_request test;
  planning_goal goal = planning_goal::power;
  std::vector<std::size_t> n;    // goal power: units per level
  std::vector<double> ratios;    // goal sample_size: allocation ratios (all 1 for equal n)
  std::size_t total = 0;         // goal allocation
  double target_power = 0.8;     // sample-size goals, and the detectable contrast
  std::uint64_t simulations = 0; // > 0: also simulate the engine's test at each design
  std::uint64_t seed = 0;
};

struct contrast_plan {
  contrast spec;
  std::vector<std::size_t> n;    // the design of this row: given, or what this contrast needs
  std::optional<contrast_power> power;   // absent without anticipated means
  double se = 0, df = 0;         // of the test at n (they do not depend on the means)
  double detectable = 0;         // smallest contrast detected with target_power at n
  double power_one_less = 0;     // sample-size goals: power one step smaller (minimality)
  bool reached = true;           // sample-size goals: false when the search limit was hit
  std::optional<simulated_power> simulated;
};

struct planning_result {
  std::vector<contrast_plan> plans;
  // The design that serves every contrast: for sample-size goals the level-wise largest of the
  // contrasts' own requirements (power grows with every n_i), and for the power goal the given n.
  // Empty for the fixed-total allocation, where the contrasts compete for the same units.
  std::vector<std::size_t> common_n;
  std::vector<double> power_at_common;  // each contrast's power at common_n (means given)
  std::string limiting_contrast;        // the contrast that needs the most units
  std::vector<std::string> notes;
};

// Runs the request contrast by contrast. Throws usage_error / analysis_error with a message
// that says what to change.
planning_result plan_trial(const planning_request& request);

std::string to_string(planning_goal goal);

}  // namespace contrasta
