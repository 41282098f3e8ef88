// Seeded completely randomised plans with a portable shuffle.
#include "contrasta/layout.hpp"

#include <limits>
#include <set>
#include <utility>

#include "contrasta/error.hpp"

namespace contrasta {

std::uint32_t bounded_integer(pcg32& engine, std::uint32_t bound) {
  // Lemire 2019, algorithm 5: the high 32 bits of x * bound are uniform on [0, bound) once the
  // few low products below 2^32 mod bound are rejected.
  std::uint64_t product = static_cast<std::uint64_t>(engine()) * bound;
  auto low = static_cast<std::uint32_t>(product);
  if (low < bound) {
    const std::uint32_t threshold = static_cast<std::uint32_t>(-bound) % bound;  // 2^32 mod bound
    while (low < threshold) {
      product = static_cast<std::uint64_t>(engine()) * bound;
      low = static_cast<std::uint32_t>(product);
    }
  }
  return static_cast<std::uint32_t>(product >> 32);
}

void shuffle_indices(std::span<std::size_t> items, pcg32& engine) {
  for (std::size_t i = items.size(); i > 1; --i) {
    const std::size_t j = bounded_integer(engine, static_cast<std::uint32_t>(i));
    std::swap(items[i - 1], items[j]);
  }
}

namespace {
// Far above any field or panel trial, and small enough that a plan always fits in memory.
constexpr std::size_t largest_layout = 100'000'000;
}  // namespace

void check_layout_design(const layout_design& design) {
  if (design.treatments.empty()) throw usage_error("give the treatments, for example --treatments a,b,c");
  if (design.replicates.size() != design.treatments.size())
    throw usage_error("give one replicate count per treatment, for example --replicates \"a=4,b=6,c=4\"");
  std::set<std::string> seen;
  std::size_t total = 0;
  for (std::size_t i = 0; i < design.treatments.size(); ++i) {
    const std::string& name = design.treatments[i];
    if (name.empty()) throw usage_error("a treatment name is empty; check the commas in --treatments");
    if (!seen.insert(name).second) throw usage_error("treatment '" + name + "' is listed twice");
    if (design.replicates[i] == 0) throw usage_error("treatment '" + name + "' needs at least one replicate");
    if (design.replicates[i] > largest_layout - total)
      throw usage_error("the plan has more than " + std::to_string(largest_layout) + " units; give fewer in all");
    total += design.replicates[i];
  }
  if (!design.unit_labels.empty() && design.unit_labels.size() != total)
    throw usage_error("the unit file lists " + std::to_string(design.unit_labels.size()) +
                      " units but the design needs " + std::to_string(total) +
                      "; list one unit per line, as many as the replicates add up to");
}

layout_plan randomise_layout(const layout_design& design) {
  check_layout_design(design);
  layout_plan plan;
  plan.design = design;
  for (std::size_t t = 0; t < design.treatments.size(); ++t)
    plan.treatment_of_unit.insert(plan.treatment_of_unit.end(), design.replicates[t], t);
  pcg32 engine(design.seed, layout_stream);
  shuffle_indices(plan.treatment_of_unit, engine);
  return plan;
}

}  // namespace contrasta
