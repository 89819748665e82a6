#!/bin/bash
# Fuzz smoke: run a libFuzzer target for SECONDS on a scratch corpus seeded from SEEDS; fails if
# the fuzzer finds a crash, leak, timeout or sanitizer report (non-zero exit).
# usage: run_smoke.sh TARGET SEEDS SECONDS [FUZZER OPTION...]
set -u
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
mkdir -p "$tmp/corpus"
cd "$tmp" || exit 1
"$1" -max_total_time="$3" -rss_limit_mb=2048 -timeout=20 -print_final_stats=1 "${@:4}" "$tmp/corpus" "$2" \
  > "$tmp/log" 2>&1 < /dev/null
rc=$?
tail -20 "$tmp/log"
exit $rc
