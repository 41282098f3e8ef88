// Everything a report shows, gathered by the CLI layer (report.cpp) from the engine before any
// writing starts: the comparison itself plus the few numbers the comparison struct does not
// carry (each level's observations in data units, the interval of each mean, flagged outliers,
// diagnostics, resampled null distributions). The HTML and Markdown writers only format this.
#pragma once
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "cli/agreement.hpp"
#include "cli/svg.hpp"
#include "contrasta/comparison.hpp"

namespace contrasta::cli {

struct report_level {
  std::vector<double> values;       // observations in data units, file order
  std::vector<std::uint64_t> rows;  // input line of each observation
  std::vector<bool> outlier;        // flagged by the diagnostics (empty: none flagged)
  double mean_low = not_available;  // interval of the mean at options.conf
  double mean_high = not_available;
};

// One line of a diagnostics table (a variance test, a normality test per level).
struct report_test {
  std::string test;
  std::string level;  // empty for tests over all levels
  double statistic = not_available;
  std::optional<double> df1, df2;
  double p_value = not_available;
};

struct report_outlier {
  std::string level;
  std::uint64_t row = 0;
  double value = 0;
  double robust_z = 0;
};

// The resampled null distribution of one method's statistic for one contrast.
struct report_null {
  std::string contrast;
  std::string method;
  std::string statistic_name;
  std::vector<double> statistics;
  double observed = not_available;
  double p_value = not_available;
  bool exact = false;
  std::uint64_t resamples = 0;
};

struct report_content {
  comparison result;
  std::vector<report_level> levels;  // one per level of result.prepared
  std::vector<report_test> variance_tests;
  std::vector<report_test> normality_tests;
  std::vector<std::string> diagnostic_facts;  // measured facts in words ("largest SD / smallest SD = 2.4")
  std::vector<report_outlier> outliers;
  std::vector<report_null> nulls;
  std::size_t nulls_omitted = 0;       // null distributions left out to keep the report short
  bool diagnostics_available = false;  // false: the build has no diagnostics step yet
  std::string version;
  std::string command;     // the command line that reproduces the report
  bool uses_seed = false;  // any resampling method ran
};

// A finished figure: an id for file names and anchors, a caption, and the SVG text.
struct report_figure {
  std::string id;
  std::string caption;
  std::string svg;
};

// The figures of a report, in reading order: observations, one forest plot per scale of
// estimate, one histogram per null distribution. `standalone` gives SVG files of their own.
std::vector<report_figure> report_figures(const report_content& content, bool standalone);

// The cautions printed at the end of every report: fixed advice plus the notes the methods
// attached to their results (each once).
std::vector<std::string> report_cautions(const report_content& content);

// One sentence per contrast in plain words, read off the recommended method's result.
std::vector<std::string> report_headlines(const report_content& content);

// The method whose result the headlines read: the recommendation when it ran, else the first.
std::string headline_method(const comparison& result);

// Words for the p-values the conclusions use ("Holm-adjusted p-value", "p-value").
std::string p_value_words(const comparison& result);

// Whether a method produced anything (a method that could not run leaves only notes).
bool computed(const method_result& r);

// Methods that produced nothing for any contrast, each with the first note it left (why).
std::vector<std::pair<std::string, std::string>> methods_without_results(const comparison& result);

// A note as a reader should see it: "not computed: ..." without a doubled prefix.
std::string not_computed_text(const method_result& r);

// Each method that ran, with the null hypothesis it tests in words (first seen), in order.
std::vector<std::pair<std::string, std::string>> method_tests(const comparison& result);

// The heading of a report: "How fresh_mass_g differs between levels of substrate", or for wide
// files (no group column) "How value differs between soxhlet, ultrasound and microwave".
std::string report_title(const dataset& d);

// Words for an alternative hypothesis ("two-sided").
std::string alternative_words(alternative side);

}  // namespace contrasta::cli
