#include "distributions.hpp"

#include <cmath>
#include <limits>

namespace contrasta::detail {

double t_upper_tail(double t, double df) {
  if (std::isnan(t) || std::isnan(df) || df <= 0) return std::numeric_limits<double>::quiet_NaN();
  if (std::isinf(t)) return t > 0 ? 0.0 : 1.0;
  if (std::isinf(df)) return boost::math::cdf(boost::math::complement(normal(0, 1), t));
  return boost::math::cdf(boost::math::complement(students_t(df), t));
}

double t_quantile(double prob, double df) {
  if (std::isnan(prob) || std::isnan(df) || df <= 0) return std::numeric_limits<double>::quiet_NaN();
  if (std::isinf(df)) return boost::math::quantile(normal(0, 1), prob);
  return boost::math::quantile(students_t(df), prob);
}

double t_p_value(double t, double df, int side) {
  if (std::isnan(t)) return std::numeric_limits<double>::quiet_NaN();
  if (side > 0) return t_upper_tail(t, df);
  if (side < 0) return t_upper_tail(-t, df);
  return std::min(1.0, 2 * t_upper_tail(std::abs(t), df));
}

}  // namespace contrasta::detail
