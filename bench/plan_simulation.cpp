// Analytic power of planned contrasts against the simulated rejection rate of contrasta's own
// pooled and Welch tests (run_method), over a grid of designs, and the speed of the analytic
// calculations. Prints a Markdown table for bench/RESULTS.md.
//   bench_plan_simulation [simulations per design, default 20000]
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <vector>

#include "contrasta/plan.hpp"

using namespace contrasta;

namespace {

struct design_case {
  const char* label;
  std::vector<double> c, means, sds;
  std::vector<std::size_t> n;
};

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

}  // namespace

int main(int argc, char** argv) {
  const std::uint64_t simulations = argc > 1 ? std::strtoull(argv[1], nullptr, 10) : 20000;
  const std::vector<design_case> cases = {
      {"pair, equal SD, n 8/8", {1, -1}, {11, 10}, {1.5, 1.5}, {8, 8}},
      {"pair, equal SD, n 20/20", {1, -1}, {10.6, 10}, {1, 1}, {20, 20}},
      {"3 levels, a - (b+c)/2, equal SD", {1, -0.5, -0.5}, {12, 10.5, 10.8}, {2, 2, 2}, {10, 8, 8}},
      {"4 levels, trend -3,-1,1,3", {-3, -1, 1, 3}, {10, 10.4, 10.9, 11.2}, {1, 1, 1, 1}, {6, 6, 6, 6}},
      {"pair, SD 1 vs 3, n 12/6", {1, -1}, {10, 12}, {1, 3}, {12, 6}},
      {"3 levels, SD 1,2,4, n 10,10,5", {1, -0.5, -0.5}, {10, 11, 12}, {1, 2, 4}, {10, 10, 5}},
  };
  std::printf("| design | test | analytic power | simulated power | 99%% interval | inside |\n");
  std::printf("| --- | --- | ---: | ---: | --- | --- |\n");
  std::uint64_t seed = 20261201;
  for (const auto& d : cases) {
    for (planned_test test : {planned_test::pooled, planned_test::welch}) {
      power_request r;
      r.test = test;
      const contrast_power analytic = power_of_contrast(d.c, d.means, d.sds, d.n, r);
      const simulated_power sim = simulate_power(d.c, d.means, d.sds, d.n, r, simulations, seed++);
      const bool inside = sim.low <= analytic.power && analytic.power <= sim.high;
      std::printf("| %s | %s | %.4f | %.4f | [%.4f, %.4f] | %s |\n", d.label, to_string(test).c_str(), analytic.power,
                  sim.power, sim.low, sim.high, inside ? "yes" : "no");
    }
  }

  // Speed of the analytic side: power evaluations and sample-size searches per second.
  const std::vector<double> c = {1, -0.5, -0.5}, means = {12, 10.5, 10.8}, sds = {2, 2.5, 3}, ratios = {2, 1, 1};
  const std::vector<std::size_t> n = {20, 10, 10};
  power_request welch;
  welch.test = planned_test::welch;
  auto start = std::chrono::steady_clock::now();
  double sink = 0;
  const int evaluations = 20000;
  for (int i = 0; i < evaluations; ++i) sink += power_of_contrast(c, means, sds, n, welch).power;
  const double per_power = seconds_since(start) / evaluations;
  start = std::chrono::steady_clock::now();
  const int searches = 200;
  for (int i = 0; i < searches; ++i) sink += static_cast<double>(smallest_sample_size(c, means, sds, ratios, welch, 0.9).base);
  const double per_search = seconds_since(start) / searches;
  start = std::chrono::steady_clock::now();
  for (int i = 0; i < searches; ++i) sink += detectable_contrast(c, sds, n, welch, 0.8);
  const double per_detectable = seconds_since(start) / searches;
  std::printf("\nanalytic Welch power: %.1f us per evaluation; smallest n search: %.2f ms; detectable contrast: %.2f ms "
              "(checksum %.3f)\n",
              per_power * 1e6, per_search * 1e3, per_detectable * 1e3, sink);
  return 0;
}
