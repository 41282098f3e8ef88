// Permutation tests of contrasts, and the pieces under them (combinatorics, random numbers,
// Monte Carlo p-values). Outside references are named beside each check.
#include <doctest/doctest.h>

#include <cstdlib>

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <set>

#include "combinatorics.hpp"
#include "contrasta/error.hpp"
#include "contrasta/resample.hpp"
#include "fixture.hpp"
#include "monte_carlo_p.hpp"
#include "random.hpp"

using namespace contrasta;

namespace {

prepared_data make_prepared(const std::vector<std::string>& levels, const std::vector<std::vector<double>>& groups) {
  return prepare(make_dataset(levels, groups));
}

contrast make_contrast(std::vector<double> c, std::string name = "c") {
  contrast out;
  out.name = name;
  out.expression = name;
  out.coefficients = std::move(c);
  return out;
}

alternative side_of(const std::string& s) {
  if (s == "greater") return alternative::greater;
  if (s == "less") return alternative::less;
  return alternative::two_sided;
}

// The revolving-door order straight from its recursive definition (Kreher & Stinson 1999,
// Combinatorial Algorithms, section 2.3.3): R(n,t) = R(n-1,t), then reversed R(n-1,t-1) with
// n-1 added.
std::vector<std::vector<std::uint32_t>> revolving_door_by_definition(std::uint32_t n, std::uint32_t t) {
  if (t == 0) return {{}};
  if (t == n) {
    std::vector<std::uint32_t> all(n);
    for (std::uint32_t i = 0; i < n; ++i) all[i] = i;
    return {all};
  }
  auto out = revolving_door_by_definition(n - 1, t);
  auto tail = revolving_door_by_definition(n - 1, t - 1);
  for (auto it = tail.rbegin(); it != tail.rend(); ++it) {
    auto s = *it;
    s.push_back(n - 1);
    out.push_back(s);
  }
  return out;
}

}  // namespace

TEST_CASE("binomial and multinomial counts") {
  using namespace contrasta::detail;
  // C(30,15) = 155,117,520 (quality.md P2; any table of binomial coefficients)
  CHECK(binomial(30, 15) == 155117520ULL);
  CHECK(binomial(13, 6) == 1716);
  // C(67,33) = 14,226,520,737,620,288,370 is the largest central binomial below 2^64 (common fact,
  // checked with Python's math.comb); C(68,34) overflows
  CHECK(binomial(67, 33) == 14226520737620288370ULL);
  CHECK(binomial(68, 34) == saturated);
  const std::vector<std::size_t> sizes{4, 5, 5};
  CHECK(multinomial(sizes) == 252252);  // 14!/(4!5!5!) (Python math.factorial)
  const std::vector<std::size_t> big{100, 100, 100};
  CHECK(multinomial(big) == saturated);
}

TEST_CASE("revolving-door order: successor, rank and unrank agree with the recursive definition") {
  using namespace contrasta::detail;
  for (std::uint32_t n = 2; n <= 10; ++n) {
    for (std::uint32_t t = 1; t < n; ++t) {
      const auto expected = revolving_door_by_definition(n, t);
      REQUIRE(expected.size() == binomial(n, t));
      std::vector<std::uint32_t> c(t + 1);
      revolving_door_unrank(0, n, std::span(c.data(), t));
      c[t] = n;
      for (std::size_t r = 0; r < expected.size(); ++r) {
        const std::vector<std::uint32_t> now(c.begin(), c.begin() + t);
        CHECK(now == expected[r]);
        CHECK(revolving_door_rank(expected[r]) == r);
        std::vector<std::uint32_t> u(t);
        revolving_door_unrank(r, n, u);
        CHECK(u == expected[r]);
        if (r + 1 < expected.size()) {
          const door_swap swap = revolving_door_next(c);
          // one element leaves, one enters (the Gray-code property)
          std::set<std::uint32_t> before(now.begin(), now.end()), after(c.begin(), c.begin() + t);
          CHECK(before.count(swap.out) == 1);
          CHECK(after.count(swap.out) == 0);
          CHECK(after.count(swap.in) == 1);
          CHECK(before.count(swap.in) == 0);
        }
      }
    }
  }
}

TEST_CASE("bounded integers are uniform (chi-square against the uniform law)") {
  using namespace contrasta::detail;
  pcg32 rng = block_stream(7, 0);
  // 3 does not divide 2^32: a modulo reduction would be biased, multiply-shift with rejection
  // is not (Lemire 2019). 300,000 draws: chi-square(2) 99.9% point is 13.8 (scipy.stats.chi2.ppf).
  std::array<double, 3> counts{};
  for (int i = 0; i < 300000; ++i) counts[bounded(rng, 3)] += 1;
  double chi = 0;
  for (double c : counts) chi += (c - 1e5) * (c - 1e5) / 1e5;
  CHECK(chi < 13.8);
  const double u = uniform01(rng);
  CHECK(u >= 0);
  CHECK(u < 1);
}

TEST_CASE("Phipson-Smyth p and Clopper-Pearson interval") {
  using namespace contrasta::detail;
  CHECK(phipson_smyth_p(0, 999) == doctest::Approx(0.001).epsilon(1e-15));
  CHECK(phipson_smyth_p(49, 999) == doctest::Approx(0.05).epsilon(1e-15));
  // scipy.stats.beta.ppf(0.005, b, m-b+1) and beta.isf(0.005, b+1, m-b) (scipy 1.10.1)
  struct row {
    std::uint64_t b, m;
    double low, high;
  };
  for (const row& r :
       {row{5, 100, 0.01094033358479003, 0.1351446825356235}, row{0, 999, 0.0, 0.00528958162053871},
        row{999, 999, 0.9947104183794613, 1.0}, row{37, 9999, 0.002322566810718104, 0.005570098523512169}}) {
    const auto ci = clopper_pearson(r.b, r.m);
    CHECK(fixture::relative_error(ci[0], r.low) < 1e-10);
    CHECK(fixture::relative_error(ci[1], r.high) < 1e-10);
  }
}

TEST_CASE("exact permutation p equals scipy.stats.permutation_test(n_resamples=inf)") {
  const fixture::value doc = fixture::load("permutation_fixtures");
  double worst = 0;
  for (const auto& c : doc["cases"].arr()) {
    INFO(c["name"].str());
    std::vector<std::vector<double>> groups;
    for (const auto& g : c["groups"].arr()) groups.push_back(g.numbers());
    const prepared_data p = make_prepared(c["levels"].strings(), groups);
    analysis_options o;
    o.side = side_of(c["alternative"].str());
    o.statistic = c["statistic"].str() == "raw" ? permutation_statistic::raw : permutation_statistic::studentized;
    o.threads = 2;
    const method_result r = permutation_contrast(p, make_contrast(c["coefficients"].numbers()), o);
    CHECK(r.exact);
    CHECK(r.resamples.value() == static_cast<std::uint64_t>(c["arrangements"].num()));
    CHECK(fixture::relative_error(r.p_value, c["p_exact"].num()) < 1e-12);
    worst = std::max(worst, fixture::relative_error(r.p_value, c["p_exact"].num()));
    CHECK(fixture::relative_error(r.statistic, c["observed"].num()) < 1e-10);
    REQUIRE(r.p_interval.has_value());
    CHECK((*r.p_interval)[0] == r.p_value);
    CHECK((*r.p_interval)[1] == r.p_value);
    CHECK(std::isnan(r.ci_low));
    CHECK(r.method == "permutation");
  }
  MESSAGE("largest relative difference from scipy's exact p over ", doc["cases"].size(), " designs: ", worst);
}

TEST_CASE("Monte Carlo p lies in its own 99% interval around the exact p, and is never zero") {
  const fixture::value doc = fixture::load("permutation_fixtures");
  std::size_t inside = 0, total = 0;
  for (const auto& c : doc["cases"].arr()) {
    INFO(c["name"].str());
    std::vector<std::vector<double>> groups;
    for (const auto& g : c["groups"].arr()) groups.push_back(g.numbers());
    const prepared_data p = make_prepared(c["levels"].strings(), groups);
    analysis_options o;
    o.side = side_of(c["alternative"].str());
    o.statistic = c["statistic"].str() == "raw" ? permutation_statistic::raw : permutation_statistic::studentized;
    o.exact = exact_mode::never;
    o.resamples = 20000;
    for (std::uint64_t seed : {1u, 2u, 3u}) {
      o.seed = seed;
      const method_result r = permutation_contrast(p, make_contrast(c["coefficients"].numbers()), o);
      CHECK_FALSE(r.exact);
      CHECK(r.p_value > 0);
      const auto ci = r.p_interval.value();
      ++total;
      inside += ci[0] <= c["p_exact"].num() && c["p_exact"].num() <= ci[1];
    }
  }
  // Each interval covers with probability 0.99. On the committed fixtures with these fixed seeds
  // all do (a miss there means a biased generator or a wrong count). The live run draws new
  // designs, so misses are binomial(total, 0.01): allow the count whose upper tail is below
  // about 1e-6 (6 of 36), so that the live test fails for a real fault, not for chance.
  const bool live = std::getenv("CONTRASTA_FIXTURE") != nullptr;
  const std::size_t misses = total - inside;
  if (live) {
    CHECK(misses <= 2 + total / 8);
  } else {
    CHECK(misses == 0);
  }
}

TEST_CASE("Monte Carlo permutation is bit-identical for 1, 2, 4 and 8 threads") {
  const prepared_data p = make_prepared({"a", "b", "c", "d"}, {{1.2, 3.4, 2.2, 5.1, 0.3, 2.8, 3.3, 1.9, 4.4},
                                                               {2.5, 6.1, 4.4, 7.0, 3.3, 5.5},
                                                               {0.1, 0.5, 0.9, 1.1, 1.4, 0.7, 0.2},
                                                               {3.3, 3.9, 4.1, 2.0, 8.8, 6.6, 7.1, 5.0}});
  const contrast c = make_contrast({1, -1, 1, -1});
  analysis_options o;
  o.exact = exact_mode::never;
  o.resamples = 30001;  // not a multiple of the block size
  o.seed = 12345;
  std::vector<double> p_values;
  std::vector<std::vector<double>> joint_rows;
  const std::vector<contrast> family{c, make_contrast({1, -1, 0, 0}), make_contrast({0, 0, 1, -1})};
  for (unsigned threads : {1u, 2u, 4u, 8u}) {
    o.threads = threads;
    p_values.push_back(permutation_contrast(p, c, o).p_value);
    joint_rows.push_back(joint_permutation_statistics(p, family, o).statistics);
  }
  for (std::size_t i = 1; i < p_values.size(); ++i) {
    CHECK(p_values[i] == p_values[0]);
    CHECK(joint_rows[i] == joint_rows[0]);
  }
  // a different seed gives a different sample of reassignments
  o.seed = 54321;
  CHECK(joint_permutation_statistics(p, family, o).statistics != joint_rows[0]);
}

TEST_CASE("joint permutation statistics") {
  const prepared_data p =
      make_prepared({"a", "b", "c"}, {{4.1, 5.2, 3.9, 6.0, 5.5}, {6.2, 7.1, 5.9, 8.4}, {5.0, 5.1, 4.7, 6.3, 5.8}});
  const std::vector<contrast> family{make_contrast({1, -1, 0}), make_contrast({1, 0, -1}), make_contrast({0, 1, -1})};
  analysis_options o;
  o.resamples = 1'000'000;  // more than the arrangements: exact rows
  const joint_resampling j = joint_permutation_statistics(p, family, o);
  CHECK(j.exact);
  CHECK(j.resamples == 252252);  // 14!/(5! 4! 5!) (Python math.factorial)
  CHECK(j.contrast_count() == 3);
  CHECK(j.statistics.size() == 3 * j.resamples);
  // The observed statistic of each contrast is its Welch t, the same value as the
  // single-contrast result (which the scipy fixtures check).
  const method_result single = permutation_contrast(p, family[0], o);
  CHECK(fixture::relative_error(j.observed[0], single.statistic) < 1e-12);
  // A family over a and b only reassigns a and b: its exact rows give the single-contrast p.
  const std::vector<contrast> pair{family[0]};
  const joint_resampling jp = joint_permutation_statistics(p, pair, o);
  CHECK(jp.resamples == 126);  // C(9,4)
  std::uint64_t hits = 0;
  for (std::uint64_t r = 0; r < jp.resamples; ++r)
    hits += std::abs(jp.row(r)[0]) >= std::abs(jp.observed[0]) * (1 - 1e-12);
  CHECK(fixture::relative_error(static_cast<double>(hits) / static_cast<double>(jp.resamples), single.p_value) < 1e-12);
  // Over every reassignment each group mean averages to the pooled mean, so every raw
  // contrast averages to zero (the permutation distribution of a linear statistic; Pitman 1937).
  o.statistic = permutation_statistic::raw;
  const joint_resampling raw = joint_permutation_statistics(p, family, o);
  for (std::size_t c = 0; c < 3; ++c) {
    double mean = 0;
    for (std::uint64_t r = 0; r < raw.resamples; ++r) mean += raw.row(r)[c];
    CHECK(std::abs(mean / static_cast<double>(raw.resamples)) < 1e-12);
  }
  // Monte Carlo rows when the arrangements exceed the resamples
  o.resamples = 5000;
  const joint_resampling mc = joint_permutation_statistics(p, family, o);
  CHECK_FALSE(mc.exact);
  CHECK(mc.resamples == 5000);
}

TEST_CASE("exact two-group enumeration split across threads by unranking") {
  // 12 vs 12 = 2,704,156 reassignments (more than two blocks): counting is the same for any
  // thread count, and the Gray-code running sums give the same p as a shuffled enumeration
  // checked against scipy in the fixture test.
  std::vector<double> a, b;
  for (int i = 0; i < 12; ++i) {
    a.push_back(std::sin(i * 1.7) * 3 + 10);
    b.push_back(std::cos(i * 0.9) * 1.2 + 11);
  }
  const prepared_data p = make_prepared({"a", "b"}, {a, b});
  analysis_options o;
  std::vector<double> p_values;
  for (unsigned threads : {1u, 2u, 8u}) {
    o.threads = threads;
    const method_result r = permutation_contrast(p, make_contrast({1, -1}), o);
    CHECK(r.exact);
    CHECK(r.resamples.value() == 2704156ULL);
    p_values.push_back(r.p_value);
  }
  CHECK(p_values[1] == p_values[0]);
  CHECK(p_values[2] == p_values[0]);
  // against Monte Carlo with many resamples: inside its 99% interval
  o.exact = exact_mode::never;
  o.resamples = 200000;
  const method_result mc = permutation_contrast(p, make_contrast({1, -1}), o);
  CHECK(mc.p_interval.value()[0] <= p_values[0]);
  CHECK(p_values[0] <= mc.p_interval.value()[1]);
}

TEST_CASE("permutation edge cases") {
  analysis_options o;
  // every observation equal: every reassignment ties with the observed one, p = 1
  const prepared_data flat = make_prepared({"a", "b"}, {{2, 2, 2}, {2, 2, 2, 2}});
  CHECK(permutation_contrast(flat, make_contrast({1, -1}), o).p_value == 1.0);
  // perfectly separated constant groups: only the observed split and no other is as extreme
  // (two-sided: its mirror needs equal sizes); C(7,3) = 35
  const prepared_data split = make_prepared({"a", "b"}, {{1, 1, 1}, {5, 5, 5, 5}});
  CHECK(permutation_contrast(split, make_contrast({1, -1}), o).p_value == doctest::Approx(1.0 / 35));
  // coefficients that do not sum to zero, and a group of one for the studentized statistic
  CHECK_THROWS_AS(permutation_contrast(split, make_contrast({1, 0}), o), analysis_error);
  const prepared_data tiny = make_prepared({"a", "b"}, {{1}, {5, 6, 7}});
  CHECK_THROWS_AS(permutation_contrast(tiny, make_contrast({1, -1}), o), analysis_error);
  o.statistic = permutation_statistic::raw;
  CHECK(permutation_contrast(tiny, make_contrast({1, -1}), o).p_value == doctest::Approx(0.25));  // 1 of C(4,1)
  // a run shorter than a second reports no progress (quality.md: progress for long runs only)
  int progress_calls = 0;
  o.progress = [&](double) { ++progress_calls; };
  permutation_contrast(split, make_contrast({1, -1}), o);
  CHECK(progress_calls == 0);
  o.progress = {};
  // cancellation stops the run with an analysis_error
  std::atomic<bool> cancel{true};
  o.cancel = &cancel;
  CHECK_THROWS_AS(permutation_contrast(split, make_contrast({1, -1}), o), analysis_error);
}

TEST_CASE("calibration: n = (8, 24), larger SD in the smaller group") {
  // Known behaviour (Box 1954; Janssen 1997; Chung & Romano 2013): with the larger variance in
  // the smaller group, the raw-difference permutation test rejects far too often, the
  // studentized one holds alpha approximately (asymptotically exactly; at n = 8 it runs a little
  // liberal: 0.062 over 10,000 datasets in a longer run of this simulation, where Welch's t
  // gives 0.049 and the pooled t 0.242 by scipy.stats.ttest_ind). 2,000 normal datasets with
  // equal means, SDs 4 and 1, 499 reassignments each, alpha = 0.05: the rejection rate has a
  // binomial SD of about 0.005.
  pcg32 rng = contrasta::detail::block_stream(2026, 0);
  auto normal = [&]() {
    // Box-Muller on the portable uniform
    const double u1 = 1.0 - contrasta::detail::uniform01(rng), u2 = contrasta::detail::uniform01(rng);
    return std::sqrt(-2 * std::log(u1)) * std::cos(2 * M_PI * u2);
  };
  analysis_options o;
  o.exact = exact_mode::never;
  o.resamples = 499;
  o.threads = 1;
  int reject_student = 0, reject_raw = 0;
  const int datasets = 2000;
  for (int d = 0; d < datasets; ++d) {
    std::vector<double> small(8), large(24);
    for (double& x : small) x = 4 * normal();
    for (double& x : large) x = normal();
    const prepared_data p = make_prepared({"small", "large"}, {small, large});
    o.seed = static_cast<std::uint64_t>(d);
    o.statistic = permutation_statistic::studentized;
    reject_student += permutation_contrast(p, make_contrast({1, -1}), o).p_value <= 0.05;
    o.statistic = permutation_statistic::raw;
    reject_raw += permutation_contrast(p, make_contrast({1, -1}), o).p_value <= 0.05;
  }
  const double rate_student = reject_student / double(datasets), rate_raw = reject_raw / double(datasets);
  MESSAGE("type I error at alpha 0.05: studentized ", rate_student, ", raw ", rate_raw);
  CHECK(rate_student < 0.08);
  CHECK(rate_raw > 0.15);
  CHECK(rate_raw > rate_student + 0.08);
}
