"""A well takes water only unless it is a recharge well (tests/smoke/
well_held_high.toml: a small pit whose well W1 is held 3 m above the water
table). Four runs of the same site:

- as given: held, W1 would inject, so its pump stands and it is sealed: it pumps
  nothing and puts nothing in; one warning line, the stopped steps counted in
  results.toml and in the run's last lines;
- W1 a recharge well: it injects, counted but not warned of;
- W1's head set below its screen: it runs dry (its screen drains at atmospheric
  pressure and pumps), warned of and counted;
- W1 as given and a recharge well R1 outside the wall, 15 m from it, held 2 m
  above the water table: R1 injects (the only kind of well allowed there).

    one_way_wells.py SETTLEWELL SOURCE_DIR FOLDER
"""
import pathlib
import shutil
import subprocess
import sys
import tomllib


def fail(message):
    print("FAIL:", message)
    sys.exit(1)


def run(settlewell, text, folder, line="W1"):
    shutil.rmtree(folder, ignore_errors=True)
    folder.mkdir(parents=True)
    scenario = folder / "scenario.toml"
    scenario.write_text(text)
    out = folder / "run"
    done = subprocess.run([settlewell, "run", str(scenario), "-o", str(out), "-q"],
                          capture_output=True, text=True)
    if done.returncode != 0:
        fail(f"the run in {folder} failed:\n" + done.stdout + done.stderr)
    with open(out / "results.toml", "rb") as f:
        results = tomllib.load(f)
    w1 = next(d for d in results["discharge"] if d["line"] == line)
    return done, w1


def main():
    settlewell, source, folder = sys.argv[1], pathlib.Path(sys.argv[2]), pathlib.Path(sys.argv[3])
    base = (source / "tests" / "smoke" / "well_held_high.toml").read_text()
    held = "wells.W1 = { head = 2.0 }"
    if held not in base:
        fail("the scenario no longer holds W1 at 2.0 m")

    done, w1 = run(settlewell, base, folder / "one-way")
    if "'W1' would put water into the ground" not in done.stderr:
        fail("no warning that W1 stood stopped:\n" + done.stderr)
    if done.stderr.strip().count("\n") != 0:
        fail("more than one warning line:\n" + done.stderr)
    if w1["steps_stopped"] == 0 or w1["steps_injecting"] != 0 or w1["recharge"]:
        fail(f"W1's steps as a one-way well: {w1}")
    # Stopped all along (its head stays above the ground's): no water either way,
    # to the solver's round-off against the 1e-4 m/s sand's flow.
    if abs(w1["volume_m3"]) > 1e-6:
        fail(f"a stopped W1 moved {w1['volume_m3']} m3")
    if "W1 stood stopped, sealed, because it would have put water into the ground" not in done.stdout:
        fail("the run's last lines do not count the stopped steps:\n" + done.stdout)
    stopped = w1["steps_stopped"]

    marked = base.replace('screen_bottom = -14.0', 'screen_bottom = -14.0\nrecharge = true')
    done, w1 = run(settlewell, marked, folder / "recharge")
    if done.stderr.strip():
        fail("a recharge well that injects is warned of:\n" + done.stderr)
    if not (w1["recharge"] and w1["steps_injecting"] > 0 and w1["volume_m3"] < 0):
        fail(f"the recharge well does not inject: {w1}")
    if "W1 (a recharge well) put water into the ground" not in done.stdout:
        fail("the run's last lines do not count the recharge steps:\n" + done.stdout)
    injected = -w1["volume_m3"]

    done, w1 = run(settlewell, base.replace(held, "wells.W1 = { head = -16.0 }"),
                   folder / "dry")
    if "'W1' has run dry" not in done.stderr:
        fail("no warning that W1 ran dry:\n" + done.stderr)
    if not (w1["steps_dry"] > 0 and w1["volume_m3"] > 0):
        fail(f"W1 held below its screen does not drain as a dry well: {w1}")
    dry_volume, dry_steps = w1["volume_m3"], w1["steps_dry"]

    outside = base.replace("[groundwater]", """[[section.wells]]
name = "R1"
x = 20.0
screen_top = -10.0
screen_bottom = -14.0
recharge = true

[groundwater]""").replace(held, held + "\nwells.R1 = { head = 1.0 }")
    done, r1 = run(settlewell, outside, folder / "recharge-outside", "R1")
    if not (r1["recharge"] and r1["volume_m3"] < 0 and r1["steps_injecting"] > 0):
        fail(f"the recharge well outside the wall does not inject: {r1}")
    if "R1" in done.stderr:
        fail("the recharge well outside the wall is warned of:\n" + done.stderr)
    print(f"PASS: stopped in {stopped} steps; as a recharge well it injected "
          f"{injected:.4g} m3; run dry it pumped {dry_volume:.4g} m3 in "
          f"{dry_steps} dry steps; R1 outside the wall injected {-r1['volume_m3']:.4g} m3")


main()
