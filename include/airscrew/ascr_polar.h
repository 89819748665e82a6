/* include/airscrew/ascr_polar.h
 * Polars: sweeps of the viscous section analysis over angle of attack, continuing from each
 * converged point to the next, with automatic step refinement where a point fails, and cl_max
 * and stall detection.
 *
 * The sweep starts at the grid angle nearest the inviscid zero-lift angle and runs outward in
 * both directions, because the flow is easiest to converge near zero lift and each next point
 * starts from its neighbour's solution. Thread safety: one solver per thread.
 */
#ifndef ASCR_POLAR_H
#define ASCR_POLAR_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_visc.h"

#ifdef __cplusplus
extern "C" {
#endif

/** One point of a polar. Numbers of an unconverged point are the last iterate and must be
 *  reported as such (converged = 0). */
typedef struct ascr_polar_point {
  double alpha_deg;
  double cl, cd, cdf, cdp, cm;
  double x_transition_upper, x_transition_lower; /* NaN where laminar to the TE */
  double x_separation_upper, x_reattach_upper;   /* NaN where none */
  double x_separation_lower, x_reattach_lower;
  int converged;
  int iterations;
  double residual;
  int trip_not_applied; /* as ascr_visc_result.trip_not_applied (bit 0 upper, bit 1 lower) */
  int bistable;      /* 1 if the sweep, reaching this angle from the other side (or a fresh
                        start, ascr_polar_check_fresh), converged to a second state
                        (|dcl| > 0.005 or |dcd| > 1 %); its values below, NaN otherwise */
  double other_cl, other_cd, other_cm;
} ascr_polar_point;

/** Summary of a sweep. */
typedef struct ascr_polar_summary {
  size_t n_points;      /* points on the requested grid */
  size_t n_converged;   /* of which converged */
  double cl_max;        /* largest converged cl (NaN if none converged) */
  double alpha_cl_max_deg;
  int stall;            /* 1 if cl falls after cl_max within the sweep (stall seen) */
  double cl_min;        /* smallest converged cl */
  double alpha_cl_min_deg;
} ascr_polar_summary;

/** Progress callback: done of total grid points finished. May be NULL. */
typedef void (*ascr_polar_progress_fn)(void *ctx, size_t done, size_t total);

/** Number of grid points of a sweep from a0 to a1 by step (> 0), both ends included when on
 *  the grid; 0 for invalid input. */
ASCR_EXPORT size_t ascr_polar_grid_size(double a0_deg, double a1_deg, double step_deg);

/** Sweep the set viscous solver v over the grid a0..a1 by step (degrees). pts must hold
 *  ascr_polar_grid_size() entries (caller owned), filled in ascending alpha. A point that does
 *  not converge after step refinement (halving the step from the last converged point up to
 *  three times) is kept, flagged unconverged, and the sweep goes on. Every point is also
 *  reached from the other side (a second walk down from the highest and up from the lowest converged point): a point
 *  found only that way is taken, and a point with two different converged states is flagged
 *  bistable with the second state's cl, cd, cm.
 *  @return ASCR_OK (even if some points did not converge: see the flags and summary);
 *          ASCR_EINVAL for a bad grid. */
ASCR_EXPORT ascr_status ascr_polar_sweep(ascr_visc_solver *v, double a0_deg, double a1_deg,
                                         double step_deg, ascr_polar_point *pts,
                                         ascr_polar_summary *sum, ascr_polar_progress_fn progress,
                                         void *progress_ctx, ascr_errbuf *err);

/** A look for the states a sweep does not reach: at every converged, not yet bistable point of
 *  a sweep (pts, n entries, as ascr_polar_sweep filled them) the solver starts afresh at the
 *  angle (its marched starts, without the continuations from a higher Reynolds number), and
 *  where that converges to a state that differs by more than 0.005 in cl or 1 % in cd the point
 *  is flagged bistable with that state as its second one, and that state is continued to the
 *  neighbouring angles both ways (continuation only) while it converges and differs from the
 *  sweep's state, each point on that branch flagged alike. The sweep's own state stays the
 *  point's result. On low-Re sections such states have the lower laminar layer separating at
 *  the trailing edge (docs/theory/viscous.md). Costs about one cold start per point.
 *  n_found (may be NULL): points flagged here. @return ASCR_OK; ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_polar_check_fresh(ascr_visc_solver *v, ascr_polar_point *pts,
                                               size_t n, size_t *n_found, ascr_errbuf *err);

/** Solve one angle as a sweep would reach it: a fresh start at the inviscid zero-lift angle,
 *  then continuation along the multiples of 0.5 deg (a sweep's usual grid) to alpha_deg, fresh
 *  starts allowed where continuation fails (with the sweep's refinement); where that ends
 *  before alpha_deg the same walk along 0.25 deg, and where that ends too a fresh start at
 *  alpha_deg.
 *  The result depends only on the section, Re and angle, and is the state a polar sweep
 *  reports there (a fresh start alone can land on another converged state: a 6 %-camber plate
 *  at Re 1e4 and -0.5 deg). @return ASCR_OK; ASCR_EMAXITER if neither converged; ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_polar_solve_point(ascr_visc_solver *v, double alpha_deg,
                                               ascr_visc_result *r, ascr_errbuf *err);

/** cl at alpha_deg by linear interpolation between the two converged points of a swept
 *  polar (pts in increasing alpha, n entries) that bracket it; NaN if no converged pair does. */
ASCR_EXPORT double ascr_polar_cl_at_alpha(const ascr_polar_point *pts, size_t n, double alpha_deg);

/** The figures a Reynolds-number study compares, from one swept polar (src/polar/re_summary.c
 *  gives each definition). Every number is taken from converged points only and is NaN where
 *  the polar does not determine it. */
typedef struct ascr_polar_re_summary {
  double cd_min, cl_at_cd_min, alpha_at_cd_min_deg;  /* smallest cd, where it occurs */
  double ld_max, cl_at_ld_max, alpha_at_ld_max_deg;  /* largest cl / cd (cd > 0), where */
  double cl_max, alpha_cl_max_deg;                   /* largest cl below the first fall */
  double alpha_zero_lift_deg;                        /* first sign change of cl, rising */
  double lift_slope_per_deg;                         /* fit within alpha_0 -2 .. +4 deg */
  double bubble_cl;                                  /* the cl the bubble is reported at */
  double x_separation_upper, x_reattach_upper;       /* at bubble_cl (x/c); NaN: none there */
  int bubble_status; /* 1 closed bubble at bubble_cl, 0 no closed bubble there (separation
                        may still be given: an open one), -1 bubble_cl not reached */
  size_t n_converged;
} ascr_polar_re_summary;

/** Summary of a swept polar (pts in increasing alpha, n entries) for a Reynolds-number study;
 *  bubble_cl is the lift coefficient at which the upper-surface bubble is reported.
 *  @return ASCR_OK; ASCR_EINVAL for NULL arguments or a non-finite bubble_cl. */
ASCR_EXPORT ascr_status ascr_polar_re_summary_compute(const ascr_polar_point *pts, size_t n,
                                                      double bubble_cl,
                                                      ascr_polar_re_summary *out,
                                                      ascr_errbuf *err);

/** The band one polar point spans over several sweeps of the same angle grid that differ in
 *  one input (issue 12: the critical amplification exponent N_crit over a range, the transition
 *  uncertainty): the least and largest cl, cd, cm and cl/cd over the sweeps whose point
 *  converged (a second state of a bistable point is not counted: it is hysteresis, not the
 *  input's effect). NaN where no sweep converged. */
typedef struct ascr_polar_band {
  double cl_lo, cl_hi, cd_lo, cd_hi, cm_lo, cm_hi, ld_lo, ld_hi;
  size_t n_runs;      /* sweeps given */
  size_t n_converged; /* of which converged at this angle: the band is complete if equal */
} ascr_polar_band;

/** Bands of npts points over nruns sweeps (runs[r] holds npts points on the same grid).
 *  @return ASCR_OK; ASCR_EINVAL for NULL arguments, no run, or grids that differ. */
ASCR_EXPORT ascr_status ascr_polar_band_compute(const ascr_polar_point *const *runs,
                                                size_t nruns, size_t npts,
                                                ascr_polar_band *out, ascr_errbuf *err);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_POLAR_H */
