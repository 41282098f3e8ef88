#include "cli/agreement.hpp"

#include <algorithm>
#include <cmath>

#include "cli/format.hpp"
#include "cli/report_text.hpp"

namespace contrasta::cli {

agreement_table method_agreement(const comparison& result, double alpha) {
  agreement_table t;
  t.alpha = alpha;
  t.adjust = result.adjust.method;
  t.methods = result.methods;
  // Methods that appear in results but not in the list (a library caller's own set) still
  // get a column.
  for (const auto& c : result.contrasts) {
    for (const auto& r : c.results) {
      if (std::find(t.methods.begin(), t.methods.end(), r.method) == t.methods.end()) {
        t.methods.push_back(r.method);
      }
    }
  }
  // A method with no p-value for any contrast (not available, or never applicable) would only
  // add an empty column: it is listed apart instead.
  std::vector<std::string> all = std::move(t.methods);
  t.methods.clear();
  for (const auto& m : all) {
    bool any = false;
    for (const auto& c : result.contrasts) {
      for (const auto& r : c.results)
        any |= r.method == m && !std::isnan(std::isnan(r.p_adjusted) ? r.p_value : r.p_adjusted);
    }
    (any ? t.methods : t.without_result).push_back(m);
  }
  for (const auto& c : result.contrasts) {
    agreement_row row;
    row.contrast = c.spec.name;
    for (const auto& m : t.methods) {
      agreement_cell cell;
      auto it = std::find_if(c.results.begin(), c.results.end(), [&](const method_result& r) { return r.method == m; });
      if (it != c.results.end()) {
        const double p = std::isnan(it->p_adjusted) ? it->p_value : it->p_adjusted;
        if (!std::isnan(p)) {
          cell.available = true;
          cell.p = p;
          cell.estimate = it->estimate;
          cell.below_alpha = p < alpha;
          ++row.available;
          row.finding += cell.below_alpha;
        }
      }
      row.cells.push_back(cell);
    }
    if (row.available == 0)
      row.verdict = agreement_verdict::unavailable;
    else if (row.finding == row.available)
      row.verdict = agreement_verdict::all_find;
    else if (row.finding == 0)
      row.verdict = agreement_verdict::none_find;
    else
      row.verdict = agreement_verdict::split;
    t.split_rows += row.verdict == agreement_verdict::split;
    t.rows.push_back(std::move(row));
  }
  return t;
}

std::string verdict_words(agreement_verdict v) {
  switch (v) {
    case agreement_verdict::all_find:
      return "all find a difference";
    case agreement_verdict::none_find:
      return "none finds a clear difference";
    case agreement_verdict::split:
      return "DEPENDS ON METHOD";
    case agreement_verdict::unavailable:
      return "no method applies";
  }
  return "";
}

namespace {
std::size_t width_of(const std::string& s) {
  std::size_t n = 0;
  for (unsigned char ch : s) n += (ch & 0xC0) != 0x80;
  return n;
}
void pad(std::ostream& out, const std::string& s, std::size_t width, bool right) {
  const std::size_t w = width_of(s);
  const std::string fill(width > w ? width - w : 0, ' ');
  if (right)
    out << fill << s;
  else
    out << s << fill;
}
}  // namespace

void write_agreement_text(std::ostream& out, const agreement_table& t) {
  const std::string p_kind = t.adjust == "none" || t.adjust.empty() ? "p" : adjustment_words(t.adjust) + "-adjusted p";
  out << "Method agreement at alpha = " << plain_number(t.alpha) << " (" << p_kind
      << "; * = below alpha, - = no result for that method)\n";
  std::vector<std::vector<std::string>> cells;
  std::vector<std::string> header = {"contrast"};
  for (const auto& m : t.methods) header.push_back(m);
  header.push_back("conclusion");
  cells.push_back(header);
  for (const auto& row : t.rows) {
    std::vector<std::string> line = {row.contrast};
    for (const auto& cell : row.cells) {
      // p-values as the compare table above prints them.
      line.push_back(cell.available ? p_text(cell.p) + (cell.below_alpha ? " *" : "  ") : "-");
    }
    std::string conclusion = verdict_words(row.verdict);
    if (row.verdict == agreement_verdict::split) {
      conclusion += " (" + std::to_string(row.finding) + " of " + std::to_string(row.available) + ")";
    }
    line.push_back(conclusion);
    cells.push_back(line);
  }
  std::vector<std::size_t> widths(header.size(), 0);
  for (const auto& line : cells) {
    for (std::size_t i = 0; i < line.size(); ++i) widths[i] = std::max(widths[i], width_of(line[i]));
  }
  for (std::size_t r = 0; r < cells.size(); ++r) {
    const auto& line = cells[r];
    const bool split = r > 0 && t.rows[r - 1].verdict == agreement_verdict::split;
    out << (split ? "! " : "  ");
    for (std::size_t i = 0; i < line.size(); ++i) {
      if (i) out << "  ";
      const bool last = i + 1 == line.size();
      if (last)
        out << line[i];
      else
        pad(out, line[i], widths[i], i > 0 && r > 0);
    }
    out << '\n';
  }
  if (!t.without_result.empty()) {
    out << "  No p-value from: ";
    for (std::size_t i = 0; i < t.without_result.size(); ++i) out << (i ? ", " : "") << t.without_result[i];
    out << '\n';
  }
  if (t.split_rows > 0) {
    out << "! " << t.split_rows << " of " << t.rows.size()
        << " contrasts reach a different conclusion under different methods: read the "
           "recommended method and the reasons for it before deciding.\n";
  } else if (!t.rows.empty()) {
    out << "  Every method reaches the same conclusion for every contrast.\n";
  }
}

}  // namespace contrasta::cli
