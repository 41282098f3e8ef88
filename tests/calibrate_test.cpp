// Calibration by simulation against the theory it must reproduce.
#include "contrasta/calibrate.hpp"

#include <doctest/doctest.h>

#include <boost/math/distributions/normal.hpp>
#include <cmath>
#include <string>
#include <vector>

using namespace contrasta;

namespace {

// Blom normal scores rescaled to the exact sample mean 0 and sample SD `sd`.
std::vector<double> exact_sd_sample(std::size_t n, double sd) {
  boost::math::normal standard;
  std::vector<double> x;
  double m = 0;
  for (std::size_t i = 1; i <= n; ++i) {
    x.push_back(boost::math::quantile(standard, (static_cast<double>(i) - 0.375) / (static_cast<double>(n) + 0.25)));
    m += x.back();
  }
  m /= static_cast<double>(n);
  double ss = 0;
  for (double& v : x) {
    v -= m;
    ss += v * v;
  }
  const double scale = sd / std::sqrt(ss / static_cast<double>(n - 1));
  for (double& v : x) v *= scale;
  return x;
}

const calibration_row& row_of(const calibration_report& r, const std::string& method, const std::string& model) {
  for (auto& row : r.rows)
    if (row.method == method && row.model == model) return row;
  throw std::runtime_error("no calibration row " + method + " " + model);
}

}  // namespace

TEST_CASE("n = (5, 20), SDs (4, 1): pooled t is liberal, Welch holds alpha") {
  const auto p = prepare(make_dataset({"small", "large"}, {exact_sd_sample(5, 4), exact_sd_sample(20, 1)}));
  calibration_request request;
  request.datasets = 6000;
  request.methods = {"pooled", "welch"};
  request.models = {error_model::normal};
  analysis_options o;
  o.seed = 20261201;
  o.alpha = 0.05;
  const auto report = calibrate(p, request, o);
  const auto& pooled = row_of(report, "pooled", "normal");
  const auto& welch = row_of(report, "welch", "normal");
  MESSAGE("pooled type I " << pooled.type1_error << " (se " << pooled.type1_se << "), welch " << welch.type1_error
                           << " (se " << welch.type1_se << ")");
  // Theory (Box 1954; the pooled SE here is sqrt(MSE (1/5 + 1/20)) = 0.95 against the true
  // sqrt(16/5 + 1/20) = 1.80): pooled |t| is inflated by about 1.9, so its size is near
  // P(|Z| > 1.96/1.9) = 0.30 (scipy, below: 0.310).
  CHECK(pooled.type1_error > 0.20);
  // Against the scipy figure 0.3104: the binomial 99% band of 6000 datasets, +-2.576
  // sqrt(.31 .69/6000) = +-0.0154, plus the reference's own 0.0019 (99%).
  CHECK(std::abs(pooled.type1_error - 0.3104) < 0.0154 + 0.0019);
  // Outside reference for this design: scipy.stats.ttest_ind on 400,000 datasets drawn by numpy
  // (seed 7; run by hand on 2026-12-01) rejects 5.22% with equal_var=False and 31.04% with
  // equal_var=True (Monte Carlo SE 0.03 and 0.07 points). Welch band asserted: the binomial 99%
  // band of 6000 datasets around 0.0522, +-2.576 sqrt(.052 .948/6000) = +-0.0074, plus the
  // reference's own 0.0009 (99%).
  CHECK(std::abs(welch.type1_error - 0.0522) < 0.0074 + 0.0009);
  CHECK(within_bradley_band(welch.type1_error, 0.05));
  CHECK(!within_bradley_band(pooled.type1_error, 0.05));
  // The Monte Carlo SE of a rejection rate near 0.05 over 6000 datasets: sqrt(.05 .95/6000).
  CHECK(welch.type1_se == doctest::Approx(std::sqrt(welch.type1_error * (1 - welch.type1_error) / 6000)).epsilon(0.01));
}

TEST_CASE("the same seed gives identical calibration for any thread count") {
  const auto p =
      prepare(make_dataset({"a", "b", "c"}, {exact_sd_sample(6, 2), exact_sd_sample(9, 1), exact_sd_sample(7, 3)}));
  calibration_request request;
  request.datasets = 300;
  request.methods = {"pooled", "welch"};
  request.effect = 2.0;
  analysis_options o;
  o.seed = 7;
  o.threads = 1;
  const auto one = calibrate(p, request, o);
  o.threads = 2;
  const auto two = calibrate(p, request, o);
  REQUIRE(one.rows.size() == two.rows.size());
  REQUIRE(one.rows.size() == 4);  // two methods, two error models
  for (std::size_t i = 0; i < one.rows.size(); ++i) {
    CHECK(one.rows[i].type1_error == two.rows[i].type1_error);
    CHECK(one.rows[i].type1_se == two.rows[i].type1_se);
    CHECK(one.rows[i].worst_type1_error == two.rows[i].worst_type1_error);
    REQUIRE(one.rows[i].power.has_value());
    CHECK(*one.rows[i].power == *two.rows[i].power);
    CHECK(one.rows[i].contrasts == 3);
  }
  // A different seed gives a different simulation.
  o.seed = 8;
  const auto other = calibrate(p, request, o);
  bool differs = false;
  for (std::size_t i = 0; i < one.rows.size(); ++i)
    differs = differs || other.rows[i].type1_error != one.rows[i].type1_error;
  CHECK(differs);
}

TEST_CASE("power grows with the effect and equal means give no power beyond alpha") {
  const auto p = prepare(make_dataset({"a", "b"}, {exact_sd_sample(10, 1), exact_sd_sample(10, 1)}));
  // make the observed means differ so that --effect has a pattern to scale
  auto data = make_dataset({"a", "b"}, {exact_sd_sample(10, 1), exact_sd_sample(10, 1)});
  for (std::size_t i = data.offsets[1]; i < data.offsets[2]; ++i) data.values[i] += 0.5;
  const auto q = prepare(data);
  calibration_request request;
  request.datasets = 2000;
  request.methods = {"pooled"};
  request.models = {error_model::normal};
  request.effect = 1.0;
  analysis_options o;
  o.seed = 3;
  const auto r = calibrate(q, request, o);
  // Power of the two-sample t with n = 10 per group at delta = 1 SD, alpha 0.05 two-sided:
  // statsmodels.stats.power.TTestIndPower().power(effect_size=1, nobs1=10, alpha=0.05) = 0.5620
  // (noncentral t, df 18, ncp = 1/sqrt(0.2) = 2.236). 2000 datasets: 99% band
  // +- 2.576 sqrt(.56 .44 / 2000) = +-0.029.
  REQUIRE(r.rows.size() == 1);
  CHECK(std::abs(*r.rows[0].power - 0.562) < 0.03);
  CHECK_THROWS(calibrate(p, request, o));  // equal observed means: no pattern to scale
}
