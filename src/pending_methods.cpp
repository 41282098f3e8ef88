// Placeholders for methods whose concept files have not landed yet. Each concept's own file
// replaces its entries here (delete the function from this file when you add the real one).
#include "contrasta/error.hpp"
#include "contrasta/rank.hpp"
#include "contrasta/resample.hpp"
#include "contrasta/robust.hpp"

namespace contrasta {
namespace {
[[noreturn]] void pending(const char* name) {
  throw analysis_error(std::string("method '") + name + "' is not available in this build yet; choose pooled or welch");
}
}  // namespace
method_result trimmed_contrast(const prepared_data&, const contrast&, const analysis_options&) { pending("trimmed"); }
method_result rank_contrast(const prepared_data&, const contrast&, const analysis_options&) { pending("rank"); }
method_result mann_whitney_contrast(const prepared_data&, const contrast&, const analysis_options&) { pending("mann-whitney"); }
method_result brunner_munzel_contrast(const prepared_data&, const contrast&, const analysis_options&) { pending("brunner-munzel"); }
method_result dunn_contrast(const prepared_data&, const contrast&, const analysis_options&) { pending("dunn"); }
}  // namespace contrasta
