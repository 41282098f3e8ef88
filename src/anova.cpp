#include "contrasta/anova.hpp"

#include <cmath>

#include "distributions.hpp"

namespace contrasta {

anova_table one_way_anova(const std::vector<group_summary>& groups) {
  anova_table t;
  double total_n = 0, weighted = 0, k = 0;
  for (const auto& g : groups) {
    if (g.n == 0) continue;
    total_n += static_cast<double>(g.n);
    weighted += static_cast<double>(g.n) * g.centred_mean;
    k += 1;
  }
  const double grand = weighted / total_n;
  // Between: sum n_i (ybar_i - ybar)^2; within: sum of the groups' two-pass sums of squares.
  double between = 0, between_c = 0, within = 0, within_c = 0;
  for (const auto& g : groups) {
    if (g.n == 0) continue;
    double d = g.centred_mean - grand;
    double term = static_cast<double>(g.n) * d * d;
    double y = term - between_c, s = between + y;
    between_c = (s - between) - y;
    between = s;
    double y2 = g.sum_squares - within_c, s2 = within + y2;
    within_c = (s2 - within) - y2;
    within = s2;
  }
  t.ss_between = between;
  t.ss_within = within;
  t.ss_total = between + within;
  t.df_between = k - 1;
  t.df_within = total_n - k;
  t.ms_between = t.df_between > 0 ? between / t.df_between : std::nan("");
  t.ms_within = t.df_within > 0 ? within / t.df_within : std::nan("");
  t.f = t.ms_between / t.ms_within;
  if (std::isfinite(t.f) && t.df_between > 0 && t.df_within > 0) {
    detail::fisher_f dist(t.df_between, t.df_within);
    t.p_value = boost::math::cdf(boost::math::complement(dist, t.f));
  } else {
    t.p_value = std::nan("");
  }
  t.r_squared = t.ss_total > 0 ? between / t.ss_total : std::nan("");
  t.residual_sd = std::sqrt(t.ms_within);
  return t;
}

}  // namespace contrasta
