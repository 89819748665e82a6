/* src/power/flight.c
 * The craft on its powertrain: hover (throttle, currents, endurance) and the largest vertical
 * climb rate. Forward flight with the disc at incidence is not modelled yet.
 * docs/theory/powertrain.md ("The craft").
 */
#include "power/power_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <string.h>

static ascr_status need_craft(const ascr_drive *d, ascr_errbuf *err)
{
  if (d == NULL || d->powertrain == NULL || !d->powertrain->has_craft) {
    return core_fail(err, ASCR_EINVAL, "drive: the powertrain file gives no craft (mass, rotors)");
  }
  return ASCR_OK;
}

ascr_status ascr_drive_hover(const ascr_drive *d, ascr_drive_point *out, double *endurance_s,
                             ascr_errbuf *err)
{
  ascr_status st = need_craft(d, err);
  if (st != ASCR_OK) {
    return st;
  }
  const ascr_craft *c = &d->powertrain->craft;
  double thrust = c->mass_kg * ASCR_STANDARD_GRAVITY / (double)c->rotors;
  st = ascr_drive_throttle_for_thrust(d, thrust, 0.0, out, err);
  if (endurance_s != NULL) {
    const ascr_battery *b = &d->powertrain->battery;
    double ib = out->power.battery_current_A;
    *endurance_s = st == ASCR_OK && ib > 0.0 ? b->usable_share * b->capacity_Ah * 3600.0 / ib : NAN;
  }
  return st;
}

typedef struct climb_ctx {
  const ascr_drive *d;
  double weight, drag_k;   /* m g; 1/2 rho CdA */
  ascr_drive_point pt;
  ascr_status st;
  int failed;              /* a full-throttle point did not converge */
  int stop;                /* an evaluation failed: end the search */
  ascr_errbuf *err;
} climb_ctx;

/* rotors T(1, Vc) - m g - 1/2 rho Vc^2 CdA; a failed evaluation sets the flags and returns 0
 * (finite: GSL calls its error handler on a non-finite value) */
static double surplus(double vc, void *vx)
{
  climb_ctx *c = vx;
  ascr_status st = ascr_drive_point_at(c->d, 1.0, vc, &c->pt, c->err);
  if (st != ASCR_OK || !c->pt.converged) {
    c->st = st;
    c->failed = 1;
    c->stop = 1;
    return 0.0;
  }
  return (double)c->d->powertrain->craft.rotors * c->pt.rotor.thrust_N - c->weight - c->drag_k * vc * vc;
}

ascr_status ascr_drive_max_climb(const ascr_drive *d, double *climb_m_s, ascr_drive_point *out,
                                 ascr_errbuf *err)
{
  ascr_status st = need_craft(d, err);
  if (st != ASCR_OK) {
    return st;
  }
  if (climb_m_s == NULL || out == NULL) {
    return core_fail(err, ASCR_EINVAL, "drive: no result");
  }
  const ascr_craft *cr = &d->powertrain->craft;
  climb_ctx c;
  memset(&c, 0, sizeof c);
  c.d = d;
  c.weight = cr->mass_kg * ASCR_STANDARD_GRAVITY;
  c.drag_k = 0.5 * d->params->density_kg_m3 * cr->drag_area_m2;
  c.st = ASCR_OK;
  c.err = err;
  double f0 = surplus(0.0, &c);
  if (c.st != ASCR_OK) {
    return c.st;
  }
  if (c.failed) {
    return core_fail(err, ASCR_EMAXITER, "drive: the full-throttle point in hover did not converge");
  }
  if (!(f0 > 0.0)) {
    return core_fail(err, ASCR_EDOM, "drive: full throttle gives %.4g N in all, less than the "
                     "craft's weight %.4g N: it cannot climb", f0 + c.weight, c.weight);
  }
  double lo = 0.0, hi = 2.0, fh = NAN;
  for (; hi <= 128.0; hi *= 2.0) {
    fh = surplus(hi, &c);
    if (c.st != ASCR_OK) {
      return c.st;
    }
    if (c.failed || !(fh > 0.0)) {
      break;
    }
    lo = hi;
  }
  if (c.failed) {
    /* a windmilling or unconverged point at hi: the surplus is gone before it (the prop
     * cannot drive the air faster than its no-load pitch speed); search below it on the
     * points that converge by bisection to the last converged speed */
    double a = lo, b = hi;
    for (int it = 0; it < 40; it++) {
      double m = 0.5 * (a + b);
      c.failed = 0;
      double fm = surplus(m, &c);
      if (c.st != ASCR_OK) {
        return c.st;
      }
      if (c.failed) {
        b = m;
      } else if (fm > 0.0) {
        a = m;
      } else {
        hi = m;
        fh = fm;
        break;
      }
    }
    if (c.failed || !(fh <= 0.0)) {
      return core_fail(err, ASCR_EMAXITER, "drive: the climb rate could not be bracketed (the "
                       "full-throttle point fails to converge near %.3g m/s)", b);
    }
    lo = a;
  }
  if (!(fh <= 0.0)) {
    return core_fail(err, ASCR_EMAXITER, "drive: still climbing at 128 m/s: check the craft");
  }
  double vc;
  c.stop = 0;
  if (core_brent(surplus, &c, &c.stop, lo, hi, 1e-9, 1e-9, 100, &vc) == ASCR_ENOMEM) {
    return core_fail(err, ASCR_ENOMEM, "drive: out of memory");
  }
  if (c.st != ASCR_OK) {
    return c.st;
  }
  if (c.failed || isnan(vc)) {
    return core_fail(err, ASCR_EMAXITER, "drive: the climb-rate search did not converge");
  }
  (void)surplus(vc, &c);
  *climb_m_s = vc;
  *out = c.pt;
  return ASCR_OK;
}

/* Level flight at speed V with the discs tilted forward by tau (rad): the airflow meets each
 * rotor at incidence 90 deg - tau; thrust T along the axis, H along the in-plane flow, which
 * points rearward and upward in the craft's frame. */
typedef struct level_ctx {
  const ascr_drive *d;
  double v, weight, drag_k;
  double tau;              /* the last tilt solved (rad) */
  ascr_drive_point pt;
  ascr_status st;
  int stop;
  ascr_errbuf *err;
} level_ctx;

/* full throttle at tilt tau: the vertical surplus rotors (T cos tau + H sin tau) - m g */
static double vertical(double tau, void *vx)
{
  level_ctx *c = vx;
  double inc = 90.0 - tau * 180.0 / ASCR_PI;
  if (inc < 0.0) inc = 0.0;
  if (inc > 90.0) inc = 90.0;
  ascr_status st = ascr_drive_point_incidence(c->d, 1.0, c->v, inc, &c->pt, c->err);
  if (st != ASCR_OK || !c->pt.converged) {
    c->st = st;
    c->stop = 1;
    return 0.0;
  }
  double n = (double)c->d->powertrain->craft.rotors;
  return n * (c->pt.rotor.thrust_N * cos(tau) + c->pt.h_force_N * sin(tau)) - c->weight;
}

typedef struct top_ctx {
  level_ctx lv;
  int failed;   /* no level-flight tilt at some speed */
  int stop;
} top_ctx;

/* horizontal surplus at speed v with the tilt that holds the craft up:
 * rotors (T sin tau - H cos tau) - 1/2 rho V^2 CdA */
static double horizontal(double v, void *vx)
{
  top_ctx *t = vx;
  level_ctx *c = &t->lv;
  c->v = v;
  c->stop = 0;
  const double lo = 1e-4, hi = 0.5 * ASCR_PI - 1e-4;
  double flo = vertical(lo, c);
  double fhi = c->stop ? 0.0 : vertical(hi, c);
  double tau;
  if (c->stop || !(flo > 0.0) || !(fhi < 0.0) ||
      core_brent(vertical, c, &c->stop, lo, hi, 1e-9, 0.0, 100, &tau) != ASCR_OK) {
    t->failed = 1;
    t->stop = 1;
    return 0.0;
  }
  (void)vertical(tau, c);
  c->tau = tau;
  double n = (double)c->d->powertrain->craft.rotors;
  return n * (c->pt.rotor.thrust_N * sin(tau) - c->pt.h_force_N * cos(tau)) - c->drag_k * v * v;
}

ascr_status ascr_drive_top_speed(const ascr_drive *d, double *speed_m_s, double *tilt_deg,
                                 ascr_drive_point *out, ascr_errbuf *err)
{
  ascr_status st = need_craft(d, err);
  if (st != ASCR_OK) {
    return st;
  }
  if (speed_m_s == NULL || tilt_deg == NULL || out == NULL) {
    return core_fail(err, ASCR_EINVAL, "drive: no result");
  }
  if (d->model != ASCR_INFLOW_BEMT) {
    return core_fail(err, ASCR_EINVAL, "drive: the top speed needs the disc at incidence, modelled "
                     "with the BEMT only");
  }
  const ascr_craft *cr = &d->powertrain->craft;
  top_ctx t;
  memset(&t, 0, sizeof t);
  t.lv.d = d;
  t.lv.weight = cr->mass_kg * ASCR_STANDARD_GRAVITY;
  t.lv.drag_k = 0.5 * d->params->density_kg_m3 * cr->drag_area_m2;
  t.lv.st = ASCR_OK;
  t.lv.err = err;
  /* the bracket: surplus at 1 m/s (must be positive), doubling until it is gone */
  double lo = 1.0, f = horizontal(lo, &t);
  if (t.lv.st != ASCR_OK) {
    return t.lv.st;
  }
  if (t.failed || !(f > 0.0)) {
    return core_fail(err, ASCR_EDOM, "drive: full throttle does not hold the craft up in slow "
                     "level flight: no top speed");
  }
  double hi = 2.0;
  for (; hi <= 128.0; hi *= 2.0) {
    f = horizontal(hi, &t);
    if (t.lv.st != ASCR_OK) {
      return t.lv.st;
    }
    if (t.failed || !(f > 0.0)) {
      break;
    }
    lo = hi;
  }
  if (t.failed) {
    /* no level-flight tilt at hi (the discs cannot hold the weight there): the top speed is
     * below it; halve towards lo until a tilt exists with the surplus gone, or give up */
    double a = lo, b = hi;
    int found = 0;
    for (int it = 0; it < 30 && !found; it++) {
      double m = 0.5 * (a + b);
      t.failed = 0;
      t.stop = 0;
      double fm = horizontal(m, &t);
      if (t.lv.st != ASCR_OK) {
        return t.lv.st;
      }
      if (t.failed) {
        b = m;
      } else if (fm > 0.0) {
        a = m;
      } else {
        hi = m;
        found = 1;
      }
    }
    if (!found) {
      return core_fail(err, ASCR_EMAXITER, "drive: level flight ends near %.3g m/s without the "
                       "thrust running out (no tilt holds the craft up beyond it)", a);
    }
    lo = a;
  }
  if (hi > 128.0) {
    return core_fail(err, ASCR_EMAXITER, "drive: still accelerating at 128 m/s: check the craft");
  }
  t.failed = t.stop = 0;
  double v;
  if (core_brent(horizontal, &t, &t.stop, lo, hi, 1e-6, 1e-7, 100, &v) != ASCR_OK) {
    return t.lv.st != ASCR_OK ? t.lv.st
                              : core_fail(err, ASCR_EMAXITER, "drive: the top-speed search did not converge");
  }
  (void)horizontal(v, &t);
  *speed_m_s = v;
  *tilt_deg = t.lv.tau * 180.0 / ASCR_PI;
  *out = t.lv.pt;
  return ASCR_OK;
}
