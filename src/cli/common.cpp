#include "cli/common.hpp"

#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <random>
#include <sstream>

#include "contrasta/error.hpp"
#include "contrasta/family.hpp"

namespace contrasta::cli {

std::atomic<bool> interrupted{false};

namespace {
std::string& stored_command_line() {
  static std::string s;
  return s;
}

std::string shell_quote(const std::string& s) {
  bool plain = !s.empty();
  for (char c : s)
    if (!(std::isalnum(static_cast<unsigned char>(c)) || std::string_view("-_./=,:+@%").find(c) != std::string_view::npos))
      plain = false;
  if (plain) return s;
  std::string out = "'";
  for (char c : s) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}
}  // namespace

void remember_command_line(int argc, char** argv) {
  std::string s = "contrasta";
  for (int i = 1; i < argc; ++i) s += " " + shell_quote(argv[i]);
  stored_command_line() = s;
}

std::string command_line() { return stored_command_line(); }

void add_data_options(CLI::App* command, data_options& d, bool data_required) {
  auto* data = command->add_option("DATA", d.path,
                                   "data file (CSV, TSV or semicolon-separated, long format: one row per observation); - reads standard input");
  if (data_required) data->required();
  command->add_option("--group", d.group, "column holding the treatment level of each row (default: the first of two columns)");
  command->add_option("--response", d.responses,
                      "response column(s): one name, a comma list, or all-numeric (default: the second of two columns)")
      ->delimiter(',');
  command->add_option("--levels", d.levels, "analyse only these levels, in this order (comma list)")->delimiter(',');
  command->add_option("--delimiter", d.delimiter, "field separator: , ; tab (default: detected from the header line)");
  command->add_flag("--decimal-comma", d.decimal_comma, "numbers are written with a decimal comma (12,5)");
  command->add_option("--missing", d.missing,
                      "extra tokens that mark a missing response (comma list; empty, NA, NaN and . always do)")
      ->delimiter(',');
  command->add_flag("--wide", d.wide, "wide layout: one column per level, one observation per cell");
}

read_request make_read_request(const data_options& d) {
  read_request r;
  r.path = d.path.empty() ? "-" : d.path;
  if (!d.delimiter.empty()) {
    if (d.delimiter == "tab" || d.delimiter == "\\t" || d.delimiter == "\t")
      r.delimiter = '\t';
    else if (d.delimiter.size() == 1)
      r.delimiter = d.delimiter[0];
    else
      throw usage_error("--delimiter takes one character (, or ;) or the word tab, not '" + d.delimiter + "'");
  }
  r.decimal_comma = d.decimal_comma;
  if (d.decimal_comma && r.delimiter && *r.delimiter == ',')
    throw usage_error("--decimal-comma cannot be used with --delimiter ','; such files are usually semicolon-separated");
  r.group_column = d.group;
  r.response_columns = d.responses;
  r.levels = d.levels;
  for (const auto& m : d.missing) r.missing_tokens.push_back(m);
  r.wide = d.wide;
  if (d.wide && (!d.group.empty() || !d.responses.empty()))
    throw usage_error("--wide files have one column per level: --group and --response do not apply");
  return r;
}

std::vector<dataset> load_datasets(const data_options& d) { return read_datasets(make_read_request(d)); }

void add_contrast_options(CLI::App* command, contrast_options& c) {
  command->add_option("-c,--contrast", c.expressions,
                      "a contrast \"NAME: EXPR\", e.g. \"organic: (compost + manure)/2 - control\"; repeatable; "
                      "[brackets] around level names with spaces")
      ->take_all()
      ->allow_extra_args(false);
  command->add_option("--coefficients", c.coefficients, "a contrast as coefficients in level order, \"NAME: 1,0,-1\"; repeatable")
      ->allow_extra_args(false);
  command->add_option("--contrast-file", c.contrast_file, "file with one \"NAME: EXPR\" per line (# starts a comment)");
  command->add_option("--family", c.families,
                      "a standard set: all-pairs, versus=LEVEL, helmert, trend[=x1,x2,...], trend-weighted[=...], adjacent, grand-mean")
      ->allow_extra_args(false);
  command->add_flag("--allow-linear", c.allow_linear,
                    "accept coefficients that do not sum to zero (estimate a linear combination of means)");
}

std::vector<contrast> build_contrasts(const contrast_options& c, const std::vector<std::string>& levels,
                                      const std::vector<std::size_t>& n) {
  std::vector<contrast> out;
  for (const auto& f : c.families) {
    auto family = make_family(f, levels, n);
    out.insert(out.end(), family.begin(), family.end());
  }
  if (!c.contrast_file.empty()) {
    auto file = read_contrast_file(c.contrast_file, levels);
    out.insert(out.end(), file.begin(), file.end());
  }
  for (const auto& e : c.expressions) out.push_back(parse_contrast(e, levels));
  for (const auto& e : c.coefficients) out.push_back(parse_coefficients(e, levels));
  for (const auto& x : out) check_contrast(x, c.allow_linear);
  return out;
}

void add_method_options(CLI::App* command, method_options& m) {
  command->add_option("--method", m.methods,
                      "comma list of pooled, welch, trimmed, permutation, bootstrap, rank, mann-whitney, brunner-munzel, "
                      "dunn; all; auto (the advised method, default)")
      ->delimiter(',');
  command->add_option("--adjust", m.adjust,
                      "multiplicity adjustment over the contrasts: none, bonferroni, holm, sidak, hochberg, bh, by, "
                      "scheffe, tukey, games-howell, dunnett, maxt (default none)");
  command->add_option("--trim", m.trim, "proportion trimmed from each end for trimmed means (default 0.2)");
  command->add_option("--resamples", m.resamples, "Monte Carlo permutations or bootstrap resamples (default 99999)")
      ->check(CLI::Range(std::uint64_t{99}, std::uint64_t{1'000'000'000}));
  command->add_option("--exact", m.exact, "enumerate every arrangement: auto (when few enough), always, never")
      ->check(CLI::IsMember({"auto", "always", "never"}));
  command->add_option("--max-arrangements", m.max_arrangements,
                      "with --exact auto: enumerate when there are at most this many arrangements (default 20000000)");
  command->add_option("--interval", m.interval, "bootstrap interval: percentile, bca (default), studentized")
      ->check(CLI::IsMember({"percentile", "bca", "studentized"}));
  command->add_option("--statistic", m.statistic,
                      "permutation statistic: studentized (Welch t, default) or raw (the contrast itself)")
      ->check(CLI::IsMember({"studentized", "raw"}));
}

void apply_method_options(const method_options& m, analysis_options& o) {
  if (m.trim < 0 || m.trim >= 0.5) throw usage_error("--trim must be at least 0 and below 0.5");
  o.trim = m.trim;
  o.resamples = m.resamples;
  o.exact = m.exact == "always" ? exact_mode::always : m.exact == "never" ? exact_mode::never : exact_mode::automatic;
  o.max_arrangements = m.max_arrangements;
  o.interval = m.interval == "percentile"    ? bootstrap_interval::percentile
               : m.interval == "studentized" ? bootstrap_interval::studentized
                                             : bootstrap_interval::bca;
  o.statistic = m.statistic == "raw" ? permutation_statistic::raw : permutation_statistic::studentized;
}

void add_output_options(CLI::App* command, output_options& o, const std::vector<std::string>& formats) {
  std::string list;
  for (const auto& f : formats) list += (list.empty() ? "" : "|") + f;
  command->add_option("--format", o.format, "output format: " + list)->check(CLI::IsMember(formats));
  command->add_option("-o,--output", o.output, "write to this file (atomically: a failed run leaves no partial file)");
  command->add_flag("--quiet", o.quiet, "no progress or notes on standard error");
}

void write_output(const output_options& o, const std::function<void(std::ostream&)>& body) {
  if (o.output.empty() || o.output == "-") {
    std::ostringstream buffer;  // written only when complete, so an error leaves no partial output
    body(buffer);
    std::cout << buffer.str();
    std::cout.flush();
    return;
  }
  namespace fs = std::filesystem;
  fs::path target(o.output);
  fs::path dir = target.has_parent_path() ? target.parent_path() : fs::path(".");
  std::string pattern = (dir / ("." + target.filename().string() + ".tmp-XXXXXX")).string();
  std::vector<char> name(pattern.begin(), pattern.end());
  name.push_back('\0');
  int fd = ::mkstemp(name.data());
  if (fd < 0) throw input_error("cannot write '" + o.output + "': the folder does not exist or is not writable");
  ::close(fd);
  std::string temp(name.data());
  try {
    {
      std::ofstream out(temp, std::ios::binary | std::ios::trunc);
      body(out);
      out.flush();
      if (!out) throw input_error("cannot write '" + o.output + "': disk full or not writable");
    }
    fs::permissions(temp, fs::perms::owner_read | fs::perms::owner_write | fs::perms::group_read | fs::perms::others_read);
    fs::rename(temp, target);
  } catch (...) {
    std::error_code ec;
    fs::remove(temp, ec);
    throw;
  }
}

void add_run_options(CLI::App* command, common_run_options& r) {
  command->add_option("--conf", r.conf, "confidence level of the intervals (default 0.95)")->check(CLI::Range(0.5, 0.999999));
  command->add_option("--alpha", r.alpha, "level at which results are called significant (default 0.05)")
      ->check(CLI::Range(1e-12, 0.5));
  command->add_option("--alternative", r.alternative, "two-sided, greater (contrast > 0) or less")
      ->check(CLI::IsMember({"two-sided", "greater", "less"}));
  command->add_option("--threads", r.threads, "worker threads (default: all cores); results do not depend on it");
  command->add_option("--seed", r.seed, "seed of the random streams (default: drawn and printed)");
}

analysis_options make_analysis_options(const common_run_options& r) {
  analysis_options o;
  o.conf = r.conf;
  o.alpha = r.alpha;
  o.side = parse_alternative(r.alternative);
  o.threads = r.threads;
  if (r.seed) {
    o.seed = *r.seed;
  } else {
    std::random_device device;
    o.seed = device();
  }
  o.cancel = &interrupted;
  return o;
}

bool stderr_is_terminal() { return ::isatty(2) == 1; }

std::function<void(double)> progress_printer(bool quiet, const std::string& what) {
  if (quiet || !stderr_is_terminal()) return {};
  return [what, last = -1](double fraction) mutable {
    int percent = static_cast<int>(fraction * 100);
    if (percent == last) return;
    last = percent;
    std::fprintf(stderr, "\r%s %3d%%", what.c_str(), percent);
    if (percent >= 100) std::fprintf(stderr, "\r%*s\r", static_cast<int>(what.size()) + 6, "");
    std::fflush(stderr);
  };
}

comparison_request comparison_request_of(const method_options& m, const common_run_options& r,
                                         const contrast_options& c) {
  comparison_request request;
  request.methods = m.methods;
  request.adjust = m.adjust;
  request.options = make_analysis_options(r);
  apply_method_options(m, request.options);
  request.options.allow_linear = c.allow_linear;
  return request;
}

}  // namespace contrasta::cli
