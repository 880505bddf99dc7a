#!/usr/bin/env python3
"""Accuracy of the default time steps against two closed forms.

Runs the scenarios in default-steps/ with the default step ladder and with a
ladder of FACTOR times as many steps (first and largest step divided by FACTOR,
FACTOR times as many steps per rung), and prints Markdown tables of the error at
early times:

  - terzaghi-column: surface settlement against S = mv u0 H U(Tv) and the excess
    pore pressure near the drained face (z/H = 0.1) and at mid-depth, from the
    series of Terzaghi (1925) (as given in Taylor 1948; from memory);
  - theis-well: drawdown at r = 2, 10 and 30 m against Theis (1935),
    s = Q/(4 pi T) W(u), u = r^2 S/(4 T t), W the exponential integral E1.

A measurement, not a test: it prints, it does not pass or fail.
  python3 tests/performance/default_step_accuracy.py [BUILD_DIR] [FACTOR]
"""
import csv
import math
import os
import re
import subprocess
import sys
import tempfile

HERE = os.path.dirname(os.path.abspath(__file__))
CASES = os.path.join(HERE, "default-steps")
GAMMA_W = 9.81

# terzaghi-column.toml
H, DROP, MV, K = 8.0, 3.0, 5.0e-4, 2.0e-9
CV = K / (MV * GAMMA_W) * 86400.0  # m2/day
U0 = GAMMA_W * DROP
TERZAGHI_TIMES = [18.17, 90.86, 181.7, 363.4, 908.6]  # days

# theis-well.toml
Q, T, S = 500.0, 1.0e-4 * 10.0 * 86400.0, GAMMA_W * 1.0e-5 * 10.0
THEIS_TIMES = [0.01, 0.05, 0.2, 1.0]  # days


def terzaghi_terms(Tv, count):
    for m in range(count):
        M = math.pi * (2 * m + 1) / 2
        yield M, math.exp(-M * M * Tv)


def degree(Tv):
    return 1.0 - sum(2.0 / M**2 * e for M, e in terzaghi_terms(Tv, 200))


def excess(Z, Tv):
    return sum(2.0 * U0 / M * math.sin(M * Z) * e for M, e in terzaghi_terms(Tv, 400))


def well_function(u):
    """E1(u) by its power series (Abramowitz & Stegun 1964, 5.1.11, from memory);
    u < 5 here."""
    total, term = -0.5772156649015329 - math.log(u), 1.0
    for k in range(1, 300):
        term *= -u / k
        total -= term / k
    return total


def finer(text, factor, stage_duration):
    """The scenario with a ladder of `factor` times as many steps."""
    first = stage_duration / 1000.0 / factor
    largest = stage_duration / 40.0 / factor
    line = (f"time_steps = {{ first = {first!r}, largest = {largest!r}, "
            f"per_rung = {8 * factor} }}\n")
    return re.sub(r"(\[\[stages\]\]\n(?:.*\n)*?duration = .*\n)", r"\1" + line, text, count=1)


def run(build, scenario_text, name, workdir):
    # Beside the original, so that its mesh file is found.
    scenario = os.path.join(CASES, f"_{os.getpid()}_{name}.toml")
    with open(scenario, "w") as f:
        f.write(scenario_text)
    out = os.path.join(workdir, name)
    try:
        subprocess.run([os.path.join(build, "settlewell"), "run", scenario, "-o", out,
                        "--overwrite", "-q"], check=True, stdout=subprocess.DEVNULL)
    finally:
        os.remove(scenario)
    with open(os.path.join(out, "steps.csv")) as f:
        steps = list(csv.DictReader(f))
    with open(os.path.join(out, "points.csv")) as f:
        points = list(csv.DictReader(f))
    return steps, points


def at(points, t):
    return {p["point"]: p for p in points if abs(float(p["time_days"]) - t) < 1e-6}


def terzaghi_rows(points):
    for t in TERZAGHI_TIMES:
        Tv = CV * t / H**2
        row = at(points, t)
        settlement = float(row["surface"]["settlement_m"])
        expected = MV * U0 * H * degree(Tv)
        # The excess over the final state: gamma_w (h - h_final).
        near = GAMMA_W * (DROP - float(row["z01"]["drawdown_m"]))
        middle = GAMMA_W * (DROP - float(row["z05"]["drawdown_m"]))
        yield (f"Tv = {Tv:.3f}", 100.0 * (settlement / expected - 1.0),
               100.0 * (near / excess(0.1, Tv) - 1.0),
               100.0 * (middle / excess(0.5, Tv) - 1.0))


def theis_rows(points):
    for t in THEIS_TIMES:
        row = at(points, t)
        errors = []
        for name in ("r2", "r10", "r30"):
            r = float(row[name]["x_m"])
            expected = Q / (4.0 * math.pi * T) * well_function(r * r * S / (4.0 * T * t))
            errors.append(100.0 * (float(row[name]["drawdown_m"]) / expected - 1.0))
        yield (f"t = {t} d", *errors)


def main():
    build = sys.argv[1] if len(sys.argv) > 1 else "build"
    factor = int(sys.argv[2]) if len(sys.argv) > 2 else 4
    build = os.path.abspath(build)
    cases = [("terzaghi-column", 3634.0, terzaghi_rows,
              "settlement % | u, z/H = 0.1, % | u, z/H = 0.5, %"),
             ("theis-well", 2.0, theis_rows, "s, r = 2 m, % | s, r = 10 m, % | s, r = 30 m, %")]
    with tempfile.TemporaryDirectory() as workdir:
        for name, duration, rows, header in cases:
            with open(os.path.join(CASES, name + ".toml")) as f:
                text = f.read()
            results = {}
            for label, variant in (("default", text),
                                   (f"{factor}x steps", finer(text, factor, duration))):
                steps, points = run(build, variant, name, workdir)
                factorisations = sum(int(s["new_matrix"]) for s in steps)
                results[label] = (len(steps), factorisations, list(rows(points)))
            print(f"\n{name}: error against the closed form (computed / expected - 1)\n")
            print(f"| steps | time | {header} |")
            print("| --- | --- |" + " --- |" * header.count("|") + " --- |")
            for label, (n, f, table) in results.items():
                for when, *errors in table:
                    cells = " | ".join(f"{e:+.2f}" for e in errors)
                    print(f"| {label}: {n} steps, {f} factorisations | {when} | {cells} |")


if __name__ == "__main__":
    main()
