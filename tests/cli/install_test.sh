#!/usr/bin/env bash
# `cmake --install` into a temporary prefix gives working commands (issue 16 item 6): the installed
# fickcast and fickcast-post start from any folder with the build tree out of their search path
# (their RUNPATH is relative to the prefix), `check` and `run` an installed demo case that names its
# mesh relative to itself, `fickcast-post` reads the result, and the manual pages are there.
# Usage: install_test.sh BUILD_DIR SCRATCH_DIR
set -u
build=$(realpath "$1") scratch=$2
rm -rf "$scratch" && mkdir -p "$scratch"
scratch=$(realpath "$scratch")
prefix=$scratch/prefix
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }

cmake --install "$build" --prefix "$prefix" >"$scratch/install.txt" 2>&1 ||
  { cat "$scratch/install.txt"; echo "FAIL: cmake --install"; exit 1; }
for f in bin/fickcast bin/fickcast-post lib/fickcast/libfickcast_core.so share/man/man1/fickcast.1 \
  share/man/man1/fickcast-post.1 share/fickcast/cases/two_layer_front.ini share/fickcast/meshes/wafer_trench.msh \
  share/doc/fickcast/README.md; do
  [ -e "$prefix/$f" ] || fail "$f is not installed"
done
# The installed binaries must not reach back into the build tree.
for f in bin/fickcast bin/fickcast-post; do
  runpath=$(readelf -d "$prefix/$f" | grep -E 'RUNPATH|RPATH' || true)
  case "$runpath" in *"$build"*) fail "$f keeps a path into the build tree: $runpath" ;; esac
done
readelf -d "$prefix/bin/fickcast" | grep -q 'RUNPATH.*\$ORIGIN/../lib/fickcast' ||
  fail "bin/fickcast lacks the RUNPATH \$ORIGIN/../lib/fickcast: $(readelf -d "$prefix/bin/fickcast" | grep -i path)"
# Manual pages: roff with a section per verb, made from the installed commands' help.
grep -q '^\.TH fickcast 1' "$prefix/share/man/man1/fickcast.1" || fail "fickcast.1 has no .TH header"
for section in RUN CHECK SWEEP SIZE VERIFY; do
  grep -q "^\.SH $section\$" "$prefix/share/man/man1/fickcast.1" || fail "fickcast.1 lacks the section $section"
done
grep -q 'Usage: fickcast run' "$prefix/share/man/man1/fickcast.1" || fail "fickcast.1 lacks run's usage line"
grep -q '^\.SH SAMPLE$' "$prefix/share/man/man1/fickcast-post.1" || fail "fickcast-post.1 lacks SAMPLE"
if command -v man >/dev/null; then
  MANWIDTH=100 man -l "$prefix/share/man/man1/fickcast.1" 2>/dev/null | grep -q 'Usage: fickcast run' ||
    fail "man -l cannot render fickcast.1"
fi

# The commands as a user runs them: from another folder, by the installed path, on PATH.
mkdir -p "$scratch/work" && cd "$scratch/work" || exit 1
export PATH="$prefix/bin:$PATH"
unset LD_LIBRARY_PATH
[ "$(command -v fickcast)" = "$prefix/bin/fickcast" ] || fail "PATH does not find the installed fickcast"
fickcast --version >version.txt 2>&1 || fail "fickcast --version: $(cat version.txt)"
grep -q '^fickcast 0\.' version.txt || fail "fickcast --version prints: $(cat version.txt)"
fickcast-post --version >post_version.txt 2>&1 || fail "fickcast-post --version: $(cat post_version.txt)"
cases=$prefix/share/fickcast/cases
fickcast check "$cases/wafer_trench.ini" >check.txt 2>&1 || fail "check of the installed wafer_trench (Gmsh mesh ../meshes/...): $(tail -3 check.txt)"
fickcast run "$cases/two_layer_front.ini" --output front --set "time.end=0.2 yr" --quiet >run.txt 2>&1 ||
  fail "run of the installed two_layer_front: $(tail -3 run.txt)"
[ -f front/summary.json ] || fail "the installed run wrote no front/summary.json"
grep -q '"status": "completed"' front/summary.json || fail "the installed run did not complete"
fickcast-post integrate front --time last >integrate.txt 2>&1 || fail "fickcast-post integrate: $(tail -3 integrate.txt)"
grep -q 'silt' integrate.txt || fail "fickcast-post integrate names no region: $(head -3 integrate.txt)"

if [ "$failures" -ne 0 ]; then
  echo "$failures check(s) failed"
  exit 1
fi
echo "install: commands, library, cases, meshes and manual pages under $prefix work"
