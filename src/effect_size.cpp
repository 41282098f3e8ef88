// Standardized contrasts (Steiger & Fouladi 1997; Kline 2013) and Bonett's unequal-variance
// standardized contrast (Bonett 2008).
#include "contrasta/effect_size.hpp"

#include <cmath>
#include <limits>

#include "distributions.hpp"

namespace contrasta {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();
constexpr double infinity = std::numeric_limits<double>::infinity();

// The noncentrality at which the noncentral t(df) cdf at t equals `probability`. The cdf falls
// as the noncentrality grows, so an expanding bracket followed by bisection finds it.
double noncentrality_at(double t, double df, double probability) {
  auto cdf_at = [&](double ncp) { return boost::math::cdf(detail::non_central_t(df, ncp), t); };
  double step = 1 + 0.5 * std::abs(t);
  double low = t - step, high = t + step;
  for (int i = 0; i < 200 && cdf_at(low) < probability; ++i) high = low, low -= step, step *= 2;
  step = 1 + 0.5 * std::abs(t);
  for (int i = 0; i < 200 && cdf_at(high) > probability; ++i) low = high, high += step, step *= 2;
  for (int i = 0; i < 200; ++i) {
    const double mid = 0.5 * (low + high);
    if (mid == low || mid == high) break;
    (cdf_at(mid) > probability ? low : high) = mid;
  }
  return 0.5 * (low + high);
}

}  // namespace

std::pair<double, double> noncentrality_limits(double t, double df, double conf, alternative side) {
  if (!std::isfinite(t) || !(df > 0)) return {nan, nan};
  switch (side) {
    case alternative::greater: return {noncentrality_at(t, df, conf), infinity};
    case alternative::less: return {-infinity, noncentrality_at(t, df, 1 - conf)};
    case alternative::two_sided: break;
  }
  return {noncentrality_at(t, df, (1 + conf) / 2), noncentrality_at(t, df, (1 - conf) / 2)};
}

effect_size_result effect_sizes(const prepared_data& p, const contrast& c, const analysis_options& o) {
  effect_size_result out;
  out.conf = o.conf;
  out.standardized.kind = "standardized";
  out.standardized.interval = "noncentral t inversion, pooled SD over all levels";
  out.bonett.kind = "bonett";
  out.bonett.interval = "normal approximation, unweighted mean of the level variances";
  for (standardized_effect* e : {&out.standardized, &out.bonett}) {
    e->estimate = e->ci_low = e->ci_high = e->standardizer = e->se = nan;
  }

  const std::size_t k = p.groups.size();
  double sum_abs = 0, sum_coefficients = 0;
  for (std::size_t i = 0; i < c.coefficients.size() && i < k; ++i) {
    sum_abs += std::abs(c.coefficients[i]);
    sum_coefficients += c.coefficients[i];
  }
  if (c.coefficients.size() != k || !(sum_abs > 0)) {
    out.notes.push_back("no effect size: the contrast does not match the levels");
    out.scale = nan;
    out.scaled_contrast = nan;
    return out;
  }
  out.scale = 2 / sum_abs;
  out.scaled_coefficients.resize(k);
  for (std::size_t i = 0; i < k; ++i) out.scaled_coefficients[i] = out.scale * c.coefficients[i];
  if (out.scale != 1)
    out.notes.push_back("coefficients multiplied by " + std::to_string(out.scale) +
                        " so that their absolute values sum to 2");
  if (std::abs(sum_coefficients) > 1e-9 * sum_abs) {
    out.notes.push_back("no standardized effect size: the coefficients do not sum to zero");
    out.scaled_contrast = nan;
    return out;
  }

  // The scaled contrast from the centred means, so that shared leading digits cost nothing.
  double psi = 0, sum_c2_over_n = 0;
  for (std::size_t i = 0; i < k; ++i) {
    const double ci = out.scaled_coefficients[i];
    if (ci == 0) continue;
    psi += ci * p.groups[i].centred_mean;
    sum_c2_over_n += ci * ci / static_cast<double>(p.groups[i].n);
  }
  out.scaled_contrast = psi;
  const auto side = o.side;

  // Standardized contrast with the pooled SD; t = d / sqrt(sum c'^2/n) is noncentral t with
  // noncentrality delta / sqrt(sum c'^2/n) (Steiger & Fouladi 1997, sec. on contrasts).
  const double df = p.anova.df_within;
  const double pooled_sd = std::sqrt(p.anova.ms_within);
  if (df >= 1 && pooled_sd > 0 && std::isfinite(pooled_sd)) {
    standardized_effect& e = out.standardized;
    e.standardizer = pooled_sd;
    e.df = df;
    e.estimate = psi / pooled_sd;
    const double root = std::sqrt(sum_c2_over_n);
    const auto [low, high] = noncentrality_limits(e.estimate / root, df, o.conf, side);
    e.ci_low = low * root;
    e.ci_high = high * root;
  } else {
    out.notes.push_back("no pooled standardized contrast: it needs error df N - k >= 1 and a non-constant response");
  }

  // Bonett 2008: standardizer from the unweighted mean of all k level variances, and the
  // delta-method variance with n_i - 1 in both terms (Bonett's small-sample choice).
  double sum_var = 0, sum_var2_over_df = 0, sum_c2_var_over_df = 0;
  bool usable = true;
  for (std::size_t i = 0; i < k; ++i) {
    const group_summary& g = p.groups[i];
    if (g.n < 2 || !std::isfinite(g.variance)) {
      usable = false;
      break;
    }
    const double df_i = static_cast<double>(g.n) - 1;
    const double ci = out.scaled_coefficients[i];
    sum_var += g.variance;
    sum_var2_over_df += g.variance * g.variance / df_i;
    sum_c2_var_over_df += ci * ci * g.variance / df_i;
  }
  const double a = static_cast<double>(k);
  const double sigma2 = sum_var / a;
  if (usable && sigma2 > 0) {
    standardized_effect& e = out.bonett;
    e.standardizer = std::sqrt(sigma2);
    e.estimate = psi / e.standardizer;
    e.se = std::sqrt(e.estimate * e.estimate * sum_var2_over_df / (2 * a * a * sigma2 * sigma2) +
                     sum_c2_var_over_df / sigma2);
    const detail::normal z;
    const double tail = side == alternative::two_sided ? (1 - o.conf) / 2 : 1 - o.conf;
    const double crit = boost::math::quantile(boost::math::complement(z, tail));
    e.ci_low = side == alternative::less ? -infinity : e.estimate - crit * e.se;
    e.ci_high = side == alternative::greater ? infinity : e.estimate + crit * e.se;
  } else {
    out.notes.push_back("no Bonett standardized contrast: every level needs at least 2 observations and the response must vary");
  }
  return out;
}

}  // namespace contrasta
