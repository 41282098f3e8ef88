// Monte Carlo p-values from resampling counts.
#pragma once
#include <array>
#include <cstdint>

namespace contrasta::detail {

// p = (b + 1) / (m + 1) for b of m random resamples at least as extreme as the observed data:
// never zero, and exact-valid for random permutations (Phipson & Smyth 2010, Stat. Appl. Genet.
// Mol. Biol. 9:39, eq. 2 with the observed arrangement counted once).
double phipson_smyth_p(std::uint64_t b, std::uint64_t m);

// Clopper-Pearson interval at `level` (default 99%) for the proportion that b of m estimates
// (Clopper & Pearson 1934, Biometrika 26:404-413): [Beta_{a/2}(b, m-b+1), Beta_{1-a/2}(b+1, m-b)],
// with 0 and 1 at the ends when b = 0 or b = m.
std::array<double, 2> clopper_pearson(std::uint64_t b, std::uint64_t m, double level = 0.99);

}  // namespace contrasta::detail
