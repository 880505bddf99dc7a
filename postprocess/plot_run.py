#!/usr/bin/env python3
"""Section views and charts of a Settlewell run folder, as PNG files.

    python3 postprocess/plot_run.py RUN_DIR [--times DAYS ...] [--processes N]

Writes RUN_DIR/plots/: drawdown and settlement over the section at chosen times
(region outlines and names, the wall, wells and the excavation level drawn in from
the run's mesh files, with a legend and the vertical exaggeration stated),
settlement troughs along the ground surface (with the wall, the neighbours'
footprints and the settlement limit), time histories at the monitoring points, the
1D-against-2D curve of each column, pumped discharge, and the base-stability
factors with their limits. The figures are drawn by N processes at once (default:
one per core, at most 4).

Needs VTK's Python module and matplotlib (Debian: python3-vtk9,
python3-matplotlib); run it with the interpreter that has them, e.g.
/usr/bin/python3.
"""

import argparse
import csv
import math
import multiprocessing
import os
import sys
import tomllib

import matplotlib

matplotlib.use("Agg")
import matplotlib.colors as mcolors  # noqa: E402
import matplotlib.pyplot as plt  # noqa: E402
import matplotlib.tri as mtri  # noqa: E402
import numpy as np  # noqa: E402
import vtk  # noqa: E402
from matplotlib.collections import LineCollection, PolyCollection  # noqa: E402
from matplotlib.lines import Line2D  # noqa: E402
from matplotlib.patches import Patch  # noqa: E402
from matplotlib.ticker import MaxNLocator  # noqa: E402
from vtk.util.numpy_support import vtk_to_numpy  # noqa: E402

LAGRANGE_QUAD = 70  # VTK_LAGRANGE_QUADRILATERAL: corners, edge midpoints, centre
# The 9-node cell's boundary in order: corner, edge midpoint, corner, ...
LAGRANGE_LOOP = [0, 4, 1, 5, 2, 6, 3, 7]
# How the section views draw the geometry (one style for the drawing and its legend).
WALL_STYLE = {"facecolor": "0.2", "edgecolor": "0.2"}
WELL_STYLE = {"color": "tab:blue", "linewidth": 2.5}
DIG_STYLE = {"color": "k", "linewidth": 0.8, "linestyle": "--"}
OUTLINE_STYLE = {"color": "0.35", "linewidth": 0.6}
# Vertical exaggerations a section view may take: a round number a reader can use.
EXAGGERATIONS = (1, 2, 3, 4, 5, 6, 8, 10, 15, 20, 25, 30, 40, 50, 75, 100)


def finish(fig, ax, title, xlabel, ylabel, legend=True):
    """Labels, grid and legend of a chart; returns the figure."""
    ax.set_xlabel(xlabel)
    ax.set_ylabel(ylabel)
    ax.set_title(title)
    ax.grid(alpha=0.3)
    if legend:
        ax.legend(fontsize=8)
    fig.tight_layout()
    return fig


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
    return points, cells, grid.GetCellData()


def cell_texts(data, name):
    """A String array of cell data (VTK keeps those apart from numeric arrays)."""
    array = data.GetAbstractArray(name)
    return [array.GetValue(i) for i in range(array.GetNumberOfValues())]


def label_position(centres, x_min, x_max):
    """Where a region's name goes: at four fifths of the section's width, at the
    middle height of the region's cells there (layers span the width), or at the
    region's cell nearest its centroid when it does not reach that far."""
    centres = np.asarray(centres)
    x = x_min + 0.8 * (x_max - x_min)
    band = centres[np.abs(centres[:, 0] - x) <= 0.1 * (x_max - x_min)]
    if len(band):
        return x, float(np.median(band[:, 1]))
    nearest = np.argmin(np.linalg.norm(centres - centres.mean(axis=0), axis=1))
    return tuple(float(v) for v in centres[nearest])


def merged_spans(intervals):
    """Overlapping (low, high) intervals merged: the walls' extents along x."""
    spans = []
    for low, high in sorted(intervals):
        if spans and low <= spans[-1][1] + 1e-9:
            spans[-1][1] = max(spans[-1][1], high)
        else:
            spans.append([low, high])
    return [tuple(s) for s in spans]


def mesh_geometry(run):
    """What the section views draw, from the run's mesh files (mesh/): the outlines
    between regions and where each region's name goes, the wall's cells and its
    extent along x, the well screens and the excavation level."""
    folder = os.path.join(run, "mesh")
    points, cells, data = read_grid(os.path.join(folder, "mesh_cells.vtu"))
    region_names = cell_texts(data, "region_name")
    owners, wall, centres = {}, [], {}
    for ids, name in zip(cells, region_names):
        if name == "wall":
            wall.append([tuple(points[i][:2]) for i in ids])
        else:
            centres.setdefault(name, []).append(points[ids][:, :2].mean(axis=0))
        for a, b in zip(ids, ids[1:] + ids[:1]):
            key = tuple(sorted((tuple(points[a][:2].round(6)), tuple(points[b][:2].round(6)))))
            owners.setdefault(key, set()).add(name)
    outlines = [edge for edge, names_here in owners.items() if len(names_here) > 1]
    x_min, x_max = float(points[:, 0].min()), float(points[:, 0].max())
    labels = {name: label_position(c, x_min, x_max) for name, c in centres.items()}
    wall_spans = merged_spans([(min(p[0] for p in w), max(p[0] for p in w)) for w in wall])
    points, cells, data = read_grid(os.path.join(folder, "mesh_lines.vtu"))
    segments = {}
    for ids, name in zip(cells, cell_texts(data, "line_name")):
        segments.setdefault(name, []).append([points[i][:2] for i in ids])
    return {"outlines": outlines, "wall": wall, "wall_spans": wall_spans, "segments": segments,
            "labels": labels, "x_min": x_min}


def draw_geometry(ax, geometry):
    """Region outlines and names, the wall, the well screens and the excavation
    level; returns the legend's entries for what was drawn."""
    ax.add_collection(LineCollection(geometry["outlines"], colors=OUTLINE_STYLE["color"],
                                     linewidths=OUTLINE_STYLE["linewidth"], zorder=2))
    handles = [Line2D([], [], label="boundary between regions", **OUTLINE_STYLE)]
    if geometry["wall"]:
        ax.add_collection(PolyCollection(geometry["wall"], zorder=3, **WALL_STYLE))
        handles.append(Patch(label="cutoff wall", **WALL_STYLE))
    wells = sorted(name[len("well_"):] for name in geometry["segments"] if name.startswith("well_"))
    for name in wells:
        ax.add_collection(LineCollection(geometry["segments"]["well_" + name], colors=WELL_STYLE["color"],
                                         linewidths=WELL_STYLE["linewidth"], zorder=4))
    if wells:
        handles.append(Line2D([], [], label="well screen (" + ", ".join(wells) + ")", **WELL_STYLE))
    if "excavation_level" in geometry["segments"]:
        ax.add_collection(LineCollection(geometry["segments"]["excavation_level"], colors=DIG_STYLE["color"],
                                         linewidths=DIG_STYLE["linewidth"],
                                         linestyles=DIG_STYLE["linestyle"], zorder=3))
        handles.append(Line2D([], [], label="final excavation level", **DIG_STYLE))
    for name, (x, y) in geometry["labels"].items():
        ax.text(x, y, name.replace("_", " "), fontsize=7, ha="center", va="center", zorder=5,
                bbox={"boxstyle": "round,pad=0.15", "facecolor": "white", "edgecolor": "none", "alpha": 0.75})
    return handles


def radial_axis(ax, x_min):
    """An axisymmetric view's radius on a log scale, so that the shaft or well can be
    seen beside a far boundary hundreds of metres out."""
    if x_min > 0:
        ax.set_xscale("log")
    else:
        ax.set_xscale("symlog", linthresh=1.0)


def colour_scale(values, sequential, diverging):
    """The values to draw, contour levels, colour map and norm of a field. A field of
    one sign is drawn in a sequential map from zero (values of the other sign within
    a thousandth of the largest are drawn as zero); one that takes both signs (heads
    that rose, ground that heaved) in a diverging map centred on zero, so that a
    negative value never shares the colour of zero. The levels are round numbers."""
    low, high = float(np.min(values)), float(np.max(values))
    span = max(abs(low), abs(high))
    if span == 0.0:
        return values, np.array([-1e-9, 1e-9]), sequential, None
    if low >= -1e-3 * span:
        return np.maximum(values, 0.0), MaxNLocator(20).tick_values(0.0, high), sequential, None
    # Each sign takes its own half of the map, so that a small rise is as plain as a
    # large drawdown; values within a thousandth of the largest of zero keep the
    # colour of zero (a band from -span/1000 to 0).
    norm = mcolors.TwoSlopeNorm(vcenter=0.0, vmin=low, vmax=max(high, 1e-6 * span))
    small = 1e-3 * span
    levels = sorted({t for t in MaxNLocator(20).tick_values(low, high) if t >= 0 or t < -small} | {-small})
    return values, np.array(levels), diverging, norm


def exaggeration(width, height, box_width, box_height):
    """The round vertical exaggeration that fills a box of about this shape."""
    natural = (width / height) * (box_height / box_width)
    if natural <= 1.0:
        return 1
    return min(EXAGGERATIONS, key=lambda e: abs(math.log(e / natural)))


SECTION_FIELDS = {
    # field: (colour-bar label, sequential map, diverging map)
    "drawdown": ("drawdown (m; negative where the head rose)", "viridis_r", "RdYlBu"),
    "settlement": ("settlement (m, down; negative is heave)", "magma_r", "BrBG_r"),
}


def phreatic_line(ax, tri, pore_pressure):
    """The line where the pore pressure is zero (the water table, or the top of the
    saturated zone), drawn where the section has one; its legend handle."""
    if pore_pressure is None or not (pore_pressure.min() < 0.0 < pore_pressure.max()):
        return []
    ax.tricontour(tri, pore_pressure, levels=[0.0], colors="#1f4e9c", linewidths=1.3,
                  linestyles="--")
    return [Line2D([], [], color="#1f4e9c", linestyle="--", label="phreatic line (p = 0)")]


def section_view(run, geometry, axisymmetric, time, file, field):
    """One field over the section, with the geometry, a legend of its symbols and,
    in plane strain, a stated vertical exaggeration (x and y share one scale times
    it); the axes are placed by hand so that the scale is exact."""
    tri, fields = read_fields(os.path.join(run, "fields", file))
    label, sequential, diverging = SECTION_FIELDS[field]
    width, height = tri.x.max() - tri.x.min(), tri.y.max() - tri.y.min()
    box_width, box_height, scale = 7.6, 3.2, 1
    if not axisymmetric:
        scale = exaggeration(width, height, box_width, box_height)
        box_height = box_width * height * scale / width
        if box_height > 6.0:  # a tall model: narrow the box instead
            box_width, box_height = 6.0 * width / (height * scale), 6.0
    left, bottom, top = 0.8, 1.05, 0.45
    fig = plt.figure(figsize=(10.0, bottom + box_height + top))
    fw, fh = fig.get_size_inches()
    ax = fig.add_axes([left / fw, bottom / fh, box_width / fw, box_height / fh])
    colour_axes = fig.add_axes([(left + box_width + 0.3) / fw, bottom / fh, 0.2 / fw, box_height / fh])
    values, levels, cmap, norm = colour_scale(fields[field], sequential, diverging)
    contour = ax.tricontourf(tri, values, levels=levels, cmap=cmap, norm=norm)
    ax.tricontour(tri, values, levels=levels, colors="k", linewidths=0.2)
    fig.colorbar(contour, cax=colour_axes, label=label)
    ax.set_xlim(tri.x.min(), tri.x.max())
    ax.set_ylim(tri.y.min(), tri.y.max())
    handles = draw_geometry(ax, geometry)
    handles += phreatic_line(ax, tri, fields.get("pore_pressure"))
    if axisymmetric:
        radial_axis(ax, geometry["x_min"])
        note = "radius on a log scale"
    else:
        ax.set_aspect(scale, adjustable="box")
        note = "true scale" if scale == 1 else f"vertical scale exaggerated ×{scale}"
    ax.set_xlabel("r, radius from the axis (m)" if axisymmetric else "x (m)")
    ax.set_ylabel("elevation (m)")
    ax.set_title(f"{field} at day {time:g} ({note})")
    fig.legend(handles=handles, loc="lower center", ncol=len(handles), fontsize=8, frameon=False,
               bbox_to_anchor=((left + box_width / 2) / fw, 0.02))
    return fig


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


def wall(run, results):
    """Deflection and bending moment against elevation at the end of each stage."""
    rows = read_table(run, "checks", "wall.csv")
    if rows is None:
        return None
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
    return fig


def trough_context(ax, geometry, results):
    """The wall, the neighbours' footprints (named) and the settlement limit drawn
    behind the troughs; returns their legend entries."""
    handles = []
    for low, high in geometry["wall_spans"]:
        ax.axvspan(low, high, zorder=0, **WALL_STYLE)
    if geometry["wall_spans"]:
        handles.append(Patch(label="cutoff wall", **WALL_STYLE))
    for n in results.get("neighbours", []):
        ax.axvspan(n["x_from_m"], n["x_to_m"], color="tab:orange", alpha=0.12, zorder=0)
        ax.text((n["x_from_m"] + n["x_to_m"]) / 2, 0.02, n["name"], transform=ax.get_xaxis_transform(),
                ha="center", va="bottom", fontsize=7)
    if results.get("neighbours"):
        handles.append(Patch(color="tab:orange", alpha=0.12, label="neighbour footprint"))
    limit = results.get("neighbour_limits", {}).get("settlement_m")
    if limit is not None and results.get("neighbours"):
        handles.append(ax.axhline(1000 * limit, color="tab:red", lw=0.9, ls="--",
                                  label=f"neighbours' settlement limit ({1000 * limit:g} mm)"))
    return handles


def trough(run, geometry, results, axisymmetric):
    rows = read_table(run, "profiles", "ground_surface.csv")
    if rows is None:
        return None
    times = sorted({float(r["time_days"]) for r in rows})
    chosen = [t for t in times if t > 0]
    step = max(1, len(chosen) // 6)
    chosen = chosen[::step] + ([chosen[-1]] if chosen and chosen[-1] not in chosen[::step] else [])
    fig, ax = plt.subplots(figsize=(9, 4))
    handles = []
    for t in chosen:
        at = [r for r in rows if float(r["time_days"]) == t]
        handles += ax.plot(numbers(at, "x_m"), [1000 * v for v in numbers(at, "settlement_m")],
                           label=f"day {t:.3g}")
    handles += trough_context(ax, geometry, results)
    ax.invert_yaxis()
    if axisymmetric:
        radial_axis(ax, geometry["x_min"])
    ax.legend(handles=handles, fontsize=7, ncol=2)
    return finish(fig, ax, "Settlement trough along the ground surface",
                  "r, radius from the axis (m)" if axisymmetric else "x (m)",
                  "settlement (mm, down)", legend=False)


def histories(run):
    rows = read_csv(os.path.join(run, "points.csv"))
    if not rows:
        return None
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
    return fig


def one_d(run, name):
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
    return finish(fig, ax, f"Column {name}: 1D hand estimate against the 2D model", "time (days)",
                  "settlement (mm)")


def discharge(run, unit, half):
    rows = read_csv(os.path.join(run, "steps.csv"))
    keys = [k for k in rows[0] if k.startswith("discharge_")]
    if not keys:
        return None
    fig, ax = plt.subplots(figsize=(8, 3.6))
    t = numbers(rows, "time_days")
    for k in keys:
        ax.step(t, numbers(rows, k), where="pre", label=k[len("discharge_"):-len("_m3_per_day")])
    if min(min(numbers(rows, k)) for k in keys) >= 0:
        ax.set_ylim(bottom=0)
    title = "Pumped discharge" + (" of the modelled half (the whole pit pumps twice this)" if half else "")
    return finish(fig, ax, title, "time (days)", f"discharge (m³/day {unit})")


def factor_label(key):
    """A base-stability column as words: piping_factor -> piping,
    heave_factor_right -> heave (right), uplift_factor_soft_clay -> uplift of soft_clay."""
    check, _, where = key.partition("_factor")
    where = where.lstrip("_")
    if not where:
        return check
    return f"{check} ({where})" if check == "heave" else f"{check} of {where}"


def base_factors(run, results):
    """The factors that were evaluated, against time, and the limit of each drawn
    check; None when no factor was evaluated (the report says why)."""
    rows = read_table(run, "checks", "base_stability.csv")
    if rows is None:
        return None
    t = numbers(rows, "time_days")
    drawn = {}
    for key in rows[0]:
        if "_factor" not in key:
            continue
        values = [v if math.isfinite(v) and v < 20 else math.nan for v in numbers(rows, key)]
        if any(math.isfinite(v) for v in values):
            drawn[key] = values
    if not drawn:
        return None
    fig, ax = plt.subplots(figsize=(8, 3.6))
    for key, values in drawn.items():
        ax.plot(t, values, marker="o", ms=3, label=factor_label(key))
    limits = {}
    checks = results.get("base_stability", {})
    for check in ("piping", "heave", "uplift"):
        entry = checks.get(check)
        entry = entry[0] if isinstance(entry, list) and entry else entry
        if entry and any(k.startswith(check + "_") for k in drawn):
            limits.setdefault(entry["limit"], []).append(check)
    for value, names in limits.items():
        ax.axhline(value, color="tab:red", lw=0.9, ls="--", label=f"limit for {', '.join(names)} ({value:g})")
    ax.set_ylim(bottom=0)
    return finish(fig, ax, "Base stability at the final excavation level (factors above 20 not shown)",
                  "time (days)", "factor of safety (-)")


def figure_jobs(run, times=None):
    """Every figure of the run: (file name, function that draws it and returns the
    matplotlib figure, or None when the run has nothing for it)."""
    with open(os.path.join(run, "results.toml"), "rb") as f:
        results = tomllib.load(f)
    fields = series(run)
    geometry = mesh_geometry(run)
    axisymmetric = results.get("analysis") == "axisymmetric"
    jobs = []
    for day in times or sorted({s["end_days"] for s in results.get("stages", [])}):
        time, file = min(fields, key=lambda s: abs(s[0] - day))
        tag = f"{time:g}".replace(".", "_")
        for field in SECTION_FIELDS:
            jobs.append((f"section_{field}_day{tag}.png",
                         lambda t=time, f=file, k=field: section_view(run, geometry, axisymmetric, t, f, k)))
    unit = "per metre run" if results.get("analysis") == "plane_strain" else "per well"
    jobs += [("trough.png", lambda: trough(run, geometry, results, axisymmetric)),
             ("wall.png", lambda: wall(run, results)),
             ("histories.png", lambda: histories(run)),
             ("discharge.png", lambda: discharge(run, unit, results.get("modelled_half", False))),
             ("base_stability.png", lambda: base_factors(run, results))]
    for column in results.get("columns", []):
        jobs.append((f"one_d_{column['name']}.png", lambda n=column["name"]: one_d(run, n)))
    return jobs


JOBS = []  # the figures to draw; the worker processes inherit them by fork


def draw(index):
    """Draws one figure of JOBS into its file; returns the file, or None."""
    out, make = JOBS[index]
    fig = make()
    if fig is None:
        return None
    fig.savefig(out, dpi=110)
    plt.close(fig)
    return out


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("run", help="a Settlewell run folder")
    parser.add_argument("--times", type=float, nargs="*", help="days for the section views")
    parser.add_argument("--processes", type=int, default=min(4, os.cpu_count() or 1),
                        help="figures drawn at once (default: one per core, at most 4)")
    args = parser.parse_args()
    plots = os.path.join(args.run, "plots")
    os.makedirs(plots, exist_ok=True)
    JOBS.extend((os.path.join(plots, name), make) for name, make in figure_jobs(args.run, args.times))
    if args.processes > 1 and len(JOBS) > 1:
        with multiprocessing.get_context("fork").Pool(min(args.processes, len(JOBS))) as pool:
            made = pool.map(draw, range(len(JOBS)), chunksize=1)
    else:
        made = [draw(i) for i in range(len(JOBS))]
    for path in made:
        if path:
            print(path)
    return 0


if __name__ == "__main__":
    sys.exit(main())
