// Standard families of contrasts (the --family option).
#pragma once
#include <string>
#include <string_view>
#include <vector>

#include "contrasta/contrast.hpp"

namespace contrasta {

// kind: all-pairs | versus=LEVEL | helmert | trend[=x1,x2,...] | trend-weighted[=...] |
// adjacent | grand-mean. `n` (per level) is used by the n-weighted trend set.
std::vector<contrast> make_family(std::string_view kind, const std::vector<std::string>& levels,
                                  const std::vector<std::size_t>& n);

std::vector<contrast> all_pairs(const std::vector<std::string>& levels);

}  // namespace contrasta
