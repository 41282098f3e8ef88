#include "contrasta/methods.hpp"

#include "contrasta/classical.hpp"
#include "contrasta/error.hpp"
#include "contrasta/rank.hpp"
#include "contrasta/resample.hpp"
#include "contrasta/robust.hpp"

namespace contrasta {

const std::vector<std::string>& method_names() {
  static const std::vector<std::string> names = {"pooled",      "welch",        "trimmed",        "permutation",
                                                 "bootstrap",   "rank",         "mann-whitney",   "brunner-munzel",
                                                 "dunn"};
  return names;
}

bool method_applies(std::string_view method, const contrast& c) {
  if (method == "mann-whitney" || method == "brunner-munzel") {
    auto [a, b] = c.two_levels();
    return a != static_cast<std::size_t>(-1);
  }
  if (method == "dunn") return c.two_levels().first != static_cast<std::size_t>(-1);
  return true;
}

method_result run_method(std::string_view method, const prepared_data& p, const contrast& c,
                         const analysis_options& o) {
  if (!method_applies(method, c))
    throw analysis_error("method '" + std::string(method) + "' compares two levels, but contrast '" + c.name +
                         "' involves " + std::to_string(c.involved().size()) + "; use it on contrasts like 'a - b'");
  if (method == "pooled") return pooled_contrast(p, c, o);
  if (method == "welch") return welch_contrast(p, c, o);
  if (method == "trimmed") return trimmed_contrast(p, c, o);
  if (method == "permutation") return permutation_contrast(p, c, o);
  if (method == "bootstrap") return bootstrap_contrast(p, c, o);
  if (method == "rank") return rank_contrast(p, c, o);
  if (method == "mann-whitney") return mann_whitney_contrast(p, c, o);
  if (method == "brunner-munzel") return brunner_munzel_contrast(p, c, o);
  if (method == "dunn") return dunn_contrast(p, c, o);
  throw usage_error("--method '" + std::string(method) +
                    "' is not known; use pooled, welch, trimmed, permutation, bootstrap, rank, mann-whitney, "
                    "brunner-munzel, dunn, all or auto");
}

}  // namespace contrasta
