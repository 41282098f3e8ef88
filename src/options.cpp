#include "contrasta/options.hpp"

#include "contrasta/error.hpp"
#include "contrasta/version.hpp"

namespace contrasta {

std::string to_string(alternative side) {
  switch (side) {
    case alternative::greater: return "greater";
    case alternative::less: return "less";
    default: return "two-sided";
  }
}

alternative parse_alternative(const std::string& text) {
  if (text == "two-sided") return alternative::two_sided;
  if (text == "greater") return alternative::greater;
  if (text == "less") return alternative::less;
  throw usage_error("--alternative must be two-sided, greater or less, not '" + text + "'");
}

#ifndef CONTRASTA_VERSION
#define CONTRASTA_VERSION "0.0.0"
#endif
const char* version() { return CONTRASTA_VERSION; }

}  // namespace contrasta
