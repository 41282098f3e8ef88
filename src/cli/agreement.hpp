// The method-agreement table: every contrast under every method that ran, with the conclusion
// at alpha, so that a reader sees at once whether a finding depends on the method. Used by the
// terminal table (compare --method all), the HTML report and the Markdown report.
#pragma once
#include <ostream>
#include <string>
#include <vector>

#include "contrasta/comparison.hpp"

namespace contrasta::cli {

struct agreement_cell {
  bool available = false;  // the method ran on this contrast and gave a p-value
  double p = 0;            // adjusted p-value (equals the raw one with no adjustment)
  double estimate = 0;
  bool below_alpha = false;  // the method's conclusion: a difference at alpha
};

enum class agreement_verdict {
  all_find,     // every available method finds a difference at alpha
  none_find,    // no available method does
  split,        // some do and some do not: the finding depends on the method
  unavailable,  // no method gave a p-value
};

struct agreement_row {
  std::string contrast;
  std::vector<agreement_cell> cells;  // one per method of the table, in table order
  std::size_t finding = 0;            // methods below alpha
  std::size_t available = 0;          // methods with a p-value
  agreement_verdict verdict = agreement_verdict::unavailable;
};

struct agreement_table {
  std::vector<std::string> methods;         // methods with a p-value for at least one contrast
  std::vector<std::string> without_result;  // methods that ran but gave no p-value anywhere
  std::vector<agreement_row> rows;
  double alpha = 0.05;
  std::string adjust = "none";  // which p-values the conclusions use
  std::size_t split_rows = 0;   // contrasts whose conclusion depends on the method
};

// Reads the conclusions off the comparison (the p-values are the family step's, adjusted when
// an adjustment ran); compares them with alpha and nothing else.
agreement_table method_agreement(const comparison& result, double alpha);

// Short words for a verdict ("all agree: difference", "DEPENDS ON METHOD", ...).
std::string verdict_words(agreement_verdict v);

// The table as aligned plain text for the terminal, with a legend line.
void write_agreement_text(std::ostream& out, const agreement_table& table);
inline void write_agreement_text(std::ostream& out, const comparison& result, double alpha) {
  write_agreement_text(out, method_agreement(result, alpha));
}

}  // namespace contrasta::cli
