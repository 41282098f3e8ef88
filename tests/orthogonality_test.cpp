// Orthogonality for the design and the one-df decomposition of the between-groups sum of
// squares.
#include "contrasta/orthogonality.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "contrasta/classical.hpp"
#include "contrasta/family.hpp"

using namespace contrasta;

namespace {
prepared_data unequal() {
  return prepare(make_dataset({"0", "10", "20", "40"},
                              {{4.1, 4.4, 3.9}, {5.0, 5.6, 5.2, 4.8, 5.1, 5.5, 5.3}, {6.2, 5.9, 6.6, 6.0}, {6.1, 6.8, 6.4, 6.9, 6.3, 6.0, 6.6, 6.5, 6.2, 6.7}}));
}
}  // namespace

TEST_CASE("n-weighted trends are orthogonal for the design and their SS add up to SS between") {
  // Requirement: the decomposition sums to the ANOVA between-groups SS to 1e-10.
  auto p = unequal();
  auto family = make_family("trend-weighted", p.data.levels, group_sizes(p));
  auto report = orthogonality(p, family);
  CHECK(report.mutually_orthogonal);
  CHECK(report.complete);
  CHECK(std::abs(report.ss_contrasts - p.anova.ss_between) <= 1e-10 * p.anova.ss_between);
  CHECK(std::abs(report.ss_remainder) <= 1e-10 * p.anova.ss_between);
  // SS_c / MSE is the square of the pooled t of the contrast (an identity of the pooled method).
  analysis_options o;
  for (std::size_t i = 0; i < family.size(); ++i) {
    double t = pooled_contrast(p, family[i], o).statistic;
    CHECK(report.sums_of_squares[i].sum_of_squares / p.anova.ms_within == doctest::Approx(t * t).epsilon(1e-12));
  }
}

TEST_CASE("unweighted trends with unequal n are not orthogonal, and the report says which pairs") {
  auto p = unequal();
  auto family = make_family("trend", p.data.levels, group_sizes(p));
  auto report = orthogonality(p, family);
  CHECK_FALSE(report.mutually_orthogonal);
  CHECK_FALSE(report.complete);
  CHECK(!report.non_orthogonal_pairs.empty());
  CHECK(std::isnan(report.ss_remainder));
  for (double r : report.non_orthogonal_correlations) CHECK(std::abs(r) > 1e-9);
}

TEST_CASE("Helmert with equal n: complete orthogonal set; a partial set leaves a remainder") {
  auto p = prepare(make_dataset({"a", "b", "c"}, {{1, 2, 3, 5}, {2, 4, 4, 6}, {6, 7, 8, 8}}));
  auto family = make_family("helmert", p.data.levels, group_sizes(p));
  auto report = orthogonality(p, family);
  CHECK(report.mutually_orthogonal);
  CHECK(report.complete);
  CHECK(std::abs(report.ss_contrasts - p.anova.ss_between) <= 1e-10 * p.anova.ss_between);
  auto partial = orthogonality(p, {family[0]});
  CHECK(partial.mutually_orthogonal);
  CHECK_FALSE(partial.complete);
  CHECK(partial.ss_remainder == doctest::Approx(report.sums_of_squares[1].sum_of_squares).epsilon(1e-12));
  // All pairs are never mutually orthogonal (a - b and a - c share a).
  CHECK_FALSE(orthogonality(p, all_pairs(p.data.levels)).mutually_orthogonal);
  CHECK(orthogonal_for_design(family[0], family[1], group_sizes(p)));
}

TEST_CASE("the orthogonality report lists exactly the pairs design_correlation calls non-orthogonal") {
  // The report walks only the levels two contrasts share; the pairwise definition walks all.
  // An empty level makes some correlations NaN, which count as not orthogonal.
  const auto p = prepare(make_dataset({"a", "b", "c", "d", "e"}, {{1, 2, 3}, {2, 4}, {}, {5, 6, 8, 9}, {1, 1.5, 3}}));
  auto family = all_pairs(p.data.levels);
  for (const char* kind : {"helmert", "adjacent", "grand-mean"}) {
    const auto more = make_family(kind, p.data.levels, group_sizes(p));
    family.insert(family.end(), more.begin(), more.end());
  }
  contrast linear;  // a linear combination: left out of the pairs
  linear.name = linear.expression = "a + b";
  linear.coefficients = {1, 1, 0, 0, 0};
  family.push_back(linear);
  const auto report = orthogonality(p, family);
  const auto n = group_sizes(p);
  std::vector<std::pair<std::size_t, std::size_t>> pairs;
  std::vector<double> correlations;
  for (std::size_t a = 0; a + 1 < family.size(); ++a)
    for (std::size_t b = a + 1; b + 1 < family.size(); ++b)
      if (!orthogonal_for_design(family[a], family[b], n)) {
        pairs.emplace_back(a, b);
        correlations.push_back(design_correlation(family[a], family[b], n));
      }
  CHECK(report.non_orthogonal_pairs == pairs);
  REQUIRE(report.non_orthogonal_correlations.size() == correlations.size());
  for (std::size_t i = 0; i < correlations.size(); ++i) {
    const double got = report.non_orthogonal_correlations[i], want = correlations[i];
    CHECK((got == want || (std::isnan(got) && std::isnan(want))));
  }
}
