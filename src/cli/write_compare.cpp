#include "cli/write_compare.hpp"

#include <algorithm>
#include <cmath>

#include "cli/common.hpp"
#include "cli/format.hpp"
#include "cli/write_effect_size.hpp"
#include "contrasta/version.hpp"

namespace contrasta::cli {
namespace {

std::string alternative_words(alternative a) {
  switch (a) {
    case alternative::greater: return "one-sided: the contrast is greater than zero";
    case alternative::less: return "one-sided: the contrast is less than zero";
    default: return "two-sided";
  }
}

std::string coefficient_text(const contrast& c, const std::vector<std::string>& levels) {
  std::string s;
  for (std::size_t i = 0; i < c.coefficients.size(); ++i) {
    double x = c.coefficients[i];
    if (x == 0) continue;
    if (!s.empty()) s += ", ";
    s += levels[i] + " " + (x > 0 ? "+" : "") + general(x, 4);
  }
  return s;
}

std::string percent(double conf) {
  std::string s = general(conf * 100, 6);
  while (s.find('.') != std::string::npos && (s.back() == '0' || s.back() == '.')) s.pop_back();
  return s + "%";
}

double smallest_sd(const prepared_data& p) {
  double s = HUGE_VAL;
  for (const auto& g : p.groups)
    if (g.sd > 0 && std::isfinite(g.sd)) s = std::min(s, g.sd);
  return std::isfinite(s) ? s : 1.0;
}

}  // namespace

std::string data_line(const prepared_data& p) {
  std::size_t n = p.data.size(), missing = p.data.missing_total();
  std::string s = p.data.source + ": response '" + p.data.response + "'";
  if (!p.data.group_column.empty()) s += " by '" + p.data.group_column + "'";
  s += ", " + std::to_string(p.data.level_count()) + " levels, " + std::to_string(n) + " observations";
  if (missing) s += " (" + std::to_string(missing) + " missing, dropped)";
  return s;
}

void write_tool_and_input_json(json_writer& json, const prepared_data& p, bool with_tool) {
  if (with_tool)
    json.key("tool").begin_object().field("name", "contrasta").field("version", version()).end_object();
  json.key("input").begin_object();
  json.field("source", p.data.source).field("group", p.data.group_column).field("response", p.data.response);
  json.key("levels").strings(p.data.levels);
  json.field("n_total", static_cast<std::uint64_t>(p.data.size()));
  json.field("n_missing", static_cast<std::uint64_t>(p.data.missing_total()));
  json.end_object();
}

void write_groups_json(json_writer& json, const prepared_data& p) {
  json.key("groups").begin_array();
  for (const auto& g : p.groups) {
    json.begin_object();
    json.field("level", g.level);
    json.field("n", static_cast<std::uint64_t>(g.n));
    json.field("n_missing", static_cast<std::uint64_t>(g.n_missing));
    json.field("mean", g.mean).field("sd", g.sd).field("variance", g.variance).field("median", g.median);
    json.field("trimmed_mean", g.trimmed_mean).field("winsorized_variance", g.winsorized_variance);
    json.field("trim", g.trim);
    json.field("min", g.min).field("max", g.max);
    json.end_object();
  }
  json.end_array();
}

void write_anova_json(json_writer& json, const anova_table& a) {
  json.key("anova").begin_object();
  json.field("ss_between", a.ss_between).field("ss_within", a.ss_within).field("ss_total", a.ss_total);
  json.field("df_between", a.df_between).field("df_within", a.df_within);
  json.field("ms_between", a.ms_between).field("ms_within", a.ms_within);
  json.field("f", a.f).field("p_value", a.p_value).field("r_squared", a.r_squared).field("residual_sd", a.residual_sd);
  json.end_object();
}

void write_test_list(json_writer& json, const std::vector<overall_test>& tests) {
  json.begin_array();
  for (const auto& t : tests) {
    json.begin_object();
    json.field("test", t.test).field("statistic", t.statistic).field("df1", t.df1).field("df2", t.df2);
    json.field("p_value", t.p_value).field("null", t.null_hypothesis);
    json.end_object();
  }
  json.end_array();
}

void write_overall_json(json_writer& json, const std::vector<overall_test>& overall) {
  json.key("overall");
  write_test_list(json, overall);
}

void write_recommendation_json(json_writer& json, const recommendation& r) {
  json.key("recommendation").begin_object();
  json.field("method", r.method).field("interval_method", r.interval_method);
  json.key("reasons").strings(r.reasons);
  json.key("alternatives").strings(r.alternatives);
  json.key("rules").strings(r.rules);
  json.key("notes").strings(r.notes);
  json.end_object();
}

void write_result_json(json_writer& json, const method_result& r) {
  json.begin_object();
  json.field("method", r.method).field("estimand", r.estimand);
  json.field("estimate", r.estimate).field("se", r.se);
  json.field("statistic_name", r.statistic_name).field("statistic", r.statistic);
  json.field("df", r.df);
  json.field("p_value", r.p_value).field("p_adjusted", r.p_adjusted);
  if (r.p_adjusted_across) json.field("p_adjusted_across", *r.p_adjusted_across);
  json.field("ci_low", r.ci_low).field("ci_high", r.ci_high);
  json.field("simultaneous_low", r.simultaneous_low).field("simultaneous_high", r.simultaneous_high);
  json.field("null", r.null_hypothesis);
  if (r.resamples) json.field("resamples", *r.resamples);
  else json.key("resamples").null();
  json.field("exact", r.exact);
  if (r.p_interval) {
    json.key("p_interval").begin_array().value((*r.p_interval)[0]).value((*r.p_interval)[1]).end_array();
  } else {
    json.key("p_interval").null();
  }
  json.key("notes").strings(r.notes);
  json.end_object();
}

void write_comparison_object(json_writer& json, const comparison& c, bool with_tool_and_seed) {
  const auto& p = c.prepared;
  json.begin_object();
  write_tool_and_input_json(json, p, with_tool_and_seed);
  if (with_tool_and_seed) json.field("seed", c.options.seed);
  json.key("settings").begin_object();
  json.field("conf", c.options.conf).field("alpha", c.options.alpha).field("alternative", to_string(c.options.side));
  json.field("trim", c.options.trim);
  json.key("methods").strings(c.methods);
  json.end_object();
  write_groups_json(json, p);
  write_anova_json(json, p.anova);
  write_overall_json(json, c.overall);
  json.key("contrasts").begin_array();
  for (const auto& cr : c.contrasts) {
    json.begin_object();
    json.field("name", cr.spec.name).field("expression", cr.spec.expression);
    json.key("coefficients").begin_object();
    for (std::size_t i = 0; i < cr.spec.coefficients.size(); ++i) json.field(p.data.levels[i], cr.spec.coefficients[i]);
    json.end_object();
    json.field("estimate", cr.estimate);
    write_effect_size_json(json, cr.effect);
    json.key("results").begin_array();
    for (const auto& r : cr.results) write_result_json(json, r);
    json.end_array();
    json.end_object();
  }
  json.end_array();
  {
    const auto& o = c.orthogonality;
    json.key("orthogonality").begin_object();
    json.field("mutually_orthogonal", o.mutually_orthogonal).field("complete", o.complete);
    json.field("ss_between", o.ss_between).field("ss_contrasts", o.ss_contrasts).field("ss_remainder", o.ss_remainder);
    json.key("sums_of_squares").begin_array();
    for (const auto& x : o.sums_of_squares)
      json.begin_object().field("contrast", x.name).field("ss", x.sum_of_squares).field("share", x.share).end_object();
    json.end_array();
    json.key("non_orthogonal_pairs").begin_array();
    for (std::size_t i = 0; i < o.non_orthogonal_pairs.size(); ++i)
      json.begin_object()
          .field("first", c.contrasts[o.non_orthogonal_pairs[i].first].spec.name)
          .field("second", c.contrasts[o.non_orthogonal_pairs[i].second].spec.name)
          .field("correlation", o.non_orthogonal_correlations[i])
          .end_object();
    json.end_array();
    json.end_object();
  }
  json.key("adjust").begin_object();
  json.field("method", c.adjust.method).field("family_size", static_cast<std::uint64_t>(c.adjust.family_size));
  json.field("protects", c.adjust.protects);
  json.end_object();
  write_recommendation_json(json, c.advice);
  json.end_object();
}

void write_comparison_json(std::ostream& out, const comparison& c) {
  json_writer json(out);
  write_comparison_object(json, c, true);
}

void write_batch_json(std::ostream& out, const std::vector<comparison>& runs,
                      const std::vector<std::pair<std::string, std::string>>& skipped) {
  json_writer json(out);
  json.begin_object();
  json.key("tool").begin_object().field("name", "contrasta").field("version", version()).end_object();
  json.field("seed", runs.empty() ? std::uint64_t{0} : runs.front().options.seed);
  json.key("responses").begin_array();
  for (const auto& c : runs) write_comparison_object(json, c, false);
  json.end_array();
  json.key("skipped").begin_array();
  for (const auto& [response, reason] : skipped)
    json.begin_object().field("response", response).field("reason", reason).end_object();
  json.end_array();
  json.end_object();
}

void write_batch_summary(std::ostream& out, const std::vector<comparison>& runs, const std::string& adjust_across,
                         const std::vector<std::pair<std::string, std::string>>& skipped) {
  const auto& first = runs.front();
  out << "contrasta " << version() << " | compare, " << runs.size() << " responses\n";
  out << "  data  " << first.prepared.data.source << " by '" << first.prepared.data.group_column << "', "
      << first.prepared.data.level_count() << " levels; seed " << first.options.seed << "\n";
  out << "  within each response: adjustment " << first.adjust.method << "; across responses: " << adjust_across
      << " per contrast and method\n";
  struct line {
    const comparison* run;
    const contrast_result* contrast;
    const method_result* result;
  };
  std::vector<line> lines;
  for (const auto& c : runs)
    for (const auto& cr : c.contrasts)
      for (const auto& r : cr.results)
        if (r.method == c.advice.method) lines.push_back({&c, &cr, &r});
  auto across = [](const line& l) { return l.result->p_adjusted_across.value_or(l.result->p_adjusted); };
  std::stable_sort(lines.begin(), lines.end(), [&](const line& a, const line& b) {
    double pa = across(a), pb = across(b);
    if (std::isnan(pa)) return false;
    if (std::isnan(pb)) return true;
    return pa < pb;
  });
  std::size_t findings = 0;
  for (const auto& l : lines) findings += across(l) <= first.options.alpha;
  out << "  findings at alpha " << general(first.options.alpha, 3) << " (p adjusted across responses): " << findings
      << " of " << lines.size() << " response-contrast pairs, advised method of each response\n\n";
  text_table t;
  t.header = {"response", "contrast", "method", "estimate", percent(first.options.conf) + " interval", "p-value",
              "within", "across", ""};
  t.right = {false, false, false, true, false, true, true, true, false};
  for (const auto& l : lines) {
    const auto& r = *l.result;
    int d = decimals_for(std::isfinite(r.se) && r.se > 0 ? r.se : 1.0);
    t.rows.push_back({l.run->prepared.data.response, l.contrast->spec.name, r.method, fixed(r.estimate, d),
                      "[" + fixed(r.ci_low, d) + ", " + fixed(r.ci_high, d) + "]", p_text(r.p_value),
                      p_text(r.p_adjusted), p_text(across(l)), across(l) <= first.options.alpha ? "finding" : ""});
  }
  t.print(out);
  for (const auto& [response, reason] : skipped) out << "\n  skipped '" << response << "': " << reason << "\n";
  out << "\n  Each response's full table: add --full. A p-value is not an effect size; read the estimates and\n"
         "  intervals, check the design and assumptions, and defer decisions under regulation to local rules.\n";
}

namespace {
std::string csv_cell(const std::string& s) {
  if (s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string out = "\"";
  for (char ch : s) out += ch == '"' ? std::string("\"\"") : std::string(1, ch);
  return out + "\"";
}
std::string csv_number(double v) { return std::isfinite(v) ? number_text(v) : (std::isnan(v) ? "" : (v > 0 ? "inf" : "-inf")); }
}  // namespace

void write_comparison_csv(std::ostream& out, const std::vector<comparison>& runs, bool batch) {
  if (batch) out << "response,";
  out << "contrast,method,estimate,se,statistic_name,statistic,df,p_value,p_adjusted";
  if (batch) out << ",p_adjusted_across";
  out << ",ci_low,ci_high,simultaneous_low,simultaneous_high,null,resamples,exact,p_interval_low,p_interval_high";
  for (const auto& column : effect_size_csv_columns()) out << ',' << column;
  out << '\n';
  for (const auto& c : runs) {
    for (const auto& cr : c.contrasts) {
      for (const auto& r : cr.results) {
        if (batch) out << csv_cell(c.prepared.data.response) << ',';
        out << csv_cell(cr.spec.name) << ',' << csv_cell(r.method) << ',' << csv_number(r.estimate) << ','
            << csv_number(r.se) << ',' << csv_cell(r.statistic_name) << ',' << csv_number(r.statistic) << ','
            << (r.df ? csv_number(*r.df) : "") << ',' << csv_number(r.p_value) << ',' << csv_number(r.p_adjusted);
        if (batch) out << ',' << (r.p_adjusted_across ? csv_number(*r.p_adjusted_across) : "");
        out << ',' << csv_number(r.ci_low) << ',' << csv_number(r.ci_high) << ','
            << (r.simultaneous_low ? csv_number(*r.simultaneous_low) : "") << ','
            << (r.simultaneous_high ? csv_number(*r.simultaneous_high) : "") << ',' << csv_cell(r.null_hypothesis)
            << ',' << (r.resamples ? std::to_string(*r.resamples) : "") << ',' << (r.exact ? "true" : "false") << ','
            << (r.p_interval ? csv_number((*r.p_interval)[0]) : "") << ','
            << (r.p_interval ? csv_number((*r.p_interval)[1]) : "");
        for (const auto& cell : effect_size_csv_cells(cr.effect)) out << ',' << cell;
        out << '\n';
      }
    }
  }
}

void write_groups_table(std::ostream& out, const prepared_data& p) {
  int d = decimals_for(smallest_sd(p));
  text_table t;
  t.header = {"level", "n", "missing", "mean", "sd", "median", "min", "max"};
  t.right = {false, true, true, true, true, true, true, true};
  for (const auto& g : p.groups)
    t.rows.push_back({g.level, std::to_string(g.n), std::to_string(g.n_missing), fixed(g.mean, d), fixed(g.sd, d),
                      fixed(g.median, d), fixed(g.min, d), fixed(g.max, d)});
  t.print(out);
}

void write_overall_table(std::ostream& out, const std::vector<overall_test>& overall) {
  text_table t;
  t.header = {"test", "statistic", "df", "p-value", "null hypothesis"};
  t.right = {false, true, true, true, false};
  for (const auto& o : overall) {
    std::string df = general(o.df1, 4) + (o.df2 ? " and " + general(*o.df2, 4) : "");
    t.rows.push_back({o.test, general(o.statistic, 4), df, p_text(o.p_value), o.null_hypothesis});
  }
  t.print(out);
}

void write_recommendation_table(std::ostream& out, const recommendation& r) {
  out << "  use " << r.method << " for tests";
  if (!r.interval_method.empty() && r.interval_method != r.method) out << " and " << r.interval_method << " for intervals";
  else if (!r.interval_method.empty()) out << " and intervals";
  out << ", because:\n";
  for (const auto& reason : r.reasons) out << "    - " << reason << '\n';
  if (!r.alternatives.empty()) {
    out << "  also worth reading:";
    for (std::size_t i = 0; i < r.alternatives.size(); ++i) out << (i ? ", " : " ") << r.alternatives[i];
    out << '\n';
  }
  for (const auto& note : r.notes) out << "  note: " << note << '\n';
}

void write_comparison_table(std::ostream& out, const comparison& c) {
  const auto& p = c.prepared;
  out << "contrasta " << version() << " | compare\n";
  out << "  data  " << data_line(p) << '\n';
  out << "  seed  " << c.options.seed << "   intervals " << percent(c.options.conf) << ", "
      << alternative_words(c.options.side) << ", conclusions at alpha " << general(c.options.alpha, 3) << "\n\n";
  out << "LEVELS\n";
  write_groups_table(out, p);
  {
    // The ANOVA table with the one-df contrast sums of squares beside it when the family is
    // mutually orthogonal for this design (then they partition SS between).
    const auto& a = p.anova;
    const auto& o = c.orthogonality;
    out << "\nANALYSIS OF VARIANCE\n";
    text_table t;
    t.header = {"source", "df", "sum of squares", "mean square", "F", "p-value", "share"};
    t.right = {false, true, true, true, true, true, true};
    auto pct = [](double share) { return std::isfinite(share) ? fixed(100 * share, 1) + "%" : std::string("-"); };
    t.rows.push_back({"between levels", general(a.df_between, 4), general(a.ss_between, 6), general(a.ms_between, 6),
                      general(a.f, 4), p_text(a.p_value), "100%"});
    if (o.mutually_orthogonal && !o.sums_of_squares.empty()) {
      for (const auto& x : o.sums_of_squares)
        t.rows.push_back({"  " + x.name, "1", general(x.sum_of_squares, 6), "", "", "", pct(x.share)});
      if (!o.complete && std::isfinite(o.ss_remainder))
        t.rows.push_back({"  rest of between", general(a.df_between - static_cast<double>(o.sums_of_squares.size()), 4),
                          general(o.ss_remainder, 6), "", "", "", pct(o.ss_remainder / a.ss_between)});
    }
    t.rows.push_back({"within levels", general(a.df_within, 4), general(a.ss_within, 6), general(a.ms_within, 6), "", "", ""});
    t.rows.push_back({"total", general(a.df_between + a.df_within, 4), general(a.ss_total, 6), "", "", "", ""});
    t.print(out);
    out << "  R^2 " << general(a.r_squared, 4) << ", residual SD " << general(a.residual_sd, 4) << "; the contrasts are "
        << (o.mutually_orthogonal ? "mutually orthogonal for this design" : "not mutually orthogonal for this design")
        << (o.mutually_orthogonal ? (o.complete ? " and complete: their sums of squares add up to SS between"
                                                : ": their sums of squares are shown inside SS between")
                                  : " (their sums of squares overlap, so none are shown)")
        << "\n";
  }
  if (!c.overall.empty()) {
    out << "\nOVERALL TESTS (does anything differ?)\n";
    write_overall_table(out, c.overall);
  }
  out << "\nADVICE\n";
  write_recommendation_table(out, c.advice);
  out << "\nCONTRASTS  " << c.contrasts.size() << " in the family; adjustment: " << c.adjust.method << "\n";
  out << "  protects: " << c.adjust.protects << "\n";
  std::size_t index = 0;
  const std::string ci_head = percent(c.options.conf) + " interval";
  for (const auto& cr : c.contrasts) {
    ++index;
    out << "\n  [" << index << "] " << cr.spec.name << '\n';
    out << "      coefficients: " << coefficient_text(cr.spec, p.data.levels) << '\n';
    out << "      effect size: " << effect_size_line(cr.effect) << '\n';
    double scale = HUGE_VAL;
    for (const auto& r : cr.results)
      if (r.se > 0 && std::isfinite(r.se)) scale = std::min(scale, r.se);
    int d = decimals_for(std::isfinite(scale) ? scale : smallest_sd(p));
    text_table t;
    bool any_simultaneous = false;
    for (const auto& r : cr.results) any_simultaneous |= r.simultaneous_low.has_value();
    t.header = {"method", "estimate", "se", "statistic", "df", "p-value", "adjusted", ci_head};
    if (any_simultaneous) t.header.push_back("simultaneous");
    t.right = {false, true, true, true, true, true, true, false, false};
    for (const auto& r : cr.results) {
      std::string name = r.method + (r.method == c.advice.method ? " (advised)" : "");
      std::string stat = r.statistic_name.empty() ? general(r.statistic, 4) : r.statistic_name + " = " + general(r.statistic, 4);
      std::string p_cell = p_text(r.p_value);
      if (r.p_interval && !r.exact) p_cell += " ~";
      if (r.exact) p_cell += " exact";
      int rd = r.estimand == "mean contrast" || r.estimand.empty() ? d : decimals_for(std::isfinite(r.se) && r.se > 0 ? r.se : 0.01);
      std::vector<std::string> row = {name,
                                      fixed(r.estimate, rd),
                                      fixed(r.se, rd),
                                      stat,
                                      r.df ? general(*r.df, 4) : "-",
                                      p_cell,
                                      p_text(r.p_adjusted),
                                      "[" + fixed(r.ci_low, rd) + ", " + fixed(r.ci_high, rd) + "]"};
      if (any_simultaneous)
        row.push_back(r.simultaneous_low ? "[" + fixed(*r.simultaneous_low, rd) + ", " + fixed(*r.simultaneous_high, rd) + "]" : "-");
      t.rows.push_back(row);
    }
    t.print(out, "      ");
    for (const auto& r : cr.results) {
      out << "      " << r.method << (r.null_hypothesis.empty() ? ":" : " tests: ") << r.null_hypothesis;
      if (!r.estimand.empty() && r.estimand != "mean contrast") out << " (estimate: " << r.estimand << ")";
      if (r.resamples) out << "; " << *r.resamples << (r.exact ? " arrangements, all enumerated" : " resamples");
      if (r.p_interval && !r.exact)
        out << ", 99% Monte Carlo range of p [" << p_text((*r.p_interval)[0]) << ", " << p_text((*r.p_interval)[1]) << "]";
      out << '\n';
      for (const auto& note : r.notes) out << "        note: " << note << '\n';
    }
  }
  out << "\nRead with care: check the design and the assumptions before the numbers; a p-value is not an\n"
         "effect size (read the estimate and its interval); decisions under regulation or licence follow\n"
         "local rules and a qualified statistician.\n";
}

void write_comparison_markdown(std::ostream& out, const comparison& c) {
  const auto& p = c.prepared;
  out << "# Contrasts of " << markdown_escape(p.data.response) << "\n\n";
  out << "- data: " << markdown_escape(data_line(p)) << "\n";
  out << "- seed: " << c.options.seed << "; intervals " << percent(c.options.conf) << ", "
      << alternative_words(c.options.side) << "; alpha " << general(c.options.alpha, 3) << "\n";
  out << "- adjustment: " << c.adjust.method << " (" << markdown_escape(c.adjust.protects) << ")\n\n";
  out << "## Levels\n\n";
  int d = decimals_for(smallest_sd(p));
  text_table g;
  g.header = {"level", "n", "missing", "mean", "sd", "median", "min", "max"};
  g.right = {false, true, true, true, true, true, true, true};
  for (const auto& s : p.groups)
    g.rows.push_back({s.level, std::to_string(s.n), std::to_string(s.n_missing), fixed(s.mean, d), fixed(s.sd, d),
                      fixed(s.median, d), fixed(s.min, d), fixed(s.max, d)});
  g.print_markdown(out);
  if (!c.overall.empty()) {
    out << "\n## Overall tests\n\n";
    text_table t;
    t.header = {"test", "statistic", "df", "p-value", "null hypothesis"};
    t.right = {false, true, true, true, false};
    for (const auto& o : c.overall)
      t.rows.push_back({o.test, general(o.statistic, 4), general(o.df1, 4) + (o.df2 ? " and " + general(*o.df2, 4) : ""),
                        p_text(o.p_value), o.null_hypothesis});
    t.print_markdown(out);
  }
  out << "\n## Advice\n\nUse **" << c.advice.method << "**";
  if (!c.advice.interval_method.empty() && c.advice.interval_method != c.advice.method)
    out << " for tests and **" << c.advice.interval_method << "** for intervals";
  out << ", because:\n\n";
  for (const auto& r : c.advice.reasons) out << "- " << markdown_escape(r) << "\n";
  out << "\n## Contrasts\n\n";
  text_table t;
  t.header = {"contrast", "method", "estimate", "se", "statistic", "df", "p-value", "adjusted", percent(c.options.conf) + " interval"};
  t.right = {false, false, true, true, true, true, true, true, false};
  for (const auto& cr : c.contrasts) {
    for (const auto& r : cr.results) {
      int rd = decimals_for(std::isfinite(r.se) && r.se > 0 ? r.se : smallest_sd(p));
      t.rows.push_back({cr.spec.name, r.method, fixed(r.estimate, rd), fixed(r.se, rd),
                        (r.statistic_name.empty() ? "" : r.statistic_name + " = ") + general(r.statistic, 4),
                        r.df ? general(*r.df, 4) : "-", p_text(r.p_value), p_text(r.p_adjusted),
                        "[" + fixed(r.ci_low, rd) + ", " + fixed(r.ci_high, rd) + "]"});
    }
  }
  t.print_markdown(out);
  out << "\n### Effect sizes\n\n";
  for (const auto& cr : c.contrasts)
    out << "- " << markdown_escape(cr.spec.name) << ": " << markdown_escape(effect_size_line(cr.effect)) << "\n";
  out << "\n### What each method tests\n\n";
  std::vector<std::string> seen;
  for (const auto& cr : c.contrasts)
    for (const auto& r : cr.results)
      if (std::find(seen.begin(), seen.end(), r.method) == seen.end()) {
        seen.push_back(r.method);
        out << "- **" << r.method << "**: " << markdown_escape(r.null_hypothesis) << "\n";
      }
  out << "\n> Check the design and the assumptions before the numbers; a p-value is not an effect size;\n"
         "> decisions under regulation or licence follow local rules and a qualified statistician.\n";
}

}  // namespace contrasta::cli
