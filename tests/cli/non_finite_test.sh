#!/usr/bin/env bash
# A wrong answer is never a result (issue 14 item 2): a run whose expression gives NaN or inf, or
# whose state stops being finite, fails with exit 1, status "failed" in summary.json, a message
# naming the first cause (the key, the point and the time), and the results folder holding the last
# good state only (series.csv ends before the bad time, every number in it finite).
# Usage: non_finite_test.sh FICKCAST CASE.ini SCRATCH_DIR   (CASE.ini: cases/two_layer_front.ini)
set -u
fickcast=$1 case_file=$2 scratch=$3
here=$(cd "$(dirname "$0")" && pwd)
rm -rf "$scratch" && mkdir -p "$scratch"
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }

# expect_numerical_failure NAME BAD_TIME_S MESSAGE_FRAGMENT... -- fickcast arguments
# The run must exit 1 with "fickcast: run failed: " and every fragment on stderr, write a folder
# with status "failed" and the first fragment in its message, and keep series.csv rows (finite)
# before BAD_TIME_S only.
expect_numerical_failure() {
  local name=$1 bad_time=$2; shift 2
  local fragments=()
  while [ "$1" != "--" ]; do fragments+=("$1"); shift; done
  shift
  local folder="$scratch/$name"
  "$fickcast" run "$@" --output "$folder" --quiet >"$scratch/$name.out" 2>"$scratch/$name.err"
  local code=$?
  echo "$name: exit $code: $(cat "$scratch/$name.err")"
  [ "$code" -eq 1 ] || fail "$name: expected exit 1 (a numerical failure), found $code"
  grep -q "^fickcast: run failed: " "$scratch/$name.err" || fail "$name: no 'run failed' line on stderr"
  for fragment in "${fragments[@]}"; do
    grep -qF -- "$fragment" "$scratch/$name.err" || fail "$name: stderr lacks '$fragment'"
  done
  [ -f "$folder/summary.json" ] || { fail "$name: no summary.json in $folder"; return; }
  python3 - "$folder" "$bad_time" "${fragments[0]}" <<'EOF' || fail "$name: results folder (see above)"
import csv, json, math, sys
folder, bad_time, fragment = sys.argv[1], float(sys.argv[2]), sys.argv[3]
ok = True
summary = json.load(open(folder + "/summary.json"))
if summary.get("status") != "failed":
    print(f"  status is {summary.get('status')!r}, expected 'failed'"); ok = False
if fragment not in summary.get("message", ""):
    print(f"  message {summary.get('message')!r} lacks {fragment!r}"); ok = False
rows = list(csv.reader(open(folder + "/series.csv")))[1:]
if not rows:
    print("  series.csv has no rows (the last good state is missing)"); ok = False
elif not float(rows[-1][0]) < bad_time:
    print(f"  series.csv ends at t = {rows[-1][0]} s, expected before {bad_time} s"); ok = False
reached = summary["time"]["reached"]["value"]
if not (isinstance(reached, float) and reached < bad_time):
    print(f"  time.reached is {reached}, expected before {bad_time} s"); ok = False
sys.exit(0 if ok else 1)
EOF
  [ -f "$folder/fields/fields.pvd" ] || fail "$name: the last good state's fields were not written"
}

# The issue's reproducer: a concentration value that is NaN after t = 1 d.
expect_numerical_failure boundary_value_nan 86400 \
  "boundary.top.value: expected a finite value, found NaN at t = " -- \
  "$case_file" --set "time.end=2 d" --set "boundary.top.value={1000*sqrt(1-t/d)} mg/L"

# A source that is NaN after t = 1 d (uniform in space: no point in the message).
expect_numerical_failure source_nan 86400 "region.silt.source: expected a finite value, found NaN at t = " -- \
  "$case_file" --set "time.end=2 d" --set "region.silt.source={1e-6*sqrt(1-t/d)} kg/(m3 s)"

# A flux that is infinite at t = 1 d, where the run ends: the step that lands there is not written.
expect_numerical_failure flux_inf 86400 "boundary.top.value: expected a finite value, found inf at t = 86400 s" -- \
  "$case_file" --set "time.end=1 d" --set "boundary.top.type=flux" --set "boundary.top.value={1e-8/(1-t/d)} kg/(m2 s)"

# A transfer face whose ambient is NaN after t = 1 d.
cat >"$scratch/transfer.ini" <<'EOF'
[case]
title = Transfer face with an ambient that goes wrong
dimension = 1
[geometry]
layers = slab 0.1 m
cell_size = 2 mm
[region.slab]
diffusivity = 1e-9 m2/s
porosity = 0.3
[boundary.top]
type = transfer
coefficient = 1e-6 m/s
ambient = {sqrt(1-t/d)} kg/m3
[boundary.bottom]
type = sealed
[initial]
value = 0 kg/m3
[time]
end = 2 d
[output]
point.mid = 0.05 m
EOF
expect_numerical_failure transfer_ambient_nan 86400 "boundary.top.ambient: expected a finite value, found NaN at t = " -- \
  "$scratch/transfer.ini"

# A finite flux so large that the state overflows: no expression is to blame, the state is.
expect_numerical_failure state_overflow 86400 "the state became non-finite at step " -- \
  "$case_file" --set "time.end=1 d" --set "boundary.top.type=flux" --set "boundary.top.value=1e307 kg/(m2 s)"

# Non-finite from the very start: no state is good, none is written, and the message says so
# (it once claimed "last good state (t = 0 s) written").
"$fickcast" run "$case_file" --output "$scratch/at_start" --set 'boundary.top.value={1000*sqrt(t/d-1)} mg/L' \
  --quiet >"$scratch/at_start.out" 2>"$scratch/at_start.err"
code=$?
[ "$code" -eq 1 ] || fail "at_start: expected exit 1, found $code"
grep -q "found NaN at t = 0 s" "$scratch/at_start.err" || fail "at_start: the cause at t = 0 is not named"
grep -q "last good state" "$scratch/at_start.err" && fail "at_start: claims a last good state that was never written"
grep -q "it failed at the start: no state was good enough to write" "$scratch/at_start.err" ||
  fail "at_start: does not say that no state was written: $(cat "$scratch/at_start.err")"
[ "$(wc -l <"$scratch/at_start/series.csv")" -eq 1 ] || fail "at_start: series.csv holds rows of a state that was not good"

# A boundary expression that swings below zero: the run completes (exit 0) and warns once, naming
# the key, the value and when, in the printout and in summary.json; the mesh is not blamed for the
# state below zero that the boundary itself caused.
"$fickcast" run "$case_file" --output "$scratch/negative_boundary" --set "time.end=2 d" \
  --set 'boundary.top.value={1000*sin(t/(0.2*d))} mg/L' --set numerics.accuracy=off \
  >"$scratch/negative.out" 2>"$scratch/negative.err"
code=$?
[ "$code" -eq 0 ] || fail "negative boundary: expected exit 0, found $code: $(cat "$scratch/negative.err")"
grep -q "warning: boundary.top.value: a concentration below zero (-" "$scratch/negative.err" ||
  fail "negative boundary: no warning naming boundary.top.value: $(cat "$scratch/negative.err")"
grep -q "boundary.top.value: a concentration below zero" "$scratch/negative_boundary/summary.json" ||
  fail "negative boundary: summary.json lacks the warning"
grep -q "went below zero" "$scratch/negative.err" &&
  fail "negative boundary: the range guard blames the mesh for what the boundary did"

# The folders above hold the last good state only: every number finite.
python3 "$here/../regression/check_finite_results.py" "$scratch" || fail "a results folder holds a non-finite number"

if [ "$failures" -ne 0 ]; then
  echo "$failures failure(s)"
  exit 1
fi
echo "all non-finite checks passed"
