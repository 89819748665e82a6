/* tests/rotor/test_rotor_vortex.c
 * The helical-wake lifting line against BEMT at light loading, and the Prandtl tip-loss
 * factor against the spanwise loading the vortex wake produces near the tip.
 */
#include "ascr_test.h"
#include "airscrew/ascr_rotor.h"
#include "airscrew/ascr_table.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#define PI 3.14159265358979323846
#define DEG (PI / 180.0)

typedef struct test_blade {
  ascr_blade b;
  ascr_blade_station st[8];
} test_blade;

/* a two-blade rotor of tip radius rt and hub rh with nst stations to be filled by the caller */
static void blade_shell(test_blade *t, double rt, double rh, size_t nst)
{
  memset(t, 0, sizeof *t);
  t->b.n_blades = 2;
  t->b.r_tip_m = rt;
  t->b.r_hub_m = rh;
  t->b.rotation = 1;
  t->b.n_stations = nst;
  t->b.stations = t->st;
  t->b.n_sections = 1;
}

/* a rectangular, linearly twisted two-blade rotor (our own test geometry) */
static void rotor(test_blade *t, double pitch75_deg)
{
  blade_shell(t, 0.1, 0.015, 2);
  t->st[0] = (ascr_blade_station){0.02, 0.012, pitch75_deg + 0.55 * 12.0, 0};
  t->st[1] = (ascr_blade_station){0.10, 0.012, pitch75_deg - 0.25 * 12.0, 0};
}

static void compare(double pitch, double rpm, double v, double tol, int print_loading)
{
  ascr_polar_table *tab;
  assert_int_equal(ascr_polar_table_linear(2.0 * PI, 0.0, 0.0, &tab, NULL), ASCR_OK);
  const ascr_polar_table *tabs[1] = {tab};
  test_blade t;
  rotor(&t, pitch);
  ascr_rotor_params p = ascr_rotor_params_defaults();
  p.hub_loss = 0;
  ascr_rotor_element eb[40], ev[40];
  ascr_rotor_result rb, rv;
  ascr_errbuf err;
  assert_int_equal(ascr_rotor_bemt(&t.b, tabs, &p, rpm, v, &rb, eb, &err), ASCR_OK);
  if (ascr_rotor_vortex(&t.b, tabs, &p, NULL, rpm, v, &rv, ev, &err) != ASCR_OK) {
    fail_msg("%s", err.msg);
  }
  assert_true(rb.converged && rv.converged);
  print_message("pitch %g rpm %g V %g: CT bemt %.5f vortex %.5f (%+.2f %%)  CP bemt %.5f vortex %.5f (%+.2f %%)\n",
                pitch, rpm, v, rb.CT, rv.CT, 100.0 * (rv.CT / rb.CT - 1.0), rb.CP, rv.CP,
                100.0 * (rv.CP / rb.CP - 1.0));
  if (print_loading) {
    /* Prandtl's tip factor (BEMT) against the loading the helical wake produces near the tip:
     * Prandtl's factor approximates the exact helical-wake (Goldstein) loading, and for two
     * blades they differ by several per cent of the peak loading near the tip (Glauert 1935,
     * Durand vol. IV div. L; figure from memory). Check: within 8 % of the peak loading from
     * r/R 0.8 outward, and both fall towards the tip. */
    double peak = 0.0, worst = 0.0;
    for (int i = 0; i < 40; i++) peak = fmax(peak, eb[i].dT_dr_N_m);
    for (int i = 0; i < 40; i++) {
      if (eb[i].r_m / 0.1 < 0.8) continue;
      worst = fmax(worst, fabs(ev[i].dT_dr_N_m - eb[i].dT_dr_N_m) / peak);
      print_message("  r/R %.4f dT/dr bemt %.4f vortex %.4f  F %.3f\n", eb[i].r_m / 0.1,
                    eb[i].dT_dr_N_m, ev[i].dT_dr_N_m, eb[i].loss);
    }
    print_message("  largest difference beyond r/R 0.8: %.1f %% of the peak loading\n", 100.0 * worst);
    assert_true(worst < 0.08);
    assert_true(ev[39].dT_dr_N_m < 0.25 * peak && ev[36].dT_dr_N_m < ev[30].dT_dr_N_m);
  }
  ascr_assert_close(rv.CT, rb.CT, tol, 0.0, "CT vortex vs BEMT");
  ascr_assert_close(rv.CP, rb.CP, tol, 0.0, "CP vortex vs BEMT");
  ascr_polar_table_free(tab);
}

/* Light loading (CT ~ 0.02 .. 0.05): the two inflow models rest on the same momentum balance
 * in the limit of many blades and light loading; the issue asks for agreement within 3 % */
static void test_light_loading(void **state)
{
  (void)state;
  compare(6.0, 6000.0, 0.0, 0.03, 1);
  compare(8.0, 6000.0, 5.0, 0.03, 0);
  compare(16.0, 6000.0, 10.0, 0.03, 0);
}

/* Hover, collective 2 to 12 deg, of an untwisted two-blade rotor (R/c = 6) and of the twisted
 * test rotor, on a thin-airfoil section (cl = 2 pi alpha, cd 0.01). Issue 13 measured figures of
 * merit above 1 and thrust 1.32-1.51 times the BEMT value on the untwisted one: each trailing
 * filament convected at its own edge's inflow. Checks, as issue 13 states them: FM below 1
 * (momentum theory: no rotor takes less than the ideal induced power, and profile drag adds to
 * it); CT within 10 % of BEMT (the models differ by the lifting line's and Prandtl's tip loss
 * and by BEMT's independent annuli); the inflow positive at every element that pushes (air goes
 * down through a thrusting annulus; the old model had upflow on alternating elements) and without
 * element-to-element zigzag (no two successive changes of sign of its increments, apart from
 * the hub and tip ends where it turns). */
static void hover_check(const ascr_blade *b, const ascr_polar_table *const *tabs, double coll,
                        const char *what)
{
  ascr_rotor_params p = ascr_rotor_params_defaults();
  ascr_rotor_result rb, rv;
  ascr_rotor_element ev[40];
  ascr_errbuf err;
  assert_int_equal(ascr_rotor_bemt(b, tabs, &p, 3000.0, 0.0, &rb, NULL, &err), ASCR_OK);
  if (ascr_rotor_vortex(b, tabs, &p, NULL, 3000.0, 0.0, &rv, ev, &err) != ASCR_OK) {
    fail_msg("%s", err.msg);
  }
  assert_true(rb.converged && rv.converged);
  print_message("%s, collective %4.1f: CT bemt %.5f vortex %.5f (%+.2f %%)  FM bemt %.3f vortex %.3f\n",
                what, coll, rb.CT, rv.CT, 100.0 * (rv.CT / rb.CT - 1.0), rb.figure_of_merit,
                rv.figure_of_merit);
  assert_true(rv.figure_of_merit < 1.0);
  ascr_assert_close(rv.CT, rb.CT, 0.10, 0.0, "CT vortex vs BEMT in hover");
  int zigzag = 0;
  double peak = 0.0;
  for (int i = 0; i < 40; i++) peak = fmax(peak, ev[i].dT_dr_N_m);
  for (int i = 0; i < 40; i++) {
    /* elements carrying at least a tenth of the peak loading: next to a tip with almost no
     * load (the twisted rotor's at 4 deg) the inflow is within hundredths of a degree of 0 */
    if (ev[i].dT_dr_N_m > 0.1 * peak) assert_true(ev[i].phi_deg > 0.0);
    if (i >= 2 && i < 38) {
      double d0 = ev[i - 1].phi_deg - ev[i - 2].phi_deg, d1 = ev[i].phi_deg - ev[i - 1].phi_deg,
             d2 = ev[i + 1].phi_deg - ev[i].phi_deg;
      if (d0 * d1 < 0.0 && d1 * d2 < 0.0) zigzag++;
    }
  }
  assert_int_equal(zigzag, 0);
}

static void test_hover_below_ideal_and_near_bemt(void **state)
{
  (void)state;
  ascr_polar_table *tab;
  assert_int_equal(ascr_polar_table_linear(2.0 * PI, 0.0, 0.01, &tab, NULL), ASCR_OK);
  const ascr_polar_table *tabs[1] = {tab};
  for (double coll = 2.0; coll <= 12.01; coll += 1.0) {
    test_blade t;
    blade_shell(&t, 0.3, 0.045, 2);
    t.st[0] = (ascr_blade_station){0.045, 0.05, coll, 0};
    t.st[1] = (ascr_blade_station){0.3, 0.05, coll, 0};
    hover_check(&t.b, tabs, coll, "untwisted R/c 6");
    /* the twisted rotor: below 3 deg its tip (coll - 3 deg) pushes air up, where BEMT took
     * phi near 145 deg and five times the rotor's thrust before its hover fix (bemt.c) */
    rotor(&t, coll);
    hover_check(&t.b, tabs, coll, "twisted test rotor");
  }
  ascr_polar_table_free(tab);
}

/* Stalled sections: a lift curve of our own that peaks at 8 deg (cl 1.0) and falls to 0.8 at
 * 14 deg, on a rotor whose root is pitched past it in hover. Before the artificial viscosity
 * (vortex.c, after Chattot 2004) the root circulation and inflow alternated element by element
 * (stalled and unstalled neighbours), and the example blade's CT jumped from 0.157 to 0.87 at
 * single rpm values (a tip element run away at Mach 7). Checks: no zigzag of the inflow
 * (as hover_check), the thrust smooth in rpm (T/rpm^2 within 1 % between 1 % rpm steps, the
 * Re dependence of a flat table being nil), FM below 1. */
static void test_stalled_root_smooth(void **state)
{
  (void)state;
  double al[23], cl[23], cd[23], cm[23];
  for (int i = 0; i < 23; i++) {
    al[i] = -8.0 + i; /* -8 .. 14 deg */
    double a = al[i];
    cl[i] = a <= 8.0 ? 0.1 * (a + 2.0) : 1.0 - 0.2 * (a - 8.0) / 6.0 - 0.01 * (a - 8.0) * (a - 8.0) / 36.0;
    cd[i] = 0.012 + (a > 8.0 ? 0.01 * (a - 8.0) : 0.0) + 0.0002 * a * a;
    cm[i] = 0.0;
  }
  ascr_table_curve c = {1e5, 23, al, cl, cd, cm, NULL, NULL};
  ascr_polar_table *tab;
  assert_int_equal(ascr_polar_table_build(&c, 1, NULL, &tab, NULL), ASCR_OK);
  const ascr_polar_table *tabs[1] = {tab};
  test_blade t;
  blade_shell(&t, 0.1, 0.012, 3);
  t.st[0] = (ascr_blade_station){0.015, 0.014, 34.0, 0};
  t.st[1] = (ascr_blade_station){0.05, 0.014, 16.0, 0};
  t.st[2] = (ascr_blade_station){0.10, 0.008, 9.0, 0};
  hover_check(&t.b, tabs, 0.0, "stalled root");
  ascr_rotor_params p = ascr_rotor_params_defaults();
  double k0 = NAN;
  int stalled = 0;
  for (int j = 0; j <= 12; j++) {
    double rpm = 8000.0 * pow(1.01, j);
    ascr_rotor_result r;
    ascr_rotor_element ev[40];
    ascr_errbuf err;
    assert_int_equal(ascr_rotor_vortex(&t.b, tabs, &p, NULL, rpm, 0.0, &r, ev, &err), ASCR_OK);
    assert_true(r.converged);
    for (int i = 0; i < 40; i++) stalled += ev[i].stalled;
    double k = r.thrust_N / (rpm * rpm);
    if (j > 0) ascr_assert_close(k, k0, 0.01, 0.0, "T/rpm^2 between neighbouring rpm");
    k0 = k;
  }
  assert_true(stalled > 0); /* the case does reach the falling lift curve */
  ascr_polar_table_free(tab);
}

/* An optimally loaded propeller at light loading (Betz condition with Prandtl's tip factor:
 * Larrabee, SAE 790585, 1979; in the notation of Adkins & Liebeck, J. Propulsion and Power
 * 10(5), 1994: tan phi = (1 + zeta/2) lambda / xi, F = (2/pi) arccos(exp(-B (1 - xi) /
 * (2 sin phi_t))), G = F x cos phi sin phi, Gamma = 2 pi V^2 zeta G / (B Omega), a = (zeta/2)
 * cos^2 phi, W = V (1 + a) / sin phi). A blade is drawn for that circulation with cl = 0.5 on a
 * cl = 2 pi alpha section without drag; both inflow models must give it back. Prandtl's factor
 * approximates Goldstein's exact helical-wake loading (Glauert 1935, Durand vol. IV div. L); the
 * issue asks for 3 % of the peak circulation. Checked from r/R 0.35 (the lifting line's root
 * vortex, which the design ignores, acts inboard of that) to 0.95. */
static void test_betz_prandtl_circulation(void **state)
{
  (void)state;
  const int B = 2;
  const double R = 0.1, V = 10.0, lam = 0.2, zeta = 0.02, cld = 0.5;
  const double omega = V / (lam * R), rpm = omega * 60.0 / (2.0 * PI);
  enum { NS = 60 };
  test_blade t;
  ascr_blade_station st[NS];
  double phit = atan((1.0 + 0.5 * zeta) * lam);
  for (int k = 0; k < NS; k++) {
    double xi = 0.2 + 0.8 * k / (NS - 1.0), r = xi * R;
    double phi = atan(tan(phit) / xi);
    double f = 0.5 * B * (1.0 - xi) / sin(phit);
    double F = k == NS - 1 ? 0.0 : 2.0 / PI * acos(exp(-f));
    double x = omega * r / V, G = F * x * cos(phi) * sin(phi);
    double gam = 2.0 * PI * V * V * zeta * G / (B * omega);
    double a = 0.5 * zeta * cos(phi) * cos(phi), W = V * (1.0 + a) / sin(phi);
    double c = 2.0 * gam / (W * cld);
    if (c < 1e-4) c = 1e-4; /* the tip: zero circulation, a sliver of chord */
    st[k] = (ascr_blade_station){r, c, (phi + cld / (2.0 * PI)) / DEG, 0};
  }
  blade_shell(&t, R, 0.2 * R, NS);
  t.b.n_blades = B;
  t.b.stations = st;
  ascr_polar_table *tab;
  assert_int_equal(ascr_polar_table_linear(2.0 * PI, 0.0, 0.0, &tab, NULL), ASCR_OK);
  const ascr_polar_table *tabs[1] = {tab};
  ascr_rotor_params p = ascr_rotor_params_defaults();
  p.hub_loss = 0;
  ascr_rotor_element e[40];
  ascr_rotor_result r;
  for (int m = 0; m < 2; m++) {
    ascr_errbuf err;
    ascr_status s = m == 0 ? ascr_rotor_bemt(&t.b, tabs, &p, rpm, V, &r, e, &err)
                           : ascr_rotor_vortex(&t.b, tabs, &p, NULL, rpm, V, &r, e, &err);
    assert_int_equal(s, ASCR_OK);
    assert_true(r.converged);
    double peak = 0.0, worst = 0.0, at = 0.0;
    for (int i = 0; i < 40; i++) {
      double xi = e[i].r_m / R, phi = atan(tan(phit) / xi);
      double F = 2.0 / PI * acos(exp(-0.5 * B * (1.0 - xi) / sin(phit)));
      double G = F * (omega * e[i].r_m / V) * cos(phi) * sin(phi);
      peak = fmax(peak, 2.0 * PI * V * V * zeta * G / (B * omega));
    }
    for (int i = 0; i < 40; i++) {
      double xi = e[i].r_m / R;
      if (xi < 0.35 || xi > 0.95) continue;
      double phi = atan(tan(phit) / xi);
      double F = 2.0 / PI * acos(exp(-0.5 * B * (1.0 - xi) / sin(phit)));
      double G = F * (omega * e[i].r_m / V) * cos(phi) * sin(phi);
      double g_opt = 2.0 * PI * V * V * zeta * G / (B * omega);
      double w = e[i].re * p.viscosity_pa_s / (p.density_kg_m3 * e[i].chord_m);
      double g = 0.5 * w * e[i].chord_m * e[i].cl;
      double d = fabs(g - g_opt) / peak;
      if (d > worst) {
        worst = d;
        at = xi;
      }
    }
    print_message("%s: circulation against Betz-Prandtl, largest difference %.2f %% of the peak "
                  "(at r/R %.2f)\n", m == 0 ? "BEMT" : "vortex", 100.0 * worst, at);
    assert_true(worst < 0.03);
  }
  ascr_polar_table_free(tab);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_light_loading),
      cmocka_unit_test(test_hover_below_ideal_and_near_bemt),
      cmocka_unit_test(test_stalled_root_smooth),
      cmocka_unit_test(test_betz_prandtl_circulation),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
