#include "contrasta/dataset.hpp"

#include <numeric>

#include "contrasta/error.hpp"

namespace contrasta {

std::size_t dataset::missing_total() const {
  return std::accumulate(missing.begin(), missing.end(), std::size_t{0});
}

std::size_t dataset::find_level(const std::string& name) const {
  for (std::size_t i = 0; i < levels.size(); ++i)
    if (levels[i] == name) return i;
  return levels.size();
}

dataset make_dataset(std::vector<std::string> levels, const std::vector<std::vector<double>>& groups,
                     std::string response) {
  if (levels.size() != groups.size())
    throw analysis_error("make_dataset: " + std::to_string(levels.size()) + " level names for " +
                         std::to_string(groups.size()) + " groups");
  dataset d;
  d.source = "(memory)";
  d.response = std::move(response);
  d.levels = std::move(levels);
  d.offsets.push_back(0);
  std::uint64_t row = 2;
  for (const auto& g : groups) {
    d.values.insert(d.values.end(), g.begin(), g.end());
    for (std::size_t j = 0; j < g.size(); ++j) d.rows.push_back(row++);
    d.offsets.push_back(d.values.size());
  }
  d.missing.assign(d.levels.size(), 0);
  d.centre_text = "0";
  return d;
}

dataset select_levels(const dataset& data, const std::vector<std::string>& levels) {
  dataset d;
  d.source = data.source;
  d.group_column = data.group_column;
  d.response = data.response;
  d.centre = data.centre;
  d.centre_text = data.centre_text;
  d.offsets.push_back(0);
  for (const auto& name : levels) {
    std::size_t i = data.find_level(name);
    if (i == data.level_count())
      throw analysis_error("level '" + name + "' given in --levels does not occur in column '" +
                           data.group_column + "'; check its spelling (level names are case-sensitive)");
    d.levels.push_back(name);
    auto g = data.group(i);
    auto r = data.group_rows(i);
    d.values.insert(d.values.end(), g.begin(), g.end());
    d.rows.insert(d.rows.end(), r.begin(), r.end());
    d.offsets.push_back(d.values.size());
    d.missing.push_back(data.missing[i]);
  }
  return d;
}

}  // namespace contrasta
