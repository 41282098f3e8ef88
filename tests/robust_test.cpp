// Yuen's trimmed-mean contrasts against scipy (tests/reference/robust_fixtures.py):
// scipy.stats.trim_mean, scipy.stats.mstats.winsorize + var(ddof=1), scipy.stats.ttest_ind(trim=,
// equal_var=False) for pairs, and the Yuen (1974) formula written out over those scipy pieces for
// general contrasts. Sources beside each check.
#include "contrasta/robust.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "contrasta/error.hpp"
#include "fixture.hpp"

using namespace contrasta;

namespace {
alternative side_of(const std::string& s) {
  return s == "greater" ? alternative::greater : s == "less" ? alternative::less : alternative::two_sided;
}
const fixture::value& fixtures() {
  static const fixture::value f = fixture::load("robust_fixtures");
  return f;
}
struct worst_error {
  std::string what;
  double worst = 0;
  void add(double got, double want) { worst = std::max(worst, fixture::relative_error(got, want)); }
  void add_error(double e) { worst = std::max(worst, e); }
  ~worst_error() { MESSAGE(what << ": worst relative error " << worst); }
};
constexpr double tolerance = 1e-10;  // quality.md

// Absolute floor for variances that are exactly zero in truth (a fully winsorized constant
// middle): numpy returns rounding noise of order (1e-14 max|x|)^2 there (6e-29 for data near
// 50), which no relative comparison can match; 1e-14 max|x|^2 lets 1e-12 tolerate that noise.
double variance_floor(const std::vector<double>& x) {
  double m = 1;
  for (double v : x) m = std::max(m, v * v);
  return 1e-14 * m;
}

prepared_data prepared(const std::vector<std::vector<double>>& groups, double trim) {
  std::vector<std::string> levels;
  for (std::size_t i = 0; i < groups.size(); ++i) {
    std::string level = "g";  // appended, not "g" + ...: GCC 12 -Wrestrict false positive
    level += std::to_string(i + 1);
    levels.push_back(level);
  }
  return prepare(make_dataset(levels, groups), trim);
}
}  // namespace

TEST_CASE("observations trimmed per side: floor(gamma n) of the decimal gamma") {
  // Arithmetic: floor(0.2 * 10) = 2, floor(0.25 * 7) = 1, floor(0.1 * 9) = 0.
  CHECK(trim_count(10, 0.2) == 2);
  CHECK(trim_count(7, 0.25) == 1);
  CHECK(trim_count(9, 0.1) == 0);
  CHECK(trim_count(0, 0.2) == 0);
  // 0.29 * 100 evaluates to 28.999999999999996 in binary; the user means 29. scipy's
  // int(0.29 * 100) trims 28 here (a known difference, so no scipy fixture uses such a product).
  CHECK(0.29 * 100 < 29);
  CHECK(trim_count(100, 0.29) == 29);
  CHECK(trim_count(100, 0.57 / 2) == 28);  // 0.285 * 100 = 28.5 -> 28
  CHECK_THROWS_AS(trim_count(10, 0.5), usage_error);
  CHECK_THROWS_AS(trim_count(10, -0.1), usage_error);
}

TEST_CASE("trimmed means and winsorized variances against scipy") {
  worst_error wm{"trimmed mean vs scipy.stats.trim_mean"},
      wv{"winsorized variance vs scipy.stats.mstats.winsorize + var(ddof=1)"};
  for (const auto& c : fixtures()["samples"].arr()) {
    const std::vector<double> x = c["x"].numbers();
    const trimmed_sample s = trim_sample(x, c["trim"].num());
    CHECK(s.trimmed_per_side == static_cast<std::size_t>(c["trimmed_per_side"].num()));
    wm.add(s.trimmed_mean, c["trimmed_mean"].num());
    wv.add_error(fixture::relative_error(s.winsorized_variance, c["winsorized_variance"].num(), variance_floor(x)));
    CHECK(fixture::relative_error(s.trimmed_mean, c["trimmed_mean"].num()) <= 1e-13);
    CHECK(fixture::relative_error(s.winsorized_variance, c["winsorized_variance"].num(), variance_floor(x)) <= 1e-12);
  }
}

TEST_CASE("the group summaries carry the same trimmed means and winsorized variances") {
  // The summaries (summary.cpp) must agree with the scipy references for any --trim.
  worst_error w{"group_summary trimmed_mean / winsorized_variance vs scipy"};
  for (const auto& c : fixtures()["samples"].arr()) {
    const std::vector<double> x = c["x"].numbers();
    if (x.size() < 2) continue;
    const prepared_data p = prepared({x}, c["trim"].num());
    const group_summary& g = p.groups[0];
    CHECK(g.trimmed_per_side == static_cast<std::size_t>(c["trimmed_per_side"].num()));
    w.add(g.trimmed_mean, c["trimmed_mean"].num());
    w.add_error(fixture::relative_error(g.winsorized_variance, c["winsorized_variance"].num(), variance_floor(x)));
    CHECK(fixture::relative_error(g.trimmed_mean, c["trimmed_mean"].num()) <= 1e-12);
    CHECK(fixture::relative_error(g.winsorized_variance, c["winsorized_variance"].num(), variance_floor(x)) <= 1e-12);
  }
}

namespace {
void check_yuen(const fixture::value& c, const method_result& r, worst_error& w) {
  const std::vector<std::pair<double, const char*>> fields = {
      {r.estimate, "estimate"}, {r.se, "se"},      {r.statistic, "statistic"}, {*r.df, "df"},
      {r.p_value, "p"},         {r.ci_low, "low"}, {r.ci_high, "high"}};
  for (auto [got, key] : fields) {
    const double want = c[key].num();
    w.add(got, want);
    CHECK_MESSAGE(fixture::relative_error(got, want) <= tolerance, key << ": " << got << " vs " << want);
  }
}
}  // namespace

TEST_CASE("Yuen pairs against scipy.stats.ttest_ind(trim=, equal_var=False)") {
  worst_error w{"Yuen pair (t, df, p from scipy; CI from refined t quantile) "};
  for (const auto& c : fixtures()["pairs"].arr()) {
    analysis_options o;
    o.trim = c["trim"].num();
    o.conf = c["conf"].num();
    o.side = side_of(c["alternative"].str());
    const prepared_data p = prepared({c["x"].numbers(), c["y"].numbers()}, o.trim);
    const method_result r = trimmed_contrast(p, contrast{"g1 - g2", {1, -1}, "g1 - g2"}, o);
    CHECK(r.method == "trimmed");
    CHECK(!r.null_hypothesis.empty());
    check_yuen(c, r, w);
  }
}

TEST_CASE("Yuen for general contrasts against the Yuen-Welch formula over scipy pieces") {
  worst_error w{"Yuen general contrast vs formula over scipy trim_mean/winsorize"};
  for (const auto& c : fixtures()["contrasts"].arr()) {
    analysis_options o;
    o.trim = c["trim"].num();
    o.conf = c["conf"].num();
    o.side = side_of(c["alternative"].str());
    std::vector<std::vector<double>> groups;
    for (const auto& g : c["groups"].arr()) groups.push_back(g.numbers());
    const prepared_data p = prepared(groups, o.trim);
    const method_result r = trimmed_contrast(p, contrast{"k", c["coefficients"].numbers(), "k"}, o);
    check_yuen(c, r, w);
  }
}

TEST_CASE("Yuen refuses a level left with fewer than two observations") {
  analysis_options o;
  o.trim = 0.4;
  const prepared_data p = prepared({{1, 2, 3, 4, 5}, {2, 3, 4, 5, 6, 7}}, o.trim);
  // n = 5, g = floor(0.4 * 5) = 2 leaves h = 1 (arithmetic).
  CHECK_THROWS_AS(trimmed_contrast(p, contrast{"g1 - g2", {1, -1}, "g1 - g2"}, o), analysis_error);
}

TEST_CASE("Yuen keeps full precision on data sharing many leading digits") {
  // A location shift of 1e12 leaves every location-invariant quantity unchanged (invariance),
  // provided the values are centred as the reader does; estimate gains nothing (sum c_i = 0).
  analysis_options o;
  const std::vector<double> a = {0.1, 0.4, 0.2, 0.9, 0.5, 0.3, 3.0}, b = {0.6, 0.8, 0.7, 1.1, 0.9, -2.0};
  const method_result base = trimmed_contrast(prepared({a, b}, o.trim), contrast{"g1 - g2", {1, -1}, "g1 - g2"}, o);
  dataset shifted = make_dataset({"g1", "g2"}, {a, b});
  shifted.centre = 1e12;  // the reader's centre: values stay centred, locations gain the centre
  const method_result r = trimmed_contrast(prepare(shifted, o.trim), contrast{"g1 - g2", {1, -1}, "g1 - g2"}, o);
  CHECK(r.estimate == base.estimate);
  CHECK(r.se == base.se);
  CHECK(r.p_value == base.p_value);
  // Coefficients 1, -1/3, -1/3, -1/3 sum to about 1e-17 in binary, not 0: a contrast must not
  // pick up centre * 1e-17 (that would move the estimate by 1e-5 here).
  const std::vector<double> c2 = {0.2, 0.3, 0.1, 0.5, 0.4}, c3 = {0.9, 0.6, 0.7, 0.8, 1.0};
  const contrast third{"g1 - mean(others)", {1, -1.0 / 3, -1.0 / 3, -1.0 / 3}, "g1 - (g2 + g3 + g4)/3"};
  dataset four = make_dataset({"g1", "g2", "g3", "g4"}, {a, b, c2, c3});
  const method_result plain = trimmed_contrast(prepare(four, o.trim), third, o);
  four.centre = 1e12;
  CHECK(trimmed_contrast(prepare(four, o.trim), third, o).estimate == plain.estimate);
  // A general linear combination (--allow-linear) is a location: it gains the centre back.
  analysis_options linear = o;
  linear.allow_linear = true;
  const method_result level = trimmed_contrast(prepare(shifted, o.trim), contrast{"g1", {1, 0}, "g1"}, linear);
  CHECK(level.estimate == 1e12 + trim_sample(a, o.trim).trimmed_mean);
}

TEST_CASE("Yuen uses the trim of the request even when the summaries were made for another") {
  // Same data prepared with trim 0.1 and 0.2: a request for 0.2 must give identical results
  // (the scipy-checked trim_sample path versus the summaries).
  analysis_options o;
  o.trim = 0.2;
  const std::vector<double> a = {3.1, 4.7, 2.2, 9.9, 5.0, 4.4, 3.8, 4.1, 6.0, 0.5},
                            b = {5.5, 6.1, 4.9, 7.7, 5.8, 6.6, 12.0, 5.1};
  const contrast k{"g1 - g2", {1, -1}, "g1 - g2"};
  const method_result same = trimmed_contrast(prepared({a, b}, 0.2), k, o);
  const method_result other = trimmed_contrast(prepared({a, b}, 0.1), k, o);
  CHECK(fixture::relative_error(other.estimate, same.estimate) <= 1e-15);
  CHECK(fixture::relative_error(other.se, same.se) <= 1e-14);
  CHECK(fixture::relative_error(*other.df, *same.df) <= 1e-14);
}
