"""A small pit whose clay layer is Modified Cam Clay (tests/smoke/cam_clay_pit.toml,
lightly overconsolidated, OCR 1.2) run from its scenario: `check` states what
the clay's skeleton uses; the run's steps.csv carries Newton's columns, every
step converged to the default tolerance (1e-8 of the largest step's residual),
the clay yields under the drawdown, the water balance closes, and the field
files carry the clay's yield size and yield ratio.

    cam_clay_run.py SETTLEWELL SOURCE_DIR FOLDER
"""
import csv
import pathlib
import shutil
import subprocess
import sys


def fail(message):
    print("FAIL:", message)
    sys.exit(1)


def main():
    settlewell, source, folder = sys.argv[1], pathlib.Path(sys.argv[2]), pathlib.Path(sys.argv[3])
    scenario = source / "tests" / "smoke" / "cam_clay_pit.toml"
    shutil.rmtree(folder, ignore_errors=True)
    check = subprocess.run([settlewell, "check", str(scenario)], capture_output=True, text=True)
    if check.returncode != 0 or "skeleton: Modified Cam Clay from Cc 0.4, Cr 0.06" not in check.stdout:
        fail("check does not describe the clay's skeleton:\n" + check.stdout + check.stderr)
    run = subprocess.run([settlewell, "run", str(scenario), "-o", str(folder), "-q"],
                         capture_output=True, text=True)
    if run.returncode != 0:
        fail("the run failed:\n" + run.stdout + run.stderr)
    if "water balance" in run.stdout:
        fail("the water balance did not close:\n" + run.stdout)
    with open(folder / "steps.csv", newline="") as f:
        rows = list(csv.DictReader(f))
    for column in ("newton_iterations", "factorisations", "sub_steps",
                   "yielding_points", "newton_residual_relative"):
        if column not in rows[0]:
            fail(f"steps.csv has no column {column}")
    worst = max(float(r["newton_residual_relative"]) for r in rows)
    if worst > 1e-8:
        fail(f"a step stopped at a residual of {worst}, above the tolerance 1e-8")
    if min(int(float(r["newton_iterations"])) for r in rows) < 1:
        fail("a step made no Newton correction")
    yielding = max(int(float(r["yielding_points"])) for r in rows)
    if yielding == 0:
        fail("the clay never yielded under a 6 m drawdown at OCR 1.2")
    pieces = sorted((folder / "fields").glob("*.vtu"))
    text = pieces[-1].read_text(errors="replace")
    for name in ("yield_size", "yield_ratio"):
        if f'Name="{name}"' not in text:
            fail(f"{pieces[-1].name} has no field {name}")
    print(f"PASS: {len(rows)} steps, at most {yielding} clay points yielding, worst "
          f"residual {worst:.2e}")


main()
