// The resampling kernels (src/resample_kernels.hpp) against plain references written here from
// their published definitions: pcg-cpp's own pcg32 for the words, Lemire's multiply-shift with
// rejection (Lemire 2019, ACM TOMACS 29:1, Algorithm 5) one word at a time for the draws, a
// Durstenfeld (1964) shuffle and the documented lane order for the sums. Every instruction-set
// level this processor runs is checked, so the levels agree bit for bit.
#include <doctest/doctest.h>

#include <algorithm>
#include <array>
#include <functional>
#include <map>
#include <cmath>
#include <cstring>
#include <memory>
#include <string>
#include <vector>

#include "bootstrap_table.hpp"
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
  // Lemire 2019, Algorithm 5, on lane l alone
  std::uint32_t bounded_in_lane(std::size_t l, std::uint32_t range, std::uint32_t& steps) {
    for (;;) {
      const std::uint64_t product = static_cast<std::uint64_t>(lanes[l]()) * range;
      ++steps;
      const auto low = static_cast<std::uint32_t>(product);
      if (low >= range || low >= (0U - range) % range) return static_cast<std::uint32_t>(product >> 32);
    }
  }
  // One chunk of eight resamples drawn in lockstep (resample_kernels.hpp, lockstep_segment):
  // lane l's draws from generator l, segment by segment of 128 draws, each segment moving every
  // generator on by as many words as the hungriest lane used. Result: [draw][lane].
  std::vector<std::array<std::uint32_t, 8>> lockstep_chunk(const std::vector<std::uint32_t>& ranges) {
    std::vector<std::array<std::uint32_t, 8>> out(ranges.size());
    for (std::size_t first = 0; first < ranges.size(); first += 128) {
      const std::size_t end = std::min(ranges.size(), first + 128);
      std::uint32_t steps[8] = {}, most = 0;
      for (std::size_t l = 0; l < 8; ++l) {
        for (std::size_t i = first; i < end; ++i) out[i][l] = bounded_in_lane(l, ranges[i], steps[l]);
        most = std::max(most, steps[l]);
      }
      for (std::size_t l = 0; l < 8; ++l)
        for (std::uint32_t skip = steps[l]; skip < most; ++skip) lanes[l]();
    }
    return out;
  }
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

TEST_CASE("lockstep draws equal Lemire's method lane by lane, including rejections") {
  // As above; ranges just above 2^31 make nearly every segment take the lane-by-lane way, and a
  // plan of 300 draws has three segments (128, 128, 44).
  std::vector<std::uint32_t> long_plan;
  for (std::uint32_t i = 0; i < 300; ++i) long_plan.push_back(1000 + 37 * i);
  const std::vector<std::vector<std::uint32_t>> plans{
      {7, 6, 5},
      {10000, 10000, 10000, 10000, 10000, 10000, 10000, 10000, 10000, 100},
      {(1U << 31) + 1, 5, (1U << 31) + 3, 3000000000U, 9, 10, 11, 12, 13},
      long_plan};
  for (const resample_kernels* k : levels()) {
    CAPTURE(std::string(k->level));
    for (const auto& ranges : plans) {
      const draw_ranges d(ranges);
      const std::uint64_t chunks = 400;
      std::vector<std::uint64_t> out(8 * chunks * d.count);
      lane_stream stream;
      start_lanes(stream, 7, 12, 1);
      k->lockstep_draws(stream, d.plan(), chunks, out.data());
      reference_words ref(7, 12, 1);
      for (std::uint64_t c = 0; c < chunks; ++c) {
        const auto expected = ref.lockstep_chunk(ranges);
        for (std::uint32_t i = 0; i < d.count; ++i)
          for (std::size_t l = 0; l < 8; ++l) REQUIRE(out[(c * d.count + i) * 8 + l] == expected[i][l]);
      }
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

namespace {

resampling_pool pool_of(const std::vector<std::vector<double>>& groups) {
  resampling_pool pool;
  pool.offsets.push_back(0);
  for (std::size_t g = 0; g < groups.size(); ++g) {
    pool.levels.push_back(g);
    for (double x : groups[g]) pool.data.push_back({x, x * x});
    pool.offsets.push_back(pool.data.size());
  }
  return pool;
}

// `count` resamples of the bootstrap kernel of `level`, as rows of (sum, square) per group
// (the kernel writes them per chunk of eight, lanes side by side).
std::vector<double> bootstrap_rows(const resample_kernels& level, const bootstrap_table& table, std::uint64_t count,
                                   std::uint64_t seed, std::uint64_t block) {
  const draw_ranges d(table.ranges, 4);  // byte offsets of 16-byte entries
  const std::size_t groups = table.draws.size(), chunks = (count + 7) / 8;
  std::vector<double> chunked(chunks * 16 * groups);
  std::vector<std::uint64_t> scratch(16 * lockstep_segment);
  lane_stream stream;
  start_lanes(stream, seed, block, 1);
  const bootstrap_shape shape = table.shape();
  level.bootstrap_sums(stream, d.plan(), shape, table.entries.data(), count, chunked.data(), scratch.data());
  std::vector<double> rows(count * 2 * groups);
  for (std::uint64_t r = 0; r < count; ++r)
    for (std::size_t g = 0; g < groups; ++g) {
      const double* at = chunked.data() + ((r / 8) * groups + g) * 16 + r % 8;
      rows[(r * groups + g) * 2] = at[0];
      rows[(r * groups + g) * 2 + 1] = at[8];
    }
  return rows;
}

}  // namespace

TEST_CASE("bootstrap sums: one draw on [0, n^2) for each pair of picks in small groups, summed in draw order") {
  // 11 and 4 observations get pair entries (odd and even n), 130 do not (more than 128): 138
  // draws, three segments; without the large group, one segment (the kernel then draws the
  // next chunk while it sums this one). 500 resamples: the last chunk is part used.
  const std::vector<std::vector<std::vector<double>>> designs{
      {noisy_values(11, 8), noisy_values(4, 9), noisy_values(130, 10)},
      {noisy_values(11, 8), noisy_values(4, 9), noisy_values(37, 11)}};
  for (const auto& groups : designs) {
    const resampling_pool pool = pool_of(groups);
    const bootstrap_table table(pool);
    REQUIRE(table.pairs == std::vector<std::uint32_t>{5, 2, groups[2].size() > 128 ? 0U : 18U});
    const std::uint64_t count = 500;
    for (const resample_kernels* k : levels()) {
      CAPTURE(std::string(k->level));
      CAPTURE(groups[2].size());
      const std::vector<double> out = bootstrap_rows(*k, table, count, 3, 17);
      reference_words ref(3, 17, 1);
      for (std::uint64_t c = 0; c * 8 < count; ++c) {
        const auto draws = ref.lockstep_chunk(table.ranges);
        for (std::uint64_t l = 0; l < 8 && c * 8 + l < count; ++l) {
          const std::uint64_t r = c * 8 + l;
          for (std::size_t g = 0, first = 0; g < groups.size(); first += table.draws[g], ++g) {
            const std::vector<double>& x = groups[g];
            const auto n = static_cast<std::uint32_t>(x.size());
            // the picks of this group: pairs (i, j) = (k / n, k mod n) of one draw on [0, n^2),
            // then single draws on [0, n); entries added one by one from +0.0
            double a = 0, q = 0;
            for (std::uint32_t i = 0; i < table.draws[g]; ++i) {
              const std::uint32_t pick = draws[first + i][l];
              if (i < table.pairs[g]) {
                const std::uint32_t u = pick / n, v = pick % n;
                a += x[u] + x[v];
                q += x[u] * x[u] + x[v] * x[v];
              } else {
                a += x[pick];
                q += x[pick] * x[pick];
              }
            }
            REQUIRE(same_bits(out[(r * groups.size() + g) * 2], a));
            REQUIRE(same_bits(out[(r * groups.size() + g) * 2 + 1], q));
          }
        }
      }
    }
  }
}

TEST_CASE("bootstrap sums do not depend on how the resamples are split into kernel calls") {
  // The kernel draws the next chunk while it sums this one, except for the first chunk of a
  // call; calls of 16, 40 and 444 resamples (the last chunk part used) must give the rows of
  // one call of 500, continuing the same stream (the kernel's own contract: no outside source).
  const std::vector<std::vector<double>> groups{noisy_values(11, 8), noisy_values(4, 9), noisy_values(37, 11)};
  const resampling_pool pool = pool_of(groups);
  const bootstrap_table table(pool);
  const draw_ranges d(table.ranges, 4);
  const bootstrap_shape shape = table.shape();
  const std::size_t chunk = 16 * groups.size();
  for (const resample_kernels* k : levels()) {
    CAPTURE(std::string(k->level));
    std::vector<double> whole(63 * chunk), parts(64 * chunk);
    std::vector<std::uint64_t> scratch(16 * lockstep_segment);
    lane_stream one;
    start_lanes(one, 5, 2, 1);
    k->bootstrap_sums(one, d.plan(), shape, table.entries.data(), 500, whole.data(), scratch.data());
    lane_stream split;
    start_lanes(split, 5, 2, 1);
    double* out = parts.data();
    for (std::uint64_t count : {16, 40, 444}) {
      k->bootstrap_sums(split, d.plan(), shape, table.entries.data(), count, out, scratch.data());
      out += (count + 7) / 8 * chunk;
    }
    // resamples 0..499 sit in the same places: 16 and 40 are whole chunks
    for (std::uint64_t r = 0; r < 500; ++r)
      for (std::size_t g = 0; g < groups.size(); ++g)
        for (std::size_t half = 0; half < 2; ++half) {
          const std::size_t at = ((r / 8) * groups.size() + g) * 16 + half * 8 + r % 8;
          REQUIRE(same_bits(whole[at], parts[at]));
        }
    for (std::size_t l = 0; l < 8; ++l) REQUIRE(one.state[l] == split.state[l]);
  }
}

TEST_CASE("bootstrap picks with pair entries follow the multinomial law") {
  // Values 1, 10, 100 (and 1000) make each resample sum name its counts. With n picks from n
  // values the counts are multinomial(n; 1/n, ..., 1/n) (Efron & Tibshirani 1993, ch. 6).
  // chi-square 99.9% points: 27.88 on 9 df, 65.25 on 34 df (scipy.stats.chi2.ppf).
  const std::vector<std::vector<double>> groups{{1, 10, 100}, {1, 10, 100, 1000}};
  const resampling_pool pool = pool_of(groups);
  const bootstrap_table table(pool);
  REQUIRE(table.pairs == std::vector<std::uint32_t>{1, 2});
  const std::uint64_t count = 200000;
  const std::vector<double> out = bootstrap_rows(best_kernels(), table, count, 2026, 1);
  for (std::size_t g = 0; g < 2; ++g) {
    const std::size_t n = groups[g].size();
    std::map<long, double> seen;
    for (std::uint64_t r = 0; r < count; ++r) seen[std::lround(out[(r * 2 + g) * 2])] += 1;
    // expected: n! / prod(c_i!) / n^n for every count vector c summing to n
    std::map<long, double> expected;
    std::vector<int> c(n, 0);
    std::function<void(std::size_t, int)> walk = [&](std::size_t i, int left) {
      if (i + 1 == n) {
        c[i] = left;
        double p = std::tgamma(static_cast<double>(n) + 1);
        long key = 0, scale = 1;
        for (std::size_t k = 0; k < n; ++k, scale *= 10) {
          p /= std::tgamma(c[k] + 1.0);
          key += c[k] * scale;
        }
        expected[key] = p / std::pow(static_cast<double>(n), static_cast<double>(n));
        return;
      }
      for (int v = 0; v <= left; ++v) {
        c[i] = v;
        walk(i + 1, left - v);
      }
    };
    walk(0, static_cast<int>(n));
    REQUIRE(seen.size() <= expected.size());
    double chi = 0;
    for (const auto& [key, p] : expected) {
      const double e = p * static_cast<double>(count);
      const double o = seen.count(key) ? seen[key] : 0.0;
      chi += (o - e) * (o - e) / e;
    }
    CHECK(chi < (n == 3 ? 27.88 : 65.25));
  }
}

TEST_CASE("bracket pass: counts below and values inside two brackets, in order, at every level") {
  // reference: the definition in resample_kernels.hpp, one value at a time
  std::vector<double> x = noisy_values(10007, 21);  // not a multiple of 8 or of 1024
  for (std::size_t i = 0; i < x.size(); i += 97) x[i] = i % 2 ? HUGE_VAL : -HUGE_VAL;
  const std::vector<std::array<double, 4>> cases{
      {-1.0, -0.5, 0.25, 0.5}, {-HUGE_VAL, -3.0, 3.0, HUGE_VAL}, {0.0, 0.0, -10.0, 10.0}};
  for (const resample_kernels* k : levels()) {
    CAPTURE(std::string(k->level));
    for (const auto& bounds : cases) {
      for (const std::size_t capacity : {std::size_t{100000}, std::size_t{500}}) {
        std::vector<double> keep0(capacity + 1032), keep1(capacity + 1032);
        bracket_pass pass;
        k->bracket_scan(x.data(), x.size(), bounds.data(), keep0.data(), keep1.data(), capacity, pass);
        CHECK(!pass.unordered);
        std::vector<double> in0, in1;
        std::uint64_t below0 = 0, below1 = 0;
        for (double v : x) {
          below0 += v < bounds[0];
          below1 += v < bounds[2];
          if (v >= bounds[0] && v <= bounds[1]) in0.push_back(v);
          if (v >= bounds[2] && v <= bounds[3]) in1.push_back(v);
        }
        const bool overflows = in0.size() > capacity || in1.size() > capacity;
        CHECK(pass.stopped == overflows);
        if (overflows) continue;  // the counts of a stopped pass are not used
        CHECK(pass.below[0] == below0);
        CHECK(pass.below[1] == below1);
        REQUIRE(pass.kept[0] == in0.size());
        REQUIRE(pass.kept[1] == in1.size());
        for (std::size_t i = 0; i < in0.size(); ++i) REQUIRE(same_bits(keep0[i], in0[i]));
        for (std::size_t i = 0; i < in1.size(); ++i) REQUIRE(same_bits(keep1[i], in1[i]));
      }
    }
    std::vector<double> with_nan(x);
    with_nan[5000] = std::nan("");
    std::vector<double> keep0(20000), keep1(20000);
    bracket_pass pass;
    const double bounds[4] = {-1, 1, -2, 2};
    k->bracket_scan(with_nan.data(), with_nan.size(), bounds, keep0.data(), keep1.data(), 10000, pass);
    CHECK(pass.unordered);
  }
}

TEST_CASE("the portable level is always there, and the best level is one of those available") {
  const auto all = levels();
  REQUIRE(!all.empty());
  CHECK(std::string(all.back()->level) == "portable");
  CHECK(&best_kernels() == all.front());
  MESSAGE("resampling kernels on this processor: " << std::string(all.front()->level) << " (of " << all.size() << " levels)");
}
