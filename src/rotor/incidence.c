/* src/rotor/incidence.c
 * BEMT with the disc at incidence (a multirotor's forward flight): Glauert's forward-flight
 * momentum balance per annulus against blade elements averaged over the azimuth, the induced
 * velocity skewed across the disc by the linear inflow of Coleman, Feingold & Stempin (1945).
 * Formulation and checks: docs/theory/rotor.md ("The disc at incidence").
 *
 * Azimuth psi is measured in the sense of rotation from the downstream direction of the in-plane
 * flow, so that the advancing blade is at psi = 90 deg: U_T = Omega r + Vp sin psi - u,
 * U_P = Va + v (1 + K (r/R) cos psi), K = tan(chi/2), tan chi = Vp / (Va + v_mean).
 * Unknowns per annulus: the azimuth-mean axial and swirl induced velocities (v, u), from
 *   f1 = B <q c cn> - 4 pi r rho F v Wm = 0,   f2 = B <q c ct> r - 4 pi r^2 rho F u Wm = 0,
 *   Wm = sqrt(Vp^2 + (Va + v)^2), F (Prandtl) at the mean inflow angle atan2(Va + v, Omega r - u),
 * <.> the mean over the azimuths. With Vp = 0 these are the axial BEMT's equations in (a, a')
 * (v = a Va, u = a' Omega r): the same solution.
 */
#include "rotor/rotor_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define DEG (ASCR_PI / 180.0)
#define MAX_AZ 360

typedef struct ann {
  const ascr_blade *b;
  const ascr_polar_table *const *tables;
  const ascr_rotor_params *p;
  double r, chord, theta, omega, va, vp, kx; /* kx = K r / R */
  size_t s0, s1;
  double w;
  size_t n;
  const double *sps, *cps;
  /* outputs of the last evaluation (azimuth means, all blades, per unit span) */
  double dt, dq, dh, dy, mx, my, loss;
  ascr_table_sample flags; /* flags over the azimuths */
  int stop;
} ann;

/* blade-element loads at (v, u) and the two residuals */
static void eval(ann *a, double v, double u, double *f1, double *f2)
{
  const ascr_rotor_params *p = a->p;
  double dt = 0.0, dq = 0.0, dh = 0.0, dy = 0.0, mx = 0.0, my = 0.0;
  a->flags.region = 0;
  a->flags.stalled = a->flags.re_outside = a->flags.trip_unbound = 0;
  for (size_t k = 0; k < a->n; k++) {
    double up = a->va + v * (1.0 + a->kx * a->cps[k]);
    double ut = a->omega * a->r + a->vp * a->sps[k] - u;
    double w2 = up * up + ut * ut, wr = sqrt(w2);
    double phi = atan2(up, ut), sp = up / (wr > 0.0 ? wr : 1.0), cp = ut / (wr > 0.0 ? wr : 1.0);
    ascr_table_sample q;
    rotor_sample(a->tables, a->s0, a->s1, a->w, a->theta - phi, p->density_kg_m3 * wr * a->chord / p->viscosity_pa_s,
                 wr / p->sound_speed_m_s, rotor_stall_delay_factor(p, a->chord, a->r), &q);
    double qc = 0.5 * p->density_kg_m3 * w2 * a->chord * a->b->n_blades;
    double cn = q.cl * cp - q.cd * sp, ct = q.cl * sp + q.cd * cp;
    dt += qc * cn;
    dq += qc * ct * a->r;
    dh += qc * ct * a->sps[k];
    dy -= qc * ct * a->cps[k];
    mx += qc * cn * a->r * a->sps[k];
    my += qc * cn * a->r * a->cps[k];
    a->flags.region = q.region > a->flags.region ? q.region : a->flags.region;
    a->flags.stalled |= q.stalled;
    a->flags.re_outside |= q.re_outside;
    a->flags.trip_unbound |= q.trip_unbound;
  }
  double inv = 1.0 / (double)a->n;
  a->dt = dt * inv;
  a->dq = dq * inv;
  a->dh = dh * inv;
  a->dy = dy * inv;
  a->mx = mx * inv;
  a->my = my * inv;
  double wm = sqrt(a->vp * a->vp + (a->va + v) * (a->va + v));
  double phim = atan2(a->va + v, a->omega * a->r - u);
  double f = rotor_loss(a->b, p, a->r, sin(phim));
  a->loss = f;
  double m = 4.0 * ASCR_PI * a->r * p->density_kg_m3 * f * wm;
  *f1 = a->dt - m * v;
  *f2 = a->dq - m * a->r * u;
}

/* scale of the residuals: the dynamic pressure of the blade speed on the annulus' chords */
static double fscale(const ann *a)
{
  double ut = a->omega * a->r + a->vp;
  return 0.5 * a->p->density_kg_m3 * (ut * ut + a->va * a->va) * a->chord * a->b->n_blades + 1e-300;
}

/* Newton's method on (v, u) with a finite-difference Jacobian and a backtracking step. */
static int newton(ann *a, double *v, double *u)
{
  double vs = a->omega * a->r + hypot(a->va, a->vp); /* velocity scale */
  double f1, f2, sc = fscale(a);
  eval(a, *v, *u, &f1, &f2);
  for (int it = 0; it < 40; it++) {
    double nrm = hypot(f1, f2 / a->r) / sc;
    if (!isfinite(nrm)) return 0;
    double h = 1e-7 * vs, g1, g2, k1, k2;
    eval(a, *v + h, *u, &g1, &g2);
    eval(a, *v, *u + h, &k1, &k2);
    double j11 = (g1 - f1) / h, j21 = (g2 - f2) / h, j12 = (k1 - f1) / h, j22 = (k2 - f2) / h;
    double det = j11 * j22 - j12 * j21;
    if (!(fabs(det) > 0.0) || !isfinite(det)) return 0;
    double dv = -(f1 * j22 - f2 * j12) / det, du = -(j11 * f2 - j21 * f1) / det;
    double lam = 1.0;
    for (int ls = 0; ls < 20; ls++, lam *= 0.5) {
      double n1, n2;
      eval(a, *v + lam * dv, *u + lam * du, &n1, &n2);
      if (hypot(n1, n2 / a->r) / sc < (1.0 - 1e-4 * lam) * nrm || lam < 1e-5) {
        *v += lam * dv;
        *u += lam * du;
        f1 = n1;
        f2 = n2;
        break;
      }
    }
    if (fabs(lam * dv) < 1e-12 * vs && fabs(lam * du) < 1e-12 * vs) {
      eval(a, *v, *u, &f1, &f2);
      return hypot(f1, f2 / a->r) / sc < 1e-8;
    }
  }
  return 0;
}

/* alternating bracketed solves: v from f1 at fixed u, u from f2 at fixed v */
typedef struct one_ctx {
  ann *a;
  double v, u;
  int which; /* 0: solve for v, 1: for u */
} one_ctx;

static double one_fn(double x, void *vc)
{
  one_ctx *c = vc;
  double f1, f2;
  if (c->which == 0) {
    eval(c->a, x, c->u, &f1, &f2);
    return isfinite(f1) ? f1 : 0.0;
  }
  eval(c->a, c->v, x, &f1, &f2);
  return isfinite(f2) ? f2 : 0.0;
}

static int bracket_solve(one_ctx *c, double x0, double scale, double *root)
{
  double f0 = one_fn(x0, c);
  if (f0 == 0.0) {
    *root = x0;
    return 1;
  }
  /* both residuals fall as their unknown grows: step towards the sign change */
  double dir = f0 > 0.0 ? 1.0 : -1.0, step = 0.02 * scale, lo = x0, flo = f0;
  for (int k = 0; k < 40; k++, step *= 1.6) {
    double x = lo + dir * step, fx = one_fn(x, c);
    if ((fx > 0.0) != (flo > 0.0)) {
      int stop = 0;
      double a = dir > 0.0 ? lo : x, b = dir > 0.0 ? x : lo;
      return core_brent(one_fn, c, &stop, a, b, 1e-13 * scale, 0.0, 100, root) == ASCR_OK;
    }
    lo = x;
    flo = fx;
  }
  return 0;
}

static int alternate(ann *a, double *v, double *u)
{
  double vs = a->omega * a->r + hypot(a->va, a->vp);
  one_ctx c = {a, *v, *u, 0};
  for (int it = 0; it < 200; it++) {
    double vn, un;
    c.which = 0;
    if (!bracket_solve(&c, c.v, vs, &vn)) return 0;
    c.v = vn;
    c.which = 1;
    if (!bracket_solve(&c, c.u, vs, &un)) return 0;
    double dv = fabs(vn - *v), du = fabs(un - *u);
    *v = vn;
    *u = un;
    c.u = un;
    if (dv < 1e-11 * vs && du < 1e-11 * vs) {
      double f1, f2;
      eval(a, *v, *u, &f1, &f2);
      return 1;
    }
  }
  return 0;
}

ascr_status ascr_rotor_incidence(const ascr_blade *b, const ascr_polar_table *const *tables,
                                 const ascr_rotor_params *pin, double rpm, double speed_m_s,
                                 double incidence_deg, size_t n_azimuth,
                                 ascr_rotor_incidence_result *res, ascr_errbuf *err)
{
  ascr_rotor_params p = pin != NULL ? *pin : ascr_rotor_params_defaults();
  if (res == NULL || !(incidence_deg >= 0.0 && incidence_deg <= 90.0) ||
      (n_azimuth != 0 && (n_azimuth < 4 || n_azimuth > MAX_AZ))) {
    return core_fail(err, ASCR_EINVAL, "rotor at incidence: incidence %g deg must be 0 .. 90 and "
                     "the azimuths 4 .. %d", incidence_deg, MAX_AZ);
  }
  size_t naz = n_azimuth == 0 ? 24 : n_azimuth;
  memset(res, 0, sizeof *res);
  double va = speed_m_s * cos(incidence_deg * DEG), vp = speed_m_s * sin(incidence_deg * DEG);
  if (incidence_deg == 90.0) va = 0.0;
  /* the axial BEMT at the axial component: checks the input, starts the induced velocities */
  ascr_rotor_element *el = core_calloc(p.n_elements, sizeof *el);
  double *v = core_calloc(2 * p.n_elements, sizeof *v);
  if (el == NULL || v == NULL) {
    free(el);
    free(v);
    return core_fail(err, ASCR_ENOMEM, "rotor at incidence: out of memory");
  }
  double *u = v + p.n_elements;
  ascr_rotor_result br;
  ascr_status st = ascr_rotor_bemt(b, tables, &p, rpm, va, &br, el, err);
  if (st != ASCR_OK) {
    free(el);
    free(v);
    return st;
  }
  double sps[MAX_AZ], cps[MAX_AZ];
  for (size_t k = 0; k < naz; k++) {
    double psi = 2.0 * ASCR_PI * ((double)k + 0.5) / (double)naz;
    sps[k] = sin(psi);
    cps[k] = cos(psi);
  }
  double omega = rpm * 2.0 * ASCR_PI / 60.0, area = 0.0;
  for (size_t i = 0; i < p.n_elements; i++) {
    v[i] = el[i].converged ? el[i].v_axial_m_s : 0.0;
    u[i] = el[i].converged ? el[i].v_swirl_m_s : 0.0;
    area += 2.0 * ASCR_PI * el[i].r_m * el[i].dr_m;
  }
  double vmean = 0.0, kfac = 0.0;
  int all_ok = 0;
  double thrust = 0.0, torque = 0.0, h = 0.0, y = 0.0, mx = 0.0, my = 0.0;
  rotor_flags fl;
  for (int pass = 0; pass < 50; pass++) {
    /* the skew from the disc's mean inflow of the last pass */
    double vm = 0.0;
    for (size_t i = 0; i < p.n_elements; i++) vm += v[i] * 2.0 * ASCR_PI * el[i].r_m * el[i].dr_m;
    vm /= area;
    double chi = atan2(vp, va + vm);
    kfac = tan(0.5 * chi);
    thrust = torque = h = y = mx = my = 0.0;
    memset(&fl, 0, sizeof fl);
    all_ok = 1;
    for (size_t i = 0; i < p.n_elements; i++) {
      ann a;
      memset(&a, 0, sizeof a);
      a.b = b;
      a.tables = tables;
      a.p = &p;
      a.r = el[i].r_m;
      double twist;
      rotor_blade_at(b, a.r, &a.chord, &twist, &a.s0, &a.s1, &a.w);
      a.theta = twist * DEG;
      a.omega = omega;
      a.va = va;
      a.vp = vp;
      a.kx = kfac * a.r / b->r_tip_m;
      a.n = naz;
      a.sps = sps;
      a.cps = cps;
      double vi = v[i], ui = u[i];
      int ok = newton(&a, &vi, &ui);
      if (!ok) {
        vi = v[i];
        ui = u[i];
        ok = alternate(&a, &vi, &ui);
      }
      all_ok &= ok;
      if (!ok) continue;
      v[i] = vi;
      u[i] = ui;
      double dr = el[i].dr_m;
      thrust += a.dt * dr;
      torque += a.dq * dr;
      h += a.dh * dr;
      y += a.dy * dr;
      mx += a.mx * dr;
      my += a.my * dr;
      rotor_flags_add(&fl, &a.flags, a.dt, dr);
    }
    double vm2 = 0.0;
    for (size_t i = 0; i < p.n_elements; i++) vm2 += v[i] * 2.0 * ASCR_PI * el[i].r_m * el[i].dr_m;
    vm2 /= area;
    vmean = vm2;
    if (vp == 0.0 || fabs(vm2 - vm) <= 1e-10 * (omega * b->r_tip_m + speed_m_s)) break;
    if (pass == 49) all_ok = 0;
  }
  free(el);
  free(v);
  rotor_point_finish(b, &p, rpm, va, thrust, torque, all_ok, &fl, &res->r);
  res->incidence_deg = incidence_deg;
  res->v_axial_m_s = va;
  res->v_inplane_m_s = vp;
  res->mu = vp / (omega * b->r_tip_m);
  res->h_force_N = h;
  res->side_force_N = y;
  res->roll_moment_Nm = mx;
  res->pitch_moment_Nm = my;
  res->induced_mean_m_s = vmean;
  res->skew_deg = 2.0 * atan(kfac) / DEG;
  res->n_azimuth = naz;
  return ASCR_OK;
}
