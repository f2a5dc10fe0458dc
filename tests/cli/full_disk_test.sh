#!/usr/bin/env bash
# A full disk (issue 14 item 4): a run and a sweep into a 150 kB tmpfs stop with exit 3 and one
# line naming the file and "No space left on device"; no results folder or partial folder stays.
# Needs to mount a tmpfs (root); elsewhere it exits 77, which ctest reports as skipped.
# Usage: full_disk_test.sh FICKCAST SOURCE_DIR SCRATCH_DIR
set -u
fickcast=$1 source_dir=$2 scratch=$3
rm -rf "$scratch" && mkdir -p "$scratch/disk"
if ! mount -t tmpfs -o size=150k tmpfs "$scratch/disk" 2>/dev/null; then
  echo "cannot mount a tmpfs here (not root?): skipped"
  exit 77
fi
trap 'umount "$scratch/disk"' EXIT
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }
cd "$source_dir" || exit 1
check() { # description command...
  local what=$1; shift
  "$@" >"$scratch/out.txt" 2>"$scratch/err.txt"
  local code=$?
  [ "$code" -eq 3 ] || fail "$what: expected exit 3, found $code ($(head -c 400 "$scratch/err.txt"))"
  [ "$(wc -l <"$scratch/err.txt")" -eq 1 ] || fail "$what: expected one line, found $(wc -l <"$scratch/err.txt")"
  grep -q "No space left on device" "$scratch/err.txt" || fail "$what: the cause is not named: $(head -c 400 "$scratch/err.txt")"
  grep -q "$scratch/disk/" "$scratch/err.txt" || fail "$what: the file is not named"
  echo "$what: $(cat "$scratch/err.txt")"
}
check "run onto a full disk" "$fickcast" run cases/two_layer_front.ini --output "$scratch/disk/run" --quiet
[ -z "$(ls -A "$scratch/disk")" ] || fail "a run onto a full disk left $(ls -A "$scratch/disk")"
check "sweep onto a full disk" "$fickcast" sweep cases/liner_what_if.ini --output "$scratch/disk/sweep" --quiet
echo "$failures failures"
[ "$failures" -eq 0 ]
