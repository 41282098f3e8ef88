// Exact decimal numbers as written in data files. A response column is centred on an exact
// decimal reference before anything is converted to double: (value - reference) is computed in
// integer arithmetic and rounded once.
#pragma once
#include <cstdint>
#include <optional>
#include <string_view>

namespace contrasta {

__extension__ using int128 = __int128;
__extension__ using uint128 = unsigned __int128;

// value = mantissa * 10^exponent, exactly. Up to 36 significant digits are kept exactly; longer
// mantissas fall back to a correctly rounded double in `approximate`.
struct decimal {
  int128 mantissa = 0;
  int exponent = 0;
  bool exact = true;          // false when the digits did not fit and `approximate` is used
  double approximate = 0;     // the nearest double; set only when !exact (see to_double)
};

// The value rounded once to the nearest double.
double to_double(const decimal& d);

// Parses a decimal number: optional sign, digits with an optional point (or comma when
// decimal_comma), optional exponent (e/E). Leading and trailing blanks are allowed.
// Returns nothing for anything else, including inf and nan spellings.
std::optional<decimal> parse_decimal(std::string_view text, bool decimal_comma = false);

// (value - reference) rounded once to the nearest double.
double centred_difference(const decimal& value, const decimal& reference);

}  // namespace contrasta
