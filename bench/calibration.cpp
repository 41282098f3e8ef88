// Speed of the calibration simulation (check --calibrate): simulated datasets per second for the
// closed-form methods and for every method of the build, on 1 and 2 threads, and the check that
// the result does not depend on the thread count.
#include <chrono>
#include <cstdio>
#include <string>
#include <vector>

#include "contrasta/calibrate.hpp"
#include "contrasta/methods.hpp"

using namespace contrasta;

namespace {

double seconds_of(const calibration_request& request, const prepared_data& p, unsigned threads,
                  calibration_report& out) {
  analysis_options o;
  o.seed = 20261201;
  o.threads = threads;
  const auto start = std::chrono::steady_clock::now();
  out = calibrate(p, request, o);
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

std::vector<double> sample(std::size_t n, double mean, double sd, unsigned salt) {
  std::vector<double> x;
  for (std::size_t i = 0; i < n; ++i)
    x.push_back(mean + sd * (static_cast<double>((i * 7919 + salt) % 101) / 50.0 - 1.0));
  return x;
}

}  // namespace

int main() {
  // The design (n = 5, 20; SDs 4, 1) and a four-level unbalanced design like the demo trial.
  const auto two = prepare(make_dataset({"small", "large"}, {sample(5, 0, 4, 1), sample(20, 0, 1, 2)}));
  const auto four = prepare(make_dataset({"a", "b", "c", "d"}, {sample(12, 47, 3, 3), sample(8, 52, 4.5, 4),
                                                                sample(6, 41, 9, 5), sample(10, 49, 3.5, 6)}));
  struct workload {
    const char* name;
    const prepared_data* p;
    std::vector<std::string> methods;
    std::size_t datasets;
  };
  const std::vector<workload> workloads = {
      {"2 levels (5, 20), pooled + welch, 2 error models", &two, {"pooled", "welch"}, 20000},
      {"4 levels (12, 8, 6, 10), 6 pairs, pooled + welch", &four, {"pooled", "welch"}, 5000},
      {"4 levels, 6 pairs, every method of this build", &four, {}, 500},
  };
  for (const auto& w : workloads) {
    calibration_request request;
    request.datasets = w.datasets;
    request.methods = w.methods;
    calibration_report one, two_threads;
    const double t1 = seconds_of(request, *w.p, 1, one);
    const double t2 = seconds_of(request, *w.p, 2, two_threads);
    bool same = one.rows.size() == two_threads.rows.size();
    for (std::size_t i = 0; same && i < one.rows.size(); ++i)
      same = one.rows[i].type1_error == two_threads.rows[i].type1_error;
    std::size_t methods = 0;
    for (const auto& r : one.rows) methods += r.model == "normal";
    const double simulated = static_cast<double>(w.datasets) * static_cast<double>(request.models.size());
    std::printf(
        "%s: %zu methods, %.0f datasets: 1 thread %.3f s (%.0f datasets/s), 2 threads %.3f s (speed-up %.2f), "
        "identical across threads: %s\n",
        w.name, methods, simulated, t1, simulated / t1, t2, t1 / t2, same ? "yes" : "NO");
    for (const auto& s : one.skipped) std::printf("    skipped %s\n", s.c_str());
  }
}
