// `contrasta check`: group summaries, assumption diagnostics, overall tests and the method
// recommendation with its reasons; `--calibrate` simulates the user's own design. Options become
// an analysis; the results go to one of the writers below, which only format.
#include <cmath>
#include <iostream>
#include <memory>
#include <optional>

#include "cli/commands.hpp"
#include "cli/common.hpp"
#include "cli/format.hpp"
#include "cli/json.hpp"
#include "cli/run.hpp"
#include "cli/write_compare.hpp"
#include "contrasta/calibrate.hpp"
#include "contrasta/diagnostics.hpp"
#include "contrasta/error.hpp"
#include "contrasta/overall.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/recommend.hpp"
#include "contrasta/version.hpp"

namespace contrasta::cli {
namespace {

struct check_settings {
  data_options data;
  contrast_options contrasts;
  output_options output;
  common_run_options run;
  double trim = 0.2;
  bool calibrate = false;
  std::size_t datasets = 2000;
  std::optional<double> effect;
  std::uint64_t method_resamples = 199;
  std::vector<std::string> methods;
};

// Everything `check` found for one response.
struct check_result {
  prepared_data prepared;
  diagnostics_report diagnostics;
  std::vector<overall_test> overall;
  std::optional<calibration_report> calibration;
  recommendation advice;
  analysis_options options;
};

std::string level_name(const prepared_data& p, std::optional<std::size_t> level) {
  return level ? p.data.levels[*level] : std::string("pooled residuals");
}

std::string percent_text(double share, int decimals = 1) {
  return fixed(100 * share, decimals) + "%";
}

// ---- JSON ----------------------------------------------------------------------------------

void write_diagnostics_json(json_writer& json, const check_result& r) {
  const auto& p = r.prepared;
  const auto& d = r.diagnostics;
  json.key("diagnostics").begin_object();
  json.key("variance");
  write_test_list(json, d.variance);
  json.key("normality").begin_array();
  for (const auto& n : d.normality) {
    json.begin_object();
    json.key("level");
    if (n.level)
      json.value(p.data.levels[*n.level]);
    else
      json.null();
    json.field("test", n.test).field("n", static_cast<std::uint64_t>(n.n));
    json.field("statistic", n.statistic).field("p_value", n.p_value);
    json.end_object();
  }
  json.end_array();
  json.key("shape").begin_array();
  for (const auto& s : d.shapes) {
    json.begin_object();
    json.field("level", p.data.levels[s.level]).field("n", static_cast<std::uint64_t>(s.n));
    json.field("skewness", s.skewness).field("excess_kurtosis", s.excess_kurtosis);
    json.end_object();
  }
  json.end_array();
  const auto& s = d.spread;
  json.field("sd_ratio", s.sd_ratio).field("n_ratio", s.n_ratio);
  json.field("smallest_n", static_cast<std::uint64_t>(s.smallest_n));
  json.field("larger_variances_in_smaller_groups", s.larger_variances_in_smaller_groups);
  json.field("size_variance_correlation", s.size_variance_correlation);
  json.key("pooled_se_ratio").begin_object();
  json.field("value", s.pooled_se_ratio);
  if (std::isnan(s.pooled_se_ratio)) {
    json.key("levels").null();
  } else {
    json.key("levels").strings({p.data.levels[s.pooled_se_pair_first], p.data.levels[s.pooled_se_pair_second]});
  }
  json.end_object();
  json.key("ties").begin_object();
  json.field("distinct_values", static_cast<std::uint64_t>(d.ties.distinct_values));
  json.field("tied_share", d.ties.tied_share).field("integer_values", d.ties.integer_values);
  json.field("small_integer_scale", d.ties.small_integer_scale);
  json.field("min", d.ties.scale_min).field("max", d.ties.scale_max);
  json.end_object();
  json.key("outliers").begin_array();
  for (const auto& o : d.outliers) {
    json.begin_object();
    json.field("level", p.data.levels[o.level])
        .field("row", o.row)
        .field("value", o.value)
        .field("robust_z", o.robust_z);
    json.end_object();
  }
  json.end_array();
  json.end_object();
}

void write_calibration_json(json_writer& json, const calibration_report& c) {
  json.key("calibration").begin_array();
  for (const auto& row : c.rows) {
    json.begin_object();
    json.field("method", row.method).field("errors", row.model).field("alpha", row.alpha);
    json.field("type1_error", row.type1_error).field("type1_error_se", row.type1_se);
    json.field("datasets", static_cast<std::uint64_t>(row.datasets));
    json.field("contrasts", static_cast<std::uint64_t>(row.contrasts));
    json.field("worst_contrast", row.worst_contrast).field("worst_type1_error", row.worst_type1_error);
    json.field("power", row.power).field("power_se", row.power_se);
    if (row.power) json.field("power_contrast", row.power_contrast);
    json.field("failures", static_cast<std::uint64_t>(row.failures));
    json.end_object();
  }
  json.end_array();
  json.key("calibration_settings").begin_object();
  json.field("datasets", static_cast<std::uint64_t>(c.datasets));
  json.field("method_resamples", c.method_resamples);
  json.field("effect", c.effect);
  json.key("skipped").strings(c.skipped);
  json.end_object();
}

void write_check_object(json_writer& json, const check_result& r, bool with_tool_and_seed) {
  const auto& p = r.prepared;
  json.begin_object();
  write_tool_and_input_json(json, p, with_tool_and_seed);
  if (with_tool_and_seed) json.field("seed", r.options.seed);
  write_groups_json(json, p);
  write_anova_json(json, p.anova);
  json.key("overall");
  write_test_list(json, r.overall);
  write_diagnostics_json(json, r);
  write_recommendation_json(json, r.advice);
  if (r.calibration) write_calibration_json(json, *r.calibration);
  json.end_object();
}

void write_check_json(std::ostream& out, const std::vector<check_result>& results) {
  json_writer json(out);
  if (results.size() == 1) {
    write_check_object(json, results.front(), true);
    return;
  }
  json.begin_object();
  json.key("tool").begin_object().field("name", "contrasta").field("version", version()).end_object();
  json.field("seed", results.front().options.seed);
  json.key("responses").begin_array();
  for (const auto& r : results) write_check_object(json, r, false);
  json.end_array();
  json.end_object();
}

// ---- CSV: tidy, one value per row ------------------------------------------------------------

struct csv_writer {
  std::ostream& out;
  bool batch;
  std::string response;
  static std::string cell(const std::string& s) {
    if (s.find_first_of(",\"\n\r") == std::string::npos) return s;
    std::string o = "\"";
    for (char ch : s) o += ch == '"' ? std::string("\"\"") : std::string(1, ch);
    return o + "\"";
  }
  void row(const std::string& section, const std::string& name, const std::string& level, const std::string& row_number,
           const std::string& quantity, const std::string& value) {
    if (batch) out << cell(response) << ',';
    out << cell(section) << ',' << cell(name) << ',' << cell(level) << ',' << row_number << ',' << cell(quantity) << ','
        << cell(value) << '\n';
  }
  void number(const std::string& section, const std::string& name, const std::string& level,
              const std::string& quantity, double v) {
    row(section, name, level, "", quantity, std::isnan(v) ? "" : number_text(v));
  }
};

void write_test_rows(csv_writer& w, const std::string& section, const std::vector<overall_test>& tests) {
  for (const auto& t : tests) {
    w.number(section, t.test, "", "statistic", t.statistic);
    w.number(section, t.test, "", "df1", t.df1);
    if (t.df2) w.number(section, t.test, "", "df2", *t.df2);
    w.number(section, t.test, "", "p_value", t.p_value);
  }
}

void write_check_csv(std::ostream& out, const std::vector<check_result>& results) {
  const bool batch = results.size() > 1;
  if (batch) out << "response,";
  out << "section,name,level,row,quantity,value\n";
  for (const auto& r : results) {
    const auto& p = r.prepared;
    const auto& d = r.diagnostics;
    csv_writer w{out, batch, p.data.response};
    for (const auto& g : p.groups) {
      w.number("group", "summary", g.level, "n", static_cast<double>(g.n));
      w.number("group", "summary", g.level, "mean", g.mean);
      w.number("group", "summary", g.level, "sd", g.sd);
      w.number("group", "summary", g.level, "median", g.median);
    }
    write_test_rows(w, "overall", r.overall);
    write_test_rows(w, "variance", d.variance);
    for (const auto& n : d.normality) {
      w.number("normality", n.test, level_name(p, n.level), "statistic", n.statistic);
      w.number("normality", n.test, level_name(p, n.level), "p_value", n.p_value);
    }
    for (const auto& s : d.shapes) {
      w.number("shape", "skewness", p.data.levels[s.level], "value", s.skewness);
      w.number("shape", "excess_kurtosis", p.data.levels[s.level], "value", s.excess_kurtosis);
    }
    w.number("spread", "sd_ratio", "", "value", d.spread.sd_ratio);
    w.number("spread", "n_ratio", "", "value", d.spread.n_ratio);
    w.number("spread", "pooled_se_ratio", "", "value", d.spread.pooled_se_ratio);
    w.number("spread", "size_variance_correlation", "", "value", d.spread.size_variance_correlation);
    w.row("spread", "larger_variances_in_smaller_groups", "", "", "value",
          d.spread.larger_variances_in_smaller_groups ? "true" : "false");
    w.number("ties", "tied_share", "", "value", d.ties.tied_share);
    w.number("ties", "distinct_values", "", "value", static_cast<double>(d.ties.distinct_values));
    w.row("ties", "small_integer_scale", "", "", "value", d.ties.small_integer_scale ? "true" : "false");
    for (const auto& o : d.outliers) {
      w.row("outlier", "modified_z", p.data.levels[o.level], std::to_string(o.row), "value", number_text(o.value));
      w.row("outlier", "modified_z", p.data.levels[o.level], std::to_string(o.row), "robust_z",
            number_text(o.robust_z));
    }
    if (r.calibration) {
      for (const auto& c : r.calibration->rows) {
        w.number("calibration", c.method, c.model, "type1_error", c.type1_error);
        w.number("calibration", c.method, c.model, "type1_error_se", c.type1_se);
        if (c.power) {
          w.number("calibration", c.method, c.model, "power", *c.power);
          w.number("calibration", c.method, c.model, "power_se", *c.power_se);
        }
      }
    }
    w.row("recommendation", "method", "", "", "tests", r.advice.method);
    w.row("recommendation", "method", "", "", "intervals", r.advice.interval_method);
    for (const auto& reason : r.advice.reasons) w.row("recommendation", "reason", "", "", "text", reason);
    for (const auto& a : r.advice.alternatives) w.row("recommendation", "alternative", "", "", "method", a);
  }
}

// ---- terminal table and Markdown ----------------------------------------------------------------

text_table shape_table(const check_result& r) {
  const auto& p = r.prepared;
  text_table t;
  t.header = {"level", "n", "skewness", "excess kurtosis", "Shapiro-Wilk W", "p-value"};
  t.right = {false, true, true, true, true, true};
  for (const auto& s : r.diagnostics.shapes) {
    std::string w = "-", pv = "-";
    for (const auto& n : r.diagnostics.normality)
      if (n.level && *n.level == s.level) {
        w = fixed(n.statistic, 4);
        pv = p_text(n.p_value);
      }
    t.rows.push_back(
        {p.data.levels[s.level], std::to_string(s.n), fixed(s.skewness, 2), fixed(s.excess_kurtosis, 2), w, pv});
  }
  for (const auto& n : r.diagnostics.normality)
    if (!n.level)
      t.rows.push_back({"pooled residuals", std::to_string(n.n), "", "", fixed(n.statistic, 4), p_text(n.p_value)});
  return t;
}

text_table test_table(const std::vector<overall_test>& tests) {
  text_table t;
  t.header = {"test", "statistic", "df", "p-value", "null hypothesis"};
  t.right = {false, true, true, true, false};
  for (const auto& o : tests)
    t.rows.push_back({o.test, general(o.statistic, 4), general(o.df1, 4) + (o.df2 ? " and " + general(*o.df2, 4) : ""),
                      p_text(o.p_value), o.null_hypothesis});
  return t;
}

text_table outlier_table(const check_result& r) {
  text_table t;
  t.header = {"level", "row", "value", "modified z"};
  t.right = {false, true, true, true};
  for (const auto& o : r.diagnostics.outliers)
    t.rows.push_back(
        {r.prepared.data.levels[o.level], std::to_string(o.row), general(o.value, 8), fixed(o.robust_z, 2)});
  return t;
}

text_table calibration_table(const calibration_report& c) {
  text_table t;
  bool power = false;
  for (const auto& row : c.rows) power |= row.power.has_value();
  t.header = {"method", "errors", "type I error", "MC se", "in band", "worst contrast", "worst"};
  t.right = {false, false, true, true, false, false, true};
  if (power) {
    t.header.push_back("power");
    t.right.push_back(true);
  }
  for (const auto& row : c.rows) {
    std::vector<std::string> cells = {row.method,
                                      row.model,
                                      percent_text(row.type1_error),
                                      percent_text(row.type1_se, 2),
                                      within_bradley_band(row.type1_error, row.alpha) ? "yes" : "NO",
                                      row.worst_contrast,
                                      percent_text(row.worst_type1_error)};
    if (power) cells.push_back(row.power ? percent_text(*row.power) : "-");
    t.rows.push_back(cells);
  }
  return t;
}

std::vector<std::string> spread_lines(const check_result& r) {
  const auto& p = r.prepared;
  const auto& s = r.diagnostics.spread;
  std::vector<std::string> lines;
  if (!std::isnan(s.sd_ratio))
    lines.push_back("SD ratio (largest/smallest) " + general(s.sd_ratio, 3) + ": largest in '" +
                    p.data.levels[s.largest_sd_level] + "' (n = " + std::to_string(p.groups[s.largest_sd_level].n) +
                    "), smallest in '" + p.data.levels[s.smallest_sd_level] +
                    "' (n = " + std::to_string(p.groups[s.smallest_sd_level].n) + ")");
  lines.push_back("n ratio (largest/smallest) " + general(s.n_ratio, 3) +
                  "; smallest n = " + std::to_string(s.smallest_n));
  if (!std::isnan(s.size_variance_correlation))
    lines.push_back(std::string("larger variances in the smaller groups: ") +
                    (s.larger_variances_in_smaller_groups ? "yes" : "no") + " (correlation of n with variance " +
                    fixed(s.size_variance_correlation, 2) + ")");
  if (!std::isnan(s.pooled_se_ratio))
    lines.push_back("pooled / separate-variance standard error, worst pair '" + p.data.levels[s.pooled_se_pair_first] +
                    "' vs '" + p.data.levels[s.pooled_se_pair_second] + "': " + fixed(s.pooled_se_ratio, 2) +
                    (s.pooled_se_ratio < 1 ? " (below 1: pooled t too large for that pair)" : ""));
  return lines;
}

std::string ties_line(const check_result& r) {
  const auto& t = r.diagnostics.ties;
  std::string s = std::to_string(t.distinct_values) + " distinct values; " + percent_text(t.tied_share, 0) +
                  " of observations share their value with another";
  if (t.integer_values)
    s += "; whole numbers from " + general(t.scale_min, 8) + " to " + general(t.scale_max, 8) +
         (t.small_integer_scale ? " (a small integer scale)" : "");
  return s;
}

const char* read_with_care =
    "Read with care: check the design and the assumptions before the numbers; the diagnostics describe these\n"
    "data, they do not prove an assumption true; a p-value is not an effect size; decisions under regulation\n"
    "or licence follow local rules and a qualified statistician.\n";

void write_check_table(std::ostream& out, const check_result& r) {
  const auto& p = r.prepared;
  out << "contrasta " << version() << " | check\n";
  out << "  data  " << data_line(p) << '\n';
  out << "  seed  " << r.options.seed << "   conclusions at alpha " << general(r.options.alpha, 3) << "\n\n";
  out << "LEVELS\n";
  write_groups_table(out, p);
  out << "\nSHAPE (bias-corrected skewness and excess kurtosis; Shapiro-Wilk, Royston 1995)\n";
  shape_table(r).print(out);
  out << "\nSPREAD\n";
  for (const auto& line : spread_lines(r)) out << "  " << line << '\n';
  out << "  tests of equal spread (reported, not a gate for the choice of method):\n";
  test_table(r.diagnostics.variance).print(out, "    ");
  out << "\nTIES AND SCALE\n  " << ties_line(r) << '\n';
  out << "\nOUTLIERS (modified z-score beyond 3.5 within the level; Iglewicz & Hoaglin 1993)\n";
  if (r.diagnostics.outliers.empty())
    out << "  none\n";
  else
    outlier_table(r).print(out);
  out << "\nOVERALL TESTS (does anything differ?)\n";
  if (r.overall.empty())
    out << "  none can be computed for these data\n";
  else
    write_overall_table(out, r.overall);
  if (r.calibration) {
    const auto& c = *r.calibration;
    out << "\nCALIBRATION (" << c.datasets
        << " simulated datasets per error model with these n and SDs and equal means;"
        << " band: alpha/2 to 3 alpha/2, Bradley 1978";
    if (c.effect) out << "; power at a largest difference of " << general(*c.effect, 4);
    out << ")\n";
    calibration_table(c).print(out);
    for (const auto& s : c.skipped) out << "  not calibrated: " << s << '\n';
  }
  out << "\nADVICE\n";
  write_recommendation_table(out, r.advice);
  out << '\n' << read_with_care;
}

void write_check_markdown(std::ostream& out, const check_result& r) {
  const auto& p = r.prepared;
  out << "# Check of " << markdown_escape(p.data.response) << "\n\n";
  out << "- data: " << markdown_escape(data_line(p)) << "\n- seed: " << r.options.seed << "; alpha "
      << general(r.options.alpha, 3) << "\n\n## Levels\n\n";
  text_table g;
  g.header = {"level", "n", "missing", "mean", "sd", "median", "min", "max"};
  g.right = {false, true, true, true, true, true, true, true};
  for (const auto& s : p.groups)
    g.rows.push_back({s.level, std::to_string(s.n), std::to_string(s.n_missing), general(s.mean, 5), general(s.sd, 4),
                      general(s.median, 5), general(s.min, 6), general(s.max, 6)});
  g.print_markdown(out);
  out << "\n## Shape\n\n";
  shape_table(r).print_markdown(out);
  out << "\n## Spread\n\n";
  for (const auto& line : spread_lines(r)) out << "- " << markdown_escape(line) << '\n';
  out << '\n';
  test_table(r.diagnostics.variance).print_markdown(out);
  out << "\n## Ties and scale\n\n" << markdown_escape(ties_line(r)) << "\n\n## Outliers\n\n";
  if (r.diagnostics.outliers.empty())
    out << "None (modified z-score rule, |z| > 3.5).\n";
  else
    outlier_table(r).print_markdown(out);
  out << "\n## Overall tests\n\n";
  test_table(r.overall).print_markdown(out);
  if (r.calibration) {
    out << "\n## Calibration\n\n" << r.calibration->datasets << " simulated datasets per error model.\n\n";
    calibration_table(*r.calibration).print_markdown(out);
  }
  out << "\n## Advice\n\nUse **" << r.advice.method << "** for tests and **" << r.advice.interval_method
      << "** for intervals, because:\n\n";
  for (const auto& reason : r.advice.reasons) out << "- " << markdown_escape(reason) << '\n';
  if (!r.advice.alternatives.empty()) {
    out << "\nAlso worth reading:";
    for (std::size_t i = 0; i < r.advice.alternatives.size(); ++i) out << (i ? ", " : " ") << r.advice.alternatives[i];
    out << ".\n";
  }
  for (const auto& note : r.advice.notes) out << "\n> note: " << markdown_escape(note) << '\n';
  out << "\n> "
      << "Check the design and the assumptions before the numbers; a p-value is not an effect size;\n"
      << "> decisions under regulation or licence follow local rules and a qualified statistician.\n";
}

// ---- the command ---------------------------------------------------------------------------

check_result run_one(dataset data, const check_settings& s, const analysis_options& o, bool show_progress) {
  check_result r;
  r.options = o;
  r.prepared = prepare(std::move(data), s.trim);
  const auto& p = r.prepared;
  std::size_t populated = 0;
  for (const auto& g : p.groups) populated += g.n > 0;
  if (populated < 2)
    throw analysis_error("the data hold " + std::to_string(populated) +
                         " level(s) with observations; a check needs at least two (check --group and --levels)");
  r.diagnostics = diagnose(p);
  r.overall = overall_tests(p);
  if (s.calibrate) {
    calibration_request request;
    request.datasets = s.datasets;
    request.effect = s.effect;
    request.method_resamples = s.method_resamples;
    request.methods = s.methods;
    std::vector<std::size_t> n = group_sizes(p);
    request.contrasts = build_contrasts(s.contrasts, p.data.levels, n);
    analysis_options co = o;
    if (show_progress) co.progress = progress_printer(s.output.quiet, "calibrating");
    r.calibration = calibrate(p, request, co);
  }
  r.advice = recommend(p, r.diagnostics, r.calibration ? &*r.calibration : nullptr, o);
  return r;
}

void run_check(const check_settings& s) {
  if (s.trim < 0 || s.trim >= 0.5) throw usage_error("--trim must be at least 0 and below 0.5");
  if (s.effect && !(*s.effect > 0))
    throw usage_error("--effect must be a positive difference in the units of the response");
  if (s.effect && !s.calibrate) throw usage_error("--effect sets the power simulation of --calibrate; add --calibrate");
  auto datasets = load_datasets(s.data);
  analysis_options o = make_analysis_options(s.run);
  o.trim = s.trim;
  const bool batch = datasets.size() > 1;
  std::vector<check_result> results;
  for (auto& d : datasets) {
    try {
      results.push_back(run_one(std::move(d), s, o, !batch));
    } catch (const analysis_error& e) {
      if (!batch) throw;
      if (!s.output.quiet) std::cerr << "note: response skipped: " << e.what() << '\n';
    }
  }
  if (results.empty()) throw analysis_error("no response could be checked; see the notes above");
  write_output(s.output, [&](std::ostream& out) {
    if (s.output.format == "json") {
      write_check_json(out, results);
    } else if (s.output.format == "csv") {
      write_check_csv(out, results);
    } else {
      for (std::size_t i = 0; i < results.size(); ++i) {
        if (i) out << '\n';
        if (s.output.format == "markdown")
          write_check_markdown(out, results[i]);
        else
          write_check_table(out, results[i]);
      }
    }
  });
}

}  // namespace

void add_check_command(CLI::App& app) {
  auto settings = std::make_shared<check_settings>();
  auto* cmd = app.add_subcommand(
      "check", "group summaries, assumption diagnostics, overall tests and the advised method with its reasons");
  cmd->footer(
      "Examples:\n"
      "  contrasta check trial.csv --group substrate --response fresh_mass_g\n"
      "  contrasta check trial.csv --group substrate --response fresh_mass_g --calibrate --seed 7\n"
      "  contrasta check trial.csv --group substrate --response fresh_mass_g --calibrate --effect 5 --format json\n\n"
      "The advice weighs the SD ratio and where the larger SDs sit, group sizes, shape, outliers and ties;\n"
      "the tests of equal spread are shown but never decide alone. --calibrate simulates datasets with the\n"
      "observed group sizes and SDs and equal means and reports how often each method rejects at --alpha;\n"
      "-c, --coefficients, --contrast-file and --family choose the contrasts it simulates (default: all pairs).");
  add_data_options(cmd, settings->data);
  add_contrast_options(cmd, settings->contrasts);
  cmd->add_option("--trim", settings->trim, "proportion trimmed from each end for trimmed means (default 0.2)");
  cmd->add_flag("--calibrate", settings->calibrate,
                "simulate this design (observed n and SDs, equal means) and report each method's actual type I error");
  cmd->add_option("--datasets", settings->datasets, "simulated datasets per error model for --calibrate (default 2000)")
      ->check(CLI::Range(std::size_t{10}, std::size_t{10'000'000}));
  cmd->add_option("--effect", settings->effect,
                  "with --calibrate: also simulate power, the observed pattern of means scaled so that the largest "
                  "difference between two levels is this value (units of the response)");
  cmd->add_option("--calibration-resamples", settings->method_resamples,
                  "resamples per simulated dataset for permutation, bootstrap and rank methods (default 199)")
      ->check(CLI::Range(std::uint64_t{19}, std::uint64_t{100'000}));
  cmd->add_option("--calibrate-methods", settings->methods,
                  "comma list of methods to calibrate (default: every method that applies)")
      ->delimiter(',');
  add_run_options(cmd, settings->run);
  add_output_options(cmd, settings->output, {"table", "json", "csv", "markdown"});
  set_action(cmd, [settings] { run_check(*settings); });
}

}  // namespace contrasta::cli
