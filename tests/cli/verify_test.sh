#!/usr/bin/env bash
# `fickcast verify` exits 0 and its report names a source for every check.
# Usage: verify_test.sh FICKCAST SCRATCH_DIR
set -u
fickcast=$1 scratch=$2
rm -rf "$scratch" && mkdir -p "$scratch"
"$fickcast" verify --output "$scratch/report" >"$scratch/out.txt" 2>&1
code=$?
cat "$scratch/out.txt"
[ "$code" -eq 0 ] || { echo "FAIL: verify exited $code"; exit 1; }
report="$scratch/report/verification_report.txt"
[ -f "$report" ] && [ -f "$scratch/report/verification_report.json" ] || { echo "FAIL: no report written"; exit 1; }
checks=$(grep -cE '^ *[0-9]+\. ' "$report")
sources=$(grep -c '^    source: ' "$report")
[ "$checks" -ge 10 ] || { echo "FAIL: only $checks checks in the report"; exit 1; }
[ "$checks" -eq "$sources" ] || { echo "FAIL: $checks checks but $sources sources"; exit 1; }
grep -q "Crank" "$report" || { echo "FAIL: the report cites no source by name"; exit 1; }
grep -q "fickcast version" "$report" && grep -q "date" "$report" && grep -q "host" "$report" ||
  { echo "FAIL: the report lacks version, date or host"; exit 1; }
grep -q "all $checks checks passed" "$report" || { echo "FAIL: the report does not say all passed"; exit 1; }
[ -d "$scratch/report/runs" ] && { echo "FAIL: scratch runs left in the report folder"; exit 1; }
echo "verify: $checks checks, each with its source"
