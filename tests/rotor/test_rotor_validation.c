/* tests/rotor/test_rotor_validation.c
 * End to end against a measured propeller: section shape -> viscous polars computed here ->
 * section tables -> BEMT, compared with the UIUC DA4002 9-in two-blade propeller at 5000 rpm
 * (Deters, Ananda & Selig, AIAA 2014-2151, Figs. 58-60; reference/da4002_9in_advancing_
 * fig58_60.csv, read by eye off the figures, about +-0.003 in CT and CP). Geometry: the
 * as-built chord and twist of Fig. 47 (reference/da4002_9in_measured_geometry_fig47.csv),
 * SDA1075 section along the whole blade (paper Sec. III; reference/sda1075_coords.csv).
 *
 * Assumptions (the paper does not give them): hub radius 0.1 R (a hub about 23 mm across);
 * N_crit 9 (low-turbulence tunnel, common practice); no trips.
 */
#include "ascr_test.h"
#include "airscrew/ascr_geom.h"
#include "airscrew/ascr_rotor.h"
#include "airscrew/ascr_table.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define INCH 0.0254

static ascr_geom_section *read_sda1075(void)
{
  FILE *f = fopen(ASCR_REFERENCE_DIR "/sda1075_coords.csv", "r");
  assert_non_null(f);
  double x[200], y[200];
  size_t n = 0;
  char line[256];
  while (fgets(line, sizeof line, f) != NULL && n < 200) {
    char surf[16];
    if (line[0] == '#' || sscanf(line, "%15[^,],%lf,%lf", surf, &x[n], &y[n]) != 3) {
      continue;
    }
    n++;
  }
  fclose(f);
  assert_true(n > 50);
  ascr_geom_section *s = NULL;
  ascr_errbuf err;
  if (ascr_geom_section_from_points(x, y, n, "SDA1075", &s, NULL, &err) != ASCR_OK) {
    fail_msg("%s", err.msg);
  }
  return s;
}

static size_t read_geometry(ascr_blade_station *st, double rtip)
{
  FILE *f = fopen(ASCR_REFERENCE_DIR "/da4002_9in_measured_geometry_fig47.csv", "r");
  assert_non_null(f);
  char line[256];
  size_t n = 0;
  while (fgets(line, sizeof line, f) != NULL && n < 40) {
    double r, c, b;
    if (line[0] == '#' || sscanf(line, "%lf,%lf,%lf", &r, &c, &b) != 3) {
      continue;
    }
    st[n].r_m = r * rtip;
    st[n].chord_m = c * rtip;
    st[n].twist_deg = b;
    st[n].section = 0;
    n++;
  }
  fclose(f);
  return n;
}

typedef struct meas {
  double j, ct, cp, eta;
} meas;

static size_t read_measured(meas *m, size_t max)
{
  FILE *f = fopen(ASCR_REFERENCE_DIR "/da4002_9in_advancing_fig58_60.csv", "r");
  assert_non_null(f);
  char line[256];
  size_t n = 0;
  while (fgets(line, sizeof line, f) != NULL && n < max) {
    double rpm, re;
    if (line[0] == '#' ||
        sscanf(line, "%lf,%lf,%lf,%lf,%lf,%lf", &rpm, &re, &m[n].j, &m[n].ct, &m[n].cp, &m[n].eta) != 6) {
      continue;
    }
    n++;
  }
  fclose(f);
  return n;
}

static void test_da4002(void **state)
{
  (void)state;
  const double rtip = 4.5 * INCH, rpm = 5000.0, n_rev = rpm / 60.0, d = 2.0 * rtip;
  ascr_blade_station st[40];
  ascr_blade b;
  memset(&b, 0, sizeof b);
  b.n_blades = 2;
  b.r_tip_m = rtip;
  b.r_hub_m = 0.1 * rtip;
  b.rotation = 1;
  b.n_stations = read_geometry(st, rtip);
  b.stations = st;
  b.n_sections = 1;
  assert_int_equal(b.n_stations, 15);
  meas m[64];
  size_t nm = read_measured(m, 64);
  assert_true(nm >= 20);

  /* polars over the Re ladder the operating range needs */
  ascr_rotor_params p = ascr_rotor_params_defaults();
  double re_lo, re_hi;
  assert_int_equal(ascr_rotor_section_re_range(&b, 0, &p, rpm, rpm, 0.0, m[nm - 1].j * n_rev * d,
                                               &re_lo, &re_hi, NULL), ASCR_OK);
  double re[16];
  size_t nre = ascr_table_re_ladder(re_lo, re_hi, re, 16);
  assert_true(nre >= 3 && nre <= 8);
  ascr_geom_section *sec = read_sda1075();
  ascr_curve_data cv[16];
  ascr_errbuf err;
  for (size_t k = 0; k < nre; k++) {
    ascr_curve_request rq = ascr_curve_request_defaults(re[k]);
    if (ascr_table_curve_compute(sec, &rq, &cv[k], &err) != ASCR_OK) {
      fail_msg("Re %g: %s", re[k], err.msg);
    }
    size_t nc = 0;
    for (size_t i = 0; i < cv[k].n; i++) nc += (size_t)cv[k].converged[i];
    print_message("SDA1075 Re %8.0f: %zu of %zu points converged\n", re[k], nc, cv[k].n);
  }
  ascr_polar_table *tab = NULL;
  if (ascr_polar_table_from_curves(cv, nre, NULL, &tab, &err) != ASCR_OK) {
    fail_msg("%s", err.msg);
  }
  const ascr_polar_table *tabs[1] = {tab};

  /* Attached-flow range: J 0.3 .. 0.75 (below it the inboard sections of this blade stall in
   * the measurements' own trend; above it thrust is near zero and relative errors explode).
   * Tolerance: the figure reading (+-0.003) plus 12 % of the measured value - the spread of
   * blade-element predictions of small propellers at Re below 1e5 reported against these
   * very measurements (Deters et al. Sec. IV compare with their own BEMT; 10-15 % is common
   * practice for BEMT on small props). */
  size_t checked = 0;
  double worst_ct = 0.0, worst_cp = 0.0, eta_max_pred = 0.0, eta_max_meas = 0.0;
  for (size_t i = 0; i < nm; i++) {
    double v = m[i].j * n_rev * d;
    ascr_rotor_result r;
    assert_int_equal(ascr_rotor_bemt(&b, tabs, &p, rpm, v, &r, NULL, &err), ASCR_OK);
    assert_true(r.converged);
    print_message("J %.3f  CT %.4f (meas %.4f)  CP %.4f (meas %.4f)  eta %.3f (meas %.3f)  "
                  "stalled %zu extended %zu\n", m[i].j, r.CT, m[i].ct, r.CP, m[i].cp,
                  isfinite(r.efficiency) ? r.efficiency : 0.0, m[i].eta, r.n_stalled, r.n_extended);
    if (isfinite(r.efficiency) && r.efficiency > eta_max_pred && m[i].ct > 0.01) {
      eta_max_pred = r.efficiency;
    }
    eta_max_meas = fmax(eta_max_meas, m[i].eta);
    if (m[i].j < 0.3 || m[i].j > 0.75) {
      continue;
    }
    /* The vortex model on the same tables: CT against the measurements with the same
     * allowance; CP against the BEMT value within 10 % (both models share the section drag,
     * which sets most of the power deficit; the rigid helical wake of a two-blade rotor of
     * solidity 0.11 loads the blade 3-8 % less than Prandtl's factor does at these J). */
    ascr_rotor_result rv;
    assert_int_equal(ascr_rotor_vortex(&b, tabs, &p, NULL, rpm, v, &rv, NULL, &err), ASCR_OK);
    assert_true(rv.converged);
    print_message("        vortex: CT %.4f  CP %.4f\n", rv.CT, rv.CP);
    ascr_validation_row("da4002_9in_5000rpm",
                        "Deters, Ananda & Selig, AIAA 2014-2151, Figs. 58-60 (read by eye, +-0.003 in CT and CP); airscrew from the SDA1075 coordinates",
                        "J,CT_measured,CT_bemt,CT_vortex,CP_measured,CP_bemt,CP_vortex,eta_measured,eta_bemt",
                        "%.3f,%.4f,%.4f,%.4f,%.4f,%.4f,%.4f,%.3f,%.3f", m[i].j, m[i].ct, r.CT, rv.CT,
                        m[i].cp, r.CP, rv.CP, m[i].eta, r.efficiency);
    char vdesc[64];
    snprintf(vdesc, sizeof vdesc, "DA4002 vortex CT at J %.3f", m[i].j);
    ascr_assert_close(rv.CT, m[i].ct, 0.12, 0.003, vdesc);
    snprintf(vdesc, sizeof vdesc, "DA4002 vortex CP vs BEMT at J %.3f", m[i].j);
    ascr_assert_close(rv.CP, r.CP, 0.10, 0.0, vdesc);
    worst_ct = fmax(worst_ct, fabs(r.CT - m[i].ct) / m[i].ct);
    worst_cp = fmax(worst_cp, fabs(r.CP - m[i].cp) / m[i].cp);
    char desc[64];
    snprintf(desc, sizeof desc, "DA4002 CT at J %.3f", m[i].j);
    ascr_assert_close(r.CT, m[i].ct, 0.12, 0.003, desc);
    snprintf(desc, sizeof desc, "DA4002 CP at J %.3f", m[i].j);
    ascr_assert_close(r.CP, m[i].cp, 0.12, 0.003, desc);
    checked++;
  }
  print_message("worst relative error J 0.3..0.75: CT %.1f %%, CP %.1f %%; peak eta %.3f (meas %.3f)\n",
                100.0 * worst_ct, 100.0 * worst_cp, eta_max_pred, eta_max_meas);
  assert_true(checked >= 12);
  /* Peak efficiency: a ratio of the two predictions above, so their allowances compound (at
   * the peak, CT ~ 0.05 and CP ~ 0.047: 0.003 + 12 % on each is about +-0.25 in eta). 0.10 is
   * a guard against gross errors, not a claim of accuracy. Measured here at the time of
   * writing: 0.760 against 0.677, CP being some 8 % low over the range (see docs/validation). */
  ascr_assert_close(eta_max_pred, eta_max_meas, 0.0, 0.10, "DA4002 peak efficiency");

  /* The optional rotational stall delay (Snel et al. 1994) on the same tables, over every
   * measured J: its effect printed and in the validation report (docs/theory/rotor.md,
   * "Rotational stall delay"). What the model must do, it does here: it leaves the
   * attached-flow range as it was within 1 % (the lift gap to the attached-flow line is small
   * there and 3 (c/r)^2 is below 0.1 outboard of 0.5 R on this blade) and raises thrust where
   * inboard elements stall (J below 0.3). */
  ascr_rotor_params ps = p;
  ps.stall_delay = ASCR_STALL_DELAY_SNEL;
  for (size_t i = 0; i < nm; i++) {
    double v = m[i].j * n_rev * d;
    ascr_rotor_result r0, r1;
    assert_int_equal(ascr_rotor_bemt(&b, tabs, &p, rpm, v, &r0, NULL, &err), ASCR_OK);
    assert_int_equal(ascr_rotor_bemt(&b, tabs, &ps, rpm, v, &r1, NULL, &err), ASCR_OK);
    assert_true(r1.converged);
    print_message("J %.3f  stall delay: CT %.4f -> %.4f (meas %.4f)  CP %.4f -> %.4f (meas %.4f)  "
                  "stalled %zu -> %zu\n", m[i].j, r0.CT, r1.CT, m[i].ct, r0.CP, r1.CP, m[i].cp,
                  r0.n_stalled, r1.n_stalled);
    ascr_validation_row("da4002_9in_5000rpm_stall_delay",
                        "Deters, Ananda & Selig, AIAA 2014-2151, Figs. 58-60 (read by eye, +-0.003 in CT and CP); airscrew BEMT without and with Snel's stall delay",
                        "J,CT_measured,CT_bemt,CT_bemt_snel,CP_measured,CP_bemt,CP_bemt_snel",
                        "%.3f,%.4f,%.4f,%.4f,%.4f,%.4f,%.4f", m[i].j, m[i].ct, r0.CT, r1.CT,
                        m[i].cp, r0.CP, r1.CP);
    if (r0.n_stalled == 0) {
      ascr_assert_close(r1.CT, r0.CT, 0.01, 0.0, "stall delay: CT unchanged with no element stalled");
    } else if (m[i].j < 0.3) {
      assert_true(r1.CT > r0.CT);
    }
  }
  for (size_t k = 0; k < nre; k++) ascr_curve_data_clear(&cv[k]);
  ascr_polar_table_free(tab);
  ascr_geom_section_free(sec);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_da4002),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
