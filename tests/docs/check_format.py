#!/usr/bin/env python3
"""Every C++ file of the project is as clang-format (with .clang-format) writes it.

    check_format.py CLANG_FORMAT REPOSITORY_ROOT

Runs `clang-format --dry-run --Werror` over src/, include/ and tests/; fails, listing
the files, if any would change. Fix with `clang-format -i FILE`.
"""

import os
import subprocess
import sys


def main():
    clang_format, root = sys.argv[1], sys.argv[2]
    files = []
    for top in ("src", "include", "tests"):
        for dirpath, _, names in os.walk(os.path.join(root, top)):
            files += [os.path.join(dirpath, n) for n in sorted(names) if n.endswith((".cc", ".h"))]
    unformatted = []
    for path in files:
        run = subprocess.run([clang_format, "--dry-run", "--Werror", path], capture_output=True, text=True)
        if run.returncode != 0:
            unformatted.append(os.path.relpath(path, root))
    for path in unformatted:
        print(f"not clang-formatted: {path}")
    if unformatted:
        sys.exit(f"{len(unformatted)} of {len(files)} files need `clang-format -i`")
    print(f"all {len(files)} C++ files are clang-formatted")


if __name__ == "__main__":
    main()
