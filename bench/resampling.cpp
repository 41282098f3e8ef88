// Speed of the resampling engine on the workloads of quality.md (P1-P4), and the calibration
// simulation of the studentized against the raw permutation test.
//
//   bench_resampling [--p1 FILE] [--p3 FILE] [--runs 5] [--resamples 1000000] [--calibration N]
//
// FILE holds one group per line (numbers separated by blanks); without one, the program makes
// its own data (4 groups of 50 with SDs 1, 2, 3, 4 for P1; two groups of 100 for P3). The
// script bench/resampling_vs_scipy.py writes the files, runs this program and scipy on the same
// data in the same run, and prints the ratios. Each figure is the median of --runs runs; wall
// and process CPU time are both printed, because shared machines steal time.
#include <sys/resource.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "contrasta/resample.hpp"
#include "random.hpp"
#include "resample_kernels.hpp"

using namespace contrasta;

namespace {

double cpu_seconds() {
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  return static_cast<double>(u.ru_utime.tv_sec + u.ru_stime.tv_sec) +
         1e-6 * static_cast<double>(u.ru_utime.tv_usec + u.ru_stime.tv_usec);
}

struct timing {
  double wall, cpu;
};

template <class F>
timing median_time(int runs, F&& f) {
  std::vector<double> wall, cpu;
  for (int i = 0; i < runs; ++i) {
    const double c0 = cpu_seconds();
    const auto t0 = std::chrono::steady_clock::now();
    f();
    const auto t1 = std::chrono::steady_clock::now();
    cpu.push_back(cpu_seconds() - c0);
    wall.push_back(std::chrono::duration<double>(t1 - t0).count());
  }
  std::sort(wall.begin(), wall.end());
  std::sort(cpu.begin(), cpu.end());
  return {wall[wall.size() / 2], cpu[cpu.size() / 2]};
}

std::vector<std::vector<double>> read_groups(const std::string& path) {
  std::ifstream in(path);
  if (!in) {
    std::fprintf(stderr, "error: cannot open %s\n", path.c_str());
    std::exit(2);
  }
  std::vector<std::vector<double>> groups;
  std::string line;
  while (std::getline(in, line)) {
    std::istringstream row(line);
    std::vector<double> g;
    double x;
    while (row >> x) g.push_back(x);
    if (!g.empty()) groups.push_back(g);
  }
  return groups;
}

struct normal_source {
  pcg32 rng;
  double operator()() {
    const double u1 = 1.0 - detail::uniform01(rng), u2 = detail::uniform01(rng);
    return std::sqrt(-2 * std::log(u1)) * std::cos(2 * M_PI * u2);
  }
};

prepared_data make(const std::vector<std::vector<double>>& groups) {
  std::vector<std::string> levels;
  for (std::size_t i = 0; i < groups.size(); ++i) {
    std::string name = "group ";
    name += std::to_string(i + 1);
    levels.push_back(name);
  }
  return prepare(make_dataset(levels, groups));
}

contrast make_contrast(std::vector<double> c) {
  contrast out;
  out.name = "contrast";
  out.expression = "contrast";
  out.coefficients = std::move(c);
  return out;
}

}  // namespace

int main(int argc, char** argv) {
  std::string p1_file, p3_file;
  int runs = 5, calibration = 10000;
  std::uint64_t resamples = 1'000'000;
  for (int i = 1; i < argc; ++i) {
    const std::string a = argv[i];
    auto next = [&]() -> std::string {
      if (i + 1 >= argc) {
        std::fprintf(stderr, "error: %s needs a value\n", a.c_str());
        std::exit(2);
      }
      return argv[++i];
    };
    if (a == "--p1")
      p1_file = next();
    else if (a == "--p3")
      p3_file = next();
    else if (a == "--runs")
      runs = std::stoi(next());
    else if (a == "--resamples")
      resamples = std::stoull(next());
    else if (a == "--calibration")
      calibration = std::stoi(next());
    else {
      std::fprintf(stderr, "error: unknown option %s\n", a.c_str());
      return 2;
    }
  }
  normal_source normal{detail::block_stream(20261201, 0)};
  std::printf("resampling kernels: %s\n", detail::best_kernels().level);

  // P1 and P4: studentized permutation test of one contrast, 4 groups of 50, unequal SDs.
  std::vector<std::vector<double>> p1 = p1_file.empty() ? std::vector<std::vector<double>>{} : read_groups(p1_file);
  if (p1.empty()) {
    for (double sd : {1.0, 2.0, 3.0, 4.0}) {
      std::vector<double> g(50);
      for (double& x : g) x = 10 + sd * normal();
      p1.push_back(g);
    }
  }
  const prepared_data d1 = make(p1);
  const contrast c1 = make_contrast({1, 1, -1, -1});  // (g1 + g2) - (g3 + g4)
  analysis_options o;
  o.exact = exact_mode::never;
  o.resamples = resamples;
  o.seed = 1;
  double p_value = 0;
  o.threads = 1;
  const timing one = median_time(runs, [&] { p_value = permutation_contrast(d1, c1, o).p_value; });
  o.threads = 2;
  const timing two = median_time(runs, [&] { p_value = permutation_contrast(d1, c1, o).p_value; });
  const double r = static_cast<double>(resamples);
  std::printf(
      "P1 studentized permutation, 4 x 50, %llu resamples, 2 threads: %.4f s wall (%.4f us per resample), "
      "%.4f s cpu, p = %.6g\n",
      static_cast<unsigned long long>(resamples), two.wall, 1e6 * two.wall / r, two.cpu, p_value);
  std::printf("P1-1thread: %.4f s wall (%.4f us per resample), %.4f s cpu\n", one.wall, 1e6 * one.wall / r, one.cpu);
  std::printf("P4 thread scaling (1 thread / 2 threads, wall): %.3fx\n", one.wall / two.wall);

  // P2: exact 15 vs 15, Welch statistic, 2 threads.
  std::vector<double> a(15), b(15);
  for (double& x : a) x = normal();
  for (double& x : b) x = 0.4 + 2 * normal();
  const prepared_data d2 = make({a, b});
  analysis_options e;
  e.exact = exact_mode::always;
  e.threads = 2;
  std::uint64_t arrangements = 0;
  const timing exact = median_time(std::max(1, runs / 2), [&] {
    const method_result m = permutation_contrast(d2, make_contrast({1, -1}), e);
    p_value = m.p_value;
    arrangements = m.resamples.value();
  });
  std::printf("P2 exact 15 vs 15 (%llu reassignments), Welch t, 2 threads: %.4f s wall, %.4f s cpu, p = %.9g\n",
              static_cast<unsigned long long>(arrangements), exact.wall, exact.cpu, p_value);

  // P3: BCa interval of a two-group mean difference, n = 100 each, 1e5 resamples.
  std::vector<std::vector<double>> p3 = p3_file.empty() ? std::vector<std::vector<double>>{} : read_groups(p3_file);
  if (p3.empty()) {
    for (double sd : {1.0, 1.5}) {
      std::vector<double> g(100);
      for (double& x : g) x = std::exp(sd * 0.5 * normal());
      p3.push_back(g);
    }
  }
  const prepared_data d3 = make(p3);
  analysis_options bo;
  bo.resamples = 100'000;
  bo.interval = bootstrap_interval::bca;
  bo.seed = 1;
  method_result bca;
  bo.threads = 2;
  const timing boot = median_time(runs, [&] { bca = bootstrap_contrast(d3, make_contrast({1, -1}), bo); });
  bo.threads = 1;
  const timing boot1 = median_time(runs, [&] { bca = bootstrap_contrast(d3, make_contrast({1, -1}), bo); });
  std::printf(
      "P3 BCa bootstrap, 100 vs 100, 100000 resamples, 2 threads: %.4f s wall (%.4f us per resample), "
      "%.4f s cpu, interval [%.6g, %.6g]\n",
      boot.wall, 1e6 * boot.wall / 1e5, boot.cpu, bca.ci_low, bca.ci_high);
  std::printf("P3-1thread: %.4f s wall (%.4f us per resample), %.4f s cpu\n", boot1.wall, 1e6 * boot1.wall / 1e5,
              boot1.cpu);

  // Calibration: n = (8, 24), SDs 4 and 1 (the larger in the smaller group), equal means,
  // 999 reassignments per dataset, alpha = 0.05.
  if (calibration > 0) {
    analysis_options co;
    co.exact = exact_mode::never;
    co.resamples = 999;
    co.threads = 2;
    int student = 0, raw = 0;
    for (int i = 0; i < calibration; ++i) {
      std::vector<double> s(8), l(24);
      for (double& x : s) x = 4 * normal();
      for (double& x : l) x = normal();
      const prepared_data d = make({s, l});
      co.seed = static_cast<std::uint64_t>(i);
      co.statistic = permutation_statistic::studentized;
      student += permutation_contrast(d, make_contrast({1, -1}), co).p_value <= 0.05;
      co.statistic = permutation_statistic::raw;
      raw += permutation_contrast(d, make_contrast({1, -1}), co).p_value <= 0.05;
    }
    const double n = calibration;
    std::printf(
        "calibration n = (8, 24), SD (4, 1), %d datasets, alpha 0.05: studentized %.4f, raw %.4f "
        "(binomial 99%% band of 0.05: +-%.4f)\n",
        calibration, student / n, raw / n, 2.576 * std::sqrt(0.05 * 0.95 / n));
  }
  return 0;
}
