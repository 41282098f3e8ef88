// The studentized range distribution by numerical integration (Copenhaver & Holland 1988,
// J. Stat. Comput. Simul. 30:1-15): the known-variance range probability as an integral over
// the largest observation, mixed over the distribution of the estimated scale.
#include "contrasta/studentized_range.hpp"

#include <cmath>
#include <limits>

#include <boost/math/quadrature/gauss.hpp>
#include <boost/math/tools/roots.hpp>

#include "scale_mixture.hpp"

namespace contrasta {
namespace {

using detail::normal_density;
using detail::normal_lower;
using detail::normal_upper;

// Beyond this range the upper tail of the known-variance range underflows to zero in double.
constexpr double range_beyond_double = 80;

// Sums a fixed 15-point Gauss-Legendre rule over panels of width 2 covering [from, to]: the
// integrands below vary on the scale of a standard normal density, so each panel is exact to
// rounding.
template <class F>
double panel_integral(const F& f, double from, double to) {
  constexpr double width = 2.0;
  double total = 0;
  for (double a = from; a < to; a += width) {
    total += boost::math::quadrature::gauss<double, 15>::integrate(f, a, std::min(a + width, to));
  }
  return total;
}

// Phi(z) - Phi(z - q) without cancellation: from the nearer tail.
double normal_interval(double z, double q) {
  if (z > q / 2) return normal_upper(z - q) - normal_upper(z);
  return normal_lower(z) - normal_lower(z - q);
}

// P(R <= q) for the range R of k standard normals: k int phi(z) [Phi(z) - Phi(z - q)]^(k-1) dz
// (Copenhaver & Holland 1988, eq. 1, z the largest observation). phi(z) < 1e-18 outside
// [-9, 9], which bounds the neglected part.
double range_lower(double q, double k) {
  if (!(q > 0)) return 0;
  if (std::isinf(q)) return 1;
  auto integrand = [&](double z) {
    double d = normal_interval(z, q);
    if (!(d > 0)) return 0.0;
    return k * normal_density(z) * std::exp((k - 1) * std::log(d));
  };
  return std::min(1.0, panel_integral(integrand, -9.0, 9.0));
}

// P(R > q) = k int phi(z) [Phi(z)^(k-1) - (Phi(z) - Phi(z - q))^(k-1)] dz, the identity
// k int phi Phi^(k-1) = 1 written under one integral so that no 1 - cdf cancellation occurs.
// The bracket is Phi(z)^(k-1) (1 - (1 - b/a)^(k-1)) with a = Phi(z), b = Phi(z - q), evaluated
// by expm1/log1p. In the far tail the integrand peaks near z = q/2, hence the upper limit.
double range_upper(double q, double k) {
  if (!(q > 0)) return 1;
  if (q > range_beyond_double) return 0;
  // While the upper side is above 1e-3, 1 - P(R <= q) keeps 13 digits and costs a quarter of
  // the direct integral.
  if (double lower = range_lower(q, k); lower < 0.999) return 1 - lower;
  auto integrand = [&](double z) {
    double a = normal_lower(z);
    if (!(a > 0)) return 0.0;
    double b = normal_lower(z - q);
    double ratio = b / a;
    double log_a = z > 0 ? std::log1p(-normal_upper(z)) : std::log(a);
    double log_rest = ratio < 0.5 ? std::log1p(-ratio) : std::log(normal_interval(z, q)) - log_a;
    return k * normal_density(z) * std::exp((k - 1) * log_a) * -std::expm1((k - 1) * log_rest);
  };
  // Below q/2 - 9 and above q/2 + 9 the integrand is under exp(-81) of its peak near q/2.
  return std::min(1.0, panel_integral(integrand, std::max(-9.0, q / 2 - 9), std::max(9.0, q / 2 + 9)));
}

bool valid(double k, double df) { return k >= 2 && df > 0 && std::isfinite(k); }

const std::vector<double>& range_scales() {
  static const std::vector<double> scales = {0.25, 0.5, 1, 1.5, 2, 3, 4, 5, 6, 8, 10, 12, 16, 20, 25, 30, 40, 50, 60};
  return scales;
}

double range_probability(double q, double k, double df, bool upper_tail) {
  if (std::isnan(q) || !valid(k, df)) return std::numeric_limits<double>::quiet_NaN();
  if (!(q > 0)) return upper_tail ? 1.0 : 0.0;
  if (std::isinf(q)) return upper_tail ? 0.0 : 1.0;
  if (df >= detail::known_scale_df) return upper_tail ? range_upper(q, k) : range_lower(q, k);
  return detail::scale_mixture(
      q, df, [&](double h) { return range_lower(h, k); }, [&](double h) { return range_upper(h, k); },
      upper_tail, range_scales(), range_beyond_double);
}

}  // namespace

double studentized_range_cdf(double q, double k, double df) { return range_probability(q, k, df, false); }

double studentized_range_sf(double q, double k, double df) { return range_probability(q, k, df, true); }

namespace {

// Solves P(Q > q) = alpha (upper = true) or P(Q <= q) = prob on the log scale, where both are
// smooth, with a bracket grown by doubling and TOMS 748.
double solve_range(double target, double k, double df, bool upper) {
  if (std::isnan(target) || !valid(k, df) || target < 0 || target > 1) return std::numeric_limits<double>::quiet_NaN();
  if (target == 0) return upper ? std::numeric_limits<double>::infinity() : 0.0;
  if (target == 1) return upper ? 0.0 : std::numeric_limits<double>::infinity();
  const double log_target = std::log(target);
  // Above 1e-3 the upper side is as accurate as 1 - cdf (1e-12 relative) and the cdf needs
  // about half the work.
  const bool via_cdf = upper && target >= 1e-3;
  auto f = [&](double q) {
    double p = via_cdf ? 1 - studentized_range_cdf(q, k, df)
               : upper ? studentized_range_sf(q, k, df)
                       : studentized_range_cdf(q, k, df);
    if (!(p > 0)) return upper ? -1e300 : -1e300;
    return std::log(p) - log_target;
  };
  double lo = 0, hi = 4;
  // The upper side decreases in q, the lower side increases.
  auto below = [&](double q) { return upper ? f(q) > 0 : f(q) < 0; };
  while (below(hi)) {
    lo = hi;
    hi *= 2;
    if (hi > 1e12) return std::numeric_limits<double>::infinity();
  }
  if (lo == 0) lo = hi / 1e6;
  while (!below(lo) && lo > 1e-300) {
    hi = lo;
    lo /= 4;
  }
  std::uintmax_t iterations = 200;
  auto bracket = boost::math::tools::toms748_solve(f, lo, hi, boost::math::tools::eps_tolerance<double>(50),
                                                   iterations, detail::policy());
  return (bracket.first + bracket.second) / 2;
}

}  // namespace

double studentized_range_quantile(double prob, double k, double df) {
  if (prob > 0.5) return solve_range(1 - prob, k, df, true);
  return solve_range(prob, k, df, false);
}

double studentized_range_critical(double alpha, double k, double df) { return solve_range(alpha, k, df, true); }

}  // namespace contrasta
