#!/usr/bin/env python3
"""Opens a Settlewell report in headless Chromium and checks that it renders:
every embedded image loads in the browser, the page is not blank, and the
cautions are there.  Usage: check_report.py RUN_DIR CHROMIUM
Exit status 0 when every check holds; the reason otherwise."""

import os
import re
import subprocess
import sys
import tempfile

import matplotlib

matplotlib.use("Agg")
import matplotlib.image as mpimg  # noqa: E402

FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
         "--disable-background-networking", "--disable-component-update", "--disable-sync"]

# Appended to a copy of the report only: after loading, it writes into the title
# how many images the browser decoded.
PROBE = """<script>
window.addEventListener('load', function () {
  var all = Array.from(document.images);
  var ok = all.filter(function (i) { return i.complete && i.naturalWidth > 0; });
  document.title = 'images-loaded ' + ok.length + ' of ' + all.length;
});
</script>"""


def chromium(binary, profile, *args):
    return subprocess.run([binary, *FLAGS, "--user-data-dir=" + profile, *args],
                          capture_output=True, text=True, timeout=120)


def main():
    run, binary = sys.argv[1], sys.argv[2]
    report = os.path.join(run, "report.html")
    html = open(report, encoding="utf-8").read()
    failures = []
    for phrase in ("qualified geotechnical engineer", "Local codes", "does not replace a structural assessment"):
        if phrase not in html:
            failures.append(f"the report lacks the caution '{phrase}'")
    with tempfile.TemporaryDirectory() as tmp:
        probe = os.path.join(tmp, "probe.html")
        with open(probe, "w", encoding="utf-8") as f:
            f.write(html.replace("</body>", PROBE + "</body>"))
        dom = chromium(binary, os.path.join(tmp, "p1"), "--virtual-time-budget=10000", "--dump-dom",
                       "file://" + probe).stdout
        found = re.search(r"<title>images-loaded (\d+) of (\d+)</title>", dom)
        if not found:
            failures.append("the browser did not finish loading the page")
        else:
            loaded, total = int(found.group(1)), int(found.group(2))
            print(f"images loaded in the browser: {loaded} of {total}")
            if total < 5 or loaded != total:
                failures.append(f"only {loaded} of {total} images loaded")
        shot = os.path.join(tmp, "shot.png")
        chromium(binary, os.path.join(tmp, "p2"), "--window-size=1200,9000", "--screenshot=" + shot,
                 "file://" + os.path.abspath(report))
        if not os.path.exists(shot):
            failures.append("no screenshot was taken")
        else:
            pixels = mpimg.imread(shot)[..., :3]
            ink = (pixels.mean(axis=2) < 0.9).mean()
            colour = (pixels.max(axis=2) - pixels.min(axis=2) > 0.15).mean()
            print(f"screenshot: {pixels.shape[1]}x{pixels.shape[0]}, ink {ink:.3f}, colour {colour:.3f}")
            if ink < 0.02:
                failures.append("the screenshot is blank")
            if colour < 0.01:
                failures.append("the screenshot shows no coloured figure")
    for f in failures:
        print("FAIL:", f)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
