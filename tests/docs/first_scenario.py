#!/usr/bin/env python3
"""The README's first scenario is valid and runs: its TOML block (between the
first-scenario markers) is written to a file, checked and run, and the run's
summary must name the largest drawdown outside the wall and the pumped volume.

    first_scenario.py SETTLEWELL README.md WORK_FOLDER
"""

import os
import re
import subprocess
import sys


def main():
    program, readme, work = sys.argv[1:4]
    text = open(readme, encoding="utf-8").read()
    found = re.search(r"<!-- first-scenario:begin -->\s*```toml\n(.*?)```\s*<!-- first-scenario:end -->",
                      text, re.S)
    if not found:
        print("FAIL: the README has no first-scenario block")
        return 1
    os.makedirs(work, exist_ok=True)
    scenario = os.path.join(work, "first.toml")
    with open(scenario, "w", encoding="utf-8") as f:
        f.write(found.group(1))
    for args in (["check", scenario], ["run", scenario, "-o", os.path.join(work, "first-run"), "--overwrite", "-q"]):
        done = subprocess.run([program, *args], capture_output=True, text=True)
        if done.returncode != 0:
            print(f"FAIL: settlewell {args[0]} exited {done.returncode}: {done.stderr.strip()}")
            return 1
    for wanted in ("largest drawdown outside the wall", "pumped volume, W1"):
        if wanted not in done.stdout:
            print(f"FAIL: the run's summary lacks '{wanted}':\n{done.stdout}")
            return 1
    print(done.stdout)
    return 0


if __name__ == "__main__":
    sys.exit(main())
