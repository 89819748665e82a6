/* src/polar/re_summary.c
 * The figures of a Reynolds-number study, from one swept polar: how the smallest drag, the
 * best lift-to-drag ratio, cl_max, the zero-lift angle, the lift slope and the upper-surface
 * bubble change with Re is how small-section results are compared (the UIUC low-speed airfoil
 * tests present them so, Selig et al.). Definitions (ours; converged points only):
 *   cd_min         the smallest cd of the polar, with the cl and alpha of that point;
 *   ld_max         the largest cl / cd over points with cd > 0, with its cl and alpha (grid
 *                  values: no interpolation between points);
 *   cl_max         the largest cl up to the first point after which cl falls (the first peak
 *                  of the lift curve, so that a second rise in deep stall is not taken);
 *   alpha_0        the first angle, going up, where cl changes sign between two neighbouring
 *                  converged points, interpolated linearly;
 *   lift slope     least-squares slope of cl on alpha over the converged points within
 *                  alpha_0 - 2 deg .. alpha_0 + 4 deg (at least three points; NaN otherwise);
 *   bubble         the upper-surface laminar separation and reattachment x/c at bubble_cl: the
 *                  first pair of neighbouring converged points, going up to cl_max, whose cl
 *                  bracket bubble_cl; each position is interpolated linearly in cl where both
 *                  points have it, else taken from the point nearer in cl. Status 1: a closed
 *                  bubble (separation and reattachment); 0: none closed (the separation may be
 *                  open: reattachment NaN); -1: no pair brackets bubble_cl.
 */
#include "airscrew/ascr_polar.h"
#include "core/core_impl.h"

#include <math.h>
#include <string.h>

#define SLOPE_BELOW_DEG 2.0
#define SLOPE_ABOVE_DEG 4.0

/* index of the first converged point after i (n if none) */
static size_t next_conv(const ascr_polar_point *p, size_t n, size_t i)
{
  for (size_t j = i + 1; j < n; j++) {
    if (p[j].converged) return j;
  }
  return n;
}

static double lerp_or_nearer(double ya, double yb, double f)
{
  if (isfinite(ya) && isfinite(yb)) return ya + f * (yb - ya);
  return f < 0.5 ? ya : yb;
}

ascr_status ascr_polar_re_summary_compute(const ascr_polar_point *pts, size_t n,
                                          double bubble_cl, ascr_polar_re_summary *out,
                                          ascr_errbuf *err)
{
  if (pts == NULL || out == NULL) {
    return core_fail(err, ASCR_EINVAL, "Reynolds-number summary: NULL argument");
  }
  if (!isfinite(bubble_cl)) {
    return core_fail(err, ASCR_EINVAL, "Reynolds-number summary: bubble cl %g is not finite",
                     bubble_cl);
  }
  ascr_polar_re_summary s;
  s.cd_min = s.cl_at_cd_min = s.alpha_at_cd_min_deg = NAN;
  s.ld_max = s.cl_at_ld_max = s.alpha_at_ld_max_deg = NAN;
  s.cl_max = s.alpha_cl_max_deg = NAN;
  s.alpha_zero_lift_deg = s.lift_slope_per_deg = NAN;
  s.bubble_cl = bubble_cl;
  s.x_separation_upper = s.x_reattach_upper = NAN;
  s.bubble_status = -1;
  s.n_converged = 0;
  size_t i_peak = n; /* the first peak of the lift curve */
  for (size_t i = 0; i < n; i++) {
    const ascr_polar_point *q = &pts[i];
    if (!q->converged) continue;
    s.n_converged++;
    if (!(q->cd >= s.cd_min)) {
      s.cd_min = q->cd;
      s.cl_at_cd_min = q->cl;
      s.alpha_at_cd_min_deg = q->alpha_deg;
    }
    if (q->cd > 0.0 && !(q->cl / q->cd <= s.ld_max)) {
      s.ld_max = q->cl / q->cd;
      s.cl_at_ld_max = q->cl;
      s.alpha_at_ld_max_deg = q->alpha_deg;
    }
    if (i_peak == n) {
      size_t j = next_conv(pts, n, i);
      if (j == n || pts[j].cl < q->cl) i_peak = i;
    }
  }
  if (i_peak < n) {
    s.cl_max = pts[i_peak].cl;
    s.alpha_cl_max_deg = pts[i_peak].alpha_deg;
  }
  /* zero-lift angle: the first rising sign change */
  for (size_t i = 0; i < n; i++) {
    if (!pts[i].converged) continue;
    size_t j = next_conv(pts, n, i);
    if (j == n) break;
    double ca = pts[i].cl, cb = pts[j].cl;
    if (ca <= 0.0 && cb > 0.0) {
      s.alpha_zero_lift_deg = pts[i].alpha_deg + (pts[j].alpha_deg - pts[i].alpha_deg) * (-ca) / (cb - ca);
      break;
    }
  }
  if (isfinite(s.alpha_zero_lift_deg)) {
    double sx = 0.0, sy = 0.0, sxx = 0.0, sxy = 0.0;
    size_t m = 0;
    for (size_t i = 0; i < n; i++) {
      const ascr_polar_point *q = &pts[i];
      if (!q->converged) continue;
      double x = q->alpha_deg - s.alpha_zero_lift_deg;
      if (x < -SLOPE_BELOW_DEG || x > SLOPE_ABOVE_DEG) continue;
      sx += x;
      sy += q->cl;
      sxx += x * x;
      sxy += x * q->cl;
      m++;
    }
    double det = (double)m * sxx - sx * sx;
    if (m >= 3 && det > 0.0) s.lift_slope_per_deg = ((double)m * sxy - sx * sy) / det;
  }
  /* the bubble at bubble_cl, on the rising part of the lift curve */
  for (size_t i = 0; i < n && i < i_peak; i++) {
    if (!pts[i].converged) continue;
    size_t j = next_conv(pts, n, i);
    if (j == n || j > i_peak) break;
    const ascr_polar_point *a = &pts[i], *b = &pts[j];
    if ((a->cl - bubble_cl) * (b->cl - bubble_cl) > 0.0 || a->cl == b->cl) continue;
    double f = (bubble_cl - a->cl) / (b->cl - a->cl);
    s.x_separation_upper = lerp_or_nearer(a->x_separation_upper, b->x_separation_upper, f);
    s.x_reattach_upper = lerp_or_nearer(a->x_reattach_upper, b->x_reattach_upper, f);
    s.bubble_status = isfinite(s.x_separation_upper) && isfinite(s.x_reattach_upper) ? 1 : 0;
    break;
  }
  *out = s;
  return ASCR_OK;
}
