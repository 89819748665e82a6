/* src/visc/workspace.c
 * The viscous solver object: parameters, allocation of every buffer the solve uses (GSL
 * style: _alloc sizes, the solve never allocates), saved states for continuation, and _set,
 * which attaches a panel solver and builds the alpha-independent surface part of the
 * source-influence matrix E (d gamma / d sigma = -A^-1 B, see influence.c for the rest).
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

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
  p.wall_curvature = 0;
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
  /* the Hiemenz layer of the laminar closure (the first stations' state): fixed numbers */
  if (bl_similarity_shape(1.0, &v->hiem_h, &v->hiem_f) != 0) {
    free(v);
    return NULL;
  }
  size_t wcols = (n - 1 > nw - 1) ? n - 1 : nw - 1;
  int ok = 1;
#define ALLOC(ptr, cnt) ok = ok && ((ptr) = core_calloc((cnt), sizeof *(ptr))) != NULL
  ALLOC(v->snode, n);
  ALLOC(v->kappa_node, n);
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
  ALLOC(v->wtx, nw - 1);
  ALLOC(v->wty, nw - 1);
  ALLOC(v->node, nst);
  ALLOC(v->side, nst);
  ALLOC(v->sgn, nst);
  ALLOC(v->xi, nst);
  ALLOC(v->dfirst, nst);
  ALLOC(v->kappa_st, nst);
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
  ALLOC(v->sig, np);
  ALLOC(v->march_s, n);
  ALLOC(v->march_ue, n);
  ALLOC(v->march_out, n);
#define ALLOC_REC(rec)                                                                             \
  ALLOC((rec).th, nst);                                                                            \
  ALLOC((rec).mm, nst);                                                                            \
  ALLOC((rec).cc, nst);                                                                            \
  ALLOC((rec).turb, nst)
  ALLOC_REC(v->pred_prev);
  ALLOC_REC(v->pred_start);
  for (int q = 0; q < VISC_SLOTS; q++) {
    ALLOC_REC(v->sv_prev[q]);
    ALLOC(v->sv_th[q], nst);
    ALLOC(v->sv_mm[q], nst);
    ALLOC(v->sv_cc[q], nst);
    ALLOC(v->sv_turb[q], nst);
  }
#undef ALLOC_REC
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
  free(v->snode); free(v->kappa_node); free(v->xw); free(v->yw); free(v->sw); free(v->E);
  free(v->gam_inv);
  free(v->qw_inv); free(v->plen); free(v->work); free(v->cu); free(v->cv); free(v->qmid);
  free(v->qmid_g); free(v->qmid_inv); free(v->wtx); free(v->wty); free(v->node); free(v->side); free(v->sgn); free(v->xi); free(v->dfirst);
  free(v->kappa_st);
  free(v->D); free(v->ue_inv); free(v->pa); free(v->pb); free(v->ga); free(v->gb); free(v->th);
  free(v->mm); free(v->cc); free(v->turb); free(v->ue); free(v->J); free(v->R); free(v->dx);
  free(v->ipiv); free(v->iscratch); free(v->cp); free(v->sig);
  free(v->march_s);
  free(v->march_ue);
  free(v->march_out);
  free(v->lst); free(v->lblk); free(v->uidx); free(v->ucoef); free(v->ucnt); free(v->zm);
  free(v->mmat); free(v->wv); free(v->yv); free(v->chk); free(v->ipiv2); free(v->dinv);
#define FREE_REC(rec) free((rec).th), free((rec).mm), free((rec).cc), free((rec).turb)
  FREE_REC(v->pred_prev);
  FREE_REC(v->pred_start);
  for (int q = 0; q < VISC_SLOTS; q++) {
    FREE_REC(v->sv_prev[q]);
    free(v->sv_th[q]); free(v->sv_mm[q]); free(v->sv_cc[q]); free(v->sv_turb[q]);
  }
#undef FREE_REC
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
  v->sv_alpha[q] = v->cur_alpha;
  v->sv_re[q] = v->cur_re;
  v->sv_cl[q] = v->cur_cl;
  visc_pred_copy(v, &v->sv_prev[q], &v->pred_prev);
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
  v->cur_alpha = v->sv_alpha[q];
  v->cur_re = v->sv_re[q];
  v->cur_cl = v->sv_cl[q];
  visc_pred_copy(v, &v->pred_prev, &v->sv_prev[q]);
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
  if (p->wall_curvature != 0 && p->wall_curvature != 1) {
    return core_fail(err, ASCR_EINVAL, "viscous solver: wall_curvature %d is neither 0 nor 1",
                     p->wall_curvature);
  }
  v->ps = ps;
  v->p = *p;
  v->is_set = 0;
  v->have_solution = 0;
  v->run.state = VISC_RUN_NONE;
  v->alpha = NAN;
  v->cur_alpha = v->cur_re = v->cur_cl = NAN;
  v->pred_prev.valid = 0;
  v->turb_fit = bl_turb_fit_published();
  const size_t n = v->n, m = n + 1, np = v->np;
  v->snode[0] = 0.0;
  for (size_t i = 1; i < n; i++) {
    v->snode[i] = v->snode[i - 1] + hypot(ps->x[i] - ps->x[i - 1], ps->y[i] - ps->y[i - 1]);
  }
  visc_wall_curvature(v);
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

