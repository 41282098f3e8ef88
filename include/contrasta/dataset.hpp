// A one-factor dataset for one response: levels in order and each level's observations stored
// contiguously. Observations are centred: each is (value - centre), computed exactly in decimal
// before conversion to double, so location-invariant statistics keep full precision even when
// the data share many leading digits (NIST StRD SmLs07-09).
#pragma once
#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <vector>

namespace contrasta {

struct dataset {
  std::string source;         // file name, or "-" for standard input
  std::string group_column;   // name of the factor column ("" for wide input)
  std::string response;       // name of the response column
  std::vector<std::string> levels;
  std::vector<double> values;             // centred observations, level by level
  std::vector<std::size_t> offsets;       // level i occupies [offsets[i], offsets[i+1])
  std::vector<std::uint64_t> rows;        // input line number (1 = header) of each value
  std::vector<std::size_t> missing;       // missing responses per level
  double centre = 0;                      // the exact decimal reference, as a double
  std::string centre_text;                // the reference as written in the file

  std::size_t level_count() const { return levels.size(); }
  std::size_t size() const { return values.size(); }
  std::size_t n(std::size_t level) const { return offsets[level + 1] - offsets[level]; }
  std::span<const double> group(std::size_t level) const {
    return {values.data() + offsets[level], n(level)};
  }
  std::span<const std::uint64_t> group_rows(std::size_t level) const {
    return {rows.data() + offsets[level], n(level)};
  }
  std::size_t missing_total() const;
  // Index of a level by name, or level_count() when absent.
  std::size_t find_level(const std::string& name) const;
};

// Builds a dataset from plain per-level vectors (tests, planning simulations, library users).
// The values are taken as they are (centre 0); rows are numbered in order from 2.
dataset make_dataset(std::vector<std::string> levels, const std::vector<std::vector<double>>& groups,
                     std::string response = "response");

// Keeps only the listed levels, in the listed order (the --levels option).
dataset select_levels(const dataset& data, const std::vector<std::string>& levels);

}  // namespace contrasta
