#!/bin/bash
# Benchmark: a 1 000-case 1-D study (sweep_1000.ini) on 1 and 2 MPI ranks. Prints wall times and
# the per-case cost; asserts nothing (figures go into DEVELOPERS.md and the issue notes).
#   bash tests/benchmark/sweep_1000.sh [path/to/fickcast]
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
fickcast=${1:-$here/../../build/fickcast}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
export OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1
for ranks in 1 2; do
  start=$(date +%s.%N)
  mpirun -np "$ranks" --oversubscribe "$fickcast" sweep "$here/sweep_1000.ini" --quiet \
    --output "$work/ranks_$ranks" || true
  end=$(date +%s.%N)
  rows=$(($(wc -l < "$work/ranks_$ranks/sweep.csv") - 1))
  completed=$(grep -c ',completed,' "$work/ranks_$ranks/sweep.csv" || true)
  awk -v r="$ranks" -v s="$start" -v e="$end" -v n="$rows" -v c="$completed" 'BEGIN {
    printf "%d rank(s): %d cases (%d completed) in %.1f s, %.1f ms per case\n", r, n, c, e - s, 1000 * (e - s) / n }'
done
# Every column but the last (wall time) must agree between 1 and 2 ranks.
strip() { sed 's/,[^,]*$//' "$1"; }
if cmp -s <(strip "$work/ranks_1/sweep.csv") <(strip "$work/ranks_2/sweep.csv"); then
  echo "sweep.csv identical on 1 and 2 ranks (all columns but wall time)"
else
  echo "sweep.csv DIFFERS between 1 and 2 ranks:"
  diff <(strip "$work/ranks_1/sweep.csv") <(strip "$work/ranks_2/sweep.csv") | head -5 || true
  exit 1
fi
