// Overall tests of equal level means (or of identical distributions, Kruskal-Wallis).
#include "contrasta/overall.hpp"

#include <cmath>
#include <cstdint>

#include "diagnostic_ranks.hpp"
#include "distributions.hpp"

namespace contrasta {
namespace {

double f_upper_tail(double f, double df1, double df2) {
  if (!(f >= 0) || !(df1 > 0) || !(df2 > 0)) return std::nan("");
  return boost::math::cdf(boost::math::complement(detail::fisher_f(df1, df2), f));
}

double chi_squared_upper_tail(double x, double df) {
  if (!(x >= 0) || !(df > 0)) return std::nan("");
  return boost::math::cdf(boost::math::complement(detail::chi_squared(df), x));
}

// Every level has n >= 2 and a positive variance: the heteroscedastic tests need both.
bool every_variance_positive(const prepared_data& p) {
  for (const auto& g : p.groups)
    if (g.n < 2 || !(g.variance > 0)) return false;
  return true;
}

}  // namespace

overall_test anova_f_test(const prepared_data& p) {
  overall_test t;
  t.test = "anova-f";
  t.statistic = p.anova.f;
  t.df1 = p.anova.df_between;
  t.df2 = p.anova.df_within;
  t.p_value = p.anova.p_value;
  t.null_hypothesis = "all level means are equal (equal variances assumed)";
  return t;
}

overall_test welch_f_test(const prepared_data& p) {
  // Welch 1951 (Biometrika 38:330-336): w_i = n_i/s_i^2, weighted mean m = sum w_i ybar_i / W,
  // F = [sum w_i (ybar_i - m)^2 / (k-1)] / [1 + 2(k-2)/(k^2-1) L], L = sum (1 - w_i/W)^2/(n_i-1),
  // df1 = k-1, df2 = (k^2-1)/(3L).
  overall_test t;
  t.test = "welch-f";
  t.null_hypothesis = "all level means are equal (variances may differ)";
  const auto& groups = p.groups;
  const double k = static_cast<double>(groups.size());
  double total_weight = 0, weighted_sum = 0;
  for (const auto& g : groups) {
    const double w = static_cast<double>(g.n) / g.variance;
    total_weight += w;
    weighted_sum += w * g.centred_mean;
  }
  const double weighted_mean = weighted_sum / total_weight;
  double between = 0, lambda = 0;
  for (const auto& g : groups) {
    const double w = static_cast<double>(g.n) / g.variance;
    const double d = g.centred_mean - weighted_mean;
    between += w * d * d;
    const double share = 1 - w / total_weight;
    lambda += share * share / (static_cast<double>(g.n) - 1);
  }
  t.statistic = (between / (k - 1)) / (1 + 2 * (k - 2) / (k * k - 1) * lambda);
  t.df1 = k - 1;
  t.df2 = (k * k - 1) / (3 * lambda);
  t.p_value = f_upper_tail(t.statistic, t.df1, *t.df2);
  return t;
}

overall_test brown_forsythe_f_test(const prepared_data& p) {
  // Brown & Forsythe 1974 (Technometrics 16:129-132): F* = sum n_i (ybar_i - ybar)^2 /
  // sum (1 - n_i/N) s_i^2 on df1 = k-1 and Satterthwaite df2 = 1 / sum f_i^2/(n_i-1) with
  // f_i = (1 - n_i/N) s_i^2 / sum_j (1 - n_j/N) s_j^2.
  overall_test t;
  t.test = "brown-forsythe-f";
  t.null_hypothesis = "all level means are equal (variances may differ)";
  const auto& groups = p.groups;
  double N = 0, grand_sum = 0;
  for (const auto& g : groups) {
    N += static_cast<double>(g.n);
    grand_sum += static_cast<double>(g.n) * g.centred_mean;
  }
  const double grand_mean = grand_sum / N;
  double between = 0, denominator = 0;
  for (const auto& g : groups) {
    const double d = g.centred_mean - grand_mean;
    between += static_cast<double>(g.n) * d * d;
    denominator += (1 - static_cast<double>(g.n) / N) * g.variance;
  }
  double reciprocal_df2 = 0;
  for (const auto& g : groups) {
    const double f = (1 - static_cast<double>(g.n) / N) * g.variance / denominator;
    reciprocal_df2 += f * f / (static_cast<double>(g.n) - 1);
  }
  t.statistic = between / denominator;
  t.df1 = static_cast<double>(groups.size()) - 1;
  t.df2 = 1 / reciprocal_df2;
  t.p_value = f_upper_tail(t.statistic, t.df1, *t.df2);
  return t;
}

overall_test alexander_govern_test(const prepared_data& p) {
  // Alexander & Govern 1994 (J. Educ. Stat. 19:91-101), equations (1)-(9): one-sample t of each
  // level mean against the precision-weighted common mean, normalised by Hill's (1970)
  // expansion, summed as chi-square(k-1).
  overall_test t;
  t.test = "alexander-govern";
  t.null_hypothesis = "all level means are equal (variances may differ)";
  const auto& groups = p.groups;
  double total_precision = 0, weighted_sum = 0;
  for (const auto& g : groups) {
    const double precision = static_cast<double>(g.n) / g.variance;
    total_precision += precision;
    weighted_sum += precision * g.centred_mean;
  }
  const double common_mean = weighted_sum / total_precision;
  double a_statistic = 0;
  for (const auto& g : groups) {
    const double se = std::sqrt(g.variance / static_cast<double>(g.n));
    const double ti = (g.centred_mean - common_mean) / se;
    const double nu = static_cast<double>(g.n) - 1;
    const double a = nu - 0.5;
    const double b = 48 * a * a;
    const double c = std::sqrt(a * std::log1p(ti * ti / nu));
    const double c2 = c * c, c3 = c2 * c, c4 = c2 * c2, c5 = c4 * c, c7 = c5 * c2;
    const double z =
        c + (c3 + 3 * c) / b - (4 * c7 + 33 * c5 + 240 * c3 + 855 * c) / (10 * b * b + 8 * b * c4 + 1000 * b);
    a_statistic += z * z;
  }
  t.statistic = a_statistic;
  t.df1 = static_cast<double>(groups.size()) - 1;
  t.p_value = chi_squared_upper_tail(t.statistic, t.df1);
  return t;
}

overall_test kruskal_wallis_test(const prepared_data& p) {
  // Kruskal & Wallis 1952 (JASA 47:583-621): H = 12/(N(N+1)) sum R_i^2/n_i - 3(N+1), divided by
  // the tie correction 1 - sum(t^3 - t)/(N^3 - N); chi-square(k-1).
  overall_test t;
  t.test = "kruskal-wallis";
  t.null_hypothesis = "every level has the same distribution";
  std::vector<std::span<const double>> samples;
  for (std::size_t i = 0; i < p.data.level_count(); ++i) samples.push_back(sorted_group(p, i));
  // Rank sums kept as twice their value in integers: exact for any N below 2^32, so the sum
  // does not depend on the order in which the ranks arrive.
  std::vector<std::uint64_t> twice_rank_sum(samples.size(), 0);
  double tie_sum = 0;
  detail::for_each_tie_block(samples, [&](std::size_t first, std::span<const detail::run_position> members) {
    const std::uint64_t twice_mid = 2 * first + 1 + members.size();
    for (const auto& m : members) twice_rank_sum[m.run] += twice_mid;
    tie_sum += detail::block_tie_term(members.size());
  });
  const double N = static_cast<double>(p.data.size());
  // sum n_i (Rbar_i - (N+1)/2)^2 is the same quantity as sum R_i^2/n_i - N(N+1)^2/4 without the
  // cancellation.
  double spread = 0;
  for (std::size_t i = 0; i < samples.size(); ++i) {
    const auto s = samples[i];
    if (s.empty()) continue;
    const double rank_sum = static_cast<double>(twice_rank_sum[i]) / 2;
    const double d = rank_sum / static_cast<double>(s.size()) - (N + 1) / 2;
    spread += static_cast<double>(s.size()) * d * d;
  }
  const double h = 12 / (N * (N + 1)) * spread;
  const double correction = 1 - tie_sum / (N * N * N - N);
  t.statistic = h / correction;
  t.df1 = static_cast<double>(samples.size()) - 1;
  t.p_value = chi_squared_upper_tail(t.statistic, t.df1);
  return t;
}

std::vector<overall_test> overall_tests(const prepared_data& p) {
  std::vector<overall_test> out;
  if (p.groups.size() < 2) return out;
  if (p.anova.df_within > 0) out.push_back(anova_f_test(p));
  if (every_variance_positive(p)) {
    out.push_back(welch_f_test(p));
    out.push_back(brown_forsythe_f_test(p));
    out.push_back(alexander_govern_test(p));
  }
  std::size_t non_empty = 0;
  for (const auto& g : p.groups) non_empty += g.n > 0 ? 1 : 0;
  if (non_empty == p.groups.size() && p.data.size() > 1) {
    auto kw = kruskal_wallis_test(p);
    if (std::isfinite(kw.statistic)) out.push_back(kw);
  }
  return out;
}

}  // namespace contrasta
