// Writers of `compare` results: terminal table, JSON, CSV and Markdown. They only format what
// the engine computed.
#pragma once
#include <ostream>
#include <string>
#include <vector>

#include "cli/json.hpp"
#include "contrasta/comparison.hpp"

namespace contrasta::cli {

// The fixed JSON keys of one single-response object (interface.md), written into an open writer.
void write_comparison_object(json_writer& json, const comparison& c, bool with_tool_and_seed);
void write_comparison_json(std::ostream& out, const comparison& c);
// Batch mode: {"tool", "seed", "responses": [...]} plus "skipped" responses with their reason.
void write_batch_json(std::ostream& out, const std::vector<comparison>& runs,
                      const std::vector<std::pair<std::string, std::string>>& skipped = {});
// Batch mode terminal summary: one line per response and contrast for the advised method,
// sorted by the p-value adjusted across responses, with the count of findings at alpha.
void write_batch_summary(std::ostream& out, const std::vector<comparison>& runs, const std::string& adjust_across,
                         const std::vector<std::pair<std::string, std::string>>& skipped);

void write_comparison_csv(std::ostream& out, const std::vector<comparison>& runs, bool batch);
void write_comparison_table(std::ostream& out, const comparison& c);
void write_comparison_markdown(std::ostream& out, const comparison& c);

// Shared pieces for other writers (check, report).
// The "tool" object (when asked) and the "input" object that open a compare or check document.
void write_tool_and_input_json(json_writer& json, const prepared_data& p, bool with_tool);
void write_groups_json(json_writer& json, const prepared_data& p);
void write_anova_json(json_writer& json, const anova_table& a);
void write_overall_json(json_writer& json, const std::vector<overall_test>& overall);
// A list of tests ({test, statistic, df1, df2, p_value, null}) as a JSON array (overall tests,
// variance tests).
void write_test_list(json_writer& json, const std::vector<overall_test>& tests);
void write_recommendation_json(json_writer& json, const recommendation& r);
void write_result_json(json_writer& json, const method_result& r);
// "substrate.csv: response fresh_mass_g by substrate, 4 levels, 38 observations (2 missing)"
std::string data_line(const prepared_data& p);
void write_groups_table(std::ostream& out, const prepared_data& p);
void write_overall_table(std::ostream& out, const std::vector<overall_test>& overall);
void write_recommendation_table(std::ostream& out, const recommendation& r);

}  // namespace contrasta::cli
