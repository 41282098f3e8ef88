// Placeholders for methods whose concept files have not landed yet. Each concept's own file
// replaces its entries here (delete the function from this file when you add the real one).
#include "contrasta/error.hpp"
#include "contrasta/resample.hpp"

namespace contrasta {
namespace {
[[noreturn]] void pending(const char* name) {
  throw analysis_error(std::string("method '") + name + "' is not available in this build yet; choose pooled or welch");
}
}  // namespace
method_result permutation_contrast(const prepared_data&, const contrast&, const analysis_options&) { pending("permutation"); }
method_result bootstrap_contrast(const prepared_data&, const contrast&, const analysis_options&) { pending("bootstrap"); }
}  // namespace contrasta
