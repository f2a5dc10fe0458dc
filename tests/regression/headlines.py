#!/usr/bin/env python3
"""Regression (not verification) of the demo cases' headline results.

The stored values in demo_headlines.json are what fickcast printed when they were recorded; they
say nothing about being right, only that the program still gives what it gave. Verification
against published solutions lives in tests/verification.

  headlines.py record SCRATCH STORED_JSON
      read the results folders that record_headlines.sh wrote under SCRATCH, write STORED_JSON
  headlines.py check SCRATCH STORED_JSON SOURCE_DIR [FICKCAST]
      compare every stored value with the results folders under SCRATCH (the ctest demo.run.*,
      demo.size.*, demo.sweep.* folders), then the numbers written in the cases' `# Expect:`
      headers and in README.md with the stored values; exit 1 on any difference or anything
      missing

Only the standard library (python3 is on every machine that runs the tests).
"""
import glob
import json
import math
import os
import re
import subprocess
import sys

DEFAULT_RELATIVE_TOLERANCE = 1e-6
JULIAN_YEAR = 365.25 * 86400.0  # fickcast's yr (solver/case/units.h)

# ---------------------------------------------------------------------------------------------
# What is stored. Every demo's run: every named result of summary.json "results" (`value`, or
# `final` for depth.* results). On top, the headline numbers that are not named results:
# EXTRA[group] = [(label, file, path, unit or unit_path, options)].
# A group is a results folder under the scratch folder: NAME (demo.run.NAME), NAME_size
# (demo.size.NAME), NAME_sweep (demo.sweep.NAME).
# ---------------------------------------------------------------------------------------------


def _result(name, field="value"):
    return {"file": "summary.json", "path": ["results", name, field],
            "unit_path": ["results", name, "unit"]}


EXTRA = {
    "two_layer_front": [
        ("mass_balance.relative",
         {"file": "summary.json", "path": ["mass_balance", "relative"], "unit": "1"},
         {"at_most": 1e-11,
          "note": "round-off, so a bound (the header's 1e-11 of the amount moved), not a value"}),
    ],
    "drug_matrix_bath": [
        ("amounts.bath_final_concentration.top",
         {"file": "summary.json", "path": ["amounts", "bath_final_concentration", "top"],
          "unit_path": ["case", "units", "concentration"]}, {}),
        ("amounts.undissolved_final",
         {"file": "summary.json", "path": ["amounts", "undissolved_final"],
          "unit_path": ["amounts", "unit"]}, {}),
        ("amounts.initial_total",
         {"file": "summary.json", "path": ["amounts", "initial_total"],
          "unit_path": ["amounts", "unit"]}, {}),
    ],
    "membrane_permeation": [
        ("series.flux_in.bottom.last",
         {"file": "series.csv", "column": "flux_in.bottom [mol/m2/s]", "unit": "mol/m2/s"},
         {"note": "last row of series.csv (12 significant digits as written)"}),
    ],
    "coated_bead_sizing_size": [
        ("size.value", {"file": "size_summary.json", "path": ["value"], "unit_path": ["unit"]}, {}),
        ("size.result", {"file": "size_summary.json", "path": ["result"],
                         "unit_path": ["result_unit"]}, {}),
    ],
    "liner_thickness_sizing_size": [
        ("size.value", {"file": "size_summary.json", "path": ["value"], "unit_path": ["unit"]}, {}),
        ("size.result", {"file": "size_summary.json", "path": ["result"],
                         "unit_path": ["result_unit"]}, {}),
    ],
    "liner_uncertainty_sweep": [
        ("threshold.clay_base." + q,
         {"file": "sweep_summary.json", "path": ["results", "threshold.clay_base", q],
          "unit_path": ["results", "threshold.clay_base", "unit"]}, {})
        for q in ("p5", "p50", "p95")
    ] + [
        ("threshold.clay_base.not_reached",
         {"file": "sweep_summary.json", "path": ["results", "threshold.clay_base", "not_reached"],
          "unit": "1"}, {"note": "number of the 200 samples that never reach the level"}),
        ("threshold.clay_base.probability_below 15 yr",
         {"file": "sweep_summary.json",
          "path": ["results", "threshold.clay_base", "probability_below 15 yr", "probability"],
          "unit": "1"}, {}),
        ("amount.final_total.mean",
         {"file": "sweep_summary.json", "path": ["results", "amount.final_total", "mean"],
          "unit_path": ["results", "amount.final_total", "unit"]}, {}),
        ("point.clay_base.final.mean",
         {"file": "sweep_summary.json", "path": ["results", "point.clay_base.final", "mean"],
          "unit_path": ["results", "point.clay_base.final", "unit"]}, {}),
    ],
    "liner_what_if_sweep": [
        entry
        for n in range(1, 7)
        for entry in (
            ("case_%04d threshold.clay_base" % n,
             dict(_result("threshold.clay_base"), file="cases/case_%04d/summary.json" % n), {}),
            ("case_%04d depth.front" % n,
             dict(_result("depth.front", "final"), file="cases/case_%04d/summary.json" % n), {}),
        )
    ],
}

# Per-value tolerance exceptions: (group, label) -> fields. Only where a value is round-off or
# where two runs on one machine were seen to differ (none were, see README.md).
OVERRIDES = {
    ("dopant_drive_in", "released_fraction.final"): {
        "absolute_tolerance": 1e-9,
        "note": "boron is conserved (no flux out), so this is round-off around 0: compared with "
                "an absolute tolerance; the relative one is meaningless here"},
}

# Numbers in the `# Expect:` headers compared with stored values (README.md lists the ones that
# are not). Each: (regex on the header block with whitespace collapsed, one group = the number,
# unit of the written number, group, label, mode). mode "digits": the stored value rounded to
# the digits written gives the written number; "at_most": the stored value is at most the
# written one; "not_reached": the stored value is not a number (never reached).
EXPECT = {
    "two_layer_front": [
        (r"threshold\.mid about (\S+) yr", "yr", "two_layer_front", "threshold.mid", "digits"),
        (r"depth\.front at 20 yr about (\S+) m", "m", "two_layer_front", "depth.front", "digits"),
        (r"near round-off \((\S+) of the amount moved\)", "1", "two_layer_front",
         "mass_balance.relative", "at_most"),
    ],
    "sorbing_barrier": [
        (r"threshold\.clay_base about (\S+) yr", "yr", "sorbing_barrier", "threshold.clay_base",
         "digits"),
        (r"depth\.front at 100 yr about (\S+) m", "m", "sorbing_barrier", "depth.front", "digits"),
        (r"flux_limit\.aquifer about (\S+) yr", "yr", "sorbing_barrier", "flux_limit.aquifer", "digits"),
        (r"crossed\.aquifer about (\S+) mg/m2", "mg/m2", "sorbing_barrier", "crossed.aquifer", "digits"),
    ],
    "pipe_penetration": [
        (r"threshold\.behind_grout about (\S+) yr", "yr", "pipe_penetration",
         "threshold.behind_grout", "digits"),
        (r"threshold\.behind_panel (not reached) in 10 yr", None, "pipe_penetration",
         "threshold.behind_panel", "not_reached"),
    ],
    "coated_tablet_release": [
        (r"point\.centre about (\S+) mg/cm3 at 24 h", "mg/cm3", "coated_tablet_release",
         "point.centre.final", "digits"),
    ],
    "dopant_drive_in": [
        (r"depth\.junction at the end about (\S+) um", "um", "dopant_drive_in", "depth.junction",
         "digits"),
        (r"point\.si_surface about (\S+) 1/cm3", "1/cm3", "dopant_drive_in",
         "point.si_surface.final", "digits"),
    ],
    "drug_matrix_bath": [
        (r"bath\.top in series\.csv about (\S+) mg/cm3 at 48 h", "mg/cm3", "drug_matrix_bath",
         "amounts.bath_final_concentration.top", "digits"),
        (r"\((\S+) kg/m2 of \S+ kg/m2\)", "kg/m2", "drug_matrix_bath",
         "amounts.undissolved_final", "digits"),
        (r"\(\S+ kg/m2 of (\S+) kg/m2\)", "kg/m2", "drug_matrix_bath", "amounts.initial_total",
         "digits"),
        (r"point\.centre still saturated at (\S+) mg/cm3", "mg/cm3", "drug_matrix_bath",
         "point.centre.final", "digits"),
    ],
    "membrane_permeation": [
        (r"point\.middle at the end (\S+) mol/m3", "mol/m3", "membrane_permeation",
         "point.middle.final", "digits"),
        (r"steady_flux\.receiver \S+ mol/m2/min \((\S+) mol/\(m2 s\)\)", "mol/m2/s", "membrane_permeation",
         "steady_flux.receiver", "digits"),
        (r"time_lag\.receiver \S+ min \((\S+) s\)", "s", "membrane_permeation", "time_lag.receiver",
         "digits"),
        (r"crossed\.receiver (\S+) mol/m2", "mol/m2", "membrane_permeation", "crossed.receiver",
         "digits"),
    ],
    "wafer_trench": [
        (r"point\.below_floor \(0\.3 um under the trench floor\) about (\S+) 1/cm3", "1/cm3",
         "wafer_trench", "point.below_floor.final", "digits"),
        (r"point\.beside_wall \(0\.3 um beside a wall\) about (\S+) 1/cm3", "1/cm3",
         "wafer_trench", "point.beside_wall.final", "digits"),
    ],
    "coated_bead_sizing": [
        (r"a film of about (\S+) um", "um", "coated_bead_sizing_size", "size.value", "digits"),
    ],
    "liner_thickness_sizing": [
        (r"about (\S+) m of clay for 100 years", "m", "liner_thickness_sizing_size", "size.value",
         "digits"),
    ],
    "liner_uncertainty": [
        (r"threshold\.clay_base P50 about (\S+) yr", "yr", "liner_uncertainty_sweep",
         "threshold.clay_base.p50", "digits"),
        (r"P95 (beyond) the 60 years simulated", None, "liner_uncertainty_sweep",
         "threshold.clay_base.p95", "not_reached"),
        (r"within 15 years about (\S+) \(", "1", "liner_uncertainty_sweep",
         "threshold.clay_base.probability_below 15 yr", "digits"),
    ],
    "liner_what_if": [
        (r"as built \(case_0005\) threshold\.clay_base about (\S+) yr", "yr", "liner_what_if",
         "threshold.clay_base", "digits"),
        (r"as built \(case_0005\) threshold\.clay_base about (\S+) yr", "yr",
         "liner_what_if_sweep", "case_0005 threshold.clay_base", "digits"),
        (r"thinner clay with double diffusivity \(case_0003\) about (\S+) yr", "yr",
         "liner_what_if_sweep", "case_0003 threshold.clay_base", "digits"),
    ],
}

# README.md: the demo command's headline (compared to the digits written, 3 for 2.42).
README = [(r"threshold\.mid: (\S+) yr(?: \+- \S+ yr \(estimated\))? \(point mid reaches", "yr", "two_layer_front",
           "threshold.mid", "digits")]

# Units that are written in a results file or a header but are not SI: unit -> (SI unit, factor).
TO_SI = {
    "yr": ("s", JULIAN_YEAR), "h": ("s", 3600.0),
    "nm": ("m", 1e-9), "um": ("m", 1e-6), "mm": ("m", 1e-3), "cm": ("m", 1e-2),
    "mg/cm3": ("kg/m3", 1.0), "mg/L": ("kg/m3", 1e-3), "1/cm3": ("1/m3", 1e6),
    "mg/m2": ("kg/m2", 1e-6),
}

# ---------------------------------------------------------------------------------------------


class Missing(Exception):
    pass


_json_cache = {}


def load_json(path):
    if path not in _json_cache:
        if not os.path.isfile(path):
            raise Missing("no file %s" % path)
        with open(path) as f:
            _json_cache[path] = json.load(f)
    return _json_cache[path]


def dig(document, path, where):
    node = document
    for key in path:
        if not isinstance(node, dict) or key not in node:
            raise Missing("%s has no %s" % (where, ".".join(path)))
        node = node[key]
    return node


def last_csv_value(path, column):
    if not os.path.isfile(path):
        raise Missing("no file %s" % path)
    with open(path) as f:
        lines = [line.rstrip("\n") for line in f if line.strip()]
    header = lines[0].split(",")
    if column not in header:
        raise Missing("%s has no column '%s'" % (path, column))
    if len(lines) < 2:
        raise Missing("%s has no rows" % path)
    text = lines[-1].split(",")[header.index(column)]
    return float(text) if text else None


def read_source(scratch, group, source):
    """The value (SI) and unit (SI) that SOURCE names in results folder GROUP."""
    path = os.path.join(scratch, group, source["file"])
    if "column" in source:
        raw, unit = last_csv_value(path, source["column"]), source["unit"]
    else:
        document = load_json(path)
        raw = dig(document, source["path"], path)
        unit = dig(document, source["unit_path"], path) if "unit_path" in source else source["unit"]
    if unit in TO_SI:
        unit, factor = TO_SI[unit]
        if isinstance(raw, (int, float)) and not isinstance(raw, bool):
            raw = raw * factor
    return raw, unit


def is_number(x):
    return isinstance(x, (int, float)) and not isinstance(x, bool)


# --------------------------------------------------------------------------------------- record


def sources_of_group(scratch, group):
    """(label, source, options) for every stored value of GROUP."""
    entries = []
    summary = os.path.join(scratch, group, "summary.json")
    if os.path.isfile(summary):
        for name, result in load_json(summary).get("results", {}).items():
            field = "value" if "value" in result else "final"
            entries.append((name, _result(name, field), {}))
    entries += EXTRA.get(group, [])
    return entries


def record(scratch, stored_json):
    groups = sorted(d for d in os.listdir(scratch) if os.path.isdir(os.path.join(scratch, d)))
    version = None
    demos = {}
    for group in groups:
        entries = {}
        for label, source, options in sources_of_group(scratch, group):
            value, unit = read_source(scratch, group, source)
            entry = {"value": value, "unit": unit}
            if "at_most" in options:
                entry["at_most"] = options["at_most"]
            else:
                entry["relative_tolerance"] = DEFAULT_RELATIVE_TOLERANCE
            entry.update(OVERRIDES.get((group, label), {}))
            if "note" in options:
                entry["note"] = options["note"]
            entry["source"] = source
            entries[label] = entry
        if not entries:
            raise Missing("nothing to store for %s" % group)
        demos[group] = entries
        for name in ("summary.json", "size_summary.json", "sweep_summary.json"):
            path = os.path.join(scratch, group, name)
            if version is None and os.path.isfile(path):
                version = load_json(path).get("version")
    document = {
        "about": [
            "Regression reference, not verification: the headline results of every demo case as "
            "fickcast gave them when recorded. Checked by check_headlines.sh (ctest "
            "regression.demo_headlines). Regenerate only on purpose with record_headlines.sh and "
            "commit with a line saying why the numbers changed.",
            "Groups: NAME = results folder of `fickcast run cases/NAME.ini` (ctest demo.run.NAME), "
            "NAME_size = `fickcast size` (demo.size.NAME), NAME_sweep = `fickcast sweep` "
            "(demo.sweep.NAME). Values in SI; source names the file (in the group's folder) and "
            "the JSON path or CSV column (last row) the value comes from.",
            "Tolerance: relative_tolerance %g by default (runs are deterministic on one machine: "
            "two complete recordings on the recording machine agreed bit for bit); "
            "absolute_tolerance where the value is round-off around zero; at_most where only a "
            "bound is meaningful. A value null or text (a level never reached) must stay so."
            % DEFAULT_RELATIVE_TOLERANCE,
        ],
        "recorded_with": "fickcast %s" % version,
        "demos": demos,
    }
    with open(stored_json, "w") as f:
        f.write(dump(document))
    n = sum(len(v) for v in demos.values())
    print("stored %d values of %d results folders in %s" % (n, len(demos), stored_json))


def dump(document):
    """JSON with one line per stored value (so a regeneration reads well as a diff)."""
    out = ["{"]
    top = list(document.items())
    for i, (key, value) in enumerate(top):
        comma = "," if i + 1 < len(top) else ""
        if key != "demos":
            out.append("  %s: %s%s" % (json.dumps(key), json.dumps(value, indent=None), comma))
            continue
        out.append('  "demos": {')
        groups = list(value.items())
        for j, (group, entries) in enumerate(groups):
            out.append("    %s: {" % json.dumps(group))
            items = list(entries.items())
            for k, (label, entry) in enumerate(items):
                out.append("      %s: %s%s" % (json.dumps(label), json.dumps(entry),
                                               "," if k + 1 < len(items) else ""))
            out.append("    }%s" % ("," if j + 1 < len(groups) else ""))
        out.append("  }%s" % comma)
    out.append("}")
    return "\n".join(out) + "\n"


# ---------------------------------------------------------------------------------------- check


def compare(measured, entry):
    """(ok, text) for one stored value."""
    stored = entry["value"]
    if "at_most" in entry:
        ok = is_number(measured) and measured <= entry["at_most"]
        return ok, "%r <= %g (bound; %r when recorded)" % (measured, entry["at_most"], stored)
    if not is_number(stored) or not is_number(measured):
        ok = stored == measured and type(stored) is type(measured)
        return ok, "%s, stored %s (must be identical)" % (json.dumps(measured), json.dumps(stored))
    difference = abs(measured - stored)
    relative = difference / abs(stored) if stored != 0 else (0.0 if difference == 0 else math.inf)
    rtol = entry.get("relative_tolerance", DEFAULT_RELATIVE_TOLERANCE)
    atol = entry.get("absolute_tolerance")
    ok = difference <= rtol * abs(stored) or (atol is not None and difference <= atol)
    text = "%.15g, stored %.15g, relative difference %.2e (tolerance %g" % (
        measured, stored, relative, rtol)
    if atol is not None:
        text += ", absolute %.2e <= %g accepted" % (difference, atol)
    return ok, text + ")"


def written_digits_match(written, unit, value_si):
    """Does VALUE_SI, in UNIT and rounded to the digits WRITTEN, give WRITTEN?"""
    m = re.fullmatch(r"([-+]?)(\d+)(?:\.(\d*))?(?:[eE]([-+]?\d+))?", written)
    if not m:
        return False, "cannot read '%s' as a number" % written
    decimals = len(m.group(3) or "")
    exponent = int(m.group(4) or 0)
    half_step = 0.5 * 10.0 ** (exponent - decimals)
    factor = TO_SI[unit][1] if unit in TO_SI else 1.0
    in_unit = value_si / factor
    ok = abs(in_unit - float(written)) <= half_step * (1 + 1e-12)
    return ok, "%s %s written, stored %.6g %s" % (written, unit, in_unit, unit)


def check_written(kind, where, block, rules, demos):
    """Numbers written in a header or README.md against the stored values; failure count."""
    failures = 0
    for pattern, unit, group, label, mode in rules:
        m = re.search(pattern, block)
        name = "%s / %s" % (group, label)
        if not m:
            print("FAIL  %s %s: no text matching /%s/ (header changed? update EXPECT in "
                  "tests/regression/headlines.py)" % (kind, where, pattern))
            failures += 1
            continue
        entry = demos.get(group, {}).get(label)
        if entry is None:
            print("FAIL  %s %s: %s is not stored" % (kind, where, name))
            failures += 1
            continue
        stored = entry["value"]
        if mode == "not_reached":
            ok = stored is None or isinstance(stored, str)
            text = "'%s' written, stored %s" % (m.group(1), json.dumps(stored))
        elif not is_number(stored):
            ok, text = False, "%s written, stored %s" % (m.group(1), json.dumps(stored))
        elif mode == "at_most":
            ok = stored <= float(m.group(1))
            text = "at most %s written, stored %.3g" % (m.group(1), stored)
        else:
            ok, text = written_digits_match(m.group(1), unit, stored)
        print("%s  %s %s: %s: %s" % ("ok  " if ok else "FAIL", kind, where, name, text))
        failures += 0 if ok else 1
    return failures


def expect_block(case_file):
    """The `# Expect:` paragraph of a case header, whitespace collapsed."""
    lines, inside = [], False
    with open(case_file) as f:
        for line in f:
            if not line.startswith("#"):
                if inside:
                    break
                continue
            text = line[1:].strip()
            if re.match(r"^Expect:", text):
                inside, text = True, text[len("Expect:"):]
            elif inside and re.match(r"^[A-Z][a-z]+:", text):
                break
            if inside:
                lines.append(text)
    return " ".join(" ".join(lines).split())


def check(scratch, stored_json, source_dir, fickcast=None):
    with open(stored_json) as f:
        stored = json.load(f)
    demos = stored["demos"]
    print("regression (not verification): %s against the results folders in %s"
          % (stored_json, scratch))
    print("recorded with %s" % stored.get("recorded_with"))
    if fickcast:
        try:
            version = subprocess.run([fickcast, "--version"], capture_output=True, text=True,
                                     check=True).stdout.strip()
            print("checking %s (%s)" % (version, fickcast))
        except (OSError, subprocess.CalledProcessError) as error:
            print("FAIL  cannot run %s --version: %s" % (fickcast, error))
            return 1
    failures = compared = 0

    # Every demo case must have stored values, and every stored group its results folder.
    cases = sorted(os.path.splitext(os.path.basename(p))[0]
                   for p in glob.glob(os.path.join(source_dir, "cases", "*.ini")))
    for case in cases:
        if case not in demos:
            print("FAIL  cases/%s.ini has no stored values (run record_headlines.sh)" % case)
            failures += 1
    for group, entries in demos.items():
        folder = os.path.join(scratch, group)
        if not os.path.isdir(folder):
            print("FAIL  %s: no results folder %s (%d stored values not compared)"
                  % (group, folder, len(entries)))
            compared += len(entries)
            failures += len(entries)
            continue
        summary = os.path.join(folder, "summary.json")
        if os.path.isfile(summary) and load_json(summary).get("status") != "completed":
            print("FAIL  %s: status %s in %s" % (group, load_json(summary).get("status"), summary))
            failures += 1
        if os.path.isfile(summary):  # a named result the program gives but nobody stored
            for name in load_json(summary).get("results", {}):
                if name not in entries:
                    print("FAIL  %s / %s: result not stored (new? record on purpose)"
                          % (group, name))
                    failures += 1
        for label, entry in entries.items():
            compared += 1
            try:
                measured, unit = read_source(scratch, group, entry["source"])
            except Missing as error:
                print("FAIL  %s / %s: missing: %s" % (group, label, error))
                failures += 1
                continue
            ok, text = compare(measured, entry)
            if unit != entry["unit"]:
                ok, text = False, text + "; unit %s, stored %s" % (unit, entry["unit"])
            print("%s  %s / %s: %s %s" % ("ok  " if ok else "FAIL", group, label, text,
                                           entry["unit"]))
            failures += 0 if ok else 1

    # The numbers people read: case headers and README.md.
    for case, rules in sorted(EXPECT.items()):
        path = os.path.join(source_dir, "cases", case + ".ini")
        if not os.path.isfile(path):
            print("FAIL  header cases/%s.ini: no such file" % case)
            failures += 1
            continue
        failures += check_written("header", "cases/%s.ini" % case, expect_block(path), rules,
                                  demos)
    with open(os.path.join(source_dir, "README.md")) as f:
        readme = " ".join(f.read().split())
    failures += check_written("text", "README.md", readme, README, demos)

    print("%d stored values; %s" % (
        compared, "all agree" if failures == 0 else "%d comparisons FAILED" % failures))
    return 1 if failures else 0


def main(argv):
    if len(argv) >= 4 and argv[1] == "record":
        record(argv[2], argv[3])
        return 0
    if len(argv) in (5, 6) and argv[1] == "check":
        return check(argv[2], argv[3], argv[4], argv[5] if len(argv) == 6 else None)
    print(__doc__, file=sys.stderr)
    return 2


if __name__ == "__main__":
    try:
        sys.exit(main(sys.argv))
    except Missing as error:
        print("FAIL  missing: %s" % error)
        sys.exit(1)
