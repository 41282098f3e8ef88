#include "cli/svg.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <sstream>

#include "cli/report_text.hpp"

namespace contrasta::cli::svg {

namespace {

// Heckbert's nice number: the nearest (round) or the next larger (ceiling) value of the form
// {1, 2, 5, 10} x 10^k.
double nice_number(double x, bool round) {
  const double exponent = std::floor(std::log10(x));
  const double fraction = x / std::pow(10.0, exponent);
  double nice;
  if (round) {
    nice = fraction < 1.5 ? 1 : fraction < 3 ? 2 : fraction < 7 ? 5 : 10;
  } else {
    nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10;
  }
  return nice * std::pow(10.0, exponent);
}

std::string num(double v) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.1f", v);
  std::string s = buffer;
  if (s == "-0.0") s = "0.0";
  return s;
}

// Cuts a label to about `max_chars` characters (on a UTF-8 boundary) with an ellipsis; the full
// text stays available in the element's <title>.
std::string shorten(const std::string& text, std::size_t max_chars) {
  std::size_t chars = 0, cut = text.size();
  for (std::size_t i = 0; i < text.size(); ++i) {
    if ((static_cast<unsigned char>(text[i]) & 0xC0) != 0x80) {
      if (chars == max_chars) {
        cut = i;
        break;
      }
      ++chars;
    }
  }
  if (cut == text.size()) return text;
  return text.substr(0, cut) + "\xE2\x80\xA6";  // U+2026 HORIZONTAL ELLIPSIS
}

std::size_t char_count(const std::string& text) {
  std::size_t n = 0;
  for (unsigned char ch : text) n += (ch & 0xC0) != 0x80;
  return n;
}

// Appends SVG elements to a buffer; every text argument is escaped here, once.
class canvas {
 public:
  canvas(double width, double height, const std::string& label, bool standalone) : width_(width) {
    out_ << "<svg";
    if (standalone) out_ << " xmlns=\"http://www.w3.org/2000/svg\"";
    out_ << " class=\"plot\" viewBox=\"0 0 " << num(width) << ' ' << num(height) << "\" width=\"" << num(width)
         << "\" height=\"" << num(height) << "\" role=\"img\" aria-label=\"" << xml_escape(label)
         << "\" font-family=\"'DejaVu Sans', 'Liberation Sans', Arial, sans-serif\" font-size=\"12\">\n";
    out_ << "<title>" << xml_escape(label) << "</title>\n";
    out_ << "<rect x=\"0\" y=\"0\" width=\"" << num(width) << "\" height=\"" << num(height)
         << "\" fill=\"#ffffff\"/>\n";
  }

  double width() const { return width_; }

  void line(double x1, double y1, double x2, double y2, const char* stroke, double stroke_width,
            const char* extra = "") {
    out_ << "<line x1=\"" << num(x1) << "\" y1=\"" << num(y1) << "\" x2=\"" << num(x2) << "\" y2=\"" << num(y2)
         << "\" stroke=\"" << stroke << "\" stroke-width=\"" << num(stroke_width) << '"' << extra << "/>\n";
  }
  void rect(double x, double y, double w, double h, const char* fill, const char* extra = "") {
    out_ << "<rect x=\"" << num(x) << "\" y=\"" << num(y) << "\" width=\"" << num(std::max(w, 0.0)) << "\" height=\""
         << num(std::max(h, 0.0)) << "\" fill=\"" << fill << '"' << extra << "/>\n";
  }
  // A mark with a hover title (the exact value, the row of the data).
  void circle(double cx, double cy, double r, const char* fill, const char* stroke, double stroke_width,
              const std::string& title, const char* extra = "") {
    out_ << "<circle cx=\"" << num(cx) << "\" cy=\"" << num(cy) << "\" r=\"" << num(r) << "\" fill=\"" << fill
         << "\" stroke=\"" << stroke << "\" stroke-width=\"" << num(stroke_width) << '"' << extra;
    if (title.empty()) {
      out_ << "/>\n";
    } else {
      out_ << "><title>" << xml_escape(title) << "</title></circle>\n";
    }
  }
  void polygon(const std::vector<std::pair<double, double>>& points, const char* fill, const char* stroke = "none",
               const std::string& title = "") {
    out_ << "<polygon points=\"";
    for (std::size_t i = 0; i < points.size(); ++i) {
      out_ << (i ? " " : "") << num(points[i].first) << ',' << num(points[i].second);
    }
    out_ << "\" fill=\"" << fill << "\" stroke=\"" << stroke << '"';
    if (title.empty()) {
      out_ << "/>\n";
    } else {
      out_ << "><title>" << xml_escape(title) << "</title></polygon>\n";
    }
  }
  // anchor: start | middle | end.
  void text(double x, double y, const std::string& content, const char* anchor = "start",
            const char* fill = colour::ink, const char* extra = "", const std::string& title = "") {
    out_ << "<text x=\"" << num(x) << "\" y=\"" << num(y) << "\" text-anchor=\"" << anchor << "\" fill=\"" << fill
         << '"' << extra << '>';
    if (!title.empty()) out_ << "<title>" << xml_escape(title) << "</title>";
    out_ << xml_escape(content) << "</text>\n";
  }
  void raw(const std::string& s) { out_ << s; }

  std::string finish() {
    out_ << "</svg>\n";
    return out_.str();
  }

 private:
  std::ostringstream out_;
  double width_;
};

struct scale {
  double from_low, from_high, to_low, to_high;
  double operator()(double v) const {
    if (from_high == from_low) return (to_low + to_high) / 2;
    return to_low + (v - from_low) / (from_high - from_low) * (to_high - to_low);
  }
};

// A horizontal value axis along y = `y` from x0 to x1 with vertical grid lines up to `top`.
void draw_value_axis(canvas& c, const axis& a, const scale& x, double top, double y, const std::string& label) {
  // Long tick labels (data with many leading digits) are thinned so that they never overlap.
  std::size_t longest = 1;
  for (double t : a.ticks) longest = std::max(longest, fixed_decimals(t, a.decimals).size());
  const double spacing = a.ticks.size() > 1 ? std::fabs(x(a.ticks[1]) - x(a.ticks[0])) : 1e9;
  const auto every =
      static_cast<std::size_t>(std::max(1.0, std::ceil((static_cast<double>(longest) * 7.2 + 8) / spacing)));
  for (std::size_t i = 0; i < a.ticks.size(); ++i) {
    const double t = a.ticks[i], px = x(t);
    c.line(px, top, px, y, colour::grid, 1);
    c.line(px, y, px, y + 5, colour::muted, 1);
    if (i % every == 0) c.text(px, y + 18, fixed_decimals(t, a.decimals), "middle", colour::muted);
  }
  c.line(x(a.low), y, x(a.high), y, colour::muted, 1);
  if (!label.empty()) c.text((x(a.low) + x(a.high)) / 2, y + 36, label, "middle", colour::ink, " font-size=\"12.5\"");
}

void diamond(canvas& c, double cx, double cy, double r, const char* fill, const std::string& title) {
  c.polygon({{cx, cy - r}, {cx + r, cy}, {cx, cy + r}, {cx - r, cy}}, fill, "#ffffff", title);
}

void interval_with_caps(canvas& c, double x1, double x2, double y, double cap, const char* stroke, double width) {
  c.line(x1, y, x2, y, stroke, width);
  c.line(x1, y - cap / 2, x1, y + cap / 2, stroke, width);
  c.line(x2, y - cap / 2, x2, y + cap / 2, stroke, width);
}

}  // namespace

axis nice_axis(double low, double high, int target_ticks) {
  axis a;
  if (!std::isfinite(low) || !std::isfinite(high)) {
    low = std::isfinite(low) ? low : (std::isfinite(high) ? high - 1 : 0);
    high = std::isfinite(high) ? high : low + 1;
  }
  if (low > high) std::swap(low, high);
  if (low == high) {
    const double pad = low == 0 ? 1 : std::fabs(low) * 0.1;
    low -= pad;
    high += pad;
  }
  if (target_ticks < 2) target_ticks = 2;
  if (!std::isfinite(high - low)) {  // a span beyond the double range: just the two ends
    a.low = low;
    a.high = high;
    a.step = high / 2 - low / 2;
    a.ticks = {low, high};
    a.decimals = 0;
    return a;
  }
  const double range = nice_number(high - low, false);
  a.step = nice_number(range / (target_ticks - 1), true);
  a.low = std::floor(low / a.step) * a.step;
  a.high = std::ceil(high / a.step) * a.step;
  // Ticks are computed as low + i * step from integers, so they carry no accumulated drift.
  const double steps = std::round((a.high - a.low) / a.step);
  const long count = steps >= 0 && steps <= 1000 ? static_cast<long>(steps) : 1;
  for (long i = 0; i <= count; ++i) {
    double t = a.low + static_cast<double>(i) * a.step;
    if (std::fabs(t) < a.step * 1e-9) t = 0;
    a.ticks.push_back(t);
  }
  a.decimals = std::max(0, -static_cast<int>(std::floor(std::log10(a.step) + 1e-9)));
  return a;
}

double jitter(std::uint64_t group, std::uint64_t index) {
  // SplitMix64 finaliser (Steele, Lea & Flood 2014) over the pair: well mixed, stateless.
  std::uint64_t z = group * 0x9E3779B97F4A7C15ULL + index + 0x632BE59BD9B4E019ULL;
  z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
  z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
  z ^= z >> 31;
  return static_cast<double>(z >> 11) / static_cast<double>(1ULL << 53) * 2.0 - 1.0;
}

std::string observation_plot(const observation_plot_input& in) {
  constexpr double width = 780, band_height = 66, top = 52;
  constexpr std::size_t point_limit = 1500;
  std::size_t longest = 4;
  for (const auto& g : in.groups) longest = std::max(longest, char_count(g.level));
  const double label_width =
      std::clamp(static_cast<double>(std::min<std::size_t>(longest, 24)) * 7.4 + 24, 90.0, 200.0);
  const double text_width = 230;
  const double x0 = label_width, x1 = width - text_width - 14;
  const double plot_bottom = top + band_height * static_cast<double>(in.groups.size());
  const double height = plot_bottom + 52;

  double low = INFINITY, high = -INFINITY;
  for (const auto& g : in.groups) {
    for (double v : g.values) {
      if (std::isfinite(v)) low = std::min(low, v), high = std::max(high, v);
    }
    for (double v : {g.mean_low, g.mean_high, g.median, g.mean}) {
      if (std::isfinite(v)) low = std::min(low, v), high = std::max(high, v);
    }
  }
  const axis a = nice_axis(low, high);
  const scale x{a.low, a.high, x0 + 6, x1 - 6};
  const std::string percent = percent_text(in.conf);

  canvas c(
      width, height,
      "Every observation of " + in.response + " by group, with the mean, its " + percent + " interval and the median",
      in.standalone);
  // Legend: one sample of each kind of mark, with its meaning in words.
  bool any_outlier = false;
  for (const auto& g : in.groups) any_outlier |= std::find(g.outlier.begin(), g.outlier.end(), true) != g.outlier.end();
  double lx = 14;
  const double ly = 22;
  c.circle(lx + 4, ly - 4, 3.6, colour::point, "#ffffff", 0.6, "", " fill-opacity=\"0.6\"");
  c.text(lx + 14, ly, "one observation");
  lx += 128;
  interval_with_caps(c, lx, lx + 26, ly - 4, 8, colour::interval, 1.6);
  diamond(c, lx + 13, ly - 4, 5, colour::ink, "");
  c.text(lx + 34, ly, "mean with " + percent + " interval");
  lx += 206;
  c.line(lx + 4, ly - 13, lx + 4, ly + 5, colour::accent, 2.6);
  c.text(lx + 13, ly, "median");
  lx += 74;
  if (any_outlier) {
    c.circle(lx + 5, ly - 4, 3.6, colour::point, "#ffffff", 0.6, "");
    c.circle(lx + 5, ly - 4, 7, "none", colour::accent, 2, "");
    c.text(lx + 17, ly, "flagged outlier (with its row)");
  }

  for (std::size_t i = 0; i < in.groups.size(); ++i) {
    const double band_top = top + band_height * static_cast<double>(i);
    if (i % 2 == 0) c.rect(0, band_top, width, band_height, colour::band);
  }
  // Grid and axis under the marks.
  draw_value_axis(c, a, x, top, plot_bottom + 6, in.response);

  for (std::size_t i = 0; i < in.groups.size(); ++i) {
    const auto& g = in.groups[i];
    const double band_top = top + band_height * static_cast<double>(i);
    c.text(x0 - 12, band_top + 32, shorten(g.level, 24), "end", colour::ink, " font-weight=\"600\" font-size=\"13\"",
           g.level);

    // Median: an upright stroke through the cloud of points, drawn first so that no point hides
    // behind it; it reaches above and below the cloud so that it stays visible.
    if (std::isfinite(g.median)) {
      c.line(x(g.median), band_top + 5, x(g.median), band_top + 41, colour::accent, 2.6);
    }
    // Observations: deterministic vertical jitter within the upper part of the band.
    const std::size_t n = g.values.size();
    const std::size_t stride = n > point_limit ? (n + point_limit - 1) / point_limit : 1;
    std::size_t drawn = 0;
    // Points that would land on top of each other (ties, as on a 0-10 score scale) are dodged
    // apart vertically in turn: 0, +5, -5, +10, -10 px; a small hashed jitter keeps the rows of
    // a crowded column from lining up. Crowds beyond the band fall back to the jitter alone.
    std::map<long, int> crowd;
    for (std::size_t j = 0; j < n; ++j) {
      const bool flagged = j < g.outlier.size() && g.outlier[j];
      if (!flagged && j % stride != 0) continue;
      const double v = g.values[j];
      if (!std::isfinite(v)) continue;
      const double px = x(v);
      const int k = crowd[std::lround(px / 6)]++;
      const double step = 5.0 * ((k + 1) / 2) * (k % 2 ? 1 : -1);
      const double py = band_top + 23 + (std::fabs(step) <= 13 ? step + 1.5 * jitter(i, j) : 13 * jitter(i, j));
      std::string title = g.level;
      if (j < g.rows.size()) title += ", row " + std::to_string(g.rows[j]);
      title += ": " + display_number(v, 6);
      ++drawn;
      if (flagged) {
        c.circle(px, py, 3.6, colour::point, "#ffffff", 0.6, title);
        c.circle(px, py, 7, "none", colour::accent, 2, "");
        c.text(px, band_top + 9, j < g.rows.size() ? "row " + std::to_string(g.rows[j]) : "outlier", "middle",
               colour::accent, " font-size=\"10.5\" font-weight=\"600\"");
      } else {
        c.circle(px, py, 3.6, colour::point, "#ffffff", 0.6, title, " fill-opacity=\"0.6\"");
      }
    }
    // Mean and its interval below the points.
    const double my = band_top + 52;
    if (std::isfinite(g.mean_low) && std::isfinite(g.mean_high)) {
      interval_with_caps(c, x(g.mean_low), x(g.mean_high), my, 8, colour::interval, 1.6);
    }
    if (std::isfinite(g.mean)) {
      diamond(c, x(g.mean), my, 5.5, colour::ink,
              g.level + ": mean " + display_number(g.mean) + ", " + percent + " interval " +
                  display_number(g.mean_low) + " to " + display_number(g.mean_high));
    }
    // The numbers beside the marks, in words.
    const double tx = x1 + 16;
    std::string first = "mean " + display_number(g.mean);
    if (std::isfinite(g.mean_low) && std::isfinite(g.mean_high)) {
      first += "  [" + display_number(g.mean_low) + ", " + display_number(g.mean_high) + "]";
    }
    c.text(tx, band_top + 27, first, "start", colour::ink, " font-size=\"12\"");
    std::string second = "median " + display_number(g.median) + " \xC2\xB7 n = " + std::to_string(n);
    if (g.missing > 0) second += " \xC2\xB7 " + std::to_string(g.missing) + " missing";
    c.text(tx, band_top + 45, second, "start", colour::muted, " font-size=\"11.5\"");
    if (drawn < n) {
      c.text(tx, band_top + 60, std::to_string(drawn) + " of " + std::to_string(n) + " points drawn", "start",
             colour::muted, " font-size=\"10.5\"");
    }
  }
  return c.finish();
}

std::string forest_plot(const forest_plot_input& in) {
  constexpr double width = 780, row_height = 26, heading_height = 28;
  std::size_t longest = 6;
  bool any_adjusted = false;
  double low = in.reference, high = in.reference;
  std::size_t rows = 0;
  for (const auto& b : in.blocks) {
    for (const auto& r : b.rows) {
      longest = std::max(longest, char_count(r.method));
      ++rows;
      for (double v : {r.estimate, r.low, r.high}) {
        if (std::isfinite(v)) low = std::min(low, v), high = std::max(high, v);
      }
      if (r.adjusted_low && r.adjusted_high) {
        any_adjusted = true;
        for (double v : {*r.adjusted_low, *r.adjusted_high}) {
          if (std::isfinite(v)) low = std::min(low, v), high = std::max(high, v);
        }
      }
    }
  }
  const double top = any_adjusted ? 76 : 58;  // room for the second legend line
  const double label_width =
      std::clamp(static_cast<double>(std::min<std::size_t>(longest, 20)) * 7.2 + 40, 110.0, 190.0);
  const double text_width = 250;
  const double x0 = label_width, x1 = width - text_width - 10;
  const double plot_bottom =
      top + heading_height * static_cast<double>(in.blocks.size()) + row_height * static_cast<double>(rows) + 6;
  const double height = plot_bottom + 52;
  const axis a = nice_axis(low, high);
  const scale x{a.low, a.high, x0 + 8, x1 - 8};
  const std::string percent = percent_text(in.conf);

  canvas c(width, height, "Contrast estimates with " + percent + " intervals, by method", in.standalone);
  // Legend.
  double lx = 14;
  const double ly = 20;
  c.circle(lx + 5, ly - 4, 4.5, colour::ink, colour::ink, 1.5, "");
  c.text(lx + 15, ly, "estimate, p below " + plain_number(in.alpha));
  lx += 170;
  c.circle(lx + 5, ly - 4, 4.5, "#ffffff", colour::ink, 1.5, "");
  c.text(lx + 15, ly, "estimate, p not below " + plain_number(in.alpha));
  lx += 190;
  interval_with_caps(c, lx, lx + 24, ly - 4, 8, colour::interval, 1.8);
  c.text(lx + 32, ly, percent + " interval");
  if (any_adjusted) {
    c.rect(14, ly + 8, 26, 10, colour::adjusted);
    c.text(48, ly + 17,
           (in.adjusted_label.empty() ? std::string("adjusted") : in.adjusted_label) +
               " interval (holds for all contrasts together)");
  }

  // Grid, axis, and the line of no difference under the marks.
  draw_value_axis(c, a, x, top, plot_bottom, in.scale);
  const double rx = x(in.reference);
  c.line(rx, top - 6, rx, plot_bottom, colour::ink, 1.2, " stroke-dasharray=\"5 4\"");
  c.text(rx, top - 10, plain_number(in.reference) + " = " + in.reference_label, "middle", colour::ink,
         " font-size=\"11.5\"");

  double y = top;
  for (std::size_t bi = 0; bi < in.blocks.size(); ++bi) {
    const auto& b = in.blocks[bi];
    // The heading sits on a band of its own, over the grid, so that lines never cross its text.
    c.rect(0, y + 3, width, heading_height - 4, colour::band);
    c.text(12, y + 19, shorten(b.contrast, 90), "start", colour::ink, " font-weight=\"700\" font-size=\"13\"",
           b.contrast);
    y += heading_height;
    for (const auto& r : b.rows) {
      const double cy = y + row_height / 2;
      c.text(x0 - 10, cy + 4, shorten(r.method, 20), "end", r.recommended ? colour::ink : colour::muted,
             r.recommended ? " font-weight=\"700\"" : "", r.method);
      if (r.adjusted_low && r.adjusted_high) {
        const double al = std::isfinite(*r.adjusted_low) ? x(*r.adjusted_low) : x(a.low);
        const double ah = std::isfinite(*r.adjusted_high) ? x(*r.adjusted_high) : x(a.high);
        c.rect(al, cy - 6, ah - al, 12, colour::adjusted);
      }
      const bool has_low = std::isfinite(r.low), has_high = std::isfinite(r.high);
      if (!std::isnan(r.low) && !std::isnan(r.high)) {
        // A one-sided interval runs off the axis: it ends in an arrowhead instead of a cap.
        const double xl = has_low ? x(r.low) : x(a.low), xh = has_high ? x(r.high) : x(a.high);
        c.line(xl, cy, xh, cy, colour::interval, 1.8);
        if (has_low)
          c.line(xl, cy - 4.5, xl, cy + 4.5, colour::interval, 1.8);
        else
          c.polygon({{xl - 4, cy}, {xl + 3, cy - 4}, {xl + 3, cy + 4}}, colour::interval);
        if (has_high)
          c.line(xh, cy - 4.5, xh, cy + 4.5, colour::interval, 1.8);
        else
          c.polygon({{xh + 4, cy}, {xh - 3, cy - 4}, {xh - 3, cy + 4}}, colour::interval);
      }
      std::string label =
          display_number(r.estimate) + "  [" + display_number(r.low) + ", " + display_number(r.high) + "]";
      if (std::isfinite(r.estimate)) {
        c.circle(x(r.estimate), cy, 4.5, r.below_alpha ? colour::ink : "#ffffff", colour::ink, 1.5,
                 b.contrast + ", " + r.method + ": " + label);
      }
      c.text(x1 + 14, cy + 4, label, "start", colour::ink, r.recommended ? " font-weight=\"700\"" : "");
      if (!r.p_text.empty()) {
        c.text(width - 12, cy + 4, "p " + r.p_text, "end", colour::muted, " font-size=\"11.5\"");
      }
      y += row_height;
    }
  }
  return c.finish();
}

std::string null_histogram(const histogram_input& in) {
  constexpr double width = 780, height = 236, x0 = 64, top = 76, bins = 40;
  const double x1 = width - 24, bottom = height - 50;
  canvas c(width, height, in.title, in.standalone);
  c.text(14, 20, in.title, "start", colour::ink, " font-weight=\"700\" font-size=\"13\"");

  // The drawn range covers the middle 99.9% of the resampled statistics and the observed value
  // (and its mirror for a two-sided p); the few beyond are counted in the end bars, so that one
  // wild resample cannot squeeze the picture.
  std::vector<double> finite;
  finite.reserve(in.statistics.size());
  for (double v : in.statistics) {
    if (std::isfinite(v)) finite.push_back(v);
  }
  double low = in.observed, high = in.observed;
  if (!finite.empty()) {
    const auto lo_at = static_cast<std::size_t>(0.0005 * static_cast<double>(finite.size() - 1));
    const auto hi_at = static_cast<std::size_t>(0.9995 * static_cast<double>(finite.size() - 1));
    std::nth_element(finite.begin(), finite.begin() + static_cast<std::ptrdiff_t>(lo_at), finite.end());
    const double q_low = finite[lo_at];
    std::nth_element(finite.begin(), finite.begin() + static_cast<std::ptrdiff_t>(hi_at), finite.end());
    const double q_high = finite[hi_at];
    low = std::isfinite(in.observed) ? std::min(q_low, in.observed) : q_low;
    high = std::isfinite(in.observed) ? std::max(q_high, in.observed) : q_high;
  }
  const bool both = in.counted == histogram_input::tail::both;
  if (both && std::isfinite(in.observed)) {
    low = std::min(low, -std::fabs(in.observed));
    high = std::max(high, std::fabs(in.observed));
  }
  const axis a = nice_axis(low, high);
  const scale x{a.low, a.high, x0, x1};
  const double bin_width = (a.high - a.low) / bins;
  // Per bin: resamples at least as extreme as observed, and the others, stacked in one bar so
  // that a bin the observed value cuts shows both parts truthfully.
  std::vector<double> extreme(static_cast<std::size_t>(bins), 0), ordinary(static_cast<std::size_t>(bins), 0);
  const double threshold = std::fabs(in.observed);
  const double tolerance = 1e-12 * std::max(1.0, threshold);  // as the engine's "at least as extreme"
  std::size_t beyond = 0;
  for (double v : finite) {
    double b = std::floor((v - a.low) / bin_width);
    if (b < 0 || b >= bins) ++beyond;
    const auto index = static_cast<std::size_t>(std::clamp(b, 0.0, bins - 1));
    bool is_extreme = false;
    switch (in.counted) {
      case histogram_input::tail::both:
        is_extreme = std::fabs(v) >= threshold - tolerance;
        break;
      case histogram_input::tail::upper:
        is_extreme = v >= in.observed - tolerance;
        break;
      case histogram_input::tail::lower:
        is_extreme = v <= in.observed + tolerance;
        break;
    }
    (is_extreme ? extreme : ordinary)[index] += 1;
  }
  double most = 1;
  for (std::size_t b = 0; b < extreme.size(); ++b) most = std::max(most, extreme[b] + ordinary[b]);
  axis ya = nice_axis(0, most, 4);
  ya.decimals = 0;
  const scale y{0, ya.high, bottom, top};

  // Legend.
  c.rect(14, 32, 14, 10, colour::bar);
  c.text(34, 41, "resampled statistic under the null");
  c.rect(270, 32, 14, 10, colour::tail);
  c.text(290, 41, "at least as extreme as observed" + (in.p_text.empty() ? std::string() : " (p " + in.p_text + ")"));

  for (double t : ya.ticks) {
    c.line(x0, y(t), x1, y(t), colour::grid, 1);
    c.text(x0 - 8, y(t) + 4, count_text(t), "end", colour::muted, " font-size=\"11\"");
  }
  for (std::size_t b = 0; b < extreme.size(); ++b) {
    const double left = a.low + static_cast<double>(b) * bin_width;
    const double bar_x = x(left) + 0.5, bar_w = x(left + bin_width) - x(left) - 1;
    if (ordinary[b] > 0) c.rect(bar_x, y(ordinary[b]), bar_w, bottom - y(ordinary[b]), colour::bar);
    if (extreme[b] > 0) {
      c.rect(bar_x, y(ordinary[b] + extreme[b]), bar_w, y(ordinary[b]) - y(ordinary[b] + extreme[b]), colour::tail);
    }
  }
  // Axis.
  draw_value_axis(c, a, x, bottom, bottom, "");
  std::string axis_label = "statistic " + in.statistic_name;
  if (beyond > 0)
    axis_label += " (" + count_text(static_cast<double>(beyond)) + " beyond the axis are counted in the end bars)";
  c.text((x0 + x1) / 2, bottom + 38, axis_label, "middle");
  if (std::isfinite(in.observed)) {
    const double ox = x(in.observed);
    const bool right_half = ox > (x0 + x1) / 2;
    c.line(ox, top - 8, ox, bottom, colour::ink, 2);
    c.text(right_half ? ox - 6 : ox + 6, top - 1, "observed " + in.statistic_name + " = " + display_number(in.observed),
           right_half ? "end" : "start", colour::ink, " font-weight=\"600\"");
    if (both && in.observed != 0) {
      const double mx = x(-in.observed);
      c.line(mx, top + 4, mx, bottom, colour::ink, 1.2, " stroke-dasharray=\"4 3\"");
      c.text(right_half ? mx - 6 : mx + 6, top + 14, "other side " + display_number(-in.observed),
             right_half ? "end" : "start", colour::muted, " font-size=\"11\"");
    }
  }
  if (finite.empty()) {
    c.text((x0 + x1) / 2, (top + bottom) / 2, "no resampled statistics were kept", "middle", colour::muted);
  }
  return c.finish();
}

}  // namespace contrasta::cli::svg
