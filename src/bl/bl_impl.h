/* src/bl/bl_impl.h
 * Private definitions of the boundary-layer stage: closure relations of the two-equation
 * integral method, the e^N envelope amplification rate, and the interval residuals used by the
 * marching solver (march.c) and, later, by the coupled viscous solver.
 *
 * Notation (Drela & Giles 1987): theta momentum thickness, dstar displacement thickness,
 * H = dstar/theta, Hk kinematic shape parameter (Whitfield), Hs = H* kinetic-energy shape
 * parameter, Re_theta = Re ue theta, Cf skin friction, CD dissipation coefficient, Ctau max
 * shear-stress coefficient, N amplification exponent. Lengths in chord, speeds in free-stream
 * units, Re = V c / nu.
 */
#ifndef ASCR_BL_IMPL_H
#define ASCR_BL_IMPL_H

#include "airscrew/ascr_bl.h"

/* Closure values at one station. */
typedef struct bl_closure {
  double hk;      /* kinematic shape parameter */
  double hs;      /* H* = theta_KE / theta (kinetic-energy shape parameter) */
  double cf;      /* skin-friction coefficient tau_w / (1/2 rho ue^2) */
  double cd;      /* dissipation coefficient D / (rho ue^3) */
  double ctau_eq; /* equilibrium Ctau (turbulent only) */
  double us;      /* normalised wall slip velocity (turbulent only) */
  double delta;   /* boundary-layer thickness estimate (turbulent only), chord */
} bl_closure;

/* Whitfield's kinematic shape parameter from H and the edge Mach number. */
double bl_hk(double h, double me);

/* Laminar closures at Hk, Re_theta (Falkner-Skan fits, Drela & Giles 1987). */
void bl_closure_laminar(double h, double rth, double me, bl_closure *c);

/* Least momentum-thickness Reynolds number of a turbulent layer: Preston (J. Fluid Mech. 3,
 * 1958; about 320, value from memory of the paper) found no turbulent boundary layer below it.
 * The turbulent fits are evaluated at Re_theta held above it by a smooth maximum of width
 * BL_TURB_RTH_WIDTH: min + (d + sqrt(d^2 + width^2))/2, d = Re_theta - min, which passes
 * Re_theta well above the floor (within 1 % from min + 3 width), gives min + width/2 at the
 * floor, and has a continuous derivative for the Newton iteration (width 0: a plain maximum).
 * The width is a numerical smoothing, not a physical constant; measured on the robustness grid
 * (2026-12-04): 60 holds 1101 of 1125 points, a plain maximum 1098, 120 1094
 * (docs/theory/viscous.md). The coupled solver may start from a lower floor and continue to
 * this one (visc/solver.c). */
#define BL_TURB_RTH_MIN 320.0
#define BL_TURB_RTH_WIDTH 60.0

/* Coles' law of the wake (J. Fluid Mech. 1(2), 1956): the defect integral of his profile gives
 * dstar / delta = (1 + Pi) u_tau / (kappa U), with Pi = 0.55 for the flat plate at high Reynolds
 * numbers and kappa = 0.41 (values from memory of the paper). bl_lag_rate takes the smaller of
 * this thickness and the entrainment fit's (below). */
#define BL_COLES_PI 0.55
#define BL_COLES_KAPPA 0.41

/* How the turbulent fits are evaluated: Re_theta held above rth_min (smooth maximum of width
 * rth_width), and the weight of Coles' bound on the lag thickness (1 normally; 0 leaves it out,
 * the fits as they were before it, for a start's path in visc/solver.c). */
typedef struct bl_turb_fit {
  double rth_min, rth_width;
  double coles;
} bl_turb_fit;

/* The fits as published (Preston's floor, its smoothing width, Coles' bound in full): the one
 * place the defaults are written. */
static inline bl_turb_fit bl_turb_fit_published(void)
{
  bl_turb_fit f = {BL_TURB_RTH_MIN, BL_TURB_RTH_WIDTH, 1.0};
  return f;
}

/* Turbulent closures at H, Re_theta, Ctau (Drela & Giles 1987; Swafford 1983 for Cf), with
 * Re_theta held above the floor fl (normally BL_TURB_RTH_MIN, BL_TURB_RTH_WIDTH).
 * wake = 1 sets Cf = 0 and doubles the outer-layer dissipation scale as for a free shear layer. */
void bl_closure_turbulent(double h, double rth, double me, double ctau, int wake, bl_turb_fit fl,
                          bl_closure *c);
/* Its dissipation CD = (Cf/2) Us + Ctau (1 - Us) (doubled in a wake), the one part that depends
 * on Ctau. */
double bl_closure_turbulent_cd(double cf, double us, double ctau, int wake);

/* Lag equation of the turbulent layer (Green, Weeks & Brooman 1977, ARC R&M 3791, in the form of
 * Drela & Giles 1987): d sqrt(Ctau)/dxi = K sqrt(Ctau) (sqrt(Ctau_EQ) - lambda sqrt(Ctau)) / delta
 * with K = 2.8 and delta = theta (3.15 + 1.72/(Hk - 1)) + dstar (closure_turbulent.c), in a wall
 * layer at most Coles' kappa dstar / ((1 + Pi) sqrt(Cf/2)) divided by the weight coles (> 0); in
 * a wake (wake = 1) K is doubled, the wake's dissipation length being half the wall layer's.
 * lambda = bl_curvature_lambda(theta, H, Hk, kappa) on a wall of curvature kappa (1/chord,
 * convex > 0; 0 for a flat wall and in the wake). One place for the march and the coupled
 * residuals. sc = sqrt(Ctau); lengths in chord. */
double bl_lag_rate(double theta, double h, double hk, double sc, double ctau_eq, double cf,
                   int wake, double coles, double kappa);

/* The ratio lambda = L0/L of the flat-wall dissipation length to the curved wall's (Bradshaw
 * 1969, 1973; in the lag equation as Green, Weeks & Brooman 1977): 1 + 7 Ri on a convex wall,
 * 1/(1 - 4.5 Ri) on a concave one, Ri = (2/3)(theta kappa)(H1 + H)(H1/H + 0.3), H1 = 3.15 +
 * 1.72/(Hk - 1). Exactly 1 at kappa = 0. closure_turbulent.c gives the sources. */
double bl_curvature_lambda(double theta, double h, double hk, double kappa);

/* Envelope amplification rate dN/dxi (1/chord) at Hk, theta, Re_theta (Drela & Giles 1987). */
double bl_amplification_rate(double hk, double theta, double rth);

/* Ctau at the start of turbulent flow from the laminar state at transition. */
double bl_ctau_initial(double hk, double ctau_eq);

/* Similarity (Falkner-Skan) start: laminar state at xi for ue = C xi^m, closures included.
 * Returns 0, or -1 if no shape parameter in [1.8, 3.9] satisfies the equations. In two parts:
 * the shape parameter H and f = Re_theta Cf/2 of the similar layer, which depend on m alone
 * (bl_similarity_shape; a caller that needs them often keeps them), and theta at xi from them
 * (bl_similarity_theta). */
int bl_similarity_start(double m, double re, double ue, double xi, double *theta, double *h);
int bl_similarity_shape(double m, double *h, double *f);
double bl_similarity_theta(double m, double h, double f, double re, double ue, double xi);

/* Integral of f over [xa, xb] from its end values. With xa > 0 the trapezoidal rule is taken
 * in ln(xi): 0.5 (fa xa + fb xb) ln(xb/xa), exact for f ~ 1/xi, which is how the source terms of
 * every Falkner-Skan layer vary (theta ~ xi^((1-m)/2), Cf ~ 1/(ue theta)); it keeps the first
 * intervals next to a stagnation point, where ue changes by a factor of ten, accurate. With
 * xa <= 0 (wake from the trailing edge) the ordinary trapezoidal rule. */
double bl_interval_integral(double fa, double fb, double xa, double xb);
/* The same in two parts, for callers that integrate several quantities over one interval:
 * ln(xb/xa) where the rule in ln xi applies (NaN elsewhere), and the integral given it. */
double bl_interval_log(double xa, double xb);
double bl_interval_integral_lx(double fa, double fb, double xa, double xb, double lx);

/* Laminar march from a given state (theta0, h0, N0 at s[0]) over stations s[1..n-1] with edge
 * velocities ue[0..n-1]. Stops at the first station where N reaches ncrit, where Hk passes
 * the laminar separation limit, or where Newton fails. Fills theta, h, nn for the stations
 * reached (index 0 = the start). Returns the index of the stopping station (n if it ran
 * through); *why: 0 ran through, 1 N_crit reached, 2 separation or failure. */
size_t bl_march_laminar_from(double theta0, double h0, double n0, const double *s,
                             const double *ue, size_t n, double re, double mach, double ncrit,
                             double *theta, double *h, double *nn, int *why);

#endif
