#include "cli/run.hpp"

#include <iostream>
#include <map>
#include <new>

#include "contrasta/error.hpp"

namespace contrasta::cli {
namespace {

std::map<const CLI::App*, std::function<void()>>& actions() {
  static std::map<const CLI::App*, std::function<void()>> a;
  return a;
}

// One line: newlines in messages (from libraries) become spaces.
void print_error(const std::string& message) {
  std::string line = message;
  for (char& c : line)
    if (c == '\n' || c == '\r') c = ' ';
  std::cerr << "error: " << line << '\n';
  std::cerr.flush();
}

}  // namespace

void set_action(CLI::App* command, std::function<void()> action) { actions()[command] = std::move(action); }

int run_guarded(const std::function<void()>& action) {
  try {
    action();
    std::cout.flush();
    return 0;
  } catch (const usage_error& e) {
    print_error(e.what());
    return 2;
  } catch (const input_error& e) {
    print_error(e.what());
    return 3;
  } catch (const analysis_error& e) {
    print_error(e.what());
    return 4;
  } catch (const std::bad_alloc&) {
    print_error("out of memory; analyse fewer levels or responses at once, or use a machine with more memory");
    return 4;
  } catch (const std::exception& e) {
    print_error(std::string(e.what()) + " (unexpected; please report it with the command that caused it)");
    return 4;
  }
}

int parse_and_run(CLI::App& app, int argc, char** argv) {
  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForAllHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForVersion& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    std::string where;
    for (auto* sub : app.get_subcommands()) where = std::string(" ") + sub->get_name();
    print_error(std::string(e.what()) + "; see 'contrasta" + where + " --help'");
    return 2;
  }
  for (auto* sub : app.get_subcommands()) {
    auto it = actions().find(sub);
    if (it != actions().end()) return run_guarded(it->second);
  }
  print_error("no command given; see 'contrasta --help'");
  return 2;
}

}  // namespace contrasta::cli
