// Resampling inference for contrasts: permutation tests (exact enumeration or Monte Carlo) and
// the bootstrap, for one contrast at a time or jointly for a family (the max-T step builds on
// the joint interface).
//
// Reproducibility: the work is cut into fixed blocks of resamples (or of arrangements), each
// block draws from its own pcg32 stream derived from (options.seed, block index), and results
// are combined in block order. The same seed therefore gives bit-identical results for any
// options.threads.
#pragma once
#include <cstdint>
#include <span>
#include <vector>

#include "contrasta/contrast.hpp"
#include "contrasta/options.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/result.hpp"

namespace contrasta {

// Reassigns the observations of the levels with c_i != 0, keeping group sizes; statistic per
// options.statistic (studentized Welch t by default). Exact when the arrangements are few
// (options.exact, options.max_arrangements), Monte Carlo otherwise with p = (b+1)/(m+1)
// (Phipson & Smyth 2010) and a 99% Clopper-Pearson interval in p_interval. Works on any
// prepared data (ties allowed, e.g. mid-ranks). Coefficients must sum to zero. The result has
// no confidence interval (ci_low/ci_high NaN): a test of equal distributions gives none unless
// inverted under a shift model, which the method does not assume; a note says so.
method_result permutation_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

// Resamples with replacement within each level; interval per options.interval (percentile,
// BCa, studentized bootstrap-t); p-value from the bootstrap-t distribution of
// (psi* - psi)/SE* against psi/SE (Hall & Wilson 1991), p = (b+1)/(m+1).
method_result bootstrap_contrast(const prepared_data& p, const contrast& c, const analysis_options& o);

// ---------------------------------------------------------------------------------------------
// Joint resampling of a family: one pass of resamples evaluates every contrast at once.
//
// `statistics` is resample-major: row r (one resample or one arrangement) holds the m
// statistics of the m contrasts, statistics[r * m + j] for contrast j, in the order the
// contrasts were given. Each row is one draw from the joint null distribution; with
// `exact` true the rows are every distinct reassignment, each of weight 1/resamples.
// Statistics are signed (two-sided max-T uses their absolute values); a statistic that is
// undefined in some resample (a zero standard error with a zero difference) is 0, and a zero
// standard error with a non-zero difference gives +-infinity.
struct joint_resampling {
  std::vector<double> observed;    // m observed statistics, same definition as the rows
  std::vector<double> statistics;  // resamples * m values, resample-major
  std::uint64_t resamples = 0;     // number of rows
  bool exact = false;              // rows enumerate every reassignment
  std::uint64_t seed = 0;          // the seed used (Monte Carlo)

  std::size_t contrast_count() const { return observed.size(); }
  std::span<const double> row(std::uint64_t r) const {
    return {statistics.data() + r * observed.size(), observed.size()};
  }
};

// Permutation null of the whole family: the observations of the union of levels involved in
// any contrast are reassigned at random keeping group sizes (levels outside the union stay
// out), and every contrast's Welch t (or raw psi with options.statistic == raw) is computed on
// the same reassignment (Westfall & Young 1993). Exact enumeration when the number of
// reassignments is at most min(options.max_arrangements, options.resamples) (or
// options.exact == always and it is at most options.max_arrangements), so that storage stays
// within resamples * m doubles; Monte Carlo with options.resamples rows otherwise.
// Every contrast must have coefficients summing to zero.
joint_resampling joint_permutation_statistics(const prepared_data& p, std::span<const contrast> family,
                                              const analysis_options& o);

// Bootstrap null of the family: each level is resampled with replacement within itself, and
// every contrast's centred studentized statistic (psi* - psi) / SE* (Welch SE of the resample)
// is computed on the same resample; observed = psi / SE. options.resamples rows.
joint_resampling joint_bootstrap_statistics(const prepared_data& p, std::span<const contrast> family,
                                            const analysis_options& o);

// Number of distinct reassignments of the observations of the given group sizes among the
// groups (the multinomial coefficient N! / prod n_i!), saturated at UINT64_MAX.
std::uint64_t arrangement_count(std::span<const std::size_t> sizes);

}  // namespace contrasta
