#!/usr/bin/env bash
# The fickcast command line: help, version, verbs, flags, exit codes, results-folder safety.
# Usage: cli_test.sh FICKCAST CASE.ini SCRATCH_DIR
set -u
fickcast=$1 case_file=$2 scratch=$3
rm -rf "$scratch" && mkdir -p "$scratch"
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }
expect_code() { # expected-code description command...
  local expected=$1 what=$2; shift 2
  "$@" >"$scratch/out.txt" 2>"$scratch/err.txt"
  local code=$?
  [ "$code" -eq "$expected" ] || fail "$what: expected exit $expected, found $code ($(head -c 300 "$scratch/err.txt"))"
}

expect_code 0 "--version" "$fickcast" --version
grep -Eq '^fickcast [0-9]+\.[0-9]+\.[0-9]+' "$scratch/out.txt" || fail "--version prints no version"
expect_code 0 "--help" "$fickcast" --help
grep -q "run" "$scratch/out.txt" && grep -q "check" "$scratch/out.txt" || fail "--help does not list the verbs"
expect_code 0 "no arguments shows help" "$fickcast"
expect_code 0 "run --help" "$fickcast" run --help
grep -q -- "--overwrite" "$scratch/out.txt" || fail "run --help lacks --overwrite"
expect_code 0 "check --help" "$fickcast" check --help
expect_code 0 "check --keys" "$fickcast" check --keys
grep -q "diffusivity" "$scratch/out.txt" || fail "check --keys does not list diffusivity"
grep -q "^\[sweep\]" "$scratch/out.txt" && grep -q "^\[size\]" "$scratch/out.txt" && grep -q "max_runs" "$scratch/out.txt" ||
  fail "check --keys does not show the [sweep] and [size] sections"
grep -q "study\|seek\|probe" "$scratch/out.txt" && fail "check --keys still shows an old spelling"

expect_code 2 "unknown verb" "$fickcast" rnu "$case_file"
grep -q "did you mean 'run'" "$scratch/err.txt" || fail "unknown verb gives no suggestion"
# Spellings of fickcast 0.7 on the command line: one line naming the new spelling, exit 2.
expect_code 2 "the old sizing verb" "$fickcast" seek "$case_file"
grep -q "write 'fickcast size'" "$scratch/err.txt" || fail "the old verb seek does not name size: $(cat "$scratch/err.txt")"
[ "$(wc -l <"$scratch/err.txt")" -eq 1 ] || fail "the old verb seek gives more than one line"
expect_code 2 "--set of an old sizing key" "$fickcast" check "$case_file" --set "study.seek.key=time.end"
grep -q -- "--set: study.seek.key: .*write \`parameter\` in a \[size\] section" "$scratch/err.txt" ||
  fail "--set study.seek.key does not name [size] parameter: $(cat "$scratch/err.txt")"
expect_code 2 "--set of an old point key" "$fickcast" check "$case_file" --set "output.probe.x=0.1 m"
grep -q -- "write \`point.x\` in \[output\]" "$scratch/err.txt" ||
  fail "--set output.probe.x does not name point.x: $(cat "$scratch/err.txt")"
expect_code 2 "sweep --vary into an old section" "$fickcast" check "$case_file" --set "study.vary.time.end=1 yr, 2 yr"
grep -q "in a \[sweep\] section" "$scratch/err.txt" || fail "--set study.vary does not name [sweep]: $(cat "$scratch/err.txt")"
# A typo in a --vary key is named as --vary and the key as written (not as an --set of sweep.vary.*).
expect_code 2 "sweep --vary with a misspelt key" "$fickcast" sweep "$case_file" --vary "region.silt.porosty=0.3,0.4" \
  --output "$scratch/vary_typo"
grep -q -- "^fickcast: --vary: region.silt.porosty: .*did you mean 'porosity'" "$scratch/err.txt" ||
  fail "a --vary typo is not named as --vary: $(cat "$scratch/err.txt")"
[ ! -e "$scratch/vary_typo" ] || fail "a refused --vary left a folder"
expect_code 2 "sweep --vary with a value the key refuses" "$fickcast" sweep "$case_file" \
  --vary "region.silt.porosity=0.3,abc" --output "$scratch/vary_typo"
grep -q -- "^fickcast: --vary: region.silt.porosity: .*'abc'" "$scratch/err.txt" ||
  fail "a bad --vary value is not named as --vary: $(cat "$scratch/err.txt")"
expect_code 2 "missing case file argument" "$fickcast" run
expect_code 2 "case file that does not exist" "$fickcast" run "$scratch/nowhere.ini"
grep -q "nowhere.ini" "$scratch/err.txt" || fail "missing file not named"
expect_code 2 "case file that is a folder" "$fickcast" run "$scratch"
grep -q "found a folder" "$scratch/err.txt" || fail "a folder given as the case file is not named as such"
expect_code 2 "unknown flag" "$fickcast" run "$case_file" --frobnicate
expect_code 2 "--set without =" "$fickcast" check "$case_file" --set time.end
grep -q -- "--set" "$scratch/err.txt" || fail "bad --set not attributed to --set"
expect_code 2 "--set with a bad unit" "$fickcast" check "$case_file" --set "time.end=3 m"
grep -q -- "--set: time.end" "$scratch/err.txt" || fail "bad --set value not attributed"

expect_code 0 "check" "$fickcast" check "$case_file"
grep -Eq "time\.end .*:[0-9]+$" "$scratch/out.txt" || fail "check does not give file:line origins"
grep -Eq "default$" "$scratch/out.txt" || fail "check does not mark defaults"
expect_code 0 "check with --set" "$fickcast" check "$case_file" --set "time.end=2 yr"
grep -Eq "time\.end +2 yr +63115200 s +--set" "$scratch/out.txt" || fail "check does not show the --set origin"
# A distortion measure at check (issue 14 item 3): a valid but skinny quadrilateral is named with
# its Jacobian ratio (0.05 by hand: the corner pulled to 0.05 m of its neighbour) and a warning.
# The mesh as written: the refinement next to open faces would split that cell.
here=$(cd "$(dirname "$0")" && pwd)
expect_code 0 "check of a distorted mesh" "$fickcast" check "$here/meshes/distorted.ini" \
  --set geometry.open_face_refinement=off
grep -q "mesh shape: worst cell Jacobian ratio 0.05 at (1.2625, 0.5) m: strongly distorted" "$scratch/out.txt" ||
  fail "check does not report the distorted cell: $(grep 'mesh shape' "$scratch/out.txt")"
expect_code 0 "check of a box mesh" "$fickcast" check "$case_file"
grep -q "mesh shape: worst cell Jacobian ratio 1 at (.*) m (1 for boxes" "$scratch/out.txt" ||
  fail "check does not report the shape of a box mesh: $(grep 'mesh shape' "$scratch/out.txt")"

results="$scratch/results"
expect_code 0 "run" "$fickcast" run "$case_file" --output "$results" --set "time.end=1 yr"
[ -f "$results/summary.json" ] && [ -f "$results/series.csv" ] && [ -f "$results/fields/fields.pvd" ] ||
  fail "run left an incomplete results folder"
touch "$results/marker"
expect_code 2 "run into an existing folder" "$fickcast" run "$case_file" --output "$results" --set "time.end=1 yr"
grep -q "overwrite" "$scratch/err.txt" || fail "existing folder message does not mention --overwrite"
[ -f "$results/marker" ] || fail "an existing results folder was touched without --overwrite"
expect_code 0 "run --overwrite --quiet" "$fickcast" run "$case_file" --output "$results" --overwrite --quiet \
  --set "time.end=1 yr"
[ -s "$scratch/out.txt" ] && fail "--quiet printed to stdout"
[ -f "$results/marker" ] && fail "--overwrite kept the old folder content"
ls "$scratch" | grep -q "partial" && fail "a partial folder was left behind"

# A numerical failure: exit 1, and the results folder written with the last good state.
cat >"$scratch/stiff.ini" <<'CASE'
[case]
title = nonlinear case that cannot converge in one iteration
[geometry]
layers = slab 1 m
cell_size = 5 cm
[region.slab]
diffusivity = {exp(8*c)} m2/s
[boundary.top]
type = concentration
value = 1 mol/m3
[time]
end = 1 s
step = 0.1 s
[numerics]
max_nonlinear_iterations = 1
CASE
expect_code 1 "a run that does not converge" "$fickcast" run "$scratch/stiff.ini" --output "$scratch/stiff"
grep -q '"status": "failed"' "$scratch/stiff/summary.json" 2>/dev/null || fail "a failed run left no summary saying so"
[ -f "$scratch/stiff/fields/fields.pvd" ] || fail "a failed run did not write its last good state"
grep -q "did not converge" "$scratch/err.txt" || fail "a failed run does not say what failed"

# run --report: the plots and the HTML report of the run, made from its files at the end.
expect_code 0 "run --report" "$fickcast" run "$case_file" --output "$scratch/reported" --report --quiet
[ -s "$scratch/reported/report/index.html" ] || fail "run --report wrote no report/index.html"
ls "$scratch/reported/report/"*.png >/dev/null 2>&1 || fail "run --report wrote no plots"
grep -q "Cautions" "$scratch/reported/report/index.html" || fail "the run report lacks the cautions"
grep -q "threshold.mid" "$scratch/reported/report/index.html" || fail "the run report lacks the headline result"
expect_code 0 "sweep --report" "$fickcast" sweep "$case_file" --vary "time.end=1 yr,2 yr" \
  --set output.fields=false --output "$scratch/reported_sweep" --report --quiet
[ -s "$scratch/reported_sweep/report/index.html" ] || fail "sweep --report wrote no study report"
expect_code 2 "check --report is not an option of check" "$fickcast" check "$case_file" --report

# An I/O error: the results folder cannot be created because a file stands where a folder is
# needed (works as root, where chmod 555 would not stop the write): exit 3, one line naming the path.
: >"$scratch/not_a_folder"
expect_code 3 "results folder under a file" "$fickcast" run "$case_file" --output "$scratch/not_a_folder/results" \
  --set "time.end=1 yr"
grep -q "$scratch/not_a_folder/results" "$scratch/err.txt" ||
  fail "the I/O error does not name the path: $(cat "$scratch/err.txt")"
[ "$(wc -l <"$scratch/err.txt")" -eq 1 ] || fail "the I/O error gives more than one line: $(cat "$scratch/err.txt")"
[ -e "$scratch/not_a_folder/results" ] && fail "a results folder appeared after an I/O error"

# Bounds (issue 14 item 5): refused before anything is allocated, unless --allow-large.
expect_code 2 "check of 1e5+ output times" "$fickcast" check "$case_file" --set "output.fields_every=1 ns"
grep -q "output.fields_every: expected at most 1e5 output times, found 6.3e+17 .*--allow-large" "$scratch/err.txt" ||
  fail "too many output times are not refused with the numbers: $(cat "$scratch/err.txt")"
expect_code 0 "check --allow-large" "$fickcast" check "$case_file" --set "output.fields_every=1 ns" --allow-large
expect_code 2 "run of a mesh beyond memory" "$fickcast" run "$case_file" --output "$scratch/huge" --set "geometry.cell_size=1 nm"
grep -q "geometry.cell_size: the mesh would have about .* GiB of memory" "$scratch/err.txt" ||
  fail "a mesh beyond memory is not refused with the numbers: $(cat "$scratch/err.txt")"
[ -e "$scratch/huge" ] && fail "a refused run left a results folder"

# A time or a temperature without its unit is read in SI, with a warning that names the reading.
expect_code 0 "check of a bare time" "$fickcast" check "$case_file" --set "time.end=20"
grep -q "warning: --set: time.end: '20' has no unit and is read as seconds" "$scratch/out.txt" ||
  fail "a bare time.end gives no warning: $(grep -i warning "$scratch/out.txt")"
expect_code 0 "check of a bare schedule" "$fickcast" check "$case_file" --set "temperature.schedule=1000, hold 2 h"
grep -q "temperature.schedule: '1000, hold 2 h' holds a number without its unit" "$scratch/out.txt" ||
  fail "a bare temperature gives no warning: $(grep -i warning "$scratch/out.txt")"
expect_code 0 "check with units" "$fickcast" check "$case_file" --set "time.end=20 s" \
  --set "temperature.schedule=1000 degC, ramp 10 K/min to 1100 degC, hold 2 h"
grep -q "has no unit\|without its unit" "$scratch/out.txt" && fail "a value with units is warned about"
expect_code 0 "run with a bare time" "$fickcast" run "$case_file" --output "$scratch/bare" --set "time.end=2e7" --quiet
grep -q "time.end: '2e7' has no unit" "$scratch/bare/summary.json" || fail "summary.json lacks the bare-time warning"

# Progress into a log (stderr not a terminal): the mesh of each solve before it starts, then plain
# lines at the interval (shortened here from a minute); none with --quiet.
FICKCAST_PROGRESS_SECONDS=0.001 expect_code 0 "run with progress into a log" "$fickcast" run "$case_file" \
  --output "$scratch/progress" --set "time.end=2 yr"
grep -Eq '^fickcast: solve 1: [0-9]+ cells, [0-9]+ unknowns, to t = 2 yr$' "$scratch/err.txt" ||
  fail "no line with the first solve's mesh before it starts: $(head -c 300 "$scratch/err.txt")"
grep -Eq '^fickcast: solve 2: t = .* step [0-9]+, .* s so far, about .* s left$' "$scratch/err.txt" ||
  fail "no plain progress line for the second solve: $(head -c 300 "$scratch/err.txt")"
grep -q $'\r' "$scratch/err.txt" && fail "progress into a log holds carriage returns"
FICKCAST_PROGRESS_SECONDS=0.001 expect_code 0 "run --quiet with progress" "$fickcast" run "$case_file" \
  --output "$scratch/progress" --set "time.end=2 yr" --overwrite --quiet
grep -q "fickcast: solve" "$scratch/err.txt" && fail "--quiet still shows progress"

if [ "$failures" -ne 0 ]; then echo "$failures failure(s)"; exit 1; fi
echo "all command-line checks passed"
