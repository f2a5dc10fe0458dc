#!/usr/bin/env bash
# --overwrite replaces only folders fickcast wrote (issue 14 item 1): the working folder, its
# parents, the home folder, a folder without the results marker and a file are refused with exit 2
# and their files survive; a results folder fickcast wrote is replaced; a partial folder left by a
# dead process is named, and removed with --overwrite.
# Usage: overwrite_test.sh FICKCAST CASE.ini SCRATCH_DIR
set -u
fickcast=$1 case_file=$(realpath "$2") scratch=$3
rm -rf "$scratch" && mkdir -p "$scratch/work/sub" "$scratch/home"
scratch=$(realpath "$scratch")
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }
expect_code() { # expected-code description command...
  local expected=$1 what=$2; shift 2
  "$@" >"$scratch/out.txt" 2>"$scratch/err.txt"
  local code=$?
  [ "$code" -eq "$expected" ] || fail "$what: expected exit $expected, found $code ($(head -c 300 "$scratch/err.txt"))"
}
expect_message() { # fragment description
  grep -q -- "$1" "$scratch/err.txt" || fail "$2: the message lacks '$1': $(head -c 300 "$scratch/err.txt")"
  [ "$(wc -l <"$scratch/err.txt")" -eq 1 ] || fail "$2: more than one line: $(head -c 600 "$scratch/err.txt")"
}
quick=(--set "time.end=1 d" --set "output.fields=false" --quiet)

cd "$scratch/work/sub" || exit 1
echo "keep me" >precious.txt
cp "$case_file" case.ini

# The working folder, as . and as ../sub, with sweep and run.
expect_code 2 "run --output . --overwrite" "$fickcast" run case.ini --output . --overwrite "${quick[@]}"
expect_message "working folder or one of its parents" "run --output ."
expect_code 2 "run into ../sub (the working folder) --overwrite" \
  "$fickcast" run case.ini --set "output.folder=../sub" --overwrite "${quick[@]}"
expect_message "working folder or one of its parents" "output.folder = ../sub"
# A parent of the working folder.
expect_code 2 "run --output .. --overwrite" "$fickcast" run case.ini --output .. --overwrite "${quick[@]}"
expect_message "working folder or one of its parents" "run --output .."
expect_code 2 "sweep --output . --overwrite" \
  "$fickcast" sweep case.ini --output . --overwrite --set "sweep.vary.time.end=1 d, 2 d" "${quick[@]}"
expect_message "working folder or one of its parents" "sweep --output ."
# The home folder.
echo "keep me too" >"$scratch/home/notes.txt"
expect_code 2 "run into the home folder --overwrite" \
  env HOME="$scratch/home" "$fickcast" run case.ini --output "$scratch/home" --overwrite "${quick[@]}"
expect_message "home folder" "run --output \$HOME"
# A filesystem root.
expect_code 2 "run --output / --overwrite" "$fickcast" run case.ini --output / --overwrite "${quick[@]}"
expect_message "filesystem root" "run --output /"
# A folder fickcast did not write (no marker), for run and for sweep.
mkdir -p "$scratch/data" && echo "measurements" >"$scratch/data/log.csv"
expect_code 2 "run into a foreign folder --overwrite" \
  "$fickcast" run case.ini --output "$scratch/data" --overwrite "${quick[@]}"
expect_message "holds no .fickcast-results marker" "run into a foreign folder"
expect_code 2 "sweep into a foreign folder --overwrite" \
  "$fickcast" sweep case.ini --output "$scratch/data" --overwrite --set "sweep.vary.time.end=1 d, 2 d" "${quick[@]}"
expect_message "holds no .fickcast-results marker" "sweep into a foreign folder"
# A file of that name.
expect_code 2 "run onto a file --overwrite" "$fickcast" run case.ini --output precious.txt --overwrite "${quick[@]}"
expect_message "found a file of that name" "run onto a file"

[ "$(cat precious.txt)" = "keep me" ] && [ -f case.ini ] || fail "files of the working folder did not survive"
[ "$(cat "$scratch/home/notes.txt")" = "keep me too" ] || fail "the home folder's file did not survive"
[ "$(cat "$scratch/data/log.csv")" = "measurements" ] || fail "the foreign folder's file did not survive"

# What fickcast wrote is replaced: a run folder, a sweep folder.
expect_code 0 "a first run" "$fickcast" run case.ini --output out "${quick[@]}"
[ -f out/.fickcast-results ] || fail "a results folder holds no marker"
expect_code 0 "the same run with --overwrite" "$fickcast" run case.ini --output out --overwrite "${quick[@]}"
[ -f out/summary.json ] || fail "the overwritten run has no summary.json"
expect_code 0 "a sweep" "$fickcast" sweep case.ini --output study --set "sweep.vary.time.end=1 d, 2 d" "${quick[@]}"
[ -f study/.fickcast-results ] && [ -f study/cases/case_0001/.fickcast-results ] || fail "a study folder holds no marker"
expect_code 0 "the same sweep with --overwrite" \
  "$fickcast" sweep case.ini --output study --overwrite --set "sweep.vary.time.end=1 d, 2 d" "${quick[@]}"

# A partial folder of a process that no longer runs (a run killed with -9): named, then removed.
sleep 0 &
dead=$!
wait "$dead"
mkdir -p "out2.partial-$dead" && touch "out2.partial-$dead/.fickcast-results"
expect_code 0 "a run next to a stale partial folder" "$fickcast" run case.ini --output out2 "${quick[@]}"
grep -q "out2.partial-$dead is left by an interrupted run" "$scratch/err.txt" ||
  fail "the stale partial folder is not named: $(cat "$scratch/err.txt")"
[ -d "out2.partial-$dead" ] || fail "the stale partial folder was removed without --overwrite"
expect_code 0 "the same run with --overwrite" "$fickcast" run case.ini --output out2 --overwrite "${quick[@]}"
[ -d "out2.partial-$dead" ] && fail "--overwrite left the stale partial folder"
# A process number is reused: a partial folder named after a live process (this shell) that did
# not make it (its owner record names another process start) is stale all the same.
mkdir -p "out2.partial-$$" && touch "out2.partial-$$/.fickcast-results"
echo "some-other-boot 12345" >"out2.partial-$$/.fickcast-owner"
expect_code 0 "a run next to a partial folder whose number was reused" "$fickcast" run case.ini --output out2 --overwrite "${quick[@]}"
[ -d "out2.partial-$$" ] && fail "a partial folder whose process number was reused is taken for a live run"
[ -e out2/.fickcast-owner ] && fail "the finished folder keeps the owner record"
# A process that has ended but is not yet reaped (a zombie, as an MPI rank can be for a moment after
# mpirun returns) runs no more: its partial folder is stale even though its owner record matches.
sh -c 'sleep 0 & exec sleep 30' &
reaper=$!
zombie=""
for _ in $(seq 1 500); do
  zombie=$(pgrep -P "$reaper" 2>/dev/null | head -1)
  [ -n "$zombie" ] && [ "$(awk '{print $3}' "/proc/$zombie/stat" 2>/dev/null)" = Z ] && break
  sleep 0.01
done
if [ -n "$zombie" ] && [ "$(awk '{print $3}' "/proc/$zombie/stat" 2>/dev/null)" = Z ]; then
  mkdir -p "out3.partial-$zombie" && touch "out3.partial-$zombie/.fickcast-results"
  echo "$(cat /proc/sys/kernel/random/boot_id) $(awk '{print $22}' "/proc/$zombie/stat")" >"out3.partial-$zombie/.fickcast-owner"
  expect_code 0 "a run next to the partial folder of a zombie process" "$fickcast" run case.ini --output out3 "${quick[@]}"
  grep -q "out3.partial-$zombie is left by an interrupted run" "$scratch/err.txt" ||
    fail "the partial folder of an ended (zombie) process is taken for a live run: $(cat "$scratch/err.txt")"
else
  fail "could not make a zombie process to test with"
fi
kill "$reaper" 2>/dev/null
wait "$reaper" 2>/dev/null

echo "$failures failures"
[ "$failures" -eq 0 ]
