#include <CLI/CLI.hpp>
#include <csignal>
#include <cstdio>
#include <iostream>
#include <new>

#include "cli/commands.hpp"
#include "cli/common.hpp"
#include "cli/run.hpp"
#include "contrasta/version.hpp"

namespace {
extern "C" void on_interrupt(int) {
  contrasta::cli::interrupted.store(true);
  std::signal(SIGINT, SIG_DFL);  // a second Ctrl-C ends the program at once
}
}  // namespace

int main(int argc, char** argv) {
  std::ios::sync_with_stdio(false);
  std::signal(SIGINT, on_interrupt);
  contrasta::cli::remember_command_line(argc, argv);
  CLI::App app{
      "contrasta: contrasts among treatment groups of a single-factor experiment, with methods that stay\n"
      "honest under unequal variances, small samples, skew, ties and outliers.\n\n"
      "Example:\n"
      "  contrasta compare trial.csv --group substrate --response yield_g -c \"coir - peat\" --method welch\n"
      "  contrasta check trial.csv --group substrate --response yield_g\n"
      "  contrasta demo",
      "contrasta"};
  app.set_version_flag("--version", std::string("contrasta ") + contrasta::version());
  app.require_subcommand(1, 1);
  app.fallthrough(false);
  contrasta::cli::add_compare_command(app);
  contrasta::cli::add_check_command(app);
  contrasta::cli::add_plan_command(app);
  contrasta::cli::add_layout_command(app);
  contrasta::cli::add_report_command(app);
  contrasta::cli::add_demo_command(app);
  return contrasta::cli::parse_and_run(app, argc, argv);
}
