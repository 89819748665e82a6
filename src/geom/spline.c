/* src/geom/spline.c
 * Parametric cubic spline of a contour, x(s) and y(s), with s the cumulative chord length
 * between nodes (an approximation of arc length that converges with node density).
 * Natural end conditions (GSL gsl_interp_cspline). Curvature
 * kappa = (x' y'' - y' x'') / (x'^2 + y'^2)^(3/2).
 */
#include "geom/geom_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>

ascr_status geom_spline_init(geom_spline *sp, const double *x, const double *y, size_t n,
                             ascr_errbuf *err)
{
  sp->n = n;
  sp->s = NULL;
  sp->sx = sp->sy = NULL;
  sp->ax = sp->ay = NULL;
  if (n < 3) {
    return core_fail(err, ASCR_EGEOM, "spline: %zu nodes (need at least 3)", n);
  }
  sp->s = core_calloc(n, sizeof(double));
  if (sp->s == NULL) {
    return core_fail(err, ASCR_ENOMEM, "spline: out of memory");
  }
  sp->s[0] = 0.0;
  for (size_t i = 1; i < n; i++) {
    double ds = hypot(x[i] - x[i - 1], y[i] - y[i - 1]);
    if (!(ds > 0.0) || !isfinite(ds) || !(sp->s[i - 1] + ds > sp->s[i - 1])) {
      /* coincident, or so close that the arc length cannot tell them apart: GSL would abort */
      geom_spline_free(sp);
      return core_fail(err, ASCR_EGEOM, "spline: nodes %zu and %zu coincide to working precision",
                       i - 1, i);
    }
    sp->s[i] = sp->s[i - 1] + ds;
  }
  sp->length = sp->s[n - 1];
  sp->sx = gsl_spline_alloc(gsl_interp_cspline, n);
  sp->sy = gsl_spline_alloc(gsl_interp_cspline, n);
  sp->ax = gsl_interp_accel_alloc();
  sp->ay = gsl_interp_accel_alloc();
  if (sp->sx == NULL || sp->sy == NULL || sp->ax == NULL || sp->ay == NULL) {
    geom_spline_free(sp);
    return core_fail(err, ASCR_ENOMEM, "spline: out of memory");
  }
  if (gsl_spline_init(sp->sx, sp->s, x, n) != 0 || gsl_spline_init(sp->sy, sp->s, y, n) != 0) {
    geom_spline_free(sp);
    return core_fail(err, ASCR_EGEOM, "spline: construction failed for %zu nodes", n);
  }
  return ASCR_OK;
}

void geom_spline_eval(geom_spline *sp, double s, double *x, double *y, double *dx, double *dy,
                      double *ddx, double *ddy)
{
  if (s < 0.0) s = 0.0;
  if (s > sp->length) s = sp->length;
  if (x) *x = gsl_spline_eval(sp->sx, s, sp->ax);
  if (y) *y = gsl_spline_eval(sp->sy, s, sp->ay);
  if (dx) *dx = gsl_spline_eval_deriv(sp->sx, s, sp->ax);
  if (dy) *dy = gsl_spline_eval_deriv(sp->sy, s, sp->ay);
  if (ddx) *ddx = gsl_spline_eval_deriv2(sp->sx, s, sp->ax);
  if (ddy) *ddy = gsl_spline_eval_deriv2(sp->sy, s, sp->ay);
}

double geom_spline_curvature(geom_spline *sp, double s)
{
  double dx, dy, ddx, ddy;
  geom_spline_eval(sp, s, NULL, NULL, &dx, &dy, &ddx, &ddy);
  double q = dx * dx + dy * dy;
  if (!(q > 0.0)) return 0.0;
  return (dx * ddy - dy * ddx) / (q * sqrt(q));
}

void geom_spline_free(geom_spline *sp)
{
  if (sp == NULL) return;
  gsl_spline_free(sp->sx);
  gsl_spline_free(sp->sy);
  gsl_interp_accel_free(sp->ax);
  gsl_interp_accel_free(sp->ay);
  free(sp->s);
  sp->s = NULL;
  sp->sx = sp->sy = NULL;
  sp->ax = sp->ay = NULL;
}

void geom_cosine_stations(double *xs, size_t n)
{
  for (size_t i = 0; i < n; i++) {
    xs[i] = 0.5 * (1.0 - cos(ASCR_PI * (double)i / (double)(n - 1)));
  }
  xs[0] = 0.0;
  xs[n - 1] = 1.0;
}
