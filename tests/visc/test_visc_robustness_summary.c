/* tests/visc/test_visc_robustness_summary.c
 * The converged share of the robustness grids, from the files the test_visc_robustness parts
 * wrote (CTest fixtures: the parts run first), per band of Reynolds numbers against issue 11's
 * targets (robustness_grid.h): the main grid 98 % at Re >= 30k (issue 3 asked for 95 %), the
 * low-Reynolds-number grid of thin plates 95 % at Re 10k-20k and 85 % at 5k. The share of every
 * Reynolds number is printed. Measured 2026-12-05: main 1109 of 1125 (98.6 %), low-Re 613 of
 * 615 (10k-20k: 410 of 410; 5k: 203 of 205).
 */
#include "ascr_test.h"
#include "robustness_grid.h"

#include <stdio.h>

static void check_grid(const char *name)
{
  const robust_grid *g = robust_grid_find(name);
  assert_non_null(g);
  size_t points = 0, bp[2] = {0, 0}, bc[2] = {0, 0};
  size_t rp[5] = {0}, rc[5] = {0};
  for (size_t k = 0; k < g->n_sections; k++) {
    char path[64];
    snprintf(path, sizeof path, "robustness-%s-%zu.txt", g->name, k);
    FILE *fp = fopen(path, "r");
    if (fp == NULL) fail_msg("%s missing: the test_visc_robustness parts did not run", path);
    double re;
    size_t np, nc, lines = 0;
    while (fscanf(fp, "%lf %zu %zu", &re, &np, &nc) == 3) {
      assert_true(lines < g->n_re);
      assert_true(re == g->re[lines]);
      assert_true(nc <= np);
      assert_int_equal(np, robust_grid_points(g));
      rp[lines] += np;
      rc[lines] += nc;
      points += np;
      for (size_t b = 0; b < g->n_bands; b++) {
        if (re >= g->bands[b].re_lo && re <= g->bands[b].re_hi) {
          bp[b] += np;
          bc[b] += nc;
        }
      }
      lines++;
    }
    fclose(fp);
    assert_int_equal(lines, g->n_re);
  }
  assert_int_equal(points, g->n_points);
  for (size_t i = 0; i < g->n_re; i++) {
    print_message("robustness grid %s, Re %7.0f: %zu of %zu converged (%.1f %%)\n", g->name,
                  g->re[i], rc[i], rp[i], 100.0 * (double)rc[i] / (double)rp[i]);
  }
  for (size_t b = 0; b < g->n_bands; b++) {
    double share = (double)bc[b] / (double)bp[b];
    print_message("robustness grid %s, Re %.0f-%.0f: %zu of %zu points converged (%.1f %%; "
                  "required %.0f %%)\n", g->name, g->bands[b].re_lo, g->bands[b].re_hi, bc[b],
                  bp[b], 100.0 * share, 100.0 * g->bands[b].share);
    assert_true(bp[b] > 0);
    assert_true(share >= g->bands[b].share);
  }
}

static void test_visc_robustness_share_main(void **state)
{
  (void)state;
  check_grid("main");
}

static void test_visc_robustness_share_low_reynolds(void **state)
{
  (void)state;
  check_grid("lowre");
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_visc_robustness_share_main),
    cmocka_unit_test(test_visc_robustness_share_low_reynolds),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
