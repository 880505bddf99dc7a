#!/usr/bin/env python3
"""One result of a Settlewell sweep against one swept parameter, as a PNG.

    python3 postprocess/plot_sweep.py SWEEP_SUMMARY.csv X_COLUMN Y_COLUMN OUT.png

When the sweep has other parameters, one line is drawn for each combination of
their values.
"""

import csv
import sys
from collections import defaultdict

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402


def _swept_keys(rows):
    """Columns before the first result column are the swept parameters."""
    keys = list(rows[0])
    first_result = keys.index("largest_neighbour_settlement_m")
    return keys[1:first_result]


def main():
    path, x_key, y_key, out = sys.argv[1:5]
    with open(path, newline="") as f:
        rows = list(csv.DictReader(f))
    # The other swept keys that take more than one value label the lines.
    swept = [k for k in rows[0] if k != "variant" and k in _swept_keys(rows)]
    others = [k for k in swept if k != x_key and len({r[k] for r in rows}) > 1]
    lines = defaultdict(list)
    for r in rows:
        label = ", ".join(f"{k} = {float(r[k]):g}" for k in others)
        # An empty cell is a result that was not evaluated for the variant.
        lines[label].append((float(r[x_key]), float(r[y_key]) if r[y_key] != "" else float("nan")))
    fig, ax = plt.subplots(figsize=(7, 4))
    for label, points in sorted(lines.items()):
        points.sort()
        ax.plot([p[0] for p in points], [p[1] for p in points], marker="o", label=label or None)
    ax.set_xlabel(x_key)
    ax.set_ylabel(y_key)
    ax.set_title(f"Sweep: {y_key} against {x_key}")
    ax.grid(alpha=0.3)
    if others:
        ax.legend(fontsize=8)
    fig.tight_layout()
    fig.savefig(out, dpi=110)
    return 0


if __name__ == "__main__":
    sys.exit(main())
