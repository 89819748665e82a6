/* src/geom/repanel.c
 * Repanelling: new nodes along a cubic arc-length spline of the contour, spaced by a density
 * function that grows with curvature and near the trailing edge, with a node kept at the
 * leading edge.
 *
 * Method (designed here; the study behind the constants is docs/theory/panel-convergence.md).
 * On a fine uniform sample of the spline parameter s (S = total length), the node density is
 *   w(s) = 1 + curv_weight * sqrt(|kappa_m(s)|) + te_weight * exp(-d(s) / te_extent)
 * where kappa_m is the curvature smoothed by a running mean over 0.04 % of S (at least 3 samples) and
 * d(s) = min(s, S - s) the distance along the contour to the nearer trailing-edge point.
 * The cumulative integral W(s) of w is split at the leading edge; each side receives a share of
 * the panels proportional to its share of W, and the nodes sit at equal steps of W.
 * The square root keeps very sharp noses (thin plates, kappa ~ 100..300) from drawing all the
 * nodes while still refining them by a factor of about 10 over the flat parts.
 */
#include "geom/geom_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

ascr_geom_repanel_params ascr_geom_repanel_defaults(void)
{
  ascr_geom_repanel_params p;
  p.n_panels = ASCR_GEOM_DEFAULT_PANELS;
  p.curv_weight = 1.0;
  p.te_weight = 1.5;
  p.te_extent = 0.04;
  return p;
}

size_t ascr_geom_panels_for_re(double re)
{
  if (!(re > 1e6)) return ASCR_GEOM_DEFAULT_PANELS;
  return re > 6.5e6 ? 320 : 240;
}

/* Place k+1 nodes at equal steps of W between indices a and b of the fine sample (s, W),
 * writing parameters into out[0..k]. */
static void place(const double *s, const double *W, size_t a, size_t b, size_t k, double *out)
{
  double w0 = W[a], w1 = W[b];
  size_t j = a;
  out[0] = s[a];
  for (size_t i = 1; i < k; i++) {
    double target = w0 + (w1 - w0) * (double)i / (double)k;
    while (j + 1 < b && W[j + 1] < target) j++;
    double f = (W[j + 1] > W[j]) ? (target - W[j]) / (W[j + 1] - W[j]) : 0.0;
    out[i] = s[j] + f * (s[j + 1] - s[j]);
  }
  out[k] = s[b];
}

ascr_status ascr_geom_section_repanel(const ascr_geom_section *in,
                                      const ascr_geom_repanel_params *p,
                                      ascr_geom_section **out, ascr_errbuf *err)
{
  if (out == NULL || in == NULL) {
    return core_fail(err, ASCR_EINVAL, "repanel: NULL argument");
  }
  *out = NULL;
  ascr_geom_repanel_params d = ascr_geom_repanel_defaults();
  if (p == NULL) p = &d;
  if (p->n_panels < 20 || p->n_panels > 2000) {
    return core_fail(err, ASCR_EINVAL, "repanel %s: %zu panels requested (20 .. 2000 allowed)",
                     in->name, p->n_panels);
  }
  if (!(p->curv_weight >= 0.0) || !(p->te_weight >= 0.0) || !(p->te_extent > 0.0)) {
    return core_fail(err, ASCR_EINVAL, "repanel %s: clustering weights must be >= 0", in->name);
  }
  geom_spline sp;
  ascr_status st = geom_spline_init(&sp, in->x, in->y, in->n, err);
  if (st != ASCR_OK) {
    return st;
  }
  const size_t M = 40 * p->n_panels + 1; /* fine sample */
  double *s = core_calloc(M + 1, sizeof(double));
  double *kap = core_calloc(M + 1, sizeof(double));
  double *ks = core_calloc(M + 1, sizeof(double));
  double *W = core_calloc(M + 1, sizeof(double));
  double *t = core_calloc(p->n_panels + 1, sizeof(double));
  ascr_geom_section *o = NULL;
  if (s == NULL || kap == NULL || ks == NULL || W == NULL || t == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "repanel %s: out of memory", in->name);
    goto done;
  }
  const double S = sp.length, sle = sp.s[in->i_le];
  /* uniform sample with the leading edge inserted exactly */
  size_t ile = (size_t)floor(sle / S * (double)(M - 1) + 0.5);
  if (ile == 0) ile = 1;
  if (ile >= M - 1) ile = M - 2;
  for (size_t i = 0; i < M; i++) {
    if (i <= ile) {
      s[i] = sle * (double)i / (double)ile;
    } else {
      s[i] = sle + (S - sle) * (double)(i - ile) / (double)(M - 1 - ile);
    }
    kap[i] = fabs(geom_spline_curvature(&sp, s[i]));
  }
  /* running mean over a window of 0.04 % of S: enough to calm noise in tabulated
   * coordinates without smearing the nose peak of a 1 %-thick section (r_LE ~ 1e-4) */
  size_t hw = (size_t)(0.0002 * (double)M);
  if (hw < 1) hw = 1;
  double acc = 0.0;
  size_t lo = 0, hi = 0; /* window [lo, hi) */
  for (size_t i = 0; i < M; i++) {
    size_t want_lo = i > hw ? i - hw : 0, want_hi = (i + hw + 1 < M) ? i + hw + 1 : M;
    while (hi < want_hi) acc += kap[hi++];
    while (lo < want_lo) acc -= kap[lo++];
    ks[i] = acc / (double)(hi - lo);
  }
  W[0] = 0.0;
  double wprev = 0.0;
  for (size_t i = 0; i < M; i++) {
    double dte = fmin(s[i], S - s[i]);
    double w = 1.0 + p->curv_weight * sqrt(ks[i]) + p->te_weight * exp(-dte / p->te_extent);
    if (i > 0) W[i] = W[i - 1] + 0.5 * (w + wprev) * (s[i] - s[i - 1]);
    wprev = w;
  }
  size_t np = p->n_panels;
  if (!(W[M - 1] > 0.0) || !isfinite(W[M - 1]) || !isfinite(W[ile])) {
    /* a degenerate contour (coincident or folded points) gives no usable arc-length weight;
     * the readers' checks should have refused it, this keeps the cast below defined */
    st = core_fail(err, ASCR_EGEOM, "repanel %s: degenerate contour (no finite arc-length weight)",
                   in->name);
    goto done;
  }
  size_t nup = (size_t)floor((double)np * W[ile] / W[M - 1] + 0.5);
  if (nup < 4) nup = 4;
  if (nup > np - 4) nup = np - 4;
  place(s, W, 0, ile, nup, t);
  place(s, W, ile, M - 1, np - nup, t + nup);
  o = geom_section_new(np + 1, in->name);
  if (o == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "repanel %s: out of memory", in->name);
    goto done;
  }
  for (size_t i = 0; i <= np; i++) {
    geom_spline_eval(&sp, t[i], &o->x[i], &o->y[i], NULL, NULL, NULL, NULL);
  }
  /* keep the end points and the leading edge exactly */
  o->x[0] = in->x[0];
  o->y[0] = in->y[0];
  o->x[np] = in->x[in->n - 1];
  o->y[np] = in->y[in->n - 1];
  o->x[nup] = in->x[in->i_le];
  o->y[nup] = in->y[in->i_le];
  o->i_le = nup;
  for (size_t i = 1; i <= np; i++) {
    if (!(hypot(o->x[i] - o->x[i - 1], o->y[i] - o->y[i - 1]) > 0.0)) {
      st = core_fail(err, ASCR_EGEOM, "repanel %s: nodes %zu and %zu coincide", in->name, i - 1, i);
      goto done;
    }
  }
  *out = o;
  o = NULL;
done:
  ascr_geom_section_free(o);
  geom_spline_free(&sp);
  free(s);
  free(kap);
  free(ks);
  free(W);
  free(t);
  return st;
}
