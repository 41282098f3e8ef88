// Timing of the robust and rank methods on large two-level designs. Prints one line per
// workload: name, n per level, median seconds over the repetitions. bench/robust_rank.py runs
// scipy on the same data in the same run and prints the ratios.
// Usage: bench_robust_rank [DATA.csv from robust_rank.py]  (two columns: level, value)
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "contrasta/prepared.hpp"
#include "contrasta/rank.hpp"
#include "contrasta/robust.hpp"

using namespace contrasta;

namespace {
template <class F>
double median_seconds(F&& f, int repetitions) {
  std::vector<double> t;
  for (int i = 0; i < repetitions; ++i) {
    const auto start = std::chrono::steady_clock::now();
    f();
    t.push_back(std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count());
  }
  std::sort(t.begin(), t.end());
  return t[t.size() / 2];
}
}  // namespace

int main(int argc, char** argv) {
  if (argc < 2) {
    std::fprintf(stderr, "usage: bench_robust_rank DATA.csv (written by bench/robust_rank.py)\n");
    return 2;
  }
  std::ifstream in(argv[1]);
  std::vector<double> a, b;
  std::string line;
  while (std::getline(in, line)) {
    const auto comma = line.find(',');
    if (comma == std::string::npos) continue;
    (line.substr(0, comma) == "a" ? a : b).push_back(std::stod(line.substr(comma + 1)));
  }
  const prepared_data p = prepare(make_dataset({"a", "b"}, {a, b}));
  const contrast c{"a - b", {1, -1}, "a - b"};
  const analysis_options o;
  double sink = 0;
  const double mw = median_seconds([&] { sink += mann_whitney_contrast(p, c, o).estimate; }, 5);
  const double bm = median_seconds([&] { sink += brunner_munzel_contrast(p, c, o).statistic; }, 5);
  // The trimmed means come from the summaries, so the timing includes preparing them.
  const double yt = median_seconds(
      [&] {
        sink += trimmed_contrast(prepare(make_dataset({"a", "b"}, {a, b})), c, o).statistic;
      },
      5);
  std::printf("mann-whitney+hodges-lehmann %zu %.6f\n", a.size(), mw);
  std::printf("brunner-munzel %zu %.6f\n", a.size(), bm);
  std::printf("trimmed(with-summaries) %zu %.6f\n", a.size(), yt);
  const double ys = median_seconds([&] { sink += trimmed_contrast(p, c, o).statistic; }, 5);
  std::printf("trimmed(step-only) %zu %.6f\n", a.size(), ys);
  std::fprintf(stderr, "(checksum %g)\n", sink);
  return 0;
}
