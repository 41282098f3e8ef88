#!/usr/bin/env bash
# contrasta set-up: installs the Debian packages that are missing, configures and builds, then
#   demo  runs `contrasta demo` on the bundled (invented) demo data;
#   test  runs the whole test suite (unit, reference, live differential and command-line tests).
# Idempotent and non-interactive; run as root on Debian 12 (or with sudo available).
set -euo pipefail
mode="${1:-demo}"
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$here"

packages=(cmake g++ make libeigen3-dev libboost-math-dev libtbb-dev libcli11-dev doctest-dev libpcg-cpp-dev)
if [ "$mode" = test ]; then
  # Reference libraries for the differential tests, a browser for the report test, clang for
  # the fuzz targets.
  packages+=(python3 python3-numpy python3-scipy python3-statsmodels chromium clang libclang-rt-14-dev)
fi
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ "${#missing[@]}" -gt 0 ]; then
  echo "setup: installing ${missing[*]}"
  sudo_cmd=""
  [ "$(id -u)" -ne 0 ] && sudo_cmd="sudo"
  export DEBIAN_FRONTEND=noninteractive
  $sudo_cmd apt-get update -qq
  $sudo_cmd apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
fi

build="${CONTRASTA_BUILD_DIR:-build}"
cmake -S . -B "$build" -DCMAKE_BUILD_TYPE=Release >/dev/null
cmake --build "$build" -j"$(nproc)"

case "$mode" in
  demo) "$build/contrasta" demo ;;
  test) ctest --test-dir "$build" --output-on-failure -j"$(nproc)" ;;
  *) echo "usage: scripts/setup.sh demo|test" >&2; exit 2 ;;
esac
