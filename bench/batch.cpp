// P6 (quality.md): 10,000 responses x 200 rows x 4 groups, classical + Welch (+ the diagnostics
// behind the advice, Levene included) for all pairs, CSV output, under 2 s on 2 cores.
//   bench_batch [responses] [file]   writes the file first when it does not exist, then runs
//   the same steps as `contrasta compare FILE --group group --response all-numeric
//   --method pooled,welch --format csv` in process and prints the time of each step.
#include <tbb/parallel_for.h>

#include <chrono>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>

#include "cli/write_compare.hpp"
#include "contrasta/comparison.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/read.hpp"

using clock_type = std::chrono::steady_clock;
static double since(clock_type::time_point t) { return std::chrono::duration<double>(clock_type::now() - t).count(); }

int main(int argc, char** argv) {
  std::size_t responses = argc > 1 ? std::stoull(argv[1]) : 10'000;
  std::string path = argc > 2 ? argv[2] : "/tmp/contrasta_batch_" + std::to_string(responses) + ".csv";
  if (!std::filesystem::exists(path)) {
    std::mt19937_64 rng(7);
    std::normal_distribution<double> noise(0, 1);
    std::FILE* f = std::fopen(path.c_str(), "w");
    std::fprintf(f, "group");
    for (std::size_t j = 0; j < responses; ++j) std::fprintf(f, ",r%zu", j);
    std::fprintf(f, "\n");
    for (int i = 0; i < 200; ++i) {
      std::fprintf(f, "g%d", i % 4);
      for (std::size_t j = 0; j < responses; ++j)
        std::fprintf(f, ",%.3f", 10.0 + 0.2 * (i % 4) + (1.0 + 0.5 * (i % 4)) * noise(rng));
      std::fprintf(f, "\n");
    }
    std::fclose(f);
  }
  auto t0 = clock_type::now();
  contrasta::read_request request;
  request.path = path;
  request.group_column = "group";
  request.response_columns = {"all-numeric"};
  auto sets = contrasta::read_datasets(request);
  double t_read = since(t0);
  auto t1 = clock_type::now();
  contrasta::comparison_request cr;
  cr.methods = {"pooled", "welch"};
  cr.options.seed = 1;
  std::vector<contrasta::comparison> runs(sets.size());
  tbb::parallel_for(std::size_t{0}, sets.size(), [&](std::size_t i) {
    runs[i] = contrasta::run_comparison(contrasta::prepare(std::move(sets[i])), cr);
  });
  double t_analyse = since(t1);
  auto t2 = clock_type::now();
  std::ostringstream out;
  contrasta::cli::write_comparison_csv(out, runs, true);
  double t_write = since(t2);
  std::printf("batch: %zu responses x 200 rows x 4 groups, 6 pairs x {pooled, welch} + advice diagnostics: read %.3f s, "
              "analyse %.3f s, CSV %.3f s (%zu bytes), total %.3f s\n",
              runs.size(), t_read, t_analyse, t_write, out.str().size(), since(t0));
  return 0;
}
