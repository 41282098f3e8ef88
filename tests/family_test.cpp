// Standard families: trends against numpy's QR of the (weighted) Vandermonde matrix, the others
// by construction.
#include "contrasta/family.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <numeric>

#include "contrasta/error.hpp"
#include "fixture.hpp"

using namespace contrasta;

namespace {
double sum(const std::vector<double>& v) { return std::accumulate(v.begin(), v.end(), 0.0); }
}

TEST_CASE("trend contrasts agree with numpy.linalg.qr of the weighted Vandermonde matrix") {
  // tests/reference/multiplicity_fixtures.py: Q of W^(1/2) V, polynomial values W^(-1/2) Q,
  // coefficients p (unweighted) or n p (weighted), scaled to sum |c| = 2, last coefficient > 0.
  auto fx = fixture::load("multiplicity_fixtures");
  for (const auto& c : fx["trends"].arr()) {
    auto x = c["x"].numbers();
    auto n = c["n"].numbers();
    std::vector<double> ones(x.size(), 1.0);
    for (auto [key, w] : {std::pair{"unweighted", ones}, std::pair{"weighted", n}}) {
      auto got = orthogonal_polynomial_contrasts(x, w);
      const auto& want = c[key];
      REQUIRE(got.size() == want.size());
      for (std::size_t d = 0; d < got.size(); ++d) {
        auto wd = want[d].numbers();
        for (std::size_t i = 0; i < wd.size(); ++i) CHECK_MESSAGE(std::abs(got[d][i] - wd[i]) < 1e-10, key << " degree " << d + 1);
      }
    }
  }
}

TEST_CASE("trend family: level values from the option, from numeric level names, or 1..k") {
  const std::vector<std::string> doses = {"0", "10", "20", "40"};
  const std::vector<std::size_t> n = {5, 5, 5, 5};
  auto from_names = make_family("trend", doses, n);
  auto given = make_family("trend=0,10,20,40", doses, n);
  REQUIRE(from_names.size() == 3);
  CHECK(from_names[0].name == "linear");
  CHECK(from_names[1].name == "quadratic");
  CHECK(from_names[2].name == "cubic");
  for (std::size_t d = 0; d < 3; ++d) CHECK(from_names[d].coefficients == given[d].coefficients);
  // Equally spaced (names are not numbers): the classical table -3,-1,1,3 / 1,-1,-1,1 /
  // -1,3,-3,1 (common-practice values, e.g. any design-of-experiments text), scaled to sum |c| = 2.
  auto equal = make_family("trend", {"low", "mid", "high", "top"}, n);
  const double linear[] = {-0.75, -0.25, 0.25, 0.75}, quadratic[] = {0.5, -0.5, -0.5, 0.5}, cubic[] = {-0.25, 0.75, -0.75, 0.25};
  for (std::size_t i = 0; i < 4; ++i) {
    CHECK(equal[0].coefficients[i] == doctest::Approx(linear[i]).epsilon(1e-12));
    CHECK(equal[1].coefficients[i] == doctest::Approx(quadratic[i]).epsilon(1e-12));
    CHECK(equal[2].coefficients[i] == doctest::Approx(cubic[i]).epsilon(1e-12));
  }
  // Three equally spaced levels: the middle linear coefficient is exactly zero (the level is
  // not involved in the linear contrast).
  auto three = make_family("trend", {"a", "b", "c"}, {4, 4, 4});
  CHECK(three[0].coefficients[1] == 0.0);
  auto weighted = make_family("trend-weighted", doses, {3, 7, 4, 10});
  CHECK(weighted[0].name == "linear (n-weighted)");
  for (const auto& c : weighted) CHECK(std::abs(sum(c.coefficients)) < 1e-12);
  CHECK_THROWS_AS(make_family("trend=1,2,3", doses, n), analysis_error);
  CHECK_THROWS_AS(make_family("trend=1,2,2,3", doses, n), analysis_error);
  CHECK_THROWS_AS(make_family("trend=1,2,x,3", doses, n), usage_error);
}

TEST_CASE("helmert, adjacent, versus and grand-mean by construction") {
  const std::vector<std::string> levels = {"a", "b", "c", "d"};
  const std::vector<std::size_t> n = {3, 3, 3, 3};
  auto helmert = make_family("helmert", levels, n);
  REQUIRE(helmert.size() == 3);
  CHECK(helmert[0].coefficients == std::vector<double>{1, -1.0 / 3, -1.0 / 3, -1.0 / 3});
  CHECK(helmert[2].coefficients == std::vector<double>{0, 0, 1, -1});
  auto adjacent = make_family("adjacent", levels, n);
  REQUIRE(adjacent.size() == 3);
  CHECK(adjacent[1].coefficients == std::vector<double>{0, -1, 1, 0});
  auto versus = make_family("versus=b", levels, n);
  REQUIRE(versus.size() == 3);
  for (const auto& c : versus) CHECK(c.coefficients[1] == -1);
  auto grand = make_family("grand-mean", levels, n);
  REQUIRE(grand.size() == 4);
  CHECK(grand[3].coefficients == std::vector<double>{-0.25, -0.25, -0.25, 0.75});
  for (const auto& family : {helmert, adjacent, versus, grand})
    for (const auto& c : family) CHECK(std::abs(sum(c.coefficients)) < 1e-15);
  CHECK(all_pairs(levels).size() == 6);
  CHECK_THROWS_AS(make_family("versus=z", levels, n), analysis_error);
  CHECK_THROWS_AS(make_family("zigzag", levels, n), usage_error);
}
