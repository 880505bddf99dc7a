"""A seepage face on a box's top (tests/smoke/seepage_face_column.toml): `check`
names the condition; while the base is artesian (+2.0 m) the water leaving
through the top at the end of the stage is the 1D Darcy flow k (2 - 0) / 10 m
over 1 m of width, 0.1728 m3/day (common practice); once the base is lowered
(-3.0 m) nothing enters through the top.

    seepage_face_column.py SETTLEWELL SOURCE_DIR FOLDER
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
    scenario = source / "tests" / "smoke" / "seepage_face_column.toml"
    shutil.rmtree(folder, ignore_errors=True)
    check = subprocess.run([settlewell, "check", str(scenario)], capture_output=True, text=True)
    if check.returncode != 0 or "seepage face" not in check.stdout:
        fail("check does not name the seepage face:\n" + check.stdout + check.stderr)
    run = subprocess.run([settlewell, "run", str(scenario), "-o", str(folder), "-q"],
                         capture_output=True, text=True)
    if run.returncode != 0:
        fail("the run failed:\n" + run.stdout + run.stderr)
    with open(folder / "steps.csv", newline="") as f:
        rows = list(csv.DictReader(f))
    last = {}
    for r in rows:
        last[int(float(r["stage"]))] = r
    darcy = 1e-5 * 2.0 / 10.0 * 1.0 * 86400.0  # m3/day per metre run
    out = -float(last[1]["inflow_top_m3_per_day"])
    # 9 days after the ramp against a diffusion time of about 10 s
    # (storage gamma_w L^2 / k): steady to round-off.
    if abs(out - darcy) > 1e-6 * darcy:
        fail(f"water leaving the top at the end of the artesian stage: {out} m3/day, "
             f"Darcy {darcy}")
    back = float(last[2]["inflow_top_m3_per_day"])
    if abs(back) > 1e-9 * darcy:
        fail(f"water crosses the sealed top after the base is lowered: {back} m3/day")
    print(f"PASS: {out:.6g} m3/day out through the seepage face (Darcy {darcy:.6g}); "
          f"{back:.2g} once sealed")


main()
