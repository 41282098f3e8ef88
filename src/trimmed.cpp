// Yuen's trimmed-mean contrast (Yuen 1974, Biometrika 61:165-170), for any contrast.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include "contrasta/classical.hpp"
#include "contrasta/error.hpp"
#include "contrasta/robust.hpp"

namespace contrasta {

std::size_t trim_count(std::size_t n, double trim) {
  if (!(trim >= 0 && trim < 0.5)) throw usage_error("--trim must be at least 0 and below 0.5 (for example 0.2)");
  const double product = trim * static_cast<double>(n);
  // The product carries a relative rounding error near 1e-16; a relative allowance of 1e-12
  // puts exact decimal products such as 0.29 * 100 on the integer they mean.
  return static_cast<std::size_t>(std::floor(product + 1e-12 * std::max(1.0, product)));
}

trimmed_sample trim_sample(std::span<const double> x, double trim) {
  trimmed_sample s;
  s.n = x.size();
  s.trimmed_per_side = trim_count(s.n, trim);
  s.kept = s.n - 2 * s.trimmed_per_side;
  if (s.n == 0) return s;
  std::vector<double> v(x.begin(), x.end());
  std::sort(v.begin(), v.end());
  const std::size_t g = s.trimmed_per_side, last = s.n - 1 - g;
  double sum = 0;
  for (std::size_t i = g; i <= last; ++i) sum += v[i];
  double mean = sum / static_cast<double>(s.kept);
  double correction = 0;  // second pass: the mean of the residuals (Bjorck's correction)
  for (std::size_t i = g; i <= last; ++i) correction += v[i] - mean;
  s.trimmed_mean = mean + correction / static_cast<double>(s.kept);
  // Winsorizing: the g smallest become v[g], the g largest v[last].
  for (std::size_t i = 0; i < g; ++i) {
    v[i] = v[g];
    v[s.n - 1 - i] = v[last];
  }
  double wsum = 0;
  for (double a : v) wsum += a;
  double wmean = wsum / static_cast<double>(s.n);
  double wcorr = 0;
  for (double a : v) wcorr += a - wmean;
  wmean += wcorr / static_cast<double>(s.n);
  double ss = 0, comp = 0;
  for (double a : v) {
    const double d = a - wmean;
    ss += d * d;
    comp += d;
  }
  ss -= comp * comp / static_cast<double>(s.n);  // corrected two-pass (Chan, Golub & LeVeque 1983)
  s.winsorized_variance = s.n > 1 ? ss / static_cast<double>(s.n - 1) : std::nan("");
  return s;
}

namespace {
// The summaries already hold the trimmed mean and winsorized variance (computed once, checked
// against scipy in tests/robust_test.cpp); recompute only when they were made for another trim.
trimmed_sample trimmed_summary(const prepared_data& p, std::size_t level, double trim) {
  const group_summary& g = p.groups[level];
  if (g.trim != trim || g.trimmed_per_side != trim_count(g.n, trim)) return trim_sample(p.data.group(level), trim);
  trimmed_sample s;
  s.n = g.n;
  s.trimmed_per_side = g.trimmed_per_side;
  s.kept = g.n - 2 * g.trimmed_per_side;
  s.trimmed_mean = g.centred_trimmed_mean;
  s.winsorized_variance = g.winsorized_variance;
  return s;
}
}  // namespace

method_result trimmed_contrast(const prepared_data& p, const contrast& c, const analysis_options& o) {
  const dataset& data = p.data;
  method_result r;
  r.method = "trimmed";
  std::string trimmed_note = "trimmed from each end:";
  double estimate = 0, variance = 0, df_denominator = 0;
  for (std::size_t level : c.involved()) {
    const trimmed_sample s = trimmed_summary(p, level, o.trim);
    if (s.kept < 2)
      throw analysis_error("level '" + data.levels[level] + "' keeps " + std::to_string(s.kept) +
                           " observation(s) after trimming; Yuen's test needs at least 2: lower --trim or use rank");
    const double ci = c.coefficients[level];
    const double h = static_cast<double>(s.kept);
    // Yuen 1974: d_i = (n_i - 1) s_wi^2 / (h_i (h_i - 1)).
    const double d = static_cast<double>(s.n - 1) * s.winsorized_variance / (h * (h - 1));
    const double component = ci * ci * d;
    estimate += ci * s.trimmed_mean;
    variance += component;
    df_denominator += component * component / (h - 1);
    trimmed_note += (trimmed_note.back() == ':' ? " " : ", ") + data.levels[level] + " " +
                    std::to_string(s.trimmed_per_side) + " of " + std::to_string(s.n);
  }
  // Centred trimmed means; a general linear combination gets the centre back (exactly nothing
  // for a contrast, even when rounded coefficients such as 1/3 do not sum to exactly zero).
  r.estimate = estimate + c.location_term(data.centre);
  r.se = std::sqrt(variance);
  r.statistic_name = "t";
  r.statistic = r.estimate / r.se;
  const double df = variance * variance / df_denominator;  // Welch-Satterthwaite form, Yuen 1974
  r.df = df;
  char trim_text[32];
  std::snprintf(trim_text, sizeof trim_text, "%g", o.trim);
  r.estimand = std::string("contrast of ") + trim_text + "-trimmed means";
  r.null_hypothesis =
      std::string("the contrast of the population ") + trim_text + "-trimmed means is zero: sum c_i mu_t,i = 0";
  r.notes.push_back(trimmed_note);
  complete_t_result(r, df, o);
  return r;
}

}  // namespace contrasta
