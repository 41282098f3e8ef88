// Trimmed-mean (Yuen) contrasts.
#pragma once
#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

// Yuen 1974 generalised to any contrast: trimmed means, winsorized variances, Welch-type df.
method_result trimmed_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

}  // namespace contrasta
