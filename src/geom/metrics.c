/* src/geom/metrics.c
 * Shape metrics of a normalised section.
 *
 * Method. The contour spline is sampled densely (4000 points per surface). Each surface,
 * walked from the leading edge, gives y_u(x) and y_l(x) by linear interpolation (points that
 * step backward in x near a drooped nose are skipped). On 2000 cosine-spaced chord stations:
 * thickness t(x) = y_u - y_l and camber c(x) = (y_u + y_l)/2, both normal to the chord line;
 * the maxima are refined by a parabola through the three samples around the largest value.
 * Leading-edge radius = 1/|kappa| of the spline at the leading-edge node. Trailing-edge angle:
 * angle between the spline tangents at the two trailing-edge nodes. Area: shoelace formula on
 * the dense sample, the gap closed by a straight line.
 */
#include "geom/geom_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>

#define MET_SAMPLES 4000
#define MET_STATIONS 2000

/* Monotone-in-x copy of a surface sample; returns the count kept. */
static size_t monotone(const double *x, const double *y, size_t n, double *mx, double *my)
{
  size_t k = 0;
  for (size_t i = 0; i < n; i++) {
    if (k == 0 || x[i] > mx[k - 1]) {
      mx[k] = x[i];
      my[k] = y[i];
      k++;
    }
  }
  return k;
}

static double interp(const double *x, const double *y, size_t n, double xq)
{
  if (xq <= x[0]) return y[0];
  if (xq >= x[n - 1]) return y[n - 1];
  size_t lo = 0, hi = n - 1;
  while (hi - lo > 1) {
    size_t mid = (lo + hi) / 2;
    if (x[mid] <= xq) lo = mid;
    else hi = mid;
  }
  double f = (xq - x[lo]) / (x[hi] - x[lo]);
  return y[lo] + f * (y[hi] - y[lo]);
}

/* Parabolic refinement of the extremum at index i of v over stations xs. */
static void refine(const double *xs, const double *v, size_t n, size_t i, double *xm, double *vm)
{
  *xm = xs[i];
  *vm = v[i];
  if (i == 0 || i + 1 >= n) return;
  double x0 = xs[i - 1], x1 = xs[i], x2 = xs[i + 1];
  double y0 = v[i - 1], y1 = v[i], y2 = v[i + 1];
  double d = (x0 - x1) * (x0 - x2) * (x1 - x2);
  if (d == 0.0) return;
  double a = (x2 * (y1 - y0) + x1 * (y0 - y2) + x0 * (y2 - y1)) / d;
  double b = (x2 * x2 * (y0 - y1) + x1 * x1 * (y2 - y0) + x0 * x0 * (y1 - y2)) / d;
  double c = (x1 * x2 * (x1 - x2) * y0 + x2 * x0 * (x2 - x0) * y1 + x0 * x1 * (x0 - x1) * y2) / d;
  if (a == 0.0) return;
  double xv = -b / (2.0 * a);
  if (xv < x0 || xv > x2) return;
  *xm = xv;
  *vm = (a * xv + b) * xv + c;
}

ascr_status ascr_geom_section_metrics(const ascr_geom_section *s, ascr_geom_metrics *m,
                                      ascr_errbuf *err)
{
  if (s == NULL || m == NULL) {
    return core_fail(err, ASCR_EINVAL, "metrics: NULL argument");
  }
  geom_spline sp;
  ascr_status st = geom_spline_init(&sp, s->x, s->y, s->n, err);
  if (st != ASCR_OK) return st;
  const size_t N = MET_SAMPLES;
  double *ux = core_calloc(N, sizeof(double)), *uy = core_calloc(N, sizeof(double));
  double *lx = core_calloc(N, sizeof(double)), *ly = core_calloc(N, sizeof(double));
  double *mux = core_calloc(N, sizeof(double)), *muy = core_calloc(N, sizeof(double));
  double *mlx = core_calloc(N, sizeof(double)), *mly = core_calloc(N, sizeof(double));
  double *xs = core_calloc(MET_STATIONS, sizeof(double));
  double *th = core_calloc(MET_STATIONS, sizeof(double));
  double *ca = core_calloc(MET_STATIONS, sizeof(double));
  if (!ux || !uy || !lx || !ly || !mux || !muy || !mlx || !mly || !xs || !th || !ca) {
    st = core_fail(err, ASCR_ENOMEM, "metrics %s: out of memory", s->name);
    goto done;
  }
  const double sle = sp.s[s->i_le], S = sp.length;
  double area2 = 0.0, px = 0.0, py = 0.0;
  for (size_t i = 0; i < N; i++) {
    double f = (double)i / (double)(N - 1);
    geom_spline_eval(&sp, sle * (1.0 - f), &ux[i], &uy[i], NULL, NULL, NULL, NULL);
    geom_spline_eval(&sp, sle + (S - sle) * f, &lx[i], &ly[i], NULL, NULL, NULL, NULL);
  }
  /* area over the whole contour: upper TE -> LE (reverse of ux), LE -> lower TE */
  for (size_t k = 0; k < 2 * N; k++) {
    double x, y;
    if (k < N) {
      x = ux[N - 1 - k];
      y = uy[N - 1 - k];
    } else {
      x = lx[k - N];
      y = ly[k - N];
    }
    if (k > 0) area2 += px * y - x * py;
    px = x;
    py = y;
  }
  area2 += px * uy[N - 1] - ux[N - 1] * py;
  size_t nu = monotone(ux, uy, N, mux, muy);
  size_t nl = monotone(lx, ly, N, mlx, mly);
  if (nu < 3 || nl < 3) {
    st = core_fail(err, ASCR_EGEOM, "metrics %s: cannot separate upper and lower surfaces",
                   s->name);
    goto done;
  }
  geom_cosine_stations(xs, MET_STATIONS);
  size_t it = 0, ic = 0;
  for (size_t i = 0; i < MET_STATIONS; i++) {
    double yu = interp(mux, muy, nu, xs[i]), yl = interp(mlx, mly, nl, xs[i]);
    th[i] = yu - yl;
    ca[i] = 0.5 * (yu + yl);
    if (th[i] > th[it]) it = i;
    if (fabs(ca[i]) > fabs(ca[ic])) ic = i;
  }
  refine(xs, th, MET_STATIONS, it, &m->thickness_x, &m->thickness);
  refine(xs, ca, MET_STATIONS, ic, &m->camber_x, &m->camber);
  if (fabs(m->camber) < 1e-9) {
    /* symmetric section: no camber, and its position means nothing */
    m->camber = 0.0;
    m->camber_x = 0.0;
  }
  double kle = geom_spline_curvature(&sp, sle);
  m->le_radius = fabs(kle) > 0.0 ? 1.0 / fabs(kle) : INFINITY;
  m->te_gap = hypot(s->x[0] - s->x[s->n - 1], s->y[0] - s->y[s->n - 1]);
  double dx0, dy0, dx1, dy1;
  geom_spline_eval(&sp, 0.0, NULL, NULL, &dx0, &dy0, NULL, NULL);
  geom_spline_eval(&sp, S, NULL, NULL, &dx1, &dy1, NULL, NULL);
  /* outgoing directions at the trailing edge: upper = -(d/ds at 0), lower = +(d/ds at S) */
  double c = (-dx0 * dx1 - dy0 * dy1) / (hypot(dx0, dy0) * hypot(dx1, dy1));
  c = fmax(-1.0, fmin(1.0, c));
  m->te_angle_deg = acos(c) * 180.0 / ASCR_PI;
  m->area = 0.5 * fabs(area2);
  m->arc_length = S;
done:
  geom_spline_free(&sp);
  free(ux); free(uy); free(lx); free(ly);
  free(mux); free(muy); free(mlx); free(mly);
  free(xs); free(th); free(ca);
  return st;
}
