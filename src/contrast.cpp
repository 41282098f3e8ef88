// The contrast expression language: linear combinations of level names.
//   expression := term (('+' | '-') term)*
//   term       := factor (('*' | '/') factor)*
//   factor     := ('+' | '-') factor | number | level | '[' any text ']' | '(' expression ')'
// Every sub-expression evaluates to a linear form (coefficients per level plus a constant);
// products need one constant side and divisors must be constants.
#include "contrasta/contrast.hpp"

#include <cctype>
#include <cstdio>
#include <optional>
#include <cmath>
#include <fstream>
#include <numeric>

#include "contrasta/decimal.hpp"
#include "contrasta/error.hpp"

namespace contrasta {

double contrast::coefficient_sum() const {
  // Compensated so that 1/3 + 1/3 + 1/3 - 1 is recognised as zero.
  long double s = 0;
  for (double c : coefficients) s += c;
  return static_cast<double>(s);
}

bool contrast::sums_to_zero() const {
  double scale = 0;
  for (double c : coefficients) scale += std::abs(c);
  return std::abs(coefficient_sum()) <= 1e-9 * scale;
}

std::vector<std::size_t> contrast::involved() const {
  std::vector<std::size_t> out;
  for (std::size_t i = 0; i < coefficients.size(); ++i)
    if (coefficients[i] != 0) out.push_back(i);
  return out;
}

bool contrast::is_pair() const {
  auto [a, b] = two_levels();
  return a != static_cast<std::size_t>(-1) && coefficients[a] == 1 && coefficients[b] == -1;
}

std::pair<std::size_t, std::size_t> contrast::two_levels() const {
  constexpr auto none = static_cast<std::size_t>(-1);
  auto idx = involved();
  if (idx.size() != 2) return {none, none};
  std::size_t a = idx[0], b = idx[1];
  if (coefficients[a] < 0) std::swap(a, b);
  if (!(coefficients[a] > 0 && coefficients[b] < 0)) return {none, none};
  return {a, b};
}

namespace {

struct linear_form {
  std::vector<double> coefficients;
  double constant = 0;
  bool is_constant() const {
    for (double c : coefficients)
      if (c != 0) return false;
    return true;
  }
};

std::string level_list(const std::vector<std::string>& levels) {
  std::string out;
  for (std::size_t i = 0; i < levels.size(); ++i) {
    if (i) out += ", ";
    out += levels[i];
  }
  return out;
}

class expression_parser {
 public:
  expression_parser(std::string_view text, const std::vector<std::string>& levels, std::string_view whole)
      : s_(text), levels_(levels), whole_(whole) {}

  linear_form parse() {
    skip();
    if (at_end()) fail("the expression is empty");
    linear_form f = expression();
    skip();
    if (!at_end()) fail(std::string("unexpected '") + s_[i_] + "'");
    return f;
  }

 private:
  [[noreturn]] void fail(const std::string& what) const {
    throw analysis_error("contrast '" + std::string(whole_) + "': " + what + " at character " +
                         std::to_string(i_ + 1) + " of the expression; write it like '(a + b)/2 - c', " +
                         "with [brackets] around level names that contain spaces or symbols");
  }
  bool at_end() const { return i_ >= s_.size(); }
  void skip() {
    while (!at_end() && std::isspace(static_cast<unsigned char>(s_[i_]))) ++i_;
  }
  static bool identifier_char(char c) {
    unsigned char u = static_cast<unsigned char>(c);
    return std::isalnum(u) || c == '_' || c == '.' || u >= 0x80;
  }

  linear_form zero() const { return linear_form{std::vector<double>(levels_.size(), 0.0), 0}; }

  linear_form expression() {
    linear_form left = term();
    for (;;) {
      skip();
      if (at_end() || (s_[i_] != '+' && s_[i_] != '-')) return left;
      char op = s_[i_++];
      linear_form right = term();
      double sign = op == '+' ? 1 : -1;
      for (std::size_t j = 0; j < left.coefficients.size(); ++j) left.coefficients[j] += sign * right.coefficients[j];
      left.constant += sign * right.constant;
    }
  }

  linear_form term() {
    linear_form left = factor();
    for (;;) {
      skip();
      if (at_end() || (s_[i_] != '*' && s_[i_] != '/')) return left;
      char op = s_[i_++];
      std::size_t where = i_;
      linear_form right = factor();
      if (op == '*') {
        if (!left.is_constant() && !right.is_constant()) {
          i_ = where;
          fail("two level means are multiplied; a contrast must be linear in the means");
        }
        if (left.is_constant()) std::swap(left, right);
        double k = right.constant;
        for (double& c : left.coefficients) c *= k;
        left.constant *= k;
      } else {
        if (!right.is_constant()) {
          i_ = where;
          fail("division by a level mean; only numbers may divide");
        }
        if (right.constant == 0) {
          i_ = where;
          fail("division by zero");
        }
        for (double& c : left.coefficients) c /= right.constant;
        left.constant /= right.constant;
      }
    }
  }

  linear_form factor() {
    skip();
    if (at_end()) fail("an operand is missing");
    char c = s_[i_];
    if (c == '+' || c == '-') {
      ++i_;
      linear_form f = factor();
      if (c == '-') {
        for (double& x : f.coefficients) x = -x;
        f.constant = -f.constant;
      }
      return f;
    }
    if (c == '(') {
      ++i_;
      linear_form f = expression();
      skip();
      if (at_end() || s_[i_] != ')') fail("a closing ')' is missing");
      ++i_;
      return f;
    }
    if (c == '[') {
      std::size_t start = ++i_;
      while (!at_end() && s_[i_] != ']') ++i_;
      if (at_end()) {
        i_ = start - 1;
        fail("a closing ']' is missing");
      }
      std::string name(s_.substr(start, i_ - start));
      ++i_;
      return level(name, start - 1);
    }
    if (std::isdigit(static_cast<unsigned char>(c)) || c == '.') {
      std::size_t start = i_;
      while (!at_end() && (std::isdigit(static_cast<unsigned char>(s_[i_])) || s_[i_] == '.')) ++i_;
      if (!at_end() && (s_[i_] == 'e' || s_[i_] == 'E')) {
        std::size_t save = i_++;
        if (!at_end() && (s_[i_] == '+' || s_[i_] == '-')) ++i_;
        if (at_end() || !std::isdigit(static_cast<unsigned char>(s_[i_]))) {
          i_ = save;
        } else {
          while (!at_end() && std::isdigit(static_cast<unsigned char>(s_[i_]))) ++i_;
        }
      }
      auto d = parse_decimal(s_.substr(start, i_ - start));
      if (!d) {
        i_ = start;
        fail("malformed number");
      }
      // A number directly followed by letters is a level name that starts with a digit.
      if (!at_end() && identifier_char(s_[i_]) && s_[i_] != '.') {
        while (!at_end() && identifier_char(s_[i_])) ++i_;
        return level(std::string(s_.substr(start, i_ - start)), start);
      }
      linear_form f = zero();
      f.constant = to_double(*d);
      return f;
    }
    if (identifier_char(c)) {
      std::size_t start = i_;
      while (!at_end() && identifier_char(s_[i_])) ++i_;
      return level(std::string(s_.substr(start, i_ - start)), start);
    }
    fail(std::string("unexpected '") + c + "'");
  }

  linear_form level(const std::string& name, std::size_t where) {
    for (std::size_t j = 0; j < levels_.size(); ++j) {
      if (levels_[j] == name) {
        linear_form f = zero();
        f.coefficients[j] = 1;
        return f;
      }
    }
    i_ = where;
    std::string hint;
    for (const auto& l : levels_) {
      if (l.size() == name.size() &&
          std::equal(l.begin(), l.end(), name.begin(), [](char a, char b) {
            return std::tolower(static_cast<unsigned char>(a)) == std::tolower(static_cast<unsigned char>(b));
          }))
        hint = " (did you mean '" + l + "'? level names are case-sensitive)";
    }
    fail("unknown level '" + name + "'" + hint + "; the levels are: " + level_list(levels_));
  }

  std::string_view s_;
  const std::vector<std::string>& levels_;
  std::string_view whole_;
  std::size_t i_ = 0;
};

// Splits "NAME: EXPR" at the first colon outside [brackets].
std::pair<std::string, std::string> split_name(std::string_view text) {
  int depth = 0;
  for (std::size_t i = 0; i < text.size(); ++i) {
    if (text[i] == '[') ++depth;
    if (text[i] == ']') --depth;
    if (text[i] == ':' && depth == 0) {
      auto trim = [](std::string_view s) {
        while (!s.empty() && std::isspace(static_cast<unsigned char>(s.front()))) s.remove_prefix(1);
        while (!s.empty() && std::isspace(static_cast<unsigned char>(s.back()))) s.remove_suffix(1);
        return std::string(s);
      };
      return {trim(text.substr(0, i)), trim(text.substr(i + 1))};
    }
  }
  std::string_view s = text;
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.front()))) s.remove_prefix(1);
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.back()))) s.remove_suffix(1);
  return {"", std::string(s)};
}

}  // namespace

contrast parse_contrast(std::string_view text, const std::vector<std::string>& levels) {
  auto [name, expr] = split_name(text);
  expression_parser parser(expr, levels, text);
  linear_form f = parser.parse();
  if (f.constant != 0)
    throw analysis_error("contrast '" + std::string(text) +
                         "': a constant term is not a contrast of means; remove the number that stands alone");
  contrast c;
  c.name = name.empty() ? expr : name;
  c.expression = expr;
  c.coefficients = std::move(f.coefficients);
  return c;
}

contrast parse_coefficients(std::string_view text, const std::vector<std::string>& levels) {
  auto [name, list] = split_name(text);
  contrast c;
  c.name = name.empty() ? list : name;
  c.expression = "";
  std::size_t start = 0;
  while (start <= list.size()) {
    std::size_t comma = list.find(',', start);
    std::string item = list.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
    // A coefficient may be a fraction such as 1/3.
    std::size_t slash = item.find('/');
    std::optional<decimal> num = parse_decimal(item.substr(0, slash));
    std::optional<decimal> den = slash == std::string::npos ? parse_decimal("1") : parse_decimal(item.substr(slash + 1));
    if (!num || !den || to_double(*den) == 0)
      throw analysis_error("--coefficients '" + std::string(text) + "': '" + item +
                           "' is not a number; give one number (or fraction like 1/3) per level, separated by commas");
    c.coefficients.push_back(to_double(*num) / to_double(*den));
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  if (c.coefficients.size() != levels.size())
    throw analysis_error("--coefficients '" + std::string(text) + "' gives " + std::to_string(c.coefficients.size()) +
                         " numbers for " + std::to_string(levels.size()) + " levels (" + level_list(levels) +
                         "); give one per level in that order");
  std::string expr;
  for (std::size_t i = 0; i < levels.size(); ++i) {
    if (c.coefficients[i] == 0) continue;
    char buf[64];
    std::snprintf(buf, sizeof buf, "%s%.6g*", c.coefficients[i] < 0 ? " - " : (expr.empty() ? "" : " + "),
                  std::abs(c.coefficients[i]));
    expr += buf;
    expr += "[" + levels[i] + "]";
  }
  c.expression = expr;
  if (name.empty()) c.name = expr;
  return c;
}

std::vector<contrast> read_contrast_file(const std::string& path, const std::vector<std::string>& levels) {
  std::ifstream in(path);
  if (!in) throw input_error("cannot open contrast file '" + path + "'; check the path");
  std::vector<contrast> out;
  std::string line;
  std::size_t number = 0;
  while (std::getline(in, line)) {
    ++number;
    if (auto hash = line.find('#'); hash != std::string::npos) line.erase(hash);
    if (line.find_first_not_of(" \t\r") == std::string::npos) continue;
    if (!line.empty() && line.back() == '\r') line.pop_back();
    try {
      out.push_back(parse_contrast(line, levels));
    } catch (const analysis_error& e) {
      throw analysis_error(path + " line " + std::to_string(number) + ": " + e.what());
    }
  }
  if (out.empty()) throw input_error("contrast file '" + path + "' has no contrasts; write one 'NAME: EXPR' per line");
  return out;
}

void check_contrast(const contrast& c, bool allow_linear) {
  double scale = 0;
  for (double x : c.coefficients) {
    if (!std::isfinite(x)) throw analysis_error("contrast '" + c.name + "' has a non-finite coefficient");
    scale += std::abs(x);
  }
  if (scale == 0) throw analysis_error("contrast '" + c.name + "' has every coefficient zero; name at least two levels");
  if (allow_linear) return;
  double sum = c.coefficient_sum();
  if (!c.sums_to_zero()) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.6g", sum);
    throw analysis_error("contrast '" + c.name + "': the coefficients sum to " + buf +
                         ", not zero, so it compares no means; balance the levels (e.g. (a + b)/2 - c), or add --allow-linear to estimate a linear combination");
  }
}

}  // namespace contrasta
