#!/bin/bash
# Benchmark B1 side by side, back to back on one core: the plain finite-difference script an
# engineer would write (fd_baseline_3d.py: 7-point FD, Crank-Nicolson, scipy CG-Jacobi) against
# fickcast on the same problem (b1.ini). Prints each wall time and error and their ratio; asserts
# nothing (figures go into the issue notes). Also the machine's memory bandwidth (a triad).
#   bash tests/benchmark/b1_side_by_side.sh [FICKCAST] [FD_N FD_STEPS] [-- fickcast --set options]
# Defaults: build/fickcast, the script at 161 nodes and 80 steps (its 1e-3 setting).
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
fickcast=${1:-$here/../../build/fickcast}
shift || true
n=161 steps=80
if [ $# -ge 2 ] && [ "$1" != "--" ]; then n=$1 steps=$2; shift 2; fi
[ "${1:-}" = "--" ] && shift
shared=${FICKCAST_SHARED_BENCHMARKS:-$here/../../../shared/benchmarks}
python=/usr/bin/python3
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

triad=$(dirname "$fickcast")/tests/benchmark_triad
[ -x "$triad" ] && "$triad"

echo "--- the plain script: fd_baseline_3d.py $n $steps"
fd=$($python "$shared/fd_baseline_3d.py" "$n" "$steps")
echo "$fd"
fd_wall=$(echo "$fd" | sed 's/.*wall_s=\([^ ]*\).*/\1/') fd_err=$(echo "$fd" | sed 's/.*rel_err=\([^ ]*\).*/\1/')

echo "--- fickcast run b1.ini $*"
start=$(date +%s.%N)
"$fickcast" run "$here/b1.ini" --output "$work/b1" --overwrite --quiet "$@" >/dev/null
end=$(date +%s.%N)
fc_wall=$(awk -v s="$start" -v e="$end" 'BEGIN { printf "%.3f", e - s }')
fc_err=$($python - "$work/b1/series.csv" <<'PY'
import csv, math, sys
D, t1 = 1.0, 0.05
exact = lambda x, y, z: (4 * math.pi * D * t1) ** -1.5 * math.exp(-(x*x + y*y + z*z) / (4 * D * t1))
rows = [r for r in csv.reader(open(sys.argv[1])) if r]
h, last = rows[0], [float(v) if v else float("nan") for v in rows[-1]]
err = 0
for k in range(21):
    i = next(j for j, name in enumerate(h) if name.startswith(f"point.k{k:02d}"))
    err = max(err, abs(last[i] - exact(0.05 * k, 0.03 * k, 0.02 * k)))
print(f"{err / exact(0, 0, 0):.3e}")
PY
)
solver=$($python -c "
import json, sys
s = json.load(open('$work/b1/summary.json'))
print(s['solver']['linear_solver'], '|', s['solver']['linear_iterations'], 'iterations |', s['mesh']['unknowns'],
      'unknowns |', s['time']['steps_accepted'], 'steps')")
echo "fickcast wall_s=$fc_wall rel_err=$fc_err ($solver)"
awk -v a="$fc_wall" -v b="$fd_wall" -v ea="$fc_err" -v eb="$fd_err" 'BEGIN {
  printf "ratio fickcast / script: wall %.3f (errors %s against %s)\n", a / b, ea, eb }'
