/* tests/power/test_drive.c
 * Motor and propeller together (src/power/drive.c): the torque balance against the closed-form
 * balance of a motor on a square-law load, the throttle for a thrust against the rotor's own
 * thrust search, the throttle map's monotonicity and linearity figures, and the flags.
 * The propeller: a 5-inch two-blade layout on an analytic section (cl = 2 pi (alpha - alpha0),
 * constant cd, independent of Re and Mach), so that in hover its torque and thrust follow
 * n^2 exactly (BEMT is then dimensionless in n) and the balance has a closed form.
 */
#include "ascr_test.h"
#include "test_props.h"
#include "airscrew/ascr_powertrain.h"
#include "airscrew/ascr_table.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846

typedef struct fixture {
  ascr_blade b;
  ascr_blade_station st[TEST_PROP_STATIONS];
  ascr_polar_table *tab;
  const ascr_polar_table *tabs[1];
  ascr_rotor_params p;
  ascr_powertrain pt;
  ascr_drive d;
} fixture;

static int setup(void **state)
{
  fixture *f = calloc(1, sizeof *f);
  if (f == NULL) return -1;
  if (test_prop_five_inch(&f->b, f->st, &f->tab) != 0) return -1;
  f->tabs[0] = f->tab;
  f->p = ascr_rotor_params_defaults();
  /* a 2300 rpm/V motor on an ideal 16.8 V supply first (battery, wiring and controller
   * resistances zero), as the closed form needs */
  ascr_powertrain *pt = &f->pt;
  pt->motor.kv_rpm_per_V = 2300.0;
  pt->motor.resistance_ohm = 0.11;
  pt->motor.no_load_current_A = 0.9;
  pt->motor.no_load_voltage_V = NAN;
  pt->motor.max_current_A = pt->motor.mass_kg = NAN;
  pt->esc.max_current_A = pt->esc.mass_kg = NAN;
  pt->battery.cells_series = 4;
  pt->battery.cells_parallel = 1;
  pt->battery.cell_voltage_full_V = 4.2;
  pt->battery.cell_voltage_nominal_V = 3.7;
  pt->battery.cell_voltage_loaded_V = 3.5;
  pt->battery.capacity_Ah = 1.3;
  pt->battery.usable_share = 0.8;
  pt->battery.max_current_A = pt->battery.mass_kg = NAN;
  f->d.blade = &f->b;
  f->d.tables = f->tabs;
  f->d.params = &f->p;
  f->d.model = ASCR_INFLOW_BEMT;
  f->d.powertrain = pt;
  f->d.state = ASCR_BATTERY_FULL;
  *state = f;
  return 0;
}

static int teardown(void **state)
{
  fixture *f = *state;
  ascr_polar_table_free(f->tab);
  free(f);
  return 0;
}

/* Closed-form balance of a DC motor on a load torque c n^2 (the fan load of Hughes & Drury,
 * ch. 3-4): k (d V - n/KV)/R - k I0 = c n^2, the positive root of the quadratic. */
static double square_law_rpm(const ascr_powertrain *pt, double c, double d)
{
  double k = ascr_motor_torque_constant(&pt->motor), r = pt->motor.resistance_ohm;
  double v = ascr_battery_open_voltage(&pt->battery, ASCR_BATTERY_FULL);
  double b = k / (pt->motor.kv_rpm_per_V * r);
  double q = k * (d * v / r - pt->motor.no_load_current_A);
  return (-b + sqrt(b * b + 4.0 * c * q)) / (2.0 * c);
}

/* the propeller's hover torque and thrust coefficients per rpm^2 */
static void square_law(fixture *f, double *cq, double *ct)
{
  ascr_rotor_result r;
  assert_int_equal(ascr_rotor_point(&f->b, f->tabs, &f->p, ASCR_INFLOW_BEMT, NULL, 20000.0, 0.0, &r,
                                    NULL, NULL), ASCR_OK);
  assert_true(r.converged);
  *cq = r.torque_Nm / (20000.0 * 20000.0);
  *ct = r.thrust_N / (20000.0 * 20000.0);
}

/* The balance against the closed form. Tolerance 1e-7: the rpm root is found to 1e-9, and the
 * BEMT's element solutions make its torque follow n^2 to about 1e-9 (checked below). */
static void test_square_law_balance(void **state)
{
  fixture *f = *state;
  double cq, ct;
  square_law(f, &cq, &ct);
  ascr_rotor_result r2;
  ascr_rotor_point(&f->b, f->tabs, &f->p, ASCR_INFLOW_BEMT, NULL, 31000.0, 0.0, &r2, NULL, NULL);
  ascr_assert_close(r2.torque_Nm, cq * 31000.0 * 31000.0, 1e-8, 0.0, "hover torque ~ n^2");
  for (int i = 2; i <= 10; i += 2) {
    double d = 0.1 * i;
    ascr_drive_point dp;
    ascr_errbuf err;
    assert_int_equal(ascr_drive_point_at(&f->d, d, 0.0, &dp, &err), ASCR_OK);
    assert_true(dp.converged);
    assert_int_equal(dp.flags, 0);
    ascr_assert_close(dp.rotor.rpm, square_law_rpm(&f->pt, cq, d), 1e-7, 0.0, "balance rpm");
    ascr_assert_close(dp.power.motor_torque_Nm, dp.rotor.torque_Nm, 1e-6, 0.0, "torques meet");
    ascr_assert_close(dp.power.shaft_power_W, dp.rotor.power_W, 1e-6, 0.0, "shaft power = prop power");
  }
}

/* The throttle for a thrust (hover) gives back the throttle of a drive point, and its rpm is
 * the rotor's own thrust search's (rotor --thrust) to that search's 1e-7. With a real supply
 * (battery, wiring and controller resistances). */
static void test_hover_throttle(void **state)
{
  fixture *f = *state;
  ascr_powertrain saved = f->pt;
  f->pt.battery.cell_resistance_ohm = 0.012;
  f->pt.wiring_resistance_ohm = 0.005;
  f->pt.esc.resistance_ohm = 0.01;
  ascr_drive_point a, b;
  ascr_errbuf err;
  assert_int_equal(ascr_drive_point_at(&f->d, 0.55, 0.0, &a, &err), ASCR_OK);
  assert_true(a.converged);
  assert_int_equal(ascr_drive_throttle_for_thrust(&f->d, a.rotor.thrust_N, 0.0, &b, &err), ASCR_OK);
  ascr_assert_close(b.throttle, 0.55, 1e-6, 0.0, "hover throttle");
  ascr_rotor_result rr;
  assert_int_equal(ascr_rotor_rpm_for_thrust(&f->b, f->tabs, &f->p, ASCR_INFLOW_BEMT, NULL,
                                             a.rotor.thrust_N, 0.0, 1000.0, 60000.0, &rr, NULL, &err),
                   ASCR_OK);
  ascr_assert_close(b.rotor.rpm, rr.rpm, 1e-6, 0.0, "rpm as the rotor's thrust search");
  ascr_assert_close(b.rotor.rpm, a.rotor.rpm, 1e-6, 0.0, "rpm as the drive point");
  /* a thrust beyond full throttle: refused with the throttle it would need */
  ascr_drive_point full;
  assert_int_equal(ascr_drive_point_at(&f->d, 1.0, 0.0, &full, &err), ASCR_OK);
  assert_int_equal(ascr_drive_throttle_for_thrust(&f->d, 1.05 * full.rotor.thrust_N, 0.0, &b, &err),
                   ASCR_EDOM);
  assert_non_null(strstr(err.msg, "beyond full throttle"));
  f->pt = saved;
}

/* Throttle map: rpm, thrust, current and power rise with throttle, static and in forward
 * flight; the gain ratio against the closed form (static, square law): T = ct n(d)^2 with the
 * same central differences. */
static void test_map_and_linearity(void **state)
{
  fixture *f = *state;
  double cq, ct;
  square_law(f, &cq, &ct);
  const double speeds[2] = {0.0, 12.0};
  for (int s = 0; s < 2; s++) {
    ascr_drive_linearity lin;
    ascr_errbuf err;
    assert_int_equal(ascr_drive_linearity_at(&f->d, speeds[s], &lin, &err), ASCR_OK);
    assert_true(lin.complete);
    for (size_t i = 1; i < ASCR_DRIVE_MAP_POINTS; i++) {
      const ascr_drive_point *p = &lin.grid[i - 1], *q = &lin.grid[i];
      if (q->throttle < lin.band[0]) continue;
      assert_true(q->converged);
      if (p->throttle >= lin.band[0]) {
        assert_true(q->rotor.rpm > p->rotor.rpm);
        assert_true(q->rotor.thrust_N > p->rotor.thrust_N);
        assert_true(q->power.battery_current_A > p->power.battery_current_A);
        assert_true(q->power.electrical_power_W > p->power.electrical_power_W);
      }
    }
    assert_true(lin.max_deviation > 0.0 && lin.max_deviation < 0.5);
    if (s == 0) {
      assert_true(lin.band[0] <= 0.1); /* static: the prop turns from the lowest throttles */
      double g[2];
      for (int k = 0; k < 2; k++) {
        double t = k == 0 ? 0.25 : 0.75;
        double n1 = square_law_rpm(&f->pt, cq, t + 0.025), n0 = square_law_rpm(&f->pt, cq, t - 0.025);
        g[k] = ct * (n1 * n1 - n0 * n0) / 0.05;
      }
      ascr_assert_close(lin.gain_ratio, g[0] / g[1], 1e-6, 0.0, "gain ratio, square law");
      /* a square-law propeller on a stiff motor: thrust ~ d^2, ratio near 1/3 */
      assert_true(lin.gain_ratio > 0.2 && lin.gain_ratio < 0.6);
    }
  }
}

/* Flags: a stated current limit exceeded; windmilling; standstill at zero throttle. */
static void test_flags(void **state)
{
  fixture *f = *state;
  ascr_powertrain saved = f->pt;
  ascr_drive_point p;
  ascr_errbuf err;
  assert_int_equal(ascr_drive_point_at(&f->d, 0.0, 0.0, &p, &err), ASCR_OK);
  assert_true(p.converged);
  assert_true(p.flags & ASCR_DRIVE_STANDSTILL);
  assert_true(p.rotor.rpm == 0.0 && p.rotor.thrust_N == 0.0);
  /* 40 m/s on a 4-inch pitch: the no-load speed at 10 % throttle (about 3800 rpm) advances
   * 0.26 m per turn, slower than the air: the prop windmills */
  assert_int_equal(ascr_drive_point_at(&f->d, 0.1, 40.0, &p, &err), ASCR_OK);
  assert_false(p.converged);
  assert_true(p.flags & ASCR_DRIVE_WINDMILLING);
  f->pt.motor.max_current_A = 1.0;
  f->pt.battery.max_current_A = 1.0;
  assert_int_equal(ascr_drive_point_at(&f->d, 0.8, 0.0, &p, &err), ASCR_OK);
  assert_true(p.converged);
  assert_true(p.flags & ASCR_DRIVE_OVER_MOTOR_CURRENT);
  assert_true(p.flags & ASCR_DRIVE_OVER_BATTERY_CURRENT);
  assert_false(p.flags & ASCR_DRIVE_OVER_ESC_CURRENT);
  f->pt = saved;
}

/* The craft: hover carries the weight share, the endurance is the usable charge over the pack's
 * current (four rotors on the pack); the climb rate balances full-throttle thrust against weight
 * and drag, falls with mass, and a craft too heavy to lift is refused. */
static void test_craft(void **state)
{
  fixture *f = *state;
  ascr_powertrain saved = f->pt;
  f->pt.battery.cell_resistance_ohm = 0.01;
  f->pt.has_craft = 1;
  f->pt.craft.mass_kg = 2.0;
  f->pt.craft.rotors = 4;
  f->pt.craft.drag_area_m2 = 0.01;
  ascr_drive_point h;
  double endurance;
  ascr_errbuf err;
  assert_int_equal(ascr_drive_hover(&f->d, &h, &endurance, &err), ASCR_OK);
  ascr_assert_close(h.rotor.thrust_N, 2.0 * ASCR_STANDARD_GRAVITY / 4.0, 1e-6, 0.0, "weight share");
  ascr_assert_close(h.power.battery_current_A, 4.0 * h.throttle * h.power.motor_current_A, 1e-12, 0.0,
                    "pack current of four rotors");
  ascr_assert_close(endurance, 0.8 * 1.3 * 3600.0 / h.power.battery_current_A, 1e-12, 0.0, "endurance");
  double vc, vc_heavy;
  ascr_drive_point top;
  assert_int_equal(ascr_drive_max_climb(&f->d, &vc, &top, &err), ASCR_OK);
  assert_true(vc > 1.0);
  double drag = 0.5 * f->p.density_kg_m3 * 0.01 * vc * vc;
  ascr_assert_close(4.0 * top.rotor.thrust_N, 2.0 * ASCR_STANDARD_GRAVITY + drag, 1e-6, 0.0,
                    "thrust = weight + drag at the climb rate");
  f->pt.craft.mass_kg = 3.0;
  assert_int_equal(ascr_drive_max_climb(&f->d, &vc_heavy, &top, &err), ASCR_OK);
  assert_true(vc_heavy < vc);
  f->pt.craft.mass_kg = 10.0;
  assert_int_equal(ascr_drive_max_climb(&f->d, &vc_heavy, &top, &err), ASCR_EDOM);
  assert_non_null(strstr(err.msg, "cannot climb"));
  f->pt = saved;
  assert_int_equal(ascr_drive_hover(&f->d, &h, &endurance, &err), ASCR_EINVAL);
}

/* Top speed in level flight: at the speed found, with the tilt found, full-throttle thrust and
 * in-plane force balance weight and drag (1e-6 of the weight: Brent's tolerances on tilt and
 * speed); more drag, less speed; the vortex model is refused (no incidence model). 20 elements:
 * the check is of the balance, not of the discretisation. */
static void test_top_speed(void **state)
{
  fixture *f = *state;
  ascr_powertrain saved = f->pt;
  ascr_rotor_params psave = f->p;
  f->p.n_elements = 20;
  f->pt.battery.cell_resistance_ohm = 0.01;
  f->pt.has_craft = 1;
  f->pt.craft.mass_kg = 0.6;
  f->pt.craft.rotors = 4;
  f->pt.craft.drag_area_m2 = 0.01;
  double v, tilt, v2, tilt2;
  ascr_drive_point o;
  ascr_errbuf err;
  assert_int_equal(ascr_drive_top_speed(&f->d, &v, &tilt, &o, &err), ASCR_OK);
  assert_true(o.converged);
  double tau = tilt * PI / 180.0, w = 0.6 * ASCR_STANDARD_GRAVITY;
  ascr_assert_close(4.0 * (o.rotor.thrust_N * cos(tau) + o.h_force_N * sin(tau)), w, 1e-6, 0.0,
                    "vertical balance");
  ascr_assert_close(4.0 * (o.rotor.thrust_N * sin(tau) - o.h_force_N * cos(tau)),
                    0.5 * f->p.density_kg_m3 * 0.01 * v * v, 1e-6 * w, 1e-6 * w, "horizontal balance");
  ascr_assert_close(o.incidence_deg, 90.0 - tilt, 1e-9, 1e-9, "incidence = 90 - tilt");
  assert_true(tilt > 0.0 && tilt < 90.0);
  f->pt.craft.drag_area_m2 = 0.02;
  assert_int_equal(ascr_drive_top_speed(&f->d, &v2, &tilt2, &o, &err), ASCR_OK);
  assert_true(v2 < v);
  f->d.model = ASCR_INFLOW_VORTEX;
  assert_int_equal(ascr_drive_top_speed(&f->d, &v2, &tilt2, &o, &err), ASCR_EINVAL);
  f->d.model = ASCR_INFLOW_BEMT;
  f->pt = saved;
  f->p = psave;
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_square_law_balance),
      cmocka_unit_test(test_hover_throttle),
      cmocka_unit_test(test_map_and_linearity),
      cmocka_unit_test(test_flags),
      cmocka_unit_test(test_craft),
      cmocka_unit_test(test_top_speed),
  };
  return cmocka_run_group_tests(tests, setup, teardown);
}
