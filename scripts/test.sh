#!/usr/bin/env bash
# The full check, as CI runs it (.ci/run execs this):
#   1. install the Debian packages the project needs
#   2. dev preset (GCC, Debug): library, header checks, unit tests, tools, command
#      tests, bench, firmware example; ctest (unit, command, consumer tests)
#   3. clang-strict preset: header checks, unit tests and examples with clang, -Werror;
#      ctest
#   4. arm-m4f and arm-m0plus presets: header checks and the firmware example
#      cross-compiled with arm-none-eabi; size report
#   5. a brief smoke run of the benchmarks
# Exits non-zero on the first failure.
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."

jobs="${JOBS:-2}"
export CTEST_OUTPUT_ON_FAILURE=1
start=$SECONDS

step() { printf '\n==== %s  [%ds]\n' "$*" "$((SECONDS - start))"; }

step "dependencies"
scripts/install-deps.sh

step "dev: configure and build (GCC, Debug, tests + tools + bench + examples)"
cmake --preset dev
cmake --build --preset dev -j "$jobs"

step "dev: ctest (unit, command and consumer tests)"
ctest --test-dir build/dev --output-on-failure -j "$jobs"

step "clang-strict: headers alone, unit tests and examples with clang (-Werror, -fno-exceptions -fno-rtti for headers)"
cmake --preset clang-strict
cmake --build --preset clang-strict -j "$jobs"
ctest --test-dir build/clang-strict --output-on-failure -j "$jobs"

size_report() {
  local elf="$1"
  echo "-- size of ${elf#build/}:"
  arm-none-eabi-size "$elf"
}

double_helpers() {
  # Software double-precision helpers referenced by our own object file: on the
  # Cortex-M4F (single-precision FPU) they mean double arithmetic on the float path.
  local obj
  obj="$(find "$1" -path '*firmware*' -name 'main.cpp.obj' | head -n 1)"
  if [ -n "$obj" ]; then
    local refs
    refs="$(arm-none-eabi-nm -u "$obj" | awk '{print $2}' | grep -E '^__aeabi_(d|f2d|l2d|ul2d|i2d|ui2d)' || true)"
    if [ -n "$refs" ]; then
      echo "-- note: firmware example on $2 calls software double helpers:" $refs
    else
      echo "-- firmware example on $2: no software double helpers referenced"
    fi
  fi
}

float_path_check() {
  # Every public function instantiated for float (tests/header_checks/instantiate_float.cpp)
  # must reference no software double helper on the Cortex-M4F: the float path stays float.
  local obj refs
  obj="$(find "$1" -name 'instantiate_float.cpp.obj' | head -n 1)"
  if [ -z "$obj" ]; then
    echo "-- float-path check: instantiate_float.cpp.obj not found under $1" >&2
    return 1
  fi
  refs="$(arm-none-eabi-nm -u "$obj" | awk '{print $2}' | grep -E '^__aeabi_(d|f2d|l2d|ul2d|i2d|ui2d)' || true)"
  if [ -n "$refs" ]; then
    echo "-- float-path check FAILED: the float API calls software double helpers:" $refs >&2
    return 1
  fi
  echo "-- float-path check: every public function in float, no software double helpers"
}

for preset in arm-m4f arm-m0plus; do
  step "$preset: cross-compile headers and the firmware example (arm-none-eabi)"
  cmake --preset "$preset"
  cmake --build --preset "$preset" -j "$jobs"
  size_report "build/$preset/examples/firmware/counterflux_firmware_example.elf"
  double_helpers "build/$preset" "$preset"
  if [ "$preset" = arm-m4f ]; then float_path_check "build/$preset"; fi
done

step "bench: smoke run"
build/dev/bench/counterflux_bench --benchmark_min_time=0.01

step "all checks passed"
