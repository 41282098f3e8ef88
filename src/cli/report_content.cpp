#include "cli/report_content.hpp"

#include <algorithm>
#include <cmath>
#include <map>

#include "cli/report_text.hpp"

namespace contrasta::cli {

namespace {

// The axis an estimate lives on. Methods whose estimates are in the response's units share
// one forest plot; rank-based estimates get plots of their own so that no axis mixes units.
struct estimate_scale {
  std::string key;
  std::string label;
  double reference = 0;
  std::string reference_label = "no difference";
};

std::optional<estimate_scale> scale_of(const method_result& r, const std::string& response) {
  static const std::vector<std::string> data_units = {"pooled", "welch", "trimmed", "permutation", "bootstrap"};
  if (std::find(data_units.begin(), data_units.end(), r.method) != data_units.end() ||
      r.estimand.find("shift") != std::string::npos) {
    return estimate_scale{"data", "contrast estimate, in units of " + response, 0, "no difference"};
  }
  if (r.method == "brunner-munzel") {
    return estimate_scale{"relative-effect", "relative effect P(X < Y) + P(X = Y)/2", 0.5, "no tendency"};
  }
  if (r.method == "rank" || r.method == "dunn") {
    return estimate_scale{"ranks", "contrast of mean ranks", 0, "no difference"};
  }
  return std::nullopt;
}

}  // namespace

bool computed(const method_result& r) {
  return !std::isnan(r.estimate) || !std::isnan(r.p_value);
}

std::vector<std::pair<std::string, std::string>> methods_without_results(const comparison& result) {
  std::vector<std::pair<std::string, std::string>> out;
  for (const auto& name : result.methods) {
    bool any = false, seen = false;
    std::string why;
    for (const auto& c : result.contrasts) {
      for (const auto& m : c.results) {
        if (m.method != name) continue;
        seen = true;
        any |= computed(m);
        if (why.empty() && !m.notes.empty()) why = not_computed_text(m);
      }
    }
    if (seen && !any) out.emplace_back(name, why.empty() ? std::string("not computed") : why);
  }
  return out;
}

std::string not_computed_text(const method_result& r) {
  if (r.notes.empty()) return "not computed";
  const std::string& note = r.notes.front();
  if (note.rfind("not computed", 0) == 0) return note;
  return "not computed: " + note;
}

std::vector<std::pair<std::string, std::string>> method_tests(const comparison& result) {
  std::vector<std::pair<std::string, std::string>> out;
  for (const auto& c : result.contrasts) {
    for (const auto& m : c.results) {
      if (!computed(m) || m.null_hypothesis.empty()) continue;
      if (std::find_if(out.begin(), out.end(), [&](const auto& x) { return x.first == m.method; }) == out.end()) {
        out.emplace_back(m.method, m.null_hypothesis);
      }
    }
  }
  return out;
}

std::string report_title(const dataset& d) {
  std::string title = "How " + d.response + " differs between ";
  if (!d.group_column.empty()) return title + "levels of " + d.group_column;
  if (d.levels.size() > 4 || d.levels.size() < 2) return title + "the " + std::to_string(d.levels.size()) + " levels";
  for (std::size_t i = 0; i < d.levels.size(); ++i) {
    title += (i == 0 ? "" : i + 1 == d.levels.size() ? " and " : ", ") + d.levels[i];
  }
  return title;
}

std::string alternative_words(alternative side) {
  switch (side) {
    case alternative::two_sided:
      return "two-sided";
    case alternative::greater:
      return "one-sided (greater)";
    case alternative::less:
      return "one-sided (less)";
  }
  return "";
}

std::string p_value_words(const comparison& result) {
  if (result.adjust.method == "none" || result.adjust.method.empty()) return "p-value";
  return adjustment_words(result.adjust.method) + "-adjusted p-value";
}

std::string headline_method(const comparison& result) {
  const std::string& advised = result.advice.method;
  if (std::find(result.methods.begin(), result.methods.end(), advised) != result.methods.end()) return advised;
  return result.methods.empty() ? std::string() : result.methods.front();
}

std::vector<report_figure> report_figures(const report_content& content, bool standalone) {
  const comparison& r = content.result;
  std::vector<report_figure> figures;

  svg::observation_plot_input obs;
  obs.response = r.prepared.data.response;
  obs.conf = r.options.conf;
  obs.standalone = standalone;
  for (std::size_t i = 0; i < r.prepared.groups.size(); ++i) {
    const group_summary& g = r.prepared.groups[i];
    svg::group_points points;
    points.level = g.level;
    points.mean = g.mean;
    points.median = g.median;
    points.missing = g.n_missing;
    if (i < content.levels.size()) {
      const report_level& l = content.levels[i];
      points.values = l.values;
      points.rows = l.rows;
      points.outlier = l.outlier;
      points.mean_low = l.mean_low;
      points.mean_high = l.mean_high;
    } else {
      points.mean_low = points.mean_high = not_available;
    }
    obs.groups.push_back(std::move(points));
  }
  figures.push_back({"observations",
                     "Every observation of " + obs.response +
                         " by group (points; a small vertical "
                         "spread keeps them apart), with each group's mean and its " +
                         percent_text(obs.conf) + " interval and the median.",
                     svg::observation_plot(obs)});

  // Forest plots: one per scale of estimate, in order of first appearance.
  const std::string advised = headline_method(r);
  std::vector<std::pair<estimate_scale, svg::forest_plot_input>> plots;
  for (const auto& c : r.contrasts) {
    for (const auto& m : c.results) {
      auto s = scale_of(m, r.prepared.data.response);
      if (!s || !std::isfinite(m.estimate) || std::isnan(m.ci_low) || std::isnan(m.ci_high)) continue;
      auto it = std::find_if(plots.begin(), plots.end(), [&](const auto& p) { return p.first.key == s->key; });
      if (it == plots.end()) {
        svg::forest_plot_input f;
        f.scale = s->label;
        f.reference = s->reference;
        f.reference_label = s->reference_label;
        f.conf = r.options.conf;
        f.alpha = r.options.alpha;
        f.adjusted_label = r.adjust.method == "none" ? "" : adjustment_words(r.adjust.method) + "-adjusted";
        f.standalone = standalone;
        plots.emplace_back(*s, std::move(f));
        it = plots.end() - 1;
      }
      auto& blocks = it->second.blocks;
      if (blocks.empty() || blocks.back().contrast != c.spec.name) blocks.push_back({c.spec.name, {}});
      svg::forest_row row;
      row.method = m.method;
      row.estimate = m.estimate;
      row.low = m.ci_low;
      row.high = m.ci_high;
      row.adjusted_low = m.simultaneous_low;
      row.adjusted_high = m.simultaneous_high;
      const double p = std::isnan(m.p_adjusted) ? m.p_value : m.p_adjusted;
      row.p_text = display_p(p);
      row.below_alpha = p < r.options.alpha;
      row.recommended = m.method == advised;
      blocks.back().rows.push_back(std::move(row));
    }
  }
  for (auto& [scale, input] : plots) {
    figures.push_back({"forest-" + scale.key,
                       "Each contrast under each method: the estimate (dot) and its " + percent_text(r.options.conf) +
                           " interval (line); the dashed line is " + plain_number(scale.reference) + ", " +
                           scale.reference_label + ".",
                       svg::forest_plot(input)});
  }

  for (std::size_t i = 0; i < content.nulls.size(); ++i) {
    const report_null& n = content.nulls[i];
    svg::histogram_input h;
    h.statistic_name = n.statistic_name;
    h.statistics = n.statistics;
    h.observed = n.observed;
    h.p_text = display_p(n.p_value);
    h.standalone = standalone;
    h.counted = r.options.side == alternative::two_sided ? svg::histogram_input::tail::both
                : r.options.side == alternative::greater ? svg::histogram_input::tail::upper
                                                         : svg::histogram_input::tail::lower;
    const std::string count = n.exact ? "all " + count_text(static_cast<double>(n.resamples)) + " arrangements"
                                      : count_text(static_cast<double>(n.resamples)) + " resamples";
    h.title = n.contrast + ": " + n.method + " statistic " + n.statistic_name + " under the null (" + count + ")";
    figures.push_back({"null-" + std::to_string(i + 1),
                       "Null distribution of the " + n.method + " statistic for " + n.contrast +
                           ", with the observed value; the shaded bars are at least as extreme.",
                       svg::null_histogram(h)});
  }
  return figures;
}

std::vector<std::string> report_cautions(const report_content& content) {
  std::vector<std::string> out = {
      "The analysis treats the data as one factor whose levels were assigned at random to "
      "independent experimental units. Check the design first: blocks, repeated measurements on "
      "the same unit or several samples from one plot need a different analysis.",
      "A p-value is not an effect size: judge the importance of a difference from its estimate "
      "and interval, in the units of the response.",
      "Contrasts chosen after looking at the data need an adjustment that allows for it "
      "(for example Scheffe's) to keep the stated error rate.",
      "Decisions under regulation (registration, safety, labelling) follow local rules and the "
      "review of a qualified statistician; this report replaces neither.",
  };
  if (content.uses_seed) {
    out.push_back(
        "Resampling results depend on the seed printed above; rerunning with the "
        "reproducing command gives the same numbers, and each Monte Carlo p-value "
        "carries a 99% interval for its resampling error.");
  }
  // Each note once per method, with the contrasts it concerns.
  std::vector<std::pair<std::string, std::vector<std::string>>> notes;
  for (const auto& c : content.result.contrasts) {
    for (const auto& m : c.results) {
      if (!computed(m)) continue;  // shown where the results are, not repeated as a caution
      for (const auto& note : m.notes) {
        const std::string key = m.method + ": " + note;
        auto it = std::find_if(notes.begin(), notes.end(), [&](const auto& x) { return x.first == key; });
        if (it == notes.end())
          notes.push_back({key, {c.spec.name}});
        else
          it->second.push_back(c.spec.name);
      }
    }
  }
  std::vector<std::string> seen;
  for (const auto& [key, contrasts] : notes) {
    std::string line = key;
    if (contrasts.size() == content.result.contrasts.size() && contrasts.size() > 1) {
      line += " (every contrast)";
    } else {
      line += " (";
      for (std::size_t i = 0; i < contrasts.size(); ++i) line += (i ? ", " : "") + contrasts[i];
      line += ")";
    }
    seen.push_back(std::move(line));
  }
  out.insert(out.end(), seen.begin(), seen.end());
  return out;
}

std::vector<std::string> report_headlines(const report_content& content) {
  const comparison& r = content.result;
  const std::string method = headline_method(r);
  const agreement_table agreement = method_agreement(r, r.options.alpha);
  const std::string alpha = plain_number(r.options.alpha);
  std::vector<std::string> out;
  for (std::size_t i = 0; i < r.contrasts.size(); ++i) {
    const auto& c = r.contrasts[i];
    auto it =
        std::find_if(c.results.begin(), c.results.end(), [&](const method_result& m) { return m.method == method; });
    if (it == c.results.end()) continue;
    const method_result& m = *it;
    const double p = std::isnan(m.p_adjusted) ? m.p_value : m.p_adjusted;
    std::string s = c.spec.name + ": estimated " + (m.estimand.empty() ? "contrast" : m.estimand) + " " +
                    display_number(m.estimate);
    if (!std::isnan(m.ci_low) && !std::isnan(m.ci_high)) {
      const bool adjusted = r.adjust.method != "none" && !r.adjust.method.empty();
      if (adjusted && m.simultaneous_low && m.simultaneous_high) {
        s += " (" + adjustment_words(r.adjust.method) + "-adjusted " + percent_text(r.options.conf) + " interval " +
             display_number(*m.simultaneous_low) + " to " + display_number(*m.simultaneous_high) + ")";
      } else {
        s += " (" + percent_text(r.options.conf) + " interval " + display_number(m.ci_low) + " to " +
             display_number(m.ci_high) + (adjusted ? ", not adjusted" : "") + ")";
      }
    }
    s += "; " + m.method + " " + (r.adjust.method == "none" ? "p" : adjustment_words(r.adjust.method) + "-adjusted p") +
         " " + (display_p(p).front() == '<' ? "" : "= ") + display_p(p) + ": ";
    if (std::isnan(p))
      s += "no conclusion (no p-value).";
    else if (p < r.options.alpha)
      s += "a difference at alpha " + alpha + ".";
    else
      s += "no clear difference at alpha " + alpha + ".";
    if (i < agreement.rows.size() && agreement.rows[i].verdict == agreement_verdict::split) {
      s += " Other methods reach a different conclusion: see the agreement table.";
    }
    out.push_back(std::move(s));
  }
  return out;
}

}  // namespace contrasta::cli
