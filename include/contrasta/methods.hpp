// The catalogue of inference methods for one contrast, by name.
#pragma once
#include <string>
#include <string_view>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

// Every method name `compare --method` accepts (without all/auto), in display order.
const std::vector<std::string>& method_names();

// Whether a method applies to this contrast (mann-whitney and brunner-munzel need a two-level
// contrast).
bool method_applies(std::string_view method, const contrast& c);

// Runs one method on one contrast. Throws analysis_error when the data do not allow it.
method_result run_method(std::string_view method, const prepared_data& p, const contrast& c,
                         const analysis_options& o);

}  // namespace contrasta
