#include "contrasta/multiplicity.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <optional>
#include <cstdio>

#include "contrasta/dunnett.hpp"
#include "contrasta/error.hpp"
#include "contrasta/resample.hpp"
#include "contrasta/studentized_range.hpp"
#include "distributions.hpp"

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

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

std::string protects_stepwise(std::string_view method) {
  if (method == "none") return "nothing: each p-value stands alone; the chance of at least one false finding grows with the number of contrasts";
  if (method == "bh") return "the false discovery rate (expected share of false findings among the findings) over the contrasts of this run, for independent or positively dependent tests (Benjamini & Hochberg 1995)";
  if (method == "by") return "the false discovery rate over the contrasts of this run, under any dependence (Benjamini & Yekutieli 2001)";
  if (method == "hochberg") return "the familywise error rate over the contrasts of this run, for independent or positively dependent tests (Hochberg 1988)";
  if (method == "sidak") return "the familywise error rate over the contrasts of this run, for independent or positively dependent tests (Sidak 1967)";
  if (method == "holm") return "the familywise error rate over the contrasts of this run, under any dependence (Holm 1979)";
  return "the familywise error rate over the contrasts of this run, under any dependence (Bonferroni)";
}

// The results of one method across the family, in contrast order (absent where the method did
// not apply to a contrast).
struct method_family {
  std::string method;
  std::vector<std::size_t> contrast_index;
  std::vector<method_result*> results;
};

std::vector<method_family> by_method(std::vector<contrast_result>& family) {
  std::vector<method_family> out;
  for (std::size_t c = 0; c < family.size(); ++c)
    for (auto& r : family[c].results) {
      auto it = std::find_if(out.begin(), out.end(), [&](const method_family& m) { return m.method == r.method; });
      if (it == out.end()) {
        out.push_back({r.method, {}, {}});
        it = out.end() - 1;
      }
      it->contrast_index.push_back(c);
      it->results.push_back(&r);
    }
  return out;
}

void stepwise(const method_family& m, std::string_view method) {
  std::vector<double> raw;
  std::vector<method_result*> where;
  for (auto* r : m.results) {
    r->p_adjusted = r->p_value;
    if (!std::isnan(r->p_value)) {
      raw.push_back(r->p_value);
      where.push_back(r);
    }
  }
  auto adjusted = adjust_p_values(raw, method);
  for (std::size_t i = 0; i < where.size(); ++i) where[i]->p_adjusted = adjusted[i];
}

// Methods a family procedure does not cover get Holm's adjustment, and say so.
void holm_instead(const method_family& m, const std::string& why) {
  stepwise(m, "holm");
  for (auto* r : m.results) r->notes.push_back("adjusted by Holm instead: " + why);
}

bool t_based(const method_result& r) { return r.df.has_value() && r.statistic_name == "t"; }

void require_two_sided(std::string_view method, const analysis_options& o) {
  if (o.side != alternative::two_sided)
    throw analysis_error("--adjust " + std::string(method) +
                         " is a two-sided procedure; with --alternative greater or less use --adjust dunnett (many-to-one), maxt or holm");
}

std::size_t populated_levels(const prepared_data& p) {
  std::size_t k = 0;
  for (const auto& g : p.groups) k += g.n > 0;
  return k;
}

// Scheffe 1953: every contrast among r + 1 levels at once; critical |t| = sqrt(r F_{r, df}).
// For Welch and Yuen results the contrast's own approximate df is used (Brown & Forsythe 1974,
// Biometrics 30:719-724).
void scheffe(const method_family& m, double r, const analysis_options& o) {
  for (auto* res : m.results) {
    res->p_adjusted = nan;
    if (std::isnan(res->statistic) || !res->df) continue;
    detail::fisher_f f(r, *res->df);
    res->p_adjusted = std::min(1.0, cdf(complement(f, res->statistic * res->statistic / r)));
    double critical = std::sqrt(r * quantile(f, o.conf));
    res->simultaneous_low = res->estimate - critical * res->se;
    res->simultaneous_high = res->estimate + critical * res->se;
  }
}

// Tukey-Kramer (pooled) and Games-Howell (Welch): q = sqrt(2) |t| on the studentized range of
// k levels with the result's df (Tukey 1953; Kramer 1956; Games & Howell 1976). The
// simultaneous interval is estimate +- q_crit / sqrt(2) SE.
void studentized_range_family(const method_family& m, double k, const analysis_options& o) {
  double cached_df = nan, cached_critical = nan;
  for (auto* res : m.results) {
    res->p_adjusted = nan;
    if (std::isnan(res->statistic) || !res->df) continue;
    double df = *res->df;
    res->p_adjusted = studentized_range_sf(std::sqrt(2.0) * std::abs(res->statistic), k, df);
    if (!(df == cached_df)) {
      cached_df = df;
      cached_critical = studentized_range_critical(1 - o.conf, k, df);
    }
    double half = cached_critical / std::sqrt(2.0) * res->se;
    res->simultaneous_low = res->estimate - half;
    res->simultaneous_high = res->estimate + half;
  }
}

// The levels of a family of pairwise differences; throws unless every contrast is a pair.
std::vector<std::size_t> pair_levels(const std::vector<contrast_result>& family, std::string_view method) {
  std::vector<std::size_t> levels;
  for (const auto& c : family) {
    if (!c.spec.is_pair())
      throw analysis_error("--adjust " + std::string(method) + " applies to pairwise differences (a - b), but contrast '" +
                           c.spec.name + "' is not one; use --adjust scheffe for general contrasts, or holm");
    auto [a, b] = c.spec.two_levels();
    for (auto l : {a, b})
      if (std::find(levels.begin(), levels.end(), l) == levels.end()) levels.push_back(l);
  }
  return levels;
}

struct many_to_one {
  std::size_t control = 0;
  std::vector<std::size_t> treatment;  // per contrast
  std::vector<double> orientation;     // +1 for treatment - control, -1 for control - treatment
};

many_to_one many_to_one_family(const std::vector<contrast_result>& family, const prepared_data& p) {
  auto fail = [&](const std::string& why) {
    throw analysis_error("--adjust dunnett needs a many-to-one family (each level against one reference level): " + why +
                         "; use --family versus=LEVEL");
  };
  for (const auto& c : family)
    if (!c.spec.is_pair()) fail("contrast '" + c.spec.name + "' is not a difference of two levels");
  many_to_one out;
  auto [a0, b0] = family.front().spec.two_levels();
  if (family.size() == 1) {
    out.control = b0;
  } else {
    auto [a1, b1] = family[1].spec.two_levels();
    if (a0 == a1 || a0 == b1) out.control = a0;
    else if (b0 == a1 || b0 == b1) out.control = b0;
    else fail("contrasts '" + family[0].spec.name + "' and '" + family[1].spec.name + "' share no level");
  }
  for (const auto& c : family) {
    auto [a, b] = c.spec.two_levels();
    if (a != out.control && b != out.control) fail("contrast '" + c.spec.name + "' does not involve '" + p.groups[out.control].level + "'");
    std::size_t t = a == out.control ? b : a;
    if (std::find(out.treatment.begin(), out.treatment.end(), t) != out.treatment.end())
      fail("level '" + p.groups[t].level + "' appears twice");
    out.treatment.push_back(t);
    out.orientation.push_back(a == out.control ? -1.0 : 1.0);
  }
  return out;
}

// Dunnett 1955 for the pooled results: the joint distribution of the family's t statistics
// with correlations lambda_i lambda_j (signed by the orientation of each contrast).
void dunnett(const method_family& m, const many_to_one& design, const prepared_data& p, const analysis_options& o) {
  std::vector<double> lambda;
  const double n0 = static_cast<double>(p.groups[design.control].n);
  for (std::size_t c : m.contrast_index) {
    double n = static_cast<double>(p.groups[design.treatment[c]].n);
    lambda.push_back(design.orientation[c] * std::sqrt(n / (n + n0)));
  }
  if (m.results.empty()) return;
  const double df = m.results.front()->df.value_or(nan);
  const bool two_sided = o.side == alternative::two_sided;
  const double critical = dunnett_critical(1 - o.conf, lambda, df, two_sided);
  for (auto* res : m.results) {
    res->p_adjusted = nan;
    if (std::isnan(res->statistic)) continue;
    double t = res->statistic;
    if (two_sided) {
      res->p_adjusted = dunnett_sf(std::abs(t), lambda, df, true);
      res->simultaneous_low = res->estimate - critical * res->se;
      res->simultaneous_high = res->estimate + critical * res->se;
    } else if (o.side == alternative::greater) {
      res->p_adjusted = dunnett_sf(t, lambda, df, false);
      res->simultaneous_low = res->estimate - critical * res->se;
      res->simultaneous_high = std::numeric_limits<double>::infinity();
    } else {
      res->p_adjusted = dunnett_sf(-t, lambda, df, false);
      res->simultaneous_low = -std::numeric_limits<double>::infinity();
      res->simultaneous_high = res->estimate + critical * res->se;
    }
    // Never below the raw p-value (rounding of the integrals at p near 1 aside).
    res->p_adjusted = std::min(1.0, std::max(res->p_adjusted, res->p_value));
  }
}

// Westfall & Young 1993 (algorithms 2.5 and 2.8): adjusted p-values from the joint null
// distribution of the family's statistics. Single step: p_j = P(max_l T*_l >= T_j). Step-down:
// contrasts in decreasing order of T, each against the maximum over itself and the contrasts
// after it, then made monotone. T = |t| two-sided, t for greater, -t for less. Monte Carlo
// counts become (b + 1) / (R + 1) (Phipson & Smyth 2010); exact enumeration gives b / R.
struct max_t_result {
  std::vector<double> single_step, step_down;
  double critical = nan;  // (conf) quantile of max_l T*_l: the single-step simultaneous bound
};

max_t_result max_t(const joint_resampling& joint, const analysis_options& o) {
  const std::size_t m = joint.contrast_count();
  const std::uint64_t rows = joint.resamples;
  auto oriented = [&](double t) {
    if (o.side == alternative::two_sided) return std::abs(t);
    return o.side == alternative::greater ? t : -t;
  };
  std::vector<double> observed(m);
  for (std::size_t j = 0; j < m; ++j) observed[j] = oriented(joint.observed[j]);
  // Ties with the observed value up to rounding count as at least as extreme (methods.md, 2).
  auto reaches = [](double x, double t) { return x >= t - 1e-12 * std::abs(t); };
  std::vector<std::size_t> order(m);
  std::iota(order.begin(), order.end(), 0);
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return observed[a] > observed[b]; });
  std::vector<std::uint64_t> single(m, 0), down(m, 0);
  std::vector<double> maxima(rows);
  for (std::uint64_t r = 0; r < rows; ++r) {
    auto row = joint.row(r);
    double running = -std::numeric_limits<double>::infinity();
    for (std::size_t i = m; i-- > 0;) {
      const std::size_t j = order[i];
      double x = oriented(row[j]);
      if (!std::isnan(x)) running = std::max(running, x);
      if (reaches(running, observed[j])) ++down[i];
    }
    maxima[r] = running;
  }
  for (std::uint64_t r = 0; r < rows; ++r)
    for (std::size_t j = 0; j < m; ++j)
      if (reaches(maxima[r], observed[j])) ++single[j];
  auto to_p = [&](std::uint64_t b) {
    return joint.exact ? static_cast<double>(b) / static_cast<double>(rows)
                       : (static_cast<double>(b) + 1) / (static_cast<double>(rows) + 1);
  };
  max_t_result out;
  out.single_step.resize(m);
  out.step_down.resize(m);
  for (std::size_t j = 0; j < m; ++j) out.single_step[j] = std::min(1.0, to_p(single[j]));
  double monotone = 0;
  for (std::size_t i = 0; i < m; ++i) {
    monotone = std::max(monotone, std::min(1.0, to_p(down[i])));
    out.step_down[order[i]] = monotone;
  }
  if (rows > 0) {
    std::sort(maxima.begin(), maxima.end());
    auto at = static_cast<std::size_t>(std::ceil(o.conf * static_cast<double>(rows))) ;
    out.critical = maxima[std::min<std::size_t>(rows - 1, at == 0 ? 0 : at - 1)];
  }
  return out;
}

// The Welch standard error of a contrast, sqrt(sum c_i^2 s_i^2 / n_i): the studentizing scale
// of the joint bootstrap statistics.
double welch_se(const prepared_data& p, const contrast& c) {
  double v = 0;
  for (std::size_t i : c.involved())
    v += c.coefficients[i] * c.coefficients[i] * p.groups[i].variance / static_cast<double>(p.groups[i].n);
  return std::sqrt(v);
}

void apply_max_t(const method_family& m, const joint_resampling& joint, const std::vector<contrast_result>& family,
                 const prepared_data& p, const analysis_options& o, bool bootstrap) {
  const auto adjusted = max_t(joint, o);
  const std::string source = bootstrap ? "joint bootstrap resamples" : (joint.exact ? "reassignments (all enumerated)" : "joint permutations");
  for (std::size_t i = 0; i < m.results.size(); ++i) {
    auto* res = m.results[i];
    const std::size_t j = m.contrast_index[i];
    res->p_adjusted = nan;
    if (std::isnan(res->p_value)) continue;
    // Never below the result's own p-value: the joint permutation reassigns the levels of the
    // whole family, a different null from the contrast's own test.
    res->p_adjusted = std::max(adjusted.step_down[j], res->p_value);
    char text[200];
    std::snprintf(text, sizeof text, "max-T step-down over %zu contrasts from %llu %s; single-step adjusted p = %.4g",
                  joint.contrast_count(), static_cast<unsigned long long>(joint.resamples), source.c_str(),
                  std::max(adjusted.single_step[j], res->p_value));
    res->notes.push_back(text);
    if (bootstrap && std::isfinite(adjusted.critical)) {
      // Simultaneous bootstrap-t bounds from the distribution of the largest studentized
      // deviation (Westfall & Young 1993, ch. 2; Davison & Hinkley 1997, 5.2).
      double se = welch_se(p, family[j].spec);
      if (o.side != alternative::less) res->simultaneous_low = res->estimate - adjusted.critical * se;
      else res->simultaneous_low = -std::numeric_limits<double>::infinity();
      if (o.side != alternative::greater) res->simultaneous_high = res->estimate + adjusted.critical * se;
      else res->simultaneous_high = std::numeric_limits<double>::infinity();
    }
  }
}

std::string join_levels(const prepared_data& p, const std::vector<std::size_t>& levels) {
  std::string s;
  for (auto l : levels) s += (s.empty() ? "" : ", ") + p.groups[l].level;
  return s;
}

}  // namespace

adjustment_summary adjust_family(std::vector<contrast_result>& family, std::string_view method,
                                 const prepared_data& p, const analysis_options& o) {
  adjustment_summary s;
  s.method = std::string(method);
  s.family_size = family.size();
  if (std::find(adjustment_names().begin(), adjustment_names().end(), method) == adjustment_names().end())
    throw usage_error("--adjust '" + std::string(method) + "' is not known; use none, bonferroni, holm, sidak, hochberg, bh, by, scheffe, tukey, games-howell, dunnett or maxt");
  const bool family_procedure =
      method == "scheffe" || method == "tukey" || method == "games-howell" || method == "dunnett" || method == "maxt";
  if (!family_procedure) {
    s.protects = protects_stepwise(method);
    for (const auto& m : by_method(family)) stepwise(m, method);
    return s;
  }
  if (family.empty()) {
    s.protects = "nothing: the family is empty";
    return s;
  }
  std::vector<std::string> fallback;  // methods adjusted by Holm instead
  auto note_fallback = [&](const method_family& m, const std::string& why) {
    holm_instead(m, why);
    fallback.push_back(m.method);
  };
  auto methods = by_method(family);
  if (method == "scheffe") {
    require_two_sided(method, o);
    const double r = static_cast<double>(populated_levels(p)) - 1;
    for (const auto& m : methods) {
      if (m.results.empty() || !t_based(*m.results.front())) note_fallback(m, "Scheffe's bound needs a t statistic with degrees of freedom");
      else scheffe(m, r, o);
    }
    s.protects = "the familywise error rate over every contrast among the " + std::to_string(populated_levels(p)) +
                 " levels, including contrasts chosen after seeing the data (Scheffe 1953); simultaneous intervals hold "
                 "jointly. Exact under normality with one common variance (pooled); with Welch or trimmed results each "
                 "contrast uses its own approximate df (Brown & Forsythe 1974)";
  } else if (method == "tukey" || method == "games-howell") {
    require_two_sided(method, o);
    auto levels = pair_levels(family, method);
    const double k = static_cast<double>(levels.size());
    const std::string wanted = method == "tukey" ? "pooled" : "welch";
    for (const auto& m : methods) {
      if (m.method == wanted) studentized_range_family(m, k, o);
      else if (method == "tukey") note_fallback(m, "Tukey-Kramer assumes one common variance and applies to the pooled method (use --adjust games-howell for welch)");
      else note_fallback(m, "Games-Howell applies to the welch method (use --adjust tukey for pooled)");
    }
    if (method == "tukey")
      s.protects = "the familywise error rate over all pairwise differences among " + join_levels(p, levels) +
                   " for the pooled method, under normality with one common variance (Tukey-Kramer: exact for equal "
                   "group sizes, conservative otherwise, Hayter 1984); simultaneous intervals hold jointly";
    else
      s.protects = "the familywise error rate over all pairwise differences among " + join_levels(p, levels) +
                   " for the welch method, approximately, allowing unequal variances (Games & Howell 1976); "
                   "simultaneous intervals hold jointly, approximately";
  } else if (method == "dunnett") {
    auto design = many_to_one_family(family, p);
    for (const auto& m : methods) {
      if (m.method == "pooled") dunnett(m, design, p, o);
      else note_fallback(m, "Dunnett's distribution assumes one common variance and applies to the pooled method");
    }
    s.protects = "the familywise error rate over the " + std::to_string(family.size()) + " comparison(s) with '" +
                 p.groups[design.control].level +
                 "' for the pooled method, under normality with one common variance (Dunnett 1955); simultaneous "
                 "intervals hold jointly";
  } else {
    std::vector<contrast> specs;
    for (const auto& c : family) specs.push_back(c.spec);
    std::optional<joint_resampling> permutations, bootstraps;
    std::string sources;
    for (const auto& m : methods) {
      const bool by_permutation = m.method == "permutation" ||
                                  (m.method == "welch" && o.statistic == permutation_statistic::studentized);
      if (!by_permutation && m.method != "bootstrap") {
        note_fallback(m, "max-T uses the joint permutation distribution of the Welch statistics (permutation and welch "
                         "results) or the joint bootstrap (bootstrap results)");
        continue;
      }
      try {
        if (by_permutation && !permutations) permutations = joint_permutation_statistics(p, specs, o);
        if (!by_permutation && !bootstraps) bootstraps = joint_bootstrap_statistics(p, specs, o);
      } catch (const analysis_error& e) {
        note_fallback(m, std::string("the joint resampling could not be done: ") + e.what());
        continue;
      }
      apply_max_t(m, by_permutation ? *permutations : *bootstraps, family, p, o, !by_permutation);
    }
    if (permutations) sources += "the joint permutation distribution of the Welch statistics (permutation, welch results)";
    if (bootstraps) sources += std::string(sources.empty() ? "" : " and ") + "the joint bootstrap distribution (bootstrap results)";
    s.protects = "the familywise error rate over the " + std::to_string(family.size()) +
                 " contrasts of this run, from " + (sources.empty() ? std::string("no joint resampling") : sources) +
                 ", which accounts for the correlation of the contrasts and needs no normality (max-T step-down, "
                 "Westfall & Young 1993; strong control under subset pivotality)";
  }
  if (!fallback.empty()) {
    std::string list;
    for (const auto& f : fallback) list += (list.empty() ? "" : ", ") + f;
    s.protects += ". Other methods in this run (" + list + "): Holm, the familywise error rate under any dependence";
  }
  return s;
}

}  // namespace contrasta
