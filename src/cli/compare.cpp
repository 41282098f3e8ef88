// `contrasta compare`: the main job. Options become a comparison_request; results go to a writer.
#include <tbb/parallel_for.h>
#include <tbb/task_arena.h>

#include <iostream>
#include <map>

#include "cli/commands.hpp"
#include "cli/agreement.hpp"
#include "cli/common.hpp"
#include "cli/run.hpp"
#include "cli/write_compare.hpp"
#include "contrasta/comparison.hpp"
#include "contrasta/error.hpp"
#include "contrasta/multiplicity.hpp"
#include "contrasta/prepared.hpp"

namespace contrasta::cli {
namespace {

struct compare_settings {
  data_options data;
  contrast_options contrasts;
  output_options output;
  common_run_options run;
  method_options method;
  std::string adjust_across = "bh";
  bool no_effect_sizes = false;
  bool full = false;  // batch mode: every response's full table instead of the compact summary
};

struct skipped_response {
  std::string response, reason;
};

// Per contrast and method, adjusts the p-values across responses (batch mode).
void adjust_across_responses(std::vector<comparison>& runs, const std::string& method) {
  std::map<std::pair<std::string, std::string>, std::vector<method_result*>> families;
  for (auto& c : runs)
    for (auto& cr : c.contrasts)
      for (auto& r : cr.results) families[{cr.spec.name, r.method}].push_back(&r);
  for (auto& [key, members] : families) {
    std::vector<double> raw;
    std::vector<method_result*> with_p;
    for (auto* r : members) {
      if (std::isnan(r->p_value)) {
        r->p_adjusted_across = r->p_value;
        continue;
      }
      raw.push_back(r->p_value);
      with_p.push_back(r);
    }
    auto adjusted = adjust_p_values(raw, method);
    for (std::size_t i = 0; i < with_p.size(); ++i) with_p[i]->p_adjusted_across = adjusted[i];
  }
}

void run_compare(const compare_settings& s) {
  auto datasets = load_datasets(s.data);
  comparison_request request = comparison_request_of(s.method, s.run, s.contrasts);
  request.effect_sizes = !s.no_effect_sizes;
  const bool batch = datasets.size() > 1;
  if (!batch) request.options.progress = progress_printer(s.output.quiet, "resampling");

  // Contrasts are parsed against the levels of the first response; in batch mode every
  // response shares the factor column and so the levels.
  std::vector<std::size_t> n;
  for (std::size_t i = 0; i < datasets.front().level_count(); ++i) n.push_back(datasets.front().n(i));
  request.contrasts = build_contrasts(s.contrasts, datasets.front().levels, n);

  std::vector<comparison> runs(datasets.size());
  std::vector<std::string> failures(datasets.size()), names(datasets.size());
  for (std::size_t i = 0; i < datasets.size(); ++i) names[i] = datasets[i].response;
  auto analyse = [&](std::size_t i) {
    try {
      runs[i] = run_comparison(prepare(std::move(datasets[i]), s.method.trim), request);
    } catch (const analysis_error& e) {
      if (!batch) throw;
      failures[i] = e.what();
    }
  };
  if (batch) {
    // Responses in parallel; each response's own computation uses the same seed, so a batch run
    // equals the single-response runs exactly.
    tbb::task_arena arena(s.run.threads > 0 ? static_cast<int>(s.run.threads) : tbb::task_arena::automatic);
    arena.execute([&] { tbb::parallel_for(std::size_t{0}, runs.size(), analyse); });
  } else {
    analyse(0);
  }
  std::vector<comparison> done;
  std::vector<skipped_response> skipped;
  for (std::size_t i = 0; i < runs.size(); ++i) {
    if (!failures[i].empty()) {
      skipped.push_back({names[i], failures[i]});
      if (!s.output.quiet) std::cerr << "note: response '" << names[i] << "' skipped: " << failures[i] << '\n';
      continue;
    }
    done.push_back(std::move(runs[i]));
  }
  if (done.empty()) throw analysis_error("no response could be analysed: " + skipped.front().reason);
  if (batch) adjust_across_responses(done, s.adjust_across);

  write_output(s.output, [&](std::ostream& out) {
    if (s.output.format == "json") {
      if (batch) {
        std::vector<std::pair<std::string, std::string>> notes;
        for (const auto& k : skipped) notes.emplace_back(k.response, k.reason);
        write_batch_json(out, done, notes);
      } else {
        write_comparison_json(out, done.front());
      }
    } else if (s.output.format == "csv") {
      write_comparison_csv(out, done, batch);
    } else if (s.output.format == "markdown") {
      for (const auto& c : done) write_comparison_markdown(out, c);
    } else if (batch && !s.full) {
      std::vector<std::pair<std::string, std::string>> notes;
      for (const auto& k : skipped) notes.emplace_back(k.response, k.reason);
      write_batch_summary(out, done, s.adjust_across, notes);
    } else {
      for (std::size_t i = 0; i < done.size(); ++i) {
        if (i) out << "\n";
        write_comparison_table(out, done[i]);
        if (done[i].methods.size() > 1) {
          // More than one method: show at a glance whether any conclusion depends on the method.
          out << "\n";
          write_agreement_text(out, done[i], done[i].options.alpha);
        }
      }
    }
  });
}

}  // namespace

void add_compare_command(CLI::App& app) {
  auto settings = std::make_shared<compare_settings>();
  auto* cmd = app.add_subcommand(
      "compare",
      "estimate and test contrasts among the levels, with intervals, under the chosen methods and multiplicity control");
  cmd->footer(
      "Examples:\n"
      "  contrasta compare trial.csv --group substrate --response fresh_mass_g\n"
      "  contrasta compare trial.csv --group substrate --response fresh_mass_g \\\n"
      "      -c \"peat-free: (coir + [wood fibre])/2 - peat\" --method welch,permutation --adjust holm\n"
      "  contrasta compare panel.csv --group recipe --response crisp,salty --family versus=classic --format json");
  add_data_options(cmd, settings->data);
  add_contrast_options(cmd, settings->contrasts);
  add_method_options(cmd, settings->method);
  cmd->add_option("--adjust-across", settings->adjust_across,
                  "with several responses: adjustment across responses per contrast and method: bh, by, holm, none (default bh)")
      ->check(CLI::IsMember({"bh", "by", "holm", "none", "bonferroni", "hochberg", "sidak"}));
  cmd->add_flag("--no-effect-sizes", settings->no_effect_sizes,
                "skip the standardized effect sizes and their intervals (faster for thousands of responses)");
  cmd->add_flag("--full", settings->full,
                "with several responses: print every response's full table instead of the one-line-per-finding summary");
  add_run_options(cmd, settings->run);
  add_output_options(cmd, settings->output, {"table", "json", "csv", "markdown"});
  set_action(cmd, [settings] { run_compare(*settings); });
}

}  // namespace contrasta::cli
