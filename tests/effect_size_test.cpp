// Tests of the standardized contrasts (src/effect_size.cpp).
#include <doctest/doctest.h>

#include <cmath>
#include <vector>

#include <pcg_random.hpp>

#include "contrasta/contrast.hpp"
#include "contrasta/dataset.hpp"
#include "contrasta/effect_size.hpp"
#include "contrasta/prepared.hpp"
#include "fixture.hpp"

using namespace contrasta;

namespace {

contrast make_contrast(std::vector<double> coefficients) {
  contrast c;
  c.name = "test";
  c.coefficients = std::move(coefficients);
  return c;
}

prepared_data prepared_from(const std::vector<std::vector<double>>& groups) {
  std::vector<std::string> levels;
  for (std::size_t i = 0; i < groups.size(); ++i) levels.push_back("g" + std::to_string(i + 1));
  return prepare(make_dataset(levels, groups));
}

// Interval end: both infinite (one-sided) or relatively close.
double end_error(double got, const fixture::value& want) {
  if (want.is_null()) return std::isinf(got) ? 0.0 : 1.0;
  return fixture::relative_error(got, want.num(), 1e-3);
}

// Normal deviates for the coverage simulations (Box-Muller on pcg32).
struct normals {
  pcg32 engine;
  double operator()() {
    const double u1 = (static_cast<double>(engine() >> 5) + 0.5) * 0x1.0p-27;
    const double u2 = static_cast<double>(engine()) * 0x1.0p-32;
    return std::sqrt(-2 * std::log(u1)) * std::cos(6.283185307179586 * u2);
  }
};

}  // namespace

TEST_CASE("standardized contrast and its interval agree with scipy nct inversion") {
  // Source: scipy.stats.nct.cdf inverted by scipy.optimize.brentq (Steiger & Fouladi 1997),
  // tests/reference/effect_size_fixtures.py.
  const fixture::value f = fixture::load("effect_size_fixtures");
  double worst_estimate = 0, worst_end = 0;
  for (const auto& c : f["cases"].arr()) {
    std::vector<std::vector<double>> groups;
    for (const auto& g : c["groups"].arr()) groups.push_back(g.numbers());
    analysis_options o;
    o.conf = c["conf"].num();
    o.side = parse_alternative(c["alternative"].str());
    const effect_size_result e = effect_sizes(prepared_from(groups), make_contrast(c["coefficients"].numbers()), o);
    worst_estimate = std::max(worst_estimate, fixture::relative_error(e.standardized.estimate, c["standardized"].num()));
    worst_estimate = std::max(worst_estimate, fixture::relative_error(e.scaled_contrast, c["scaled_contrast"].num(), 1e-12));
    worst_end = std::max(worst_end, end_error(e.standardized.ci_low, c["standardized_low"]));
    worst_end = std::max(worst_end, end_error(e.standardized.ci_high, c["standardized_high"]));
    CHECK(*e.standardized.df == c["df"].num());
  }
  MESSAGE("standardized contrast vs scipy: estimate " << worst_estimate << ", interval ends " << worst_end);
  CHECK(worst_estimate < 1e-12);
  CHECK(worst_end < 1e-8);
}

TEST_CASE("Bonett's standardized contrast agrees with the published formula") {
  // Source: Bonett 2008, Psychol. Methods 13:99-109, between-subjects standardized linear
  // contrast with the unweighted-variance standardizer and its delta-method variance, written
  // out independently in tests/reference/effect_size_fixtures.py (formula check; no published
  // worked example is reproduced because none could be quoted reliably from memory).
  const fixture::value f = fixture::load("effect_size_fixtures");
  double worst = 0;
  for (const auto& c : f["cases"].arr()) {
    std::vector<std::vector<double>> groups;
    for (const auto& g : c["groups"].arr()) groups.push_back(g.numbers());
    analysis_options o;
    o.conf = c["conf"].num();
    o.side = parse_alternative(c["alternative"].str());
    const effect_size_result e = effect_sizes(prepared_from(groups), make_contrast(c["coefficients"].numbers()), o);
    worst = std::max(worst, fixture::relative_error(e.bonett.estimate, c["bonett"].num()));
    worst = std::max(worst, fixture::relative_error(e.bonett.se, c["bonett_se"].num()));
    worst = std::max(worst, end_error(e.bonett.ci_low, c["bonett_low"]));
    worst = std::max(worst, end_error(e.bonett.ci_high, c["bonett_high"]));
  }
  MESSAGE("Bonett standardized contrast vs formula: worst relative error " << worst);
  CHECK(worst < 1e-12);
}

TEST_CASE("coefficients are scaled so that their absolute values sum to 2") {
  // 2a - b - c and a - (b + c)/2 are the same comparison and give the same effect size.
  const std::vector<std::vector<double>> groups = {{5.1, 6.3, 5.8, 6.0}, {4.2, 4.9, 5.0, 4.4}, {4.8, 5.5, 5.2, 4.6}};
  const prepared_data p = prepared_from(groups);
  const effect_size_result a = effect_sizes(p, make_contrast({2, -1, -1}), {});
  const effect_size_result b = effect_sizes(p, make_contrast({1, -0.5, -0.5}), {});
  CHECK(a.scale == doctest::Approx(0.5));
  CHECK(b.scale == doctest::Approx(1.0));
  CHECK(a.standardized.estimate == doctest::Approx(b.standardized.estimate).epsilon(1e-14));
  CHECK(a.bonett.ci_low == doctest::Approx(b.bonett.ci_low).epsilon(1e-14));
  CHECK(a.scaled_coefficients == std::vector<double>{1, -0.5, -0.5});
}

TEST_CASE("interval coverage is close to nominal in simulation") {
  // Definition of a confidence interval: over repeated samples it covers the true value with
  // the stated probability. The nct interval is exact under normality with equal variances;
  // Bonett's is a large-sample interval that also holds under unequal variances (his
  // simulations show coverage near nominal at these n). 2000 samples: the 99.9% binomial band
  // around 0.95 is about +-0.016; Bonett's gets an extra 0.01 for its approximation.
  normals z{pcg32(2026u, 7u)};
  const std::vector<double> c = {1, -0.5, -0.5};
  const std::vector<std::size_t> n = {15, 12, 20};
  const std::vector<double> mean = {11, 10, 9.5};
  const int runs = 2000;
  SUBCASE("equal variances: noncentral t interval") {
    const double sigma = 2;
    const double truth = (mean[0] - 0.5 * mean[1] - 0.5 * mean[2]) / sigma;
    int covered = 0;
    for (int r = 0; r < runs; ++r) {
      std::vector<std::vector<double>> g(3);
      for (std::size_t i = 0; i < 3; ++i)
        for (std::size_t j = 0; j < n[i]; ++j) g[i].push_back(mean[i] + sigma * z());
      const effect_size_result e = effect_sizes(prepared_from(g), make_contrast(c), {});
      covered += e.standardized.ci_low <= truth && truth <= e.standardized.ci_high;
    }
    CHECK(std::abs(covered / double(runs) - 0.95) < 0.016);
  }
  SUBCASE("unequal variances: Bonett interval") {
    const std::vector<double> sd = {1, 2, 3};
    const double sigma = std::sqrt((1 + 4 + 9) / 3.0);
    const double truth = (mean[0] - 0.5 * mean[1] - 0.5 * mean[2]) / sigma;
    int covered = 0;
    for (int r = 0; r < runs; ++r) {
      std::vector<std::vector<double>> g(3);
      for (std::size_t i = 0; i < 3; ++i)
        for (std::size_t j = 0; j < n[i]; ++j) g[i].push_back(mean[i] + sd[i] * z());
      const effect_size_result e = effect_sizes(prepared_from(g), make_contrast(c), {});
      covered += e.bonett.ci_low <= truth && truth <= e.bonett.ci_high;
    }
    CHECK(std::abs(covered / double(runs) - 0.95) < 0.026);
  }
}

TEST_CASE("effect sizes the data do not allow are NaN with a note") {
  // A level of one observation: no Bonett variance (n_i - 1 = 0), the pooled version still works.
  const prepared_data p = prepared_from({{1.0, 2.0, 3.0}, {4.0}});
  const effect_size_result e = effect_sizes(p, make_contrast({1, -1}), {});
  CHECK(std::isnan(e.bonett.estimate));
  CHECK(std::isfinite(e.standardized.estimate));
  CHECK(!e.notes.empty());
  // A linear combination that is not a contrast has no standardized effect size.
  const effect_size_result linear = effect_sizes(p, make_contrast({1, 1}), {});
  CHECK(std::isnan(linear.standardized.estimate));
  CHECK(std::isnan(linear.bonett.estimate));
  // A constant response has no SD to standardize by.
  const effect_size_result constant = effect_sizes(prepared_from({{2.0, 2.0}, {2.0, 2.0}}), make_contrast({1, -1}), {});
  CHECK(std::isnan(constant.standardized.estimate));
  CHECK(std::isnan(constant.bonett.estimate));
}

TEST_CASE("noncentrality limits bracket the observed t") {
  // At df -> large the noncentral t tends to a shifted normal, so the limits approach
  // t -+ z_{0.975} (a property of the distribution, checked at df = 1e6 to 1e-4).
  const auto [low, high] = noncentrality_limits(2.5, 1e6, 0.95, alternative::two_sided);
  CHECK(low == doctest::Approx(2.5 - 1.959963984540054).epsilon(1e-4));
  CHECK(high == doctest::Approx(2.5 + 1.959963984540054).epsilon(1e-4));
}
