#!/usr/bin/env python3
"""Compares two trees of results folders value by value (a refactoring must not move a number).

  compare_results.py BEFORE AFTER [--relative TOL] [--balance-absolute ABS]

Walks every summary.json, sweep_summary.json, size_summary.json and *.csv under BEFORE, reads the
file at the same place under AFTER and compares every leaf: texts and booleans exactly, numbers
within TOL relative (default 0: identical as written); mass-balance errors (the mass_balance object
of summary.json, balance_error columns), which are round-off themselves, also when within ABS of
each other (default 0). Ignored: the run facts that change from
run to run (`run` in summary.json: date, host, wall times), the program version, absolute paths,
and CSV columns named wall_time*. Prints the largest relative difference per file kind and every
mismatch; exits 1 on any mismatch or a file missing under AFTER. Standard library only.
"""
import csv
import json
import math
import os
import sys

IGNORED_KEYS = {"run", "version", "date", "host", "wall_time", "wall_time_s", "wall_time_by_phase_s", "file",
                "origin", "folder", "path"}


BALANCE_ABSOLUTE = 0.0  # --balance-absolute


def is_balance(where):
    return "mass_balance" in where or "balance_error" in where


def differ(a, b, tolerance):
    """Relative difference of two numbers (0 when equal or within tolerance, inf for NaN against a number)."""
    if a == b or abs(a - b) <= tolerance:
        return 0.0
    if isinstance(a, float) and isinstance(b, float) and math.isnan(a) and math.isnan(b):
        return 0.0
    scale = max(abs(a), abs(b))
    return abs(a - b) / scale if scale > 0 else 0.0


def as_number(text):
    try:
        return float(text)
    except (TypeError, ValueError):
        return None


def walk(a, b, where, out):
    if isinstance(a, dict):
        if not isinstance(b, dict):
            out.append((where, "an object against " + type(b).__name__, math.inf))
            return
        for key in sorted(set(a) | set(b)):
            if key in IGNORED_KEYS:
                continue
            if key not in a or key not in b:
                out.append((where + "/" + key, "only in " + ("BEFORE" if key in a else "AFTER"), math.inf))
                continue
            walk(a[key], b[key], where + "/" + key, out)
    elif isinstance(a, list):
        if not isinstance(b, list) or len(a) != len(b):
            out.append((where, "lists of different length", math.inf))
            return
        for i, (x, y) in enumerate(zip(a, b)):
            walk(x, y, f"{where}[{i}]", out)
    elif isinstance(a, bool) or isinstance(b, bool) or a is None or b is None or isinstance(a, str):
        if a != b:
            out.append((where, f"{a!r} against {b!r}", math.inf))
    else:
        absolute = BALANCE_ABSOLUTE if is_balance(where) else 0
        out.append((where, f"{a!r} against {b!r}", differ(float(a), float(b), absolute)))


def compare_csv(path_a, path_b, out):
    with open(path_a, newline="") as fa, open(path_b, newline="") as fb:
        rows_a = [row for row in csv.reader(fa) if row and not row[0].startswith("#")]
        rows_b = [row for row in csv.reader(fb) if row and not row[0].startswith("#")]
    if len(rows_a) != len(rows_b):
        out.append(("", f"{len(rows_a)} rows against {len(rows_b)}", math.inf))
        return
    header = rows_a[0] if rows_a else []
    for r, (ra, rb) in enumerate(zip(rows_a, rows_b)):
        if len(ra) != len(rb):
            out.append((f"row {r}", "rows of different length", math.inf))
            continue
        for c, (x, y) in enumerate(zip(ra, rb)):
            name = header[c] if c < len(header) else str(c)
            if name.startswith("wall_time"):
                continue
            nx, ny = as_number(x), as_number(y)
            if nx is None or ny is None:
                if x != y:
                    out.append((f"row {r} {name}", f"{x!r} against {y!r}", math.inf))
            else:
                absolute = BALANCE_ABSOLUTE if is_balance(name) else 0
                out.append((f"row {r} {name}", f"{x} against {y}", differ(nx, ny, absolute)))


def main():
    if len(sys.argv) < 3:
        print(__doc__)
        return 2
    before, after = sys.argv[1], sys.argv[2]
    tolerance = float(sys.argv[sys.argv.index("--relative") + 1]) if "--relative" in sys.argv else 0.0
    global BALANCE_ABSOLUTE
    if "--balance-absolute" in sys.argv:
        BALANCE_ABSOLUTE = float(sys.argv[sys.argv.index("--balance-absolute") + 1])
    largest = {}
    failures = []
    n_files = 0
    for root, _, files in os.walk(before):
        for name in sorted(files):
            if not (name.endswith("summary.json") or name.endswith(".csv")):
                continue
            path_a = os.path.join(root, name)
            relative = os.path.relpath(path_a, before)
            path_b = os.path.join(after, relative)
            if not os.path.exists(path_b):
                failures.append(f"{relative}: missing under AFTER")
                continue
            n_files += 1
            out = []
            if name.endswith(".json"):
                with open(path_a) as fa, open(path_b) as fb:
                    walk(json.load(fa), json.load(fb), "", out)
            else:
                compare_csv(path_a, path_b, out)
            kind = name if name.endswith(".json") else "*.csv"
            for where, what, difference in out:
                largest[kind] = max(largest.get(kind, 0.0), difference)
                if difference > tolerance:
                    failures.append(f"{relative} {where}: {what} (relative {difference:.3g})")
    for kind in sorted(largest):
        print(f"{kind}: largest relative difference {largest[kind]:.3g}")
    for failure in failures[:50]:
        print("DIFFERENT", failure)
    if len(failures) > 50:
        print(f"... and {len(failures) - 50} more")
    print(f"{n_files} files compared, {len(failures)} differences above {tolerance:g}")
    return 1 if failures or n_files == 0 else 0


if __name__ == "__main__":
    sys.exit(main())
