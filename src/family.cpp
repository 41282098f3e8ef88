#include "contrasta/family.hpp"

#include <cctype>

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

}  // namespace

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
  (void)n;
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
  throw usage_error("--family '" + std::string(kind) +
                    "' is not known; use all-pairs, versus=LEVEL, helmert, trend[=x1,x2,...], adjacent or grand-mean");
}

}  // namespace contrasta
