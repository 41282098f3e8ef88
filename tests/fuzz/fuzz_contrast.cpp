// Any text parsed as a contrast either yields coefficients or throws analysis_error.
#include <string>

#include "contrasta/contrast.hpp"
#include "contrasta/error.hpp"

extern "C" int LLVMFuzzerTestOneInput(const unsigned char* data, std::size_t size) {
  std::string text(reinterpret_cast<const char*>(data), size);
  static const std::vector<std::string> levels = {"peat", "coir", "bark compost", "wood fibre", "a", "b1", "10mg"};
  try {
    auto c = contrasta::parse_contrast(text, levels);
    contrasta::check_contrast(c, false);
  } catch (const contrasta::analysis_error&) {
  }
  try {
    (void)contrasta::parse_coefficients(text, levels);
  } catch (const contrasta::analysis_error&) {
  }
  return 0;
}
