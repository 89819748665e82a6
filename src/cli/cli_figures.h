/* src/cli/cli_figures.h
 * The standard figures of the CLI, drawn from plain arrays (so that an analysis command and the
 * plot command, which reads a saved JSON result, draw the same pictures).
 */
#ifndef ASCR_CLI_FIGURES_H
#define ASCR_CLI_FIGURES_H

#include <stddef.h>

#include "cli_plot.h"

/* one polar: NaN where a point did not converge */
typedef struct fig_polar {
  char label[96];
  size_t n;
  double *alpha, *cl, *cd, *cm;
  /* optional band (all NULL: none), e.g. over an N_crit range: the least and largest cl, cd,
   * cm and cl/cd at each angle, NaN where undetermined; drawn shaded under the curve */
  double *cl_lo, *cl_hi, *cd_lo, *cd_hi, *cm_lo, *cm_hi, *ld_lo, *ld_hi;
} fig_polar;

/* The Reynolds-number study of one section (one series per Mach number, nre Reynolds numbers
 * each; NaN where a figure is undetermined): DIR/polar-re.svg and .png, six panels against Re
 * on a decade axis: smallest cd, largest L/D, cl_max, zero-lift angle, lift slope, and the
 * upper-surface laminar separation and reattachment at bubble_cl. */
typedef struct fig_re_series {
  char label[48];
  size_t n;
  const double *re, *cd_min, *ld_max, *cl_max, *alpha0, *slope, *x_sep, *x_re;
} fig_re_series;
/* Point f at b, 8 n values in the order re, cd_min, ld_max, cl_max, alpha0, slope, x_sep, x_re
 * (n each), labelled by the Mach number. */
void fig_re_series_bind(fig_re_series *f, double mach, size_t n, double *b);
int fig_re_study(const char *dir, const char *section, double bubble_cl, const fig_re_series *s,
                 size_t ns);

/* Polars of one section: DIR/polar.svg and .png (cl-alpha, drag polar, cm-alpha, L/D). */
int fig_polars(const char *dir, const char *section, const fig_polar *p, size_t np);

/* The same figure at BASE.svg and BASE.png with the first panel titled title. */
int fig_polar_set(const char *base, const char *title, const fig_polar *p, size_t np);

/* Scratch of fig_polar_panels for np polars: sr 8 np series, ld np arrays of each polar's
 * length (17 times it for a polar with a band: the band outlines follow), label np legend
 * texts. */
typedef struct fig_polar_work {
  plot_series *sr;
  double **ld;
  char (*label)[128];
} fig_polar_work;

/* The four panels of a polar figure (fig_polar_panels.c): lift against angle (legend), the drag
 * polar (cd across, cl up), cm against angle, L/D against angle; a polar without a converged
 * point is named "...: no converged points" in the legend. pan points into w. */
void fig_polar_panels(const char *title, const fig_polar *p, size_t np, fig_polar_work *w,
                      plot_panel pan[4]);

/* one rotor operating point (numbers NaN where not converged); stations optional */
typedef struct fig_rotor_point {
  double rpm, speed, J, CT, CP, eta, thrust, power;
  double thrust_band[2], power_band[2]; /* N_crit band [min, max]; NaN where there is none */
  double re_075;                        /* chord Re at 0.75 R (NaN: unknown) */
  size_t ns;
  double *r_over_R, *dT_dr; /* ns entries or NULL */
} fig_rotor_point;

/* Rotor results: DIR/rotor.svg and .png (CT, CP, efficiency against J by rpm; thrust and power
 * against rpm by speed, each with its N_crit band shaded where the points carry one; where the
 * points hold fixed advance ratios at two or more rpm, also CT and CP against Re at 0.75 R by
 * J) and, when stations are given, DIR/rotor-spanwise.svg/.png (dT/dr of up to eight
 * points). */
int fig_rotor(const char *dir, const char *blade, const fig_rotor_point *p, size_t np);

/* Candidates compared: DIR/compare-rotor.svg and .png: CT, CP and efficiency against J (each
 * candidate at the rpm it has most points at) and static thrust and shaft power against rpm,
 * one line per candidate (names[k], p[k] with np[k] points). */
int fig_rotor_compare(const char *dir, const char *const *names, const fig_rotor_point *const *p,
                      const size_t *np, size_t nc);

/* The Campbell diagram of a blade: flap, lag and torsion frequencies against rpm (n entries of
 * m, ascending rpm; modes entirely above 1.5 times the highest order's top frequency left out)
 * with the engine orders 1P .. max_order P as straight lines:
 * DIR/structure.svg and .png. */
struct ascr_blade_modes;
int fig_campbell(const char *dir, const char *blade, const struct ascr_blade_modes *m, size_t n,
                 int max_order);

/* Throttle maps of a powertrain (ascr_drive_linearity_at, one per airspeed): thrust with its
 * best straight line over the usable band, rpm, pack current and electrical power against
 * throttle, one line per airspeed, unconverged points left out: DIR/drive.svg and .png. */
struct ascr_drive_linearity;
int fig_drive(const char *dir, const struct ascr_drive_linearity *lin, size_t ns);

/* One viscous solution: DIR/flow-cp.svg/.png (-Cp over x/c, viscous and inviscid, transition and
 * separated stations marked) and DIR/flow-bl.svg/.png (displacement thickness, shape factor and
 * skin friction along both surfaces and the wake). Stations in the solver's order (side 0
 * upper, 1 lower, 2 wake); the inviscid Cp at the n_inv section nodes. */
int fig_flow(const char *dir, const char *title, size_t ns, const int *side, const double *x,
             const double *cp, const double *dstar, const double *h, const double *cf,
             const int *turb, size_t n_inv, const double *x_inv, const double *cp_inv);

/* Create DIR if needed and refuse to replace DIR/<name>.svg unless force; 0 or an exit code. */
int fig_prepare_dir(const char *dir, const char *const *names, int force);

#endif
