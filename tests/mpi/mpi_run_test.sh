#!/usr/bin/env bash
# `mpirun -np 2 fickcast run` end to end (issue 24 item 5): a 2-D and a 3-D case on one rank and on
# two ranks give the same fields (fickcast-post compare at 1e-8), the 2-rank results folder is
# complete (PVTU with one piece per rank, PVD, summary.json and series.csv written once, by rank 0),
# fickcast-post reads the PVTU (sample and integrate agree with the 1-rank folder and with
# series.csv), and input errors that only one rank sees, or that no rank's cells contain, end every
# rank with exit code 2 and one message line within 60 s and leave no results folder.
# Usage: mpi_run_test.sh FICKCAST FICKCAST_POST MPIEXEC SCRATCH_DIR [MPI flags...]
#        (MPI flags default to --oversubscribe --allow-run-as-root; Open MPI)
set -u
absolute() { case $1 in /*) echo "$1" ;; */*) echo "$(cd "$(dirname "$1")" && pwd)/$(basename "$1")" ;; *) echo "$1" ;; esac; }
fickcast=$(absolute "$1") post=$(absolute "$2") mpiexec=$(absolute "$3") scratch=$4
shift 4
mpi_flags=("$@")
[ ${#mpi_flags[@]} -eq 0 ] && mpi_flags=(--oversubscribe --allow-run-as-root)
export OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1
source_dir=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
rm -rf "$scratch" && mkdir -p "$scratch"
cd "$scratch" || exit 1
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }
say() { echo "-- $*"; }
# Runs a command with a 60 s limit (times FICKCAST_TEST_TIME_SCALE: sanitizer builds run slower);
# out.txt, err.txt and $code keep what it did (124: it hung).
limit=$((60 * ${FICKCAST_TEST_TIME_SCALE:-1}))
run() { # description command...
  local what=$1; shift
  timeout -k 5 "$limit" "$@" >out.txt 2>err.txt
  code=$?
  [ "$code" -ne 124 ] || fail "$what: still running after $limit s (killed)"
}
expect_code() { # expected-code description command...
  local expected=$1 what=$2; shift 2
  run "$what" "$@"
  [ "$code" -eq "$expected" ] || [ "$code" -eq 124 ] ||
    fail "$what: expected exit $expected, found $code ($(grep -v -e '^---' -e '^ *$' err.txt | head -c 400))"
}
two_ranks=("$mpiexec" -np 2 "${mpi_flags[@]}")
# |a - b| <= rel * max(|a|, |b|)
close() { awk -v a="$1" -v b="$2" -v r="$3" 'BEGIN { d = a - b; if (d < 0) d = -d; m = (a < 0 ? -a : a);
  n = (b < 0 ? -b : b); if (n > m) m = n; exit !(a != "" && b != "" && d <= r * m) }'; }
# Two CSV files with the same cells, numbers equal to rel relative (text cells identical).
same_csv() { # file-a file-b rel
  awk -F, -v r="$3" 'NR == FNR { row[FNR] = $0; rows = FNR; next }
    { if (!(FNR in row)) exit 1; n = split(row[FNR], a, ","); if (n != NF) exit 1
      for (i = 1; i <= NF; ++i) {
        if (a[i] == $i) continue
        if (a[i] !~ /^[-+0-9.eE]+$/ || $i !~ /^[-+0-9.eE]+$/) exit 1
        d = a[i] - $i; if (d < 0) d = -d; m = a[i] < 0 ? -a[i] : a[i]; n2 = $i < 0 ? -$i : $i; if (n2 > m) m = n2
        if (d > r * m) exit 1 } }
    END { if (FNR != rows) exit 1 }' "$1" "$2"
}
# Value of series.csv column (header starting with NAME + space) in the row at time T (s).
series_value() { # folder column time
  awk -F, -v name="$2" -v t="$3" 'NR == 1 { for (i = 1; i <= NF; ++i) if (index($i, name " ") == 1) c = i; next }
    c && ($1 - t < 1e-6 * t) && (t - $1 < 1e-6 * t) { print $c; exit }' "$1/series.csv"
}
# Last column of the first data row of a fickcast-post CSV.
first_value() { awk -F, 'NR == 2 { print $NF; exit }' "$1"; }

# --- The two-rank runs and their results folders --------------------------------------------
# Fixed steps (the same steps on any number of ranks) and the iterative solver to 1e-14 relative
# residual, so that the 1- and 2-rank solutions differ by ~1e-14: far below the float32 rounding
# of the VTU values, so the written fields are the same numbers and 1e-8 is a fair tolerance.

# A two-layer plate, invented data (test case). 750 cells, 3111 unknowns.
cat >plate.ini <<'CASE'
[case]
title = two-layer plate on one and two ranks (test, invented data)
dimension = 2
[geometry]
layers = cap 0.2 m, body 0.8 m
width = 1.2 m
cell_size = 0.04 m
[region.cap]
diffusivity = {2e-9*(1 + 0.5*x)} m2/s
[region.body]
diffusivity = 1e-9 m2/s
porosity = 0.3
[boundary.top]
type = concentration
value = {1 + 0.2*x} mol/m3
[boundary.right]
type = transfer
coefficient = 1e-8 m/s
ambient = 0.3 mol/m3
[time]
end = 2 yr
step = 0.1 yr
[numerics]
solver_tolerance = 1e-14
[output]
fields_every = 1 yr
point.a = 0.75 m, 0.3 m
point.near = 0.1 m, 0.1 m
point.far = 1.1 m, 0.9 m
CASE

# A two-layer block, invented data (test case). 384 cells, 3757 unknowns.
cat >block.ini <<'CASE'
[case]
title = two-layer block on one and two ranks (test, invented data)
dimension = 3
[geometry]
layers = skin 0.25 m, core 0.75 m
width = 1 m
length = 0.75 m
cell_size = 0.125 m
[region.skin]
diffusivity = {2e-9*(1 + 0.5*x)} m2/s
[region.core]
diffusivity = 1e-9 m2/s
porosity = 0.3
[boundary.top]
type = concentration
value = {1 + 0.2*x - 0.1*y} mol/m3
[boundary.right]
type = transfer
coefficient = 1e-8 m/s
ambient = 0.3 mol/m3
[time]
end = 2 yr
step = 0.1 yr
[numerics]
solver_tolerance = 1e-14
[output]
fields_every = 1 yr
point.p = 0.55 m, 0.3 m, 0.35 m
point.near = 0.1 m, 0.1 m, 0.1 m
point.far = 0.9 m, 0.7 m, 0.9 m
CASE

# Point (comma-separated, inside a cell, not on a cell face) and named point of each case.
declare -A at=([plate]="0.75,0.3" [block]="0.55,0.3,0.35")
declare -A point=([plate]=point.a [block]=point.p)
declare -A regions=([plate]="cap body" [block]="skin core")

for name in plate block; do
  one=${name}_one two=${name}_two
  say "$name: fickcast run on 1 rank and mpirun -np 2 fickcast run: exit 0"
  expect_code 0 "$name on 1 rank" "$fickcast" run $name.ini --output $one --quiet
  expect_code 0 "$name on 2 ranks" "${two_ranks[@]}" "$fickcast" run $name.ini --output $two --quiet
  [ -d $two ] || { fail "$name: the 2-rank run left no results folder"; continue; }

  say "$name: the 2-rank folder has fields/*.pvtu with one .vtu piece per rank, the .pvd, summary.json, series.csv"
  compgen -G "$two.partial-*" >/dev/null && fail "$name: a partial folder was left behind"
  [ -s $two/summary.json ] || fail "$name: no summary.json in the 2-rank folder"
  [ -s $two/series.csv ] || fail "$name: no series.csv in the 2-rank folder"
  [ -s $two/fields/fields.pvd ] || fail "$name: no fields/fields.pvd in the 2-rank folder"
  n_pvtu=$(ls $two/fields/*.pvtu 2>/dev/null | wc -l)
  [ "$n_pvtu" -eq 3 ] || fail "$name: expected 3 fields/*.pvtu (t = 0, 1 yr, 2 yr), found $n_pvtu"
  for pvtu in $two/fields/*.pvtu; do
    [ -e "$pvtu" ] || continue
    pieces=$(grep -o 'Source="[^"]*"' "$pvtu" | sed 's/Source="\(.*\)"/\1/')
    [ "$(echo "$pieces" | grep -c .)" -eq 2 ] || fail "$name: $pvtu does not list 2 pieces: $pieces"
    for piece in $pieces; do
      [ -s "$two/fields/$piece" ] || fail "$name: $pvtu lists $piece, which is missing"
    done
    grep -q "file=\"$(basename "$pvtu")\"" $two/fields/fields.pvd || fail "$name: fields.pvd does not index $pvtu"
  done
  grep -q '"ranks": 2' $two/summary.json || fail "$name: summary.json does not say 2 ranks"
  grep -q '"ranks": 1' $one/summary.json || fail "$name: the 1-rank summary.json does not say 1 rank"
  grep -q '"status": "completed"' $two/summary.json || fail "$name: the 2-rank summary.json is not 'completed'"
  # Written once, by rank 0: one header, as many rows as on one rank.
  [ "$(grep -c '^time' $two/series.csv)" -eq 1 ] || fail "$name: series.csv has more than one header"
  [ "$(wc -l <$two/series.csv)" -eq "$(wc -l <$one/series.csv)" ] ||
    fail "$name: series.csv has $(wc -l <$two/series.csv) lines on 2 ranks, $(wc -l <$one/series.csv) on 1 rank"

  # Every recorded number (points spread over both ranks' parts, amounts, fluxes) as on one rank:
  # rank 0 writes series.csv only after every rank's values have arrived. Left out: the linear
  # iteration counts (they depend on the partition) and the balance error (round-off).
  say "$name: series.csv on 2 ranks = on 1 rank (every column but linear_iterations and balance_error, 1e-8)"
  drop_columns() { awk -F, 'NR == 1 { for (i = 1; i <= NF; ++i) if ($i ~ /^(linear_iterations|balance_error)/) skip[i] = 1 }
    { out = ""; for (i = 1; i <= NF; ++i) if (!(i in skip)) out = out (out == "" ? "" : ",") $i; print out }' "$1"; }
  drop_columns $one/series.csv >series1_$name.csv
  drop_columns $two/series.csv >series2_$name.csv
  same_csv series1_$name.csv series2_$name.csv 1e-8 ||
    fail "$name: series.csv differs between 1 and 2 ranks: $(diff series1_$name.csv series2_$name.csv | head -3)"

  say "$name: fickcast-post compare 1-rank 2-rank --tolerance 1e-8 (every field): exit 0"
  expect_code 0 "$name: compare (every field) at 1e-8" "$post" compare $one $two --tolerance 1e-8 --output cmp_$name.csv
  [ "$code" -eq 0 ] || echo "   compare said: $(cat out.txt)"
  say "$name: the same for the continuous fields (concentration, reference_concentration)"
  expect_code 0 "$name: compare (concentration, reference_concentration) at 1e-8" \
    "$post" compare $one $two --field concentration,reference_concentration --tolerance 1e-8

  say "$name: fickcast-post sample at ${at[$name]} m, t = 1 yr and integrate at t = 2 yr: the PVTU gives the 1-rank numbers (sample 2.4e-7: Float32 fields; integrals 1e-8)"
  for folder in $one $two; do
    expect_code 0 "sample $folder" "$post" sample $folder --at "${at[$name]}" --time 1yr --field concentration \
      --output sample_$folder.csv
    expect_code 0 "integrate $folder" "$post" integrate $folder --time 2yr --output integral_$folder.csv
  done
  # The fields are stored in single precision (Float32: 2^-23 = 1.2e-7 relative per value); a point on
  # a cell edge may be read from either neighbour's nodes, so the sample agrees to two such steps.
  same_csv sample_$one.csv sample_$two.csv 2.4e-7 ||
    fail "$name: sample on the PVTU differs from 1 rank: $(tail -1 sample_$one.csv) / $(tail -1 sample_$two.csv)"
  same_csv integral_$one.csv integral_$two.csv 1e-8 ||
    fail "$name: integrate on the PVTU differs from 1 rank: $(tr '\n' ' ' <integral_$one.csv) / $(tr '\n' ' ' <integral_$two.csv)"

  # The sampled value against the named point in series.csv (double precision, written by the
  # solver) at the same place and time. The VTU holds float32 values and coordinates: nodal values
  # are rounded to 2^-24 = 6e-8 relative, the Q2 interpolation weights sum in absolute value to at
  # most 1.25^dim (<= 2), and the float32 coordinates (6e-8 x 1.2 m) times the gradient here add
  # about 1e-7: 1e-6 relative bounds these with margin (measured: 2e-8), while sampling at the
  # wrong place or time would be off by 1e-2 or more.
  say "$name: sampled value = ${point[$name]} in series.csv at 1 yr (1e-6 relative: float32 VTU values)"
  sampled=$(first_value sample_$two.csv)
  recorded=$(series_value $two "${point[$name]}" 31557600)
  close "$sampled" "$recorded" 1e-6 || fail "$name: sample gives '$sampled', series.csv ${point[$name]} '$recorded'"
  # Region integrals of amount_per_volume over the PVTU (all pieces) = the amounts in series.csv.
  say "$name: integrate (amount_per_volume over all pieces) = amounts in series.csv at 2 yr (1e-6 relative: float32)"
  for region in ${regions[$name]} total; do
    integral=$(awk -F, -v r="$region" 'NR > 1 && $2 == r { print $4; exit }' integral_$two.csv)
    amount=$(series_value $two "amount.$region" 63115200)
    close "$integral" "$amount" 1e-6 || fail "$name: integral over $region '$integral', series.csv amount '$amount'"
  done
done

# --- Input errors on two ranks: exit 2 within 60 s, one message line, no results folder --------
expect_input_error() { # case-name description fragments...
  local case_name=$1 what=$2; shift 2
  say "$what: timeout 60 mpirun -np 2 fickcast run: exit 2, one message line, no results folder"
  rm -rf $case_name.out*
  run "$what" "${two_ranks[@]}" "$fickcast" run $case_name.ini --output $case_name.out
  local message lines missing=() fragment
  message=$(grep -m1 '^fickcast:' err.txt)
  lines=$(grep -c '^fickcast:' err.txt)
  echo "   exit $code; message: ${message:-(none)}"
  if [ "$code" -ne 2 ]; then
    [ "$code" -eq 124 ] || fail "$what: expected exit 2, found $code$([ -f $case_name.out/summary.json ] &&
      echo "; the run wrote $case_name.out with $(grep -m1 '"status"' $case_name.out/summary.json | tr -d ' ,') and" \
        "last series.csv row '$(tail -1 $case_name.out/series.csv)'")"
  else
    [ "$lines" -eq 1 ] || fail "$what: expected one message line from fickcast, found $lines"
    for fragment in "$@"; do
      [[ "$message" == *"$fragment"* ]] || missing+=("'$fragment'")
    done
    [ ${#missing[@]} -eq 0 ] || fail "$what: the message lacks ${missing[*]}"
  fi
  compgen -G "$case_name.out*" >/dev/null && fail "$what: a results folder was left: $(ls -d $case_name.out*)"
}

# A diffusivity negative in one cell only, the corner cell x > 1.16 m, y > 0.96 m of the plate: one
# cell belongs to one rank (rank 1 in this partition), so only that rank sees the error while it
# assembles. The other rank must hear of it and stop too (exit 2, not a hang).
sed 's/^diffusivity = 1e-9 m2\/s/diffusivity = {x > 1.16 \&\& y > 0.96 ? -1e-9 : 1e-9} m2\/s/' plate.ini \
  >one_rank_diffusivity.ini
expect_input_error one_rank_diffusivity "a diffusivity negative in one rank's cell" \
  one_rank_diffusivity.ini region.body.diffusivity "> 0 everywhere"
# The value found must be legible (-1e-09 m2/s, not a number printed as zero).
grep -q '^fickcast:.*found -0\.000000 ' err.txt &&
  fail "a diffusivity negative in one rank's cell: the message shows -1e-9 m2/s as '-0.000000 m2/s'"

# An initial concentration that is not a number in the same corner cell only (square root of a
# negative number for x > 1.16 m): an input error seen by one rank.
sed 's/^\[time\]/[initial]\nvalue = {y > 0.96 ? sqrt(1.16 - x) : 0} mol\/m3\n[time]/' plate.ini >one_rank_initial.ini
expect_input_error one_rank_initial "an initial value that is NaN in one rank's cell" one_rank_initial.ini initial.value

# A named point inside a hole of the body (the trench of the demo wafer mesh): no rank's cells hold
# it. Shape of our own (meshes/wafer_trench.msh), invented data.
cat >hole.ini <<CASE
[case]
title = point in the trench (test, invented data)
dimension = 2
[geometry]
mesh = $source_dir/meshes/wafer_trench.msh
[region.silicon]
diffusivity = 1e-16 m2/s
[region.oxide]
diffusivity = 1e-18 m2/s
[boundary.trench]
type = concentration
value = 1e20 1/cm3
[time]
end = 10 min
[output]
point.in_trench = 5 um, 4.5 um
CASE
expect_input_error hole "a named point inside the trench (a hole of the mesh)" \
  "hole.ini:$(grep -n '^point.in_trench' hole.ini | cut -d: -f1)" output.point.in_trench

echo "elapsed: ${SECONDS} s"
if [ "$failures" -ne 0 ]; then echo "$failures failure(s)"; exit 1; fi
echo "all mpirun checks passed"
