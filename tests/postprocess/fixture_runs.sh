#!/usr/bin/env bash
# Fixture for the fickcast-post command-line tests: a small two-layer run (invented numbers)
# and the same run with one diffusivity changed by 5 %, in SCRATCH/base and SCRATCH/changed.
# Usage: fixture_runs.sh FICKCAST SCRATCH
set -eu
fickcast=$1 scratch=$2
rm -rf "$scratch" && mkdir -p "$scratch"
cat >"$scratch/case.ini" <<'CASE'
[case]
title = Post-processing fixture: two layers (invented numbers)
[geometry]
layers = upper 0.25 m, lower 0.75 m
cell_size = 0.0125 m
[region.upper]
diffusivity = 2e-3 m2/s
porosity = 0.4
[region.lower]
diffusivity = 1e-2 m2/s
[boundary.top]
type = concentration
value = 5 mg/L
[time]
end = 10 s
[output]
fields_every = 2.5 s
point.mid = 0.5 m
threshold.mid = 1 mg/L
line.depth = 0 m to 1 m
samples.depth = 41
CASE
"$fickcast" run "$scratch/case.ini" --output "$scratch/base" --overwrite --quiet
"$fickcast" run "$scratch/case.ini" --output "$scratch/changed" --overwrite --quiet \
  --set "region.lower.diffusivity=1.05e-2 m2/s"
echo "fixture runs written to $scratch/base and $scratch/changed"
