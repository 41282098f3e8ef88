// Dunn's z for contrasts of mean ranks (Dunn 1964, Technometrics 6:241-252): ranks over all
// levels (the ranking of the Kruskal-Wallis test it follows), tie-corrected variance.
#include <cmath>
#include <cstdio>
#include <limits>

#include "contrasta/error.hpp"
#include "contrasta/rank.hpp"
#include "distributions.hpp"

namespace contrasta {

method_result dunn_contrast(const prepared_data& p, const contrast& c, const analysis_options& o) {
  const dataset& data = p.data;
  const std::vector<double> ranks = midranks(data.values);
  const double total = static_cast<double>(data.size());
  if (data.size() < 2) throw analysis_error("Dunn's test needs at least two observations");
  // S^2 = N(N+1)/12 - sum(t^3 - t)/(12(N-1)): the finite-population variance of one mid-rank
  // times N/(N-1) (Dunn 1964, with the usual tie correction). For any contrast with
  // sum c_i = 0, Var(sum c_i Rbar_i) = S^2 sum c_i^2/n_i under the null, which for a pair is
  // Dunn's S^2 (1/n_i + 1/n_j).
  const double spread = total * (total + 1) / 12 - tie_term(data.values) / (12 * (total - 1));
  double estimate = 0, weight = 0;
  for (std::size_t level : c.involved()) {
    const std::size_t n = data.n(level);
    if (n == 0)
      throw analysis_error("level '" + data.levels[level] + "' has no observations; Dunn's test needs at least one");
    double sum = 0;
    for (std::size_t i = data.offsets[level]; i < data.offsets[level + 1]; ++i) sum += ranks[i];
    const double ci = c.coefficients[level];
    estimate += ci * sum / static_cast<double>(n);
    weight += ci * ci / static_cast<double>(n);
  }
  method_result r;
  r.method = "dunn";
  r.estimand = "contrast of mean ranks (ranks over all levels)";
  r.estimate = estimate;
  r.se = std::sqrt(spread * weight);
  r.statistic_name = "z";
  r.statistic = r.estimate / r.se;
  const int side = o.side == alternative::greater ? 1 : o.side == alternative::less ? -1 : 0;
  r.p_value = detail::t_p_value(r.statistic, std::numeric_limits<double>::infinity(), side);
  r.null_hypothesis =
      "all levels have the same distribution; tested through the contrast of mean ranks (sum c_i E[mean rank_i] = 0)";
  r.notes.push_back("no interval: the standard error is the variance of the mean ranks under the null hypothesis");
  if (weight > 0 && std::isnan(r.statistic)) r.notes.push_back("all observations are tied: no test");
  return r;
}

}  // namespace contrasta
