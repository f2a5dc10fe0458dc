#!/usr/bin/env bash
# Studies from the command line: sweeps on one and two ranks give identical cases, an interrupted
# sweep resumes without recomputing finished cases, failing cases are recorded, sizing and sweep
# reject bad set-ups with exit code 2.
# Usage: study_test.sh FICKCAST SCRATCH_DIR MPIEXEC [MPI flags...]
set -u
fickcast=$1 scratch=$2 mpiexec=$3
shift 3
mpi_flags=("$@")
rm -rf "$scratch" && mkdir -p "$scratch"
cd "$scratch" || exit 1
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }
expect_code() { # expected-code description command...
  local expected=$1 what=$2; shift 2
  "$@" >out.txt 2>err.txt
  local code=$?
  [ "$code" -eq "$expected" ] || fail "$what: expected exit $expected, found $code ($(head -c 400 err.txt))"
}

# A two-layer liner, invented data; cell_size is set per test.
liner() { # cell_size "[sweep] or [size] section" [point position]
  cat <<CASE
[case]
title = liner study (test, invented data)
[geometry]
layers = clay 0.9 m, sand 0.3 m
cell_size = $1
[region.clay]
diffusivity = 1e-10 m2/s
porosity = 0.4
[region.sand]
diffusivity = 5e-10 m2/s
porosity = 0.3
[boundary.top]
type = concentration
value = 1500 mg/L
[time]
end = 60 yr
[output]
fields = false
point.base = ${3:-0.9 m}
threshold.base = 250 mg/L
$2
CASE
}

# --- 1 rank and 2 ranks give the same results for every case (each case on one rank).
liner "10 mm" "[sweep]
vary.region.clay.diffusivity = 5e-11 m2/s, 1e-10 m2/s, 2e-10 m2/s, 4e-10 m2/s
vary.geometry.layers = clay 0.6 m, sand 0.3 m | clay 0.9 m, sand 0.3 m" >grid.ini
expect_code 0 "sweep on 1 rank" "$fickcast" sweep grid.ini --output one
expect_code 0 "sweep on 2 ranks" "$mpiexec" -np 2 "${mpi_flags[@]}" "$fickcast" sweep grid.ini --output two
grep -q "rank 1" out.txt || fail "the 2-rank sweep ran no case on rank 1"
grep -q "rank 0" out.txt || fail "the 2-rank sweep ran no case on rank 0"
[ "$(wc -l <one/sweep.csv)" -eq 9 ] || fail "sweep.csv does not have a header and 8 rows"
# Everything but the wall time (last column) must be identical.
if ! diff <(sed 's/,[^,]*$//' one/sweep.csv) <(sed 's/,[^,]*$//' two/sweep.csv) >/dev/null; then
  fail "1-rank and 2-rank sweeps differ"
fi
head -1 one/sweep.csv | grep -q "region.clay.diffusivity,geometry.layers,.*threshold.base \[s\].*,status,message,wall_time \[s\]" ||
  fail "sweep.csv header lacks parameters, results, status or wall time: $(head -1 one/sweep.csv)"
grep -q '"clay 0.6 m, sand 0.3 m"' one/sweep.csv || fail "whole-string values are not quoted in sweep.csv"
[ -d one/cases/case_0008 ] && [ -f one/cases/case_0008/summary.json ] || fail "per-case folders missing"

# --- --vary from the command line adds to the case's study.
expect_code 0 "sweep --vary" "$fickcast" sweep grid.ini --output varied --vary "region.clay.porosity=0.3,0.45"

# --- a folder another study is writing to is refused; a lock whose process is gone is not.
mkdir -p locked
touch locked/.fickcast-results               # as a study folder fickcast wrote (--overwrite needs it)
echo "$$ $(hostname)" >locked/.fickcast-lock # this shell: alive while the test runs
expect_code 2 "sweep into a folder in use" "$fickcast" sweep grid.ini --output locked
grep -q "in use by process $$" err.txt || fail "a folder in use is not reported as such: $(cat err.txt)"
[ -e locked/cases ] && fail "a refused sweep touched the folder in use"
bash -c 'exit 0' &
gone=$!
wait "$gone"
echo "$gone $(hostname)" >locked/.fickcast-lock # a process that has ended: a stale lock
expect_code 0 "sweep over a stale lock" "$fickcast" sweep grid.ini --output locked --overwrite
[ -e locked/.fickcast-lock ] && fail "the sweep left its lock behind"
[ -f locked/sweep.csv ] || fail "the sweep over a stale lock wrote no sweep.csv"
[ "$(wc -l <varied/sweep.csv)" -eq 17 ] || fail "--vary did not multiply the grid to 16 cases"

# --- An interrupted sweep resumes without recomputing finished cases.
liner "0.5 mm" "[sweep]
vary.region.clay.diffusivity = 5e-11 m2/s, 6e-11 m2/s, 7e-11 m2/s, 8e-11 m2/s, 9e-11 m2/s, 1e-10 m2/s, 1.1e-10 m2/s, 1.2e-10 m2/s, 1.3e-10 m2/s, 1.4e-10 m2/s" >slow.ini
"$fickcast" sweep slow.ini --output resumed >first.txt 2>&1 &
pid=$!
for _ in $(seq 1 600); do
  [ "$(ls resumed/cases/*/summary.json 2>/dev/null | wc -l)" -ge 2 ] && break
  sleep 0.1
done
kill -TERM "$pid"
wait "$pid"
code=$?
[ "$code" -eq 4 ] || fail "an interrupted sweep exits $code, expected 4 (interrupted)"
grep -q "interrupted" first.txt || fail "the interrupted sweep does not say so"
[ -f resumed/sweep.csv ] && fail "an interrupted sweep wrote sweep.csv"
ls resumed/cases | grep -q partial && fail "an interrupted sweep left a partial case folder"
finished=$(ls resumed/cases/*/summary.json | wc -l)
[ "$finished" -ge 2 ] && [ "$finished" -lt 10 ] || fail "expected an interrupted sweep to finish some cases, found $finished"
stat -c '%n %i %.9Y' resumed/cases/*/summary.json >before.txt
expect_code 0 "resumed sweep" "$fickcast" sweep slow.ini --output resumed
grep -q "$((10 - finished)) run now, $finished kept" out.txt || fail "resume did not report $finished kept: $(grep cases out.txt)"
ran=$(grep -c " completed " out.txt)
[ "$ran" -eq $((10 - finished)) ] || fail "resume ran $ran cases, expected $((10 - finished))"
stat -c '%n %i %.9Y' $(cut -d' ' -f1 before.txt) >after.txt
diff before.txt after.txt >/dev/null || fail "resume touched finished cases: $(diff before.txt after.txt | head -3)"
[ "$(grep -c ',completed,' resumed/sweep.csv)" -eq 10 ] || fail "resumed sweep.csv lacks 10 completed cases"
expect_code 2 "a different study into the same folder" "$fickcast" sweep grid.ini --output resumed
grep -q "different study" err.txt || fail "a different study is not named as such"

# --- Failing cases are recorded and the study goes on; exit code 1.
liner "10 mm" "[sweep]
sample.region.clay.porosity = normal(0.2, 0.3)
samples = 12
seed = 3" >some_fail.ini
expect_code 1 "sweep with failing cases" "$fickcast" sweep some_fail.ini --output some_fail
[ "$(grep -c ',completed,' some_fail/sweep.csv)" -ge 1 ] || fail "no case of the partly failing study completed"
grep -q ',input error,.*porosity' some_fail/sweep.csv || fail "a rejected sample is not recorded with its message"
[ -f some_fail/sweep_summary.json ] || fail "no sweep_summary.json"

# --- Bad set-ups: exit 2 before any run.
liner "10 mm" "" >no_study.ini
expect_code 2 "sweep without a study" "$fickcast" sweep no_study.ini --output x1
grep -q "vary" err.txt || fail "missing study not explained"
liner "10 mm" "[sweep]
vary.region.clay.porosity = 0.3, 1.4" >bad_value.ini
expect_code 2 "sweep with a value the case rejects" "$fickcast" sweep bad_value.ini --output x2
grep -q "sweep.vary.region.clay.porosity" err.txt || fail "rejected value not attributed to its study key"
[ -e x2 ] && fail "a rejected sweep created its folder"
expect_code 2 "check of a study with a value the case rejects" "$fickcast" check bad_value.ini
grep -q "sweep.vary.region.clay.porosity" err.txt || fail "check does not check the study's values"
expect_code 0 "check of a sweep" "$fickcast" check grid.ini
grep -q "would run 8 cases" out.txt || fail "check does not say what the sweep would run: $(tail -1 out.txt)"
liner "10 mm" "[size]
parameter = layer.clay.thickness
from = -0.1 m
to = 0.5 m
result = threshold.base
aim = 5 yr" "end of clay" >negative.ini
expect_code 2 "sizing whose range starts at a negative thickness" "$fickcast" check negative.ini
grep -q "size.parameter" err.txt || fail "a range end the case rejects is not attributed to the sizing: $(cat err.txt)"
expect_code 2 "sizing run whose range starts at a negative thickness" "$fickcast" size negative.ini --output x5
[ -e x5 ] && fail "a rejected sizing created its folder"
liner "10 mm" "[sweep]
vary.region.clay.porosity = 0.3
exceed.threshold.bse = 30 yr" >bad_limit.ini
expect_code 2 "sweep with a limit on an unknown result" "$fickcast" sweep bad_limit.ini --output x3
grep -q "did you mean 'threshold.base'" err.txt || fail "unknown result gives no suggestion"
expect_code 2 "check of a limit on an unknown result" "$fickcast" check bad_limit.ini
expect_code 2 "sweep --vary without =" "$fickcast" sweep grid.ini --vary region.clay.porosity
liner "10 mm" "[size]
parameter = layer.clay.thickness
from = 0.3 m
to = 0.5 m
result = threshold.base
aim = 5 yr" "end of clay" >short.ini
expect_code 2 "sizing whose range does not reach the target" "$fickcast" size short.ini --output x4
grep -q "0.3 m" err.txt && grep -q "0.5 m" err.txt || fail "non-bracketing sizing does not show both ends: $(cat err.txt)"
[ -e x4 ] && fail "a failed sizing left its folder"

# --- sizing: sizing the clay for a 40-year breakthrough prints every run and writes its tables.
liner "10 mm" "[size]
parameter = layer.clay.thickness
from = 0.3 m
to = 1.5 m
result = threshold.base
aim = 40 yr
tolerance = 1e-3" "end of clay" >size.ini
expect_code 0 "size" "$fickcast" size size.ini --output sized
grep -q "run  1" out.txt && grep -q "answer" out.txt || fail "sizing does not print its runs and answer"
# At a tolerance of 1e-3 the answer has 4 significant digits, not 8, and the bracket's half width.
grep -Eq "answer: layer.clay.thickness = (0\.[0-9]{4}|[1-9]\.[0-9]{3}) m \(\+- [0-9.e+-]+ m: the final bracket, after [0-9]+ runs\)" out.txt ||
  fail "the sizing answer is not printed to the digits its tolerance supports: $(grep answer out.txt)"
[ -f sized/size.csv ] && [ -f sized/size_summary.json ] || fail "sizing tables missing"
answer=$(sed -n 's/.*"value": \([0-9.e+-]*\),*/\1/p' sized/size_summary.json | head -1)
result=$(sed -n 's/.*"result": \([0-9.e+-]*\),*/\1/p' sized/size_summary.json | head -1)
awk -v r="$result" 'BEGIN { exit !(r > 0.99 * 40 * 31557600 && r < 1.01 * 40 * 31557600) }' ||
  fail "the sizing answer ($answer) gives breakthrough $result s, not 40 yr"

# --- size --report: the sizing report names the answer and shows the evaluations plot.
expect_code 0 "size --report" "$fickcast" size size.ini --output sized_report --report --quiet
[ -s sized_report/report/index.html ] || fail "size --report wrote no report"
grep -q "Sizing search" sized_report/report/index.html && grep -q "no safety margin" sized_report/report/index.html ||
  fail "the sizing report lacks its title or the sizing caution"
[ -s sized_report/report/size_runs.png ] || fail "the sizing report has no plot"

[ "$failures" -eq 0 ] && echo "study tests: all passed"
exit $((failures > 0))
