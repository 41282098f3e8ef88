// Placeholders for subcommands whose files have not landed yet. Whoever adds src/cli/NAME.cpp
// with add_NAME_command deletes that function from here.
#include "cli/commands.hpp"
#include "cli/run.hpp"
#include "contrasta/error.hpp"

namespace contrasta::cli {
namespace {
void pending(CLI::App& app, const char* name, const char* what) {
  auto* cmd = app.add_subcommand(name, what);
  cmd->allow_extras();
  set_action(cmd, [name] { throw usage_error(std::string("'contrasta ") + name + "' is not available in this build yet"); });
}
}  // namespace
void add_check_command(CLI::App& app) { pending(app, "check", "group summaries, assumption diagnostics, overall tests and method advice"); }
void add_plan_command(CLI::App& app) { pending(app, "plan", "power, sample size and allocation for planned contrasts"); }
void add_layout_command(CLI::App& app) { pending(app, "layout", "a seeded randomisation plan for a completely randomised design"); }
void add_report_command(CLI::App& app) { pending(app, "report", "a self-contained HTML or Markdown report with plots"); }
}  // namespace contrasta::cli
