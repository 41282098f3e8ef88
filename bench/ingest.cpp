// Ingestion and classical-contrast throughput (issue bars: >= 150 MB/s on a 10-million-row
// two-column CSV with peak memory <= 3x the numeric data; all pairs of 50 groups from 1e6
// observations, pooled and Welch, under 0.5 s).
//   bench_ingest [rows] [file]   (the file is written first when it does not exist)
#include <sys/resource.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <random>
#include <string>
#include <vector>

#include "contrasta/comparison.hpp"
#include "contrasta/diagnostics.hpp"
#include "contrasta/overall.hpp"
#include "contrasta/family.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/read.hpp"

using clock_type = std::chrono::steady_clock;

static double seconds_since(clock_type::time_point t) {
  return std::chrono::duration<double>(clock_type::now() - t).count();
}

static void write_file(const std::string& path, std::size_t rows, std::size_t levels) {
  std::mt19937_64 rng(42);
  std::normal_distribution<double> noise(0, 2.5);
  std::FILE* f = std::fopen(path.c_str(), "w");
  std::fprintf(f, "treatment,response\n");
  for (std::size_t i = 0; i < rows; ++i) {
    std::size_t g = rng() % levels;
    std::fprintf(f, "T%zu,%.3f\n", g, 100.0 + static_cast<double>(g) + noise(rng));
  }
  std::fclose(f);
}

int main(int argc, char** argv) {
  std::size_t rows = argc > 1 ? std::stoull(argv[1]) : 10'000'000;
  std::string path = argc > 2 ? argv[2] : "/tmp/contrasta_ingest_" + std::to_string(rows) + ".csv";
  if (!std::filesystem::exists(path)) write_file(path, rows, 4);
  double megabytes = static_cast<double>(std::filesystem::file_size(path)) / 1e6;
  std::vector<double> times, cpu_times;
  std::size_t n = 0;
  auto cpu_seconds = [] {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    return static_cast<double>(u.ru_utime.tv_sec + u.ru_stime.tv_sec) +
           static_cast<double>(u.ru_utime.tv_usec + u.ru_stime.tv_usec) * 1e-6;
  };
  for (int run = 0; run < 3; ++run) {
    auto t = clock_type::now();
    double c0 = cpu_seconds();
    contrasta::read_request request;
    request.path = path;
    auto sets = contrasta::read_datasets(request);
    times.push_back(seconds_since(t));
    cpu_times.push_back(cpu_seconds() - c0);
    n = sets.front().size();
  }
  std::sort(times.begin(), times.end());
  std::sort(cpu_times.begin(), cpu_times.end());
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  double peak_mb = static_cast<double>(usage.ru_maxrss) / 1024.0;
  double numeric_mb = static_cast<double>(n) * 8 / 1e6;
  std::printf("ingest: %zu rows, %.1f MB, median of 3: wall %.3f s = %.0f MB/s, CPU %.3f s = %.0f MB/s (one thread); "
              "peak RSS %.0f MB = %.2fx the numeric data (%.0f MB)\n",
              n, megabytes, times[1], megabytes / times[1], cpu_times[1], megabytes / cpu_times[1], peak_mb,
              peak_mb * 1.048576 / numeric_mb, numeric_mb);

  // All pairs of 50 groups from 1e6 observations, pooled and Welch.
  std::string path50 = "/tmp/contrasta_pairs50.csv";
  if (!std::filesystem::exists(path50)) write_file(path50, 1'000'000, 50);
  contrasta::read_request request;
  request.path = path50;
  auto sets = contrasta::read_datasets(request);
  auto t = clock_type::now();
  auto prepared = contrasta::prepare(std::move(sets.front()));
  contrasta::comparison_request cr;
  cr.methods = {"pooled", "welch"};
  cr.options.seed = 1;
  cr.effect_sizes = false;  // the bar is about the contrasts; effect sizes have their own cost
  auto result = contrasta::run_comparison(std::move(prepared), cr);
  double pairs_time = seconds_since(t);
  std::printf("all pairs of 50 groups from 1e6 observations (summaries + %zu contrasts x 2 methods): %.3f s\n",
              result.contrasts.size(), pairs_time);

  // Where the time goes: each stage on its own, one after the other (in run_comparison the
  // overall tests and the advice run side by side).
  auto stage = [](auto&& work) {
    auto t0 = clock_type::now();
    work();
    return seconds_since(t0);
  };
  contrasta::prepared_data p;
  double t_prepare = stage([&] { p = contrasta::prepare(result.prepared.data); });
  double t_overall = stage([&] { (void)contrasta::overall_tests(p); });
  double t_diagnose = stage([&] { (void)contrasta::diagnose(p); });
  std::printf("  breakdown, stage by stage: prepare %.3f s, overall tests %.3f s, diagnostics %.3f s\n", t_prepare,
              t_overall, t_diagnose);
  return 0;
}
