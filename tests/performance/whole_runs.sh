#!/usr/bin/env bash
# Whole runs, every step and factorisation included: the examples at their own
# mesh, the layered box of layered-box.toml, and the basement pit refined to
# levels 0..MAX_LEVEL with the direct solver (and to ITERATIVE_MAX_LEVEL with the
# iterative one) on one and two processes.
# Each run's steps.csv gives its time per part; a matrix-vector product timed by
# settlewell_benchmark on the same mesh and process count turns the solver's
# share (assembly, factorisations, solves) and the whole run's wall time into
# matrix-vector products (SpMV) per step. Prints a Markdown table.
#   bash tests/performance/whole_runs.sh [BUILD_DIR] [MAX_LEVEL] [ITERATIVE_MAX_LEVEL]
# Build first: cmake --build build --target settlewell_benchmark
set -euo pipefail
build=$(realpath "${1:-build}")
max_level=${2:-3}
iterative_max_level=${3:-0}
mpi=(mpirun --allow-run-as-root --oversubscribe)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

# matvec NP SCENARIO LEVEL: seconds of one matrix-vector product.
matvec() {
  "${mpi[@]}" -np "$1" "$build/tests/settlewell_benchmark" "$2" --refine "$3" --steps 1 \
    2>/dev/null | tr ' ' '\n' | sed -n 's/^matvec_s=//p'
}

# whole_run NP SCENARIO LEVEL SOLVER: one table row.
whole_run() {
  local np=$1 scenario=$2 level=$3 solver=$4 name out peak product
  name=$(basename "$(dirname "$scenario")")
  [ "$name" = performance ] && name=$(basename "$scenario" .toml)
  out="$work/$name-$level-$solver-$np"
  # Peak resident memory of each process (KB) on stderr, summed.
  "${mpi[@]}" -np "$np" /usr/bin/time -f "peak_kb=%M" "$build/settlewell" run "$scenario" \
    -o "$out" --overwrite -q --refine "$level" --solver "$solver" \
    >/dev/null 2>"$work/stderr" || { echo "| $name | $solver | $np | $level | failed |"; return; }
  peak=$(sed -n 's/^peak_kb=//p' "$work/stderr" | awk '{s += $1} END {printf "%.0f", s / 1024}')
  product=$(matvec "$np" "$scenario" "$level")
  awk -F, -v name="$name" -v solver="$solver" -v np="$np" -v level="$level" \
      -v matvec="$product" -v peak="$peak" \
      -v wall="$(sed -n 's/^wall_time_s = //p' "$out/results.toml")" \
      -v unknowns="$(sed -n 's/^unknowns = //p' "$out/results.toml")" '
    NR == 1 { for (i = 1; i <= NF; ++i) col[$i] = i; next }
    { ++steps; factorisations += $col["new_matrix"]; assembly += $col["assembly_s"]
      factor += $col["factorisation_s"]; solve += $col["solve_s"]
      monitors += $col["monitors_s"]; output += $col["output_s"] }
    END {
      printf "| %s | %s | %s | %s | %s | %d | %d | %.1f | %.1f | %.1f | %.1f | %.1f | %.1f | %.6f | %.0f | %.0f | %s |\n",
        name, solver, np, level, unknowns, steps, factorisations, assembly, factor, solve,
        monitors, output, wall, matvec, (assembly + factor + solve) / steps / matvec,
        wall / steps / matvec, peak
    }' "$out/steps.csv"
}

echo "| example | solver | processes | level | unknowns | steps | factorisations | assembly s | factorisation s | solve s | monitors s | output s | run wall s | matvec s | solver SpMV/step | whole run SpMV/step | peak MB |"
echo "| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |"
for example in basement-pit shaft layered-column dug-pit; do
  whole_run 1 "examples/$example/scenario.toml" 0 direct
done
whole_run 1 tests/performance/layered-box.toml 0 direct
for level in $(seq 0 "$max_level"); do
  for np in 1 2; do
    whole_run "$np" examples/basement-pit/scenario.toml "$level" direct
    if [ "$level" -le "$iterative_max_level" ]; then
      whole_run "$np" examples/basement-pit/scenario.toml "$level" iterative
    fi
  done
done
