#include "contrasta/orthogonality.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace contrasta {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

// sum c_i d_i / n_i over the levels; NaN when a level with a non-zero product has n = 0.
double weighted_inner(const contrast& a, const contrast& b, std::span<const std::size_t> n) {
  double s = 0;
  for (std::size_t i = 0; i < n.size() && i < a.coefficients.size() && i < b.coefficients.size(); ++i) {
    double product = a.coefficients[i] * b.coefficients[i];
    if (product == 0) continue;
    if (n[i] == 0) return nan;
    s += product / static_cast<double>(n[i]);
  }
  return s;
}

// A contrast with the levels it involves: weighted_inner over a pair of contrasts visits only
// the levels where both coefficients are non-zero, in increasing order, so walking the shorter
// list of involved levels gives the same terms in the same order (all-pairs families of many
// levels have a million pairs, each involving two levels).
struct sparse_contrast {
  const contrast* c = nullptr;
  std::vector<std::size_t> involved;  // levels below the usable length with a non-zero coefficient
  bool finite = true;                 // with a non-finite coefficient, 0 * inf forces the full walk
  double self = 0;                    // weighted_inner(c, c, n)
};

sparse_contrast sparse_of(const contrast& c, std::span<const std::size_t> n) {
  sparse_contrast s;
  s.c = &c;
  for (std::size_t i = 0; i < n.size() && i < c.coefficients.size(); ++i) {
    if (!std::isfinite(c.coefficients[i])) s.finite = false;
    if (c.coefficients[i] != 0) s.involved.push_back(i);
  }
  s.self = weighted_inner(c, c, n);
  return s;
}

double sparse_inner(const sparse_contrast& a, const sparse_contrast& b, std::span<const std::size_t> n) {
  if (!a.finite || !b.finite) return weighted_inner(*a.c, *b.c, n);
  const auto& walk = a.involved.size() <= b.involved.size() ? a.involved : b.involved;
  const std::size_t length = std::min(a.c->coefficients.size(), b.c->coefficients.size());
  double s = 0;
  for (std::size_t i : walk) {
    if (i >= length) break;
    double product = a.c->coefficients[i] * b.c->coefficients[i];
    if (product == 0) continue;
    if (n[i] == 0) return nan;
    s += product / static_cast<double>(n[i]);
  }
  return s;
}

bool sums_to_zero(const contrast& c) {
  double sum = 0, scale = 0;
  for (double x : c.coefficients) {
    sum += x;
    scale += std::abs(x);
  }
  return scale > 0 && std::abs(sum) <= 1e-9 * scale;
}

}  // namespace

double design_correlation(const contrast& a, const contrast& b, std::span<const std::size_t> n) {
  double ab = weighted_inner(a, b, n), aa = weighted_inner(a, a, n), bb = weighted_inner(b, b, n);
  return ab / std::sqrt(aa * bb);
}

bool orthogonal_for_design(const contrast& a, const contrast& b, std::span<const std::size_t> n) {
  double r = design_correlation(a, b, n);
  return std::isfinite(r) && std::abs(r) <= 1e-9;
}

orthogonality_report orthogonality(const prepared_data& p, const std::vector<contrast>& contrasts) {
  orthogonality_report out;
  std::vector<std::size_t> n;
  std::size_t populated = 0;
  for (const auto& g : p.groups) {
    n.push_back(g.n);
    populated += g.n > 0;
  }
  out.ss_between = p.anova.ss_between;
  std::vector<std::size_t> proper;  // contrasts whose coefficients sum to zero
  for (std::size_t i = 0; i < contrasts.size(); ++i)
    if (sums_to_zero(contrasts[i])) proper.push_back(i);
  std::vector<sparse_contrast> sparse;
  for (std::size_t i : proper) sparse.push_back(sparse_of(contrasts[i], n));
  for (std::size_t a = 0; a < proper.size(); ++a)
    for (std::size_t b = a + 1; b < proper.size(); ++b) {
      // design_correlation and orthogonal_for_design, with the self terms computed once.
      const double r = sparse_inner(sparse[a], sparse[b], n) / std::sqrt(sparse[a].self * sparse[b].self);
      if (!(std::isfinite(r) && std::abs(r) <= 1e-9)) {
        out.mutually_orthogonal = false;
        out.non_orthogonal_pairs.emplace_back(proper[a], proper[b]);
        out.non_orthogonal_correlations.push_back(r);
      }
    }
  for (std::size_t i : proper) {
    const auto& c = contrasts[i];
    contrast_sum_of_squares s;
    s.name = c.name;
    // psi on the centred means: the centre cancels because sum c_i = 0.
    double psi = 0;
    for (std::size_t j = 0; j < c.coefficients.size(); ++j)
      if (c.coefficients[j] != 0) psi += c.coefficients[j] * (n[j] > 0 ? p.groups[j].centred_mean : nan);
    s.estimate = psi;
    s.sum_of_squares = psi * psi / weighted_inner(c, c, n);  // SS_c = psi^2 / sum c_i^2/n_i
    s.share = s.sum_of_squares / out.ss_between;
    out.ss_contrasts += s.sum_of_squares;
    out.sums_of_squares.push_back(s);
  }
  if (out.mutually_orthogonal) {
    out.ss_remainder = out.ss_between - out.ss_contrasts;
    out.complete = populated >= 2 && proper.size() == populated - 1;
  } else {
    out.ss_remainder = nan;
  }
  return out;
}

}  // namespace contrasta
