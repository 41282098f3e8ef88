// The balance of spreads and group sizes, and how they pair: the facts behind the choice
// between pooled and separate-variance methods (Box 1954, Ann. Math. Stat. 25:290-302).
#include <algorithm>
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
  out.n_ratio =
      out.smallest_n > 0 ? static_cast<double>(out.largest_n) / static_cast<double>(out.smallest_n) : not_available;

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
    if (smallest_sd > 0)
      out.sd_ratio = largest_sd / smallest_sd;
    else if (largest_sd > 0)
      out.sd_ratio = std::numeric_limits<double>::infinity();
    out.size_variance_correlation = pearson_correlation(sizes, variances);
    out.larger_variances_in_smaller_groups = out.size_variance_correlation < 0;
  }

  // Pooled against separate-variance standard errors for each pair of levels. With many levels,
  // every level is paired only with the 64 levels of largest s_i^2/n_i (the separate-variance
  // terms that make the ratio small), so the search stays O(64 k).
  const double mse = p.anova.ms_within;
  std::vector<std::size_t> usable;
  for (std::size_t i = 0; i < groups.size(); ++i)
    if (groups[i].n >= 2 && std::isfinite(groups[i].variance)) usable.push_back(i);
  auto mean_variance = [&](std::size_t i) { return groups[i].variance / static_cast<double>(groups[i].n); };
  std::vector<std::size_t> partners = usable;
  constexpr std::size_t all_pairs_limit = 200, partner_count = 64;
  if (usable.size() > all_pairs_limit) {
    std::partial_sort(partners.begin(), partners.begin() + partner_count, partners.end(),
                      [&](std::size_t a, std::size_t b) { return mean_variance(a) > mean_variance(b); });
    partners.resize(partner_count);
  }
  for (std::size_t i : partners) {
    for (std::size_t j : usable) {
      if (i == j || (usable.size() <= all_pairs_limit && j < i)) continue;
      const double ni = static_cast<double>(groups[i].n), nj = static_cast<double>(groups[j].n);
      const double separate = mean_variance(i) + mean_variance(j);
      if (!(separate > 0)) continue;
      const double ratio = std::sqrt(mse * (1 / ni + 1 / nj) / separate);
      if (std::isnan(out.pooled_se_ratio) || ratio < out.pooled_se_ratio) {
        out.pooled_se_ratio = ratio;
        out.pooled_se_pair_first = std::min(i, j);
        out.pooled_se_pair_second = std::max(i, j);
      }
    }
  }
  return out;
}

}  // namespace contrasta
