/* src/visc/influence.c
 * Alpha-dependent geometry of the coupled problem: the wake along the inviscid streamline from
 * the trailing edge, and the wake rows and columns of the source-influence matrix E (edge
 * velocity at every node per unit source on every surface and wake panel). The method is
 * described in solver.c; the source-panel influences come from src/panel/.
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <cblas.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Velocity of the inviscid flow at a point (free stream + sheet with gamma_inv). */
static void inviscid_velocity(ascr_visc_solver *v, double px, double py, double *u, double *w)
{
  panel_velocity_coeffs(v->ps, px, py, v->cu, v->cv);
  double uu = cos(v->alpha), vv = sin(v->alpha);
  for (size_t j = 0; j < v->n; j++) {
    uu += v->cu[j] * v->gam_inv[j];
    vv += v->cv[j] * v->gam_inv[j];
  }
  *u = uu;
  *w = vv;
}

/* Wake geometry and the alpha-dependent parts of E. */
ascr_status visc_prepare_alpha(ascr_visc_solver *v, double alpha, ascr_errbuf *err)
{
  const ascr_panel_solver *ps = v->ps;
  const size_t n = v->n, nw = v->nw, np = v->np, m = n + 1, ns = n - 1;
  v->alpha = alpha;
  for (size_t i = 0; i < n; i++) v->gam_inv[i] = cos(alpha) * ps->g0[i] + sin(alpha) * ps->g90[i];
  /* wake spacing: first step the mean trailing-edge panel length, geometric growth to the length */
  double h0 = 0.5 * (v->plen[0] + v->plen[n - 2]);
  double L = v->p.wake_length;
  double qlo = 0.5, qhi = 3.0;
  for (int it = 0; it < 100; it++) {
    double q = 0.5 * (qlo + qhi), tot = 0.0, h = h0;
    for (size_t k = 0; k + 1 < nw; k++) {
      tot += h;
      h *= q;
    }
    if (tot > L) qhi = q;
    else qlo = q;
  }
  double q = 0.5 * (qlo + qhi);
  /* trailing-edge bisector */
  double ux = ps->x[0] - ps->x[1], uy = ps->y[0] - ps->y[1];
  double lx = ps->x[n - 1] - ps->x[n - 2], ly = ps->y[n - 1] - ps->y[n - 2];
  double bx = ux / hypot(ux, uy) + lx / hypot(lx, ly), by = uy / hypot(ux, uy) + ly / hypot(lx, ly);
  double lb = hypot(bx, by);
  bx /= lb;
  by /= lb;
  v->xw[0] = 0.5 * (ps->x[0] + ps->x[n - 1]);
  v->yw[0] = 0.5 * (ps->y[0] + ps->y[n - 1]);
  v->sw[0] = 0.0;
  double h = h0, dxp = bx, dyp = by;
  for (size_t k = 0; k + 1 < nw; k++) {
    double mx = v->xw[k] + 0.5 * h * dxp, my = v->yw[k] + 0.5 * h * dyp;
    double uu, vv;
    inviscid_velocity(v, mx, my, &uu, &vv);
    double sp = hypot(uu, vv);
    if (!(sp > 1e-6)) {
      return core_fail(err, ASCR_EGEOM, "viscous solver: the wake meets a stagnation point at "
                       "(%.4f, %.4f)", mx, my);
    }
    double dx = uu / sp, dy = vv / sp;
    if (k == 0) {
      /* leave the trailing edge along the mean of the bisector and the flow direction */
      dx = 0.5 * (dx + bx);
      dy = 0.5 * (dy + by);
      double l2 = hypot(dx, dy);
      dx /= l2;
      dy /= l2;
    }
    v->xw[k + 1] = v->xw[k] + h * dx;
    v->yw[k + 1] = v->yw[k] + h * dy;
    v->sw[k + 1] = v->sw[k] + h;
    dxp = dx;
    dyp = dy;
    h *= q;
  }
  for (size_t k = 0; k + 1 < nw; k++) v->plen[ns + k] = hypot(v->xw[k + 1] - v->xw[k], v->yw[k + 1] - v->yw[k]);
  /* wake source panels on the surface: -A^-1 B_wake */
  double *W = v->work;
  double *wtx = v->wtx, *wty = v->wty;
  for (size_t k = 0; k + 1 < nw; k++) {
    /* the wake panel's frame, once (the expressions of panel_source_psi's own) */
    wtx[k] = (v->xw[k + 1] - v->xw[k]) / v->plen[ns + k];
    wty[k] = (v->yw[k + 1] - v->yw[k]) / v->plen[ns + k];
    for (size_t i = 0; i < n; i++) {
      W[i + k * m] = -panel_source_psi_frame(v->xw[k], v->yw[k], v->plen[ns + k], wtx[k], wty[k],
                                             ps->x[i], ps->y[i], 1);
    }
    if (ps->sharp) W[(n - 1) + k * m] = 0.0;
    W[n + k * m] = 0.0;
  }
  if (panel_lu_solve(ps, W, nw - 1) != 0) {
    return core_fail(err, ASCR_ESING, "viscous solver: wake source influence solve failed");
  }
  for (size_t i = 0; i < n; i++) {
    for (size_t k = 0; k + 1 < nw; k++) v->E[i * np + ns + k] = W[i + k * m];
  }
  /* tangential speed at the wake panel midpoints */
  for (size_t k = 0; k + 1 < nw; k++) {
    double tx = wtx[k], ty = wty[k];
    double mx = 0.5 * (v->xw[k] + v->xw[k + 1]), my = 0.5 * (v->yw[k] + v->yw[k + 1]);
    panel_velocity_coeffs(ps, mx, my, v->cu, v->cv);
    double qi = cos(alpha) * tx + sin(alpha) * ty;
    for (size_t j = 0; j < n; j++) {
      v->qmid_g[k * n + j] = v->cu[j] * tx + v->cv[j] * ty;
      qi += v->qmid_g[k * n + j] * v->gam_inv[j];
    }
    v->qmid_inv[k] = qi;
    for (size_t pp = 0; pp < np; pp++) {
      /* each panel's frame as computed once: the body panels' by the panel solver's set-up, the
       * wake panels' above (the numbers panel_source_velocity computes from the end points) */
      double su, sv;
      if (pp < ns) {
        panel_source_velocity_frame(ps->x[pp], ps->y[pp], ps->plen[pp], ps->ptx[pp], ps->pty[pp],
                                    mx, my, &su, &sv);
      } else {
        size_t kk = pp - ns;
        panel_source_velocity_frame(v->xw[kk], v->yw[kk], v->plen[ns + kk], wtx[kk], wty[kk], mx,
                                    my, &su, &sv);
      }
      v->qmid[k * np + pp] = su * tx + sv * ty;
    }
  }
  /* plus the sources' effect through the surface vorticity: qmid += qmid_g E(surface rows) */
  cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasNoTrans, (int)(nw - 1), (int)np, (int)n, 1.0,
              v->qmid_g, (int)n, v->E, (int)np, 1.0, v->qmid, (int)np);
  /* wake node rows of E and inviscid speeds */
  for (size_t k = 0; k < nw; k++) {
    double *row = v->E + (n + k) * np;
    if (k == 0) {
      for (size_t pp = 0; pp < np; pp++) row[pp] = 0.5 * (v->E[pp] - v->E[(n - 1) * np + pp]);
      v->qw_inv[0] = 0.5 * (v->gam_inv[0] - v->gam_inv[n - 1]);
    } else if (k + 1 < nw) {
      for (size_t pp = 0; pp < np; pp++) row[pp] = 0.5 * (v->qmid[(k - 1) * np + pp] + v->qmid[k * np + pp]);
      v->qw_inv[k] = 0.5 * (v->qmid_inv[k - 1] + v->qmid_inv[k]);
    } else {
      for (size_t pp = 0; pp < np; pp++) row[pp] = v->qmid[(k - 1) * np + pp];
      v->qw_inv[k] = v->qmid_inv[k - 1];
    }
  }
  return ASCR_OK;
}

