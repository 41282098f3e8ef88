// Choosing a method from the facts of the data, with every reason stated with its number.
#pragma once
#include <string>
#include <vector>

#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"

namespace contrasta {

struct recommendation {
  std::string method;                  // primary method for tests (a name from method_names())
  std::string interval_method;         // primary method for intervals
  std::vector<std::string> reasons;    // each with its measured number
  std::vector<std::string> alternatives;  // other methods worth reading
};

struct calibration_row;  // from calibrate.hpp, when calibration has run

recommendation recommend(const prepared_data& p, const analysis_options& o);

}  // namespace contrasta
