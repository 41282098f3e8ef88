// Reading the JSON reference fixtures written by tests/reference/*_fixtures.py, and the datasets
// the tests build from their lists of groups.
// A minimal JSON reader for test code only (the product writes JSON but never reads it).
#pragma once
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <map>
#include <memory>
#include <sstream>
#include <stdexcept>
#include <string>
#include <variant>
#include <vector>

#include "contrasta/prepared.hpp"

namespace fixture {

struct value;
using array = std::vector<value>;
using object = std::map<std::string, value>;

struct value {
  std::variant<std::nullptr_t, bool, double, std::string, std::shared_ptr<array>, std::shared_ptr<object>> v;
  bool is_null() const { return std::holds_alternative<std::nullptr_t>(v); }
  double num() const {
    if (is_null()) return std::nan("");
    return std::get<double>(v);
  }
  bool boolean() const { return std::get<bool>(v); }
  const std::string& str() const { return std::get<std::string>(v); }
  const array& arr() const { return *std::get<std::shared_ptr<array>>(v); }
  const object& obj() const { return *std::get<std::shared_ptr<object>>(v); }
  const value& operator[](const std::string& k) const {
    auto& o = obj();
    auto it = o.find(k);
    if (it == o.end()) throw std::runtime_error("fixture: no key " + k);
    return it->second;
  }
  const value& operator[](std::size_t i) const { return arr().at(i); }
  bool has(const std::string& k) const { return obj().count(k) != 0; }
  std::size_t size() const { return arr().size(); }
  std::vector<double> numbers() const {
    std::vector<double> out;
    for (auto& x : arr()) out.push_back(x.num());
    return out;
  }
  std::vector<std::string> strings() const {
    std::vector<std::string> out;
    for (auto& x : arr()) out.push_back(x.str());
    return out;
  }
};

class parser {
 public:
  explicit parser(const std::string& text) : s_(text) {}
  value parse() {
    value v = any();
    ws();
    if (i_ != s_.size()) fail("trailing text");
    return v;
  }

 private:
  [[noreturn]] void fail(const char* what) { throw std::runtime_error(std::string("fixture JSON: ") + what + " at " + std::to_string(i_)); }
  void ws() {
    while (i_ < s_.size() && (s_[i_] == ' ' || s_[i_] == '\n' || s_[i_] == '\r' || s_[i_] == '\t')) ++i_;
  }
  bool lit(const char* w) {
    std::string_view sv(w);
    if (s_.compare(i_, sv.size(), sv) == 0) {
      i_ += sv.size();
      return true;
    }
    return false;
  }
  value any() {
    ws();
    if (i_ >= s_.size()) fail("unexpected end");
    char c = s_[i_];
    if (c == '{') {
      ++i_;
      auto o = std::make_shared<object>();
      ws();
      if (s_[i_] == '}') { ++i_; return value{o}; }
      for (;;) {
        ws();
        std::string k = string();
        ws();
        if (s_[i_++] != ':') fail("expected :");
        (*o)[k] = any();
        ws();
        if (s_[i_] == ',') { ++i_; continue; }
        if (s_[i_] == '}') { ++i_; break; }
        fail("expected , or }");
      }
      return value{o};
    }
    if (c == '[') {
      ++i_;
      auto a = std::make_shared<array>();
      ws();
      if (s_[i_] == ']') { ++i_; return value{a}; }
      for (;;) {
        a->push_back(any());
        ws();
        if (s_[i_] == ',') { ++i_; continue; }
        if (s_[i_] == ']') { ++i_; break; }
        fail("expected , or ]");
      }
      return value{a};
    }
    if (c == '"') return value{string()};
    if (lit("null")) return value{nullptr};
    if (lit("true")) return value{true};
    if (lit("false")) return value{false};
    if (lit("NaN")) return value{std::nan("")};
    if (lit("Infinity")) return value{HUGE_VAL};
    if (lit("-Infinity")) return value{-HUGE_VAL};
    char* end = nullptr;
    double d = std::strtod(s_.c_str() + i_, &end);
    if (end == s_.c_str() + i_) fail("bad value");
    i_ = static_cast<std::size_t>(end - s_.c_str());
    return value{d};
  }
  std::string string() {
    if (s_[i_] != '"') fail("expected string");
    ++i_;
    std::string out;
    while (i_ < s_.size() && s_[i_] != '"') {
      char c = s_[i_++];
      if (c == '\\') {
        char e = s_[i_++];
        switch (e) {
          case 'n': out += '\n'; break;
          case 't': out += '\t'; break;
          case 'r': out += '\r'; break;
          case 'b': out += '\b'; break;
          case 'f': out += '\f'; break;
          case 'u': {
            unsigned cp = static_cast<unsigned>(std::stoul(s_.substr(i_, 4), nullptr, 16));
            i_ += 4;
            if (cp < 0x80) out += static_cast<char>(cp);
            else if (cp < 0x800) { out += static_cast<char>(0xC0 | (cp >> 6)); out += static_cast<char>(0x80 | (cp & 0x3F)); }
            else { out += static_cast<char>(0xE0 | (cp >> 12)); out += static_cast<char>(0x80 | ((cp >> 6) & 0x3F)); out += static_cast<char>(0x80 | (cp & 0x3F)); }
            break;
          }
          default: out += e;
        }
      } else {
        out += c;
      }
    }
    ++i_;
    return out;
  }
  const std::string& s_;
  std::size_t i_ = 0;
};

inline value parse(const std::string& text) { return parser(text).parse(); }

// Loads tests/data/NAME.json, or the file named by $CONTRASTA_FIXTURE when set (the live
// differential runs point it at freshly generated fixtures).
inline value load(const std::string& name) {
  std::string path = std::string(CONTRASTA_TEST_DATA) + "/" + name + ".json";
  if (const char* env = std::getenv("CONTRASTA_FIXTURE")) path = env;
  std::ifstream in(path);
  if (!in) throw std::runtime_error("cannot open fixture " + path);
  std::stringstream ss;
  ss << in.rdbuf();
  return parse(ss.str());
}

// Relative difference, with an absolute floor for values near zero.
inline double relative_error(double got, double want, double floor = 1e-300) {
  if (std::isnan(got) && std::isnan(want)) return 0;
  if (std::isinf(got) && std::isinf(want) && (got > 0) == (want > 0)) return 0;
  return std::abs(got - want) / std::max(std::abs(want), floor);
}

// A fixture's list of groups, each a list of numbers.
inline std::vector<std::vector<double>> groups_of(const value& v) {
  std::vector<std::vector<double>> out;
  for (const auto& g : v.arr()) out.push_back(g.numbers());
  return out;
}

// The groups as a prepared dataset with levels g0, g1, ...
inline contrasta::prepared_data prepared_of(const std::vector<std::vector<double>>& groups) {
  std::vector<std::string> levels;
  for (std::size_t i = 0; i < groups.size(); ++i) {
    std::string name = "g";  // appended, not "g" + to_string: GCC 12 warns falsely (-Wrestrict) on that
    name += std::to_string(i);
    levels.push_back(name);
  }
  return contrasta::prepare(contrasta::make_dataset(levels, groups));
}

}  // namespace fixture
