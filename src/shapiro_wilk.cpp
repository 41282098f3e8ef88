// Shapiro-Wilk W by Royston's algorithm AS R94 (Royston 1995, Appl. Stat. 44:547-551):
// approximate normal-scores coefficients for the two extreme order statistics, Blom-type scores
// for the rest, W as the squared correlation of the ordered data with the coefficients, and a
// normalising transformation of log(1 - W) for the p-value. Computed in double precision.
#include <algorithm>
#include <cmath>
#include <vector>

#include "contrasta/diagnostics.hpp"
#include "distributions.hpp"

namespace contrasta {
namespace {

// c[0] + c[1] x + ... + c[m-1] x^(m-1) (Horner).
template <std::size_t m>
double polynomial(const double (&c)[m], double x) {
  double r = c[m - 1];
  for (std::size_t j = m - 1; j-- > 0;) r = r * x + c[j];
  return r;
}

// AS R94 constants (Royston 1995, Table 1 and the published code).
constexpr double c1[] = {0.0, 0.221157, -0.147981, -2.071190, 4.434685, -2.706056};
constexpr double c2[] = {0.0, 0.042981, -0.293762, -1.752461, 5.682633, -3.582633};
constexpr double c3[] = {0.5440, -0.39978, 0.025054, -6.714e-4};
constexpr double c4[] = {1.3822, -0.77857, 0.062767, -0.0020322};
constexpr double c5[] = {-1.5861, -0.31082, -0.083751, 0.0038915};
constexpr double c6[] = {-0.4803, -0.082676, 0.0030302};
constexpr double g[] = {-2.273, 0.459};

// The upper half of the antisymmetric coefficient vector: a[0] belongs to the largest order
// statistic, a[i] to the (i+1)-th largest; the lower half is its negative.
std::vector<double> coefficients(std::size_t n) {
  const std::size_t half = n / 2;
  std::vector<double> a(half);
  if (n == 3) {
    a[0] = std::sqrt(0.5);
    return a;
  }
  const double nd = static_cast<double>(n);
  const detail::normal standard;
  // m_i = Phi^-1((i - 3/8)/(n + 1/4)), negative for the lower half.
  std::vector<double> m(half);
  double summ2 = 0;
  for (std::size_t i = 0; i < half; ++i) {
    m[i] = boost::math::quantile(standard, (static_cast<double>(i + 1) - 0.375) / (nd + 0.25));
    summ2 += m[i] * m[i];
  }
  summ2 *= 2;
  const double ssumm2 = std::sqrt(summ2);
  const double rsn = 1 / std::sqrt(nd);
  const double a1 = polynomial(c1, rsn) - m[0] / ssumm2;
  std::size_t first_plain = 1;
  double fac;
  if (n > 5) {
    first_plain = 2;
    const double a2 = -m[1] / ssumm2 + polynomial(c2, rsn);
    fac = std::sqrt((summ2 - 2 * m[0] * m[0] - 2 * m[1] * m[1]) / (1 - 2 * a1 * a1 - 2 * a2 * a2));
    a[1] = a2;
  } else {
    fac = std::sqrt((summ2 - 2 * m[0] * m[0]) / (1 - 2 * a1 * a1));
  }
  a[0] = a1;
  for (std::size_t i = first_plain; i < half; ++i) a[i] = -m[i] / fac;
  return a;
}

// p-value from 1 - W: exact for n = 3, otherwise Royston's normalising transformation of
// log(1 - W) (AS R94; for n <= 11 through -log(gamma - log(1 - W))).
double p_value_of(double one_minus_w, std::size_t n) {
  const double nd = static_cast<double>(n);
  if (n == 3) {
    // Exact for n = 3: p = (6/pi) (asin(sqrt(W)) - asin(sqrt(3/4))).
    constexpr double pi = 3.14159265358979323846;
    return std::max(0.0, 6 / pi * (std::asin(std::sqrt(1 - one_minus_w)) - pi / 3));
  }
  if (!(one_minus_w > 0)) return 1.0;
  double y = std::log(one_minus_w);
  double mu, sigma;
  if (n <= 11) {
    const double gamma = polynomial(g, nd);
    // Beyond the range of the transformation: W is so small that p is negligible.
    if (y >= gamma) return 1e-99;
    y = -std::log(gamma - y);
    mu = polynomial(c3, nd);
    sigma = std::exp(polynomial(c4, nd));
  } else {
    const double log_n = std::log(nd);
    mu = polynomial(c5, log_n);
    sigma = std::exp(polynomial(c6, log_n));
  }
  return boost::math::cdf(boost::math::complement(detail::normal(mu, sigma), y));
}

}  // namespace

shapiro_wilk_result shapiro_wilk(std::span<const double> sample) {
  shapiro_wilk_result out;
  const std::size_t n = sample.size();
  out.n = n;
  if (n < 3 || n > 5000) return out;
  std::vector<double> x(sample.begin(), sample.end());
  std::sort(x.begin(), x.end());
  const double range = x.back() - x.front();
  if (!(range > 0) || !std::isfinite(range)) return out;
  const auto half_coefficients = coefficients(n);
  // Full coefficient for the order statistic at ascending position i.
  auto coefficient = [&](std::size_t i) {
    const std::size_t j = n - 1 - i;
    if (i == j) return 0.0;
    return i < j ? -half_coefficients[i] : half_coefficients[j];
  };
  // W as the squared correlation of the data (scaled by the range) with the coefficients, and
  // 1 - W computed directly so that W near 1 keeps its digits (AS R94).
  double mean_x = 0, mean_a = 0;
  for (std::size_t i = 0; i < n; ++i) {
    mean_x += x[i] / range;
    mean_a += coefficient(i);
  }
  const double nd = static_cast<double>(n);
  mean_x /= nd;
  mean_a /= nd;
  double ssa = 0, ssx = 0, sax = 0;
  for (std::size_t i = 0; i < n; ++i) {
    const double da = coefficient(i) - mean_a;
    const double dx = x[i] / range - mean_x;
    ssa += da * da;
    ssx += dx * dx;
    sax += da * dx;
  }
  const double root = std::sqrt(ssa * ssx);
  const double one_minus_w = (root - sax) * (root + sax) / (ssa * ssx);
  out.w = 1 - one_minus_w;
  out.p_value = p_value_of(one_minus_w, n);
  return out;
}

double shapiro_wilk_p_value(double w, std::size_t n) {
  if (n < 3 || n > 5000 || !(w > 0 && w <= 1)) return not_available;
  return p_value_of(1 - w, n);
}

}  // namespace contrasta
