// The bootstrap of a contrast of means: resampling with replacement within each level
// (Efron 1979; Efron & Tibshirani 1993), percentile, BCa (Efron 1987, JASA 82:171-185) and
// studentized (bootstrap-t) intervals, and the bootstrap-t test of psi = 0 (Hall & Wilson 1991,
// Biometrics 47:757-762).
//
// Each group is stored centred on its own mean, so a resample's sums give psi* - psi directly
// (sum c_g S*_g / n_g) and its within-group sums of squares without cancellation.
#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <memory>
#include <sstream>

#include "contrasta/error.hpp"
#include "contrasta/resample.hpp"
#include "distributions.hpp"
#include "monte_carlo_p.hpp"
#include "random.hpp"
#include "resample_kernels.hpp"
#include "resample_core.hpp"
#include "resample_intervals.hpp"
#include "bootstrap_table.hpp"

namespace contrasta {
namespace detail {
namespace {

constexpr std::uint64_t resamples_per_block = 2048;

resampling_pool make_bootstrap_pool(const prepared_data& p, std::span<const std::size_t> levels) {
  resampling_pool pool;
  pool.levels.assign(levels.begin(), levels.end());
  pool.offsets.push_back(0);
  for (std::size_t level : levels) {
    const auto g = p.data.group(level);
    const double mean = p.groups[level].centred_mean;
    for (double y : g) {
      const double v = y - mean;
      pool.data.push_back({v, v * v});
    }
    pool.offsets.push_back(pool.data.size());
  }
  return pool;
}

// Draws resamples with replacement within each group and hands over each chunk of eight
// resamples' per-group sums and sums of squares (resample_kernels.hpp, bootstrap_sums) with
// the number of its resamples in use. The draws and sums run in the vector kernels, many
// chunks per call.
class bootstrap_walker {
 public:
  bootstrap_walker(const bootstrap_table& table, const draw_ranges& draws)
      : table_(table), plan_(draws.plan()), shape_(table.shape()) {
    scratch_.resize(2 * lanes * lockstep_segment);
    out_.resize(resamples_per_call * 2 * table.draws.size());
  }

  template <class Consume>
  void run(lane_stream& stream, std::uint64_t count, Consume&& consume) {
    const resample_kernels& kernels = best_kernels();
    const std::size_t chunk_size = 2 * lanes * table_.draws.size();
    for (std::uint64_t done = 0; done < count; done += resamples_per_call) {
      const std::uint64_t m = std::min<std::uint64_t>(resamples_per_call, count - done);
      kernels.bootstrap_sums(stream, plan_, shape_, table_.entries.data(), m, out_.data(), scratch_.data());
      for (std::uint64_t c = 0; c < m; c += lanes)
        consume(out_.data() + chunk_size * (c / lanes), std::min<std::uint64_t>(lanes, m - c));
    }
  }

  static constexpr std::uint64_t lanes = lane_stream::lanes;

 private:
  // resamples per kernel call, a multiple of the kernel's eight lanes: the sums stay in L1
  static constexpr std::uint64_t resamples_per_call = 256;

  const bootstrap_table& table_;
  draw_plan plan_;
  bootstrap_shape shape_;
  std::vector<std::uint64_t> scratch_;
  std::vector<double> out_;
};

template <class Body>
void for_each_bootstrap_block(std::uint64_t resamples, const analysis_options& o, Body&& body) {
  const std::uint64_t blocks = (resamples + resamples_per_block - 1) / resamples_per_block;
  run_blocks(blocks, o, [&](std::uint64_t b) {
    lane_stream stream;
    start_lanes(stream, o.seed, b, 1);
    const std::uint64_t first = b * resamples_per_block;
    body(stream, first, std::min(resamples_per_block, resamples - first), b);
  });
}

void require_bootstrap_contrast(const contrast& c, const prepared_data& p) {
  if (c.coefficients.size() != p.data.level_count())
    throw analysis_error("contrast '" + c.name + "' has " + std::to_string(c.coefficients.size()) +
                         " coefficients for " + std::to_string(p.data.level_count()) + " levels");
  bool any = false;
  for (std::size_t i = 0; i < c.coefficients.size(); ++i) {
    if (c.coefficients[i] == 0) continue;
    any = true;
    if (p.data.n(i) < 2)
      throw analysis_error("contrast '" + c.name + "': the bootstrap needs at least two observations in level '" +
                           p.data.levels[i] + "' (a group of one has no spread to resample)");
  }
  if (!any) throw analysis_error("contrast '" + c.name + "' has no non-zero coefficient");
}

double normal_quantile(double prob) {
  return boost::math::quantile(normal(), prob);
}

}  // namespace
}  // namespace detail

method_result bootstrap_contrast(const prepared_data& p, const contrast& c, const analysis_options& o) {
  using namespace detail;
  require_bootstrap_contrast(c, p);
  if (o.resamples < 2) throw usage_error("the bootstrap needs at least 2 resamples");
  if (!(o.conf > 0 && o.conf < 1)) throw usage_error("the confidence level must lie strictly between 0 and 1");
  const std::vector<std::size_t> levels = involved_levels(std::span(&c, 1));
  const resampling_pool pool = make_bootstrap_pool(p, levels);
  const contrast_terms terms = make_terms(c, pool);
  const bootstrap_table table(pool);
  const draw_ranges draws(table.ranges, 4);  // byte offsets of the 16-byte entries

  double coefficient_sum = 0, psi = 0, se2 = 0;
  for (std::size_t level : levels) {
    const double ci = c.coefficients[level];
    coefficient_sum += ci;
    psi += ci * p.groups[level].centred_mean;
    se2 += ci * ci * p.groups[level].variance / static_cast<double>(p.groups[level].n);
  }
  // A location: add centre * sum c back (DEVELOPERS.md, centring); zero for a contrast.
  const double estimate = psi + p.data.centre * coefficient_sum;
  const double se = std::sqrt(se2);
  const double t_observed = studentized_value(estimate, se2);
  const extremeness extreme(o.side, t_observed);

  const bool keep_t = o.interval == bootstrap_interval::studentized;
  const std::uint64_t m = o.resamples;
  // psi* - psi for percentile and BCa, or (psi* - psi)/SE* for the studentized interval: left
  // uninitialised, so that the blocks' threads touch their own pages first
  const std::unique_ptr<double[]> kept(new double[m]);
  const std::span<double> deviations(kept.get(), keep_t ? 0 : m), t_star(kept.get(), keep_t ? m : 0);
  const bool squared = o.side == alternative::two_sided;
  const double bar = std::max(0.0, std::abs(t_observed) - extreme.tolerance), bar_squared = bar * bar;
  std::vector<std::uint64_t> block_hits((m + resamples_per_block - 1) / resamples_per_block);
  std::vector<double> block_sum(block_hits.size()), block_square(block_hits.size());
  // deviations below and at or below zero, for the BCa bias (counted here, in parallel)
  std::vector<std::uint64_t> block_below(block_hits.size()), block_at_or_below(block_hits.size());
  for_each_bootstrap_block(m, o, [&](lane_stream& rng, std::uint64_t first, std::uint64_t count, std::uint64_t b) {
    bootstrap_walker walker(table, draws);
    std::uint64_t hits = 0, r = first, below = 0, at_or_below = 0;
    double s = 0, q = 0;
    walker.run(rng, count, [&](const double* chunk, std::uint64_t used) {
      double difference[bootstrap_walker::lanes], variance[bootstrap_walker::lanes];
      evaluate_chunk(terms, chunk, difference, variance);
      for (std::uint64_t l = 0; l < used; ++l, ++r) {
        const double d = difference[l], v = variance[l];
        if (keep_t) {
          const double t = studentized_value(d, v);
          hits += extreme(t);
          t_star[r] = t;
        } else {
          // two-sided: |d|/sqrt(V) >= bar <=> d^2 >= bar^2 V when V > 0 (no root or division)
          hits += squared && v > 0 ? d * d >= bar_squared * v : extreme(studentized_value(d, v));
          deviations[r] = d;
          below += d < 0;
          at_or_below += d <= 0;
        }
        s += d;
        q += d * d;
      }
    });
    block_hits[b] = hits;
    block_sum[b] = s;
    block_square[b] = q;
    block_below[b] = below;
    block_at_or_below[b] = at_or_below;
  });
  std::uint64_t hits = 0, below = 0, at_or_below = 0;
  double sum = 0, square = 0;
  for (std::size_t b = 0; b < block_hits.size(); ++b) {  // block order: thread-count invariant
    below += block_below[b];
    at_or_below += block_at_or_below[b];
    hits += block_hits[b];
    sum += block_sum[b];
    square += block_square[b];
  }
  const double md = static_cast<double>(m);
  const double bootstrap_se = std::sqrt(std::max(0.0, (square - sum * sum / md) / (md - 1)));

  // Interval. Two-sided at conf uses tails (1-conf)/2; one-sided alternatives give one bound
  // at conf and an infinite other end.
  const double tail = o.side == alternative::two_sided ? (1 - o.conf) / 2 : 1 - o.conf;
  double low = -HUGE_VAL, high = HUGE_VAL;
  const bool want_low = o.side != alternative::less, want_high = o.side != alternative::greater;
  std::string interval_words;
  double acceleration = not_available, bias = not_available;
  // the quantile levels of the two ends (NaN: not wanted), both selected in one pass
  auto quantiles = [&o](std::span<double> x, double level_low, double level_high) {
    const double wanted[2] = {level_low, level_high};
    const std::vector<double> q = quantiles_linear(x, wanted, thread_count(o));
    return std::array<double, 2>{q[0], q[1]};
  };
  const double unwanted = std::numeric_limits<double>::quiet_NaN();
  switch (o.interval) {
    case bootstrap_interval::percentile: {
      interval_words = "percentile";
      const auto q = quantiles(deviations, want_low ? tail : unwanted, want_high ? 1 - tail : unwanted);
      if (want_low) low = estimate + q[0];
      if (want_high) high = estimate + q[1];
      break;
    }
    case bootstrap_interval::bca: {
      interval_words = "BCa (bias-corrected and accelerated)";
      bias = bca_bias(below, at_or_below, m);
      acceleration = bca_acceleration(p, c);
      auto adjusted = [&](double z_alpha) { return bca_level(bias, acceleration, z_alpha); };
      const auto q = quantiles(deviations, want_low ? adjusted(normal_quantile(tail)) : unwanted,
                               want_high ? adjusted(-normal_quantile(tail)) : unwanted);
      if (want_low) low = estimate + q[0];
      if (want_high) high = estimate + q[1];
      break;
    }
    case bootstrap_interval::studentized: {
      interval_words = "studentized (bootstrap-t with the Welch SE of each resample)";
      // [psi - t*_(1-a) SE, psi - t*_(a) SE] (Efron & Tibshirani 1993 eq. 12.22)
      const auto q = quantiles(t_star, want_low ? 1 - tail : unwanted, want_high ? tail : unwanted);
      if (want_low) low = estimate - q[0] * se;
      if (want_high) high = estimate - q[1] * se;
      break;
    }
  }

  method_result r;
  r.method = "bootstrap";
  r.estimand = std::abs(coefficient_sum) > 1e-9 ? "linear combination of means" : "mean contrast";
  r.estimate = estimate;
  r.se = se;
  r.statistic_name = std::string("t");  // (a literal here trips GCC 12 bug 105651, -Wrestrict)
  r.statistic = t_observed;
  r.p_value = phipson_smyth_p(hits, m);
  r.p_interval = clopper_pearson(hits, m, 0.99);
  r.ci_low = low;
  r.ci_high = high;
  r.resamples = m;
  r.exact = false;
  r.null_hypothesis = std::abs(coefficient_sum) > 1e-9 ? "the linear combination of the means is zero"
                                                       : "the mean contrast is zero (no equal-distribution assumption)";
  std::ostringstream note;
  note.precision(6);
  note << "bootstrap: " << m << " resamples within each level (seed " << o.seed << "); interval: " << interval_words;
  if (o.interval == bootstrap_interval::bca) note << ", bias z0 = " << bias << ", acceleration a = " << acceleration;
  r.notes.push_back(note.str());
  std::ostringstream test_note;
  test_note.precision(6);
  test_note << "test: bootstrap-t, p = (b+1)/(m+1) with b = " << hits << " resamples where (psi*-psi)/SE* is at least "
            << "as extreme as psi/SE; bootstrap standard error of the estimate " << bootstrap_se;
  r.notes.push_back(test_note.str());
  return r;
}

joint_resampling joint_bootstrap_statistics(const prepared_data& p, std::span<const contrast> family,
                                            const analysis_options& o) {
  using namespace detail;
  if (family.empty()) throw analysis_error("joint bootstrap statistics need at least one contrast");
  for (const contrast& c : family) require_bootstrap_contrast(c, p);
  if (o.resamples == 0) throw usage_error("the number of resamples must be at least 1");
  const std::vector<std::size_t> levels = involved_levels(family);
  const resampling_pool pool = make_bootstrap_pool(p, levels);
  const bootstrap_table table(pool);
  const draw_ranges draws(table.ranges, 4);
  std::vector<contrast_terms> terms;
  for (const contrast& c : family) terms.push_back(make_terms(c, pool));
  const std::size_t m = family.size();

  joint_resampling out;
  out.seed = o.seed;
  out.resamples = o.resamples;
  out.statistics.assign(out.resamples * m, 0.0);
  for (const contrast& c : family) {
    double psi = 0, se2 = 0, coefficient_sum = 0;
    for (std::size_t level : levels) {
      const double ci = c.coefficients[level];
      coefficient_sum += ci;
      psi += ci * p.groups[level].centred_mean;
      se2 += ci * ci * p.groups[level].variance / static_cast<double>(p.groups[level].n);
    }
    out.observed.push_back(studentized_value(psi + p.data.centre * coefficient_sum, se2));
  }
  for_each_bootstrap_block(out.resamples, o,
                           [&](lane_stream& rng, std::uint64_t first, std::uint64_t count, std::uint64_t) {
                             bootstrap_walker walker(table, draws);
                             double* row = out.statistics.data() + first * m;
                             walker.run(rng, count, [&](const double* chunk, std::uint64_t used) {
                               double d[bootstrap_walker::lanes], v[bootstrap_walker::lanes];
                               for (std::size_t j = 0; j < m; ++j) {
                                 evaluate_chunk(terms[j], chunk, d, v);
                                 for (std::uint64_t l = 0; l < used; ++l) row[l * m + j] = studentized_value(d[l], v[l]);
                               }
                               row += used * m;
                             });
                           });
  return out;
}

}  // namespace contrasta
