"""The unconfined example (examples/unconfined-pit) end to end, and the same site
with the sand kept saturated at any suction: `check` describes the retention
curve; the run closes its water balance, drains water from the pores above the
phreatic line (part of the storage's share, never more), writes the degree of
saturation (between theta_r/theta_s and 1, below 1 somewhere) and takes a few
Newton iterations a step. Against the saturated run, storage gives a larger share
of the pumped water (the sand drains) and the ground settles less (above the
water table the soil carries Bishop's stress at S_r < 1, and weighs less). With
the well's screen raised 4 m above the water it holds, the part above the water is
a seepage face in drained soil: it must settle with no point taking water in, and
the water balance must close.

    unconfined_example.py SETTLEWELL SOURCE_DIR FOLDER
"""
import csv
import pathlib
import re
import shutil
import subprocess
import sys
import tomllib

import vtk


def fail(message):
    print("FAIL:", message)
    sys.exit(1)


def run(settlewell, scenario, folder):
    shutil.rmtree(folder, ignore_errors=True)
    done = subprocess.run([settlewell, "run", str(scenario), "-o", str(folder), "-q"],
                          capture_output=True, text=True)
    if done.returncode != 0:
        fail(f"the run of {scenario} failed:\n" + done.stdout + done.stderr)
    with open(folder / "results.toml", "rb") as f:
        return tomllib.load(f)


def storage_volume(results):
    return next(s["volume_m3"] for s in results["water_budget"]["sources"]
                if s["kind"] == "storage")


def main():
    settlewell, source, folder = sys.argv[1], pathlib.Path(sys.argv[2]), pathlib.Path(sys.argv[3])
    scenario = source / "examples" / "unconfined-pit" / "scenario.toml"
    check = subprocess.run([settlewell, "check", str(scenario)], capture_output=True, text=True)
    if check.returncode != 0 or "van Genuchten" not in check.stdout:
        fail("check does not describe the retention curve:\n" + check.stdout + check.stderr)
    wet = run(settlewell, scenario, folder / "unsaturated")
    if not wet["water_balance"]["closes"]:
        fail(f"water balance off by {wet['water_balance']['largest_relative_error']}")
    drained, stored = wet["water_budget"]["drained_from_pores_m3"], storage_volume(wet)
    if not 0.0 < drained <= stored * 1.001:
        fail(f"drained from the pores {drained} m3 against storage's {stored} m3")
    reader = vtk.vtkXMLUnstructuredGridReader()
    reader.SetFileName(str(sorted((folder / "unsaturated" / "fields").glob("fields_*.vtu"))[-1]))
    reader.Update()
    array = reader.GetOutput().GetPointData().GetArray("degree_of_saturation")
    if array is None:
        fail("no degree_of_saturation in the last fields file")
    s = [array.GetValue(i) for i in range(array.GetNumberOfTuples())]
    if not (min(s) >= 0.04 / 0.36 - 1e-9 and max(s) <= 1.0 and min(s) < 0.9):
        fail(f"degree of saturation from {min(s)} to {max(s)}")
    with open(folder / "unsaturated" / "steps.csv", newline="") as f:
        iterations = [int(r["newton_iterations"]) for r in csv.DictReader(f)]
    mean = sum(iterations) / len(iterations)
    if mean > 6:
        fail(f"{mean:.2f} Newton iterations a step on average")
    text = scenario.read_text()
    saturated = folder / "saturated.toml"
    saturated.write_text(re.sub(r"(?m)^(retention|retention_alpha|retention_n|"
                                r"residual_water_content)\s*=.*$", "", text))
    dry = run(settlewell, saturated, folder / "saturated")
    share = [storage_volume(r) / r["water_budget"]["pumped_volume_m3"] for r in (wet, dry)]
    if not share[0] > 2 * share[1]:
        fail(f"storage's share {share[0]:.3f} drained against {share[1]:.3f} saturated")
    settle = [r["summary"]["settlement_outside_m"] for r in (wet, dry)]
    if not settle[0] < settle[1]:
        fail(f"settlement outside the wall {settle[0]} m drained against {settle[1]} m")
    high = folder / "screen_high.toml"
    high.write_text(re.sub(r"(?m)^screen_top = -8\.0 .*$", "screen_top = -3.0", text))
    if high.read_text() == text:
        fail("the example's screen_top line was not found")
    seeping = run(settlewell, high, folder / "screen_high")["water_balance"]
    if seeping["steps_held_points_feeding"] != 0 or not seeping["closes"]:
        fail(f"the screen above its water fed the ground or broke the balance: {seeping}")
    print(f"PASS: storage {100 * share[0]:.1f} % of the pumped water (saturated "
          f"{100 * share[1]:.1f} %), {drained:.4g} m3 from the pores; settlement "
          f"{1000 * settle[0]:.1f} mm (saturated {1000 * settle[1]:.1f} mm); "
          f"{mean:.2f} Newton iterations a step")


main()
