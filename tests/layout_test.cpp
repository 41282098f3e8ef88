// Tests of the seeded randomisation plan (src/layout.cpp).
#include <doctest/doctest.h>

#include <algorithm>
#include <fstream>
#include <map>
#include <string>
#include <vector>

#include "contrasta/error.hpp"
#include "contrasta/layout.hpp"
#include "distributions.hpp"

using namespace contrasta;

namespace {

layout_design abc(std::size_t replicates, std::uint64_t seed) {
  return {{"a", "b", "c"}, {replicates, replicates, replicates}, {}, seed};
}

std::vector<std::string> treatment_names(const layout_plan& plan) {
  std::vector<std::string> out;
  for (std::size_t t : plan.treatment_of_unit) out.push_back(plan.design.treatments[t]);
  return out;
}

// Upper-tail chi-square probability, for the uniformity checks.
double chi_square_p(double statistic, double df) {
  return boost::math::cdf(boost::math::complement(detail::chi_squared(df), statistic));
}

}  // namespace

TEST_CASE("pcg32 reproduces the published reference outputs") {
  // pcg-c-basic's demo program, seed 42 and stream 54, prints these first six 32-bit outputs
  // (from memory of its documented output; tests/reference/layout_golden.py asserts the same
  // values from an independent Python implementation of PCG XSH RR 64/32).
  pcg32 engine(42u, 54u);
  const std::vector<std::uint32_t> expected = {0xa15c02b7, 0x7b47f409, 0xba1d3330, 0x83d2f293, 0xbfa4784b, 0xcbed606e};
  for (std::uint32_t want : expected) CHECK(engine() == want);
}

TEST_CASE("the plan for seed 5 equals the golden file from the independent implementation") {
  // tests/data/layout_golden_seed5.csv is written by tests/reference/layout_golden.py, which
  // re-implements pcg32, Lemire's bounded integers and Fisher-Yates from their publications.
  // Any change of generator, stream, bounding or shuffle order changes this plan.
  std::ifstream in(std::string(CONTRASTA_TEST_DATA) + "/layout_golden_seed5.csv");
  REQUIRE(in);
  std::string line;
  std::vector<std::string> golden;
  while (std::getline(in, line)) {
    if (line.empty() || line[0] == '#' || line == "unit,treatment") continue;
    golden.push_back(line.substr(line.find(',') + 1));
  }
  REQUIRE(golden.size() == 12);
  CHECK(treatment_names(randomise_layout(abc(4, 5))) == golden);
}

TEST_CASE("every treatment gets exactly its replicates") {
  const layout_design design{{"control", "compost", "bark"}, {4, 6, 3}, {}, 123};
  const layout_plan plan = randomise_layout(design);
  REQUIRE(plan.units() == 13);
  std::vector<std::size_t> counts(3, 0);
  for (std::size_t t : plan.treatment_of_unit) ++counts.at(t);
  CHECK(counts == design.replicates);
}

TEST_CASE("the same seed gives the same plan; other seeds give other plans") {
  const layout_plan first = randomise_layout(abc(5, 2026));
  CHECK(randomise_layout(abc(5, 2026)).treatment_of_unit == first.treatment_of_unit);
  std::size_t differing = 0;
  for (std::uint64_t seed = 0; seed < 20; ++seed)
    differing += randomise_layout(abc(5, seed)).treatment_of_unit != first.treatment_of_unit;
  CHECK(differing == 20);  // 15!/(5!)^3 = 756756 plans: a repeat among 20 seeds would be a flaw
}

TEST_CASE("all orderings are equally likely over many seeds (chi-square)") {
  // One unit per treatment: the 6 orderings of a, b, c should each appear 1/6 of the time.
  // A chi-square goodness-of-fit test (df 5) at the 0.001 level; the seeds are fixed, so the
  // outcome is reproducible, and a biased shuffle (such as swapping with j uniform on [0, n)
  // instead of [0, i]) fails it clearly.
  std::map<std::vector<std::size_t>, double> counts;
  const double seeds = 60000;
  for (std::uint64_t seed = 0; seed < static_cast<std::uint64_t>(seeds); ++seed)
    counts[randomise_layout(abc(1, seed)).treatment_of_unit] += 1;
  REQUIRE(counts.size() == 6);
  double chi2 = 0;
  for (auto& [order, observed] : counts) chi2 += (observed - seeds / 6) * (observed - seeds / 6) / (seeds / 6);
  CHECK(chi_square_p(chi2, 5) > 0.001);

  // Unequal replication a=2, b=3, c=1: at every run position each treatment appears in
  // proportion to its replicates. Table of positions x treatments, df = 6 * 2.
  const layout_design design{{"a", "b", "c"}, {2, 3, 1}, {}, 0};
  std::vector<std::vector<double>> table(6, std::vector<double>(3, 0));
  const std::uint64_t runs = 30000;
  for (std::uint64_t seed = 0; seed < runs; ++seed) {
    layout_design d = design;
    d.seed = seed;
    const layout_plan plan = randomise_layout(d);
    for (std::size_t u = 0; u < 6; ++u) table[u][plan.treatment_of_unit[u]] += 1;
  }
  double chi2_positions = 0;
  for (std::size_t u = 0; u < 6; ++u)
    for (std::size_t t = 0; t < 3; ++t) {
      const double expected = static_cast<double>(runs) * static_cast<double>(design.replicates[t]) / 6;
      chi2_positions += (table[u][t] - expected) * (table[u][t] - expected) / expected;
    }
  CHECK(chi_square_p(chi2_positions, 12) > 0.001);
}

TEST_CASE("Lemire bounded integers are uniform and in range") {
  // Bound 3 does not divide 2^32, so a plain modulo or a missing rejection step shows up as bias
  // only at huge sample sizes; the range check and a chi-square over 300000 draws with bound 7
  // catch gross errors such as an off-by-one in the bound.
  pcg32 engine(7u, 11u);
  std::vector<double> counts(7, 0);
  std::uint32_t largest = 0;
  for (int i = 0; i < 300000; ++i) {
    const std::uint32_t x = bounded_integer(engine, 7);
    largest = std::max(largest, x);
    if (x < 7) counts[x] += 1;
  }
  CHECK(largest == 6);
  double chi2 = 0;
  for (double c : counts) chi2 += (c - 300000.0 / 7) * (c - 300000.0 / 7) / (300000.0 / 7);
  CHECK(chi_square_p(chi2, 6) > 0.001);
  CHECK(bounded_integer(engine, 1) == 0);
}

TEST_CASE("unit labels must match the number of units; designs are checked") {
  layout_design design = abc(2, 1);
  design.unit_labels = {"p1", "p2", "p3"};
  CHECK_THROWS_AS(randomise_layout(design), usage_error);
  design.unit_labels = {"p1", "p2", "p3", "p4", "p5", "p6"};
  CHECK(randomise_layout(design).units() == 6);
  CHECK_THROWS_AS(randomise_layout({{"a", "a"}, {2, 2}, {}, 1}), usage_error);
  CHECK_THROWS_AS(randomise_layout({{"a", "b"}, {2, 0}, {}, 1}), usage_error);
  CHECK_THROWS_AS(randomise_layout({{}, {}, {}, 1}), usage_error);
  CHECK_THROWS_AS(randomise_layout({{"a", "b"}, {2}, {}, 1}), usage_error);
  // A plan that cannot fit in memory is refused up front (found with --replicates 4000000000).
  CHECK_THROWS_AS(randomise_layout({{"a", "b"}, {4'000'000'000, 2}, {}, 1}), usage_error);
}
