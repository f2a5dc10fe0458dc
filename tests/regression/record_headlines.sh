#!/usr/bin/env bash
# Records the regression reference tests/regression/demo_headlines.json: runs every demo case
# (cases/*.ini) the way ctest does (demo.run.NAME, and demo.size.NAME / demo.sweep.NAME where the
# case has a [size] section or vary./sample. lines), one after the other, into SCRATCH, then
# writes the headline values (headlines.py record).
#
# Run only on purpose, when a change is meant to move the demos' numbers; read the diff of
# demo_headlines.json and commit it with a line saying why the numbers changed. The stored values
# are a regression reference (what fickcast gave), not verification.
#
# Usage: record_headlines.sh FICKCAST [SCRATCH [OUTPUT_JSON]]
#   SCRATCH defaults to a new temporary folder (removed afterwards), OUTPUT_JSON to
#   tests/regression/demo_headlines.json.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
source_dir=$(cd "$here/../.." && pwd)
fickcast=$(realpath "${1:?usage: record_headlines.sh FICKCAST [SCRATCH [OUTPUT_JSON]]}")
scratch=${2:-}
output=$(realpath -m "${3:-$here/demo_headlines.json}")
if [ -z "$scratch" ]; then
  scratch=$(mktemp -d)
  trap 'rm -rf "$scratch"' EXIT
else
  rm -rf "$scratch" && mkdir -p "$scratch"
fi
scratch=$(realpath "$scratch")
cd "$source_dir"  # as ctest's WORKING_DIRECTORY: case files name meshes relative to it
for demo in cases/*.ini; do
  name=$(basename "$demo" .ini)
  echo "run   $name"
  "$fickcast" run "$demo" --output "$scratch/$name" --overwrite --quiet
  if grep -qE '^\[size\]' "$demo"; then
    echo "size  $name"
    "$fickcast" size "$demo" --output "$scratch/${name}_size" --overwrite --quiet
  fi
  if grep -qE '^(vary|sample)\.' "$demo"; then
    echo "sweep $name"
    "$fickcast" sweep "$demo" --output "$scratch/${name}_sweep" --overwrite --quiet
  fi
done
python3 "$here/headlines.py" record "$scratch" "$output"
