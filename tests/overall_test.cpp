// Overall tests against scipy/statsmodels (tests/reference/overall_fixtures.py) and a published
// worked example.
#include "contrasta/overall.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <random>
#include <string>
#include <vector>

#include "contrasta/rank.hpp"

#include "fixture.hpp"

using namespace contrasta;

namespace {

using fixture::prepared_of;

void check_test(const overall_test& got, const fixture::value& want, const std::string& name) {
  INFO(name << ": statistic " << got.statistic << " p " << got.p_value);
  CHECK(got.test == name);
  // Statistics are O(1): absolute 1e-13 near an exact zero (tied data), relative 1e-10 elsewhere.
  CHECK(fixture::relative_error(got.statistic, want["statistic"].num(), 1e-3) <= 1e-10);
  CHECK(fixture::relative_error(got.df1, want["df1"].num()) <= 1e-10);
  if (want.has("df2")) {
    REQUIRE(got.df2.has_value());
    CHECK(fixture::relative_error(*got.df2, want["df2"].num()) <= 1e-10);
  } else {
    CHECK(!got.df2.has_value());
  }
  CHECK(fixture::relative_error(got.p_value, want["p_value"].num()) <= 1e-10);
}

}  // namespace

TEST_CASE("overall tests agree with scipy and statsmodels to 1e-10") {
  const auto fx = fixture::load("overall_fixtures");
  for (auto& c : fx["cases"].arr()) {
    std::vector<std::vector<double>> groups;
    for (auto& g : c["groups"].arr()) groups.push_back(g.numbers());
    const auto p = prepared_of(groups);
    const auto tests = overall_tests(p);
    REQUIRE(tests.size() == 5);
    check_test(tests[0], c["anova_f"], "anova-f");                    // scipy.stats.f_oneway
    check_test(tests[1], c["welch_f"], "welch-f");                    // statsmodels anova_oneway unequal
    check_test(tests[2], c["brown_forsythe_f"], "brown-forsythe-f");  // statsmodels bf, pvalue2 (df1 = k-1)
    check_test(tests[3], c["alexander_govern"], "alexander-govern");  // scipy.stats.alexandergovern
    check_test(tests[4], c["kruskal_wallis"], "kruskal-wallis");      // scipy.stats.kruskal
  }
}

TEST_CASE("Kruskal-Wallis tie correction: hand computation") {
  // Ranks by hand (formula of Kruskal & Wallis 1952): a = {1, 2, 2}, b = {2, 3, 4}; pooled sorted
  // 1 2 2 2 3 4 -> ranks 1, 3, 3, 3, 5, 6; a sums 1+3+3 = 7, b sums 3+5+6 = 14.
  // H = 12/(6*7) (7^2/3 + 14^2/3) - 3*7 = (2/7)(245/3) - 21 = 70/3 - 21 = 7/3;
  // tie correction 1 - (27 - 3)/(216 - 6) = 1 - 24/210 = 31/35; H_c = (7/3)/(31/35) = 245/93.
  const auto p = prepared_of({{1, 2, 2}, {2, 3, 4}});
  const auto kw = kruskal_wallis_test(p);
  CHECK(kw.statistic == doctest::Approx(245.0 / 93).epsilon(1e-13));
  CHECK(kw.df1 == 1);
  CHECK(!kw.df2.has_value());
}

TEST_CASE("heteroscedastic tests are left out when a level has no variance") {
  const auto p = prepared_of({{1, 2, 3}, {5, 5, 5}});
  const auto tests = overall_tests(p);
  for (auto& t : tests) {
    CHECK(t.test != "welch-f");
    CHECK(t.test != "alexander-govern");
  }
  CHECK(tests.front().test == "anova-f");
}

TEST_CASE("Kruskal-Wallis from the merged sorted levels equals mid-ranks of the pooled data") {
  // The direct computation: mid-ranks of the concatenated sample (rank.hpp), rank sums in data
  // order, the tie term from tie_term. Small integer data give large tie blocks.
  std::mt19937_64 rng(5);
  for (std::size_t scale : {1, 10, 3000}) {
    std::vector<std::vector<double>> groups(5);
    std::vector<double> all;
    for (std::size_t g = 0; g < groups.size(); ++g) {
      for (std::size_t i = 0; i < scale * (3 + g); ++i) groups[g].push_back(static_cast<double>(rng() % (4 + g)));
      all.insert(all.end(), groups[g].begin(), groups[g].end());
    }
    const auto ranks = midranks(all);
    const double N = static_cast<double>(all.size());
    double spread = 0;
    std::size_t start = 0;
    for (const auto& g : groups) {
      double rank_sum = 0;
      for (std::size_t j = 0; j < g.size(); ++j) rank_sum += ranks[start + j];
      start += g.size();
      const double d = rank_sum / static_cast<double>(g.size()) - (N + 1) / 2;
      spread += static_cast<double>(g.size()) * d * d;
    }
    const double h = 12 / (N * (N + 1)) * spread / (1 - tie_term(all) / (N * N * N - N));
    CHECK(kruskal_wallis_test(prepared_of(groups)).statistic == h);
  }
}
