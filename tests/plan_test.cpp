// Tests of power, sample size, detectable contrast and allocation (src/plan.cpp).
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>
#include <vector>

#include "contrasta/error.hpp"
#include "contrasta/plan.hpp"
#include "distributions.hpp"
#include "fixture.hpp"

using namespace contrasta;

namespace {

std::vector<std::size_t> sizes(const fixture::value& v) {
  std::vector<std::size_t> out;
  for (double x : v.numbers()) out.push_back(static_cast<std::size_t>(x));
  return out;
}

power_request request_of(const fixture::value& c) {
  power_request r;
  r.test = parse_planned_test(c["test"].str());
  r.alpha = c["alpha"].num();
  r.side = parse_alternative(c["alternative"].str());
  return r;
}

// Relative error with an absolute floor: powers near 0 are compared absolutely.
double power_error(double got, double want) { return std::abs(got - want) / std::max(std::abs(want), 1e-3); }

double variance_of(const std::vector<double>& c, const std::vector<double>& sds, const std::vector<std::size_t>& n) {
  double v = 0;
  for (std::size_t i = 0; i < c.size(); ++i)
    if (c[i] != 0) v += c[i] * c[i] * sds[i] * sds[i] / static_cast<double>(n[i]);
  return v;
}

}  // namespace

TEST_CASE("two-group power agrees with statsmodels TTestIndPower") {
  // Source: statsmodels.stats.power.TTestIndPower.power (tests/reference/plan_fixtures.py).
  const fixture::value f = fixture::load("plan_fixtures");
  double worst = 0;
  for (const auto& c : f["two_group_power"].arr()) {
    const std::vector<std::size_t> n = sizes(c["n"]);
    const contrast_power p = power_of_contrast(c["coefficients"].numbers(), c["means"].numbers(),
                                               c["sds"].numbers(), n, request_of(c));
    worst = std::max(worst, power_error(p.power, c["power"].num()));
  }
  MESSAGE("two-group power, worst relative error vs statsmodels: " << worst);
  CHECK(worst < 1e-6);
}

TEST_CASE("the noncentral t cdf agrees with an independent quadrature") {
  // Source: scipy.integrate.quad of E[Phi(t sqrt(X/df) - ncp)], X ~ chi-square(df)
  // (tests/reference/plan_fixtures.py); scipy.stats.nct wraps Boost like our code, so this is
  // the check that does not share code with the engine.
  const fixture::value f = fixture::load("plan_fixtures");
  double worst = 0;
  for (const auto& c : f["nct_cdf_quadrature"].arr()) {
    const double got = boost::math::cdf(detail::non_central_t(c["df"].num(), c["ncp"].num()), c["t"].num());
    worst = std::max(worst, fixture::relative_error(got, c["cdf"].num()));
  }
  MESSAGE("noncentral t cdf, worst relative error vs quadrature: " << worst);
  CHECK(worst < 1e-10);
}

TEST_CASE("power of general contrasts agrees with scipy.stats.nct") {
  // Source: scipy.stats.nct / scipy.stats.t with the pooled and Satterthwaite formulas written
  // out in tests/reference/plan_fixtures.py.
  const fixture::value f = fixture::load("plan_fixtures");
  double worst_power = 0, worst_df = 0, worst_ncp = 0;
  for (const auto& c : f["contrast_power"].arr()) {
    const std::vector<std::size_t> n = sizes(c["n"]);
    const contrast_power p = power_of_contrast(c["coefficients"].numbers(), c["means"].numbers(),
                                               c["sds"].numbers(), n, request_of(c));
    worst_power = std::max(worst_power, power_error(p.power, c["power"].num()));
    worst_df = std::max(worst_df, fixture::relative_error(p.df, c["df"].num()));
    worst_ncp = std::max(worst_ncp, fixture::relative_error(p.ncp, c["ncp"].num()));
  }
  MESSAGE("contrast power, worst relative error vs scipy nct: power " << worst_power << ", df " << worst_df
                                                                     << ", ncp " << worst_ncp);
  CHECK(worst_power < 1e-8);
  CHECK(worst_df < 1e-12);
  CHECK(worst_ncp < 1e-12);
}

TEST_CASE("the smallest sample size is the ceiling of statsmodels' continuous solution, and minimal") {
  // Source: statsmodels TTestIndPower.solve_power; the integer answer must be its ceiling, and
  // power(n) >= target > power(n - 1) must hold by our own evaluation.
  const fixture::value f = fixture::load("plan_fixtures");
  for (const auto& c : f["two_group_sample_size"].arr()) {
    const sample_size s = smallest_sample_size(c["coefficients"].numbers(), c["means"].numbers(), c["sds"].numbers(),
                                               c["ratios"].numbers(), request_of(c), c["target"].num());
    CHECK(s.reached);
    CHECK(s.base == static_cast<std::size_t>(c["smallest_n1"].num()));
    CHECK(s.achieved.power >= c["target"].num());
    CHECK(s.power_one_less < c["target"].num());
    CHECK(s.n[1] == s.n[0] * static_cast<std::size_t>(c["ratios"][1].num()));
  }
}

TEST_CASE("Cohen's classic figure: d = 0.5, two-sided alpha 0.05, power 0.80 needs 64 per group") {
  // Cohen 1988, Statistical Power Analysis for the Behavioral Sciences, table 2.4.1 (n = 64 for
  // d = .50 at power .80, two-tailed a = .05; from memory, and statsmodels solve_power gives 63.77).
  const std::vector<double> c = {1, -1}, means = {0.5, 0}, sds = {1, 1}, ratios = {1, 1};
  const sample_size s = smallest_sample_size(c, means, sds, ratios, {}, 0.8);
  CHECK(s.base == 64);
  CHECK(s.n == std::vector<std::size_t>{64, 64});
}

TEST_CASE("detectable contrast agrees with root finding on scipy's nct power") {
  // Source: scipy.optimize.brentq on the scipy.stats.nct power (tests/reference/plan_fixtures.py).
  const fixture::value f = fixture::load("plan_fixtures");
  double worst = 0;
  for (const auto& c : f["detectable"].arr()) {
    const std::vector<std::size_t> n = sizes(c["n"]);
    const double got = detectable_contrast(c["coefficients"].numbers(), c["sds"].numbers(), n, request_of(c),
                                           c["target"].num());
    worst = std::max(worst, fixture::relative_error(got, c["detectable"].num()));
  }
  MESSAGE("detectable contrast, worst relative error vs scipy: " << worst);
  CHECK(worst < 1e-8);
}

TEST_CASE("sample sizes with unequal ratios and Welch are minimal") {
  // Property check of the search itself (power from the scipy-verified function above).
  const std::vector<double> c = {1, -0.5, -0.5}, means = {12, 10.5, 11}, sds = {2, 3, 1.5}, ratios = {2, 1, 1};
  for (planned_test test : {planned_test::pooled, planned_test::welch}) {
    power_request r;
    r.test = test;
    const sample_size s = smallest_sample_size(c, means, sds, ratios, r, 0.9);
    CHECK(s.reached);
    CHECK(s.n[0] == 2 * s.base);
    CHECK(s.n[1] == s.base);
    CHECK(s.achieved.power >= 0.9);
    CHECK(s.power_one_less < 0.9);
  }
  // Fractional ratios are rounded up per level: 1 : 1.5 gives 4 and 6 at base 4.
  const std::vector<double> two = {1, -1}, two_means = {0, 2}, two_sds = {1, 1}, frac = {1, 1.5};
  const sample_size s = smallest_sample_size(two, two_means, two_sds, frac, {}, 0.8);
  CHECK(s.n[1] == static_cast<std::size_t>(std::ceil(1.5 * static_cast<double>(s.base) - 1e-9)));
}

TEST_CASE("optimal allocation is the exact integer optimum") {
  // Checked by exhaustive enumeration of every allocation of the total (an independent brute
  // force), for several designs.
  const std::vector<std::vector<double>> contrasts = {{1, -1, 0}, {1, -0.5, -0.5}, {3, -1, -1, -1}, {1, -2, 1}};
  const std::vector<std::vector<double>> sd_sets = {{1, 3, 2}, {2, 1, 1}, {1, 1, 2, 4}, {1.5, 1, 2}};
  for (std::size_t d = 0; d < contrasts.size(); ++d) {
    const auto& c = contrasts[d];
    const auto& sds = sd_sets[d];
    for (std::size_t total : {std::size_t{12}, std::size_t{17}, std::size_t{30}}) {
      const std::vector<std::size_t> got = optimal_allocation(c, sds, total);
      std::size_t sum = 0;
      for (std::size_t x : got) sum += x;
      CHECK(sum == total);
      // Brute force over the involved levels, each at least 2.
      std::vector<std::size_t> involved;
      for (std::size_t i = 0; i < c.size(); ++i)
        if (c[i] != 0) involved.push_back(i);
      double best = std::numeric_limits<double>::infinity();
      std::vector<std::size_t> trial(c.size(), 0);
      std::function<void(std::size_t, std::size_t)> search = [&](std::size_t level, std::size_t left) {
        if (level + 1 == involved.size()) {
          if (left < 2) return;
          trial[involved[level]] = left;
          best = std::min(best, variance_of(c, sds, trial));
          return;
        }
        for (std::size_t x = 2; x + 2 * (involved.size() - level - 1) <= left; ++x) {
          trial[involved[level]] = x;
          search(level + 1, left - x);
        }
      };
      search(0, total);
      CHECK(variance_of(c, sds, got) <= best * (1 + 1e-14));
      for (std::size_t i = 0; i < c.size(); ++i)
        if (c[i] == 0) CHECK(got[i] == 0);
    }
  }
  // Common practice: with equal SDs, a control compared with the mean of two treatments gets
  // twice the units of each (n proportional to abs(c_i)).
  CHECK(optimal_allocation(std::vector<double>{1, -0.5, -0.5}, std::vector<double>{2, 2, 2}, 40) ==
        std::vector<std::size_t>{20, 10, 10});
  // n proportional to sigma_i for a pair: SDs 1 and 3 split 40 units 10 : 30.
  CHECK(optimal_allocation(std::vector<double>{1, -1}, std::vector<double>{1, 3}, 40) ==
        std::vector<std::size_t>{10, 30});
  CHECK_THROWS_AS(optimal_allocation(std::vector<double>{1, -1}, std::vector<double>{1, 1}, 3), analysis_error);
}

TEST_CASE("the smallest allocated total is minimal and beats equal allocation") {
  const std::vector<double> c = {1, -1}, means = {10, 12}, sds = {1, 3};
  const allocated_sample_size a = smallest_allocated_total(c, means, sds, {planned_test::welch}, 0.8);
  CHECK(a.reached);
  CHECK(a.achieved.power >= 0.8);
  CHECK(a.power_one_less < 0.8);
  const sample_size equal = smallest_sample_size(c, means, sds, std::vector<double>{1, 1}, {planned_test::welch}, 0.8);
  CHECK(a.total <= equal.n[0] + equal.n[1]);
  CHECK(a.n[1] > a.n[0]);
}

TEST_CASE("simulated power of the engine's own test agrees with the analytic value") {
  // The analytic power must fall inside the 99% Clopper-Pearson interval of the rejection rate
  // of the engine's pooled and Welch tests on simulated normal data (Monte Carlo error only;
  // the Welch analytic value is an approximation, good to about 0.01 at these n).
  const std::vector<double> c = {1, -0.5, -0.5}, means = {12, 10.5, 10.8}, sds = {2, 2, 2};
  const std::vector<std::size_t> n = {10, 8, 8};
  for (planned_test test : {planned_test::pooled, planned_test::welch}) {
    power_request r;
    r.test = test;
    const contrast_power analytic = power_of_contrast(c, means, sds, n, r);
    const simulated_power sim = simulate_power(c, means, sds, n, r, 4000, 20261201);
    MESSAGE(to_string(test) << ": analytic " << analytic.power << ", simulated " << sim.power << " [" << sim.low
                            << ", " << sim.high << "]");
    CHECK(sim.low <= analytic.power + (test == planned_test::welch ? 0.01 : 0.0));
    CHECK(analytic.power - (test == planned_test::welch ? 0.01 : 0.0) <= sim.high);
    CHECK(simulate_power(c, means, sds, n, r, 200, 7).rejections == simulate_power(c, means, sds, n, r, 200, 7).rejections);
  }
}

TEST_CASE("designs that cannot be analysed are refused with a clear error") {
  const std::vector<double> c = {1, -1}, means = {0, 1}, sds = {1, 1};
  power_request welch;
  welch.test = planned_test::welch;
  CHECK_THROWS_AS(power_of_contrast(c, means, sds, std::vector<std::size_t>{1, 5}, welch), analysis_error);
  CHECK_THROWS_AS(power_of_contrast(c, means, sds, std::vector<std::size_t>{1, 1}, {}), analysis_error);
  CHECK_THROWS_AS(power_of_contrast(c, means, std::vector<double>{1, 0}, std::vector<std::size_t>{5, 5}, {}), analysis_error);
  CHECK_THROWS_AS(smallest_sample_size(c, means, sds, std::vector<double>{1, 1}, {}, 0.04), usage_error);
  CHECK_THROWS_AS(smallest_sample_size(c, std::vector<double>{1, 1}, sds, std::vector<double>{1, 1}, {}, 0.8),
                  analysis_error);
  // Inputs outside the representable range are refused instead of failing inside the noncentral
  // t (found by trying --n 18446744073709551615 and --sd 1e308 on the command line).
  CHECK_THROWS_AS(power_of_contrast(c, means, sds, std::vector<std::size_t>{std::size_t(-1), 5}, {}), analysis_error);
  CHECK_THROWS_AS(power_of_contrast(c, means, std::vector<double>{1e308, 1}, std::vector<std::size_t>{5, 5}, {}), analysis_error);
  CHECK_THROWS_AS(power_of_contrast(c, means, std::vector<double>{1e-308, 1}, std::vector<std::size_t>{5, 5}, {}), analysis_error);
  CHECK_THROWS_AS(smallest_sample_size(c, means, sds, std::vector<double>{1, 1e7}, {}, 0.8), usage_error);
  // Zero-effect power equals alpha (the test's size): a fact of any level-alpha test.
  CHECK(power_of_contrast(c, std::vector<double>{1, 1}, sds, std::vector<std::size_t>{5, 5}, {}).power ==
        doctest::Approx(0.05).epsilon(1e-12));
}

TEST_CASE("several contrasts: the common design serves all of them") {
  // Property of the design: every contrast's power at the level-wise largest requirement is at
  // least the target (power grows with every n_i), and the limiting contrast needs that design.
  planning_request r;
  r.levels = {"peat", "coir", "bark"};
  r.means = {31, 34, 29.5};
  r.sds = {4, 4, 4};
  contrast a, b;
  a.name = "coir - peat";
  a.coefficients = {-1, 1, 0};
  b.name = "peat - bark";
  b.coefficients = {1, 0, -1};
  r.contrasts = {a, b};
  r.goal = planning_goal::sample_size;
  r.ratios = {1, 1, 1};
  r.target_power = 0.8;
  const planning_result result = plan_trial(r);
  REQUIRE(result.plans.size() == 2);
  REQUIRE(result.power_at_common.size() == 2);
  for (double p : result.power_at_common) CHECK(p >= 0.8);
  for (std::size_t i = 0; i < 3; ++i)
    CHECK(result.common_n[i] == std::max(result.plans[0].n[i], result.plans[1].n[i]));
  // peat - bark (difference 1.5) needs more units than coir - peat (difference 3).
  CHECK(result.limiting_contrast == "peat - bark");
}
