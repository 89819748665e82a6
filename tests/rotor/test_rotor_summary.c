/* tests/rotor/test_rotor_summary.c
 * The key numbers of a rotor map (src/rotor/summary.c, ascr_rotor_summarize): hover rpm and
 * power between two static points, the best figure of merit and efficiency per airspeed.
 */
#include "ascr_test.h"
#include "airscrew/ascr_rotor.h"
#include "airscrew/ascr_table.h"

#include <math.h>
#include <string.h>

#define PI 3.14159265358979323846

/* Similarity: with constant CT and CP, T = CT rho n^2 D^4 and P = CP rho n^3 D^5 (e.g.
 * McCormick, Aerodynamics, Aeronautics and Flight Mechanics, 1979, ch. 6), so the hover rpm and
 * power interpolated between two static points of such a rotor are exact: checked to 1e-12. */
static void test_hover_exact_for_constant_coefficients(void **state)
{
  (void)state;
  const double rho = 1.225, D = 0.2, CT = 0.11, CP = 0.045;
  ascr_rotor_result p[6];
  memset(p, 0, sizeof p);
  for (int i = 0; i < 6; i++) {
    double rpm = 4000.0 + 1500.0 * i, n = rpm / 60.0;
    p[i].rpm = rpm;
    p[i].speed_m_s = i < 4 ? 0.0 : 8.0;
    p[i].thrust_N = CT * rho * n * n * pow(D, 4);
    p[i].power_W = CP * rho * n * n * n * pow(D, 5);
    p[i].CT = CT;
    p[i].CP = CP;
    p[i].efficiency = i < 4 ? NAN : 0.5 + 0.01 * i;
    p[i].converged = 1;
  }
  double rpm_t = 6123.0, n_t = rpm_t / 60.0;
  double t = CT * rho * n_t * n_t * pow(D, 4), pw = CP * rho * n_t * n_t * n_t * pow(D, 5);
  ascr_rotor_summary s;
  ascr_errbuf err;
  assert_int_equal(ascr_rotor_summarize(p, 6, t, &s, &err), ASCR_OK);
  ascr_assert_close(s.hover_rpm, rpm_t, 1e-12, 0.0, "hover rpm");
  ascr_assert_close(s.hover_power_W, pw, 1e-12, 0.0, "hover power");
  assert_int_equal(s.hover_interpolated, 1);
  assert_int_equal(s.n_used, 6);
  /* figure of merit CT^1.5 / (CP sqrt(pi/2)), the same at every static point */
  ascr_assert_close(s.fm_max, pow(CT, 1.5) / (CP * sqrt(0.5 * PI)), 1e-12, 0.0, "FM");
  assert_int_equal(s.n_speeds, 1);
  ascr_assert_close(s.speed_m_s[0], 8.0, 0.0, 0.0, "speed");
  ascr_assert_close(s.eta_max[0], 0.55, 1e-15, 0.0, "best efficiency");
  ascr_assert_close(s.eta_max_rpm[0], 11500.0, 0.0, 0.0, "its rpm");
  /* a thrust beyond the static points: not extrapolated */
  assert_int_equal(ascr_rotor_summarize(p, 6, 100.0 * t, &s, &err), ASCR_OK);
  assert_true(isnan(s.hover_rpm) && isnan(s.hover_power_W));
  /* a point at the thrust itself: taken as it is */
  assert_int_equal(ascr_rotor_summarize(p, 6, p[2].thrust_N, &s, &err), ASCR_OK);
  assert_int_equal(s.hover_interpolated, 0);
  ascr_assert_close(s.hover_rpm, p[2].rpm, 0.0, 0.0, "hover rpm at a point");
  /* unconverged points are left out */
  p[5].converged = 0;
  assert_int_equal(ascr_rotor_summarize(p, 6, NAN, &s, &err), ASCR_OK);
  assert_int_equal(s.n_used, 5);
  ascr_assert_close(s.eta_max[0], 0.54, 1e-15, 0.0, "best efficiency, converged only");
  assert_int_equal(ascr_rotor_summarize(p, 6, -1.0, &s, &err), ASCR_EINVAL);
}

/* The figure of merit from the coefficients equals the rotor's own, T^1.5 / (P sqrt(2 rho A)),
 * on a BEMT hover point (analytic section): the two definitions are one (to 1e-12). */
static void test_fm_matches_the_rotor(void **state)
{
  (void)state;
  ascr_polar_table *lin;
  assert_int_equal(ascr_polar_table_linear(2.0 * PI, -2.0 * PI / 180.0, 0.012, &lin, NULL), ASCR_OK);
  const ascr_polar_table *tabs[1] = {lin};
  ascr_blade_station st[3] = {{0.015, 0.012, 22.0, 0}, {0.04, 0.010, 14.0, 0}, {0.0635, 0.006, 9.0, 0}};
  ascr_blade b;
  memset(&b, 0, sizeof b);
  b.n_blades = 2;
  b.r_tip_m = 0.0635;
  b.r_hub_m = 0.01;
  b.rotation = 1;
  b.n_stations = 3;
  b.stations = st;
  b.n_sections = 1;
  b.envelope_rpm[0] = b.envelope_rpm[1] = NAN;
  ascr_rotor_result r;
  ascr_errbuf err;
  assert_int_equal(ascr_rotor_bemt(&b, tabs, NULL, 15000.0, 0.0, &r, NULL, &err), ASCR_OK);
  assert_true(r.converged);
  ascr_rotor_summary s;
  assert_int_equal(ascr_rotor_summarize(&r, 1, NAN, &s, &err), ASCR_OK);
  ascr_assert_close(s.fm_max, r.figure_of_merit, 1e-12, 0.0, "FM from coefficients");
  ascr_polar_table_free(lin);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_hover_exact_for_constant_coefficients),
      cmocka_unit_test(test_fm_matches_the_rotor),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
