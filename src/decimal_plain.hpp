// The common case of a number in a data file, [-+]digits[.digits] with at most 18 digits, and
// the exact centring of two such numbers. Inline because the reader runs them once per row (a
// call each, with the general parser's frame, was a fifth of the reading time); decimal.cpp
// builds the general parser and centring on the same functions, so there is one definition.
#pragma once
#include <cstdint>
#include <string_view>

#include "contrasta/decimal.hpp"

namespace contrasta::detail {

// Powers of ten that are exact in double (up to 1e22).
inline constexpr double exact_powers_of_ten[] = {1e0,  1e1,  1e2,  1e3,  1e4,  1e5,  1e6,  1e7,
                                                 1e8,  1e9,  1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
                                                 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};

// Parses [-+]digits[.digits] (point '.' or ','), at most 18 digits, no blanks; false otherwise.
inline bool parse_plain(std::string_view text, char point, decimal& d) {
  std::size_t i = 0, n = text.size();
  if (n == 0 || n > 20) return false;
  bool negative = text[0] == '-';
  if (negative || text[0] == '+') ++i;
  std::uint64_t m = 0;
  int digits = 0, fraction = -1;
  for (; i < n; ++i) {
    char c = text[i];
    if (c >= '0' && c <= '9') {
      m = m * 10 + static_cast<std::uint64_t>(c - '0');
      ++digits;
      if (fraction >= 0) ++fraction;
    } else if (c == point && fraction < 0) {
      fraction = 0;
    } else {
      return false;
    }
  }
  if (digits == 0 || digits > 18) return false;
  d.mantissa = negative ? -static_cast<int128>(m) : static_cast<int128>(m);
  d.exponent = m == 0 ? 0 : -(fraction > 0 ? fraction : 0);
  d.exact = true;
  return true;
}

// mantissa * 10^exponent rounded once, when both operands are exact doubles (|mantissa| < 2^53,
// |exponent| <= 22): one multiplication or division rounds once. False otherwise.
inline bool small_to_double(int128 mantissa, int exponent, double& out) {
  const int128 limit = static_cast<int128>(1) << 53;
  if (!(mantissa > -limit && mantissa < limit && exponent >= -22 && exponent <= 22)) return false;
  // int64 -> double is one instruction; int128 -> double is a library call.
  const double m = static_cast<double>(static_cast<std::int64_t>(mantissa));
  out = exponent >= 0 ? m * exact_powers_of_ten[exponent] : m / exact_powers_of_ten[-exponent];
  return true;
}

// (value - reference) rounded once, in the common case: both exact and non-zero with the same
// exponent, the difference an exact double. False otherwise (then use centred_difference, which
// gives this same value whenever this succeeds).
inline bool centred_plain(const decimal& value, const decimal& reference, double& out) {
  if (!(value.exact && reference.exact && value.mantissa != 0 && reference.mantissa != 0 &&
        value.exponent == reference.exponent))
    return false;
  return small_to_double(value.mantissa - reference.mantissa, value.exponent, out);
}

// The reference of a column in the form centre_plain_text needs: set when the reference is an
// exact non-zero decimal whose mantissa fits in 64 bits.
struct plain_reference {
  bool usable = false;
  std::int64_t mantissa = 0;
  int exponent = 0;
};

inline plain_reference plain_reference_of(const decimal& reference) {
  plain_reference r;
  const int128 limit = static_cast<int128>(1) << 62;
  if (reference.exact && reference.mantissa != 0 && reference.mantissa < limit && reference.mantissa > -limit) {
    r.usable = true;
    r.mantissa = static_cast<std::int64_t>(reference.mantissa);
    r.exponent = reference.exponent;
  }
  return r;
}

// parse_plain and centred_plain fused, in 64-bit integers: true, with `out` the value
// centred_plain gives, when `text` is a plain decimal (parse_plain accepts it) with the
// reference's exponent, a non-zero mantissa and a difference below 2^53. Every other case is
// left to the general path. The digit loop is parse_plain's again on purpose: a shared helper
// returning the digits through a struct made reading 10% slower (bench_ingest, 2026-12-02:
// 163-175 against 188-196 MB/s in alternating runs).
inline bool centre_plain_text(std::string_view text, char point, const plain_reference& reference, double& out) {
  std::size_t i = 0;
  const std::size_t n = text.size();
  if (!reference.usable || n == 0 || n > 20) return false;
  const bool negative = text[0] == '-';
  if (negative || text[0] == '+') ++i;
  std::uint64_t m = 0;
  int digits = 0, fraction = -1;
  for (; i < n; ++i) {
    const char c = text[i];
    if (c >= '0' && c <= '9') {
      m = m * 10 + static_cast<std::uint64_t>(c - '0');
      ++digits;
      if (fraction >= 0) ++fraction;
    } else if (c == point && fraction < 0) {
      fraction = 0;
    } else {
      return false;
    }
  }
  // At most 18 digits: m < 10^18 < 2^60, so the difference below cannot overflow.
  if (digits == 0 || digits > 18 || m == 0 || -(fraction > 0 ? fraction : 0) != reference.exponent) return false;
  const std::int64_t value = negative ? -static_cast<std::int64_t>(m) : static_cast<std::int64_t>(m);
  const std::int64_t difference = value - reference.mantissa;
  const std::int64_t limit = std::int64_t{1} << 53;
  if (!(difference > -limit && difference < limit) || reference.exponent < -22 || reference.exponent > 22) return false;
  const double d = static_cast<double>(difference);
  out = reference.exponent >= 0 ? d * exact_powers_of_ten[reference.exponent] : d / exact_powers_of_ten[-reference.exponent];
  return true;
}

}  // namespace contrasta::detail
