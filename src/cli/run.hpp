// Parsing and running a subcommand with the exit statuses of the interface: 0 success, 2 usage
// error, 3 input data error, 4 analysis cannot be done as asked.
#pragma once
#include <CLI/CLI.hpp>
#include <functional>

namespace contrasta::cli {

// Registers the action of a subcommand; it runs after parsing succeeded.
void set_action(CLI::App* command, std::function<void()> action);

// Parses, runs the chosen subcommand's action, prints one `error:` line on failure.
int parse_and_run(CLI::App& app, int argc, char** argv);

// Runs an action with the error-to-exit-status mapping (used by parse_and_run and by demo).
int run_guarded(const std::function<void()>& action);

}  // namespace contrasta::cli
