// Number formatting and aligned text tables for terminal and Markdown writers.
#pragma once
#include <ostream>
#include <string>
#include <vector>

namespace contrasta::cli {

// Fixed decimals; "n/a" for NaN, "inf" / "-inf" for infinities.
std::string fixed(double v, int decimals);
// Decimals that show a quantity to about three significant digits of its scale `scale`.
int decimals_for(double scale);
// A p-value: four decimals down to 0.001, then scientific with three digits; "<1e-300" at the floor.
std::string p_text(double p);
// About `significant` significant digits, no exponent for moderate values.
std::string general(double v, int significant = 4);

struct text_table {
  std::vector<std::string> header;
  std::vector<bool> right;  // right-align column i
  std::vector<std::vector<std::string>> rows;
  // Plain aligned columns separated by two spaces, each line prefixed by `indent`.
  void print(std::ostream& out, const std::string& indent = "  ") const;
  // A GitHub-flavoured Markdown table (cells escaped for | and newlines).
  void print_markdown(std::ostream& out) const;
};

// Display width of UTF-8 text (code points; wide characters are not special-cased).
std::size_t display_width(const std::string& s);
std::string markdown_escape(const std::string& s);

}  // namespace contrasta::cli
