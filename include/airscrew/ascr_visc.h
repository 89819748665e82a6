/* include/airscrew/ascr_visc.h
 * Viscous section analysis: the integral boundary layer of ascr_bl.h on both surfaces and the
 * wake, coupled to the panel solution through the mass defect (edge velocity = inviscid
 * velocity + source influence x mass defect) and solved for all stations at once by Newton's
 * method (the simultaneous coupling of Drela & Giles 1987, AIAA J. 25(10); our formulation in
 * docs/theory/viscous.md). Drag from the far-wake momentum thickness (Squire & Young 1937,
 * ARC R&M 1838).
 *
 * Life cycle: _alloc(n_nodes, n_wake) -> _set(panel solver, params) -> _solve(alpha) any number
 * of times (each solve may start from the previous converged state: continuation) -> _free.
 * The panel solver is borrowed and must outlive the viscous solver; it is only read.
 * Thread safety: one solver object per thread.
 * Reproducibility: a converged state is the same to round-off whatever the BLAS, but whether a
 * hard condition converges at all from a fresh start can depend on the rounding of the linear
 * algebra, which with OpenBLAS depends on its thread count (measured 2026-12-04: a thin plate at
 * Re 5000, -4 deg, one start converged with two threads and diverged with one). The command line,
 * the benchmarks and the tests run OpenBLAS on one thread (openblas_set_num_threads(1)); a
 * program linking the library gets the same points converged by doing the same.
 */
#ifndef ASCR_VISC_H
#define ASCR_VISC_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_panel.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct ascr_visc_solver ascr_visc_solver;

/** Parameters of a viscous analysis. */
typedef struct ascr_visc_params {
  double re;            /* chord Reynolds number V c / nu (1e3 .. 1e8) */
  double mach;          /* free-stream Mach number (0 .. 0.7) */
  double ncrit;         /* critical amplification exponent (default 9) */
  double trip_upper;    /* forced transition x/c on the upper surface (> 1 for none) */
  double trip_lower;    /* forced transition x/c on the lower surface (> 1 for none) */
  double wake_length;   /* wake length, chords (default 1) */
  int max_iter;         /* Newton iteration limit (default 60) */
  double tol;           /* convergence: largest relative update of theta and m (default 1e-7) */
  int wall_curvature;   /* 0 (default): the flat-wall turbulent closure; 1: the turbulent layer's
                           dissipation length follows the wall's curvature (Bradshaw 1969, in
                           the lag equation as Green, Weeks & Brooman 1977; shorter on convex
                           walls). A study option, measured on every reference and not the
                           default: docs/theory/viscous.md, "Streamline curvature" */
} ascr_visc_params;

/** Defaults: Re 1e6, Mach 0, N_crit 9, no trips, 1-chord wake, 60 iterations, 1e-7, flat-wall
 *  closure (wall_curvature 0). */
ASCR_EXPORT ascr_visc_params ascr_visc_params_defaults(void);

/** Default number of wake nodes for a section of n_nodes nodes. */
ASCR_EXPORT size_t ascr_visc_default_wake_nodes(size_t n_nodes);

/** Allocate for sections of n_nodes nodes and a wake of n_wake nodes (>= 8). NULL on failure. */
ASCR_EXPORT ascr_visc_solver *ascr_visc_solver_alloc(size_t n_nodes, size_t n_wake);

/** Attach a set panel solver (borrowed) and the parameters (copied); builds the surface part
 *  of the source-influence matrix. Forgets any previous solution.
 *  @return ASCR_OK, ASCR_EINVAL (sizes, parameter ranges; message names the field),
 *          ASCR_ESING (LU solve failed). */
ASCR_EXPORT ascr_status ascr_visc_solver_set(ascr_visc_solver *v, const ascr_panel_solver *ps,
                                             const ascr_visc_params *p, ascr_errbuf *err);

/** Results at one angle of attack. */
typedef struct ascr_visc_result {
  double alpha_rad;
  double cl;                 /* from the viscous surface pressure */
  double cm;                 /* about (0.25, 0), nose up positive */
  double cd;                 /* total drag, Squire-Young at the wake end */
  double cdf;                /* skin-friction drag */
  double cdp;                /* pressure drag, cd - cdf */
  double x_transition_upper; /* x/c of transition, upper surface (NaN if laminar to the TE) */
  double x_transition_lower;
  int forced_upper;          /* 1 if the upper transition is the trip */
  int trip_not_applied;      /* bit 0 upper, bit 1 lower surface: a trip was asked for there but
                                lies between the leading edge and the stagnation point (at
                                incidence the stagnation point moves onto that surface, behind
                                the trip), ahead of the layer it was meant for, so it binds
                                nothing: that layer's transition is free */
  double x_separation_upper; /* x/c where Cf first turns negative on the upper surface (NaN if none) */
  double x_reattach_upper;   /* x/c where it turns positive again (NaN if it does not) */
  double x_separation_lower;
  double x_reattach_lower;
  int converged;             /* 1 if the Newton iteration met the tolerance */
  int iterations;            /* Newton iterations used */
  double residual;           /* error left: the final largest relative update, or the smaller
                                estimate from the contraction of the last two steps */
} ascr_visc_result;

/** Solve at angle alpha_rad. warm != 0 starts from the previous solution of this object (if
 *  any), which is how polar sweeps continue from point to point: where that solution was
 *  itself continued from another angle at the same Reynolds number, the start is the secant
 *  extrapolation through the two (transition points included), and the plain previous solution
 *  if that fails; a step whose cl leaves the secant's line by more than 0.03 is repeated in two
 *  halves, so that the continuation keeps to its branch where another lies beside it.
 *  Otherwise, or if the continuation fails, the layer is initialised by marches on the inviscid
 *  velocity, then the same with a provisional trip on the suction side (solved again without
 *  it), and, failing those, continued down from a higher Reynolds number. The start decides the
 *  path, not the result: a converged state is one the equations and the transition rule accept
 *  at this condition.
 *  @return ASCR_OK if converged; ASCR_EMAXITER if not (r is still filled, r->converged = 0:
 *          the numbers are the last iterate and must not be used as a result); ASCR_EINVAL;
 *          ASCR_ESING (singular Newton system). */
ASCR_EXPORT ascr_status ascr_visc_solver_solve(ascr_visc_solver *v, double alpha_rad, int warm,
                                               ascr_visc_result *r, ascr_errbuf *err);

/** Distributions of the last solve, one entry per station (caller-owned arrays of
 *  ascr_visc_solver_stations() entries; any pointer may be NULL). Stations run over the upper
 *  surface from the stagnation point to the trailing edge, then the lower surface likewise,
 *  then the wake. side: 0 upper, 1 lower, 2 wake. ampl: N (laminar) or sqrt(Ctau) (turbulent). */
ASCR_EXPORT size_t ascr_visc_solver_stations(const ascr_visc_solver *v);
ASCR_EXPORT void ascr_visc_solver_distributions(const ascr_visc_solver *v, int *side, double *s,
                                                double *x, double *y, double *ue, double *dstar,
                                                double *theta, double *h, double *cf,
                                                double *ampl, int *turbulent);
/** Surface pressure of the last solve at the section nodes (n_nodes entries). */
ASCR_EXPORT void ascr_visc_solver_cp(const ascr_visc_solver *v, double *cp);

/* ---- stepping: the Newton iteration of one start, a step at a time ----
 * ascr_visc_solver_solve tries several starts in turn (the previous state, a march, a
 * coupled march, a continuation down from a higher Reynolds number). A caller may instead run
 * one start itself, as GSL's iterative solvers are run:
 *     ascr_visc_solver_start(v, alpha, ASCR_VISC_START_MARCH, err);
 *     while (ascr_visc_solver_test(v) == ASCR_CONTINUE) ascr_visc_solver_iterate(v, &step, err);
 *     ascr_visc_solver_result(v, &r, err);
 * A converged run leaves the state a later warm start (or ASCR_VISC_START_PREVIOUS) continues
 * from, as a converged solve does. */

/** Where a run starts. */
typedef enum ascr_visc_start {
  ASCR_VISC_START_PREVIOUS = 0,     /* the last converged state (secant predictor where it was
                                       itself continued from another angle at this Re) */
  ASCR_VISC_START_MARCH = 1,        /* a march on the inviscid edge velocity, inverse mode
                                       through laminar separation */
  ASCR_VISC_START_COUPLED_MARCH = 2 /* a direct march repeated on the coupled edge velocity;
                                       transition placed by a look-ahead march until the
                                       iteration settles, by the exact rule after that */
} ascr_visc_start;

/** One Newton step of a run. */
typedef struct ascr_visc_step {
  int start;                 /* ascr_visc_start of the run */
  double alpha_rad;          /* angle of the run */
  double re;                 /* Reynolds number of the run (a continuation from a higher Re
                                runs above the requested one) */
  int iteration;             /* 1, 2, ... within the run */
  double residual_max;       /* largest residual before the step */
  double update;             /* largest Newton update of ln theta and ln m */
  double relax;              /* fraction of the Newton step taken */
  int transition_moved;      /* 1 if a transition interval moved before the step */
  int stagnation_moved;      /* 1 if the stagnation point changed panel after it */
  int exact_rule;            /* 1 once the exact rule places transition (0: placement phase of
                                the coupled-march start) */
  double x_transition_upper; /* x/c of the crossing points after the step (NaN: laminar) */
  double x_transition_lower;
} ascr_visc_step;

/** Begin a run at angle alpha_rad from the given start. ASCR_EINVAL if the solver is not set,
 *  the start is unknown or ASCR_VISC_START_PREVIOUS has no converged state; ASCR_EGEOM if the
 *  inviscid solution has no stagnation point. */
ASCR_EXPORT ascr_status ascr_visc_solver_start(ascr_visc_solver *v, double alpha_rad,
                                               ascr_visc_start start, ascr_errbuf *err);
/** One Newton step of the run (step may be NULL). ASCR_OK when taken; ASCR_ESING if the Newton
 *  system is singular (the run ends); ASCR_EINVAL if no run is under way. */
ASCR_EXPORT ascr_status ascr_visc_solver_iterate(ascr_visc_solver *v, ascr_visc_step *step,
                                                 ascr_errbuf *err);
/** State of the run: ASCR_CONTINUE (going on), ASCR_OK (converged), ASCR_EMAXITER (ended
 *  without convergence: iteration limit, no descent, stagnation point lost), ASCR_ESING,
 *  ASCR_EINVAL (no run started). */
ASCR_EXPORT ascr_status ascr_visc_solver_test(const ascr_visc_solver *v);
/** Results of the run: of its last iterate once it has ended (the status of _test, with the
 *  reason in err where it did not converge), of the present iterate (converged = 0,
 *  ASCR_CONTINUE) while it goes on. */
ASCR_EXPORT ascr_status ascr_visc_solver_result(ascr_visc_solver *v, ascr_visc_result *r,
                                                ascr_errbuf *err);

/** Called by ascr_visc_solver_solve after every Newton step of every run it makes (ctx
 *  borrowed; fn NULL to stop). */
typedef void (*ascr_visc_trace_fn)(void *ctx, const ascr_visc_step *step);
ASCR_EXPORT void ascr_visc_solver_set_trace(ascr_visc_solver *v, ascr_visc_trace_fn fn, void *ctx);

/** Free; NULL is a no-op. */
ASCR_EXPORT void ascr_visc_solver_free(ascr_visc_solver *v);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_VISC_H */
