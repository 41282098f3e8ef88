// All diagnostics of one dataset, gathered once for the check command and the recommendation.
#include "contrasta/diagnostics.hpp"

#include "side_by_side.hpp"

namespace contrasta {

std::vector<normality_test> normality_tests(const prepared_data& p) {
  std::vector<normality_test> out;
  // Shapiro-Wilk is defined up to n = 5000 (Royston 1995); larger data skip the pooled residuals.
  const bool pooled = p.data.size() >= 3 && p.data.size() <= 5000;
  std::vector<double> residuals;
  if (pooled) residuals.reserve(p.data.size());
  for (std::size_t i = 0; i < p.data.level_count(); ++i) {
    const auto g = p.data.group(i);
    if (g.size() >= 3 && g.size() <= 5000) {
      const auto sw = shapiro_wilk(g);
      out.push_back({i, "shapiro-wilk", g.size(), sw.w, sw.p_value});
    }
    // Residuals from the level means (on the centred scale, so no digits are lost).
    if (pooled)
      for (double y : g) residuals.push_back(y - p.groups[i].centred_mean);
  }
  if (pooled) {
    const auto sw = shapiro_wilk(residuals);
    out.push_back({std::nullopt, "shapiro-wilk", residuals.size(), sw.w, sw.p_value});
  }
  return out;
}

diagnostics_report diagnose(const prepared_data& p) {
  diagnostics_report r;
  // Independent reads of the same prepared data; on large data each costs a pass or a merge.
  detail::side_by_side(
      p.data.size(), [&] { r.variance = variance_tests(p); }, [&] { r.ties = describe_ties(p); },
      [&] {
        r.normality = normality_tests(p);
        r.shapes = describe_shapes(p);
        r.residuals = describe_residual_shape(p);
        r.outliers = find_outliers(p);
        r.spread = describe_spread(p);
      });
  return r;
}

}  // namespace contrasta
