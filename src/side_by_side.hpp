// Independent pieces of one analysis run side by side on large data and one after the other on
// small data, where handing work to another thread costs more than the work (batch mode runs
// thousands of small analyses, already in parallel over responses). Each piece writes only its
// own result, so the output is the same either way.
#pragma once
#include <tbb/parallel_invoke.h>

#include <cstddef>

namespace contrasta::detail {

// Observations from which splitting one analysis across threads pays.
constexpr std::size_t side_by_side_from = std::size_t{1} << 15;

template <class... Work>
void side_by_side(std::size_t observations, Work&&... work) {
  if (observations >= side_by_side_from)
    tbb::parallel_invoke(work...);
  else
    (work(), ...);
}

}  // namespace contrasta::detail
