#!/usr/bin/env bash
# Runs `fickcast VERB CASE` (VERB from a `# verb: NAME` line in the case, else run) and checks that it fails the way tests/bad_input/EXPECTED says:
# exit code 2, one line on stderr containing every listed fragment, no results folder left.
# Usage: expect_failure.sh FICKCAST CASE.ini EXPECTED_TABLE SCRATCH_DIR
set -u
fickcast=$1 case_file=$2 table=$3 scratch=$4
name=$(basename "$case_file")
line=$(grep -E "^${name//./\\.} \|" "$table") || { echo "no expectation for $name in $table"; exit 1; }
rm -rf "$scratch" && mkdir -p "$scratch"
stderr_file="$scratch/stderr.txt"
verb=$(sed -n 's/^# verb: *//p' "$case_file" | head -1)
output=(--output "$scratch/results")
[ "$verb" = check ] && output=() # check writes nothing and takes no --output
"$fickcast" "${verb:-run}" "$case_file" "${output[@]}" >"$scratch/stdout.txt" 2>"$stderr_file"
code=$?
message=$(cat "$stderr_file")
status=0
if [ "$code" -ne 2 ]; then echo "expected exit code 2, found $code"; status=1; fi
if [ "$(wc -l <"$stderr_file")" -ne 1 ]; then echo "expected one line on stderr, found $(wc -l <"$stderr_file")"; status=1; fi
IFS='|' read -r -a parts <<<"$line"
for fragment in "${parts[@]:1}"; do
  fragment=$(echo "$fragment" | sed -e 's/^ *//' -e 's/ *$//')
  if [[ "$message" != *"$fragment"* ]]; then echo "message lacks '$fragment'"; status=1; fi
done
if compgen -G "$scratch/results*" >/dev/null; then echo "a results folder was left behind"; status=1; fi
echo "stderr: $message"
exit $status
