"""A run killed with SIGKILL part way resumes from its last checkpoint
(settlewell run --resume) to the results of a run never interrupted: every number
of results.toml, steps.csv and the CSV tables within 1e-10 of its quantity's
largest magnitude, and (on the same process count) the last fields too.

    resume_run.py SETTLEWELL SCENARIO WORK_FOLDER [--mpirun MPIRUN]
                  [--processes N] [--resume-processes M] [--gravity-from STAGE]

With --gravity-from the run starts from gravity loading and reports displacements
from the start of STAGE, so that the checkpoint carries the reference displacement.

With --newton the scenario has a clay solved by Newton's method: the resumed run
has no kept factor to start from, so its Newton iterates take another path to
the same converged states, which agree to the Newton tolerance (1e-8 of the
residual scale; 4.1e-9 of a quantity's largest magnitude measured on
tests/smoke/cam_clay_pit.toml): 1e-7 is required, and the columns that count
the solver's work are left out. The scenario is then run as written, with a
checkpoint every 0.3 s (--checkpoint-minutes) so that the kill finds one.

The scenario is run coarser than written (cells of 1 m near the wall and well,
steps of at most 2 days) to keep the test short.
"""
import argparse
import csv
import json
import math
import os
import pathlib
import re
import shutil
import signal
import subprocess
import sys
import time
import tomllib

# What may differ between two runs of the same model: timings, dates, the process
# count, and whether a step factorised (a resumed run factorises afresh).
SKIPPED_KEYS = {"wall_time_s", "started", "finished", "processes", "updated"}
SKIPPED_COLUMNS = {"new_matrix", "assembly_s", "factorisation_s", "solve_s",
                   "monitors_s", "output_s"}
TOLERANCE = 1e-10


def coarse_copy(scenario, folder, gravity_from):
    text = pathlib.Path(scenario).read_text()
    if gravity_from:
        text, count = re.subn(r"^\[output\]\n",
                              f'[output]\ndisplacements_from = "{gravity_from}"\n',
                              text, flags=re.M)
        if count != 1:
            sys.exit(f"FAIL: {scenario} has no [output] table")
        text += '\n[initial_state]\nmethod = "gravity"\n'
    for pattern, value in [(r"size_near_wall = [0-9.]+", "size_near_wall = 1.0"),
                           (r"size_near_well = [0-9.]+", "size_near_well = 1.0"),
                           (r"largest = [0-9.]+", "largest = 2.0")]:
        text, count = re.subn(pattern, value, text)
        if count == 0:
            sys.exit(f"FAIL: {scenario} has no '{pattern}' to coarsen")
    copy = folder / "scenario.toml"
    copy.write_text(text)
    return copy


def command(args, processes, *rest):
    prefix = []
    if processes > 1:
        prefix = [args.mpirun, "--allow-run-as-root", "--oversubscribe", "-np",
                  str(processes)]
    return prefix + [args.settlewell, "run", *rest]


def rows_of(path):
    with open(path, newline="") as f:
        return list(csv.reader(f))


def session_members(session):
    """The live processes of a session (from /proc: mpirun puts each rank in a
    process group of its own, but they stay in the session mpirun started)."""
    members = []
    for entry in pathlib.Path("/proc").iterdir():
        if not entry.name.isdigit():
            continue
        try:
            fields = (entry / "stat").read_text().rsplit(")", 1)[1].split()
        except OSError:
            continue
        if int(fields[3]) == session and fields[0] != "Z":
            members.append(int(entry.name))
    return members


def kill_session(session, timeout=30.0):
    """SIGKILL to every process of the session, until none is left: a rank that
    outlived mpirun would go on writing into the run folder while it is resumed."""
    deadline = time.time() + timeout
    while (members := session_members(session)) and time.time() < deadline:
        for pid in members:
            try:
                os.kill(pid, signal.SIGKILL)
            except ProcessLookupError:
                pass
        time.sleep(0.05)
    if session_members(session):
        sys.exit(f"FAIL: processes of the killed run are still alive: {session_members(session)}")


NEWTON_TOLERANCE = 1e-7
NEWTON_COLUMNS = {"iterations", "newton_iterations", "factorisations", "line_search_cuts",
                  "sub_steps",
                  "newton_residual_relative", "water_balance_error_relative"}


def kill_part_way(args, scenario, folder, total_steps):
    """Starts a run and kills it (SIGKILL, every process of its session) past 60 % of its
    steps and a few steps after a checkpoint, so that steps.csv holds rows the
    resumed run must drop. Returns the steps in steps.csv when killed."""
    extra = ["--checkpoint-minutes", "0.005"] if args.newton else []
    run = subprocess.Popen(command(args, args.processes, str(scenario), "-o", str(folder),
                                   "-q", *extra),
                           stdout=subprocess.DEVNULL, stderr=subprocess.PIPE,
                           start_new_session=True)
    steps, state = folder / "steps.csv", folder / "checkpoint" / "state.bin"
    seen, rows_at_checkpoint, rows = None, 0, 0
    deadline = time.time() + 600
    while time.time() < deadline and run.poll() is None:
        rows = len(rows_of(steps)) - 1 if steps.exists() else 0
        stamp = state.stat().st_mtime_ns if state.exists() else None
        if stamp != seen:
            seen, rows_at_checkpoint = stamp, rows
        if seen and rows > 0.6 * total_steps and rows >= rows_at_checkpoint + 3:
            break
        time.sleep(0.02)
    if run.poll() is not None:
        sys.exit(f"FAIL: the run ended (status {run.returncode}) before it could be "
                 f"killed part way: {run.stderr.read()!r}")
    kill_session(run.pid)
    run.wait()
    return len(rows_of(steps)) - 1


def numbers_differ(a, b, scale):
    return abs(a - b) > TOLERANCE * scale


def compare_toml(a, b, path, failures, worst):
    if isinstance(a, dict):
        for key in a:
            if key in SKIPPED_KEYS:
                continue
            if key not in b:
                failures.append(f"results.toml: {path}{key} missing after resume")
            else:
                compare_toml(a[key], b[key], f"{path}{key}.", failures, worst)
    elif isinstance(a, list):
        if len(a) != len(b):
            failures.append(f"results.toml: {path} has {len(b)} items, not {len(a)}")
        for i, (x, y) in enumerate(zip(a, b)):
            compare_toml(x, y, f"{path}{i}.", failures, worst)
    elif isinstance(a, float) and isinstance(b, (int, float)):
        scale = max(abs(a), abs(b))
        relative = abs(a - b) / scale if scale > 0 else 0.0
        worst[0] = max(worst[0], relative)
        if numbers_differ(a, b, scale):
            failures.append(f"results.toml: {path} {a!r} != {b!r}")
    elif a != b:
        failures.append(f"results.toml: {path} {a!r} != {b!r}")


def number(text):
    try:
        return float(text)
    except ValueError:
        return None


def compare_csv(name, a_path, b_path, failures, worst):
    a, b = rows_of(a_path), rows_of(b_path)
    if a[0] != b[0] or len(a) != len(b):
        failures.append(f"{name}: header or row count differs ({len(a)} / {len(b)} rows)")
        return
    for c, column in enumerate(a[0]):
        if column in SKIPPED_COLUMNS:
            continue
        pairs = [(r[c], s[c]) for r, s in zip(a[1:], b[1:])]
        values = [abs(v) for x, y in pairs for v in (number(x), number(y)) if v is not None]
        scale = max(values, default=0.0)
        for row, (x, y) in enumerate(pairs, start=2):
            u, v = number(x), number(y)
            if u is None or v is None:
                if x != y:
                    failures.append(f"{name} line {row} {column}: {x!r} != {y!r}")
            elif not (math.isnan(u) and math.isnan(v)):
                if scale > 0:
                    worst[0] = max(worst[0], abs(u - v) / scale)
                if numbers_differ(u, v, scale):
                    failures.append(f"{name} line {row} {column}: {x} != {y}")


def last_fields(folder):
    """The point arrays of the last field file (VTK's reader, python3-vtk9)."""
    import vtk
    from vtk.util.numpy_support import vtk_to_numpy
    pvd = (folder / "fields" / "fields.pvd").read_text()
    last = re.findall(r'file="([^"]+)"', pvd)[-1]
    reader = vtk.vtkXMLGenericDataObjectReader()
    reader.SetFileName(str(folder / "fields" / last))
    reader.Update()
    data = reader.GetOutput().GetPointData()
    return {data.GetArrayName(i): vtk_to_numpy(data.GetArray(i))
            for i in range(data.GetNumberOfArrays())}


def compare_fields(a_folder, b_folder, failures, worst, tolerance):
    a, b = last_fields(a_folder), last_fields(b_folder)
    for name, values in a.items():
        if name not in b or b[name].shape != values.shape:
            failures.append(f"last fields: array {name} missing or reshaped")
            continue
        scale = float(abs(values).max()) if values.size else 0.0
        difference = float(abs(values - b[name]).max()) if values.size else 0.0
        if scale > 0:
            worst[0] = max(worst[0], difference / scale)
        if difference > tolerance * scale:
            failures.append(f"last fields: {name} differs by {difference} (of {scale})")


def compare_runs(a, b, tolerance):
    """Failures and the largest relative difference between two run folders."""
    global TOLERANCE
    kept, TOLERANCE = TOLERANCE, tolerance
    failures, worst = [], [0.0]
    compare_toml(tomllib.loads((a / "results.toml").read_text()),
                 tomllib.loads((b / "results.toml").read_text()), "", failures, worst)
    tables = sorted(p.relative_to(a) for p in a.rglob("*.csv"))
    if not tables:
        failures.append("the run wrote no CSV tables")
    for table in tables:
        compare_csv(str(table), a / table, b / table, failures, worst)
    TOLERANCE = kept
    return failures, worst


def main():
    global TOLERANCE
    parser = argparse.ArgumentParser()
    parser.add_argument("settlewell")
    parser.add_argument("scenario")
    parser.add_argument("work", type=pathlib.Path)
    parser.add_argument("--mpirun", default="mpirun")
    parser.add_argument("--processes", type=int, default=1)
    parser.add_argument("--resume-processes", type=int, default=1)
    parser.add_argument("--gravity-from", default="")
    parser.add_argument("--newton", action="store_true")
    args = parser.parse_args()
    shutil.rmtree(args.work, ignore_errors=True)
    args.work.mkdir(parents=True)
    if args.gravity_from:
        # After gravity loading these are round-off (about 1e-9 kN/m): their digits
        # differ with the process count; their size is checked in dug_pit_test.
        SKIPPED_KEYS.update({"largest_out_of_balance_kN_per_m",
                             "summed_out_of_balance_kN_per_m"})
    if args.newton:
        TOLERANCE = NEWTON_TOLERANCE
        SKIPPED_COLUMNS.update(NEWTON_COLUMNS)
        SKIPPED_KEYS.add("largest_relative_error")
        scenario = pathlib.Path(args.scenario)
    else:
        scenario = coarse_copy(args.scenario, args.work, args.gravity_from)
    whole, resumed = args.work / "whole", args.work / "resumed"
    subprocess.run(command(args, args.processes, str(scenario), "-o", str(whole), "-q"),
                   check=True, stdout=subprocess.DEVNULL)
    total_steps = len(rows_of(whole / "steps.csv")) - 1
    killed_after = kill_part_way(args, scenario, resumed, total_steps)

    failures = []
    manifest = json.loads((resumed / "manifest.json").read_text())
    if manifest.get("state") != "running" or (resumed / "results.toml").exists():
        failures.append(f"the killed run's folder is not marked running: {manifest}")
    again = subprocess.run(command(args, args.resume_processes, "--resume", str(resumed)),
                           capture_output=True, text=True)
    if again.returncode != 0 or "resuming" not in again.stderr:
        sys.exit(f"FAIL: resume ended with status {again.returncode}: {again.stderr}")
    resumed_after = int(re.search(r"after step (\d+)", again.stderr).group(1))
    manifest = json.loads((resumed / "manifest.json").read_text())
    if manifest.get("state") != "finished":
        failures.append(f"the resumed run is not marked finished: {manifest.get('state')}")
    twice = subprocess.run(command(args, 1, "--resume", str(resumed)), capture_output=True,
                           text=True)
    if twice.returncode != 2 or "has finished" not in twice.stderr:
        failures.append(f"resuming a finished run: status {twice.returncode}, "
                        f"{twice.stderr!r}")
    left = [p.name for p in resumed.iterdir() if p.name.startswith("checkpoint")]
    if left:
        failures.append(f"a finished run keeps its checkpoint: {left}")

    tolerance = TOLERANCE
    if args.processes != args.resume_processes:
        # Another process count orders the direct solver's pivots differently: the
        # resumed run can agree with the run never interrupted only as well as an
        # uninterrupted run on the other count does (measured here: 2.5e-9 of a
        # quantity's largest magnitude between 1 and 2 processes for this model).
        # The water-balance errors are round-off themselves and are left out.
        other = args.work / "whole_other_count"
        subprocess.run(command(args, args.resume_processes, str(scenario), "-o",
                               str(other), "-q"), check=True, stdout=subprocess.DEVNULL)
        SKIPPED_KEYS.update({"largest_relative_error", "input"})
        SKIPPED_COLUMNS.add("water_balance_error_relative")
        reference = compare_runs(whole, other, 1.0)[1][0]
        tolerance = max(TOLERANCE, 2.0 * reference)
        print(f"uninterrupted runs on {args.processes} and {args.resume_processes} "
              f"processes differ by {reference:.3g}; tolerance {tolerance:.3g}")
    run_failures, worst = compare_runs(whole, resumed, tolerance)
    failures += run_failures
    if args.processes == args.resume_processes:
        # The field files hold 32-bit floats: with --newton the doubles differ a
        # little, and a value near a rounding boundary flips its last bit (6e-8 to
        # 1.2e-7 of it). Two such steps are allowed.
        field_tolerance = max(tolerance, 2.4e-7) if args.newton else tolerance
        compare_fields(whole, resumed, failures, worst, field_tolerance)

    for failure in failures[:20]:
        print("FAIL:", failure)
    if not failures:
        print(f"killed after step {killed_after} of {total_steps} on {args.processes} "
              f"process(es), resumed after step {resumed_after} on "
              f"{args.resume_processes}: results.toml, the tables (and on one count the "
              f"last fields) "
              f"agree with the run never interrupted; largest difference "
              f"{worst[0]:.3g} of a quantity's largest magnitude")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
