/* tests/visc/test_visc_uniqueness.c
 * One condition, one answer (issue 11), for the exact transition formulation: over 12
 * (section, Re) pairs from Re 1e4 to 1e6, thin cambered plates included, at two angles drawn
 * per pair from a fixed-seed generator, the result of a cold start at the angle, of a warm-started walk
 * up to the angle from 1.5 deg below and of a walk down from 1.5 deg above (0.5 deg steps) agree
 * to |dcl| <= 0.005 and |dcd| <= 1 % wherever two of them converge. (No point is flagged
 * bistable yet: the sweeps do not look for second states; a real second state would show here
 * as a disagreement and fail the test, which is what it should do until it is reported.)
 * The exact formulation does not converge everywhere yet (docs/theory/viscous.md): the test
 * also requires at least MIN_COMPARED compared angles, so that it cannot pass by converging
 * nothing (23 of 24 pair-angles had two or three converged paths on 2026-12-02 with the start
 * continued from a higher Reynolds number, 12 before it, all agreeing to round-off; the margin
 * of 2 absorbs a BLAS or CPU that lands a point either side).
 * About 95 s in a release build (label long: the sanitizer run leaves it out).
 * The banded default formulation does not have this property (bench/study_visc_uniqueness,
 * 3 deg walks: 34 of 44 angles disagree, up to 0.112 in cl and 32.5 % in cd).
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>

#define DEG (3.14159265358979323846 / 180.0)
#define DCL_MAX 0.005     /* issue 11 */
#define DCD_REL_MAX 0.01  /* issue 11 */
#define MIN_COMPARED 21


/* walk from a_start to a_end by 0.5 deg: a cold start first, then warm starts; 1 if the last
 * solve converged */
static int walk(ascr_visc_solver *v, double a_start, double a_end, ascr_visc_result *r)
{
  double step = a_end > a_start ? 0.5 : -0.5;
  int n = (int)lround(fabs(a_end - a_start) / 0.5);
  int have = 0;
  for (int k = 0; k <= n; k++) {
    double a = a_start + step * k;
    ascr_status st = ascr_visc_solver_solve(v, a * DEG, have, r, NULL);
    have = st == ASCR_OK;
  }
  return have && r->converged;
}

static void test_visc_exact_transition_gives_one_answer_per_condition(void **state)
{
  (void)state;
  const char *plate = ASCR_SOURCE_DIR "/airfoils/microprop-plate-t25-f45.dat";
  struct { const char *sec; double re; } pairs[] = {
    {"naca0012", 1e5}, {"naca0012", 1e6}, {"naca2412", 1e5}, {"naca2412", 2e5},
    {"naca4412", 6e4}, {"naca4412", 1e6}, {"naca6409", 5e4}, {"naca6409", 2e5},
    {plate, 2e4}, {plate, 6e4}, {"plate:t=3,f=5", 3e4}, {"plate:t=2,f=3", 1e4},
  };
  unsigned long seed = 20261202UL;
  size_t compared = 0, bad = 0;
  for (size_t ip = 0; ip < sizeof pairs / sizeof pairs[0]; ip++) {
    ascr_geom_section *raw = NULL, *s = NULL;
    ascr_errbuf e;
    if (ascr_geom_is_spec(pairs[ip].sec)) {
      assert_int_equal(ascr_geom_section_from_spec(pairs[ip].sec, &raw, &e), ASCR_OK);
    } else {
      assert_int_equal(ascr_geom_section_read(pairs[ip].sec, &raw, NULL, &e), ASCR_OK);
    }
    assert_int_equal(ascr_geom_section_repanel(raw, NULL, &s, &e), ASCR_OK);
    size_t n = ascr_geom_section_size(s);
    ascr_panel_solver *w = ascr_panel_solver_alloc(n);
    assert_int_equal(ascr_panel_solver_set(w, s, &e), ASCR_OK);
    ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
    ascr_visc_params p = ascr_visc_params_defaults();
    p.re = pairs[ip].re;
    p.exact_transition = 1;
    assert_int_equal(ascr_visc_solver_set(v, w, &p, &e), ASCR_OK);
    for (int ka = 0; ka < 2; ka++) {
      /* an angle in [0, 6) deg on a 0.1 deg grid from a linear congruential generator
       * (Numerical Recipes' constants) */
      seed = (1664525UL * seed + 1013904223UL) & 0xffffffffUL;
      double a = 0.1 * (double)(seed % 60UL);
      ascr_visc_result rc, ru, rd;
      int ok[3];
      ok[0] = ascr_visc_solver_solve(v, a * DEG, 0, &rc, NULL) == ASCR_OK;
      ok[1] = walk(v, a - 1.5, a, &ru);
      ok[2] = walk(v, a + 1.5, a, &rd);
      const ascr_visc_result *r[3] = {&rc, &ru, &rd};
      double dcl = 0.0, dcd = 0.0;
      int pairs_cmp = 0;
      for (int i = 0; i < 3; i++) {
        for (int j = i + 1; j < 3; j++) {
          if (!ok[i] || !ok[j]) continue;
          pairs_cmp++;
          dcl = fmax(dcl, fabs(r[i]->cl - r[j]->cl));
          dcd = fmax(dcd, fabs(r[i]->cd - r[j]->cd) / fmin(r[i]->cd, r[j]->cd));
        }
      }
      if (pairs_cmp > 0) {
        compared++;
        if (dcl > DCL_MAX || dcd > DCD_REL_MAX) bad++;
      }
      print_message("%-28.28s Re %8.0f alpha %4.1f: converged %d%d%d  dcl %.5f  dcd %.3f %%\n",
                    ascr_geom_section_name(s), p.re, a, ok[0], ok[1], ok[2], dcl, 100.0 * dcd);
    }
    ascr_visc_solver_free(v);
    ascr_panel_solver_free(w);
    ascr_geom_section_free(s);
    ascr_geom_section_free(raw);
  }
  print_message("compared %zu angles, %zu disagree\n", compared, bad);
  assert_int_equal(bad, 0);
  assert_true(compared >= MIN_COMPARED);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_visc_exact_transition_gives_one_answer_per_condition),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
