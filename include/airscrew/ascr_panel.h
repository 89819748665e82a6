/* include/airscrew/ascr_panel.h
 * Inviscid section analysis: linear-vorticity surface panels in a stream-function
 * formulation with a Kutta condition and a source/vortex panel across a finite trailing-edge
 * gap (Katz & Plotkin 2001, ch. 11; Drela 1989). The influence matrix is built and LU-factored
 * once per geometry (ascr_panel_solver_set); the solutions for a free stream at 0 and 90 deg
 * are kept and superposed for any angle of attack (ascr_panel_solver_solve).
 *
 * Sign conventions: nodes run counter-clockwise (upper trailing edge, over the upper surface,
 * leading edge, lower surface, lower trailing edge). gamma is the vortex-sheet strength,
 * positive clockwise; with the body interior at rest the surface velocity is gamma along the
 * upper surface toward the trailing edge, and the signed surface speed q_i = gamma_i.
 * cm is taken about (0.25, 0), positive nose up. Angles in radians unless named _deg.
 *
 * Thread safety: a solver object is written by _set only; _solve reads it and may be called
 * from several threads at once with separate output arrays.
 */
#ifndef ASCR_PANEL_H
#define ASCR_PANEL_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_geom.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct ascr_panel_solver ascr_panel_solver;

/** Trailing-edge gaps below this fraction of the total arc length, or below 5 % of the mean
 *  length of the two trailing-edge panels, are treated as sharp. */
#define ASCR_PANEL_SHARP_TE_GAP 1e-6

/** Allocate a solver for sections of exactly n_nodes nodes (n_nodes >= 8).
 *  Returns NULL on allocation failure or bad size. Free with ascr_panel_solver_free(). */
ASCR_EXPORT ascr_panel_solver *ascr_panel_solver_alloc(size_t n_nodes);

/** Build the influence matrix for a section, factor it (LAPACKE dgetrf) and compute the two
 *  unit solutions. The section is read, not kept (copied node coordinates).
 *  @return ASCR_OK; ASCR_EINVAL if the node count differs from the allocation;
 *          ASCR_ESING if the matrix is singular (message names the size). */
ASCR_EXPORT ascr_status ascr_panel_solver_set(ascr_panel_solver *w, const ascr_geom_section *s,
                                              ascr_errbuf *err);

/** Integrated results at one condition. */
typedef struct ascr_panel_result {
  double alpha_rad;   /* angle of attack, rad */
  double mach;        /* free-stream Mach number used for the correction (0 = incompressible) */
  double cl;          /* lift coefficient from pressure integration */
  double cl_circ;     /* lift coefficient from the circulation, 2 Gamma / (V c), Prandtl-Glauert scaled */
  double cm;          /* pitching moment about (0.25, 0), positive nose up */
  double cd_p;        /* pressure-integrated drag (zero in exact potential flow; a discretisation check) */
  double gamma_total; /* circulation Gamma / (V c), incompressible */
  double cp_min;      /* lowest nodal Cp (after the Mach correction) */
  double cp_critical; /* Cp at which the local flow reaches Mach 1 (-inf for mach = 0) */
} ascr_panel_result;

/** Solve at angle alpha_rad and Mach number mach (0 <= mach < 1; Karman-Tsien correction of
 *  Cp, see ascr_panel_karman_tsien()). cp and q may be NULL; otherwise arrays of n_nodes that
 *  receive nodal pressure coefficient and signed surface speed q/V (copied out).
 *  @return ASCR_OK, ASCR_EINVAL (solver not set), ASCR_EDOM (mach outside [0,1) or the local
 *          flow beyond the correction's validity, i.e. a Cp below the vacuum limit). */
ASCR_EXPORT ascr_status ascr_panel_solver_solve(const ascr_panel_solver *w, double alpha_rad,
                                                double mach, ascr_panel_result *r, double *cp,
                                                double *q, ascr_errbuf *err);

/** Karman-Tsien compressibility correction of an incompressible pressure coefficient:
 *  Cp = Cp0 / (beta + M^2/(1+beta) * Cp0/2), beta = sqrt(1-M^2) (von Karman 1941, J. Aero.
 *  Sci. 8(9); Tsien 1939, J. Aero. Sci. 6(10)). */
ASCR_EXPORT double ascr_panel_karman_tsien(double cp0, double mach);

/** Nodes the solver was allocated for. */
ASCR_EXPORT size_t ascr_panel_solver_size(const ascr_panel_solver *w);
/** 1 if the trailing edge was treated as sharp (owned flag). */
ASCR_EXPORT int ascr_panel_solver_sharp_te(const ascr_panel_solver *w);
/** Node coordinates copied at _set (owned by the object). */
ASCR_EXPORT const double *ascr_panel_solver_x(const ascr_panel_solver *w);
ASCR_EXPORT const double *ascr_panel_solver_y(const ascr_panel_solver *w);

/** Free; NULL is a no-op. */
ASCR_EXPORT void ascr_panel_solver_free(ascr_panel_solver *w);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_PANEL_H */
