/* tests/polar/test_polar_table.c
 * Section tables: computed range reproduced, gaps bridged and flagged, the Viterna-Corrigan
 * extension (NASA CP-2230, 1982) continuous at the stall point and reaching its flat-plate
 * limits, Re interpolation and clamping, Prandtl-Glauert factor, refusals.
 */
#include "ascr_test.h"
#include "airscrew/ascr_table.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#define PI 3.14159265358979323846
#define DEG (PI / 180.0)
#define NA 37

typedef struct synth {
  double al[NA], cl[NA], cd[NA], cm[NA];
  int conv[NA];
} synth;

/* a thin-airfoil-like curve from -8 to 10 deg by 0.5: cl = k 2 pi (alpha + 2 deg) with a soft
 * top; cd = cd0 + 0.01 cl^2 */
static void make(synth *s, double k, double cd0)
{
  for (int i = 0; i < NA; i++) {
    s->al[i] = -8.0 + 0.5 * i;
    double a = (s->al[i] + 2.0) * DEG;
    s->cl[i] = k * 2.0 * PI * a - (s->al[i] > 6.0 ? 0.02 * (s->al[i] - 6.0) * (s->al[i] - 6.0) : 0.0);
    s->cd[i] = cd0 + 0.01 * s->cl[i] * s->cl[i];
    s->cm[i] = -0.05;
    s->conv[i] = 1;
  }
}

/* four curves whose lift and drag change with Re, for the Re interpolation tests */
static void make_four(synth *a, synth *b, synth *c, synth *d)
{
  make(a, 0.80, 0.030);
  make(b, 0.85, 0.020);
  make(c, 0.90, 0.014);
  make(d, 0.95, 0.010);
}

static void test_inside_and_extension(void **state)
{
  (void)state;
  synth s;
  make(&s, 0.9, 0.02);
  s.conv[20] = s.conv[21] = 0; /* 2.0 and 2.5 deg did not converge */
  ascr_table_curve c = {1e5, NA, s.al, s.cl, s.cd, s.cm, s.conv, NULL};
  ascr_table_options o = ascr_table_options_defaults();
  ascr_polar_table *t = NULL;
  ascr_errbuf err;
  assert_int_equal(ascr_polar_table_build(&c, 1, &o, &t, &err), ASCR_OK);
  ascr_table_sample q;
  /* at a converged grid point the computed value is reproduced (the 0.5 deg resampling grid
   * holds the same angles; the interpolation through them is exact there) */
  ascr_polar_table_eval(t, -3.0 * DEG, 1e5, 0.0, &q);
  ascr_assert_close(q.cl, s.cl[10], 1e-12, 1e-12, "cl at a computed point");
  ascr_assert_close(q.cd, s.cd[10], 1e-12, 1e-12, "cd at a computed point");
  assert_int_equal(q.region, ASCR_TABLE_COMPUTED);
  assert_false(q.re_outside);
  /* in the gap: flagged, and the monotone cubic stays between its neighbours */
  ascr_polar_table_eval(t, 2.25 * DEG, 1e5, 0.0, &q);
  assert_int_equal(q.region, ASCR_TABLE_BRIDGED);
  assert_true(q.cl > s.cl[19] && q.cl < s.cl[22]);
  /* continuity at the stall point (10 deg, the last converged) */
  ascr_table_sample lo, hi;
  ascr_polar_table_eval(t, 9.999 * DEG, 1e5, 0.0, &lo);
  ascr_polar_table_eval(t, 10.5 * DEG, 1e5, 0.0, &hi);
  assert_int_equal(hi.region, ASCR_TABLE_EXTENDED);
  assert_true(hi.stalled);
  assert_true(fabs(hi.cl - lo.cl) < 0.03 && fabs(hi.cd - lo.cd) < 0.01);
  /* Viterna-Corrigan limits: cl(90) = 0, cd(90) = cd_max; flat plate to cd_reverse at 180 */
  ascr_polar_table_eval(t, 90.0 * DEG, 1e5, 0.0, &q);
  ascr_assert_close(q.cl, 0.0, 0.0, 1e-9, "cl(90)");
  ascr_assert_close(q.cd, o.cd_max, 1e-9, 0.0, "cd(90) = cd_max");
  ascr_polar_table_eval(t, 180.0 * DEG, 1e5, 0.0, &q);
  ascr_assert_close(q.cd, o.cd_reverse, 1e-9, 0.0, "cd(180)");
  ascr_polar_table_eval(t, -90.0 * DEG, 1e5, 0.0, &q);
  ascr_assert_close(q.cd, o.cd_max, 1e-9, 0.0, "cd(-90) = cd_max");
  /* Viterna at 45 deg from (as, cls, cds) evaluated by hand (CP-2230 eqs.) */
  double as = 10.0 * DEG, cls = s.cl[NA - 1], cds = s.cd[NA - 1], b1 = o.cd_max;
  double a2 = (cls - b1 * sin(as) * cos(as)) * sin(as) / (cos(as) * cos(as));
  double b2 = (cds - b1 * sin(as) * sin(as)) / cos(as);
  double a = 45.0 * DEG;
  ascr_polar_table_eval(t, a, 1e5, 0.0, &q);
  ascr_assert_close(q.cl, 0.5 * b1 * sin(2 * a) + a2 * cos(a) * cos(a) / sin(a), 1e-9, 0.0, "Viterna cl(45)");
  ascr_assert_close(q.cd, b1 * sin(a) * sin(a) + b2 * cos(a), 1e-9, 0.0, "Viterna cd(45)");
  /* every angle gives finite numbers, cd > 0 */
  for (int d = -360; d <= 360; d++) {
    ascr_polar_table_eval(t, d * 0.5 * DEG, 1e5, 0.3, &q);
    assert_true(isfinite(q.cl) && isfinite(q.cd) && isfinite(q.cm) && q.cd > 0.0);
  }
  ascr_polar_table_free(t);
}

static void test_re_interpolation_and_mach(void **state)
{
  (void)state;
  synth a, b, c, d;
  make_four(&a, &b, &c, &d);
  ascr_table_curve cv[4] = {{3e5, NA, d.al, d.cl, d.cd, d.cm, NULL, NULL},
                            {3e4, NA, a.al, a.cl, a.cd, a.cm, NULL, NULL},
                            {1e5, NA, c.al, c.cl, c.cd, c.cm, NULL, NULL},
                            {6e4, NA, b.al, b.cl, b.cd, b.cm, NULL, NULL}};
  ascr_polar_table *t = NULL;
  assert_int_equal(ascr_polar_table_build(cv, 4, NULL, &t, NULL), ASCR_OK);
  assert_int_equal(ascr_polar_table_curves(t), 4);
  ascr_assert_close(ascr_polar_table_re_min(t), 3e4, 1e-12, 0.0, "Re min");
  ascr_table_sample q, q1, q2;
  /* at a curve's Re the curve is reproduced */
  ascr_polar_table_eval(t, 1.0 * DEG, 6e4, 0.0, &q);
  ascr_assert_close(q.cd, b.cd[18], 1e-10, 0.0, "cd on the 60k curve");
  /* between curves: between their values */
  ascr_polar_table_eval(t, 1.0 * DEG, 8e4, 0.0, &q);
  assert_true(q.cd < b.cd[18] && q.cd > c.cd[18]);
  /* beyond the range: the end curve, flagged */
  ascr_polar_table_eval(t, 1.0 * DEG, 1e4, 0.0, &q);
  assert_true(q.re_outside);
  ascr_assert_close(q.cd, a.cd[18], 1e-10, 0.0, "clamped to the 30k curve");
  /* Prandtl-Glauert (Glauert 1928): cl scales by 1/sqrt(1 - M^2) in the computed range */
  ascr_polar_table_eval(t, 3.0 * DEG, 1e5, 0.0, &q1);
  ascr_polar_table_eval(t, 3.0 * DEG, 1e5, 0.6, &q2);
  ascr_assert_close(q2.cl, q1.cl / 0.8, 1e-12, 0.0, "Prandtl-Glauert factor at M 0.6");
  ascr_polar_table_free(t);
}

/* One condition, one answer: a lookup depends only on the two curves around its Re. A table of
 * those two and one of four (a wider request) give the same numbers to the last bit, inside the
 * computed range, in the post-stall extension and between grid angles. (The bicubic surface
 * used before took its Re derivatives from all curves: 0.4191 N against 0.4210 N for one rotor
 * point asked alone and inside a map.) */
static void test_lookup_is_local_in_re(void **state)
{
  (void)state;
  synth a, b, c, d;
  make_four(&a, &b, &c, &d);
  ascr_table_curve two[2] = {{6e4, NA, b.al, b.cl, b.cd, b.cm, NULL, NULL},
                             {1e5, NA, c.al, c.cl, c.cd, c.cm, NULL, NULL}};
  ascr_table_curve four[4] = {{3e4, NA, a.al, a.cl, a.cd, a.cm, NULL, NULL},
                              {6e4, NA, b.al, b.cl, b.cd, b.cm, NULL, NULL},
                              {1e5, NA, c.al, c.cl, c.cd, c.cm, NULL, NULL},
                              {3e5, NA, d.al, d.cl, d.cd, d.cm, NULL, NULL}};
  ascr_polar_table *t2 = NULL, *t4 = NULL;
  assert_int_equal(ascr_polar_table_build(two, 2, NULL, &t2, NULL), ASCR_OK);
  assert_int_equal(ascr_polar_table_build(four, 4, NULL, &t4, NULL), ASCR_OK);
  const double alphas[] = {-5.3, 0.0, 1.27, 4.9, 9.8, 14.0, 35.0, 120.0, -60.0};
  const double res[] = {6e4, 7.1e4, 8.3e4, 1e5};
  for (size_t i = 0; i < sizeof alphas / sizeof alphas[0]; i++) {
    for (size_t k = 0; k < sizeof res / sizeof res[0]; k++) {
      ascr_table_sample q2, q4;
      ascr_polar_table_eval(t2, alphas[i] * DEG, res[k], 0.0, &q2);
      ascr_polar_table_eval(t4, alphas[i] * DEG, res[k], 0.0, &q4);
      assert_true(q2.cl == q4.cl);
      assert_true(q2.cd == q4.cd);
      assert_true(q2.cm == q4.cm);
      assert_int_equal(q2.region, q4.region);
      assert_int_equal(q2.stalled, q4.stalled);
    }
  }
  /* and between the curves the value lies between theirs (linear in log Re) */
  ascr_table_sample q, qb, qc;
  ascr_polar_table_eval(t4, 2.3 * DEG, 6e4, 0.0, &qb);
  ascr_polar_table_eval(t4, 2.3 * DEG, 1e5, 0.0, &qc);
  double u = log(8e4 / 6e4) / log(1e5 / 6e4);
  ascr_polar_table_eval(t4, 2.3 * DEG, 8e4, 0.0, &q);
  ascr_assert_close(q.cd, (1.0 - u) * qb.cd + u * qc.cd, 1e-14, 1e-14, "linear in log Re");
  ascr_polar_table_free(t2);
  ascr_polar_table_free(t4);
}

/* The post-stall extension against a published measurement through 180 deg: NACA 0012 at
 * Re 3.6e5 (Sheldahl & Klimas 1981, SAND80-2114; reference/sheldahl_klimas_naca0012_re3.6e5_0_180.csv,
 * whose header calls it a shape reference: a synthesis of tests and computation). The table is
 * built from the measured attached points (-10..10 deg, the negative side mirrored) with cd_max
 * the measured 90-deg value 1.8 (these are 2-D data; the default 1.3 is for blades of aspect
 * ratio 10), and the extension compared from 30 to 150 deg, where the flow is fully separated
 * and Viterna & Corrigan's relations are meant to hold. Measured on 2026-12-03: largest
 * |cl error| 0.100 (at 45 deg: the model's peak is 1.00 at 40 deg, the data's 1.085 at 45 deg),
 * largest |cd error| 0.204 (the model's cd low by up to 0.2 from 35 to 60 and 120 to 145 deg).
 * The bounds 0.12 and 0.25 guard those figures (a change of the extension that moves them shows
 * here); they are not a claim of accuracy beyond them. Shape: the lift peak between 35 and 55
 * deg, lift through zero between 85 and 95 deg, the negative peak between 125 and 145 deg, and
 * the extension continuous at the last measured point. Not modelled (documented): the abrupt
 * stall between 11 and 25 deg (cl 0.98 -> 0.28 -> 0.99) and the reversed-flow lift near 170
 * deg. */
static void test_post_stall_against_sheldahl_klimas(void **state)
{
  (void)state;
  FILE *f = fopen(ASCR_REFERENCE_DIR "/sheldahl_klimas_naca0012_re3.6e5_0_180.csv", "r");
  assert_non_null(f);
  double ma[100], mcl[100], mcd[100];
  size_t nm = 0;
  char line[512];
  while (fgets(line, sizeof line, f) != NULL && nm < 100) {
    if (line[0] == '#' || line[0] == 'a') continue;
    assert_int_equal(sscanf(line, "%lf,%lf,%lf", &ma[nm], &mcl[nm], &mcd[nm]), 3);
    nm++;
  }
  fclose(f);
  assert_true(nm >= 50 && ma[10] == 10.0);
  double al[21], cl[21], cd[21], cm[21];
  for (int i = 0; i < 21; i++) {
    int k = i - 10;
    al[i] = k;
    cl[i] = k < 0 ? -mcl[-k] : mcl[k];
    cd[i] = mcd[k < 0 ? -k : k];
    cm[i] = 0.0;
  }
  ascr_table_curve c = {3.6e5, 21, al, cl, cd, cm, NULL, NULL};
  ascr_table_options o = ascr_table_options_defaults();
  o.cd_max = 1.8;
  ascr_polar_table *t = NULL;
  assert_int_equal(ascr_polar_table_build(&c, 1, &o, &t, NULL), ASCR_OK);
  double ecl = 0.0, ecd = 0.0, apk = 0.0, clpk = -1.0, aneg = 0.0, clneg = 1.0, azero = NAN;
  double prev = NAN;
  for (double a = 30.0; a <= 150.0; a += 0.5) {
    ascr_table_sample q;
    ascr_polar_table_eval(t, a * DEG, 3.6e5, 0.0, &q);
    assert_int_equal(q.region, ASCR_TABLE_EXTENDED);
    if (q.cl > clpk) { clpk = q.cl; apk = a; }
    if (q.cl < clneg) { clneg = q.cl; aneg = a; }
    if (prev > 0.0 && q.cl <= 0.0 && isnan(azero)) azero = a;
    prev = q.cl;
    for (size_t k = 0; k < nm; k++) {
      if (ma[k] != a) continue;
      ecl = fmax(ecl, fabs(q.cl - mcl[k]));
      ecd = fmax(ecd, fabs(q.cd - mcd[k]));
    }
  }
  print_message("NACA 0012 post-stall 30..150 deg: largest |cl error| %.3f, |cd error| %.3f; "
                "peaks at %.1f and %.1f deg, zero lift at %.1f deg\n", ecl, ecd, apk, aneg, azero);
  assert_true(ecl < 0.12);
  assert_true(ecd < 0.25);
  assert_true(apk >= 35.0 && apk <= 55.0);
  assert_true(azero >= 85.0 && azero <= 95.0);
  assert_true(aneg >= 125.0 && aneg <= 145.0);
  /* continuous at the last measured point */
  ascr_table_sample lo, hi;
  ascr_polar_table_eval(t, 9.9999 * DEG, 3.6e5, 0.0, &lo);
  ascr_polar_table_eval(t, 10.0001 * DEG, 3.6e5, 0.0, &hi);
  assert_true(fabs(hi.cl - lo.cl) < 1e-3 && fabs(hi.cd - lo.cd) < 1e-3);
  ascr_polar_table_free(t);
}

/* A curve whose converged range starts above zero lift (common for thin cambered plates at low
 * Re): the lift line continues with the lowest points' slope, flagged as extended, and the
 * mirrored post-stall relations take over below the negative stall angle. */
static void test_negative_side_extension(void **state)
{
  (void)state;
  synth s;
  make(&s, 0.9, 0.02);
  for (int i = 0; i < NA; i++) {
    s.conv[i] = s.al[i] >= 2.0;
  }
  ascr_table_curve c = {2e4, NA, s.al, s.cl, s.cd, s.cm, s.conv, NULL};
  ascr_polar_table *t = NULL;
  assert_int_equal(ascr_polar_table_build(&c, 1, NULL, &t, NULL), ASCR_OK);
  ascr_table_sample q;
  double slope = 0.9 * 2.0 * PI * DEG; /* the synthetic curve's slope per deg */
  ascr_polar_table_eval(t, -3.0 * DEG, 2e4, 0.0, &q);
  assert_int_equal(q.region, ASCR_TABLE_EXTENDED);
  ascr_assert_close(q.cl, s.cl[20] + slope * (-3.0 - 2.0), 1e-3, 1e-3, "linear continuation below the range");
  ascr_assert_close(q.cd, s.cd[20], 1e-3, 0.0, "drag held");
  ascr_polar_table_eval(t, -90.0 * DEG, 2e4, 0.0, &q);
  ascr_assert_close(q.cd, 1.3, 1e-9, 0.0, "cd(-90) = cd_max");
  ascr_polar_table_free(t);
}

static void test_refusals(void **state)
{
  (void)state;
  synth s;
  make(&s, 0.9, 0.02);
  ascr_polar_table *t = NULL;
  ascr_errbuf err;
  ascr_table_curve c = {1e5, NA, s.al, s.cl, s.cd, s.cm, NULL, NULL};
  s.cd[3] = NAN;
  assert_int_equal(ascr_polar_table_build(&c, 1, NULL, &t, &err), ASCR_EINVAL);
  assert_non_null(strstr(err.msg, "point 4"));
  make(&s, 0.9, 0.02);
  s.al[5] = s.al[4];
  assert_int_equal(ascr_polar_table_build(&c, 1, NULL, &t, &err), ASCR_EINVAL);
  assert_non_null(strstr(err.msg, "does not increase"));
  make(&s, 0.9, 0.02);
  /* converged only below 1 deg: no usable curve */
  for (int i = 0; i < NA; i++) {
    s.conv[i] = s.al[i] < 1.0 && s.al[i] > -2.0;
  }
  c.converged = s.conv;
  assert_int_equal(ascr_polar_table_build(&c, 1, NULL, &t, &err), ASCR_EDOM);
  assert_null(t);
  ascr_table_curve two[2] = {{1e5, NA, s.al, s.cl, s.cd, s.cm, NULL, NULL},
                             {1e5, NA, s.al, s.cl, s.cd, s.cm, NULL, NULL}};
  assert_int_equal(ascr_polar_table_build(two, 2, NULL, &t, &err), ASCR_EINVAL);
  assert_non_null(strstr(err.msg, "twice"));
}

/* The attached-flow line a stall-delay model measures the lift against (ascr_table_sample.cl_lin):
 * 2 pi (alpha - alpha0) / sqrt(1 - M^2) through the curve's zero-lift angle (-2 deg here, where
 * the converged lift turns positive), at any angle, stall included; between two curves of
 * different zero-lift angles, alpha0 interpolated in log Re. */
static void test_attached_flow_line(void **state)
{
  (void)state;
  synth s, s2;
  make(&s, 0.9, 0.02);
  make(&s2, 0.9, 0.02);
  for (int i = 0; i < NA; i++) s2.cl[i] += 0.9 * 2.0 * PI * 1.0 * DEG; /* zero lift at -3 deg */
  ascr_table_curve c[2] = {{1e5, NA, s.al, s.cl, s.cd, s.cm, s.conv, NULL},
                           {4e5, NA, s2.al, s2.cl, s2.cd, s2.cm, s2.conv, NULL}};
  ascr_polar_table *t = NULL;
  assert_int_equal(ascr_polar_table_build(c, 2, NULL, &t, NULL), ASCR_OK);
  ascr_table_sample q;
  const double al[3] = {3.0, 14.0, 40.0};
  for (int k = 0; k < 3; k++) {
    ascr_polar_table_eval(t, al[k] * DEG, 1e5, 0.0, &q);
    ascr_assert_close(q.cl_lin, 2.0 * PI * (al[k] + 2.0) * DEG, 1e-9, 1e-12, "cl_lin, first curve");
    ascr_polar_table_eval(t, al[k] * DEG, 4e5, 0.3, &q);
    ascr_assert_close(q.cl_lin, 2.0 * PI * (al[k] + 3.0) * DEG / sqrt(1.0 - 0.09), 1e-9, 1e-12,
                      "cl_lin, second curve, Mach 0.3");
    ascr_polar_table_eval(t, al[k] * DEG, 2e5, 0.0, &q);
    ascr_assert_close(q.cl_lin, 2.0 * PI * (al[k] + 2.5) * DEG, 1e-9, 1e-12, "cl_lin, half-way in log Re");
  }
  ascr_polar_table_free(t);
}

/* Trip flags (ascr_table_curve.trip_not_applied): a lookup carries the bits of the converged
 * points on either side of its angle, of the end point beyond the computed range, and of both
 * curves around its Re; a curve without flags gives none. */
static void test_trip_flags(void **state)
{
  (void)state;
  synth a, b;
  make(&a, 0.85, 0.02);
  make(&b, 0.90, 0.015);
  int ta[NA], tb[NA];
  for (int i = 0; i < NA; i++) {
    ta[i] = a.al[i] >= 4.0 ? 2 : 0; /* lower trip unbound from 4 deg */
    tb[i] = 0;
  }
  a.conv[26] = 0;      /* 5.0 deg unconverged: its flag must not count */
  ta[26] = 1;
  ascr_table_curve one = {5e4, NA, a.al, a.cl, a.cd, a.cm, a.conv, ta};
  ascr_polar_table *t = NULL;
  assert_int_equal(ascr_polar_table_build(&one, 1, NULL, &t, NULL), ASCR_OK);
  ascr_table_sample q;
  ascr_polar_table_eval(t, 2.0 * DEG, 5e4, 0.0, &q);
  assert_int_equal(q.trip_unbound, 0);
  ascr_polar_table_eval(t, 3.7 * DEG, 5e4, 0.0, &q); /* between 3.5 (free) and 4.0 (flagged) */
  assert_int_equal(q.trip_unbound, 2);
  ascr_polar_table_eval(t, 5.0 * DEG, 5e4, 0.0, &q); /* the unconverged point's bit 0 is not used */
  assert_int_equal(q.trip_unbound, 2);
  ascr_polar_table_eval(t, 30.0 * DEG, 5e4, 0.0, &q); /* extension: from the flagged end point */
  assert_int_equal(q.trip_unbound, 2);
  ascr_polar_table_eval(t, -20.0 * DEG, 5e4, 0.0, &q);
  assert_int_equal(q.trip_unbound, 0);
  ascr_polar_table_free(t);

  ascr_table_curve two[2] = {{5e4, NA, a.al, a.cl, a.cd, a.cm, a.conv, ta},
                             {1e5, NA, b.al, b.cl, b.cd, b.cm, b.conv, tb}};
  assert_int_equal(ascr_polar_table_build(two, 2, NULL, &t, NULL), ASCR_OK);
  ascr_polar_table_eval(t, 6.0 * DEG, 7e4, 0.0, &q); /* between the curves: either one's flag */
  assert_int_equal(q.trip_unbound, 2);
  ascr_polar_table_eval(t, 6.0 * DEG, 2e5, 0.0, &q); /* above the range: the flagless curve */
  assert_int_equal(q.trip_unbound, 0);
  ascr_polar_table_free(t);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_inside_and_extension),
      cmocka_unit_test(test_re_interpolation_and_mach),
      cmocka_unit_test(test_lookup_is_local_in_re),
      cmocka_unit_test(test_post_stall_against_sheldahl_klimas),
      cmocka_unit_test(test_negative_side_extension),
      cmocka_unit_test(test_refusals),
      cmocka_unit_test(test_attached_flow_line),
      cmocka_unit_test(test_trip_flags),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
