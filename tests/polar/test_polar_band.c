/* tests/polar/test_polar_band.c
 * The band of a polar over several sweeps (src/polar/band.c), on three hand-made sweeps whose
 * least and largest values are known: every converged sweep counts, an unconverged point and a
 * bistable point's second state do not, sweeps on different grids are refused.
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <math.h>
#include <string.h>

static void fill(ascr_polar_point *p, double a, double cl, double cd, double cm, int conv)
{
  memset(p, 0, sizeof *p);
  p->alpha_deg = a;
  p->cl = cl;
  p->cd = cd;
  p->cm = cm;
  p->converged = conv;
  p->other_cl = p->other_cd = p->other_cm = NAN;
}

static void test_polar_band_spans_the_converged_sweeps(void **state)
{
  (void)state;
  ascr_polar_point r0[2], r1[2], r2[2];
  fill(&r0[0], 0.0, 0.30, 0.010, -0.05, 1);
  fill(&r1[0], 0.0, 0.34, 0.012, -0.06, 1);
  fill(&r2[0], 0.0, 0.32, 0.015, -0.04, 1);
  fill(&r0[1], 1.0, 0.40, 0.011, -0.05, 1);
  fill(&r1[1], 1.0, 9.00, 1e-9, 9.0, 0); /* unconverged: its numbers do not count */
  fill(&r2[1], 1.0, 0.44, 0.012, -0.05, 1);
  r2[1].bistable = 1; /* its second state does not count either */
  r2[1].other_cl = 0.9;
  r2[1].other_cd = 0.05;
  r2[1].other_cm = 0.1;
  const ascr_polar_point *runs[3] = {r0, r1, r2};
  ascr_polar_band b[2];
  ascr_errbuf e;
  assert_int_equal(ascr_polar_band_compute(runs, 3, 2, b, &e), ASCR_OK);
  assert_int_equal(b[0].n_runs, 3);
  assert_int_equal(b[0].n_converged, 3);
  ascr_assert_close(b[0].cl_lo, 0.30, 0, 1e-15, "cl_lo");
  ascr_assert_close(b[0].cl_hi, 0.34, 0, 1e-15, "cl_hi");
  ascr_assert_close(b[0].cd_lo, 0.010, 0, 1e-15, "cd_lo");
  ascr_assert_close(b[0].cd_hi, 0.015, 0, 1e-15, "cd_hi");
  ascr_assert_close(b[0].cm_lo, -0.06, 0, 1e-15, "cm_lo");
  ascr_assert_close(b[0].cm_hi, -0.04, 0, 1e-15, "cm_hi");
  /* L/D per sweep: 30, 28.33, 21.33 */
  ascr_assert_close(b[0].ld_lo, 0.32 / 0.015, 1e-12, 0, "ld_lo");
  ascr_assert_close(b[0].ld_hi, 30.0, 1e-12, 0, "ld_hi");
  assert_int_equal(b[1].n_converged, 2);
  ascr_assert_close(b[1].cl_lo, 0.40, 0, 1e-15, "cl_lo 1");
  ascr_assert_close(b[1].cl_hi, 0.44, 0, 1e-15, "cl_hi 1");
  ascr_assert_close(b[1].cd_hi, 0.012, 0, 1e-15, "cd_hi 1");
  /* different grids are refused */
  r1[1].alpha_deg = 1.5;
  assert_int_equal(ascr_polar_band_compute(runs, 3, 2, b, &e), ASCR_EINVAL);
  /* no sweep converged at a point: NaN */
  r1[1].alpha_deg = 1.0;
  r0[1].converged = r2[1].converged = 0;
  assert_int_equal(ascr_polar_band_compute(runs, 3, 2, b, &e), ASCR_OK);
  assert_int_equal(b[1].n_converged, 0);
  assert_true(isnan(b[1].cl_lo) && isnan(b[1].cd_hi) && isnan(b[1].ld_lo));
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_polar_band_spans_the_converged_sweeps),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
