/* src/geom/plate.c
 * Thin cambered plate: the typical section of a printed or moulded micro-propeller.
 *
 * Construction (designed here; docs/theory/geometry.md). Camber line: the two-parabola
 * NACA 4-digit form (Abbott & von Doenhoff 1959, eq. 6.4) with maximum camber f at x = xf.
 * Half-thickness h(x), with t the plate thickness, a = nose_length * t the nose length,
 * L = taper_length and t_te the trailing-edge thickness:
 *   nose   0 <= x < a        h = (t/2) sqrt(1 - (1 - x/a)^2)          (elliptic nose)
 *   flat   a <= x < 1 - L    h = t/2
 *   taper  1 - L <= x <= 1   h = t_te/2 + (t/2 - t_te/2)(1 - u^2), u = (x - 1 + L)/L
 * The nose joins the flat with zero slope; the taper leaves the flat with zero slope and
 * reaches the trailing edge at a finite wedge angle 2 atan((t - t_te)/L). The leading-edge
 * radius is (t/2)^2 / a = t / (4 nose_length). The thickness is laid normal to the camber
 * line as in the NACA sections.
 */
#include "geom/geom_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>

ascr_geom_plate_params ascr_geom_plate_defaults(void)
{
  ascr_geom_plate_params p = {0.03, 0.04, 0.5, 1.0, 0.2, 0.0};
  return p;
}

ascr_status ascr_geom_plate(const ascr_geom_plate_params *p, size_t n_side,
                            ascr_geom_section **out, ascr_errbuf *err)
{
  if (out == NULL || p == NULL) {
    return core_fail(err, ASCR_EINVAL, "plate: NULL argument");
  }
  *out = NULL;
  if (n_side < 8 || n_side > 100000) {
    return core_fail(err, ASCR_EINVAL, "plate: %zu points per side (8 .. 100000 allowed)", n_side);
  }
#define PLATE_RANGE(v, lo, hi, what)                                                          \
  if (!(v >= lo && v <= hi)) {                                                                \
    return core_fail(err, ASCR_EDOM, "plate: %s = %g is outside %g .. %g", what, v, lo, hi); \
  }
  PLATE_RANGE(p->thickness, 0.002, 0.2, "thickness t/c")
  PLATE_RANGE(p->camber, 0.0, 0.15, "camber f/c")
  PLATE_RANGE(p->camber_pos, 0.1, 0.9, "camber position x/c")
  PLATE_RANGE(p->nose_length, 0.5, 5.0, "nose length (in thicknesses)")
  PLATE_RANGE(p->taper_length, 0.0, 0.6, "taper length x/c")
  PLATE_RANGE(p->te_thickness, 0.0, p->thickness, "trailing-edge thickness t/c")
#undef PLATE_RANGE
  double t = p->thickness, a = p->nose_length * t, L = p->taper_length, tte = p->te_thickness;
  if (a + L >= 1.0) {
    return core_fail(err, ASCR_EDOM, "plate: nose (%g) and taper (%g) overlap", a, L);
  }
  if (L == 0.0 && tte < t) {
    return core_fail(err, ASCR_EDOM,
                     "plate: a trailing edge thinner than the plate needs a taper length above 0");
  }
  geom_profile pr;
  ascr_status st = geom_profile_alloc(&pr, n_side, err);
  if (st != ASCR_OK) {
    return st;
  }
  for (size_t i = 0; i < n_side; i++) {
    double x = pr.xs[i];
    geom_camber_two_parabola(p->camber, p->camber_pos, x, &pr.yc[i], &pr.dyc[i]);
    double h;
    if (x < a) {
      double u = 1.0 - x / a;
      h = 0.5 * t * sqrt(fmax(0.0, 1.0 - u * u));
    } else if (x <= 1.0 - L || L == 0.0) {
      h = 0.5 * t;
    } else {
      double u = (x - 1.0 + L) / L;
      h = 0.5 * tte + 0.5 * (t - tte) * (1.0 - u * u);
    }
    pr.yt[i] = h;
  }
  char name[96];
  snprintf(name, sizeof name, "plate t=%.3g%% f=%.3g%% at %.3g%%", 100.0 * t,
           100.0 * p->camber, 100.0 * p->camber_pos);
  st = geom_from_profile(&pr, name, out, err);
  geom_profile_free(&pr);
  return st;
}
