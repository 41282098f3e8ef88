// The reader's fast paths (one-pass line split, packed short level names, numbers centred in
// 64-bit integers) against values worked out by hand from the exact decimal definitions.
#include "contrasta/read.hpp"

#include <doctest/doctest.h>

#include <sstream>
#include <string>
#include <vector>

#include "contrasta/error.hpp"

using namespace contrasta;

namespace {

std::vector<dataset> read_text(const std::string& text, read_request request = {}) {
  std::istringstream in(text);
  return read_datasets(in, "test", request);
}

}  // namespace

TEST_CASE("plain numbers are centred exactly on the first value; other forms take the general path") {
  // Reference 100.25 (exponent -2). 100.50 shares the exponent (fast path): 0.25. 100.5 and 99
  // do not (general path): 0.25 and -1.25. 0 has mantissa 0: -100.25. 1e2 has an exponent:
  // -0.25. "+100.30" is plain with a sign: 0.05 rounded once from the exact 5/100.
  const auto d = read_text("g,y\na,100.25\na,100.50\nb,100.5\nb,99\na,0\nb,1e2\na,+100.30\n").front();
  REQUIRE(d.values.size() == 7);
  CHECK(d.centre_text == "100.25");
  CHECK(d.levels == std::vector<std::string>{"a", "b"});
  // Level a: rows 2, 3, 6, 8; level b: rows 4, 5, 7.
  CHECK(d.group(0)[0] == 0);
  CHECK(d.group(0)[1] == 0.25);
  CHECK(d.group(0)[2] == -100.25);
  CHECK(d.group(0)[3] == 0.05);
  CHECK(d.group(1)[0] == 0.25);
  CHECK(d.group(1)[1] == -1.25);
  CHECK(d.group(1)[2] == -0.25);
  CHECK(std::vector<std::uint64_t>(d.rows.begin(), d.rows.end()) == std::vector<std::uint64_t>{2, 3, 6, 8, 4, 5, 7});
}

TEST_CASE("line ends, quotes and a missing final newline give the same records") {
  const std::string lf = "g,y\nT1,1.5\n\"T2\",2.5\nT1,\"3.5\"\nT2,4.5";
  std::string crlf;
  for (char c : lf) crlf += c == '\n' ? std::string("\r\n") : std::string(1, c);
  for (const auto& text : {lf, crlf, lf + "\n", crlf + "\r\n"}) {
    const auto d = read_text(text).front();
    REQUIRE(d.levels == std::vector<std::string>{"T1", "T2"});
    CHECK(std::vector<double>(d.values.begin(), d.values.end()) == std::vector<double>{0, 2, 1, 3});
    CHECK(std::vector<std::uint64_t>(d.rows.begin(), d.rows.end()) == std::vector<std::uint64_t>{2, 4, 3, 5});
  }
}

TEST_CASE("level names of 7 and 8 bytes, names that differ only in length, and more than 16 levels") {
  // "abcdefg" packs into the short key, "abcdefgh" does not; "T1" and "T10" must stay apart.
  std::string text = "g,y\n";
  const std::vector<std::string> names = {"abcdefg", "abcdefgh", "T1", "T10", "T", "abcdefg", "T1", "abcdefgh"};
  for (std::size_t i = 0; i < names.size(); ++i) text += names[i] + "," + std::to_string(i) + "\n";
  auto d = read_text(text).front();
  CHECK(d.levels == std::vector<std::string>{"abcdefg", "abcdefgh", "T1", "T10", "T"});
  CHECK(std::vector<double>(d.values.begin(), d.values.end()) == std::vector<double>{0, 5, 1, 7, 2, 6, 3, 4});
  // 20 levels: past 16 the reader looks names up in its hash map; the order of first
  // appearance is kept either way.
  text = "g,y\n";
  for (int round = 0; round < 3; ++round)
    for (int i = 0; i < 20; ++i) text += "L" + std::to_string((i * 7) % 20) + "," + std::to_string(round) + "\n";
  d = read_text(text).front();
  REQUIRE(d.level_count() == 20);
  for (int i = 0; i < 20; ++i) {
    CHECK(d.levels[static_cast<std::size_t>(i)] == "L" + std::to_string((i * 7) % 20));
    CHECK(d.n(static_cast<std::size_t>(i)) == 3);
  }
}

TEST_CASE("a numeric missing token and a restricted level list still apply on the fast path") {
  read_request request;
  request.missing_tokens.push_back("-99");
  request.levels = {"b", "a"};
  const auto d = read_text("g,y\na,1.5\nb,-99\nc,7.5\nb,2.5\na,-99\n", request).front();
  CHECK(d.levels == std::vector<std::string>{"b", "a"});
  CHECK(d.missing == std::vector<std::size_t>{1, 1});
  CHECK(std::vector<double>(d.values.begin(), d.values.end()) == std::vector<double>{1, 0});
  // Decimal commas with semicolons.
  read_request comma;
  comma.decimal_comma = true;
  const auto e = read_text("g;y\na;1,25\nb;2,50\n", comma).front();
  CHECK(std::vector<double>(e.values.begin(), e.values.end()) == std::vector<double>{0, 1.25});
}

TEST_CASE("a line longer than the read buffer and lines across buffer ends") {
  // Rows of 11 bytes cross the 1 MiB block boundary many times; one 3 MiB level name forces the
  // buffer to grow.
  std::string text = "g,y\n";
  for (int i = 0; i < 200000; ++i) text += "T" + std::to_string(i % 4) + "," + std::to_string(100 + i % 10) + ".125\n";
  const std::string long_name(3 << 20, 'x');
  text += long_name + ",1.5\n";
  const auto d = read_text(text).front();
  REQUIRE(d.level_count() == 5);
  CHECK(d.levels[4] == long_name);
  CHECK(d.size() == 200001);
  std::size_t wrong = 0;
  for (std::size_t level = 0; level < 4; ++level)
    for (std::size_t j = 0; j < d.n(level); ++j) {
      // Row 2 + i holds 100 + i % 10 + 0.125 in level i % 4; the centre is 100.125.
      const std::uint64_t i = d.group_rows(level)[j] - 2;
      wrong += d.group(level)[j] != static_cast<double>(i % 10) || i % 4 != level;
    }
  CHECK(wrong == 0);
  CHECK(d.group(4)[0] == 1.5 - 100.125);
}

TEST_CASE("errors keep their line and column") {
  CHECK_THROWS_WITH_AS(read_text("g,y\na,1\nb,2\nb,x\n"), doctest::Contains("line 4, column 2"), input_error);
  CHECK_THROWS_WITH_AS(read_text("g,y\na,1\nb,2,3\n"), doctest::Contains("line 3: 3 fields"), input_error);
  CHECK_THROWS_WITH_AS(read_text("g,y\na,1\n,2\n"), doctest::Contains("line 3, column 1"), input_error);
}
