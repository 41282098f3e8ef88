// Choosing a method from the facts of the data, with every reason stated with its number.
#pragma once
#include <string>
#include <vector>

#include "contrasta/calibrate.hpp"
#include "contrasta/diagnostics.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"

namespace contrasta {

struct recommendation {
  std::string method;                     // primary method for tests (a name from method_names())
  std::string interval_method;            // primary method for intervals
  std::vector<std::string> reasons;       // each with its measured number
  std::vector<std::string> alternatives;  // other methods worth reading
  std::vector<std::string> rules;         // the rules that fired, by name (docs/diagnostics.md)
  std::vector<std::string> notes;         // remarks without a measured number (how to read, availability)
};

// The documented rule set (docs/diagnostics.md), on the diagnostics of `p`.
recommendation recommend(const prepared_data& p, const analysis_options& o);

// The same rules on diagnostics already computed, and, when calibration has run on this design,
// its simulated type I errors: a primary method that the simulation shows to be liberal is
// replaced by the best calibrated one.
recommendation recommend(const prepared_data& p, const diagnostics_report& d, const calibration_report* calibration,
                         const analysis_options& o);

}  // namespace contrasta
