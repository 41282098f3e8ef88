#include "cli/format.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace contrasta::cli {

std::string fixed(double v, int decimals) {
  if (std::isnan(v)) return "n/a";
  if (std::isinf(v)) return v > 0 ? "inf" : "-inf";
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", std::clamp(decimals, 0, 12), v);
  std::string s(buf);
  if (s == "-0" || s.find_first_not_of("-0.") == std::string::npos) s.erase(0, s[0] == '-' ? 1 : 0);
  return s;
}

int decimals_for(double scale) {
  if (!std::isfinite(scale) || scale <= 0) return 3;
  return std::clamp(2 - static_cast<int>(std::floor(std::log10(scale))), 0, 10);
}

std::string p_text(double p) {
  if (std::isnan(p)) return "n/a";
  char buf[32];
  if (p >= 0.001 || p == 0) {
    std::snprintf(buf, sizeof buf, "%.4f", p);
  } else if (p < 1e-300) {
    return "<1e-300";
  } else {
    std::snprintf(buf, sizeof buf, "%.2e", p);
  }
  return buf;
}

std::string general(double v, int significant) {
  if (std::isnan(v)) return "n/a";
  if (std::isinf(v)) return v > 0 ? "inf" : "-inf";
  if (v == 0) return "0";
  double a = std::abs(v);
  if (a < 1e15 && v == std::round(v)) return fixed(v, 0);
  if (a >= 1e-4 && a < 1e9) {
    int decimals = std::max(0, significant - 1 - static_cast<int>(std::floor(std::log10(a))));
    std::string s = fixed(v, decimals);
    if (s.find('.') != std::string::npos) {
      while (s.back() == '0') s.pop_back();
      if (s.back() == '.') s.pop_back();
    }
    return s;
  }
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*e", significant - 1, v);
  return buf;
}

std::size_t display_width(const std::string& s) {
  std::size_t w = 0;
  for (unsigned char c : s) w += (c & 0xC0) != 0x80;
  return w;
}

void text_table::print(std::ostream& out, const std::string& indent) const {
  std::vector<std::size_t> width(header.size(), 0);
  for (std::size_t i = 0; i < header.size(); ++i) width[i] = display_width(header[i]);
  for (const auto& r : rows)
    for (std::size_t i = 0; i < r.size() && i < width.size(); ++i) width[i] = std::max(width[i], display_width(r[i]));
  auto line = [&](const std::vector<std::string>& cells) {
    std::string s = indent;
    for (std::size_t i = 0; i < header.size(); ++i) {
      std::string cell = i < cells.size() ? cells[i] : "";
      std::size_t pad = width[i] - display_width(cell);
      bool r = i < right.size() && right[i];
      if (i) s += "  ";
      if (r) s += std::string(pad, ' ') + cell;
      else s += cell + (i + 1 < header.size() ? std::string(pad, ' ') : "");
    }
    while (!s.empty() && s.back() == ' ') s.pop_back();
    out << s << '\n';
  };
  line(header);
  for (const auto& r : rows) line(r);
}

std::string markdown_escape(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (c == '|') out += "\\|";
    else if (c == '\n' || c == '\r') out += ' ';
    else if (c == '<') out += "&lt;";
    else if (c == '>') out += "&gt;";
    else if (c == '*' || c == '_' || c == '`' || c == '[' || c == ']') { out += '\\'; out += c; }
    else out += c;
  }
  return out;
}

void text_table::print_markdown(std::ostream& out) const {
  out << '|';
  for (const auto& h : header) out << ' ' << markdown_escape(h) << " |";
  out << "\n|";
  for (std::size_t i = 0; i < header.size(); ++i) out << (i < right.size() && right[i] ? " ---: |" : " --- |");
  out << '\n';
  for (const auto& r : rows) {
    out << '|';
    for (std::size_t i = 0; i < header.size(); ++i) out << ' ' << markdown_escape(i < r.size() ? r[i] : "") << " |";
    out << '\n';
  }
}

}  // namespace contrasta::cli
