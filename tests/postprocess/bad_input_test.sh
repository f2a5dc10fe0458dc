#!/usr/bin/env bash
# fickcast-post on bad input: exit code 2 (3 for I/O), exactly one line on stderr naming the
# file, and no output file. Usage: bad_input_test.sh FICKCAST_POST FIXTURE_SCRATCH OUT_SCRATCH NAME
set -u
post=$1 fixture=$2 out=$3/$4 name=$4
rm -rf "$out" && mkdir -p "$out"
base=$fixture/base
copy() { cp -r "$base" "$out/results"; }
expected_code=2
case $name in
  missing_folder)
    args=(sample "$out/no_such_folder" --at 0.5); fragment="$out/no_such_folder: expected a results folder" ;;
  no_summary)
    copy; rm "$out/results/summary.json"
    args=(integrate "$out/results"); fragment="$out/results/summary.json: expected" ;;
  malformed_summary)
    copy; echo '{"program": "fickcast", "version": ' >"$out/results/summary.json"
    args=(report "$out/results"); fragment="$out/results/summary.json: expected" ;;
  malformed_series)
    copy; sed -i '3s/^[^,]*,/abc,/' "$out/results/series.csv"
    args=(plots "$out/results"); fragment="$out/results/series.csv:3: expected a number in column \`time\`, found 'abc'" ;;
  short_series_row)
    copy; sed -i '4s/,[^,]*$//' "$out/results/series.csv"
    args=(report "$out/results"); fragment="$out/results/series.csv:4: expected" ;;
  unknown_time)
    args=(sample "$base" --at 0.5 --time 30s); fragment="$base/fields/fields.pvd: expected a time from 0 s to 10 s (the stored states)" ;;
  integrate_time)
    args=(integrate "$base" --time 3s); fragment="$base/fields/fields.pvd: expected an output time" ;;
  length_unit)
    args=(sample "$base" --at "0.5 kg"); fragment="--at: expected a length unit (m, cm, mm, um, nm, ft, in), found 'kg' in '0.5 kg'" ;;
  time_unit)
    args=(sample "$base" --at 0.5 --time "3 furlong"); fragment="--time: expected a time unit (s, min, h, d, yr, ...), found 'furlong'" ;;
  table_which)
    args=(table "$base" --which sweep); fragment="--which: expected \`series\` or \`profiles\` (the tables of a results folder), found 'sweep'" ;;
  table_units)
    args=(table "$base" --units imperial); fragment="--units: expected \`case\` (the units the case was written in) or \`si\`, found 'imperial'" ;;
  unknown_field)
    args=(sample "$base" --at 0.5 --time last --field nonsense); fragment="fields_0004.vtu: expected a field among" ;;
  missing_vtu)
    copy; rm "$out/results/fields/fields_0002.vtu"
    args=(integrate "$out/results"); fragment="$out/results/fields/fields_0002.vtu: expected" ;;
  bad_point)
    args=(sample "$base" --at 0.5,0.2); fragment="--at: expected 1 coordinate" ;;
  unknown_option)
    args=(compare "$base" "$base" --tolerence 1); fragment="command line: expected an option of \`compare\`" ;;
  io_failure)
    args=(integrate "$base" --output /proc/fickcast-post-cannot-write.csv); fragment="cannot write"
    expected_code=3 ;;
  *) echo "unknown scenario $name"; exit 1 ;;
esac
"$post" "${args[@]}" >"$out/stdout.txt" 2>"$out/stderr.txt"
code=$?
status=0
[ $code -eq $expected_code ] || { echo "expected exit code $expected_code, found $code"; status=1; }
lines=$(wc -l <"$out/stderr.txt")
[ "$lines" -eq 1 ] || { echo "expected one line on stderr, found $lines"; status=1; }
grep -qF -- "$fragment" "$out/stderr.txt" || { echo "stderr lacks: $fragment"; status=1; }
[ -e "$out/results/report" ] && { echo "a report folder was left behind"; status=1; }
echo "stderr: $(cat "$out/stderr.txt")"
exit $status
