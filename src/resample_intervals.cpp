#include "resample_intervals.hpp"

#include <algorithm>
#include <cmath>
#include <memory>

#include <tbb/parallel_for.h>
#include <tbb/task_arena.h>

#include "contrasta/result.hpp"
#include "resample_kernels.hpp"
#include "distributions.hpp"

namespace contrasta::detail {

double quantile_linear(std::span<double> x, double q) {
  if (x.empty() || std::isnan(q)) return not_available;
  q = std::clamp(q, 0.0, 1.0);
  const double h = static_cast<double>(x.size() - 1) * q;
  const auto lo = static_cast<std::size_t>(std::floor(h));
  std::nth_element(x.begin(), x.begin() + static_cast<std::ptrdiff_t>(lo), x.end());
  const double a = x[lo];
  if (lo + 1 >= x.size()) return a;
  const double b = *std::min_element(x.begin() + static_cast<std::ptrdiff_t>(lo) + 1, x.end());
  const double t = h - static_cast<double>(lo);
  return t == 0 ? a : a + (b - a) * t;
}

namespace {

// What one part of the data holds for two brackets [low, high]: the count below each and the
// values inside each (at most `capacity` of them: a part that holds more reports `full`).
struct bracket_scan {
  std::size_t below[2] = {0, 0};
  std::vector<double> kept[2];
  bool full[2] = {false, false};
  bool unordered = false;  // a NaN was seen
};

bracket_scan scan_brackets(std::span<const double> x, double low0, double high0, double low1, double high1) {
  bracket_scan out;
  // about 50/1024 of the values fall in a bracket; twice that is plenty, and keeps the buffers
  // of 1e5 resamples below the size at which each allocation maps fresh pages
  const std::size_t capacity = x.size() / 10 + 1024;
  // not zero-filled: only the kept part is read
  const std::unique_ptr<double[]> keep0(new double[capacity + 1032]), keep1(new double[capacity + 1032]);
  const double bounds[4] = {low0, high0, low1, high1};
  bracket_pass pass;
  best_kernels().bracket_scan(x.data(), x.size(), bounds, keep0.get(), keep1.get(), capacity, pass);
  for (int k = 0; k < 2; ++k) {
    out.below[k] = pass.below[k];
    out.full[k] = pass.stopped;
  }
  out.kept[0].assign(keep0.get(), keep0.get() + std::min<std::size_t>(pass.kept[0], capacity));
  out.kept[1].assign(keep1.get(), keep1.get() + std::min<std::size_t>(pass.kept[1], capacity));
  out.unordered = pass.unordered;
  return out;
}

}  // namespace

std::vector<double> quantiles_linear(std::span<double> x, std::span<const double> levels, int threads) {
  const std::size_t n = x.size();
  std::vector<double> out(levels.size(), not_available);
  // Below this size, or for a single level, one selection per level costs little.
  constexpr std::size_t sample_size = 1024, half_width = 24;
  const auto active = static_cast<std::size_t>(
      std::count_if(levels.begin(), levels.end(), [](double q) { return !std::isnan(q); }));
  if (n < 16 * sample_size || active < 2) {
    for (std::size_t i = 0; i < levels.size(); ++i) out[i] = quantile_linear(x, levels[i]);
    return out;
  }
  // The rank h of each level and the bracket of sample values around it (Floyd & Rivest 1975,
  // CACM 18:165-172): about half_width / sqrt(1024 q (1-q)) sample standard deviations each side.
  std::vector<double> sample(sample_size);
  const std::size_t stride = n / sample_size;
  for (std::size_t i = 0; i < sample_size; ++i) sample[i] = x[i * stride];
  if (std::any_of(sample.begin(), sample.end(), [](double v) { return std::isnan(v); })) {
    for (std::size_t i = 0; i < levels.size(); ++i) out[i] = quantile_linear(x, levels[i]);
    return out;
  }
  std::sort(sample.begin(), sample.end());
  struct bracket {
    double h = 0;
    std::size_t rank = 0;
    double low = -HUGE_VAL, high = HUGE_VAL;
    std::size_t below = 0;
    std::vector<double> inside;
  };
  std::vector<bracket> brackets(levels.size());
  std::vector<bracket*> used;
  for (std::size_t i = 0; i < levels.size(); ++i) {
    bracket& b = brackets[i];
    if (std::isnan(levels[i])) continue;
    used.push_back(&b);
    b.h = static_cast<double>(n - 1) * std::clamp(levels[i], 0.0, 1.0);
    b.rank = static_cast<std::size_t>(std::floor(b.h));
    const std::size_t at = b.rank * sample_size / n;
    if (at >= half_width) b.low = sample[at - half_width];
    if (at + half_width + 1 < sample_size) b.high = sample[at + half_width + 1];
  }
  // One pass: how many values lie below each bracket, and the ones inside it; two brackets at a
  // time, the data cut into `threads` parts scanned side by side and merged in part order.
  bool unordered = false;
  const std::size_t parts = std::clamp<std::size_t>(threads, 1, 8);
  for (std::size_t k = 0; k < used.size(); k += 2) {
    bracket& first = *used[k];
    bracket& second = k + 1 < used.size() ? *used[k + 1] : *used[k];
    std::vector<bracket_scan> scans(parts);
    auto scan_part = [&](std::size_t part) {
      const std::size_t begin = n * part / parts, end = n * (part + 1) / parts;
      scans[part] = scan_brackets(x.subspan(begin, end - begin), first.low, first.high, second.low, second.high);
    };
    if (parts == 1) {
      scan_part(0);
    } else {
      tbb::task_arena arena(static_cast<int>(parts));
      arena.execute([&] { tbb::parallel_for(std::size_t{0}, parts, scan_part); });
    }
    first.below = second.below = 0;
    first.inside.clear();
    second.inside.clear();
    bool full0 = false, full1 = false;
    for (const bracket_scan& part : scans) {
      unordered |= part.unordered;
      full0 |= part.full[0];
      full1 |= part.full[1];
      first.below += part.below[0];
      first.inside.insert(first.inside.end(), part.kept[0].begin(), part.kept[0].end());
      if (&second != &first) {
        second.below += part.below[1];
        second.inside.insert(second.inside.end(), part.kept[1].begin(), part.kept[1].end());
      }
    }
    if (full0) first.below = n;  // a full buffer: the bracket counts as missed
    if (full1 && &second != &first) second.below = n;
  }
  for (std::size_t i = 0; i < levels.size(); ++i) {
    bracket& b = brackets[i];
    if (std::isnan(levels[i])) continue;
    const std::size_t need = std::min(b.rank + 1, n - 1);  // the two order statistics used
    if (unordered || b.below > b.rank || need >= b.below + b.inside.size()) {
      out[i] = quantile_linear(x, levels[i]);  // the bracket missed: select in full
      continue;
    }
    const auto k = static_cast<std::ptrdiff_t>(b.rank - b.below);
    std::nth_element(b.inside.begin(), b.inside.begin() + k, b.inside.end());
    const double a = b.inside[static_cast<std::size_t>(k)];
    if (b.rank + 1 >= n) {
      out[i] = a;
      continue;
    }
    const double next = *std::min_element(b.inside.begin() + k + 1, b.inside.end());
    const double t = b.h - static_cast<double>(b.rank);
    out[i] = t == 0 ? a : a + (next - a) * t;
  }
  return out;
}

double bca_acceleration(const prepared_data& p, const contrast& c) {
  double numerator = 0, denominator = 0;
  for (std::size_t level = 0; level < c.coefficients.size(); ++level) {
    const double cg = c.coefficients[level];
    if (cg == 0) continue;
    const auto n = static_cast<double>(p.data.n(level));
    const double mean = p.groups[level].centred_mean;
    double u2 = 0, u3 = 0;
    for (double y : p.data.group(level)) {
      const double u = cg * (y - mean);
      u2 += u * u;
      u3 += u * u * u;
    }
    numerator += u3 / (n * n * n);
    denominator += u2 / (n * n);
  }
  return denominator > 0 ? numerator / (6 * std::pow(denominator, 1.5)) : 0.0;
}

double bca_bias(std::span<const double> deviations) {
  std::uint64_t below = 0, at_or_below = 0;
  for (double d : deviations) {
    below += d < 0;
    at_or_below += d <= 0;
  }
  return bca_bias(below, at_or_below, deviations.size());
}

double bca_bias(std::uint64_t below, std::uint64_t at_or_below, std::uint64_t resamples) {
  const double share =
      (static_cast<double>(below) + static_cast<double>(at_or_below)) / (2.0 * static_cast<double>(resamples));
  if (share <= 0) return -HUGE_VAL;
  if (share >= 1) return HUGE_VAL;
  return boost::math::quantile(normal(), share);
}

double bca_level(double bias, double acceleration, double z_alpha) {
  if (std::isinf(bias)) return bias > 0 ? 1.0 : 0.0;
  const double shifted = bias + z_alpha;
  const double z = bias + shifted / (1 - acceleration * shifted);
  if (std::isinf(z)) return z > 0 ? 1.0 : 0.0;
  return boost::math::cdf(normal(), z);
}

}  // namespace contrasta::detail
