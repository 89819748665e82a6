/* tests/panel/test_panel_thin_airfoil.c
 * The panel solution against thin-airfoil theory (Abbott & von Doenhoff 1959, ch. 4;
 * also Anderson, Fundamentals of Aerodynamics, sec. 4.7-4.8): lift slope 2 pi, zero-lift angle
 * alpha_0 = -(1/pi) int_0^pi (dy_c/dx)(cos t - 1) dt and quarter-chord moment
 * cm = (pi/4)(A2 - A1), A_n = (2/pi) int_0^pi (dy_c/dx) cos(n t) dt, x = (1 - cos t)/2.
 * The integrals are evaluated here from the mean-line equations of Abbott & von Doenhoff
 * sec. 6.4-6.5 (written out again in this file, independently of src/geom/naca.c).
 * Thin-airfoil theory neglects thickness, whose effects on alpha_0 and cm are of relative order
 * t/c (Abbott & von Doenhoff ch. 4, thick-airfoil theory); the tolerances below are that order,
 * plus the discretisation error at the default panel count (below 0.3 % for lift).
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>

#define PI 3.14159265358979323846
#define DEG (PI / 180.0)

/* Mean-line slope of a NACA 4-digit (m, p) or 5-digit (r, k1) line at x. */
typedef struct meanline {
  int five;
  double m, p, r, k1;
} meanline;

static double slope(const meanline *c, double x)
{
  if (!c->five) {
    if (c->m == 0.0) return 0.0;
    return x < c->p ? 2.0 * c->m / (c->p * c->p) * (c->p - x)
                    : 2.0 * c->m / ((1.0 - c->p) * (1.0 - c->p)) * (c->p - x);
  }
  return x < c->r ? c->k1 / 6.0 * (3.0 * x * x - 6.0 * c->r * x + c->r * c->r * (3.0 - c->r))
                  : -c->k1 / 6.0 * c->r * c->r * c->r;
}

/* Midpoint rule on 200000 intervals: error far below the tolerances (the integrand has one
 * kink, at the max-camber station, where the rule is still first order in 1/N = 5e-6). */
static void thin_theory(const meanline *c, double *alpha0, double *cm)
{
  const int N = 200000;
  double i0 = 0.0, a1 = 0.0, a2 = 0.0;
  for (int i = 0; i < N; i++) {
    double t = PI * (i + 0.5) / N, x = 0.5 * (1.0 - cos(t)), d = slope(c, x);
    i0 += d * (cos(t) - 1.0);
    a1 += d * cos(t);
    a2 += d * cos(2.0 * t);
  }
  double h = PI / N;
  *alpha0 = -(1.0 / PI) * i0 * h;
  double A1 = 2.0 / PI * a1 * h, A2 = 2.0 / PI * a2 * h;
  *cm = PI / 4.0 * (A2 - A1);
}

typedef struct panel_fit {
  double slope, alpha0, cm;
} panel_fit;

/* Zero-lift angle from the circulation, which is exactly linear in (cos alpha, sin alpha):
 * alpha_0 = atan2(-G(0), G(90 deg)). Lift slope by central difference of the pressure-
 * integrated cl at alpha_0 +- 1 deg. cm at alpha_0. */
static panel_fit panel_section(const char *spec)
{
  ascr_geom_section *s = NULL, *r = NULL;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_from_spec(spec, &s, &e), ASCR_OK);
  assert_int_equal(ascr_geom_section_repanel(s, NULL, &r, &e), ASCR_OK);
  ascr_panel_solver *w = ascr_panel_solver_alloc(ascr_geom_section_size(r));
  assert_int_equal(ascr_panel_solver_set(w, r, &e), ASCR_OK);
  ascr_panel_result a, b, z;
  assert_int_equal(ascr_panel_solver_solve(w, 0.0, 0.0, &a, NULL, NULL, &e), ASCR_OK);
  assert_int_equal(ascr_panel_solver_solve(w, 90.0 * DEG, 0.0, &b, NULL, NULL, &e), ASCR_OK);
  panel_fit f;
  f.alpha0 = atan2(-a.gamma_total, b.gamma_total);
  assert_int_equal(ascr_panel_solver_solve(w, f.alpha0 - DEG, 0.0, &a, NULL, NULL, &e), ASCR_OK);
  assert_int_equal(ascr_panel_solver_solve(w, f.alpha0 + DEG, 0.0, &b, NULL, NULL, &e), ASCR_OK);
  f.slope = (b.cl - a.cl) / (2.0 * DEG);
  assert_int_equal(ascr_panel_solver_solve(w, f.alpha0, 0.0, &z, NULL, NULL, &e), ASCR_OK);
  f.cm = z.cm;
  ascr_panel_solver_free(w);
  ascr_geom_section_free(r);
  ascr_geom_section_free(s);
  return f;
}

/* The thin-airfoil integral reproduces the values quoted with the project's reference data
 * (../shared/reference-data/README.md: NACA 2412 -2.077 deg, 4412 -4.154 deg), to the 3
 * decimals quoted. */
static void test_panel_thin_theory_integral_matches_quoted_values(void **state)
{
  (void)state;
  meanline c24 = {0, 0.02, 0.4, 0, 0}, c44 = {0, 0.04, 0.4, 0, 0};
  double a0, cm;
  thin_theory(&c24, &a0, &cm);
  ascr_assert_close(a0 / DEG, -2.077, 0.0, 6e-4, "thin-airfoil alpha0 NACA 24xx");
  thin_theory(&c44, &a0, &cm);
  ascr_assert_close(a0 / DEG, -4.154, 0.0, 6e-4, "thin-airfoil alpha0 NACA 44xx");
}

typedef struct ta_case {
  const char *spec;
  meanline c;
  double t; /* thickness ratio, sets the tolerance */
} ta_case;

/* Zero-lift angle and cm of cambered sections. Tolerances: alpha_0 within t/c * |alpha_0,thin|
 * + 0.01 deg and cm within t/c * |cm_thin| + 0.002 (thickness effect of order t/c, see the
 * header; the constants cover discretisation). */
static void test_panel_zero_lift_angle_and_cm_follow_thin_theory(void **state)
{
  (void)state;
  const ta_case cases[] = {
    {"naca2402", {0, 0.02, 0.4, 0, 0}, 0.02},
    {"naca4402", {0, 0.04, 0.4, 0, 0}, 0.02},
    {"naca2412", {0, 0.02, 0.4, 0, 0}, 0.12},
    {"naca4412", {0, 0.04, 0.4, 0, 0}, 0.12},
    {"naca6409", {0, 0.06, 0.4, 0, 0}, 0.09},
    {"naca23012", {1, 0, 0, 0.2025, 15.957}, 0.12},
  };
  /* NACA 23012's cm is not compared: its forward-loaded mean line gives a small thin-theory
   * cm (-0.0128) that thickness shifts by 0.004 here, a third of its value; the alpha_0 check
   * stands. Measured cm comes with the viscous validation. */
  for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
    const ta_case *c = &cases[k];
    double a0t, cmt;
    thin_theory(&c->c, &a0t, &cmt);
    panel_fit f = panel_section(c->spec);
    print_message("%-10s alpha0 panel %.3f thin %.3f deg; cm panel %.4f thin %.4f; slope/2pi %.4f\n",
                  c->spec, f.alpha0 / DEG, a0t / DEG, f.cm, cmt, f.slope / (2 * PI));
    char d[64];
    snprintf(d, sizeof d, "%s zero-lift angle (deg)", c->spec);
    ascr_assert_close(f.alpha0 / DEG, a0t / DEG, c->t, 0.01, d);
    if (c->c.five) continue;
    snprintf(d, sizeof d, "%s cm_c/4", c->spec);
    ascr_assert_close(f.cm, cmt, c->t, 0.002, d);
  }
}

/* Lift slope: 2 pi for a thin section (NACA 0001 within 1.5 %: thin theory omits a thickness
 * gain of about 0.8 t/c = 0.8 %, discretisation adds < 0.5 %), and growing with thickness.
 * For Joukowski sections potential theory gives about 2 pi (1 + 0.77 t/c) (Abbott & von
 * Doenhoff ch. 4; coefficient from memory); NACA 4-digit sections, with fuller noses, are
 * expected near that: we accept 0.6 .. 1.1 times t/c for the excess over 2 pi. */
static void test_panel_lift_slope_thin_limit_and_thickness_effect(void **state)
{
  (void)state;
  panel_fit f1 = panel_section("naca0001");
  ascr_assert_close(f1.slope, 2.0 * PI, 0.015, 0.0, "NACA 0001 lift slope vs 2 pi");
  const char *specs[] = {"naca0006", "naca0012", "naca0018"};
  const double ts[] = {0.06, 0.12, 0.18};
  double prev = f1.slope;
  for (int i = 0; i < 3; i++) {
    panel_fit f = panel_section(specs[i]);
    double excess = (f.slope / (2.0 * PI) - 1.0) / ts[i];
    print_message("%s slope/2pi %.4f, excess per t/c %.3f\n", specs[i], f.slope / (2 * PI), excess);
    assert_true(f.slope > prev);
    assert_true(excess > 0.6 && excess < 1.1);
    ascr_assert_close(f.alpha0, 0.0, 0.0, 1e-12, "symmetric section zero-lift angle");
    prev = f.slope;
  }
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_panel_thin_theory_integral_matches_quoted_values),
    cmocka_unit_test(test_panel_zero_lift_angle_and_cm_follow_thin_theory),
    cmocka_unit_test(test_panel_lift_slope_thin_limit_and_thickness_effect),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
