#include "contrasta/classical.hpp"

#include <cmath>

#include "contrasta/error.hpp"
#include "distributions.hpp"

namespace contrasta {
namespace {

int side_of(alternative a) { return a == alternative::greater ? 1 : a == alternative::less ? -1 : 0; }

double mean_contrast(const prepared_data& p, const contrast& c) {
  // On the centred scale; the centre enters only when the coefficients do not sum to zero.
  double psi = 0;
  for (std::size_t i = 0; i < c.coefficients.size(); ++i)
    if (c.coefficients[i] != 0) psi += c.coefficients[i] * p.groups[i].centred_mean;
  return psi + c.location_term(p.data.centre);
}

void require_levels(const prepared_data& p, const contrast& c) {
  if (c.coefficients.size() != p.groups.size())
    throw analysis_error("contrast '" + c.name + "' has " + std::to_string(c.coefficients.size()) +
                         " coefficients for " + std::to_string(p.groups.size()) + " levels");
  for (std::size_t i : c.involved())
    if (p.groups[i].n == 0)
      throw analysis_error("contrast '" + c.name + "' uses level '" + p.groups[i].level +
                           "', which has no observations (all missing?); drop it with --levels");
}

}  // namespace

double satterthwaite_df(std::span<const double> components, std::span<const double> component_df) {
  double total = 0, denominator = 0;
  for (std::size_t i = 0; i < components.size(); ++i) {
    total += components[i];
    denominator += components[i] * components[i] / component_df[i];
  }
  return total * total / denominator;
}

void complete_t_result(method_result& r, double df, const analysis_options& o) {
  r.df = df;
  r.statistic = r.estimate / r.se;
  const int side = side_of(o.side);
  r.p_value = detail::t_p_value(r.statistic, df, side);
  const double level = o.conf;
  if (side == 0) {
    double q = detail::t_quantile(1 - (1 - level) / 2, df);
    r.ci_low = r.estimate - q * r.se;
    r.ci_high = r.estimate + q * r.se;
  } else {
    double q = detail::t_quantile(level, df);
    if (side > 0) {
      r.ci_low = r.estimate - q * r.se;
      r.ci_high = HUGE_VAL;
    } else {
      r.ci_low = -HUGE_VAL;
      r.ci_high = r.estimate + q * r.se;
    }
  }
}

method_result pooled_contrast(const prepared_data& p, const contrast& c, const analysis_options& o) {
  require_levels(p, c);
  if (!(p.anova.df_within > 0))
    throw analysis_error("the pooled method needs more observations than levels (N - k = " +
                         std::to_string(static_cast<long>(p.anova.df_within)) + "); add replicates");
  method_result r;
  r.method = "pooled";
  r.estimand = "mean contrast";
  r.statistic_name = "t";
  r.estimate = mean_contrast(p, c);
  // SE^2 = MSE sum c_i^2 / n_i, MSE from all k groups (Scheffe 1959, ch. 3).
  double weight = 0;
  for (std::size_t i : c.involved()) weight += c.coefficients[i] * c.coefficients[i] / static_cast<double>(p.groups[i].n);
  r.se = std::sqrt(p.anova.ms_within * weight);
  r.null_hypothesis = "the mean contrast is zero, assuming normal errors with one common variance in all levels";
  if (p.anova.ms_within == 0)
    throw analysis_error("every level is constant (the pooled variance is zero), so contrast '" + c.name +
                         "' has no standard error; check that the response column is the measurement");
  complete_t_result(r, p.anova.df_within, o);
  return r;
}

method_result welch_contrast(const prepared_data& p, const contrast& c, const analysis_options& o) {
  require_levels(p, c);
  method_result r;
  r.method = "welch";
  r.estimand = "mean contrast";
  r.statistic_name = "t";
  r.estimate = mean_contrast(p, c);
  std::vector<double> parts, dfs;
  for (std::size_t i : c.involved()) {
    const auto& g = p.groups[i];
    if (g.n < 2)
      throw analysis_error("the Welch method needs at least two observations in every level of contrast '" + c.name +
                           "', but level '" + g.level + "' has " + std::to_string(g.n) +
                           "; use --method pooled (one common variance) or add replicates");
    // v_i = c_i^2 s_i^2 / n_i (Welch 1947, eq. 9; Satterthwaite 1946).
    parts.push_back(c.coefficients[i] * c.coefficients[i] * g.variance / static_cast<double>(g.n));
    dfs.push_back(static_cast<double>(g.n - 1));
  }
  double v = 0;
  for (double x : parts) v += x;
  r.se = std::sqrt(v);
  r.null_hypothesis = "the mean contrast is zero, assuming normal errors; the level variances may differ";
  if (v == 0)
    throw analysis_error("every level in contrast '" + c.name +
                         "' is constant (zero variance), so it has no standard error; check the data, or use --method pooled");
  complete_t_result(r, satterthwaite_df(parts, dfs), o);
  return r;
}

}  // namespace contrasta
