// Mid-ranks over several samples taken together, and the tie correction that goes with them;
// shared by the Fligner-Killeen and Kruskal-Wallis tests and the description of ties. Each
// sample comes already in ascending order (prepare sorts every level once), so the pooled
// order is a k-way merge, O(N log k), rather than a sort of all N values.
#pragma once
#include <cstddef>
#include <span>
#include <utility>
#include <vector>

namespace contrasta::detail {

// Where an observation sits: sample `run`, index `position` within that sorted sample.
struct run_position {
  std::size_t run = 0, position = 0;
};

// Walks the samples (each sorted ascending) as one pooled sample in ascending order, one block
// of equal values at a time: visit(first, members), where the block holds the 0-based pooled
// positions first .. first + members.size() - 1, that is the ranks first + 1 .. first + size, and
// `members` says where each of its values sits. Blocks come in increasing order of value.
template <class Runs, class Visit>
void for_each_tie_block(const Runs& runs, Visit&& visit) {
  struct head {
    double value;
    std::size_t run, position;
  };
  // A binary min-heap of the next value of every sample (ties broken by sample, so the walk is
  // the same on every machine).
  std::vector<head> heap;
  for (std::size_t r = 0; r < runs.size(); ++r)
    if (!runs[r].empty()) heap.push_back({runs[r][0], r, 0});
  auto before = [](const head& a, const head& b) { return a.value < b.value || (a.value == b.value && a.run < b.run); };
  auto sift_down = [&](std::size_t i) {
    const std::size_t n = heap.size();
    const head moving = heap[i];
    for (;;) {
      std::size_t child = 2 * i + 1;
      if (child >= n) break;
      if (child + 1 < n && before(heap[child + 1], heap[child])) ++child;
      if (!before(heap[child], moving)) break;
      heap[i] = heap[child];
      i = child;
    }
    heap[i] = moving;
  };
  for (std::size_t i = heap.size() / 2; i-- > 0;) sift_down(i);

  std::vector<run_position> members;
  std::size_t first = 0;
  double block_value = 0;
  while (!heap.empty()) {
    head& top = heap[0];
    if (!members.empty() && top.value != block_value) {
      visit(first, std::span<const run_position>(members));
      first += members.size();
      members.clear();
    }
    block_value = top.value;
    members.push_back({top.run, top.position});
    const auto& run = runs[top.run];
    if (top.position + 1 < run.size()) {
      ++top.position;
      top.value = run[top.position];
    } else {
      heap[0] = heap.back();
      heap.pop_back();
    }
    if (!heap.empty()) sift_down(0);
  }
  if (!members.empty()) visit(first, std::span<const run_position>(members));
}

// The mid-rank of a block at pooled positions [first, first + size): the mean of the ranks
// first + 1 .. first + size.
inline double block_midrank(std::size_t first, std::size_t size) {
  return 0.5 * static_cast<double>(2 * first + 1 + size);
}

// The block's term t^3 - t of the tie correction.
inline double block_tie_term(std::size_t size) {
  const double t = static_cast<double>(size);
  return t * t * t - t;
}

}  // namespace contrasta::detail
