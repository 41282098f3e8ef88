#include "contrasta/multiplicity.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

#include "contrasta/error.hpp"

namespace contrasta {

const std::vector<std::string>& adjustment_names() {
  static const std::vector<std::string> names = {"none", "bonferroni", "holm", "sidak", "hochberg", "bh", "by",
                                                 "scheffe", "tukey", "games-howell", "dunnett", "maxt"};
  return names;
}

std::vector<double> adjust_p_values(std::span<const double> p, std::string_view method) {
  const std::size_t m = p.size();
  std::vector<double> out(p.begin(), p.end());
  if (m == 0 || method == "none") return out;
  const double mm = static_cast<double>(m);
  std::vector<std::size_t> order(m);
  std::iota(order.begin(), order.end(), 0);
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return p[a] < p[b]; });
  auto clip = [](double x) { return std::min(1.0, x); };
  if (method == "bonferroni") {
    for (auto& x : out) x = clip(x * mm);
  } else if (method == "sidak") {
    // 1 - (1 - p)^m, computed as -expm1(m log1p(-p)) to keep small p exact.
    for (auto& x : out) x = -std::expm1(mm * std::log1p(-x));
  } else if (method == "holm") {
    double running = 0;
    for (std::size_t r = 0; r < m; ++r) {
      running = std::max(running, clip((mm - static_cast<double>(r)) * p[order[r]]));
      out[order[r]] = running;
    }
  } else if (method == "hochberg" || method == "bh" || method == "by") {
    double harmonic = 0;
    for (std::size_t i = 1; i <= m; ++i) harmonic += 1.0 / static_cast<double>(i);
    double running = 1;
    for (std::size_t r = m; r-- > 0;) {
      double rank = static_cast<double>(r + 1), x = p[order[r]];
      double candidate = method == "hochberg" ? (mm - rank + 1) * x
                         : method == "bh"     ? x * mm / rank
                                              : x * mm * harmonic / rank;
      running = std::min(running, clip(candidate));
      out[order[r]] = running;
    }
  } else {
    throw usage_error("adjustment '" + std::string(method) + "' is not a p-value adjustment");
  }
  return out;
}

namespace {
std::string protects_text(std::string_view method) {
  if (method == "none") return "nothing: each p-value stands alone; the chance of at least one false finding grows with the number of contrasts";
  if (method == "bh") return "the false discovery rate (expected share of false findings among the findings), for independent or positively dependent tests (Benjamini & Hochberg 1995)";
  if (method == "by") return "the false discovery rate under any dependence (Benjamini & Yekutieli 2001)";
  if (method == "hochberg") return "the familywise error rate over the contrasts of this run, for independent or positively dependent tests (Hochberg 1988)";
  if (method == "sidak") return "the familywise error rate over the contrasts of this run, for independent or positively dependent tests (Sidak 1967)";
  if (method == "holm") return "the familywise error rate over the contrasts of this run, under any dependence (Holm 1979)";
  return "the familywise error rate over the contrasts of this run, under any dependence (Bonferroni)";
}
}  // namespace

adjustment_summary adjust_family(std::vector<contrast_result>& family, std::string_view method,
                                 const prepared_data& p, const analysis_options& o) {
  (void)p;
  (void)o;
  adjustment_summary s;
  s.method = std::string(method);
  s.family_size = family.size();
  if (std::find(adjustment_names().begin(), adjustment_names().end(), method) == adjustment_names().end())
    throw usage_error("--adjust '" + std::string(method) + "' is not known; use none, bonferroni, holm, sidak, hochberg, bh, by, scheffe, tukey, games-howell, dunnett or maxt");
  std::string_view stepwise = method;
  if (method == "scheffe" || method == "tukey" || method == "games-howell" || method == "dunnett" || method == "maxt")
    throw analysis_error("--adjust " + std::string(method) + " is not available in this build yet; use holm");
  s.protects = protects_text(stepwise);
  if (family.empty()) return s;
  // One family per method: the contrasts of this run under that method.
  std::vector<std::string> names;
  for (const auto& c : family)
    for (const auto& r : c.results)
      if (std::find(names.begin(), names.end(), r.method) == names.end()) names.push_back(r.method);
  for (const auto& name : names) {
    std::vector<double> raw;
    std::vector<method_result*> where;
    for (auto& c : family)
      for (auto& r : c.results)
        if (r.method == name) {
          r.p_adjusted = r.p_value;
          if (!std::isnan(r.p_value)) {
            raw.push_back(r.p_value);
            where.push_back(&r);
          }
        }
    auto adjusted = adjust_p_values(raw, stepwise);
    for (std::size_t i = 0; i < where.size(); ++i) where[i]->p_adjusted = adjusted[i];
  }
  return s;
}

}  // namespace contrasta
