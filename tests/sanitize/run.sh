#!/usr/bin/env bash
# Builds the unit tests with clang 14, AddressSanitizer and UndefinedBehaviorSanitizer
# (CMake option SETTLEWELL_SANITIZE) in BUILD_DIR, apart from the GCC build, and runs
# them: any finding of either sanitizer, or a leak not in lsan_suppressions.txt, fails.
#   tests/sanitize/run.sh BUILD_DIR [JOBS]
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
source_dir="$(cd "$here/../.." && pwd)"
build="$1"
jobs="${2:-1}"
# Exported before the build too: gtest_discover_tests runs the binary to list its tests.
# fast_unwind_on_malloc=0: the GCC-built MPI, PETSc and deal.II keep no frame pointers,
# and the suppressions need the whole stack of an allocation, down to MPI_Init.
export ASAN_OPTIONS="halt_on_error=1:detect_leaks=1:fast_unwind_on_malloc=0:detect_stack_use_after_return=1:check_initialization_order=1:strict_string_checks=1"
export UBSAN_OPTIONS="halt_on_error=1:print_stacktrace=1"
export LSAN_OPTIONS="suppressions=$here/lsan_suppressions.txt:print_suppressions=1"
cmake -S "$source_dir" -B "$build" -DCMAKE_BUILD_TYPE=Release -DCMAKE_CXX_COMPILER=clang++-14 \
  -DSETTLEWELL_SANITIZE=ON >/dev/null
cmake --build "$build" --target unit_tests -j"$jobs"
# One process for all the unit tests: MPI and PETSc start once, as in the GCC build.
"$build/tests/unit_tests" --gtest_brief=1
