"""A seepage face in soil with a retention curve finds its exit point.

tests/smoke/seepage_face_bank.toml is a sand bank with Gardner's retention curve
between a pond (h1 = 5 m) and a ditch (h2 = 1 m), its downstream face a seepage face
above the ditch's water. Run from the command line, the face must settle with no
point taking water in (no warning, nothing counted in results.toml), the water
balance must close, and the steady discharge must lie between Dupuit's value
k (h1^2 - h2^2) / (2 L), exact with a seepage face for a saturated bank (Charny
1951), and that value plus the capillary allowance k (h1 - h2) / (a L) of Gardner's
curve (derived in src/verification/case_seepage_bank.cc).

    seepage_face_bank.py SETTLEWELL SOURCE_DIR FOLDER
"""
import pathlib
import shutil
import subprocess
import sys
import tomllib

WARNING = "kept held for the step because they would leave and come back"
K, A, L, H1, H2 = 1e-4, 4.0, 10.0, 5.0, 1.0  # as in seepage_face_bank.toml


def fail(message):
    print("FAIL:", message)
    sys.exit(1)


def main():
    settlewell, source, folder = sys.argv[1], pathlib.Path(sys.argv[2]), pathlib.Path(sys.argv[3])
    out = folder / "bank"
    shutil.rmtree(out, ignore_errors=True)
    done = subprocess.run([settlewell, "run", str(source / "tests" / "smoke" / "seepage_face_bank.toml"),
                           "-o", str(out)], capture_output=True, text=True)
    if done.returncode != 0:
        fail("the run failed:\n" + done.stdout + done.stderr)
    with open(out / "results.toml", "rb") as f:
        results = tomllib.load(f)
    balance = results["water_balance"]
    inflow = next(s["final_m3_per_day"] for s in results["water_budget"]["sources"]
                  if s["name"] == "left") / 86400.0
    dupuit = K * (H1 * H1 - H2 * H2) / (2 * L)
    allowance = K * (H1 - H2) / (A * L)
    print(f"discharge {inflow:.6e} m2/s; Dupuit {dupuit:.6e}, upper bound {dupuit + allowance:.6e}; "
          f"held points feeding: {balance['steps_held_points_feeding']} steps")
    if WARNING in done.stderr or balance["steps_held_points_feeding"] != 0 \
            or balance["largest_held_inflow_share"] != 0.0:
        fail(f"points of the seepage face took water in: {balance}\n{done.stderr}")
    if not balance["closes"]:
        fail(f"the water balance does not close: {balance}")
    if not dupuit <= inflow <= dupuit + allowance:
        fail("the steady discharge lies outside Dupuit's value and the capillary allowance")
    print("PASS")


if __name__ == "__main__":
    main()
