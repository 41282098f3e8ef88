// The rank contrast (Conover & Iman 1981, Am. Stat. 35:124-129): mid-ranks of the pooled
// involved levels, then the studentized permutation test of the contrast on those ranks.
#include <string>
#include <vector>

#include "contrasta/error.hpp"
#include "contrasta/rank.hpp"
#include "contrasta/resample.hpp"

namespace contrasta {

method_result rank_contrast(const prepared_data& p, const contrast& c, const analysis_options& o) {
  const dataset& data = p.data;
  const std::vector<std::size_t> involved = c.involved();
  if (involved.size() < 2) throw analysis_error("the rank method needs a contrast over at least two levels");
  // Ranks once on the pooled involved levels; levels with c_i = 0 take no part.
  std::vector<double> pooled;
  for (std::size_t level : involved) {
    if (data.n(level) == 0) throw analysis_error("level '" + data.levels[level] + "' has no observations");
    const auto g = data.group(level);
    pooled.insert(pooled.end(), g.begin(), g.end());
  }
  const std::vector<double> ranks = midranks(pooled);
  std::vector<std::string> levels;
  std::vector<std::vector<double>> groups;
  contrast on_ranks;
  on_ranks.name = c.name;
  on_ranks.expression = c.expression;
  std::size_t start = 0;
  for (std::size_t level : involved) {
    levels.push_back(data.levels[level]);
    groups.emplace_back(ranks.begin() + static_cast<std::ptrdiff_t>(start),
                        ranks.begin() + static_cast<std::ptrdiff_t>(start + data.n(level)));
    start += data.n(level);
    on_ranks.coefficients.push_back(c.coefficients[level]);
  }
  const prepared_data ranked = prepare(make_dataset(levels, groups, data.response + " (mid-ranks)"), o.trim);
  method_result r = permutation_contrast(ranked, on_ranks, o);
  r.method = "rank";
  r.estimand = "contrast of mean mid-ranks (ranks of the pooled involved levels)";
  r.null_hypothesis = "the involved levels have the same distribution (their mid-ranks are exchangeable)";
  return r;
}

}  // namespace contrasta
