// The report writers: SVG drawing helpers, the method-agreement table, the self-contained HTML
// report and the Markdown report (golden file). The example comparison below is built by hand
// so that these tests do not depend on the engine; its numbers were computed with Debian's
// scipy 1.10.1 and statsmodels 0.13.5 (scipy.stats t-based pooled and Welch contrasts,
// statsmodels multipletests(method="holm"), scipy.stats.f_oneway, scipy.stats.levene
// (center="median")), so the golden Markdown file reads as a true analysis of the data.
#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <regex>
#include <sstream>

#include "cli/agreement.hpp"
#include "cli/report_text.hpp"
#include "cli/svg.hpp"
#include "cli/write_html.hpp"
#include "cli/write_report_markdown.hpp"
#include "contrasta/contrast.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/resample.hpp"

using namespace contrasta;
using namespace contrasta::cli;

namespace {

const std::string script_level = "<script>alert(1)</script>";

group_summary summary(std::string level, std::size_t n, double mean, double sd, double median, double trimmed,
                      double min, double max) {
  group_summary g;
  g.level = std::move(level);
  g.n = n;
  g.mean = g.centred_mean = mean;
  g.sd = sd;
  g.variance = sd * sd;
  g.median = g.centred_median = median;
  g.trimmed_mean = g.centred_trimmed_mean = trimmed;
  g.min = min;
  g.max = max;
  return g;
}

method_result t_result(std::string method, double estimate, double se, double t, double df, double p, double p_adjusted,
                       double low, double high) {
  method_result r;
  r.method = std::move(method);
  r.estimand = "mean contrast";
  r.estimate = estimate;
  r.se = se;
  r.statistic_name = "t";
  r.statistic = t;
  r.df = df;
  r.p_value = p;
  r.p_adjusted = p_adjusted;
  r.ci_low = low;
  r.ci_high = high;
  r.null_hypothesis = r.method == "pooled" ? "the contrast of means is 0 (equal variances assumed)"
                                           : "the contrast of means is 0 (variances may differ)";
  return r;
}

contrast_result pair(std::string name, std::vector<double> coefficients, double estimate,
                     std::vector<method_result> results) {
  contrast_result c;
  c.spec.name = name;
  c.spec.expression = std::move(name);
  c.spec.coefficients = std::move(coefficients);
  c.estimate = estimate;
  c.results = std::move(results);
  return c;
}

// An invented lettuce trial: head weight (kg per plot) of six, six and five plots per treatment.
report_content example_content() {
  const std::vector<std::vector<double>> values = {
      {21.3, 19.8, 22.5, 20.1, 18.9, 21.7}, {24.6, 26.1, 23.8, 27.4, 25.0, 31.9}, {22.0, 23.1, 21.4, 24.2, 22.8}};
  report_content content;
  comparison& r = content.result;
  dataset& d = r.prepared.data;
  d.source = "plots <2026>.csv";
  d.group_column = "treatment";
  d.response = "head weight";
  d.levels = {"control", "compost", script_level};
  d.offsets = {0};
  std::uint64_t row = 2;
  for (const auto& g : values) {
    for (double v : g) {
      d.values.push_back(v);
      d.rows.push_back(row++);
    }
    d.offsets.push_back(d.values.size());
  }
  d.missing = {0, 1, 0};
  // scipy: numpy mean/std(ddof=1)/median, scipy.stats.trim_mean(x, 0.2).
  r.prepared.groups = {summary("control", 6, 20.716666666666665, 1.342261772780059, 20.7, 20.725, 18.9, 22.5),
                       summary("compost", 6, 26.46666666666667, 2.941881484129954, 25.55, 25.775, 23.8, 31.9),
                       summary(script_level, 5, 22.7, 1.0723805294763613, 22.8, 22.633333333333336, 21.4, 24.2)};
  r.prepared.groups[1].n_missing = 1;
  // scipy.stats.f_oneway and the sums of squares.
  anova_table& a = r.prepared.anova;
  a.f = 12.551590591406658;
  a.p_value = 0.000754069921866242;
  a.df_between = 2;
  a.df_within = 14;
  a.ss_between = 101.99362745098043;
  a.ss_within = 56.88166666666664;
  a.residual_sd = 2.0156825619318606;
  a.r_squared = 0.6419728631655858;
  r.methods = {"pooled", "welch"};
  r.advice.method = "welch";
  r.advice.interval_method = "welch";
  r.advice.reasons = {"largest SD / smallest SD = 2.74 (above 2): variances differ",
                      "the group with the largest SD is not the largest group (n = 6, 6, 5)"};
  r.advice.alternatives = {"trimmed", "permutation"};
  overall_test welch_f;
  welch_f.test = "anova-f";
  welch_f.statistic = a.f;
  welch_f.df1 = 2;
  welch_f.df2 = 14;
  welch_f.p_value = a.p_value;
  welch_f.null_hypothesis = "all level means are equal";
  r.overall = {welch_f};
  // t-based pooled and Welch contrasts (scipy.stats.t), Holm adjustment over the three
  // contrasts per method (statsmodels multipletests).
  r.contrasts = {
      pair("compost - control", {-1, 1, 0}, 5.7500000000000036,
           {t_result("pooled", 5.7500000000000036, 1.1637548697321942, 4.9409030626210875, 14, 0.00021709261230175398,
                     0.0006512778369052619, 3.2539940473998956, 8.246005952600111),
            t_result("welch", 5.7500000000000036, 1.3201220482297162, 4.355657878535363, 6.995261998087561,
                     0.0033371269027674707, 0.010011380708302412, 2.62797873183058, 8.872021268169426)}),
      pair("[" + script_level + "] - control", {-1, 0, 1}, 1.9833333333333343,
           {t_result("pooled", 1.9833333333333343, 1.2205564044762274, 1.6249419740535747, 14, 0.12646720526093147,
                     0.12646720526093147, -0.634499794839027, 4.601166461505695),
            t_result("welch", 1.9833333333333343, 0.7282017424984494, 2.723604212382886, 8.99582136328023,
                     0.023478563859855316, 0.04695712771971063, 0.33590989638328206, 3.6307567702833863)}),
      pair("compost - [" + script_level + "]", {0, 1, -1}, 3.7666666666666693,
           {t_result("pooled", 3.7666666666666693, 1.2205564044762274, 3.0860242532446045, 14, 0.008052834359956278,
                     0.016105668719912557, 1.148833538494308, 6.38449979483903),
            t_result("welch", 3.7666666666666693, 1.2932302364406902, 2.912603309549525, 6.5145990231933135,
                     0.02447450479075598, 0.04695712771971063, 0.6618615964987002, 6.871471736834638)}),
  };
  r.adjust.method = "holm";
  r.adjust.family_size = 3;
  r.adjust.protects = "familywise error rate over the 3 contrasts, per method";
  r.options.seed = 20261201;

  // Mean intervals: scipy.stats.t.ppf(0.975, n - 1) * sd / sqrt(n) around each mean.
  const double mean_low[] = {19.308049323705152, 23.379351387695497, 21.36846370417451};
  const double mean_high[] = {22.125284009628178, 29.55398194563784, 24.03153629582549};
  for (std::size_t i = 0; i < values.size(); ++i) {
    report_level l;
    l.values = values[i];
    for (std::size_t j = 0; j < values[i].size(); ++j) l.rows.push_back(d.group_rows(i)[j]);
    l.outlier.assign(values[i].size(), false);
    l.mean_low = mean_low[i];
    l.mean_high = mean_high[i];
    content.levels.push_back(std::move(l));
  }
  // The compost plot at 31.9 has robust z = 0.6745 (31.9 - 25.55) / 0.95 = 4.51 with
  // MAD = median |x - 25.55| = 0.95 (by hand; Iglewicz & Hoaglin's flag is abs > 3.5).
  content.levels[1].outlier[5] = true;
  content.outliers = {{"compost", 13, 31.9, 4.508631578947368}};
  content.diagnostics_available = true;
  content.variance_tests = {{"levene-median", "", 1.1421203155959412, 2.0, 14.0, 0.3471551966257887}};
  content.diagnostic_facts = {"largest SD / smallest SD = 2.74", "group sizes 6, 6, 5"};
  content.version = "0.1.0";
  content.command =
      "contrasta report 'plots <2026>.csv' --group treatment --response 'head weight' "
      "--method pooled,welch --adjust holm --seed 20261201 -o report.html";
  return content;
}

std::size_t count(const std::string& text, const std::string& what) {
  std::size_t n = 0;
  for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
  return n;
}

// Every element opened inside each <svg> ... </svg> is closed again in order (a small
// well-formedness check; the browser test parses the real thing).
void check_balanced(const std::string& xml) {
  static const std::regex tag(R"(<(/?)([a-zA-Z][a-zA-Z0-9-]*)[^>]*?(/?)>)");
  std::vector<std::string> open;
  for (auto it = std::sregex_iterator(xml.begin(), xml.end(), tag); it != std::sregex_iterator(); ++it) {
    const auto& m = *it;
    if (m[3].length()) continue;  // self-closing
    if (m[1].length()) {
      REQUIRE_FALSE(open.empty());
      CHECK(open.back() == m[2].str());
      open.pop_back();
    } else {
      open.push_back(m[2].str());
    }
  }
  CHECK(open.empty());
}

}  // namespace

TEST_CASE("text: escaping of user data for XML/HTML and Markdown") {
  CHECK(xml_escape(script_level) == "&lt;script&gt;alert(1)&lt;/script&gt;");
  CHECK(xml_escape("a & \"b\" 'c'") == "a &amp; &quot;b&quot; &#39;c&#39;");
  CHECK(xml_escape(std::string("x\x01y")) == "x\xEF\xBF\xBDy");  // XML 1.0 forbids C0 controls
  CHECK(markdown_text("a|b *c* [d](e) <f>") == "a\\|b \\*c\\* \\[d\\](e) &lt;f&gt;");
}

TEST_CASE("text: numbers for reading") {
  CHECK(display_number(5.7500000000000036) == "5.750");
  CHECK(display_number(-0.634499794839027) == "-0.6345");
  CHECK(display_number(1234.5678) == "1235");
  CHECK(display_number(-0.00001) == "-1.000e-05");
  CHECK(display_number(2.5e7) == "2.500e+07");
  CHECK(display_number(-0.00004, 1) == "-4e-05");
  CHECK(display_number(0) == "0");
  CHECK(display_number(not_available) == "n/a");
  CHECK(fixed_decimals(-0.0001, 2) == "0.00");  // no "-0.00"
  CHECK(display_p(0.00021709261230175398) == "0.000217");
  CHECK(display_p(0.04695712771971063) == "0.0470");
  CHECK(display_p(3e-9) == "< 0.0001");
  CHECK(display_p(1.0) == "1.00");
  CHECK(shell_quote("plots <2026>.csv") == "'plots <2026>.csv'");
  CHECK(shell_quote("it's") == "'it'\\''s'");
  CHECK(shell_quote("data/a.csv") == "data/a.csv");
  // RFC 3986 unreserved characters stay; the rest is %XX (UTF-8 bytes one by one).
  CHECK(percent_encode("lettuce report-observations.svg") == "lettuce%20report-observations.svg");
  CHECK(percent_encode("a(b)<c>\xC3\xA9") == "a%28b%29%3Cc%3E%C3%A9");
}

TEST_CASE("svg: nice axis ticks follow Heckbert's 1-2-5 steps") {
  // Worked by hand from Heckbert (Graphics Gems, 1990): range 9.57 -> nice 10, step
  // nice(10 / 5) = 2, bounds floor(0.13 / 2) * 2 = 0 and ceil(9.7 / 2) * 2 = 10.
  svg::axis a = svg::nice_axis(0.13, 9.7, 6);
  CHECK(a.step == doctest::Approx(2));
  REQUIRE(a.ticks.size() == 6);
  CHECK(a.ticks.front() == 0);
  CHECK(a.ticks.back() == doctest::Approx(10));
  CHECK(a.decimals == 0);
  // range 0.0387 -> nice 0.05, step nice(0.01) = 0.01: from -0.02 to 0.03, two decimals.
  a = svg::nice_axis(-0.0153, 0.0234, 6);
  CHECK(a.step == doctest::Approx(0.01));
  CHECK(a.ticks.front() == doctest::Approx(-0.02));
  CHECK(a.ticks.back() == doctest::Approx(0.03));
  CHECK(a.decimals == 2);
  CHECK(std::count(a.ticks.begin(), a.ticks.end(), 0.0) == 1);  // exact zero, not 1e-18
  // Data with many constant leading digits (as NIST StRD SmLs07-09, 1000000000000.4): range
  // 0.3 -> nice 0.5, step 0.1, from 1000000000000.1 to 1000000000000.4.
  a = svg::nice_axis(1e12 + 0.1, 1e12 + 0.4, 6);
  CHECK(a.step == doctest::Approx(0.1));
  CHECK(a.ticks.size() == 4);
  CHECK(a.decimals == 1);
  // Degenerate inputs still give a usable axis.
  a = svg::nice_axis(-1e308, 1e308, 6);
  CHECK(a.ticks.size() == 2);
  a = svg::nice_axis(5, 5, 6);
  CHECK(a.low < 5);
  CHECK(a.high > 5);
  a = svg::nice_axis(not_available, not_available, 6);
  CHECK(a.ticks.size() >= 2);
}

TEST_CASE("svg: jitter is deterministic, bounded and spread out") {
  CHECK(svg::jitter(2, 7) == svg::jitter(2, 7));
  CHECK(svg::jitter(2, 7) != svg::jitter(2, 8));
  CHECK(svg::jitter(2, 7) != svg::jitter(3, 7));
  double sum = 0, low = 1, high = -1;
  for (std::uint64_t i = 0; i < 10000; ++i) {
    const double j = svg::jitter(1, i);
    REQUIRE(j >= -1);
    REQUIRE(j <= 1);
    sum += j;
    low = std::min(low, j);
    high = std::max(high, j);
  }
  // A uniform offset on [-1, 1] has mean 0 and SD 0.577: the mean of 10000 lies within
  // 5 standard errors (0.029) of 0.
  CHECK(std::fabs(sum / 10000) < 0.029);
  CHECK(low < -0.99);
  CHECK(high > 0.99);
}

TEST_CASE("svg: plots label their marks and escape user text") {
  svg::observation_plot_input in;
  in.response = "weight & size";
  svg::group_points g;
  g.level = script_level;
  g.values = {1, 2, 3, 10};
  g.rows = {2, 3, 4, 5};
  g.outlier = {false, false, false, true};
  g.mean = 4;
  g.mean_low = -1;
  g.mean_high = 9;
  g.median = 2.5;
  in.groups = {g};
  const std::string s = svg::observation_plot(in);
  CHECK(s.find("<script") == std::string::npos);
  CHECK(s.find("&lt;script&gt;alert(1)&lt;/script&gt;") != std::string::npos);
  CHECK(s.find("weight &amp; size") != std::string::npos);
  CHECK(s.find("row 5") != std::string::npos);  // the outlier carries its row
  CHECK(s.find("flagged outlier") != std::string::npos);
  CHECK(s.find("mean 4.000") != std::string::npos);
  CHECK(s.find("median 2.500") != std::string::npos);
  CHECK(s.find("xmlns") == std::string::npos);  // inline SVG in HTML needs none
  CHECK(count(s, "<circle") >= 5);              // four points and the outlier ring (legend too)
  check_balanced(s);
  in.standalone = true;
  CHECK(svg::observation_plot(in).find("xmlns=\"http://www.w3.org/2000/svg\"") != std::string::npos);
  CHECK(svg::observation_plot(in) == svg::observation_plot(in));  // deterministic

  // Long tick labels are thinned so that they cannot overlap: six ticks (step 0.2) of 15
  // characters, about 87 px apart, leave room for every second label only: 3 of 6 shown.
  svg::observation_plot_input wide;
  wide.response = "mass";
  svg::group_points big;
  big.level = "a";
  big.values = {1e12 + 0.01, 1e12 + 0.99};
  big.mean = big.mean_low = big.mean_high = big.median = 1e12 + 0.5;
  wide.groups = {big};
  const std::string ws = svg::observation_plot(wide);
  CHECK(count(ws, ">1000000000000.") == 3);

  svg::histogram_input h;
  h.title = "t of " + script_level;
  h.statistic_name = "t";
  for (int i = 0; i < 1000; ++i) h.statistics.push_back(svg::jitter(9, static_cast<std::uint64_t>(i)) * 3);
  h.observed = 2.4;
  h.p_text = "0.0123";
  const std::string hs = svg::null_histogram(h);
  CHECK(hs.find("observed t = 2.400") != std::string::npos);
  CHECK(hs.find("(p 0.0123)") != std::string::npos);
  CHECK(hs.find("<script") == std::string::npos);
  check_balanced(hs);
}

TEST_CASE("agreement: conclusions at alpha, and a mark where they differ") {
  const report_content content = example_content();
  const agreement_table t = method_agreement(content.result, 0.05);
  REQUIRE(t.methods == std::vector<std::string>{"pooled", "welch"});
  REQUIRE(t.rows.size() == 3);
  // Holm-adjusted p (statsmodels): pooled 0.00065 / welch 0.0100 -> both find a difference.
  CHECK(t.rows[0].verdict == agreement_verdict::all_find);
  // pooled 0.126 against welch 0.0470: the finding depends on the method.
  CHECK(t.rows[1].verdict == agreement_verdict::split);
  CHECK(t.rows[1].finding == 1);
  CHECK(t.split_rows == 1);
  // At alpha 0.01 the third contrast (0.0161 and 0.0470) is found by neither.
  CHECK(method_agreement(content.result, 0.01).rows[2].verdict == agreement_verdict::none_find);

  std::ostringstream text;
  write_agreement_text(text, content.result, 0.05);
  const std::string s = text.str();
  CHECK(s.find("Holm-adjusted p") != std::string::npos);
  CHECK(s.find("DEPENDS ON METHOD (1 of 2)") != std::string::npos);
  CHECK(s.find("! [" + script_level + "] - control") != std::string::npos);
  CHECK(s.find("0.1265") != std::string::npos);
  CHECK(s.find("0.0470 *") != std::string::npos);
  CHECK(s.find("1 of 3 contrasts reach a different conclusion") != std::string::npos);

  // A method that did not run on a contrast is shown as not applying, not as a conclusion.
  report_content partial = example_content();
  partial.result.methods.push_back("brunner-munzel");
  method_result bm;
  bm.method = "brunner-munzel";
  bm.p_value = bm.p_adjusted = 0.5;
  partial.result.contrasts[0].results.push_back(bm);
  const agreement_table p = method_agreement(partial.result, 0.05);
  CHECK(p.rows[0].verdict == agreement_verdict::split);
  CHECK_FALSE(p.rows[1].cells[2].available);
  CHECK(p.rows[1].available == 2);
}

TEST_CASE("html: self-contained, complete and escaped") {
  const report_content content = example_content();
  std::ostringstream out;
  write_html_report(out, content);
  const std::string html = out.str();
  if (const char* sample = std::getenv("CONTRASTA_WRITE_SAMPLE")) std::ofstream(sample) << html;

  CHECK(html.rfind("<!DOCTYPE html>", 0) == 0);
  CHECK(count(html, "<svg") >= 2);  // observations and forest plot
  CHECK(html.find("id=\"figure-observations\"") != std::string::npos);
  CHECK(html.find("id=\"figure-forest-data\"") != std::string::npos);
  CHECK(html.find("<table class=\"groups\">") != std::string::npos);
  CHECK(html.find("<table class=\"results\">") != std::string::npos);
  CHECK(html.find("<table class=\"agreement\">") != std::string::npos);
  CHECK(html.find("<tr class=\"split\">") != std::string::npos);
  // No external reference of any kind, and nothing that runs.
  for (const char* bad : {"http:", "https:", "src=", "url(", "<script", "@import", "<link", "javascript:"}) {
    INFO(bad);
    CHECK(html.find(bad) == std::string::npos);
  }
  // The level named <script>alert(1)</script> (and the file name) render as text.
  CHECK(html.find("&lt;script&gt;alert(1)&lt;/script&gt;") != std::string::npos);
  CHECK(html.find("plots &lt;2026&gt;.csv") != std::string::npos);
  // Every contrast name and every estimate, interval end and p-value appears.
  for (const auto& c : content.result.contrasts) {
    CHECK(html.find(xml_escape(c.spec.name)) != std::string::npos);
    for (const auto& m : c.results) {
      for (double v : {m.estimate, m.se, m.statistic, m.ci_low, m.ci_high}) {
        INFO(c.spec.name, " ", m.method, " ", v);
        CHECK(html.find(display_number(v)) != std::string::npos);
      }
      CHECK(html.find(xml_escape(display_p(m.p_value))) != std::string::npos);
      CHECK(html.find(xml_escape(display_p(m.p_adjusted))) != std::string::npos);
    }
  }
  CHECK(html.find("seed</dt><dd>20261201") != std::string::npos);
  CHECK(html.find("--seed 20261201") != std::string::npos);
  CHECK(html.find("A p-value is not an effect size") != std::string::npos);
  CHECK(html.find("largest SD / smallest SD = 2.74") != std::string::npos);
  CHECK(html.find("compost row 13 (31.90, robust z 4.51)") != std::string::npos);
  // Every <svg> is well formed.
  for (auto at = html.find("<svg"); at != std::string::npos; at = html.find("<svg", at + 1)) {
    const auto end = html.find("</svg>", at);
    REQUIRE(end != std::string::npos);
    check_balanced(html.substr(at, end + 6 - at));
  }
}

TEST_CASE("html: simultaneous intervals are drawn behind the plain ones and tabled") {
  report_content content = example_content();
  // Bonferroni-type simultaneous interval for the first Welch result: estimate +- t(1 - 0.05/6,
  // 6.995) SE with t = 3.128176 (scipy.stats.t.ppf(1 - 0.05/6, 6.995261998087561)).
  method_result& w = content.result.contrasts[0].results[1];
  w.simultaneous_low = 5.7500000000000036 - 3.128176473340532 * 1.3201220482297162;
  w.simultaneous_high = 5.7500000000000036 + 3.128176473340532 * 1.3201220482297162;
  std::ostringstream out;
  write_html_report(out, content);
  const std::string html = out.str();
  CHECK(html.find("Holm-adjusted interval (holds for all contrasts together)") != std::string::npos);
  CHECK(html.find("<th>adjusted interval</th>") != std::string::npos);
  CHECK(html.find(display_number(*w.simultaneous_low) + " to " + display_number(*w.simultaneous_high)) !=
        std::string::npos);
  // The headline then quotes the adjusted interval, which matches the adjusted p-value.
  CHECK(html.find("Holm-adjusted 95% interval " + display_number(*w.simultaneous_low)) != std::string::npos);
  if (const char* sample = std::getenv("CONTRASTA_WRITE_SAMPLE_ADJUSTED")) std::ofstream(sample) << html;
}

TEST_CASE("html: null distributions of resampling methods get histograms") {
  report_content content = example_content();
  report_null n;
  n.contrast = "compost - control";
  n.method = "permutation";
  n.statistic_name = "t";
  for (int i = 0; i < 999; ++i) n.statistics.push_back(svg::jitter(4, static_cast<std::uint64_t>(i)) * 2.5);
  n.observed = 4.355657878535363;
  n.p_value = 0.002;
  n.resamples = 999;
  content.nulls = {n};
  content.uses_seed = true;
  std::ostringstream out;
  write_html_report(out, content);
  const std::string html = out.str();
  CHECK(html.find("id=\"figure-null-1\"") != std::string::npos);
  CHECK(html.find("observed t = 4.356") != std::string::npos);
  CHECK(html.find("999 resamples") != std::string::npos);
  CHECK(html.find("depend on the seed") != std::string::npos);
}

TEST_CASE("markdown: matches the golden file and links its SVG figures") {
  const report_content content = example_content();
  const markdown_report md = write_markdown_report(content, "lettuce report");
  const std::string golden_path = std::string(CONTRASTA_TEST_DATA) + "/report_golden.md";
  if (std::getenv("CONTRASTA_UPDATE_GOLDEN")) {
    std::ofstream(golden_path, std::ios::binary) << md.markdown;
  }
  std::ifstream in(golden_path, std::ios::binary);
  REQUIRE(in.good());
  std::stringstream golden;
  golden << in.rdbuf();
  CHECK(md.markdown == golden.str());

  REQUIRE(md.figures.size() == 2);
  CHECK(md.figures[0].first == "lettuce report-observations.svg");
  CHECK(md.figures[1].first == "lettuce report-forest-data.svg");
  for (const auto& [name, svg_text] : md.figures) {
    CHECK(md.markdown.find("](" + percent_encode(name) + ")") != std::string::npos);
    CHECK(svg_text.find("xmlns=\"http://www.w3.org/2000/svg\"") != std::string::npos);
    check_balanced(svg_text);
  }
  // Raw HTML passes through Markdown renderers: the level name must arrive escaped.
  CHECK(md.markdown.find("<script") == std::string::npos);
  CHECK(md.markdown.find("&lt;script&gt;alert(1)&lt;/script&gt;") != std::string::npos);
}

TEST_CASE("null histogram input: the resampled statistics behind the permutation p-value") {
  // The report draws the engine's joint permutation statistics of one contrast. For 5 + 5
  // observations every one of the 252 reassignments is enumerated, and the share at least as
  // extreme as the observed Welch t is scipy's exact p: scipy.stats.permutation_test((b, a),
  // |Welch t|, permutation_type="independent", n_resamples=inf, alternative="greater") gives
  // p = 0.015873015873015872 (= 4/252) and t = 3.826666993832902 (scipy.stats.ttest_ind,
  // equal_var=False), scipy 1.10.1.
  const prepared_data p =
      prepare(make_dataset({"a", "b"}, {{12.1, 13.4, 11.8, 14.2, 12.9}, {14.8, 15.1, 13.9, 16.3, 15.7}}, "yield"));
  const contrast c = parse_contrast("b - a", p.data.levels);
  analysis_options o;
  o.seed = 1;
  const joint_resampling joint = joint_permutation_statistics(p, std::span<const contrast>(&c, 1), o);
  REQUIRE(joint.exact);
  REQUIRE(joint.resamples == 252);
  REQUIRE(joint.observed.size() == 1);
  CHECK(joint.observed[0] == doctest::Approx(3.826666993832902).epsilon(1e-12));
  std::size_t extreme = 0;
  for (double t : joint.statistics) extreme += std::fabs(t) >= std::fabs(joint.observed[0]) * (1 - 1e-12);
  CHECK(static_cast<double>(extreme) / 252.0 == doctest::Approx(0.015873015873015872).epsilon(1e-12));
}
