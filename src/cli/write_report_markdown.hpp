// The Markdown report: the same content as the HTML report, as tables and text, with each plot
// as an SVG file beside the Markdown file (linked by relative name), for a lab notebook or a
// repository.
#pragma once
#include <string>
#include <vector>

#include "cli/report_content.hpp"

namespace contrasta::cli {

struct markdown_report {
  std::string markdown;
  // File name (relative, beside the Markdown file) and content of each linked SVG figure.
  std::vector<std::pair<std::string, std::string>> figures;
};

// `figure_stem` names the figure files: STEM-observations.svg, STEM-forest-data.svg, ...
markdown_report write_markdown_report(const report_content& content, const std::string& figure_stem);

}  // namespace contrasta::cli
