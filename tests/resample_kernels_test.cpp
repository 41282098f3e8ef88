// The resampling kernels (src/resample_kernels.hpp) against plain references written here from
// their published definitions: pcg-cpp's own pcg32 for the words, Lemire's multiply-shift with
// rejection (Lemire 2019, ACM TOMACS 29:1, Algorithm 5) one word at a time for the draws, a
// Durstenfeld (1964) shuffle and the documented lane order for the sums. Every instruction-set
// level this processor runs is checked, so the levels agree bit for bit.
#include <doctest/doctest.h>

#include <array>
#include <cmath>
#include <cstring>
#include <memory>
#include <string>
#include <vector>

#include "random.hpp"
#include "resample_kernels.hpp"

using namespace contrasta::detail;

namespace {

std::vector<const resample_kernels*> levels() {
  const resample_kernels* all[4];
  const std::size_t n = available_kernels(all);
  return {all, all + n};
}

// The words of the stream the plain way: eight pcg-cpp generators read in turn.
struct reference_words {
  std::array<pcg32, 8> lanes;
  std::uint64_t k = 0;
  reference_words(std::uint64_t seed, std::uint64_t block, std::uint64_t kind)
      : lanes{block_stream(seed, (kind << 60) | ((block << 3) + 0)), block_stream(seed, (kind << 60) | ((block << 3) + 1)),
              block_stream(seed, (kind << 60) | ((block << 3) + 2)), block_stream(seed, (kind << 60) | ((block << 3) + 3)),
              block_stream(seed, (kind << 60) | ((block << 3) + 4)), block_stream(seed, (kind << 60) | ((block << 3) + 5)),
              block_stream(seed, (kind << 60) | ((block << 3) + 6)), block_stream(seed, (kind << 60) | ((block << 3) + 7))} {}
  std::uint32_t next() { return lanes[k++ % 8](); }
  // Lemire 2019, Algorithm 5, on this stream
  std::uint32_t bounded(std::uint32_t range) {
    for (;;) {
      const std::uint64_t product = static_cast<std::uint64_t>(next()) * range;
      const auto low = static_cast<std::uint32_t>(product);
      if (low >= range || low >= (0U - range) % range) return static_cast<std::uint32_t>(product >> 32);
    }
  }
};

// The documented sum: eight lanes, +0.0 past the end, ((a0+a4)+(a2+a6))+((a1+a5)+(a3+a7)).
std::array<double, 2> lane_sums(const std::vector<double>& x) {
  double a[8] = {}, q[8] = {};
  const std::size_t padded = (x.size() + 7) / 8 * 8;
  for (std::size_t i = 0; i < padded; ++i) {
    const double v = i < x.size() ? x[i] : 0.0;
    a[i % 8] += v;
    q[i % 8] += v * v;
  }
  auto tree = [](const double* t) { return ((t[0] + t[4]) + (t[2] + t[6])) + ((t[1] + t[5]) + (t[3] + t[7])); };
  return {tree(a), tree(q)};
}

bool same_bits(double a, double b) {
  return std::memcmp(&a, &b, sizeof a) == 0;
}

std::vector<double> noisy_values(std::size_t n, std::uint64_t seed) {
  pcg32 rng = block_stream(seed, 99);
  std::vector<double> v(n);
  for (double& x : v) x = (uniform01(rng) - 0.5) * 7.3 + uniform01(rng) * 1e-3;
  return v;
}

}  // namespace

TEST_CASE("the word stream is eight pcg32 streams read in turn") {
  // reference: pcg-cpp's pcg32 (O'Neill 2014), the generator the streams are made from
  for (const resample_kernels* k : levels()) {
    CAPTURE(std::string(k->level));
    auto words = std::make_unique<word_stream>();
    start_words(*words, 12345, 3, 1);
    reference_words ref(12345, 3, 1);
    // three refills, each after an odd number of words was read (the unread ones move down)
    for (int round = 0; round < 3; ++round) {
      k->refill(*words);
      const std::uint32_t take = 1001 + static_cast<std::uint32_t>(round) * 17;
      for (std::uint32_t i = 0; i < take; ++i) REQUIRE(words->words[words->position++] == ref.next());
    }
  }
}

TEST_CASE("draws equal Lemire's method word by word, including rejections") {
  // Ranges just above 2^31 reject about half the words, so the one-by-one path is taken in
  // nearly every resample; small ranges exercise the eight-at-a-time path.
  const std::vector<std::vector<std::uint32_t>> plans{
      {7, 6, 5},
      {200, 199, 198, 197, 196, 195, 194, 193, 192, 191, 190},
      {100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100},
      {(1U << 31) + 1, 5, (1U << 31) + 3, 3000000000U, 9, 10, 11, 12, 13}};
  for (const resample_kernels* k : levels()) {
    CAPTURE(std::string(k->level));
    for (const auto& ranges : plans) {
      const draw_ranges d(ranges);
      const std::uint64_t count = 5000;
      std::vector<std::uint32_t> out(count * d.count + 16);
      auto words = std::make_unique<word_stream>();
      start_words(*words, 7, 11, 0);
      k->draws(*words, d.plan(), count, out.data());
      reference_words ref(7, 11, 0);
      for (std::uint64_t r = 0; r < count; ++r)
        for (std::uint32_t i = 0; i < d.count; ++i) REQUIRE(out[r * d.count + i] == ref.bounded(ranges[i]));
    }
  }
}

TEST_CASE("joint draws are uniform (chi-square against the uniform law)") {
  // ranges 7, 6, 5: all 210 joint outcomes equally likely; 210,000 resamples, chi-square(209)
  // 99.9% point 284.1 (scipy.stats.chi2.ppf(0.999, 209))
  const std::vector<std::uint32_t> ranges{7, 6, 5};
  const draw_ranges d(ranges);
  for (const resample_kernels* k : levels()) {
    CAPTURE(std::string(k->level));
    const std::uint64_t count = 210000;
    std::vector<std::uint32_t> out(count * 3 + 16);
    auto words = std::make_unique<word_stream>();
    start_words(*words, 2026, 0, 0);
    k->draws(*words, d.plan(), count, out.data());
    std::vector<double> joint(210);
    for (std::uint64_t r = 0; r < count; ++r) {
      const std::uint32_t* o = out.data() + 3 * r;
      REQUIRE(o[0] < 7);
      REQUIRE(o[1] < 6);
      REQUIRE(o[2] < 5);
      joint[(o[0] * 6 + o[1]) * 5 + o[2]] += 1;
    }
    double chi = 0;
    for (double c : joint) chi += (c - 1000) * (c - 1000) / 1000;
    CHECK(chi < 284.1);
  }
}

TEST_CASE("permutation sums: a Durstenfeld shuffle of the running order, summed in the documented lane order") {
  // groups of 13, 8, 21 (tails not a multiple of 8) drawn from 50 pooled observations, the last
  // group (8) not drawn; 700 resamples so that the stream is refilled several times
  const std::vector<std::uint32_t> sizes{13, 8, 21};
  const std::uint32_t n = 50;
  std::vector<std::uint32_t> ranges;
  for (std::uint32_t i = 0; i < 42; ++i) ranges.push_back(n - i);
  const draw_ranges d(ranges);
  const std::vector<double> start = noisy_values(n, 5);
  const std::uint64_t count = 700;
  for (const resample_kernels* k : levels()) {
    CAPTURE(std::string(k->level));
    std::vector<double> data(start);
    data.resize(n + 8, 0.0);
    std::vector<double> out(count * 2 * sizes.size());
    std::vector<std::uint32_t> scratch(d.count + 16);
    auto words = std::make_unique<word_stream>();
    start_words(*words, 99, 4, 0);
    const permutation_shape shape{n, 3, sizes.data()};
    k->permutation_sums(*words, d.plan(), shape, data.data(), count, out.data(), scratch.data());

    reference_words ref(99, 4, 0);
    std::vector<double> order(start);
    for (std::uint64_t r = 0; r < count; ++r) {
      for (std::uint32_t i = 0; i < 42; ++i) std::swap(order[ref.bounded(n - i)], order[n - 1 - i]);
      std::uint32_t top = n;
      for (std::size_t g = 0; g < sizes.size(); ++g) {
        top -= sizes[g];
        const std::vector<double> part(order.begin() + top, order.begin() + top + sizes[g]);
        const auto expected = lane_sums(part);
        REQUIRE(same_bits(out[(r * 3 + g) * 2], expected[0]));
        REQUIRE(same_bits(out[(r * 3 + g) * 2 + 1], expected[1]));
      }
    }
    for (std::uint32_t i = 0; i < n; ++i) REQUIRE(same_bits(data[i], order[i]));  // the order carries on
  }
}

TEST_CASE("bootstrap sums: draws with replacement within each group, summed in the documented lane order") {
  const std::vector<std::uint32_t> sizes{11, 100, 3}, offsets{0, 11, 111};
  const std::vector<double> values = noisy_values(114, 8);
  std::vector<std::uint32_t> ranges;
  for (std::uint32_t s : sizes) ranges.insert(ranges.end(), s, s);
  const draw_ranges d(ranges);
  const std::uint64_t count = 500;
  for (const resample_kernels* k : levels()) {
    CAPTURE(std::string(k->level));
    std::vector<double> out(count * 2 * sizes.size());
    std::vector<std::uint32_t> scratch(d.count + 16);
    auto words = std::make_unique<word_stream>();
    start_words(*words, 3, 17, 1);
    const bootstrap_shape shape{3, sizes.data(), offsets.data()};
    k->bootstrap_sums(*words, d.plan(), shape, values.data(), count, out.data(), scratch.data());
    reference_words ref(3, 17, 1);
    for (std::uint64_t r = 0; r < count; ++r)
      for (std::size_t g = 0; g < sizes.size(); ++g) {
        std::vector<double> drawn;
        for (std::uint32_t i = 0; i < sizes[g]; ++i) drawn.push_back(values[offsets[g] + ref.bounded(sizes[g])]);
        const auto expected = lane_sums(drawn);
        REQUIRE(same_bits(out[(r * 3 + g) * 2], expected[0]));
        REQUIRE(same_bits(out[(r * 3 + g) * 2 + 1], expected[1]));
      }
  }
}

TEST_CASE("the portable level is always there, and the best level is one of those available") {
  const auto all = levels();
  REQUIRE(!all.empty());
  CHECK(std::string(all.back()->level) == "portable");
  CHECK(&best_kernels() == all.front());
  MESSAGE("resampling kernels on this processor: " << std::string(all.front()->level) << " (of " << all.size() << " levels)");
}
