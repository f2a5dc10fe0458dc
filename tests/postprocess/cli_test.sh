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

# sample with units: "50 cm" is 0.5 m; 6 s lies between the stored 5 s and 7.5 s: linear in time
# (weights 0.6 and 0.4), and stderr says so
"$post" sample "$base" --at "50 cm" --time 5s --output "$out/s3.csv" || fail "sample --at with a unit"
[ "$(tail -1 "$out/s3.csv")" = "$(grep '^5,' "$out/s2.csv")" ] || fail "--at '50 cm' differs from --at 0.5"
"$post" sample "$base" --at 0.5 --time "6 s" --output "$out/s4.csv" 2>"$out/s4.err" || fail "sample between states"
grep -q "t = 6 s is not a stored state: values interpolated linearly in time between 5 s and 7.5 s" "$out/s4.err" \
  || fail "sample between states did not say so: $(cat "$out/s4.err")"
v5=$(awk -F, '$1 == 5 { print $5 }' "$out/s2.csv") v75=$(awk -F, '$1 == 7.5 { print $5 }' "$out/s2.csv")
awk -F, -v a="$v5" -v b="$v75" 'NR == 2 { e = 0.6 * a + 0.4 * b; d = $5 - e; if (d < 0) d = -d; exit !(d <= 1e-9 * e) }' \
  "$out/s4.csv" || fail "value at 6 s is not 0.6 x (5 s) + 0.4 x (7.5 s): $(tail -1 "$out/s4.csv"), $v5, $v75"

# table: series.csv in the case's units (mg/L for point.mid: 1000 x kg/m3), the SI file untouched
sum_before=$(md5sum <"$base/series.csv")
"$post" table "$base" --output "$out/t.csv" || fail "table"
head -1 "$out/t.csv" | grep -q 'time \[s\],.*point.mid \[mg/L\]' || fail "table header: $(head -1 "$out/t.csv")"
column=$(head -1 "$base/series.csv" | tr ',' '\n' | grep -n '^point.mid' | cut -d: -f1)
si=$(tail -1 "$base/series.csv" | cut -d, -f"$column") shown=$(tail -1 "$out/t.csv" | cut -d, -f"$column")
awk -v a="$si" -v b="$shown" 'BEGIN { d = b - 1000 * a; if (d < 0) d = -d; exit !(a > 0 && d <= 1e-8 * b) }' \
  || fail "table: point.mid $shown mg/L is not 1000 x $si kg/m3"
[ "$(md5sum <"$base/series.csv")" = "$sum_before" ] || fail "table changed series.csv"
"$post" table "$base" --which profiles | head -1 | grep -q 'concentration \[mg/L\]' || fail "table --which profiles"
"$post" table "$base" --units si | cmp -s - "$base/series.csv" || fail "table --units si is not series.csv"

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
