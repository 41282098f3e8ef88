// Exact decimal parsing and centring. The reference for a correctly rounded difference is the
// exact rational value rounded once (IEEE 754 round-to-nearest; common practice), computed here
// by hand for the cases shown.
#include <doctest/doctest.h>

#include <cmath>

#include "contrasta/decimal.hpp"

using namespace contrasta;

TEST_CASE("decimal text parses exactly") {
  auto d = parse_decimal("1000000000000.4");
  REQUIRE(d);
  CHECK(d->exact);
  CHECK(d->mantissa == 10000000000004);
  CHECK(d->exponent == -1);
  CHECK(to_double(*parse_decimal("-0.05")) == -0.05);
  CHECK(to_double(*parse_decimal("+12.50e2")) == 1250.0);
  CHECK(to_double(*parse_decimal("12,5", true)) == 12.5);
  CHECK(to_double(*parse_decimal("  3.25 ")) == 3.25);
  CHECK(to_double(*parse_decimal("1e-320")) > 0);  // subnormal, still finite
  CHECK_FALSE(parse_decimal("12,5"));
  CHECK_FALSE(parse_decimal("inf"));
  CHECK_FALSE(parse_decimal("nan"));
  CHECK_FALSE(parse_decimal("1.2.3"));
  CHECK_FALSE(parse_decimal("e5"));
  CHECK_FALSE(parse_decimal("."));
  CHECK_FALSE(parse_decimal(""));
  CHECK_FALSE(parse_decimal("0x10"));
  CHECK(std::isinf(to_double(*parse_decimal("1e400"))));
}

TEST_CASE("centring keeps the digits that a plain double parse loses") {
  // 1000000000000.4 - 1000000000000.3 = 0.1 exactly in decimal; in double the two values are
  // 1000000000000.4000244... and 1000000000000.2999878..., whose difference is 0.10003662...
  auto a = *parse_decimal("1000000000000.4"), b = *parse_decimal("1000000000000.3");
  CHECK(centred_difference(a, b) == 0.1);
  CHECK(std::abs((1000000000000.4 - 1000000000000.3) - 0.1) > 1e-5);
  // Different exponents align exactly: 12.5 - 0.0025 = 12.4975.
  CHECK(centred_difference(*parse_decimal("12.5"), *parse_decimal("0.0025")) == 12.4975);
  // 36 significant digits stay exact.
  auto big = *parse_decimal("123456789012345678901234567890.123456");
  auto near = *parse_decimal("123456789012345678901234567890.123455");
  CHECK(big.exact);
  CHECK(centred_difference(big, near) == 1e-6);
}
