/* tests/polar/test_polar_check_fresh.c
 * Second states a sweep does not reach are reported (issue 11: "real bistability is reported,
 * not hidden"). A fresh start at the angle can converge to a state that neither of the sweep's
 * walks reaches: on SD7003 at Re 1.016e5, 5.5-6 deg, the lower laminar layer separating at the
 * trailing edge, with less lift (docs/theory/viscous.md, sixteenth and seventeenth sessions).
 * ascr_polar_check_fresh must flag such points bistable with that state, keep the sweep's state
 * as the result, and flag nothing where there is one state (NACA 0012 at Re 1e6, attached).
 * Tolerances: issue 11's uniqueness tolerances, 0.005 in cl and 1 % in cd.
 *
 * Beside it, the data: the UIUC low-speed airfoil tests (reference/sd7003_uiuc_lsat_lift.csv,
 * run JG00170 at Re 1.022e5) have cl 0.758 at 5.93 deg and 0.787 at 6.22 deg, 0.765 at 6 deg by
 * linear interpolation; the second state (0.781) is the nearer of the two there, the sweep's
 * (0.815) 0.05 high. Checked below as a fact of this case, with the tunnel's spread between
 * neighbouring runs (about 0.01 in cl) as the margin.
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

static ascr_visc_solver *setup(const char *path_or_spec, double re, ascr_panel_solver **w,
                               ascr_geom_section **raw, ascr_geom_section **s)
{
  *raw = NULL;
  *s = NULL;
  if (ascr_geom_is_spec(path_or_spec)) {
    assert_int_equal(ascr_geom_section_from_spec(path_or_spec, raw, NULL), ASCR_OK);
  } else {
    assert_int_equal(ascr_geom_section_read(path_or_spec, raw, NULL, NULL), ASCR_OK);
  }
  assert_int_equal(ascr_geom_section_repanel(*raw, NULL, s, NULL), ASCR_OK);
  size_t n = ascr_geom_section_size(*s);
  *w = ascr_panel_solver_alloc(n);
  assert_int_equal(ascr_panel_solver_set(*w, *s, NULL), ASCR_OK);
  ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = re;
  assert_int_equal(ascr_visc_solver_set(v, *w, &p, NULL), ASCR_OK);
  return v;
}

static void teardown(ascr_visc_solver *v, ascr_panel_solver *w, ascr_geom_section *raw,
                     ascr_geom_section *s)
{
  ascr_visc_solver_free(v);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  ascr_geom_section_free(raw);
}

/* setup() for SD7003 from its UIUC coordinates in reference/ */
static ascr_visc_solver *setup_sd7003(double re, ascr_panel_solver **w, ascr_geom_section **raw,
                                      ascr_geom_section **s)
{
  char path[512];
  snprintf(path, sizeof path, "%s/sd7003_coords_uiuc.csv", ASCR_REFERENCE_DIR);
  return setup(path, re, w, raw, s);
}

static void test_check_fresh_flags_the_trailing_edge_state(void **state)
{
  (void)state;
  ascr_panel_solver *w;
  ascr_geom_section *raw, *s;
  ascr_visc_solver *v = setup_sd7003(101600.0, &w, &raw, &s);
  enum { NP = 4 };
  ascr_polar_point pts[NP], before[NP];
  ascr_polar_summary sum;
  assert_int_equal(ascr_polar_grid_size(5.0, 6.5, 0.5), NP);
  assert_int_equal(ascr_polar_sweep(v, 5.0, 6.5, 0.5, pts, &sum, NULL, NULL, NULL), ASCR_OK);
  memcpy(before, pts, sizeof pts);
  size_t found = 0;
  assert_int_equal(ascr_polar_check_fresh(v, pts, NP, &found, NULL), ASCR_OK);
  assert_true(found >= 1);
  const ascr_polar_point *p6 = &pts[2];
  assert_true(p6->alpha_deg == 6.0 && p6->converged);
  /* the sweep's state stays the result */
  for (int i = 0; i < NP; i++) {
    assert_true(pts[i].cl == before[i].cl && pts[i].cd == before[i].cd);
  }
  print_message("SD7003 Re 1.016e5, 6 deg: sweep cl %.4f cd %.5f, second state cl %.4f cd %.5f\n",
                p6->cl, p6->cd, p6->other_cl, p6->other_cd);
  assert_true(p6->bistable);
  assert_true(p6->cl - p6->other_cl > 0.005);
  /* the tunnel's 0.765 (interpolated, see the header) is nearer the second state */
  const double cl_tunnel = 0.758 + (0.787 - 0.758) * (6.0 - 5.93) / (6.22 - 5.93);
  assert_true(fabs(p6->other_cl - cl_tunnel) + 0.01 < fabs(p6->cl - cl_tunnel));
  teardown(v, w, raw, s);
}

/* The second branch is continued from where a fresh start finds it: SD7003 at Re 3.046e5 (the
 * UIUC lift run MS00174), where a fresh start at 6 deg reaches the trailing-edge state and its
 * continuation follows the tunnel's lift curve (docs/theory/viscous.md, sixteenth session:
 * 0.887, 0.964, 1.032 at 7-9 deg). Data: MS00174 has cl 1.033 at 9.04 deg going up and 1.048
 * at 9.19 deg coming down; the second state must be the nearer at 9 deg by more than that
 * spread. */
static void test_check_fresh_follows_the_second_branch(void **state)
{
  (void)state;
  ascr_panel_solver *w;
  ascr_geom_section *raw, *s;
  ascr_visc_solver *v = setup_sd7003(304600.0, &w, &raw, &s);
  enum { NP = 5 };
  ascr_polar_point pts[NP];
  ascr_polar_summary sum;
  assert_int_equal(ascr_polar_sweep(v, 5.0, 9.0, 1.0, pts, &sum, NULL, NULL, NULL), ASCR_OK);
  assert_int_equal(ascr_polar_check_fresh(v, pts, NP, NULL, NULL), ASCR_OK);
  for (int i = 1; i < NP; i++) {
    print_message("SD7003 Re 3.046e5, %g deg: sweep cl %.4f, second %s %.4f\n", pts[i].alpha_deg,
                  pts[i].cl, pts[i].bistable ? "state" : "(none)", pts[i].other_cl);
    assert_true(pts[i].converged && pts[i].bistable);
    assert_true(pts[i].cl - pts[i].other_cl > 0.005);
  }
  const ascr_polar_point *p9 = &pts[4];
  assert_true(p9->alpha_deg == 9.0);
  assert_true(fabs(p9->other_cl - 1.033) + (1.048 - 1.033) < fabs(p9->cl - 1.033));
  teardown(v, w, raw, s);
}

static void test_check_fresh_flags_nothing_where_one_state(void **state)
{
  (void)state;
  ascr_panel_solver *w;
  ascr_geom_section *raw, *s;
  ascr_visc_solver *v = setup("naca0012", 1e6, &w, &raw, &s);
  enum { NP = 5 };
  ascr_polar_point pts[NP];
  ascr_polar_summary sum;
  assert_int_equal(ascr_polar_sweep(v, 0.0, 4.0, 1.0, pts, &sum, NULL, NULL, NULL), ASCR_OK);
  size_t found = 99;
  assert_int_equal(ascr_polar_check_fresh(v, pts, NP, &found, NULL), ASCR_OK);
  assert_int_equal(found, 0);
  for (int i = 0; i < NP; i++) assert_false(pts[i].bistable);
  teardown(v, w, raw, s);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_check_fresh_flags_the_trailing_edge_state),
    cmocka_unit_test(test_check_fresh_follows_the_second_branch),
    cmocka_unit_test(test_check_fresh_flags_nothing_where_one_state),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
