"""The demo's site given as a user's mesh: examples/basement-pit/scenario.toml with
its [section] replaced by [mesh_file] = meshes/basement-pit.msh (the demo's own
mesh, as `settlewell mesh` wrote it) and the boundary roles a section sets by
default written out. The stages keep the demo's `wells.W1`, the mesh calls the
screen `well_W1`. Both runs must give the same discharge, settlements, heads and
1D comparisons at the columns (the same mesh and equations: to round-off), the
user mesh's column stacks must come from its own regions, and its figures must
draw the outlines and the well. Its field files carry each cell's region id and
name and every point field's unit.

    demo_as_user_mesh.py SETTLEWELL SOURCE_DIR FOLDER
"""
import csv
import pathlib
import shutil
import subprocess
import sys
import tomllib

SECTION_TABLES = ("[section]", "[section.wall]", "[[section.wells]]", "[section.mesh]")
AS_USER_MESH = """
[mesh_file]
path = "{mesh}"
regions = {{ upper_sand = "upper_sand", soft_clay = "soft_clay", aquifer_sand = "aquifer_sand", stiff_clay = "stiff_clay", wall = "diaphragm_wall" }}

[boundaries.far_boundary]
hydraulic = "fixed_head"      # at the initial head, as a section's far boundary
mechanical = "roller"

[boundaries.model_base]
mechanical = "fixed"

[boundaries.symmetry_axis]
mechanical = "roller"
"""


def without_section(text):
    """The scenario's text without the [section...] tables (each runs to the next
    table header)."""
    out, skipping = [], False
    for line in text.splitlines():
        if line.startswith("["):
            skipping = line.strip() in SECTION_TABLES
        if not skipping:
            out.append(line)
    return "\n".join(out) + "\n"


def run(settlewell, scenario, folder):
    shutil.rmtree(folder, ignore_errors=True)
    done = subprocess.run([settlewell, "run", str(scenario), "-o", str(folder), "--report"],
                          capture_output=True, text=True)
    if done.returncode != 0:
        sys.exit(f"FAIL: {scenario} exited {done.returncode}: {done.stderr.strip()}")
    with open(folder / "results.toml", "rb") as f:
        return tomllib.load(f)


def close(a, b, what, failures, rel=1e-6, floor=1e-9):
    if abs(a - b) > rel * max(abs(a), abs(b)) + floor:
        failures.append(f"{what}: section {a!r}, user mesh {b!r}")


def compare_columns(section, user, failures):
    by_name = {c["name"]: c for c in user.get("columns", [])}
    if len(by_name) != len(section["columns"]):
        failures.append(f"columns: the user mesh has {sorted(by_name)}, the section "
                        f"{[c['name'] for c in section['columns']]}")
    for c in section["columns"]:
        u = by_name.get(c["name"])
        if u is None:
            continue
        for key in ("settlement_2d_end_m", "settlement_1d_computed_end_m",
                    "settlement_1d_design_end_m", "t50_1d_days"):
            close(c[key], u[key], f"column {c['name']} {key}", failures)
        names = [l["name"] for l in u["computed"]["layers"]]
        if names != ["upper_sand", "soft_clay", "aquifer_sand", "stiff_clay"]:
            failures.append(f"column {c['name']}: the user mesh's stack is {names}")


def compare_points(section_dir, user_dir, failures):
    with open(section_dir / "points.csv") as f:
        a = list(csv.DictReader(f))
    with open(user_dir / "points.csv") as f:
        b = list(csv.DictReader(f))
    if len(a) != len(b):
        failures.append(f"points.csv: {len(a)} rows against {len(b)}")
        return
    for ra, rb in zip(a, b):
        for key in ("settlement_m", "head_m"):
            close(float(ra[key]), float(rb[key]), f"{ra['point']} {key} day {ra['time_days']}",
                  failures, floor=1e-8)


def check_field_files(run_dir, failures):
    """The last field file: each cell's region as an id and a name that agree with
    the region list in the file, and a unit for every point field."""
    import vtk  # Debian's python3-vtk9, as the plotting scripts use

    last = sorted((run_dir / "fields").glob("fields_*.vtu"))[-1]
    reader = vtk.vtkXMLUnstructuredGridReader()
    reader.SetFileName(str(last))
    reader.Update()
    grid = reader.GetOutput()
    cells, fields = grid.GetCellData(), grid.GetFieldData()
    ids, names = cells.GetArray("region"), cells.GetAbstractArray("region_name")
    listed, units = fields.GetAbstractArray("region_names"), fields.GetAbstractArray("units")
    if None in (ids, names, listed, units):
        failures.append(f"{last.name}: region, region_name, region_names or units missing")
        return
    regions = dict(listed.GetValue(i).split(": ", 1) for i in range(listed.GetNumberOfValues()))
    if names.GetNumberOfValues() != grid.GetNumberOfCells():
        failures.append(f"{last.name}: {names.GetNumberOfValues()} region names for "
                        f"{grid.GetNumberOfCells()} cells")
    for c in range(grid.GetNumberOfCells()):
        if regions.get(str(int(ids.GetValue(c)))) != names.GetValue(c):
            failures.append(f"{last.name}: cell {c} region {ids.GetValue(c)} named "
                            f"{names.GetValue(c)!r}")
            break
    with_unit = {units.GetValue(i).split(":")[0] for i in range(units.GetNumberOfValues())}
    points = grid.GetPointData()
    for i in range(points.GetNumberOfArrays()):
        if points.GetArrayName(i) not in with_unit:
            failures.append(f"{last.name}: no unit for the point field {points.GetArrayName(i)}")


def main():
    settlewell, source, folder = sys.argv[1], pathlib.Path(sys.argv[2]).resolve(), pathlib.Path(sys.argv[3])
    folder.mkdir(parents=True, exist_ok=True)
    demo = source / "examples" / "basement-pit" / "scenario.toml"
    user = folder / "demo_as_user_mesh.toml"
    user.write_text(without_section(demo.read_text()) +
                    AS_USER_MESH.format(mesh=(source / "meshes" / "basement-pit.msh").as_posix()))
    section = run(settlewell, demo, folder / "section")
    as_mesh = run(settlewell, user, folder / "user_mesh")
    failures = []
    pumped = {d["line"]: d for d in as_mesh.get("discharge", [])}
    for d in section["discharge"]:
        if d["line"] not in pumped:
            failures.append(f"discharge: no '{d['line']}' in the user mesh's results")
            continue
        close(d["volume_m3"], pumped[d["line"]]["volume_m3"], f"pumped volume of {d['line']}",
              failures)
    compare_columns(section, as_mesh, failures)
    compare_points(folder / "section", folder / "user_mesh", failures)
    check_field_files(folder / "user_mesh", failures)
    figures = subprocess.run([sys.executable, str(source / "tests" / "report" / "check_figures.py"),
                              str(folder / "user_mesh")], capture_output=True, text=True)
    if figures.returncode != 0:
        failures.append("figures: " + figures.stdout.strip() + figures.stderr.strip())
    for f in failures:
        print("FAIL:", f)
    if failures:
        sys.exit(1)
    print("the demo as a user mesh: discharge, points and columns as the section's")


if __name__ == "__main__":
    main()
