// All diagnostics of one dataset, gathered once for the check command and the recommendation.
#include "contrasta/diagnostics.hpp"

namespace contrasta {

std::vector<normality_test> normality_tests(const prepared_data& p) {
  std::vector<normality_test> out;
  std::vector<double> residuals;
  residuals.reserve(p.data.size());
  for (std::size_t i = 0; i < p.data.level_count(); ++i) {
    const auto g = p.data.group(i);
    if (g.size() >= 3 && g.size() <= 5000) {
      const auto sw = shapiro_wilk(g);
      out.push_back({i, "shapiro-wilk", g.size(), sw.w, sw.p_value});
    }
    // Residuals from the level means (on the centred scale, so no digits are lost).
    for (double y : g) residuals.push_back(y - p.groups[i].centred_mean);
  }
  if (residuals.size() >= 3 && residuals.size() <= 5000) {
    const auto sw = shapiro_wilk(residuals);
    out.push_back({std::nullopt, "shapiro-wilk", residuals.size(), sw.w, sw.p_value});
  }
  return out;
}

diagnostics_report diagnose(const prepared_data& p) {
  diagnostics_report r;
  r.variance = variance_tests(p);
  r.normality = normality_tests(p);
  r.shapes = describe_shapes(p);
  r.residuals = describe_residual_shape(p);
  r.outliers = find_outliers(p.data);
  r.ties = describe_ties(p.data);
  r.spread = describe_spread(p);
  return r;
}

}  // namespace contrasta
