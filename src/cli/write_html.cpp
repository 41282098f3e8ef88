#include "cli/write_html.hpp"

#include <algorithm>
#include <cmath>

#include "cli/report_text.hpp"

namespace contrasta::cli {

namespace {

// Print-friendly, calm, and with no external resource: system fonts only.
constexpr const char* style_sheet = R"css(
:root { --ink: #22303c; --muted: #66737f; --line: #dfe3e6; --paper: #f7f6f2; --card: #ffffff;
        --blue: #3b6ea8; --blue-soft: #eef4fa; --accent: #c7792b; --accent-soft: #fbefe2; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--paper); color: var(--ink);
       font: 15px/1.55 "DejaVu Sans", "Liberation Sans", Arial, sans-serif; }
main { max-width: 900px; margin: 0 auto; padding: 28px 22px 56px; }
header h1 { font-size: 25px; line-height: 1.25; margin: 0 0 6px; }
header p { margin: 0; color: var(--muted); }
section { background: var(--card); border: 1px solid var(--line); border-radius: 10px;
          padding: 18px 22px 20px; margin: 18px 0; }
h2 { font-size: 18px; margin: 0 0 10px; display: flex; align-items: center; gap: 10px; }
h2 .step { flex: none; width: 26px; height: 26px; border-radius: 50%; background: var(--blue);
           color: #fff; font-size: 13px; line-height: 26px; text-align: center; }
h3 { font-size: 15px; margin: 16px 0 6px; }
p { margin: 6px 0 10px; }
.note { color: var(--muted); font-size: 13.5px; }
.glance { border-left: 5px solid var(--blue); background: var(--blue-soft); }
.glance ul { margin: 4px 0 0; padding-left: 20px; }
.glance li { margin: 4px 0; }
.alert { border-left: 5px solid var(--accent); background: var(--accent-soft); padding: 8px 12px;
         border-radius: 6px; margin: 10px 0; }
.calm { border-left: 5px solid var(--blue); background: var(--blue-soft); padding: 8px 12px;
        border-radius: 6px; margin: 10px 0; }
.table-wrap { overflow-x: auto; }
table { border-collapse: collapse; width: 100%; font-size: 13.5px; margin: 6px 0 8px;
        font-variant-numeric: tabular-nums; }
th, td { padding: 5px 8px; border-bottom: 1px solid var(--line); text-align: right;
         vertical-align: top; }
th { font-weight: 600; color: var(--muted); border-bottom: 2px solid var(--line); }
th:first-child, td:first-child, td.text, th.text { text-align: left; }
td.words { text-align: left; color: var(--muted); font-size: 12.5px; }
td:not(.text):not(.words) { white-space: nowrap; }
tr.contrast-head th { text-align: left; color: var(--ink); font-size: 14px; padding-top: 12px;
                      border-bottom: 1px solid var(--line); }
.tag { white-space: nowrap; }
table.results { font-size: 12.5px; }
table.results th, table.results td { padding: 4px 6px; }
.sub { color: var(--muted); font-size: 11.5px; font-weight: 400; }
tr.recommended td.text { white-space: nowrap; }
table.agreement { font-size: 12.5px; }
table.agreement th, table.agreement td { padding: 4px 5px; }
table.agreement td.text { min-width: 9em; }
table.agreement td.cell, table.agreement td.no { text-align: center; }
table.agreement th:not(:first-child):not(.text) { text-align: center; }
table.agreement .mark { font-size: 17px; line-height: 1.1; }
tr.split td { background: var(--accent-soft); }
.mark { display: inline-block; min-width: 1.3em; text-align: center; font-weight: 700; }
.yes { color: var(--ink); }
.no { color: var(--muted); }
.verdict-split { font-weight: 700; color: #8a4a10; }
.recommended { font-weight: 700; }
.tag { display: inline-block; font-size: 11px; padding: 0 6px; border-radius: 9px;
       background: var(--blue); color: #fff; margin-left: 6px; vertical-align: 1px; }
figure { margin: 10px 0 4px; }
figcaption { color: var(--muted); font-size: 13px; margin-top: 4px; }
svg.plot { display: block; max-width: 100%; height: auto; }
pre { background: #f1f1ee; border-radius: 6px; padding: 10px 12px; overflow-x: auto;
      white-space: pre-wrap; word-break: break-all; font-size: 13px; }
code { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; }
dl { display: grid; grid-template-columns: max-content 1fr; gap: 2px 16px; margin: 6px 0; }
dt { color: var(--muted); } dd { margin: 0; }
footer { color: var(--muted); font-size: 12.5px; text-align: center; margin-top: 22px; }
@media print {
  body { background: #fff; font-size: 12px; }
  main { max-width: none; padding: 0; }
  section { border: none; padding: 0; margin: 14px 0; }
  /* Sections flow across pages; a plot, a table row or a heading never splits from what it heads. */
  figure, tr, .alert, .calm { break-inside: avoid; }
  h2, h3 { break-after: avoid; }
  .glance { background: #fff; }
  .table-wrap { overflow: visible; }
  table, table.results, table.agreement { font-size: 10px; }
  table.results th, table.results td { padding: 3px 4px; }
}
)css";

std::string e(const std::string& s) {
  return xml_escape(s);
}

std::string cell(const std::string& s, const char* cls = nullptr) {
  std::string out = cls ? std::string("<td class=\"") + cls + "\">" : std::string("<td>");
  return out + e(s) + "</td>";
}

std::string interval_text(double low, double high) {
  if (std::isnan(low) && std::isnan(high)) return "n/a";
  return display_number(low) + " to " + display_number(high);
}

class html {
 public:
  explicit html(std::ostream& out) : out_(out) {}
  std::ostream& o() { return out_; }
  void section_start(const std::string& id, const std::string& title, const char* extra_class = "") {
    ++step_;
    out_ << "<section id=\"" << id << "\"" << (*extra_class ? std::string(" class=\"") + extra_class + "\"" : "")
         << ">\n<h2><span class=\"step\">" << step_ << "</span>" << e(title) << "</h2>\n";
  }
  void section_end() { out_ << "</section>\n"; }

 private:
  std::ostream& out_;
  int step_ = 0;
};

void write_figure(std::ostream& out, const report_figure& f) {
  out << "<figure id=\"figure-" << e(f.id) << "\">\n"
      << f.svg << "<figcaption>" << e(f.caption) << "</figcaption>\n</figure>\n";
}

void write_groups_table(std::ostream& out, const comparison& r) {
  out << "<div class=\"table-wrap\"><table class=\"groups\">\n<thead><tr><th>level</th><th>n</th>"
         "<th>missing</th><th>mean</th><th>SD</th><th>median</th><th>trimmed mean ("
      << e(plain_number(r.options.trim * 100)) << "%)</th><th>min</th><th>max</th></tr></thead>\n<tbody>\n";
  for (const auto& g : r.prepared.groups) {
    out << "<tr>" << cell(g.level) << cell(std::to_string(g.n)) << cell(std::to_string(g.n_missing))
        << cell(display_number(g.mean)) << cell(display_number(g.sd)) << cell(display_number(g.median))
        << cell(display_number(g.trimmed_mean)) << cell(display_number(g.min)) << cell(display_number(g.max))
        << "</tr>\n";
  }
  out << "</tbody></table></div>\n";
}

void write_contrast_definitions(std::ostream& out, const comparison& r) {
  const auto& levels = r.prepared.data.levels;
  out << "<div class=\"table-wrap\"><table class=\"contrast-definitions\">\n<thead><tr><th>contrast</th>"
         "<th class=\"text\">as written</th>";
  for (const auto& l : levels) out << "<th>" << e(l) << "</th>";
  out << "</tr></thead>\n<tbody>\n";
  for (const auto& c : r.contrasts) {
    out << "<tr>" << cell(c.spec.name) << cell(c.spec.expression, "text");
    for (std::size_t i = 0; i < levels.size(); ++i) {
      const double v = i < c.spec.coefficients.size() ? c.spec.coefficients[i] : 0;
      out << cell(v == 0 ? std::string("\xC2\xB7") : plain_number(v));
    }
    out << "</tr>\n";
  }
  out << "</tbody></table></div>\n";
}

void write_test_table(std::ostream& out, const std::vector<report_test>& tests, bool with_level, const char* cls) {
  out << "<div class=\"table-wrap\"><table class=\"" << cls << "\">\n<thead><tr><th>test</th>";
  if (with_level) out << "<th class=\"text\">level</th>";
  out << "<th>statistic</th><th>df</th><th>p-value</th></tr></thead>\n<tbody>\n";
  for (const auto& t : tests) {
    std::string df = t.df1 ? display_df(*t.df1) : "";
    if (t.df2) df += ", " + display_df(*t.df2);
    out << "<tr>" << cell(t.test);
    if (with_level) out << cell(t.level.empty() ? "pooled residuals" : t.level, "text");
    out << cell(display_number(t.statistic)) << cell(df.empty() ? "n/a" : df) << cell(display_p(t.p_value))
        << "</tr>\n";
  }
  out << "</tbody></table></div>\n";
}

void write_results_table(std::ostream& out, const comparison& r, const std::string& advised) {
  const bool adjusted = r.adjust.method != "none" && !r.adjust.method.empty();
  bool simultaneous = false;
  for (const auto& c : r.contrasts) {
    for (const auto& m : c.results) simultaneous |= m.simultaneous_low.has_value();
  }
  const std::string percent = percent_text(r.options.conf);
  const int columns = 6 + (adjusted ? 1 : 0) + (simultaneous ? 1 : 0);
  // Methods with no result anywhere are listed once below the table instead of row by row.
  const auto without = methods_without_results(r);
  std::vector<std::string> silent;
  for (const auto& w : without) silent.push_back(w.first);
  out << "<div class=\"table-wrap\"><table class=\"results\">\n<thead><tr><th class=\"text\">method</th>"
         "<th>estimate</th><th>"
      << e(percent) << " interval</th>";
  if (simultaneous) out << "<th>adjusted interval</th>";
  out << "<th>p-value</th>";
  if (adjusted) out << "<th>" << e(adjustment_words(r.adjust.method)) << "-adjusted p</th>";
  out << "<th>statistic (df)</th><th>SE</th></tr></thead>\n<tbody>\n";
  for (const auto& c : r.contrasts) {
    out << "<tr class=\"contrast-head\"><th class=\"text\" colspan=\"" << columns << "\">" << e(c.spec.name)
        << "</th></tr>\n";
    for (const method_result& m : c.results) {
      if (std::find(silent.begin(), silent.end(), m.method) != silent.end()) continue;
      const bool rec = m.method == advised;
      out << "<tr" << (rec ? " class=\"recommended\"" : "") << "><td class=\"text\">" << e(m.method)
          << (rec ? "<span class=\"tag\">recommended</span>" : "") << "</td>";
      if (!computed(m)) {
        out << "<td class=\"words\" colspan=\"" << columns - 1 << "\">" << e(not_computed_text(m)) << "</td></tr>\n";
        continue;
      }
      out << cell(display_number(m.estimate)) << cell(interval_text(m.ci_low, m.ci_high));
      if (simultaneous) {
        out << cell(m.simultaneous_low && m.simultaneous_high ? interval_text(*m.simultaneous_low, *m.simultaneous_high)
                                                              : std::string("n/a"));
      }
      // A Monte Carlo p-value carries its 99% resampling interval on a second line.
      out << "<td>" << e(display_p(m.p_value));
      if (m.p_interval && !m.exact) {
        out << "<br><span class=\"sub\">99%: " << e(display_p((*m.p_interval)[0])) << " to "
            << e(display_p((*m.p_interval)[1])) << "</span>";
      } else if (m.exact) {
        out << "<br><span class=\"sub\">exact</span>";
      }
      out << "</td>";
      if (adjusted) out << cell(display_p(m.p_adjusted));
      std::string statistic =
          (m.statistic_name.empty() ? std::string() : m.statistic_name + " = ") + display_number(m.statistic);
      if (m.df) statistic += " (" + display_df(*m.df) + ")";
      out << cell(statistic) << cell(display_number(m.se)) << "</tr>\n";
    }
  }
  out << "</tbody></table></div>\n";
  if (!without.empty()) {
    out << "<p class=\"note\">No result from:</p>\n<ul class=\"note\">\n";
    for (const auto& [method, why] : without) out << "<li>" << e(method) << ": " << e(why) << "</li>\n";
    out << "</ul>\n";
  }
  const auto tests = method_tests(r);
  if (!tests.empty()) {
    out << "<h3>What each method tests</h3>\n<dl class=\"methods\">\n";
    for (const auto& [method, words] : tests) out << "<dt>" << e(method) << "</dt><dd>" << e(words) << "</dd>\n";
    out << "</dl>\n";
  }
}

void write_agreement(std::ostream& out, const comparison& r) {
  const agreement_table t = method_agreement(r, r.options.alpha);
  const std::string alpha = plain_number(t.alpha);
  if (t.split_rows > 0) {
    out << "<p class=\"alert\"><strong>The conclusion depends on the method for " << t.split_rows << " of "
        << t.rows.size()
        << " contrasts</strong> (marked \xE2\x96\xB2 below). Read the recommended method and "
           "its reasons before deciding.</p>\n";
  } else if (!t.rows.empty()) {
    out << "<p class=\"calm\"><strong>Every method reaches the same conclusion for every contrast</strong> "
           "at alpha "
        << e(alpha) << ".</p>\n";
  }
  out << "<div class=\"table-wrap\"><table class=\"agreement\">\n<thead><tr><th>contrast</th><th "
         "class=\"text\">conclusion</th>";
  for (const auto& m : t.methods) out << "<th>" << e(m) << "</th>";
  out << "</tr></thead>\n<tbody>\n";
  for (const auto& row : t.rows) {
    const bool split = row.verdict == agreement_verdict::split;
    out << "<tr" << (split ? " class=\"split\"" : "") << ">" << cell(row.contrast);
    std::string verdict = verdict_words(row.verdict);
    if (split)
      verdict = "\xE2\x96\xB2 depends on the method (" + std::to_string(row.finding) + " of " +
                std::to_string(row.available) + " find a difference)";
    out << "<td class=\"text" << (split ? " verdict-split" : "") << "\">" << e(verdict) << "</td>";
    for (const auto& c : row.cells) {
      if (!c.available) {
        out << "<td class=\"no\" title=\"no result\">\xE2\x80\x93</td>";
        continue;
      }
      // The mark on top, large, so that a row reads at a glance; the p-value beneath it.
      out << "<td class=\"cell\"><span class=\"mark " << (c.below_alpha ? "yes\">\xE2\x97\x8F" : "no\">\xE2\x97\x8B")
          << "</span><br><span class=\"sub\">" << e(display_p(c.p)) << "</span></td>";
    }
    out << "</tr>\n";
  }
  out << "</tbody></table></div>\n";
  if (!t.without_result.empty()) {
    out << "<p class=\"note\">No p-value from ";
    for (std::size_t i = 0; i < t.without_result.size(); ++i) out << (i ? ", " : "") << e(t.without_result[i]);
    out << " (see the results above).</p>\n";
  }
  out << "<p class=\"note\">Each cell is the " << e(p_value_words(r)) << " of that method; \xE2\x97\x8F = below alpha "
      << e(alpha)
      << " (a difference), \xE2\x97\x8B = not below, \xE2\x80\x93 = no result (the method does not apply to that "
         "contrast or could not be computed).</p>\n";
}

}  // namespace

void write_html_report(std::ostream& out, const report_content& content) {
  const comparison& r = content.result;
  const dataset& d = r.prepared.data;
  const std::string advised = headline_method(r);
  const std::vector<report_figure> figures = report_figures(content, false);
  std::size_t n_total = 0;
  for (const auto& g : r.prepared.groups) n_total += g.n;
  const std::string title = report_title(d);

  out << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
         "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
         // Nothing may load or run: even a failure of escaping could not fetch or execute.
         "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; style-src 'unsafe-inline'\">\n"
         "<meta name=\"generator\" content=\"contrasta "
      << e(content.version) << "\">\n"
      << "<title>" << e(title) << "</title>\n<style>" << style_sheet << "</style>\n</head>\n<body>\n<main>\n";

  out << "<header>\n<h1>" << e(title) << "</h1>\n<p>Data: <strong>" << e(d.source) << "</strong> \xC2\xB7 " << n_total
      << " observations in " << r.prepared.groups.size() << " groups \xC2\xB7 " << r.contrasts.size() << " contrast"
      << (r.contrasts.size() == 1 ? "" : "s") << " \xC2\xB7 " << e(alternative_words(r.options.side))
      << " tests at alpha " << e(plain_number(r.options.alpha)) << " \xC2\xB7 contrasta " << e(content.version)
      << "</p>\n</header>\n";

  html h(out);
  // At a glance.
  h.section_start("glance", "At a glance", "glance");
  out << "<p>Recommended method: <strong>" << e(advised) << "</strong>"
      << (advised == r.advice.method || r.advice.method.empty()
              ? ""
              : " (the recommended " + e(r.advice.method) + " did not run)")
      << ". Conclusions use the " << e(p_value_words(r)) << ".</p>\n<ul>\n";
  for (const auto& s : report_headlines(content)) out << "<li>" << e(s) << "</li>\n";
  out << "</ul>\n";
  h.section_end();

  // The question and the data.
  h.section_start("data", "The question and the data");
  out << "<dl>\n<dt>file</dt><dd>" << e(d.source) << "</dd>\n<dt>groups (column)</dt><dd>"
      << e(d.group_column.empty() ? std::string("one column per level") : d.group_column)
      << "</dd>\n<dt>response</dt><dd>" << e(d.response) << "</dd>\n<dt>levels</dt><dd>";
  for (std::size_t i = 0; i < d.levels.size(); ++i) out << (i ? ", " : "") << e(d.levels[i]);
  out << "</dd>\n<dt>missing values</dt><dd>" << d.missing_total()
      << (d.missing_total() ? " (left out; counted per level below)" : " (none)") << "</dd>\n</dl>\n";
  out << "<h3>Contrasts asked</h3>\n<p class=\"note\">A contrast weighs the level means by the coefficients "
         "shown; its estimate is the weighted sum.</p>\n";
  write_contrast_definitions(out, r);
  out << "<h3>Group summaries</h3>\n";
  write_groups_table(out, r);
  out << "<p class=\"note\">Overall test of equal means (one-way analysis of variance): F = "
      << e(display_number(r.prepared.anova.f)) << " on " << e(display_df(r.prepared.anova.df_between)) << " and "
      << e(display_df(r.prepared.anova.df_within)) << " df, p "
      << (display_p(r.prepared.anova.p_value).front() == '<' ? "" : "= ") << e(display_p(r.prepared.anova.p_value))
      << "; residual SD " << e(display_number(r.prepared.anova.residual_sd)) << ".</p>\n";
  h.section_end();

  // Every observation.
  h.section_start("observations", "Every observation");
  write_figure(out, figures.front());
  if (!content.outliers.empty()) {
    out << "<p>Flagged as possible outliers (robust z above 3.5, Iglewicz &amp; Hoaglin): ";
    for (std::size_t i = 0; i < content.outliers.size(); ++i) {
      const auto& o = content.outliers[i];
      out << (i ? "; " : "") << e(o.level) << " row " << o.row << " (" << e(display_number(o.value)) << ", robust z "
          << e(display_number(o.robust_z, 3)) << ")";
    }
    out << ". They stay in every analysis; check them against the field or lab record.</p>\n";
  }
  h.section_end();

  // Diagnostics and recommendation.
  h.section_start("checks", "Checks and the recommended method");
  out << "<p class=\"calm\">Recommended: <strong>" << e(r.advice.method.empty() ? advised : r.advice.method)
      << "</strong>";
  if (!r.advice.interval_method.empty() && r.advice.interval_method != r.advice.method) {
    out << "; for intervals: <strong>" << e(r.advice.interval_method) << "</strong>";
  }
  out << ".</p>\n";
  if (!r.advice.reasons.empty()) {
    out << "<h3>Why</h3>\n<ul>\n";
    for (const auto& s : r.advice.reasons) out << "<li>" << e(s) << "</li>\n";
    out << "</ul>\n";
  }
  if (!r.advice.alternatives.empty()) {
    out << "<p>Also worth reading: ";
    for (std::size_t i = 0; i < r.advice.alternatives.size(); ++i)
      out << (i ? ", " : "") << e(r.advice.alternatives[i]);
    out << ".</p>\n";
  }
  if (!content.diagnostic_facts.empty()) {
    out << "<h3>Measured facts</h3>\n<ul>\n";
    for (const auto& s : content.diagnostic_facts) out << "<li>" << e(s) << "</li>\n";
    out << "</ul>\n";
  }
  if (!r.overall.empty()) {
    out << "<h3>Overall tests</h3>\n<div class=\"table-wrap\"><table class=\"overall\">\n<thead><tr><th>test</th>"
           "<th>statistic</th><th>df</th><th>p-value</th><th class=\"text\">null "
           "hypothesis</th></tr></thead>\n<tbody>\n";
    for (const auto& t : r.overall) {
      std::string df = display_df(t.df1) + (t.df2 ? ", " + display_df(*t.df2) : std::string());
      out << "<tr>" << cell(t.test) << cell(display_number(t.statistic)) << cell(df) << cell(display_p(t.p_value))
          << cell(t.null_hypothesis, "words") << "</tr>\n";
    }
    out << "</tbody></table></div>\n";
  }
  if (!content.variance_tests.empty()) {
    out << "<h3>Equal spread</h3>\n";
    write_test_table(out, content.variance_tests, false, "variance");
    out << "<p class=\"note\">Reported, not used as a gate: choosing a method by a preliminary variance test "
           "distorts error rates (Zimmerman 2004).</p>\n";
  }
  if (!content.normality_tests.empty()) {
    out << "<h3>Shape of each group</h3>\n";
    write_test_table(out, content.normality_tests, true, "normality");
  }
  if (!content.diagnostics_available) {
    out << "<p class=\"note\">Assumption diagnostics are not part of this build.</p>\n";
  }
  h.section_end();

  // Contrasts.
  h.section_start("contrasts", "Contrasts: estimates and intervals");
  for (const auto& f : figures) {
    if (f.id.rfind("forest-", 0) == 0) write_figure(out, f);
  }
  if (r.adjust.method != "none" && !r.adjust.method.empty()) {
    out << "<p class=\"note\">Adjustment: " << e(adjustment_words(r.adjust.method)) << " over " << r.adjust.family_size
        << " contrasts" << (r.adjust.protects.empty() ? std::string() : "; " + e(r.adjust.protects)) << ".</p>\n";
  } else {
    out << "<p class=\"note\">No multiplicity adjustment: each p-value and interval holds for its own contrast "
           "only.</p>\n";
  }
  h.section_end();

  // Agreement.
  h.section_start("agreement", "Do the methods agree?");
  write_agreement(out, r);
  h.section_end();

  // Every number of every method.
  h.section_start("results", "All results in detail");
  write_results_table(out, r, advised);
  h.section_end();

  // Null distributions.
  bool any_null = false;
  for (const auto& f : figures) any_null |= f.id.rfind("null-", 0) == 0;
  if (any_null) {
    h.section_start("null-distributions", "Resampling: what chance alone produces");
    out << "<p class=\"note\">Each histogram shows the statistic recomputed after reshuffling or resampling "
           "the data as the null hypothesis allows; the observed value is the dark line.</p>\n";
    for (const auto& f : figures) {
      if (f.id.rfind("null-", 0) == 0) write_figure(out, f);
    }
    if (content.nulls_omitted > 0) {
      out << "<p class=\"note\">" << content.nulls_omitted
          << " more null distributions are not drawn, to keep the "
             "report short.</p>\n";
    }
    h.section_end();
  }

  // Reproduce.
  h.section_start("reproduce", "Reproduce this report");
  out << "<dl>\n<dt>contrasta version</dt><dd>" << e(content.version) << "</dd>\n<dt>seed</dt><dd>" << r.options.seed
      << (content.uses_seed ? "" : " (no resampling method ran; the seed does not change any number here)")
      << "</dd>\n<dt>confidence</dt><dd>" << e(plain_number(r.options.conf * 100)) << "%</dd>\n<dt>alpha</dt><dd>"
      << e(plain_number(r.options.alpha)) << "</dd>\n<dt>alternative</dt><dd>" << e(alternative_words(r.options.side))
      << "</dd>\n</dl>\n";
  if (!content.command.empty()) out << "<pre><code>" << e(content.command) << "</code></pre>\n";
  h.section_end();

  // Cautions.
  h.section_start("cautions", "Cautions");
  out << "<ul>\n";
  for (const auto& s : report_cautions(content)) out << "<li>" << e(s) << "</li>\n";
  out << "</ul>\n";
  h.section_end();

  out << "<footer>Made with contrasta " << e(content.version)
      << ". Self-contained: no scripts, no external files.</footer>\n"
      << "</main>\n</body>\n</html>\n";
}

}  // namespace contrasta::cli
