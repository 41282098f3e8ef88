#include "cli/write_effect_size.hpp"

#include <cmath>

#include "cli/format.hpp"

namespace contrasta::cli {
namespace {

void write_one(json_writer& json, const standardized_effect& s) {
  json.begin_object();
  json.field("estimate", s.estimate).field("ci_low", s.ci_low).field("ci_high", s.ci_high);
  json.field("standardizer", s.standardizer).field("se", s.se).field("df", s.df);
  json.field("interval", s.interval);
  json.end_object();
}

std::string csv_number(double v) { return std::isfinite(v) ? number_text(v) : (std::isnan(v) ? "" : (v > 0 ? "inf" : "-inf")); }

std::string percent(double conf) {
  std::string s = general(conf * 100, 6);
  return s + "%";
}

std::string one_text(const char* label, const standardized_effect& s, const char* sd_words) {
  if (std::isnan(s.estimate)) return std::string(label) + " n/a";
  return std::string(label) + " " + fixed(s.estimate, 3) + " [" + fixed(s.ci_low, 3) + ", " + fixed(s.ci_high, 3) + "] (" +
         sd_words + " " + general(s.standardizer, 4) + ")";
}

}  // namespace

void write_effect_size_json(json_writer& json, const effect_size_result& e) {
  json.key("effect_size").begin_object();
  json.field("scale", e.scale);
  json.key("scaled_coefficients").begin_array();
  for (double c : e.scaled_coefficients) json.value(c);
  json.end_array();
  json.field("scaled_contrast", e.scaled_contrast).field("conf", e.conf);
  json.key("standardized");
  write_one(json, e.standardized);
  json.key("bonett");
  write_one(json, e.bonett);
  json.key("notes").strings(e.notes);
  json.end_object();
}

const std::vector<std::string>& effect_size_csv_columns() {
  static const std::vector<std::string> columns = {"standardized", "standardized_low", "standardized_high",
                                                   "bonett", "bonett_low", "bonett_high"};
  return columns;
}

std::vector<std::string> effect_size_csv_cells(const effect_size_result& e) {
  return {csv_number(e.standardized.estimate), csv_number(e.standardized.ci_low), csv_number(e.standardized.ci_high),
          csv_number(e.bonett.estimate),       csv_number(e.bonett.ci_low),       csv_number(e.bonett.ci_high)};
}

std::string effect_size_line(const effect_size_result& e) {
  return one_text("standardized", e.standardized, "pooled SD") + "; " + one_text("Bonett", e.bonett, "SD") + "; " +
         percent(e.conf) + " intervals, contrast scaled to sum |c| = 2";
}

}  // namespace contrasta::cli
