#!/usr/bin/env python3
"""One result of a Settlewell sweep against one swept parameter, as a PNG.

    python3 postprocess/plot_sweep.py SWEEP_SUMMARY.csv X_COLUMN Y_COLUMN OUT.png [--x-unit UNIT]

When the sweep has other parameters, one line is drawn for each combination of
their values. The y axis starts at zero, and the result's limit (the neighbours'
settlement limit, a base-stability factor's limit) is drawn when the variants'
results.toml files give one.
"""

import argparse
import csv
import os
import sys
import tomllib
from collections import defaultdict

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402

# The summary's result columns as words with their units, and the limit each is
# checked against (a path in a variant's results.toml; a list takes its first entry).
RESULTS = {
    "largest_neighbour_settlement_m": ("largest settlement of a neighbour (m)",
                                       ("neighbour_limits", "settlement_m")),
    "worst_neighbour_category": ("worst damage category of a neighbour (0 to 5)", None),
    "least_piping_factor": ("least factor against piping (-)", ("base_stability", "piping", "limit")),
    "least_heave_factor": ("least factor against heave (-)", ("base_stability", "heave", "limit")),
    "uplift_factor_at_end": ("factor against uplift at the end (-)", ("base_stability", "uplift", "limit")),
    "final_discharge_m3_per_day": ("discharge at the end (m³/day)", None),
    "pumped_volume_m3": ("pumped volume (m³)", None),
    "settlement_outside_m": ("largest settlement outside the wall (m)", None),
    "drawdown_outside_m": ("largest drawdown outside the wall (m)", None),
    "share_from_lateral_edges": ("share of the pumped water from the model's lateral edges (-)", None),
}


def _swept_keys(rows):
    """Columns before the first result column are the swept parameters."""
    keys = list(rows[0])
    first_result = keys.index("largest_neighbour_settlement_m")
    return keys[1:first_result]


def limit_of(folder, path):
    """The limit at `path` in the first variant's results.toml that has it, or None."""
    if path is None:
        return None
    for entry in sorted(os.listdir(folder)):
        results = os.path.join(folder, entry, "run", "results.toml")
        if not os.path.exists(results):
            continue
        with open(results, "rb") as f:
            node = tomllib.load(f)
        for key in path:
            node = node[0] if isinstance(node, list) and node else node
            node = node.get(key) if isinstance(node, dict) else None
        if isinstance(node, (int, float)):
            return float(node)
    return None


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("summary")
    parser.add_argument("x")
    parser.add_argument("y")
    parser.add_argument("out")
    parser.add_argument("--x-unit", default="", help="the swept key's unit, for the axis label")
    args = parser.parse_args()
    with open(args.summary, newline="") as f:
        rows = list(csv.DictReader(f))
    # The other swept keys that take more than one value label the lines.
    swept = [k for k in rows[0] if k != "variant" and k in _swept_keys(rows)]
    others = [k for k in swept if k != args.x and len({r[k] for r in rows}) > 1]
    lines = defaultdict(list)
    for r in rows:
        label = ", ".join(f"{k} = {float(r[k]):g}" for k in others)
        # An empty cell is a result that was not evaluated for the variant.
        lines[label].append((float(r[args.x]), float(r[args.y]) if r[args.y] != "" else float("nan")))
    y_label, limit_path = RESULTS.get(args.y, (args.y, None))
    fig, ax = plt.subplots(figsize=(7, 4))
    for label, points in sorted(lines.items()):
        points.sort()
        ax.plot([p[0] for p in points], [p[1] for p in points], marker="o", label=label or "variants")
    limit = limit_of(os.path.dirname(os.path.abspath(args.summary)), limit_path)
    if limit is not None:
        unit = y_label.rsplit("(", 1)[-1].rstrip(")")
        ax.axhline(limit, color="tab:red", lw=0.9, ls="--",
                   label=f"limit ({limit:g} {unit})" if unit != "-" else f"limit ({limit:g})")
    ax.set_ylim(bottom=min(0.0, ax.get_ylim()[0]))
    ax.set_xlabel(f"{args.x} ({args.x_unit})" if args.x_unit else f"{args.x} (-)")
    ax.set_ylabel(y_label)
    ax.set_title(f"Sweep: {y_label.rsplit(' (', 1)[0]} against {args.x}")
    ax.grid(alpha=0.3)
    ax.legend(fontsize=8)
    fig.tight_layout()
    fig.savefig(args.out, dpi=110)
    return 0


if __name__ == "__main__":
    sys.exit(main())
