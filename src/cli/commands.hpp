// One function per subcommand; each registers its options and its action on the app.
#pragma once
#include <CLI/CLI.hpp>

namespace contrasta::cli {

void add_compare_command(CLI::App& app);
void add_check_command(CLI::App& app);
void add_plan_command(CLI::App& app);
void add_layout_command(CLI::App& app);
void add_report_command(CLI::App& app);
void add_demo_command(CLI::App& app);

}  // namespace contrasta::cli
