// Reading long-format (one row per observation) and wide-format (one column per level)
// delimited text files into datasets, one dataset per response column.
#pragma once
#include <istream>
#include <optional>
#include <string>
#include <vector>

#include "contrasta/dataset.hpp"

namespace contrasta {

struct read_request {
  std::string path = "-";                     // "-" reads standard input
  std::optional<char> delimiter;              // detected from the header line when empty
  bool decimal_comma = false;                 // numbers written as 12,5
  std::string group_column;                   // empty: the first of two columns
  std::vector<std::string> response_columns;  // empty: the second of two; {"all-numeric"}: all
  std::vector<std::string> levels;            // keep and order these levels (empty: all)
  std::vector<std::string> missing_tokens = {"", "NA", "NaN", "."};
  bool wide = false;                          // one column per level
};

// Reads the file named in the request. Throws input_error with file, line and column on any
// problem in the data.
std::vector<dataset> read_datasets(const read_request& request);

// The same from an already open stream; `source` names it in messages.
std::vector<dataset> read_datasets(std::istream& in, const std::string& source,
                                   const read_request& request);

}  // namespace contrasta
