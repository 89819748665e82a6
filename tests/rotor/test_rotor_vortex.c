/* tests/rotor/test_rotor_vortex.c
 * The helical-wake lifting line against BEMT at light loading, and the Prandtl tip-loss
 * factor against the spanwise loading the vortex wake produces near the tip.
 */
#include "ascr_test.h"
#include "airscrew/ascr_rotor.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#define PI 3.14159265358979323846
#define DEG (PI / 180.0)

typedef struct test_blade {
  ascr_blade b;
  ascr_blade_station st[8];
} test_blade;

/* a rectangular, linearly twisted two-blade rotor (our own test geometry) */
static void rotor(test_blade *t, double pitch75_deg)
{
  memset(t, 0, sizeof *t);
  t->b.n_blades = 2;
  t->b.r_tip_m = 0.1;
  t->b.r_hub_m = 0.015;
  t->b.rotation = 1;
  t->b.n_stations = 2;
  t->b.stations = t->st;
  t->b.n_sections = 1;
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

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_light_loading),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
