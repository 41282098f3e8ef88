// Small SVG drawings for the report: the observations of every group, a forest plot of the
// contrasts and the null distribution of a resampling statistic. Each drawing takes plain,
// finished numbers (the CLI layer gets them from the engine) and returns SVG text: drawing maps
// numbers to positions and never estimates anything. Every piece of user text is XML-escaped.
#pragma once
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace contrasta::cli::svg {

// The colours of the report: a calm set that stays distinguishable under the common colour
// vision deficiencies (blue against orange carries every contrast that matters; shape and text
// carry it again, so no meaning depends on colour alone).
namespace colour {
inline constexpr const char* ink = "#22303c";       // text, axes, estimates
inline constexpr const char* muted = "#66737f";     // secondary text, tick labels
inline constexpr const char* grid = "#e3e6e8";      // grid lines
inline constexpr const char* band = "#f3f1ea";      // alternate row background
inline constexpr const char* point = "#3b6ea8";     // observations
inline constexpr const char* accent = "#c7792b";    // medians, flagged outliers, tail shading
inline constexpr const char* interval = "#22303c";  // unadjusted intervals
inline constexpr const char* adjusted = "#9dc3e2";  // adjusted (simultaneous) intervals
inline constexpr const char* bar = "#a9bccd";       // histogram bars
inline constexpr const char* tail = "#dd9f63";      // histogram bars at least as extreme as observed
}  // namespace colour

// An axis with round tick values covering [low, high] (Heckbert, "Nice numbers for graph
// labels", Graphics Gems, 1990: steps of 1, 2 or 5 times a power of ten).
struct axis {
  double low = 0, high = 1, step = 0.2;
  std::vector<double> ticks;
  int decimals = 1;  // decimals that tick labels need at this step
};
axis nice_axis(double low, double high, int target_ticks = 6);

// A deterministic offset in [-1, 1] for the point (group, index): a hash, so that the same data
// always draw the same picture and no global random state is touched.
double jitter(std::uint64_t group, std::uint64_t index);

struct group_points {
  std::string level;
  std::vector<double> values;                    // in data units
  std::vector<std::uint64_t> rows;               // input line of each value (for labels), may be empty
  std::vector<bool> outlier;                     // flagged observations, same length as values or empty
  double mean = 0, mean_low = 0, mean_high = 0;  // the mean and its interval
  double median = 0;
  std::size_t missing = 0;
};

struct observation_plot_input {
  std::vector<group_points> groups;
  std::string response;     // axis label
  double conf = 0.95;       // level of the mean intervals (legend text)
  bool standalone = false;  // a .svg file of its own (adds the XML namespace)
};
std::string observation_plot(const observation_plot_input& input);

struct forest_row {
  std::string method;
  double estimate = 0, low = 0, high = 0;             // unadjusted interval
  std::optional<double> adjusted_low, adjusted_high;  // simultaneous interval, when defined
  std::string p_text;                                 // the p-value as shown in the tables
  bool below_alpha = false;
  bool recommended = false;
};

struct forest_block {
  std::string contrast;
  std::vector<forest_row> rows;
};

struct forest_plot_input {
  std::vector<forest_block> blocks;
  std::string scale;     // what the axis measures ("difference in yield (kg)")
  double reference = 0;  // the value of "no difference"
  std::string reference_label = "no difference";
  double conf = 0.95;
  double alpha = 0.05;         // filled estimate marks: p below alpha
  std::string adjusted_label;  // legend words for the adjusted interval ("Holm-adjusted")
  bool standalone = false;
};
std::string forest_plot(const forest_plot_input& input);

struct histogram_input {
  std::string title;               // "welch t of compost - control, 9999 reassignments"
  std::string statistic_name;      // "t"
  std::vector<double> statistics;  // the resampled statistics
  double observed = 0;
  // Which tail the p-value counts: two-sided counts both (abs >= abs observed).
  enum class tail { both, upper, lower } counted = tail::both;
  std::string p_text;
  bool standalone = false;
};
std::string null_histogram(const histogram_input& input);

}  // namespace contrasta::cli::svg
