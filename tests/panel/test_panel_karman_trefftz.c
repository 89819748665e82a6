/* tests/panel/test_panel_karman_trefftz.c
 * The panel solution against the exact potential flow about Karman-Trefftz sections
 * (Karman & Trefftz 1918; conformal mapping computed in tests/support/ascr_test.c).
 *
 * What is compared. cl by pressure integration and by circulation against the Kutta-Joukowski
 * value 2 Gamma / (V c); nodal Cp against the exact Cp at the same contour point. The two
 * trailing-edge nodes are left out of the Cp comparison: at a trailing edge of included angle
 * tau the exact speed vanishes like r^(tau/(2 pi - tau)) = r^0.029 for tau = 10 deg, i.e. it
 * drops from 0.8 to 0 within a distance far below any panel length, so the exact value there
 * (Cp = 1) is not a property a panel method with finite panels can (or should) reproduce.
 * The same weak singularity limits the convergence of cl to about first order in the panel
 * count (observed ratios 2.2 to 2.4 per doubling); the check below asks for a ratio >= 1.6.
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdlib.h>

#define DEG (3.14159265358979323846 / 180.0)
#define KT_DENSE 4001 /* points of the exact contour handed to the reader */

/* Acceptance at the default paneling, from the issue: cl within 0.5 %, Cp within 0.02. */
#define TOL_CL_REL 0.005
#define TOL_CP_ABS 0.02

typedef struct kt_run {
  double cl, cl_circ, cl_exact;
  double cp_err_max; /* over all nodes but the two trailing-edge nodes */
} kt_run;

static kt_run run_kt(const kt_section *k, double alpha, size_t n_panels)
{
  double *x = malloc(KT_DENSE * sizeof *x), *y = malloc(KT_DENSE * sizeof *y);
  kt_contour(k, KT_DENSE, x, y);
  ascr_geom_section *s = NULL, *r = NULL;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_from_points(x, y, KT_DENSE, "kt", &s, NULL, &e), ASCR_OK);
  ascr_geom_repanel_params p = ascr_geom_repanel_defaults();
  if (n_panels > 0) p.n_panels = n_panels;
  assert_int_equal(ascr_geom_section_repanel(s, &p, &r, &e), ASCR_OK);
  size_t n = ascr_geom_section_size(r);
  ascr_panel_solver *w = ascr_panel_solver_alloc(n);
  assert_non_null(w);
  assert_int_equal(ascr_panel_solver_set(w, r, &e), ASCR_OK);
  double *cp = malloc(n * sizeof *cp);
  ascr_panel_result res;
  assert_int_equal(ascr_panel_solver_solve(w, alpha, 0.0, &res, cp, NULL, &e), ASCR_OK);
  kt_run out = {res.cl, res.cl_circ, kt_cl(k, alpha), 0.0};
  const double *rx = ascr_geom_section_x(r), *ry = ascr_geom_section_y(r);
  for (size_t i = 1; i + 1 < n; i++) {
    double th = kt_theta_of(k, rx[i], ry[i]);
    double d = fabs(cp[i] - kt_cp(k, th, alpha));
    if (d > out.cp_err_max) out.cp_err_max = d;
  }
  free(cp);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(r);
  ascr_geom_section_free(s);
  free(x);
  free(y);
  return out;
}

/* Check one shape at one angle at the default paneling against the acceptance tolerances. */
static void check_kt_default(double mux, double muy, double tau_deg, double alpha_deg)
{
  kt_section k;
  kt_init(&k, mux, muy, tau_deg * DEG);
  kt_run r = run_kt(&k, alpha_deg * DEG, 0);
  print_message("KT (%g, %g, %g deg) alpha %g: cl %.6f circ %.6f exact %.6f, max |dCp| %.4f\n",
                mux, muy, tau_deg, alpha_deg, r.cl, r.cl_circ, r.cl_exact, r.cp_err_max);
  ascr_assert_close(r.cl, r.cl_exact, TOL_CL_REL, 0.0, "cl by pressure");
  ascr_assert_close(r.cl_circ, r.cl_exact, TOL_CL_REL, 0.0, "cl by circulation");
  assert_true(r.cp_err_max < TOL_CP_ABS);
}

/* A cambered 13 %-thick Karman-Trefftz section with a 10 deg trailing edge at alpha 3.7 deg. */
static void test_panel_karman_trefftz_cl_and_cp_at_default_panels(void **state)
{
  (void)state;
  check_kt_default(0.1, 0.08, 10.0, 3.7);
}

/* A thicker, less cambered section with a 15 deg trailing edge, at negative alpha. */
static void test_panel_karman_trefftz_second_shape_negative_alpha(void **state)
{
  (void)state;
  check_kt_default(0.15, 0.04, 15.0, -7.4);
}

/* Convergence as the panel count doubles: 80 -> 160 -> 320 -> 640. */
static void test_panel_karman_trefftz_error_falls_as_panels_double(void **state)
{
  (void)state;
  kt_section k;
  kt_init(&k, 0.1, 0.08, 10.0 * DEG);
  double ecl[4], ecp[4];
  size_t np[4] = {80, 160, 320, 640};
  for (int i = 0; i < 4; i++) {
    kt_run r = run_kt(&k, 3.7 * DEG, np[i]);
    ecl[i] = fabs(r.cl - r.cl_exact) / r.cl_exact;
    ecp[i] = r.cp_err_max;
    print_message("panels %4zu: cl rel err %.3e, max |dCp| %.4f\n", np[i], ecl[i], ecp[i]);
  }
  for (int i = 0; i < 3; i++) {
    assert_true(ecl[i] / ecl[i + 1] >= 1.6);
    assert_true(ecp[i + 1] < ecp[i]);
  }
}

/* A symmetric section at zero incidence carries no lift. Tolerance 1e-6: the test's own
 * contour places its leading edge by a golden-section search on a flat maximum, which finds
 * it only to about sqrt(machine epsilon) ~ 1e-8, so
 * upper and lower point sets are mirror images only to that level. */
static void test_panel_symmetric_section_zero_lift(void **state)
{
  (void)state;
  kt_section k;
  kt_init(&k, 0.12, 0.0, 12.0 * DEG);
  kt_run r = run_kt(&k, 0.0, 0);
  ascr_assert_close(r.cl, 0.0, 0.0, 1e-6, "symmetric cl");
  ascr_assert_close(r.cl_exact, 0.0, 0.0, 1e-6, "exact symmetric cl");
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_panel_karman_trefftz_cl_and_cp_at_default_panels),
    cmocka_unit_test(test_panel_karman_trefftz_second_shape_negative_alpha),
    cmocka_unit_test(test_panel_karman_trefftz_error_falls_as_panels_double),
    cmocka_unit_test(test_panel_symmetric_section_zero_lift),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
