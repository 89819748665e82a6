/* src/visc/residual.c
 * Residuals of the coupled boundary-layer system, station by station.
 *
 * Method. The same discretisation as the direct march (src/bl/march.c): between stations a
 * and b, in logarithmic form,
 *   R0 = ln(theta_b/theta_a) + (2 + H_m - Me_m^2) ln(ue_b/ue_a) - int Cf/(2 theta) dxi
 *   R1 = ln(H*_b/H*_a) + (1 - H_m) ln(ue_b/ue_a) - int (2CD/H* - Cf/2)/theta dxi
 *   R2 = N_b - N_a - int dN/dxi dxi                                  (laminar)
 *   R2 = sqrt(Ctau)_b - sqrt(Ctau)_a - dxi [K sqrt(Ctau)(sqrt(Ctau_EQ) - sqrt(Ctau))/delta]_b (turbulent)
 * with H = m/(ue theta), the integrals by bl_interval_integral (trapezoidal in ln xi on the
 * surfaces) (Drela & Giles 1987 for the equations, Green et al. 1977 for the lag).
 * A transition interval is split at the point where N, growing at the rate of its laminar
 * end, reaches N_crit (or at the trip): the
 * state there is interpolated linearly between a and b, the laminar equations hold before it
 * and the turbulent ones after it (their R0 and R1 are added), and Ctau starts at
 * bl_ctau_initial(). The first station of each surface follows the Hiemenz similarity state of
 * the closure with a = ue/xi (stagnation flow, bl_similarity_start with m = 1). The first wake
 * station takes the sum of the two trailing-edge momentum and displacement thicknesses and the
 * theta-weighted mean of their sqrt(Ctau) (a laminar side contributes its initial Ctau).
 *
 * Besides the residual of one interval (visc_residual), two paths for all stations in turn: the
 * forward differences of an interval (visc_residual_plain_fd, for the Newton matrix) and the
 * line search's residual norm (visc_residual_norm2). Both evaluate each station's closures once,
 * holding the downstream end of one interval for the next, with the numbers visc_residual gives
 * (tests/visc/test_visc_residual.c).
 */
#include "visc/visc_impl.h"

#include <math.h>

/* width (in interval fractions) of the smooth minimum that keeps the transition point within
 * its interval; it lies below min(f, 1) by at most TR_SMOOTH/2 of the interval */
#define TR_SMOOTH 0.1

typedef visc_vev vev;

/* Source of the kinetic-energy (shape-parameter) equation per unit xi: (2 CD/H* - Cf/2)/theta. */
static double ke_source(const bl_closure *c, double th)
{
  return (2.0 * c->cd / c->hs - 0.5 * c->cf) / th;
}

/* The parts of a turbulent evaluation that depend on the third unknown sqrt(Ctau): the
 * dissipation, the lag rate and the energy equation's source. */
static void eval_stress(const vctx *cx, double th, double sc, int wake, double kappa, vev *e)
{
  e->c.cd = bl_closure_turbulent_cd(e->c.cf, e->c.us, sc * sc, wake);
  /* the wake's shorter dissipation length (bl_lag_rate) goes with the exact formulation for
   * now: measured on the robustness grid it lifts the exact formulation from 980 to 1068
   * converged points of 1125 and takes the banded iteration from 1080 to 1053, whose states
   * it moves along their path (docs/theory/viscous.md, "The wake") */
  e->lag = bl_lag_rate(th, e->h, e->c.hk, sc, e->c.ctau_eq, e->c.cf, wake && cx->exact_tr,
                       cx->turb_fit.coles, kappa);
  e->ke = ke_source(&e->c, th);
}

static void eval(const vctx *cx, const vstate *s, int turb, int wake, vev *e)
{
  double ue = s->ue > 1e-6 ? s->ue : 1e-6;
  double th = s->th > 1e-12 ? s->th : 1e-12;
  e->h = s->m / (ue * th);
  if (e->h < (wake ? 1.00005 : 1.02)) e->h = wake ? 1.00005 : 1.02;
  e->me = cx->mach * ue;
  e->rth = cx->re * ue * th;
  if (turb) {
    double sc = s->c > 1e-5 ? s->c : 1e-5;
    bl_closure_turbulent(e->h, e->rth, e->me, sc * sc, wake, cx->turb_fit, &e->c);
    e->amp = 0.0;
    e->mom = 0.5 * e->c.cf / th;
    eval_stress(cx, th, sc, wake, s->kappa, e);
  } else {
    bl_closure_laminar(e->h, e->rth, e->me, &e->c);
    e->lag = 0.0;
    e->amp = bl_amplification_rate(e->c.hk, th, e->rth);
    e->mom = 0.5 * e->c.cf / th;
    e->ke = ke_source(&e->c, th);
  }
}

/* R0, R1 over the interval between two evaluated states (lx = bl_interval_log of it). */
static void two_eq(const vstate *a, const vev *ea, const vstate *b, const vev *eb, double lx,
                   double *r0, double *r1)
{
  double lue = log(fmax(b->ue, 1e-6) / fmax(a->ue, 1e-6));
  double hm = 0.5 * (ea->h + eb->h);
  double mm = 0.5 * (ea->me * ea->me + eb->me * eb->me);
  *r0 = log(fmax(b->th, 1e-12) / fmax(a->th, 1e-12)) + (2.0 + hm - mm) * lue -
        bl_interval_integral_lx(ea->mom, eb->mom, a->xi, b->xi, lx);
  *r1 = log(eb->c.hs / ea->c.hs) + (1.0 - hm) * lue -
        bl_interval_integral_lx(ea->ke, eb->ke, a->xi, b->xi, lx);
}

double visc_sqrt_ctau_start(const vctx *cx, const vstate *s)
{
  vev e;
  vstate t = *s;
  t.c = 0.03;
  eval(cx, &t, 1, 0, &e);
  return sqrt(bl_ctau_initial(e.c.hk, e.c.ctau_eq));
}

double visc_hiemenz_theta(const vctx *cx)
{
  return bl_similarity_theta(1.0, cx->hiem_h, cx->hiem_f, cx->re, cx->stag_a, 1.0);
}

/* State at fraction f of the interval a -> b (linear in theta, dstar, ue). */
static vstate interp(const vstate *a, const vstate *b, double f)
{
  vstate t;
  double da = a->m / a->ue, db = b->m / b->ue;
  t.th = a->th + f * (b->th - a->th);
  t.ue = a->ue + f * (b->ue - a->ue);
  t.m = t.ue * (da + f * (db - da));
  t.xi = a->xi + f * (b->xi - a->xi);
  t.kappa = a->kappa + f * (b->kappa - a->kappa);
  t.c = a->c;
  t.turb = 0;
  return t;
}

/* g(f) of the transition interval (see visc_residual): N at fraction f of a -> b minus N_crit. */
static double crossing_g(const vctx *cx, const vstate *a, const vev *ea, const vstate *b, double f)
{
  double xt = a->xi + f * (b->xi - a->xi);
  return a->c + bl_interval_integral(ea->amp, ea->amp, a->xi, xt) - cx->ncrit;
}

/* Crossing fraction f in [0, 1] of the transition interval a -> b, and N at b (*nb) by the
 * laminar amplification equation. Bracketing by the Illinois variant of regula falsi
 * (Dowell & Jarratt, BIT 11, 1971) to |df| < 1e-14: deterministic and to round-off, so that
 * forward differences of the residual see the true dependence of f on the states. */
#define CROSS_TOL 1e-14
#define CROSS_MAX 100
static double crossing(const vctx *cx, const vstate *a, const vev *ea, const vstate *b, double *nb)
{
  double g0 = a->c - cx->ncrit;
  double g1 = crossing_g(cx, a, ea, b, 1.0);
  *nb = g1 + cx->ncrit;
  if (!(b->xi > a->xi)) return 1.0;
  if (g0 >= 0.0) return 0.0;
  if (!(g1 >= 0.0)) return 1.0; /* also NaN: the caller sees *nb */
  double lo = 0.0, hi = 1.0, glo = g0, ghi = g1, f = 1.0;
  int side = 0;
  for (int it = 0; it < CROSS_MAX && hi - lo > CROSS_TOL; it++) {
    f = (lo * ghi - hi * glo) / (ghi - glo);
    if (!(f > lo && f < hi)) f = 0.5 * (lo + hi);
    double gf = crossing_g(cx, a, ea, b, f);
    if (gf == 0.0) return f;
    if (gf < 0.0) {
      lo = f;
      glo = gf;
      if (side == -1) ghi *= 0.5;
      side = -1;
    } else {
      hi = f;
      ghi = gf;
      if (side == 1) glo *= 0.5;
      side = 1;
    }
  }
  return f;
}

/* A first station is seen at its distance from the stagnation point, but no closer than
 * xi_min, with the edge velocity of the stagnation flow there, ue = stag_a xi. The stagnation
 * point may sit arbitrarily close to a node; this keeps the logarithms of the first interval
 * finite while the node's own (tiny) ue plays no part. */
static vstate first_view(const vctx *cx, const vstate *s)
{
  vstate t = *s;
  if (s->first) {
    /* the mass defect is kept: dstar = m / (stag_a xi) */
    t.xi = fmax(s->xi, cx->xi_min);
    t.ue = cx->stag_a * t.xi;
  }
  return t;
}

/* R of a laminar, turbulent or wake interval a -> b from the two ends' evaluated closures
 * (lx = bl_interval_log of it). */
static void plain_interval(int kind, const vctx *cx, const vstate *a, const vev *ea,
                           const vstate *b, const vev *eb, double lx, double *R)
{
  two_eq(a, ea, b, eb, lx, &R[0], &R[1]);
  if (kind != VR_LAM) {
    R[2] = (b->c - a->c) - (b->xi - a->xi) * eb->lag;
  } else {
    /* exact formulation: amplification at the rate of the interval's upstream end, the
     * rule of the transition interval below (why: there) */
    R[2] = b->c - a->c -
           bl_interval_integral_lx(ea->amp, cx->exact_tr ? ea->amp : eb->amp, a->xi, b->xi, lx);
  }
}

/* The transition interval (a laminar, b turbulent; both seen through first_view) from the
 * laminar closure ea of a; eb receives b's turbulent closure. */
static void transition_interval(const vctx *cx, const vstate *a, const vev *ea, const vstate *b,
                                vev *eb, double *R, double *f_tr)
{
  /* transition interval: a laminar, b turbulent. N grows from a at the rate of station a
   * (an explicit step: b carries a turbulent state, so a rate interpolated toward it would
   * mix in a turbulent shape parameter and make N non-monotonic in the crossing point) */
  double f = 1.0, f_nb = NAN, dxi = b->xi - a->xi;
  /* Exact formulation (exact_tr). The crossing point t = a + f (b - a) solves
   *     g(f) = N_a + I(rate_a, rate_a, xi_a, xi_t) - N_crit = 0,
   * the amplification equation of the laminar stations integrated from a to the transition
   * point (Drela & Giles 1987, transition interval; Drela 1989, LNE 54). The rate is that of
   * the interval's upstream end, in the laminar intervals as here: station b carries a
   * turbulent state, and a rate taken there would see a turbulent shape parameter. With the
   * same rule on both sides of a switch, N at b predicted here is exactly the N that station b
   * gets when it turns laminar, so the interval rule of the driver cannot cycle between two
   * neighbours. f is found to round-off by a bracketing iteration, so it is a smooth function
   * of the end states and its derivatives enter the Jacobian through the residual's
   * differences. Where g(1) < 0 the amplification does not reach N_crit in this interval:
   * f = 1 and f_tr[1] < N_crit tells the caller to move the interval downstream; where
   * g(0) >= 0 (N_a >= N_crit) f = 0 and the caller moves it upstream. */
  if (cx->exact_tr) {
    f = crossing(cx, a, ea, b, &f_nb);
  } else if (ea->amp > 0.0 && dxi > 0.0) {
    /* the crossing point, held inside the interval by a smooth minimum: a hard clamp at the
     * interval's end puts a kink in the residual across which the Newton iteration cycles
     * (when the interval ends at a laminar separation, N need not reach N_crit in it) */
    double fr = (cx->ncrit - a->c) / (ea->amp * dxi);
    f = 0.5 * (fr + 1.0 - sqrt((fr - 1.0) * (fr - 1.0) + TR_SMOOTH * TR_SMOOTH));
  }
  vstate t;
  vev et;
  if (cx->xi_trip >= 0.0 && cx->xi_trip > a->xi && cx->xi_trip <= b->xi) {
    double ft = (cx->xi_trip - a->xi) / dxi;
    if (ft < f) f = ft;
  }
  if (f < 1e-6) f = 1e-6;
  if (f_tr) {
    int tripped = cx->xi_trip >= 0.0 && cx->xi_trip > a->xi && cx->xi_trip <= b->xi;
    f_tr[0] = f;
    /* N at b at the rate of a (exact formulation: by the laminar amplification equation) */
    f_tr[1] = tripped ? INFINITY : cx->exact_tr ? f_nb : a->c + ea->amp * dxi;
    f_tr[2] = ea->c.hk;
  }
  t = interp(a, b, f);
  eval(cx, &t, 0, 0, &et);
  double r0a, r1a, r0b, r1b;
  two_eq(a, ea, &t, &et, bl_interval_log(a->xi, t.xi), &r0a, &r1a);
  vstate tt = t;
  tt.turb = 1;
  tt.c = visc_sqrt_ctau_start(cx, &t);
  vev ett;
  eval(cx, &tt, 1, 0, &ett);
  eval(cx, b, 1, 0, eb);
  two_eq(&tt, &ett, b, eb, bl_interval_log(tt.xi, b->xi), &r0b, &r1b);
  R[0] = r0a + r0b;
  R[1] = r1a + r1b;
  R[2] = (b->c - tt.c) - (1.0 - f) * dxi * eb->lag;
}

void visc_residual(int kind, const vctx *cx, const vstate *a_in, const vstate *b_in,
                   const vstate *w, double *R, double *f_tr)
{
  R[0] = R[1] = R[2] = 0.0;
  if (kind == VR_STAG) {
    /* Hiemenz state of the closure for ue = stag_a xi: theta independent of xi */
    double hh = cx->hiem_h, thh = visc_hiemenz_theta(cx);
    vstate bf = first_view(cx, b_in);
    double h = bf.m / (bf.ue * fmax(bf.th, 1e-12));
    R[0] = log(fmax(b_in->th, 1e-12) / thh);
    R[1] = log(fmax(h, 1e-6) / hh);
    R[2] = b_in->c;
    return;
  }
  vstate av, bv;
  const vstate *a = a_in, *b = b_in;
  if (kind != VR_MERGE) {
    av = first_view(cx, a_in);
    bv = first_view(cx, b_in);
    a = &av;
    b = &bv;
  }
  if (kind == VR_MERGE) {
    double da = a->m / fmax(a->ue, 1e-6), db = b->m / fmax(b->ue, 1e-6);
    double dw = w->m / fmax(w->ue, 1e-6);
    double sca = a->turb ? a->c : visc_sqrt_ctau_start(cx, a);
    double scb = b->turb ? b->c : visc_sqrt_ctau_start(cx, b);
    R[0] = log(fmax(w->th, 1e-12) / (a->th + b->th));
    R[1] = log(fmax(dw, 1e-12) / (da + db));
    R[2] = w->c - (a->th * sca + b->th * scb) / (a->th + b->th);
    return;
  }
  if (kind == VR_LAM || kind == VR_TURB || kind == VR_WAKE) {
    int turb = kind != VR_LAM, wake = kind == VR_WAKE;
    vev ea, eb;
    eval(cx, a, turb, wake, &ea);
    eval(cx, b, turb, wake, &eb);
    plain_interval(kind, cx, a, &ea, b, &eb, bl_interval_log(a->xi, b->xi), R);
    return;
  }
  vev ea, eb;
  eval(cx, a, 0, 0, &ea);
  transition_interval(cx, a, &ea, b, &eb, R, f_tr);
}

/* Sum of squared residuals of all stations at the current state (R and J untouched). Each
 * station's closure is evaluated once where visc_residual station by station would evaluate it
 * twice (as the downstream end of its own interval and the upstream end of the next one, with
 * the same view and regime): the same numbers to the last bit. */
double visc_residual_norm2(ascr_visc_solver *v, const vctx cxs[3])
{
  double sum = 0.0;
  vev prev;
  size_t prev_k = SIZE_MAX;
  int prev_turb = -1, prev_wake = -1;
  const vctx *prev_cx = NULL;
  for (size_t k = 0; k < v->nst; k++) {
    const vctx *cx = &cxs[v->side[k]];
    size_t a, b, w;
    int kind = visc_station_kind(v, k, &a, &b, &w);
    vstate sa = visc_get_state(v, a), sb = visc_get_state(v, b);
    double R[3];
    int plain = kind == VR_LAM || kind == VR_TURB || kind == VR_WAKE;
    if (plain || kind == VR_TRANS) {
      int turb = kind != VR_LAM && kind != VR_TRANS, wake = kind == VR_WAKE;
      vstate av = first_view(cx, &sa), bv = first_view(cx, &sb);
      vev ea, eb;
      if (prev_k == a && prev_cx == cx && prev_turb == turb && prev_wake == wake) ea = prev;
      else eval(cx, &av, turb, wake, &ea);
      if (plain) {
        eval(cx, &bv, turb, wake, &eb);
        plain_interval(kind, cx, &av, &ea, &bv, &eb, bl_interval_log(av.xi, bv.xi), R);
      } else {
        transition_interval(cx, &av, &ea, &bv, &eb, R, NULL);
        turb = 1;
      }
      prev = eb;
      prev_k = b;
      prev_cx = cx;
      prev_turb = turb;
      prev_wake = wake;
    } else {
      vstate sw = visc_get_state(v, w);
      if (kind == VR_MERGE) visc_residual(kind, cx, &sa, &sb, &sw, R, NULL);
      else visc_residual(kind, cx, NULL, &sw, NULL, R, NULL);
      prev_k = SIZE_MAX;
    }
    for (int e = 0; e < 3; e++) sum += isfinite(R[e]) ? R[e] * R[e] : 1e300;
  }
  return sum;
}

/* A laminar, turbulent or wake interval and its forward differences (visc_impl.h): each end's
 * closure is evaluated once for its own state and once per perturbation of that end, where
 * visc_residual on the perturbed pair would evaluate both ends again; the numbers are the
 * same to the last bit (the unperturbed end's evaluation is the same computation, and the
 * closures do not depend on xi). */
void visc_residual_plain_fd(int kind, const vctx *cx, const vstate *a_in, const vstate *b_in,
                            const double h[2][4], double hx, double R0[3], double R1[2][4][3],
                            double Rx[3], size_t ka, size_t kb, visc_end_evals *ends)
{
  int turb = kind != VR_LAM, wake = kind == VR_WAKE;
  const vstate *in[2] = {a_in, b_in};
  vstate v0[2], vp[2][4];
  vev e0[2], ep[2][4];
  int held = ends != NULL && ends->k == ka && ends->turb == turb && ends->wake == wake &&
             ends->cx == cx;
  for (int q = 0; q < 2; q++) {
    v0[q] = first_view(cx, in[q]);
    for (int var = 0; var < 4; var++) {
      vstate sp = *in[q];
      double *x = var == 0 ? &sp.th : var == 1 ? &sp.m : var == 2 ? &sp.c : &sp.ue;
      *x += h[q][var];
      vp[q][var] = first_view(cx, &sp);
    }
    if (q == 0 && held) {
      e0[0] = ends->e0;
      for (int var = 0; var < 4; var++) ep[0][var] = ends->ep[var];
      continue;
    }
    eval(cx, &v0[q], turb, wake, &e0[q]);
    for (int var = 0; var < 4; var++) {
      const vstate *t = &vp[q][var];
      if (var == 2) {
        /* the third unknown: a laminar closure does not see N, a turbulent one sees sqrt(Ctau)
         * in its dissipation only */
        ep[q][var] = e0[q];
        if (turb) {
          eval_stress(cx, t->th > 1e-12 ? t->th : 1e-12, t->c > 1e-5 ? t->c : 1e-5, wake, t->kappa,
                      &ep[q][var]);
        }
      } else {
        eval(cx, t, turb, wake, &ep[q][var]);
      }
    }
  }
  if (ends != NULL) {
    ends->k = kb;
    ends->turb = turb;
    ends->wake = wake;
    ends->cx = cx;
    ends->e0 = e0[1];
    for (int var = 0; var < 4; var++) ends->ep[var] = ep[1][var];
  }
  /* the perturbations move no station along the surface: one logarithm for all but Rx */
  double lx = bl_interval_log(v0[0].xi, v0[1].xi);
  plain_interval(kind, cx, &v0[0], &e0[0], &v0[1], &e0[1], lx, R0);
  if (Rx != NULL) {
    /* both ends moved along the surface: the closures do not see xi, except through a first
     * station's view */
    vstate vx[2];
    vev ex[2];
    for (int q = 0; q < 2; q++) {
      vstate sp = *in[q];
      sp.xi += hx;
      vx[q] = first_view(cx, &sp);
      if (in[q]->first) eval(cx, &vx[q], turb, wake, &ex[q]);
      else ex[q] = e0[q];
    }
    plain_interval(kind, cx, &vx[0], &ex[0], &vx[1], &ex[1], bl_interval_log(vx[0].xi, vx[1].xi),
                   Rx);
  }
  for (int var = 0; var < 4; var++) {
    plain_interval(kind, cx, &vp[0][var], &ep[0][var], &v0[1], &e0[1], lx, R1[0][var]);
    plain_interval(kind, cx, &v0[0], &e0[0], &vp[1][var], &ep[1][var], lx, R1[1][var]);
  }
}
