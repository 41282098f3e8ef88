// Pooled and Welch contrasts against scipy/statsmodels fixtures
// (tests/reference/classical_fixtures.py: scipy.stats.ttest_ind, statsmodels OLS t_test with the
// contrast row, scipy.stats.f_oneway), and against published worked examples.
#include <doctest/doctest.h>

#include <cmath>
#include <iomanip>
#include <sstream>

#include "contrasta/classical.hpp"
#include "contrasta/contrast.hpp"
#include "contrasta/error.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/read.hpp"
#include "fixture.hpp"

using namespace contrasta;

namespace {

prepared_data from_strings(const std::vector<std::string>& levels, const fixture::value& groups) {
  std::string csv = "level,y\n";
  for (std::size_t i = 0; i < levels.size(); ++i)
    for (const auto& v : groups[i].arr()) csv += levels[i] + "," + v.str() + "\n";
  std::istringstream in(csv);
  read_request request;
  auto d = read_datasets(in, "fixture", request);
  return prepare(std::move(d.front()));
}

// Relative error, with an absolute floor for quantities that can be exactly zero (an estimate of
// 0 against statsmodels' 5.6e-17 is agreement): `floor` is the natural scale of the quantity
// (the standard error for estimates and interval ends, 1 for t statistics).
void check_close(double got, double want, double tolerance, double& worst, const char* what, double floor = 1e-300) {
  double e = fixture::relative_error(got, want, floor);
  worst = std::max(worst, e);
  CHECK_MESSAGE(e <= tolerance, std::string(what) << ": got " << std::setprecision(17) << got << ", reference " << want << ", rel " << e);
}

}  // namespace

TEST_CASE("pooled and Welch contrasts agree with scipy/statsmodels to 1e-10") {
  auto doc = fixture::load("classical_fixtures");
  double worst = 0;
  std::size_t checked = 0;
  for (const auto& c : doc["cases"].arr()) {
    auto levels = c["levels"].strings();
    auto p = from_strings(levels, c["groups"]);
    analysis_options o;
    o.conf = c["conf"].num();
    const auto& ref = c["reference"];
    // scipy.stats.f_oneway
    check_close(p.anova.f, ref["anova_f"].num(), 1e-10, worst, "ANOVA F");
    if (ref["anova_p"].num() > 1e-300) check_close(p.anova.p_value, ref["anova_p"].num(), 1e-10, worst, "ANOVA p");
    for (const auto& rc : ref["contrasts"].arr()) {
      contrast k;
      k.name = "fixture";
      k.coefficients = rc["coefficients"].numbers();
      // statsmodels OLS t_test (cell-means model)
      auto r = pooled_contrast(p, k, o);
      const auto& pr = rc["pooled"];
      check_close(r.estimate, pr["estimate"].num(), 1e-10, worst, "pooled estimate", r.se);
      check_close(r.se, pr["se"].num(), 1e-10, worst, "pooled se");
      check_close(r.statistic, pr["t"].num(), 1e-10, worst, "pooled t", 1.0);
      check_close(*r.df, pr["df"].num(), 1e-12, worst, "pooled df");
      if (pr["p"].num() > 1e-300) check_close(r.p_value, pr["p"].num(), 1e-10, worst, "pooled p");
      check_close(r.ci_low, pr["ci_low"].num(), 1e-10, worst, "pooled ci_low", r.se);
      check_close(r.ci_high, pr["ci_high"].num(), 1e-10, worst, "pooled ci_high", r.se);
      if (rc.has("pooled_scipy_k2") && !rc["pooled_scipy_k2"].is_null()) {
        // scipy.stats.ttest_ind(equal_var=True), two levels
        check_close(r.statistic, rc["pooled_scipy_k2"]["t"].num(), 1e-10, worst, "pooled t vs ttest_ind", 1.0);
        if (rc["pooled_scipy_k2"]["p"].num() > 1e-300)
          check_close(r.p_value, rc["pooled_scipy_k2"]["p"].num(), 1e-10, worst, "pooled p vs ttest_ind");
      }
      if (rc.has("welch")) {
        // scipy.stats.ttest_ind(equal_var=False) for pairs; Satterthwaite formula otherwise
        auto w = welch_contrast(p, k, o);
        const auto& wr = rc["welch"];
        check_close(w.se, wr["se"].num(), 1e-10, worst, "welch se");
        check_close(w.statistic, wr["t"].num(), 1e-10, worst, "welch t", 1.0);
        check_close(*w.df, wr["df"].num(), 1e-10, worst, "welch df");
        if (wr["p"].num() > 1e-300) check_close(w.p_value, wr["p"].num(), 1e-10, worst, "welch p");
        check_close(w.ci_low, wr["ci_low"].num(), 1e-10, worst, "welch ci_low", w.se);
        check_close(w.ci_high, wr["ci_high"].num(), 1e-10, worst, "welch ci_high", w.se);
      }
      ++checked;
    }
  }
  CHECK(checked >= 50);
  MESSAGE("classical fixtures: " << checked << " contrasts, worst relative error " << worst);
}

TEST_CASE("Welch two-sample test: published worked examples") {
  // Source: the worked examples of the Wikipedia article "Welch's t-test" (section Examples),
  // which print t, the Welch-Satterthwaite df and p to the digits checked here. The data and the
  // printed values are quoted from memory; scipy.stats.ttest_ind(equal_var=False) on the same
  // data reproduces every printed digit (checked when this test was written).
  SUBCASE("example 1: equal sizes, similar variances") {
    auto p = prepare(make_dataset({"A1", "A2"},
                                  {{27.5, 21.0, 19.0, 23.6, 17.0, 17.9, 16.9, 20.1, 21.9, 22.6, 23.1, 19.6, 19.0, 21.7, 21.4},
                                   {27.1, 22.0, 20.8, 23.4, 23.4, 23.5, 25.8, 22.0, 24.8, 20.2, 21.9, 22.1, 22.9, 20.5, 24.4}}));
    auto c = parse_contrast("A1 - A2", p.data.levels);
    auto w = welch_contrast(p, c, analysis_options{});
    CHECK(w.statistic == doctest::Approx(-2.46).epsilon(0.005 / 2.46));  // printed t = -2.46
    CHECK(*w.df == doctest::Approx(25.0).epsilon(0.05 / 25.0));           // printed nu = 25.0 (24.99)
    CHECK(w.p_value == doctest::Approx(0.021).epsilon(0.0005 / 0.021));   // printed p = 0.021
    auto s = pooled_contrast(p, c, analysis_options{});
    CHECK(*s.df == 28.0);                                                // Student: df = 28
    CHECK(s.p_value == doctest::Approx(0.021).epsilon(0.0005 / 0.021));
  }
  SUBCASE("example 2: unequal sizes, unequal variances") {
    auto p = prepare(make_dataset({"A1", "A2"},
                                  {{17.2, 20.9, 22.6, 18.1, 21.7, 21.4, 23.5, 24.2, 14.7, 21.8},
                                   {21.5, 22.8, 21.0, 23.0, 21.6, 23.6, 22.5, 20.7, 23.4, 21.8, 20.7, 21.7, 21.5, 22.5,
                                    23.6, 21.5, 22.5, 23.5, 21.5, 21.8}}));
    auto c = parse_contrast("A1 - A2", p.data.levels);
    auto w = welch_contrast(p, c, analysis_options{});
    CHECK(w.statistic == doctest::Approx(-1.57).epsilon(0.005 / 1.57));  // printed t = -1.57
    CHECK(*w.df == doctest::Approx(9.9).epsilon(0.05 / 9.9));            // printed nu = 9.9
    CHECK(w.p_value == doctest::Approx(0.149).epsilon(0.0005 / 0.149));  // printed p = 0.149
    auto s = pooled_contrast(p, c, analysis_options{});
    CHECK(s.statistic == doctest::Approx(-2.10).epsilon(0.005 / 2.10));  // Student: t = -2.10
    CHECK(s.p_value == doctest::Approx(0.045).epsilon(0.0005 / 0.045));  // p = 0.045
  }
}

TEST_CASE("Welch needs two observations per involved level; pooled does not") {
  auto p = prepare(make_dataset({"a", "b", "c"}, {{1.0}, {2.0, 3.0, 4.0}, {5.0, 6.0}}));
  contrast c = parse_contrast("a - b", p.data.levels);
  CHECK_THROWS_AS(welch_contrast(p, c, analysis_options{}), analysis_error);
  auto r = pooled_contrast(p, c, analysis_options{});
  CHECK(*r.df == 3.0);  // N - k = 6 - 3: the c = 0 level enters the pooled MSE (methods.md)
  // A level with c_i = 0 does not enter Welch: b - c works although a has one value.
  auto w = welch_contrast(p, parse_contrast("b - c", p.data.levels), analysis_options{});
  CHECK(w.df.has_value());
}

TEST_CASE("one-sided alternatives and interval ends") {
  auto p = prepare(make_dataset({"a", "b"}, {{5.1, 5.9, 6.3, 7.0}, {4.0, 4.4, 5.2, 4.9, 3.8}}));
  contrast c = parse_contrast("a - b", p.data.levels);
  analysis_options two, greater, less;
  greater.side = alternative::greater;
  less.side = alternative::less;
  auto r2 = welch_contrast(p, c, two), rg = welch_contrast(p, c, greater), rl = welch_contrast(p, c, less);
  // Common practice: for t > 0, p(greater) = p(two-sided)/2 and p(less) = 1 - p(greater).
  CHECK(rg.p_value == doctest::Approx(r2.p_value / 2).epsilon(1e-12));
  CHECK(rl.p_value == doctest::Approx(1 - rg.p_value).epsilon(1e-12));
  CHECK(std::isinf(rg.ci_high));
  CHECK(std::isinf(rl.ci_low));
  CHECK(rg.ci_low > r2.ci_low);
}
