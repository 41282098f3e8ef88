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
