// Rank methods against outside references: scipy.stats (mannwhitneyu, brunnermunzel, rankdata,
// norm, permutation_test) through tests/reference/rank_fixtures.py, a brute-force median of
// pairwise differences, published examples and tables (sources beside each check).
#include "contrasta/rank.hpp"

#include <doctest/doctest.h>

#include <cstdlib>

#include <algorithm>
#include <cmath>
#include <limits>
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
  static const fixture::value f = fixture::load("rank_fixtures");
  return f;
}
// Tracks the worst relative error of each comparison, printed for bench/RESULTS.md.
struct worst_error {
  std::string what;
  double worst = 0;
  void add(double got, double want) { worst = std::max(worst, fixture::relative_error(got, want)); }
  ~worst_error() { MESSAGE(what << ": worst relative error " << worst); }
};
constexpr double tolerance = 1e-10;  // quality.md: relative 1e-10 against scipy
}  // namespace

TEST_CASE("mid-ranks and ties") {
  // scipy.stats.rankdata documentation example: rankdata([0, 2, 3, 2]) = [1, 2.5, 4, 2.5].
  const std::vector<double> x = {0, 2, 3, 2};
  CHECK(midranks(x) == std::vector<double>{1, 2.5, 4, 2.5});
  // Ties: the values 2 twice, 0 and 3 once; sum t^3 - t = 6 (arithmetic).
  CHECK(tie_counts(x) == std::vector<std::size_t>{1, 2, 1});
  CHECK(tie_term(x) == 6);
  // All equal: every mid-rank is (n+1)/2 (definition of the mid-rank).
  const std::vector<double> same(5, 3.0);
  CHECK(midranks(same) == std::vector<double>(5, 3.0));
  CHECK(tie_term(same) == 120);
  CHECK(midranks(std::vector<double>{}).empty());
}

TEST_CASE("exact null distribution of U") {
  worst_error w{"Mann-Whitney null cdf vs the Mann-Whitney recursion in Python integers"};
  for (const auto& c : fixtures()["null_cdf"].arr()) {
    const auto m = static_cast<std::size_t>(c["m"].num()), n = static_cast<std::size_t>(c["n"].num());
    const std::vector<double> want = c["cdf"].numbers();
    const std::vector<double> got = mann_whitney_null_cdf(m, n);
    REQUIRE(got.size() == want.size());
    for (std::size_t u = 0; u < got.size(); ++u) {
      w.add(got[u], want[u]);
      CHECK(fixture::relative_error(got[u], want[u]) <= 1e-14);
    }
  }
  // Critical values of the two-sided 5% Mann-Whitney test, n1 = n2: the largest U with
  // 2 P(U <= u) <= 0.05. Standard tables of critical U (common-practice values, from memory):
  // 5,5 -> 2; 6,6 -> 5; 7,7 -> 8; 8,8 -> 13; 10,10 -> 23; 20,20 -> 127.
  const std::vector<std::pair<std::size_t, std::size_t>> table = {{5, 2}, {6, 5}, {7, 8}, {8, 13}, {10, 23}, {20, 127}};
  for (auto [n, critical] : table) {
    const std::vector<double> cdf = mann_whitney_null_cdf(n, n);
    std::size_t u = 0;
    while (2 * cdf[u + 1] <= 0.05) ++u;
    CHECK_MESSAGE(u == critical, "n = " << n);
  }
  // Counting is exact in 128 bits only while C(m+n, m) stays below about 2^124.
  CHECK(mann_whitney_null_cdf(70, 70).empty());         // log2 C(140, 70) is about 136
  CHECK(mann_whitney_null_cdf(60, 60).size() == 3601);  // log2 C(120, 60) is about 116
  CHECK(mann_whitney_null_cdf(8, 100000).size() == 800001);
}

TEST_CASE("Mann-Whitney U and p against scipy.stats.mannwhitneyu") {
  // scipy.stats.mannwhitneyu documentation example: U = 17 of the first sample, exact
  // two-sided p = 1/9; asymptotic p 0.11134688653314041 (both printed in that documentation).
  const std::vector<double> males = {19, 22, 16, 29, 24}, females = {20, 11, 17, 12};
  const auto exact = mann_whitney(males, females, alternative::two_sided);
  CHECK(exact.exact);
  CHECK(exact.u == 17);
  CHECK(fixture::relative_error(exact.p_value, 1.0 / 9) <= 1e-14);
  const auto normal = mann_whitney(males, females, alternative::two_sided, exact_mode::never);
  CHECK(!normal.exact);
  CHECK(fixture::relative_error(normal.p_value, 0.11134688653314041) <= 1e-13);

  worst_error wu{"Mann-Whitney U vs scipy.stats.mannwhitneyu"}, wp{"Mann-Whitney p vs scipy.stats.mannwhitneyu"};
  for (const auto& c : fixtures()["mann_whitney"].arr()) {
    const std::vector<double> x = c["x"].numbers(), y = c["y"].numbers();
    const exact_mode mode = c.has("mode") ? exact_mode::always : exact_mode::automatic;
    const auto r = mann_whitney(x, y, side_of(c["alternative"].str()), mode);
    CHECK(r.exact == c["exact"].boolean());
    CHECK(r.u == c["u"].num());
    wu.add(r.u, c["u"].num());
    wp.add(r.p_value, c["p"].num());
    CHECK_MESSAGE(fixture::relative_error(r.p_value, c["p"].num()) <= tolerance,
                  "p " << r.p_value << " vs " << c["p"].num() << " m=" << x.size() << " n=" << y.size());
  }
}

TEST_CASE("k-th pairwise difference by bisection equals sorting all differences") {
  // Brute force (all m n differences sorted) as the reference.
  std::vector<double> x = {-3.5, -1, 0, 0, 2.25, 7, 1e-300}, y = {-2, 0, 0.5, 0.5, 9, -1e300};
  std::sort(x.begin(), x.end());
  std::sort(y.begin(), y.end());
  std::vector<double> all;
  for (double a : x)
    for (double b : y) all.push_back(a - b);
  std::sort(all.begin(), all.end());
  for (std::size_t k = 1; k <= all.size(); ++k) CHECK(kth_pairwise_difference(x, y, k) == all[k - 1]);
}

TEST_CASE("Hodges-Lehmann shift and Lehmann interval against brute force") {
  worst_error we{"Hodges-Lehmann estimate vs brute-force median of pairwise differences"},
      wi{"Hodges-Lehmann interval ends vs brute-force order statistics"};
  for (const auto& c : fixtures()["hodges_lehmann"].arr()) {
    const std::vector<double> x = c["x"].numbers(), y = c["y"].numbers();
    const auto r = hodges_lehmann_shift(x, y, c["conf"].num(), side_of(c["alternative"].str()), c["exact"].boolean());
    we.add(r.estimate, c["estimate"].num());
    CHECK(fixture::relative_error(r.estimate, c["estimate"].num()) <= 1e-14);
    CHECK(r.order == static_cast<std::size_t>(c["order"].num()));
    // Interval ends are order statistics of the differences: equal, not merely close.
    CHECK(r.low == c["low"].num());
    CHECK(r.high == c["high"].num());
    wi.add(r.low, c["low"].num());
    wi.add(r.high, c["high"].num());
  }
}

TEST_CASE("Brunner-Munzel against scipy.stats.brunnermunzel") {
  // scipy.stats.brunnermunzel documentation example: W = 3.1374674823029505,
  // p = 0.0057862086661515377 (printed there).
  const std::vector<double> x1 = {1, 2, 1, 1, 1, 1, 1, 1, 1, 1, 2, 4, 1, 1}, x2 = {3, 3, 4, 3, 1, 2, 3, 1, 1, 5, 4};
  const auto doc = brunner_munzel(x1, x2, 0.95, alternative::two_sided);
  CHECK(fixture::relative_error(doc.statistic, 3.1374674823029505) <= 1e-13);
  CHECK(fixture::relative_error(doc.p_value, 0.0057862086661515377) <= 1e-9);  // scipy's p: 2 min(cdf, sf)

  worst_error ws{"Brunner-Munzel W vs scipy"}, wd{"Brunner-Munzel df vs scipy formula"},
      wp{"Brunner-Munzel p vs 2 t.sf(|W|, df) from scipy's W, df"},
      wc{"Brunner-Munzel estimate/se/CI vs brute force + refined t quantile"};
  for (const auto& c : fixtures()["brunner_munzel"].arr()) {
    const std::vector<double> x = c["x"].numbers(), y = c["y"].numbers();
    const auto r = brunner_munzel(x, y, c["conf"].num(), side_of(c["alternative"].str()));
    if (std::isnan(c["df"].num())) {  // no overlap: zero placement variance, no t approximation
      CHECK(std::isnan(r.df));
      CHECK(std::isnan(r.p_value));
      CHECK(r.statistic == c["statistic"].num());
      continue;
    }
    for (auto [got, want, track] :
         {std::tuple{r.statistic, c["statistic"].num(), &ws}, std::tuple{r.df, c["df"].num(), &wd},
          std::tuple{r.p_value, c["p"].num(), &wp}, std::tuple{r.estimate, c["estimate"].num(), &wc},
          std::tuple{r.se, c["se"].num(), &wc}, std::tuple{r.ci_low, c["low"].num(), &wc},
          std::tuple{r.ci_high, c["high"].num(), &wc}}) {
      track->add(got, want);
      CHECK_MESSAGE(fixture::relative_error(got, want, 1e-300) <= tolerance, got << " vs " << want);
    }
  }
}

namespace {
prepared_data prepared(const std::vector<std::vector<double>>& groups) {
  std::vector<std::string> levels;
  for (std::size_t i = 0; i < groups.size(); ++i) {
    std::string level = "g";  // appended, not "g" + ...: GCC 12 -Wrestrict false positive
    level += std::to_string(i + 1);
    levels.push_back(level);
  }
  return prepare(make_dataset(levels, groups));
}
using fixture::groups_of;
}  // namespace

TEST_CASE("Dunn's z against the formula with scipy.stats.rankdata and scipy.stats.norm") {
  worst_error w{"Dunn estimate/se/z/p vs formula with scipy rankdata + norm"};
  for (const auto& d : fixtures()["dunn"].arr()) {
    const prepared_data p = prepared(groups_of(d["groups"]));
    for (const auto& c : d["contrasts"].arr()) {
      const contrast k{"k", c["coefficients"].numbers(), "k"};
      for (auto [side, key] : {std::pair{alternative::two_sided, "p"}, std::pair{alternative::greater, "p_greater"},
                               std::pair{alternative::less, "p_less"}}) {
        analysis_options o;
        o.side = side;
        const method_result r = dunn_contrast(p, k, o);
        CHECK(r.method == "dunn");
        CHECK(!r.df.has_value());
        for (auto [got, want] : {std::pair{r.estimate, c["estimate"].num()}, std::pair{r.se, c["se"].num()},
                                 std::pair{r.statistic, c["z"].num()}, std::pair{r.p_value, c[key].num()}}) {
          w.add(got, want);
          CHECK_MESSAGE(fixture::relative_error(got, want) <= tolerance, got << " vs " << want);
        }
      }
    }
  }
}

TEST_CASE("method wrappers: orientation, units and refusals") {
  // Two levels a (positive coefficient) and b. Mann-Whitney U is that of a; the
  // Hodges-Lehmann shift is a - b; the Brunner-Munzel estimate is P(a < b) + P(a = b)/2.
  const prepared_data p = prepared({{19, 22, 16, 29, 24}, {20, 11, 17, 12}});
  const analysis_options o;
  const method_result mw = mann_whitney_contrast(p, contrast{"g1 - g2", {1, -1}, "g1 - g2"}, o);
  CHECK(mw.statistic == 17);  // scipy.stats.mannwhitneyu documentation example, U of the first sample
  CHECK(mw.exact);
  // The 20 differences a - b of this example, sorted by hand: -4 -1 -1 2 2 4 4 5 5 7 7 8 9 10
  // 11 12 12 13 17 18; the median (10th and 11th) is 7.
  CHECK(mw.estimate == 7);
  // Lehmann's 95% interval, by hand from the exact null counts of U for 5 and 4 (C(9, 4) = 126
  // arrangements; U = 0, 1, 2 occur 1, 1, 2 times): P(U <= 1) = 2/126 <= 0.025 < P(U <= 2), so
  // k = 2 and the interval is [D_(2), D_(19)] = [-1, 17] with confidence 1 - 4/126.
  CHECK(mw.ci_low == -1);
  CHECK(mw.ci_high == 17);
  // The reversed contrast mirrors everything: U of the other level, shift negated.
  const method_result back = mann_whitney_contrast(p, contrast{"g2 - g1", {-1, 1}, "g2 - g1"}, o);
  CHECK(back.statistic == 20 - 17);
  CHECK(back.estimate == -mw.estimate);
  CHECK(back.ci_low == -mw.ci_high);
  CHECK(back.p_value == mw.p_value);
  // A contrast scaled by 2 reports the shift times 2.
  const method_result twice = mann_whitney_contrast(p, contrast{"2(g1 - g2)", {2, -2}, "2*g1 - 2*g2"}, o);
  CHECK(twice.estimate == 2 * mw.estimate);
  CHECK(twice.p_value == mw.p_value);

  const method_result bm = brunner_munzel_contrast(p, contrast{"g1 - g2", {1, -1}, "g1 - g2"}, o);
  // P(g1 < g2) + P(g1 = g2)/2 by counting the 20 pairs: 3 of them have g1 < g2 (16<17, 16<20, 19<20).
  CHECK(fixture::relative_error(bm.estimate, 3.0 / 20) <= 1e-15);
  CHECK(bm.statistic < 0);
  CHECK(bm.ci_low <= bm.estimate);
  CHECK(bm.ci_high >= bm.estimate);

  // --exact always with ties: the no-ties distribution does not apply; the result says so.
  analysis_options always = o;
  always.exact = exact_mode::always;
  const prepared_data tied = prepared({{1, 2, 2, 3}, {2, 4, 5}});
  const method_result tie_result = mann_whitney_contrast(tied, contrast{"g1 - g2", {1, -1}, "g1 - g2"}, always);
  CHECK(!tie_result.exact);
  CHECK(std::any_of(tie_result.notes.begin(), tie_result.notes.end(),
                    [](const std::string& n) { return n.find("exact distribution not used") != std::string::npos; }));

  const prepared_data three = prepared({{1, 2, 3}, {4, 5, 6}, {7, 8, 9}});
  const contrast not_two{"g1 - (g2 + g3)/2", {1, -0.5, -0.5}, "g1 - (g2 + g3)/2"};
  CHECK_THROWS_AS(mann_whitney_contrast(three, not_two, o), analysis_error);
  CHECK_THROWS_AS(brunner_munzel_contrast(three, not_two, o), analysis_error);
  // Brunner-Munzel divides by n - 1 within each level.
  const prepared_data single = prepared({{1}, {4, 5, 6}});
  CHECK_THROWS_AS(brunner_munzel_contrast(single, contrast{"g1 - g2", {1, -1}, "g1 - g2"}, o), analysis_error);
}

TEST_CASE("rank contrast: exact permutation p against scipy.stats.permutation_test over rankdata") {
  worst_error w{"rank contrast exact p vs scipy.stats.permutation_test(rankdata)"};
  for (const auto& c : fixtures()["rank_contrast"].arr()) {
    const prepared_data p = prepared(groups_of(c["groups"]));
    const contrast k{"k", c["coefficients"].numbers(), "k"};
    for (auto [side, key] : {std::pair{alternative::two_sided, "p"}, std::pair{alternative::greater, "p_greater"},
                             std::pair{alternative::less, "p_less"}}) {
      analysis_options o;
      o.side = side;
      o.exact = exact_mode::always;
      o.threads = 1;
      const method_result r = rank_contrast(p, k, o);
      CHECK(r.method == "rank");
      CHECK(r.exact);
      CHECK(fixture::relative_error(r.estimate, c["estimate"].num()) <= 1e-12);
      CHECK(fixture::relative_error(r.statistic, c["statistic"].num()) <= 1e-12);
      w.add(r.p_value, c[key].num());
      // quality.md: exact enumeration p equal to scipy.stats.permutation_test to 1e-12.
      CHECK_MESSAGE(fixture::relative_error(r.p_value, c[key].num()) <= 1e-12, r.p_value << " vs " << c[key].num());
    }
  }
}

TEST_CASE("mann-whitney names a scaled shift in plain numbers") {
  const prepared_data p = prepared({{1, 2, 3}, {4, 5, 6}});
  const method_result r = mann_whitney_contrast(p, contrast{"2(g1 - g2)", {2, -2}, "2*g1 - 2*g2"}, analysis_options{});
  CHECK(r.estimand.find("times 2") != std::string::npos);
  CHECK(r.estimand.find("2.000") == std::string::npos);
  CHECK(r.estimate == -6);  // 2 x the median of the 9 differences (-3 by hand)
}

TEST_CASE("rank contrast: Monte Carlo p brackets the exact p of scipy.stats.permutation_test") {
  // quality.md: a Monte Carlo p must lie inside its own 99% interval around the exact p. With a
  // fixed seed this is deterministic; the exact p is the scipy fixture value.
  const auto& c = fixtures()["rank_contrast"][2];
  const prepared_data p = prepared(groups_of(c["groups"]));
  analysis_options o;
  o.exact = exact_mode::never;
  o.resamples = 20'000;
  o.threads = 2;
  // Three seeds: on the committed fixture all three intervals contain the exact p. In the live
  // run (new data each time) a 99% interval misses by chance once in a hundred, so one miss of
  // three is allowed there (two misses: probability 3e-4).
  int misses = 0;
  for (std::uint64_t seed : {12345u, 777u, 4242u}) {
    o.seed = seed;
    const method_result r = rank_contrast(p, contrast{"k", c["coefficients"].numbers(), "k"}, o);
    CHECK(!r.exact);
    REQUIRE(r.p_interval.has_value());
    misses += !((*r.p_interval)[0] <= c["p"].num() && c["p"].num() <= (*r.p_interval)[1]);
    CHECK(r.method == "rank");
  }
  CHECK(misses <= (std::getenv("CONTRASTA_FIXTURE") != nullptr ? 1 : 0));
}
