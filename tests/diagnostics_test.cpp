// Diagnostics against outside references. Sources beside each check; the reference values come
// from tests/reference/diagnostics_fixtures.py (scipy 1.10.1 on Debian) unless stated.
#include "contrasta/diagnostics.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <numeric>
#include <random>
#include <string>
#include <vector>

#include "distributions.hpp"
#include "fixture.hpp"

using namespace contrasta;

namespace {

using fixture::prepared_of;

using fixture::groups_of;

void check_close(double got, double want, double tolerance, const char* what, double floor = 1e-300) {
  INFO(std::string(what) << ": got " << got << ", want " << want);
  CHECK(fixture::relative_error(got, want, floor) <= tolerance);
}

}  // namespace

TEST_CASE("variance tests, skewness and kurtosis agree with scipy to 1e-10") {
  const auto fx = fixture::load("diagnostics_fixtures");
  for (auto& c : fx["variance"].arr()) {
    const auto p = prepared_of(groups_of(c["groups"]));
    const auto tests = variance_tests(p);
    REQUIRE(tests.size() == 5);
    // scipy.stats.levene(center="mean"), (center="median"); f_oneway on |y - trim_mean(y, 0.1)|;
    // scipy.stats.bartlett; scipy.stats.fligner(center="median").
    const char* keys[] = {"levene_mean", "levene_median", "levene_trimmed", "bartlett", "fligner"};
    const char* names[] = {"levene-mean", "levene-median", "levene-trimmed", "bartlett", "fligner"};
    for (int t = 0; t < 5; ++t) {
      CHECK(tests[t].test == names[t]);
      // Statistics are O(1); with tied data one can be exactly 0 in scipy and 1e-31 here, so near
      // zero the check is absolute at 1e-13.
      check_close(tests[t].statistic, c[keys[t]]["statistic"].num(), 1e-10, keys[t], 1e-3);
      check_close(tests[t].p_value, c[keys[t]]["p_value"].num(), 1e-10, keys[t]);
    }
    // scipy.stats.skew(bias=False), scipy.stats.kurtosis(bias=False): Joanes & Gill G1, G2.
    const auto shapes = describe_shapes(p);
    const auto skew = c["skewness"].numbers();
    for (std::size_t i = 0; i < shapes.size(); ++i) {
      // Shape statistics are dimensionless and O(1): near zero (a symmetric level) the check is
      // absolute at 1e-11. Both programs leave rounding noise there: for {100.1, 99.9, 100.3}
      // (exact skewness 0) scipy gives -3.2e-13 and we give +3.2e-13, because the deviations
      // from a mean 500 SDs from zero carry about 1e-13 of relative error (found by the live run).
      check_close(shapes[i].skewness, skew[i], 1e-10, "skewness", 0.1);
      if (!c["kurtosis"][i].is_null())
        check_close(shapes[i].excess_kurtosis, c["kurtosis"][i].num(), 1e-10, "kurtosis", 0.1);
    }
  }
}

TEST_CASE("Fligner-Killeen ties the two middle deviations of an even level as numpy's median does") {
  // Found by the live differential test: the median as a + (b - a)/2 broke the tie between the
  // two middle deviations that numpy's (a + b)/2 keeps, and the statistic moved by 3e-4.
  // Reference: scipy.stats.fligner(center="median") 1.10.1 on these two groups.
  const std::vector<std::vector<double>> groups{
      {0.7256484728499508, 0.4540691034213449, -0.16419630238668959, 0.6521653167309129, 0.5978560045371317,
       0.12231502765762681, -0.6996699822373658, -0.8341735770435733, -0.3591554592619792, 0.10598397574234764,
       -0.6469434821959608, -0.12049295367776569, 0.04528968488541352, 0.5055556239900318, 0.15905353173816272,
       -0.8246222626723296, -0.6254673918401489, 0.24195342960907684, 0.04136232896554792, 0.7913841259025896,
       -0.5019196468799889, -0.008516969622890058},
      {0.920542254162201, -0.6763685730012275, -1.2632718345013514, 0.4212875637214626}};
  const auto tests = variance_tests(prepared_of(groups));
  REQUIRE(tests[4].test == "fligner");
  check_close(tests[4].statistic, 4.8889265255271885, 1e-12, "fligner statistic");
  check_close(tests[4].p_value, 0.027029487294298094, 1e-12, "fligner p");
}

// scipy.stats.shapiro runs Royston's AS R94 Fortran in single precision (REAL): its W carries
// about 6-7 significant digits and its p-value is a float. We compute in double, so the
// reference caps agreement: W to 2e-5 relative (float rounding accumulated over sums of n terms,
// about sqrt(n) * 6e-8: 4e-6 at n = 5000). p comes from log(1 - W), which magnifies the error in
// W by 1/(1 - W) (at n = 5000, W = 0.9989, scipy's W error of 1.6e-6 moves p by 0.5-2%), so our p
// is compared directly only for n <= 500 (2e-3 relative or 1e-6 absolute), and for every n the
// p-value step alone is checked: Royston's p of scipy's own W against scipy's p, 2e-3 relative.
// quality.md records the same limits of the reference.
TEST_CASE("Shapiro-Wilk agrees with scipy.stats.shapiro within its single precision") {
  const auto fx = fixture::load("diagnostics_fixtures");
  double worst_w = 0, worst_p = 0;
  for (auto& c : fx["shapiro"].arr()) {
    const auto x = c["x"].numbers();
    const auto r = shapiro_wilk(x);
    INFO("n = " << x.size());
    const double ew = fixture::relative_error(r.w, c["w"].num());
    const double want_p = c["p_value"].num();
    CHECK(ew <= 2e-5);
    // For n = 3, p = (6/pi)(asin(sqrt W) - pi/3) has slope 3/(pi sqrt(W(1-W))) at W, which
    // becomes steep as W nears 3/4; scipy's single-precision W (off by a few float steps, ~1e-6)
    // then moves its p by more than 1e-6 (W = 0.7500247: scipy p 5.3275e-5, the formula on that
    // very W 5.4420e-5), so the allowance grows with that slope.
    const double w_slack = x.size() == 3 ? 3 / (3.14159265358979 * std::sqrt(r.w * (1 - r.w))) * 1e-6 : 0.0;
    if (x.size() <= 500) CHECK(std::abs(r.p_value - want_p) <= 2e-3 * want_p + 1e-6 + w_slack);
    CHECK(std::abs(shapiro_wilk_p_value(c["w"].num(), x.size()) - want_p) <= 2e-3 * want_p + 1e-6 + w_slack);
    worst_w = std::max(worst_w, ew);
    if (want_p > 1e-3 && x.size() <= 500) worst_p = std::max(worst_p, std::abs(r.p_value - want_p) / want_p);
  }
  MESSAGE("Shapiro-Wilk vs scipy: worst W relative error "
          << worst_w << ", worst p relative error (p > 1e-3, n <= 500) " << worst_p);
  for (auto& c : fx["variance"].arr()) {
    const auto p = prepared_of(groups_of(c["groups"]));
    const auto normal = normality_tests(p);
    REQUIRE(normal.size() == p.groups.size() + 1);  // every fixture group has n >= 3
    for (std::size_t i = 0; i < p.groups.size(); ++i) {
      CHECK(fixture::relative_error(normal[i].statistic, c["shapiro"][i]["statistic"].num()) <= 2e-5);
    }
    CHECK(!normal.back().level.has_value());
    CHECK(fixture::relative_error(normal.back().statistic, c["shapiro_residuals"]["statistic"].num()) <= 2e-5);
  }
}

TEST_CASE("Shapiro-Wilk edge cases") {
  // n = 3 has the exact p of Shapiro & Wilk 1965: an equally spaced triple gives W = 1, p = 1.
  const std::vector<double> spaced = {1, 2, 3};
  const auto r = shapiro_wilk(spaced);
  CHECK(r.w == doctest::Approx(1.0).epsilon(1e-12));
  CHECK(r.p_value == doctest::Approx(1.0).epsilon(1e-9));
  // W is bounded below by 3/4 for n = 3 (Shapiro & Wilk 1965), reached with two equal values:
  // then p = (6/pi)(asin(sqrt(3/4)) - pi/3) = 0.
  const std::vector<double> two_equal = {1, 1, 2};
  const auto q = shapiro_wilk(two_equal);
  CHECK(q.w == doctest::Approx(0.75).epsilon(1e-7));
  CHECK(q.p_value <= 1e-6);
  // Undefined outside 3 <= n <= 5000 or with zero range.
  CHECK(std::isnan(shapiro_wilk(std::vector<double>{1, 2}).w));
  CHECK(std::isnan(shapiro_wilk(std::vector<double>{4, 4, 4, 4}).w));
  // Location and scale invariance (a property of W): shifting by 1e6 and scaling by 1e-3 keeps W.
  std::vector<double> a = {2.1, 3.4, 1.9, 5.6, 4.4, 3.3, 2.8, 7.9, 3.1};
  std::vector<double> b;
  for (double v : a) b.push_back(1e6 + 1e-3 * v);
  CHECK(shapiro_wilk(b).w == doctest::Approx(shapiro_wilk(a).w).epsilon(1e-8));
}

TEST_CASE("modified z-scores and outliers with input rows") {
  // Formula check (Iglewicz & Hoaglin 1993): data 1..9 and 100. median 5.5, absolute deviations
  // 4.5 3.5 2.5 1.5 .5 .5 1.5 2.5 3.5 94.5, MAD = 2.5; M(100) = 0.6745 * 94.5 / 2.5 = 25.4961.
  std::vector<double> x = {1, 2, 3, 4, 5, 6, 7, 8, 9, 100};
  const auto z = modified_z_scores(x);
  CHECK(z[9] == doctest::Approx(0.6745 * 94.5 / 2.5).epsilon(1e-14));
  CHECK(z[0] == doctest::Approx(0.6745 * -4.5 / 2.5).epsilon(1e-14));
  auto data = make_dataset({"a", "b"}, {{1, 2, 3, 4, 5}, x});
  const auto flagged = find_outliers(data);
  REQUIRE(flagged.size() == 1);
  CHECK(flagged[0].level == 1);
  CHECK(flagged[0].value == 100);
  // make_dataset numbers rows from 2 in order: the 10th value of b is the 15th observation.
  CHECK(flagged[0].row == 16);
  // MAD = 0 (more than half the values tie at the median): the rule cannot score, flags nothing.
  CHECK(std::isnan(modified_z_scores(std::vector<double>{3, 3, 3, 3, 9})[4]));
}

TEST_CASE("ties and a small integer scale") {
  // Counted by hand: values 0 1 1 2 5 5 5 10 -> 5 of 8 observations share their value.
  auto data = make_dataset({"a", "b"}, {{0, 1, 1, 2}, {5, 5, 5, 10}});
  const auto t = describe_ties(data);
  CHECK(t.distinct_values == 5);
  CHECK(t.tied_share == doctest::Approx(5.0 / 8));
  CHECK(t.integer_values);
  CHECK(t.small_integer_scale);
  CHECK(t.scale_max == 10);
  auto continuous = make_dataset({"a", "b"}, {{0.5, 1.25}, {3.5, 100.75}});
  CHECK(!describe_ties(continuous).integer_values);
  CHECK(describe_ties(continuous).tied_share == 0);
}

TEST_CASE("spread balance: SD ratio, n ratio, larger variances in smaller groups") {
  // Group a: n = 4, values 0 4 8 12 -> s^2 = 80/3; group b: n = 8, 1 2 1 2 1 2 1 2 -> s^2 = 2/7.
  const auto p = prepared_of({{0, 4, 8, 12}, {1, 2, 1, 2, 1, 2, 1, 2}});
  const auto s = describe_spread(p);
  CHECK(s.sd_ratio == doctest::Approx(std::sqrt((80.0 / 3) / (2.0 / 7))));
  CHECK(s.n_ratio == 2);
  CHECK(s.smallest_n == 4);
  CHECK(s.largest_sd_level == 0);
  CHECK(s.larger_variances_in_smaller_groups);
  // MSE = (80 + 2)/10; pooled SE^2 = MSE (1/4 + 1/8), separate SE^2 = (80/3)/4 + (2/7)/8.
  const double pooled = 8.2 * (0.25 + 0.125), separate = (80.0 / 3) / 4 + (2.0 / 7) / 8;
  CHECK(s.pooled_se_ratio == doctest::Approx(std::sqrt(pooled / separate)));
  CHECK(s.pooled_se_ratio < 1);
  // Mirror image: the larger variance in the larger group -> pooled is conservative.
  const auto q = prepared_of({{0, 4, 8, 12, 0, 4, 8, 12}, {1, 2, 1, 2}});
  CHECK(!describe_spread(q).larger_variances_in_smaller_groups);
  CHECK(describe_spread(q).pooled_se_ratio > 1);
}

namespace {

// Fligner-Killeen written out the direct way (a stable sort of all the deviations, mid-ranks in
// data order), as the library computed it before it ranked the sorted levels by merging them.
double fligner_by_sorting(const std::vector<std::vector<double>>& groups) {
  std::vector<double> all;
  std::vector<double> medians;
  for (const auto& g : groups) {
    medians.push_back(median_of(g));
    for (double y : g) all.push_back(std::abs(y - medians.back()));
  }
  std::vector<std::size_t> order(all.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return all[a] < all[b]; });
  std::vector<double> ranks(all.size());
  for (std::size_t i = 0; i < order.size();) {
    std::size_t j = i + 1;
    while (j < order.size() && all[order[j]] == all[order[i]]) ++j;
    for (std::size_t m = i; m < j; ++m) ranks[order[m]] = 0.5 * static_cast<double>(i + 1 + j);
    i = j;
  }
  const double N = static_cast<double>(all.size());
  std::vector<double> scores;
  for (double r : ranks) scores.push_back(boost::math::quantile(detail::normal(), 0.5 + r / (2 * (N + 1))));
  const double mean = accurate_mean(scores);
  const double variance = sum_squared_deviations(scores, mean) / (N - 1);
  double between = 0;
  std::size_t start = 0;
  for (const auto& g : groups) {
    const double dm = accurate_mean(std::span<const double>(scores.data() + start, g.size())) - mean;
    start += g.size();
    between += static_cast<double>(g.size()) * dm * dm;
  }
  return between / variance;
}

// Groups with heavy ties (a grid of 0.5), values at the median, odd and even sizes; `scale`
// multiplies the group sizes (large ones take the parallel paths).
std::vector<std::vector<double>> tied_groups(std::size_t scale, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::vector<std::vector<double>> out;
  for (std::size_t g = 0; g < 6; ++g) {
    std::vector<double> x;
    const std::size_t n = scale * (5 + g) + g % 2;
    for (std::size_t i = 0; i < n; ++i) x.push_back(0.5 * static_cast<double>(rng() % (7 + 3 * g)) + static_cast<double>(g));
    out.push_back(x);
  }
  return out;
}

}  // namespace

TEST_CASE("diagnostics read from the sorted levels equal the direct computations exactly") {
  for (std::size_t scale : {1, 3, 2000}) {
    for (std::uint64_t seed : {1, 2, 3}) {
      const auto groups = tied_groups(scale, seed);
      const auto p = prepared_of(groups);
      sample_list samples;
      for (const auto& g : groups) samples.emplace_back(g);
      const auto tests = variance_tests(p);
      REQUIRE(tests.size() == 5);
      CHECK(tests[0].statistic == levene_test(samples, levene_centre::mean).statistic);
      CHECK(tests[1].statistic == levene_test(samples, levene_centre::median).statistic);
      CHECK(tests[2].statistic == levene_test(samples, levene_centre::trimmed, 0.1).statistic);
      CHECK(tests[4].statistic == fligner_test(samples).statistic);
      CHECK(tests[4].statistic == fligner_by_sorting(groups));
      const auto a = find_outliers(p), b = find_outliers(p.data);
      REQUIRE(a.size() == b.size());
      for (std::size_t i = 0; i < a.size(); ++i) CHECK((a[i].row == b[i].row && a[i].robust_z == b[i].robust_z));
      const auto t = describe_ties(p), u = describe_ties(p.data);
      CHECK(t.distinct_values == u.distinct_values);
      CHECK(t.tied_share == u.tied_share);
      CHECK(t.scale_min == u.scale_min);
      CHECK(t.scale_max == u.scale_max);
      CHECK(t.integer_values == u.integer_values);
    }
  }
}
