#!/bin/sh
# Table-driven command-line tests: tests/cli/cases.txt lists exit code | stderr fragment | args.
# usage: run_cases.sh AIRSCREW CASES SOURCE_DIR
set -u
exe=$1; cases=$2; src=$3
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
# computed section tables go to a cache of this run, never the user's
AIRSCREW_CACHE_DIR="$tmp/cache"; export AIRSCREW_CACHE_DIR
printf '\000\001\002binary' > "$tmp/binary.dat"
: > "$tmp/empty.dat"
echo "keep me" > "$tmp/existing.dat"
# output safety (issue 17): links are refused, devices written to, a replaced file keeps its mode
echo "link target" > "$tmp/target.dat"
ln -s "$tmp/target.dat" "$tmp/link.dat"
ln -s "$tmp/nowhere.dat" "$tmp/dangling.dat"
echo "old" > "$tmp/mode640.dat"
chmod 640 "$tmp/mode640.dat"
# figure sets (issue 17): every file of a set is checked, a link among them is refused
mkdir -p "$tmp/figset" "$tmp/figlink"
echo "keep" > "$tmp/figset/rotor-spanwise.png"
ln -s "$tmp/target.dat" "$tmp/figlink/polar.png"
# cache (issue 17): clear removes the temporaries of killed runs, not foreign files
mkdir -p "$tmp/cleft"
: > "$tmp/cleft/.airscrew-tmp-AbC123"; : > "$tmp/cleft/0123456789abcdef.json.tmp-XyZ123"
: > "$tmp/cleft/0123456789abcdef.json"; echo mine > "$tmp/cleft/notes.txt"
# plot's result readers (issue 17): a size limit while reading, regular files, field types
truncate -s 65M "$tmp/big.json"
printf '{"polars":[{"re":1e5,"points":[{"alpha_deg":0,"cl":"abc","cd":0.01,"cm":0}]}]}\n' > "$tmp/badtype.json"
# a blade file cut short, a blade in an unknown unit, and a 5 MiB "blade file"
head -c 200 "$src/docs/examples/inspection-3in.json" > "$tmp/truncated.json"
sed 's/"mm"/"furlong"/' "$src/docs/examples/inspection-3in.json" > "$tmp/unit.json"
head -c 5300000 /dev/zero | tr '\000' ' ' > "$tmp/huge.json"
# result CSV files that the plot command must refuse, each with its line
printf '# section: x\nre,alpha_deg,cl,cd,cm,converged\n1e5,0,0.1,0.01,0,true\n1e5,1,0.2,abc,0,true\n' > "$tmp/badnum.csv"
printf 're,alpha_deg,cl,cd,cm\n1e5,0,0.1,0.01,0\n\n1e5,1,0.2\n' > "$tmp/ragged.csv"
printf '\357\273\277re,alpha_deg,cl,cd,cm,converged\n1e5,0,0.1,0.01,0,true\n1e5,1,0.2,0.011,0,true\n' > "$tmp/bom.csv"
printf 're,alpha_deg,cl,cd,cm,converged\n1e5,0,0.1,0.01,0,true\n1e5,1,0.2,inf,0,true\n' > "$tmp/inf.csv"
printf 'time,voltage\n0,1\n' > "$tmp/foreign.csv"
printf 'rpm,speed_m_s,J,CT,CP,efficiency,thrust_N,power_W,converged\n5000,0,0,0.1,0.05,,1,2,maybe\n' > "$tmp/badconv.csv"
printf 're,alpha_deg,cl,cd,cm\n1e5,"0,0.1,0.01,0\n' > "$tmp/quote.csv"
printf 'rpm,speed_m_s,J,CT,CP,efficiency,power_W\n5000,0,0,0.1,0.05,,2\n' > "$tmp/nothrust.csv"
pass=0; fail=0
while IFS= read -r line; do
  case "$line" in ''|'#'*) continue ;; esac
  want=$(printf '%s' "$line" | cut -d'|' -f1 | tr -d ' ')
  frag=$(printf '%s' "$line" | cut -d'|' -f2 | sed 's/^ *//;s/ *$//')
  args=$(printf '%s' "$line" | cut -d'|' -f3- | sed 's/^ *//')
  args=$(printf '%s' "$args" | sed "s#@DATA@#$src/tests/data#g;s#@SRC@#$src#g;s#@TMP@#$tmp#g")
  # shellcheck disable=SC2086
  "$exe" $args > "$tmp/out" 2> "$tmp/err"
  got=$?
  ok=1
  [ "$got" = "$want" ] || ok=0
  if [ -n "$frag" ]; then
    grep -qF -- "$frag" "$tmp/err" || ok=0
  elif [ "$want" = 0 ] && [ -s "$tmp/err" ]; then
    ok=0
  fi
  # a failed run writes nothing on stdout
  if [ "$want" != 0 ] && [ -s "$tmp/out" ]; then ok=0; fi
  if [ $ok = 1 ]; then
    pass=$((pass + 1))
  else
    fail=$((fail + 1))
    echo "FAIL: airscrew $args"
    echo "  exit $got (want $want); stderr: $(head -c 400 "$tmp/err")"
  fi
done < "$cases"
# the file that was refused is untouched
if ! grep -q "keep me" "$tmp/existing.dat" 2>/dev/null && [ ! -s "$tmp/existing.dat" ]; then
  echo "FAIL: existing output file damaged"; fail=$((fail + 1))
fi
# links and their targets untouched, /dev/null still a device, the replaced file's mode kept
if [ ! -L "$tmp/link.dat" ] || [ "$(cat "$tmp/target.dat")" != "link target" ]; then
  echo "FAIL: symbolic link or its target replaced"; fail=$((fail + 1))
fi
if [ ! -L "$tmp/dangling.dat" ] || [ -e "$tmp/nowhere.dat" ]; then
  echo "FAIL: dangling link replaced or followed"; fail=$((fail + 1))
fi
if [ "$(cat "$tmp/figset/rotor-spanwise.png")" != keep ] || [ ! -L "$tmp/figlink/polar.png" ]; then
  echo "FAIL: a figure file or link was replaced"; fail=$((fail + 1))
fi
if [ "$(ls -A "$tmp/cleft")" != notes.txt ]; then
  echo "FAIL: cache clear left: $(ls -A "$tmp/cleft" | tr '\n' ' ')"; fail=$((fail + 1))
fi
# an unwritable cache folder: one warning, no error lines, exit 0
"$exe" rotor "$src/tests/data/blades/two-blade-4412.json" --rpm 7000 --cache-dir /sys --panels 80 --table-alpha 0:6:1 > /dev/null 2> "$tmp/ro.err"
if [ $? != 0 ] || grep -q 'error:' "$tmp/ro.err" || [ "$(grep -c 'not writable' "$tmp/ro.err")" != 1 ]; then
  echo "FAIL: unwritable cache folder: $(cat "$tmp/ro.err")"; fail=$((fail + 1))
fi
if [ ! -c /dev/null ]; then echo "FAIL: /dev/null is no longer a device"; fail=$((fail + 1)); fi
# output names of 245-255 characters (issue 17: the temporary name outgrew the 255-character
# limit): written, and the folder holds no temporary afterwards
mkdir -p "$tmp/longnames"
for len in 245 250 255; do
  name=$(printf "%${len}s" | tr ' ' n)
  if ! "$exe" section naca0012 --points -o "$tmp/longnames/$name" > /dev/null 2>&1 || [ ! -s "$tmp/longnames/$name" ]; then
    echo "FAIL: an output name of $len characters was not written"; fail=$((fail + 1))
  fi
done
if [ "$(ls -A "$tmp/longnames" | wc -l)" != 3 ]; then
  echo "FAIL: long names left: $(ls -A "$tmp/longnames" | wc -l) files"; fail=$((fail + 1))
fi
if [ "$(stat -c %a "$tmp/mode640.dat")" != 640 ] || grep -q '^old$' "$tmp/mode640.dat"; then
  echo "FAIL: replaced file lost its mode 640 or was not replaced"; fail=$((fail + 1))
fi
# export wrote a binary STL of 84 + 50 n bytes and one coordinate file per blade station
if [ -f "$tmp/prop.stl" ]; then
  n=$(od -An -tu4 -j80 -N4 "$tmp/prop.stl" | tr -d ' ')
  [ "$(stat -c %s "$tmp/prop.stl")" = $((84 + 50 * n)) ] || { echo "FAIL: STL size does not match its count"; fail=$((fail + 1)); }
else
  echo "FAIL: export wrote no STL"; fail=$((fail + 1))
fi
[ -s "$tmp/stations/station-00.dat" ] || { echo "FAIL: export --sections wrote no station file"; fail=$((fail + 1)); }
[ -e "$tmp/x.stl" ] || [ -e "$tmp/x2.stl" ] && { echo "FAIL: a refused export left a file"; fail=$((fail + 1)); }
# runs refused for an output in a missing folder left nothing (whole or nothing, issue 17)
for f in wn-figs wn-t.json wn-figs2 wn-figs3 nodir; do
  if [ -e "$tmp/$f" ]; then echo "FAIL: a refused run left $f"; fail=$((fail + 1)); fi
done
# section says which panels the analyses use (issue 17: it showed 401 nodes, the analyses 160)
"$exe" section naca2412 > "$tmp/sec.out" 2>&1
grep -q "^nodes        401 (400 panels)" "$tmp/sec.out" && grep -q "respace it on 160 panels" "$tmp/sec.out" ||
  { echo "FAIL: section does not say which panels the analyses use"; fail=$((fail + 1)); }
# polar output leads with alpha, cl, cd, L/D, cm (issue 17), in the table and in CSV
"$exe" polar naca0012 --re 1e6 --alpha 0:2:2 > "$tmp/pt.out" 2>&1
"$exe" polar naca0012 --re 1e6 --alpha 0:2:2 --csv > "$tmp/pc.out" 2>&1
grep -Eq '^ +alpha +cl +cd +L/D +cm +trans_up +trans_lo +cdf +cdp$' "$tmp/pt.out" &&
  grep -q '^re,mach,ncrit,alpha_deg,cl,cd,ld,cm,x_transition_upper,x_transition_lower,cdf,cdp,converged,bistable$' "$tmp/pc.out" ||
  { echo "FAIL: polar columns not in the order alpha, cl, cd, L/D, cm, transition, drag split"; fail=$((fail + 1)); }
# "no transition" said one way in text outputs: none (issue 17: it was "-" here, "none" in flow)
"$exe" polar plate:t=3,f=4 --re 6e4 --alpha 3:4:1 > "$tmp/pn.out" 2>&1
grep -Eq '^ +3\.00 .* none ' "$tmp/pn.out" && ! grep -Eq ' - +[0-9]' "$tmp/pn.out" ||
  { echo "FAIL: polar table does not say none for laminar to the trailing edge"; fail=$((fail + 1)); }
# rotor notes give their totals and Re is a whole number everywhere (issue 17: "9 elements beyond
# ..." without "of 40"; Re as 7314, 1.107e+04 and 2e+04 in one output)
"$exe" rotor "$src/tests/data/blades/two-blade-4412.json" --rpm 3000 --speed 0 --polar-table main="$src/tests/data/naca4412-table.json" --stations > "$tmp/rn.out" 2>&1
grep -q "of 40 elements stalled" "$tmp/rn.out" && ! grep -Eq '[0-9]e\+0[0-9]' "$tmp/rn.out" ||
  { echo "FAIL: rotor notes without totals, or Re printed in e-notation"; fail=$((fail + 1)); }
# no temporary files left behind
if ls -a "$tmp" | grep -q '\.tmp-\|\.airscrew-tmp-'; then echo "FAIL: temporary file left behind"; fail=$((fail + 1)); fi
echo "$pass passed, $fail failed"
[ $fail = 0 ]
