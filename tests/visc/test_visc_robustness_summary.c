/* tests/visc/test_visc_robustness_summary.c
 * The converged share of the robustness grid, from the files the test_visc_robustness parts
 * wrote (CTest fixture: the parts run first). Required: 98 % of the 1125 points (issue 11's
 * target at Re >= 30k; issue 3 asked for 95 %). Measured 2026-12-03: 1106 points (98.3 %; the
 * figures per section and Re are in docs/theory/viscous.md, "Two defects of the Newton step").
 */
#include "ascr_test.h"
#include "robustness_grid.h"

#include <stdio.h>

#define REQ_SHARE 0.98 /* issue 11 */

static void test_visc_robustness_share(void **state)
{
  (void)state;
  const robust_grid *g = robust_grid_find("main");
  size_t points = 0, converged = 0;
  for (size_t k = 0; k < g->n_sections; k++) {
    char path[64];
    snprintf(path, sizeof path, "robustness-%s-%zu.txt", g->name, k);
    FILE *fp = fopen(path, "r");
    if (fp == NULL) fail_msg("%s missing: the test_visc_robustness parts did not run", path);
    double re;
    size_t np, nc, lines = 0;
    while (fscanf(fp, "%lf %zu %zu", &re, &np, &nc) == 3) {
      lines++;
      assert_true(nc <= np);
      assert_int_equal(np, robust_grid_points(g));
      points += np;
      converged += nc;
    }
    fclose(fp);
    assert_int_equal(lines, g->n_re);
  }
  double share = (double)converged / (double)points;
  print_message("robustness grid: %zu of %zu points converged (%.1f %%; required %.0f %%)\n",
                converged, points, 100.0 * share, 100.0 * REQ_SHARE);
  assert_int_equal(points, 1125);
  assert_true(share >= REQ_SHARE);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_visc_robustness_share),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
