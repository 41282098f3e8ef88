#include "contrasta/recommend.hpp"

namespace contrasta {

// First rule only: Welch is the sound default for contrasts of means (Delacre, Lakens & Leys
// 2017). The diagnostics concept extends this with the full rule set.
recommendation recommend(const prepared_data& p, const analysis_options& o) {
  (void)p;
  (void)o;
  recommendation r;
  r.method = "welch";
  r.interval_method = "welch";
  r.reasons.push_back("Welch's test keeps its error rate whether or not the level variances are equal (Delacre, Lakens & Leys 2017)");
  r.alternatives = {"pooled"};
  return r;
}

}  // namespace contrasta
