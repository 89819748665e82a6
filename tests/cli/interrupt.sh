#!/bin/sh
# An interrupted run leaves no partial output and no temporaries: a long polar sweep with -o and
# a cold rotor run (computing its section tables into a fresh cache) are stopped with SIGINT and
# SIGTERM part-way; the exit status is 128 + signal and the folders hold nothing new.
# usage: interrupt.sh AIRSCREW SOURCE_DIR
set -u
exe=$1; src=$2
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
fail=0
"$exe" polar naca4412 --re 3e4,6e4,1e5 --alpha -8:16:0.5 -o "$tmp/polar.csv" 2>/dev/null &
pid=$!
sleep 1
kill -INT $pid
wait $pid
rc=$?
[ $rc = 130 ] || { echo "FAIL: polar after SIGINT exited $rc (want 130)"; fail=1; }
AIRSCREW_CACHE_DIR="$tmp/cache" "$exe" rotor "$src/docs/examples/inspection-3in.json" \
  --rpm 12000:26000:2000 --speed 0,6 --json -o "$tmp/rotor.json" 2>/dev/null &
pid=$!
sleep 2
kill -TERM $pid
wait $pid
rc=$?
[ $rc = 143 ] || { echo "FAIL: rotor after SIGTERM exited $rc (want 143)"; fail=1; }
left=$(find "$tmp" -type f | wc -l)
if [ "$left" != 0 ]; then echo "FAIL: files left behind:"; find "$tmp" -type f; fail=1; fi
[ $fail = 0 ] && echo "interrupted runs left no files"
exit $fail
