#!/bin/sh
# The demo's report renders in a browser: run "airscrew demo" into a fresh folder (with a cache
# of its own), check its outputs, open report.html in headless Chromium and take a screenshot.
# With CACHE_DIR the cache is made there afresh and kept (the valgrind test reads it, so the
# demo's polars are computed once per test run).
# usage: render_report.sh AIRSCREW CHROMIUM [CACHE_DIR]
set -u
exe=$1; browser=$2
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
AIRSCREW_CACHE_DIR="$tmp/cache"
if [ $# -ge 3 ]; then rm -rf "$3" && AIRSCREW_CACHE_DIR=$3; fi
export AIRSCREW_CACHE_DIR
if ! "$exe" demo --out "$tmp/demo" > "$tmp/out" 2> "$tmp/err"; then
  echo "FAIL: airscrew demo exited non-zero"; cat "$tmp/err"; exit 1
fi
fail=0
for f in blade.json polars.csv rotor-map.csv hover.json report.html rotor-map.svg rotor-map.png \
         hover-spanwise.svg hover-spanwise.png polars-blade.svg polars-blade.png powertrain.json \
         drive-map.csv drive.svg drive.png design-blade.json design.svg design.png \
         material.json structure.svg structure.png prop.stl; do
  if [ ! -s "$tmp/demo/$f" ]; then echo "FAIL: $f missing or empty"; fail=1; fi
done
grep -q "outputs in" "$tmp/out" || { echo "FAIL: no output listing"; fail=1; }
grep -q "guarded thrust stand" "$tmp/demo/report.html" || { echo "FAIL: report lacks the cautions"; fail=1; }
grep -q "<h2>Powertrain</h2>" "$tmp/demo/report.html" || { echo "FAIL: report lacks the powertrain section"; fail=1; }
grep -q "powertrain: hover at" "$tmp/out" || { echo "FAIL: no powertrain summary"; fail=1; }
grep -q "<h2>Designed blade</h2>" "$tmp/demo/report.html" || { echo "FAIL: report lacks the designed blade"; fail=1; }
grep -q "<h2>Structure</h2>" "$tmp/demo/report.html" || { echo "FAIL: report lacks the structure section"; fail=1; }
# the structure command on the demo's blade and material gives the report's mass (3 digits)
m_rep=$(grep -o "[0-9.]*&nbsp;g a blade" "$tmp/demo/report.html" | head -1 | sed 's/&nbsp;.*//')
m_cmd=$("$exe" structure "$tmp/demo/blade.json" "$tmp/demo/material.json" --rpm 13000 2>/dev/null |
        sed -n 's/^mass *\([0-9.]*\) g.*/\1/p')
[ -n "$m_rep" ] && [ "$m_rep" = "$m_cmd" ] || { echo "FAIL: structure mass $m_cmd differs from the report's $m_rep"; fail=1; }
# the demo's material is the example file's tough resin (the same values; ASCR_SOURCE_DIR set by
# CTest)
if [ -n "${ASCR_SOURCE_DIR:-}" ]; then
  vals() { tr -d ' \n' < "$1" | grep -o '"[A-Za-z_0-9]*":{"value":[^,}]*' | sed 's/{"value"://'; }
  if [ "$(vals "$tmp/demo/material.json")" != "$(vals "$ASCR_SOURCE_DIR/docs/examples/materials/sla-resin-tough.json")" ]; then
    echo "FAIL: the demo's material differs from docs/examples/materials/sla-resin-tough.json"; fail=1
  fi
fi
# the designed blade file is a blade file the rotor command reads
"$exe" rotor "$tmp/demo/design-blade.json" --rpm 13600 > /dev/null 2>&1 ||
  { echo "FAIL: rotor cannot use design-blade.json"; fail=1; }
# the demo's title once over both streams (issue 17: it was printed as progress and as summary)
n_title=$(cat "$tmp/out" "$tmp/err" | grep -c "three-blade prop")
[ "$n_title" = 1 ] || { echo "FAIL: the demo's title appears $n_title times in its output"; fail=1; }
grep -q "<svg" "$tmp/demo/report.html" || { echo "FAIL: report has no inline figures"; fail=1; }
# a hover point gives the thrust it was searched for, or none (issue 13: the vortex search closed
# its bracket on a jump of the thrust and reported 10,870 rpm with 0.214 N for 0.343 N)
target=$(grep -o '"thrust_per_rotor_N": *[^,}]*' "$tmp/demo/hover.json" | sed 's/.*: *//')
for t in $(grep -o '"thrust_N": *[^,}]*' "$tmp/demo/hover.json" | sed 's/.*: *//'); do
  [ "$t" = null ] && continue
  awk -v t="$t" -v g="$target" 'BEGIN { d = t - g; if (d < 0) d = -d; exit !(d <= 1e-3 * g) }' ||
    { echo "FAIL: a hover point reports $t N for a target of $target N"; fail=1; }
done
# every element id once in the page (issue 17: the inline figures repeated the plotting library's
# glyph ids, and a browser drew every figure after the first with the first one's glyphs), and
# every reference to an id names one that exists
n_dup=$(grep -o ' id="[^"]*"' "$tmp/demo/report.html" | sort | uniq -d | wc -l)
[ "$n_dup" = 0 ] || { echo "FAIL: $n_dup element ids repeated in report.html"; fail=1; }
grep -o ' id="[^"]*"' "$tmp/demo/report.html" | sed 's/ id="\(.*\)"/\1/' | sort -u > "$tmp/ids"
grep -o 'href="#[^"]*"' "$tmp/demo/report.html" | sed 's/href="#\(.*\)"/\1/' | sort -u > "$tmp/refs"
n_dangling=$(comm -13 "$tmp/ids" "$tmp/refs" | wc -l)
[ "$n_dangling" = 0 ] || { echo "FAIL: $n_dangling references to missing ids in report.html"; fail=1; }
# each figure drawn with its own glyphs, as the browser resolves them (the first element with an
# id wins): every reference of an inline figure resolves into that figure, and every figure
# draws text (figure_refs.awk); the check fails on a copy whose second figure's glyph ids are
# renamed to the first's (the defect issue 17 found)
here=$(dirname "$0")
awk -f "$here/figure_refs.awk" "$tmp/demo/report.html" > "$tmp/refs.log" ||
  { echo "FAIL: figures resolve glyphs outside themselves:"; cat "$tmp/refs.log"; fail=1; }
sed 's/f1-glyph/f0-glyph/g' "$tmp/demo/report.html" > "$tmp/collide.html"
if awk -f "$here/figure_refs.awk" "$tmp/collide.html" > /dev/null; then
  echo "FAIL: the figure check does not see colliding glyph ids"; fail=1
fi
# a second run into the same folder is refused without --force and leaves it as it was
before=$(cksum < "$tmp/demo/report.html")
if "$exe" demo --out "$tmp/demo" > /dev/null 2>&1; then echo "FAIL: demo overwrote its folder"; fail=1; fi
[ "$(cksum < "$tmp/demo/report.html")" = "$before" ] || { echo "FAIL: report changed"; fail=1; }
# headless render; Chromium's own noise on stderr is kept for the log only
"$browser" --headless --no-sandbox --disable-gpu --hide-scrollbars --window-size=1200,3000 \
  --screenshot="$tmp/shot.png" "file://$tmp/demo/report.html" > "$tmp/chromium.log" 2>&1
rc=$?
if [ $rc -ne 0 ]; then echo "FAIL: chromium exited $rc"; cat "$tmp/chromium.log"; fail=1; fi
size=$(wc -c < "$tmp/shot.png" 2>/dev/null || echo 0)
if [ "$size" -lt 20000 ]; then echo "FAIL: screenshot missing or too small ($size bytes)"; fail=1; fi
[ $fail = 0 ] && echo "report rendered: screenshot $size bytes"
exit $fail
