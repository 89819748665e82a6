/* tests/panel/test_panel_compress.c
 * Karman-Tsien correction and the critical pressure coefficient.
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <string.h>

#define DEG (3.14159265358979323846 / 180.0)

/* Limits of the rule (Tsien 1939): identity at M = 0; zero stays zero; for small |Cp0| the rule
 * tends to Prandtl-Glauert Cp0/beta (relative difference O(M^2 Cp0), here below 1e-4);
 * suction is amplified more than Prandtl-Glauert, pressure less. One worked value: Cp0 = -1,
 * M = 0.5 gives -1/(0.8660254 - 0.25/1.8660254 * 0.5) = -1.2515047 (hand evaluation of the
 * formula; checks the implementation, not the rule). */
static void test_panel_karman_tsien_limits(void **state)
{
  (void)state;
  ascr_assert_close(ascr_panel_karman_tsien(-0.731, 0.0), -0.731, 0, 1e-15, "M = 0 identity");
  ascr_assert_close(ascr_panel_karman_tsien(0.0, 0.6), 0.0, 0, 1e-15, "zero Cp");
  double b = sqrt(1.0 - 0.36);
  ascr_assert_close(ascr_panel_karman_tsien(-1e-4, 0.6), -1e-4 / b, 1e-4, 0, "small-Cp limit");
  assert_true(ascr_panel_karman_tsien(-0.5, 0.6) < -0.5 / b);
  assert_true(ascr_panel_karman_tsien(0.5, 0.6) < 0.5 / b);
  ascr_assert_close(ascr_panel_karman_tsien(-1.0, 0.5), -1.2515047, 0, 5e-7, "worked value");
  assert_true(isnan(ascr_panel_karman_tsien(-0.5, 1.0)));
}

/* Critical Cp at M = 0.7 is -0.779 (isentropic relation, NACA Report 1135; the value as quoted
 * in Anderson, Fundamentals of Aerodynamics, sec. 11.5, from memory): 3 decimals. */
static void test_panel_cp_critical_and_compressible_lift(void **state)
{
  (void)state;
  ascr_geom_section *s = NULL, *r = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &s, NULL), ASCR_OK);
  assert_int_equal(ascr_geom_section_repanel(s, NULL, &r, NULL), ASCR_OK);
  ascr_panel_solver *w = ascr_panel_solver_alloc(ascr_geom_section_size(r));
  ascr_errbuf e;
  assert_int_equal(ascr_panel_solver_set(w, r, &e), ASCR_OK);
  ascr_panel_result r0, r1;
  assert_int_equal(ascr_panel_solver_solve(w, 2.3 * DEG, 0.0, &r0, NULL, NULL, &e), ASCR_OK);
  assert_int_equal(ascr_panel_solver_solve(w, 2.3 * DEG, 0.7, &r1, NULL, NULL, &e), ASCR_OK);
  ascr_assert_close(r1.cp_critical, -0.779, 0, 6e-4, "Cp* at M 0.7");
  /* Lift grows at least as fast as Prandtl-Glauert 1/beta and within 10 % of it at M 0.3
   * (at M 0.3 the Karman-Tsien and Prandtl-Glauert rules differ by a few per cent). */
  ascr_panel_result r3;
  assert_int_equal(ascr_panel_solver_solve(w, 2.3 * DEG, 0.3, &r3, NULL, NULL, &e), ASCR_OK);
  double pg = 1.0 / sqrt(1.0 - 0.09);
  assert_true(r3.cl / r0.cl >= pg * 0.999);
  assert_true(r3.cl / r0.cl <= pg * 1.10);
  /* out of range */
  assert_int_equal(ascr_panel_solver_solve(w, 2.3 * DEG, 1.2, &r1, NULL, NULL, &e), ASCR_EDOM);
  assert_non_null(strstr(e.msg, "Mach 1.2"));
  assert_int_equal(ascr_panel_solver_solve(w, 12.0 * DEG, 0.9, &r1, NULL, NULL, &e), ASCR_EDOM);
  assert_non_null(strstr(e.msg, "Karman-Tsien"));
  assert_int_equal(ascr_panel_solver_solve(w, NAN, 0.0, &r1, NULL, NULL, &e), ASCR_EDOM);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(r);
  ascr_geom_section_free(s);
}

/* Status codes of the solver object. */
static void test_panel_solver_rejects_misuse(void **state)
{
  (void)state;
  assert_null(ascr_panel_solver_alloc(3));
  ascr_panel_solver *w = ascr_panel_solver_alloc(50);
  ascr_panel_result res;
  ascr_errbuf e;
  assert_int_equal(ascr_panel_solver_solve(w, 0.0, 0.0, &res, NULL, NULL, &e), ASCR_EINVAL);
  assert_non_null(strstr(e.msg, "call _set first"));
  ascr_geom_section *s = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &s, NULL), ASCR_OK);
  assert_int_equal(ascr_panel_solver_set(w, s, &e), ASCR_EINVAL);
  assert_non_null(strstr(e.msg, "allocated for 50"));
  ascr_panel_solver_free(w);
  ascr_panel_solver_free(NULL);
  ascr_geom_section_free(s);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_panel_karman_tsien_limits),
    cmocka_unit_test(test_panel_cp_critical_and_compressible_lift),
    cmocka_unit_test(test_panel_solver_rejects_misuse),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
