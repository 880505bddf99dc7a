#!/usr/bin/env python3
"""The modules include only what DEVELOPERS.md allows.

    module_dependencies.py REPOSITORY_ROOT

Reads the module table of DEVELOPERS.md (between <!-- modules:begin --> and
<!-- modules:end -->): each row names a module, the modules it may include and the
libraries it may include. Then every #include line of src/<module>/ and
include/settlewell/<module>/ (and of src/main.cc, the module "main") is checked:
a "settlewell/<other>/..." header must be of its own module or an allowed one, and
a library header must belong to an allowed library. Exits with 1, listing every
offending line, if any include breaks the table; also if a module folder has no
row, or a row names a module that does not exist.
"""

import os
import re
import sys

# A library is recognised by the start of the header's path.
LIBRARIES = {
    "deal.II": ("deal.II/",),
    "PETSc": ("petsc",),
    "MPI": ("mpi.h",),
    "Gmsh": ("gmsh.h",),
    "toml++": ("toml++/",),
    "VTK": ("vtk",),
    "OpenSSL": ("openssl/",),
    "Boost": ("boost/",),
    "CLI11": ("CLI/",),
}
INCLUDE = re.compile(r'^\s*#\s*include\s*[<"]([^>"]+)[>"]')


def read_table(developers):
    text = open(developers, encoding="utf-8").read()
    start, end = text.find("<!-- modules:begin -->"), text.find("<!-- modules:end -->")
    if start < 0 or end < 0:
        sys.exit("DEVELOPERS.md has no module table (<!-- modules:begin --> ... end)")
    rules = {}
    for line in text[start:end].splitlines():
        cells = [c.strip() for c in line.strip().strip("|").split("|")]
        if len(cells) < 4 or not cells[0].startswith("`"):
            continue
        module = cells[0].strip("`/")
        modules = set(re.findall(r"`([a-z_]+)/?`", cells[2]))
        libraries = {name for name in LIBRARIES if re.search(rf"(^|[ ,]){re.escape(name)}($|[ ,;.])", cells[3])}
        rules[module] = (modules, libraries)
    return rules


def library_of(header):
    for name, prefixes in LIBRARIES.items():
        if header.startswith(prefixes):
            return name
    return None


def files_of(root, module):
    if module == "main":
        return [os.path.join(root, "src", "main.cc")]
    found = []
    for folder in (os.path.join(root, "src", module), os.path.join(root, "include", "settlewell", module)):
        for dirpath, _, names in os.walk(folder):
            found += [os.path.join(dirpath, n) for n in sorted(names) if n.endswith((".h", ".cc", ".h.in"))]
    return found


def main():
    root = sys.argv[1] if len(sys.argv) > 1 else "."
    rules = read_table(os.path.join(root, "DEVELOPERS.md"))
    problems = []
    existing = {d for d in os.listdir(os.path.join(root, "src")) if os.path.isdir(os.path.join(root, "src", d))}
    existing |= {d for d in os.listdir(os.path.join(root, "include", "settlewell"))}
    for module in sorted(existing - set(rules)):
        problems.append(f"module {module}/ has no row in the DEVELOPERS.md module table")
    for module in sorted(set(rules) - existing - {"main"}):
        problems.append(f"the module table names {module}/, which does not exist")
    for module, (modules, libraries) in sorted(rules.items()):
        for path in files_of(root, module):
            for number, line in enumerate(open(path, encoding="utf-8"), 1):
                match = INCLUDE.match(line)
                if not match:
                    continue
                header = match.group(1)
                where = f"{os.path.relpath(path, root)}:{number}: {header}"
                if header.startswith("settlewell/"):
                    other = header.split("/")[1]
                    if other != module and other not in modules:
                        problems.append(f"{where} (module {module} may not include {other}/)")
                elif (library := library_of(header)) and library not in libraries:
                    problems.append(f"{where} (module {module} may not use {library})")
    for p in problems:
        print(p)
    if problems:
        sys.exit(f"{len(problems)} include lines break the module table of DEVELOPERS.md")
    print(f"every include of {len(rules)} modules follows the module table of DEVELOPERS.md")


if __name__ == "__main__":
    main()
