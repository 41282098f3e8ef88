// Dunnett's many-to-one distribution against Student's t, a published table, a Monte Carlo of
// the multivariate t and Genz's multivariate normal integration.
#include "contrasta/dunnett.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <vector>

#include "distributions.hpp"
#include "fixture.hpp"

using namespace contrasta;

namespace {
constexpr double inf = std::numeric_limits<double>::infinity();

std::vector<double> lambdas(const fixture::value& treatment_n, double control_n) {
  auto n = treatment_n.numbers();
  return dunnett_lambdas(n, control_n);
}
}  // namespace

TEST_CASE("one treatment is Student's t") {
  // With m = 1 the statistic is a single t on df degrees of freedom (by construction).
  const std::vector<double> lambda = {std::sqrt(5.0 / 12.0)};
  for (double df : {2.0, 9.0, 41.5, inf}) {
    for (double c : {0.7, 2.1, 4.5}) {
      double upper = std::isinf(df) ? cdf(complement(detail::normal(), c)) : cdf(complement(detail::students_t(df), c));
      CHECK(fixture::relative_error(dunnett_sf(c, lambda, df, false), upper) < 1e-9);
      CHECK(fixture::relative_error(dunnett_sf(c, lambda, df, true), 2 * upper) < 1e-9);
      CHECK(std::abs(dunnett_cdf(c, lambda, df, true) + dunnett_sf(c, lambda, df, true) - 1) < 1e-12);
      // A one-sided bound below zero (an estimate on the wrong side of a one-sided test).
      CHECK(fixture::relative_error(dunnett_sf(-c, lambda, df, false), 1 - upper) < 1e-9);
    }
    CHECK(std::abs(dunnett_sf(0, lambda, df, false) - 0.5) < 1e-12);
  }
}

TEST_CASE("critical values match Dunnett's published table for equal group sizes") {
  // Dunnett 1955 (JASA 50:1096-1121) tables 1a (one-sided) and 2a (two-sided), alpha = 0.05,
  // equal n (lambda^2 = 1/2), m treatments; two decimals as printed. Values written from
  // memory; printed rounding is +-0.005.
  struct row { int m; double df; bool two_sided; double c; };
  const row table[] = {{2, inf, true, 2.21},  {3, inf, true, 2.35},  {5, inf, true, 2.51},  {9, inf, true, 2.69},
                       {2, 10, true, 2.57},   {5, 10, true, 2.99},   {2, inf, false, 1.92}, {4, inf, false, 2.16},
                       {9, inf, false, 2.42}, {3, 10, false, 2.34},  {4, 20, true, 2.65}};
  for (const auto& r : table) {
    std::vector<double> lambda(static_cast<std::size_t>(r.m), std::sqrt(0.5));
    double c = dunnett_critical(0.05, lambda, r.df, r.two_sided);
    CHECK_MESSAGE(std::abs(c - r.c) <= 0.0051, "m=" << r.m << " df=" << r.df << " two-sided=" << r.two_sided << " got " << c);
    CHECK(std::abs(dunnett_sf(c, lambda, r.df, r.two_sided) - 0.05) < 1e-10);
  }
}

TEST_CASE("unequal sizes agree with a Monte Carlo of the multivariate t") {
  // numpy Monte Carlo (tests/reference/multiplicity_fixtures.py): 4e6 draws of
  // T_i = (lambda_i X + sqrt(1 - lambda_i^2) Y_i) / s; allowance 4.5 binomial standard errors.
  auto fx = fixture::load("multiplicity_fixtures");
  for (const auto& c : fx["dunnett_monte_carlo"].arr()) {
    auto lambda = lambdas(c["treatment_n"], c["control_n"].num());
    double draws = c["draws"].num();
    for (auto [key, two] : {std::pair{"two_sided", true}, std::pair{"one_sided", false}}) {
      double mc = c[key].num();
      double se = std::sqrt(mc * (1 - mc) / draws);
      double got = dunnett_sf(c["c"].num(), lambda, c["df"].num(), two);
      MESSAGE("Monte Carlo " << std::string(key) << ": ours " << got << ", simulated " << mc << ", z = " << (got - mc) / se);
      CHECK_MESSAGE(std::abs(got - mc) < 4.5 * se, key << " got " << got << " Monte Carlo " << mc << " se " << se);
    }
  }
}

TEST_CASE("known variance agrees with Genz's multivariate normal integration") {
  // scipy.stats.multivariate_normal.cdf over the box [-c, c]^m with the product correlation.
  auto fx = fixture::load("multiplicity_fixtures");
  for (const auto& c : fx["dunnett_normal"].arr()) {
    auto lambda = lambdas(c["treatment_n"], c["control_n"].num());
    double got = dunnett_cdf(c["c"].num(), lambda, inf, true);
    MESSAGE("Genz multivariate normal: difference " << got - c["two_sided_cdf"].num());
    CHECK(std::abs(got - c["two_sided_cdf"].num()) < 1e-6);
  }
}

TEST_CASE("a far larger treatment group (lambda near 1) and invalid input") {
  // Correlation near 1 between the two statistics: the two-sided probability lies between the
  // single t and the Bonferroni bound (Sidak 1967, JASA 62:626-633).
  const std::vector<double> lambda = dunnett_lambdas(std::vector<double>{400, 400}, 2);
  double joint = dunnett_sf(2.5, lambda, 15, true);
  double single = 2 * cdf(complement(detail::students_t(15), 2.5));
  CHECK(joint >= single);
  CHECK(joint <= 2 * single);
  CHECK(std::isnan(dunnett_sf(2, std::vector<double>{}, 10, true)));
  CHECK(std::isnan(dunnett_sf(2, std::vector<double>{0.5}, 0, true)));
  CHECK(std::isnan(dunnett_critical(0.7, std::vector<double>{0.5}, 10, true)));
}
