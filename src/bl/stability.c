/* src/bl/stability.c
 * Linear stability of Falkner-Skan profiles: the profile by shooting, the Orr-Sommerfeld
 * temporal eigenvalues by Chebyshev collocation, spatial rates by Gaster's relation and the e^N
 * envelope of the similarity flow. Equations and references: include/airscrew/ascr_stability.h.
 *
 * Internally lengths are in eta units of the profile (eta = y sqrt((m+1) ue / (2 nu x))); the
 * public functions take and return momentum-thickness units (alpha_theta = alpha_eta
 * theta_eta, Re_theta = Re_eta theta_eta, -alpha_i theta = -alpha_i,eta theta_eta).
 */
#include "airscrew/ascr_stability.h"
#include "core/core_impl.h"

#include <complex.h>
#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define FS_POINTS 8001    /* RK4 steps of the profile (step 0.0025-0.006 in eta) */
#define FS_SCAN_STEP 5e-4 /* scan of the wall shear for a sign change of f'(eta_max) - 1 */
#define FS_BLOWUP 50.0    /* |f'| beyond this ends a shot (it has left every solution) */
#define CURVE_COARSE 60   /* coarse wavenumber scan, alpha_theta 0.02 .. 1.2 */
#define CURVE_FINE 40     /* fine scan over the unstable band */
#define ENV_FAMILIES 400  /* physical frequencies followed by the envelope */
#define OS_DOMAIN 40.0    /* least outer edge of the collocation domain, eta units */

struct ascr_stability {
  size_t n, m, n_re_max;
  /* profile */
  double *f0, *f1, *f2;
  double beta, eta_max, theta_eta, y_max;
  int have;
  /* collocation: D in the Chebyshev variable xi, then mapped to eta in [0, eta_max] */
  double *xi, *d1x, *d1, *d2, *d4, *u, *u2;
  /* eigenproblem */
  lapack_complex_double *a, *b, *ea, *eb, *work;
  double *rwork;
  lapack_int lwork;
  /* spatial curves of the envelope: per station up to CURVE_FINE points */
  double *cw, *cg;
  size_t *cn;
  /* scan scratch */
  double *sa, *swr, *swi;
};

void ascr_stability_free(ascr_stability *w)
{
  if (w == NULL) return;
  free(w->f0);
  free(w->f1);
  free(w->f2);
  free(w->xi);
  free(w->d1x);
  free(w->d1);
  free(w->d2);
  free(w->d4);
  free(w->u);
  free(w->u2);
  free(w->a);
  free(w->b);
  free(w->ea);
  free(w->eb);
  free(w->work);
  free(w->rwork);
  free(w->cw);
  free(w->cg);
  free(w->cn);
  free(w->sa);
  free(w->swr);
  free(w->swi);
  free(w);
}

ascr_stability *ascr_stability_alloc(size_t n, size_t n_re_max)
{
  if (n < 16 || n > 400 || n_re_max < 2 || n_re_max > 100000) return NULL;
  ascr_stability *w = calloc(1, sizeof *w);
  if (w == NULL) return NULL;
  size_t m = n + 1;
  w->n = n;
  w->m = m;
  w->n_re_max = n_re_max;
  w->f0 = malloc(FS_POINTS * sizeof(double));
  w->f1 = malloc(FS_POINTS * sizeof(double));
  w->f2 = malloc(FS_POINTS * sizeof(double));
  w->xi = malloc(m * sizeof(double));
  w->d1x = malloc(m * m * sizeof(double));
  w->d1 = malloc(m * m * sizeof(double));
  w->d2 = malloc(m * m * sizeof(double));
  w->d4 = malloc(m * m * sizeof(double));
  w->u = malloc(m * sizeof(double));
  w->u2 = malloc(m * sizeof(double));
  w->a = malloc(m * m * sizeof(lapack_complex_double));
  w->b = malloc(m * m * sizeof(lapack_complex_double));
  w->ea = malloc(m * sizeof(lapack_complex_double));
  w->eb = malloc(m * sizeof(lapack_complex_double));
  w->rwork = malloc(8 * m * sizeof(double));
  w->cw = malloc(n_re_max * CURVE_FINE * sizeof(double));
  w->cg = malloc(n_re_max * CURVE_FINE * sizeof(double));
  w->cn = malloc(n_re_max * sizeof(size_t));
  w->sa = malloc((CURVE_COARSE + CURVE_FINE) * sizeof(double));
  w->swr = malloc((CURVE_COARSE + CURVE_FINE) * sizeof(double));
  w->swi = malloc((CURVE_COARSE + CURVE_FINE) * sizeof(double));
  if (!w->f0 || !w->f1 || !w->f2 || !w->xi || !w->d1x || !w->d1 || !w->d2 || !w->d4 || !w->u ||
      !w->u2 || !w->a || !w->b || !w->ea || !w->eb || !w->rwork || !w->cw || !w->cg || !w->cn ||
      !w->sa || !w->swr || !w->swi) {
    ascr_stability_free(w);
    return NULL;
  }
  /* Chebyshev-Gauss-Lobatto points and the first-derivative matrix (Trefethen 2000, ch. 6) */
  for (size_t i = 0; i < m; i++) w->xi[i] = cos(ASCR_PI * (double)i / (double)n);
  for (size_t i = 0; i < m; i++) {
    double ci = (i == 0 || i == n) ? 2.0 : 1.0;
    if (i % 2) ci = -ci;
    double sum = 0.0;
    for (size_t j = 0; j < m; j++) {
      if (i == j) continue;
      double cj = (j == 0 || j == n) ? 2.0 : 1.0;
      if (j % 2) cj = -cj;
      double d = ci / cj / (w->xi[i] - w->xi[j]);
      w->d1x[i * m + j] = d;
      sum += d;
    }
    w->d1x[i * m + i] = -sum;
  }
  /* workspace query of the generalized eigensolver */
  lapack_complex_double q;
  lapack_int mm = (lapack_int)m;
  lapack_int info = LAPACKE_zggev_work(LAPACK_COL_MAJOR, 'N', 'N', mm, w->a, mm, w->b, mm, w->ea,
                                       w->eb, NULL, 1, NULL, 1, &q, -1, w->rwork);
  w->lwork = info == 0 ? (lapack_int)creal(q) : 4 * mm;
  if (w->lwork < 2 * mm) w->lwork = 2 * mm;
  w->work = malloc((size_t)w->lwork * sizeof(lapack_complex_double));
  if (w->work == NULL) {
    ascr_stability_free(w);
    return NULL;
  }
  return w;
}

/* ---- Falkner-Skan ---------------------------------------------------------------------- */

static void fs_rhs(double beta, const double y[3], double d[3])
{
  d[0] = y[1];
  d[1] = y[2];
  d[2] = -y[0] * y[2] - beta * (1.0 - y[1] * y[1]);
}

/* One shot with wall shear s to eta_max (RK4); f'(eta_max) - 1, or +-FS_BLOWUP where the
 * solution runs away. store: keep the profile. */
static double fs_shoot(ascr_stability *w, double beta, double s, double eta_max, int store)
{
  double y[3] = {0.0, 0.0, s}, k1[3], k2[3], k3[3], k4[3], t[3];
  double h = eta_max / (FS_POINTS - 1);
  if (store) {
    w->f0[0] = 0.0;
    w->f1[0] = 0.0;
    w->f2[0] = s;
  }
  for (size_t i = 1; i < FS_POINTS; i++) {
    fs_rhs(beta, y, k1);
    for (int j = 0; j < 3; j++) t[j] = y[j] + 0.5 * h * k1[j];
    fs_rhs(beta, t, k2);
    for (int j = 0; j < 3; j++) t[j] = y[j] + 0.5 * h * k2[j];
    fs_rhs(beta, t, k3);
    for (int j = 0; j < 3; j++) t[j] = y[j] + h * k3[j];
    fs_rhs(beta, t, k4);
    for (int j = 0; j < 3; j++) y[j] += h / 6.0 * (k1[j] + 2.0 * k2[j] + 2.0 * k3[j] + k4[j]);
    if (fabs(y[1]) > FS_BLOWUP) return y[1] > 0.0 ? FS_BLOWUP : -FS_BLOWUP;
    if (store) {
      w->f0[i] = y[0];
      w->f1[i] = y[1];
      w->f2[i] = y[2];
    }
  }
  return y[1] - 1.0;
}

/* Profile values at eta: U = f', U'' = f''' from the equation; U = 1 outside. */
static void fs_at(const ascr_stability *w, double eta, double *u, double *u2)
{
  if (eta >= w->eta_max) {
    *u = 1.0;
    *u2 = 0.0;
    return;
  }
  double h = w->eta_max / (FS_POINTS - 1);
  size_t i = (size_t)(eta / h);
  if (i > FS_POINTS - 2) i = FS_POINTS - 2;
  double t = eta / h - (double)i;
  double f = w->f0[i] * (1.0 - t) + w->f0[i + 1] * t;
  double fp = w->f1[i] * (1.0 - t) + w->f1[i + 1] * t;
  double fpp = w->f2[i] * (1.0 - t) + w->f2[i + 1] * t;
  *u = fp;
  *u2 = -f * fpp - w->beta * (1.0 - fp * fp);
}

ascr_status ascr_stability_set_falkner_skan(ascr_stability *w, double beta, int reversed,
                                            ascr_fs_profile *info, ascr_errbuf *err)
{
  if (w == NULL) return core_fail(err, ASCR_EINVAL, "stability: NULL workspace");
  if (!(beta > -0.19884) || !(beta <= 2.0) || (reversed && !(beta < -0.02)))
    return core_fail(err, ASCR_EINVAL,
                     "stability: beta = %g outside the %s branch (%s)", beta,
                     reversed ? "reversed-flow" : "attached",
                     reversed ? "-0.19884 < beta < -0.02" : "-0.19884 < beta <= 2");
  /* the reversed branch's layer thickens without bound as beta -> 0- */
  double eta_max = reversed ? fmax(20.0, 1.2 / fabs(beta) + 8.0) : 14.0;
  double s_hi = reversed ? -1e-4 : 2.0, s_lo = reversed ? -0.4 : 0.0;
  double prev = NAN, ps = s_hi;
  int found = 0;
  double root = 0.0;
  for (double s = s_hi; s >= s_lo - 1e-12 && !found; s -= FS_SCAN_STEP) {
    double fv = fs_shoot(w, beta, s, eta_max, 0);
    if (isfinite(prev) && (fv > 0.0) != (prev > 0.0)) {
      double lo = ps, hi = s, flo = prev;
      for (int k = 0; k < 60; k++) {
        double mid = 0.5 * (lo + hi), fm = fs_shoot(w, beta, mid, eta_max, 0);
        if ((fm > 0.0) == (flo > 0.0)) {
          lo = mid;
          flo = fm;
        } else {
          hi = mid;
        }
      }
      /* a solution reaches the outer flow (f' = 1, f'' = 0); a sign change between two
       * run-away shots that meet elsewhere is none */
      double r = 0.5 * (lo + hi);
      double fr = fs_shoot(w, beta, r, eta_max, 1);
      if (fabs(fr) < 1e-4 && fabs(w->f2[FS_POINTS - 1]) < 1e-3) {
        root = r;
        found = 1;
      }
    }
    prev = fv;
    ps = s;
  }
  if (!found)
    return core_fail(err, ASCR_EMAXITER, "stability: no Falkner-Skan solution at beta = %g (%s)",
                     beta, reversed ? "reversed" : "attached");
  fs_shoot(w, beta, root, eta_max, 1);
  double h = eta_max / (FS_POINTS - 1), ds = 0.0, th = 0.0;
  for (size_t i = 0; i < FS_POINTS; i++) {
    double wt = (i == 0 || i == FS_POINTS - 1) ? 0.5 * h : h;
    ds += wt * (1.0 - w->f1[i]);
    th += wt * w->f1[i] * (1.0 - w->f1[i]);
  }
  w->beta = beta;
  w->eta_max = eta_max;
  /* the disturbances decay like exp(-alpha y) outside the layer: the collocation domain reaches
   * OS_DOMAIN eta units at least (a domain of 14 put the Blasius critical phase speed at 0.39714,
   * 40 at 0.39656 against Jordinson's 0.3965) */
  w->y_max = fmax(eta_max, OS_DOMAIN);
  w->theta_eta = th;
  w->have = 1;
  /* collocation on eta = y_max (1 - xi)/2 */
  size_t m = w->m;
  double sc = -2.0 / w->y_max;
  for (size_t k = 0; k < m * m; k++) w->d1[k] = sc * w->d1x[k];
  for (size_t i = 0; i < m; i++)
    for (size_t j = 0; j < m; j++) {
      double s2 = 0.0;
      for (size_t k = 0; k < m; k++) s2 += w->d1[i * m + k] * w->d1[k * m + j];
      w->d2[i * m + j] = s2;
    }
  for (size_t i = 0; i < m; i++)
    for (size_t j = 0; j < m; j++) {
      double s4 = 0.0;
      for (size_t k = 0; k < m; k++) s4 += w->d2[i * m + k] * w->d2[k * m + j];
      w->d4[i * m + j] = s4;
    }
  for (size_t i = 0; i < m; i++) fs_at(w, w->y_max * (1.0 - w->xi[i]) / 2.0, &w->u[i], &w->u2[i]);
  if (info != NULL) {
    info->beta = beta;
    info->reversed = reversed;
    info->fpp0 = root;
    info->h = ds / th;
    info->theta_eta = th;
    info->eta_max = eta_max;
  }
  return ASCR_OK;
}

/* ---- Orr-Sommerfeld --------------------------------------------------------------------- */

/* Least stable eigenvalue at alpha, Re in eta units; 1 if none qualifies or LAPACK fails. */
static int os_solve(ascr_stability *w, double al, double re, double complex *c)
{
  size_t m = w->m, n = w->n;
  double complex f = 1.0 / (I * al * re);
  double a2 = al * al, a4 = a2 * a2;
  for (size_t i = 0; i < m; i++)
    for (size_t j = 0; j < m; j++) {
      double d2 = w->d2[i * m + j], d4 = w->d4[i * m + j], id = i == j ? 1.0 : 0.0;
      w->b[i + j * m] = d2 - a2 * id;
      w->a[i + j * m] = w->u[i] * (d2 - a2 * id) - w->u2[i] * id - f * (d4 - 2.0 * a2 * d2 + a4 * id);
    }
  /* phi = 0 at both ends (rows 0, n), phi' = 0 (rows 1, n-1): no B part, so their
   * eigenvalues are infinite and drop out */
  size_t rows[4] = {0, 1, n - 1, n};
  for (int r = 0; r < 4; r++)
    for (size_t j = 0; j < m; j++) {
      w->a[rows[r] + j * m] = 0.0;
      w->b[rows[r] + j * m] = 0.0;
    }
  w->a[0] = 1.0;
  w->a[n + n * m] = 1.0;
  for (size_t j = 0; j < m; j++) {
    w->a[1 + j * m] = w->d1[0 * m + j];
    w->a[(n - 1) + j * m] = w->d1[n * m + j];
  }
  lapack_int mm = (lapack_int)m;
  lapack_int info = LAPACKE_zggev_work(LAPACK_COL_MAJOR, 'N', 'N', mm, w->a, mm, w->b, mm, w->ea,
                                       w->eb, NULL, 1, NULL, 1, w->work, w->lwork, w->rwork);
  if (info != 0) return 1;
  int got = 0;
  double complex best = 0.0;
  for (size_t k = 0; k < m; k++) {
    double cb = cabs(w->eb[k]), ca = cabs(w->ea[k]);
    if (!(cb > 1e-12 * ca) || cb == 0.0) continue;
    double complex cc = w->ea[k] / w->eb[k];
    if (!(creal(cc) > -0.5 && creal(cc) < 1.0 && cabs(cc) < 2.0)) continue;
    if (!got || cimag(cc) > cimag(best)) {
      best = cc;
      got = 1;
    }
  }
  *c = best;
  return got ? 0 : 1;
}

ascr_status ascr_stability_temporal(ascr_stability *w, double alpha_theta, double re_theta,
                                    double *cr, double *ci, ascr_errbuf *err)
{
  if (w == NULL || cr == NULL || ci == NULL || !w->have)
    return core_fail(err, ASCR_EINVAL, "stability: NULL argument or no profile set");
  if (!(alpha_theta > 0.0) || !(re_theta > 0.0))
    return core_fail(err, ASCR_EINVAL, "stability: alpha_theta %g and Re_theta %g must be > 0",
                     alpha_theta, re_theta);
  double complex c;
  if (os_solve(w, alpha_theta / w->theta_eta, re_theta / w->theta_eta, &c))
    return core_fail(err, ASCR_ESING, "stability: no eigenvalue at alpha_theta %g, Re_theta %g",
                     alpha_theta, re_theta);
  *cr = creal(c);
  *ci = cimag(c);
  return ASCR_OK;
}

/* Spatial rate curve at Re_theta (Gaster): frequencies om[] (ascending) and rates g[] in theta
 * units over the unstable band, *np points (0: stable). */
static int spatial_curve(ascr_stability *w, double re_theta, double *om, double *g, size_t *np)
{
  double th = w->theta_eta, re = re_theta / th;
  double lo = NAN, hi = NAN;
  *np = 0;
  /* coarse scan for the unstable band */
  for (int k = 0; k < CURVE_COARSE; k++) {
    double at = 0.02 * (k + 1);
    double complex c;
    if (os_solve(w, at / th, re, &c)) continue;
    if (cimag(c) > 0.0) {
      if (isnan(lo)) lo = at;
      hi = at;
    }
  }
  if (isnan(lo)) return 0;
  lo = fmax(0.002, lo - 0.02);
  hi = hi + 0.02;
  size_t nf = CURVE_FINE;
  double da = (hi - lo) / (double)(nf - 1);
  for (size_t k = 0; k < nf; k++) {
    double at = lo + da * (double)k;
    double complex c;
    w->sa[k] = at;
    if (os_solve(w, at / th, re, &c)) {
      w->swr[k] = NAN;
      w->swi[k] = NAN;
      continue;
    }
    w->swr[k] = at * creal(c); /* omega theta / ue */
    w->swi[k] = at * cimag(c);
  }
  size_t n = 0;
  for (size_t k = 1; k + 1 < nf; k++) {
    if (!(w->swi[k] > 0.0) || !isfinite(w->swr[k - 1]) || !isfinite(w->swr[k + 1])) continue;
    double cg = (w->swr[k + 1] - w->swr[k - 1]) / (w->sa[k + 1] - w->sa[k - 1]);
    if (!(cg > 0.0)) continue;
    if (n > 0 && !(w->swr[k] > om[n - 1])) continue; /* keep the frequencies ascending */
    om[n] = w->swr[k];
    g[n] = w->swi[k] / cg;
    n++;
  }
  *np = n;
  return 0;
}

ascr_status ascr_stability_spatial_max(ascr_stability *w, double re_theta, double *rate_theta,
                                       double *omega_theta, ascr_errbuf *err)
{
  if (w == NULL || rate_theta == NULL || !w->have)
    return core_fail(err, ASCR_EINVAL, "stability: NULL argument or no profile set");
  if (!(re_theta > 0.0)) return core_fail(err, ASCR_EINVAL, "stability: Re_theta %g", re_theta);
  size_t np;
  spatial_curve(w, re_theta, w->cw, w->cg, &np);
  double best = 0.0, wb = 0.0;
  for (size_t k = 0; k < np; k++)
    if (w->cg[k] > best) {
      best = w->cg[k];
      wb = w->cw[k];
    }
  *rate_theta = best;
  if (omega_theta != NULL) *omega_theta = wb;
  return ASCR_OK;
}

/* Rate at frequency om on station k's curve (linear; 0 outside the band). */
static double curve_at(const ascr_stability *w, size_t k, double om)
{
  const double *x = w->cw + k * CURVE_FINE, *y = w->cg + k * CURVE_FINE;
  size_t n = w->cn[k];
  if (n == 0 || om < x[0] || om > x[n - 1]) return 0.0;
  for (size_t i = 0; i + 1 < n; i++)
    if (om <= x[i + 1]) {
      double t = (om - x[i]) / (x[i + 1] - x[i]);
      return fmax(0.0, y[i] * (1.0 - t) + y[i + 1] * t);
    }
  return fmax(0.0, y[n - 1]);
}

ascr_status ascr_stability_fs_envelope(ascr_stability *w, const double *re_theta, size_t n,
                                       double *n_env, ascr_errbuf *err)
{
  if (w == NULL || re_theta == NULL || n_env == NULL || !w->have)
    return core_fail(err, ASCR_EINVAL, "stability: NULL argument or no profile set");
  if (n < 2 || n > w->n_re_max)
    return core_fail(err, ASCR_EINVAL, "stability: %zu Reynolds numbers (2 .. %zu)", n,
                     w->n_re_max);
  for (size_t k = 0; k < n; k++)
    if (!(re_theta[k] > 0.0) || (k > 0 && !(re_theta[k] > re_theta[k - 1])))
      return core_fail(err, ASCR_EINVAL, "stability: Re_theta[%zu] = %g not increasing and > 0",
                       k, re_theta[k]);
  double m = w->beta / (2.0 - w->beta);
  double p = (1.0 - 3.0 * m) / (1.0 + m);
  double lw_lo = INFINITY, lw_hi = -INFINITY;
  for (size_t k = 0; k < n; k++) {
    spatial_curve(w, re_theta[k], w->cw + k * CURVE_FINE, w->cg + k * CURVE_FINE, &w->cn[k]);
    for (size_t i = 0; i < w->cn[k]; i++) {
      /* the family through this point, labelled by its frequency at re_theta[0] */
      double om = w->cw[k * CURVE_FINE + i];
      if (!(om > 0.0)) continue;
      double l0 = log(om) - p * log(re_theta[k] / re_theta[0]);
      lw_lo = fmin(lw_lo, l0);
      lw_hi = fmax(lw_hi, l0);
    }
  }
  for (size_t k = 0; k < n; k++) n_env[k] = 0.0;
  if (!(lw_hi >= lw_lo)) return ASCR_OK; /* stable everywhere */
  double scale = 1.0 / (w->theta_eta * w->theta_eta);
  for (int f = 0; f < ENV_FAMILIES; f++) {
    double l0 = lw_lo + (lw_hi - lw_lo) * (double)f / (ENV_FAMILIES - 1);
    double nn = 0.0, gprev = 0.0;
    for (size_t k = 0; k < n; k++) {
      double om = exp(l0 + p * log(re_theta[k] / re_theta[0]));
      double gk = curve_at(w, k, om) * scale;
      if (k > 0) nn += 0.5 * (gprev + gk) * (re_theta[k] - re_theta[k - 1]);
      gprev = gk;
      if (nn > n_env[k]) n_env[k] = nn;
    }
  }
  return ASCR_OK;
}

size_t ascr_stability_envelope_line(const double *re_theta, const double *n_env, size_t n,
                                    double n_lo, double n_hi, double *slope, double *onset)
{
  double sx = 0.0, sy = 0.0, sxx = 0.0, sxy = 0.0;
  size_t m = 0;
  *slope = NAN;
  *onset = NAN;
  if (re_theta == NULL || n_env == NULL) return 0;
  for (size_t k = 0; k < n; k++) {
    if (!(n_env[k] >= n_lo && n_env[k] <= n_hi)) continue;
    sx += re_theta[k];
    sy += n_env[k];
    sxx += re_theta[k] * re_theta[k];
    sxy += re_theta[k] * n_env[k];
    m++;
  }
  if (m < 3) return m;
  double dm = (double)m, den = dm * sxx - sx * sx;
  if (!(den > 0.0)) return m;
  *slope = (dm * sxy - sx * sy) / den;
  if (*slope != 0.0) *onset = (sx - sy / *slope) / dm;
  return m;
}
