#!/usr/bin/env python3
"""A completed results folder never holds a non-finite number (issue 14 item 2).

ctest `results.all_finite`: walks every results folder under ROOT (a folder holding summary.json,
at any depth; the tests write them under build/test-scratch) and checks

- summary.json of a run with status "completed": every number is finite. summary.json writes a
  non-finite number as null (results/json_file), so a null is a failure unless it stands for a
  result that is legitimately absent:
    results/threshold.NAME/value     the level was never reached (its `reached` is false)
    results/release.NAME/value       the released fraction never reached the level (`reached` false)
    results/flux_limit.NAME/value, crossed_limit.NAME/value
                                     the rate or amount through the face never reached the limit
                                     (`reached` false)
    results/time_lag.NAME/value and final_flux_in, both null together: no flux through the face at
                                     the end, so no asymptote (a null lag with a flux is a failure)
    results/depth.NAME/depths[i], final, value
                                     the level is exceeded along the whole line ("below the whole
                                     domain" in the printout)
    results/moments/mean_position[i], variance[i]
                                     nothing in the domain at that time (amount[i] == 0: 0/0)
  Anything else null (an amount, the balance error, a point value, a wall time) fails.
- series.csv and profiles.csv of every folder, completed or failed (a failed run keeps its last
  good state, which must be finite too): no cell of a numeric column is NaN or inf, and no cell is
  empty, except (series.csv, where the writer leaves an undefined value empty):
    flux_in.FACE at step 0           a concentration or bath face's flux is undefined at the instant
                                     the condition starts (and so its dispersive part,
                                     flux_in_dispersive.FACE)
    released_fraction, every row     no reference amount (no initial content, no output.loading),
                                     and summary.json has no released_fraction.final
    bath.FACE in a stage             the face is not a bath in that stage (the column is empty for
                                     every row of that stage, or for none)
  A column is numeric if any of its cells reads as a number.

Every named result in summary.json (but moments) has a value and a unit.

Prints every problem; exits 1 on any, or if ROOT holds no results folder.
Usage: check_finite_results.py ROOT
"""

import csv
import json
import math
import os
import re
import sys


def is_number(text):
    try:
        float(text)
        return True
    except ValueError:
        return False


def finite_number(text):
    try:
        return math.isfinite(float(text))
    except ValueError:
        return False


def read_csv(path):
    with open(path, newline="", encoding="utf-8") as f:
        rows = list(csv.reader(f))
    if not rows:
        return [], []
    # Column names without their unit: `flux_in.top [kg/m2/s]` -> `flux_in.top`.
    header = [re.sub(r"\s*\[.*\]$", "", name) for name in rows[0]]
    return header, rows[1:]


def check_csv(path, summary, problems):
    header, rows = read_csv(path)
    series = os.path.basename(path) == "series.csv"
    for r, row in enumerate(rows):
        if len(row) != len(header):
            problems.append(f"{path}: row {r + 2} has {len(row)} cells for {len(header)} columns")
    rows = [row for row in rows if len(row) == len(header)]
    results = summary.get("results", {}) if summary else {}
    for c, name in enumerate(header):
        cells = [row[c] for row in rows]
        if not any(is_number(cell) for cell in cells):
            continue  # a text column (names)
        empty_allowed = [False] * len(cells)
        if series and name.startswith(("flux_in.", "flux_in_dispersive.")) and "step" in header:
            s = header.index("step")
            empty_allowed = [row[s] == "0" for row in rows]
        if series and name == "released_fraction" and "released_fraction.final" not in results:
            empty_allowed = [all(cell == "" for cell in cells)] * len(cells)
        if series and name.startswith("bath.") and "stage" in header:
            s = header.index("stage")
            by_stage = {}
            for row, cell in zip(rows, cells):
                by_stage.setdefault(row[s], set()).add(cell == "")
            empty_allowed = [by_stage[row[s]] == {True} for row in rows]
        for r, cell in enumerate(cells):
            if cell == "" and empty_allowed[r]:
                continue
            if not finite_number(cell):
                problems.append(f"{path}: row {r + 2}, column {name}: expected a finite number, found "
                                f"{cell!r}")
                break  # one line per column is enough


def check_summary(path, summary, problems):
    results = summary.get("results", {})

    def allowed(keys):
        if len(keys) < 3 or keys[0] != "results":
            return False
        name, field = keys[1], keys[2]
        entry = results.get(name, {})
        if name.startswith(("threshold.", "release.", "flux_limit.", "crossed_limit.")) and field == "value":
            return entry.get("reached") is False
        if name.startswith("time_lag.") and field in ("value", "final_flux_in"):
            return entry.get("value") is None and entry.get("final_flux_in") is None
        if name.startswith("depth.") and field in ("depths", "final", "value"):
            return True
        if name == "moments" and field in ("mean_position", "variance") and len(keys) >= 4:
            amounts = entry.get("amount", [])
            i = keys[3]
            return isinstance(i, int) and i < len(amounts) and amounts[i] == 0
        return False

    def walk(value, keys):
        if isinstance(value, dict):
            for k, v in value.items():
                walk(v, keys + [k])
        elif isinstance(value, list):
            for i, v in enumerate(value):
                walk(v, keys + [i])
        elif value is None:
            if not allowed(keys):
                problems.append(f"{path}: {'/'.join(str(k) for k in keys)} is null (a non-finite number) "
                                "in a completed run")
        elif isinstance(value, float) and not math.isfinite(value):
            problems.append(f"{path}: {'/'.join(str(k) for k in keys)} is {value}")

    walk(summary, [])
    # One schema for every named result: its value and its unit (moments is a table of its own).
    for name, entry in results.items():
        if name != "moments" and not (isinstance(entry, dict) and "value" in entry and "unit" in entry):
            problems.append(f"{path}: results/{name} lacks its value or unit")


# Results folders the post-processor's bad-input tests damage on purpose (a letter in a number, a
# truncated summary.json, a short row) to check that fickcast-post rejects them: not written so
# by fickcast, so not checked here.
DAMAGED_ON_PURPOSE = "/post/bad_input/"


def main():
    if len(sys.argv) != 2:
        print(__doc__.strip().splitlines()[-1])
        return 2
    root = sys.argv[1]
    problems = []
    folders = completed = 0
    for folder, _, files in sorted(os.walk(root)):
        if "summary.json" not in files:
            continue
        if DAMAGED_ON_PURPOSE in folder.replace(os.sep, "/"):
            continue
        folders += 1
        summary_path = os.path.join(folder, "summary.json")
        try:
            with open(summary_path, encoding="utf-8") as f:
                summary = json.load(f)
        except (OSError, ValueError) as error:
            problems.append(f"{summary_path}: unreadable ({error})")
            continue
        if "status" not in summary:
            continue  # not a run's summary (a study's sweep_summary.json is named otherwise)
        if summary["status"] == "completed":
            completed += 1
            check_summary(summary_path, summary, problems)
        for name in ("series.csv", "profiles.csv"):
            if name in files:
                check_csv(os.path.join(folder, name), summary, problems)
    for problem in problems:
        print("FAIL:", problem)
    print(f"{folders} results folders ({completed} completed) under {root}: "
          f"{'ok' if not problems and folders else str(len(problems)) + ' problems'}")
    if folders == 0:
        print("FAIL: no results folder found")
        return 1
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main())
