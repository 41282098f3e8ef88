// Tests of equal spread across levels: Levene-type (mean, median, trimmed-mean centres),
// Bartlett and Fligner-Killeen.
#include <cmath>

#include "contrasta/diagnostics.hpp"
#include "contrasta/summary.hpp"
#include "diagnostic_ranks.hpp"
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

}  // namespace

variance_test levene_test(const sample_list& groups, levene_centre centre, double trim) {
  std::vector<std::vector<double>> deviations;
  for (auto g : groups) {
    double c = not_available;
    if (!g.empty()) {
      switch (centre) {
        case levene_centre::mean:
          c = accurate_mean(g);
          break;
        case levene_centre::median:
          c = median_of(g);
          break;
        case levene_centre::trimmed:
          c = trimmed_mean_of(g, trim);
          break;
      }
    }
    std::vector<double> z;
    z.reserve(g.size());
    for (double y : g) z.push_back(std::abs(y - c));
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
  variance_test out;
  out.test = "fligner";
  out.null_hypothesis = "the spreads about the level medians are the same in every level";
  std::vector<std::vector<double>> deviations;
  for (auto g : groups) {
    const double m = g.empty() ? 0.0 : median_of(g);
    std::vector<double> z;
    for (double y : g) z.push_back(std::abs(y - m));
    deviations.push_back(std::move(z));
  }
  const auto ranked = detail::rank_together(deviations);
  const double N = static_cast<double>(ranked.ranks.size());
  const detail::normal standard;
  // Scores a_i = Phi^-1(1/2 + r_i / (2(N+1))) (Conover, Johnson & Johnson 1981, FK test).
  std::vector<double> scores;
  scores.reserve(ranked.ranks.size());
  for (double r : ranked.ranks) scores.push_back(boost::math::quantile(standard, 0.5 + r / (2 * (N + 1))));
  const double score_mean = accurate_mean(scores);
  const double score_variance = sum_squared_deviations(scores, score_mean) / (N - 1);
  double between = 0;
  std::size_t start = 0;
  for (auto& d : deviations) {
    const std::span<const double> group_scores(scores.data() + start, d.size());
    start += d.size();
    if (d.empty()) continue;
    const double dm = accurate_mean(group_scores) - score_mean;
    between += static_cast<double>(d.size()) * dm * dm;
  }
  out.statistic = between / score_variance;
  out.df1 = static_cast<double>(groups.size()) - 1;
  out.p_value = chi_squared_upper_tail(out.statistic, out.df1);
  return out;
}

std::vector<variance_test> variance_tests(const prepared_data& p) {
  sample_list groups;
  for (std::size_t i = 0; i < p.data.level_count(); ++i) groups.push_back(p.data.group(i));
  return {levene_test(groups, levene_centre::mean), levene_test(groups, levene_centre::median),
          levene_test(groups, levene_centre::trimmed, 0.1), bartlett_test(groups), fligner_test(groups)};
}

}  // namespace contrasta
