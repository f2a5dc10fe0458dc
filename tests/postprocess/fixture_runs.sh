#!/usr/bin/env bash
# Fixture for the fickcast-post command-line tests: a small two-layer run (invented numbers),
# the same run with one diffusivity changed by 5 %, and the same run with remeshing, in
# SCRATCH/base, SCRATCH/changed and SCRATCH/remeshed.
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
"$fickcast" run "$scratch/case.ini" --output "$scratch/remeshed" --overwrite --quiet \
  --set numerics.remesh=on --set "numerics.smallest_cell=1 mm" --set geometry.refine=1
echo "fixture runs written to $scratch/base, $scratch/changed and $scratch/remeshed"
