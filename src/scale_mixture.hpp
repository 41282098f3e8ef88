// The outer integral shared by the studentized range and Dunnett distributions: a probability
// that is known for a known variance, P(h), mixed over the distribution of the estimated scale
// s = sqrt(chi^2_df / df) (Copenhaver & Holland 1988, eq. 2; Dunnett 1955, section 2).
#pragma once
#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <vector>

#include <boost/math/quadrature/gauss.hpp>
#include <boost/math/special_functions/gamma.hpp>

#include "distributions.hpp"

namespace contrasta::detail {

// Beyond this many degrees of freedom the scale is taken as known: the mixture differs from the
// known-variance probability by O(1/df), below 1e-9 here.
inline constexpr double known_scale_df = 1e10;

// Density of s = sqrt(X/df), X ~ chi^2_df: f(s) = df s g(df s^2 / 2) with g the Gamma(df/2)
// density, which Boost evaluates without the cancellation of the textbook constant.
inline double scale_density(double s, double df) {
  if (s <= 0) return 0;
  return df * s * boost::math::gamma_p_derivative(df / 2, df * s * s / 2, policy());
}

// Quantile of s: sqrt(chi^2 quantile / df); `upper` gives the upper-tail quantile.
inline double scale_quantile(double prob, double df, bool upper) {
  chi_squared chi(df);
  double x = upper ? quantile(complement(chi, prob)) : quantile(chi, prob);
  return std::sqrt(x / df);
}

// The maximum of a unimodal function of s on [lo, hi], by golden-section search on log s.
template <class F>
double peak_of(const F& log_integrand, double lo, double hi) {
  if (!(lo > 0) || !(hi > lo)) return hi;
  double a = std::log(lo), b = std::log(hi);
  const double ratio = (std::sqrt(5.0) - 1) / 2;
  double x1 = b - ratio * (b - a), x2 = a + ratio * (b - a);
  double f1 = log_integrand(std::exp(x1)), f2 = log_integrand(std::exp(x2));
  // The cuts placed around the peak need it to about 1e-6 relative only.
  for (int i = 0; i < 60 && b - a > 1e-6; ++i) {
    if (f1 < f2) {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + ratio * (b - a);
      f2 = log_integrand(std::exp(x2));
    } else {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - ratio * (b - a);
      f1 = log_integrand(std::exp(x1));
    }
  }
  return std::exp((a + b) / 2);
}

// Integrates f(s) lower(q s) ds (upper_tail = false) or f(s) upper(q s) ds (upper_tail = true)
// over s in (0, inf), where lower(h) + upper(h) = 1 are the known-scale probabilities of the
// two sides. `scales` lists values of h where upper/lower change character; together with
// quantiles of s they split (0, inf) into panels, each summed by a 10-point Gauss-Legendre rule. On the first
// panel (0, b) the upper side is computed as P(s < b) - integral of f lower, which removes the
// s^(df-1) singularity of f at zero for df < 1 and keeps every term positive.
template <class Lower, class Upper>
double scale_mixture(double q, double df, const Lower& lower, const Upper& upper, bool upper_tail,
                     const std::vector<double>& scales, double upper_negligible_h) {
  using rule = boost::math::quadrature::gauss<double, 10>;  // 10 points match 20 to 3e-13 on the test grid
  std::vector<double> cuts;
  // Upper limit: P(s > s_hi) = 1e-20 bounds the dropped part absolutely (lower side) and, as
  // upper(q s) decreases in s, relatively (upper side) by 2e-20.
  const double s_hi = scale_quantile(1e-20, df, true);
  for (double pr : {1e-12, 1e-8, 1e-5, 1e-3, 0.02, 0.1, 0.3, 0.5}) cuts.push_back(scale_quantile(pr, df, false));
  for (double pr : {0.3, 0.1, 0.02, 1e-3, 1e-5, 1e-8, 1e-12, 1e-16}) cuts.push_back(scale_quantile(pr, df, true));
  double top = s_hi;
  if (upper_tail && std::isfinite(upper_negligible_h)) top = std::min(top, upper_negligible_h / q);
  cuts.push_back(top);
  // Below `bottom` the lower side holds no mass that matters (P(s < bottom) = 1e-12). The upper
  // side keeps every cut: its first panel must end where upper(q s) is still large (h = 0.25),
  // or P(s < b) - integral of f lower would cancel.
  double bottom = upper_tail ? 0.0 : cuts.front();
  if (upper_tail) {
    // Far in the upper tail the integrand is a narrow peak where the falling upper(q s) meets
    // the rising density; cuts at geometrically closer distances around it resolve it for any
    // df (the peak has width about 1 / sqrt(2 (df + q^2)) when df is large).
    const double peak = peak_of([&](double s) {
      double u = upper(q * s);
      return u > 0 ? std::log(scale_density(s, df)) + std::log(u) : -std::numeric_limits<double>::infinity();
    }, scale_quantile(1e-300, df, false), top);
    // Resolve down to about a quarter of that width.
    const int finest = std::clamp(static_cast<int>(std::ceil(std::log2(4 * std::sqrt(2 * (df + q * q))))), 3, 24);
    for (int j = 1; j <= finest; ++j) {
      double d = std::ldexp(1.0, -j);
      cuts.push_back(peak * (1 - d));
      cuts.push_back(peak * (1 + d));
    }
  }
  // Where upper/lower change character.
  for (double h : scales)
    if (h / q >= bottom) cuts.push_back(h / q);
  std::sort(cuts.begin(), cuts.end());
  cuts.erase(std::remove_if(cuts.begin(), cuts.end(), [&](double c) { return !(c > 0) || c > top; }), cuts.end());
  cuts.erase(std::unique(cuts.begin(), cuts.end()), cuts.end());
  if (cuts.empty()) return upper_tail ? 1.0 : 0.0;

  auto f_lower = [&](double s) { return scale_density(s, df) * lower(q * s); };
  auto f_upper = [&](double s) { return scale_density(s, df) * upper(q * s); };
  double total = 0;
  const double first = cuts.front();
  double first_lower = rule::integrate(f_lower, 0.0, first);
  if (upper_tail) {
    chi_squared chi(df);
    total += cdf(chi, df * first * first) - first_lower;
  } else {
    total += first_lower;
  }
  for (std::size_t i = 0; i + 1 < cuts.size(); ++i) {
    if (upper_tail) {
      total += rule::integrate(f_upper, cuts[i], cuts[i + 1]);
    } else {
      total += rule::integrate(f_lower, cuts[i], cuts[i + 1]);
    }
  }
  return std::clamp(total, 0.0, 1.0);
}

// Phi(x) and 1 - Phi(x), each from erfc so that both tails keep relative accuracy.
inline double normal_lower(double x) { return 0.5 * std::erfc(-x / std::numbers::sqrt2); }
inline double normal_upper(double x) { return 0.5 * std::erfc(x / std::numbers::sqrt2); }
inline double normal_density(double x) { return std::exp(-0.5 * x * x) / std::sqrt(2 * std::numbers::pi); }

}  // namespace contrasta::detail
