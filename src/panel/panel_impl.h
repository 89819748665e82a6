/* src/panel/panel_impl.h
 * Private helpers of the inviscid panel stage.
 */
#ifndef ASCR_PANEL_IMPL_H
#define ASCR_PANEL_IMPL_H

#include "airscrew/ascr_panel.h"

#include <lapacke.h>

/* The solver object (linvort.c); visible to the viscous stage, which reuses the factored
 * matrix and the node geometry. */
struct ascr_panel_solver {
  size_t n;        /* nodes */
  int is_set;      /* 1 after a successful _set */
  int sharp;       /* 1 if the trailing edge is treated as sharp */
  double *x, *y;   /* node coordinates (owned copies) */
  double *a;       /* LU factors, (n+1)^2 column-major (owned) */
  lapack_int *ipiv;
  double *g0, *g90;/* unit solutions, n+1 each (last entry Psi0) */
  double te_len;   /* trailing-edge panel length */
  double te_sn;    /* b . n_out of the trailing-edge panel */
  double te_tb;    /* b . t_TE */
  double *ptx, *pty, *plen; /* panel unit tangents and lengths, n-1 each (set at _set; read by
                               panel_velocity_coeffs) */
  double *lnr, *rsq;        /* ln r and r^2 from one field node to every node (scratch) */
};


/* Influence integrals of a straight panel from (ax,ay) to (bx,by) at field point (px,py):
 * p0 = int ln r, p1 = int xi ln r, q = int theta (source angle, downstream branch cut);
 * see linvort.c. Any output pointer may be NULL. */
void panel_integrals(double ax, double ay, double bx, double by, double px, double py,
                     double *p0, double *p1, double *q);

/* Pressure coefficient at which the local Mach number is 1, free-stream Mach mach > 0,
 * ratio of specific heats 1.4 (isentropic relations; NACA Report 1135, eq. 45 with M = 1). */
double panel_cp_critical(double mach);

/* Velocity at (px, py) per unit nodal vortex strength: u = sum_j cu[j] gamma_j, v likewise,
 * including the trailing-edge panel's source and vortex (which depend on gamma_0 and
 * gamma_{n-1}). The free stream is not included. cu, cv: n entries each (caller owned). */
void panel_velocity_coeffs(const ascr_panel_solver *w, double px, double py, double *cu,
                           double *cv);

/* Velocity at (px, py) induced by a uniform source of unit strength on the panel from (ax,ay)
 * to (bx,by). On the panel line inside its span the normal component is taken as 0 (the
 * mean of the two sides). */
void panel_source_velocity(double ax, double ay, double bx, double by, double px, double py,
                           double *u, double *v);
/* The same for a panel given by its start (ax, ay), length L and unit tangent (tx, ty) as
 * hypot and division give them (the numbers of panel_source_velocity, without recomputing the
 * frame for every point). */
void panel_source_velocity_frame(double ax, double ay, double L, double tx, double ty, double px,
                                 double py, double *u, double *v);

/* Stream function at (px, py) of a uniform source of unit strength on the panel from (ax,ay)
 * to (bx,by), including the 1/(2 pi). forward_cut = 0 puts the branch cut to the right of the
 * panel (outward for a body panel); forward_cut = 1 puts it along the panel line beyond its
 * end (downstream for a wake panel). Defined up to a constant. */
double panel_source_psi(double ax, double ay, double bx, double by, double px, double py,
                        int forward_cut);
/* The same with the panel's frame given (see panel_source_velocity_frame). */
double panel_source_psi_frame(double ax, double ay, double L, double tx, double ty, double px,
                              double py, int forward_cut);

/* Add the force (fx, fy, body axes) and moment about (0.25, 0) of a panel from a to b with
 * linear Cp from cpa to cpb (outward normal to the right of a -> b). */
void panel_force_accumulate(double xa, double ya, double xb, double yb, double cpa, double cpb,
                            double *fx, double *fy, double *mom);

/* cl, cm, pressure drag from nodal Cp over the closed contour (base panel included). */
void panel_integrate_cp(const ascr_panel_solver *w, const double *cp, double alpha_rad,
                        double *cl, double *cm, double *cdp);

/* Solve A x = rhs with the stored LU factors for nrhs right-hand sides stored column-major
 * with leading dimension n+1 (overwritten with the solutions). 0 on success. */
int panel_lu_solve(const ascr_panel_solver *w, double *rhs, size_t nrhs);

#endif
