#!/usr/bin/env bash
# Fuzzes one harness for a while, then minimises what it found together with the stored corpus.
#
#   bash tests/fuzz/fuzz.sh HARNESS SECONDS [--store]
#
# HARNESS is case, msh or table; the binary is build-fuzz/fuzz_HARNESS (cmake --preset fuzz &&
# cmake --build --preset fuzz). The working corpus build-fuzz/work/HARNESS/corpus starts from the
# seeds (cases/, tests/bad_input/, tests/fuzz/seeds and tables) and the stored corpus
# tests/fuzz/corpus/HARNESS; libFuzzer runs one job at nice 10 (-timeout=10 -rss_limit_mb=4096),
# writes its log to build-fuzz/work/HARNESS/fuzz-0.log and any finding to
# build-fuzz/work/HARNESS/artifacts/. Then -merge=1 keeps the inputs that reach new edges in
# build-fuzz/work/HARNESS/minimised; with --store they replace tests/fuzz/corpus/HARNESS (whose
# files named finding-* are kept as they are: every fixed finding stays in the replay corpus).
set -euo pipefail
cd "$(dirname "$0")/../.."
harness=${1:?usage: fuzz.sh case|msh|table SECONDS [--store]}
seconds=${2:?usage: fuzz.sh case|msh|table SECONDS [--store]}
store=${3:-}
binary=build-fuzz/fuzz_$harness
[ -x "$binary" ] || { echo "fuzz.sh: $binary missing: cmake --preset fuzz && cmake --build --preset fuzz" >&2; exit 2; }
case $harness in
  case) max_len=4096 ;;
  msh) max_len=8192 ;;
  table) max_len=1024 ;;
  *) echo "fuzz.sh: expected case, msh or table, found '$harness'" >&2; exit 2 ;;
esac
work=build-fuzz/work/$harness
stored=tests/fuzz/corpus/$harness
mkdir -p "$work/corpus" "$work/artifacts" "$stored"

# Seeds from the repository (copied under their own names, so reruns do not duplicate them).
seed() { for f in "$@"; do [ -f "$f" ] && cp "$f" "$work/corpus/seed-$(basename "$f")"; done; return 0; }
case $harness in
  case) seed cases/*.ini tests/bad_input/*.ini tests/fuzz/seeds/*.ini ;;
  msh) seed meshes/*.msh tests/bad_input/meshes/*.msh tests/fuzz/seeds/*.msh ;;
  table) seed tests/bad_input/tables/*.csv tests/fuzz/tables/*.csv ;;
esac

export LSAN_OPTIONS="suppressions=$PWD/tests/sanitizer/lsan.supp:print_suppressions=0"
start=$(date +%s)
status=0
(cd "$work" && nice -n 10 "$OLDPWD/$binary" -jobs=1 -workers=1 -timeout=10 -rss_limit_mb=4096 \
  -max_total_time="$seconds" -max_len=$max_len -print_final_stats=1 -artifact_prefix=artifacts/ \
  -dict="$OLDPWD/tests/fuzz/$harness.dict" corpus "$OLDPWD/$stored") || status=$?
echo "fuzz.sh: $harness fuzzed $(( $(date +%s) - start )) s, exit $status; log $work/fuzz-0.log"
grep -E "^#[0-9]+ +DONE|^stat::|SUMMARY|ERROR|finding" "$work/fuzz-0.log" || true
ls "$work/artifacts"

# Minimise the stored and the working corpus together (libFuzzer names the kept files by SHA-1).
# -use_counters=0: keep the inputs that reach new edges, not new hit counts of known ones (a few
# hundred files per harness instead of about twice as many, the same edges).
rm -rf "$work/minimised" && mkdir -p "$work/minimised"
nice -n 10 "$binary" -merge=1 -use_counters=0 -timeout=10 -rss_limit_mb=4096 -max_len=$max_len "$work/minimised" "$stored" \
  "$work/corpus" > "$work/merge.log" 2>&1 || { tail -20 "$work/merge.log"; exit 1; }
grep -E "MERGE-OUTER: [0-9]+ new files" "$work/merge.log" || true
echo "fuzz.sh: minimised corpus $(ls "$work/minimised" | wc -l) files (working corpus $(ls "$work/corpus" | wc -l))"
if [ "$store" = "--store" ]; then
  find "$stored" -maxdepth 1 -type f ! -name 'finding-*' -delete
  cp "$work/minimised"/* "$stored"/
  for finding in "$stored"/finding-*; do   # a finding is kept once, under its own name
    [ -f "$finding" ] && rm -f "$stored/$(sha1sum "$finding" | cut -d' ' -f1)"
  done
  echo "fuzz.sh: stored $(ls "$stored" | wc -l) files in $stored"
fi
exit $status
