// Dunnett's joint probability for the many-to-one family with unequal group sizes.
// With Z_i = lambda_i X + sqrt(1 - lambda_i^2) Y_i (X, Y_i independent standard normals) the
// Z_i have correlations lambda_i lambda_j, so given X = x and the scale s the events
// |Z_i| <= c s are independent (Dunnett 1955, section 2): the probability is a one-dimensional
// normal integral over x inside the integral over the chi-distributed scale.
#include "contrasta/dunnett.hpp"

#include <cmath>
#include <limits>

#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/tools/roots.hpp>

#include "scale_mixture.hpp"

namespace contrasta {
namespace {

using detail::normal_density;
using detail::normal_lower;
using detail::normal_upper;

struct factor {
  double lambda, tau;  // tau = sqrt(1 - lambda^2)
};

std::vector<factor> factors(std::span<const double> lambda) {
  std::vector<factor> out;
  for (double l : lambda) out.push_back({l, std::sqrt((1 - l) * (1 + l))});
  return out;
}

// Probability outside the acceptance region of one Z_i given X = x: P(|Z_i| > h | x) or
// P(Z_i > h | x), from erfc tails so that it stays accurate when small.
double outside(const factor& f, double h, double x, bool two_sided) {
  double upper = normal_upper((h - f.lambda * x) / f.tau);
  if (!two_sided) return upper;
  return upper + normal_lower((-h - f.lambda * x) / f.tau);
}

// The known-scale integrals over x, on [-9, 9] where phi(x) carries all but 1e-18 of the mass,
// by adaptive Gauss-Kronrod (31 points): a lambda_i near 1 (a treatment far larger than the
// control) makes the integrand change on a scale of tau_i. One call over the whole range makes
// the tolerance relative to the whole integral, not to each near-empty piece of it.
template <class F>
double over_x(const F& f) {
  return boost::math::quadrature::gauss_kronrod<double, 21>::integrate(f, -9.0, 9.0, 12, 1e-11);
}

double inside_known(const std::vector<factor>& fs, double h, bool two_sided) {
  if (two_sided && !(h > 0)) return 0.0;
  return std::min(1.0, over_x([&](double x) {
    double log_inside = 0;
    for (const auto& f : fs) log_inside += std::log1p(-outside(f, h, x, two_sided));
    return normal_density(x) * std::exp(log_inside);
  }));
}

// 1 - prod(1 - outside_i) as -expm1(sum log1p(-outside_i)): no cancellation in the tail.
double outside_known(const std::vector<factor>& fs, double h, bool two_sided) {
  return std::min(1.0, over_x([&](double x) {
    double log_inside = 0;
    for (const auto& f : fs) log_inside += std::log1p(-outside(f, h, x, two_sided));
    return normal_density(x) * -std::expm1(log_inside);
  }));
}

// Student's t quantile, the normal one for an infinite df.
double t_quantile_of(double prob, double df) {
  if (std::isinf(df)) return quantile(detail::normal(), prob);
  return quantile(detail::students_t(df), prob);
}

bool valid(std::span<const double> lambda, double df) {
  if (lambda.empty() || !(df > 0)) return false;
  for (double l : lambda)
    if (!(std::abs(l) < 1) || l == 0) return false;
  return true;
}

const std::vector<double>& dunnett_scales() {
  static const std::vector<double> scales = {0.25, 0.5, 1, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10, 12, 16, 20, 30};
  return scales;
}

// Beyond this critical value every one-dimensional normal tail in the integrand underflows.
constexpr double dunnett_beyond_double = 40;

double joint(double c, std::span<const double> lambda, double df, bool two_sided, bool upper_tail) {
  if (std::isnan(c) || !valid(lambda, df)) return std::numeric_limits<double>::quiet_NaN();
  if (std::isinf(c)) return (c > 0) == upper_tail ? 0.0 : 1.0;
  const auto fs = factors(lambda);
  if (two_sided && !(c > 0)) return upper_tail ? 1.0 : 0.0;
  if (!two_sided && c < -dunnett_beyond_double) return upper_tail ? 1.0 : 0.0;
  // A one-sided bound at or below zero: the events are Z_i <= c s with c s <= 0, so the
  // known-scale probabilities are evaluated at h = -|c| s (c = 0: free of s).
  const double sign = (!two_sided && c < 0) ? -1.0 : 1.0;
  auto lower = [&](double h) { return inside_known(fs, sign * h, two_sided); };
  auto upper = [&](double h) { return outside_known(fs, sign * h, two_sided); };
  if (c == 0) return upper_tail ? upper(0) : lower(0);
  if (df >= detail::known_scale_df) return upper_tail ? upper(std::abs(c)) : lower(std::abs(c));
  if (sign < 0) {
    // Here P(max Z_i > c s) rises with s: the complement side is the well-behaved one.
    double inside = detail::scale_mixture(std::abs(c), df, lower, upper, false, dunnett_scales(), dunnett_beyond_double);
    return upper_tail ? 1 - inside : inside;
  }
  return detail::scale_mixture(c, df, lower, upper, upper_tail, dunnett_scales(), dunnett_beyond_double);
}

}  // namespace

std::vector<double> dunnett_lambdas(std::span<const double> treatment_n, double control_n) {
  std::vector<double> out;
  for (double n : treatment_n) out.push_back(std::sqrt(n / (n + control_n)));
  return out;
}

double dunnett_cdf(double c, std::span<const double> lambda, double df, bool two_sided) {
  return joint(c, lambda, df, two_sided, false);
}

double dunnett_sf(double c, std::span<const double> lambda, double df, bool two_sided) {
  return joint(c, lambda, df, two_sided, true);
}

double dunnett_critical(double alpha, std::span<const double> lambda, double df, bool two_sided) {
  if (!(alpha > 0 && alpha < 0.5) || !valid(lambda, df)) return std::numeric_limits<double>::quiet_NaN();
  const double log_alpha = std::log(alpha);
  auto f = [&](double c) {
    double p = dunnett_sf(c, lambda, df, two_sided);
    return (p > 0 ? std::log(p) : -1e300) - log_alpha;
  };
  // The Bonferroni bound t_{1 - alpha/(sides m)} is above the answer and Student's single
  // t_{1 - alpha/sides} below it.
  const double sides = two_sided ? 2.0 : 1.0;
  const double m = static_cast<double>(lambda.size());
  double lo = t_quantile_of(1 - alpha / sides, df) * 0.999;
  double hi = t_quantile_of(1 - alpha / (sides * m), df) * 1.001 + 1e-9;
  std::uintmax_t iterations = 100;
  auto bracket = boost::math::tools::toms748_solve(f, lo, hi, boost::math::tools::eps_tolerance<double>(45),
                                                   iterations, detail::policy());
  return (bracket.first + bracket.second) / 2;
}

}  // namespace contrasta
