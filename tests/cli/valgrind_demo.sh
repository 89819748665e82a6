#!/bin/sh
# The demo under valgrind memcheck: zero errors and no definite leaks. The section polars are
# computed first without valgrind (into a cache of this run, or given: CACHE_DIR, filled by the
# report render test); the checked run then reads them and does everything else (tables, BEMT
# and vortex maps, hover trim, plots, report).
# usage: valgrind_demo.sh AIRSCREW VALGRIND [CACHE_DIR]
set -u
exe=$1; vg=$2
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
AIRSCREW_CACHE_DIR="$tmp/cache"
[ $# -ge 3 ] && [ -d "$3" ] && AIRSCREW_CACHE_DIR=$3
export AIRSCREW_CACHE_DIR
OPENBLAS_NUM_THREADS=1; export OPENBLAS_NUM_THREADS
# fills the cache where it is empty; where the render test filled it, only reads it
"$exe" demo --out "$tmp/warmup" > /dev/null 2>&1 || { echo "FAIL: demo (warm-up) failed"; exit 1; }
"$vg" --error-exitcode=9 --leak-check=full --errors-for-leak-kinds=definite \
  --suppressions="$(dirname "$0")/valgrind.supp" \
  --show-leak-kinds=definite -q "$exe" demo --out "$tmp/checked" > "$tmp/out" 2> "$tmp/vg"
rc=$?
if [ $rc -ne 0 ]; then
  echo "FAIL: valgrind reported errors or definite leaks (exit $rc)"
  grep -B2 -A14 -E "definitely lost|Invalid|uninitialised" "$tmp/vg" | head -80
  exit 1
fi
[ -s "$tmp/checked/report.html" ] || { echo "FAIL: no report"; exit 1; }
echo "demo under valgrind: no errors, no definite leaks"
