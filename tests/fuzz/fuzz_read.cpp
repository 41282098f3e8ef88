// Any byte string fed to the reader either yields datasets or throws input_error; nothing else.
#include <sstream>
#include <string>

#include "contrasta/error.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/read.hpp"

extern "C" int LLVMFuzzerTestOneInput(const unsigned char* data, std::size_t size) {
  std::string text(reinterpret_cast<const char*>(data), size);
  for (bool wide : {false, true}) {
    std::istringstream in(text);
    contrasta::read_request request;
    request.wide = wide;
    try {
      auto sets = contrasta::read_datasets(in, "fuzz", request);
      for (auto& d : sets) (void)contrasta::prepare(std::move(d));
    } catch (const contrasta::input_error&) {
    } catch (const contrasta::analysis_error&) {
    }
  }
  return 0;
}
