// The family step: adjusted p-values (and simultaneous intervals where the procedure defines
// them) over the contrasts of one run.
#pragma once
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/effect_size.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

struct contrast_result {
  contrast spec;
  double estimate = 0;                 // the plain mean contrast psi = sum c_i ybar_i
  std::vector<method_result> results;  // one per method, in request order
  effect_size_result effect;           // standardized and Bonett effect sizes (effect_size.hpp)
};

struct adjustment_summary {
  std::string method = "none";
  std::size_t family_size = 0;
  std::string protects;                // words: what error rate, over which family
};

// Names --adjust accepts.
const std::vector<std::string>& adjustment_names();

// Step-wise adjustments of a list of raw p-values: none, bonferroni, holm, sidak, hochberg, bh, by.
std::vector<double> adjust_p_values(std::span<const double> p, std::string_view method);

// Applies `method` to every method's results across the contrasts (the family is the contrasts
// of the run, one family per method). Sets p_adjusted (and simultaneous intervals).
adjustment_summary adjust_family(std::vector<contrast_result>& family, std::string_view method,
                                 const prepared_data& p, const analysis_options& o);

}  // namespace contrasta
