/* src/visc/coldstart.c
 * Cold starts of the coupled iteration. The exact formulation's (visc_initial_state_exact):
 * a march of each surface's boundary layer on the inviscid edge velocity that passes laminar
 * separation in inverse mode, described below. The default formulation's (visc_initial_state):
 * the direct march of src/bl/march.c, restarted with transition ahead of a laminar separation,
 * then two passes on the coupled edge velocity. Both start the wake from the trailing edge.
 *
 * Method. Station by station from the stagnation point, the unknowns of station b are found
 * from the same interval residuals the Newton iteration uses (residual.c: laminar, transition,
 * turbulent), so the start obeys the equations of the coupled problem and no second copy of
 * them exists. Direct mode: ue_b is the given edge velocity, the unknowns are (ln theta,
 * ln m, N or sqrt(Ctau)). Where the direct solution fails or its shape parameter passes the
 * separation limit of its regime, the station is solved in inverse mode: the kinematic shape
 * parameter is prescribed and the edge velocity becomes the unknown, unknowns (ln theta,
 * ln ue, N or sqrt(Ctau)), m = H ue theta (the inverse boundary-layer problem is regular
 * through separation: Catherall & Mangler, J. Fluid Mech. 26, 1966; Carter, NASA TP-1208,
 * 1979, prescribed displacement thickness; here the prescribed quantity is Hk, which carries
 * the same information at a given theta). The prescribed Hk grows downstream of a laminar
 * separation and falls back toward attached values after transition: a start only; the
 * coupled iteration replaces the prescription by the interaction with the outer flow, and the
 * converged state does not depend on it (the rates below are numerical choices, not physics).
 * Transition: where N reaches N_crit (or the trip) at station b, b is solved as the end of a
 * transition interval (the crossing point inside it follows from the residual).
 *
 * Notation as in visc_impl.h; stations k0 .. k1-1 of one side, k0 the first (stagnation).
 */
#include "visc/visc_impl.h"

#include <math.h>
#include <string.h>
#include <stdlib.h>
#include "core/core_impl.h"

#define CS_NEWTON_MAX 40
#define CS_TOL 1e-10
#define CS_FD 1e-7
#define CS_LAM_HK_MAX 3.8  /* direct laminar march up to here (Falkner-Skan separation 4.03) */
#define CS_TURB_HK_MAX 2.5 /* direct turbulent march up to here */
/* inverse-mode prescriptions (start only): laminar Hk grows by this much per momentum
 * thickness of run, up to CS_LAM_HK_CAP; turbulent Hk falls by CS_TURB_SLOPE per momentum
 * thickness, not below CS_TURB_HK_MAX */
#define CS_LAM_SLOPE 0.01
#define CS_LAM_HK_CAP 6.0
#define CS_TURB_SLOPE 0.15

/* H from Hk at edge Mach me (inverse of bl_hk) */
static double h_of_hk(double hk, double me)
{
  double m2 = me * me;
  return hk * (1.0 + 0.113 * m2) + 0.29 * m2;
}

/* Solve station b (a known) in direct (inverse = 0) or inverse mode with prescribed Hk.
 * b holds the first guess and receives the solution. 0 on success. */
static int solve_station(const vctx *cx, int kind, const vstate *a, vstate *b, int inverse,
                         double hk_target)
{
  for (int it = 0; it < CS_NEWTON_MAX; it++) {
    if (inverse) b->m = h_of_hk(hk_target, cx->mach * b->ue) * b->ue * b->th;
    double R[3], J[9];
    visc_residual(kind, cx, a, b, NULL, R, NULL);
    double rmax = fmax(fabs(R[0]), fmax(fabs(R[1]), fabs(R[2])));
    if (!isfinite(rmax)) return -1;
    if (rmax < CS_TOL) return 0;
    for (int j = 0; j < 3; j++) {
      vstate p = *b;
      double h;
      if (j == 0) {
        h = CS_FD;
        p.th *= exp(h);
      } else if (j == 1) {
        h = CS_FD;
        if (inverse) p.ue *= exp(h);
        else p.m *= exp(h);
      } else {
        h = CS_FD * fmax(fabs(b->c), 1e-2);
        p.c += h;
      }
      if (inverse) p.m = h_of_hk(hk_target, cx->mach * p.ue) * p.ue * p.th;
      double Rp[3];
      visc_residual(kind, cx, a, &p, NULL, Rp, NULL);
      for (int i = 0; i < 3; i++) J[i * 3 + j] = (Rp[i] - R[i]) / h;
    }
    double dx[3] = {-R[0], -R[1], -R[2]};
    if (!core_solve_small(J, dx, 3)) return -1;
    double lim = 1.0;
    if (fabs(dx[0]) * lim > 0.5) lim = 0.5 / fabs(dx[0]);
    if (fabs(dx[1]) * lim > 0.5) lim = 0.5 / fabs(dx[1]);
    double cmax = b->turb ? 0.3 * fmax(b->c, 0.01) : 2.0;
    if (fabs(dx[2]) * lim > cmax) lim = cmax / fabs(dx[2]);
    b->th *= exp(lim * dx[0]);
    if (inverse) b->ue *= exp(lim * dx[1]);
    else b->m *= exp(lim * dx[1]);
    b->c += lim * dx[2];
    if (b->turb) b->c = fmin(fmax(b->c, 1e-4), 0.5);
    else b->c = fmax(b->c, 0.0);
  }
  return -1;
}

static double hk_of(const vctx *cx, const vstate *s)
{
  return bl_hk(s->m / (fmax(s->ue, 1e-6) * s->th), cx->mach * s->ue);
}

int visc_cold_march(const vctx *cx, size_t n, const double *xi, const double *ue,
                    const double *kappa, const vstate *first, double *th, double *m, double *c,
                    int *turb)
{
  vstate a = *first;
  a.first = 1;
  th[0] = a.th;
  m[0] = a.m;
  c[0] = a.c;
  turb[0] = 0;
  int ok = 1;
  for (size_t k = 1; k < n; k++) {
    vstate b = a;
    b.first = 0;
    b.xi = xi[k];
    b.kappa = kappa[k];
    b.ue = fmax(ue[k], 1e-4);
    b.m = a.m / fmax(a.ue, 1e-6) * b.ue; /* same displacement thickness */
    int kind = a.turb ? VR_TURB : VR_LAM;
    double hka = hk_of(cx, &a), ds = (b.xi - a.xi) / fmax(a.th, 1e-12);
    double hk_lim = a.turb ? CS_TURB_HK_MAX : CS_LAM_HK_MAX;
    vstate d = b;
    int direct_ok = solve_station(cx, kind, &a, &d, 0, 0.0) == 0 && hk_of(cx, &d) <= hk_lim;
    if (direct_ok) {
      b = d;
    } else {
      double hkt = a.turb ? fmax(hka - CS_TURB_SLOPE * ds, CS_TURB_HK_MAX)
                          : fmin(fmax(hka, CS_LAM_HK_MAX) + CS_LAM_SLOPE * ds, CS_LAM_HK_CAP);
      if (solve_station(cx, kind, &a, &b, 1, hkt) != 0) {
        ok = 0; /* keep the guess: a start need not be exact */
        b.m = h_of_hk(hkt, cx->mach * b.ue) * b.ue * b.th;
      }
    }
    /* transition: N_crit reached (or the trip passed) at a laminar station */
    int trip = cx->xi_trip >= 0.0 && b.xi >= cx->xi_trip;
    if (!b.turb && (b.c >= cx->ncrit || trip)) {
      vstate t = b;
      t.turb = 1;
      t.c = visc_sqrt_ctau_start(cx, &a);
      vstate dt = t;
      int tok = solve_station(cx, VR_TRANS, &a, &dt, 0, 0.0) == 0 && hk_of(cx, &dt) <= CS_LAM_HK_MAX;
      if (tok) {
        t = dt;
      } else {
        double hkt = fmin(fmax(hk_of(cx, &b), CS_TURB_HK_MAX), CS_LAM_HK_CAP);
        if (solve_station(cx, VR_TRANS, &a, &t, 1, hkt) != 0) ok = 0;
      }
      b = t;
    }
    th[k] = b.th;
    m[k] = b.m * fmax(ue[k], 1e-4) / fmax(b.ue, 1e-6); /* keep dstar on the given ue */
    c[k] = b.c;
    turb[k] = b.turb;
    a = b;
  }
  return ok;
}

/* Start of the wake for a cold start: theta the sum of the two trailing-edge values, the
 * shape parameter relaxing from the trailing-edge sum of displacement thicknesses toward 1.05
 * over a tenth of a chord, sqrt(Ctau) 0.05 (a first guess the iteration replaces). */
static void wake_start(ascr_visc_solver *v)
{
  size_t w0 = v->nu + v->nl, ku = v->nu - 1, kl = w0 - 1;
  double thw = v->th[ku] + v->th[kl];
  double dw = v->mm[ku] / fmax(v->ue_inv[ku], 1e-3) + v->mm[kl] / fmax(v->ue_inv[kl], 1e-3);
  for (size_t j = 0; j < v->nw; j++) {
    size_t k = w0 + j;
    double hw = 1.05 + (dw / thw - 1.05) * exp(-v->xi[k] / 0.1);
    v->th[k] = thw;
    v->mm[k] = hw * thw * fmax(v->ue_inv[k], 0.5);
    v->turb[k] = 1;
    v->cc[k] = 0.05;
  }
}

/* The march start's velocity at a trailing edge. The inviscid velocity falls towards the
 * wedge's stagnation value over the last panels of each side; the viscous flow does not see
 * that fall (the displacement fills the wedge), but a march on it thickens the layer by tens
 * of per cent in one station, and the jump of mass defect into the wake drives the coupled
 * edge velocity of the first iterate negative next to the edge (NACA 2412, Re 1e5, -2 deg:
 * ue = -0.16 at the last-but-one lower station, first residual 9.7e6). The march therefore
 * takes, at the last CS_TE_STATIONS stations of each side, the larger of the inviscid
 * velocity and its linear extrapolation from upstream. A start only (the coupled iteration
 * replaces it). Fresh march starts converged alone (bench of 90 cold points, NACA 0012, 2412,
 * 4412 and two plates at Re 3e4, 1e5, 1e6, -2 to 8 deg): 21 before, 30 with one station, 32
 * with two. */
#define CS_TE_STATIONS 2

/* Cold start of the exact formulation: each surface marched on the inviscid edge velocity by
 * visc_cold_march (coldstart.c: inverse mode through laminar separation, transition where N
 * reaches N_crit), the wake from the two trailing-edge states. One pass: marching again on
 * ue_inv + D m of this start (as initial_state does) was measured worse -- the displacement
 * of a start's separated region drives the edge velocity near the trailing edge negative
 * (NACA 2412 and the thin plate at Re 1e5-2e5: 2 of 8 cold points converged with one pass,
 * 0 of 8 with three, before the fallback start existed). */
void visc_initial_state_exact(ascr_visc_solver *v)
{
  for (size_t k = 0; k < v->nst; k++) v->ue[k] = v->ue_inv[k];
  visc_set_xi(v);
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, cnt = side == 0 ? v->nu : v->nl;
    vctx cx = visc_context(v, side);
    vstate f;
    double hh = cx.hiem_h, thh = visc_hiemenz_theta(&cx);
    f.th = thh;
    f.xi = v->xi[k0];
    f.ue = cx.stag_a * fmax(f.xi, cx.xi_min);
    f.m = hh * thh * f.ue;
    f.c = 0.0;
    f.turb = 0;
    f.kappa = 0.0;
    f.first = 1;
    /* the trailing edge: the larger of the inviscid velocity and its linear extrapolation
     * from the two stations upstream (v->ue is the march's velocity, scratch until the
     * coupled edge velocities are formed) */
    double *um = v->ue + k0;
    for (size_t j = cnt > CS_TE_STATIONS + 2 ? cnt - CS_TE_STATIONS : cnt; j < cnt; j++) {
      double ex = um[j - 1] + (um[j - 1] - um[j - 2]) * (v->xi[k0 + j] - v->xi[k0 + j - 1]) /
                                 fmax(v->xi[k0 + j - 1] - v->xi[k0 + j - 2], 1e-12);
      if (ex > um[j]) um[j] = ex;
    }
    /* a station the march could only approximate is left to the Newton iteration */
    (void)visc_cold_march(&cx, cnt, v->xi + k0, um, v->kappa_st + k0, &f, v->th + k0,
                          v->mm + k0, v->cc + k0, v->turb + k0);
  }
  wake_start(v);
}

/* Cold start: direct march of each surface on the inviscid edge velocity. */
ascr_status visc_initial_state(ascr_visc_solver *v, const vctx cxs[3], ascr_errbuf *err)
{
  (void)err;
  const size_t nst = v->nst;
  /* three passes: march on the inviscid ue, then twice on ue_inv + D m of the previous pass */
  for (int pass = 0; pass < 3; pass++) {
  if (pass > 0) visc_update_ue(v);
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, cnt = side == 0 ? v->nu : v->nl;
    double *s = v->march_s, *ue = v->march_ue;
    ascr_bl_station *out = v->march_out;
    for (size_t j = 0; j < cnt; j++) {
      s[j] = v->xi[k0 + j];
      ue[j] = fmax(pass == 0 ? v->ue_inv[k0 + j] : v->ue[k0 + j], 1e-3);
      if (j > 0 && ue[j] < 0.5 * ue[j - 1] && pass > 0) ue[j] = fmax(v->ue_inv[k0 + j], 1e-3);
    }
    ascr_bl_params bp = ascr_bl_params_defaults();
    bp.re = v->p.re;
    bp.mach = v->p.mach;
    bp.ncrit = v->p.ncrit;
    bp.s_trip = cxs[side].xi_trip;
    bp.turb_rth_min = v->turb_fit.rth_min;
    bp.turb_rth_width = v->turb_fit.rth_width;
    bp.turb_lag_coles = v->turb_fit.coles;
    ascr_bl_result br;
    ascr_errbuf merr;
    ascr_status st = ascr_bl_march(s, ue, cnt, &bp, out, &br, &merr);
    /* a laminar layer that separates (or fails near separation) is restarted with transition
     * forced two stations upstream of where it stopped: a separation bubble closes turbulent */
    int lam_stop = (st == ASCR_OK && br.n_done < cnt && br.n_done > 0 &&
                    !out[br.n_done - 1].turbulent) ||
                   (st == ASCR_EMAXITER && br.n_done > 0 && !out[br.n_done - 1].turbulent);
    if (lam_stop && br.n_done >= 3) {
      bp.s_trip = s[br.n_done - 2];
      st = ascr_bl_march(s, ue, cnt, &bp, out, &br, &merr);
      if (st != ASCR_OK && br.n_done > 0) st = ASCR_OK; /* keep what was marched */
    } else if (st != ASCR_OK && br.n_done > 0) {
      st = ASCR_OK;
    }
    size_t done = (st == ASCR_OK) ? br.n_done : 0;
    for (size_t j = 0; j < cnt; j++) {
      size_t k = k0 + j;
      if (j < done) {
        v->th[k] = out[j].theta;
        v->mm[k] = out[j].dstar * ue[j];
        v->turb[k] = out[j].turbulent;
        v->cc[k] = out[j].turbulent ? sqrt(out[j].ctau) : out[j].n;
      } else if (j > 0) {
        /* beyond a separation the march cannot go: grow theta, keep a separated shape */
        v->th[k] = v->th[k - 1] * (1.0 + 0.5 * (s[j] - s[j - 1]) / fmax(s[j - 1], 1e-3));
        v->turb[k] = 1;
        v->cc[k] = 0.12;
        v->mm[k] = 2.2 * v->th[k] * ue[j];
      } else {
        v->th[k] = sqrt(0.08 * s[0] / (v->p.re * ue[0]));
        v->mm[k] = 2.24 * v->th[k] * ue[0];
        v->turb[k] = 0;
        v->cc[k] = 0.0;
      }
    }
  }
  wake_start(v);
  }
  (void)nst;
  return ASCR_OK;
}

