// `contrasta demo`: runs compare and check on the bundled (invented) demo data, printing each
// command before its output so that the user can copy it.
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <iostream>

#include "cli/commands.hpp"
#include "cli/run.hpp"
#include "contrasta/error.hpp"

namespace contrasta::cli {
namespace {

namespace fs = std::filesystem;

fs::path demo_data_dir() {
  std::vector<fs::path> candidates;
  if (const char* env = std::getenv("CONTRASTA_DATA")) candidates.emplace_back(env);
  std::error_code ec;
  fs::path exe = fs::read_symlink("/proc/self/exe", ec);
  if (!ec) {
    candidates.push_back(exe.parent_path() / "../share/contrasta/data");
    candidates.push_back(exe.parent_path() / "../data");
  }
  candidates.emplace_back(CONTRASTA_DATA_DIR);
  candidates.emplace_back(CONTRASTA_INSTALLED_DATA_DIR);
  for (const auto& c : candidates)
    if (fs::exists(c / "substrate_trial.csv", ec)) return fs::weakly_canonical(c, ec);
  throw input_error("the demo data were not found; set CONTRASTA_DATA to the project's data folder");
}

int run_line(const std::vector<std::string>& words) {
  std::cout << "\n$ contrasta";
  for (const auto& w : words) std::cout << ' ' << (w.find(' ') != std::string::npos || w.find('(') != std::string::npos ? "\"" + w + "\"" : w);
  std::cout << "\n\n";
  std::cout.flush();
  CLI::App app{"contrasta", "contrasta"};
  app.require_subcommand(1, 1);
  add_compare_command(app);
  add_check_command(app);
  add_plan_command(app);
  add_layout_command(app);
  add_report_command(app);
  std::vector<std::string> args = {"contrasta"};
  args.insert(args.end(), words.begin(), words.end());
  std::vector<char*> argv;
  for (auto& a : args) argv.push_back(a.data());
  return parse_and_run(app, static_cast<int>(argv.size()), argv.data());
}

void run_demo(std::uint64_t seed) {
  fs::path dir = demo_data_dir();
  std::string s = std::to_string(seed);
  std::string substrate = (dir / "substrate_trial.csv").string();
  std::string panel = (dir / "cracker_panel.csv").string();
  std::cout << "contrasta demo: two invented trials from " << dir.string() << " (see data/README.md)\n";
  int rc = 0;
  rc |= run_line({"check", substrate, "--group", "substrate", "--response", "fresh_mass_g", "--seed", s});
  rc |= run_line({"compare", substrate, "--group", "substrate", "--response", "fresh_mass_g", "--contrast-file",
                  (dir / "substrate_trial.contrasts").string(), "--method", "auto,pooled", "--adjust", "holm", "--seed", s});
  rc |= run_line({"check", panel, "--group", "recipe", "--response", "crisp", "--seed", s});
  rc |= run_line({"compare", panel, "--group", "recipe", "--response", "crisp", "--contrast-file",
                  (dir / "cracker_panel.contrasts").string(), "--method", "auto,welch", "--adjust", "holm", "--seed", s});
  if (rc != 0) throw analysis_error("a demo step failed (see the message above)");
}

}  // namespace

void add_demo_command(CLI::App& app) {
  auto seed = std::make_shared<std::uint64_t>(20261201);
  auto* cmd = app.add_subcommand("demo", "run check and compare on the bundled demo data (no arguments needed)");
  cmd->add_option("--seed", *seed, "seed for the resampling methods (default 20261201)");
  cmd->footer("Example:\n  contrasta demo");
  set_action(cmd, [seed] { run_demo(*seed); });
}

}  // namespace contrasta::cli
