#include "contrasta/family.hpp"

#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdio>

#include "contrasta/error.hpp"

namespace contrasta {
namespace {

// A level as it must be written in an expression: bare when it is a plain identifier.
std::string reference(const std::string& level) {
  bool plain = !level.empty() && !std::isdigit(static_cast<unsigned char>(level[0]));
  for (char c : level) {
    unsigned char u = static_cast<unsigned char>(c);
    if (!(std::isalnum(u) || c == '_' || c == '.' || u >= 0x80)) plain = false;
  }
  return plain ? level : "[" + level + "]";
}

contrast difference(const std::vector<std::string>& levels, std::size_t plus, std::size_t minus) {
  contrast c;
  c.coefficients.assign(levels.size(), 0.0);
  c.coefficients[plus] = 1;
  c.coefficients[minus] = -1;
  c.expression = reference(levels[plus]) + " - " + reference(levels[minus]);
  c.name = c.expression;
  return c;
}

std::string mean_of(const std::vector<std::string>& levels, std::size_t from, std::size_t to) {
  if (to - from == 1) return reference(levels[from]);
  std::string s = "(";
  for (std::size_t j = from; j < to; ++j) s += (j > from ? " + " : "") + reference(levels[j]);
  return s + ")/" + std::to_string(to - from);
}

// Reads "x1,x2,..." (the trend spacing) as numbers.
std::vector<double> parse_spacing(const std::string& text, std::string_view kind) {
  std::vector<double> out;
  std::size_t from = 0;
  while (from <= text.size()) {
    std::size_t to = text.find(',', from);
    if (to == std::string::npos) to = text.size();
    std::string item = text.substr(from, to - from);
    while (!item.empty() && item.front() == ' ') item.erase(item.begin());
    while (!item.empty() && item.back() == ' ') item.pop_back();
    double v = 0;
    auto [end, ec] = std::from_chars(item.data(), item.data() + item.size(), v);
    if (item.empty() || ec != std::errc() || end != item.data() + item.size() || !std::isfinite(v))
      throw usage_error("--family " + std::string(kind) + ": '" + item +
                        "' is not a number; give one level value per level, e.g. trend=0,10,20,40");
    out.push_back(v);
    from = to + 1;
  }
  return out;
}

// The level values of a trend: given, or read from the level names when every name is a
// number (doses such as 0, 10, 20, 40), or else equally spaced 1, 2, ..., k.
std::vector<double> trend_values(const std::string& argument, std::string_view kind,
                                 const std::vector<std::string>& levels) {
  const std::size_t k = levels.size();
  std::vector<double> x;
  if (!argument.empty()) {
    x = parse_spacing(argument, kind);
    if (x.size() != k)
      throw analysis_error("--family " + std::string(kind) + " gives " + std::to_string(x.size()) +
                           " level values for " + std::to_string(k) + " levels; give one value per level in level order");
  } else {
    for (const auto& level : levels) {
      double v = 0;
      auto [end, ec] = std::from_chars(level.data(), level.data() + level.size(), v);
      if (ec != std::errc() || end != level.data() + level.size() || !std::isfinite(v)) {
        x.clear();
        break;
      }
      x.push_back(v);
    }
    if (x.empty())
      for (std::size_t i = 0; i < k; ++i) x.push_back(static_cast<double>(i + 1));
  }
  for (std::size_t i = 0; i < k; ++i)
    for (std::size_t j = i + 1; j < k; ++j)
      if (x[i] == x[j])
        throw analysis_error("--family " + std::string(kind) + ": levels '" + levels[i] + "' and '" + levels[j] +
                             "' have the same value; a trend needs distinct level values");
  return x;
}

std::string trend_name(std::size_t degree) {
  static const char* names[] = {"", "linear", "quadratic", "cubic", "quartic", "quintic"};
  if (degree < 6) return names[degree];
  return "degree " + std::to_string(degree);
}

std::string coefficient_text(double c) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.6g", c);
  return buffer;
}

// An expression that shows the coefficients, e.g. "-0.75*a - 0.25*b + 0.25*c + 0.75*d".
std::string linear_expression(const std::vector<std::string>& levels, const std::vector<double>& c) {
  std::string s;
  for (std::size_t i = 0; i < c.size(); ++i) {
    if (c[i] == 0) continue;
    double a = std::abs(c[i]);
    if (s.empty()) s += c[i] < 0 ? "-" : "";
    else s += c[i] < 0 ? " - " : " + ";
    s += coefficient_text(a) + "*" + reference(levels[i]);
  }
  return s;
}

}  // namespace

std::vector<std::vector<double>> orthogonal_polynomial_contrasts(std::span<const double> x, std::span<const double> weight) {
  const std::size_t k = x.size();
  std::size_t positive = 0;
  double mean = 0, total = 0, lo = HUGE_VAL, hi = -HUGE_VAL;
  for (std::size_t i = 0; i < k; ++i) {
    if (weight[i] > 0) {
      ++positive;
      mean += weight[i] * x[i];
      total += weight[i];
      lo = std::min(lo, x[i]);
      hi = std::max(hi, x[i]);
    }
  }
  std::vector<std::vector<double>> out;
  if (positive < 2) return out;
  mean /= total;
  // Centred and scaled level values keep the powers well conditioned.
  std::vector<double> u(k);
  for (std::size_t i = 0; i < k; ++i) u[i] = (x[i] - mean) / (hi - lo);
  auto inner = [&](const std::vector<double>& a, const std::vector<double>& b) {
    double s = 0;
    for (std::size_t i = 0; i < k; ++i) s += weight[i] * a[i] * b[i];
    return s;
  };
  // Gram-Schmidt in the weighted inner product sum w_i a_i b_i, applied twice per column
  // (the "twice is enough" re-orthogonalisation), starting from the constant.
  std::vector<std::vector<double>> basis = {std::vector<double>(k, 1.0)};
  for (std::size_t degree = 1; degree < positive; ++degree) {
    std::vector<double> v(k);
    for (std::size_t i = 0; i < k; ++i) v[i] = basis.back()[i] * u[i];
    for (int pass = 0; pass < 2; ++pass)
      for (const auto& b : basis) {
        double f = inner(v, b) / inner(b, b);
        for (std::size_t i = 0; i < k; ++i) v[i] -= f * b[i];
      }
    basis.push_back(v);
    // Contrast coefficients: the polynomial itself (unit weights) or n_i times it (weights
    // n_i), so that sum c_i = 0 and sum c_i c'_i / n_i = 0 hold in the inner product used.
    std::vector<double> c(k);
    double scale = 0, largest = 0;
    for (std::size_t i = 0; i < k; ++i) {
      c[i] = weight[i] * v[i];
      largest = std::max(largest, std::abs(c[i]));
    }
    for (auto& ci : c) {
      if (std::abs(ci) < 1e-12 * largest) ci = 0;  // exact zeros stay zero (middle of a symmetric design)
      scale += std::abs(ci);
    }
    // Normalised to sum |c_i| = 2 (a difference between two weighted averages of means) with
    // a positive coefficient on the last level, so a rising trend has a positive estimate.
    double sign = 1;
    for (std::size_t i = k; i-- > 0;)
      if (c[i] != 0) {
        sign = c[i] > 0 ? 1 : -1;
        break;
      }
    for (auto& ci : c) ci *= 2 * sign / scale;
    out.push_back(c);
  }
  return out;
}

std::vector<contrast> all_pairs(const std::vector<std::string>& levels) {
  // Beyond a few hundred levels "all pairs" is no longer a question anyone asks of a trial, and
  // the family would not fit in memory for a million levels.
  constexpr std::size_t max_levels = 300;
  if (levels.size() > max_levels)
    throw analysis_error(std::to_string(levels.size()) + " levels give " +
                         std::to_string(levels.size() * (levels.size() - 1) / 2) +
                         " pairs; name the contrasts with -c, or use --family versus=LEVEL (check that --group names the treatment column)");
  std::vector<contrast> out;
  for (std::size_t i = 0; i < levels.size(); ++i)
    for (std::size_t j = i + 1; j < levels.size(); ++j) out.push_back(difference(levels, i, j));
  return out;
}

std::vector<contrast> make_family(std::string_view kind, const std::vector<std::string>& levels,
                                  const std::vector<std::size_t>& n) {
  const std::size_t k = levels.size();
  if (k < 2) throw analysis_error("a family of contrasts needs at least two levels");
  std::string name(kind), argument;
  if (auto eq = name.find('='); eq != std::string::npos) {
    argument = name.substr(eq + 1);
    name = name.substr(0, eq);
  }
  std::vector<contrast> out;
  if (name == "all-pairs") return all_pairs(levels);
  if (name == "versus") {
    std::size_t base = k;
    for (std::size_t i = 0; i < k; ++i)
      if (levels[i] == argument) base = i;
    if (base == k)
      throw analysis_error("--family versus=" + argument + ": no level named '" + argument +
                           "'; give the reference level, e.g. versus=" + levels[0]);
    for (std::size_t i = 0; i < k; ++i)
      if (i != base) out.push_back(difference(levels, i, base));
    return out;
  }
  if (name == "adjacent") {
    for (std::size_t i = 0; i + 1 < k; ++i) out.push_back(difference(levels, i + 1, i));
    return out;
  }
  if (name == "helmert") {
    // Each level against the mean of the levels after it (k - 1 mutually orthogonal contrasts
    // when the groups are of equal size).
    for (std::size_t i = 0; i + 1 < k; ++i) {
      contrast c;
      c.coefficients.assign(k, 0.0);
      c.coefficients[i] = 1;
      for (std::size_t j = i + 1; j < k; ++j) c.coefficients[j] = -1.0 / static_cast<double>(k - i - 1);
      c.expression = reference(levels[i]) + " - " + mean_of(levels, i + 1, k);
      c.name = c.expression;
      out.push_back(c);
    }
    return out;
  }
  if (name == "grand-mean") {
    for (std::size_t i = 0; i < k; ++i) {
      contrast c;
      c.coefficients.assign(k, -1.0 / static_cast<double>(k));
      c.coefficients[i] += 1;
      c.expression = reference(levels[i]) + " - mean of all levels";
      c.name = reference(levels[i]) + " - grand mean";
      out.push_back(c);
    }
    return out;
  }
  if (name == "trend" || name == "trend-weighted") {
    const bool weighted = name == "trend-weighted";
    auto x = trend_values(argument, kind, levels);
    std::vector<double> w(k, 1.0);
    if (weighted) {
      if (n.size() != k) throw analysis_error("--family trend-weighted needs the group sizes");
      for (std::size_t i = 0; i < k; ++i) w[i] = static_cast<double>(n[i]);
    }
    auto sets = orthogonal_polynomial_contrasts(x, w);
    if (sets.empty()) throw analysis_error("--family " + std::string(kind) + " needs at least two levels with observations");
    for (std::size_t d = 0; d < sets.size(); ++d) {
      contrast c;
      c.coefficients = sets[d];
      c.name = trend_name(d + 1) + (weighted ? " (n-weighted)" : "");
      c.expression = linear_expression(levels, c.coefficients);
      out.push_back(c);
    }
    return out;
  }
  throw usage_error("--family '" + std::string(kind) +
                    "' is not known; use all-pairs, versus=LEVEL, helmert, trend[=x1,x2,...], trend-weighted[=x1,x2,...], adjacent or grand-mean");
}

}  // namespace contrasta
