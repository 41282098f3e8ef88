#include "resample_core.hpp"

#include <tbb/blocked_range.h>
#include <tbb/info.h>
#include <tbb/parallel_for.h>
#include <tbb/task_arena.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <limits>
#include <mutex>

#include "contrasta/error.hpp"

namespace contrasta::detail {

std::vector<std::size_t> resampling_pool::sizes() const {
  std::vector<std::size_t> s(groups());
  for (std::size_t g = 0; g < groups(); ++g) s[g] = n(g);
  return s;
}

std::vector<std::size_t> involved_levels(std::span<const contrast> family) {
  std::vector<std::size_t> levels;
  for (const contrast& c : family)
    for (std::size_t i = 0; i < c.coefficients.size(); ++i)
      if (c.coefficients[i] != 0) levels.push_back(i);
  std::sort(levels.begin(), levels.end());
  levels.erase(std::unique(levels.begin(), levels.end()), levels.end());
  return levels;
}

resampling_pool make_pool(const prepared_data& p, std::span<const std::size_t> levels) {
  resampling_pool pool;
  pool.levels.assign(levels.begin(), levels.end());
  pool.offsets.push_back(0);
  std::vector<double> values;
  for (std::size_t level : levels) {
    const auto g = p.data.group(level);
    values.insert(values.end(), g.begin(), g.end());
    pool.offsets.push_back(values.size());
  }
  if (values.size() > std::numeric_limits<std::uint32_t>::max())
    throw analysis_error("too many observations for resampling (more than 4294967295)");
  pool.shift = values.empty() ? 0.0 : accurate_mean(values);
  pool.data.reserve(values.size());
  for (double y : values) {
    const double v = y - pool.shift;
    pool.data.push_back({v, v * v});
    pool.total += v;
    pool.total_square += v * v;
  }
  return pool;
}

contrast_terms make_terms(const contrast& c, const resampling_pool& pool) {
  contrast_terms t;
  for (std::size_t g = 0; g < pool.groups(); ++g) {
    const double coefficient = c.coefficients.at(pool.levels[g]);
    if (coefficient == 0) continue;
    const auto n = static_cast<double>(pool.n(g));
    t.groups.push_back(g);
    t.mean_weight.push_back(coefficient / n);
    t.inverse_n.push_back(1.0 / n);
    t.variance_weight.push_back(n > 1 ? coefficient * coefficient / (n * (n - 1)) : not_available);
  }
  return t;
}

int thread_count(const analysis_options& o) {
  // More threads than the hardware offers cannot run at once (oneTBB would refuse the extra
  // workers with a warning on standard error); results do not depend on the count anyway.
  const int hardware = tbb::info::default_concurrency();
  if (o.threads == 0) return hardware;
  return std::min(static_cast<int>(std::min<unsigned>(o.threads, 1024)), hardware);
}

void run_blocks(std::uint64_t blocks, const analysis_options& o, const std::function<void(std::uint64_t)>& body) {
  std::atomic<bool> stopped{false};
  std::atomic<std::uint64_t> done{0};
  std::mutex progress_mutex;
  std::uint64_t reported = 0;
  bool reporting = false;
  const std::uint64_t step = std::max<std::uint64_t>(1, blocks / 200);
  // Progress only for runs that last: nothing before the first second (quality.md: a
  // progress line for long runs only).
  const auto start = std::chrono::steady_clock::now();
  auto one = [&](std::uint64_t b) {
    if (stopped.load(std::memory_order_relaxed)) return;
    if (o.cancel && o.cancel->load(std::memory_order_relaxed)) {
      stopped = true;
      return;
    }
    body(b);
    const std::uint64_t finished = ++done;
    if (o.progress && finished - reported >= step && finished < blocks) {
      std::lock_guard lock(progress_mutex);
      if (finished > reported && (reporting || std::chrono::steady_clock::now() - start > std::chrono::seconds(1))) {
        reporting = true;
        reported = finished;
        o.progress(static_cast<double>(finished) / static_cast<double>(blocks));
      }
    }
  };
  const int threads = thread_count(o);
  if (threads <= 1) {
    for (std::uint64_t b = 0; b < blocks; ++b) one(b);
  } else {
    tbb::task_arena arena(threads);
    arena.execute([&] {
      tbb::parallel_for(tbb::blocked_range<std::uint64_t>(0, blocks, 1),
                        [&](const tbb::blocked_range<std::uint64_t>& r) {
                          for (std::uint64_t b = r.begin(); b != r.end(); ++b) one(b);
                        });
    });
  }
  if (reporting) o.progress(1.0);  // lets the printer clear its line
  if (stopped) throw analysis_error("resampling cancelled before it finished; no result was produced");
}

}  // namespace contrasta::detail
