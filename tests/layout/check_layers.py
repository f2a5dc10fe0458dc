#!/usr/bin/env python3
"""The layers of solver/ (DEVELOPERS.md, "Layers"): which folder may include which.

  check_layers.py SOURCE_DIR

Reads every #include "..." of solver/ and exits 1, naming each file and line, when a folder
includes one it must not; also when a source file of solver/, postprocess/ or tests/ has more
than 800 lines. Standard library only.
"""
import os
import re
import sys

# Folder -> folders of solver/ it may include (besides itself). A new folder must be added here.
ALLOWED = {
    "case": set(),
    "geometry": {"case"},
    "model": {"case"},
    "numerics": {"case", "geometry", "model"},
    "results": {"case", "geometry", "model"},
    "run": {"case", "geometry", "model", "numerics", "results"},
    "studies": {"case", "geometry", "model", "numerics", "results", "run"},
    "verify": {"case", "geometry", "model", "numerics", "results", "run", "studies"},
    "app": {"case", "geometry", "model", "numerics", "results", "run", "studies", "verify"},
}
MAX_LINES = 800
INCLUDE = re.compile(r'^\s*#\s*include\s+"([^"]+)"')


def main():
    source = sys.argv[1]
    solver = os.path.join(source, "solver")
    problems = []
    checked = 0
    for folder in sorted(os.listdir(solver)):
        path = os.path.join(solver, folder)
        if not os.path.isdir(path):
            continue
        if folder not in ALLOWED:
            problems.append(f"solver/{folder}/: a folder the layer table does not know; add it to ALLOWED")
            continue
        for name in sorted(os.listdir(path)):
            if not name.endswith((".h", ".cc")):
                continue
            with open(os.path.join(path, name), encoding="utf-8") as handle:
                for number, line in enumerate(handle, 1):
                    match = INCLUDE.match(line)
                    if not match:
                        continue
                    checked += 1
                    target = match.group(1).split("/")[0]
                    if "/" not in match.group(1) or target == folder:
                        continue
                    if target in ALLOWED and target not in ALLOWED[folder]:
                        problems.append(f"solver/{folder}/{name}:{number}: {folder}/ may not include "
                                        f"{match.group(1)} (allowed: {', '.join(sorted(ALLOWED[folder])) or 'none'})")
    for top in ("solver", "postprocess", "tests"):
        for root, _, files in os.walk(os.path.join(source, top)):
            for name in files:
                if name.endswith((".h", ".cc")):
                    full = os.path.join(root, name)
                    with open(full, encoding="utf-8") as handle:
                        lines = sum(1 for _ in handle)
                    if lines > MAX_LINES:
                        problems.append(f"{os.path.relpath(full, source)}: {lines} lines, more than {MAX_LINES}")
    for problem in problems:
        print(problem)
    print(f"{checked} includes checked, {len(problems)} problems")
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main())
