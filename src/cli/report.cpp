// `contrasta report`: the comparison of `compare`, gathered with the few extra numbers a reader
// needs (each mean's interval, flagged outliers) and handed to the HTML or Markdown writer.
#include <cmath>
#include <filesystem>
#include <iostream>

#include "cli/commands.hpp"
#include "cli/common.hpp"
#include "cli/report_content.hpp"
#include "cli/report_text.hpp"
#include "cli/run.hpp"
#include "cli/write_html.hpp"
#include "cli/write_report_markdown.hpp"
#include "contrasta/classical.hpp"
#include "contrasta/comparison.hpp"
#include "contrasta/error.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/resample.hpp"
#include "contrasta/version.hpp"
#if __has_include("contrasta/diagnostics.hpp")
#include "contrasta/diagnostics.hpp"
#define CONTRASTA_REPORT_DIAGNOSTICS 1
#endif

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
  method_options method;
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

#ifdef CONTRASTA_REPORT_DIAGNOSTICS
// The engine's diagnostics in the report's words: test tables, flagged outliers (also marked
// on the observation plot) and the measured facts behind the recommendation.
void add_diagnostics(const prepared_data& p, report_content& content) {
  const diagnostics_report d = diagnose(p);
  content.diagnostics_available = true;
  for (const auto& t : d.variance) content.variance_tests.push_back({t.test, "", t.statistic, t.df1, t.df2, t.p_value});
  for (const auto& t : d.normality) {
    const std::string level = t.level ? p.groups[*t.level].level : std::string();
    content.normality_tests.push_back({t.test, level, t.statistic, std::nullopt, std::nullopt, t.p_value});
  }
  for (const auto& o : d.outliers) {
    content.outliers.push_back({p.groups[o.level].level, o.row, o.value, o.robust_z});
    report_level& l = content.levels[o.level];
    l.outlier.resize(l.values.size(), false);
    for (std::size_t j = 0; j < l.rows.size(); ++j) {
      if (l.rows[j] == o.row) l.outlier[j] = true;
    }
  }
  const spread_balance& s = d.spread;
  auto level = [&](std::size_t i) { return i < p.groups.size() ? p.groups[i].level : std::string("?"); };
  if (!std::isnan(s.sd_ratio)) {
    content.diagnostic_facts.push_back("largest SD / smallest SD = " + display_number(s.sd_ratio, 3) + " (" +
                                       level(s.largest_sd_level) + " against " + level(s.smallest_sd_level) + ")");
  }
  if (!std::isnan(s.n_ratio)) {
    content.diagnostic_facts.push_back("largest n / smallest n = " + display_number(s.n_ratio, 3) +
                                       "; smallest group " + level(s.smallest_n_level) +
                                       " with n = " + std::to_string(s.smallest_n));
  }
  if (s.larger_variances_in_smaller_groups) {
    content.diagnostic_facts.push_back(
        "the larger variances sit in the smaller groups (correlation of n with variance " +
        display_number(s.size_variance_correlation, 3) + "): the pooled t then rejects too often (Box 1954)");
  }
  if (!std::isnan(s.pooled_se_ratio) && s.pooled_se_ratio < 1) {
    content.diagnostic_facts.push_back(
        "pooled standard error / separate-variances standard error = " + display_number(s.pooled_se_ratio, 3) +
        " for " + level(s.pooled_se_pair_first) + " against " + level(s.pooled_se_pair_second) +
        " (below 1: the pooled t is too large for that pair)");
  }
  if (!std::isnan(d.residuals.skewness)) {
    content.diagnostic_facts.push_back(
        "shape of the standardized residuals: skewness " + display_number(d.residuals.skewness, 3) +
        ", excess kurtosis " + display_number(d.residuals.excess_kurtosis, 3) + " (0 and 0 for a normal shape)");
  }
  content.diagnostic_facts.push_back(
      std::to_string(d.ties.distinct_values) + " distinct values; " + display_number(d.ties.tied_share * 100, 3) +
      "% of observations share their value" +
      (d.ties.small_integer_scale ? " (whole numbers on a short scale: treat as discrete)" : ""));
  content.diagnostic_facts.push_back(std::to_string(d.outliers.size()) + " observation" +
                                     (d.outliers.size() == 1 ? "" : "s") +
                                     " flagged as possible outliers (robust z above 3.5, Iglewicz & Hoaglin 1993)");
}
#endif

// The resampled null distribution behind each permutation and bootstrap result, for the
// histograms: the engine's joint resampling run on the one contrast, with the same options
// (seed, resamples, statistic) as the method itself.
void add_null_distributions(const comparison& result, report_content& content) {
  constexpr std::size_t most = 24;  // histograms beyond this many would bury the report
  analysis_options o = result.options;
  o.progress = {};
  for (const auto& c : result.contrasts) {
    for (const auto& m : c.results) {
      if ((m.method != "permutation" && m.method != "bootstrap") || !computed(m)) continue;
      if (content.nulls.size() == most) {
        ++content.nulls_omitted;
        continue;
      }
      try {
        const std::span<const contrast> one(&c.spec, 1);
        joint_resampling joint = m.method == "permutation" ? joint_permutation_statistics(result.prepared, one, o)
                                                           : joint_bootstrap_statistics(result.prepared, one, o);
        report_null n;
        n.contrast = c.spec.name;
        n.method = m.method;
        n.statistic_name = m.statistic_name.empty() ? std::string("t") : m.statistic_name;
        n.observed = joint.observed.front();
        n.statistics = std::move(joint.statistics);
        n.p_value = m.p_value;
        n.exact = joint.exact;
        n.resamples = joint.resamples;
        content.nulls.push_back(std::move(n));
      } catch (const analysis_error&) {
        // The method ran but its null cannot be redrawn here: the histogram is left out.
      }
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
#ifdef CONTRASTA_REPORT_DIAGNOSTICS
  add_diagnostics(result.prepared, content);
#endif
  for (const auto& c : result.contrasts) {
    for (const auto& m : c.results) content.uses_seed |= m.resamples.has_value();
  }
  add_null_distributions(result, content);
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
  const std::string format = format_of(s);
  auto datasets = load_datasets(s.data);
  comparison_request request = comparison_request_of(s.method, s.run, s.contrasts);
  request.options.progress = progress_printer(s.quiet, "resampling");
  std::vector<std::size_t> n;
  for (std::size_t i = 0; i < datasets.front().level_count(); ++i) n.push_back(datasets.front().n(i));
  request.contrasts = build_contrasts(s.contrasts, datasets.front().levels, n);

  // Several responses: one complete report per response, named after the output file and the
  // response (panel.html -> panel-crisp.html), each with the same contrasts, methods and seed.
  const bool batch = datasets.size() > 1;
  std::vector<std::string> written;
  for (auto& data : datasets) {
    std::string target_name = s.output;
    if (batch) {
      std::string safe;
      for (char ch : data.response)
        safe += (std::isalnum(static_cast<unsigned char>(ch)) || ch == '-' || ch == '_' || ch == '.') ? ch : '_';
      const fs::path t(s.output);
      target_name = (t.parent_path() / (t.stem().string() + "-" + safe + t.extension().string())).string();
    }
    comparison result;
    try {
      result = run_comparison(prepare(std::move(data), s.method.trim), request);
    } catch (const analysis_error& e) {
      if (!batch) throw;
      if (!s.quiet) std::cerr << "note: no report for response '" << target_name << "': " << e.what() << '\n';
      continue;
    }
    report_content content = gather(std::move(result));
    content.command = reproducing_command(s, content.result.options.seed);
    output_options out;
    out.output = target_name;
    if (format == "html") {
      write_output(out, [&](std::ostream& o) { write_html_report(o, content); });
    } else {
      // The figures go beside the Markdown file, named after it, and are written first so that
      // the Markdown never links a file that is not there.
      const fs::path target(target_name);
      const std::string stem = target.stem().string();
      const markdown_report md = write_markdown_report(content, stem);
      for (const auto& [name, svg_text] : md.figures) {
        output_options figure;
        figure.output = (target.has_parent_path() ? target.parent_path() / name : fs::path(name)).string();
        write_output(figure, [&](std::ostream& o) { o << svg_text; });
      }
      write_output(out, [&](std::ostream& o) { o << md.markdown; });
    }
    written.push_back(target_name + " (seed " + std::to_string(content.result.options.seed) + ")");
  }
  if (written.empty()) throw analysis_error("no response could be reported; see the notes above");
  if (!s.quiet)
    for (const auto& w : written) std::cerr << "report written to " << w << "\n";
}

}  // namespace

void add_report_command(CLI::App& app) {
  auto settings = std::make_shared<report_settings>();
  auto* cmd =
      app.add_subcommand("report",
                         "a self-contained HTML report (or Markdown with SVG figures) of a comparison: data, plots, "
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
  add_method_options(cmd, settings->method);
  add_run_options(cmd, settings->run);
  cmd->add_option(
         "-o,--output", settings->output,
         "the report file: NAME.html (self-contained) or NAME.md (with NAME-*.svg beside it); written atomically")
      ->required();
  cmd->add_option("--format", settings->format, "html or markdown (default: from the file name)")
      ->check(CLI::IsMember({"html", "markdown"}));
  cmd->add_flag("--quiet", settings->quiet, "no progress or notes on standard error");
  set_action(cmd, [settings] { run_report(*settings); });
}

}  // namespace contrasta::cli
