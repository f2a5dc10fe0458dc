#!/usr/bin/env bash
# Regression test (not verification): compares the headline results of every demo case with the
# values stored in tests/regression/demo_headlines.json, reading the results folders that the
# ctest demo.run.*, demo.size.* and demo.sweep.* tests wrote under DEMO_SCRATCH
# (build/test-scratch/demo/NAME, NAME_size, NAME_sweep). Then checks that the numbers written in
# the cases' `# Expect:` headers and README.md's `threshold.mid: 2.42 yr` agree with the stored
# values to the digits written. Prints every comparison; exits 1 on any difference beyond
# tolerance, any missing folder, file or result.
#
# Usage: check_headlines.sh FICKCAST DEMO_SCRATCH [STORED_JSON]
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
fickcast=${1:?usage: check_headlines.sh FICKCAST DEMO_SCRATCH [STORED_JSON]}
scratch=${2:?usage: check_headlines.sh FICKCAST DEMO_SCRATCH [STORED_JSON]}
stored=${3:-$here/demo_headlines.json}
exec python3 "$here/headlines.py" check "$scratch" "$stored" "$(cd "$here/../.." && pwd)" "$fickcast"
