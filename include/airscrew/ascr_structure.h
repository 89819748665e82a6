/* include/airscrew/ascr_structure.h
 * Blade structure: the section properties of a solid blade section.
 *
 * Method (docs/theory/structure.md): the section's contour (chord-normalised coordinates,
 * the trailing-edge gap closed by a straight line) scaled by the chord is a simple polygon; its
 * area, centroid and second moments follow exactly from Green's theorem over the polygon's
 * edges (e.g. Steger, "On the calculation of arbitrary moments of polygons", TU Munich
 * FGBV-96-05, 1996; from memory). The torsion constant of a solid section is Saint-Venant's
 * approximation J = A^4 / (4 pi^2 Ip), Ip the polar second moment about the centroid (Timoshenko
 * & Goodier, Theory of Elasticity, 3rd ed. 1970, ch. 10; from memory): exact for the ellipse,
 * within about 10 % for compact and thin solid sections (8.1 % high for the square, 3.6 % low
 * for a 10:1 rectangle: tests/structure/test_section_props.c).
 *
 * Axes: x along the chord from the leading edge towards the trailing edge, y normal to it
 * (upper surface positive). Thread safety: reentrant.
 */
#ifndef ASCR_STRUCTURE_H
#define ASCR_STRUCTURE_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_geom.h"

#ifdef __cplusplus
extern "C" {
#endif

/** Properties of a solid section (SI units: m, m^2, m^4). */
typedef struct ascr_section_props {
  double area;                /* A */
  double x_c, y_c;            /* centroid */
  double i_xx, i_yy, i_xy;    /* about the centroid: int (y - y_c)^2 dA (bending out of the chord
                                 plane), int (x - x_c)^2 dA (bending in it), int (x - x_c)(y - y_c) dA */
  double i_1, i_2;            /* principal second moments, i_1 >= i_2 */
  double principal_deg;       /* angle from the x axis to the axis of i_1, degrees (-90 .. 90] */
  double j_torsion;           /* torsion constant, A^4 / (4 pi^2 (i_xx + i_yy)) */
} ascr_section_props;

/** Properties of the polygon (x[i], y[i]), i < n (n >= 3, closed from the last vertex back to
 *  the first; either orientation), every coordinate multiplied by scale (> 0).
 *  @return ASCR_OK; ASCR_EINVAL (bad arguments); ASCR_EGEOM (no area). */
ASCR_EXPORT ascr_status ascr_section_props_polygon(const double *x, const double *y, size_t n,
                                                   double scale, ascr_section_props *out,
                                                   ascr_errbuf *err);

/** Properties of a section (its contour as read or generated) at chord chord_m.
 *  @return as ascr_section_props_polygon. */
ASCR_EXPORT ascr_status ascr_section_props_of(const ascr_geom_section *s, double chord_m,
                                              ascr_section_props *out, ascr_errbuf *err);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_STRUCTURE_H */
