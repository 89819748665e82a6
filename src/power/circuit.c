/* src/power/circuit.c
 * The powertrain's circuit: battery (open-circuit voltage behind its internal resistance),
 * wiring, PWM speed controller (averaged ideal switch with its switch resistance) and the
 * first-order DC motor. Every equation of the electrical side lives here; sources in
 * include/airscrew/ascr_powertrain.h and docs/theory/powertrain.md.
 *
 * With duty cycle d, open-circuit pack voltage Voc, supply-side resistance Rs = N Rbat + Rwire
 * (N the rotors on the pack, all at the same throttle: each branch sees the pack's drop under
 * the whole current),
 * motor-side resistance Rm' = Rmotor + Resc and back-EMF E = n/KV (n in rpm):
 *   controller input   Vin = Voc - Ib Rs,    Ib = d I           (averaged switch: Mohan et al.)
 *   motor              d Vin = E + I Rm'                        (Hughes & Drury, ch. 3)
 * so that I = (d Voc - E) / (Rm' + d^2 Rs): linear in the currents, solved in closed form.
 * Shaft torque k (I - I0(n)), k = 60/(2 pi KV); I0(n) = I0 ((1 - s) + s n / n_ref).
 * Power drawn at the battery's terminals = shaft + I^2 Rmotor (copper) + E I0 (no-load)
 * + I^2 Resc + Ib^2 Rwire, exactly (tests/power/test_power_circuit.c checks it to 1e-9).
 */
#include "power/power_impl.h"
#include "core/core_impl.h"

#include <math.h>

double ascr_motor_torque_constant(const ascr_motor *m)
{
  return 60.0 / (2.0 * ASCR_PI * m->kv_rpm_per_V);
}

double ascr_battery_open_voltage(const ascr_battery *b, ascr_battery_state s)
{
  double v = s == ASCR_BATTERY_FULL      ? b->cell_voltage_full_V
             : s == ASCR_BATTERY_NOMINAL ? b->cell_voltage_nominal_V
                                         : b->cell_voltage_loaded_V;
  return (double)b->cells_series * v;
}

/* internal resistance of the pack: cells in series, strings in parallel */
static double battery_resistance(const ascr_battery *b)
{
  return (double)b->cells_series * b->cell_resistance_ohm / (double)b->cells_parallel;
}

/* rotors drawing on the one pack (the craft's, all at the same throttle) */
static double pack_share(const ascr_powertrain *pt)
{
  return pt->has_craft ? (double)pt->craft.rotors : 1.0;
}

/* supply-side resistance one branch sees: the pack's, carrying every branch's current, and its
 * own wiring */
static double supply_resistance(const ascr_powertrain *pt)
{
  return pack_share(pt) * battery_resistance(&pt->battery) + pt->wiring_resistance_ohm;
}

/* no-load current at shaft speed n: a = constant part, b = per rpm */
static void no_load_terms(const ascr_motor *m, double *a, double *b)
{
  double s = m->no_load_speed_share;
  if (!(s > 0.0) || !(m->no_load_voltage_V > 0.0)) {
    *a = m->no_load_current_A;
    *b = 0.0;
    return;
  }
  double n_ref = m->kv_rpm_per_V * m->no_load_voltage_V;
  *a = m->no_load_current_A * (1.0 - s);
  *b = m->no_load_current_A * s / n_ref;
}

double power_no_load_current(const ascr_motor *m, double rpm)
{
  double a, b;
  no_load_terms(m, &a, &b);
  return a + b * rpm;
}

ascr_status ascr_power_state_at(const ascr_powertrain *pt, ascr_battery_state s, double throttle,
                                double rpm, ascr_power_state *out, ascr_errbuf *err)
{
  if (pt == NULL || out == NULL || !(throttle >= 0.0 && throttle <= 1.0) || !(rpm >= 0.0) ||
      !isfinite(rpm)) {
    return core_fail(err, ASCR_EINVAL, "powertrain: throttle must be 0..1 and rpm >= 0");
  }
  const ascr_motor *m = &pt->motor;
  double d = throttle;
  double voc = ascr_battery_open_voltage(&pt->battery, s);
  double rb = battery_resistance(&pt->battery), rw = pt->wiring_resistance_ohm;
  double share = pack_share(pt);
  double rs = share * rb + rw, rm = m->resistance_ohm + pt->esc.resistance_ohm;
  double k = ascr_motor_torque_constant(m);
  double w = 2.0 * ASCR_PI * rpm / 60.0;
  double e = k * w; /* = rpm / KV */
  double i = (d * voc - e) / (rm + d * d * rs);
  double ib = d * i; /* this branch's draw from the pack */
  double i0 = power_no_load_current(m, rpm);
  ascr_power_state *o = out;
  o->throttle = d;
  o->rpm = rpm;
  o->motor_current_A = i;
  o->battery_current_A = share * ib;
  o->back_emf_V = e;
  o->esc_input_voltage_V = voc - ib * rs;
  o->battery_voltage_V = voc - share * ib * rb;
  o->motor_voltage_V = e + i * m->resistance_ohm; /* d Vin less the switch drop */
  o->motor_torque_Nm = k * (i - i0);
  o->shaft_power_W = o->motor_torque_Nm * w + 0.0; /* + 0.0: no -0 at standstill */
  o->electrical_power_W = o->battery_voltage_V * ib;
  o->copper_loss_W = i * i * m->resistance_ohm;
  o->no_load_loss_W = e * i0;
  o->esc_loss_W = i * i * pt->esc.resistance_ohm;
  o->wiring_loss_W = ib * ib * rw;
  o->battery_loss_W = share * ib * ib * rb; /* this branch's share of the pack's loss */
  double p_motor = o->motor_voltage_V * i; /* at the motor's terminals */
  o->motor_efficiency = p_motor > 0.0 ? o->shaft_power_W / p_motor : NAN;
  o->overall_efficiency = o->electrical_power_W > 0.0 ? o->shaft_power_W / o->electrical_power_W : NAN;
  return ASCR_OK;
}

double ascr_power_no_load_rpm(const ascr_powertrain *pt, ascr_battery_state s, double throttle)
{
  /* (d Voc - n/KV) / (Rm' + d^2 Rs) = a + b n, linear in n */
  const ascr_motor *m = &pt->motor;
  double voc = ascr_battery_open_voltage(&pt->battery, s);
  double rs = supply_resistance(pt);
  double r = m->resistance_ohm + pt->esc.resistance_ohm + throttle * throttle * rs;
  double a, b;
  no_load_terms(m, &a, &b);
  double n = (throttle * voc - r * a) / (1.0 / m->kv_rpm_per_V + r * b);
  return n > 0.0 ? n : 0.0;
}

double ascr_power_throttle_for(const ascr_powertrain *pt, ascr_battery_state s, double rpm,
                               double torque_Nm, double *needed)
{
  /* I Rs d^2 - Voc d + (E + I Rm') = 0; the root that tends to (E + I Rm')/Voc as Rs -> 0 */
  const ascr_motor *m = &pt->motor;
  double voc = ascr_battery_open_voltage(&pt->battery, s);
  double rs = supply_resistance(pt);
  double rm = m->resistance_ohm + pt->esc.resistance_ohm;
  double i = torque_Nm / ascr_motor_torque_constant(m) + power_no_load_current(m, rpm);
  double c = rpm / m->kv_rpm_per_V + i * rm;
  double disc = voc * voc - 4.0 * i * rs * c;
  double d = NAN;
  if (disc >= 0.0) {
    d = 2.0 * c / (voc + sqrt(disc));
  }
  if (needed != NULL) {
    *needed = d;
  }
  return d >= 0.0 && d <= 1.0 ? d : NAN;
}
