// Power, sample size, detectable contrast and allocation for planned contrasts.
#include "contrasta/plan.hpp"

#include <algorithm>
#include <functional>
#include <cmath>
#include <limits>
#include <numeric>
#include <queue>
#include <sstream>
#include <string>

#include <pcg_random.hpp>

#include "contrasta/classical.hpp"
#include "contrasta/contrast.hpp"
#include "contrasta/dataset.hpp"
#include "contrasta/error.hpp"
#include "contrasta/methods.hpp"
#include "contrasta/prepared.hpp"
#include "distributions.hpp"

namespace contrasta {

std::string to_string(planned_test test) { return test == planned_test::welch ? "welch" : "pooled"; }

planned_test parse_planned_test(const std::string& text) {
  if (text == "pooled") return planned_test::pooled;
  if (text == "welch") return planned_test::welch;
  throw usage_error("unknown planning method '" + text + "'; use pooled or welch");
}

namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

void check_sizes(std::span<const double> coefficients, std::span<const double> sds, std::size_t n_size) {
  if (coefficients.empty()) throw analysis_error("a planned contrast needs at least one level");
  if (sds.size() != coefficients.size() || n_size != coefficients.size())
    throw analysis_error("give one SD and one n per level of the contrast");
}

std::string number_words(double x) {
  std::ostringstream out;
  out << x;
  return out.str();
}

void check_target(double target_power, double alpha) {
  if (!(target_power > alpha && target_power < 1))
    throw usage_error("the target power must lie between alpha (" + number_words(alpha) +
                      ") and 1, for example --power 0.8");
}

// Planning works in double precision with the noncentral t: keep the inputs inside the range
// where variances and degrees of freedom are representable.
constexpr std::size_t largest_level_size = 1'000'000'000;

void check_sd(double sd) {
  if (!(sd > 0) || !std::isfinite(sd)) throw analysis_error("anticipated SDs must be positive numbers");
  if (sd < 1e-100 || sd > 1e100)
    throw analysis_error("an anticipated SD of " + number_words(sd) + " is outside the range planning handles; "
                         "rescale the units (for example grams instead of tonnes)");
}

// Critical value of the test statistic at level alpha for the alternative.
double critical_t(double df, double alpha, alternative side) {
  const detail::students_t t(df);
  const double tail = side == alternative::two_sided ? alpha / 2 : alpha;
  return boost::math::quantile(boost::math::complement(t, tail));
}

}  // namespace

double t_test_power(double ncp, double df, double alpha, alternative side) {
  const double crit = critical_t(df, alpha, side);
  if (std::isinf(ncp)) {
    if (side == alternative::greater) return ncp > 0 ? 1.0 : 0.0;
    if (side == alternative::less) return ncp < 0 ? 1.0 : 0.0;
    return 1.0;
  }
  const detail::non_central_t d(df, ncp);
  const double upper = boost::math::cdf(boost::math::complement(d, crit));  // P(T > crit)
  const double lower = boost::math::cdf(d, -crit);                           // P(T < -crit)
  switch (side) {
    case alternative::greater: return upper;
    case alternative::less: return lower;
    case alternative::two_sided: break;
  }
  return upper + lower;
}

contrast_power power_of_contrast(std::span<const double> coefficients, std::span<const double> means,
                                 std::span<const double> sds, std::span<const std::size_t> n,
                                 const power_request& request) {
  check_sizes(coefficients, sds, n.size());
  if (!means.empty() && means.size() != coefficients.size())
    throw analysis_error("give one anticipated mean per level of the contrast");
  if (!(request.alpha > 0 && request.alpha < 1)) throw usage_error("alpha must lie strictly between 0 and 1");

  contrast_power out;
  std::size_t total = 0, levels_in_trial = 0;
  for (std::size_t i = 0; i < coefficients.size(); ++i) {
    if (coefficients[i] != 0 && n[i] == 0)
      throw analysis_error("a level with a non-zero coefficient needs at least one unit");
    if (n[i] == 0) continue;
    if (n[i] > largest_level_size)
      throw analysis_error("more than " + std::to_string(largest_level_size) + " units per level is outside the range planning handles");
    check_sd(sds[i]);
    total += n[i];
    ++levels_in_trial;
    if (!means.empty()) out.contrast_value += coefficients[i] * means[i];
  }

  if (request.test == planned_test::pooled) {
    if (total <= levels_in_trial)
      throw analysis_error("the pooled test needs more units than levels (error df N - k >= 1)");
    // The anticipated common variance: the (n_i - 1)-weighted mean of the level variances,
    // which is what the pooled mean square estimates.
    double pooled_ss = 0, sum_c2_over_n = 0;
    for (std::size_t i = 0; i < coefficients.size(); ++i) {
      if (n[i] == 0) continue;
      const double ni = static_cast<double>(n[i]);
      pooled_ss += (ni - 1) * sds[i] * sds[i];
      sum_c2_over_n += coefficients[i] * coefficients[i] / ni;
    }
    out.df = static_cast<double>(total - levels_in_trial);
    out.se = std::sqrt(pooled_ss / out.df * sum_c2_over_n);
  } else {
    std::vector<double> components, component_df;
    for (std::size_t i = 0; i < coefficients.size(); ++i) {
      if (coefficients[i] == 0) continue;
      if (n[i] < 2) throw analysis_error("the Welch test needs at least 2 units in every level of the contrast");
      const double ni = static_cast<double>(n[i]);
      components.push_back(coefficients[i] * coefficients[i] * sds[i] * sds[i] / ni);
      component_df.push_back(ni - 1);
    }
    double variance = 0;
    for (double v : components) variance += v;
    out.se = std::sqrt(variance);
    out.df = satterthwaite_df(components, component_df);
  }
  if (!(out.se > 0)) throw analysis_error("the contrast has no non-zero coefficient");
  out.ncp = out.contrast_value / out.se;
  out.critical = critical_t(out.df, request.alpha, request.side);
  out.power = t_test_power(out.ncp, out.df, request.alpha, request.side);
  return out;
}

double detectable_contrast(std::span<const double> coefficients, std::span<const double> sds,
                           std::span<const std::size_t> n, const power_request& request,
                           double target_power) {
  check_target(target_power, request.alpha);
  const contrast_power design = power_of_contrast(coefficients, {}, sds, n, request);
  // Power as a function of the size lambda >= 0 of the noncentrality in the direction the
  // alternative looks for; it increases from alpha at lambda = 0 towards 1.
  const double direction = request.side == alternative::less ? -1.0 : 1.0;
  auto gap = [&](double lambda) {
    return t_test_power(direction * lambda, design.df, request.alpha, request.side) - target_power;
  };
  double low = 0, high = 4;
  while (gap(high) < 0) {
    low = high;
    high *= 2;
    if (high > 1e8) throw analysis_error("no detectable contrast found for this target power");
  }
  // Bisection to a relative width near machine precision: the root is where a continuous,
  // increasing function crosses zero, so this cannot miss it.
  for (int i = 0; i < 200 && high - low > 4 * std::numeric_limits<double>::epsilon() * high; ++i) {
    const double mid = 0.5 * (low + high);
    (gap(mid) < 0 ? low : high) = mid;
  }
  return direction * 0.5 * (low + high) * design.se;
}

namespace {

// Power of a candidate design, or NaN when that design cannot be analysed with the test.
double power_or_nan(std::span<const double> coefficients, std::span<const double> means,
                    std::span<const double> sds, std::span<const std::size_t> n, const power_request& request) {
  try {
    return power_of_contrast(coefficients, means, sds, n, request).power;
  } catch (const analysis_error&) {
    return nan;
  }
}

bool reaches(double power, double target) { return !std::isnan(power) && power >= target; }

// Finds the smallest integer x in [first, limit] with reaches(f(x)) for a function that, once it
// reaches the target, stays there (power grows with the design). Returns limit + 1 when none.
template <class F>
std::size_t smallest_reaching(std::size_t first, std::size_t limit, double target, F&& power_at) {
  if (reaches(power_at(first), target)) return first;
  std::size_t low = first, high = first;  // invariant: power(low) below target
  for (;;) {
    if (high >= limit) return limit + 1;
    high = std::min(limit, high < 1 ? 1 : 2 * high);
    if (reaches(power_at(high), target)) break;
    low = high;
  }
  while (high - low > 1) {
    const std::size_t mid = low + (high - low) / 2;
    (reaches(power_at(mid), target) ? high : low) = mid;
  }
  return high;
}

void check_anticipated_effect(std::span<const double> coefficients, std::span<const double> means) {
  if (means.size() != coefficients.size())
    throw usage_error("solving for n needs the anticipated means of every level (--means)");
  double psi = 0, scale = 0;
  for (std::size_t i = 0; i < means.size(); ++i) {
    psi += coefficients[i] * means[i];
    scale += std::abs(coefficients[i] * means[i]);
  }
  if (!(std::abs(psi) > 1e-12 * scale))
    throw analysis_error("the anticipated means make this contrast zero, so no n reaches the target power; "
                         "give means that differ as you expect them to");
}

}  // namespace

sample_size smallest_sample_size(std::span<const double> coefficients, std::span<const double> means,
                                 std::span<const double> sds, std::span<const double> ratios,
                                 const power_request& request, double target_power, std::size_t max_base) {
  check_sizes(coefficients, sds, ratios.size());
  check_target(target_power, request.alpha);
  check_anticipated_effect(coefficients, means);
  double smallest_ratio = std::numeric_limits<double>::infinity();
  for (std::size_t i = 0; i < ratios.size(); ++i) {
    if (!(ratios[i] >= 0) || !std::isfinite(ratios[i])) throw usage_error("allocation ratios must be non-negative numbers");
    if (ratios[i] > 0) smallest_ratio = std::min(smallest_ratio, ratios[i]);
  }
  if (std::isinf(smallest_ratio)) throw usage_error("at least one allocation ratio must be positive");
  for (double r : ratios)
    if (r / smallest_ratio > 1e6) throw usage_error("allocation ratios that differ by more than a factor of 10^6 are not supported");

  auto design = [&](std::size_t base) {
    std::vector<std::size_t> n(ratios.size(), 0);
    for (std::size_t i = 0; i < ratios.size(); ++i) {
      if (ratios[i] == 0) continue;
      // Rounded up, with a tolerance so that 1.5 * 4 = 6 stays 6 despite binary fractions.
      const double wanted = static_cast<double>(base) * ratios[i] / smallest_ratio;
      n[i] = static_cast<std::size_t>(std::ceil(wanted * (1 - 1e-12)));
    }
    return n;
  };
  auto power_at = [&](std::size_t base) {
    const std::vector<std::size_t> n = design(base);
    return power_or_nan(coefficients, means, sds, n, request);
  };

  sample_size out;
  const std::size_t base = smallest_reaching(1, max_base, target_power, power_at);
  out.reached = base <= max_base;
  out.base = std::min(base, max_base);
  out.n = design(out.base);
  out.achieved = power_of_contrast(coefficients, means, sds, out.n, request);
  out.power_one_less = out.base > 1 ? power_at(out.base - 1) : nan;
  return out;
}

std::vector<std::size_t> optimal_allocation(std::span<const double> coefficients, std::span<const double> sds,
                                            std::size_t total, std::size_t minimum) {
  check_sizes(coefficients, sds, sds.size());
  const std::size_t k = coefficients.size();
  std::vector<double> weight(k, 0);  // c_i^2 sigma_i^2: the variance is sum weight_i / n_i
  std::vector<std::size_t> n(k, 0);
  std::size_t involved = 0;
  for (std::size_t i = 0; i < k; ++i) {
    if (coefficients[i] == 0) continue;
    check_sd(sds[i]);
    weight[i] = coefficients[i] * coefficients[i] * sds[i] * sds[i];
    ++involved;
  }
  if (involved == 0) throw analysis_error("the contrast has no non-zero coefficient");
  minimum = std::max<std::size_t>(minimum, 1);
  if (total < minimum * involved)
    throw analysis_error("a total of " + std::to_string(total) + " units cannot give each of the " +
                         std::to_string(involved) + " levels in the contrast " + std::to_string(minimum) + " units");

  // Start below the optimum: the continuous optimum n_i = total abs(c_i) sigma_i / sum, with
  // levels whose share falls under the minimum fixed there (water-filling), then one unit less.
  // The greedy steps below then add exactly the largest remaining marginal reductions.
  std::vector<bool> fixed(k, false);
  std::vector<double> continuous(k, 0);
  for (bool changed = true; changed;) {
    changed = false;
    double free_total = static_cast<double>(total), free_scale = 0;
    for (std::size_t i = 0; i < k; ++i) {
      if (weight[i] == 0) continue;
      if (fixed[i]) free_total -= static_cast<double>(minimum);
      else free_scale += std::sqrt(weight[i]);
    }
    for (std::size_t i = 0; i < k; ++i) {
      if (weight[i] == 0 || fixed[i]) continue;
      continuous[i] = free_total * std::sqrt(weight[i]) / free_scale;
      if (continuous[i] < static_cast<double>(minimum)) {
        fixed[i] = true;
        changed = true;
      }
    }
  }
  std::size_t used = 0;
  for (std::size_t i = 0; i < k; ++i) {
    if (weight[i] == 0) continue;
    const double start = fixed[i] ? 0.0 : std::floor(continuous[i]) - 1;
    n[i] = std::max<std::size_t>(minimum, start > 0 ? static_cast<std::size_t>(start) : 0);
    used += n[i];
  }
  if (used > total) {  // cannot happen with the bounds above; keep the greedy start safe anyway
    used = 0;
    for (std::size_t i = 0; i < k; ++i)
      if (weight[i] != 0) used += n[i] = minimum;
  }

  // Greedy marginal allocation: one more unit in level i lowers the variance by
  // weight_i / (n_i (n_i + 1)). Ties go to the earlier level, so the result is deterministic.
  using entry = std::pair<double, std::size_t>;
  auto later = [](const entry& a, const entry& b) { return a.first < b.first || (a.first == b.first && a.second > b.second); };
  std::priority_queue<entry, std::vector<entry>, decltype(later)> gains(later);
  auto gain = [&](std::size_t i) {
    const double ni = static_cast<double>(n[i]);
    return weight[i] / (ni * (ni + 1));
  };
  for (std::size_t i = 0; i < k; ++i)
    if (weight[i] != 0) gains.emplace(gain(i), i);
  for (; used < total; ++used) {
    const std::size_t i = gains.top().second;
    gains.pop();
    ++n[i];
    gains.emplace(gain(i), i);
  }
  return n;
}

allocated_sample_size smallest_allocated_total(std::span<const double> coefficients, std::span<const double> means,
                                               std::span<const double> sds, const power_request& request,
                                               double target_power, std::size_t max_total) {
  check_sizes(coefficients, sds, sds.size());
  check_target(target_power, request.alpha);
  check_anticipated_effect(coefficients, means);
  const std::size_t minimum = 2;
  std::size_t involved = 0;
  for (double c : coefficients) involved += c != 0;
  const std::size_t first = minimum * involved;

  auto power_at = [&](std::size_t total) {
    const std::vector<std::size_t> n = optimal_allocation(coefficients, sds, total, minimum);
    return power_or_nan(coefficients, means, sds, n, request);
  };
  allocated_sample_size out;
  const std::size_t total = smallest_reaching(first, max_total, target_power, power_at);
  out.reached = total <= max_total;
  out.total = std::min(total, max_total);
  out.n = optimal_allocation(coefficients, sds, out.total, minimum);
  out.achieved = power_of_contrast(coefficients, means, sds, out.n, request);
  out.power_one_less = out.total > first ? power_at(out.total - 1) : nan;
  return out;
}

namespace {

// A uniform double in (0, 1) from 53 random bits, the same on every machine.
double open_uniform(pcg32& engine) {
  const std::uint64_t high = engine(), low = engine();
  const std::uint64_t bits = ((high << 32) | low) >> 11;
  return (static_cast<double>(bits) + 0.5) * 0x1.0p-53;
}

// Standard normal deviates by the Box-Muller transform (Box & Muller 1958), both of each pair used.
struct normal_source {
  pcg32& engine;
  bool has_spare = false;
  double spare = 0;
  double operator()() {
    if (has_spare) {
      has_spare = false;
      return spare;
    }
    const double radius = std::sqrt(-2 * std::log(open_uniform(engine)));
    const double angle = 2 * 3.14159265358979323846 * open_uniform(engine);
    spare = radius * std::sin(angle);
    has_spare = true;
    return radius * std::cos(angle);
  }
};

}  // namespace

simulated_power simulate_power(std::span<const double> coefficients, std::span<const double> means,
                               std::span<const double> sds, std::span<const std::size_t> n,
                               const power_request& request, std::uint64_t simulations, std::uint64_t seed) {
  // Validates the design the same way as the analytic power.
  (void)power_of_contrast(coefficients, means, sds, n, request);
  if (simulations == 0) throw usage_error("the number of simulations must be positive");

  std::vector<std::string> levels;
  std::vector<std::size_t> in_trial;
  contrast spec;
  spec.name = "planned";
  for (std::size_t i = 0; i < n.size(); ++i) {
    if (n[i] == 0) continue;
    in_trial.push_back(i);
    levels.push_back("level" + std::to_string(i + 1));
    spec.coefficients.push_back(coefficients[i]);
  }
  analysis_options options;
  options.alpha = request.alpha;
  options.conf = 1 - request.alpha;
  options.side = request.side;
  options.seed = seed;
  const std::string method = to_string(request.test);

  // One stream for the whole run: the statistic of each dataset is cheap, so there is no
  // parallel split whose blocks would need separate streams.
  pcg32 engine(seed, 0x706c616eULL /* "plan" */);
  normal_source normal{engine};
  std::vector<std::vector<double>> groups(in_trial.size());
  simulated_power out;
  out.simulations = simulations;
  out.seed = seed;
  for (std::uint64_t s = 0; s < simulations; ++s) {
    for (std::size_t g = 0; g < in_trial.size(); ++g) {
      const std::size_t i = in_trial[g];
      groups[g].resize(n[i]);
      for (double& y : groups[g]) y = means.empty() ? sds[i] * normal() : means[i] + sds[i] * normal();
    }
    const prepared_data prepared = prepare(make_dataset(levels, groups));
    const method_result r = run_method(method, prepared, spec, options);
    if (r.p_value <= request.alpha) ++out.rejections;
  }
  out.power = static_cast<double>(out.rejections) / static_cast<double>(simulations);
  // Clopper & Pearson 1934: the beta quantiles bounding a binomial proportion.
  const double x = static_cast<double>(out.rejections), m = static_cast<double>(simulations);
  out.low = out.rejections == 0 ? 0.0 : boost::math::quantile(detail::beta(x, m - x + 1), 0.005);
  out.high = out.rejections == simulations ? 1.0 : boost::math::quantile(detail::beta(x + 1, m - x), 0.995);
  return out;
}

std::string to_string(planning_goal goal) {
  switch (goal) {
    case planning_goal::power: return "power";
    case planning_goal::sample_size: return "sample-size";
    case planning_goal::allocation: return "allocation";
    case planning_goal::allocated_total: return "allocated-sample-size";
  }
  return "power";
}

planning_result plan_trial(const planning_request& request) {
  const std::size_t k = request.levels.size();
  if (k < 2) throw usage_error("planning needs at least two levels, for example --means \"a=10,b=12\"");
  if (request.sds.size() != k) throw usage_error("give an anticipated SD for every level (--sd or --sds)");
  if (!request.means.empty() && request.means.size() != k)
    throw usage_error("give an anticipated mean for every level (--means)");
  if (request.contrasts.empty()) throw usage_error("give at least one contrast (-c) or a family (--family)");
  if (request.simulations > 0 && request.means.empty())
    throw usage_error("--simulate needs the anticipated means (--means)");
  if (request.total > largest_level_size) throw usage_error("a total above 10^9 units is outside the range planning handles");

  planning_result out;
  if (request.test.test == planned_test::pooled &&
      std::adjacent_find(request.sds.begin(), request.sds.end(), std::not_equal_to<>()) != request.sds.end())
    out.notes.push_back("the pooled test assumes one common SD; with the unequal SDs given, its power here uses "
                        "their pooled value; --method welch or --simulate shows what unequal SDs do");

  for (const contrast& c : request.contrasts) {
    if (c.coefficients.size() != k) throw analysis_error("contrast '" + c.name + "' does not match the levels");
    contrast_plan row;
    row.spec = c;
    switch (request.goal) {
      case planning_goal::power:
        if (request.n.size() != k) throw usage_error("give the units per level (--n or --ns)");
        row.n = request.n;
        if (!request.means.empty()) row.power = power_of_contrast(c.coefficients, request.means, request.sds, row.n, request.test);
        break;
      case planning_goal::sample_size: {
        const sample_size s = smallest_sample_size(c.coefficients, request.means, request.sds, request.ratios,
                                                   request.test, request.target_power);
        row.n = s.n;
        row.power = s.achieved;
        row.power_one_less = s.power_one_less;
        row.reached = s.reached;
        break;
      }
      case planning_goal::allocation:
        row.n = optimal_allocation(c.coefficients, request.sds, request.total);
        if (!request.means.empty()) row.power = power_of_contrast(c.coefficients, request.means, request.sds, row.n, request.test);
        break;
      case planning_goal::allocated_total: {
        const allocated_sample_size a = smallest_allocated_total(c.coefficients, request.means, request.sds,
                                                                 request.test, request.target_power);
        row.n = a.n;
        row.power = a.achieved;
        row.power_one_less = a.power_one_less;
        row.reached = a.reached;
        break;
      }
    }
    if (!row.reached)
      out.notes.push_back("contrast '" + c.name + "': the target power was not reached within the search limit");
    const contrast_power design = power_of_contrast(c.coefficients, {}, request.sds, row.n, request.test);
    row.se = design.se;
    row.df = design.df;
    row.detectable = detectable_contrast(c.coefficients, request.sds, row.n, request.test, request.target_power);
    if (request.simulations > 0 &&
        static_cast<double>(request.simulations) * static_cast<double>(std::accumulate(row.n.begin(), row.n.end(), std::size_t{0})) > 2e9)
      throw usage_error("simulating " + std::to_string(request.simulations) + " trials of this size would take too long; "
                        "lower --simulations (the product of simulations and units should stay below 2e9)");
    if (request.simulations > 0)
      row.simulated = simulate_power(c.coefficients, request.means, request.sds, row.n, request.test,
                                     request.simulations, request.seed);
    out.plans.push_back(std::move(row));
  }

  if (request.goal == planning_goal::allocation) {
    if (out.plans.size() > 1)
      out.notes.push_back("each contrast has its own best allocation of the fixed total; no single allocation is best for all");
    return out;
  }
  if (request.goal == planning_goal::power) {
    out.common_n = request.n;
  } else {
    out.common_n.assign(k, 0);
    std::size_t largest = 0;
    for (const contrast_plan& row : out.plans) {
      std::size_t total = 0;
      for (std::size_t i = 0; i < k; ++i) {
        out.common_n[i] = std::max(out.common_n[i], row.n[i]);
        total += row.n[i];
      }
      if (total > largest) largest = total, out.limiting_contrast = row.spec.name;
    }
  }
  if (!request.means.empty())
    for (const contrast_plan& row : out.plans)
      out.power_at_common.push_back(
          power_of_contrast(row.spec.coefficients, request.means, request.sds, out.common_n, request.test).power);
  return out;
}

}  // namespace contrasta
