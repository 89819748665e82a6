/* src/visc/solver.c
 * Coupled viscous-inviscid section analysis: wake geometry, source-influence matrix, station
 * bookkeeping, initial state, global Newton iteration, forces and drag.
 *
 * Method (docs/theory/viscous.md). The boundary layer displaces the flow by its mass defect
 * m = ue dstar; its streamwise growth acts on the outer flow as a source sheet sigma = dm/ds on
 * the surface panels (uniform per panel) and on the wake panels. The panel system (linvort.c)
 * gives the change of the surface vortex strength per unit source, d gamma/d sigma = -A^-1 B,
 * with B the stream function of the sources at the nodes; at the wake nodes the tangential
 * velocity is summed from vortices and sources directly. So every edge velocity is
 *     ue = ue_inv + D m,   D = E G,
 * and the boundary-layer residuals of all stations (residual.c), with the edge velocities
 * substituted, form one nonlinear system in (theta, m, N or sqrt(Ctau)) per station. It is
 * solved by Newton's method: residual derivatives with respect to the local unknowns and edge
 * velocities by forward differences (relative step 1e-7), chained through D into a dense
 * Jacobian of order 3 (n + n_wake), solved by LAPACKE dgesv. Updates are under-relaxed so that
 * no theta or m changes by more than 50 % and no N by more than 2 in one step (the idea of
 * Drela & Giles 1987; the limits are ours). Between iterations the transition interval on each
 * side and the stagnation point are re-located from the current state.
 * The wake follows the inviscid streamline from the trailing edge (midpoint rule, geometric
 * spacing starting at the trailing-edge panel size), fixed during the iteration.
 * Drag: Squire & Young (ARC R&M 1838, 1937): cd = 2 theta_end ue_end^((H_end + 5)/2) at the
 * wake end; skin-friction drag by integrating Cf ue^2 along the surface projected on the free
 * stream; pressure drag by difference.
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <cblas.h>
#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define FD_STEP 1e-7
/* most edge-velocity terms in one residual row: three stations' ue, and the two stagnation
 * terms with two D rows each */
#define UMAX 8

ascr_visc_params ascr_visc_params_defaults(void)
{
  ascr_visc_params p;
  p.re = 1e6;
  p.mach = 0.0;
  p.ncrit = 9.0;
  p.trip_upper = 2.0;
  p.trip_lower = 2.0;
  p.wake_length = 1.0;
  p.max_iter = 60;
  p.tol = 1e-7;
  p.exact_transition = 0;
  return p;
}

size_t ascr_visc_default_wake_nodes(size_t n_nodes)
{
  size_t k = n_nodes / 6 + 8;
  return k < 12 ? 12 : k;
}

ascr_visc_solver *ascr_visc_solver_alloc(size_t n_nodes, size_t n_wake)
{
  if (n_nodes < 20 || n_nodes > 4000 || n_wake < 8 || n_wake > 1000) return NULL;
  ascr_visc_solver *v = calloc(1, sizeof *v);
  if (v == NULL) return NULL;
  size_t n = n_nodes, nw = n_wake, np = (n - 1) + (nw - 1), nst = n + nw;
  v->n = n;
  v->nw = nw;
  v->np = np;
  v->nst = nst;
  size_t wcols = (n - 1 > nw - 1) ? n - 1 : nw - 1;
  int ok = 1;
#define ALLOC(ptr, cnt) ok = ok && ((ptr) = core_calloc((cnt), sizeof *(ptr))) != NULL
  ALLOC(v->snode, n);
  ALLOC(v->xw, nw);
  ALLOC(v->yw, nw);
  ALLOC(v->sw, nw);
  ALLOC(v->E, (n + nw) * np);
  ALLOC(v->gam_inv, n);
  ALLOC(v->qw_inv, nw);
  ALLOC(v->plen, np);
  ALLOC(v->work, (n + 1) * wcols);
  ALLOC(v->cu, n);
  ALLOC(v->cv, n);
  ALLOC(v->qmid, (nw - 1) * np);
  ALLOC(v->qmid_g, (nw - 1) * n);
  ALLOC(v->qmid_inv, nw - 1);
  ALLOC(v->node, nst);
  ALLOC(v->side, nst);
  ALLOC(v->sgn, nst);
  ALLOC(v->xi, nst);
  ALLOC(v->dfirst, nst);
  ALLOC(v->D, nst * nst);
  ALLOC(v->ue_inv, nst);
  ALLOC(v->pa, np);
  ALLOC(v->pb, np);
  ALLOC(v->ga, np);
  ALLOC(v->gb, np);
  ALLOC(v->th, nst);
  ALLOC(v->mm, nst);
  ALLOC(v->cc, nst);
  ALLOC(v->turb, nst);
  ALLOC(v->ue, nst);
  ALLOC(v->J, 9 * nst * nst);
  ALLOC(v->lst, 3 * nst);
  ALLOC(v->lblk, 27 * nst);
  ALLOC(v->uidx, 3 * nst * UMAX);
  ALLOC(v->ucoef, 3 * nst * UMAX);
  ALLOC(v->ucnt, 3 * nst);
  ALLOC(v->zm, nst * nst);
  ALLOC(v->mmat, nst * nst);
  ALLOC(v->wv, 3 * nst);
  ALLOC(v->yv, nst);
  ALLOC(v->chk, 3 * nst);
  ALLOC(v->ipiv2, nst);
  ALLOC(v->dinv, 9 * nst);
  ALLOC(v->R, 3 * nst);
  ALLOC(v->dx, 3 * nst);
  ALLOC(v->ipiv, 3 * nst);
  ALLOC(v->iscratch, 2 * nst);
  ALLOC(v->cp, n);
  for (int q = 0; q < 3; q++) {
    ALLOC(v->sv_th[q], nst);
    ALLOC(v->sv_mm[q], nst);
    ALLOC(v->sv_cc[q], nst);
    ALLOC(v->sv_turb[q], nst);
  }
#undef ALLOC
  if (!ok) {
    ascr_visc_solver_free(v);
    return NULL;
  }
  return v;
}

void ascr_visc_solver_free(ascr_visc_solver *v)
{
  if (v == NULL) return;
  free(v->snode); free(v->xw); free(v->yw); free(v->sw); free(v->E); free(v->gam_inv);
  free(v->qw_inv); free(v->plen); free(v->work); free(v->cu); free(v->cv); free(v->qmid);
  free(v->qmid_g); free(v->qmid_inv); free(v->node); free(v->side); free(v->sgn); free(v->xi); free(v->dfirst);
  free(v->D); free(v->ue_inv); free(v->pa); free(v->pb); free(v->ga); free(v->gb); free(v->th);
  free(v->mm); free(v->cc); free(v->turb); free(v->ue); free(v->J); free(v->R); free(v->dx);
  free(v->ipiv); free(v->iscratch); free(v->cp);
  free(v->lst); free(v->lblk); free(v->uidx); free(v->ucoef); free(v->ucnt); free(v->zm);
  free(v->mmat); free(v->wv); free(v->yv); free(v->chk); free(v->ipiv2); free(v->dinv);
  for (int q = 0; q < 3; q++) {
    free(v->sv_th[q]); free(v->sv_mm[q]); free(v->sv_cc[q]); free(v->sv_turb[q]);
  }
  free(v);
}

size_t ascr_visc_solver_stations(const ascr_visc_solver *v) { return v ? v->nst : 0; }

void ascr_visc_solver_set_trace(ascr_visc_solver *v, ascr_visc_trace_fn fn, void *ctx)
{
  if (v == NULL) return;
  v->trace = fn;
  v->trace_ctx = ctx;
}

void visc_snapshot(ascr_visc_solver *v, int q)
{
  v->sv_have[q] = v->have_solution;
  if (!v->sv_have[q]) return;
  memcpy(v->sv_th[q], v->th, v->nst * sizeof *v->th);
  memcpy(v->sv_mm[q], v->mm, v->nst * sizeof *v->mm);
  memcpy(v->sv_cc[q], v->cc, v->nst * sizeof *v->cc);
  memcpy(v->sv_turb[q], v->turb, v->nst * sizeof *v->turb);
  v->sv_is[q] = v->is;
  v->sv_s_stag[q] = v->s_stag;
}

void visc_restore(ascr_visc_solver *v, int q)
{
  if (!v->sv_have[q]) return;
  memcpy(v->th, v->sv_th[q], v->nst * sizeof *v->th);
  memcpy(v->mm, v->sv_mm[q], v->nst * sizeof *v->mm);
  memcpy(v->cc, v->sv_cc[q], v->nst * sizeof *v->cc);
  memcpy(v->turb, v->sv_turb[q], v->nst * sizeof *v->turb);
  v->is = v->sv_is[q];
  v->s_stag = v->sv_s_stag[q];
  v->have_solution = 1;
}

ascr_status ascr_visc_solver_set(ascr_visc_solver *v, const ascr_panel_solver *ps,
                                 const ascr_visc_params *p, ascr_errbuf *err)
{
  if (v == NULL || ps == NULL || p == NULL) {
    return core_fail(err, ASCR_EINVAL, "viscous solver: NULL argument");
  }
  if (!ps->is_set || ps->n != v->n) {
    return core_fail(err, ASCR_EINVAL, "viscous solver: panel solver has %zu nodes (set: %d), "
                     "expected %zu", ps->n, ps->is_set, v->n);
  }
  if (!(p->re >= 1e3 && p->re <= 1e8)) {
    return core_fail(err, ASCR_EINVAL, "viscous solver: Re = %g outside 1e3 .. 1e8", p->re);
  }
  if (!(p->mach >= 0.0 && p->mach <= 0.7)) {
    return core_fail(err, ASCR_EINVAL, "viscous solver: Mach %g outside 0 .. 0.7", p->mach);
  }
  if (!(p->ncrit > 0.0 && p->ncrit <= 20.0)) {
    return core_fail(err, ASCR_EINVAL, "viscous solver: N_crit %g outside (0, 20]", p->ncrit);
  }
  if (!(p->wake_length >= 0.2 && p->wake_length <= 5.0) || p->max_iter < 1 || !(p->tol > 0.0)) {
    return core_fail(err, ASCR_EINVAL, "viscous solver: wake length, iteration limit or tolerance "
                     "out of range");
  }
  if (!isfinite(p->trip_upper) || !isfinite(p->trip_lower)) {
    return core_fail(err, ASCR_EINVAL, "viscous solver: trip location is not finite");
  }
  v->ps = ps;
  v->p = *p;
  v->is_set = 0;
  v->have_solution = 0;
  v->alpha = NAN;
  const size_t n = v->n, m = n + 1, np = v->np;
  v->snode[0] = 0.0;
  for (size_t i = 1; i < n; i++) {
    v->snode[i] = v->snode[i - 1] + hypot(ps->x[i] - ps->x[i - 1], ps->y[i] - ps->y[i - 1]);
  }
  /* surface source panels: d gamma / d sigma = -A^-1 B (alpha-independent) */
  double *W = v->work;
  for (size_t pp = 0; pp + 1 < n; pp++) {
    v->plen[pp] = hypot(ps->x[pp + 1] - ps->x[pp], ps->y[pp + 1] - ps->y[pp]);
    for (size_t i = 0; i < n; i++) {
      W[i + pp * m] = -panel_source_psi(ps->x[pp], ps->y[pp], ps->x[pp + 1], ps->y[pp + 1],
                                        ps->x[i], ps->y[i], 0);
    }
    if (ps->sharp) W[(n - 1) + pp * m] = 0.0; /* that row is the TE closure, not a psi equation */
    W[n + pp * m] = 0.0;                       /* Kutta row */
  }
  if (panel_lu_solve(ps, W, n - 1) != 0) {
    return core_fail(err, ASCR_ESING, "viscous solver: source influence solve failed (n = %zu)", m);
  }
  for (size_t i = 0; i < n; i++) {
    for (size_t pp = 0; pp + 1 < n; pp++) v->E[i * np + pp] = W[i + pp * m];
  }
  v->is_set = 1;
  return ASCR_OK;
}

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
static ascr_status prepare_alpha(ascr_visc_solver *v, double alpha, ascr_errbuf *err)
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
  for (size_t k = 0; k + 1 < nw; k++) {
    for (size_t i = 0; i < n; i++) {
      W[i + k * m] = -panel_source_psi(v->xw[k], v->yw[k], v->xw[k + 1], v->yw[k + 1], ps->x[i],
                                       ps->y[i], 1);
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
    double tx = (v->xw[k + 1] - v->xw[k]) / v->plen[ns + k], ty = (v->yw[k + 1] - v->yw[k]) / v->plen[ns + k];
    double mx = 0.5 * (v->xw[k] + v->xw[k + 1]), my = 0.5 * (v->yw[k] + v->yw[k + 1]);
    panel_velocity_coeffs(ps, mx, my, v->cu, v->cv);
    double qi = cos(alpha) * tx + sin(alpha) * ty;
    for (size_t j = 0; j < n; j++) {
      v->qmid_g[k * n + j] = v->cu[j] * tx + v->cv[j] * ty;
      qi += v->qmid_g[k * n + j] * v->gam_inv[j];
    }
    v->qmid_inv[k] = qi;
    for (size_t pp = 0; pp < np; pp++) {
      double ax, ay, bx2, by2, su, sv;
      if (pp < ns) {
        ax = ps->x[pp]; ay = ps->y[pp]; bx2 = ps->x[pp + 1]; by2 = ps->y[pp + 1];
      } else {
        size_t kk = pp - ns;
        ax = v->xw[kk]; ay = v->yw[kk]; bx2 = v->xw[kk + 1]; by2 = v->yw[kk + 1];
      }
      panel_source_velocity(ax, ay, bx2, by2, mx, my, &su, &sv);
      double qq = su * tx + sv * ty;
      for (size_t j = 0; j < n; j++) qq += v->qmid_g[k * n + j] * v->E[j * np + pp];
      v->qmid[k * np + pp] = qq;
    }
  }
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

/* Current surface gamma at node i from the inviscid part and the sources of the current m. */
static double node_gamma(const ascr_visc_solver *v, size_t i)
{
  double g = v->gam_inv[i];
  const double *row = v->E + i * v->np;
  for (size_t pp = 0; pp < v->np; pp++) {
    g += row[pp] * (v->ga[pp] * v->mm[v->pa[pp]] + v->gb[pp] * v->mm[v->pb[pp]]);
  }
  return g;
}

/* Station layout for stagnation between nodes is and is+1; builds G, D and ue_inv. */
static void restage(ascr_visc_solver *v, size_t is, double s_stag)
{
  const size_t n = v->n, nw = v->nw, np = v->np, ns = n - 1, nst = v->nst;
  v->is = is;
  v->s_stag = s_stag;
  v->nu = is + 1;
  v->nl = n - 1 - is;
  v->dsp = v->snode[is + 1] - v->snode[is];
  size_t k = 0;
  for (size_t i = is + 1; i-- > 0;) {
    v->node[k] = i; v->side[k] = 0; v->sgn[k] = 1.0;
    v->xi[k] = s_stag - v->snode[i];
    v->dfirst[k] = v->snode[is] - v->snode[i];
    k++;
  }
  for (size_t i = is + 1; i < n; i++) {
    v->node[k] = i; v->side[k] = 1; v->sgn[k] = -1.0;
    v->xi[k] = v->snode[i] - s_stag;
    v->dfirst[k] = v->snode[i] - v->snode[is + 1];
    k++;
  }
  for (size_t j = 0; j < nw; j++) {
    v->node[k] = j; v->side[k] = 2; v->sgn[k] = 1.0;
    v->xi[k] = v->sw[j];
    v->dfirst[k] = 0.0;
    k++;
  }
  /* station of node i */
#define ST_OF(i) ((i) <= is ? is - (i) : v->nu + ((i) - is - 1))
  for (size_t pp = 0; pp < ns; pp++) {
    double L = v->plen[pp];
    size_t a = ST_OF(pp), b = ST_OF(pp + 1);
    v->pa[pp] = a;
    v->pb[pp] = b;
    if (pp + 1 <= is) { /* upper: flow from node pp+1 to node pp */
      v->ga[pp] = 1.0 / L;
      v->gb[pp] = -1.0 / L;
    } else if (pp >= is + 1) { /* lower: flow from pp to pp+1 */
      v->ga[pp] = -1.0 / L;
      v->gb[pp] = 1.0 / L;
    } else { /* the panel holding the stagnation point: both layers start in it */
      v->ga[pp] = 1.0 / L;
      v->gb[pp] = 1.0 / L;
    }
  }
#undef ST_OF
  size_t w0 = v->nu + v->nl;
  for (size_t j = 0; j + 1 < nw; j++) {
    double L = v->plen[ns + j];
    v->pa[ns + j] = w0 + j;
    v->pb[ns + j] = w0 + j + 1;
    v->ga[ns + j] = -1.0 / L;
    v->gb[ns + j] = 1.0 / L;
  }
  memset(v->D, 0, nst * nst * sizeof *v->D);
  for (size_t r = 0; r < nst; r++) {
    size_t row_node = v->side[r] == 2 ? n + v->node[r] : v->node[r];
    const double *er = v->E + row_node * np;
    double *dr = v->D + r * nst;
    for (size_t pp = 0; pp < np; pp++) {
      dr[v->pa[pp]] += v->sgn[r] * er[pp] * v->ga[pp];
      dr[v->pb[pp]] += v->sgn[r] * er[pp] * v->gb[pp];
    }
    v->ue_inv[r] = v->side[r] == 2 ? v->qw_inv[v->node[r]] : v->sgn[r] * v->gam_inv[v->node[r]];
  }
}

/* Stagnation point from nodal gamma: the last node of the first positive-to-negative change
 * counting from the leading-edge node region. */
static int find_stagnation(const ascr_visc_solver *v, const double *gam, size_t *is, double *s_stag)
{
  const size_t n = v->n;
  /* start from the node of smallest |gamma| change near the nose: scan all sign changes and
   * take the one nearest the leading-edge node */
  const ascr_panel_solver *ps = v->ps;
  size_t best = n;
  double bestd = INFINITY;
  for (size_t i = 0; i + 1 < n; i++) {
    if (gam[i] > 0.0 && gam[i + 1] <= 0.0) {
      double d = fmin(ps->x[i], ps->x[i + 1]);
      if (d < bestd) {
        bestd = d;
        best = i;
      }
    }
  }
  if (best >= n || best < 1 || best + 2 >= n) return -1;
  *is = best;
  double f = gam[best] / (gam[best] - gam[best + 1]);
  *s_stag = v->snode[best] + f * (v->snode[best + 1] - v->snode[best]);
  return 0;
}

static void update_ue(ascr_visc_solver *v)
{
  const size_t nst = v->nst;
  for (size_t r = 0; r < nst; r++) {
    double u = v->ue_inv[r];
    const double *dr = v->D + r * nst;
    for (size_t k = 0; k < nst; k++) u += dr[k] * v->mm[k];
    v->ue[r] = u;
  }
}

/* Stagnation point between the first stations of the two sides, where the edge velocity,
 * linear along the stagnation panel, vanishes: offsets of the two sides' first stations. */
static void stag_offsets(const ascr_visc_solver *v, double ueu, double uel, double *xu, double *xl)
{
  ueu = fmax(ueu, 1e-7);
  uel = fmax(uel, 1e-7);
  *xu = v->dsp * ueu / (ueu + uel);
  *xl = v->dsp * uel / (ueu + uel);
}

/* Surface xi from the current first-station edge velocities. */
static void set_xi(ascr_visc_solver *v)
{
  double xu, xl;
  stag_offsets(v, v->ue[0], v->ue[v->nu], &xu, &xl);
  for (size_t k = 0; k < v->nu; k++) v->xi[k] = xu + v->dfirst[k];
  for (size_t k = v->nu; k < v->nu + v->nl; k++) v->xi[k] = xl + v->dfirst[k];
  v->s_stag = v->snode[v->is] + xu;
}

static vstate get_state(const ascr_visc_solver *v, size_t k)
{
  vstate s;
  s.th = v->th[k];
  s.m = v->mm[k];
  s.c = v->cc[k];
  s.ue = v->ue[k];
  s.xi = v->xi[k];
  s.turb = v->turb[k];
  s.first = (k == 0 || k == v->nu);
  return s;
}

/* Residual kind of station k and its partner stations. */
static int station_kind(const ascr_visc_solver *v, size_t k, size_t *a, size_t *b, size_t *w)
{
  size_t w0 = v->nu + v->nl;
  *w = k;
  *b = k;
  if (k == 0 || k == v->nu) {
    *a = k;
    return VR_STAG;
  }
  if (k == w0) {
    *a = v->nu - 1;
    *b = w0 - 1;
    return VR_MERGE;
  }
  *a = k - 1;
  if (k > w0) return VR_WAKE;
  if (!v->turb[k]) return VR_LAM;
  return v->turb[k - 1] ? VR_TURB : VR_TRANS;
}

/* Is the converged transition on each surface one the e^N criterion allows? The interval
 * kt-1 -> kt holds transition where N, growing at the rate of its laminar end, reaches N_crit;
 * where it cannot (the crossing held at the interval's end), the interval must end at a
 * laminar separation (Hk at its laminar end near the separation value: a bubble transition)
 * or contain a trip. A transition left where N is far below N_crit on an attached layer (for
 * instance a leading-edge transition of a cold start that the iteration could not move) is
 * not a solution of the model. Returns a bit per side that fails (1 upper, 2 lower). */
#define TR_CHECK_DN 1.0  /* N may fall short of N_crit by this much (hysteresis, smoothing) */
#define TR_CHECK_HK 3.0  /* Hk from which a laminar layer is taken as separating */
#define TR_FORCED_MOVES 12 /* forced moves per solve before the point is given up */
static int transition_inconsistent(const ascr_visc_solver *v, const vctx cxs[3])
{
  int bad = 0;
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
    for (size_t k = k0 + 1; k < k1; k++) {
      if (!v->turb[k]) continue;
      if (v->turb[k - 1]) break;
      vstate sa = get_state(v, k - 1), sb = get_state(v, k);
      double R[3], f[3] = {1.0, INFINITY, 0.0};
      visc_residual(VR_TRANS, &cxs[side], &sa, &sb, NULL, R, f);
      if (!(f[1] >= cxs[side].ncrit - TR_CHECK_DN || f[2] >= TR_CHECK_HK)) bad |= 1 << side;
      break;
    }
  }
  return bad;
}

/* Distance along the surface between the second stations of the two sides. */
static double stag_span(const ascr_visc_solver *v)
{
  return v->snode[v->node[v->nu + 1]] - v->snode[v->node[1]];
}

static vctx context(const ascr_visc_solver *v, int side)
{
  vctx c;
  c.re = v->p.re;
  c.mach = v->p.mach;
  c.ncrit = v->p.ncrit;
  c.xi_trip = -1.0;
  /* the stagnation-flow gradient from the second stations of the two sides: their edge
   * velocities are well away from zero, while the first stations' can be dominated by the
   * displacement effect when the stagnation point sits near a node */
  c.stag_a = (fmax(v->ue[1], 0.0) + fmax(v->ue[v->nu + 1], 0.0)) / stag_span(v);
  if (!(c.stag_a > 1e-6)) c.stag_a = 1e-6;
  c.xi_min = 0.25 * v->dsp;
  c.exact_tr = v->exact_phase;
  double xt = side == 0 ? v->p.trip_upper : v->p.trip_lower;
  if (side < 2 && xt >= 0.0 && xt <= 1.0) {
    /* xi of the trip: first node on this side at or behind x = xt */
    const ascr_panel_solver *ps = v->ps;
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
    for (size_t k = k0 + 1; k < k1; k++) {
      double xa = ps->x[v->node[k - 1]], xb = ps->x[v->node[k]];
      if (xa <= xt && xb >= xt && xb > xa) {
        c.xi_trip = v->xi[k - 1] + (xt - xa) / (xb - xa) * (v->xi[k] - v->xi[k - 1]);
        break;
      }
    }
  }
  return c;
}

/* Sum of squared residuals of all stations at the current state (R and J untouched). */
static double residual_norm2(ascr_visc_solver *v, const vctx cxs[3])
{
  double sum = 0.0;
  for (size_t k = 0; k < v->nst; k++) {
    const vctx *cx = &cxs[v->side[k]];
    size_t a, b, w;
    int kind = station_kind(v, k, &a, &b, &w);
    vstate sa = get_state(v, a), sb = get_state(v, b), sw = get_state(v, w);
    double R[3];
    if (kind == VR_MERGE) visc_residual(kind, cx, &sa, &sb, &sw, R, NULL);
    else if (kind == VR_STAG) visc_residual(kind, cx, NULL, &sw, NULL, R, NULL);
    else visc_residual(kind, cx, &sa, &sb, NULL, R, NULL);
    for (int e = 0; e < 3; e++) sum += isfinite(R[e]) ? R[e] * R[e] : 1e300;
  }
  return sum;
}

/* Writers of the Newton matrix: dense (J, column-major) or structured (L blocks, U entries). */
static void add_local(ascr_visc_solver *v, size_t k, size_t e, size_t col_station, int var, double d)
{
  if (v->dense_jac) {
    size_t N = 3 * v->nst;
    v->J[(3 * k + e) + (3 * col_station + (size_t)var) * N] += d;
    return;
  }
  size_t *ls = v->lst + 3 * k;
  int q = 0;
  while (q < 3 && ls[q] != col_station && ls[q] != SIZE_MAX) q++;
  if (q == 3) return; /* cannot happen: at most three stations per residual */
  ls[q] = col_station;
  v->lblk[(3 * k + (size_t)q) * 9 + e * 3 + (size_t)var] += d;
}

/* row 3k+e gets d * (D row drow) in the m columns */
static void add_ue(ascr_visc_solver *v, size_t k, size_t e, size_t drow, double d)
{
  size_t nst = v->nst, row = 3 * k + e;
  if (v->dense_jac) {
    size_t N = 3 * nst;
    const double *dr = v->D + drow * nst;
    double *jr = v->J + row;
    for (size_t kk = 0; kk < nst; kk++) jr[(3 * kk + 1) * N] += d * dr[kk];
    return;
  }
  size_t *ui = v->uidx + row * UMAX;
  double *uc = v->ucoef + row * UMAX;
  int c = v->ucnt[row];
  for (int q = 0; q < c; q++) {
    if (ui[q] == drow) {
      uc[q] += d;
      return;
    }
  }
  if (c < UMAX) {
    ui[c] = drow;
    uc[c] = d;
    v->ucnt[row] = c + 1;
  }
}

/* Build R and J. Returns the largest |R|. */
static double assemble(ascr_visc_solver *v, const vctx cxs[3])
{
  const size_t nst = v->nst, N = 3 * nst;
  if (v->dense_jac) {
    memset(v->J, 0, N * N * sizeof *v->J);
  } else {
    for (size_t i = 0; i < 3 * nst; i++) v->lst[i] = SIZE_MAX;
    memset(v->lblk, 0, 27 * nst * sizeof *v->lblk);
    memset(v->ucnt, 0, 3 * nst * sizeof *v->ucnt);
  }
  double rmax = 0.0;
  for (size_t k = 0; k < nst; k++) {
    const vctx *cx = &cxs[v->side[k]];
    size_t a, b, w;
    int kind = station_kind(v, k, &a, &b, &w);
    size_t st[3] = {a, b, w};
    int nsts = kind == VR_MERGE ? 3 : (kind == VR_STAG ? 1 : 2);
    if (kind == VR_STAG) st[0] = k;
    vstate s[3];
    for (int q = 0; q < nsts; q++) s[q] = get_state(v, st[q]);
    double R0[3], ftr[3] = {1.0, INFINITY, 0.0};
    if (kind == VR_MERGE) visc_residual(kind, cx, &s[0], &s[1], &s[2], R0, ftr);
    else if (kind == VR_STAG) visc_residual(kind, cx, NULL, &s[0], NULL, R0, NULL);
    else visc_residual(kind, cx, &s[0], &s[1], NULL, R0, ftr);
    if (kind == VR_TRANS) v->f_tr[v->side[k]] = ftr[0];
    for (int e = 0; e < 3; e++) {
      v->R[3 * k + e] = R0[e];
      rmax = fmax(rmax, fabs(R0[e]));
    }
    /* derivative with respect to the stagnation offset of this side (surface stations): the
     * offsets depend on the two first-station edge velocities, which depend on all m */
    if (v->side[k] < 2 && kind != VR_MERGE) {
      vstate sp[3];
      for (int qq = 0; qq < nsts; qq++) sp[qq] = s[qq];
      double h = 1e-7 * fmax(v->xi[v->side[k] == 0 ? 0 : v->nu], 1e-9);
      for (int qq = 0; qq < nsts; qq++) sp[qq].xi += h;
      double R1[3];
      if (kind == VR_STAG) visc_residual(kind, cx, NULL, &sp[0], NULL, R1, NULL);
      else visc_residual(kind, cx, &sp[0], &sp[1], NULL, R1, NULL);
      double ueu = fmax(v->ue[0], 1e-7), uel = fmax(v->ue[v->nu], 1e-7), sum = ueu + uel;
      /* d xoff / d ue_u0 and d ue_l0 for this side */
      double du, dl;
      if (v->side[k] == 0) {
        du = v->dsp * uel / (sum * sum);
        dl = -v->dsp * ueu / (sum * sum);
      } else {
        du = -v->dsp * uel / (sum * sum);
        dl = v->dsp * ueu / (sum * sum);
      }
      for (int e = 0; e < 3; e++) {
        double d = (R1[e] - R0[e]) / h;
        if (d == 0.0) continue;
        add_ue(v, k, (size_t)e, 0, d * du);
        add_ue(v, k, (size_t)e, v->nu, d * dl);
      }
    }
    /* derivative with respect to the stagnation-flow gradient a = (ue_u1 + ue_l1)/span */
    if (v->side[k] < 2 && kind != VR_MERGE) {
      vctx cp2 = *cx;
      double h = 1e-7 * cx->stag_a;
      cp2.stag_a += h;
      double R1[3];
      if (kind == VR_STAG) visc_residual(kind, &cp2, NULL, &s[0], NULL, R1, NULL);
      else visc_residual(kind, &cp2, &s[0], &s[1], NULL, R1, NULL);
      for (int e = 0; e < 3; e++) {
        double d = (R1[e] - R0[e]) / h / stag_span(v);
        if (d == 0.0) continue;
        add_ue(v, k, (size_t)e, 1, d);
        add_ue(v, k, (size_t)e, v->nu + 1, d);
      }
    }
    /* derivatives with respect to theta, m, c, ue of each involved station */
    for (int q = 0; q < nsts; q++) {
      for (int var = 0; var < 4; var++) {
        vstate sp[3];
        for (int qq = 0; qq < nsts; qq++) sp[qq] = s[qq];
        double *x = var == 0 ? &sp[q].th : var == 1 ? &sp[q].m : var == 2 ? &sp[q].c : &sp[q].ue;
        double h = FD_STEP * (fabs(*x) > 1e-3 ? fabs(*x) : 1e-3);
        if (var == 0 || var == 1) h = FD_STEP * fabs(*x) + 1e-14;
        *x += h;
        double R1[3];
        if (kind == VR_MERGE) visc_residual(kind, cx, &sp[0], &sp[1], &sp[2], R1, NULL);
        else if (kind == VR_STAG) visc_residual(kind, cx, NULL, &sp[0], NULL, R1, NULL);
        else visc_residual(kind, cx, &sp[0], &sp[1], NULL, R1, NULL);
        for (int e = 0; e < 3; e++) {
          double d = (R1[e] - R0[e]) / h;
          if (d == 0.0) continue;
          if (var < 3) {
            add_local(v, k, (size_t)e, st[q], var, d);
          } else {
            add_ue(v, k, (size_t)e, st[q], d);
          }
        }
      }
    }
  }
  return rmax;
}

/* ---- structured solve of the Newton system ----------------------------------------------
 * J = L + U D Q: L holds each residual's derivatives with respect to the unknowns of its own
 * and its upstream stations (block lower triangular in station order: a residual involves its
 * station, the one before it, and at the wake's first station the two trailing-edge stations);
 * U holds its derivatives with respect to edge velocities; D is the mass-defect influence
 * (ue = ue_inv + D m) and Q picks the m unknowns. With y = D Q x (the edge-velocity change):
 *     x = L^-1 (b - U y),   (I + D Q L^-1 U) y = D Q L^-1 b,
 * so the dense factorisation is of order nst instead of 3 nst (27 times fewer operations) and
 * the rest is block substitution. The result is checked against the structured matrix; a
 * solution that does not satisfy it to 1e-6 of the residual falls back to the dense LU. */

/* 3x3 solve with partial pivoting, a row-major (destroyed); 0 if singular */
int visc_solve3(double a[9], double b[3])
{
  for (int c = 0; c < 3; c++) {
    int p = c;
    for (int r = c + 1; r < 3; r++) {
      if (fabs(a[r * 3 + c]) > fabs(a[p * 3 + c])) p = r;
    }
    if (!(fabs(a[p * 3 + c]) > 1e-300)) return 0;
    if (p != c) {
      for (int q = 0; q < 3; q++) {
        double t = a[c * 3 + q];
        a[c * 3 + q] = a[p * 3 + q];
        a[p * 3 + q] = t;
      }
      double t = b[c];
      b[c] = b[p];
      b[p] = t;
    }
    for (int r = c + 1; r < 3; r++) {
      double f = a[r * 3 + c] / a[c * 3 + c];
      for (int q = c; q < 3; q++) a[r * 3 + q] -= f * a[c * 3 + q];
      b[r] -= f * b[c];
    }
  }
  for (int c = 2; c >= 0; c--) {
    double t = b[c];
    for (int q = c + 1; q < 3; q++) t -= a[c * 3 + q] * b[q];
    b[c] = t / a[c * 3 + c];
  }
  return 1;
}

/* Invert the diagonal blocks of L once per Newton step; 0 if one is singular. */
static int invert_diagonal(ascr_visc_solver *v)
{
  for (size_t k = 0; k < v->nst; k++) {
    const size_t *ls = v->lst + 3 * k;
    int qs = -1;
    for (int q = 0; q < 3 && ls[q] != SIZE_MAX; q++) {
      if (ls[q] == k) qs = q;
    }
    if (qs < 0) return 0;
    const double *blk = v->lblk + (3 * k + (size_t)qs) * 9;
    double *inv = v->dinv + 9 * k;
    for (int c = 0; c < 3; c++) {
      double a[9], b[3] = {c == 0, c == 1, c == 2};
      memcpy(a, blk, sizeof a);
      if (!visc_solve3(a, b)) return 0;
      inv[0 * 3 + c] = b[0];
      inv[1 * 3 + c] = b[1];
      inv[2 * 3 + c] = b[2];
    }
  }
  return 1;
}

/* x <- L^-1 x, forward over stations from k0 (x is zero above station k0). */
static void lsolve(const ascr_visc_solver *v, double *x, size_t k0)
{
  for (size_t k = k0; k < v->nst; k++) {
    const size_t *ls = v->lst + 3 * k;
    double r0 = x[3 * k], r1 = x[3 * k + 1], r2 = x[3 * k + 2];
    for (int q = 0; q < 3 && ls[q] != SIZE_MAX; q++) {
      if (ls[q] == k) continue;
      const double *blk = v->lblk + (3 * k + (size_t)q) * 9;
      const double *xs = x + 3 * ls[q];
      r0 -= blk[0] * xs[0] + blk[1] * xs[1] + blk[2] * xs[2];
      r1 -= blk[3] * xs[0] + blk[4] * xs[1] + blk[5] * xs[2];
      r2 -= blk[6] * xs[0] + blk[7] * xs[1] + blk[8] * xs[2];
    }
    const double *d = v->dinv + 9 * k;
    x[3 * k] = d[0] * r0 + d[1] * r1 + d[2] * r2;
    x[3 * k + 1] = d[3] * r0 + d[4] * r1 + d[5] * r2;
    x[3 * k + 2] = d[6] * r0 + d[7] * r1 + d[8] * r2;
  }
}

/* Solve J dx = -R (unscaled unknowns) in structured form; 1 on success. */
static int solve_structured(ascr_visc_solver *v)
{
  const size_t nst = v->nst, N = 3 * nst;
  double *zf = v->J; /* N x nst, column-major: L^-1 U */
  if (!invert_diagonal(v)) return 0;
  for (size_t j = 0; j < nst; j++) memset(zf + j * N, 0, N * sizeof *zf);
  /* scatter U by columns (D rows); yv holds, per column, the first station with a nonzero
   * (the substitution starts there: L is lower triangular) */
  for (size_t j = 0; j < nst; j++) v->yv[j] = (double)nst;
  for (size_t row = 0; row < N; row++) {
    for (int q = 0; q < v->ucnt[row]; q++) {
      size_t j = v->uidx[row * UMAX + (size_t)q];
      zf[j * N + row] += v->ucoef[row * UMAX + (size_t)q];
      if ((double)(row / 3) < v->yv[j]) v->yv[j] = (double)(row / 3);
    }
  }
  for (size_t j = 0; j < nst; j++) {
    size_t k0 = (size_t)v->yv[j];
    if (k0 < nst) lsolve(v, zf + j * N, k0);
  }
  /* zm = Q L^-1 U (row-major nst x nst) */
  for (size_t kk = 0; kk < nst; kk++) {
    for (size_t j = 0; j < nst; j++) v->zm[kk * nst + j] = zf[j * N + 3 * kk + 1];
  }
  /* M = I + D zm */
  cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasNoTrans, (int)nst, (int)nst, (int)nst, 1.0, v->D,
              (int)nst, v->zm, (int)nst, 0.0, v->mmat, (int)nst);
  for (size_t j = 0; j < nst; j++) v->mmat[j * nst + j] += 1.0;
  /* w = L^-1 (-R), y from M y = D Q w */
  for (size_t i = 0; i < N; i++) v->wv[i] = -v->R[i];
  lsolve(v, v->wv, 0);
  for (size_t j = 0; j < nst; j++) {
    double t = 0.0;
    const double *dr = v->D + j * nst;
    for (size_t kk = 0; kk < nst; kk++) t += dr[kk] * v->wv[3 * kk + 1];
    v->yv[j] = t;
  }
  /* mmat is row-major M, i.e. column-major M^T: factor that and solve with the transpose */
  lapack_int info = LAPACKE_dgetrf(LAPACK_COL_MAJOR, (lapack_int)nst, (lapack_int)nst, v->mmat,
                                   (lapack_int)nst, v->ipiv2);
  if (info != 0) return 0;
  info = LAPACKE_dgetrs(LAPACK_COL_MAJOR, 'T', (lapack_int)nst, 1, v->mmat, (lapack_int)nst,
                        v->ipiv2, v->yv, (lapack_int)nst);
  if (info != 0) return 0;
  /* dx = w - (L^-1 U) y */
  memcpy(v->dx, v->wv, N * sizeof *v->dx);
  cblas_dgemv(CblasColMajor, CblasNoTrans, (int)N, (int)nst, -1.0, zf, (int)N, v->yv, 1, 1.0,
              v->dx, 1);
  /* check: L dx + U D Q dx + R = 0 */
  double rmax = 0.0, emax = 0.0;
  for (size_t j = 0; j < nst; j++) {
    double t = 0.0;
    const double *dr = v->D + j * nst;
    for (size_t kk = 0; kk < nst; kk++) t += dr[kk] * v->dx[3 * kk + 1];
    v->wv[j] = t; /* the edge-velocity change */
  }
  for (size_t k = 0; k < nst; k++) {
    const size_t *ls = v->lst + 3 * k;
    for (size_t e = 0; e < 3; e++) {
      size_t row = 3 * k + e;
      double t = v->R[row];
      for (int q = 0; q < 3 && ls[q] != SIZE_MAX; q++) {
        const double *blk = v->lblk + (3 * k + (size_t)q) * 9;
        const double *xs = v->dx + 3 * ls[q];
        t += blk[e * 3] * xs[0] + blk[e * 3 + 1] * xs[1] + blk[e * 3 + 2] * xs[2];
      }
      for (int q = 0; q < v->ucnt[row]; q++) {
        t += v->ucoef[row * UMAX + (size_t)q] * v->wv[v->uidx[row * UMAX + (size_t)q]];
      }
      emax = fmax(emax, fabs(t));
      rmax = fmax(rmax, fabs(v->R[row]));
    }
  }
  return isfinite(emax) && emax <= 1e-6 * rmax + 1e-300;
}

/* Downstream move of the transition interval that starts at kt (first turbulent station) on a
 * side ending before k1: a laminar march from the last laminar station over the next stations
 * (at most 12) says where N reaches N_crit (or where the laminar layer separates: transition
 * is then taken there, as in a separation bubble); the stations passed become laminar with the
 * marched state. On the present edge velocity, or (forced = 1) on the inviscid one, moving at
 * least one station: used when the iteration has settled with a transition the e^N criterion
 * does not allow, where the present edge velocity carries the displacement of the turbulent
 * layer that should not be there. Returns the new first turbulent station. */
static size_t move_downstream(ascr_visc_solver *v, const vctx *cx, size_t k1, size_t kt,
                              double hyst, int forced)
{
  enum { LOOK = 13 };
  double ss[LOOK], uu[LOOK], tt[LOOK], hh[LOOK], nn[LOOK];
  size_t cnt = 0;
  for (size_t j = kt - 1; j < k1 && cnt < LOOK; j++, cnt++) {
    ss[cnt] = v->xi[j];
    uu[cnt] = fmax(forced && cnt > 0 ? v->ue_inv[j] : v->ue[j], 1e-4);
  }
  vstate a = get_state(v, kt - 1);
  double ha = a.m / (fmax(a.ue, 1e-6) * a.th);
  int why = 0;
  for (size_t q = 0; q < LOOK; q++) tt[q] = hh[q] = nn[q] = NAN;
  size_t stop = bl_march_laminar_from(a.th, ha, a.c, ss, uu, cnt, cx->re, cx->mach,
                                      cx->ncrit - hyst, tt, hh, nn, &why);
  /* stop: index (in the look-ahead) of the station where the march stopped; stations
   * 1..stop-1 become laminar */
  size_t knew = kt + (stop > 0 ? stop - 1 : 0);
  if (why == 0) knew = kt + cnt - 1;
  if (forced && knew == kt && cnt > 1 && kt + 1 < k1) {
    knew = kt + 1;
    if (!isfinite(tt[1]) || !isfinite(hh[1]) || !isfinite(nn[1])) {
      tt[1] = a.th;
      hh[1] = ha;
      nn[1] = a.c;
    }
  }
  if (cx->xi_trip >= 0.0) {
    for (size_t j = kt; j < knew; j++) {
      if (v->xi[j] >= cx->xi_trip) {
        knew = j;
        break;
      }
    }
  }
  for (size_t j = kt; j < knew; j++) {
    size_t q = j - (kt - 1);
    v->turb[j] = 0;
    v->th[j] = tt[q];
    v->cc[j] = nn[q];
    v->mm[j] = hh[q] * tt[q] * fmax(v->ue[j], 1e-6);
  }
  return knew > kt ? knew : kt;
}

/* Re-locate transition per side from the current state. Returns 1 if a flag changed.
 * Hysteresis of TR_HYST in N: within it the transition interval keeps its place and the
 * crossing point moves inside it (clamped to its ends), which stops the interval from
 * hopping back and forth between iterations. */
#define TR_HYST 0.3
/* Second phase: once converged with the wide band, the intervals may move again with a narrow
 * one, so that the transition point is not left up to a band's worth of N upstream. */
#define TR_HYST_FINE 0.02
#define TR_FINE_MOVES 4
#define TR_FINE_ITERS 20
/* After this many moves the transition intervals stay where they are and the crossing point
 * is found within them (clamped to their ends): in separation bubbles the transition point
 * and the edge velocity feed back on each other and the interval can cycle between two
 * neighbours; the clamped result is then off by at most one panel. */
#define TR_MAX_MOVES 8
/* An iteration whose residual has not fallen for this many steps is cycling across the kink of
 * a transition interval whose crossing point sits at one of its ends: the interval may then
 * move although the updates are not small. */
#define TR_STUCK_ITERS 4
/* First turbulent station of the side's stations k0+1 .. k1-1 (k1 if none). */
static size_t first_turbulent(const ascr_visc_solver *v, size_t k0, size_t k1)
{
  for (size_t k = k0 + 1; k < k1; k++) {
    if (v->turb[k]) return k;
  }
  return k1;
}

static int update_transition(ascr_visc_solver *v, const vctx cxs[3], double hyst)
{
  int changed = 0;
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
    const vctx *cx = &cxs[side];
    size_t kt = first_turbulent(v, k0, k1);
    /* upstream move: a laminar station already past N_crit, or past the trip */
    for (size_t k = k0 + 1; k < kt; k++) {
      int trip = cx->xi_trip >= 0.0 && v->xi[k] >= cx->xi_trip && v->xi[k - 1] < cx->xi_trip;
      if (v->cc[k] >= cx->ncrit + hyst || trip) {
        for (size_t j = k; j < k1; j++) {
          if (!v->turb[j]) {
            v->turb[j] = 1;
            v->cc[j] = 0.07;
          }
        }
        changed = 1;
        kt = k;
        break;
      }
    }
    /* downstream move: a laminar march from the last laminar station on the current edge
     * velocity over the next stations (at most 12) says where N reaches N_crit (or where the
     * laminar layer separates: transition is then taken there, as in a separation bubble);
     * the stations passed become laminar with the marched state */
    if (!changed && kt < k1 && kt > k0) {
      size_t knew = move_downstream(v, cx, k1, kt, hyst, 0);
      if (knew > kt) {
        changed = 1;
        kt = knew;
      }
    }
    v->itr[side] = kt;
  }
  return changed;
}

/* Transition interval of each side from the current state (Drela & Giles 1987: the interval
 * in which the amplification reaches N_crit, or the trip). Called at the start of every Newton
 * iteration; the rule has no memory, no band and no budget, so a converged state is one in
 * which every laminar station has N < N_crit, lies upstream of the trip, and the transition
 * interval's crossing point (residual.c) lies inside it:
 *  - upstream: the first laminar station with N >= N_crit, or at or past the trip, becomes
 *    turbulent with the stations behind it; sqrt(Ctau) starts from the transition relation
 *    (bl_ctau_initial) at its state;
 *  - downstream: where N at the interval's end, by the laminar amplification equation, stays
 *    below N_crit and no trip lies in the interval, its end station becomes laminar with that N
 *    (theta and m kept). One station per iteration: the Newton step that follows settles the
 *    layer before the next interval is judged.
 * Returns 1 if an interval moved. */
/* Path controls of the exact rule (they decide how fast the iteration gets there, not where it
 * ends): a downstream move passes at most TR_MOVE_STATIONS stations at once, and the intervals
 * are judged once the largest relative update is below TR_EXACT_SETTLED. Measured on the thin
 * plate at Re 2e5, 2 deg: 1 station / 0.05 crept for 100 iterations without arriving; 2 / 0.15,
 * 4 / 0.15 and 3 / 0.3 converged to the same state in 113, 97 and 85 iterations. */
#define TR_MOVE_STATIONS 3
#define TR_EXACT_SETTLED 0.3
static int transition_exact(ascr_visc_solver *v, const vctx cxs[3])
{
  int changed = 0;
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
    const vctx *cx = &cxs[side];
    size_t kt = first_turbulent(v, k0, k1);
    /* everything behind the first turbulent station is turbulent */
    for (size_t k = kt; k < k1; k++) v->turb[k] = 1;
    int moved = 0;
    for (size_t k = k0 + 1; k < kt; k++) {
      int trip = cx->xi_trip >= 0.0 && v->xi[k] >= cx->xi_trip;
      if (v->cc[k] >= cx->ncrit || trip) {
        for (size_t j = k; j < kt; j++) {
          vstate s = get_state(v, j);
          v->turb[j] = 1;
          v->cc[j] = visc_sqrt_ctau_start(cx, &s);
        }
        kt = k;
        moved = 1;
        break;
      }
    }
    if (!moved && kt < k1 && kt > k0 + 1) {
      vstate sa = get_state(v, kt - 1), sb = get_state(v, kt);
      double R[3], f[3] = {1.0, INFINITY, 0.0};
      visc_residual(VR_TRANS, cx, &sa, &sb, NULL, R, f);
      if (isfinite(f[1]) && f[1] < cx->ncrit) {
        /* N grows on at the rate of the last laminar station, the stations passed turn
         * laminar, until N_crit or the trip is reached: a first guess, which the following
         * iterations settle and the rule above may move back upstream */
        double na = sa.c, rate = (f[1] - na) / fmax(log(sb.xi / sa.xi) * 0.5 * (sa.xi + sb.xi), 1e-300);
        size_t j = kt;
        while (j < k1 && j < kt + TR_MOVE_STATIONS) {
          double nj = na + rate * 0.5 * (sa.xi + v->xi[j]) * log(v->xi[j] / sa.xi);
          if (!(nj < cx->ncrit) || (cx->xi_trip >= 0.0 && v->xi[j] >= cx->xi_trip)) break;
          v->turb[j] = 0;
          v->cc[j] = fmax(nj, 0.0);
          j++;
        }
        kt = j;
        moved = 1;
      }
    }
    changed |= moved;
    v->itr[side] = kt;
  }
  return changed;
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

/* Cold start of the exact formulation: each surface marched on the inviscid edge velocity by
 * visc_cold_march (coldstart.c: inverse mode through laminar separation, transition where N
 * reaches N_crit), the wake from the two trailing-edge states. One pass: marching again on
 * ue_inv + D m of this start (as initial_state does) was measured worse -- the displacement
 * of a start's separated region drives the edge velocity near the trailing edge negative
 * (NACA 2412 and the thin plate at Re 1e5-2e5: 2 of 8 cold points converged with one pass,
 * 0 of 8 with three, before the fallback start existed). */
static void initial_state_exact(ascr_visc_solver *v)
{
  for (size_t k = 0; k < v->nst; k++) v->ue[k] = v->ue_inv[k];
  set_xi(v);
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, cnt = side == 0 ? v->nu : v->nl;
    vctx cx = context(v, side);
    vstate f;
    double hh = visc_hiemenz_h(), thh, h2;
    bl_similarity_start(1.0, v->p.re, cx.stag_a, 1.0, &thh, &h2);
    f.th = thh;
    f.xi = v->xi[k0];
    f.ue = cx.stag_a * fmax(f.xi, cx.xi_min);
    f.m = hh * thh * f.ue;
    f.c = 0.0;
    f.turb = 0;
    f.first = 1;
    /* a station the march could only approximate is left to the Newton iteration */
    (void)visc_cold_march(&cx, cnt, v->xi + k0, v->ue_inv + k0, &f, v->th + k0, v->mm + k0,
                          v->cc + k0, v->turb + k0);
  }
  wake_start(v);
}

/* Cold start: direct march of each surface on the inviscid edge velocity. */
static ascr_status initial_state(ascr_visc_solver *v, const vctx cxs[3], ascr_errbuf *err)
{
  (void)err;
  const size_t nst = v->nst;
  /* three passes: march on the inviscid ue, then twice on ue_inv + D m of the previous pass */
  for (int pass = 0; pass < 3; pass++) {
  if (pass > 0) update_ue(v);
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, cnt = side == 0 ? v->nu : v->nl;
    double *s = core_calloc(cnt, sizeof *s), *ue = core_calloc(cnt, sizeof *ue);
    ascr_bl_station *out = core_calloc(cnt, sizeof *out);
    if (!s || !ue || !out) {
      free(s); free(ue); free(out);
      return core_fail(err, ASCR_ENOMEM, "viscous solver: out of memory");
    }
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
    free(s); free(ue); free(out);
  }
  wake_start(v);
  }
  (void)nst;
  return ASCR_OK;
}

/* Set the unknowns from saved values and rlx * dx: theta and m (and sqrt(Ctau)) change by
 * factors exp(rlx dx), N additively. */
static void set_trial(ascr_visc_solver *v, const double *saved, double rlx)
{
  const size_t nst = v->nst;
  for (size_t k = 0; k < nst; k++) {
    v->th[k] = saved[3 * k] * exp(rlx * v->dx[3 * k]);
    v->mm[k] = saved[3 * k + 1] * exp(rlx * v->dx[3 * k + 1]);
    if (v->turb[k]) {
      v->cc[k] = saved[3 * k + 2] * exp(rlx * v->dx[3 * k + 2]);
      if (v->cc[k] < 1e-4) v->cc[k] = 1e-4;
      if (v->cc[k] > 0.5) v->cc[k] = 0.5;
    } else {
      v->cc[k] = saved[3 * k + 2] + rlx * v->dx[3 * k + 2];
      if (v->cc[k] < 0.0) v->cc[k] = 0.0;
    }
  }
}

/* Relaxation of the Newton step (in log theta, log m, N or log sqrt(Ctau)): no factor above
 * e^1 in theta, m or sqrt(Ctau), no change above 2 in N. Returns the largest |dx| of theta, m. */
static double step_limit(ascr_visc_solver *v, double *rlx_out)
{
  const size_t nst = v->nst;
  double rlx = 1.0, dmax = 0.0;
  for (size_t k = 0; k < nst; k++) {
    double a = fabs(v->dx[3 * k]), b = fabs(v->dx[3 * k + 1]), c = fabs(v->dx[3 * k + 2]);
    dmax = fmax(dmax, fmax(a, b));
    if (a * rlx > 1.0) rlx = 1.0 / a;
    if (b * rlx > 1.0) rlx = 1.0 / b;
    double lim = v->turb[k] ? 1.0 : 2.0;
    if (c * rlx > lim) rlx = lim / c;
  }
  *rlx_out = rlx;
  return dmax;
}

/* Keep H above its floor with the current ue (the closures are not defined below it). */
static void clamp_shape(ascr_visc_solver *v)
{
  for (size_t k = 0; k < v->nst; k++) {
    /* floors: wake 1.0001, turbulent wall layer 1.05, laminar 1.8 (below the fits' range) */
    double hmin = v->side[k] == 2 ? 1.0001 : (v->turb[k] ? 1.05 : 1.8);
    double ue = fmax(v->ue[k], 1e-6);
    if (v->mm[k] < hmin * ue * v->th[k]) v->mm[k] = hmin * ue * v->th[k];
  }
}

/* Move the stagnation point if the current surface gamma says so; states are carried by node. */
static int relocate_stagnation(ascr_visc_solver *v)
{
  const size_t n = v->n;
  double *g = v->cp; /* scratch */
  for (size_t i = 0; i < n; i++) g[i] = node_gamma(v, i);
  size_t is;
  double ss;
  if (find_stagnation(v, g, &is, &ss) != 0) return -1;
  /* at most one node per iteration: a far jump comes from a poor intermediate state */
  if (is > v->is + 1) is = v->is + 1;
  if (is + 1 < v->is) is = v->is - 1;
  if (is != v->is) {
    double f = g[is] / (g[is] - g[is + 1]);
    if (!(f >= 0.0 && f <= 1.0)) f = g[is] > 0.0 ? 1.0 : 0.0;
    ss = v->snode[is] + f * (v->snode[is + 1] - v->snode[is]);
  }
  if (is == v->is) {
    set_xi(v);
    return 0;
  }
  /* carry the state by node: save, restage, restore */
  size_t nst = v->nst;
  double *th = v->J, *mm = v->J + nst, *cc = v->J + 2 * nst; /* J is rebuilt anyway */
  int *tb = v->iscratch;
  double *nth = v->J + 3 * nst, *nmm = v->J + 4 * nst, *ncc = v->J + 5 * nst;
  int *ntb = v->iscratch + nst;
  for (size_t k = 0; k < nst; k++) {
    th[k] = v->th[k]; mm[k] = v->mm[k]; cc[k] = v->cc[k]; tb[k] = v->turb[k];
  }
  size_t old_is = v->is, old_nu = v->nu;
  /* node -> old station */
  for (size_t i = 0; i < n; i++) {
    size_t ko = i <= old_is ? old_is - i : old_nu + (i - old_is - 1);
    nth[i] = th[ko]; nmm[i] = mm[ko]; ncc[i] = cc[ko]; ntb[i] = tb[ko];
  }
  double *wth = v->J + 6 * nst; /* wake part unchanged */
  size_t w0o = old_nu + (n - 1 - old_is);
  for (size_t j = 0; j < v->nw; j++) {
    wth[3 * j] = th[w0o + j]; wth[3 * j + 1] = mm[w0o + j]; wth[3 * j + 2] = cc[w0o + j];
  }
  restage(v, is, ss);
  update_ue(v);
  for (size_t k = 0; k < v->nu + v->nl; k++) {
    size_t i = v->node[k];
    v->th[k] = nth[i]; v->mm[k] = nmm[i]; v->cc[k] = ncc[i]; v->turb[k] = ntb[i];
  }
  /* Stations whose node changed sides, and the first station of each side, lie within a few
   * panels of the stagnation point: they restart from its Hiemenz state (constant theta,
   * H = H_hiemenz, N = 0), which is what the layer there is. */
  {
    update_ue(v);
    set_xi(v);
    vctx c0 = context(v, 0);
    double hh = visc_hiemenz_h(), thh, h2;
    bl_similarity_start(1.0, v->p.re, c0.stag_a, 1.0, &thh, &h2);
    for (size_t k = 0; k < v->nu + v->nl; k++) {
      size_t i = v->node[k];
      int upper = k < v->nu;
      int moved = upper ? (i > old_is) : (i <= old_is);
      if (moved || k == 0 || k == v->nu) {
        double ue = (k == 0 || k == v->nu) ? c0.stag_a * fmax(v->xi[k], c0.xi_min) : fmax(v->ue[k], 1e-6);
        v->th[k] = thh;
        v->mm[k] = hh * thh * ue;
        v->cc[k] = 0.0;
        v->turb[k] = 0;
      }
    }
  }
  size_t w0 = v->nu + v->nl;
  for (size_t j = 0; j < v->nw; j++) {
    v->th[w0 + j] = wth[3 * j]; v->mm[w0 + j] = wth[3 * j + 1]; v->cc[w0 + j] = wth[3 * j + 2];
    v->turb[w0 + j] = 1;
  }
  update_ue(v);
  set_xi(v);
  return 1;
}

/* x/c at fraction f of the interval ending at station k (side stations). */
static double station_x(const ascr_visc_solver *v, size_t k, double f)
{
  const ascr_panel_solver *ps = v->ps;
  double xb = ps->x[v->node[k]];
  double xa = ps->x[v->node[k - 1]];
  return xa + f * (xb - xa);
}

static void results(ascr_visc_solver *v, const vctx cxs[3], ascr_visc_result *r)
{
  const size_t n = v->n;
  const ascr_panel_solver *ps = v->ps;
  /* surface pressure from the viscous edge velocity */
  for (size_t k = 0; k < v->nu + v->nl; k++) {
    double ue = v->ue[k];
    double cp0 = 1.0 - ue * ue;
    double cp = v->p.mach > 0.0 ? ascr_panel_karman_tsien(cp0, v->p.mach) : cp0;
    v->cp[v->node[k]] = isfinite(cp) ? cp : cp0;
  }
  double cl, cm, cdp_int;
  panel_integrate_cp(ps, v->cp, v->alpha, &cl, &cm, &cdp_int);
  (void)cdp_int;
  r->alpha_rad = v->alpha;
  r->cl = cl;
  r->cm = cm;
  size_t ke = v->nst - 1;
  double he = v->mm[ke] / (v->ue[ke] * v->th[ke]);
  r->cd = 2.0 * v->th[ke] * pow(fmax(v->ue[ke], 1e-6), 0.5 * (he + 5.0));
  /* skin friction drag */
  double cdf = 0.0, ca = cos(v->alpha), sa = sin(v->alpha);
  r->x_transition_upper = r->x_transition_lower = NAN;
  r->x_separation_upper = r->x_separation_lower = NAN;
  r->x_reattach_upper = r->x_reattach_lower = NAN;
  r->forced_upper = 0;
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
    double cfprev = 0.0, xprev = 0.0;
    double xsep = NAN, xre = NAN;
    for (size_t k = k0; k < k1; k++) {
      vstate s = get_state(v, k);
      vctx cx = cxs[side];
      if (k == k0) s.ue = cx.stag_a * fmax(s.xi, cx.xi_min);
      double h = s.m / (fmax(s.ue, 1e-6) * s.th), rth = cx.re * fmax(s.ue, 1e-6) * s.th;
      bl_closure c;
      if (s.turb) bl_closure_turbulent(h, rth, cx.mach * s.ue, s.c * s.c, 0, &c);
      else bl_closure_laminar(h, rth, cx.mach * s.ue, &c);
      double x = ps->x[v->node[k]];
      if (k > k0) {
        size_t ia = v->node[k - 1], ib = v->node[k];
        double dx = ps->x[ib] - ps->x[ia], dy = ps->y[ib] - ps->y[ia];
        double ta = cfprev * v->ue[k - 1] * v->ue[k - 1], tb = c.cf * s.ue * s.ue;
        cdf += 0.5 * (ta + tb) * (dx * ca + dy * sa);
        if (cfprev > 0.0 && c.cf <= 0.0 && isnan(xsep)) {
          xsep = xprev + cfprev / (cfprev - c.cf) * (x - xprev);
        } else if (cfprev <= 0.0 && c.cf > 0.0 && !isnan(xsep) && isnan(xre)) {
          xre = xprev + cfprev / (cfprev - c.cf) * (x - xprev);
        }
      }
      cfprev = c.cf;
      xprev = x;
    }
    double xtr = NAN;
    size_t kt = v->itr[side];
    if (kt < k1 && kt > k0) xtr = station_x(v, kt, v->f_tr[side]);
    int forced = 0;
    if (!isnan(xtr) && cxs[side].xi_trip >= 0.0) {
      double xt = side == 0 ? v->p.trip_upper : v->p.trip_lower;
      forced = fabs(xtr - xt) < 1e-9 + 1e-6;
    }
    if (side == 0) {
      r->x_transition_upper = xtr;
      r->forced_upper = forced;
      r->x_separation_upper = xsep;
      r->x_reattach_upper = xre;
    } else {
      r->x_transition_lower = xtr;
      r->x_separation_lower = xsep;
      r->x_reattach_lower = xre;
    }
  }
  r->cdf = cdf;
  r->cdp = r->cd - cdf;
  (void)n;
}

static ascr_status solve_once(ascr_visc_solver *v, double alpha_rad, int warm,
                              ascr_visc_result *r, ascr_errbuf *err)
{
  if (v == NULL || r == NULL) return core_fail(err, ASCR_EINVAL, "viscous solve: NULL argument");
  if (!v->is_set) return core_fail(err, ASCR_EINVAL, "viscous solve: solver not set");
  if (!isfinite(alpha_rad) || fabs(alpha_rad) > 1.2) {
    return core_fail(err, ASCR_EINVAL, "viscous solve: alpha %g rad outside +-1.2", alpha_rad);
  }
  memset(r, 0, sizeof *r);
  ascr_status st = prepare_alpha(v, alpha_rad, err);
  if (st != ASCR_OK) return st;
  size_t is;
  double ss;
  int use_warm = warm && v->have_solution;
  if (use_warm) {
    /* keep the previous state by station; restage at the previous stagnation point, then let
     * relocate_stagnation move it with the new inviscid part */
    restage(v, v->is, v->s_stag);
    update_ue(v);
    relocate_stagnation(v);
  } else {
    if (find_stagnation(v, v->gam_inv, &is, &ss) != 0) {
      return core_fail(err, ASCR_EGEOM, "viscous solve: no stagnation point found at alpha %.2f deg",
                       alpha_rad * 180.0 / ASCR_PI);
    }
    restage(v, is, ss);
    /* the contexts read the edge velocities: after a failed attempt they hold its last
     * iterate, so a cold start takes the inviscid ones */
    for (size_t k = 0; k < v->nst; k++) v->ue[k] = v->ue_inv[k];
    vctx cx0[3] = {context(v, 0), context(v, 1), context(v, 2)};
    if (v->p.exact_transition && v->cold_kind == 0) {
      v->exact_phase = 1;
      initial_state_exact(v);
    } else {
      st = initial_state(v, cx0, err);
    }
    if (st != ASCR_OK) return st;
  }
  const size_t nst = v->nst, N = 3 * nst;
  v->f_tr[0] = v->f_tr[1] = 1.0;
  int n_forced = 0; /* forced moves of a transition the e^N criterion does not allow */
  int converged = 0, it, n_moves = 0, stalled = 0, n_uphill = 0, fine = 0, it_fine = 0;
  /* exact formulation: the exact rule from the first iteration (no banded phase) */
  /* exact formulation: the exact rule from the first iteration, or (second cold start,
   * cold_kind 1) after the banded iteration has settled */
  int exact = v->p.exact_transition && !(v->cold_kind == 1 && !use_warm), it_exact = 0;
  v->exact_phase = exact;
  int since_best = 0; /* iterations since the residual last fell below 0.7 of its best */
  double rel = INFINITY, rbest = INFINITY;
  update_ue(v);
  relocate_stagnation(v);
  if (!use_warm) {
    /* first stations: the Hiemenz state the stagnation residual asks for */
    update_ue(v);
    set_xi(v);
    vctx c0 = context(v, 0);
    double hh = visc_hiemenz_h(), thh, h2;
    bl_similarity_start(1.0, v->p.re, c0.stag_a, 1.0, &thh, &h2);
    size_t firsts[2] = {0, v->nu};
    for (int q = 0; q < 2; q++) {
      size_t k = firsts[q];
      v->th[k] = thh;
      v->mm[k] = hh * thh * c0.stag_a * fmax(v->xi[k], c0.xi_min);
      v->cc[k] = 0.0;
      v->turb[k] = 0;
    }
  }
  for (it = 1; it <= v->p.max_iter + (fine ? TR_FINE_ITERS : 0) + it_exact; it++) {
    update_ue(v);
    set_xi(v);
    clamp_shape(v);
    vctx cxs[3] = {context(v, 0), context(v, 1), context(v, 2)};
    /* transition moves only once the iteration has settled with the present intervals:
     * moving it while far from a solution makes the Newton iteration chase a moving target */
    int tchange = 0;
    if (exact) {
      /* exact phase: the interval rule of transition_exact, judged once the iteration has
       * settled with the present intervals (or stopped making progress): a station just
       * switched carries the other regime's state until a Newton step has settled it */
      if (it == 1 || rel < TR_EXACT_SETTLED || since_best >= TR_STUCK_ITERS) {
        tchange = transition_exact(v, cxs);
        if (since_best >= TR_STUCK_ITERS) {
          since_best = 0;
          rbest = INFINITY;
        }
      }
    } else if ((rel < 0.05 || it == 1 || (since_best >= TR_STUCK_ITERS)) &&
        n_moves < (fine ? TR_FINE_MOVES : TR_MAX_MOVES)) {
      tchange = update_transition(v, cxs, fine ? TR_HYST_FINE : TR_HYST);
      n_moves += tchange;
      if (since_best >= TR_STUCK_ITERS) {
        since_best = 0;
        rbest = INFINITY;
      }
    }
    double rmax = assemble(v, cxs);
    if (rmax < 0.7 * rbest) {
      rbest = rmax;
      since_best = 0;
    } else {
      since_best++;
    }
    /* unknowns in log form: theta, m, and sqrt(Ctau) where turbulent: the update of the log
     * unknown is the plain update divided by the unknown */
    int structured_ok = !v->dense_jac && solve_structured(v);
    if (structured_ok) {
      for (size_t k = 0; k < nst; k++) {
        v->dx[3 * k] /= v->th[k];
        v->dx[3 * k + 1] /= v->mm[k];
        if (v->turb[k]) v->dx[3 * k + 2] /= v->cc[k];
      }
    } else {
      if (!v->dense_jac) {
        v->dense_jac = 1; /* rare: rebuild densely for this iteration */
        rmax = assemble(v, cxs);
      }
      for (size_t k = 0; k < nst; k++) {
        double sc0 = v->th[k], sc1 = v->mm[k], sc2 = v->turb[k] ? v->cc[k] : 1.0;
        double *c0 = v->J + (3 * k) * N, *c1 = v->J + (3 * k + 1) * N, *c2 = v->J + (3 * k + 2) * N;
        for (size_t row = 0; row < N; row++) {
          c0[row] *= sc0;
          c1[row] *= sc1;
          c2[row] *= sc2;
        }
      }
      for (size_t i = 0; i < N; i++) v->dx[i] = -v->R[i];
      lapack_int info = LAPACKE_dgesv(LAPACK_COL_MAJOR, (lapack_int)N, 1, v->J, (lapack_int)N,
                                      v->ipiv, v->dx, (lapack_int)N);
      v->dense_jac = 0;
      if (info != 0) {
        v->have_solution = 0;
        return core_fail(err, ASCR_ESING, "viscous solve at alpha %.2f deg: Newton system singular "
                         "(order %zu, iteration %d)", alpha_rad * 180.0 / ASCR_PI, N, it);
      }
    }
    double rlx;
    rel = step_limit(v, &rlx);
    /* backtracking on the residual norm: halve the step while it does not decrease */
    double *saved = v->R; /* R is no longer needed: keep the current unknowns there */
    for (size_t k = 0; k < nst; k++) {
      saved[3 * k] = v->th[k];
      saved[3 * k + 1] = v->mm[k];
      saved[3 * k + 2] = v->cc[k];
    }
    double f0 = residual_norm2(v, cxs);
    int descended = 0;
    for (int ls = 0; ls < 8 && f0 > 1e-16; ls++) {
      set_trial(v, saved, rlx);
      update_ue(v);
      set_xi(v);
      double f1 = residual_norm2(v, cxs);
      if (f1 < f0 * (1.0 - 1e-4 * rlx)) {
        descended = 1;
        break;
      }
      if (ls == 7) break; /* take the smallest step anyway: early iterations often need it */
      rlx *= 0.5;
    }
    if (f0 <= 1e-16) descended = 1;
    /* many steps in a row that do not lower the residual: the iteration is lost (a kink of the
     * closures or a transition/stagnation change it cannot follow); stop rather than drift */
    n_uphill = descended ? 0 : n_uphill + 1;
    if (n_uphill >= 8) {
      stalled = 1;
      break;
    }
    update_ue(v);
    int smoved = relocate_stagnation(v);
    if (v->trace) v->trace(v->trace_ctx, it, rmax, rel, rlx, tchange, smoved > 0);
    if (smoved < 0) break;
    if (rel < v->p.tol && !tchange && smoved == 0) {
      if (exact) {
        /* settled in the exact phase: converged if the intervals hold at this state too */
        update_ue(v);
        set_xi(v);
        vctx ce[3] = {context(v, 0), context(v, 1), context(v, 2)};
        if (transition_exact(v, ce)) continue;
        converged = 1;
        break;
      }
      if (v->p.exact_transition) {
        /* banded start settled: the exact rule takes over from here */
        exact = 1;
        v->exact_phase = 1;
        it_exact = it;
        continue;
      }
      /* settled: but with a transition the e^N criterion allows? If not, move the offending
       * interval downstream on the inviscid edge velocity and go on iterating */
      vctx cc3[3] = {context(v, 0), context(v, 1), context(v, 2)};
      int bad = transition_inconsistent(v, cc3);
      if (bad && n_forced < TR_FORCED_MOVES) {
        for (int side = 0; side < 2; side++) {
          if (!(bad & (1 << side))) continue;
          size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
          size_t kt = k1;
          for (size_t k = k0 + 1; k < k1; k++) {
            if (v->turb[k]) {
              kt = k;
              break;
            }
          }
          if (kt < k1 && kt > k0) v->itr[side] = move_downstream(v, &cc3[side], k1, kt, 0.0, 1);
        }
        n_forced++;
        continue;
      }
      if (!fine) {
        /* converged with the wide band: keep this solution and try to place transition
         * more exactly with the narrow one */
        v->have_solution = 1;
        visc_snapshot(v, 1);
        fine = 1;
        it_fine = it;
        n_moves = 0;
        continue;
      }
      converged = 1;
      break;
    }
    if (fine && it - it_fine >= TR_FINE_ITERS) break;
  }
  if (fine && !converged) {
    /* the narrow band did not settle: the wide-band solution stands (restaged at its own
     * stagnation point) */
    visc_restore(v, 1);
    restage(v, v->is, v->s_stag);
    update_ue(v);
    set_xi(v);
    converged = 1;
    rel = 0.0;
  }
  update_ue(v);
  vctx cxs[3] = {context(v, 0), context(v, 1), context(v, 2)};
  int tr_bad = converged && !exact && transition_inconsistent(v, cxs) != 0;
  if (tr_bad) converged = 0;
  results(v, cxs, r);
  int it_cap = v->p.max_iter + (fine ? TR_FINE_ITERS : 0) + it_exact;
  r->iterations = it > it_cap ? it_cap : it;
  r->residual = rel;
  r->converged = converged;
  int finite = isfinite(r->cl) && isfinite(r->cd) && isfinite(r->cm);
  if (!finite) r->converged = converged = 0;
  v->have_solution = converged;
  if (!converged) {
    return core_fail(err, ASCR_EMAXITER, "viscous solve at alpha %.2f deg, Re %.3g: not converged "
                     "after %d iterations (largest relative update %.2e%s)",
                     alpha_rad * 180.0 / ASCR_PI, v->p.re, r->iterations, rel,
                     tr_bad ? "; the iteration settled with transition where N is far below "
                              "N_crit on an attached layer" :
                     stalled ? "; stopped after 8 steps without descent" : "");
  }
  return ASCR_OK;
}

ascr_status ascr_visc_solver_solve(ascr_visc_solver *v, double alpha_rad, int warm,
                                   ascr_visc_result *r, ascr_errbuf *err)
{
  v->cold_kind = 0;
  ascr_status st = solve_once(v, alpha_rad, warm, r, err);
  if ((st == ASCR_EMAXITER || st == ASCR_ESING) && warm) {
    /* the continuation start did not lead anywhere: start afresh from a march */
    int its = r->iterations;
    st = solve_once(v, alpha_rad, 0, r, err);
    r->iterations += its;
  }
  if ((st == ASCR_EMAXITER || st == ASCR_ESING) && v->p.exact_transition) {
    /* exact formulation: a second cold start, the direct march with its coupling passes
     * (initial_state); whichever start, a result is a state the exact rule accepts */
    int its = r->iterations;
    v->cold_kind = 1;
    st = solve_once(v, alpha_rad, 0, r, err);
    v->cold_kind = 0;
    r->iterations += its;
  }
  return st;
}

void ascr_visc_solver_distributions(const ascr_visc_solver *v, int *side, double *s, double *x,
                                    double *y, double *ue, double *dstar, double *theta,
                                    double *h, double *cf, double *ampl, int *turbulent)
{
  const ascr_panel_solver *ps = v->ps;
  vctx c0 = context(v, 0);
  for (size_t k = 0; k < v->nst; k++) {
    int sd = v->side[k];
    double u = v->ue[k];
    /* the first station of a surface is seen in the stagnation-flow view of the residuals */
    double ub = (k == 0 || k == v->nu) ? c0.stag_a * fmax(v->xi[k], c0.xi_min) : u;
    double hh = v->mm[k] / (fmax(ub, 1e-6) * v->th[k]);
    if (side) side[k] = sd;
    if (s) s[k] = v->xi[k];
    if (x) x[k] = sd == 2 ? v->xw[v->node[k]] : ps->x[v->node[k]];
    if (y) y[k] = sd == 2 ? v->yw[v->node[k]] : ps->y[v->node[k]];
    if (ue) ue[k] = u;
    if (dstar) dstar[k] = v->mm[k] / fmax(ub, 1e-6);
    if (theta) theta[k] = v->th[k];
    if (h) h[k] = hh;
    if (cf) {
      double rth = v->p.re * fmax(ub, 1e-6) * v->th[k];
      bl_closure c;
      if (sd == 2) c.cf = 0.0;
      else if (v->turb[k]) bl_closure_turbulent(hh, rth, v->p.mach * ub, v->cc[k] * v->cc[k], 0, &c);
      else bl_closure_laminar(hh, rth, v->p.mach * ub, &c);
      cf[k] = c.cf;
    }
    if (ampl) ampl[k] = v->cc[k];
    if (turbulent) turbulent[k] = v->turb[k];
  }
}

void ascr_visc_solver_cp(const ascr_visc_solver *v, double *cp)
{
  for (size_t i = 0; i < v->n; i++) cp[i] = v->cp[i];
}
