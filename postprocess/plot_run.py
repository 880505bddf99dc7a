#!/usr/bin/env python3
"""Section views and charts of a Settlewell run folder, as PNG files.

    python3 postprocess/plot_run.py RUN_DIR [--times DAYS ...]

Writes RUN_DIR/plots/: drawdown and settlement over the section at chosen times
(region outlines, the wall, wells and the excavation level drawn in from the run's
mesh files), settlement troughs along
the ground surface, time histories at the monitoring points, the 1D-against-2D
curve of each column, pumped discharge, and the base-stability factors.

Needs VTK's Python module and matplotlib (Debian: python3-vtk9,
python3-matplotlib); run it with the interpreter that has them, e.g.
/usr/bin/python3.
"""

import argparse
import csv
import math
import os
import sys
import tomllib

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
import matplotlib.tri as mtri  # noqa: E402
import vtk  # noqa: E402
from vtk.util.numpy_support import vtk_to_numpy  # noqa: E402

LAGRANGE_QUAD = 70  # VTK_LAGRANGE_QUADRILATERAL: corners, edge midpoints, centre
# The 9-node cell's boundary in order: corner, edge midpoint, corner, ...
LAGRANGE_LOOP = [0, 4, 1, 5, 2, 6, 3, 7]


def finish(fig, ax, out, title, xlabel, ylabel, legend=True):
    """Labels, grid and legend of a chart, then save and close it."""
    ax.set_xlabel(xlabel)
    ax.set_ylabel(ylabel)
    ax.set_title(title)
    ax.grid(alpha=0.3)
    if legend:
        ax.legend(fontsize=8)
    fig.tight_layout()
    fig.savefig(out, dpi=110)
    plt.close(fig)


def read_csv(path):
    with open(path, newline="") as f:
        rows = list(csv.DictReader(f))
    return rows


def read_table(run, *parts):
    """The rows of a table in the run folder, or None if the run did not write it."""
    path = os.path.join(run, *parts)
    return read_csv(path) if os.path.exists(path) else None


def numbers(rows, key):
    """A column as numbers; an empty cell (not evaluated) is NaN."""
    return [float(r[key]) if r[key] != "" else math.nan for r in rows]


def series(run):
    """(time in days, file) of the field series, from the PVD record."""
    import xml.etree.ElementTree as ET  # the PVD record is plain XML

    root = ET.parse(os.path.join(run, "fields", "fields.pvd")).getroot()
    return [(float(d.get("timestep")), d.get("file")) for d in root.iter("DataSet")]


def read_fields(path):
    if path.endswith(".pvtu"):
        reader = vtk.vtkXMLPUnstructuredGridReader()
    else:
        reader = vtk.vtkXMLUnstructuredGridReader()
    reader.SetFileName(path)
    reader.Update()
    grid = reader.GetOutput()
    points = vtk_to_numpy(grid.GetPoints().GetData())
    triangles = []
    for c in range(grid.GetNumberOfCells()):
        cell = grid.GetCell(c)
        ids = [cell.GetPointId(i) for i in range(cell.GetNumberOfPoints())]
        if grid.GetCellType(c) == LAGRANGE_QUAD and len(ids) == 9:
            loop = [ids[i] for i in LAGRANGE_LOOP]
            triangles += [(loop[i], loop[(i + 1) % 8], ids[8]) for i in range(8)]
        elif len(ids) == 4:
            triangles += [(ids[0], ids[1], ids[2]), (ids[0], ids[2], ids[3])]
    tri = mtri.Triangulation(points[:, 0], points[:, 1], triangles)
    data = grid.GetPointData()
    fields = {data.GetArrayName(i): vtk_to_numpy(data.GetArray(i)) for i in range(data.GetNumberOfArrays())}
    return tri, fields


def read_grid(path):
    reader = vtk.vtkXMLUnstructuredGridReader()
    reader.SetFileName(path)
    reader.Update()
    grid = reader.GetOutput()
    points = vtk_to_numpy(grid.GetPoints().GetData())
    cells = [[grid.GetCell(c).GetPointId(i) for i in range(grid.GetCell(c).GetNumberOfPoints())]
             for c in range(grid.GetNumberOfCells())]
    return points, cells, grid.GetPointData()


def mesh_geometry(run):
    """What the section views draw, from the run's mesh files (mesh/): the outlines
    between regions, the wall's cells, the well screens and the excavation level."""
    folder = os.path.join(run, "mesh")
    with open(os.path.join(folder, "names.toml"), "rb") as f:
        names = tomllib.load(f)
    regions = {int(k): v for k, v in names["regions"].items()}
    lines = {int(k): v for k, v in names["lines"].items()}
    points, cells, data = read_grid(os.path.join(folder, "mesh_cells.vtu"))
    region = vtk_to_numpy(data.GetArray("region"))
    owners, wall = {}, []
    for ids in cells:
        name = regions[int(region[ids[0]])]  # constant over the cell
        if name == "wall":
            wall.append([tuple(points[i][:2]) for i in ids])
        for a, b in zip(ids, ids[1:] + ids[:1]):
            key = tuple(sorted((tuple(points[a][:2].round(6)), tuple(points[b][:2].round(6)))))
            owners.setdefault(key, set()).add(name)
    outlines = [edge for edge, names_here in owners.items() if len(names_here) > 1]
    points, cells, data = read_grid(os.path.join(folder, "mesh_lines.vtu"))
    line = vtk_to_numpy(data.GetArray("line"))
    segments = {}
    for ids in cells:
        segments.setdefault(lines[int(line[ids[0]])], []).append([points[i][:2] for i in ids])
    return {"outlines": outlines, "wall": wall, "segments": segments}


def draw_geometry(ax, geometry):
    """Region outlines, the wall, the well screens and the excavation level."""
    from matplotlib.collections import LineCollection, PolyCollection
    ax.add_collection(LineCollection(geometry["outlines"], colors="0.35", linewidths=0.6, zorder=2))
    if geometry["wall"]:
        ax.add_collection(PolyCollection(geometry["wall"], facecolors="0.2", edgecolors="0.2", zorder=3))
    for name, segments in geometry["segments"].items():
        if name.startswith("well_"):
            ax.add_collection(LineCollection(segments, colors="tab:blue", linewidths=2.5, zorder=4))
        elif name == "excavation_level":
            ax.add_collection(LineCollection(segments, colors="k", linewidths=0.8, linestyles="--",
                                             zorder=3))


def section_view(run, geometry, axisymmetric, time, file, field, label, cmap, out):
    tri, fields = read_fields(os.path.join(run, "fields", file))
    values = fields[field]
    fig, ax = plt.subplots(figsize=(10, 4.2))
    levels = 20
    contour = ax.tricontourf(tri, values, levels=levels, cmap=cmap)
    ax.tricontour(tri, values, levels=levels, colors="k", linewidths=0.2)
    fig.colorbar(contour, ax=ax, label=label)
    ax.set_xlim(tri.x.min(), tri.x.max())
    ax.set_ylim(tri.y.min(), tri.y.max())
    draw_geometry(ax, geometry)
    ax.set_xlabel("r (m)" if axisymmetric else "x (m)")
    ax.set_ylabel("elevation (m)")
    ax.set_title(f"{label} at day {time:g}")
    fig.tight_layout()
    fig.savefig(out, dpi=110)
    plt.close(fig)


def stage_end_times(results):
    """The end of every stage, in days."""
    return [s["end_days"] for s in results.get("stages", [])]


def nearest_times(available, wanted):
    """For each wanted time, the nearest available one (each once, in order)."""
    chosen = []
    for t in wanted:
        best = min(available, key=lambda a: abs(a - t))
        if best not in chosen:
            chosen.append(best)
    return chosen


def wall(run, results, out):
    """Deflection and bending moment against elevation at the end of each stage."""
    rows = read_table(run, "checks", "wall.csv")
    if rows is None:
        return False
    side = rows[0]["side"]
    rows = [r for r in rows if r["side"] == side]
    times = nearest_times(sorted({float(r["time_days"]) for r in rows}), stage_end_times(results))
    names = {round(s["end_days"], 6): s["name"] for s in results.get("stages", [])}
    fig, (left, right) = plt.subplots(1, 2, figsize=(9, 5), sharey=True)
    for t in times:
        at = [r for r in rows if float(r["time_days"]) == t]
        label = f"{names.get(round(t, 6), 'day')} (day {t:g})"
        left.plot(numbers(at, "deflection_towards_pit_mm"), numbers(at, "y_m"), label=label)
        right.plot(numbers(at, "bending_moment_kNm_per_m"), numbers(at, "y_m"), label=label)
    left.set_xlabel("deflection towards the pit (mm)")
    right.set_xlabel("bending moment (kNm/m; + pit side in tension)")
    left.set_ylabel("elevation (m)")
    for ax in (left, right):
        ax.axvline(0.0, color="0.6", lw=0.6)
        ax.grid(alpha=0.3)
    right.legend(fontsize=7)
    fig.suptitle(f"Wall ({side} side) at the end of each stage")
    fig.tight_layout()
    fig.savefig(out, dpi=110)
    plt.close(fig)
    return True


def trough(run, out):
    rows = read_table(run, "profiles", "ground_surface.csv")
    if rows is None:
        return False
    times = sorted({float(r["time_days"]) for r in rows})
    chosen = [t for t in times if t > 0]
    step = max(1, len(chosen) // 6)
    chosen = chosen[::step] + ([chosen[-1]] if chosen and chosen[-1] not in chosen[::step] else [])
    fig, ax = plt.subplots(figsize=(9, 4))
    for t in chosen:
        at = [r for r in rows if float(r["time_days"]) == t]
        ax.plot(numbers(at, "x_m"), [1000 * v for v in numbers(at, "settlement_m")], label=f"day {t:.3g}")
    ax.invert_yaxis()
    finish(fig, ax, out, "Settlement trough along the ground surface", "x (m)", "settlement (mm, down)")
    return True


def histories(run, out):
    rows = read_csv(os.path.join(run, "points.csv"))
    if not rows:
        return False
    names = list(dict.fromkeys(r["point"] for r in rows))
    fig, (top, bottom) = plt.subplots(2, 1, figsize=(9, 6), sharex=True)
    for name in names:
        at = [r for r in rows if r["point"] == name]
        t = numbers(at, "time_days")
        top.plot(t, numbers(at, "drawdown_m"), label=name)
        bottom.plot(t, [1000 * v for v in numbers(at, "settlement_m")], label=name)
    top.set_ylabel("drawdown (m)")
    bottom.set_ylabel("settlement (mm)")
    bottom.set_xlabel("time (days)")
    top.set_title("Monitoring points")
    for ax in (top, bottom):
        ax.grid(alpha=0.3)
    top.legend(fontsize=8)
    fig.tight_layout()
    fig.savefig(out, dpi=110)
    plt.close(fig)
    return True


def one_d(run, name, out):
    rows = read_csv(os.path.join(run, "one_d", name + ".csv"))
    t = numbers(rows, "time_days")
    fig, ax = plt.subplots(figsize=(8, 4))
    ax.plot(t, [1000 * v for v in numbers(rows, "settlement_2d_m")], "k", lw=2, label="2D model")
    curves = [("settlement_1d_computed_ramped_m", "1D, 2D heads, ramped", "-"),
              ("settlement_1d_computed_instant_m", "1D, 2D heads, instantaneous", ":"),
              ("settlement_1d_design_ramped_m", "1D, design drawdown, ramped", "--"),
              ("settlement_1d_design_instant_m", "1D, design drawdown, instantaneous", "-.")]
    for key, label, style in curves:
        if key in rows[0]:
            ax.plot(t, [1000 * v for v in numbers(rows, key)], style, label=label)
    finish(fig, ax, out, f"Column {name}: 1D hand estimate against the 2D model", "time (days)",
           "settlement (mm)")


def discharge(run, unit, out):
    rows = read_csv(os.path.join(run, "steps.csv"))
    keys = [k for k in rows[0] if k.startswith("discharge_")]
    if not keys:
        return False
    fig, ax = plt.subplots(figsize=(8, 3.6))
    t = numbers(rows, "time_days")
    for k in keys:
        ax.step(t, numbers(rows, k), where="pre", label=k[len("discharge_"):-len("_m3_per_day")])
    finish(fig, ax, out, "Pumped discharge", "time (days)", f"discharge (m³/day {unit})")
    return True


def base_factors(run, results, out):
    rows = read_table(run, "checks", "base_stability.csv")
    if rows is None:
        return False
    t = numbers(rows, "time_days")
    fig, ax = plt.subplots(figsize=(8, 3.6))
    limits = results.get("base_stability", {})
    for key in rows[0]:
        if "factor" not in key:
            continue
        values = [v if math.isfinite(v) and v < 20 else math.nan for v in numbers(rows, key)]
        ax.plot(t, values, marker="o", ms=3, label=key.replace("_", " "))
    for check in ("piping",):
        if check in limits:
            ax.axhline(limits[check]["limit"], color="tab:red", lw=0.8, ls="--")
    for group in ("heave", "uplift"):
        for entry in limits.get(group, [])[:1]:
            ax.axhline(entry["limit"], color="tab:red", lw=0.8, ls=":")
    finish(fig, ax, out, "Base stability at the final excavation level (factors above 20 not shown)",
           "time (days)", "factor of safety")
    return True


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("run", help="a Settlewell run folder")
    parser.add_argument("--times", type=float, nargs="*", help="days for the section views")
    args = parser.parse_args()
    run = args.run
    with open(os.path.join(run, "results.toml"), "rb") as f:
        results = tomllib.load(f)
    plots = os.path.join(run, "plots")
    os.makedirs(plots, exist_ok=True)
    made = []
    fields = series(run)
    geometry = mesh_geometry(run)
    axisymmetric = results.get("analysis") == "axisymmetric"
    wanted = args.times or sorted({s["end_days"] for s in results.get("stages", [])})
    for day in wanted:
        time, file = min(fields, key=lambda s: abs(s[0] - day))
        tag = f"{time:g}".replace(".", "_")
        for field, label, cmap in (("drawdown", "drawdown (m)", "viridis_r"),
                                   ("settlement", "settlement (m)", "magma_r")):
            out = os.path.join(plots, f"section_{field}_day{tag}.png")
            section_view(run, geometry, axisymmetric, time, file, field, label, cmap, out)
            made.append(out)
    unit = "per metre run" if results.get("analysis") == "plane_strain" else "per well"
    for name, make in (("trough.png", lambda o: trough(run, o)),
                       ("wall.png", lambda o: wall(run, results, o)),
                       ("histories.png", lambda o: histories(run, o)),
                       ("discharge.png", lambda o: discharge(run, unit, o)),
                       ("base_stability.png", lambda o: base_factors(run, results, o))):
        out = os.path.join(plots, name)
        if make(out):
            made.append(out)
    for column in results.get("columns", []):
        out = os.path.join(plots, f"one_d_{column['name']}.png")
        one_d(run, column["name"], out)
        made.append(out)
    for path in made:
        print(path)
    return 0


if __name__ == "__main__":
    sys.exit(main())
