// Bootstrap of a contrast of means: intervals against scipy.stats.bootstrap, the bootstrap-t
// test, reproducibility. Outside references are named beside each check.
#include <doctest/doctest.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstring>
#include <limits>

#include "contrasta/error.hpp"
#include "contrasta/resample.hpp"
#include "distributions.hpp"
#include "fixture.hpp"
#include "random.hpp"
#include "resample_intervals.hpp"

using namespace contrasta;

namespace {

// A dataset as the reader builds it: values centred on `centre` (the reader does this exactly
// in decimal; the fixture values have few decimals, so double subtraction is exact enough).
prepared_data make_prepared(const std::vector<std::string>& levels, const std::vector<std::vector<double>>& groups,
                            double centre = 0) {
  std::vector<std::vector<double>> shifted = groups;
  for (auto& g : shifted)
    for (double& y : g) y -= centre;
  dataset d = make_dataset(levels, shifted);
  d.centre = centre;
  return prepare(d);
}

contrast make_contrast(std::vector<double> c) {
  contrast out;
  out.name = "contrast";
  out.expression = "contrast";
  out.coefficients = std::move(c);
  return out;
}

// Monte Carlo standard deviation of a bootstrap quantile at tail probability q from B
// resamples: sqrt(q(1-q)/B) / f(x_q) (the asymptotic variance of a sample quantile, e.g.
// Serfling 1980 section 2.3.3), with the bootstrap density approximated by a normal of the
// bootstrap standard error.
double quantile_sd(double q, double resamples, double standard_error) {
  const double z = boost::math::quantile(contrasta::detail::normal(), q);
  const double density = boost::math::pdf(contrasta::detail::normal(), z) / standard_error;
  return std::sqrt(q * (1 - q) / resamples) / density;
}

}  // namespace

TEST_CASE("percentile and BCa intervals agree with scipy.stats.bootstrap within Monte Carlo error") {
  const fixture::value doc = fixture::load("bootstrap_fixtures");
  const double ours = 400000;
  for (const auto& c : doc["cases"].arr()) {
    INFO(c["name"].str());
    std::vector<std::vector<double>> groups;
    for (const auto& g : c["groups"].arr()) groups.push_back(g.numbers());
    const double centre = c["centre"].num() != 0 ? c["centre"].num() : groups[0][0];
    const prepared_data p = make_prepared(c["levels"].strings(), groups, centre);
    const contrast k = make_contrast(c["coefficients"].numbers());
    // the jackknife acceleration: closed form against scipy-style brute-force leave-one-out
    CHECK(fixture::relative_error(detail::bca_acceleration(p, k), c["acceleration"].num(), 1e-300) < 1e-9);

    analysis_options o;
    o.resamples = static_cast<std::uint64_t>(ours);
    o.seed = 77;
    o.threads = 2;
    const double se = c["standard_error"].num(), theirs = c["resamples"].num();
    // Both ends are independent Monte Carlo estimates (ours and scipy's): the difference has SD
    // sqrt(sd_ours^2 + sd_scipy^2); 5 SD makes a false alarm a one-in-a-million event per end.
    // BCa ends sit at the adjusted tail probabilities (taken here with z0 = 0 and the
    // fixture's acceleration) and move also with the estimated z0, another Monte Carlo
    // quantity, and the density of a skewed bootstrap distribution in its long tail is lower than
    // the normal approximation (scipy itself scatters by 0.016 over seeds on the 1e6 case, where
    // the formula says 0.010), hence 1.5x.
    auto tolerance_at = [&](double q) { return 5 * std::hypot(quantile_sd(q, ours, se), quantile_sd(q, theirs, se)); };
    const double tolerance = tolerance_at(0.025);
    const double a = c["acceleration"].num(), z = boost::math::quantile(contrasta::detail::normal(), 0.025);
    const double bca_low_tolerance = 1.5 * tolerance_at(detail::bca_level(0, a, z));
    const double bca_high_tolerance = 1.5 * tolerance_at(1 - detail::bca_level(0, a, -z));
    o.interval = bootstrap_interval::percentile;
    const method_result percentile = bootstrap_contrast(p, k, o);
    CHECK(fixture::relative_error(percentile.estimate, c["estimate"].num()) < 1e-10);
    CHECK(std::abs(percentile.ci_low - c["percentile"][0].num()) < tolerance);
    CHECK(std::abs(percentile.ci_high - c["percentile"][1].num()) < tolerance);
    o.interval = bootstrap_interval::bca;
    const method_result bca = bootstrap_contrast(p, k, o);
    MESSAGE(c["name"].str(), ": differences from scipy in tolerance units, percentile ",
            std::abs(percentile.ci_low - c["percentile"][0].num()) / tolerance, " ",
            std::abs(percentile.ci_high - c["percentile"][1].num()) / tolerance, ", BCa ",
            std::abs(bca.ci_low - c["bca"][0].num()) / bca_low_tolerance, " ",
            std::abs(bca.ci_high - c["bca"][1].num()) / bca_high_tolerance);
    CHECK(std::abs(bca.ci_low - c["bca"][0].num()) < bca_low_tolerance);
    CHECK(std::abs(bca.ci_high - c["bca"][1].num()) < bca_high_tolerance);
    CHECK(bca.method == "bootstrap");
    CHECK(bca.resamples.value() == o.resamples);
    CHECK_FALSE(bca.exact);
    if (c.has("welch_p")) {
      // Large normal samples: bootstrap-t and Welch agree to O(1/n) (Hall 1988); reference
      // scipy.stats.ttest_ind(equal_var=False) and the Welch interval with scipy's t quantile.
      o.interval = bootstrap_interval::studentized;
      const method_result t = bootstrap_contrast(p, k, o);
      const double width = c["welch_ci"][1].num() - c["welch_ci"][0].num();
      CHECK(std::abs(t.ci_low - c["welch_ci"][0].num()) < 0.02 * width);
      CHECK(std::abs(t.ci_high - c["welch_ci"][1].num()) < 0.02 * width);
      CHECK(std::abs(t.p_value - c["welch_p"].num()) < 0.02);
      CHECK(t.p_interval.value()[0] < t.p_value);
      CHECK(t.p_value < t.p_interval.value()[1]);
    }
  }
}

TEST_CASE("quantile with linear interpolation (numpy.percentile default)") {
  // numpy.percentile([1, 2, 3, 4, 10], [0, 25, 40, 90, 100]) = [1, 2, 2.6, 7.6, 10]
  std::vector<double> x{10, 3, 1, 4, 2};
  CHECK(detail::quantile_linear(x, 0.0) == 1);
  CHECK(detail::quantile_linear(x, 0.25) == 2);
  CHECK(detail::quantile_linear(x, 0.40) == doctest::Approx(2.6).epsilon(1e-14));
  CHECK(detail::quantile_linear(x, 0.90) == doctest::Approx(7.6).epsilon(1e-14));
  CHECK(detail::quantile_linear(x, 1.0) == 10);
}

TEST_CASE("several quantiles in one pass equal one selection per level") {
  // the reference is quantile_linear above (numpy's definition), level by level
  pcg32 rng = detail::block_stream(77, 0);
  auto uniform = [&] { return detail::uniform01(rng); };
  std::vector<std::vector<double>> cases;
  for (std::size_t n : {20000u, 100000u, 16385u}) {
    std::vector<double> x(n);
    for (double& v : x) v = std::log(uniform() + 1e-12) - std::log(uniform() + 1e-12);  // skewed both ways
    cases.push_back(x);
    std::vector<double> tied(x);
    for (double& v : tied) v = std::round(v * 4) / 4;  // many ties
    cases.push_back(tied);
    std::vector<double> sorted(x);
    std::sort(sorted.begin(), sorted.end());  // a sample taken at a stride sees a sorted input
    cases.push_back(sorted);
    std::vector<double> infinite(x);
    for (std::size_t i = 0; i < n; i += 7) infinite[i] = i % 2 ? HUGE_VAL : -HUGE_VAL;  // t* can be infinite
    cases.push_back(infinite);
  }
  cases.push_back(std::vector<double>(50000, 3.25));  // constant
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const std::vector<std::array<double, 2>> level_pairs{
      {0.025, 0.975}, {0.0, 1.0}, {1e-9, 1 - 1e-9}, {0.5, 0.5000001}, {0.3, nan}, {0.9, 0.1}};
  for (const auto& x : cases)
    for (const auto& levels : level_pairs) {
      CAPTURE(x.size());
      CAPTURE(levels[0]);
      CAPTURE(levels[1]);
      std::vector<double> work(x);
      const std::vector<double> got = detail::quantiles_linear(work, levels);
      for (std::size_t i = 0; i < 2; ++i) {
        if (std::isnan(levels[i])) {
          CHECK(std::isnan(got[i]));
          continue;
        }
        std::vector<double> one(x);
        const double expected = detail::quantile_linear(one, levels[i]);
        CHECK(std::memcmp(&got[i], &expected, sizeof expected) == 0);
      }
    }
}

TEST_CASE("BCa pieces: bias from ties counted half, level formula") {
  // share below 0 = (1 + 3)/(2*4) = 0.5 -> z0 = 0 (scipy's _percentile_of_score 'mean' rule)
  CHECK(detail::bca_bias({-1, 0, 0, 2}) == doctest::Approx(0).epsilon(1e-15));
  CHECK(detail::bca_bias({1, 2}) == -HUGE_VAL);
  // with z0 = 0 and a = 0 BCa is the percentile method: level = Phi(z_alpha)
  CHECK(detail::bca_level(0, 0, -1.959963984540054) == doctest::Approx(0.025).epsilon(1e-12));
  // Efron 1987 eq. 2.3 by hand: z0 = 0.1, a = 0.05, z = -1.96: 0.1 + (-1.86)/(1 + 0.093)
  const double z = 0.1 + (-1.86) / (1 + 0.05 * 1.86);
  CHECK(detail::bca_level(0.1, 0.05, -1.96) ==
        doctest::Approx(boost::math::cdf(contrasta::detail::normal(), z)).epsilon(1e-14));
}

TEST_CASE("bootstrap is bit-identical for 1, 2, 4 and 8 threads; joint rows match the single test") {
  const prepared_data p =
      make_prepared({"a", "b", "c"},
                    {{4.1, 5.2, 3.9, 6.0, 5.5, 9.9, 4.4}, {6.2, 7.1, 5.9, 8.4, 6.6}, {5.0, 5.1, 4.7, 6.3, 5.8, 5.2}});
  const contrast k = make_contrast({1, -0.5, -0.5});
  analysis_options o;
  o.resamples = 20001;
  o.seed = 99;
  std::vector<method_result> results;
  std::vector<std::vector<double>> rows;
  const std::vector<contrast> family{k, make_contrast({1, -1, 0})};
  for (unsigned threads : {1u, 2u, 4u, 8u}) {
    o.threads = threads;
    for (auto interval : {bootstrap_interval::percentile, bootstrap_interval::bca, bootstrap_interval::studentized}) {
      o.interval = interval;
      results.push_back(bootstrap_contrast(p, k, o));
    }
    rows.push_back(joint_bootstrap_statistics(p, family, o).statistics);
  }
  for (std::size_t i = 3; i < results.size(); ++i) {
    CHECK(results[i].ci_low == results[i % 3].ci_low);
    CHECK(results[i].ci_high == results[i % 3].ci_high);
    CHECK(results[i].p_value == results[i % 3].p_value);
  }
  for (std::size_t i = 1; i < rows.size(); ++i) CHECK(rows[i] == rows[0]);
  // Joint rows with the same seed are the same resamples: counting |t*| >= |t| in the first
  // column gives the single-contrast bootstrap-t p exactly.
  const joint_resampling j = joint_bootstrap_statistics(p, family, o);
  std::uint64_t hits = 0;
  for (std::uint64_t r = 0; r < j.resamples; ++r)
    hits += std::abs(j.row(r)[0]) >= std::abs(j.observed[0]) * (1 - 1e-12);
  CHECK((static_cast<double>(hits) + 1) / (static_cast<double>(j.resamples) + 1) == results[0].p_value);
  CHECK(j.observed[0] == results[0].statistic);
}

TEST_CASE("bootstrap one-sided intervals, general linear combinations and errors") {
  const prepared_data p =
      make_prepared({"a", "b"}, {{1000.5, 1001.25, 999.75, 1002.0, 1000.0}, {1003.5, 1004.0, 1002.25, 1005.5}}, 1000.5);
  analysis_options o;
  o.resamples = 5000;
  o.side = alternative::greater;
  const method_result g = bootstrap_contrast(p, make_contrast({-1, 1}), o);
  CHECK(std::isinf(g.ci_high));
  CHECK(g.ci_low < g.estimate);
  o.side = alternative::less;
  const method_result l = bootstrap_contrast(p, make_contrast({-1, 1}), o);
  CHECK(std::isinf(l.ci_low));
  // the mean of b in data units (sum c = 1 adds the centre back): 1003.8125
  o.side = alternative::two_sided;
  const method_result mean_b = bootstrap_contrast(p, make_contrast({0, 1}), o);
  CHECK(mean_b.estimate == doctest::Approx(1003.8125).epsilon(1e-15));
  CHECK(mean_b.ci_low > 1002);
  CHECK(mean_b.ci_high < 1005.6);
  CHECK(mean_b.estimand == "linear combination of means");
  // constant groups: every resample equals the data, the interval collapses to the estimate
  // and no resample is as extreme as an infinite t (p = 1/(m+1)); no NaN anywhere
  const prepared_data flat = make_prepared({"a", "b"}, {{2, 2, 2}, {3, 3, 3, 3}});
  for (auto interval : {bootstrap_interval::percentile, bootstrap_interval::bca, bootstrap_interval::studentized}) {
    o.interval = interval;
    const method_result f = bootstrap_contrast(flat, make_contrast({-1, 1}), o);
    CHECK(f.estimate == 1.0);
    if (interval != bootstrap_interval::studentized) {
      CHECK(f.ci_low == 1.0);
      CHECK(f.ci_high == 1.0);
    }
    CHECK(f.p_value == doctest::Approx(1.0 / 5001));
  }
  const prepared_data tiny = make_prepared({"a", "b"}, {{1}, {2, 3}});
  CHECK_THROWS_AS(bootstrap_contrast(tiny, make_contrast({1, -1}), o), analysis_error);
}
