#include "contrasta/prepared.hpp"

namespace contrasta {

prepared_data prepare(dataset data, double trim) {
  prepared_data p;
  p.groups = summarize(data, trim);
  p.anova = one_way_anova(p.groups);
  p.data = std::move(data);
  return p;
}

std::vector<std::size_t> group_sizes(const prepared_data& p) {
  std::vector<std::size_t> n;
  for (const auto& g : p.groups) n.push_back(g.n);
  return n;
}

}  // namespace contrasta
