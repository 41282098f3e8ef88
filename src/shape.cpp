// Bias-corrected skewness and excess kurtosis of each level (Joanes & Gill 1998, The
// Statistician 47:183-189, the G1 and G2 estimators).
#include <cmath>

#include "contrasta/diagnostics.hpp"
#include "contrasta/summary.hpp"

namespace contrasta {
namespace {

struct central_moments {
  double m2 = 0, m3 = 0, m4 = 0;  // divisor n
};

central_moments moments_of(std::span<const double> x) {
  central_moments m;
  const double mean = accurate_mean(x);
  for (double y : x) {
    const double d = y - mean;
    const double d2 = d * d;
    m.m2 += d2;
    m.m3 += d2 * d;
    m.m4 += d2 * d2;
  }
  const double n = static_cast<double>(x.size());
  m.m2 /= n;
  m.m3 /= n;
  m.m4 /= n;
  return m;
}

}  // namespace

double sample_skewness(std::span<const double> x) {
  if (x.size() < 3) return not_available;
  const auto m = moments_of(x);
  if (!(m.m2 > 0)) return not_available;
  const double n = static_cast<double>(x.size());
  const double g1 = m.m3 / std::pow(m.m2, 1.5);
  return g1 * std::sqrt(n * (n - 1)) / (n - 2);
}

double sample_excess_kurtosis(std::span<const double> x) {
  if (x.size() < 4) return not_available;
  const auto m = moments_of(x);
  if (!(m.m2 > 0)) return not_available;
  const double n = static_cast<double>(x.size());
  const double g2 = m.m4 / (m.m2 * m.m2) - 3;
  return ((n + 1) * g2 + 6) * (n - 1) / ((n - 2) * (n - 3));
}

std::vector<group_shape> describe_shapes(const prepared_data& p) {
  std::vector<group_shape> out;
  for (std::size_t i = 0; i < p.data.level_count(); ++i) {
    const auto g = p.data.group(i);
    out.push_back({i, g.size(), sample_skewness(g), sample_excess_kurtosis(g)});
  }
  return out;
}

std::vector<double> standardized_residuals(const prepared_data& p) {
  std::vector<double> out;
  out.reserve(p.data.size());
  for (std::size_t i = 0; i < p.groups.size(); ++i) {
    const auto& g = p.groups[i];
    if (g.n < 2 || !(g.sd > 0)) continue;
    for (double y : p.data.group(i)) out.push_back((y - g.centred_mean) / g.sd);
  }
  return out;
}

residual_shape describe_residual_shape(const prepared_data& p) {
  const auto r = standardized_residuals(p);
  return {r.size(), sample_skewness(r), sample_excess_kurtosis(r)};
}

}  // namespace contrasta
