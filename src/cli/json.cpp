#include "cli/json.hpp"

#include <charconv>
#include <cmath>

namespace contrasta::cli {

std::string number_text(double v) {
  if (!std::isfinite(v)) return "null";
  if (v == 0) return "0";
  char buf[64];
  auto [end, ec] = std::to_chars(buf, buf + sizeof buf, v);  // shortest text that reads back exactly
  return ec == std::errc() ? std::string(buf, end) : "null";
}

std::string json_escape(std::string_view s) {
  std::string out;
  out.reserve(s.size() + 2);
  for (char c : s) {
    unsigned char u = static_cast<unsigned char>(c);
    switch (c) {
      case '"': out += "\\\""; break;
      case '\\': out += "\\\\"; break;
      case '\n': out += "\\n"; break;
      case '\r': out += "\\r"; break;
      case '\t': out += "\\t"; break;
      default:
        if (u < 0x20 || u == 0x7F) {
          static const char hex[] = "0123456789abcdef";
          out += "\\u00";
          out += hex[u >> 4];
          out += hex[u & 15];
        } else if (c == '<') {
          out += "\\u003c";  // safe to embed in HTML
        } else {
          out += c;
        }
    }
  }
  return out;
}

void json_writer::newline() {
  if (!pretty_) return;
  out_ << '\n';
  for (std::size_t i = 0; i < first_.size(); ++i) out_ << "  ";
}

void json_writer::separate() {
  if (after_key_) {
    after_key_ = false;
    return;
  }
  if (!first_.empty()) {
    if (!first_.back()) out_ << ',';
    first_.back() = false;
    newline();
  }
}

json_writer& json_writer::begin_object() {
  separate();
  out_ << '{';
  first_.push_back(true);
  return *this;
}

json_writer& json_writer::end_object() {
  bool empty = first_.back();
  first_.pop_back();
  if (!empty) newline();
  out_ << '}';
  if (first_.empty()) out_ << '\n';
  return *this;
}

json_writer& json_writer::begin_array() {
  separate();
  out_ << '[';
  first_.push_back(true);
  return *this;
}

json_writer& json_writer::end_array() {
  bool empty = first_.back();
  first_.pop_back();
  if (!empty) newline();
  out_ << ']';
  return *this;
}

json_writer& json_writer::key(std::string_view k) {
  separate();
  out_ << '"' << json_escape(k) << "\":" << (pretty_ ? " " : "");
  after_key_ = true;
  return *this;
}

json_writer& json_writer::value(double v) {
  separate();
  out_ << number_text(v);
  return *this;
}

json_writer& json_writer::value(std::optional<double> v) {
  if (!v) return null();
  return value(*v);
}

json_writer& json_writer::value(std::int64_t v) {
  separate();
  out_ << v;
  return *this;
}

json_writer& json_writer::value(std::uint64_t v) {
  separate();
  out_ << v;
  return *this;
}

json_writer& json_writer::value(bool v) {
  separate();
  out_ << (v ? "true" : "false");
  return *this;
}

json_writer& json_writer::value(std::string_view v) {
  separate();
  out_ << '"' << json_escape(v) << '"';
  return *this;
}

json_writer& json_writer::null() {
  separate();
  out_ << "null";
  return *this;
}

json_writer& json_writer::strings(const std::vector<std::string>& list) {
  begin_array();
  for (const auto& s : list) value(s);
  return end_array();
}

}  // namespace contrasta::cli
