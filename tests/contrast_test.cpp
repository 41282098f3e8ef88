// The contrast language and the standard families. Expected coefficients follow by hand from
// the definitions (common practice; no outside source needed for linear algebra on small cases).
#include <doctest/doctest.h>

#include <cmath>

#include "contrasta/contrast.hpp"
#include "contrasta/error.hpp"
#include "contrasta/family.hpp"

using namespace contrasta;

static const std::vector<std::string> levels = {"compost", "manure", "control", "high dose", "10mg"};

TEST_CASE("expressions become coefficients in level order") {
  auto c = parse_contrast("organic: (compost + manure)/2 - control", levels);
  CHECK(c.name == "organic");
  CHECK(c.coefficients == std::vector<double>{0.5, 0.5, -1, 0, 0});
  c = parse_contrast("2*compost - manure - control", levels);
  CHECK(c.name == "2*compost - manure - control");
  CHECK(c.coefficients == std::vector<double>{2, -1, -1, 0, 0});
  c = parse_contrast("[high dose] - [10mg]", levels);
  CHECK(c.coefficients == std::vector<double>{0, 0, 0, 1, -1});
  c = parse_contrast("10mg - control", levels);  // a name starting with a digit, written bare
  CHECK(c.coefficients == std::vector<double>{0, 0, -1, 0, 1});
  c = parse_contrast("-(compost - manure) * 3 / 1.5", levels);
  CHECK(c.coefficients == std::vector<double>{-2, 2, 0, 0, 0});
  c = parse_contrast("x: compost/3 + manure/3 + control/3 - [high dose]", levels);
  CHECK(c.sums_to_zero());
  CHECK_NOTHROW(check_contrast(c, false));
}

TEST_CASE("malformed expressions and unknown levels fail with the position") {
  CHECK_THROWS_WITH_AS(parse_contrast("compost - peat", levels), doctest::Contains("unknown level 'peat'"), analysis_error);
  CHECK_THROWS_WITH_AS(parse_contrast("Compost - manure", levels), doctest::Contains("did you mean 'compost'"), analysis_error);
  CHECK_THROWS_WITH_AS(parse_contrast("(compost - manure", levels), doctest::Contains("closing ')'"), analysis_error);
  CHECK_THROWS_WITH_AS(parse_contrast("compost * manure", levels), doctest::Contains("multiplied"), analysis_error);
  CHECK_THROWS_WITH_AS(parse_contrast("compost / manure", levels), doctest::Contains("division by a level"), analysis_error);
  CHECK_THROWS_WITH_AS(parse_contrast("compost / 0", levels), doctest::Contains("division by zero"), analysis_error);
  CHECK_THROWS_WITH_AS(parse_contrast("compost - manure + 1", levels), doctest::Contains("constant term"), analysis_error);
  CHECK_THROWS_WITH_AS(parse_contrast("[high dose - control", levels), doctest::Contains("closing ']'"), analysis_error);
  CHECK_THROWS_WITH_AS(parse_contrast("name:", levels), doctest::Contains("empty"), analysis_error);
  CHECK_THROWS_AS(check_contrast(parse_contrast("compost + manure", levels), false), analysis_error);
  CHECK_NOTHROW(check_contrast(parse_contrast("compost + manure", levels), true));
}

TEST_CASE("coefficients in level order") {
  auto c = parse_coefficients("k: 1, 0, -1/2, -1/2, 0", levels);
  CHECK(c.name == "k");
  CHECK(c.coefficients == std::vector<double>{1, 0, -0.5, -0.5, 0});
  CHECK_THROWS_AS(parse_coefficients("k: 1,-1", levels), analysis_error);
  CHECK_THROWS_AS(parse_coefficients("k: 1,x,0,0,-1", levels), analysis_error);
}

TEST_CASE("two-level contrasts know their positive and negative level") {
  auto c = parse_contrast("control - manure", levels);
  auto [plus, minus] = c.two_levels();
  CHECK(plus == 2);
  CHECK(minus == 1);
  CHECK(c.is_pair());
  CHECK(parse_contrast("(compost + manure)/2 - control", levels).two_levels().first == static_cast<std::size_t>(-1));
}

TEST_CASE("families by construction") {
  std::vector<std::string> l = {"a", "b", "c", "d"};
  std::vector<std::size_t> n = {3, 3, 3, 3};
  auto pairs = make_family("all-pairs", l, n);
  CHECK(pairs.size() == 6);
  auto versus = make_family("versus=b", l, n);
  CHECK(versus.size() == 3);
  for (const auto& c : versus) CHECK(c.coefficients[1] == -1);
  auto adjacent = make_family("adjacent", l, n);
  CHECK(adjacent.size() == 3);
  CHECK(adjacent[0].coefficients == std::vector<double>{-1, 1, 0, 0});
  auto helmert = make_family("helmert", l, n);
  CHECK(helmert.size() == 3);
  // Helmert contrasts are mutually orthogonal with equal n.
  for (std::size_t i = 0; i < helmert.size(); ++i)
    for (std::size_t j = i + 1; j < helmert.size(); ++j) {
      double dot = 0;
      for (std::size_t k = 0; k < 4; ++k) dot += helmert[i].coefficients[k] * helmert[j].coefficients[k];
      CHECK(std::abs(dot) < 1e-15);
    }
  auto grand = make_family("grand-mean", l, n);
  CHECK(grand.size() == 4);
  for (const auto& c : grand) CHECK(c.sums_to_zero());
  CHECK_THROWS_AS(make_family("versus=zz", l, n), analysis_error);
  CHECK_THROWS_AS(make_family("nonsense", l, n), usage_error);
}
