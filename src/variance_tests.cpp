// Tests of equal spread across levels: Levene-type (mean, median, trimmed-mean centres),
// Bartlett and Fligner-Killeen.
#include <algorithm>
#include <bit>
#include <cmath>
#include <cstdint>

#include "contrasta/diagnostics.hpp"
#include "contrasta/summary.hpp"
#include "diagnostic_ranks.hpp"
#include "side_by_side.hpp"
#include "distributions.hpp"

namespace contrasta {
namespace {

double f_upper_tail(double f, double df1, double df2) {
  if (!(f >= 0) || !(df1 > 0) || !(df2 > 0)) return not_available;
  return boost::math::cdf(boost::math::complement(detail::fisher_f(df1, df2), f));
}

double chi_squared_upper_tail(double x, double df) {
  if (!(x >= 0) || !(df > 0)) return not_available;
  return boost::math::cdf(boost::math::complement(detail::chi_squared(df), x));
}

std::size_t total_size(const sample_list& groups) {
  std::size_t n = 0;
  for (auto g : groups) n += g.size();
  return n;
}

// The one-way ANOVA F of several samples (the engine of every Levene-type test).
variance_test anova_f_of(const std::vector<std::vector<double>>& samples) {
  variance_test out;
  const double k = static_cast<double>(samples.size());
  std::size_t total = 0;
  for (auto& s : samples) total += s.size();
  const double N = static_cast<double>(total);
  std::vector<double> means;
  double grand = 0;
  for (auto& s : samples) {
    means.push_back(s.empty() ? 0.0 : accurate_mean(s));
    grand += means.back() * static_cast<double>(s.size());
  }
  grand /= N;
  double between = 0, within = 0;
  for (std::size_t i = 0; i < samples.size(); ++i) {
    const double d = means[i] - grand;
    between += static_cast<double>(samples[i].size()) * d * d;
    if (!samples[i].empty()) within += sum_squared_deviations(samples[i], means[i]);
  }
  out.df1 = k - 1;
  out.df2 = N - k;
  // With no spread within the levels the F ratio is undefined (or infinite): reported as NaN.
  out.statistic = within > 0 ? (between / out.df1) / (within / *out.df2) : not_available;
  out.p_value = f_upper_tail(out.statistic, out.df1, *out.df2);
  return out;
}

// Levene-type test about given centres, one per group.
variance_test levene_about(const sample_list& groups, const std::vector<double>& centres, levene_centre centre) {
  std::vector<std::vector<double>> deviations;
  for (std::size_t i = 0; i < groups.size(); ++i) {
    std::vector<double> z;
    z.reserve(groups[i].size());
    for (double y : groups[i]) z.push_back(std::abs(y - centres[i]));
    deviations.push_back(std::move(z));
  }
  variance_test out = anova_f_of(deviations);
  switch (centre) {
    case levene_centre::mean:
      out.test = "levene-mean";
      out.null_hypothesis = "the mean absolute deviation from the level mean is the same in every level";
      break;
    case levene_centre::median:
      out.test = "levene-median";
      out.null_hypothesis = "the mean absolute deviation from the level median is the same in every level";
      break;
    case levene_centre::trimmed:
      out.test = "levene-trimmed";
      out.null_hypothesis = "the mean absolute deviation from the level's trimmed mean is the same in every level";
      break;
  }
  return out;
}

// The centre of one group; `sorted` is the group in ascending order, or empty to have the
// median and trimmed mean computed from `g` itself (same values).
double levene_centre_of(std::span<const double> g, std::span<const double> sorted, levene_centre centre, double trim) {
  if (g.empty()) return not_available;
  const bool have_sorted = sorted.size() == g.size();
  switch (centre) {
    case levene_centre::mean:
      return accurate_mean(g);
    case levene_centre::median:
      return have_sorted ? median_of_sorted(sorted) : median_of(g);
    case levene_centre::trimmed:
      return have_sorted ? trimmed_mean_of_sorted(sorted, trim) : trimmed_mean_of(g, trim);
  }
  return not_available;
}

std::vector<std::vector<double>> sorted_copies(const sample_list& groups) {
  std::vector<std::vector<double>> out;
  for (auto g : groups) {
    out.emplace_back(g.begin(), g.end());
    std::sort(out.back().begin(), out.back().end());
  }
  return out;
}

variance_test levene_sorted(const sample_list& groups, const sample_list& sorted, levene_centre centre, double trim) {
  std::vector<double> centres;
  for (std::size_t i = 0; i < groups.size(); ++i) centres.push_back(levene_centre_of(groups[i], sorted[i], centre, trim));
  return levene_about(groups, centres, centre);
}

// An open-addressing hash table from the distinct values of a sorted sample to one number each
// (equal values carry equal numbers). Keys are compared as bit patterns: the values here are
// absolute deviations, never -0 or NaN.
class value_table {
 public:
  value_table(const std::vector<double>& sorted_keys, const std::vector<double>& numbers) {
    std::size_t distinct = 0;
    for (std::size_t j = 0; j < sorted_keys.size(); ++j) distinct += j == 0 || sorted_keys[j] != sorted_keys[j - 1];
    std::size_t capacity = 16;
    while (capacity < 2 * distinct) capacity *= 2;
    shift_ = 64 - static_cast<unsigned>(std::countr_zero(capacity));
    slots_.assign(capacity, slot{});
    for (std::size_t j = 0; j < sorted_keys.size(); ++j) {
      if (j > 0 && sorted_keys[j] == sorted_keys[j - 1]) continue;
      const std::uint64_t key = std::bit_cast<std::uint64_t>(sorted_keys[j]);
      std::size_t i = home(key);
      while (slots_[i].used) i = (i + 1) & (slots_.size() - 1);
      slots_[i] = {key, numbers[j], true};
    }
  }
  // The number of a value that is one of the keys.
  double at(double value) const {
    const std::uint64_t key = std::bit_cast<std::uint64_t>(value);
    std::size_t i = home(key);
    // Linear probing puts a key before the first free slot from its home (a free slot's key
    // field is 0, the bits of +0, hence the `used` test).
    while (!slots_[i].used || slots_[i].key != key) i = (i + 1) & (slots_.size() - 1);
    return slots_[i].number;
  }

 private:
  struct slot {
    std::uint64_t key = 0;
    double number = 0;
    bool used = false;
  };
  // Fibonacci hashing: the high bits of key times 2^64 / golden ratio.
  std::size_t home(std::uint64_t key) const { return static_cast<std::size_t>((key * 0x9E3779B97F4A7C15ull) >> shift_); }
  std::vector<slot> slots_;
  unsigned shift_ = 60;
};

// Fligner-Killeen on the groups and the same groups in ascending order.
variance_test fligner_sorted(const sample_list& groups, const sample_list& sorted) {
  variance_test out;
  out.test = "fligner";
  out.null_hypothesis = "the spreads about the level medians are the same in every level";
  // |y - median| of each group in ascending order, from the sorted group without a sort.
  std::vector<std::vector<double>> deviations;
  std::vector<double> medians;
  std::size_t total = 0;
  for (std::size_t i = 0; i < groups.size(); ++i) {
    medians.push_back(groups[i].empty() ? 0.0 : median_of_sorted(sorted[i]));
    deviations.push_back(sorted_absolute_deviations(sorted[i], medians.back()));
    total += groups[i].size();
  }
  const double N = static_cast<double>(total);
  const detail::normal standard;
  // Scores a_i = Phi^-1(1/2 + r_i / (2(N+1))) (Conover, Johnson & Johnson 1981, FK test): one
  // quantile per block of tied deviations, laid out like `deviations`.
  std::vector<std::vector<double>> sorted_scores(groups.size());
  for (std::size_t i = 0; i < groups.size(); ++i) sorted_scores[i].resize(deviations[i].size());
  detail::for_each_tie_block(deviations, [&](std::size_t first, std::span<const detail::run_position> members) {
    const double r = detail::block_midrank(first, members.size());
    const double score = boost::math::quantile(standard, 0.5 + r / (2 * (N + 1)));
    for (const auto& m : members) sorted_scores[m.run][m.position] = score;
  });
  // Back to the order of the observations (a score depends only on the deviation's value), so
  // the sums below run in the same order as the data. A hash table from each distinct deviation
  // to its score: a binary search per observation would cost more than everything else here.
  std::vector<double> scores;
  scores.reserve(total);
  for (std::size_t i = 0; i < groups.size(); ++i) {
    const value_table table(deviations[i], sorted_scores[i]);
    for (double y : groups[i]) scores.push_back(table.at(std::abs(y - medians[i])));
  }
  const double score_mean = accurate_mean(scores);
  const double score_variance = sum_squared_deviations(scores, score_mean) / (N - 1);
  double between = 0;
  std::size_t start = 0;
  for (auto g : groups) {
    const std::span<const double> group_scores(scores.data() + start, g.size());
    start += g.size();
    if (g.empty()) continue;
    const double dm = accurate_mean(group_scores) - score_mean;
    between += static_cast<double>(g.size()) * dm * dm;
  }
  out.statistic = between / score_variance;
  out.df1 = static_cast<double>(groups.size()) - 1;
  out.p_value = chi_squared_upper_tail(out.statistic, out.df1);
  return out;
}

sample_list spans_of(const std::vector<std::vector<double>>& v) {
  sample_list out;
  for (const auto& x : v) out.emplace_back(x);
  return out;
}

}  // namespace

variance_test levene_test(const sample_list& groups, levene_centre centre, double trim) {
  return levene_sorted(groups, sample_list(groups.size()), centre, trim);
}

variance_test bartlett_test(const sample_list& groups) {
  variance_test out;
  out.test = "bartlett";
  out.null_hypothesis = "the variances are equal (normal errors assumed)";
  const double k = static_cast<double>(groups.size());
  const double N = static_cast<double>(total_size(groups));
  double pooled = 0, log_sum = 0, reciprocal_df = 0;
  for (auto g : groups) {
    const double df = static_cast<double>(g.size()) - 1;
    const double v = g.size() >= 2 ? sum_squared_deviations(g, accurate_mean(g)) / df : not_available;
    pooled += df * v;
    log_sum += df * std::log(v);
    reciprocal_df += 1 / df;
  }
  pooled /= (N - k);
  // Bartlett 1937: T = [(N-k) ln s_p^2 - sum (n_i-1) ln s_i^2] / C.
  const double scaling = 1 + (reciprocal_df - 1 / (N - k)) / (3 * (k - 1));
  out.statistic = ((N - k) * std::log(pooled) - log_sum) / scaling;
  out.df1 = k - 1;
  out.p_value = chi_squared_upper_tail(out.statistic, out.df1);
  return out;
}

variance_test fligner_test(const sample_list& groups) {
  const auto sorted = sorted_copies(groups);
  return fligner_sorted(groups, spans_of(sorted));
}

std::vector<variance_test> variance_tests(const prepared_data& p) {
  sample_list groups, sorted;
  for (std::size_t i = 0; i < p.data.level_count(); ++i) {
    groups.push_back(p.data.group(i));
    sorted.push_back(sorted_group(p, i));
  }
  std::vector<variance_test> out(5);
  detail::side_by_side(
      p.data.size(), [&] { out[4] = fligner_sorted(groups, sorted); },
      [&] {
        out[0] = levene_sorted(groups, sorted, levene_centre::mean, 0.1);
        out[1] = levene_sorted(groups, sorted, levene_centre::median, 0.1);
        out[2] = levene_sorted(groups, sorted, levene_centre::trimmed, 0.1);
        out[3] = bartlett_test(groups);
      });
  return out;
}

}  // namespace contrasta
