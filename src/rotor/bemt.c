/* src/rotor/bemt.c
 * Blade-element momentum theory with swirl and Prandtl tip/hub loss, one residual in the
 * inflow angle phi per element (after Ning 2014, Wind Energy 17:1327, written here for a
 * propeller: thrust positive downstream, axial induction a > 0 speeds the flow through the
 * disc). Formulation (docs/theory/rotor.md):
 *
 *   tan phi = Vx (1 + a) / (Vy (1 - a')),  Vx = V, Vy = Omega r,  alpha = theta - phi
 *   cn = cl cos phi - cd sin phi,  ct = cl sin phi + cd cos phi,  sigma' = B c / (2 pi r)
 *   k = sigma' cn / (4 F sin^2 phi) = a / (1 + a),  k' = sigma' ct / (4 F sin phi cos phi) = a' / (1 - a')
 *   R(phi) = sin phi (1 - k) - (Vx / Vy) cos phi (1 + k') = 0
 *
 * which is regular in hover (Vx = 0: R = sin phi (1 - k)). In the turbulent-wake state of a
 * windmilling propeller (k < -2/3) the axial momentum relation is replaced by Buhl's
 * (2005, NREL/TP-500-36834) empirical thrust curve, as Ning (2014) does for turbines.
 * The bracket is sought over (0, pi/2], then (-pi/2, 0), then (pi/2, pi) (Ning's order); the
 * root by Brent. In hover (Vx = 0) an annulus with upflow (phi < 0) takes the momentum relation
 * with the flow reversed (k -> -k).
 * Re and Mach are taken at the previous pass's relative speed (first pass: no induction)
 * and the element solved again until Re settles (usually two passes).
 */
#include "rotor/rotor_impl.h"
#include "core/core_impl.h"
#include "polar/polar_impl.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <string.h>

#define DEG (ASCR_PI / 180.0)

ascr_rotor_params ascr_rotor_params_defaults(void)
{
  ascr_rotor_params p;
  p.density_kg_m3 = 1.225;
  p.viscosity_pa_s = 1.7894e-5;
  p.sound_speed_m_s = 340.294;
  p.n_elements = 40;
  p.tip_loss = 1;
  p.hub_loss = 1;
  p.swirl = 1;
  p.stall_delay = ASCR_STALL_DELAY_NONE;
  return p;
}

typedef struct elem_ctx {
  const ascr_blade *b;
  const ascr_polar_table *const *tables;
  const ascr_rotor_params *p;
  double r, chord, theta, sigma, vx, vy;
  double sd; /* stall-delay factor (rotor_stall_delay_factor) */
  size_t s0, s1;
  double w;
  double re, mach; /* fixed during one pass */
  /* outputs of the last evaluation */
  ascr_table_sample smp;
  double loss, k, kp, a, ap;
} elem_ctx;

static void lookup(elem_ctx *e, double alpha)
{
  rotor_sample(e->tables, e->s0, e->s1, e->w, alpha, e->re, e->mach, e->sd, &e->smp);
}

static double residual(double phi, void *ctx)
{
  elem_ctx *e = ctx;
  double sp = sin(phi), cp = cos(phi);
  lookup(e, e->theta - phi);
  double cn = e->smp.cl * cp - e->smp.cd * sp;
  double ct = e->smp.cl * sp + e->smp.cd * cp;
  double f = rotor_loss(e->b, e->p, e->r, sp);
  e->loss = f;
  double k = e->sigma * cn / (4.0 * f * sp * sp);
  double kp = e->p->swirl ? e->sigma * ct / (4.0 * f * sp * cp) : 0.0;
  e->k = k;
  e->kp = kp;
  double inv1pa = 1.0 - k; /* 1 / (1 + a) from momentum */
  if (e->vx == 0.0 && sp < 0.0) {
    /* hover, air going up through the annulus (an element with negative pitch): momentum
     * with the flow reversed, dT = -4 pi rho r F v^2 dr, i.e. k -> -k */
    inv1pa = 1.0 + k;
  }
  double kt = -k;          /* the turbine-convention k */
  if (e->vx > 0.0 && kt > 2.0 / 3.0) {
    /* Buhl's empirical curve in the turbulent-wake state (a_turbine = -a) */
    double g1 = 2.0 * f * kt - (10.0 / 9.0 - f);
    double g2 = 2.0 * f * kt - f * (4.0 / 3.0 - f);
    double g3 = 2.0 * f * kt - (25.0 / 9.0 - 2.0 * f);
    double at = fabs(g3) < 1e-6 ? 1.0 - 0.5 / sqrt(g2) : (g1 - sqrt(g2)) / g3;
    inv1pa = 1.0 / (1.0 - at);
  }
  e->a = fabs(inv1pa) > 1e-12 ? 1.0 / inv1pa - 1.0 : HUGE_VAL;
  e->ap = kp / (1.0 + kp);
  double r = sp * inv1pa - (e->vx / e->vy) * cp * (1.0 + kp);
  /* GSL's solvers call the error handler (abort by default) on a non-finite value: the library
   * must not depend on its caller switching that off, so the residual stays finite */
  if (!isfinite(r)) {
    r = r < 0.0 ? -1e300 : 1e300;
  }
  return r;
}

/* Find a bracket in (lo, hi) by scanning n sub-intervals from lo towards hi. */
static int scan(elem_ctx *e, double lo, double hi, int n, double *x0, double *x1)
{
  double fl = residual(lo, e);
  for (int i = 1; i <= n; i++) {
    double x = lo + (hi - lo) * i / n;
    double fx = residual(x, e);
    if (fabs(fl) < 1e299 && fabs(fx) < 1e299 && ((fl <= 0.0 && fx >= 0.0) || (fl >= 0.0 && fx <= 0.0))) {
      *x0 = lo + (hi - lo) * (i - 1) / n;
      *x1 = x;
      return 1;
    }
    fl = fx;
  }
  return 0;
}

static int solve_phi(elem_ctx *e, gsl_root_fsolver *s, double *phi)
{
  const double eps = 1e-6;
  double lo, hi;
  /* Ning's bracket first: (0, pi/2] holds the root of a propeller in normal operation; the
   * scans find the other states (and the lowest root where there are several) */
  int found = 0;
  if (isfinite(*phi)) {
    /* a later pass (Re and Mach updated): the root moves little; a narrow bracket first */
    double a = *phi - 0.01, b = *phi + 0.01;
    double fa = residual(a, e), fb = residual(b, e);
    if (fabs(fa) < 1e299 && fabs(fb) < 1e299 && fa * fb <= 0.0 && (a > 0.0) == (*phi > 0.0)) {
      lo = a;
      hi = b;
      found = 1;
    }
  }
  if (!found) {
    double f0 = residual(eps, e), f1 = residual(0.5 * ASCR_PI, e);
    if (fabs(f0) < 1e299 && fabs(f1) < 1e299 && f0 < 0.0 && f1 > 0.0) {
      lo = eps;
      hi = 0.5 * ASCR_PI;
      found = 1;
    }
  }
  /* Ning's order: the normal region, then negative phi (flow reversed through the annulus),
   * then (pi/2, pi) (swirl reversed), which before came second and gave elements with
   * negative pitch in hover phi near 145 deg and five times the rotor's thrust */
  found = found || scan(e, eps, 0.5 * ASCR_PI, 32, &lo, &hi) ||
              scan(e, -eps, -0.5 * ASCR_PI, 16, &lo, &hi) ||
              scan(e, 0.5 * ASCR_PI, ASCR_PI - eps, 16, &lo, &hi);
  if (!found) {
    return 0;
  }
  if (lo > hi) {
    double t = lo;
    lo = hi;
    hi = t;
  }
  gsl_function fn = {residual, e};
  if (gsl_root_fsolver_set(s, &fn, lo, hi) != GSL_SUCCESS) {
    return 0;
  }
  for (int it = 0; it < 100; it++) {
    if (gsl_root_fsolver_iterate(s) != GSL_SUCCESS) {
      return 0;
    }
    double x0 = gsl_root_fsolver_x_lower(s), x1 = gsl_root_fsolver_x_upper(s);
    if (gsl_root_test_interval(x0, x1, 1e-11, 0.0) == GSL_SUCCESS) {
      *phi = gsl_root_fsolver_root(s);
      double rr = residual(*phi, e); /* leaves the element state at the root */
      return fabs(rr) < 1e299;
    }
  }
  return 0;
}

static ascr_status check_inputs(const ascr_blade *b, const ascr_polar_table *const *tables,
                                const ascr_rotor_params *p, double rpm, double v, ascr_errbuf *err)
{
  ascr_status st = ascr_blade_validate(b, err);
  if (st != ASCR_OK) {
    return st;
  }
  if (tables == NULL) {
    return core_fail(err, ASCR_EINVAL, "rotor: no section tables");
  }
  for (size_t i = 0; i < b->n_sections; i++) {
    if (tables[i] == NULL) {
      return core_fail(err, ASCR_EINVAL, "rotor: no table for section %zu", i);
    }
  }
  if (!(p->density_kg_m3 > 0.0 && p->density_kg_m3 < 100.0) ||
      !(p->viscosity_pa_s > 0.0 && p->viscosity_pa_s < 1.0) ||
      !(p->sound_speed_m_s > 10.0 && p->sound_speed_m_s < 2000.0)) {
    return core_fail(err, ASCR_EINVAL, "rotor: air density %g kg/m3, viscosity %g Pa s or speed of "
                     "sound %g m/s out of range", p->density_kg_m3, p->viscosity_pa_s,
                     p->sound_speed_m_s);
  }
  if (p->n_elements < 4 || p->n_elements > 2000) {
    return core_fail(err, ASCR_EINVAL, "rotor: %zu blade elements, must be 4 .. 2000", p->n_elements);
  }
  if (p->stall_delay != ASCR_STALL_DELAY_NONE && p->stall_delay != ASCR_STALL_DELAY_SNEL) {
    return core_fail(err, ASCR_EINVAL, "rotor: stall-delay model %d unknown (0 none, 1 Snel)",
                     p->stall_delay);
  }
  if (!(isfinite(rpm) && rpm > 0.0 && rpm <= 1e6)) {
    return core_fail(err, ASCR_EINVAL, "rotor: rpm %g must be > 0 and at most 1e6", rpm);
  }
  if (!(isfinite(v) && v >= 0.0 && v <= 500.0)) {
    return core_fail(err, ASCR_EINVAL, "rotor: axial speed %g m/s must be in 0 .. 500", v);
  }
  return ASCR_OK;
}

ascr_status ascr_rotor_bemt(const ascr_blade *b, const ascr_polar_table *const *tables,
                            const ascr_rotor_params *pin, double rpm, double speed_m_s,
                            ascr_rotor_result *res, ascr_rotor_element *el, ascr_errbuf *err)
{
  ascr_rotor_params p = pin != NULL ? *pin : ascr_rotor_params_defaults();
  if (res == NULL) {
    return core_fail(err, ASCR_EINVAL, "rotor: no result");
  }
  ascr_status st = check_inputs(b, tables, &p, rpm, speed_m_s, err);
  if (st != ASCR_OK) {
    return st;
  }
  gsl_root_fsolver *solver = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
  if (solver == NULL) {
    return core_fail(err, ASCR_ENOMEM, "rotor: out of memory");
  }
  memset(res, 0, sizeof *res);
  double omega = rpm * 2.0 * ASCR_PI / 60.0;
  double r0 = b->stations[0].r_m, r1 = b->stations[b->n_stations - 1].r_m;
  size_t ne = p.n_elements;
  double thrust = 0.0, torque = 0.0;
  rotor_flags fl = {0, 0, 0, 0, 0, 0.0, 0.0};
  int all_ok = 1;
  for (size_t i = 0; i < ne; i++) {
    double ea = rotor_edge(r0, r1, i, ne), eb = rotor_edge(r0, r1, i + 1, ne);
    elem_ctx e;
    memset(&e, 0, sizeof e);
    e.b = b;
    e.tables = tables;
    e.p = &p;
    e.r = 0.5 * (ea + eb);
    double twist;
    rotor_blade_at(b, e.r, &e.chord, &twist, &e.s0, &e.s1, &e.w);
    e.sd = rotor_stall_delay_factor(&p, e.chord, e.r);
    e.theta = twist * DEG;
    e.sigma = b->n_blades * e.chord / (2.0 * ASCR_PI * e.r);
    e.vx = speed_m_s;
    e.vy = omega * e.r;
    double wrel = hypot(e.vx, e.vy);
    double phi = NAN;
    int ok = 0;
    for (int pass = 0; pass < 8; pass++) {
      e.re = p.density_kg_m3 * wrel * e.chord / p.viscosity_pa_s;
      e.mach = wrel / p.sound_speed_m_s;
      ok = solve_phi(&e, solver, &phi);
      if (!ok) {
        break;
      }
      double sp = sin(phi), cp = cos(phi);
      double wnew = fabs(cp) > 0.1 ? e.vy * (1.0 - e.ap) / fabs(cp)
                                   : fabs(e.vx * (1.0 + e.a) / sp);
      int settled = fabs(wnew - wrel) <= 1e-4 * wrel;
      wrel = wnew;
      if (settled) {
        break;
      }
      if (pass == 7) {
        ok = 0;
      }
    }
    double q = 0.5 * p.density_kg_m3 * wrel * wrel * e.chord * b->n_blades;
    double sp = sin(phi), cp = cos(phi);
    double dt = q * (e.smp.cl * cp - e.smp.cd * sp);
    double dq = q * (e.smp.cl * sp + e.smp.cd * cp) * e.r;
    double dr = eb - ea;
    if (ok) {
      thrust += dt * dr;
      torque += dq * dr;
    }
    all_ok &= ok;
    if (ok) rotor_flags_add(&fl, &e.smp, dt, dr);
    if (el != NULL) {
      ascr_rotor_element *o = &el[i];
      o->r_m = e.r;
      o->dr_m = dr;
      o->chord_m = e.chord;
      o->converged = ok;
      o->phi_deg = ok ? phi / DEG : NAN;
      o->alpha_deg = ok ? (e.theta - phi) / DEG : NAN;
      o->re = ok ? p.density_kg_m3 * wrel * e.chord / p.viscosity_pa_s : NAN;
      o->mach = ok ? wrel / p.sound_speed_m_s : NAN;
      o->cl = ok ? e.smp.cl : NAN;
      o->cd = ok ? e.smp.cd : NAN;
      o->cm = ok ? rotor_sample_cm(tables, e.s0, e.s1, e.w, e.theta - phi, o->re, o->mach) : NAN;
      o->dM_dr_Nm_m = ok ? 0.5 * p.density_kg_m3 * wrel * wrel * e.chord * e.chord * o->cm : NAN;
      o->v_axial_m_s = ok ? wrel * sp - e.vx : NAN;
      o->v_swirl_m_s = ok ? e.vy - wrel * cp : NAN;
      o->loss = ok ? e.loss : NAN;
      o->dT_dr_N_m = ok ? dt : NAN;
      o->dQ_dr_Nm_m = ok ? dq : NAN;
      o->region = e.smp.region;
      o->stalled = e.smp.stalled;
      o->re_outside = e.smp.re_outside;
      o->trip_unbound = e.smp.trip_unbound;
    }
  }
  gsl_root_fsolver_free(solver);

  rotor_point_finish(b, &p, rpm, speed_m_s, thrust, torque, all_ok, &fl, res);
  return ASCR_OK;
}
