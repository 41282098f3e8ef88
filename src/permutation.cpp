// Permutation tests of contrasts: exact enumeration over a revolving-door Gray code, or Monte
// Carlo reassignment with a partial Fisher-Yates shuffle, one word stream per fixed block.
//
// The studentized statistic (Welch t of the contrast) keeps the test asymptotically valid for
// the mean contrast under unequal variances (Janssen 1997, Stat. Prob. Letters 36:9-21; Chung &
// Romano 2013, Ann. Stat. 41:484-507; Pauly, Brunner & Konietschke 2015, JRSS-B 77:461-473);
// under exchangeability it is exact (Fisher 1935; Pitman 1937).
#include <algorithm>
#include <cmath>
#include <memory>
#include <sstream>

#include "combinatorics.hpp"
#include "contrasta/error.hpp"
#include "contrasta/resample.hpp"
#include "monte_carlo_p.hpp"
#include "random.hpp"
#include "resample_kernels.hpp"
#include "resample_core.hpp"

namespace contrasta {
namespace detail {
namespace {

// Reassignments per exact block and resamples per Monte Carlo block. Part of the definition of
// a run (a block's stream depends on its index), so fixed, never derived from the thread count.
constexpr std::uint64_t arrangements_per_block = 1ULL << 20;
constexpr std::uint64_t resamples_per_block = 4096;

// ---- exact enumeration --------------------------------------------------------------------

// Walks every reassignment of the pool's observations to its groups (group sizes kept):
// group 0 takes a subset of all observations, group 1 a subset of the rest, ..., the last group
// what remains (its sums follow from the totals). Each level walks a revolving-door Gray code,
// so its running sums change by one observation out and one in per step.
class exact_walker {
 public:
  explicit exact_walker(const resampling_pool& pool)
      : pool_(pool),
        groups_(pool.groups()),
        remaining_(groups_),
        subset_(groups_),
        sum_(groups_),
        square_(groups_),
        remaining_sum_(groups_),
        remaining_square_(groups_) {
    remaining_[0].resize(pool.size());
    for (std::uint32_t i = 0; i < pool.size(); ++i) remaining_[0][i] = i;
    remaining_sum_[0] = pool.total;
    remaining_square_[0] = pool.total_square;
    for (std::size_t g = 0; g + 1 < groups_; ++g) subset_[g].resize(pool.n(g) + 1);
    std::vector<std::size_t> rest(pool.sizes());
    rest.erase(rest.begin());
    inner_count_ = multinomial(rest);
  }

  std::uint64_t outer_count() const { return binomial(pool_.size(), pool_.n(0)); }
  std::uint64_t inner_count() const { return inner_count_; }

  // Visits the reassignments whose group-0 subset has revolving-door rank in
  // [first, first + count), in order; consume(sum, square) gets per-group sums.
  template <class Consume>
  void walk(std::uint64_t first, std::uint64_t count, Consume&& consume) {
    start(0, first);
    for (std::uint64_t i = 0;; ++i) {
      if (groups_ == 2) {
        sum_[1] = pool_.total - sum_[0];
        square_[1] = pool_.total_square - square_[0];
        consume(sum_.data(), square_.data());
      } else {
        descend(1, consume);
      }
      if (i + 1 == count) break;
      step(0);
    }
  }

 private:
  // Level g: the subset of rank `rank` among remaining_[g], with its sums from scratch.
  void start(std::size_t g, std::uint64_t rank) {
    auto& c = subset_[g];
    const auto t = c.size() - 1;
    const auto m = static_cast<std::uint32_t>(remaining_[g].size());
    revolving_door_unrank(rank, m, std::span(c.data(), t));
    c[t] = m;
    double s = 0, q = 0;
    for (std::size_t i = 0; i < t; ++i) {
      const observation& o = pool_.data[remaining_[g][c[i]]];
      s += o.value;
      q += o.square;
    }
    sum_[g] = s;
    square_[g] = q;
  }

  void step(std::size_t g) {
    const door_swap swap = revolving_door_next(subset_[g]);
    const observation& out = pool_.data[remaining_[g][swap.out]];
    const observation& in = pool_.data[remaining_[g][swap.in]];
    sum_[g] += in.value - out.value;
    square_[g] += in.square - out.square;
  }

  // Enumerates levels g.. completely for the current choice of levels 0..g-1.
  template <class Consume>
  void descend(std::size_t g, Consume& consume) {
    // the observations not taken by level g - 1, in pool order
    const auto& above = remaining_[g - 1];
    const auto& taken = subset_[g - 1];
    auto& here = remaining_[g];
    here.clear();
    std::size_t k = 0;
    double s = 0, q = 0;
    for (std::uint32_t i = 0; i < above.size(); ++i) {
      if (k + 1 < taken.size() && taken[k] == i) {
        ++k;
        continue;
      }
      here.push_back(above[i]);
      s += pool_.data[above[i]].value;
      q += pool_.data[above[i]].square;
    }
    remaining_sum_[g] = s;
    remaining_square_[g] = q;
    const std::uint64_t count = binomial(here.size(), subset_[g].size() - 1);
    start(g, 0);
    for (std::uint64_t i = 0;; ++i) {
      if (g + 2 == groups_) {
        sum_[g + 1] = remaining_sum_[g] - sum_[g];
        square_[g + 1] = remaining_square_[g] - square_[g];
        consume(sum_.data(), square_.data());
      } else {
        descend(g + 1, consume);
      }
      if (i + 1 == count) break;
      step(g);
    }
  }

  const resampling_pool& pool_;
  std::size_t groups_;
  std::vector<std::vector<std::uint32_t>> remaining_;  // pool indices available to level g
  std::vector<std::vector<std::uint32_t>> subset_;     // positions in remaining_[g] + sentinel
  std::vector<double> sum_, square_;                   // per-group sums of the current arrangement
  std::vector<double> remaining_sum_, remaining_square_;
  std::uint64_t inner_count_ = 1;
};

// Splits the exact walk into fixed blocks of group-0 ranks holding about
// arrangements_per_block reassignments each, and runs body(walker, first, count, block index).
template <class Body>
void for_each_exact_block(const resampling_pool& pool, const analysis_options& o, Body&& body) {
  exact_walker probe(pool);
  const std::uint64_t outer = probe.outer_count();
  const std::uint64_t per_block = std::max<std::uint64_t>(1, arrangements_per_block / probe.inner_count());
  const std::uint64_t blocks = (outer + per_block - 1) / per_block;
  run_blocks(blocks, o, [&](std::uint64_t b) {
    exact_walker walker(pool);
    const std::uint64_t first = b * per_block;
    body(walker, first, std::min(per_block, outer - first), b);
  });
}

// The two-group walk with everything in registers: the hot loop of exact two-group tests
// (quality.md P2). consume(s, q) gets the sum and sum of squares of group 0; group 1's follow
// from the totals.
template <class Consume>
void walk_two_groups(const resampling_pool& pool, std::uint64_t first, std::uint64_t count, Consume&& consume) {
  const auto n = static_cast<std::uint32_t>(pool.size());
  const std::size_t t = pool.n(0);
  std::vector<std::uint32_t> c(t + 1);
  revolving_door_unrank(first, n, std::span(c.data(), t));
  c[t] = n;
  const observation* data = pool.data.data();
  double s = 0, q = 0;
  for (std::size_t i = 0; i < t; ++i) {
    s += data[c[i]].value;
    q += data[c[i]].square;
  }
  for (std::uint64_t i = 0;; ++i) {
    consume(s, q);
    if (i + 1 == count) break;
    const door_swap swap = revolving_door_next(c);
    s += data[swap.in].value - data[swap.out].value;
    q += data[swap.in].square - data[swap.out].square;
  }
}

// ---- Monte Carlo reassignment ---------------------------------------------------------------

// Random reassignments by a partial Fisher-Yates shuffle (Durstenfeld 1964) of the block's own
// copy of the observations: position i = N-1, N-2, ... swaps with a uniform position in [0, i],
// so the tail positions are a uniform random ordered selection. Groups 0..G-2 take the tail in
// turn; the last group's sums follow from the totals, so only N - n_last positions are drawn.
// Continuing from the previous resample's order keeps every resample uniform. The draws, swaps
// and sums run in the vector kernels (resample_kernels.hpp), a chunk of resamples at a time.
class monte_carlo_walker {
 public:
  explicit monte_carlo_walker(const resampling_pool& pool)
      : pool_(pool), draws_(drawn_ranges(pool)), sum_(pool.groups()), square_(pool.groups()) {
    for (const observation& o : pool.data) data_.push_back(o.value);
    data_.resize(pool.size() + 8, 0.0);  // the kernels read up to 8 past the end
    for (std::size_t g = 0; g + 1 < pool.groups(); ++g) sizes_.push_back(static_cast<std::uint32_t>(pool.n(g)));
    shape_ = {static_cast<std::uint32_t>(pool.size()), static_cast<std::uint32_t>(sizes_.size()), sizes_.data()};
    scratch_.resize(draws_.count + 16);
    out_.resize(chunk * 2 * sizes_.size());
  }

  template <class Consume>
  void run(word_stream& words, std::uint64_t count, Consume&& consume) {
    const resample_kernels& kernels = best_kernels();
    const draw_plan plan = draws_.plan();
    const std::size_t last = pool_.groups() - 1;
    for (std::uint64_t done = 0; done < count; done += chunk) {
      const std::uint64_t m = std::min<std::uint64_t>(chunk, count - done);
      kernels.permutation_sums(words, plan, shape_, data_.data(), m, out_.data(), scratch_.data());
      const double* row = out_.data();
      for (std::uint64_t r = 0; r < m; ++r) {
        double s_rest = 0, q_rest = 0;
        for (std::size_t g = 0; g < last; ++g, row += 2) {
          sum_[g] = row[0];
          square_[g] = row[1];
          s_rest += row[0];
          q_rest += row[1];
        }
        sum_[last] = pool_.total - s_rest;
        square_[last] = pool_.total_square - q_rest;
        consume(sum_.data(), square_.data());
      }
    }
  }

 private:
  static constexpr std::uint64_t chunk = 256;  // resamples per kernel call: the rows stay in L1

  static draw_ranges drawn_ranges(const resampling_pool& pool) {
    std::vector<std::uint32_t> ranges;
    const std::size_t drawn = pool.size() - pool.n(pool.groups() - 1);
    for (std::size_t i = 0; i < drawn; ++i) ranges.push_back(static_cast<std::uint32_t>(pool.size() - i));
    return draw_ranges(ranges);
  }

  const resampling_pool& pool_;
  draw_ranges draws_;
  std::vector<double> data_;
  std::vector<std::uint32_t> sizes_, scratch_;
  permutation_shape shape_;
  std::vector<double> out_, sum_, square_;
};

template <class Body>
void for_each_monte_carlo_block(std::uint64_t resamples, const analysis_options& o, Body&& body) {
  const std::uint64_t blocks = (resamples + resamples_per_block - 1) / resamples_per_block;
  run_blocks(blocks, o, [&](std::uint64_t b) {
    const auto words = std::make_unique<word_stream>();
    start_words(*words, o.seed, b, 0);
    const std::uint64_t first = b * resamples_per_block;
    body(*words, first, std::min(resamples_per_block, resamples - first), b);
  });
}

// ---- shared setup ---------------------------------------------------------------------------

void require_contrast(const contrast& c, const prepared_data& p, bool studentized) {
  if (c.coefficients.size() != p.data.level_count())
    throw analysis_error("contrast '" + c.name + "' has " + std::to_string(c.coefficients.size()) +
                         " coefficients for " + std::to_string(p.data.level_count()) + " levels");
  double sum = 0, scale = 0;
  std::size_t nonzero = 0;
  for (double x : c.coefficients) {
    sum += x;
    scale += std::abs(x);
    nonzero += x != 0;
  }
  if (nonzero < 2 || std::abs(sum) > 1e-9 * scale)
    throw analysis_error("contrast '" + c.name +
                         "': a permutation test needs coefficients that sum to zero over at least two levels; "
                         "use the bootstrap for a general linear combination");
  for (std::size_t i = 0; i < c.coefficients.size(); ++i) {
    if (c.coefficients[i] == 0) continue;
    const std::size_t n = p.data.n(i);
    if (n == 0)
      throw analysis_error("contrast '" + c.name + "': level '" + p.data.levels[i] +
                           "' has no observations; drop it from the contrast");
    if (studentized && n < 2)
      throw analysis_error("contrast '" + c.name +
                           "': the studentized permutation statistic needs at least two "
                           "observations in level '" +
                           p.data.levels[i] + "'; use --statistic raw");
  }
}

bool choose_exact(std::uint64_t arrangements, const analysis_options& o, std::uint64_t limit) {
  switch (o.exact) {
    case exact_mode::always:
      // About 10 ns per reassignment: beyond 1e12 a complete enumeration takes hours.
      if (arrangements > 1'000'000'000'000ULL)
        throw analysis_error(
            "this contrast has " +
            (arrangements == saturated ? std::string("more than 1.8e19") : std::to_string(arrangements)) +
            " reassignments, too many to enumerate (more than 1e12); use --exact auto for a Monte Carlo test");
      return true;
    case exact_mode::never:
      return false;
    default:
      return arrangements <= limit;
  }
}

// The statistic of one arrangement: Welch t of the contrast, or its raw difference.
inline double arrangement_statistic(const contrast_terms& t, bool studentized, const double* s, const double* q) {
  const auto [d, v] = evaluate(t, s, q);
  return studentized ? studentized_value(d, v) : d;
}

std::string level_list(const prepared_data& p, std::span<const std::size_t> levels) {
  std::string out;
  for (std::size_t i = 0; i < levels.size(); ++i) {
    if (i) out += i + 1 == levels.size() ? " and " : ", ";
    out += p.data.levels[levels[i]];
  }
  return out;
}

}  // namespace
}  // namespace detail

std::uint64_t arrangement_count(std::span<const std::size_t> sizes) {
  return detail::multinomial(sizes);
}

method_result permutation_contrast(const prepared_data& p, const contrast& c, const analysis_options& o) {
  using namespace detail;
  const bool student = o.statistic == permutation_statistic::studentized;
  require_contrast(c, p, student);
  const std::vector<std::size_t> levels = involved_levels(std::span(&c, 1));
  const resampling_pool pool = make_pool(p, levels);
  const contrast_terms terms = make_terms(c, pool);
  const std::uint64_t arrangements = multinomial(pool.sizes());
  const bool exact = choose_exact(arrangements, o, o.max_arrangements);

  // Observed statistic from the pool's own sums, so that it is computed the same way as every
  // reassignment's.
  std::vector<double> s(pool.groups()), q(pool.groups());
  for (std::size_t g = 0; g < pool.groups(); ++g)
    for (std::size_t i = pool.offsets[g]; i < pool.offsets[g + 1]; ++i) {
      s[g] += pool.data[i].value;
      q[g] += pool.data[i].square;
    }
  const double observed = arrangement_statistic(terms, student, s.data(), q.data());
  const extremeness extreme(o.side, observed);

  // Two-sided studentized fast path: |d|/sqrt(V) >= a  <=>  d^2 >= a^2 V when V > 0 (no square
  // root or division per reassignment).
  const double bar = std::max(0.0, std::abs(observed) - extreme.tolerance);
  const double bar_squared = bar * bar;
  const bool fast = student && o.side == alternative::two_sided;
  auto is_extreme = [&](const double* ss, const double* qq) -> bool {
    const auto [d, v] = evaluate(terms, ss, qq);
    if (fast && v > 0) return d * d >= bar_squared * v;
    return extreme(student ? studentized_value(d, v) : d);
  };

  std::uint64_t total = 0, hits = 0;
  if (exact) {
    if (pool.groups() == 2) {
      // The hot loop of two-group exact tests, with the contrast's factors in registers.
      const double w0 = terms.mean_weight[0], w1 = terms.mean_weight[1];
      const double i0 = terms.inverse_n[0], i1 = terms.inverse_n[1];
      const double v0 = terms.variance_weight[0], v1 = terms.variance_weight[1];
      const double total_sum = pool.total, total_square = pool.total_square;
      // With equal group sizes and c_0 = -c_1, the complement of a group-0 subset swaps the
      // groups and negates the statistic; two-sided, both count alike. In revolving-door order
      // the first C(N-1, n_0) subsets are exactly those without the last observation, one of
      // each complementary pair: enumerate them and count twice.
      const bool mirror = o.side == alternative::two_sided && pool.n(0) == pool.n(1) && w0 == -w1;
      const std::uint64_t outer = mirror ? binomial(pool.size() - 1, pool.n(0)) : arrangements;
      const std::uint64_t blocks = (outer + arrangements_per_block - 1) / arrangements_per_block;
      std::vector<std::uint64_t> two_hits(blocks);
      run_blocks(blocks, o, [&](std::uint64_t b) {
        const std::uint64_t first = b * arrangements_per_block;
        std::uint64_t local = 0;
        walk_two_groups(pool, first, std::min(arrangements_per_block, outer - first), [&](double s0, double q0) {
          const double s1 = total_sum - s0, q1 = total_square - q0;
          const double d = w0 * s0 + w1 * s1;
          const double v = v0 * std::max(0.0, q0 - s0 * s0 * i0) + v1 * std::max(0.0, q1 - s1 * s1 * i1);
          if (fast && v > 0) {
            local += d * d >= bar_squared * v;
          } else {
            local += extreme(student ? studentized_value(d, v) : d);
          }
        });
        two_hits[b] = local;
      });
      for (std::uint64_t h : two_hits) hits += h;
      if (mirror) hits *= 2;
    } else {
      exact_walker probe(pool);
      const std::uint64_t per_block = std::max<std::uint64_t>(1, arrangements_per_block / probe.inner_count());
      std::vector<std::uint64_t> block_hits((probe.outer_count() + per_block - 1) / per_block);
      for_each_exact_block(
          pool, o, [&](exact_walker& walker, std::uint64_t first, std::uint64_t count, std::uint64_t b) {
            std::uint64_t local = 0;
            walker.walk(first, count, [&](const double* ss, const double* qq) { local += is_extreme(ss, qq); });
            block_hits[b] = local;
          });
      for (std::uint64_t h : block_hits) hits += h;  // block order
    }
    total = arrangements;
    // The observed arrangement is one of those enumerated, so at least one counts; rounding in
    // an extremely separated design must not push the count to zero.
    hits = std::max<std::uint64_t>(hits, 1);
  } else {
    total = o.resamples;
    if (total == 0) throw usage_error("the number of resamples must be at least 1");
    std::vector<std::uint64_t> block_hits((total + resamples_per_block - 1) / resamples_per_block);
    for_each_monte_carlo_block(total, o, [&](word_stream& rng, std::uint64_t, std::uint64_t count, std::uint64_t b) {
      monte_carlo_walker walker(pool);
      std::uint64_t local = 0;
      walker.run(rng, count, [&](const double* ss, const double* qq) { local += is_extreme(ss, qq); });
      block_hits[b] = local;
    });
    for (std::uint64_t h : block_hits) hits += h;
  }

  method_result r;
  r.method = "permutation";
  r.estimand = "mean contrast";
  double psi = 0, se2 = 0;
  for (std::size_t level : levels) {
    const double ci = c.coefficients[level];
    const group_summary& g = p.groups[level];
    psi += ci * g.centred_mean;
    se2 += ci * ci * g.variance / static_cast<double>(g.n);
  }
  r.estimate = psi;  // coefficients sum to zero: no centre to add back
  r.se = std::sqrt(se2);
  r.statistic_name = student ? "t" : "psi";
  r.statistic = student ? studentized_value(psi, se2) : psi;
  r.resamples = total;
  r.exact = exact;
  if (exact) {
    r.p_value = static_cast<double>(hits) / static_cast<double>(total);
    r.p_interval = std::array<double, 2>{r.p_value, r.p_value};
  } else {
    r.p_value = phipson_smyth_p(hits, total);
    r.p_interval = clopper_pearson(hits, total, 0.99);
  }
  const std::string who = level_list(p, levels);
  r.null_hypothesis = "the groups " + who + " have the same distribution";
  if (student) r.null_hypothesis += " (asymptotically: the mean contrast is zero)";
  std::ostringstream note;
  const char* statistic_words = student ? "Welch t" : "raw contrast";
  if (exact) {
    note << "exact: all " << total << " reassignments of the observations of " << who << " enumerated ("
         << statistic_words << " recomputed on each)";
  } else {
    note << "Monte Carlo: " << total << " random reassignments (seed " << o.seed << ", " << statistic_words
         << " recomputed on each), p = (b+1)/(m+1) with b = " << hits;
  }
  r.notes.push_back(note.str());
  r.notes.push_back(
      "no confidence interval: a test of equal distributions gives none without a shift model; "
      "read the welch or bootstrap interval");
  return r;
}

joint_resampling joint_permutation_statistics(const prepared_data& p, std::span<const contrast> family,
                                              const analysis_options& o) {
  using namespace detail;
  const bool student = o.statistic == permutation_statistic::studentized;
  if (family.empty()) throw analysis_error("joint permutation statistics need at least one contrast");
  for (const contrast& c : family) require_contrast(c, p, student);
  const std::vector<std::size_t> levels = involved_levels(family);
  const resampling_pool pool = make_pool(p, levels);
  std::vector<contrast_terms> terms;
  for (const contrast& c : family) terms.push_back(make_terms(c, pool));
  const std::size_t m = family.size();
  const std::uint64_t arrangements = multinomial(pool.sizes());
  const std::uint64_t limit =
      o.exact == exact_mode::always ? o.max_arrangements : std::min(o.max_arrangements, o.resamples);
  bool exact = false;
  if (o.exact == exact_mode::always) {
    if (arrangements > limit)
      throw analysis_error("the joint permutation distribution has " + std::to_string(arrangements) +
                           " reassignments, more than --max-arrangements; raise it or use --exact auto");
    exact = true;
  } else if (o.exact == exact_mode::automatic) {
    exact = arrangements <= limit;
  }

  joint_resampling out;
  out.exact = exact;
  out.seed = o.seed;
  out.resamples = exact ? arrangements : o.resamples;
  if (out.resamples == 0) throw usage_error("the number of resamples must be at least 1");
  out.statistics.assign(out.resamples * m, 0.0);

  std::vector<double> s(pool.groups()), q(pool.groups());
  for (std::size_t g = 0; g < pool.groups(); ++g)
    for (std::size_t i = pool.offsets[g]; i < pool.offsets[g + 1]; ++i) {
      s[g] += pool.data[i].value;
      q[g] += pool.data[i].square;
    }
  for (const contrast_terms& t : terms) out.observed.push_back(arrangement_statistic(t, student, s.data(), q.data()));

  auto record = [&](double* row, const double* ss, const double* qq) {
    for (std::size_t j = 0; j < m; ++j) row[j] = arrangement_statistic(terms[j], student, ss, qq);
  };
  if (exact) {
    exact_walker probe(pool);
    const std::uint64_t inner = probe.inner_count();
    for_each_exact_block(pool, o, [&](exact_walker& walker, std::uint64_t first, std::uint64_t count, std::uint64_t) {
      double* row = out.statistics.data() + first * inner * m;
      walker.walk(first, count, [&](const double* ss, const double* qq) {
        record(row, ss, qq);
        row += m;
      });
    });
  } else {
    for_each_monte_carlo_block(out.resamples, o,
                               [&](word_stream& rng, std::uint64_t first, std::uint64_t count, std::uint64_t) {
                                 monte_carlo_walker walker(pool);
                                 double* row = out.statistics.data() + first * m;
                                 walker.run(rng, count, [&](const double* ss, const double* qq) {
                                   record(row, ss, qq);
                                   row += m;
                                 });
                               });
  }
  return out;
}

}  // namespace contrasta
