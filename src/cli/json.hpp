// A small streaming JSON writer: objects and arrays with automatic commas, numbers printed with
// 17 significant digits (shortest round-trip where possible), NaN and inf written as null.
#pragma once
#include <cstdint>
#include <optional>
#include <ostream>
#include <string>
#include <string_view>
#include <vector>

namespace contrasta::cli {

class json_writer {
 public:
  explicit json_writer(std::ostream& out, bool pretty = true) : out_(out), pretty_(pretty) {}

  json_writer& begin_object();
  json_writer& end_object();
  json_writer& begin_array();
  json_writer& end_array();
  json_writer& key(std::string_view k);

  json_writer& value(double v);
  json_writer& value(std::optional<double> v);
  json_writer& value(std::int64_t v);
  json_writer& value(std::uint64_t v);
  json_writer& value(int v) { return value(static_cast<std::int64_t>(v)); }
  json_writer& value(unsigned v) { return value(static_cast<std::uint64_t>(v)); }
  json_writer& value(bool v);
  json_writer& value(std::string_view v);
  json_writer& value(const char* v) { return value(std::string_view(v)); }
  json_writer& value(const std::string& v) { return value(std::string_view(v)); }
  json_writer& null();
  json_writer& strings(const std::vector<std::string>& list);

  template <class T>
  json_writer& field(std::string_view k, const T& v) {
    key(k);
    return value(v);
  }

 private:
  void separate();
  void newline();
  std::ostream& out_;
  bool pretty_;
  std::vector<bool> first_;  // per open container: no element written yet
  bool after_key_ = false;
};

// JSON string escaping (also used by the HTML writer for data attributes).
std::string json_escape(std::string_view s);
// Shortest decimal text that reads back to the same double ("null" for NaN/inf).
std::string number_text(double v);

}  // namespace contrasta::cli
