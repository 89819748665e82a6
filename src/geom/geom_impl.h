/* src/geom/geom_impl.h
 * Private definitions of the geometry stage: the section object, the point-list pipeline
 * shared by the file reader and the generators, and the arc-length spline.
 * Notation: nodes 0..n-1, 0-based, counter-clockwise from the upper trailing edge.
 */
#ifndef ASCR_GEOM_IMPL_H
#define ASCR_GEOM_IMPL_H

#include <stddef.h>
#include <gsl/gsl_spline.h>
#include "airscrew/ascr_geom.h"

struct ascr_geom_section {
  size_t n;        /* node count */
  double *x, *y;   /* node coordinates, chord units, owned */
  size_t i_le;     /* index of the leading-edge node */
  char name[128];  /* display name */
};

/* Allocate a section of n nodes (coordinates zeroed). NULL on failure. */
ascr_geom_section *geom_section_new(size_t n, const char *name);

/* The common pipeline for a raw point list: layout detection, assembly into one
 * counter-clockwise contour, validation and normalisation.
 * line[i] is the 1-based source line of point i (used in messages, prefixed by src).
 * count_split, if nonzero, is the number of points of the first surface given by a count row. */
ascr_status geom_build(const double *x, const double *y, const long *line, size_t n,
                       size_t count_split, const char *src, const char *name,
                       ascr_geom_section **out, ascr_geom_load_info *info, ascr_errbuf *err);

/* Validation of an ordered contour (validate.c). Messages cite src and line[]. */
ascr_status geom_check_repeats(const double *x, const double *y, const long *line, size_t n,
                               double scale, const char *src, ascr_errbuf *err);
ascr_status geom_check_crossing(const double *x, const double *y, const long *line, size_t n,
                                int closed_base, const char *src, ascr_errbuf *err);
ascr_status geom_check_monotone(const double *x, const long *line, size_t n, size_t i_le,
                                const char *src, ascr_errbuf *err);

/* A parametric cubic spline x(s), y(s) through the nodes, s = cumulative chord length. */
typedef struct geom_spline {
  size_t n;
  double *s;             /* node parameters, owned */
  double length;         /* s at the last node */
  gsl_spline *sx, *sy;   /* owned */
  gsl_interp_accel *ax, *ay;
} geom_spline;

ascr_status geom_spline_init(geom_spline *sp, const double *x, const double *y, size_t n,
                             ascr_errbuf *err);
/* Position, first and second derivatives with respect to s at s (any pointer may be NULL). */
void geom_spline_eval(geom_spline *sp, double s, double *x, double *y, double *dx, double *dy,
                      double *ddx, double *ddy);
/* Signed curvature at s. */
double geom_spline_curvature(geom_spline *sp, double s);
void geom_spline_free(geom_spline *sp);

/* Cosine-spaced chord stations 0..1, n of them. */
void geom_cosine_stations(double *xs, size_t n);

/* Camber line and half-thickness of a generated section at m cosine-spaced stations. */
typedef struct geom_profile {
  size_t m;
  double *xs;  /* stations, xs[0] = 0, xs[m-1] = 1 */
  double *yc;  /* camber line */
  double *dyc; /* its slope */
  double *yt;  /* half-thickness, laid normal to the camber line */
} geom_profile;

/* Allocate m stations (cosine spaced) with zeroed camber and thickness; ASCR_ENOMEM on failure. */
ascr_status geom_profile_alloc(geom_profile *p, size_t m, ascr_errbuf *err);
void geom_profile_free(geom_profile *p);
/* Two-parabola mean line of maximum ordinate f at x = xf (Abbott & von Doenhoff eq. 6.4). */
void geom_camber_two_parabola(double f, double xf, double x, double *yc, double *dyc);
/* Assemble the section: thickness normal to the camber line (eq. 6.1). */
ascr_status geom_from_profile(const geom_profile *p, const char *name, ascr_geom_section **out,
                              ascr_errbuf *err);

#endif
