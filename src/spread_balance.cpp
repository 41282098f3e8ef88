// The balance of spreads and group sizes, and how they pair: the facts behind the choice
// between pooled and separate-variance methods (Box 1954, Ann. Math. Stat. 25:290-302).
#include <cmath>
#include <limits>

#include "contrasta/diagnostics.hpp"

namespace contrasta {
namespace {

double pearson_correlation(const std::vector<double>& x, const std::vector<double>& y) {
  const double n = static_cast<double>(x.size());
  double mx = 0, my = 0;
  for (std::size_t i = 0; i < x.size(); ++i) {
    mx += x[i];
    my += y[i];
  }
  mx /= n;
  my /= n;
  double sxy = 0, sxx = 0, syy = 0;
  for (std::size_t i = 0; i < x.size(); ++i) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) * (x[i] - mx);
    syy += (y[i] - my) * (y[i] - my);
  }
  if (!(sxx > 0) || !(syy > 0)) return not_available;
  return sxy / std::sqrt(sxx * syy);
}

}  // namespace

spread_balance describe_spread(const prepared_data& p) {
  spread_balance out;
  const auto& groups = p.groups;
  if (groups.empty()) return out;
  out.smallest_n = std::numeric_limits<std::size_t>::max();
  for (std::size_t i = 0; i < groups.size(); ++i) {
    if (groups[i].n < out.smallest_n) {
      out.smallest_n = groups[i].n;
      out.smallest_n_level = i;
    }
    out.largest_n = std::max(out.largest_n, groups[i].n);
  }
  out.n_ratio = out.smallest_n > 0 ? static_cast<double>(out.largest_n) / static_cast<double>(out.smallest_n)
                                   : not_available;

  std::vector<double> sizes, variances;
  double largest_sd = -1, smallest_sd = std::numeric_limits<double>::infinity();
  for (std::size_t i = 0; i < groups.size(); ++i) {
    if (groups[i].n < 2 || !std::isfinite(groups[i].sd)) continue;
    sizes.push_back(static_cast<double>(groups[i].n));
    variances.push_back(groups[i].variance);
    if (groups[i].sd > largest_sd) {
      largest_sd = groups[i].sd;
      out.largest_sd_level = i;
    }
    if (groups[i].sd < smallest_sd) {
      smallest_sd = groups[i].sd;
      out.smallest_sd_level = i;
    }
  }
  if (sizes.size() >= 2) {
    if (smallest_sd > 0) out.sd_ratio = largest_sd / smallest_sd;
    else if (largest_sd > 0) out.sd_ratio = std::numeric_limits<double>::infinity();
    out.size_variance_correlation = pearson_correlation(sizes, variances);
    out.larger_variances_in_smaller_groups = out.size_variance_correlation < 0;
  }

  // Pooled against separate-variance standard errors for each pair of levels.
  const double mse = p.anova.ms_within;
  for (std::size_t i = 0; i < groups.size(); ++i) {
    for (std::size_t j = i + 1; j < groups.size(); ++j) {
      if (groups[i].n < 2 || groups[j].n < 2) continue;
      const double ni = static_cast<double>(groups[i].n), nj = static_cast<double>(groups[j].n);
      const double separate = groups[i].variance / ni + groups[j].variance / nj;
      if (!(separate > 0)) continue;
      const double ratio = std::sqrt(mse * (1 / ni + 1 / nj) / separate);
      if (std::isnan(out.pooled_se_ratio) || ratio < out.pooled_se_ratio) {
        out.pooled_se_ratio = ratio;
        out.pooled_se_pair_first = i;
        out.pooled_se_pair_second = j;
      }
    }
  }
  return out;
}

}  // namespace contrasta
