#!/bin/sh
# The validation report is generated from the validation tests: every comparison table present.
# With DATA_DIR, the rows the CTest run of the validation tests wrote there (fixture: they ran
# and passed before this test) instead of running them again.
# usage: run_validation_report.sh SOURCE_DIR BUILD_DIR [DATA_DIR]
set -u
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
sh "$1/tools/validation-report.sh" "$2" "$tmp/report" ${3:-} || { echo "FAIL: report script failed"; exit 1; }
md="$tmp/report/validation.md"
fail=0
for t in closed_form_hover da4002_9in_5000rpm naca0012_re6e6_smooth naca0012_re6e6_tripped \
         naca0012_lift_slope sd7003_re1e5 uiuc_sd7003 uiuc_sd8000 uiuc_clarky; do
  grep -q "^## $t\$" "$md" || { echo "FAIL: table $t missing"; fail=1; }
done
# every comparison with a curve has its figure, linked from the page
for t in closed_form_hover da4002_9in_5000rpm naca0012_re6e6_smooth naca0012_re6e6_tripped sd7003_re1e5; do
  [ -s "$tmp/report/figures/$t.svg" ] && [ -s "$tmp/report/figures/$t.png" ] || { echo "FAIL: figure $t missing"; fail=1; }
  grep -q "(figures/$t.svg)" "$md" || { echo "FAIL: figure $t not linked"; fail=1; }
done
grep -q "FAILED" "$md" && { echo "FAIL: a validation test failed"; fail=1; }
[ $fail = 0 ] && echo "validation report complete: $(grep -c '^## ' "$md") tables"
exit $fail
