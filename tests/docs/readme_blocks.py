#!/usr/bin/env python3
"""Generated blocks of the README, kept true by CTest.

    readme_blocks.py SETTLEWELL README.md BLOCK [--update]

BLOCK is "keys" (the text of `settlewell check --keys`, compared exactly) or
"verify" (the text of `settlewell verify --markdown`; numbers compared to
round-off: within one unit of their last printed digit, or both below 1e-12,
which is noise around zero).
Without --update the script fails, naming the first difference, when the README's
block between <!-- BLOCK:begin --> and <!-- BLOCK:end --> is not what the program
prints; with --update it writes the printed text into the README.
"""

import re
import subprocess
import sys

COMMANDS = {"keys": ["check", "--keys"], "verify": ["verify", "--markdown"]}
NUMBER = re.compile(r"[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?")


def block_span(text, name):
    begin, end = f"<!-- {name}:begin -->\n", f"<!-- {name}:end -->"
    start = text.find(begin)
    stop = text.find(end)
    if start < 0 or stop < 0:
        sys.exit(f"README has no {name} block ({begin.strip()} ... {end})")
    return start + len(begin), stop


def last_digit_unit(token):
    """The value of one unit in the last printed digit: 1e-5 for "2.44108"."""
    mantissa, _, exponent = token.lower().partition("e")
    decimals = len(mantissa.partition(".")[2])
    return 10.0 ** (int(exponent or 0) - decimals)


def numbers_agree(a, b):
    x, y = float(a), float(b)
    if max(abs(x), abs(y)) < 1e-12:
        return True
    return abs(x - y) <= 1.01 * max(last_digit_unit(a), last_digit_unit(b))


def first_difference(printed, stored, numeric):
    a, b = printed.splitlines(), stored.splitlines()
    for i in range(max(len(a), len(b))):
        line_a = a[i] if i < len(a) else "<nothing>"
        line_b = b[i] if i < len(b) else "<nothing>"
        if line_a == line_b:
            continue
        if numeric and NUMBER.sub("#", line_a) == NUMBER.sub("#", line_b):
            pairs = zip(NUMBER.findall(line_a), NUMBER.findall(line_b))
            if all(numbers_agree(x, y) for x, y in pairs):
                continue
        return f"line {i + 1}:\n  printed: {line_a}\n  README:  {line_b}"
    return None


def main():
    if len(sys.argv) < 4 or sys.argv[3] not in COMMANDS:
        sys.exit(__doc__)
    program, readme, name = sys.argv[1:4]
    update = "--update" in sys.argv[4:]
    run = subprocess.run([program] + COMMANDS[name], capture_output=True, text=True)
    if run.returncode != 0:
        sys.exit(f"settlewell {' '.join(COMMANDS[name])} failed:\n{run.stderr}")
    text = open(readme, encoding="utf-8").read()
    start, stop = block_span(text, name)
    block = "```\n" + run.stdout + "```\n" if name == "keys" else run.stdout
    if update:
        open(readme, "w", encoding="utf-8").write(text[:start] + block + text[stop:])
        print(f"updated the {name} block of {readme}")
        return
    difference = first_difference(block, text[start:stop], numeric=(name == "verify"))
    if difference:
        sys.exit(f"the README's {name} block is out of date; run\n  {' '.join(sys.argv[:4])} "
                 f"--update\nfirst difference at {difference}")
    print(f"the README's {name} block is what settlewell prints")


if __name__ == "__main__":
    main()
