/* src/polar/sweep.c
 * Angle-of-attack sweep with continuation and step refinement.
 *
 * Method. Grid angles a_i = a0 + i step. The sweep starts at the grid point nearest the
 * inviscid zero-lift angle (from the panel solver's two unit solutions: the circulation
 * vanishes at atan2(-G0, G90)), solving it as a single point does (ascr_polar_solve_point: a
 * fresh start at the zero-lift angle itself, continued to the grid point, so that the branch
 * a sweep follows does not depend on where its range begins), then walks up the grid and
 * afterwards down from the start point, each point warm-started from the last converged one.
 * When a point fails, intermediate angles between the last converged angle and the target are
 * solved first (halving the gap, up to three levels), and the target is retried from there.
 * The downward walk starts from the lowest point that converged on the way up (so a failed
 * start point does not leave the lower half without continuation).
 * A point that still fails is recorded unconverged and the walk continues from the last
 * converged solution. A fresh start depends only on the condition, so it is tried once per
 * angle (the first time the walk reaches it); every retry (the refinement's intermediate
 * angles, the downward walk over points that failed going up, the second walk) continues only.
 * A warm start begins at the solver's secant predictor (src/visc/predictor.c). cl_max is the
 * largest converged cl; stall is reported when a converged point beyond it has a lower cl.
 * A converged state depends only on the condition (the exact transition rule), so where two
 * walks reach an angle with different converged states the physics has two states
 * (hysteresis near stall, a bubble that bursts): each point is therefore also reached from the
 * other side (down from the highest converged point, up from the lowest) and flagged bistable
 * where the second state differs by more than 0.005 in cl or 1 % in cd (issue 11's uniqueness
 * tolerances); a point only the second walk converges is taken from it.
 */
#include "airscrew/ascr_polar.h"
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define DEG (ASCR_PI / 180.0)

size_t ascr_polar_grid_size(double a0, double a1, double step)
{
  if (!isfinite(a0) || !isfinite(a1) || !(step > 0.0) || a1 < a0) return 0;
  double n = floor((a1 - a0) / step + 1e-9) + 1.0;
  if (n > 100000.0) return 0;
  return (size_t)n;
}

static void fill(ascr_polar_point *p, double alpha_deg, const ascr_visc_result *r)
{
  p->alpha_deg = alpha_deg;
  p->cl = r->cl;
  p->cd = r->cd;
  p->cdf = r->cdf;
  p->cdp = r->cdp;
  p->cm = r->cm;
  p->x_transition_upper = r->x_transition_upper;
  p->x_transition_lower = r->x_transition_lower;
  p->x_separation_upper = r->x_separation_upper;
  p->x_reattach_upper = r->x_reattach_upper;
  p->x_separation_lower = r->x_separation_lower;
  p->x_reattach_lower = r->x_reattach_lower;
  p->converged = r->converged;
  p->trip_not_applied = r->trip_not_applied;
  p->iterations = r->iterations;
  p->residual = r->residual;
  p->bistable = 0;
  p->other_cl = p->other_cd = p->other_cm = NAN;
}

/* Two converged states differ (issue 11's uniqueness tolerances). */
#define BISTABLE_DCL 0.005
#define BISTABLE_DCD_REL 0.01

/* Solve target alpha continuing from the last converged state (saved in the solver's snapshot;
 * have_last = 0 for a fresh start). On success the snapshot holds the new state. cold_ok = 0
 * where this angle's fresh starts have been tried before (they depend only on the angle: a
 * repeat would only repeat the failure). The refinement below continues only, at its
 * intermediate angles too: on the robustness grid (bench/study_visc_convergence) fresh starts
 * there gained 8 of 1125 points for a third more time. */
static int solve_point(ascr_visc_solver *v, int have_last, double alast, double target,
                       int cold_ok, ascr_visc_result *r)
{
  if (!have_last && !cold_ok) {
    /* nothing to continue from, and the fresh starts were tried before */
    memset(r, 0, sizeof *r);
    r->cl = r->cd = r->cm = NAN;
    return 0;
  }
  if (have_last) visc_restore(v, 0);
  ascr_status st = visc_solve(v, target * DEG, have_last, cold_ok, r, NULL);
  if (st == ASCR_OK) {
    visc_snapshot(v, 0);
    return 1;
  }
  if (!have_last) return 0;
  int total_its = r->iterations;
  /* refine: approach the target in halving steps from the last converged angle */
  for (int level = 1; level <= 3; level++) {
    int parts = 1 << level, ok = 1;
    visc_restore(v, 0);
    for (int k = 1; k < parts && ok; k++) {
      double mid = alast + (target - alast) * (double)k / (double)parts;
      ascr_visc_result rm;
      ok = visc_solve(v, mid * DEG, 1, 0, &rm, NULL) == ASCR_OK;
      total_its += rm.iterations;
    }
    if (!ok) continue;
    st = visc_solve(v, target * DEG, 1, 0, r, NULL);
    total_its += r->iterations;
    if (st == ASCR_OK) {
      r->iterations = total_its;
      visc_snapshot(v, 0);
      return 1;
    }
  }
  r->iterations = total_its;
  visc_restore(v, 0);
  return 0;
}

/* Zero-lift angle of the inviscid solution, degrees. */
static double zero_lift_deg(const ascr_visc_solver *v)
{
  const ascr_panel_solver *ps = v->ps;
  double g0 = 0.0, g90 = 0.0;
  for (size_t j = 0; j + 1 < ps->n; j++) {
    double L = hypot(ps->x[j + 1] - ps->x[j], ps->y[j + 1] - ps->y[j]);
    g0 += 0.5 * (ps->g0[j] + ps->g0[j + 1]) * L;
    g90 += 0.5 * (ps->g90[j] + ps->g90[j + 1]) * L;
  }
  return atan2(-g0, g90) / DEG;
}

/* The single point's path (ascr_polar_solve_point): a fresh start at the inviscid zero-lift
 * angle, then continuation along the lattice of multiples of `lattice` deg: to the lattice
 * angle nearest zero lift, lattice step by lattice step towards alpha_deg, and from the last
 * lattice angle before it to alpha_deg (each step with the sweep's step refinement); angles
 * that fail are passed over. The path depends only on the section and the angle, and at
 * lattice angles it is the path of a sweep over lattice angles in lattice steps (which starts
 * at its grid angle nearest zero lift, reached from the zero-lift angle, and walks from there):
 * where the discrete equations have two states at an angle (a laminar layer separated to the
 * trailing edge or not, SD7003 at Re 1e5 near zero lift: cl 0.56 and 0.33 at 1 deg) the single
 * point gives the state the sweep gives, not one its own path happened to reach. Returns 1 if
 * alpha_deg itself converged (its result in r). */
static int walk_from_zero_lift(ascr_visc_solver *v, double alpha_deg, double lattice,
                               ascr_visc_result *r, int *its, double *a_reached)
{
  double azl = zero_lift_deg(v);
  double c0 = lattice * floor(azl / lattice + 0.5);
  double dir = alpha_deg >= c0 ? 1.0 : -1.0;
  /* lattice angles from c0 towards alpha_deg, alpha_deg excluded */
  long m = (long)floor(fabs(alpha_deg - c0) / lattice + 1e-9);
  if (m > 0 && fabs(c0 + dir * lattice * (double)m - alpha_deg) < 1e-9) m--;
  int have = 0;
  double alast = NAN;
  ascr_visc_result rr;
  memset(&rr, 0, sizeof rr);
  /* the zero-lift angle itself (fresh), then c0 .. c0 + dir m lattice, then the target */
  for (long k = -1; k <= m + 1; k++) {
    double a;
    if (k < 0) a = azl;
    else if (k <= m) a = c0 + dir * lattice * (double)k;
    else a = alpha_deg;
    if (k >= 0 && have && fabs(a - alast) < 1e-9) {
      /* the same angle to rounding (c0 at zero lift, or the target on c0): already reached */
      alast = a;
      continue;
    }
    /* fresh starts allowed where continuation fails, at the target too, as in a sweep */
    int ok = solve_point(v, have, alast, a, 1, &rr);
    *its += rr.iterations;
    if (ok) {
      have = 1;
      alast = a;
    }
  }
  *r = rr;
  *a_reached = have ? alast : NAN;
  return have && alast == alpha_deg;
}

/* The single point: the walk from zero lift along the lattice of 0.5 deg (a sweep's usual
 * step), where it ends before the angle the same walk along 0.25 deg, and where that ends too a
 * fresh start at the angle (the state a fresh start reaches depends only on the condition). 1
 * if converged, its state then in slot 0; the iterations of every solve in r->iterations. If
 * not, *a_reached is the last angle the last walk converged (its state in slot 0), NaN if none. */
static int single_point(ascr_visc_solver *v, double alpha_deg, ascr_visc_result *r,
                        double *a_reached)
{
  int its = 0;
  int ok = walk_from_zero_lift(v, alpha_deg, 0.5, r, &its, a_reached);
  if (!ok) ok = walk_from_zero_lift(v, alpha_deg, 0.25, r, &its, a_reached);
  if (!ok) {
    ok = visc_solve(v, alpha_deg * DEG, 0, 1, r, NULL) == ASCR_OK;
    if (ok) visc_snapshot(v, 0);
    its += r->iterations;
  }
  r->iterations = its;
  return ok;
}

ascr_status ascr_polar_solve_point(ascr_visc_solver *v, double alpha_deg, ascr_visc_result *r,
                                   ascr_errbuf *err)
{
  if (v == NULL || r == NULL) return core_fail(err, ASCR_EINVAL, "solve point: NULL argument");
  if (!v->is_set) return core_fail(err, ASCR_EINVAL, "solve point: viscous solver not set");
  if (!isfinite(alpha_deg) || fabs(alpha_deg) > 60.0) {
    return core_fail(err, ASCR_EINVAL, "solve point: alpha %g deg outside +-60", alpha_deg);
  }
  double a_reached;
  if (single_point(v, alpha_deg, r, &a_reached)) return ASCR_OK;
  return core_fail(err, ASCR_EMAXITER, "viscous solve at alpha %.2f deg, Re %.3g: not converged, "
                   "neither by continuation from the zero-lift angle nor from a fresh start",
                   alpha_deg, v->p.re);
}

/* 1 where a converged result differs from the point's state (issue 11's tolerances). */
static int differs(const ascr_visc_result *r, const ascr_polar_point *p)
{
  return fabs(r->cl - p->cl) > BISTABLE_DCL ||
         fabs(r->cd - p->cd) > BISTABLE_DCD_REL * fmin(r->cd, p->cd);
}

static void set_other(ascr_polar_point *p, const ascr_visc_result *r)
{
  p->bistable = 1;
  p->other_cl = r->cl;
  p->other_cd = r->cd;
  p->other_cm = r->cm;
}

/* Second pass of a sweep: the angles i0..i1 (stepping by dir) reached from
 * the converged state of slot `slot` at index istart; a point that failed before and converges
 * now is taken, a point with a different converged state is flagged bistable. */
static void return_pass(ascr_visc_solver *v, int slot, size_t istart, long dir, size_t iend,
                        double a0, double step, ascr_polar_point *pts)
{
  visc_restore(v, slot);
  visc_snapshot(v, 0);
  int have = 1;
  double alast = a0 + step * (double)istart;
  for (size_t i = istart; i != iend;) {
    i = (size_t)((long)i + dir);
    double a = a0 + step * (double)i;
    ascr_visc_result rr;
    int ok = solve_point(v, have, alast, a, 0, &rr); /* every angle was tried fresh before */
    if (!ok) continue;
    have = 1;
    alast = a;
    ascr_polar_point *p = &pts[i];
    if (!p->converged) {
      fill(p, a, &rr);
    } else if (differs(&rr, p)) {
      set_other(p, &rr);
    }
  }
}

ascr_status ascr_polar_sweep(ascr_visc_solver *v, double a0, double a1, double step,
                             ascr_polar_point *pts, ascr_polar_summary *sum,
                             ascr_polar_progress_fn progress, void *progress_ctx,
                             ascr_errbuf *err)
{
  size_t n = ascr_polar_grid_size(a0, a1, step);
  if (v == NULL || pts == NULL || sum == NULL) {
    return core_fail(err, ASCR_EINVAL, "polar sweep: NULL argument");
  }
  if (n == 0) {
    return core_fail(err, ASCR_EINVAL, "polar sweep: alpha range %g .. %g by %g is empty or "
                     "too long", a0, a1, step);
  }
  if (!v->is_set) return core_fail(err, ASCR_EINVAL, "polar sweep: viscous solver not set");
  if (fabs(a0) > 60.0 || fabs(a1) > 60.0) {
    return core_fail(err, ASCR_EINVAL, "polar sweep: alpha beyond +-60 deg");
  }
  memset(sum, 0, sizeof *sum);
  sum->n_points = n;
  /* start near zero lift */
  double azl = zero_lift_deg(v);
  size_t i0 = 0;
  double best = INFINITY;
  for (size_t i = 0; i < n; i++) {
    double a = a0 + step * (double)i;
    if (fabs(a - azl) < best) {
      best = fabs(a - azl);
      i0 = i;
    }
  }
  size_t done = 0;
  ascr_visc_result r;
  /* upward from i0; the lowest converged point is kept (slot 2) to start the downward walk */
  int have = 0;
  size_t ilow = n;
  double alast = NAN;
  size_t ihigh = n; /* highest converged index of the upward walk (its state in slot 3) */
  for (size_t i = i0; i < n; i++) {
    double a = a0 + step * (double)i;
    /* the first point is solved as a single point (reached from the zero-lift angle), so
     * that the branch a sweep follows does not depend on where its range starts; if it fails,
     * the sweep continues from the last angle the single point's walk reached */
    int ok;
    if (i == i0) {
      double a_reached;
      ok = single_point(v, a, &r, &a_reached);
      if (!ok && isfinite(a_reached)) {
        have = 1;
        alast = a_reached;
      }
    } else {
      ok = solve_point(v, have, alast, a, 1, &r);
    }
    fill(&pts[i], a, &r);
    if (ok) {
      if (ilow == n) {
        ilow = i;
        visc_snapshot(v, 2);
      }
      ihigh = i;
      visc_snapshot(v, 3);
      have = 1;
      alast = a;
    }
    if (progress) progress(progress_ctx, ++done, n);
  }
  /* downward from the lowest converged point: first the points between it and i0 that failed
   * going up are tried again, then the rest */
  have = 0;
  alast = NAN;
  size_t istart = i0;
  if (ilow < n) {
    visc_restore(v, 2);
    visc_snapshot(v, 0);
    have = 1;
    alast = a0 + step * (double)ilow;
    istart = ilow;
  }
  for (size_t i = istart; i-- > 0;) {
    double a = a0 + step * (double)i;
    ascr_visc_result rr;
    int ok = solve_point(v, have, alast, a, i < i0, &rr); /* i >= i0: tried on the way up */
    if (i >= i0) {
      /* already tried on the way up: keep a success, otherwise the first record stands */
      if (ok) fill(&pts[i], a, &rr);
    } else {
      fill(&pts[i], a, &rr);
      if (progress) progress(progress_ctx, ++done, n);
    }
    if (ok) {
      have = 1;
      alast = a;
    }
  }
  /* every point from the other side too: down from the highest converged point, then up from
   * the lowest (the downward walk ended there: its state is in slot 0) */
  size_t ilo = n;
  for (size_t i = 0; i < n && ilo == n; i++) {
    if (pts[i].converged) ilo = i;
  }
  if (ilo < n && ilo < i0 && v->sv_have[0]) {
    visc_snapshot(v, 2); /* slot 0 may be overwritten by the first return pass */
  }
  if (ihigh < n && ihigh > i0) return_pass(v, 3, ihigh, -1, i0, a0, step, pts);
  if (ilo < n && ilo < i0 && v->sv_have[2]) return_pass(v, 2, ilo, 1, i0 - 1, a0, step, pts);
  /* summary */
  sum->cl_max = NAN;
  sum->cl_min = NAN;
  size_t imax = n, imin = n;
  for (size_t i = 0; i < n; i++) {
    if (!pts[i].converged) continue;
    sum->n_converged++;
    if (imax == n || pts[i].cl > pts[imax].cl) imax = i;
    if (imin == n || pts[i].cl < pts[imin].cl) imin = i;
  }
  if (imax < n) {
    sum->cl_max = pts[imax].cl;
    sum->alpha_cl_max_deg = pts[imax].alpha_deg;
    sum->cl_min = pts[imin].cl;
    sum->alpha_cl_min_deg = pts[imin].alpha_deg;
    for (size_t i = imax + 1; i < n; i++) {
      if (pts[i].converged && pts[i].cl < sum->cl_max) {
        sum->stall = 1;
        break;
      }
    }
  }
  return ASCR_OK;
}

/* The second branch continued from point i (its state in slot 2) towards dir, point by point
 * (continuation only, with the solver's step control), while it converges and stays away from
 * the sweep's state; each point on it flagged. Returns the points flagged. */
static size_t follow_branch(ascr_visc_solver *v, ascr_polar_point *pts, size_t n, size_t i,
                            long dir)
{
  size_t found = 0;
  visc_restore(v, 2);
  for (long j = (long)i + dir; j >= 0 && j < (long)n; j += dir) {
    ascr_polar_point *p = &pts[j];
    if (!p->converged || p->bistable) break;
    ascr_visc_result r;
    if (visc_solve(v, p->alpha_deg * DEG, 1, 0, &r, NULL) != ASCR_OK || !r.converged) break;
    /* the branch ended between the two angles: the state landed on is another one */
    if (v->branch_ended) break;
    if (!differs(&r, p)) break; /* back on the sweep's branch */
    set_other(p, &r);
    found++;
  }
  return found;
}

ascr_status ascr_polar_check_fresh(ascr_visc_solver *v, ascr_polar_point *pts, size_t n,
                                   size_t *n_found, ascr_errbuf *err)
{
  if (v == NULL || (pts == NULL && n > 0)) {
    return core_fail(err, ASCR_EINVAL, "fresh-start check: NULL argument");
  }
  if (!v->is_set) return core_fail(err, ASCR_EINVAL, "fresh-start check: viscous solver not set");
  size_t found = 0;
  for (size_t i = 0; i < n; i++) {
    ascr_polar_point *p = &pts[i];
    if (!p->converged || p->bistable) continue;
    ascr_visc_result r;
    if (visc_solve_fresh_first(v, p->alpha_deg * DEG, &r) != ASCR_OK || !r.converged) continue;
    if (!differs(&r, p)) continue;
    set_other(p, &r);
    found++;
    /* and the branch it lies on, both ways */
    visc_snapshot(v, 2);
    found += follow_branch(v, pts, n, i, 1);
    found += follow_branch(v, pts, n, i, -1);
  }
  if (n_found) *n_found = found;
  return ASCR_OK;
}
