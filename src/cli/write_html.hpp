// The self-contained HTML report: one file with inline CSS and inline SVG, no script and no
// reference to anything outside itself, readable offline and printable.
#pragma once
#include <ostream>

#include "cli/report_content.hpp"

namespace contrasta::cli {

void write_html_report(std::ostream& out, const report_content& content);

}  // namespace contrasta::cli
