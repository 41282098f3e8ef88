// Writers of the standardized effect sizes of a contrast (effect_size.hpp), shared by the
// compare writers. They only format what effect_sizes() computed.
#pragma once
#include <string>
#include <vector>

#include "cli/json.hpp"
#include "contrasta/effect_size.hpp"

namespace contrasta::cli {

// "effect_size": {"scale", "scaled_coefficients", "conf", "standardized": {...}, "bonett": {...}, "notes"}
void write_effect_size_json(json_writer& json, const effect_size_result& e);

// Column names and cells for the tidy CSV (same order).
const std::vector<std::string>& effect_size_csv_columns();
std::vector<std::string> effect_size_csv_cells(const effect_size_result& e);

// One line for terminal and Markdown output, e.g.
// "standardized 0.85 [0.21, 1.48] (pooled SD 4.90); Bonett 0.80 [0.15, 1.45] (SD 5.10); 95% intervals"
std::string effect_size_line(const effect_size_result& e);

}  // namespace contrasta::cli
