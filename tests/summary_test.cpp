// Summaries from the sorted copy of each level that prepare keeps: every statistic read from
// the sorted copy must be exactly (bit for bit) the value of the unsorted computation.
#include "contrasta/summary.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <vector>

#include "contrasta/prepared.hpp"

using namespace contrasta;

namespace {

// Samples of every size from 1 to 40 with many ties (a coarse grid) and values at the centre.
std::vector<std::vector<double>> tied_samples() {
  std::mt19937_64 rng(11);
  std::vector<std::vector<double>> out;
  for (std::size_t n = 1; n <= 40; ++n) {
    std::vector<double> x;
    for (std::size_t i = 0; i < n; ++i) x.push_back(0.5 * static_cast<double>(rng() % 9) - 2);
    out.push_back(x);
  }
  return out;
}

std::vector<double> sorted(std::vector<double> x) {
  std::sort(x.begin(), x.end());
  return x;
}

}  // namespace

TEST_CASE("median, trimmed mean and winsorized variance from a sorted sample equal the unsorted ones exactly") {
  for (const auto& x : tied_samples()) {
    const auto s = sorted(x);
    CHECK(median_of_sorted(s) == median_of(x));
    for (double trim : {0.0, 0.1, 0.2, 0.25, 0.5}) {
      CHECK(trimmed_mean_of_sorted(s, trim) == trimmed_mean_of(x, trim));
      const double w = winsorized_variance_of(x, trim), ws = winsorized_variance_of_sorted(s, trim);
      CHECK((w == ws || (std::isnan(w) && std::isnan(ws))));
    }
  }
  CHECK(std::isnan(median_of_sorted({})));
}

TEST_CASE("absolute deviations from a sorted sample come out sorted") {
  for (const auto& x : tied_samples()) {
    const auto s = sorted(x);
    for (double centre : {median_of(x), -2.0, 0.25, 5.0}) {
      std::vector<double> want;
      for (double y : x) want.push_back(std::abs(y - centre));
      std::sort(want.begin(), want.end());
      CHECK(sorted_absolute_deviations(s, centre) == want);
    }
  }
}

TEST_CASE("prepare keeps each level sorted and summarizes as summarize does") {
  // Large enough that prepare shares the levels out between threads.
  std::mt19937_64 rng(3);
  std::normal_distribution<double> noise(0, 1);
  std::vector<std::vector<double>> groups(7);
  for (std::size_t g = 0; g < groups.size(); ++g)
    for (std::size_t i = 0; i < 6000 + 37 * g; ++i) groups[g].push_back(std::round(100 * noise(rng)) / 100);
  const auto data = make_dataset({"a", "b", "c", "d", "e", "f", "g"}, groups);
  const auto p = prepare(data);
  const auto plain = summarize(data);
  REQUIRE(p.groups.size() == plain.size());
  for (std::size_t i = 0; i < plain.size(); ++i) {
    const auto s = sorted_group(p, i);
    CHECK(std::vector<double>(s.begin(), s.end()) == sorted(groups[i]));
    CHECK(p.groups[i].centred_mean == plain[i].centred_mean);
    CHECK(p.groups[i].sum_squares == plain[i].sum_squares);
    CHECK(p.groups[i].centred_median == plain[i].centred_median);
    CHECK(p.groups[i].centred_trimmed_mean == plain[i].centred_trimmed_mean);
    CHECK(p.groups[i].winsorized_variance == plain[i].winsorized_variance);
    CHECK(p.groups[i].min == plain[i].min);
    CHECK(p.groups[i].max == plain[i].max);
  }
}
