// A seeded randomisation plan for a completely randomised design: every arrangement of the
// treatments over the units is equally likely, and the same seed gives the same plan on every
// machine and standard library.
#pragma once
#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <vector>

#include <pcg_random.hpp>

namespace contrasta {

struct layout_design {
  std::vector<std::string> treatments;
  std::vector<std::size_t> replicates;   // one per treatment
  std::vector<std::string> unit_labels;  // empty: units are numbered 1..N; else exactly N labels
  std::uint64_t seed = 0;
};

struct layout_plan {
  layout_design design;
  // treatment_of_unit[u] is the index (into design.treatments) of the treatment unit u + 1
  // receives; units are in run order.
  std::vector<std::size_t> treatment_of_unit;

  std::size_t units() const { return treatment_of_unit.size(); }
};

// Checks the design (at least one treatment, names unique and non-empty, every replicate count
// positive, labels matching the number of units) and throws usage_error otherwise.
void check_layout_design(const layout_design& design);

// The plan: the treatments written out in order (a a a b b b ...) and then shuffled by
// Fisher-Yates (Durstenfeld 1964) with a pcg32 stream (O'Neill 2014) seeded by design.seed on
// stream `layout_stream`, and bounded integers by Lemire's method (Lemire 2019, ACM TOMACS 29:3).
layout_plan randomise_layout(const layout_design& design);

inline constexpr std::uint64_t layout_stream = 0x6c61796f7574ULL;  // "layout"

// A uniform integer in [0, bound) from a pcg32 stream, by Lemire's nearly divisionless method:
// the same on every machine (unlike std::uniform_int_distribution, whose algorithm the standard
// leaves open). bound must be positive.
std::uint32_t bounded_integer(pcg32& engine, std::uint32_t bound);

// Fisher-Yates: for i = n-1 down to 1, swap element i with a uniform element of [0, i].
void shuffle_indices(std::span<std::size_t> items, pcg32& engine);

}  // namespace contrasta
