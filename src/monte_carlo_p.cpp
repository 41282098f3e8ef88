#include "monte_carlo_p.hpp"

#include "distributions.hpp"

namespace contrasta::detail {

double phipson_smyth_p(std::uint64_t b, std::uint64_t m) {
  return (static_cast<double>(b) + 1.0) / (static_cast<double>(m) + 1.0);
}

std::array<double, 2> clopper_pearson(std::uint64_t b, std::uint64_t m, double level) {
  const double tail = (1.0 - level) / 2.0;
  const auto x = static_cast<double>(b), n = static_cast<double>(m);
  double low = 0, high = 1;
  if (b > 0) low = boost::math::quantile(beta(x, n - x + 1.0), tail);
  if (b < m) high = boost::math::quantile(boost::math::complement(beta(x + 1.0, n - x), tail));
  return {low, high};
}

}  // namespace contrasta::detail
