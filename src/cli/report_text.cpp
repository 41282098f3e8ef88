#include "cli/report_text.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>

namespace contrasta::cli {

std::string xml_escape(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char ch : text) {
    switch (ch) {
      case '&':
        out += "&amp;";
        break;
      case '<':
        out += "&lt;";
        break;
      case '>':
        out += "&gt;";
        break;
      case '"':
        out += "&quot;";
        break;
      case '\'':
        out += "&#39;";
        break;
      default:
        // Control characters other than tab and newline are not allowed in XML 1.0 at all;
        // a level name that carries one is shown with a visible replacement instead.
        if (static_cast<unsigned char>(ch) < 0x20 && ch != '\t' && ch != '\n') {
          out += "\xEF\xBF\xBD";  // U+FFFD REPLACEMENT CHARACTER
        } else {
          out += ch;
        }
    }
  }
  return out;
}

std::string markdown_text(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char ch : text) {
    switch (ch) {
      case '&':
        out += "&amp;";
        break;
      case '<':
        out += "&lt;";
        break;
      case '>':
        out += "&gt;";
        break;
      case '|':
        out += "\\|";
        break;
      case '\\':
      case '`':
      case '*':
      case '_':
      case '[':
      case ']':
      case '#':
        out += '\\';
        out += ch;
        break;
      case '\n':
      case '\r':
        out += ' ';
        break;  // a newline would end the table row
      default:
        out += ch;
    }
  }
  return out;
}

namespace {
std::string printf_text(const char* format, int digits, double value) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, format, digits, value);
  std::string s = buffer;
  // "-0" or "-0.00" after rounding reads as a sign that is not there.
  if (s.front() == '-' && s.find_first_not_of("-0.") == std::string::npos) s.erase(0, 1);
  return s;
}
}  // namespace

std::string display_number(double value, int significant) {
  if (std::isnan(value)) return "n/a";
  if (std::isinf(value)) return value > 0 ? "inf" : "-inf";
  if (value == 0) return "0";
  if (significant < 1) significant = 1;
  const double magnitude = std::fabs(value);
  if (magnitude >= 1e6 || magnitude < 1e-4) return printf_text("%.*e", significant - 1, value);
  const int exponent = static_cast<int>(std::floor(std::log10(magnitude)));
  const int decimals = std::max(0, significant - 1 - exponent);
  return printf_text("%.*f", decimals, value);
}

std::string display_p(double p) {
  if (std::isnan(p)) return "n/a";
  if (p < 1e-4) return "< 0.0001";
  if (p >= 1) return "1.00";
  return display_number(p, 3);
}

std::string plain_number(double value, int significant) {
  if (!std::isfinite(value)) return display_number(value);
  std::string s = printf_text("%.*g", significant < 1 ? 1 : significant, value);
  return s;
}

std::string display_df(double df) {
  if (std::isfinite(df) && std::fabs(df - std::round(df)) < 1e-9 * std::max(1.0, std::fabs(df)) &&
      std::fabs(df) < 1e15) {
    return printf_text("%.*f", 0, df);
  }
  return display_number(df, 4);
}

std::string percent_text(double proportion) {
  return plain_number(proportion * 100, 4) + "%";
}

std::string adjustment_words(const std::string& name) {
  static const std::pair<const char*, const char*> names[] = {{"bonferroni", "Bonferroni"},
                                                              {"holm", "Holm"},
                                                              {"sidak", "Sidak"},
                                                              {"hochberg", "Hochberg"},
                                                              {"bh", "Benjamini-Hochberg"},
                                                              {"by", "Benjamini-Yekutieli"},
                                                              {"scheffe", "Scheffe"},
                                                              {"tukey", "Tukey-Kramer"},
                                                              {"games-howell", "Games-Howell"},
                                                              {"dunnett", "Dunnett"},
                                                              {"maxt", "max-T"}};
  for (const auto& [option, words] : names) {
    if (name == option) return words;
  }
  return name;
}

std::string count_text(double count) {
  if (!std::isfinite(count)) return display_number(count);
  std::string digits = printf_text("%.*f", 0, std::fabs(count));
  std::string out;
  for (std::size_t i = 0; i < digits.size(); ++i) {
    if (i > 0 && (digits.size() - i) % 3 == 0) out += ',';
    out += digits[i];
  }
  return count < 0 && out != "0" ? "-" + out : out;
}

std::string fixed_decimals(double value, int decimals) {
  if (!std::isfinite(value)) return display_number(value);
  return printf_text("%.*f", decimals < 0 ? 0 : decimals, value);
}

std::string percent_encode(std::string_view name) {
  static const char* hex = "0123456789ABCDEF";
  std::string out;
  for (char ch : name) {
    const auto byte = static_cast<unsigned char>(ch);
    if (std::isalnum(byte) || ch == '-' || ch == '.' || ch == '_' || ch == '~') {
      out += ch;
    } else {
      out += '%';
      out += hex[byte >> 4];
      out += hex[byte & 15];
    }
  }
  return out;
}

std::string shell_quote(std::string_view argument) {
  const bool plain = !argument.empty() && argument.find_first_not_of(
                                              "abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ"
                                              "0123456789-_./=:,+@%") == std::string_view::npos;
  if (plain) return std::string(argument);
  std::string out = "'";
  for (char ch : argument) {
    if (ch == '\'')
      out += "'\\''";
    else
      out += ch;
  }
  return out + "'";
}

}  // namespace contrasta::cli
