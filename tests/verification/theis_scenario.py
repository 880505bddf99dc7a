"""Theis (1935) through the scenario file rather than the verification code: a
flow-only axisymmetric box that starts at the well's radius (box.x_origin) and
takes the well's total discharge on its inner side (stages[].boundaries.left.
discharge). The drawdown at r = 10 m and 30 m after 0.1, 0.5 and 1 day must equal
s = Q/(4 pi T) W(u), u = r^2 S/(4 T t) (Theis 1935), W(u) = E1(u) by its series
(Abramowitz & Stegun 1964, 5.1.11), within 0.2 %: the verify case of the same
well on the default ladder of steps is within 0.05 % from a twentieth of the
stage on (docs/verification.md), and here the radial cells are 0.5 m.

    theis_scenario.py SETTLEWELL SCENARIO FOLDER
"""
import csv
import math
import shutil
import subprocess
import sys

T = 1e-5 * 10.0          # k b, m2/s
STORATIVITY = 9.81 * 1e-6 * 10.0  # gamma_w * storage * b
Q = 43.2 / 86400.0       # m3/s
TIMES = (0.1, 0.5, 1.0)  # days
TOLERANCE = 0.002


def exponential_integral(u):
    """E1(u) = -gamma - ln u - sum_{k>=1} (-u)^k / (k k!), for small u."""
    total, term = -0.5772156649015329 - math.log(u), 1.0
    for k in range(1, 60):
        term *= -u / k
        total -= term / k
    return total


def theis(r, days):
    u = r * r * STORATIVITY / (4.0 * T * days * 86400.0)
    return Q / (4.0 * math.pi * T) * exponential_integral(u)


def main():
    settlewell, scenario, folder = sys.argv[1:4]
    shutil.rmtree(folder, ignore_errors=True)
    subprocess.run([settlewell, "run", scenario, "-o", folder, "-q"], check=True)
    with open(f"{folder}/points.csv", newline="") as f:
        rows = [r for r in csv.DictReader(f)
                if any(abs(float(r["time_days"]) - t) < 1e-9 for t in TIMES)]
    failures, worst = [], 0.0
    if len(rows) != 2 * len(TIMES):
        failures.append(f"{len(rows)} rows at the output times, expected {2 * len(TIMES)}")
    for r in rows:
        expected = theis(float(r["x_m"]), float(r["time_days"]))
        error = (float(r["drawdown_m"]) - expected) / expected
        worst = max(worst, abs(error))
        print(f"{r['point']} day {r['time_days']}: drawdown {float(r['drawdown_m']):.5f} m, "
              f"Theis {expected:.5f} m, {100 * error:+.3f} %")
        if abs(error) > TOLERANCE:
            failures.append(f"{r['point']} day {r['time_days']}: {100 * error:+.3f} %")
    for f in failures:
        print("FAIL:", f)
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
