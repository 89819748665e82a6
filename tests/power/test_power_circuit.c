/* tests/power/test_power_circuit.c
 * The powertrain's circuit (src/power/circuit.c) and its file reader. Sources beside each check.
 */
#include "ascr_test.h"
#include "airscrew/ascr_powertrain.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846

static ascr_powertrain bare(double kv, double r, double i0, double volts)
{
  ascr_powertrain pt;
  memset(&pt, 0, sizeof pt);
  pt.motor.kv_rpm_per_V = kv;
  pt.motor.resistance_ohm = r;
  pt.motor.no_load_current_A = i0;
  pt.motor.no_load_voltage_V = NAN;
  pt.motor.max_current_A = pt.motor.mass_kg = NAN;
  pt.esc.max_current_A = pt.esc.mass_kg = NAN;
  pt.battery.cells_series = 1;
  pt.battery.cells_parallel = 1;
  pt.battery.cell_voltage_full_V = pt.battery.cell_voltage_nominal_V = volts;
  pt.battery.cell_voltage_loaded_V = volts;
  pt.battery.capacity_Ah = 1.0;
  pt.battery.usable_share = 0.8;
  pt.battery.max_current_A = pt.battery.mass_kg = NAN;
  return pt;
}

/* A hand-computable case of the DC-motor equations (Hughes & Drury, Electric Motors and Drives,
 * 4th ed., ch. 3; E = k w, T = k (I - I0), V = E + I R; k = 60/(2 pi KV) from E I = T w):
 * KV 1000 rpm/V on an ideal 10 V supply, R 0.1 ohm, I0 0.5 A, 9000 rpm, full throttle:
 * E = 9 V, I = (10 - 9)/0.1 = 10 A, k = 0.00954930 N m/A, T = k 9.5 = 0.0907183 N m,
 * w = 942.478 rad/s, shaft 85.5 W, copper 10 W, no-load 9 x 0.5 = 4.5 W, input 100 W. */
static void test_motor_hand_case(void **state)
{
  (void)state;
  ascr_powertrain pt = bare(1000.0, 0.1, 0.5, 10.0);
  ascr_power_state s;
  assert_int_equal(ascr_power_state_at(&pt, ASCR_BATTERY_FULL, 1.0, 9000.0, &s, NULL), ASCR_OK);
  ascr_assert_close(ascr_motor_torque_constant(&pt.motor), 0.00954930, 1e-6, 0.0, "k = 60/(2 pi KV)");
  ascr_assert_close(s.back_emf_V, 9.0, 1e-12, 0.0, "E = n / KV");
  ascr_assert_close(s.motor_current_A, 10.0, 1e-12, 0.0, "I = (V - E)/R");
  ascr_assert_close(s.motor_torque_Nm, 0.0907183, 1e-6, 0.0, "T = k (I - I0)");
  ascr_assert_close(s.shaft_power_W, 85.5, 1e-9, 0.0, "shaft power");
  ascr_assert_close(s.copper_loss_W, 10.0, 1e-12, 0.0, "copper loss");
  ascr_assert_close(s.no_load_loss_W, 4.5, 1e-12, 0.0, "no-load loss");
  ascr_assert_close(s.electrical_power_W, 100.0, 1e-12, 0.0, "input power");
  ascr_assert_close(s.motor_efficiency, 0.855, 1e-9, 0.0, "motor efficiency");
  /* the no-load speed: k (I - I0) = 0 -> (10 - n/1000)/0.1 = 0.5 -> n = 9950 rpm */
  ascr_assert_close(ascr_power_no_load_rpm(&pt, ASCR_BATTERY_FULL, 1.0), 9950.0, 1e-12, 0.0,
                    "no-load speed");
  /* half throttle on an ideal supply: the motor sees 5 V; I0 2 A and 1 V: it cannot turn */
  assert_true(ascr_power_no_load_rpm(&pt, ASCR_BATTERY_FULL, 0.5) > 4900.0);
  ascr_powertrain weak = bare(1000.0, 1.0, 2.0, 1.0);
  assert_true(ascr_power_no_load_rpm(&weak, ASCR_BATTERY_FULL, 1.0) == 0.0);
}

/* A powertrain with every resistance present. */
static ascr_powertrain full_train(void)
{
  ascr_powertrain pt = bare(2300.0, 0.11, 0.9, 4.2);
  pt.motor.no_load_voltage_V = 10.0;
  pt.motor.no_load_speed_share = 0.6;
  pt.esc.resistance_ohm = 0.012;
  pt.battery.cells_series = 4;
  pt.battery.cells_parallel = 2;
  pt.battery.cell_voltage_nominal_V = 3.7;
  pt.battery.cell_voltage_loaded_V = 3.5;
  pt.battery.cell_resistance_ohm = 0.01;
  pt.wiring_resistance_ohm = 0.006;
  pt.has_craft = 1; /* four rotors on the pack */
  pt.craft.mass_kg = 0.6;
  pt.craft.rotors = 4;
  return pt;
}

/* Energy balance: power at the battery's terminals = shaft + copper + no-load + controller +
 * wiring, to 1e-9 relative (conservation of energy in the averaged circuit; the issue's
 * figure), over throttles, speeds and states of charge, four rotors on the pack; and the
 * battery's own loss = open-circuit power - terminal power, per branch. */
static void test_energy_balance(void **state)
{
  (void)state;
  ascr_powertrain pt = full_train();
  assert_int_equal(ascr_powertrain_validate(&pt, NULL), ASCR_OK);
  for (int s = 0; s < 3; s++) {
    for (int i = 1; i <= 10; i++) {
      double d = 0.1 * i;
      double nnl = ascr_power_no_load_rpm(&pt, (ascr_battery_state)s, d);
      for (int j = 0; j <= 10; j++) {
        double n = nnl * j / 10.0;
        ascr_power_state p;
        assert_int_equal(ascr_power_state_at(&pt, (ascr_battery_state)s, d, n, &p, NULL), ASCR_OK);
        double sum = p.shaft_power_W + p.copper_loss_W + p.no_load_loss_W + p.esc_loss_W +
                     p.wiring_loss_W;
        ascr_assert_close(p.electrical_power_W, sum, 1e-9, 1e-12, "energy balance");
        double voc = ascr_battery_open_voltage(&pt.battery, (ascr_battery_state)s);
        ascr_assert_close(voc * p.battery_current_A / 4.0, p.electrical_power_W + p.battery_loss_W,
                          1e-9, 1e-12, "battery loss");
        ascr_assert_close(p.battery_current_A, 4.0 * d * p.motor_current_A, 1e-12, 0.0,
                          "averaged switch: Ib = d I, four branches on the pack");
        ascr_assert_close(p.battery_voltage_V, voc - p.battery_current_A * 0.02, 1e-12, 0.0,
                          "pack drop under the whole current (4 cells x 0.01 ohm / 2 strings)");
      }
      /* at the no-load speed the shaft torque vanishes */
      ascr_power_state p;
      ascr_power_state_at(&pt, (ascr_battery_state)s, d, nnl, &p, NULL);
      assert_true(fabs(p.motor_torque_Nm) < 1e-12);
    }
  }
}

/* The throttle for a speed and torque inverts the circuit (a quadratic in the duty cycle). */
static void test_throttle_inverse(void **state)
{
  (void)state;
  ascr_powertrain pt = full_train();
  for (int i = 1; i <= 20; i++) {
    double d = 0.05 * i;
    double n = 0.8 * ascr_power_no_load_rpm(&pt, ASCR_BATTERY_NOMINAL, d);
    ascr_power_state p;
    ascr_power_state_at(&pt, ASCR_BATTERY_NOMINAL, d, n, &p, NULL);
    double need;
    double back = ascr_power_throttle_for(&pt, ASCR_BATTERY_NOMINAL, n, p.motor_torque_Nm, &need);
    ascr_assert_close(back, d, 1e-10, 0.0, "throttle from speed and torque");
  }
  /* beyond full throttle: NaN, with the duty cycle it would need */
  double n = ascr_power_no_load_rpm(&pt, ASCR_BATTERY_NOMINAL, 1.0);
  double need;
  assert_true(isnan(ascr_power_throttle_for(&pt, ASCR_BATTERY_NOMINAL, n, 0.01, &need)));
  assert_true(need > 1.0);
}

/* The no-load current's speed dependence: with share s, I0(n) = I0 ((1 - s) + s n / (KV V0)). */
static void test_no_load_speed_dependence(void **state)
{
  (void)state;
  ascr_powertrain pt = bare(1000.0, 0.1, 0.5, 20.0);
  pt.motor.no_load_voltage_V = 10.0;
  pt.motor.no_load_speed_share = 1.0;
  ascr_power_state p;
  /* at 20000 rpm (twice the reference 10000): I0 = 1 A; full throttle, 20 V: E = 20 V, I = 0 */
  ascr_power_state_at(&pt, ASCR_BATTERY_FULL, 1.0, 20000.0, &p, NULL);
  ascr_assert_close(p.no_load_loss_W, 20.0 * 1.0, 1e-12, 0.0, "E I0 with I0 doubled");
  ascr_power_state_at(&pt, ASCR_BATTERY_FULL, 1.0, 10000.0, &p, NULL);
  ascr_assert_close(p.no_load_loss_W, 10.0 * 0.5, 1e-12, 0.0, "E I0 at the reference speed");
}

static const char *good_file =
    "{\"format\": \"airscrew-powertrain-1\", \"name\": \"t\",\n"
    " \"motor\": {\"kv_rpm_per_V\": 2300, \"resistance_ohm\": 0.11, \"no_load_current_A\": 0.9,\n"
    "           \"no_load_voltage_V\": 10, \"no_load_speed_share\": 0.5, \"max_current_A\": 30},\n"
    " \"esc\": {\"resistance_ohm\": 0.01, \"max_current_A\": 35},\n"
    " \"battery\": {\"cells_series\": 4, \"cell_voltage_full_V\": 4.2, \"cell_voltage_nominal_V\": 3.7,\n"
    "             \"cell_voltage_loaded_V\": 3.5, \"cell_resistance_ohm\": 0.008, \"capacity_Ah\": 1.3},\n"
    " \"wiring_resistance_ohm\": 0.005}\n";

static void test_file_good(void **state)
{
  (void)state;
  ascr_powertrain *pt;
  ascr_errbuf err;
  assert_int_equal(ascr_powertrain_parse(good_file, strlen(good_file), "t.json", &pt, &err), ASCR_OK);
  assert_string_equal(pt->name, "t");
  ascr_assert_close(pt->motor.kv_rpm_per_V, 2300.0, 0.0, 0.0, "kv");
  assert_int_equal(pt->battery.cells_series, 4);
  assert_int_equal(pt->battery.cells_parallel, 1);
  ascr_assert_close(pt->battery.usable_share, 0.8, 0.0, 0.0, "default usable share");
  assert_true(isnan(pt->battery.max_current_A));
  ascr_assert_close(ascr_battery_open_voltage(&pt->battery, ASCR_BATTERY_LOADED), 14.0, 1e-12, 0.0,
                    "4 cells x 3.5 V");
  ascr_powertrain_free(pt);
}

/* Bad files: each rejected with the file name and the field path in the message. */
static void test_file_bad(void **state)
{
  (void)state;
  struct {
    const char *from, *to, *expect;
  } c[] = {
      {"\"kv_rpm_per_V\": 2300", "\"kv_rpm_per_V\": -5", "t.json: motor.kv_rpm_per_V: -5"},
      {"\"kv_rpm_per_V\": 2300", "\"kv_rpm_per_V\": \"fast\"", "t.json: motor.kv_rpm_per_V: must be a number"},
      {"\"kv_rpm_per_V\": 2300, ", "", "t.json: motor.kv_rpm_per_V: missing"},
      {"\"resistance_ohm\": 0.11", "\"resistance_ohm\": 0.11, \"colour\": 1", "t.json: motor.colour: unknown field"},
      {"\"cells_series\": 4", "\"cells_series\": 4.5", "t.json: battery.cells_series: must be a whole number"},
      {"\"cells_series\": 4", "\"cells_series\": 0", "t.json: battery.cells_series: 0, must be 1 .. 30"},
      {"\"cell_voltage_nominal_V\": 3.7", "\"cell_voltage_nominal_V\": 4.4",
       "t.json: battery.cell_voltage_nominal_V: 4.4 must be 0.5 .. 4.2 (at most the full voltage)"},
      {"\"capacity_Ah\": 1.3", "\"capacity_Ah\": 1300", "t.json: battery.capacity_Ah: 1300 must be"},
      {"\"no_load_speed_share\": 0.5", "\"no_load_speed_share\": 1.5", "t.json: motor.no_load_speed_share"},
      {"\"no_load_voltage_V\": 10, ", "", "t.json: motor.no_load_speed_share needs motor.no_load_voltage_V"},
      {"\"esc\": {", "\"esc\": [{", "t.json:"}, /* syntax: the line is named */
      {"\"esc\": {\"resistance_ohm\": 0.01, \"max_current_A\": 35}", "\"esc\": 3", "t.json: esc: must be an object"},
      {"\"airscrew-powertrain-1\"", "\"airscrew-blade-1\"", "t.json: format: must be"},
      {"\"wiring_resistance_ohm\": 0.005", "\"wiring_resistance_ohm\": 0.005, \"propeller\": 1",
       "t.json: propeller: unknown field"},
      {"\"cell_resistance_ohm\": 0.008, ", "", "t.json: battery.cell_resistance_ohm: missing"},
      {"\"wiring_resistance_ohm\": 0.005", "\"wiring_resistance_ohm\": 0.005, \"craft\": {\"mass_kg\": 0.2}",
       "t.json: craft.rotors: missing"},
      {"\"wiring_resistance_ohm\": 0.005", "\"wiring_resistance_ohm\": 0.005, \"craft\": {\"mass_kg\": 0.2, \"rotors\": 40}",
       "t.json: craft.rotors: 40, must be 1 .. 16"},
      {"\"wiring_resistance_ohm\": 0.005", "\"wiring_resistance_ohm\": 0.005, \"craft\": {\"mass_kg\": -1, \"rotors\": 4}",
       "t.json: craft.mass_kg: -1 must be"},
  };
  for (size_t i = 0; i < sizeof c / sizeof c[0]; i++) {
    const char *at = strstr(good_file, c[i].from);
    assert_non_null(at);
    char text[2048];
    snprintf(text, sizeof text, "%.*s%s%s", (int)(at - good_file), good_file, c[i].to,
             at + strlen(c[i].from));
    ascr_powertrain *pt = (ascr_powertrain *)1;
    ascr_errbuf err;
    ascr_status st = ascr_powertrain_parse(text, strlen(text), "t.json", &pt, &err);
    if (st == ASCR_OK || strstr(err.msg, c[i].expect) == NULL) {
      fail_msg("case %zu: status %d, message '%s', expected '%s'", i, st, err.msg, c[i].expect);
    }
    assert_null(pt);
  }
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_motor_hand_case),
      cmocka_unit_test(test_energy_balance),
      cmocka_unit_test(test_throttle_inverse),
      cmocka_unit_test(test_no_load_speed_dependence),
      cmocka_unit_test(test_file_good),
      cmocka_unit_test(test_file_bad),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
