#!/usr/bin/env bash
# `cmake --install` gives the binary, the headers, the library and a package config with which
# another CMake project can find_package(contrasta) and link contrasta::contrasta.
set -eu
bin="$1"; tests="$2"
build="$(dirname "$bin")"
tmp="$(mktemp -d)"; trap 'rm -rf "$tmp"' EXIT
cmake --install "$build" --prefix "$tmp/prefix" >/dev/null
test -x "$tmp/prefix/bin/contrasta"
test -f "$tmp/prefix/include/contrasta/comparison.hpp"
mkdir -p "$tmp/consumer"
cat > "$tmp/consumer/CMakeLists.txt" <<'CM'
cmake_minimum_required(VERSION 3.25)
project(consumer CXX)
set(CMAKE_CXX_STANDARD 20)
find_package(contrasta REQUIRED)
add_executable(consumer main.cpp)
target_link_libraries(consumer PRIVATE contrasta::contrasta)
CM
cat > "$tmp/consumer/main.cpp" <<'CPP'
#include <contrasta/classical.hpp>
#include <contrasta/contrast.hpp>
#include <cstdio>
int main() {
  auto p = contrasta::prepare(contrasta::make_dataset({"a", "b"}, {{1, 2, 3, 4}, {3, 4, 5, 7}}));
  auto c = contrasta::parse_contrast("b - a", p.data.levels);
  auto r = contrasta::welch_contrast(p, c, {});
  std::printf("%.4f\n", r.estimate);
  return r.estimate == 2.25 ? 0 : 1;
}
CPP
cmake -S "$tmp/consumer" -B "$tmp/consumer/build" -DCMAKE_PREFIX_PATH="$tmp/prefix" >/dev/null
cmake --build "$tmp/consumer/build" >/dev/null
"$tmp/consumer/build/consumer"
"$tmp/prefix/bin/contrasta" --version
echo "install: 1 passed, 0 failed"
