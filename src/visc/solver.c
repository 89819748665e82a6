/* src/visc/solver.c
 * Coupled viscous-inviscid section analysis: which starts a solve tries, in which order (the
 * Newton iteration of one start is driver.c's; the other steps live in workspace.c,
 * influence.c, stations.c, jacobian.c, linsolve.c, transition_rules.c, coldstart.c,
 * predictor.c and forces.c).
 *
 * Method (docs/theory/viscous.md). The boundary layer displaces the flow by its mass defect
 * m = ue dstar; its streamwise growth acts on the outer flow as a source sheet sigma = dm/ds on
 * the surface panels (uniform per panel) and on the wake panels. The panel system (linvort.c)
 * gives the change of the surface vortex strength per unit source, d gamma/d sigma = -A^-1 B,
 * with B the stream function of the sources at the nodes; at the wake nodes the tangential
 * velocity is summed from vortices and sources directly. So every edge velocity is
 *     ue = ue_inv + D m,   D = E G,
 * and the boundary-layer residuals of all stations (residual.c), with the edge velocities
 * substituted, form one nonlinear system in (theta, m, N or sqrt(Ctau)) per station, solved by
 * Newton's method (driver.c). The transition interval of each side follows the exact rule
 * (transition_rules.c); the stagnation point is re-located from the current state
 * (stations.c). The wake follows the inviscid streamline from the trailing edge (midpoint
 * rule, geometric spacing starting at the trailing-edge panel size), fixed during the
 * iteration. Drag: Squire & Young (ARC R&M 1838, 1937): cd = 2 theta_end
 * ue_end^((H_end + 5)/2) at the wake end; skin-friction drag by integrating Cf ue^2 along the
 * surface projected on the free stream; pressure drag by difference (forces.c).
 *
 * Starts, in order, until one converges: the previous converged state (warm; the secant
 * predictor through it and the state before it, then the plain state; a step whose result
 * leaves the secant's line is repeated in two halves, solve_continued), the march
 * (ASCR_VISC_START_MARCH), the coupled march (ASCR_VISC_START_COUPLED_MARCH), both marches
 * with a provisional trip on the suction side solved again without it (start_with_trip), and
 * both marches at a higher Reynolds number continued down (start_from_higher_re); each group of
 * fresh starts, where it fails, once more with the turbulent fits as they were before (a lower
 * Re_theta floor, no Coles bound) and continued to the present ones (from_lower_floor). Whichever start leads to it, a result is a state the equations and
 * the exact transition rule accept at the requested condition.
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <string.h>

/* One run: start, step until it ends, results (trace called after each step). */
static ascr_status solve_once(ascr_visc_solver *v, double alpha_rad, int warm, int kind,
                              ascr_visc_result *r, ascr_errbuf *err)
{
  if (v == NULL || r == NULL) return core_fail(err, ASCR_EINVAL, "viscous solve: NULL argument");
  if (!v->is_set) return core_fail(err, ASCR_EINVAL, "viscous solve: solver not set");
  memset(r, 0, sizeof *r);
  ascr_status st = visc_run_start(v, alpha_rad, warm, kind, err);
  if (st != ASCR_OK) return st;
  ascr_visc_step step;
  while (visc_run_test(v) == ASCR_CONTINUE) {
    step.iteration = 0;
    st = visc_run_iterate(v, &step, err);
    if (v->trace && step.iteration > 0) v->trace(v->trace_ctx, &step);
    if (st != ASCR_OK) break;
  }
  *r = v->run.res;
  return st != ASCR_OK ? st : visc_run_message(v, err);
}

/* Both marched fresh starts in turn (march, then coupled march) until one converges; their
 * iterations added to *its. */
static ascr_status both_marches(ascr_visc_solver *v, double alpha_rad, ascr_visc_result *r,
                                int *its)
{
  ascr_status st = ASCR_EMAXITER;
  for (int kind = ASCR_VISC_START_MARCH; kind <= ASCR_VISC_START_COUPLED_MARCH && st != ASCR_OK;
       kind++) {
    st = solve_once(v, alpha_rad, 0, kind, r, NULL);
    *its += r->iterations;
  }
  return st;
}

/* Last fresh start, for the thick layers of low Reynolds numbers
 * and for conditions a continuation in alpha cannot reach: there the displacement of a
 * marched start (separated regions above all) changes the edge velocities of the first
 * coupled iteration by more than the Newton step can follow (the thin plates at Re 5,000: the
 * coupled ue of the start turns negative near the leading edge and the first residuals reach
 * 1e7). The same angle is solved fresh (both starts) at 2 or 4 times the Reynolds number
 * (8 and 16 as well: 3 points more of the 1125 of the robustness grid for 14 % more Newton
 * iterations, the same 513 of 615 on the low-Reynolds grid for 47 % more), and that
 * state continued down to the requested Reynolds number in steps of a factor
 * sqrt 2 (halved where a step fails, down to a factor 2^(1/16)): a continuation in a
 * parameter, as a sweep continues in alpha. Whichever path led to it, the result is a state
 * the exact rule accepts at the requested condition. */
#define RE_CONT_MAX_FACTOR 4.0
#define RE_CONT_MIN_STEP (0.0625 * 0.6931471805599453) /* ln 2 / 16 */
static ascr_status start_from_higher_re(ascr_visc_solver *v, double alpha_rad,
                                        ascr_visc_result *r, ascr_errbuf *err)
{
  const double re = v->p.re;
  int its = 0;
  ascr_status st = ASCR_EMAXITER;
  double lcur = NAN;
  for (double f = 2.0; f <= RE_CONT_MAX_FACTOR && v->p.re * f <= 1e8; f *= 2.0) {
    v->p.re = re * f;
    st = both_marches(v, alpha_rad, r, &its);
    v->p.re = re;
    if (st == ASCR_OK) {
      lcur = log(re * f);
      break;
    }
  }
  const double lend = log(re);
  double step = 0.5 * 0.6931471805599453;
  while (st == ASCR_OK && lcur > lend) {
    visc_snapshot(v, 1);
    double lnext = fmax(lcur - step, lend);
    v->p.re = lnext > lend ? exp(lnext) : re;
    st = solve_once(v, alpha_rad, 1, ASCR_VISC_START_MARCH, r, NULL);
    its += r->iterations;
    v->p.re = re;
    if (st == ASCR_OK) {
      lcur = lnext;
    } else if (step > RE_CONT_MIN_STEP) {
      visc_restore(v, 1);
      step *= 0.5;
      st = ASCR_OK;
    }
  }
  v->p.re = re;
  r->iterations = its;
  if (st == ASCR_OK) return ASCR_OK;
  v->have_solution = 0;
  return core_fail(err, ASCR_EMAXITER, "viscous solve at alpha %.2f deg, Re %.3g: not converged "
                   "from any start (fresh, and continued from a higher Reynolds number)",
                   alpha_rad * 180.0 / ASCR_PI, re);
}

/* A warm solve: from the secant predictor, and where that fails from the plain last state (slot
 * 1 keeps it): the extrapolation can overshoot where the layer changes fast (a bubble forming,
 * stall). */
static ascr_status solve_warm(ascr_visc_solver *v, double alpha_rad, ascr_visc_result *r,
                              ascr_errbuf *err)
{
  visc_snapshot(v, 1);
  ascr_status st = solve_once(v, alpha_rad, 1, ASCR_VISC_START_MARCH, r, err);
  if ((st == ASCR_EMAXITER || st == ASCR_ESING) && v->pred_used) {
    int its = r->iterations;
    visc_restore(v, 1);
    v->pred_off = 1;
    st = solve_once(v, alpha_rad, 1, ASCR_VISC_START_MARCH, r, err);
    v->pred_off = 0;
    r->iterations += its;
  }
  return st;
}

/* Step control of the continuation (Allgower & Georg 2003, ch. 6: the step is cut where the
 * corrector lands far from the predictor). Where thin sections at low Reynolds numbers have
 * neighbouring branches (a layer separated without reattachment beside one that reattaches,
 * measured on the 3 %-thick, 5 %-camber plate at Re 3e4, 3-4.6 deg: cl 0.42-0.64 and
 * 0.53-0.69 at the same angles), a continuation step of 0.5 deg could leave the branch it was
 * on although the branch goes on: steps of 0.1 deg followed it. A converged warm step whose cl
 * differs from the secant prediction through the two last states by more than JUMP_DCL is
 * therefore repeated in two halves; if both halves converge, their end state is the result
 * (the branch followed), otherwise the direct step's state stands (a real jump: the branch
 * ended). JUMP_DCL is a path control, not a physical constant: a smooth branch misses the
 * secant by about cl'' h^2 (measured below 0.03 on the plate's branches at h = 0.5 deg);
 * a spurious trigger costs two warm solves and gives the same state. */
#define JUMP_DCL 0.03
#define JUMP_MIN_STEP (0.05 * ASCR_PI / 180.0)
static int jumped(double a1, double cl1, double a0, double cl0, double alpha_rad,
                  const ascr_visc_result *r)
{
  if (!(isfinite(a0) && isfinite(cl0) && isfinite(a1) && isfinite(cl1)) || a1 == a0) return 0;
  if (fabs(alpha_rad - a1) < JUMP_MIN_STEP) return 0;
  double f = (alpha_rad - a1) / (a1 - a0);
  if (fabs(f) > 2.0) return 0; /* no secant this far out (predictor.c's limit) */
  return fabs(r->cl - (cl1 + f * (cl1 - cl0))) > JUMP_DCL;
}

/* The step from a1 to alpha_rad again in two halves, from the state it started from (slot 4);
 * the iterations added to *its, the second half's result in r2. */
static ascr_status solve_halves(ascr_visc_solver *v, double a1, double alpha_rad,
                                ascr_visc_result *r2, int *its)
{
  ascr_visc_result rm;
  visc_restore(v, 4);
  ascr_status sm = solve_warm(v, 0.5 * (a1 + alpha_rad), &rm, NULL);
  *its += rm.iterations;
  if (sm == ASCR_OK) {
    sm = solve_warm(v, alpha_rad, r2, NULL);
    *its += r2->iterations;
  }
  return sm;
}

/* A warm solve with the step control above. *ended is set where the step left the secant's line
 * and its halves did not both converge: the branch ended between the two angles, and the state
 * returned (kept in slot 5) is wherever the direct step landed. */
static ascr_status solve_continued(ascr_visc_solver *v, double alpha_rad, ascr_visc_result *r,
                                   ascr_errbuf *err, int *ended)
{
  double a1 = v->cur_alpha, cl1 = v->cur_cl;
  int pair = v->pred_prev.valid && v->pred_prev.re == v->p.re && v->cur_re == v->p.re;
  double a0 = pair ? v->pred_prev.alpha : NAN, cl0 = pair ? v->pred_prev.cl : NAN;
  *ended = 0;
  visc_snapshot(v, 4);
  ascr_status st = solve_warm(v, alpha_rad, r, err);
  if ((st == ASCR_EMAXITER || st == ASCR_ESING) && fabs(alpha_rad - a1) >= 2.0 * JUMP_MIN_STEP) {
    /* a failed step is tried once more in two halves before the caller starts afresh */
    ascr_visc_result r2;
    int its = r->iterations;
    if (solve_halves(v, a1, alpha_rad, &r2, &its) == ASCR_OK) {
      *r = r2;
      st = ASCR_OK;
    }
    r->iterations = its;
    if (st != ASCR_OK) return st;
  }
  if (st != ASCR_OK || !jumped(a1, cl1, a0, cl0, alpha_rad, r)) return st;
  ascr_visc_result rd = *r, r2;
  visc_snapshot(v, 5); /* the direct step's state */
  int its = rd.iterations;
  if (solve_halves(v, a1, alpha_rad, &r2, &its) == ASCR_OK) {
    *r = r2;
  } else {
    visc_restore(v, 5);
    *r = rd;
    *ended = 1;
  }
  r->iterations = its;
  return ASCR_OK;
}

/* A fresh start through a provisional trip (past stall above all, where the marched starts
 * fail: NACA 0012 at Re 1e6, 16 deg, from every start and at every Re from 2.5e5 to 4e6). The
 * suction side's layer (the upper surface at alpha >= 0, the lower below) is tripped at
 * x/c = START_TRIP_X for the start, which settles the leading-edge region at once; the state is
 * then solved again, warm, with the section's own trips. Where natural transition lies ahead of the provisional trip (the case it is meant
 * for) the trip binds nothing and the second solve confirms the state in an iteration or two;
 * elsewhere it continues from the tripped state. Either way the result is judged at the
 * requested condition alone: a path, like the other starts. START_TRIP_X is a path control.
 * Measured (2026-12-04): robustness grid 1107 -> 1109 of 1125 (the 2.5 %-thick plate at Re
 * 1e6, 34 -> 36 of 45); the low-Reynolds grid (592 of 615), bench_visc and every UIUC figure
 * unchanged. */
#define START_TRIP_X 0.02
static ascr_status start_with_trip(ascr_visc_solver *v, double alpha_rad, ascr_visc_result *r)
{
  double *trip = alpha_rad >= 0.0 ? &v->p.trip_upper : &v->p.trip_lower;
  if (!(*trip > START_TRIP_X)) return ASCR_EMAXITER; /* the section's own trip is ahead */
  const double own = *trip;
  int its = 0;
  *trip = START_TRIP_X;
  ascr_status st = both_marches(v, alpha_rad, r, &its);
  *trip = own;
  if (st == ASCR_OK) {
    v->pred_off = 1;
    st = solve_once(v, alpha_rad, 1, ASCR_VISC_START_MARCH, r, NULL);
    v->pred_off = 0;
    its += r->iterations;
    /* the start is for states whose own transition lies ahead of the trip; where the layer,
     * untripped, went elsewhere, the trip was not the path to it */
    double xt = alpha_rad >= 0.0 ? r->x_transition_upper : r->x_transition_lower;
    if (st == ASCR_OK && !(xt <= START_TRIP_X)) st = ASCR_EMAXITER;
  }
  r->iterations = its;
  if (st != ASCR_OK) v->have_solution = 0;
  return st;
}

/* The fresh starts of one group: 0, the march, the direct march with its coupling passes
 * (initial_state) and both through a provisional trip (start_with_trip); 1, the start continued
 * down from a higher Reynolds number. */
static ascr_status fresh_group(ascr_visc_solver *v, int group, double alpha_rad,
                               ascr_visc_result *r, ascr_errbuf *err)
{
  if (group == 1) {
    /* robustness grid (bench/study_visc_convergence, 1125 points): 1060 -> 1084 converged
     * with this start after a failed continuation, NACA 4412 at Re 3e4 past 10 deg above all */
    return start_from_higher_re(v, alpha_rad, r, err);
  }
  ascr_status st = solve_once(v, alpha_rad, 0, ASCR_VISC_START_MARCH, r, err);
  if (st == ASCR_EMAXITER || st == ASCR_ESING) {
    int its = r->iterations;
    st = solve_once(v, alpha_rad, 0, ASCR_VISC_START_COUPLED_MARCH, r, err);
    r->iterations += its;
  }
  if (st == ASCR_EMAXITER || st == ASCR_ESING) {
    int its = r->iterations;
    st = start_with_trip(v, alpha_rad, r);
    r->iterations += its;
  }
  return st;
}

/* A group of fresh starts with the turbulent fits as the code had them before (bl_impl.h): the
 * Re_theta floor a plain maximum at START_RTH_MIN (without a source) and no Coles bound on the
 * lag thickness; the state continued in the fits, floor min = START_RTH_MIN + t (BL_TURB_RTH_MIN
 * - START_RTH_MIN), width = t BL_TURB_RTH_WIDTH, Coles weight t, from t = 0 to 1 (two steps,
 * each halved where it fails, down to a tenth): a continuation in parameters of the closure, as
 * start_from_higher_re's is in the Reynolds number, judged at the requested condition alone. It
 * is for the states the two changes made hard to start: past stall (NACA 0012 and 2412 at 15-16
 * deg, Re 3e4-1e6: transition near the leading edge, where the young turbulent layer has
 * Re_theta 100-300) and the thin plates at Re 5,000. START_RTH_MIN is a path control. */
#define START_RTH_MIN 200.0
static bl_turb_fit floor_at(double t)
{
  bl_turb_fit f = {START_RTH_MIN + t * (BL_TURB_RTH_MIN - START_RTH_MIN), t * BL_TURB_RTH_WIDTH, t};
  return f;
}

static ascr_status from_lower_floor(ascr_visc_solver *v, int group, double alpha_rad,
                                    ascr_visc_result *r)
{
  const bl_turb_fit own = v->turb_fit;
  v->turb_fit = floor_at(0.0);
  ascr_status st = fresh_group(v, group, alpha_rad, r, NULL);
  int its = r->iterations;
  double t = 0.0, step = 0.5;
  while (st == ASCR_OK && t < 1.0) {
    visc_snapshot(v, 1);
    double next = fmin(t + step, 1.0);
    v->turb_fit = floor_at(next);
    v->pred_off = 1;
    st = solve_once(v, alpha_rad, 1, ASCR_VISC_START_MARCH, r, NULL);
    v->pred_off = 0;
    its += r->iterations;
    if (st == ASCR_OK) {
      t = next;
    } else if (step > 0.1) {
      visc_restore(v, 1);
      step *= 0.5;
      st = ASCR_OK;
    }
  }
  v->turb_fit = own;
  r->iterations = its;
  if (st != ASCR_OK) v->have_solution = 0;
  return st;
}

ascr_status visc_solve_fresh_first(ascr_visc_solver *v, double alpha_rad, ascr_visc_result *r)
{
  ascr_status st = fresh_group(v, 0, alpha_rad, r, NULL);
  if (st != ASCR_OK) v->have_solution = 0;
  return st;
}

/* The fresh starts in turn, each group first as it is and then from the lower floor. */
static ascr_status solve_fresh(ascr_visc_solver *v, double alpha_rad, ascr_visc_result *r,
                               ascr_errbuf *err)
{
  ascr_status st = ASCR_EMAXITER;
  int its = 0;
  for (int group = 0; group < 2 && (st == ASCR_EMAXITER || st == ASCR_ESING); group++) {
    st = fresh_group(v, group, alpha_rad, r, err);
    its += r->iterations;
    if (st == ASCR_EMAXITER || st == ASCR_ESING) {
      st = from_lower_floor(v, group, alpha_rad, r);
      its += r->iterations;
    }
  }
  r->iterations = its;
  if (st == ASCR_OK || (st != ASCR_EMAXITER && st != ASCR_ESING)) return st;
  v->have_solution = 0;
  return core_fail(err, ASCR_EMAXITER, "viscous solve at alpha %.2f deg, Re %.3g: not converged "
                   "from any start (fresh, continued from a higher Reynolds number, and from a "
                   "lower floor of the turbulent Re_theta)", alpha_rad * 180.0 / ASCR_PI, v->p.re);
}

/* Where the continuation's branch ended (solve_continued), the state the direct step landed on
 * depends on the step: on the 3 %-thick, 5 %-camber plate at Re 3e4 the branch that ends near
 * 4.05 deg led a step to 4.5 deg onto a state with cl 0.354 and a step to 4.1 deg onto one with
 * 0.544, where a fresh start reaches the leading-edge-bubble state (0.783, 0.788). So a solve
 * that may start afresh takes the fresh starts' state there, which depends only on the
 * condition; the direct step's state is kept only if no fresh start converges. */
ascr_status visc_solve(ascr_visc_solver *v, double alpha_rad, int warm, int cold_ok,
                       ascr_visc_result *r, ascr_errbuf *err)
{
  if (v == NULL || r == NULL) return core_fail(err, ASCR_EINVAL, "viscous solve: NULL argument");
  v->branch_ended = 0;
  if (!(warm && v->have_solution)) return solve_fresh(v, alpha_rad, r, err);
  int ended = 0;
  ascr_status st = solve_continued(v, alpha_rad, r, err, &ended);
  v->branch_ended = ended;
  if ((st == ASCR_OK && !ended) || !cold_ok) return st;
  int its = r->iterations;
  ascr_visc_result rd = *r;
  ascr_status sf = solve_fresh(v, alpha_rad, r, ended ? NULL : err);
  r->iterations += its;
  if (sf == ASCR_OK || !ended) return sf;
  visc_restore(v, 5);
  its = r->iterations;
  *r = rd;
  r->iterations = its;
  return ASCR_OK;
}

ascr_status ascr_visc_solver_solve(ascr_visc_solver *v, double alpha_rad, int warm,
                                   ascr_visc_result *r, ascr_errbuf *err)
{
  return visc_solve(v, alpha_rad, warm, 1, r, err);
}
