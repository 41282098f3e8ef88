// The recommendation: an explicit rule set over the facts of methods.md section 7. Each rule is
// documented in docs/diagnostics.md with its source (or marked as common practice). The rules
// choose the primary method from the data's shape, ties and group sizes; the spread facts and
// the variance tests explain the choice but never gate it alone (Zimmerman 2004, Br. J. Math.
// Stat. Psychol. 57:173-181).
#include "contrasta/recommend.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <string>

#include "contrasta/error.hpp"
#include "contrasta/methods.hpp"

namespace contrasta {
namespace {

// Thresholds of the rules (docs/diagnostics.md, "The rule set").
constexpr std::size_t tiny_group = 5;              // R1: smallest n below this
constexpr double discrete_scale_tied_share = 0.3;  // R2: with few distinct values
constexpr std::size_t discrete_distinct = 21;      // R2: "few": a 0-20 scale or shorter
constexpr std::size_t shape_min_n = 8;             // R3: residual shape read from N >= 8
constexpr double skew_limit = 1.0;                 // R3: residual |G1| >= 1, "highly skewed"
constexpr double kurtosis_limit = 3.0;             // R3: residual excess kurtosis >= 3
constexpr double outlier_level_kurtosis = 4.0;     // R3: a flagged outlier whose level has G2 >= 4
constexpr double sd_ratio_limit = 2.0;             // S1: common-practice warning sign
constexpr double pooled_se_limit = 0.9;            // S1: pooled SE below 0.9 of the separate SE
constexpr double balanced_limit = 1.5;             // S2: SD ratio and n ratio both <= 1.5

std::string number(double v, int significant = 3) {
  if (std::isnan(v)) return "n/a";
  if (std::isinf(v)) return v > 0 ? "infinite" : "-infinite";
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", significant, v);
  return buf;
}

// "p = 0.0123" or "p < 0.0001".
std::string p_text(double p) {
  if (std::isnan(p)) return "p n/a";
  if (p < 0.0001) return "p < 0.0001";
  char buf[32];
  std::snprintf(buf, sizeof buf, "p = %.4f", p);
  return buf;
}

std::string fixed(double v, int decimals = 2) {
  if (std::isnan(v)) return "n/a";
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

std::string percent(double share, int decimals = 1) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.*f%%", decimals, 100 * share);
  return buf;
}

std::string quoted(const prepared_data& p, std::size_t level) {
  return "'" + p.data.levels[level] + "'";
}

// Whether this build can run a method (methods not yet in the build throw analysis_error). Probed
// once per process on a small fixed dataset; the answer cannot change while the program runs.
bool probe_method(const std::string& method) {
  const prepared_data probe = prepare(make_dataset({"a", "b"}, {{1, 2, 3, 4.5}, {2, 3.5, 5, 7, 8}}));
  contrast c;
  c.name = "b - a";
  c.expression = "b - a";
  c.coefficients = {-1, 1};
  analysis_options o;
  o.resamples = 99;
  o.threads = 1;
  try {
    (void)run_method(method, probe, c, o);
    return true;
  } catch (const analysis_error&) {
    return false;
  }
}

bool method_available(const std::string& method) {
  static const std::map<std::string, bool> available = [] {
    std::map<std::string, bool> m;
    for (const auto& name : method_names()) m[name] = probe_method(name);
    return m;
  }();
  const auto it = available.find(method);
  return it != available.end() && it->second;
}

struct facts {
  std::size_t smallest_n = 0;
  std::size_t smallest_level = 0;
  bool discrete = false;
  double residual_skewness = not_available, residual_kurtosis = not_available;
  std::size_t residual_n = 0;
  bool skewed = false, heavy_tailed = false;
  // Flagged outliers in levels whose own excess kurtosis confirms a heavy tail: the modified
  // z-score alone flags some observation in about 4 of 10 small normal designs (bench/RESULTS.md).
  std::vector<outlier> confirmed_outliers;
  std::vector<double> confirmed_kurtosis;
  double levene_median_p = not_available;
  double residual_shapiro_p = not_available, residual_shapiro_w = not_available;
};

facts gather(const diagnostics_report& d) {
  facts f;
  f.smallest_n = d.spread.smallest_n;
  f.smallest_level = d.spread.smallest_n_level;
  // Few distinct values (a rating scale, small counts) with many ties. Finely rounded
  // measurements tie often too (90% of 180 values rounded to 0.1 SD share a value) but take many
  // distinct values, and stay with the means.
  f.discrete = d.ties.distinct_values <= discrete_distinct && d.ties.tied_share >= discrete_scale_tied_share;
  f.residual_n = d.residuals.n;
  f.residual_skewness = d.residuals.skewness;
  f.residual_kurtosis = d.residuals.excess_kurtosis;
  if (f.residual_n >= shape_min_n) {
    f.skewed = std::abs(f.residual_skewness) >= skew_limit;
    f.heavy_tailed = f.residual_kurtosis >= kurtosis_limit;
  }
  for (const auto& o : d.outliers) {
    // describe_shapes lists the levels in order, so shapes[level] is the outlier's level.
    if (o.level < d.shapes.size() && d.shapes[o.level].excess_kurtosis >= outlier_level_kurtosis) {
      f.confirmed_outliers.push_back(o);
      f.confirmed_kurtosis.push_back(d.shapes[o.level].excess_kurtosis);
    }
  }
  for (const auto& v : d.variance)
    if (v.test == "levene-median") f.levene_median_p = v.p_value;
  for (const auto& n : d.normality)
    if (!n.level) {
      f.residual_shapiro_p = n.p_value;
      f.residual_shapiro_w = n.statistic;
    }
  return f;
}

void add_unique(std::vector<std::string>& list, const std::string& item) {
  if (std::find(list.begin(), list.end(), item) == list.end()) list.push_back(item);
}

const calibration_row* find_row(const calibration_report& c, const std::string& method, const std::string& model) {
  for (const auto& r : c.rows)
    if (r.method == method && r.model == model) return &r;
  return nullptr;
}

// Liberal beyond Monte Carlo noise: even the lower end of a 99% interval exceeds 1.5 alpha
// (Bradley 1978).
bool clearly_liberal(const calibration_row& r) {
  return r.type1_error - 2.576 * r.type1_se > 1.5 * r.alpha;
}

std::string calibration_text(const calibration_row& r) {
  return r.method + " rejected " + percent(r.type1_error) + " (Monte Carlo SE " + percent(r.type1_se, 2) + ") of " +
         std::to_string(r.datasets) + " simulated equal-means datasets (" +
         (r.model == "normal" ? std::string("normal errors") : std::string("resampled residuals")) + ") at alpha " +
         number(r.alpha);
}

// Calibration (rule C1): keep the primary method if the simulation of this design shows it
// holding alpha, otherwise move to the calibrated method closest to alpha within Bradley's band.
void apply_calibration(recommendation& rec, const calibration_report& c, const std::vector<std::string>& preference) {
  std::vector<std::string> models;
  for (const auto& r : c.rows) add_unique(models, r.model);
  auto rows_of = [&](const std::string& method) {
    std::vector<const calibration_row*> rows;
    for (const auto& m : models)
      if (const auto* r = find_row(c, method, m)) rows.push_back(r);
    return rows;
  };
  const auto primary_rows = rows_of(rec.method);
  if (primary_rows.empty()) return;
  rec.rules.push_back("C1 calibration");
  bool liberal = false;
  for (const auto* r : primary_rows) liberal = liberal || clearly_liberal(*r);
  if (!liberal) {
    for (const auto* r : primary_rows) {
      rec.reasons.push_back(
          "calibration on this design: " + calibration_text(*r) +
          (within_bradley_band(r->type1_error, r->alpha)
               ? ", inside Bradley's (1978) band alpha/2 to 3 alpha/2"
               : ", outside Bradley's (1978) band alpha/2 to 3 alpha/2 but within Monte Carlo noise"));
    }
  } else {
    std::string best;
    double best_distance = INFINITY;
    for (const auto& method : preference) {
      const auto rows = rows_of(method);
      if (rows.size() != primary_rows.size()) continue;
      double distance = 0;
      bool ok = true;
      for (const auto* r : rows) {
        ok = ok && within_bradley_band(r->type1_error, r->alpha) && !clearly_liberal(*r);
        distance = std::max(distance, std::abs(r->type1_error - r->alpha));
      }
      if (ok && distance < best_distance - 1e-12) {
        best = method;
        best_distance = distance;
      }
    }
    for (const auto* r : primary_rows)
      rec.reasons.push_back("calibration on this design: " + calibration_text(*r) + ": too liberal");
    if (!best.empty()) {
      for (const auto* r : rows_of(best)) rec.reasons.push_back("calibration on this design: " + calibration_text(*r));
      add_unique(rec.alternatives, rec.method);
      rec.method = best;
      if (best == "pooled" || best == "welch" || best == "trimmed") rec.interval_method = best;
      rec.reasons.push_back("so " + best +
                            " is recommended: of the calibrated methods it holds alpha best on this design, " +
                            "within " + fixed(100 * best_distance, 1) + " percentage points of alpha " +
                            number(primary_rows.front()->alpha) + " under every error model");
    } else {
      rec.notes.push_back("no calibrated method held alpha on this design: read every result with caution");
    }
  }
  // Say so when the classical pooled t fails on this design, whatever was chosen.
  if (rec.method != "pooled") {
    for (const auto* r : rows_of("pooled"))
      if (clearly_liberal(*r))
        rec.reasons.push_back("calibration on this design: " + calibration_text(*r) + ": too liberal");
  }
  for (const auto* r : rows_of(rec.method))
    if (r->power)
      rec.reasons.push_back("simulated power of " + rec.method + " for " + r->power_contrast + " (" +
                            (r->model == "normal" ? std::string("normal errors") : std::string("resampled residuals")) +
                            "): " + percent(*r->power) + " (Monte Carlo SE " + percent(*r->power_se, 2) + ")");
}

}  // namespace

recommendation recommend(const prepared_data& p, const analysis_options& o) {
  return recommend(p, diagnose(p), nullptr, o);
}

recommendation recommend(const prepared_data& p, const diagnostics_report& d, const calibration_report* calibration,
                         const analysis_options& o) {
  (void)o;
  recommendation rec;
  const facts f = gather(d);
  const auto& s = d.spread;
  const std::size_t k = p.groups.size();
  if (k < 2) {
    rec.method = rec.interval_method = "welch";
    rec.reasons.push_back("only " + std::to_string(k) + " level: no comparison to make");
    return rec;
  }

  // Primary method: the first rule that applies (R1 to R4).
  if (f.smallest_n < 2) {
    rec.rules.push_back("R1 tiny groups");
    rec.method = rec.interval_method = "pooled";
    rec.reasons.push_back("level " + quoted(p, f.smallest_level) + " has n = " + std::to_string(f.smallest_n) +
                          ": it has no variance of its own, so only the pooled variance can serve; pooled assumes "
                          "equal variances in all " +
                          std::to_string(k) + " levels");
    rec.alternatives = {"permutation"};
  } else if (f.smallest_n < tiny_group) {
    rec.rules.push_back("R1 tiny groups");
    rec.method = f.discrete ? "rank" : "permutation";
    rec.interval_method = "welch";
    rec.reasons.push_back("smallest group n = " + std::to_string(f.smallest_n) + " (level " +
                          quoted(p, f.smallest_level) +
                          "): too few to judge normality or trust a t approximation; a permutation test needs "
                          "neither and is exact when the arrangements are few (Fisher 1935; Pitman 1937)");
    if (f.discrete)
      rec.reasons.push_back(percent(d.ties.tied_share, 0) +
                            " of observations are tied: the permutation test on mid-ranks "
                            "handles ties exactly (Conover & Iman 1981)");
    rec.alternatives = {f.discrete ? "permutation" : "rank", "welch"};
  } else if (f.discrete) {
    rec.rules.push_back("R2 ties and discrete scale");
    rec.method = "rank";
    rec.interval_method = "welch";
    std::string what = d.ties.small_integer_scale
                           ? "responses are whole numbers from " + number(d.ties.scale_min, 6) + " to " +
                                 number(d.ties.scale_max, 6) + " with " + std::to_string(d.ties.distinct_values) +
                                 " distinct values"
                           : "responses take " + std::to_string(d.ties.distinct_values) + " distinct values";
    rec.reasons.push_back(what + " and " + percent(d.ties.tied_share, 0) +
                          " of observations are tied: a discrete scale, so the permutation test on mid-ranks "
                          "(exact for small samples, ties allowed; Conover & Iman 1981) is the primary test");
    rec.notes.push_back(
        "intervals for mean differences by Welch; on a rating scale read them as differences of "
        "average scores");
    rec.alternatives = {"brunner-munzel", "permutation", "welch"};
  } else if (!f.confirmed_outliers.empty() || f.skewed || f.heavy_tailed) {
    rec.rules.push_back("R3 heavy tails or outliers");
    rec.method = rec.interval_method = "trimmed";
    if (!f.confirmed_outliers.empty()) {
      std::size_t worst = 0;
      for (std::size_t i = 1; i < f.confirmed_outliers.size(); ++i)
        if (std::abs(f.confirmed_outliers[i].robust_z) > std::abs(f.confirmed_outliers[worst].robust_z)) worst = i;
      const auto& flagged = f.confirmed_outliers[worst];
      const std::size_t count = f.confirmed_outliers.size();
      rec.reasons.push_back((count == 1 ? std::string("an outlier") : std::to_string(count) + " outliers") +
                            " by the modified z-score rule (|z| > 3.5; Iglewicz & Hoaglin 1993) in a level with heavy "
                            "tails" +
                            (count == 1 ? ": " : "; the most extreme ") + number(flagged.value, 6) + " in level " +
                            quoted(p, flagged.level) + " (row " + std::to_string(flagged.row) +
                            ", z = " + fixed(flagged.robust_z, 1) + "; excess kurtosis of that level " +
                            fixed(f.confirmed_kurtosis[worst], 1) + ")");
    }
    if (f.skewed)
      rec.reasons.push_back("skewness of the standardized residuals " + fixed(f.residual_skewness) +
                            " (N = " + std::to_string(f.residual_n) + "; |G1| >= 1: highly skewed, common practice)");
    if (f.heavy_tailed)
      rec.reasons.push_back("excess kurtosis of the standardized residuals " + fixed(f.residual_kurtosis, 1) +
                            " (N = " + std::to_string(f.residual_n) + "; >= 3: heavy tails, common practice)");
    rec.reasons.push_back(
        "trimmed means (20%, Yuen 1974) resist outliers and heavy tails and allow unequal variances "
        "(Wilcox, Introduction to Robust Estimation and Hypothesis Testing)");
    rec.alternatives = {"rank", "welch", "permutation"};
  } else {
    rec.rules.push_back("R4 default");
    rec.method = rec.interval_method = "welch";
    std::string outliers_text = d.outliers.empty()
                                    ? "no outliers"
                                    : std::to_string(d.outliers.size()) + " flagged value" +
                                          (d.outliers.size() == 1 ? "" : "s") + " without heavy tails in its level";
    rec.reasons.push_back("smallest n = " + std::to_string(f.smallest_n) + ", " + outliers_text +
                          ", standardized residuals with skewness " + fixed(f.residual_skewness) +
                          " and excess kurtosis " + fixed(f.residual_kurtosis, 1) +
                          ": means are a fair summary; Welch is the sound default, "
                          "losing little when variances are equal (Delacre, Lakens & Leys 2017)");
    rec.alternatives = {"trimmed", "permutation"};
  }

  // Spread facts (S1, S2): explain the pooled-versus-separate choice with numbers.
  if (!std::isnan(s.sd_ratio)) {
    const std::string sd_text = "SD ratio " + fixed(s.sd_ratio, 1) + " (largest SD " +
                                number(p.groups[s.largest_sd_level].sd) + " in " + quoted(p, s.largest_sd_level) +
                                ", n = " + std::to_string(p.groups[s.largest_sd_level].n) + "; smallest " +
                                number(p.groups[s.smallest_sd_level].sd) + " in " + quoted(p, s.smallest_sd_level) +
                                ", n = " + std::to_string(p.groups[s.smallest_sd_level].n) + ")";
    const bool unequal = s.sd_ratio > sd_ratio_limit || s.pooled_se_ratio < pooled_se_limit;
    if (unequal) {
      rec.rules.push_back("S1 unequal variances");
      std::string text = sd_text;
      if (s.larger_variances_in_smaller_groups && s.pooled_se_ratio < 1)
        text += " with the larger variances in the smaller groups: pooled t rejects too often (Box 1954)";
      else
        text += ": the variances differ";
      if (s.pooled_se_ratio < 1)
        text += "; for " + quoted(p, s.pooled_se_pair_first) + " vs " + quoted(p, s.pooled_se_pair_second) +
                " the pooled standard error is " + fixed(s.pooled_se_ratio, 2) +
                " times the separate-variance one, so pooled t overstates that difference";
      else
        text += "; pooled t is conservative here, losing power (Box 1954)";
      rec.reasons.push_back(text);
    } else if (s.sd_ratio <= balanced_limit && s.n_ratio <= balanced_limit) {
      rec.rules.push_back("S2 balanced and homogeneous");
      rec.reasons.push_back(sd_text + " and n ratio " + fixed(s.n_ratio, 1) +
                            ": spreads and sizes are balanced, so pooled and Welch nearly agree");
      if (rec.method == "welch") add_unique(rec.alternatives, "pooled");
    } else {
      rec.reasons.push_back(sd_text + " and n ratio " + fixed(s.n_ratio, 1) +
                            ": below the common-practice warning sign of 2");
    }
  }

  // Reported, never a gate (S3).
  if (!std::isnan(f.levene_median_p))
    rec.reasons.push_back("Brown-Forsythe (median-centred Levene) test " + p_text(f.levene_median_p) +
                          ": reported, not used as a gate, since choosing a test after a variance pre-test distorts "
                          "error rates (Zimmerman 2004)");
  if (!std::isnan(f.residual_shapiro_p))
    rec.reasons.push_back("Shapiro-Wilk on the pooled residuals W = " + fixed(f.residual_shapiro_w, 4) + ", " +
                          p_text(f.residual_shapiro_p) + ": reported; the shape figures above carry the decision");

  if (calibration && !calibration->rows.empty()) {
    std::vector<std::string> preference = {"welch",          "trimmed",   "permutation", "rank",
                                           "brunner-munzel", "bootstrap", "pooled"};
    std::stable_partition(preference.begin(), preference.end(), [&](const std::string& m) { return m == rec.method; });
    apply_calibration(rec, *calibration, preference);
  }

  // A method this build cannot run falls back to Welch (or pooled for a group of one).
  if (!method_available(rec.method)) {
    const std::string fallback = f.smallest_n < 2 ? "pooled" : "welch";
    rec.notes.push_back(rec.method + " would be preferred but is not available in this build: " + fallback +
                        " instead");
    rec.method = fallback;
  }
  if (!method_available(rec.interval_method)) rec.interval_method = f.smallest_n < 2 ? "pooled" : "welch";
  std::vector<std::string> alternatives;
  for (const auto& a : rec.alternatives)
    if (a != rec.method && method_available(a)) alternatives.push_back(a);
  rec.alternatives = alternatives;
  return rec;
}

}  // namespace contrasta
