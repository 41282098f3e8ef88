// The recommendation scenarios of the issue. Data are built from normal scores
// Phi^-1((i - 3/8)/(n + 1/4)) (Blom 1958) so that each scenario has exactly the shape it claims
// (no chance outliers, no chance skew) and the expected outcome follows from the documented
// rule set (docs/diagnostics.md) and its sources.
#include "contrasta/recommend.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <boost/math/distributions/normal.hpp>
#include <cmath>
#include <string>
#include <vector>

#include "contrasta/error.hpp"
#include "contrasta/methods.hpp"

using namespace contrasta;

namespace {

std::vector<double> normal_scores(std::size_t n, double mean, double sd) {
  boost::math::normal standard;
  std::vector<double> out;
  for (std::size_t i = 1; i <= n; ++i)
    out.push_back(mean + sd * boost::math::quantile(
                                  standard, (static_cast<double>(i) - 0.375) / (static_cast<double>(n) + 0.25)));
  return out;
}

prepared_data prepared_of(const std::vector<std::vector<double>>& groups) {
  std::vector<std::string> levels;
  for (std::size_t i = 0; i < groups.size(); ++i) levels.push_back(std::string(1, static_cast<char>('a' + i)));
  return prepare(make_dataset(levels, groups));
}

bool fired(const recommendation& r, const std::string& rule) {
  return std::find(r.rules.begin(), r.rules.end(), rule) != r.rules.end();
}

bool mentions(const recommendation& r, const std::string& words) {
  for (auto& s : r.reasons)
    if (s.find(words) != std::string::npos) return true;
  for (auto& s : r.notes)
    if (s.find(words) != std::string::npos) return true;
  return false;
}

bool has_alternative(const recommendation& r, const std::string& m) {
  return std::find(r.alternatives.begin(), r.alternatives.end(), m) != r.alternatives.end();
}

bool available(const std::string& method) {
  const auto p = prepared_of({{1, 2, 3, 4.5}, {2, 3.5, 5, 7, 8}});
  contrast c{"b - a", {-1, 1}, "b - a"};
  try {
    (void)run_method(method, p, c, analysis_options{});
    return true;
  } catch (const analysis_error&) {
    return false;
  }
}

// Every reason carries its measured number (the requirement).
void check_reasons_have_numbers(const recommendation& r) {
  for (auto& s : r.reasons) {
    INFO(s);
    CHECK(std::any_of(s.begin(), s.end(), [](char c) { return c >= '0' && c <= '9'; }));
  }
}

}  // namespace

TEST_CASE("strong heteroscedasticity with unbalanced n: Welch, and pooled t named as liberal") {
  // SD 4 in the group of 6, SD 1 in the groups of 30: the larger variance in the smaller group,
  // where pooled t rejects too often (Box 1954).
  const auto p = prepared_of({normal_scores(6, 10, 4), normal_scores(30, 10, 1), normal_scores(30, 11, 1)});
  const auto r = recommend(p, analysis_options{});
  CHECK(r.method == "welch");
  CHECK(r.interval_method == "welch");
  CHECK(fired(r, "R4 default"));
  CHECK(fired(r, "S1 unequal variances"));
  CHECK(mentions(r, "pooled t rejects too often"));
  CHECK(mentions(r, "SD ratio 3.8"));  // sample SDs 3.66 and 0.973 of the normal scores
  CHECK(!has_alternative(r, "pooled"));
  check_reasons_have_numbers(r);
}

TEST_CASE("balanced homogeneous normal: Welch by default, pooled worth reading") {
  const auto p = prepared_of({normal_scores(12, 5, 1), normal_scores(12, 6, 1.1), normal_scores(12, 5.5, 0.95)});
  const auto r = recommend(p, analysis_options{});
  CHECK(r.method == "welch");  // Delacre, Lakens & Leys 2017: Welch loses little here
  CHECK(fired(r, "S2 balanced and homogeneous"));
  CHECK(has_alternative(r, "pooled"));
  CHECK(mentions(r, "Delacre"));
  check_reasons_have_numbers(r);
}

TEST_CASE("gross outliers: trimmed means, with the outlier's row") {
  auto b = normal_scores(15, 20.3, 2);
  b[7] = 60;  // the 8th value of level b: row 2 + 15 + 7 = 24 in make_dataset's numbering
  const auto p = prepared_of({normal_scores(15, 20, 2.1), b, normal_scores(15, 21, 1.9)});
  const auto r = recommend(p, analysis_options{});
  CHECK(fired(r, "R3 heavy tails or outliers"));
  CHECK(mentions(r, "row 24"));
  if (available("trimmed"))
    CHECK(r.method == "trimmed");
  else
    CHECK(mentions(r, "not available in this build"));
  check_reasons_have_numbers(r);
}

TEST_CASE("a 0-10 panel scale with ties: the rank method") {
  // Panel scores on 0-10: whole numbers, heavily tied.
  const std::vector<double> a = {6, 7, 7, 8, 5, 6, 7, 9, 6, 7, 8, 7, 6, 5, 8};
  const std::vector<double> b = {4, 5, 5, 6, 3, 5, 6, 4, 5, 7, 5, 4, 6, 5, 5};
  const std::vector<double> c = {7, 8, 8, 9, 10, 7, 8, 9, 8, 6, 9, 8, 7, 8, 9};
  const auto p = prepared_of({a, b, c});
  const auto r = recommend(p, analysis_options{});
  CHECK(fired(r, "R2 ties and discrete scale"));
  CHECK(mentions(r, "whole numbers from 3 to 10"));
  if (available("rank"))
    CHECK(r.method == "rank");
  else
    CHECK(mentions(r, "not available in this build"));
  check_reasons_have_numbers(r);
}

TEST_CASE("finely rounded measurements keep the means even with many ties") {
  // Three levels of 60 values rounded to 0.1 g: 90% of values tied, but 75 distinct values, so the
  // discrete-scale rule R2 (at most 21 distinct values) stays silent.
  std::vector<std::vector<double>> groups;
  for (double mean : {50.0, 50.5, 51.0}) {
    auto g = normal_scores(60, mean, 2);
    for (double& v : g) v = std::round(v * 10) / 10;
    groups.push_back(g);
  }
  const auto p = prepared_of(groups);
  const auto d = diagnose(p);
  INFO("distinct " << d.ties.distinct_values << ", tied share " << d.ties.tied_share);
  CHECK(d.ties.distinct_values > 21);
  CHECK(d.ties.tied_share > 0.3);
  const auto r = recommend(p, d, nullptr, analysis_options{});
  CHECK(!fired(r, "R2 ties and discrete scale"));
  CHECK(r.method == "welch");
}

TEST_CASE("one tiny group: permutation") {
  const auto p = prepared_of({normal_scores(3, 10, 1), normal_scores(20, 10, 1), normal_scores(20, 12, 1)});
  const auto r = recommend(p, analysis_options{});
  CHECK(fired(r, "R1 tiny groups"));
  CHECK(mentions(r, "n = 3"));
  if (available("permutation"))
    CHECK(r.method == "permutation");
  else
    CHECK(mentions(r, "not available in this build"));
  CHECK(r.interval_method == "welch");
  // A group of one has no variance of its own: only pooled can run.
  const auto q = prepared_of({{4.0}, normal_scores(10, 5, 1)});
  CHECK(recommend(q, analysis_options{}).method == "pooled");
}

TEST_CASE("a variance test p-value alone does not gate the choice (Zimmerman 2004)") {
  // n = 400 per group, SDs 1 and 1.25: Brown-Forsythe detects the difference (p < 0.01) while the
  // SD ratio is modest and the groups balanced: the choice rests on the SD ratio, not on p.
  const auto p = prepared_of({normal_scores(400, 0, 1), normal_scores(400, 0, 1.25)});
  const auto d = diagnose(p);
  double levene_p = 1;
  for (auto& v : d.variance)
    if (v.test == "levene-median") levene_p = v.p_value;
  REQUIRE(levene_p < 0.01);
  const auto r = recommend(p, d, nullptr, analysis_options{});
  CHECK(r.method == "welch");
  CHECK(!fired(r, "S1 unequal variances"));
  CHECK(mentions(r, "not used as a gate"));
}

TEST_CASE("calibration overrides a primary method that is liberal on this design") {
  const auto p = prepared_of({normal_scores(12, 5, 1), normal_scores(12, 6, 1.1)});
  calibration_report c;
  auto row = [](const std::string& m, double t1, double se) {
    calibration_row r;
    r.method = m;
    r.model = "normal";
    r.alpha = 0.05;
    r.datasets = 4000;
    r.contrasts = 1;
    r.type1_error = t1;
    r.type1_se = se;
    return r;
  };
  c.rows = {row("pooled", 0.21, 0.006), row("welch", 0.12, 0.005), row("trimmed", 0.052, 0.0035)};
  const auto r = recommend(p, diagnose(p), &c, analysis_options{});
  CHECK(fired(r, "C1 calibration"));
  CHECK(mentions(r, "welch rejected 12.0%"));
  if (available("trimmed")) {
    CHECK(r.method == "trimmed");
    CHECK(has_alternative(r, "welch"));
    CHECK(mentions(r, "within 0.2 percentage points of alpha 0.05"));
  }
  check_reasons_have_numbers(r);
  // Welch holding alpha keeps Welch, with the figure stated.
  c.rows = {row("pooled", 0.21, 0.006), row("welch", 0.051, 0.0035)};
  const auto kept = recommend(p, diagnose(p), &c, analysis_options{});
  CHECK(kept.method == "welch");
  CHECK(mentions(kept, "welch rejected 5.1%"));
  CHECK(mentions(kept, "pooled rejected 21.0%"));
}
