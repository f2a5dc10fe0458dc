#!/usr/bin/env bash
# Restart (issue 14 item 6). A 1-D, a 2-D and a 3-D case on two ranks, each killed with -9 at a
# random step and continued with `run --resume`, end with the uninterrupted run's numbers: every
# value of summary.json, series.csv and profiles.csv within 1e-12 relative (compare_results.py; the
# resumed run repeats the same arithmetic, so the differences seen are 0). SIGTERM gives exit 4,
# "interrupted at t = ..." and no results, and --resume continues it. A resume that does not fit
# (another case, other ranks, a damaged checkpoint, --overwrite beside it) is refused with one line.
# A run with time.error_control = global resumes to the same numbers (its carried error restored).
# A run that remeshes resumes on the mesh of its checkpoint (1-D and 2-D).
# Usage: restart_test.sh FICKCAST SOURCE_DIR SCRATCH_DIR MPIEXEC [MPI flags...]
set -u
fickcast=$1 source=$2 scratch=$3 mpiexec=$4
shift 4
mpi_flags=("$@")
compare="$source/tests/regression/compare_results.py"
rm -rf "$scratch" && mkdir -p "$scratch"
cd "$scratch" || exit 1
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }
on_ranks() { # ranks fickcast-arguments...
  local ranks=$1; shift
  "$mpiexec" -np "$ranks" "${mpi_flags[@]}" "$fickcast" "$@"
}

# descendants PID: every process started by PID, children first.
descendants() {
  local child
  for child in $(pgrep -P "$1"); do
    descendants "$child"
    echo "$child"
  done
}

# kill_at ROWS TARGET command...: starts the command and kills it (every process it started, the
# ranks included) with -9 once TARGET.partial-*/$series_in holds ROWS lines. Prints the exit code.
series_in=series.csv # an accuracy check writes solve-K/series.csv
kill_at() {
  local rows=$1 target=$2; shift 2
  "$@" >/dev/null 2>&1 &
  local pid=$! file tree
  while kill -0 "$pid" 2>/dev/null; do
    file=$(ls "$target".partial-*/$series_in 2>/dev/null | head -1)
    if [ -n "$file" ] && [ "$(wc -l <"$file")" -ge "$rows" ]; then
      tree=$(descendants "$pid")
      # shellcheck disable=SC2086
      kill -9 $tree "$pid" 2>/dev/null
      break
    fi
    sleep 0.002
  done
  wait "$pid" 2>/dev/null
  local code=$?
  # The ranks are gone before anyone looks at their folder.
  for _ in $(seq 1 500); do
    # shellcheck disable=SC2086
    kill -0 $tree 2>/dev/null || break
    sleep 0.01
  done
  echo $code
}

# restart_case NAME RANKS CASE.ini [checked]: reference run, a run killed at a random step, the
# resume. One solve (numerics.accuracy = off), or with `checked` the accuracy check, killed in its
# second solve.
restart_case() {
  local name=$1 ranks=$2 case_file=$3 checked=${4:-}
  local settings=(--set "output.checkpoint_every=0 s" "${extra[@]}")
  [ -z "$checked" ] && settings+=(--set "numerics.accuracy=off")
  on_ranks "$ranks" run "$case_file" "${settings[@]}" --output "$name.reference" --quiet ||
    { fail "$name: the uninterrupted run failed"; return; }
  local rows
  rows=$(wc -l <"$name.reference/series.csv")
  local attempt code at
  for attempt in 1 2 3; do
    rm -rf "$name".resumed*
    # A random step between a tenth and seven tenths of the run (series.csv has one row per step).
    at=$((rows / 10 + RANDOM % (rows * 6 / 10)))
    code=$(kill_at "$at" "$name.resumed" on_ranks "$ranks" run "$case_file" "${settings[@]}" --output "$name.resumed")
    [ -d "$name.resumed" ] || break # killed before it finished: go on
    echo "$name: the run finished before the kill at row $at; again"
  done
  echo "$name: killed at series row $at of $rows (exit $code)"
  [ -d "$name.resumed" ] && { fail "$name: could not kill the run before it finished"; return; }
  compgen -G "$name.resumed.partial-*/checkpoint/step-*/complete" >/dev/null ||
    compgen -G "$name.resumed.partial-*/solve-*/checkpoint/step-*/complete" >/dev/null ||
    { fail "$name: the killed run left no complete checkpoint"; return; }
  on_ranks "$ranks" run "$case_file" "${settings[@]}" --output "$name.resumed" --resume >"$name.out" 2>"$name.err"
  code=$?
  [ "$code" -eq 0 ] || { fail "$name: --resume exits $code ($(head -c 400 "$name.err"))"; return; }
  # (A check may end with a later solve than the one that resumed: its last solve's record says nothing.)
  [ -n "$checked" ] || grep -q "resumed from its checkpoint at t = " "$name.out" ||
    fail "$name: the run did not say it resumed (it started over?)"
  ls -d "$name".resumed.partial-* >/dev/null 2>&1 && fail "$name: a partial folder is left after the resume"
  [ -d "$name.resumed/checkpoint" ] && fail "$name: the finished folder still holds its checkpoints"
  python3 "$compare" "$name.reference" "$name.resumed" "${tolerance[@]}" >"$name.compare" 2>&1 ||
    fail "$name: the resumed run differs from the uninterrupted one: $(tail -n 5 "$name.compare")"
  echo "$name: $(tail -n 1 "$name.compare")"
}

extra=()                    # more settings for restart_case
tolerance=(--relative 1e-12) # how close the resumed run's numbers must be
restart_case one_d_staged 2 "$source/tests/cli/restart/staged_release.ini"
# Global time error control: the carried error (two vectors) is part of the checkpoint.
extra=(--set "time.error_control=global")
restart_case one_d_global 2 "$source/tests/cli/restart/staged_release.ini"
extra=()
restart_case one_d_reserve 2 "$source/cases/drug_matrix_bath.ini"
restart_case two_d 2 "$source/cases/wafer_trench.ini"
restart_case three_d 2 "$source/cases/pipe_penetration.ini"
series_in=solve-1/series.csv restart_case one_d_checked 2 "$source/tests/cli/restart/staged_release.ini" checked
# Remeshed runs (numerics.remesh): the checkpoint holds the mesh, which the resume makes again from
# the mesh as set up. In 1-D the arithmetic repeats (identical). In 2-D on two ranks the mesh made
# again visits its cells in another order, so sums differ in the last digits (seen: 1e-11
# relative): within 1e-9, and mass-balance errors (round-off themselves: 1e-18 kg/m next to
# amounts of 1e-7 kg/m, 5e-12 relative) within 1e-13 of each other.
extra=(--set numerics.remesh=on --set "numerics.smallest_cell=1 um" --set geometry.refine=1)
restart_case one_d_remeshed 2 "$source/tests/cli/restart/staged_release.ini"
extra=()
tolerance=(--relative 1e-9 --balance-absolute 1e-13)
restart_case two_d_remeshed 2 "$source/tests/cli/restart/remeshed_spot.ini"
tolerance=(--relative 1e-12)

# --- SIGTERM: exit 4, "interrupted at t = ...", no results and no numbers; --resume continues it.
case_file="$source/cases/pipe_penetration.ini"
single=(--set "numerics.accuracy=off")
# Fixed steps of 0.005 yr (2000 steps, several seconds): long enough to be interrupted mid-run on
# any machine speed.
long=("${single[@]}" --set "time.step=0.005 yr")
"$fickcast" run "$case_file" "${long[@]}" --output term >term.out 2>term.err &
pid=$!
for _ in $(seq 1 3000); do
  [ -n "$(ls term.partial-*/series.csv 2>/dev/null)" ] && break
  sleep 0.01
done
sleep 0.5
kill -TERM "$pid"
wait "$pid"
code=$?
[ "$code" -eq 4 ] || fail "SIGTERM: expected exit 4 (interrupted), found $code"
grep -q "^fickcast: interrupted at t = .*(step [0-9]*); no results written" term.err ||
  fail "SIGTERM: stderr lacks 'interrupted at t = ...': $(cat term.err)"
grep -q "point\.\|threshold\.\|mass balance" term.out && fail "SIGTERM: headline numbers printed for an interrupted run"
[ -e term ] && fail "SIGTERM: the results folder was committed"
ls term.partial-*/summary.json >/dev/null 2>&1 && fail "SIGTERM: the kept state holds a summary.json"
"$fickcast" run "$case_file" "${long[@]}" --output term --resume --quiet || fail "SIGTERM: --resume failed"
"$fickcast" run "$case_file" "${long[@]}" --output term.reference --quiet
python3 "$compare" term.reference term --relative 1e-12 >term.compare 2>&1 ||
  fail "SIGTERM: the resumed run differs: $(tail -n 5 term.compare)"

# --- Resumes that do not fit are refused with one line (exit 2), their state kept.
expect_refusal() { # name fragment command...
  local name=$1 fragment=$2; shift 2
  "$@" >refusal.out 2>refusal.err
  local code=$?
  [ "$code" -eq 2 ] || fail "$name: expected exit 2, found $code ($(head -c 300 refusal.err))"
  grep -qF -- "$fragment" refusal.err || fail "$name: stderr lacks '$fragment': $(head -c 300 refusal.err)"
  echo "$name: $(head -n 1 refusal.err)"
}
case_file="$source/cases/wafer_trench.ini"
kill_code=$(kill_at 20 mismatch on_ranks 2 run "$case_file" --set "output.checkpoint_every=0 s" "${single[@]}" --output mismatch)
ls -d mismatch.partial-*/checkpoint/step-*/complete >/dev/null 2>&1 || fail "mismatch: no checkpoint to test with"
expect_refusal "other ranks" "expected a checkpoint written by 1 rank(s) (this run), found one by 2" \
  "$fickcast" run "$case_file" --set "output.checkpoint_every=0 s" "${single[@]}" --output mismatch --resume
expect_refusal "another case" "found it changed" \
  on_ranks 2 run "$case_file" --set "output.checkpoint_every=0 s" "${single[@]}" --set "time.end=20 min" --output mismatch --resume
expect_refusal "resume and overwrite" "found both" \
  "$fickcast" run "$case_file" "${single[@]}" --output mismatch --resume --overwrite
ls -d mismatch.partial-*/checkpoint/step-*/complete >/dev/null 2>&1 || fail "a refused resume removed the checkpoint"
# A damaged checkpoint file: exit 3 naming it, never a wrong start.
file=$(ls mismatch.partial-*/checkpoint/step-*/rank-0001.bin | head -1)
byte=$(od -An -tu1 -j200 -N1 "$file" | tr -d ' ')
printf "\\x$(printf %02x $((byte ^ 255)))" | dd of="$file" bs=1 seek=200 conv=notrunc status=none # a changed byte
on_ranks 2 run "$case_file" --set "output.checkpoint_every=0 s" "${single[@]}" --output mismatch --resume >damaged.out 2>damaged.err
code=$?
[ "$code" -eq 3 ] || fail "damaged checkpoint: expected exit 3, found $code ($(head -c 300 damaged.err))"
grep -q "the file is damaged" damaged.err || fail "damaged checkpoint: stderr lacks 'the file is damaged': $(head -c 300 damaged.err)"
# With nothing to resume, --resume starts at t = 0 and says so.
"$fickcast" run "$source/cases/two_layer_front.ini" --output fresh --resume --quiet 2>fresh.err ||
  fail "--resume with nothing to resume failed"
grep -q "no interrupted run of fresh to resume; starting at t = 0" fresh.err || fail "--resume without a checkpoint does not say it starts over"

if [ "$failures" -ne 0 ]; then
  echo "$failures failure(s)"
  exit 1
fi
echo "restart: all checks passed"
