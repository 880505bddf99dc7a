"""A pit dug in a user's mesh (mesh_file.excavation_regions) in two lifts, run from
the command line: the run finishes; at every output time the pit's cells above the
level dug to are gone from the field output and every other cell is still there;
water rises into the dug pit and is pumped (the formation's discharge is positive
in every step once the floor lies below the water table); the soil under the pit's
centre heaves, and more after the second lift; the base checks are evaluated on
the pit the mesh gives (the excavation regions' extent, and the region named
"wall" for the toe); the report is written.

    dig_in_user_mesh.py SETTLEWELL SCENARIO FOLDER

The mesh (dig_in_user_mesh.geo) has the pit at 0 < x < 6 m, from 0 m down to -6 m.
"""
import csv
import pathlib
import shutil
import subprocess
import sys
import tomllib
import xml.etree.ElementTree as ET

import vtk
from vtk.util.numpy_support import vtk_to_numpy

PIT_HALF_WIDTH = 6.0
LIFTS = [("lift 1", 0.0, -2.5), ("lift 2", 10.0, -6.0)]  # (stage, start day, level)


def read_csv(path):
    with open(path, newline="") as f:
        return list(csv.DictReader(f))


def cell_centres(vtu_path):
    reader = vtk.vtkXMLUnstructuredGridReader()
    reader.SetFileName(str(vtu_path))
    reader.Update()
    centres = vtk.vtkCellCenters()
    centres.SetInputData(reader.GetOutput())
    centres.Update()
    return vtk_to_numpy(centres.GetOutput().GetPoints().GetData())


def field_outputs(folder):
    """(time, vtu path) of every field output, from the .pvd collection."""
    pvd = next(folder.rglob("*.pvd"))
    return [(float(d.get("timestep")), pvd.parent / d.get("file"))
            for d in ET.parse(pvd).getroot().iter("DataSet")]  # days


def dug_to(day):
    """The level the pit is dug to at a time (cells leave after their stage starts)."""
    level = None
    for _, start, dig in LIFTS:
        if day > start + 1e-9:
            level = dig
    return level


def check_cells(folder, failures):
    """Against the first output (day 0, the whole mesh): every later one lacks the
    pit's cells above the level dug to then, and only those."""
    outputs = field_outputs(folder)
    if outputs[0][0] != 0.0:
        failures.append(f"the first field output is at day {outputs[0][0]}, not 0")
        return len(outputs)
    whole = cell_centres(outputs[0][1])
    in_pit = lambda c, level: c[0] < PIT_HALF_WIDTH and c[1] > level
    levels_seen = set()
    for day, path in outputs[1:]:
        level = dug_to(day)
        levels_seen.add(level)
        centres = cell_centres(path)
        left = [c for c in centres if in_pit(c, level)]
        if left:
            failures.append(f"day {day:g}: {len(left)} pit cells above the dig level "
                            f"{level} m are still in the output (one at {left[0][:2]})")
        kept = len([c for c in whole if not in_pit(c, level)])
        if len(centres) != kept:
            failures.append(f"day {day:g}: {len(centres)} cells in the output, {kept} "
                            f"expected (the mesh's {len(whole)} less the pit above "
                            f"{level} m)")
    if levels_seen != {-2.5, -6.0}:
        failures.append(f"field outputs after each lift expected, got levels {levels_seen}")
    return len(outputs)


def check_discharge(folder, failures):
    steps = read_csv(folder / "steps.csv")
    column = "discharge_formation_m3_per_day"
    if column not in steps[0]:
        failures.append(f"steps.csv has no column {column}")
        return None
    # The floor is below the water table (-1 m) from the first dig on.
    values = [float(r[column]) for r in steps if float(r["time_days"]) > 0.0]
    if not values or min(values) <= 0.0:
        failures.append(f"the formation's discharge is not positive in every step "
                        f"(least {min(values) if values else None})")
    return min(values), max(values)


def check_heave(folder, failures):
    rows = [r for r in read_csv(folder / "points.csv") if r["point"] == "under_floor_centre"]
    settlement = {float(r["time_days"]): float(r["settlement_m"]) for r in rows}
    after_lift_1 = settlement[min(settlement, key=lambda t: abs(t - 10.0))]
    at_end = settlement[max(settlement)]
    if not at_end < 0.0:
        failures.append(f"no heave under the pit's centre at the end ({at_end} m)")
    if not at_end < after_lift_1:
        failures.append(f"the second lift did not add heave ({after_lift_1} m after "
                        f"lift 1, {at_end} m at the end)")
    return after_lift_1, at_end


def check_results(folder, failures):
    results = tomllib.loads((folder / "results.toml").read_text())
    base = results.get("base_stability", {})
    # The pit is the excavation regions' extent, the wall the region named "wall":
    # piping at the floor and heave beside the wall toe (-12 m) are evaluated.
    piping = base.get("piping", {})
    if not piping.get("evaluated", False) or not piping.get("least", 0.0) > 0.0:
        failures.append(f"piping at the floor of the user's pit is not evaluated: {piping}")
    heave = base.get("heave", [])
    if len(heave) != 1 or heave[0].get("side") != "right" or not heave[0].get("evaluated"):
        failures.append(f"heave beside the user's wall is not evaluated: {heave}")
    elif abs(heave[0]["depth_at_end_m"] - 6.0) > 1e-9 or abs(heave[0]["width_at_end_m"] - 3.0) > 1e-9:
        failures.append(f"the heave prism at the end is {heave[0]['depth_at_end_m']} m deep "
                        f"and {heave[0]['width_at_end_m']} m wide, expected 6 and 3 (the "
                        f"toe at -12 m, the floor at -6 m)")
    levels = {s["name"]: s["dig_level_m"] for s in base.get("stages", [])}
    if levels != {name: level for name, _, level in LIFTS}:
        failures.append(f"results.toml gives the dig levels {levels}")


def main():
    program, scenario, folder = sys.argv[1:4]
    folder = pathlib.Path(folder)
    shutil.rmtree(folder, ignore_errors=True)  # an earlier run's files would mislead
    run = subprocess.run([program, "run", scenario, "-o", str(folder), "--overwrite", "-q"],
                         capture_output=True, text=True, timeout=900)
    if run.returncode != 0:
        print(f"FAIL: the run ended with status {run.returncode}: {run.stderr}")
        return 1
    failures = []
    n_outputs = check_cells(folder, failures)
    discharge = check_discharge(folder, failures)
    heave = check_heave(folder, failures)
    check_results(folder, failures)
    report = subprocess.run([program, "report", str(folder)], capture_output=True, text=True)
    if report.returncode != 0:
        failures.append(f"the report failed: {report.stderr}")
    for failure in failures:
        print("FAIL:", failure)
    if not failures:
        print(f"{n_outputs} field outputs checked; formation discharge "
              f"{discharge[0]:.4g} to {discharge[1]:.4g} m3/day per m; settlement under "
              f"the pit's centre {heave[0]:.4g} m after lift 1, {heave[1]:.4g} m at the end")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
