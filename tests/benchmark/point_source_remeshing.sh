#!/bin/bash
# Benchmark (issue 23, "instantaneous point source in 2-D and 3-D"): a Gaussian released at age
# 0.01 s in a 6 m box (D = 1 m2/s) and followed to age 0.11 s, from a start of 0.75 m cells with
# runtime remeshing against uniform meshes. Exact: C = exp(-r^2/(4 D a)) / (4 pi D a)^(dim/2)
# (Crank, The Mathematics of Diffusion, 1975, ch. 2-3; Carslaw & Jaeger 1959 sec. 10.2-10.3, from
# memory). The error is the largest along two lines through the centre (along x and the diagonal,
# 241 points each, sampled from the written fields by fickcast-post). Prints unknowns (the remeshed run's largest mesh), steps, errors and wall times; asserts
# nothing (figures go into the issue notes). Takes about 15 minutes in 3-D on 2 cores.
#   bash tests/benchmark/point_source_remeshing.sh [path/to/fickcast] [dim] [uniform cell sizes...]
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
fickcast=${1:-$here/../../build/fickcast}
post=$(dirname "$fickcast")/fickcast-post
dim=${2:-3}
shift $(($# > 2 ? 2 : $#))
cells=("$@")
[ ${#cells[@]} -gt 0 ] || cells=(0.375 0.25 0.1875)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
export OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1

write_case() { # NAME CELL [numerics lines...]
  local name=$1 cell=$2
  shift 2
  local geometry="layers = medium 6 m\nwidth = 6 m" value point
  if [ "$dim" = 3 ]; then
    geometry="$geometry\nlength = 6 m"
    value="{exp(-((x-3)^2+(y-3)^2+(z-3)^2)/(4*0.01))/(4*pi*0.01)^1.5}"
    point() { echo "$1 m, 3 m, 3 m"; }
  else
    value="{exp(-((x-3)^2+(y-3)^2)/(4*0.01))/(4*pi*0.01)}"
    point() { echo "$1 m, 3 m"; }
  fi
  {
    printf '[case]\ntitle = point source %s-D\ndimension = %s\n[geometry]\n' "$dim" "$dim"
    printf "$geometry\ncell_size = %s m\n" "$cell"
    printf '[region.medium]\ndiffusivity = 1 m2/s\n[initial]\nvalue = %s mol/m3\n' "$value"
    printf '[time]\nend = 0.1 s\ntolerance = 1e-5\n[numerics]\naccuracy = off\n'
    for line in "$@"; do echo "$line"; done
    printf '[output]\nfields_every = 0.1 s\n'
  } >"$work/$name.ini"
}

report() { # NAME
  local from to
  if [ "$dim" = 3 ]; then from=(0,3,3 0,0,0) to=(6,3,3 6,6,6); else from=(0,3 0,0) to=(6,3 6,6); fi
  for k in 0 1; do
    "$post" sample "$work/$1" --from "${from[$k]}" --to "${to[$k]}" --points 241 --time last \
      --field concentration --output "$work/$1/line$k.csv"
  done
  python3 - "$work/$1" "$1" "$dim" <<'PY'
import csv, json, math, sys
folder, name, dim = sys.argv[1], sys.argv[2], int(sys.argv[3])
s = json.load(open(folder + "/summary.json"))
age = 0.11
worst = 0.0
for k in (0, 1):
    for row in csv.DictReader(open("%s/line%d.csv" % (folder, k))):
        x = [float(row[c]) for c in row if c.split(" ")[0] in ("x", "y", "z")]
        r2 = sum((v - 3) ** 2 for v in x)
        exact = math.exp(-r2 / (4 * age)) / (4 * math.pi * age) ** (dim / 2)
        worst = max(worst, abs(float(row["concentration [mol/m3]"]) - exact))
m = s["mesh"]
wall = s["run"]["wall_time"]["value"]
print("%-14s %8d unknowns (largest) %5d steps  error %.3e (peak %.3f)  wall %.1f s" % (
    name, m.get("unknowns_largest", m["unknowns"]), s["time"]["steps_accepted"], worst,
    1 / (4 * math.pi * age) ** (dim / 2), wall))
PY
}

write_case remeshed 0.75 "remesh = on" "remesh_every = 2" "remesh_error = 1e-4"
"$fickcast" run "$work/remeshed.ini" --output "$work/remeshed" --quiet 2>/dev/null
report remeshed
for cell in "${cells[@]}"; do
  write_case "uniform_$cell" "$cell"
  "$fickcast" run "$work/uniform_$cell.ini" --output "$work/uniform_$cell" --quiet 2>/dev/null
  report "uniform_$cell"
done
