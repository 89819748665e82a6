/* src/power/drive.c
 * Motor and propeller together: the shaft speed where the motor's torque (circuit.c) meets the
 * propeller's (ascr_rotor_point), the throttle that gives a thrust, and the throttle map with
 * its linearity figures. docs/theory/powertrain.md.
 */
#include "power/power_impl.h"
#include "core/core_impl.h"

#include <gsl/gsl_fit.h>
#include <math.h>
#include <string.h>

typedef struct balance_ctx {
  const ascr_drive *d;
  double throttle, speed, incidence;
  ascr_status st;      /* first failure of the rotor model */
  int converged;       /* every rotor point so far converged */
  int stop;            /* either failed: end the search */
  ascr_errbuf *err;
} balance_ctx;

/* Q_motor(rpm) - Q_prop(rpm); a failed evaluation sets the flags and returns 0 (finite: GSL
 * calls its error handler on a non-finite value) */
/* the propeller at rpm: axial by the chosen model, at incidence by the BEMT at incidence */
static ascr_status prop_at(const ascr_drive *d, double rpm, double speed, double incidence,
                           ascr_drive_point *o, ascr_errbuf *err)
{
  if (incidence == 0.0) {
    o->h_force_N = o->side_force_N = o->roll_moment_Nm = o->pitch_moment_Nm = 0.0;
    return ascr_rotor_point(d->blade, d->tables, d->params, d->model, d->vortex, rpm, speed,
                            &o->rotor, NULL, err);
  }
  ascr_rotor_incidence_result ir;
  ascr_status st = ascr_rotor_incidence(d->blade, d->tables, d->params, rpm, speed, incidence, 0,
                                        &ir, err);
  if (st == ASCR_OK) {
    o->rotor = ir.r;
    o->h_force_N = ir.h_force_N;
    o->side_force_N = ir.side_force_N;
    o->roll_moment_Nm = ir.roll_moment_Nm;
    o->pitch_moment_Nm = ir.pitch_moment_Nm;
  }
  return st;
}

static double balance_fn(double rpm, void *vc)
{
  balance_ctx *c = vc;
  ascr_power_state ps;
  ascr_drive_point tmp;
  ascr_power_state_at(c->d->powertrain, c->d->state, c->throttle, rpm, &ps, NULL);
  ascr_status st = prop_at(c->d, rpm, c->speed, c->incidence, &tmp, c->err);
  const ascr_rotor_result rr = tmp.rotor;
  if (st != ASCR_OK || !rr.converged) {
    c->st = st;
    c->converged = 0;
    c->stop = 1;
    return 0.0;
  }
  return ps.motor_torque_Nm - rr.torque_Nm;
}

static ascr_status check_drive(const ascr_drive *d, ascr_errbuf *err)
{
  if (d == NULL || d->blade == NULL || d->tables == NULL || d->powertrain == NULL) {
    return core_fail(err, ASCR_EINVAL, "drive: blade, tables and powertrain are required");
  }
  return ascr_powertrain_validate(d->powertrain, err);
}

/* the flags of the currents and of the propeller point */
static unsigned limit_flags(const ascr_powertrain *pt, const ascr_drive_point *o)
{
  unsigned f = 0;
  double im = fabs(o->power.motor_current_A), ib = fabs(o->power.battery_current_A);
  if (im > pt->motor.max_current_A) f |= ASCR_DRIVE_OVER_MOTOR_CURRENT;
  if (im > pt->esc.max_current_A) f |= ASCR_DRIVE_OVER_ESC_CURRENT;
  if (ib > pt->battery.max_current_A) f |= ASCR_DRIVE_OVER_BATTERY_CURRENT;
  if (o->rotor.converged && o->rotor.low_confidence) f |= ASCR_DRIVE_LOW_CONFIDENCE;
  return f; /* comparisons with a NaN limit (none stated) are false */
}

/* the motor standing: no propeller forces, the stall current flows */
static void standstill(const ascr_drive *d, double throttle, double speed, ascr_drive_point *o)
{
  ascr_power_state_at(d->powertrain, d->state, throttle, 0.0, &o->power, NULL);
  memset(&o->rotor, 0, sizeof o->rotor);
  o->rotor.speed_m_s = speed;
  o->rotor.efficiency = o->rotor.figure_of_merit = NAN;
  o->rotor.converged = 1;
  o->flags = ASCR_DRIVE_STANDSTILL;
  /* in an airflow a standing propeller is turned by it: not an equilibrium of this model */
  o->converged = speed == 0.0;
  if (speed > 0.0) o->flags |= ASCR_DRIVE_WINDMILLING;
}

ascr_status ascr_drive_point_at(const ascr_drive *d, double throttle, double speed_m_s,
                                ascr_drive_point *out, ascr_errbuf *err)
{
  return ascr_drive_point_incidence(d, throttle, speed_m_s, 0.0, out, err);
}

ascr_status ascr_drive_point_incidence(const ascr_drive *d, double throttle, double speed_m_s,
                                       double incidence_deg, ascr_drive_point *out,
                                       ascr_errbuf *err)
{
  if (out == NULL || !(throttle >= 0.0 && throttle <= 1.0) || !(speed_m_s >= 0.0) ||
      !isfinite(speed_m_s) || !(incidence_deg >= 0.0 && incidence_deg <= 90.0)) {
    return core_fail(err, ASCR_EINVAL, "drive: throttle must be 0 .. 1, the airspeed >= 0 and the "
                     "incidence 0 .. 90 deg");
  }
  if (incidence_deg != 0.0 && d != NULL && d->model != ASCR_INFLOW_BEMT) {
    return core_fail(err, ASCR_EINVAL, "drive: the disc at incidence is modelled with the BEMT "
                     "only (not the vortex model)");
  }
  ascr_status st = check_drive(d, err);
  if (st != ASCR_OK) {
    return st;
  }
  memset(out, 0, sizeof *out);
  out->throttle = throttle;
  out->speed_m_s = speed_m_s;
  out->incidence_deg = incidence_deg;
  double n_nl = ascr_power_no_load_rpm(d->powertrain, d->state, throttle);
  if (!(n_nl > 1.0)) {
    standstill(d, throttle, speed_m_s, out);
    return ASCR_OK;
  }
  balance_ctx c = {d, throttle, speed_m_s, incidence_deg, ASCR_OK, 1, 0, err};
  /* upper end: at the no-load speed the motor gives no torque; the propeller needs some unless
   * the airflow drives it (windmilling) */
  double f_hi = balance_fn(n_nl, &c);
  if (c.st != ASCR_OK) {
    return c.st;
  }
  if (!c.converged) {
    out->rotor.rpm = n_nl;
    return ASCR_OK; /* not converged */
  }
  if (f_hi >= 0.0) {
    out->flags = ASCR_DRIVE_WINDMILLING;
    out->rotor.rpm = n_nl;
    return ASCR_OK;
  }
  /* lower end: towards standstill the motor gives its stall torque, the propeller almost none
   * (or a windmilling torque, negative); step down until the balance changes sign */
  static const double frac[] = {0.9, 0.75, 0.5, 0.25, 0.1, 0.03, 0.01};
  double lo = NAN, hi = n_nl;
  for (size_t k = 0; k < sizeof frac / sizeof frac[0]; k++) {
    double n = frac[k] * n_nl;
    double f = balance_fn(n, &c);
    if (c.st != ASCR_OK) {
      return c.st;
    }
    if (!c.converged) {
      return ASCR_OK;
    }
    if (f > 0.0) {
      lo = n;
      break;
    }
    hi = n;
  }
  if (isnan(lo)) {
    return ASCR_OK; /* no sign change down to 1 % of the no-load speed: not converged */
  }
  double rpm;
  if (core_brent(balance_fn, &c, &c.stop, lo, hi, 0.0, 1e-9, 100, &rpm) == ASCR_ENOMEM) {
    return core_fail(err, ASCR_ENOMEM, "drive: out of memory");
  }
  if (c.st != ASCR_OK) {
    return c.st;
  }
  if (!c.converged || isnan(rpm)) {
    return ASCR_OK;
  }
  st = prop_at(d, rpm, speed_m_s, incidence_deg, out, err);
  if (st != ASCR_OK) {
    return st;
  }
  ascr_power_state_at(d->powertrain, d->state, throttle, rpm, &out->power, NULL);
  out->converged = out->rotor.converged;
  out->flags = limit_flags(d->powertrain, out);
  return ASCR_OK;
}

ascr_status ascr_drive_throttle_for_thrust(const ascr_drive *d, double thrust_N,
                                           double speed_m_s, ascr_drive_point *out,
                                           ascr_errbuf *err)
{
  if (out == NULL || !(thrust_N > 0.0 && isfinite(thrust_N)) || !(speed_m_s >= 0.0) ||
      !isfinite(speed_m_s)) {
    return core_fail(err, ASCR_EINVAL, "drive: the thrust must be > 0 and the airspeed >= 0");
  }
  ascr_status st = check_drive(d, err);
  if (st != ASCR_OK) {
    return st;
  }
  memset(out, 0, sizeof *out);
  out->speed_m_s = speed_m_s;
  double n_max = ascr_power_no_load_rpm(d->powertrain, d->state, 1.0);
  if (!(n_max > 100.0)) {
    return core_fail(err, ASCR_EDOM, "drive: the motor cannot turn at full throttle");
  }
  st = ascr_rotor_rpm_for_thrust(d->blade, d->tables, d->params, d->model, d->vortex, thrust_N,
                                 speed_m_s, 0.01 * n_max, n_max, &out->rotor, NULL, err);
  if (st == ASCR_EDOM) {
    return core_fail(err, ASCR_EDOM,
                     "drive: %g N at %g m/s is not reached below the full-throttle no-load speed "
                     "(%.0f rpm)", thrust_N, speed_m_s, n_max);
  }
  if (st != ASCR_OK) {
    return st;
  }
  double need;
  double thr = ascr_power_throttle_for(d->powertrain, d->state, out->rotor.rpm,
                                       out->rotor.torque_Nm, &need);
  if (isnan(thr)) {
    if (isnan(need)) {
      return core_fail(err, ASCR_EDOM, "drive: %g N needs %.0f rpm and %.4g N m, more than the "
                       "battery can supply at any throttle", thrust_N, out->rotor.rpm,
                       out->rotor.torque_Nm);
    }
    return core_fail(err, ASCR_EDOM, "drive: %g N needs %.0f rpm and %.4g N m: throttle %.0f %%, "
                     "beyond full throttle", thrust_N, out->rotor.rpm, out->rotor.torque_Nm,
                     100.0 * need);
  }
  out->throttle = thr;
  ascr_power_state_at(d->powertrain, d->state, thr, out->rotor.rpm, &out->power, NULL);
  out->converged = out->rotor.converged;
  out->flags = limit_flags(d->powertrain, out);
  return ASCR_OK;
}

ascr_status ascr_drive_linearity_at(const ascr_drive *d, double speed_m_s,
                                    ascr_drive_linearity *out, ascr_errbuf *err)
{
  if (out == NULL) {
    return core_fail(err, ASCR_EINVAL, "drive: no result");
  }
  memset(out, 0, sizeof *out);
  out->speed_m_s = speed_m_s;
  out->band[0] = out->band[1] = out->max_deviation = out->gain_ratio = NAN;
  out->fit_offset_N = out->fit_slope_N = NAN;
  const size_t n = ASCR_DRIVE_MAP_POINTS;
  for (size_t i = 0; i < n; i++) {
    double t = (double)i / (double)(n - 1);
    ascr_status st = ascr_drive_point_at(d, t, speed_m_s, &out->grid[i], err);
    if (st != ASCR_OK) {
      return st;
    }
  }
  /* the usable band: the longest run of turning, thrusting, converged points ending at 1 */
  size_t i0 = n;
  while (i0 > 0) {
    const ascr_drive_point *p = &out->grid[i0 - 1];
    if (!p->converged || (p->flags & ASCR_DRIVE_STANDSTILL) || !(p->rotor.thrust_N > 0.0)) {
      break;
    }
    i0--;
  }
  if (n - i0 < 3) {
    return ASCR_OK; /* fewer than three points: no line, not complete */
  }
  double x[ASCR_DRIVE_MAP_POINTS], y[ASCR_DRIVE_MAP_POINTS];
  size_t m = 0;
  for (size_t i = i0; i < n; i++, m++) {
    x[m] = out->grid[i].throttle;
    y[m] = out->grid[i].rotor.thrust_N;
  }
  double c0, c1, v00, v01, v11, ss;
  gsl_fit_linear(x, 1, y, 1, m, &c0, &c1, &v00, &v01, &v11, &ss);
  double dev = 0.0;
  for (size_t i = 0; i < m; i++) {
    dev = fmax(dev, fabs(y[i] - (c0 + c1 * x[i])));
  }
  out->band[0] = x[0];
  out->band[1] = 1.0;
  out->fit_offset_N = c0;
  out->fit_slope_N = c1;
  out->max_deviation = dev / y[m - 1];
  /* thrust gains by central differences at 25 % and 75 % (inside the band only) */
  const double h = 0.025, at[2] = {0.25, 0.75};
  double gain[2];
  for (int k = 0; k < 2; k++) {
    if (at[k] - h < out->band[0]) {
      return ASCR_OK;
    }
    ascr_drive_point a, b;
    ascr_status st = ascr_drive_point_at(d, at[k] - h, speed_m_s, &a, err);
    if (st == ASCR_OK) {
      st = ascr_drive_point_at(d, at[k] + h, speed_m_s, &b, err);
    }
    if (st != ASCR_OK) {
      return st;
    }
    if (!a.converged || !b.converged) {
      return ASCR_OK;
    }
    gain[k] = (b.rotor.thrust_N - a.rotor.thrust_N) / (2.0 * h);
  }
  out->gain_ratio = gain[0] / gain[1];
  out->complete = 1;
  return ASCR_OK;
}
