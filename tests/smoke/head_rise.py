"""Heads that rise in a stage that only lowers them (tests/smoke/well_held_high.toml
with its well W1 held at -6 m, 5 m below the water table). Three runs:

- as it is: nothing feeds the ground, so no head in permeable soil rises by the
  limit: no warning, no step counted, the stage marked as one that lowers heads;
- with the far boundary held at +1 m, 2 m above the start's water table (a slip a
  user makes): the boundary's head rises 2 m at once, exactly what it is held at
  less the start's; one warning line, every step counted, in results.toml and in
  the run's last lines, and the report flags it;
- the same with W1 held at +2 m too (the stage now raises a head): not watched.

    head_rise.py SETTLEWELL SOURCE_DIR FOLDER
"""
import pathlib
import shutil
import subprocess
import sys
import tomllib

WARNING = "which only lowers heads, the head has risen"
FED = '\n[boundaries.far_boundary]\nhydraulic = "fixed_head"\nhead = 1.0\n'


def fail(message):
    print("FAIL:", message)
    sys.exit(1)


def run(settlewell, text, folder, report=False):
    shutil.rmtree(folder, ignore_errors=True)
    folder.mkdir(parents=True)
    scenario = folder / "scenario.toml"
    scenario.write_text(text)
    out = folder / "run"
    command = [settlewell, "run", str(scenario), "-o", str(out)]
    done = subprocess.run(command + (["--report"] if report else []),
                          capture_output=True, text=True)
    if done.returncode != 0:
        fail(f"the run in {folder} failed:\n" + done.stdout + done.stderr)
    with open(out / "results.toml", "rb") as f:
        stage = tomllib.load(f)["head_rise"]["stages"][0]
    return done, stage, out


def main():
    settlewell, source, folder = sys.argv[1], pathlib.Path(sys.argv[2]), pathlib.Path(sys.argv[3])
    base = (source / "tests" / "smoke" / "well_held_high.toml").read_text()
    held = "wells.W1 = { head = 2.0 }"
    if held not in base:
        fail("the scenario no longer holds W1 at 2.0 m")
    lowered = base.replace(held, "wells.W1 = { head = -6.0 }")

    done, stage, _ = run(settlewell, lowered, folder / "lowered")
    if not stage["lowers_heads"]:
        fail(f"a stage that lowers W1 is not marked as lowering heads: {stage}")
    if stage["steps_over_limit"] != 0 or WARNING in done.stderr:
        fail(f"heads rose in the lowered site with nothing feeding it: {stage}")

    done, stage, out = run(settlewell, lowered + FED, folder / "fed", report=True)
    print(f"fed: largest rise {stage['largest_rise_m']:.6f} m at "
          f"{stage.get('largest_rise_at')}, {stage['steps_over_limit']} steps")
    if done.stderr.count(WARNING) != 1:
        fail("the rising heads were not warned of exactly once:\n" + done.stderr)
    if abs(stage["largest_rise_m"] - 2.0) > 1e-6:
        fail(f"the largest rise is not the boundary's 2 m: {stage['largest_rise_m']}")
    if stage["largest_rise_at"]["x_m"] < 50.0:
        fail(f"the largest rise is not at the far boundary: {stage['largest_rise_at']}")
    if stage["steps_over_limit"] == 0 or "heads: " not in done.stdout:
        fail("the steps are not counted in results.toml and the last lines:\n" +
             done.stdout)
    report = (out / "report.md").read_text()
    if "**2.00 (limit 0.100;" not in report:
        fail("the report does not flag the rise")

    raised = lowered.replace("wells.W1 = { head = -6.0 }", held) + FED
    done, stage, _ = run(settlewell, raised, folder / "raised")
    if stage["lowers_heads"] or stage["steps_over_limit"] != 0 or WARNING in done.stderr:
        fail(f"a stage that raises a head was watched: {stage}")
    print("PASS")


if __name__ == "__main__":
    main()
