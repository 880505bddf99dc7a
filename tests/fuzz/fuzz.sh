#!/usr/bin/env bash
# Builds a fuzz target with clang 14 (libFuzzer, AddressSanitizer,
# UndefinedBehaviorSanitizer) and runs it on its corpus for SECONDS seconds.
#   tests/fuzz/fuzz.sh [TARGET] BUILD_DIR SECONDS [more libFuzzer options]
# TARGET (the binary is BUILD_DIR/TARGET_fuzz, its working corpus BUILD_DIR/CORPUS):
#   scenario (the default)  scenario_fuzz.cc, the scenario reader and validator;
#                           CORPUS corpus (tests/fuzz/corpus + found_corpus.tar.gz)
#   mesh                    mesh_fuzz.cc, the mesh reader's checks on plain data;
#                           CORPUS mesh_corpus (tests/fuzz/mesh_corpus +
#                           mesh_found_corpus.tar.gz)
#   mesh_file               mesh_file_fuzz.cc, .msh text through Gmsh and the checks;
#                           CORPUS mesh_file_corpus (the bad-input meshes and
#                           meshes/layered-column.msh)
# Inputs that reach new code go into BUILD_DIR/CORPUS; to keep them, merge a minimal
# set (BUILD_DIR/TARGET_fuzz -merge=1 NEW tests/fuzz/CORPUS BUILD_DIR/CORPUS) and
# pack NEW as the target's .tar.gz. A crash leaves its input as BUILD_DIR/crash-*
# and the script fails; MESH_FUZZ_PRINT=1 BUILD_DIR/mesh_fuzz crash-* prints the
# mesh a mesh_fuzz input decodes to.
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
source_dir="$(cd "$here/../.." && pwd)"
target=scenario
case "$1" in scenario | mesh | mesh_file) target="$1"; shift ;; esac
build="$1"
seconds="$2"
shift 2
mkdir -p "$build"
binary="$build/${target}_fuzz"
flags=(-std=c++17 -O1 -g -fsanitize=fuzzer,address,undefined -fno-sanitize-recover=undefined
       -I"$source_dir/include" -I"$build")
libraries=()
seeds=("$here/$([ "$target" = scenario ] && echo corpus || echo "${target}_corpus")")
found="$here/$([ "$target" = scenario ] && echo found_corpus || echo "${target}_found_corpus").tar.gz"
mesh=("$source_dir/src/mesh/gmsh_checks.cc" "$source_dir/src/mesh/name_table.cc")
case "$target" in
scenario)
  sources=("$here/scenario_fuzz.cc" "$source_dir"/src/scenario/*.cc "$source_dir"/src/materials/*.cc
           "$source_dir/src/core/files.cc" "$source_dir/src/core/number_text.cc")
  # toml++ 3.3.0 asserts (in a Release build: assumes) that a table header starts
  # with a key, and "[ = 1" breaks that before its own error is raised; the Release
  # binary gives the parse error (tests/bad-input/toml_header_without_key.toml).
  # Its asserts are off here so that the fuzzer looks past it, into our code.
  flags+=('-DTOML_ASSERT(expr)=static_assert(true)' -fsanitize-ignorelist="$here/ubsan_ignore.txt"
          -I"$source_dir/src/scenario") ;;
mesh)
  sources=("$here/mesh_fuzz.cc" "${mesh[@]}") ;;
mesh_file)
  sources=("$here/mesh_file_fuzz.cc" "$source_dir/src/mesh/gmsh_model.cc"
           "$source_dir/src/mesh/gmsh_grid.cc" "${mesh[@]}")
  libraries+=(-lgmsh)
  seeds=("$source_dir/tests/bad-input/meshes" "$source_dir/meshes/layered-column.msh")
  export LSAN_OPTIONS="suppressions=$here/lsan_ignore_gmsh.txt:print_suppressions=0${LSAN_OPTIONS:+:$LSAN_OPTIONS}" ;;
esac
if [ "$target" != scenario ]; then
  # Debian's deal.II debug library (-DDEBUG must match it): its internal assertions
  # stop the fuzzer on a mesh deal.II cannot take, which the Release library would
  # take on silently. Its headers pull in MPI, PETSc and Trilinos headers (and two
  # Teuchos symbols); p4est is started as deal.II starts it.
  flags+=(-DDEBUG -DBOOST_NO_AUTO_PTR -I"$source_dir/src/mesh" -I"$here"
          -isystem /usr/lib/x86_64-linux-gnu/openmpi/include
          -isystem /usr/lib/x86_64-linux-gnu/openmpi/include/openmpi
          -isystem /usr/include/trilinos -isystem /usr/include/hdf5/openmpi
          -isystem /usr/include/suitesparse -isystem /usr/include/petsc)
  libraries+=(-ldeal.ii.g -ltrilinos_teuchoscomm -ltrilinos_teuchoscore -lmpi -lp4est -lsc)
fi
if [ ! -x "$binary" ] ||
   [ -n "$(find "${sources[@]}" "$source_dir/include" "$source_dir/src/mesh/gmsh_checks.h" \
             "$here/mesh_fuzz_support.h" "$here/ubsan_ignore.txt" -newer "$binary" | head -1)" ]; then
  echo "fuzz.sh: building $binary"
  clang++-14 "${flags[@]}" "${sources[@]}" -o "$binary" "${libraries[@]}"
fi
corpus="$build/$([ "$target" = scenario ] && echo corpus || echo "${target}_corpus")"
# FUZZ_FRESH=1 (the CTest smoke runs): start from the kept corpus alone, so that a
# fixed -seed and -runs make the same run every time.
if [ "${FUZZ_FRESH:-0}" = 1 ]; then
  rm -rf "$corpus"
fi
mkdir -p "$corpus"
for seed in "${seeds[@]}"; do
  if [ -d "$seed" ]; then
    cp "$seed"/* "$corpus"/ 2>/dev/null || true
  elif [ -f "$seed" ]; then
    cp "$seed" "$corpus"/
  fi
done
# What earlier runs found (a minimised merge, packed to keep the tree small).
if [ -f "$found" ]; then
  tar xzf "$found" -C "$corpus"
fi
cd "$build"
"$binary" -max_total_time="$seconds" -max_len=16384 -timeout=10 -rss_limit_mb=2048 \
  -print_final_stats=1 "$@" "$corpus"
