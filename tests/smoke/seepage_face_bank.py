"""The warning for one-way points kept held that feed the ground.

tests/smoke/seepage_face_bank.toml is a sand bank with a retention curve between a
pond and a ditch, its downstream face a seepage face above the ditch's water. The
exit point of such a face is not resolved yet: points that would leave the
draining set and come back are kept held, and there water enters. The run must say
so: one warning line, the steps counted in results.toml and in the run's last
lines, the largest share above the 1 % bound. The saturated seepage-face column
(tests/smoke/seepage_face_column.toml) is the control: nothing kept held feeds it.

    seepage_face_bank.py SETTLEWELL SOURCE_DIR FOLDER
"""
import pathlib
import shutil
import subprocess
import sys
import tomllib

WARNING = "kept held for the step because they would leave and come back"


def fail(message):
    print("FAIL:", message)
    sys.exit(1)


def run(settlewell, scenario, out):
    shutil.rmtree(out, ignore_errors=True)
    done = subprocess.run([settlewell, "run", str(scenario), "-o", str(out)],
                          capture_output=True, text=True)
    if done.returncode != 0:
        fail(f"the run of {scenario} failed:\n" + done.stdout + done.stderr)
    with open(out / "results.toml", "rb") as f:
        return done, tomllib.load(f)["water_balance"]


def main():
    settlewell, source, folder = sys.argv[1], pathlib.Path(sys.argv[2]), pathlib.Path(sys.argv[3])
    smoke = source / "tests" / "smoke"
    done, balance = run(settlewell, smoke / "seepage_face_bank.toml", folder / "bank")
    print(f"bank: {balance['steps_held_points_feeding']} steps, largest share "
          f"{balance['largest_held_inflow_share']:.3f}")
    if done.stderr.count(WARNING) != 1:
        fail("the held points feeding the bank were not warned of once:\n" + done.stderr)
    if balance["steps_held_points_feeding"] == 0 or balance["largest_held_inflow_share"] <= 0.01:
        fail(f"the steps are not counted in results.toml: {balance}")
    if "points kept held took in" not in done.stdout:
        fail("the run's last lines do not count the steps:\n" + done.stdout)
    done, balance = run(settlewell, smoke / "seepage_face_column.toml", folder / "column")
    if (balance["steps_held_points_feeding"] != 0 or balance["largest_held_inflow_share"] != 0.0
            or WARNING in done.stderr):
        fail(f"the saturated column's face was flagged: {balance}")
    print("PASS")


if __name__ == "__main__":
    main()
