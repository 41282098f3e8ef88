// Cost of the diagnostics, overall tests and recommendation per response: `compare` runs the
// recommendation for every response of a batch, so this bounds its share of batch workloads
// (quality.md P6: 10,000 responses x 200 rows x 4 groups).
#include "contrasta/diagnostics.hpp"

#include <chrono>
#include <cstdio>
#include <vector>

#include "contrasta/overall.hpp"
#include "contrasta/recommend.hpp"

using namespace contrasta;

int main() {
  std::vector<std::vector<double>> groups(4);
  std::uint64_t state = 12345;
  auto next = [&] {  // a fixed linear congruential sequence: reproducible data without a library
    state = state * 6364136223846793005ULL + 1442695040888963407ULL;
    return static_cast<double>(state >> 11) * 0x1.0p-53;
  };
  for (std::size_t g = 0; g < 4; ++g)
    for (int i = 0; i < 50; ++i)
      groups[g].push_back(10 + static_cast<double>(g) +
                          (next() + next() + next() - 1.5) * (1 + static_cast<double>(g)));
  const auto p = prepare(make_dataset({"a", "b", "c", "d"}, groups));
  const analysis_options o;
  (void)recommend(p, o);  // first call probes the methods of the build once
  const int repeats = 2000;
  auto time = [&](const char* what, auto&& f) {
    const auto start = std::chrono::steady_clock::now();
    for (int i = 0; i < repeats; ++i) f();
    const double us =
        std::chrono::duration<double, std::micro>(std::chrono::steady_clock::now() - start).count() / repeats;
    std::printf("%-40s %8.1f microseconds per response (200 rows, 4 levels)\n", what, us);
  };
  time("overall_tests", [&] { (void)overall_tests(p); });
  time("diagnose", [&] { (void)diagnose(p); });
  time("recommend (diagnose + rules)", [&] { (void)recommend(p, o); });
}
