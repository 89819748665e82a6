/* tests/support/karman_trefftz.h
 * Exact potential flow about Karman-Trefftz sections (reference for tests and studies).
 */
#ifndef ASCR_KARMAN_TREFFTZ_H
#define ASCR_KARMAN_TREFFTZ_H

#include <stddef.h>

/* Exact potential flow about a Karman-Trefftz section.
 * Circle of radius R about zeta_c = (-mux, muy) through zeta = b = 1; mapping
 * z = n b (1 + r^n)/(1 - r^n), r = (zeta - b)/(zeta + b), n = 2 - tau/pi.
 * The section is translated, rotated and scaled here so that its leading edge (the contour
 * point farthest from the trailing edge z = n b) is at (0,0) and the trailing edge at (1,0). */
typedef struct kt_section {
  double mux, muy, tau;   /* circle offset and trailing-edge angle (rad) */
  double R, theta_te;     /* circle radius, polar angle of the trailing edge on the circle */
  double n;               /* exponent 2 - tau/pi */
  double theta_le;        /* polar angle of the leading edge on the circle */
  double z_le_re, z_le_im;/* leading edge in the mapped plane */
  double chord;           /* |z_te - z_le| */
  double phi;             /* angle of the chord line (LE -> TE) in the mapped plane */
} kt_section;

void kt_init(kt_section *k, double mux, double muy, double tau);
/* Normalised contour point at circle angle theta. */
void kt_point(const kt_section *k, double theta, double *x, double *y);
/* Exact Cp at circle angle theta for angle of attack alpha (rad) relative to the chord. */
double kt_cp(const kt_section *k, double theta, double alpha);
/* Exact lift coefficient (Kutta-Joukowski) for angle alpha relative to the chord. */
double kt_cl(const kt_section *k, double alpha);
/* Circle angle whose normalised contour point is nearest (x, y). */
double kt_theta_of(const kt_section *k, double x, double y);
/* Fill n points (n odd) of the normalised contour, TE -> upper -> LE -> lower -> TE, with the
 * leading edge as the middle point and angles clustered at both edges. */
void kt_contour(const kt_section *k, size_t n, double *x, double *y);

#endif
