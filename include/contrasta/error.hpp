// Errors the engine reports. Each maps to one exit status of the command-line program and
// carries a one-line message that says what to do.
#pragma once
#include <stdexcept>
#include <string>

namespace contrasta {

// The input cannot be read as asked (bad file, bad number, unknown column). Exit status 3.
struct input_error : std::runtime_error {
  using std::runtime_error::runtime_error;
};

// The data were read but the analysis cannot be done as asked (a Welch contrast with a group
// of one, an unknown level in a contrast, coefficients that do not sum to zero). Exit status 4.
struct analysis_error : std::runtime_error {
  using std::runtime_error::runtime_error;
};

// A request that is malformed regardless of the data (an option value out of range). Exit 2.
struct usage_error : std::runtime_error {
  using std::runtime_error::runtime_error;
};

}  // namespace contrasta
