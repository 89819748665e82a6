#!/bin/sh
# The API reference builds from the public headers without a warning.
# usage: run_api_docs.sh DOXYGEN DOXYFILE OUTDIR
set -u
rm -rf "$3" && mkdir -p "$3" || exit 1
"$1" "$2" > "$3/stdout.log" 2>&1 || { echo "FAIL: doxygen exited non-zero"; cat "$3/stdout.log"; exit 1; }
[ -s "$3/html/index.html" ] || { echo "FAIL: no html/index.html"; exit 1; }
grep -q "ascr_rotor_bemt" "$3/html/"*.html || { echo "FAIL: the rotor API is missing"; exit 1; }
if [ -s "$3/warnings.log" ]; then echo "FAIL: doxygen warnings:"; head -20 "$3/warnings.log"; exit 1; fi
echo "API reference: $(ls "$3/html" | wc -l) files, no warnings"
