/* src/visc/driver.c
 * The Newton iteration of one start, a step at a time (GSL's fsolver pattern: _start sets the
 * initial state, _iterate takes one step, _test says whether the run has converged, failed or
 * goes on). ascr_visc_solver_solve (solver.c) runs these steps for each start it tries; a
 * caller may step them itself (the CLI's convergence history does).
 *
 * One step (docs/theory/viscous.md): edge velocities and arc lengths from the current state;
 * the transition interval of each side from the exact rule (transition_rules.c) once the
 * iteration has settled; residuals and the Newton matrix (jacobian.c), solved in structured
 * form (linsolve.c; dense LAPACKE dgesv as the fallback); the update under-relaxed so that no
 * theta or m changes by more than a factor e and no N by more than 2 (the idea of Drela & Giles
 * 1987, AIAA J. 25(10); the limits are ours), then halved while the residual norm does not
 * fall (backtracking, Dennis & Schnabel 1996, sect. 6.3); the stagnation point relocated
 * (stations.c). The run has converged when the largest update is below the tolerance, nothing
 * moved, and the exact rule keeps its intervals at the final state.
 *
 * The coupled-march start (ASCR_VISC_START_COUPLED_MARCH) places transition during its first
 * iterations by a look-ahead march (visc_update_transition) until the iteration settles; the
 * exact rule then takes over, so its result is again a state the exact rule accepts.
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <lapacke.h>
#include <math.h>
#include <string.h>

/* Path controls (they decide how the iteration gets there, not where it ends).
 * The exact rule is judged at the first iteration and whenever the largest relative update is
 * below TR_EXACT_SETTLED (see the measurement beside TR_MOVE_STATIONS, transition_rules.c). */
#define TR_EXACT_SETTLED 0.3
/* An iteration whose residual has not fallen to 0.7 of its best for this many steps is cycling
 * across the kink of a transition interval whose crossing point sits at one of its ends: the
 * interval may then move although the updates are not small. */
#define TR_STUCK_ITERS 4
/* Placement phase of the coupled-march start: hysteresis of the look-ahead placement in N,
 * the largest update at which it is judged, and the moves it may make. */
#define TR_PLACE_HYST 0.3
#define TR_PLACE_SETTLED 0.05
#define TR_PLACE_MOVES 8
/* Steps in a row without descent after which the run is given up. */
#define UPHILL_MAX 8

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

/* Keep H above its floor with the current ue (the closures are not defined below it). The
 * first station of each side is seen by its residual and the closures of the first interval
 * with the stagnation flow's ue = stag_a max(xi, xi_min) (residual.c, first_view), under which
 * the stagnation residual holds H at the Hiemenz value: its floor is applied with that ue, so
 * that it is never active at a solution. With the node's own ue it fought that residual
 * (measured: a cycle of constant residual 0.27 on the plate at Re 5e3, 1 deg, the floor raising
 * m and the Newton step lowering it again); leaving those stations out of the floor cured the
 * cycle but let early iterates reach shape factors the closures do not cover, and doubled the
 * Newton iterations of a swept point (bench_visc medians 7 -> 13 and 8 -> 16). */
static void clamp_shape(ascr_visc_solver *v)
{
  const vctx cx = visc_context(v, 0); /* stag_a and xi_min: the same for both sides */
  for (size_t k = 0; k < v->nst; k++) {
    /* floors: wake 1.0001, turbulent wall layer 1.05, laminar 1.8 (below the fits' range) */
    double hmin = v->side[k] == 2 ? 1.0001 : (v->turb[k] ? 1.05 : 1.8);
    double ue = fmax(v->ue[k], 1e-6);
    if (k == 0 || k == v->nu) ue = fmax(cx.stag_a * fmax(v->xi[k], cx.xi_min), 1e-6);
    if (v->mm[k] < hmin * ue * v->th[k]) v->mm[k] = hmin * ue * v->th[k];
  }
}

static void contexts(const ascr_visc_solver *v, vctx cxs[3])
{
  for (int s = 0; s < 3; s++) cxs[s] = visc_context(v, s);
}

ascr_status visc_run_start(ascr_visc_solver *v, double alpha_rad, int warm, int kind,
                           ascr_errbuf *err)
{
  visc_run *run = &v->run;
  run->state = VISC_RUN_NONE;
  if (!isfinite(alpha_rad) || fabs(alpha_rad) > 1.2) {
    return core_fail(err, ASCR_EINVAL, "viscous solve: alpha %g rad outside +-1.2", alpha_rad);
  }
  ascr_status st = visc_prepare_alpha(v, alpha_rad, err);
  if (st != ASCR_OK) return st;
  int use_warm = warm && v->have_solution;
  /* a warm start to another angle of the same Reynolds number begins at the secant predictor
   * (predictor.c) when the live state was itself continued from a neighbour; the live state is
   * recorded for the next one's predictor also when this start is the plain retry (pred_off) */
  int cont = use_warm && v->cur_re == v->p.re && alpha_rad != v->cur_alpha;
  int pred = cont && !v->pred_off;
  v->pred_start.valid = 0;
  v->pred_used = 0;
  if (use_warm) {
    /* keep the previous state by station; restage at the previous stagnation point, then let
     * relocate_stagnation move it with the new inviscid part */
    if (cont) visc_pred_capture(v, &v->pred_start, v->cur_alpha);
    visc_restage(v, v->is, v->s_stag);
    if (pred) v->pred_used = visc_pred_apply(v, &v->pred_prev, v->cur_alpha, alpha_rad);
    if (v->pred_used) {
      visc_update_ue(v);
      visc_set_xi(v);
      visc_pred_transition(v, &v->pred_prev, v->cur_alpha, alpha_rad, &v->pred_start);
    }
    visc_update_ue(v);
    visc_relocate_stagnation(v);
  } else {
    size_t is;
    double ss;
    if (visc_find_stagnation(v, v->gam_inv, &is, &ss) != 0) {
      return core_fail(err, ASCR_EGEOM, "viscous solve: no stagnation point found at alpha %.2f deg",
                       alpha_rad * 180.0 / ASCR_PI);
    }
    visc_restage(v, is, ss);
    /* the contexts read the edge velocities: after a failed attempt they hold its last
     * iterate, so a cold start takes the inviscid ones */
    for (size_t k = 0; k < v->nst; k++) v->ue[k] = v->ue_inv[k];
    vctx cx0[3];
    contexts(v, cx0);
    if (kind == ASCR_VISC_START_MARCH) {
      v->exact_phase = 1;
      visc_initial_state_exact(v);
    } else {
      st = visc_initial_state(v, cx0, err);
      if (st != ASCR_OK) return st;
    }
  }
  v->f_tr[0] = v->f_tr[1] = 1.0;
  memset(run, 0, sizeof *run);
  run->alpha = alpha_rad;
  run->kind = use_warm ? ASCR_VISC_START_PREVIOUS : kind;
  run->warm = use_warm;
  /* the exact rule from the first iteration, except in the coupled-march start's placement
   * phase */
  run->exact = run->kind != ASCR_VISC_START_COUPLED_MARCH;
  v->exact_phase = run->exact;
  run->rel = run->rbest = run->rel_full = run->err = INFINITY;
  visc_update_ue(v);
  visc_relocate_stagnation(v);
  if (!use_warm) {
    /* first stations: the Hiemenz state the stagnation residual asks for */
    visc_update_ue(v);
    visc_set_xi(v);
    vctx c0 = visc_context(v, 0);
    double hh = c0.hiem_h, thh = visc_hiemenz_theta(&c0);
    size_t firsts[2] = {0, v->nu};
    for (int q = 0; q < 2; q++) {
      size_t k = firsts[q];
      v->th[k] = thh;
      v->mm[k] = hh * thh * c0.stag_a * fmax(v->xi[k], c0.xi_min);
      v->cc[k] = 0.0;
      v->turb[k] = 0;
    }
  }
  run->state = VISC_RUN_GOING;
  return ASCR_OK;
}

/* The iteration limit of the run: a full max_iter for the exact rule after a placement phase. */
static int run_cap(const ascr_visc_solver *v)
{
  return v->p.max_iter + v->run.it_exact;
}

/* End of a run: the results of its last iterate, and the bookkeeping of a converged state. */
static void run_end(ascr_visc_solver *v, int state)
{
  visc_run *run = &v->run;
  run->state = state;
  visc_update_ue(v);
  vctx cxs[3];
  contexts(v, cxs);
  ascr_visc_result *r = &run->res;
  memset(r, 0, sizeof *r);
  visc_results(v, cxs, r);
  r->iterations = run->it;
  r->residual = run->err;
  int converged = state == VISC_RUN_CONVERGED;
  if (!(isfinite(r->cl) && isfinite(r->cd) && isfinite(r->cm))) converged = 0;
  if (!converged && state == VISC_RUN_CONVERGED) run->state = VISC_RUN_NONFINITE;
  r->converged = converged;
  v->have_solution = converged;
  if (converged) {
    /* the predictor's pair: this state and the one it was continued from */
    if (v->pred_start.valid) {
      visc_pred_rec t = v->pred_prev;
      v->pred_prev = v->pred_start;
      v->pred_start = t;
    } else {
      v->pred_prev.valid = 0;
    }
    v->pred_start.valid = 0;
    v->cur_alpha = run->alpha;
    v->cur_re = v->p.re;
    v->cur_cl = r->cl;
  }
}

ascr_status visc_run_iterate(ascr_visc_solver *v, ascr_visc_step *step, ascr_errbuf *err)
{
  visc_run *run = &v->run;
  if (run->state != VISC_RUN_GOING) {
    return core_fail(err, ASCR_EINVAL, "viscous iterate: no run under way (start one first)");
  }
  const size_t nst = v->nst, N = 3 * nst;
  int it = ++run->it;
  visc_update_ue(v);
  visc_set_xi(v);
  clamp_shape(v);
  vctx cxs[3];
  contexts(v, cxs);
  /* transition moves only once the iteration has settled with the present intervals (or stopped
   * making progress): moving it while far from a solution makes the Newton iteration chase a
   * moving target, and a station just switched carries the other regime's state until a Newton
   * step has settled it */
  int tchange = 0;
  int stuck = run->since_best >= TR_STUCK_ITERS;
  if (run->exact) {
    if (it == 1 || run->rel < TR_EXACT_SETTLED || stuck) tchange = visc_transition_exact(v, cxs);
  } else if ((run->rel < TR_PLACE_SETTLED || it == 1 || stuck) && run->n_moves < TR_PLACE_MOVES) {
    tchange = visc_update_transition(v, cxs, TR_PLACE_HYST);
    run->n_moves += tchange;
  } else {
    stuck = 0;
  }
  if (stuck) {
    run->since_best = 0;
    run->rbest = INFINITY;
  }
  double rmax = visc_assemble(v, cxs);
  if (rmax < 0.7 * run->rbest) {
    run->rbest = rmax;
    run->since_best = 0;
  } else {
    run->since_best++;
  }
  /* unknowns in log form: theta, m, and sqrt(Ctau) where turbulent: the update of the log
   * unknown is the plain update divided by the unknown */
  int structured_ok = !v->dense_jac && visc_solve_structured(v);
  if (structured_ok) {
    for (size_t k = 0; k < nst; k++) {
      v->dx[3 * k] /= v->th[k];
      v->dx[3 * k + 1] /= v->mm[k];
      if (v->turb[k]) v->dx[3 * k + 2] /= v->cc[k];
    }
  } else {
    if (!v->dense_jac) {
      v->dense_jac = 1; /* rare: rebuild densely for this iteration */
      rmax = visc_assemble(v, cxs);
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
      run->state = VISC_RUN_SINGULAR;
      run->res.iterations = it;
      v->have_solution = 0;
      return core_fail(err, ASCR_ESING, "viscous solve at alpha %.2f deg: Newton system singular "
                       "(order %zu, iteration %d)", run->alpha * 180.0 / ASCR_PI, N, it);
    }
  }
  double rlx;
  run->rel = step_limit(v, &rlx);
  /* backtracking on the residual norm: halve the step while it does not decrease; the norm at
   * the current state is that of R (as visc_residual_norm2 sums it) */
  double f0 = 0.0;
  for (size_t i = 0; i < N; i++) f0 += isfinite(v->R[i]) ? v->R[i] * v->R[i] : 1e300;
  double *saved = v->R; /* R is no longer needed: keep the current unknowns there */
  for (size_t k = 0; k < nst; k++) {
    saved[3 * k] = v->th[k];
    saved[3 * k + 1] = v->mm[k];
    saved[3 * k + 2] = v->cc[k];
  }
  int descended = 0;
  for (int ls = 0; ls < 8 && f0 > 1e-16; ls++) {
    set_trial(v, saved, rlx);
    visc_update_ue(v);
    visc_set_xi(v);
    /* the trial's own contexts: the stagnation-flow gradient depends on the state, and the
     * Jacobian carries that dependence, so judging the trial with the current iterate's
     * contexts rejected exact Newton steps (measured: the full step left |R|^2 at 2e-10 with
     * the old contexts and 1e-18 with its own, so every step near convergence was halved and
     * the iteration converged linearly at rate 0.5) */
    contexts(v, cxs);
    double f1 = visc_residual_norm2(v, cxs);
    if (f1 < f0 * (1.0 - 1e-4 * rlx)) {
      descended = 1;
      break;
    }
    if (ls == 7) break; /* take the smallest step anyway: early iterations often need it */
    rlx *= 0.5;
  }
  if (f0 <= 1e-16) descended = 1;
  visc_update_ue(v);
  /* many steps in a row that do not lower the residual: the iteration is lost (a kink of the
   * closures or a transition/stagnation change it cannot follow); stop rather than drift */
  run->n_uphill = descended ? 0 : run->n_uphill + 1;
  int smoved = 0;
  if (run->n_uphill < UPHILL_MAX) smoved = visc_relocate_stagnation(v);
  if (step) {
    step->start = run->kind;
    step->alpha_rad = run->alpha;
    step->re = v->p.re;
    step->iteration = it;
    step->residual_max = rmax;
    step->update = run->rel;
    step->relax = rlx;
    step->transition_moved = tchange;
    step->stagnation_moved = smoved > 0;
    step->exact_rule = run->exact;
    step->x_transition_upper = visc_x_transition(v, 0);
    step->x_transition_lower = visc_x_transition(v, 1);
  }
  if (run->n_uphill >= UPHILL_MAX) {
    run_end(v, VISC_RUN_STALLED);
    return ASCR_OK;
  }
  if (smoved < 0) {
    run_end(v, VISC_RUN_LOST);
    return ASCR_OK;
  }
  /* converged: the update below the tolerance, or the error left after it, estimated from the
   * contraction of two successive full steps, Theta = |dx_k| / |dx_k-1|, as Theta/(1 - Theta)
   * |dx_k| (Deuflhard, Newton Methods for Nonlinear Problems, Springer 2004, sec. 2.1, from
   * memory), below it while the iteration contracts fast (Theta <= 1/4): in the quadratic
   * phase this stops one step earlier with the state as accurate as the tolerance asks */
  int full = rlx == 1.0 && descended && !tchange && smoved == 0;
  double theta = run->rel / run->rel_full;
  run->err = run->rel;
  if (full && isfinite(run->rel_full) && theta <= 0.25) {
    run->err = fmin(run->rel, theta / (1.0 - theta) * run->rel);
  }
  int settled = run->err < v->p.tol;
  run->rel_full = full ? run->rel : INFINITY;
  if (settled && !tchange && smoved == 0) {
    if (run->exact) {
      /* settled: converged if the exact rule keeps the intervals at this state too */
      visc_update_ue(v);
      visc_set_xi(v);
      vctx ce[3];
      contexts(v, ce);
      if (!visc_transition_exact(v, ce)) {
        run_end(v, VISC_RUN_CONVERGED);
        return ASCR_OK;
      }
    } else {
      /* the placement phase has settled: the exact rule takes over, with a full iteration
       * limit of its own */
      run->exact = 1;
      v->exact_phase = 1;
      run->it_exact = it;
    }
  }
  if (it >= run_cap(v)) run_end(v, VISC_RUN_LIMIT);
  return ASCR_OK;
}

ascr_status visc_run_test(const ascr_visc_solver *v)
{
  switch (v->run.state) {
  case VISC_RUN_GOING: return ASCR_CONTINUE;
  case VISC_RUN_CONVERGED: return ASCR_OK;
  case VISC_RUN_SINGULAR: return ASCR_ESING;
  case VISC_RUN_NONE: return ASCR_EINVAL;
  default: return ASCR_EMAXITER;
  }
}

ascr_status visc_run_message(const ascr_visc_solver *v, ascr_errbuf *err)
{
  const visc_run *run = &v->run;
  ascr_status st = visc_run_test(v);
  if (st == ASCR_OK || st == ASCR_CONTINUE || st == ASCR_ESING) return st;
  if (st == ASCR_EINVAL) return core_fail(err, st, "viscous solve: no run was started");
  const char *why = run->state == VISC_RUN_STALLED ? "; stopped after 8 steps without descent" :
                    run->state == VISC_RUN_LOST ? "; the stagnation point was lost" :
                    run->state == VISC_RUN_NONFINITE ? "; the result is not finite" : "";
  return core_fail(err, ASCR_EMAXITER, "viscous solve at alpha %.2f deg, Re %.3g: not converged "
                   "after %d iterations (largest relative update %.2e%s)",
                   run->alpha * 180.0 / ASCR_PI, v->p.re, run->it, run->rel, why);
}

/* ---- public stepping interface ---- */

ascr_status ascr_visc_solver_start(ascr_visc_solver *v, double alpha_rad, ascr_visc_start start,
                                   ascr_errbuf *err)
{
  if (v == NULL) return core_fail(err, ASCR_EINVAL, "viscous start: NULL solver");
  if (!v->is_set) return core_fail(err, ASCR_EINVAL, "viscous start: solver not set");
  if (start != ASCR_VISC_START_PREVIOUS && start != ASCR_VISC_START_MARCH &&
      start != ASCR_VISC_START_COUPLED_MARCH) {
    return core_fail(err, ASCR_EINVAL, "viscous start: unknown start %d", (int)start);
  }
  if (start == ASCR_VISC_START_PREVIOUS && !v->have_solution) {
    return core_fail(err, ASCR_EINVAL, "viscous start: no converged state to continue from");
  }
  return visc_run_start(v, alpha_rad, start == ASCR_VISC_START_PREVIOUS, (int)start, err);
}

ascr_status ascr_visc_solver_iterate(ascr_visc_solver *v, ascr_visc_step *step, ascr_errbuf *err)
{
  if (v == NULL) return core_fail(err, ASCR_EINVAL, "viscous iterate: NULL solver");
  return visc_run_iterate(v, step, err);
}

ascr_status ascr_visc_solver_test(const ascr_visc_solver *v)
{
  return v == NULL ? ASCR_EINVAL : visc_run_test(v);
}

ascr_status ascr_visc_solver_result(ascr_visc_solver *v, ascr_visc_result *r, ascr_errbuf *err)
{
  if (v == NULL || r == NULL) return core_fail(err, ASCR_EINVAL, "viscous result: NULL argument");
  ascr_status st = visc_run_test(v);
  if (st == ASCR_EINVAL) return core_fail(err, st, "viscous result: no run was started");
  if (st == ASCR_CONTINUE) {
    /* the present iterate, not converged */
    visc_update_ue(v);
    vctx cxs[3];
    contexts(v, cxs);
    memset(r, 0, sizeof *r);
    visc_results(v, cxs, r);
    r->iterations = v->run.it;
    r->residual = v->run.err;
    r->converged = 0;
    return ASCR_CONTINUE;
  }
  *r = v->run.res;
  return visc_run_message(v, err);
}
