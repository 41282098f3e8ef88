// The family step: p-value adjustments against statsmodels, Tukey-Kramer against scipy's
// tukey_hsd, Games-Howell and Scheffe against their formulas evaluated with scipy, Dunnett
// through the pipeline, and the rules for methods a procedure does not cover.
#include "contrasta/multiplicity.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <string>
#include <vector>

#include "contrasta/classical.hpp"
#include "contrasta/dunnett.hpp"
#include "contrasta/error.hpp"
#include "contrasta/family.hpp"
#include "fixture.hpp"

using namespace contrasta;

namespace {

std::vector<std::string> level_names(std::size_t k) {
  std::vector<std::string> out;
  for (std::size_t i = 0; i < k; ++i) out.push_back("g" + std::to_string(i + 1));
  return out;
}

prepared_data prepared_from(const fixture::value& groups) {
  std::vector<std::vector<double>> g;
  for (const auto& x : groups.arr()) g.push_back(x.numbers());
  return prepare(make_dataset(level_names(g.size()), g));
}

std::vector<contrast_result> run(const prepared_data& p, const std::vector<contrast>& contrasts,
                                 const std::vector<std::string>& methods, const analysis_options& o) {
  std::vector<contrast_result> out;
  for (const auto& c : contrasts) {
    contrast_result cr;
    cr.spec = c;
    for (const auto& m : methods) cr.results.push_back(m == "pooled" ? pooled_contrast(p, c, o) : welch_contrast(p, c, o));
    out.push_back(cr);
  }
  return out;
}

void check_never_below_raw(const std::vector<contrast_result>& family) {
  for (const auto& c : family)
    for (const auto& r : c.results) CHECK(r.p_adjusted >= r.p_value * (1 - 1e-12));
}

}  // namespace

TEST_CASE("step-wise adjustments agree with statsmodels multipletests to 1e-12") {
  // statsmodels 0.13 multipletests: bonferroni, holm, sidak, simes-hochberg, fdr_bh, fdr_by.
  auto fx = fixture::load("multiplicity_fixtures");
  double worst = 0;
  for (const auto& c : fx["multipletests"].arr()) {
    auto p = c["p"].numbers();
    for (const auto& [name, want] : c["adjusted"].obj()) {
      auto got = adjust_p_values(p, name);
      auto w = want.numbers();
      REQUIRE(got.size() == w.size());
      for (std::size_t i = 0; i < w.size(); ++i) worst = std::max(worst, fixture::relative_error(got[i], w[i]));
      for (std::size_t i = 0; i < w.size(); ++i)
        CHECK_MESSAGE(fixture::relative_error(got[i], w[i]) < 1e-12, name << " i=" << i << " got " << got[i] << " want " << w[i]);
    }
    CHECK(adjust_p_values(p, "none") == p);
  }
  MESSAGE("largest relative difference from statsmodels: " << worst);
}

TEST_CASE("Tukey-Kramer agrees with scipy.stats.tukey_hsd (p-values and simultaneous intervals)") {
  auto fx = fixture::load("multiplicity_fixtures");
  analysis_options o;
  double worst_p = 0, worst_ci = 0;
  for (const auto& c : fx["tukey_hsd"].arr()) {
    auto p = prepared_from(c["groups"]);
    auto contrasts = all_pairs(p.data.levels);
    auto family = run(p, contrasts, {"pooled", "welch"}, o);
    auto s = adjust_family(family, "tukey", p, o);
    CHECK(s.family_size == contrasts.size());
    CHECK(s.protects.find("Tukey-Kramer") != std::string::npos);
    CHECK(s.protects.find("Holm") != std::string::npos);  // welch fell back
    for (const auto& cr : family) {
      auto [i, j] = cr.spec.two_levels();
      const auto& pooled = cr.results[0];
      // scipy's p is 1 - cdf with its cdf good to ~1e-11 absolute.
      double want_p = c["pvalue"][i][j].num();
      worst_p = std::max(worst_p, std::abs(pooled.p_adjusted - want_p));
      worst_ci = std::max({worst_ci, fixture::relative_error(*pooled.simultaneous_low, c["low"][i][j].num(), 1e-3),
                           fixture::relative_error(*pooled.simultaneous_high, c["high"][i][j].num(), 1e-3)});
      CHECK(std::abs(pooled.p_adjusted - want_p) < 1e-9);
      // scipy's interval uses studentized_range.ppf (root finding to about 1e-10 relative).
      CHECK(fixture::relative_error(*pooled.simultaneous_low, c["low"][i][j].num(), 1e-3) < 1e-8);
      CHECK(fixture::relative_error(*pooled.simultaneous_high, c["high"][i][j].num(), 1e-3) < 1e-8);
      const auto& welch = cr.results[1];
      CHECK(!welch.simultaneous_low.has_value());
      CHECK(!welch.notes.empty());
    }
    check_never_below_raw(family);
  }
  MESSAGE("Tukey-Kramer vs scipy: largest p difference " << worst_p << ", largest relative interval difference " << worst_ci);
}

TEST_CASE("Games-Howell agrees with its formula evaluated with scipy.stats.studentized_range") {
  auto fx = fixture::load("multiplicity_fixtures");
  analysis_options o;
  double worst_p = 0, worst_ci = 0;
  for (const auto& c : fx["games_howell"].arr()) {
    auto p = prepared_from(c["groups"]);
    auto family = run(p, all_pairs(p.data.levels), {"welch"}, o);
    adjust_family(family, "games-howell", p, o);
    std::size_t at = 0;
    for (const auto& pair : c["pairs"].arr()) {
      const auto& r = family[at++].results[0];
      worst_p = std::max(worst_p, std::abs(r.p_adjusted - pair["p"].num()));
      worst_ci = std::max({worst_ci, fixture::relative_error(*r.simultaneous_low, pair["low"].num(), 1e-3),
                           fixture::relative_error(*r.simultaneous_high, pair["high"].num(), 1e-3)});
      CHECK(fixture::relative_error(*r.df, pair["df"].num()) < 1e-10);
      CHECK(std::abs(r.p_adjusted - pair["p"].num()) < 1e-9);
      CHECK(fixture::relative_error(*r.simultaneous_low, pair["low"].num(), 1e-3) < 1e-8);
      CHECK(fixture::relative_error(*r.simultaneous_high, pair["high"].num(), 1e-3) < 1e-8);
    }
    check_never_below_raw(family);
  }
  MESSAGE("Games-Howell vs formula with scipy: largest p difference " << worst_p << ", largest relative interval difference " << worst_ci);
}

TEST_CASE("Scheffe agrees with its formula evaluated with scipy.stats.f") {
  auto fx = fixture::load("multiplicity_fixtures");
  analysis_options o;
  for (const auto& c : fx["tukey_hsd"].arr()) {
    auto p = prepared_from(c["groups"]);
    const auto& sc = c["scheffe"];
    contrast k;
    k.name = "first vs rest";
    k.coefficients = sc["coefficients"].numbers();
    auto family = run(p, {k}, {"pooled"}, o);
    adjust_family(family, "scheffe", p, o);
    const auto& r = family[0].results[0];
    CHECK(fixture::relative_error(r.p_adjusted, sc["p"].num()) < 1e-10);
    double critical = sc["critical"].num();
    CHECK(fixture::relative_error(*r.simultaneous_low, sc["estimate"].num() - critical * sc["se"].num(), 1e-3) < 1e-9);
    CHECK(fixture::relative_error(*r.simultaneous_high, sc["estimate"].num() + critical * sc["se"].num(), 1e-3) < 1e-9);
  }
}

TEST_CASE("Dunnett through the family step: many-to-one with unequal n") {
  // The family step must hand Dunnett's distribution the lambdas of the design; reference:
  // dunnett_sf directly (itself checked in dunnett_test against tables and Monte Carlo).
  auto p = prepare(make_dataset({"control", "a", "b", "c"},
                                {{10.1, 9.8, 10.4, 10.0, 9.7, 10.3}, {10.9, 11.2, 10.5, 11.0}, {10.2, 9.9, 10.6, 10.1, 10.4, 9.8, 10.0, 10.3}, {11.5, 11.1, 11.8}}));
  analysis_options o;
  auto contrasts = make_family("versus=control", p.data.levels, group_sizes(p));
  auto family = run(p, contrasts, {"pooled"}, o);
  auto s = adjust_family(family, "dunnett", p, o);
  CHECK(s.protects.find("'control'") != std::string::npos);
  std::vector<double> lambda;
  for (std::size_t i = 1; i < 4; ++i) lambda.push_back(std::sqrt(double(p.groups[i].n) / double(p.groups[i].n + p.groups[0].n)));
  double df = p.anova.df_within;
  double critical = dunnett_critical(0.05, lambda, df, true);
  for (const auto& cr : family) {
    const auto& r = cr.results[0];
    CHECK(std::abs(r.p_adjusted - dunnett_sf(std::abs(r.statistic), lambda, df, true)) < 1e-12);
    CHECK(std::abs(*r.simultaneous_high - (r.estimate + critical * r.se)) < 1e-10);
  }
  check_never_below_raw(family);

  SUBCASE("one-sided, comparisons written control - treatment") {
    analysis_options less = o;
    less.side = alternative::less;
    std::vector<contrast> flipped;
    for (auto c : contrasts) {
      for (auto& x : c.coefficients) x = -x;
      flipped.push_back(c);
    }
    auto f2 = run(p, flipped, {"pooled"}, less);
    adjust_family(f2, "dunnett", p, less);
    analysis_options greater = o;
    greater.side = alternative::greater;
    auto f1 = run(p, contrasts, {"pooled"}, greater);
    adjust_family(f1, "dunnett", p, greater);
    // "control - a < 0" is the same hypothesis as "a - control > 0".
    for (std::size_t i = 0; i < f1.size(); ++i)
      CHECK(std::abs(f1[i].results[0].p_adjusted - f2[i].results[0].p_adjusted) < 1e-9);
    check_never_below_raw(f1);
  }
}

TEST_CASE("procedures refuse families they do not cover, with a message that says what to do") {
  auto p = prepare(make_dataset({"a", "b", "c"}, {{1, 2, 3, 4}, {2, 3, 4, 6}, {5, 6, 7, 9}}));
  analysis_options o;
  auto helmert = run(p, make_family("helmert", p.data.levels, group_sizes(p)), {"pooled"}, o);
  CHECK_THROWS_AS(adjust_family(helmert, "tukey", p, o), analysis_error);
  auto pairs = run(p, all_pairs(p.data.levels), {"pooled"}, o);
  CHECK_THROWS_AS(adjust_family(pairs, "dunnett", p, o), analysis_error);
  analysis_options one_sided = o;
  one_sided.side = alternative::greater;
  CHECK_THROWS_AS(adjust_family(pairs, "tukey", p, one_sided), analysis_error);
  CHECK_THROWS_AS(adjust_family(pairs, "nonsense", p, o), usage_error);
  // Scheffe covers any contrast, Holm-type adjustments any family.
  auto s = adjust_family(helmert, "scheffe", p, o);
  CHECK(s.protects.find("after seeing the data") != std::string::npos);
  check_never_below_raw(helmert);
}

TEST_CASE("max-T from every reassignment agrees with a brute-force enumeration in numpy") {
  // tests/reference/multiplicity_fixtures.py (maxt_exact): itertools enumeration of every
  // distinct reassignment, Welch t of each pair, Westfall & Young single-step and step-down.
  auto fx = fixture::load("multiplicity_fixtures");
  const auto& c = fx["maxt_exact"];
  auto p = prepared_from(c["groups"]);
  analysis_options o;
  o.seed = 5;
  std::vector<contrast> contrasts;
  for (const auto& row : c["coefficients"].arr()) {
    contrast k;
    k.coefficients = row.numbers();
    k.name = "pair " + std::to_string(contrasts.size());
    contrasts.push_back(k);
  }
  auto family = run(p, contrasts, {"welch"}, o);
  auto s = adjust_family(family, "maxt", p, o);
  CHECK(s.protects.find("Westfall & Young") != std::string::npos);
  auto down = c["step_down"].numbers();
  for (std::size_t j = 0; j < family.size(); ++j) {
    const auto& r = family[j].results[0];
    CHECK(std::abs(r.p_adjusted - std::max(down[j], r.p_value)) < 1e-12);
    REQUIRE(!r.notes.empty());
    CHECK(r.notes.back().find(std::to_string(static_cast<long>(c["arrangements"].num()))) != std::string::npos);
  }
  check_never_below_raw(family);
}

TEST_CASE("max-T Monte Carlo: adjusted p never below raw, pooled results fall back to Holm") {
  auto p = prepare(make_dataset({"a", "b", "c", "d"}, {{1.2, 2.3, 1.9, 2.8, 2.2, 1.7, 2.5, 1.4, 2.0, 2.6},
                                                      {2.9, 3.4, 2.2, 3.9, 3.1, 2.7, 3.6, 2.4, 3.3, 3.0, 2.8},
                                                      {2.0, 1.1, 3.5, 2.7, 0.9, 2.2, 3.1, 1.6, 2.4},
                                                      {1.8, 2.5, 2.1, 2.9, 1.6, 2.3, 2.7, 2.0, 2.4, 1.9, 2.2, 2.6}}));
  analysis_options o;
  o.seed = 11;
  o.resamples = 1999;
  auto family = run(p, all_pairs(p.data.levels), {"pooled", "welch"}, o);
  auto s = adjust_family(family, "maxt", p, o);
  CHECK(s.protects.find("Holm") != std::string::npos);
  check_never_below_raw(family);
  for (const auto& cr : family) {
    CHECK(cr.results[0].notes.back().find("Holm") != std::string::npos);
    CHECK(cr.results[1].notes.back().find("max-T step-down") != std::string::npos);
  }
  // The same seed gives the same adjusted p-values.
  auto again = run(p, all_pairs(p.data.levels), {"pooled", "welch"}, o);
  adjust_family(again, "maxt", p, o);
  for (std::size_t j = 0; j < family.size(); ++j) CHECK(again[j].results[1].p_adjusted == family[j].results[1].p_adjusted);
}
