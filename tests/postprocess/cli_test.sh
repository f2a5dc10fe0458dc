#!/usr/bin/env bash
# fickcast-post on the fixture runs: every command works, writes what it says, exit codes hold.
# Usage: cli_test.sh FICKCAST_POST FIXTURE_SCRATCH OUT_SCRATCH
set -u
post=$1 fixture=$2 out=$3
rm -rf "$out" && mkdir -p "$out"
base=$fixture/base changed=$fixture/changed
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }

"$post" --help | grep -q "fickcast-post sample" || fail "--help lacks the sample command"

# sample: 11 points at 2 times -> header + 22 rows; value at x = 0 is the surface value 5 mg/L = 0.005 kg/m3
"$post" sample "$base" --from 0 --to 1 --points 11 --time 5s --field concentration --output "$out/s1.csv" \
  || fail "sample at one time"
[ "$(wc -l <"$out/s1.csv")" -eq 12 ] || fail "sample: expected 12 lines, found $(wc -l <"$out/s1.csv")"
head -1 "$out/s1.csv" | grep -q '^time \[s\],point,distance \[m\],x \[m\],concentration \[kg/m3\]$' \
  || fail "sample header: $(head -1 "$out/s1.csv")"
awk -F, 'NR==2 { if ($5 < 0.004999 || $5 > 0.005001) exit 1 }' "$out/s1.csv" || fail "surface value not 0.005 kg/m3"
"$post" sample "$base" --at 0.5 --time all --output "$out/s2.csv" || fail "sample at a point, all times"
[ "$(wc -l <"$out/s2.csv")" -eq 6 ] || fail "sample --time all: expected 6 lines (5 times), found $(wc -l <"$out/s2.csv")"

# integrate: regions by name plus total, per time
"$post" integrate "$base" --time last --output "$out/i.csv" || fail "integrate"
grep -q '^10,upper,' "$out/i.csv" && grep -q '^10,lower,' "$out/i.csv" && grep -q '^10,total,' "$out/i.csv" \
  || fail "integrate rows: $(cat "$out/i.csv")"

# compare: itself -> 0 and exit 0 even at tolerance 0; changed -> exit 1 beyond 1e-6, 0 within 0.5
"$post" compare "$base" "$base" --tolerance 0 --output "$out/c0.csv" >/dev/null || fail "self comparison not 0"
awk -F, 'NR>1 && $3 != 0 { exit 1 }' "$out/c0.csv" || fail "self comparison has a nonzero difference"
"$post" compare "$base" "$changed" --tolerance 1e-6 --field concentration --output "$out/c1.csv" >/dev/null 2>"$out/c1.err"
code=$?
[ $code -eq 1 ] || fail "compare beyond tolerance: expected exit 1, found $code"
grep -q "more than the tolerance" "$out/c1.err" || fail "compare gave no reason: $(cat "$out/c1.err")"
awk -F, 'NR>2 && $3 > 0 { found = 1 } END { exit !found }' "$out/c1.csv" || fail "changed run shows no difference"
"$post" compare "$base" "$changed" --tolerance 0.5 --field concentration >/dev/null || fail "compare within 0.5"

# plots and report
"$post" plots "$base" --output "$out/plots" >"$out/plots.txt" || fail "plots"
for f in profile_depth points amounts; do
  [ -s "$out/plots/$f.png" ] && [ -s "$out/plots/$f.svg" ] || fail "plot $f missing"
done
"$post" report "$base" --output "$out/report" >/dev/null || fail "report"
grep -q 'data:image/png;base64,' "$out/report/index.html" || fail "report has no embedded image"
grep -q 'http' "$out/report/index.html" && fail "report refers to a web address"
ls "$out"/report/*.partial-* >/dev/null 2>&1 && fail "partial files left behind"
# A remeshed run's report says how often the mesh changed and what that added to the balance.
"$post" report "$fixture/remeshed" --output "$out/report-remeshed" --no-svg >/dev/null || fail "report of a remeshed run"
remeshings=$(grep -o '"remeshings": [0-9]*' "$fixture/remeshed/summary.json" | grep -o '[0-9]*$')
[ "${remeshings:-0}" -gt 0 ] || fail "the remeshed fixture did not remesh"
grep -q "remeshed $remeshings times during the run" "$out/report-remeshed/index.html" ||
  fail "the report of a remeshed run does not say it remeshed $remeshings times"
grep -q "what the $remeshings remeshings added, a term of its own" "$out/report-remeshed/index.html" ||
  fail "the report's mass balance does not show the remeshing term"
grep -q "remeshed [0-9]* times" "$out/report/index.html" && fail "a run without remeshing reported remeshings"

[ $failures -eq 0 ] && echo "all fickcast-post command checks passed"
exit $((failures > 0))
