#!/usr/bin/env bash
# Refinement series of the basement-pit example with both solvers on one and two
# processes, the iterative solver's iterations across time steps from 1e-4 to
# 1e3 days (levels up to DT_MAX_LEVEL), and the demo's end-to-end time. Prints
# Markdown tables.
#   bash tests/performance/run_benchmarks.sh [BUILD_DIR] [MAX_LEVEL] [DT_MAX_LEVEL]
# Build first: cmake --build build --target settlewell_benchmark
set -euo pipefail
build=${1:-build}
max_level=${2:-3}
dt_max_level=${3:-2}
scenario=examples/basement-pit/scenario.toml
mpi=(mpirun --allow-run-as-root --oversubscribe)
declare -A v=()
# measure NP ARGS...: one benchmark run on NP processes; its key=value figures in v.
measure() {
  local np=$1 line kv
  shift
  line=$("${mpi[@]}" -np "$np" "$build/tests/settlewell_benchmark" "$scenario" --steps 3 "$@" \
         2>/dev/null | grep '^solver=') || return 1
  v=()
  for kv in $line; do v[${kv%%=*}]=${kv#*=}; done
}
echo "| solver | processes | level | cells | unknowns | setup s | factor/PC s | assembly s/step | solve s/step | iterations/step | matvec s | step / matvec | peak MB | bytes/unknown |"
echo "| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |"
for level in $(seq 0 "$max_level"); do
  for solver in direct iterative; do
    for np in 1 2; do
      measure "$np" --refine "$level" --solver "$solver" || { echo "| $solver | $np | $level | failed |"; continue; }
      echo "| ${v[solver]} | ${v[processes]} | ${v[refine]} | ${v[cells]} | ${v[dofs]} | ${v[setup_s]} | ${v[factor_s]} | ${v[assembly_s]} | ${v[solve_s]} | ${v[iterations]} | ${v[matvec_s]} | ${v[step_over_matvec]} | ${v[peak_memory_MB]} | ${v[bytes_per_dof]} |"
    done
  done
done
echo
echo "Iterative solver, one process: FGMRES iterations per step (3 steps at each dt)"
echo
echo "| level | unknowns | dt = 1e-4 d | 1e-2 d | 1 d | 1e3 d |"
echo "| --- | --- | --- | --- | --- | --- |"
for level in $(seq 0 "$dt_max_level"); do
  row="| $level |"
  dofs=""
  for dt in 1e-4 1e-2 1 1e3; do
    measure 1 --refine "$level" --solver iterative --dt-days "$dt" || { row="$row failed |"; continue; }
    dofs=${v[dofs]}
    row="$row ${v[iterations]} |"
  done
  echo "${row/| $level |/| $level | $dofs |}"
done
start=$(date +%s.%N)
"$build/settlewell" run "$scenario" -o /tmp/settlewell-demo-timing --overwrite -q > /dev/null
end=$(date +%s.%N)
echo
echo "Demo (examples/basement-pit, one process, mesh + all steps + output): $(awk -v a="$start" -v b="$end" 'BEGIN{printf "%.1f", b - a}') s"
