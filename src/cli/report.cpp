// `contrasta report`: the comparison of `compare`, gathered with the few extra numbers a reader
// needs (each mean's interval, flagged outliers) and handed to the HTML or Markdown writer.
#include <filesystem>
#include <iostream>

#include "cli/commands.hpp"
#include "cli/common.hpp"
#include "cli/report_content.hpp"
#include "cli/run.hpp"
#include "cli/write_html.hpp"
#include "cli/write_report_markdown.hpp"
#include "contrasta/classical.hpp"
#include "contrasta/comparison.hpp"
#include "contrasta/error.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/version.hpp"

namespace contrasta::cli {
namespace {

namespace fs = std::filesystem;

struct report_settings {
  data_options data;
  contrast_options contrasts;
  common_run_options run;
  std::string output;
  std::string format;  // html | markdown; empty: from the file extension
  bool quiet = false;
  std::vector<std::string> methods = {"auto"};
  std::string adjust = "none";
  double trim = 0.2;
  std::uint64_t resamples = 99'999;
  std::string exact = "auto";
  std::uint64_t max_arrangements = 20'000'000;
  std::string interval = "bca";
  std::string statistic = "studentized";
};

std::string format_of(const report_settings& s) {
  if (!s.format.empty()) return s.format;
  const std::string ext = fs::path(s.output).extension().string();
  if (ext == ".html" || ext == ".htm") return "html";
  if (ext == ".md" || ext == ".markdown") return "markdown";
  throw usage_error("cannot tell the report format from '" + s.output +
                    "': name the file .html or .md, or give --format html|markdown");
}

// The interval of each level's mean: the engine's Welch method on the unit combination that
// picks that level (SE = s/sqrt(n), df = n - 1: the one-sample t interval), always two-sided.
void add_mean_intervals(const comparison& result, std::vector<report_level>& levels) {
  analysis_options o = result.options;
  o.side = alternative::two_sided;
  o.allow_linear = true;
  const std::size_t k = result.prepared.groups.size();
  for (std::size_t i = 0; i < k; ++i) {
    contrast unit;
    unit.name = result.prepared.groups[i].level;
    unit.coefficients.assign(k, 0);
    unit.coefficients[i] = 1;
    if (result.prepared.groups[i].n < 2) continue;  // no interval from one observation
    try {
      const method_result r = welch_contrast(result.prepared, unit, o);
      levels[i].mean_low = r.ci_low;
      levels[i].mean_high = r.ci_high;
    } catch (const analysis_error&) {
      // A constant group or similar: the plot shows the mean without an interval.
    }
  }
}

report_content gather(comparison result) {
  report_content content;
  const dataset& d = result.prepared.data;
  for (std::size_t i = 0; i < d.level_count(); ++i) {
    report_level level;
    // Back to the units of the data for drawing (the engine keeps values centred).
    for (double v : d.group(i)) level.values.push_back(v + d.centre);
    const auto rows = d.group_rows(i);
    level.rows.assign(rows.begin(), rows.end());
    content.levels.push_back(std::move(level));
  }
  add_mean_intervals(result, content.levels);
  for (const auto& c : result.contrasts) {
    for (const auto& m : c.results) content.uses_seed |= m.resamples.has_value();
  }
  content.version = version();
  content.result = std::move(result);
  return content;
}

// The command that reproduces this report: as typed, with the seed made explicit when it was
// drawn (resampling results depend on it).
std::string reproducing_command(const report_settings& s, std::uint64_t seed) {
  std::string command = command_line();
  if (command.empty()) command = "contrasta report ...";
  if (!s.run.seed) command += " --seed " + std::to_string(seed);
  return command;
}

void run_report(const report_settings& s) {
  if (s.trim < 0 || s.trim >= 0.5) throw usage_error("--trim must be at least 0 and below 0.5");
  const std::string format = format_of(s);
  auto datasets = load_datasets(s.data);
  if (datasets.size() != 1) {
    throw usage_error("a report covers one response; name one with --response (run once per response)");
  }
  comparison_request request;
  request.methods = s.methods;
  request.adjust = s.adjust;
  request.options = make_analysis_options(s.run);
  request.options.trim = s.trim;
  request.options.resamples = s.resamples;
  request.options.exact = s.exact == "always" ? exact_mode::always : s.exact == "never" ? exact_mode::never : exact_mode::automatic;
  request.options.max_arrangements = s.max_arrangements;
  request.options.interval = s.interval == "percentile" ? bootstrap_interval::percentile
                             : s.interval == "studentized" ? bootstrap_interval::studentized
                                                           : bootstrap_interval::bca;
  request.options.statistic = s.statistic == "raw" ? permutation_statistic::raw : permutation_statistic::studentized;
  request.options.allow_linear = s.contrasts.allow_linear;
  request.options.progress = progress_printer(s.quiet, "resampling");
  std::vector<std::size_t> n;
  for (std::size_t i = 0; i < datasets.front().level_count(); ++i) n.push_back(datasets.front().n(i));
  request.contrasts = build_contrasts(s.contrasts, datasets.front().levels, n);

  report_content content = gather(run_comparison(prepare(std::move(datasets.front()), s.trim), request));
  content.command = reproducing_command(s, content.result.options.seed);

  output_options out;
  out.output = s.output;
  if (format == "html") {
    write_output(out, [&](std::ostream& o) { write_html_report(o, content); });
  } else {
    // The figures go beside the Markdown file, named after it, and are written first so that
    // the Markdown never links a file that is not there.
    const fs::path target(s.output);
    const std::string stem = target.stem().string();
    const markdown_report md = write_markdown_report(content, stem);
    for (const auto& [name, svg_text] : md.figures) {
      output_options figure;
      figure.output = (target.has_parent_path() ? target.parent_path() / name : fs::path(name)).string();
      write_output(figure, [&](std::ostream& o) { o << svg_text; });
    }
    write_output(out, [&](std::ostream& o) { o << md.markdown; });
  }
  if (!s.quiet) {
    std::cerr << "report written to " << s.output << " (seed " << content.result.options.seed << ")\n";
  }
}

}  // namespace

void add_report_command(CLI::App& app) {
  auto settings = std::make_shared<report_settings>();
  auto* cmd = app.add_subcommand(
      "report", "a self-contained HTML report (or Markdown with SVG figures) of a comparison: data, plots, "
                "checks, contrasts under each method, method agreement, how to reproduce it");
  cmd->footer(
      "Examples:\n"
      "  contrasta report trial.csv --group substrate --response fresh_mass_g -o trial.html\n"
      "  contrasta report trial.csv --group substrate --response fresh_mass_g \\\n"
      "      --contrast-file trial.contrasts --method all --adjust holm -o trial.md\n"
      "The HTML file needs nothing else: no scripts, no fonts or images fetched, prints as it shows.\n"
      "With .md, each plot is written as an SVG file beside it (NAME-observations.svg, ...).");
  add_data_options(cmd, settings->data);
  add_contrast_options(cmd, settings->contrasts);
  cmd->add_option("--method", settings->methods,
                  "comma list of pooled, welch, trimmed, permutation, bootstrap, rank, mann-whitney, brunner-munzel, dunn; "
                  "all; auto (the advised method, default)")
      ->delimiter(',');
  cmd->add_option("--adjust", settings->adjust,
                  "multiplicity adjustment over the contrasts: none, bonferroni, holm, sidak, hochberg, bh, by, scheffe, "
                  "tukey, games-howell, dunnett, maxt (default none)");
  cmd->add_option("--trim", settings->trim, "proportion trimmed from each end for trimmed means (default 0.2)");
  cmd->add_option("--resamples", settings->resamples, "Monte Carlo permutations or bootstrap resamples (default 99999)")
      ->check(CLI::Range(std::uint64_t{99}, std::uint64_t{1'000'000'000}));
  cmd->add_option("--exact", settings->exact, "enumerate every arrangement: auto (when few enough), always, never")
      ->check(CLI::IsMember({"auto", "always", "never"}));
  cmd->add_option("--max-arrangements", settings->max_arrangements,
                  "with --exact auto: enumerate when there are at most this many arrangements (default 20000000)");
  cmd->add_option("--interval", settings->interval, "bootstrap interval: percentile, bca (default), studentized")
      ->check(CLI::IsMember({"percentile", "bca", "studentized"}));
  cmd->add_option("--statistic", settings->statistic,
                  "permutation statistic: studentized (Welch t, default) or raw (the contrast itself)")
      ->check(CLI::IsMember({"studentized", "raw"}));
  add_run_options(cmd, settings->run);
  cmd->add_option("-o,--output", settings->output,
                  "the report file: NAME.html (self-contained) or NAME.md (with NAME-*.svg beside it); written atomically")
      ->required();
  cmd->add_option("--format", settings->format, "html or markdown (default: from the file name)")
      ->check(CLI::IsMember({"html", "markdown"}));
  cmd->add_flag("--quiet", settings->quiet, "no progress or notes on standard error");
  set_action(cmd, [settings] { run_report(*settings); });
}

}  // namespace contrasta::cli
