#include "contrasta/prepared.hpp"

#include <tbb/blocked_range.h>
#include <tbb/parallel_for.h>

#include <algorithm>
#include <stdexcept>

#include "side_by_side.hpp"

namespace contrasta {

prepared_data prepare(dataset data, double trim) {
  prepared_data p;
  const std::size_t k = data.level_count();
  p.sorted.resize(data.values.size());
  p.groups.resize(k);
  // Each level is sorted once here; the summaries and the diagnostics (medians, trimmed means,
  // MADs, pooled ranks) all read this copy. Levels are independent, so large data sort them side
  // by side; the result does not depend on how the levels are shared out.
  auto level_work = [&](std::size_t i) {
    const auto x = data.group(i);
    double* out = p.sorted.data() + data.offsets[i];
    std::copy(x.begin(), x.end(), out);
    std::sort(out, out + x.size());
    p.groups[i] = summarize_level(data, i, {out, x.size()}, trim);
  };
  if (data.values.size() < detail::side_by_side_from || k < 2) {
    for (std::size_t i = 0; i < k; ++i) level_work(i);
  } else {
    tbb::parallel_for(tbb::blocked_range<std::size_t>(0, k), [&](const tbb::blocked_range<std::size_t>& r) {
      for (std::size_t i = r.begin(); i != r.end(); ++i) level_work(i);
    });
  }
  p.anova = one_way_anova(p.groups);
  p.data = std::move(data);
  return p;
}

std::span<const double> sorted_group(const prepared_data& p, std::size_t level) {
  if (p.sorted.size() != p.data.values.size())
    throw std::logic_error("prepared_data without its sorted levels; build it with prepare()");
  return {p.sorted.data() + p.data.offsets[level], p.data.n(level)};
}

std::vector<std::size_t> group_sizes(const prepared_data& p) {
  std::vector<std::size_t> n;
  for (const auto& g : p.groups) n.push_back(g.n);
  return n;
}

}  // namespace contrasta
