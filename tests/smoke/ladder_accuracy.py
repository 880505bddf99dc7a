"""The default ladder of time steps against a run with four times as many steps:
every point's settlement and head history within TOLERANCE of its largest
magnitude, and the ladder's factorisations counted.

    ladder_accuracy.py SETTLEWELL SCENARIO WORK_FOLDER [--tolerance T]
                       [--largest-factorisations N]

The finer run takes 4 times the steps on each rung (time_steps.per_rung) and a
quarter of each stage's first and largest steps; its history is interpolated linearly to the
default run's times (its steps are a quarter as long, so the interpolation error is
well below the tolerance). Exit 1 with one line per failure.
"""
import argparse
import csv
import pathlib
import re
import subprocess
import sys
import tomllib

DEFAULT_PER_RUNG = 8  # stages[].time_steps.per_rung
FINER = 4


def default_steps(stage):
    """Days: the stage's first and largest steps as the schedule takes them by
    default (src/model/schedule.cc)."""
    duration, ramp = stage["duration"], min(stage.get("ramp", 0.0), stage["duration"])
    largest = min(duration / 40.0, ramp / 100.0) if ramp > 0.0 else duration / 40.0
    return duration / 1000.0, largest


def finer_copy(scenario, folder):
    """The scenario with FINER times the steps in every stage."""
    text = pathlib.Path(scenario).read_text()
    stages = tomllib.loads(text)["stages"]
    parts = re.split(r"^\[\[stages\]\]\n", text, flags=re.M)
    if len(parts) != len(stages) + 1:
        sys.exit(f"FAIL: {scenario}: could not find each [[stages]] table")
    out = [parts[0]]
    for stage, body in zip(stages, parts[1:]):
        steps = dict(stage.get("time_steps", {}))
        first, largest = default_steps(stage)
        steps["first"] = steps.get("first", first) / FINER
        steps["largest"] = steps.get("largest", largest) / FINER
        steps["per_rung"] = steps.get("per_rung", DEFAULT_PER_RUNG) * FINER
        body = re.sub(r"^time_steps = .*\n", "", body, flags=re.M)
        inline = ", ".join(f"{k} = {v!r}" for k, v in steps.items())
        out.append(f"[[stages]]\ntime_steps = {{ {inline} }}\n{body}")
    copy = folder / "finer.toml"
    copy.write_text("".join(out))
    return copy


def run(settlewell, scenario, folder):
    subprocess.run([settlewell, "run", str(scenario), "-o", str(folder), "--overwrite",
                    "-q"], check=True, stdout=subprocess.DEVNULL)
    with open(folder / "steps.csv") as f:
        steps = list(csv.DictReader(f))
    histories = {}
    with open(folder / "points.csv") as f:
        for row in csv.DictReader(f):
            for quantity in ("settlement_m", "head_m"):
                key = (row["point"], quantity)
                histories.setdefault(key, []).append(
                    (float(row["time_days"]), float(row[quantity])))
    return steps, histories


def interpolate(history, t):
    for (t0, v0), (t1, v1) in zip(history, history[1:]):
        if t0 <= t <= t1 and t1 > t0:
            return v0 + (v1 - v0) * (t - t0) / (t1 - t0)
    return history[-1][1]


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("settlewell")
    parser.add_argument("scenario")
    parser.add_argument("work")
    parser.add_argument("--tolerance", type=float, default=0.005)
    parser.add_argument("--largest-factorisations", type=int, default=0)
    args = parser.parse_args()
    work = pathlib.Path(args.work)
    work.mkdir(parents=True, exist_ok=True)
    steps, ladder = run(args.settlewell, args.scenario, work / "ladder")
    fine_steps, fine = run(args.settlewell, finer_copy(args.scenario, work),
                           work / "finer")
    factorisations = sum(int(r["new_matrix"]) for r in steps)
    print(f"ladder: {len(steps)} steps, {factorisations} factorisations; finer: "
          f"{len(fine_steps)} steps, "
          f"{sum(int(r['new_matrix']) for r in fine_steps)} factorisations")
    failures = []
    for key, history in sorted(ladder.items()):
        reference = fine[key]
        scale = max(abs(v - reference[0][1]) for _, v in reference)
        if scale == 0.0:
            continue
        worst = max(abs(v - interpolate(reference, t)) for t, v in history) / scale
        print(f"  {key[0]:>28} {key[1]:<13} largest difference {worst:.2e} of "
              f"its largest change {scale:.4g}")
        if not worst <= args.tolerance:
            failures.append(f"{key[0]} {key[1]}: {worst:.2e} > {args.tolerance}")
    if args.largest_factorisations and factorisations > args.largest_factorisations:
        failures.append(f"{factorisations} factorisations > "
                        f"{args.largest_factorisations}")
    for f in failures:
        print("FAIL:", f)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
