/* tests/bl/test_bl_stability.c
 * Linear stability of Falkner-Skan profiles (src/bl/stability.c) against classical results:
 * the similarity solutions' wall shear (Blasius/Howarth, Hiemenz, Hartree's separation profile,
 * Stewartson's reversed-flow branch) and the critical point of the Blasius layer (Jordinson).
 */
#include "ascr_test.h"

#include "bl/bl_impl.h"
#include <airscrew/airscrew.h>
#include <math.h>

/* Wall shear f''(0) of f''' + f f'' + beta (1 - f'^2) = 0 (values from memory of the classical
 * tables: Blasius 0.469600 (Howarth 1938, in this eta = y sqrt(ue/(2 nu x)) form), Hiemenz
 * beta = 1: 1.232588, Hartree 1937: separation (f''(0) = 0) at beta = -0.19884, Stewartson 1954:
 * reversed branch at beta = -0.1: -0.1405). Shooting with RK4 over 8000 steps is good to 1e-6;
 * tolerances are those of the quoted digits. */
static void test_stability_falkner_skan_wall_shear(void **state)
{
  (void)state;
  ascr_stability *w = ascr_stability_alloc(60, 4);
  assert_non_null(w);
  ascr_fs_profile p;
  assert_int_equal(ascr_stability_set_falkner_skan(w, 0.0, 0, &p, NULL), ASCR_OK);
  ascr_assert_close(p.fpp0, 0.469600, 0, 2e-6, "Blasius f''(0)");
  ascr_assert_close(p.h, 2.5911, 2e-4, 0, "Blasius H");
  assert_int_equal(ascr_stability_set_falkner_skan(w, 1.0, 0, &p, NULL), ASCR_OK);
  ascr_assert_close(p.fpp0, 1.232588, 0, 2e-6, "Hiemenz f''(0)");
  assert_int_equal(ascr_stability_set_falkner_skan(w, -0.19883, 0, &p, NULL), ASCR_OK);
  ascr_assert_close(p.fpp0, 0.0, 0, 0.01, "Hartree separation profile f''(0)");
  assert_int_equal(ascr_stability_set_falkner_skan(w, -0.1, 1, &p, NULL), ASCR_OK);
  ascr_assert_close(p.fpp0, -0.1405, 0, 5e-4, "Stewartson reversed branch f''(0), beta -0.1");
  assert_true(p.h > 10.0); /* a separated profile: large shape parameter */
  /* out of range: the reversed branch does not exist above beta = 0 */
  assert_int_equal(ascr_stability_set_falkner_skan(w, 0.1, 1, &p, NULL), ASCR_EINVAL);
  assert_int_equal(ascr_stability_set_falkner_skan(w, -0.3, 0, &p, NULL), ASCR_EINVAL);
  ascr_stability_free(w);
}

/* Jordinson (J. Fluid Mech. 43, 1970; values from memory): the Blasius layer is neutral at
 * Re_dstar = 519.4, alpha dstar = 0.3036, phase speed c = 0.3965; stable below, unstable above.
 * 100 collocation intervals: c = 0.39656, ci = 1.5e-5 (110 and 160 give the same digits, 60
 * gives ci 6e-5). dci/dRe_dstar is 4.5e-5 there, so |ci| < 3e-5 puts the neutral point within
 * 0.7 of 519.4 (0.13 %, about the spread of the published calculations of this point, 519.2 to
 * 520, from memory; this one: 519.07); c to the quoted digits. */
static void test_stability_blasius_critical_point(void **state)
{
  (void)state;
  ascr_stability *w = ascr_stability_alloc(100, 4);
  assert_non_null(w);
  ascr_fs_profile p;
  assert_int_equal(ascr_stability_set_falkner_skan(w, 0.0, 0, &p, NULL), ASCR_OK);
  double h = p.h, cr, ci;
  assert_int_equal(ascr_stability_temporal(w, 0.3036 / h, 519.4 / h, &cr, &ci, NULL), ASCR_OK);
  ascr_assert_close(cr, 0.3965, 0, 5e-4, "Blasius critical phase speed");
  ascr_assert_close(ci, 0.0, 0, 3e-5, "Blasius neutral at the critical point");
  assert_int_equal(ascr_stability_temporal(w, 0.3036 / h, 450.0 / h, &cr, &ci, NULL), ASCR_OK);
  assert_true(ci < 0.0);
  assert_int_equal(ascr_stability_temporal(w, 0.3036 / h, 600.0 / h, &cr, &ci, NULL), ASCR_OK);
  assert_true(ci > 0.0);
  /* no spatial growth below the critical Reynolds number, growth above */
  double g;
  assert_int_equal(ascr_stability_spatial_max(w, 450.0 / h, &g, NULL, NULL), ASCR_OK);
  assert_true(g == 0.0);
  assert_int_equal(ascr_stability_spatial_max(w, 1000.0 / h, &g, NULL, NULL), ASCR_OK);
  assert_true(g > 0.0);
  ascr_stability_free(w);
}

/* The transition correlation (src/bl/transition.c: Drela & Giles 1987, written from memory of
 * the paper) is a fit to the e^N envelopes of Falkner-Skan flows; on the attached branch it must
 * reproduce the envelope computed here from the Orr-Sommerfeld equation. Slope theta dN/dxi of
 * a least-squares line over N 1..9. Measured: Blasius 0.00215 against 0.00225, beta -0.15
 * (H 3.02) 0.00941 against 0.00959; the envelope moves by 1.5 % from these settings (60
 * intervals, 24 stations) to 100 and 48. Tolerance 8 %: the fit's own accuracy (a few per cent,
 * from memory of the paper) and the envelope's discretisation. (On the reversed-flow branch the
 * two part by 25 % to 3.6 times: docs/theory/viscous.md; that is a finding, not checked.) */
static void test_stability_envelope_reproduces_correlation(void **state)
{
  (void)state;
  const double beta[2] = {0.0, -0.15}, lo[2] = {150.0, 40.0}, hi[2] = {3000.0, 1000.0};
  enum { K = 24 };
  ascr_stability *w = ascr_stability_alloc(60, K);
  assert_non_null(w);
  for (int c = 0; c < 2; c++) {
    ascr_fs_profile p;
    assert_int_equal(ascr_stability_set_falkner_skan(w, beta[c], 0, &p, NULL), ASCR_OK);
    double re[K], ne[K];
    for (int k = 0; k < K; k++) re[k] = lo[c] * pow(hi[c] / lo[c], (double)k / (K - 1));
    assert_int_equal(ascr_stability_fs_envelope(w, re, K, ne, NULL), ASCR_OK);
    double slope, onset;
    assert_true(ascr_stability_envelope_line(re, ne, K, 1.0, 9.0, &slope, &onset) >= 5);
    ascr_assert_close(slope * p.theta_eta * p.theta_eta, bl_amplification_rate(p.h, 1.0, 1e7),
                      0.08, 0, "envelope slope against the correlation");
  }
  ascr_stability_free(w);
}

static void test_stability_rejects_bad_input(void **state)
{
  (void)state;
  assert_null(ascr_stability_alloc(4, 4));
  ascr_stability *w = ascr_stability_alloc(40, 4);
  assert_non_null(w);
  double cr, ci, re[3] = {100, 90, 200}, ne[3];
  ascr_errbuf err;
  /* no profile yet */
  assert_int_equal(ascr_stability_temporal(w, 0.1, 200, &cr, &ci, &err), ASCR_EINVAL);
  assert_int_equal(ascr_stability_set_falkner_skan(w, 0.0, 0, NULL, NULL), ASCR_OK);
  assert_int_equal(ascr_stability_temporal(w, -0.1, 200, &cr, &ci, &err), ASCR_EINVAL);
  assert_int_equal(ascr_stability_fs_envelope(w, re, 3, ne, &err), ASCR_EINVAL);
  assert_int_equal(ascr_stability_fs_envelope(w, re, 9, ne, &err), ASCR_EINVAL);
  /* a line needs three points in the N range */
  double nn[3] = {0.5, 2.0, 12.0}, sl, on;
  assert_int_equal(ascr_stability_envelope_line(re, nn, 3, 1.0, 9.0, &sl, &on), 1);
  assert_true(isnan(sl) && isnan(on));
  ascr_stability_free(w);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_stability_falkner_skan_wall_shear),
      cmocka_unit_test(test_stability_blasius_critical_point),
      cmocka_unit_test(test_stability_envelope_reproduces_correlation),
      cmocka_unit_test(test_stability_rejects_bad_input),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
