// Option plumbing shared by the subcommands: data options, contrast options, output options,
// the seed, and the action runner that maps errors to exit statuses.
#pragma once
#include <CLI/CLI.hpp>
#include <atomic>
#include <functional>
#include <optional>
#include <ostream>
#include <string>
#include <vector>

#include "contrasta/comparison.hpp"
#include "contrasta/contrast.hpp"
#include "contrasta/dataset.hpp"
#include "contrasta/options.hpp"
#include "contrasta/read.hpp"

namespace contrasta::cli {

// Set by the SIGINT handler; long computations watch it through analysis_options::cancel.
extern std::atomic<bool> interrupted;

struct data_options {
  std::string path;
  std::string group;
  std::vector<std::string> responses;  // --response a,b,c or all-numeric
  std::vector<std::string> levels;
  std::string delimiter;
  bool decimal_comma = false;
  std::vector<std::string> missing;
  bool wide = false;
};
void add_data_options(CLI::App* command, data_options& d, bool data_required = true);
read_request make_read_request(const data_options& d);
std::vector<dataset> load_datasets(const data_options& d);

struct contrast_options {
  std::vector<std::string> expressions;   // -c/--contrast
  std::vector<std::string> coefficients;  // --coefficients
  std::string contrast_file;
  std::vector<std::string> families;      // --family
  bool allow_linear = false;
};
void add_contrast_options(CLI::App* command, contrast_options& c);
// Builds the contrasts against the levels (families first, then explicit ones, in the order
// given); empty when none was asked for.
std::vector<contrast> build_contrasts(const contrast_options& c, const std::vector<std::string>& levels,
                                      const std::vector<std::size_t>& n);

// The method options shared by compare and report: which methods, which adjustment, and the
// settings of the trimmed, permutation and bootstrap methods.
struct method_options {
  std::vector<std::string> methods = {"auto"};
  std::string adjust = "none";
  double trim = 0.2;
  std::uint64_t resamples = 99'999;
  std::string exact = "auto";
  std::uint64_t max_arrangements = 20'000'000;
  std::string interval = "bca";
  std::string statistic = "studentized";
};
void add_method_options(CLI::App* command, method_options& m);
// Copies the method settings into analysis_options (after make_analysis_options); checks --trim.
void apply_method_options(const method_options& m, analysis_options& o);

struct output_options {
  std::string format = "table";
  std::string output;  // -o FILE; empty = standard output
  bool quiet = false;
};
void add_output_options(CLI::App* command, output_options& o, const std::vector<std::string>& formats);
// Writes through `body` to -o FILE atomically (temporary file, then rename) or to stdout.
void write_output(const output_options& o, const std::function<void(std::ostream&)>& body);

struct common_run_options {
  double conf = 0.95;
  double alpha = 0.05;
  std::string alternative = "two-sided";
  unsigned threads = 0;
  std::optional<std::uint64_t> seed;
};
void add_run_options(CLI::App* command, common_run_options& r);
// Fills the shared fields of analysis_options; draws a seed when none was given.
analysis_options make_analysis_options(const common_run_options& r);

// The part of a comparison request that compare and report build alike from their options:
// methods, adjustment, analysis options (run, method and --allow-linear settings). Contrasts,
// effect sizes and progress are the caller's.
comparison_request comparison_request_of(const method_options& m, const common_run_options& r,
                                         const contrast_options& c);

// The command line as typed, for the "reproduce with" line of reports.
std::string command_line();
void remember_command_line(int argc, char** argv);

// True when standard error is a terminal (progress lines go there only).
bool stderr_is_terminal();
// A progress callback that draws on standard error when it is a terminal and not quiet.
std::function<void(double)> progress_printer(bool quiet, const std::string& what);

}  // namespace contrasta::cli
