#include "contrasta/decimal.hpp"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <string>

#include "decimal_plain.hpp"

namespace contrasta {
namespace {

constexpr int max_exact_digits = 36;  // 10^36 < 2^127

bool is_digit(char c) { return c >= '0' && c <= '9'; }

struct power_table {
  int128 values[39];
  constexpr power_table() : values() {
    values[0] = 1;
    for (int i = 1; i < 39; ++i) values[i] = values[i - 1] * 10;
  }
};
constexpr power_table powers;

int128 power_of_ten(int e) { return powers.values[e]; }

std::string int128_text(int128 v) {
  bool negative = v < 0;
  uint128 u = negative ? static_cast<uint128>(-(v + 1)) + 1 : static_cast<uint128>(v);
  std::string digits;
  do {
    digits.insert(digits.begin(), static_cast<char>('0' + static_cast<int>(u % 10)));
    u /= 10;
  } while (u != 0);
  return negative ? "-" + digits : digits;
}

// mantissa * 10^exponent rounded once to the nearest double.
[[gnu::noinline]] double to_double_by_text(int128 mantissa, int exponent) {
  std::string text = int128_text(mantissa) + "e" + std::to_string(exponent);
  return std::strtod(text.c_str(), nullptr);  // correctly rounded by the C library
}

double to_double(int128 mantissa, int exponent) {
  double out;
  if (detail::small_to_double(mantissa, exponent, out)) return out;
  return to_double_by_text(mantissa, exponent);
}

}  // namespace

std::optional<decimal> parse_decimal(std::string_view text, bool decimal_comma) {
  {
    decimal quick;
    if (detail::parse_plain(text, decimal_comma ? ',' : '.', quick)) return quick;
  }
  std::size_t i = 0, n = text.size();
  while (i < n && (text[i] == ' ' || text[i] == '\t')) ++i;
  while (n > i && (text[n - 1] == ' ' || text[n - 1] == '\t')) --n;
  if (i == n) return std::nullopt;
  const std::size_t start = i;
  bool negative = false;
  if (text[i] == '+' || text[i] == '-') {
    negative = text[i] == '-';
    ++i;
  }
  const char point = decimal_comma ? ',' : '.';
  decimal d;
  int128 m = 0;
  std::uint64_t small = 0;
  int digits = 0, dropped = 0, fraction_digits = 0;
  bool any_digit = false, seen_point = false;
  for (; i < n; ++i) {
    char c = text[i];
    if (is_digit(c)) {
      any_digit = true;
      if (digits == 0 && c == '0') {
        if (seen_point) ++fraction_digits;
        continue;  // leading zeros carry no significant digit
      }
      if (digits < 18) {
        small = small * 10 + static_cast<std::uint64_t>(c - '0');  // fast path: fits in 64 bits
        ++digits;
        if (seen_point) ++fraction_digits;
      } else if (digits < max_exact_digits) {
        if (digits == 18) m = static_cast<int128>(small);
        m = m * 10 + (c - '0');
        ++digits;
        if (seen_point) ++fraction_digits;
      } else {
        if (c != '0') d.exact = false;
        if (!seen_point) ++dropped;
      }
    } else if (c == point && !seen_point) {
      seen_point = true;
    } else {
      break;
    }
  }
  if (!any_digit) return std::nullopt;
  if (digits <= 18) m = static_cast<int128>(small);
  long long exponent = 0;
  if (i < n && (text[i] == 'e' || text[i] == 'E')) {
    ++i;
    bool exp_negative = false;
    if (i < n && (text[i] == '+' || text[i] == '-')) {
      exp_negative = text[i] == '-';
      ++i;
    }
    if (i >= n || !is_digit(text[i])) return std::nullopt;
    for (; i < n && is_digit(text[i]); ++i) {
      if (exponent < 100000) exponent = exponent * 10 + (text[i] - '0');
    }
    if (exp_negative) exponent = -exponent;
  }
  if (i != n) return std::nullopt;
  exponent += dropped - fraction_digits;
  if (exponent > 100000 || exponent < -100000) {
    d.exact = m == 0;
  }
  d.mantissa = negative ? -m : m;
  d.exponent = m == 0 ? 0 : static_cast<int>(std::clamp(exponent, -100000LL, 100000LL));
  if (!d.exact) {
    std::string copy(text.substr(start, n - start));
    if (decimal_comma)
      for (char& c : copy)
        if (c == ',') c = '.';
    d.approximate = std::strtod(copy.c_str(), nullptr);
  }
  return d;
}

double to_double(const decimal& d) {
  if (!d.exact) return d.approximate;
  return d.mantissa == 0 ? 0.0 : to_double(d.mantissa, d.exponent);
}

double centred_difference(const decimal& value, const decimal& reference) {
  if (value.exact && reference.exact) {
    if (reference.mantissa == 0) return to_double(value);
    if (value.mantissa == 0) return -to_double(reference);
    if (value.exponent == reference.exponent) return to_double(value.mantissa - reference.mantissa, value.exponent);
    const int e = std::min(value.exponent, reference.exponent);
    const int shift_v = value.exponent - e, shift_r = reference.exponent - e;
    // Align both mantissas on the smaller exponent; stay exact while the result fits.
    auto fits = [](int128 m, int shift) {
      if (shift > 37) return false;
      int128 bound = power_of_ten(37 - shift);
      return m < bound && m > -bound;  // m * 10^shift stays below 10^37 < 2^127
    };
    if (fits(value.mantissa, shift_v) && fits(reference.mantissa, shift_r)) {
      int128 a = value.mantissa * power_of_ten(shift_v);
      int128 b = reference.mantissa * power_of_ten(shift_r);
      return to_double(a - b, e);
    }
  }
  return static_cast<double>(static_cast<long double>(to_double(value)) -
                             static_cast<long double>(to_double(reference)));
}

}  // namespace contrasta
