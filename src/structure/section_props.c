/* src/structure/section_props.c
 * Area, centroid, second moments and torsion constant of a solid section (include/airscrew/
 * ascr_structure.h; docs/theory/structure.md).
 *
 * Green's theorem turns each area integral into a sum over the polygon's edges; with
 * c_i = x_i y_{i+1} - x_{i+1} y_i:
 *   A      = 1/2  sum c_i
 *   int x  = 1/6  sum (x_i + x_{i+1}) c_i,           int y likewise
 *   int y^2 = 1/12 sum (y_i^2 + y_i y_{i+1} + y_{i+1}^2) c_i,   int x^2 likewise
 *   int xy = 1/24 sum (x_i y_{i+1} + 2 x_i y_i + 2 x_{i+1} y_{i+1} + x_{i+1} y_i) c_i
 * evaluated about the vertices' mean (so that the parallel-axis step to the centroid subtracts
 * small numbers) and signed by the orientation.
 */
#include "core/core_impl.h"
#include "airscrew/ascr_structure.h"

#include <math.h>
#include <string.h>

ascr_status ascr_section_props_polygon(const double *x, const double *y, size_t n, double scale,
                                       ascr_section_props *out, ascr_errbuf *err)
{
  if (x == NULL || y == NULL || out == NULL || n < 3 || !(scale > 0.0) || !isfinite(scale)) {
    return core_fail(err, ASCR_EINVAL, "section properties: at least 3 vertices and a chord > 0");
  }
  double mx = 0.0, my = 0.0;
  for (size_t i = 0; i < n; i++) {
    if (!isfinite(x[i]) || !isfinite(y[i])) {
      return core_fail(err, ASCR_EINVAL, "section properties: vertex %zu is not finite", i);
    }
    mx += x[i];
    my += y[i];
  }
  mx /= (double)n;
  my /= (double)n;
  double a = 0.0, sx = 0.0, sy = 0.0, ixx = 0.0, iyy = 0.0, ixy = 0.0;
  for (size_t i = 0; i < n; i++) {
    size_t j = i + 1 < n ? i + 1 : 0;
    double x0 = x[i] - mx, y0 = y[i] - my, x1 = x[j] - mx, y1 = y[j] - my;
    double c = x0 * y1 - x1 * y0;
    a += c;
    sx += (x0 + x1) * c;
    sy += (y0 + y1) * c;
    ixx += (y0 * y0 + y0 * y1 + y1 * y1) * c;
    iyy += (x0 * x0 + x0 * x1 + x1 * x1) * c;
    ixy += (x0 * y1 + 2.0 * x0 * y0 + 2.0 * x1 * y1 + x1 * y0) * c;
  }
  a *= 0.5;
  if (!(fabs(a) > 0.0)) {
    return core_fail(err, ASCR_EGEOM, "section properties: the contour encloses no area");
  }
  double sg = a > 0.0 ? 1.0 : -1.0; /* clockwise: every integral changes sign */
  a *= sg;
  sx *= sg / 6.0;
  sy *= sg / 6.0;
  ixx *= sg / 12.0;
  iyy *= sg / 12.0;
  ixy *= sg / 24.0;
  double xc = sx / a, yc = sy / a;
  double s2 = scale * scale, s4 = s2 * s2;
  memset(out, 0, sizeof *out);
  out->area = a * s2;
  out->x_c = (xc + mx) * scale;
  out->y_c = (yc + my) * scale;
  out->i_xx = (ixx - a * yc * yc) * s4;
  out->i_yy = (iyy - a * xc * xc) * s4;
  out->i_xy = (ixy - a * xc * yc) * s4;
  double avg = 0.5 * (out->i_xx + out->i_yy), d = 0.5 * (out->i_xx - out->i_yy);
  double r = hypot(d, out->i_xy);
  out->i_1 = avg + r;
  out->i_2 = avg - r;
  /* I(theta) = avg + d cos 2theta - i_xy sin 2theta is largest at 2theta = atan2(-i_xy, d) */
  out->principal_deg = 0.5 * atan2(-out->i_xy, d) * 180.0 / ASCR_PI;
  if (out->principal_deg <= -90.0) out->principal_deg += 180.0;
  double ip = out->i_xx + out->i_yy;
  out->j_torsion = pow(out->area, 4.0) / (4.0 * ASCR_PI * ASCR_PI * ip);
  return ASCR_OK;
}

ascr_status ascr_section_props_of(const ascr_geom_section *s, double chord_m,
                                  ascr_section_props *out, ascr_errbuf *err)
{
  if (s == NULL) return core_fail(err, ASCR_EINVAL, "section properties: no section");
  return ascr_section_props_polygon(ascr_geom_section_x(s), ascr_geom_section_y(s),
                                    ascr_geom_section_size(s), chord_m, out, err);
}
