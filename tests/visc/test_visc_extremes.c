/* tests/visc/test_visc_extremes.c
 * The viscous solver at the edges of its use: angles from -25 to 30 deg, Reynolds numbers 5e3
 * and 5e6, a 1 %-thick plate and a section with a 2 % blunt trailing edge, and a 30,000-point
 * coordinate file. Nothing may crash; every point is flagged converged or not; a converged
 * point has finite numbers (cd > 0); the iteration limit bounds the work (iterations <= limit).
 * No published data: these are behaviour checks (issue: hardening).
 */
#include "ascr_test.h"
#include "airscrew/airscrew.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846

static void sweep_section(const char *spec)
{
  ascr_geom_section *raw = NULL, *s = NULL;
  ascr_errbuf err;
  if (ascr_geom_section_from_spec(spec, &raw, &err) != ASCR_OK) fail_msg("%s: %s", spec, err.msg);
  assert_int_equal(ascr_geom_section_repanel(raw, NULL, &s, &err), ASCR_OK);
  size_t n = ascr_geom_section_size(s);
  ascr_panel_solver *ps = ascr_panel_solver_alloc(n);
  ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
  assert_non_null(ps);
  assert_non_null(v);
  assert_int_equal(ascr_panel_solver_set(ps, s, &err), ASCR_OK);
  const double res[2] = {5e3, 5e6};
  const double alphas[6] = {-25.0, -10.0, 0.0, 10.0, 20.0, 30.0};
  for (int ir = 0; ir < 2; ir++) {
    ascr_visc_params vp = ascr_visc_params_defaults();
    vp.re = res[ir];
    assert_int_equal(ascr_visc_solver_set(v, ps, &vp, &err), ASCR_OK);
    int nconv = 0;
    for (int ia = 0; ia < 6; ia++) {
      ascr_visc_result r;
      memset(&r, 0, sizeof r);
      ascr_status st = ascr_visc_solver_solve(v, alphas[ia] * PI / 180.0, 0, &r, &err);
      /* a flagged outcome, never anything else */
      assert_true(st == ASCR_OK || st == ASCR_EMAXITER || st == ASCR_ESING || st == ASCR_EGEOM);
      /* the work of a fresh solve is bounded by its starts (src/visc/solver.c): the two marched
       * starts (L and 2L, L = max_iter), the same with the provisional trip and the warm solve
       * after it (4L), both marched starts at 2 and 4 times Re (6L) and at most 36 continuation
       * steps back down (ln 4 in steps of at least ln 2 / 16, and four halvings), L each: 49L;
       * then the same again from the lower turbulent Re_theta floor, each of the two groups
       * followed by at most 19 steps of the floor's continuation (16 of 1/16 and three
       * halvings): 49L + 38L. 136L in all */
      assert_true(r.iterations <= 136 * vp.max_iter);
      if (st == ASCR_OK) {
        assert_true(r.converged);
        assert_true(isfinite(r.cl) && isfinite(r.cm) && isfinite(r.cd) && r.cd > 0.0);
        assert_true(r.residual <= vp.tol);
        nconv++;
      } else {
        assert_false(r.converged);
      }
    }
    print_message("%s Re %g: %d of 6 angles converged (cold starts)\n", spec, res[ir], nconv);
  }
  ascr_visc_solver_free(v);
  ascr_panel_solver_free(ps);
  ascr_geom_section_free(s);
  ascr_geom_section_free(raw);
}

static void test_extreme_sweeps(void **state)
{
  (void)state;
  sweep_section("plate:t=1,f=3");
  sweep_section("plate:t=3,f=2,te=2");
  sweep_section("naca4412");
}

/* 30,000 points (NACA 0012 from its thickness formula, Abbott & von Doenhoff eq. 6.2, written
 * here as a coordinate file): read, repanelled to 160 panels, analysed inviscidly. */
static void test_huge_coordinate_file(void **state)
{
  (void)state;
  size_t m = 15000;
  char *text = malloc(64 * 2 * m + 64);
  assert_non_null(text);
  size_t len = (size_t)sprintf(text, "NACA 0012, 30000 points\n");
  for (size_t i = 0; i < 2 * m; i++) {
    int upper = i < m;
    size_t j = upper ? m - 1 - i : i - m + 1;
    double b = PI * (double)j / (double)(m - 1);
    double x = 0.5 * (1.0 - cos(b));
    double yt = 0.6 * (0.2969 * sqrt(x) - 0.1260 * x - 0.3516 * x * x + 0.2843 * x * x * x -
                       0.1015 * x * x * x * x);
    if (!upper && j == 0) continue; /* one leading-edge point */
    len += (size_t)sprintf(text + len, "%.9f %.9f\n", x, upper ? yt : -yt);
  }
  ascr_geom_section *s = NULL, *r = NULL;
  ascr_errbuf err;
  if (ascr_geom_section_parse(text, len, "huge.dat", &s, NULL, &err) != ASCR_OK) {
    fail_msg("%s", err.msg);
  }
  assert_true(ascr_geom_section_size(s) >= 29000);
  assert_int_equal(ascr_geom_section_repanel(s, NULL, &r, &err), ASCR_OK);
  ascr_panel_solver *ps = ascr_panel_solver_alloc(ascr_geom_section_size(r));
  assert_int_equal(ascr_panel_solver_set(ps, r, &err), ASCR_OK);
  ascr_panel_result pr;
  assert_int_equal(ascr_panel_solver_solve(ps, 4.0 * PI / 180.0, 0.0, &pr, NULL, NULL, &err), ASCR_OK);
  /* thin-airfoil slope with the thickness correction (about 1.1 x 2 pi for 12 %): cl(4 deg)
   * near 0.48 - a sanity check that the huge file was read as the right shape */
  ascr_assert_close(pr.cl, 0.48, 0.05, 0.0, "NACA 0012 from 30k points, cl at 4 deg");
  ascr_panel_solver_free(ps);
  ascr_geom_section_free(r);
  ascr_geom_section_free(s);
  free(text);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_extreme_sweeps),
      cmocka_unit_test(test_huge_coordinate_file),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
