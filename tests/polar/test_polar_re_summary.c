/* tests/polar/test_polar_re_summary.c
 * The Reynolds-number summary of a polar (src/polar/re_summary.c) on polars built from closed
 * forms, whose figures follow by hand: cl = 0.1 (alpha + 2) up to 8 deg and falling beyond,
 * cd = 0.01 + 0.001 (alpha - 1)^2, an upper bubble from x/c 0.5 - 0.02 alpha to
 * 0.7 - 0.01 alpha, closed from 0 deg on (open below), one unconverged point in between.
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <math.h>
#include <string.h>

#define N 17 /* -4 .. 12 deg by 1 */

static void build(ascr_polar_point *p)
{
  memset(p, 0, N * sizeof *p);
  for (int i = 0; i < N; i++) {
    double a = -4.0 + i;
    p[i].alpha_deg = a;
    p[i].cl = a <= 8.0 ? 0.1 * (a + 2.0) : 1.0 - 0.05 * (a - 8.0);
    p[i].cd = 0.01 + 0.001 * (a - 1.0) * (a - 1.0);
    p[i].converged = 1;
    p[i].x_separation_upper = 0.5 - 0.02 * a;
    p[i].x_reattach_upper = a >= 0.0 ? 0.7 - 0.01 * a : NAN;
    p[i].x_separation_lower = p[i].x_reattach_lower = NAN;
  }
  p[8].converged = 0; /* 4 deg */
  p[8].cl = 99.0;     /* an unconverged point's numbers must not be used */
  p[8].cd = 1e-9;
}

static void test_re_summary_figures_of_a_closed_form_polar(void **state)
{
  (void)state;
  ascr_polar_point p[N];
  build(p);
  ascr_polar_re_summary s;
  ascr_errbuf e;
  assert_int_equal(ascr_polar_re_summary_compute(p, N, 0.5, &s, &e), ASCR_OK);
  assert_int_equal(s.n_converged, N - 1);
  /* smallest cd at 1 deg, cl 0.3 */
  ascr_assert_close(s.cd_min, 0.01, 0.0, 1e-12, "s.cd_min");
  ascr_assert_close(s.alpha_at_cd_min_deg, 1.0, 0.0, 1e-12, "s.alpha_at_cd_min_deg");
  ascr_assert_close(s.cl_at_cd_min, 0.3, 0.0, 1e-12, "s.cl_at_cd_min");
  /* L/D = 0.1 (a + 2) / (0.01 + 0.001 (a - 1)^2) over the grid: 36.4 at 2 deg (0.4 / 0.011;
   * 1 deg: 30, 3 deg: 35.7) */
  ascr_assert_close(s.alpha_at_ld_max_deg, 2.0, 0.0, 1e-12, "s.alpha_at_ld_max_deg");
  ascr_assert_close(s.ld_max, 0.4 / 0.011, 0.0, 1e-9, "s.ld_max");
  /* the first peak: 1.0 at 8 deg */
  ascr_assert_close(s.cl_max, 1.0, 0.0, 1e-12, "s.cl_max");
  ascr_assert_close(s.alpha_cl_max_deg, 8.0, 0.0, 1e-12, "s.alpha_cl_max_deg");
  /* cl = 0 at -2 deg exactly; slope 0.1 per deg (a straight line over -4 .. 2 deg) */
  ascr_assert_close(s.alpha_zero_lift_deg, -2.0, 0.0, 1e-12, "s.alpha_zero_lift_deg");
  ascr_assert_close(s.lift_slope_per_deg, 0.1, 0.0, 1e-12, "s.lift_slope_per_deg");
  /* bubble at cl 0.5: alpha 3 deg, between the grid points 2 and 3 (cl 0.4, 0.5): x 0.44, 0.67 */
  assert_int_equal(s.bubble_status, 1);
  ascr_assert_close(s.x_separation_upper, 0.44, 0.0, 1e-12, "s.x_separation_upper");
  ascr_assert_close(s.x_reattach_upper, 0.67, 0.0, 1e-12, "s.x_reattach_upper");
}

static void test_re_summary_open_bubble_and_unreached_cl(void **state)
{
  (void)state;
  ascr_polar_point p[N];
  build(p);
  ascr_polar_re_summary s;
  ascr_errbuf e;
  /* cl 0.05 lies between -2 deg (open separation) and -1 deg (open): no closed bubble */
  assert_int_equal(ascr_polar_re_summary_compute(p, N, 0.05, &s, &e), ASCR_OK);
  assert_int_equal(s.bubble_status, 0);
  assert_true(isfinite(s.x_separation_upper));
  assert_true(isnan(s.x_reattach_upper));
  /* above cl_max: not reached on the rising branch */
  assert_int_equal(ascr_polar_re_summary_compute(p, N, 1.2, &s, &e), ASCR_OK);
  assert_int_equal(s.bubble_status, -1);
  assert_true(isnan(s.x_separation_upper));
  /* a polar without a converged point: every figure NaN */
  for (int i = 0; i < N; i++) p[i].converged = 0;
  assert_int_equal(ascr_polar_re_summary_compute(p, N, 0.5, &s, &e), ASCR_OK);
  assert_int_equal(s.n_converged, 0);
  assert_true(isnan(s.cd_min) && isnan(s.ld_max) && isnan(s.cl_max));
  assert_true(isnan(s.alpha_zero_lift_deg) && isnan(s.lift_slope_per_deg));
  assert_int_equal(ascr_polar_re_summary_compute(p, N, NAN, &s, &e), ASCR_EINVAL);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_re_summary_figures_of_a_closed_form_polar),
    cmocka_unit_test(test_re_summary_open_bubble_and_unreached_cl),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
