#include "cli/write_report_markdown.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "cli/report_text.hpp"

namespace contrasta::cli {

namespace {

std::string m(const std::string& s) {
  return markdown_text(s);
}

std::string p_phrase(double p) {
  const std::string t = display_p(p);
  return t.front() == '<' ? t : "= " + t;
}

void row(std::ostream& out, const std::vector<std::string>& cells) {
  out << '|';
  for (const auto& c : cells) out << ' ' << c << " |";
  out << '\n';
}

// Header row and alignment row: the first column left, the others right unless listed as text.
void header(std::ostream& out, const std::vector<std::string>& cells, const std::vector<bool>& text = {}) {
  row(out, cells);
  out << '|';
  for (std::size_t i = 0; i < cells.size(); ++i) {
    const bool left = i == 0 || (i < text.size() && text[i]);
    out << (left ? " :--- |" : " ---: |");
  }
  out << '\n';
}

std::string interval_text(double low, double high) {
  if (std::isnan(low) && std::isnan(high)) return "n/a";
  return display_number(low) + " to " + display_number(high);
}

}  // namespace

markdown_report write_markdown_report(const report_content& content, const std::string& figure_stem) {
  const comparison& r = content.result;
  const dataset& d = r.prepared.data;
  const std::string advised = headline_method(r);
  const bool adjusted = r.adjust.method != "none" && !r.adjust.method.empty();
  const std::string alpha = plain_number(r.options.alpha);
  const std::string percent = percent_text(r.options.conf);
  markdown_report report;
  const std::vector<report_figure> figures = report_figures(content, true);
  auto link = [&](const report_figure& f, std::ostream& out) {
    const std::string file = figure_stem + "-" + f.id + ".svg";
    report.figures.emplace_back(file, f.svg);
    // The file name comes from the output name the user chose: the link target percent-encodes
    // every byte outside the URL-safe set (RFC 3986), so spaces, brackets or quotes in it can
    // neither break the link nor inject markup.
    out << "![" << m(f.caption) << "](" << percent_encode(file) << ")\n\n";
  };

  std::ostringstream out;
  std::size_t n_total = 0;
  for (const auto& g : r.prepared.groups) n_total += g.n;
  out << "# " << m(report_title(d)) << "\n\n";
  out << "Data: **" << m(d.source) << "**, " << n_total << " observations in " << r.prepared.groups.size()
      << " groups, " << r.contrasts.size() << " contrast" << (r.contrasts.size() == 1 ? "" : "s") << ", "
      << alternative_words(r.options.side) << " tests at alpha " << alpha << ", contrasta " << m(content.version)
      << ".\n\n";

  out << "## At a glance\n\n";
  out << "Recommended method: **" << m(advised) << "**. Conclusions use the " << m(p_value_words(r)) << ".\n\n";
  for (const auto& s : report_headlines(content)) out << "- " << m(s) << '\n';
  out << '\n';

  out << "## The question and the data\n\n";
  out << "- file: " << m(d.source) << '\n';
  out << "- groups (column): " << m(d.group_column.empty() ? std::string("one column per level") : d.group_column)
      << '\n';
  out << "- response: " << m(d.response) << '\n';
  out << "- levels: ";
  for (std::size_t i = 0; i < d.levels.size(); ++i) out << (i ? ", " : "") << m(d.levels[i]);
  out << "\n- missing values: " << d.missing_total()
      << (d.missing_total() ? " (left out; counted per level below)" : " (none)") << "\n\n";

  out << "### Contrasts asked\n\n";
  {
    std::vector<std::string> h = {"contrast", "as written"};
    for (const auto& l : d.levels) h.push_back(m(l));
    header(out, h, {false, true});
    for (const auto& c : r.contrasts) {
      std::vector<std::string> cells = {m(c.spec.name), m(c.spec.expression)};
      for (std::size_t i = 0; i < d.levels.size(); ++i) {
        const double v = i < c.spec.coefficients.size() ? c.spec.coefficients[i] : 0;
        cells.push_back(v == 0 ? "\xC2\xB7" : plain_number(v));
      }
      row(out, cells);
    }
    out << '\n';
  }

  out << "### Group summaries\n\n";
  header(out, {"level", "n", "missing", "mean", "SD", "median",
               "trimmed mean (" + plain_number(r.options.trim * 100) + "%)", "min", "max"});
  for (const auto& g : r.prepared.groups) {
    row(out,
        {m(g.level), std::to_string(g.n), std::to_string(g.n_missing), display_number(g.mean), display_number(g.sd),
         display_number(g.median), display_number(g.trimmed_mean), display_number(g.min), display_number(g.max)});
  }
  out << "\nOverall test of equal means (one-way analysis of variance): F = " << display_number(r.prepared.anova.f)
      << " on " << display_df(r.prepared.anova.df_between) << " and " << display_df(r.prepared.anova.df_within)
      << " df, p " << p_phrase(r.prepared.anova.p_value) << "; residual SD "
      << display_number(r.prepared.anova.residual_sd) << ".\n\n";

  out << "## Every observation\n\n";
  link(figures.front(), out);
  if (!content.outliers.empty()) {
    out << "Flagged as possible outliers (robust z above 3.5, Iglewicz & Hoaglin):\n\n";
    header(out, {"level", "row", "value", "robust z"});
    for (const auto& o : content.outliers) {
      row(out, {m(o.level), std::to_string(o.row), display_number(o.value), display_number(o.robust_z, 3)});
    }
    out << "\nThey stay in every analysis; check them against the field or lab record.\n\n";
  }

  out << "## Checks and the recommended method\n\n";
  out << "Recommended: **" << m(r.advice.method.empty() ? advised : r.advice.method) << "**";
  if (!r.advice.interval_method.empty() && r.advice.interval_method != r.advice.method) {
    out << "; for intervals: **" << m(r.advice.interval_method) << "**";
  }
  out << ".\n\n";
  if (!r.advice.reasons.empty()) {
    out << "Why:\n\n";
    for (const auto& s : r.advice.reasons) out << "- " << m(s) << '\n';
    out << '\n';
  }
  if (!r.advice.alternatives.empty()) {
    out << "Also worth reading: ";
    for (std::size_t i = 0; i < r.advice.alternatives.size(); ++i)
      out << (i ? ", " : "") << m(r.advice.alternatives[i]);
    out << ".\n\n";
  }
  if (!content.diagnostic_facts.empty()) {
    out << "Measured facts:\n\n";
    for (const auto& s : content.diagnostic_facts) out << "- " << m(s) << '\n';
    out << '\n';
  }
  if (!r.overall.empty()) {
    out << "### Overall tests\n\n";
    header(out, {"test", "statistic", "df", "p-value", "null hypothesis"}, {false, false, false, false, true});
    for (const auto& t : r.overall) {
      row(out, {m(t.test), display_number(t.statistic),
                display_df(t.df1) + (t.df2 ? ", " + display_df(*t.df2) : std::string()), display_p(t.p_value),
                m(t.null_hypothesis)});
    }
    out << '\n';
  }
  auto test_table = [&](const std::vector<report_test>& tests, bool with_level) {
    std::vector<std::string> h = {"test"};
    if (with_level) h.push_back("level");
    for (const char* s : {"statistic", "df", "p-value"}) h.push_back(s);
    header(out, h, {false, with_level});
    for (const auto& t : tests) {
      std::string df = t.df1 ? display_df(*t.df1) : "";
      if (t.df2) df += ", " + display_df(*t.df2);
      std::vector<std::string> cells = {m(t.test)};
      if (with_level) cells.push_back(m(t.level.empty() ? std::string("pooled residuals") : t.level));
      cells.push_back(display_number(t.statistic));
      cells.push_back(df.empty() ? "n/a" : df);
      cells.push_back(display_p(t.p_value));
      row(out, cells);
    }
    out << '\n';
  };
  if (!content.variance_tests.empty()) {
    out << "### Equal spread\n\n";
    test_table(content.variance_tests, false);
    out << "Reported, not used as a gate: choosing a method by a preliminary variance test distorts error "
           "rates (Zimmerman 2004).\n\n";
  }
  if (!content.normality_tests.empty()) {
    out << "### Shape of each group\n\n";
    test_table(content.normality_tests, true);
  }
  if (!content.diagnostics_available) out << "Assumption diagnostics are not part of this build.\n\n";

  out << "## Contrasts: estimates and intervals\n\n";
  for (const auto& f : figures) {
    if (f.id.rfind("forest-", 0) == 0) link(f, out);
  }
  if (adjusted) {
    out << "Adjustment: " << m(adjustment_words(r.adjust.method)) << " over " << r.adjust.family_size << " contrasts"
        << (r.adjust.protects.empty() ? std::string() : "; " + m(r.adjust.protects)) << ".\n\n";
  } else {
    out << "No multiplicity adjustment: each p-value and interval holds for its own contrast only.\n\n";
  }

  out << "## Do the methods agree?\n\n";
  {
    const agreement_table t = method_agreement(r, r.options.alpha);
    if (t.split_rows > 0) {
      out << "> **The conclusion depends on the method for " << t.split_rows << " of " << t.rows.size()
          << " contrasts** (marked \xE2\x96\xB2). Read the recommended method and its reasons before deciding.\n\n";
    } else if (!t.rows.empty()) {
      out << "Every method reaches the same conclusion for every contrast at alpha " << alpha << ".\n\n";
    }
    std::vector<std::string> h = {"contrast", "conclusion"};
    for (const auto& x : t.methods) h.push_back(m(x));
    header(out, h, {false, true});
    for (const auto& rw : t.rows) {
      const bool split = rw.verdict == agreement_verdict::split;
      std::vector<std::string> cells = {(split ? "\xE2\x96\xB2 " : "") + m(rw.contrast),
                                        split ? "**depends on the method** (" + std::to_string(rw.finding) + " of " +
                                                    std::to_string(rw.available) + " find a difference)"
                                              : verdict_words(rw.verdict)};
      for (const auto& c : rw.cells) {
        cells.push_back(c.available ? (c.below_alpha ? "\xE2\x97\x8F " : "\xE2\x97\x8B ") + display_p(c.p)
                                    : "\xE2\x80\x93");
      }
      row(out, cells);
    }
    if (!t.without_result.empty()) {
      out << "\nNo p-value from ";
      for (std::size_t i = 0; i < t.without_result.size(); ++i) out << (i ? ", " : "") << m(t.without_result[i]);
      out << " (see the results above).\n";
    }
    out << "\nEach cell is the " << m(p_value_words(r)) << " of that method; \xE2\x97\x8F = below alpha " << alpha
        << " (a difference), \xE2\x97\x8B = not below, \xE2\x80\x93 = no result (the method does not apply to that "
           "contrast or could not be computed).\n\n";
  }

  out << "## All results in detail\n\n";
  {
    bool simultaneous = false;
    for (const auto& c : r.contrasts) {
      for (const auto& x : c.results) simultaneous |= x.simultaneous_low.has_value();
    }
    std::vector<std::string> h = {"contrast", "method", "estimate", percent + " interval"};
    if (simultaneous) h.push_back("adjusted interval");
    h.push_back("p-value");
    if (adjusted) h.push_back(m(adjustment_words(r.adjust.method)) + "-adjusted p");
    h.push_back("statistic (df)");
    h.push_back("SE");
    header(out, h, {false, true});
    const auto without = methods_without_results(r);
    for (const auto& c : r.contrasts) {
      for (const auto& x : c.results) {
        if (std::find_if(without.begin(), without.end(), [&](const auto& w) { return w.first == x.method; }) !=
            without.end()) {
          continue;  // listed once below the table
        }
        const bool rec = x.method == advised;
        std::vector<std::string> cells = {m(c.spec.name), rec ? "**" + m(x.method) + "** (recommended)" : m(x.method)};
        if (!computed(x)) {
          cells.push_back(m(not_computed_text(x)));
          while (cells.size() < h.size()) cells.push_back("");
          row(out, cells);
          continue;
        }
        std::string p = display_p(x.p_value);
        if (x.p_interval && !x.exact) {
          p += " (99%: " + display_p((*x.p_interval)[0]) + " to " + display_p((*x.p_interval)[1]) + ")";
        } else if (x.exact) {
          p += " (exact)";
        }
        cells.push_back(display_number(x.estimate));
        cells.push_back(interval_text(x.ci_low, x.ci_high));
        if (simultaneous) {
          cells.push_back(x.simultaneous_low && x.simultaneous_high
                              ? interval_text(*x.simultaneous_low, *x.simultaneous_high)
                              : std::string("n/a"));
        }
        cells.push_back(p);
        if (adjusted) cells.push_back(display_p(x.p_adjusted));
        std::string statistic =
            (x.statistic_name.empty() ? std::string() : m(x.statistic_name) + " = ") + display_number(x.statistic);
        if (x.df) statistic += " (" + display_df(*x.df) + ")";
        cells.push_back(statistic);
        cells.push_back(display_number(x.se));
        row(out, cells);
      }
    }
    out << '\n';
    if (!without.empty()) {
      out << "No result from:\n\n";
      for (const auto& [method, why] : without) out << "- " << m(method) << ": " << m(why) << '\n';
      out << '\n';
    }
    const auto tests = method_tests(r);
    if (!tests.empty()) {
      out << "What each method tests:\n\n";
      for (const auto& [method, words] : tests) out << "- " << m(method) << ": " << m(words) << '\n';
      out << '\n';
    }
  }
  bool any_null = false;
  for (const auto& f : figures) any_null |= f.id.rfind("null-", 0) == 0;
  if (any_null) {
    out << "## Resampling: what chance alone produces\n\n";
    out << "Each histogram shows the statistic recomputed after reshuffling or resampling the data as the null "
           "hypothesis allows; the observed value is the dark line.\n\n";
    for (const auto& f : figures) {
      if (f.id.rfind("null-", 0) == 0) link(f, out);
    }
    if (content.nulls_omitted > 0) {
      out << content.nulls_omitted << " more null distributions are not drawn, to keep the report short.\n\n";
    }
  }

  out << "## Reproduce this report\n\n";
  out << "- contrasta version: " << m(content.version) << '\n';
  out << "- seed: " << r.options.seed
      << (content.uses_seed ? "" : " (no resampling method ran; the seed does not change any number here)") << '\n';
  out << "- confidence: " << percent << "\n- alpha: " << alpha
      << "\n- alternative: " << alternative_words(r.options.side) << "\n\n";
  if (!content.command.empty()) {
    // A fence longer than any run of backticks in the command keeps it literal.
    std::size_t longest = 0, run = 0;
    for (char ch : content.command) {
      run = ch == '`' ? run + 1 : 0;
      longest = std::max(longest, run);
    }
    const std::string fence(std::max<std::size_t>(3, longest + 1), '`');
    out << fence << "sh\n" << content.command << '\n' << fence << "\n\n";
  }

  out << "## Cautions\n\n";
  for (const auto& s : report_cautions(content)) out << "- " << m(s) << '\n';
  report.markdown = out.str();
  return report;
}

}  // namespace contrasta::cli
