#include "contrasta/comparison.hpp"

#include <algorithm>

#include "contrasta/error.hpp"
#include "contrasta/family.hpp"
#include "contrasta/methods.hpp"
#include "side_by_side.hpp"

namespace contrasta {

comparison run_comparison(prepared_data p, const comparison_request& request) {
  std::size_t populated = 0;
  for (const auto& g : p.groups) populated += g.n > 0;
  if (populated < 2)
    throw analysis_error("the data hold " + std::to_string(populated) +
                         " level(s) with observations; a comparison needs at least two (check --group and --levels)");
  comparison out;
  out.options = request.options;
  // The overall tests and the diagnostics behind the advice are independent reads of the same
  // prepared data; on large files each costs a few sorts, so they run side by side.
  detail::side_by_side(
      p.data.size(), [&] { out.overall = overall_tests(p); }, [&] { out.advice = recommend(p, request.options); });

  std::vector<contrast> contrasts = request.contrasts.empty() ? all_pairs(p.data.levels) : request.contrasts;
  for (const auto& c : contrasts) check_contrast(c, request.options.allow_linear);

  bool everything = false;
  for (const auto& m : request.methods) {
    if (m == "auto") {
      // The advised method for tests, and for intervals when the advice names another one.
      for (const auto& advised : {out.advice.method, out.advice.interval_method})
        if (!advised.empty() && std::find(out.methods.begin(), out.methods.end(), advised) == out.methods.end())
          out.methods.push_back(advised);
    } else if (m == "all") {
      everything = true;
      for (const auto& name : method_names())
        if (name != "dunn" && std::find(out.methods.begin(), out.methods.end(), name) == out.methods.end())
          out.methods.push_back(name);
    } else if (std::find(out.methods.begin(), out.methods.end(), m) == out.methods.end()) {
      if (std::find(method_names().begin(), method_names().end(), m) == method_names().end())
        throw usage_error("--method '" + m + "' is not known; use a comma list of pooled, welch, trimmed, permutation, "
                          "bootstrap, rank, mann-whitney, brunner-munzel, dunn, or all / auto");
      out.methods.push_back(m);
    }
  }

  for (const auto& c : contrasts) {
    contrast_result cr;
    cr.spec = c;
    double psi = 0;
    for (std::size_t i = 0; i < c.coefficients.size(); ++i)
      if (c.coefficients[i] != 0) psi += c.coefficients[i] * p.groups[i].centred_mean;
    cr.estimate = psi + c.location_term(p.data.centre);
    if (request.effect_sizes) {
      cr.effect = effect_sizes(p, c, request.options);
    } else {
      for (auto* e : {&cr.effect.standardized, &cr.effect.bonett})
        e->estimate = e->ci_low = e->ci_high = e->standardizer = e->se = not_available;
      cr.effect.scaled_contrast = cr.effect.scale = not_available;
      cr.effect.notes.push_back("effect sizes not computed (--no-effect-sizes)");
    }
    for (const auto& m : out.methods) {
      if (!method_applies(m, c)) {
        // Asked for by name: say why there is no number rather than dropping the row.
        if (!everything && m != out.advice.method) {
          method_result r;
          r.method = m;
          r.notes.push_back("does not apply: " + m + " compares two levels, and this contrast involves " +
                            std::to_string(c.involved().size()) + "; use rank or trimmed for it");
          cr.results.push_back(r);
        }
        continue;
      }
      if (everything) {
        try {
          cr.results.push_back(run_method(m, p, c, request.options));
        } catch (const analysis_error& e) {
          method_result r;
          r.method = m;
          r.notes.push_back(std::string("not computed: ") + e.what());
          cr.results.push_back(r);
        }
      } else {
        cr.results.push_back(run_method(m, p, c, request.options));
      }
    }
    out.contrasts.push_back(std::move(cr));
  }
  out.adjust = adjust_family(out.contrasts, request.adjust, p, request.options);
  out.orthogonality = orthogonality(p, contrasts);
  out.prepared = std::move(p);
  return out;
}

}  // namespace contrasta
