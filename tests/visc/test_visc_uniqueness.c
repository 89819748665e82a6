/* tests/visc/test_visc_uniqueness.c
 * One condition, one answer (issue 11), for the exact transition formulation: over 12
 * (section, Re) pairs from Re 1e4 to 1e6, thin cambered plates included, at two angles drawn
 * per pair from a fixed-seed generator, the result of a cold start at the angle, of a warm-started walk
 * up to the angle from 1.5 deg below and of a walk down from 1.5 deg above (0.5 deg steps) agree
 * to |dcl| <= 0.005 and |dcd| <= 1 % wherever two of them converge, except where the physics
 * has two states: a disagreement passes only if a polar sweep over the walks' range (which
 * reaches each angle from both sides, src/polar/sweep.c) flags the angle bistable and every
 * path's result is one of the sweep's two states (so a second state must be reported, and
 * must be the one the paths found). Measured 2026-12-03 with the secant predictor: plate
 * t=3 %, f=5 % at Re 3e4, 4.1 deg: cl 0.7879 (cold) and 0.5439 (walk from below: transition
 * at 0.92 chord behind an open laminar separation), both reported by the sweep.
 * The exact formulation does not converge everywhere yet (docs/theory/viscous.md): the test
 * also requires at least MIN_COMPARED compared angles, so that it cannot pass by converging
 * nothing (23 of 24 pair-angles had two or three converged paths on 2026-12-02 with the start
 * continued from a higher Reynolds number, 12 before it, all agreeing to round-off; the margin
 * of 2 absorbs a BLAS or CPU that lands a point either side).
 * A second test: past stall (NACA 0012, Re 1e6, 16 deg) a fresh start alone reaches the state
 * the sweep reports.
 * About 95 s in a release build (label long: the sanitizer run leaves it out).
 * The earlier banded transition rules did not have this property (bench/study_visc_uniqueness,
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

static int same_state(double cl1, double cd1, double cl2, double cd2)
{
  return fabs(cl1 - cl2) <= DCL_MAX && fabs(cd1 - cd2) <= DCD_REL_MAX * fmin(cd1, cd2);
}

/* A disagreement of the paths at angle a is real bistability if the polar sweep over
 * a - 1.5 .. a + 1.5 deg flags a bistable and each converged path found one of its states. */
static int explained_by_sweep(ascr_visc_solver *v, double a, const int ok[3],
                              const ascr_visc_result *const r[3])
{
  ascr_polar_point pts[7];
  ascr_polar_summary sum;
  if (ascr_polar_sweep(v, a - 1.5, a + 1.5, 0.5, pts, &sum, NULL, NULL, NULL) != ASCR_OK) return 0;
  const ascr_polar_point *q = &pts[3];
  if (!q->converged || !q->bistable) return 0;
  for (int i = 0; i < 3; i++) {
    if (!ok[i]) continue;
    if (!same_state(r[i]->cl, r[i]->cd, q->cl, q->cd) &&
        !same_state(r[i]->cl, r[i]->cd, q->other_cl, q->other_cd)) {
      return 0;
    }
  }
  return 1;
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
  size_t compared = 0, bad = 0, n_bistable = 0;
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
      const char *why = "";
      if (pairs_cmp > 0) {
        compared++;
        if (dcl > DCL_MAX || dcd > DCD_REL_MAX) {
          if (explained_by_sweep(v, a, ok, r)) {
            n_bistable++;
            why = "  (bistable, both states reported by the sweep)";
          } else {
            bad++;
          }
        }
      }
      print_message("%-28.28s Re %8.0f alpha %4.1f: converged %d%d%d  dcl %.5f  dcd %.3f %%%s\n",
                    ascr_geom_section_name(s), p.re, a, ok[0], ok[1], ok[2], dcl, 100.0 * dcd,
                    why);
    }
    ascr_visc_solver_free(v);
    ascr_panel_solver_free(w);
    ascr_geom_section_free(s);
    ascr_geom_section_free(raw);
  }
  print_message("compared %zu angles, %zu disagree, %zu bistable (reported)\n", compared, bad,
                n_bistable);
  assert_int_equal(bad, 0);
  assert_true(compared >= MIN_COMPARED);
}

/* Past stall a fresh start alone reaches the state the sweep reports (NACA 0012, Re 1e6,
 * 16 deg: every marched start failed there until the start through a provisional trip,
 * src/visc/solver.c; measured 2026-12-04: both give cl 1.2641, cd 0.05620). A behaviour check
 * of one condition, one answer; no published data. */
static void test_visc_fresh_start_past_stall_agrees_with_sweep(void **state)
{
  (void)state;
  ascr_geom_section *raw = NULL, *s = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &raw, NULL), ASCR_OK);
  assert_int_equal(ascr_geom_section_repanel(raw, NULL, &s, NULL), ASCR_OK);
  size_t n = ascr_geom_section_size(s);
  ascr_panel_solver *w = ascr_panel_solver_alloc(n);
  assert_int_equal(ascr_panel_solver_set(w, s, NULL), ASCR_OK);
  ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = 1e6;
  assert_int_equal(ascr_visc_solver_set(v, w, &p, NULL), ASCR_OK);
  ascr_polar_point pts[7];
  ascr_polar_summary sum;
  assert_int_equal(ascr_polar_sweep(v, 13.0, 16.0, 0.5, pts, &sum, NULL, NULL, NULL), ASCR_OK);
  assert_true(pts[6].converged);
  ascr_visc_result r;
  assert_int_equal(ascr_visc_solver_set(v, w, &p, NULL), ASCR_OK); /* forgets the sweep */
  assert_int_equal(ascr_visc_solver_solve(v, 16.0 * DEG, 0, &r, NULL), ASCR_OK);
  print_message("NACA 0012, Re 1e6, 16 deg: sweep cl %.4f cd %.5f, fresh start cl %.4f cd %.5f\n",
                pts[6].cl, pts[6].cd, r.cl, r.cd);
  assert_true(fabs(r.cl - pts[6].cl) <= DCL_MAX);
  assert_true(fabs(r.cd - pts[6].cd) <= DCD_REL_MAX * fmin(r.cd, pts[6].cd));
  ascr_visc_solver_free(v);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  ascr_geom_section_free(raw);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_visc_exact_transition_gives_one_answer_per_condition),
    cmocka_unit_test(test_visc_fresh_start_past_stall_agrees_with_sweep),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
