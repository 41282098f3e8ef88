// The main job as one call: contrasts under the chosen methods with multiplicity control.
#pragma once
#include <string>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/multiplicity.hpp"
#include "contrasta/options.hpp"
#include "contrasta/orthogonality.hpp"
#include "contrasta/overall.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/recommend.hpp"

namespace contrasta {

struct comparison_request {
  std::vector<contrast> contrasts;     // empty: all pairs
  std::vector<std::string> methods = {"auto"};  // names, or "all" / "auto"
  std::string adjust = "none";
  analysis_options options;
  // Standardized effect sizes with noncentral-t intervals cost far more than the contrasts
  // themselves (a root search over the noncentral t per interval end); batch runs over
  // thousands of responses may switch them off.
  bool effect_sizes = true;
};

struct comparison {
  prepared_data prepared;
  std::vector<overall_test> overall;
  recommendation advice;
  std::vector<std::string> methods;    // the methods that ran, "auto" resolved
  std::vector<contrast_result> contrasts;
  adjustment_summary adjust;
  orthogonality_report orthogonality;  // of the family, for this design
  analysis_options options;
};

comparison run_comparison(prepared_data p, const comparison_request& request);

}  // namespace contrasta
