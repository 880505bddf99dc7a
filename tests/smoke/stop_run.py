"""A run stopped by SIGINT or SIGTERM ends after its current step, with one line,
the shell's status for the signal (130, 143) and a whole folder marked stopped.

    stop_run.py SETTLEWELL SCENARIO FOLDER SIGNAL
"""
import json
import pathlib
import shutil
import signal
import subprocess
import sys
import time


def main():
    program, scenario, folder, name = sys.argv[1:5]
    sig = getattr(signal, name)
    shutil.rmtree(folder, ignore_errors=True)  # the steps of an earlier run would mislead
    run = subprocess.Popen([program, "run", scenario, "-o", folder, "--overwrite", "-q"],
                           stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    steps = pathlib.Path(folder) / "steps.csv"
    deadline = time.time() + 300
    # Wait for a few steps, so that the signal comes in the middle of the run.
    while time.time() < deadline and run.poll() is None:
        if steps.exists() and len(steps.read_text().splitlines()) > 5:
            break
        time.sleep(0.2)
    run.send_signal(sig)
    out, err = run.communicate(timeout=300)
    failures = []
    if run.returncode != 128 + sig:
        failures.append(f"exit status {run.returncode}, expected {128 + sig}")
    lines = err.strip().splitlines()
    if len(lines) != 1 or f"stopped by {name}" not in lines[0]:
        failures.append(f"expected one line naming {name} on stderr, got: {err!r}")
    manifest = json.loads((pathlib.Path(folder) / "manifest.json").read_text())
    if manifest.get("state") != "stopped" or manifest.get("stopped_by") != name:
        failures.append(f"manifest not marked stopped by {name}: {manifest}")
    rows = len(steps.read_text().splitlines()) - 1
    if manifest.get("steps") != rows or rows >= manifest.get("steps_planned", 0):
        failures.append(f"steps.csv has {rows} steps, the manifest {manifest.get('steps')}"
                        f" of {manifest.get('steps_planned')}")
    report = subprocess.run([program, "report", folder], capture_output=True, text=True)
    if report.returncode != 0:
        failures.append(f"the report of the stopped run failed: {report.stderr}")
    for failure in failures:
        print("FAIL:", failure)
    if not failures:
        print(f"stopped after {rows} of {manifest['steps_planned']} steps; {lines[0]}")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
