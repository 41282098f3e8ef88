// Calibration by simulation of the user's own design (methods.md section 7): datasets with the
// observed n_i and s_i and equal means, under normal errors and under resampled standardized
// residuals, each analysed by every method; the rejection rate at alpha is the actual type I
// error of the method on this design.
#include "contrasta/calibrate.hpp"

#include <tbb/blocked_range.h>
#include <tbb/parallel_for.h>
#include <tbb/task_arena.h>

#include <algorithm>
#include <cmath>

#include "calibrate_random.hpp"
#include "contrasta/error.hpp"
#include "contrasta/family.hpp"
#include "contrasta/methods.hpp"

namespace contrasta {
namespace {

namespace rnd = detail::calibration;

// Datasets per random stream: a fixed block of work, never tied to a thread.
constexpr std::size_t block_size = 25;

struct method_plan {
  std::string name;
  std::vector<std::size_t> contrasts;  // indices of the contrasts the method applies to
};

// Counts of one method over a set of simulated datasets. Integers only, so that summing blocks
// in any order gives the same answer.
struct method_counts {
  std::vector<std::uint64_t> rejections;  // per contrast
  std::uint64_t share_sum = 0;            // sum over datasets of r_d (rejections in dataset d)
  std::uint64_t share_sum_squares = 0;    // sum of r_d^2
  std::uint64_t failures = 0;
  void add(const method_counts& o) {
    for (std::size_t i = 0; i < rejections.size(); ++i) rejections[i] += o.rejections[i];
    share_sum += o.share_sum;
    share_sum_squares += o.share_sum_squares;
    failures += o.failures;
  }
};

struct design {
  std::vector<std::string> levels;
  std::vector<std::size_t> n;
  std::vector<double> sd;
  std::vector<double> residual_pool;  // standardized residuals, variance about 1
};

design design_of(const prepared_data& p) {
  design d;
  d.levels = p.data.levels;
  const double fallback_sd = std::sqrt(p.anova.ms_within);
  for (std::size_t i = 0; i < p.groups.size(); ++i) {
    const auto& g = p.groups[i];
    d.n.push_back(g.n);
    const bool own = g.n >= 2 && std::isfinite(g.sd);
    d.sd.push_back(own ? g.sd : (std::isfinite(fallback_sd) ? fallback_sd : 1.0));
    if (own && g.sd > 0) {
      // (y - ybar_i)/s_i scaled by sqrt(n_i/(n_i - 1)): residuals whose variance is 1 in
      // expectation, pooled so that small groups borrow the common shape.
      const double scale = std::sqrt(static_cast<double>(g.n) / static_cast<double>(g.n - 1)) / g.sd;
      for (double y : p.data.group(i)) d.residual_pool.push_back((y - g.centred_mean) * scale);
    }
  }
  return d;
}

bool rejects(const method_result& r, double alpha) {
  return r.p_value <= alpha;
}

}  // namespace

std::string to_string(error_model m) {
  return m == error_model::normal ? "normal" : "residuals";
}

bool within_bradley_band(double type1_error, double alpha) {
  return type1_error >= 0.5 * alpha && type1_error <= 1.5 * alpha;
}

calibration_report calibrate(const prepared_data& p, const calibration_request& request, const analysis_options& o) {
  if (p.groups.size() < 2) throw analysis_error("calibration needs at least two levels");
  if (request.datasets == 0) throw usage_error("calibration needs at least one simulated dataset");
  calibration_report report;
  report.seed = o.seed;
  report.datasets = request.datasets;
  report.method_resamples = request.method_resamples;
  report.effect = request.effect;

  const design des = design_of(p);
  constexpr std::size_t max_levels_for_pairs = 100;
  if (request.contrasts.empty() && p.data.level_count() > max_levels_for_pairs)
    throw analysis_error("calibration over all pairs of " + std::to_string(p.data.level_count()) +
                         " levels is too large; name the contrasts to calibrate with -c or --family");
  const std::vector<contrast> contrasts = request.contrasts.empty() ? all_pairs(p.data.levels) : request.contrasts;

  analysis_options sim = o;
  sim.resamples = request.method_resamples;
  sim.exact = exact_mode::never;  // Monte Carlo throughout: bounded cost per simulated dataset
  sim.threads = 1;                // parallel over datasets instead
  sim.progress = nullptr;

  // Which methods run here: every requested (or known) method that applies to at least one
  // contrast and runs on the observed data.
  std::vector<method_plan> plans;
  const auto& names = request.methods.empty() ? method_names() : request.methods;
  for (const auto& name : names) {
    if (std::find(method_names().begin(), method_names().end(), name) == method_names().end()) {
      std::string known;
      for (const auto& m : method_names()) known += (known.empty() ? "" : ", ") + m;
      throw usage_error("calibration method '" + name + "' is not known; use a comma list of " + known);
    }
    method_plan plan{name, {}};
    for (std::size_t c = 0; c < contrasts.size(); ++c)
      if (method_applies(name, contrasts[c])) plan.contrasts.push_back(c);
    if (plan.contrasts.empty()) {
      report.skipped.push_back(name + ": does not apply to these contrasts");
      continue;
    }
    try {
      (void)run_method(name, p, contrasts[plan.contrasts.front()], sim);
    } catch (const analysis_error& e) {
      report.skipped.push_back(name + ": " + e.what());
      continue;
    }
    plans.push_back(std::move(plan));
  }

  // Power: the observed pattern of means scaled so that the largest pairwise gap is `effect`.
  std::vector<double> effect_means(des.n.size(), 0.0);
  std::size_t power_contrast = 0;
  if (request.effect) {
    double low = INFINITY, high = -INFINITY, grand = 0;
    for (const auto& g : p.groups) {
      low = std::min(low, g.centred_mean);
      high = std::max(high, g.centred_mean);
      grand += g.centred_mean;
    }
    grand /= static_cast<double>(p.groups.size());
    if (!(high > low))
      throw analysis_error("--effect keeps the observed pattern of means, but the observed means are all equal");
    for (std::size_t i = 0; i < p.groups.size(); ++i)
      effect_means[i] = (p.groups[i].centred_mean - grand) * *request.effect / (high - low);
    double largest = -1;
    for (std::size_t c = 0; c < contrasts.size(); ++c) {
      double psi = 0;
      for (std::size_t i = 0; i < effect_means.size(); ++i) psi += contrasts[c].coefficients[i] * effect_means[i];
      if (std::abs(psi) > largest) {
        largest = std::abs(psi);
        power_contrast = c;
      }
    }
  }

  const std::size_t blocks = (request.datasets + block_size - 1) / block_size;
  tbb::task_arena arena(o.threads == 0 ? tbb::task_arena::automatic : static_cast<int>(o.threads));

  // One simulation: every dataset of every block, counts per method.
  auto simulate = [&](error_model model, const std::vector<double>& means, std::uint64_t stream_tag) {
    std::vector<std::vector<method_counts>> per_block(blocks);
    auto run_block = [&](std::size_t b) {
      auto& counts = per_block[b];
      counts.resize(plans.size());
      for (std::size_t m = 0; m < plans.size(); ++m) counts[m].rejections.assign(contrasts.size(), 0);
      pcg32 rng = rnd::block_stream(o.seed ^ rnd::mix(stream_tag), b);
      rnd::normal_source normal;
      const std::size_t first = b * block_size, last = std::min(request.datasets, first + block_size);
      std::vector<std::vector<double>> groups(des.n.size());
      for (std::size_t d = first; d < last; ++d) {
        if (o.cancel && o.cancel->load()) return;
        for (std::size_t i = 0; i < des.n.size(); ++i) {
          groups[i].resize(des.n[i]);
          for (auto& y : groups[i]) {
            const double e =
                model == error_model::normal
                    ? normal(rng)
                    : des.residual_pool[rnd::bounded(rng, static_cast<std::uint32_t>(des.residual_pool.size()))];
            y = means[i] + des.sd[i] * e;
          }
        }
        const prepared_data simulated = prepare(make_dataset(des.levels, groups, p.data.response), o.trim);
        analysis_options run = sim;
        run.seed = rnd::mix(o.seed ^ rnd::mix(stream_tag * 0x100000000ULL + d));
        for (std::size_t m = 0; m < plans.size(); ++m) {
          std::uint64_t in_dataset = 0;
          for (std::size_t c : plans[m].contrasts) {
            try {
              const auto r = run_method(plans[m].name, simulated, contrasts[c], run);
              if (std::isnan(r.p_value)) ++counts[m].failures;
              if (rejects(r, o.alpha)) {
                ++counts[m].rejections[c];
                ++in_dataset;
              }
            } catch (const analysis_error&) {
              ++counts[m].failures;
            }
          }
          counts[m].share_sum += in_dataset;
          counts[m].share_sum_squares += in_dataset * in_dataset;
        }
      }
    };
    // Blocks run in parallel in chunks, with progress reported between chunks from this thread.
    const std::size_t chunk = std::max<std::size_t>(1, blocks / 20);
    for (std::size_t start = 0; start < blocks; start += chunk) {
      const std::size_t stop = std::min(blocks, start + chunk);
      arena.execute([&] {
        tbb::parallel_for(tbb::blocked_range<std::size_t>(start, stop, 1),
                          [&](const tbb::blocked_range<std::size_t>& r) {
                            for (std::size_t b = r.begin(); b != r.end(); ++b) run_block(b);
                          });
      });
      if (o.cancel && o.cancel->load()) throw analysis_error("calibration cancelled");
      if (o.progress) o.progress(static_cast<double>(stop) / static_cast<double>(blocks));
    }
    std::vector<method_counts> total(plans.size());
    for (std::size_t m = 0; m < plans.size(); ++m) {
      total[m].rejections.assign(contrasts.size(), 0);
      for (const auto& block : per_block) total[m].add(block[m]);
    }
    return total;
  };

  const double D = static_cast<double>(request.datasets);
  std::uint64_t tag = 1;
  for (const error_model model : request.models) {
    if (model == error_model::residuals && des.residual_pool.size() < 2) {
      report.skipped.push_back("residuals error model: no level has a usable spread");
      continue;
    }
    const std::vector<double> null_means(des.n.size(), 0.0);
    const auto counts = simulate(model, null_means, tag++);
    std::vector<method_counts> power_counts;
    if (request.effect) power_counts = simulate(model, effect_means, tag++);
    for (std::size_t m = 0; m < plans.size(); ++m) {
      calibration_row row;
      row.method = plans[m].name;
      row.model = to_string(model);
      row.alpha = o.alpha;
      row.datasets = request.datasets;
      const double K = static_cast<double>(plans[m].contrasts.size());
      row.contrasts = plans[m].contrasts.size();
      const auto& c = counts[m];
      // Mean over datasets of the share f_d = r_d / K, and the standard error of that mean.
      const double mean_share = static_cast<double>(c.share_sum) / K / D;
      const double mean_square = static_cast<double>(c.share_sum_squares) / (K * K) / D;
      row.type1_error = mean_share;
      row.type1_se = D > 1 ? std::sqrt(std::max(0.0, (mean_square - mean_share * mean_share) * D / (D - 1)) / D) : 0;
      for (std::size_t ci : plans[m].contrasts) {
        const double rate = static_cast<double>(c.rejections[ci]) / D;
        if (row.worst_contrast.empty() || rate > row.worst_type1_error) {
          row.worst_type1_error = rate;
          row.worst_contrast = contrasts[ci].name;
        }
      }
      row.failures = c.failures;
      if (request.effect &&
          std::find(plans[m].contrasts.begin(), plans[m].contrasts.end(), power_contrast) != plans[m].contrasts.end()) {
        const double power = static_cast<double>(power_counts[m].rejections[power_contrast]) / D;
        row.power = power;
        row.power_se = std::sqrt(power * (1 - power) / D);
        row.power_contrast = contrasts[power_contrast].name;
      }
      report.rows.push_back(std::move(row));
    }
  }
  return report;
}

}  // namespace contrasta
