/* tests/structure/test_modes.c
 * Rotating modes (src/structure/modes.c) against closed forms: the uniform cantilever
 * (Euler-Bernoulli), the rotating uniform cantilever (published table), the rotating string
 * hinged at the axis, the uniform shaft in torsion with
 * the propeller moment; convergence with the element count.
 */
#include "ascr_test.h"
#include "airscrew/ascr_structure.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#define PI 3.14159265358979323846

/* n uniform stations over [r0, r0 + L]: mass per length m, EI (flap and lag), GJ, I_xx, I_yy
 * (area 1e-4 m^2: rho = m / 1e-4) */
static void uniform(ascr_structure_station *st, size_t n, double r0, double L, double m, double ei,
                    double gj, double ixx, double iyy)
{
  memset(st, 0, n * sizeof *st);
  for (size_t i = 0; i < n; i++) {
    st[i].r_m = r0 + L * (double)i / (double)(n - 1);
    st[i].mass_per_length_kg_m = m;
    st[i].ei_flap_nm2 = st[i].ei_lag_nm2 = ei;
    st[i].gj_nm2 = gj;
    st[i].props.area = 1e-4;
    st[i].props.i_xx = ixx;
    st[i].props.i_yy = iyy;
  }
}

/* Uniform cantilever, not rotating: omega_k = (beta_k L)^2 sqrt(EI / (m L^4)), beta_1 L =
 * 1.8751041, beta_2 L = 4.6940911, beta_3 L = 7.8547574 (Euler-Bernoulli; e.g. Blevins, Formulas
 * for Natural Frequency and Mode Shape, 1979, table 8-1). Hermite elements converge in the
 * frequencies as h^4: from 10 to 40 elements the largest error (of the first three) must fall by
 * at least 100 (4^4 = 256 in theory; measured 2.55e-4 -> 1.03e-6) and be below 1e-5 at 40. */
static void test_cantilever(void **state)
{
  (void)state;
  static ascr_structure_station st[41];
  const double bl[3] = {1.8751040687, 4.6940911330, 7.8547574382};
  double L = 0.1, m = 0.12, ei = 0.05;
  double err10 = 0.0, err40 = 0.0;
  for (int pass = 0; pass < 2; pass++) {
    size_t n = pass == 0 ? 11 : 41;
    uniform(st, n, 0.01, L, m, ei, 1.0, 1e-9, 1e-8);
    ascr_blade_modes md;
    ascr_errbuf err;
    assert_int_equal(ascr_blade_modes_at(st, n, 0.0, NULL, &md, &err), ASCR_OK);
    for (int k = 0; k < 3; k++) {
      double f = bl[k] * bl[k] * sqrt(ei / (m * pow(L, 4))) / (2.0 * PI);
      double e = fabs(md.flap_hz[k] / f - 1.0);
      if (pass == 0) err10 = fmax(err10, e);
      else err40 = fmax(err40, e);
      ascr_assert_close(md.lag_hz[k], md.flap_hz[k], 1e-9, 0.0, "equal stiffness: lag = flap");
    }
  }
  print_message("cantilever: largest error %.2e (10 elements), %.2e (40 elements)\n", err10, err40);
  assert_true(err40 < 1e-5);
  assert_true(err40 * 100.0 < err10);
}

/* The rotating string hinged at the axis (EI -> 0): omega_k^2 = Omega^2 k (2k - 1), modes the odd
 * Legendre polynomials (the first, 1/rev, is the rigid flapping of any zero-offset hinged blade;
 * Bramwell, Done & Balmford, Bramwell's Helicopter Dynamics, ch. 8, from memory); in the plane
 * of rotation the -Omega^2 term lowers each by one: omega_lag^2 = Omega^2 (k (2k - 1) - 1), the
 * first zero. EI is 1e-7 of m Omega^2 L^4; 80 elements: 1e-3. */
static void test_rotating_string(void **state)
{
  (void)state;
  static ascr_structure_station st[81];
  double L = 0.1, m = 0.1, om = 1000.0, rpm = om * 30.0 / PI;
  uniform(st, 81, 0.0, L, m, 1e-7 * m * om * om * pow(L, 4), 1.0, 1e-9, 1e-8);
  ascr_modes_params p = ascr_modes_params_defaults();
  p.hinged_root = 1;
  ascr_blade_modes md;
  ascr_errbuf err;
  assert_int_equal(ascr_blade_modes_at(st, 81, rpm, &p, &md, &err), ASCR_OK);
  for (int k = 1; k <= 3; k++) {
    double f = om * sqrt((double)(k * (2 * k - 1))) / (2.0 * PI);
    ascr_assert_close(md.flap_hz[k - 1], f, 1e-3, 0.0, "rotating string, flap");
  }
  assert_true(isnan(md.lag_hz[0]) || md.lag_hz[0] < 1e-2 * om / (2.0 * PI)); /* zero */
  ascr_assert_close(md.lag_hz[1], om * sqrt(5.0) / (2.0 * PI), 1e-3, 0.0, "rotating string, lag 2");
  ascr_assert_close(md.lag_hz[2], om * sqrt(14.0) / (2.0 * PI), 1e-3, 0.0, "rotating string, lag 3");
}

/* The rotating uniform cantilever clamped at the axis: nondimensional frequencies
 * omega sqrt(m L^4 / EI) of the first two flap modes at nondimensional rotation speeds
 * lambda = Omega sqrt(m L^4 / EI) = 0..12, as tabulated by D. H. Hodges and M. J. Rutkowski,
 * "Free-vibration analysis of rotating beams by a variable-order finite-element method", AIAA
 * Journal 19(11), 1981, pp. 1459-1466 (table 1; the same values in A. D. Wright et al., J. Appl.
 * Mech. 49, 1982) -- transcribed from memory; our 80-element model reproduces every entry to the
 * table's last digit, which an error of memory would hardly do. Their Southwell coefficients
 * follow: (omega^2 - omega_0^2) / Omega^2 = 1.1936 for the first mode at lambda = 1. Tolerance
 * 1e-4 relative: the table's 5 significant digits (half a unit of the last is 1.4e-5 of 3.5160)
 * plus the model's discretisation (1e-6 at 40 elements non-rotating, above). In the plane of
 * rotation a uniform blade's frequencies are the flap ones less Omega^2 (omega_lag^2 =
 * omega_flap^2 - Omega^2: its -Omega^2 M term is proportional to the mass matrix). */
static void test_rotating_cantilever(void **state)
{
  (void)state;
  static const double table[13][2] = {
      {3.5160, 22.0345},  {3.6816, 22.1810},  {4.1373, 22.6149},  {4.7973, 23.3203},
      {5.5850, 24.2733},  {6.4495, 25.4461},  {7.3604, 26.8091},  {8.2996, 28.3341},
      {9.2568, 29.9954},  {10.2257, 31.7705}, {11.2023, 33.6404}, {12.1843, 35.5890},
      {13.1702, 37.6031}};
  static ascr_structure_station st[81];
  double L = 0.1, m = 0.12, ei = 0.05, s = sqrt(m * pow(L, 4) / ei);
  uniform(st, 81, 0.0, L, m, ei, 1.0, 1e-9, 1e-8);
  for (int lam = 0; lam <= 12; lam++) {
    double om = lam / s;
    ascr_blade_modes md;
    ascr_errbuf err;
    assert_int_equal(ascr_blade_modes_at(st, 81, om * 30.0 / PI, NULL, &md, &err), ASCR_OK);
    for (int k = 0; k < 2; k++) {
      double w = md.flap_hz[k] * 2.0 * PI * s;
      ascr_assert_close(w, table[lam][k], 1e-4, 0.0, "rotating cantilever (Hodges & Rutkowski)");
    }
    double wl = md.lag_hz[0] * 2.0 * PI * s, wf = md.flap_hz[0] * 2.0 * PI * s;
    ascr_assert_close(wl * wl, wf * wf - (double)(lam * lam), 1e-6, 1e-9, "lag = flap less Omega^2");
  }
}

/* Uniform shaft in torsion, fixed at the root: omega_k = (2k - 1) pi / (2 L) sqrt(GJ / (rho Ip))
 * (e.g. Blevins, table 8-19); linear elements converge as h^2: 80 elements within 1e-3 for the
 * first, 5e-3 for the third. Rotating (twist 0): the propeller moment adds Omega^2 (I_yy - I_xx)
 * / Ip to omega^2 of every mode of a uniform blade (its matrix is proportional to the mass
 * matrix): 1e-9 against the non-rotating result. */
static void test_torsion(void **state)
{
  (void)state;
  static ascr_structure_station st[81];
  double L = 0.1, m = 0.12, gj = 0.02, ixx = 2e-10, iyy = 6e-9, rho = m / 1e-4;
  uniform(st, 81, 0.01, L, m, 1.0, gj, ixx, iyy);
  ascr_blade_modes m0, m1;
  ascr_errbuf err;
  assert_int_equal(ascr_blade_modes_at(st, 81, 0.0, NULL, &m0, &err), ASCR_OK);
  for (int k = 1; k <= 3; k++) {
    double f = (2 * k - 1) * PI / (2.0 * L) * sqrt(gj / (rho * (ixx + iyy))) / (2.0 * PI);
    ascr_assert_close(m0.torsion_hz[k - 1], f, k == 1 ? 1e-3 : 5e-3, 0.0, "uniform shaft torsion");
  }
  double rpm = 30000.0, om = rpm * PI / 30.0;
  assert_int_equal(ascr_blade_modes_at(st, 81, rpm, NULL, &m1, &err), ASCR_OK);
  for (int k = 0; k < 3; k++) {
    double w0 = 2.0 * PI * m0.torsion_hz[k];
    double w = sqrt(w0 * w0 + om * om * (iyy - ixx) / (ixx + iyy));
    ascr_assert_close(m1.torsion_hz[k], w / (2.0 * PI), 1e-9, 0.0, "propeller moment");
  }
  /* centrifugal stiffening raises every bending frequency */
  for (int k = 0; k < 3; k++) assert_true(m1.flap_hz[k] > m0.flap_hz[k]);
}

/* Crossings: a flap mode at 100 Hz + 0.01 Hz/rpm meets 1P where 100 + 0.01 n = n/60, at
 * n = 15,000 rpm, 2P at 4,615.4 rpm and 3P at 2,500 rpm; exact on a line sampled every 1,000
 * rpm (the interpolation is linear). The other families stay above 3P or are NaN (not
 * counted). */
static void test_crossings(void **state)
{
  (void)state;
  ascr_blade_modes m[21];
  memset(m, 0, sizeof m);
  for (int i = 0; i < 21; i++) {
    m[i].rpm = 1000.0 * i;
    m[i].n_modes = 1;
    m[i].flap_hz[0] = 100.0 + 0.01 * m[i].rpm;
    m[i].lag_hz[0] = 5000.0;
    m[i].torsion_hz[0] = NAN;
  }
  ascr_campbell_crossing c[8];
  size_t n = ascr_campbell_crossings(m, 21, 3, c, 8);
  assert_int_equal(n, 3);
  for (int k = 0; k < 3; k++) {
    assert_int_equal(c[k].family, 0);
    assert_int_equal(c[k].order, k + 1);
    ascr_assert_close(c[k].rpm, 100.0 / ((k + 1) / 60.0 - 0.01), 1e-12, 0.0, "crossing rpm");
    ascr_assert_close(c[k].hz, (k + 1) * c[k].rpm / 60.0, 1e-15, 0.0, "crossing frequency");
  }
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_cantilever),
      cmocka_unit_test(test_rotating_string),
      cmocka_unit_test(test_rotating_cantilever),
      cmocka_unit_test(test_torsion),
      cmocka_unit_test(test_crossings),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
