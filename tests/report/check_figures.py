#!/usr/bin/env python3
"""Checks what the figures of a run say, beyond their loading: each axis is
labelled with its unit, each figure with more than one curve has a legend, every
legend entry stands for something drawn with data, the section views name their
symbols and state their vertical scale (and keep it), a field that changes sign
is drawn about zero, and the trough shows the wall, the neighbours and the limit.

    /usr/bin/python3 tests/report/check_figures.py RUN_DIR

Draws the figures with postprocess/plot_run.py's own functions (nothing is
written). Exit status 0 when every check holds; each failure is printed."""

import math
import os
import re
import sys
import tomllib

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "postprocess"))
import plot_run  # noqa: E402
from matplotlib.lines import Line2D  # noqa: E402

UNIT = re.compile(r"\(.+\)")


def plot_axes(fig):
    """The figure's axes that hold data (not colour bars)."""
    return [a for a in fig.axes if not hasattr(a, "_colorbar")]


def legend_texts(fig):
    legends = [a.get_legend() for a in fig.axes if a.get_legend()] + list(fig.legends)
    return [t.get_text() for legend in legends for t in legend.get_texts()]


def check_labels(name, fig, failures):
    axes = plot_axes(fig)
    for ax in axes:
        # An axis shared with a labelled one (stacked or side-by-side charts) may go
        # without its own label.
        for axis, label, shared in (("x", ax.get_xlabel(), ax.get_shared_x_axes()),
                                    ("y", ax.get_ylabel(), ax.get_shared_y_axes())):
            labelled_twin = any(shared.joined(ax, other) and
                                (other.get_xlabel() if axis == "x" else other.get_ylabel())
                                for other in axes if other is not ax)
            if not UNIT.search(label) and not labelled_twin:
                failures.append(f"{name}: {axis} label '{label}' has no unit")


def check_legend(name, fig, failures):
    texts = legend_texts(fig)
    for ax in plot_axes(fig):
        curves = [line for line in ax.lines if not line.get_label().startswith("_")]
        if len(curves) > 1 and not texts:
            failures.append(f"{name}: {len(curves)} curves and no legend")
        for line in curves:
            if line.get_label() in texts and not any(math.isfinite(v) for v in line.get_ydata()):
                failures.append(f"{name}: the legend lists '{line.get_label()}', drawn without data")


def check_section(name, fig, geometry, axisymmetric, failures):
    ax = plot_axes(fig)[0]
    texts = " | ".join(legend_texts(fig))
    for wanted, present in (("cutoff wall", bool(geometry["wall"])),
                            ("well screen", any(k.startswith("well_") for k in geometry["segments"])),
                            ("excavation level", "excavation_level" in geometry["segments"])):
        if present and wanted not in texts:
            failures.append(f"{name}: the legend lacks '{wanted}' ({texts})")
    drawn_names = {t.get_text() for t in ax.texts}
    for region in geometry["labels"]:
        if region.replace("_", " ") not in drawn_names:
            failures.append(f"{name}: region '{region}' is not named on the view")
    title = ax.get_title()
    if axisymmetric:
        if ax.get_xscale() not in ("log", "symlog") or not ax.get_xlabel().startswith("r"):
            failures.append(f"{name}: an axisymmetric view needs r on a log scale")
    else:
        scale = re.search(r"exaggerated ×(\d+)", title)
        stated = int(scale.group(1)) if scale else (1 if "true scale" in title else None)
        if stated is None:
            failures.append(f"{name}: the title does not state the vertical scale ('{title}')")
        elif not math.isclose(float(ax.get_aspect()), stated):
            failures.append(f"{name}: states ×{stated} but is drawn at ×{ax.get_aspect()}")
    bars = [a._colorbar for a in fig.axes if hasattr(a, "_colorbar")]
    if not bars:
        failures.append(f"{name}: no colour bar")
        return
    filled = bars[0].mappable  # the filled contours
    low, high = min(filled.levels), max(filled.levels)
    if low < -1e-3 * max(abs(low), abs(high)) and getattr(filled.norm, "vcenter", None) != 0:
        failures.append(f"{name}: a field of both signs is not coloured about zero")


def check_trough(fig, results, geometry, failures):
    texts = " | ".join(legend_texts(fig))
    if geometry["wall_spans"] and "cutoff wall" not in texts:
        failures.append("trough: the wall is not in the legend")
    if results.get("neighbours"):
        if "neighbour footprint" not in texts or "settlement limit" not in texts:
            failures.append(f"trough: footprints or the limit are missing ({texts})")
        names = {t.get_text() for t in plot_axes(fig)[0].texts}
        for n in results["neighbours"]:
            if n["name"] not in names:
                failures.append(f"trough: neighbour '{n['name']}' is not named")


def check_base(fig, failures):
    texts = legend_texts(fig)
    if not any(t.startswith("limit for") for t in texts):
        failures.append("base_stability: no limit line in the legend")
    ax = plot_axes(fig)[0]
    if ax.get_ylim()[0] != 0:
        failures.append("base_stability: the factor axis does not start at zero")


def main():
    run = sys.argv[1]
    with open(os.path.join(run, "results.toml"), "rb") as f:
        results = tomllib.load(f)
    axisymmetric = results.get("analysis") == "axisymmetric"
    geometry = plot_run.mesh_geometry(run)
    failures, drawn = [], 0
    for name, make in plot_run.figure_jobs(run):
        fig = make()
        if fig is None:
            if name == "base_stability.png" and os.path.exists(os.path.join(run, "checks", "base_stability.csv")):
                rows = plot_run.read_csv(os.path.join(run, "checks", "base_stability.csv"))
                if any(math.isfinite(v) and v < 20 for k in rows[0] if "_factor" in k
                       for v in plot_run.numbers(rows, k)):
                    failures.append("base_stability: factors were evaluated but not drawn")
            continue
        drawn += 1
        check_labels(name, fig, failures)
        check_legend(name, fig, failures)
        if name.startswith("section_"):
            check_section(name, fig, geometry, axisymmetric, failures)
        elif name == "trough.png":
            check_trough(fig, results, geometry, failures)
        elif name == "base_stability.png":
            check_base(fig, failures)
        plot_run.plt.close(fig)
    print(f"figures checked: {drawn}")
    if drawn < 5:
        failures.append(f"only {drawn} figures were drawn")
    for f in failures:
        print("FAIL:", f)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
