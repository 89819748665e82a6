/* src/polar/table.c
 * Section coefficient tables over (alpha, Re): converged computed points -> monotone cubic
 * per curve (Steffen 1990, A&A 239:443) with gaps bridged, Viterna & Corrigan (1982, NASA
 * CP-2230) extension to +-90 deg and a flat plate beyond, resampled on one angle grid and
 * interpolated in (alpha, log Re) by GSL interp2d. See include/airscrew/ascr_table.h and
 * docs/theory/rotor.md.
 */
#include "airscrew/ascr_table.h"
#include "core/core_impl.h"
#include "polar/polar_impl.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_interp.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define DEG (ASCR_PI / 180.0)

typedef struct table_curve {
  double re, logre;
  double a_lo, a_hi;       /* converged range, deg */
  double a_clmax, a_clmin; /* angles of the largest / smallest converged cl, deg */
  double a_ns;             /* negative stall angle of the extension, deg (<= a_lo, < 0) */
  double slope_lo;         /* lift slope used from a_lo down to a_ns, per deg */
  double alpha0;           /* zero-lift angle, deg: where the converged lift first turns
                              from negative to positive, else the line of slope_lo */
  size_t ngap;
  double *gap;             /* ngap pairs (lo, hi), deg */
  size_t ntrip;            /* converged points, where a trip bound nothing at any (else 0) */
  double *trip_a;          /* their angles, deg, ascending */
  int *trip_bits;          /* their ascr_table_curve.trip_not_applied bits */
} table_curve;

struct ascr_polar_table {
  int linear;
  double slope, alpha0, cd0; /* linear model */
  ascr_table_options opt;
  size_t nc;
  table_curve *c;            /* ascending Re */
  size_t na, ny;             /* grid sizes (ny >= 2) */
  double *agrid, *ygrid;     /* deg, log Re */
  double *zcl, *zcd, *zcm;   /* na x ny, z[j * na + i] */
  gsl_interp **rcl, **rcd, **rcm; /* per row (ny): alpha interpolation of that curve */
};

ascr_table_options ascr_table_options_defaults(void)
{
  ascr_table_options o;
  o.cd_max = 1.3;
  o.cd_reverse = 0.05;
  o.mach = 0.0;
  return o;
}

/* ---- one curve: spline inside, extension outside ---------------------------------------- */

typedef struct curve_fit {
  size_t n;
  double *a, *cl, *cd, *cm; /* converged points only */
  gsl_interp *icl, *icd, *icm;
} curve_fit;

static void fit_free(curve_fit *f)
{
  gsl_interp_free(f->icl);
  gsl_interp_free(f->icd);
  gsl_interp_free(f->icm);
  free(f->a);
  free(f->cl);
  free(f->cd);
  free(f->cm);
  memset(f, 0, sizeof *f);
}

/* Viterna-Corrigan on the positive side from the stall point (as_deg, cls, cds) at a_deg in
 * (as, 180]; flat plate beyond 90 deg. */
static void viterna(double a_deg, double as_deg, double cls, double cds, const ascr_table_options *o,
                    double *cl, double *cd)
{
  double b1 = o->cd_max, a1 = 0.5 * b1;
  if (a_deg <= 90.0) {
    double s = as_deg * DEG;
    double ss = sin(s), cs = cos(s);
    double a2 = (cls - b1 * ss * cs) * ss / (cs * cs);
    double b2 = (cds - b1 * ss * ss) / cs;
    double a = a_deg * DEG;
    double sa = sin(a), ca = cos(a);
    *cl = a1 * sin(2.0 * a) + a2 * ca * ca / sa;
    *cd = b1 * sa * sa + b2 * ca;
    if (*cd < cds) {
      *cd = cds; /* B2 > 0 can dip just past a small stall angle: keep the stall drag */
    }
  } else {
    double a = a_deg * DEG;
    double sa = sin(a), ca = cos(a);
    *cl = a1 * sin(2.0 * a);
    *cd = b1 * sa * sa + o->cd_reverse * ca * ca;
  }
}

/* Rough post-stall pitching moment about the quarter chord: the centre of pressure moves to
 * mid-chord at 90 deg (flat plate), blended from the edge value over about 10 deg. */
static double cm_extended(double a_deg, double edge_deg, double cm_edge, double cl, double cd)
{
  double a = a_deg * DEG;
  double cn = cl * cos(a) + cd * sin(a);
  double plate = -0.25 * cn * fabs(sin(a));
  double w = exp(-fabs(a_deg - edge_deg) / 10.0);
  return w * cm_edge + (1.0 - w) * plate;
}

static void curve_eval(const curve_fit *f, const table_curve *c, const ascr_table_options *o,
                       double a_deg, double *cl, double *cd, double *cm)
{
  if (a_deg >= c->a_lo && a_deg <= c->a_hi) {
    *cl = gsl_interp_eval(f->icl, f->a, f->cl, a_deg, NULL);
    *cd = gsl_interp_eval(f->icd, f->a, f->cd, a_deg, NULL);
    *cm = gsl_interp_eval(f->icm, f->a, f->cm, a_deg, NULL);
    return;
  }
  if (a_deg > c->a_hi) {
    size_t k = f->n - 1;
    viterna(a_deg, c->a_hi, f->cl[k], f->cd[k], o, cl, cd);
    *cm = cm_extended(a_deg, c->a_hi, f->cm[k], *cl, *cd);
  } else if (a_deg >= c->a_ns) {
    /* converged range ends above the negative stall: the lift line continues with the slope
     * of the lowest converged points, drag and moment held (flagged as extended) */
    *cl = f->cl[0] + c->slope_lo * (a_deg - c->a_lo);
    *cd = f->cd[0];
    *cm = f->cm[0];
  } else {
    double l, d;
    double cl_ns = f->cl[0] + c->slope_lo * (c->a_ns - c->a_lo);
    viterna(-a_deg, -c->a_ns, -cl_ns, f->cd[0], o, &l, &d);
    *cl = -l;
    *cd = d;
    *cm = cm_extended(a_deg, c->a_ns, f->cm[0], *cl, *cd);
  }
}

/* Extract the converged points of curve k and fit; fills c. Returns 1 if the curve qualifies,
 * 0 if it is left out, -1 on allocation failure. */
static int curve_prepare(const ascr_table_curve *in, table_curve *c, curve_fit *f)
{
  memset(f, 0, sizeof *f);
  memset(c, 0, sizeof *c);
  size_t n = 0;
  for (size_t i = 0; i < in->n; i++) {
    n += (in->converged == NULL || in->converged[i]) ? 1 : 0;
  }
  if (n < 4) {
    return 0;
  }
  f->a = core_calloc(n, sizeof *f->a);
  f->cl = core_calloc(n, sizeof *f->cl);
  f->cd = core_calloc(n, sizeof *f->cd);
  f->cm = core_calloc(n, sizeof *f->cm);
  c->gap = core_calloc(2 * in->n, sizeof *c->gap);
  if (f->a == NULL || f->cl == NULL || f->cd == NULL || f->cm == NULL || c->gap == NULL) {
    free(c->gap);
    fit_free(f);
    return -1;
  }
  size_t k = 0;
  int pending_gap = 0;
  for (size_t i = 0; i < in->n; i++) {
    if (in->converged != NULL && !in->converged[i]) {
      pending_gap = k > 0;
      continue;
    }
    if (pending_gap) {
      c->gap[2 * c->ngap] = f->a[k - 1];
      c->gap[2 * c->ngap + 1] = in->alpha_deg[i];
      c->ngap++;
      pending_gap = 0;
    }
    f->a[k] = in->alpha_deg[i];
    f->cl[k] = in->cl[i];
    f->cd[k] = in->cd[i];
    f->cm[k] = in->cm[i];
    k++;
  }
  f->n = n;
  c->re = in->re;
  c->logre = log(in->re);
  c->a_lo = f->a[0];
  c->a_hi = f->a[n - 1];
  if (!(c->a_hi > 1.0) || c->a_hi >= 90.0 || c->a_lo <= -90.0) {
    free(c->gap);
    c->gap = NULL;
    fit_free(f);
    return 0;
  }
  size_t imax = 0, imin = 0;
  for (size_t i = 1; i < n; i++) {
    imax = f->cl[i] > f->cl[imax] ? i : imax;
    imin = f->cl[i] < f->cl[imin] ? i : imin;
  }
  c->a_clmax = f->a[imax];
  c->a_clmin = f->a[imin];
  /* Lift slope of the lowest three converged points (least squares), held within 0.04 ..
   * 0.12 per deg (thin-airfoil theory gives 0.1097; common practice bounds), and the negative
   * stall angle of the extension: 4 deg below the zero-lift angle it implies, at most -2 deg,
   * or the lowest converged angle if that is lower. */
  {
    size_t m = n < 3 ? n : 3;
    double sa = 0.0, sc = 0.0, saa = 0.0, sac = 0.0;
    for (size_t i = 0; i < m; i++) {
      sa += f->a[i];
      sc += f->cl[i];
      saa += f->a[i] * f->a[i];
      sac += f->a[i] * f->cl[i];
    }
    double den = (double)m * saa - sa * sa;
    double sl = den > 0.0 ? ((double)m * sac - sa * sc) / den : 0.1;
    sl = sl < 0.04 ? 0.04 : (sl > 0.12 ? 0.12 : sl);
    c->slope_lo = sl;
    double a0 = f->a[0] - f->cl[0] / sl;
    double ans = fmin(a0 - 4.0, -2.0);
    c->a_ns = fmin(c->a_lo, fmax(ans, -30.0));
    c->alpha0 = f->cl[0] > 0.0 ? a0 : f->a[n - 1] - f->cl[n - 1] / sl;
    for (size_t i = 1; i < n; i++) {
      if (f->cl[i - 1] <= 0.0 && f->cl[i] > 0.0) {
        c->alpha0 = f->a[i - 1] - f->cl[i - 1] * (f->a[i] - f->a[i - 1]) / (f->cl[i] - f->cl[i - 1]);
        break;
      }
    }
  }
  f->icl = gsl_interp_alloc(gsl_interp_steffen, n);
  f->icd = gsl_interp_alloc(gsl_interp_steffen, n);
  f->icm = gsl_interp_alloc(gsl_interp_steffen, n);
  if (f->icl == NULL || f->icd == NULL || f->icm == NULL ||
      gsl_interp_init(f->icl, f->a, f->cl, n) != GSL_SUCCESS ||
      gsl_interp_init(f->icd, f->a, f->cd, n) != GSL_SUCCESS ||
      gsl_interp_init(f->icm, f->a, f->cm, n) != GSL_SUCCESS) {
    free(c->gap);
    c->gap = NULL;
    fit_free(f);
    return -1;
  }
  if (in->trip_not_applied != NULL) {
    int any = 0;
    for (size_t i = 0; i < in->n; i++) {
      any |= (in->converged == NULL || in->converged[i]) && (in->trip_not_applied[i] & 3);
    }
    if (any) {
      c->trip_a = core_calloc(n, sizeof *c->trip_a);
      c->trip_bits = core_calloc(n, sizeof *c->trip_bits);
      if (c->trip_a == NULL || c->trip_bits == NULL) {
        free(c->trip_a);
        free(c->trip_bits);
        free(c->gap);
        memset(c, 0, sizeof *c);
        fit_free(f);
        return -1;
      }
      for (size_t i = 0, q = 0; i < in->n; i++) {
        if (in->converged != NULL && !in->converged[i]) continue;
        c->trip_a[q] = in->alpha_deg[i];
        c->trip_bits[q++] = in->trip_not_applied[i] & 3;
      }
      c->ntrip = n;
    }
  }
  return 1;
}

/* ---- table ---------------------------------------------------------------------------- */

void ascr_polar_table_free(ascr_polar_table *t)
{
  if (t == NULL) {
    return;
  }
  for (size_t i = 0; i < t->nc; i++) {
    free(t->c[i].gap);
    free(t->c[i].trip_a);
    free(t->c[i].trip_bits);
  }
  free(t->c);
  free(t->agrid);
  free(t->ygrid);
  free(t->zcl);
  free(t->zcd);
  free(t->zcm);
  for (size_t j = 0; j < t->ny; j++) {
    if (t->rcl != NULL) gsl_interp_free(t->rcl[j]);
    if (t->rcd != NULL) gsl_interp_free(t->rcd[j]);
    if (t->rcm != NULL) gsl_interp_free(t->rcm[j]);
  }
  free(t->rcl);
  free(t->rcd);
  free(t->rcm);
  free(t);
}

/* The common angle grid: 5 deg steps beyond +-40 deg, 0.5 deg within. */
static size_t angle_grid(double *a)
{
  size_t n = 0;
  for (int d = -180; d < -40; d += 5) {
    if (a != NULL) {
      a[n] = d;
    }
    n++;
  }
  for (int h = -80; h < 80; h++) {
    if (a != NULL) {
      a[n] = 0.5 * h;
    }
    n++;
  }
  for (int d = 40; d <= 180; d += 5) {
    if (a != NULL) {
      a[n] = d;
    }
    n++;
  }
  return n;
}

/* Index i of the grid interval [agrid[i], agrid[i+1]] holding a (clamped to the grid), from the
 * grid's three uniform pieces (angle_grid) without a search. */
static size_t angle_index(const ascr_polar_table *t, double a)
{
  double f;
  if (a < -40.0) {
    f = (a + 180.0) / 5.0;
  } else if (a < 40.0) {
    f = 28.0 + (a + 40.0) / 0.5;
  } else {
    f = 188.0 + (a - 40.0) / 5.0;
  }
  long i = (long)floor(f);
  if (i < 0) i = 0;
  if (i > (long)t->na - 2) i = (long)t->na - 2;
  /* guard the rounding at the joins */
  while (i > 0 && t->agrid[i] > a) i--;
  while (i + 2 < (long)t->na && t->agrid[i + 1] <= a) i++;
  return (size_t)i;
}

static int cmp_curve_re(const void *pa, const void *pb)
{
  const ascr_table_curve *a = pa, *b = pb;
  return (a->re > b->re) - (a->re < b->re);
}

static ascr_status check_curve(const ascr_table_curve *c, size_t k, ascr_errbuf *err)
{
  if (!(isfinite(c->re) && c->re > 0.0)) {
    return core_fail(err, ASCR_EINVAL, "polar curve %zu: Re %g is not a positive number", k, c->re);
  }
  if (c->n > 0 && (c->alpha_deg == NULL || c->cl == NULL || c->cd == NULL || c->cm == NULL)) {
    return core_fail(err, ASCR_EINVAL, "polar curve %zu (Re %g): missing arrays", k, c->re);
  }
  for (size_t i = 0; i < c->n; i++) {
    if (!isfinite(c->alpha_deg[i]) || c->alpha_deg[i] < -180.0 || c->alpha_deg[i] > 180.0) {
      return core_fail(err, ASCR_EINVAL, "polar curve %zu (Re %g) point %zu: alpha %g deg out of range",
                       k, c->re, i + 1, c->alpha_deg[i]);
    }
    if (i > 0 && !(c->alpha_deg[i] > c->alpha_deg[i - 1])) {
      return core_fail(err, ASCR_EINVAL,
                       "polar curve %zu (Re %g) point %zu: alpha %g deg does not increase", k,
                       c->re, i + 1, c->alpha_deg[i]);
    }
    int used = c->converged == NULL || c->converged[i];
    if (used && !(isfinite(c->cl[i]) && isfinite(c->cd[i]) && isfinite(c->cm[i]) && c->cd[i] > 0.0)) {
      return core_fail(err, ASCR_EINVAL,
                       "polar curve %zu (Re %g) point %zu (alpha %g deg): cl, cd, cm must be finite "
                       "and cd > 0 for a converged point", k, c->re, i + 1, c->alpha_deg[i]);
    }
  }
  return ASCR_OK;
}

ascr_status ascr_polar_table_build(const ascr_table_curve *curves, size_t n_curves,
                                   const ascr_table_options *opt, ascr_polar_table **out,
                                   ascr_errbuf *err)
{
  if (out == NULL || curves == NULL || n_curves == 0) {
    return core_fail(err, ASCR_EINVAL, "polar table: no curves given");
  }
  *out = NULL;
  ascr_table_options o = opt != NULL ? *opt : ascr_table_options_defaults();
  if (!(o.cd_max > 0.3 && o.cd_max < 3.0) || !(o.cd_reverse > 0.0 && o.cd_reverse < o.cd_max) ||
      !(o.mach >= 0.0 && o.mach < 0.8)) {
    return core_fail(err, ASCR_EINVAL,
                     "polar table: options out of range (cd_max %g in 0.3..3, cd_reverse %g in "
                     "0..cd_max, mach %g in 0..0.8)", o.cd_max, o.cd_reverse, o.mach);
  }
  for (size_t k = 0; k < n_curves; k++) {
    ascr_status st = check_curve(&curves[k], k + 1, err);
    if (st != ASCR_OK) {
      return st;
    }
  }
  ascr_table_curve *sorted = core_calloc(n_curves, sizeof *sorted);
  if (sorted == NULL) {
    return core_fail(err, ASCR_ENOMEM, "polar table: out of memory");
  }
  memcpy(sorted, curves, n_curves * sizeof *sorted);
  qsort(sorted, n_curves, sizeof *sorted, cmp_curve_re);
  for (size_t k = 1; k < n_curves; k++) {
    if (sorted[k].re <= sorted[k - 1].re * (1.0 + 1e-9)) {
      double re = sorted[k].re;
      free(sorted);
      return core_fail(err, ASCR_EINVAL, "polar table: Re %g given twice", re);
    }
  }

  ascr_status st = ASCR_OK;
  ascr_polar_table *t = calloc(1, sizeof *t);
  curve_fit *fits = core_calloc(n_curves, sizeof *fits);
  if (t == NULL || fits == NULL) {
    free(t);
    free(fits);
    free(sorted);
    return core_fail(err, ASCR_ENOMEM, "polar table: out of memory");
  }
  t->opt = o;
  t->c = core_calloc(n_curves, sizeof *t->c);
  if (t->c == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "polar table: out of memory");
    goto done;
  }
  for (size_t k = 0; k < n_curves; k++) {
    int q = curve_prepare(&sorted[k], &t->c[t->nc], &fits[t->nc]);
    if (q < 0) {
      st = core_fail(err, ASCR_ENOMEM, "polar table: out of memory");
      goto done;
    }
    t->nc += (size_t)q;
  }
  if (t->nc == 0) {
    st = core_fail(err, ASCR_EDOM,
                   "polar table: no curve has four converged points reaching above alpha = 1 deg "
                   "(Re %g .. %g)", sorted[0].re, sorted[n_curves - 1].re);
    goto done;
  }

  t->na = angle_grid(NULL);
  t->ny = t->nc >= 2 ? t->nc : 2;
  t->agrid = core_calloc(t->na, sizeof *t->agrid);
  t->ygrid = core_calloc(t->ny, sizeof *t->ygrid);
  t->zcl = core_calloc(t->na * t->ny, sizeof *t->zcl);
  t->zcd = core_calloc(t->na * t->ny, sizeof *t->zcd);
  t->zcm = core_calloc(t->na * t->ny, sizeof *t->zcm);
  t->rcl = core_calloc(t->ny, sizeof *t->rcl);
  t->rcd = core_calloc(t->ny, sizeof *t->rcd);
  t->rcm = core_calloc(t->ny, sizeof *t->rcm);
  if (t->agrid == NULL || t->ygrid == NULL || t->zcl == NULL || t->zcd == NULL || t->zcm == NULL ||
      t->rcl == NULL || t->rcd == NULL || t->rcm == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "polar table: out of memory");
    goto done;
  }
  for (size_t j = 0; j < t->ny; j++) {
    t->rcl[j] = gsl_interp_alloc(gsl_interp_steffen, t->na);
    t->rcd[j] = gsl_interp_alloc(gsl_interp_steffen, t->na);
    t->rcm[j] = gsl_interp_alloc(gsl_interp_steffen, t->na);
    if (t->rcl[j] == NULL || t->rcd[j] == NULL || t->rcm[j] == NULL) {
      st = core_fail(err, ASCR_ENOMEM, "polar table: out of memory");
      goto done;
    }
  }
  angle_grid(t->agrid);
  for (size_t j = 0; j < t->ny; j++) {
    size_t k = t->nc >= 2 ? j : 0;
    /* a single curve: two rows half a unit of log Re apart, so the table is flat in Re */
    t->ygrid[j] = t->nc >= 2 ? t->c[k].logre : t->c[0].logre + (j == 0 ? -0.5 : 0.5);
    for (size_t i = 0; i < t->na; i++) {
      curve_eval(&fits[k], &t->c[k], &o, t->agrid[i], &t->zcl[j * t->na + i],
                 &t->zcd[j * t->na + i], &t->zcm[j * t->na + i]);
    }
  }
  for (size_t j = 0; j < t->ny; j++) {
    if (gsl_interp_init(t->rcl[j], t->agrid, t->zcl + j * t->na, t->na) != GSL_SUCCESS ||
        gsl_interp_init(t->rcd[j], t->agrid, t->zcd + j * t->na, t->na) != GSL_SUCCESS ||
        gsl_interp_init(t->rcm[j], t->agrid, t->zcm + j * t->na, t->na) != GSL_SUCCESS) {
      st = core_fail(err, ASCR_EINVAL, "polar table: interpolation set-up failed");
      goto done;
    }
  }

done:
  for (size_t k = 0; k < n_curves; k++) {
    fit_free(&fits[k]);
  }
  free(fits);
  free(sorted);
  if (st != ASCR_OK) {
    ascr_polar_table_free(t);
    return st;
  }
  *out = t;
  return ASCR_OK;
}

ascr_status ascr_polar_table_linear(double lift_slope_per_rad, double alpha0_rad, double cd,
                                    ascr_polar_table **out, ascr_errbuf *err)
{
  if (out == NULL) {
    return core_fail(err, ASCR_EINVAL, "linear section model: no output");
  }
  *out = NULL;
  if (!(isfinite(lift_slope_per_rad) && lift_slope_per_rad > 0.0 && lift_slope_per_rad < 20.0) ||
      !(isfinite(alpha0_rad) && fabs(alpha0_rad) < 0.5) || !(isfinite(cd) && cd >= 0.0 && cd < 1.0)) {
    return core_fail(err, ASCR_EINVAL,
                     "linear section model: lift slope %g /rad (0..20), alpha0 %g rad (|.| < 0.5), "
                     "cd %g (0..1) out of range", lift_slope_per_rad, alpha0_rad, cd);
  }
  ascr_polar_table *t = calloc(1, sizeof *t);
  if (t == NULL) {
    return core_fail(err, ASCR_ENOMEM, "linear section model: out of memory");
  }
  t->linear = 1;
  t->slope = lift_slope_per_rad;
  t->alpha0 = alpha0_rad;
  t->cd0 = cd;
  t->opt = ascr_table_options_defaults();
  *out = t;
  return ASCR_OK;
}

static int curve_region(const table_curve *c, double a_deg)
{
  if (a_deg < c->a_lo || a_deg > c->a_hi) {
    return ASCR_TABLE_EXTENDED;
  }
  for (size_t g = 0; g < c->ngap; g++) {
    if (a_deg > c->gap[2 * g] && a_deg < c->gap[2 * g + 1]) {
      return ASCR_TABLE_BRIDGED;
    }
  }
  return ASCR_TABLE_COMPUTED;
}

/* trip bits at a_deg: those of the converged points on either side (within the computed
 * range), of the end point beyond it (the extension continues from there) */
static int curve_trip(const table_curve *c, double a_deg)
{
  if (c->ntrip == 0) return 0;
  if (a_deg <= c->trip_a[0]) return c->trip_bits[0];
  if (a_deg >= c->trip_a[c->ntrip - 1]) return c->trip_bits[c->ntrip - 1];
  size_t i = 0;
  while (i + 2 < c->ntrip && c->trip_a[i + 1] <= a_deg) i++;
  return c->trip_bits[i] | c->trip_bits[i + 1];
}

void ascr_polar_table_eval(const ascr_polar_table *t, double alpha_rad, double re, double mach,
                           ascr_table_sample *out)
{
  polar_table_lookup(t, alpha_rad, re, mach, 1, out);
}

void polar_table_lookup(const ascr_polar_table *t, double alpha_rad, double re, double mach,
                        int want_cm, ascr_table_sample *out)
{
  double a = remainder(alpha_rad, 2.0 * ASCR_PI); /* -pi..pi */
  memset(out, 0, sizeof *out);
  if (t->linear) {
    out->cl = t->slope * (a - t->alpha0);
    out->cl_lin = 2.0 * ASCR_PI * (a - t->alpha0) / sqrt(1.0 - fmin(mach * mach, 0.64));
    out->cd = t->cd0;
    out->cm = 0.0;
    out->region = ASCR_TABLE_COMPUTED;
    return;
  }
  double a_deg = a / DEG;
  if (a_deg < -180.0) {
    a_deg = -180.0;
  } else if (a_deg > 180.0) {
    a_deg = 180.0;
  }
  double y = log(re > 1.0 ? re : 1.0);
  const table_curve *c0 = &t->c[0], *c1 = &t->c[t->nc - 1];
  size_t j0 = 0, j1 = 0; /* rows of the bracketing curves */
  double ylo = t->ygrid[0], yhi = t->ygrid[t->ny - 1];
  if (t->nc == 1) {
    y = t->c[0].logre;
    out->re_outside = fabs(log(re > 1.0 ? re : 1.0) - y) > 1e-9;
  } else if (y < ylo) {
    y = ylo;
    out->re_outside = 1;
    c1 = c0;
  } else if (y > yhi) {
    y = yhi;
    out->re_outside = 1;
    c0 = c1;
    j0 = j1 = t->nc - 1;
  } else {
    size_t j = 0;
    while (j + 2 < t->nc && t->c[j + 1].logre <= y) {
      j++;
    }
    c0 = &t->c[j];
    c1 = &t->c[j + 1];
    j0 = j;
    j1 = j + 1;
  }
  /* linear in log Re between the two rows (one row: that curve alone) */
  double v = j1 > j0 ? (y - t->ygrid[j0]) / (t->ygrid[j1] - t->ygrid[j0]) : 0.0;
  v = v < 0.0 ? 0.0 : (v > 1.0 ? 1.0 : v);
  double ac = a_deg < t->agrid[0] ? t->agrid[0] : (a_deg > t->agrid[t->na - 1] ? t->agrid[t->na - 1] : a_deg);
  /* the grid interval of ac found once for all six evaluations: a look-up's own accelerator
   * (a table is shared between threads, so no accelerator is kept in it) */
  gsl_interp_accel acc = {angle_index(t, ac), 0, 0};
  const double *zl0 = t->zcl + j0 * t->na, *zl1 = t->zcl + j1 * t->na;
  const double *zd0 = t->zcd + j0 * t->na, *zd1 = t->zcd + j1 * t->na;
  out->cl = (1.0 - v) * gsl_interp_eval(t->rcl[j0], t->agrid, zl0, ac, &acc) +
            v * gsl_interp_eval(t->rcl[j1], t->agrid, zl1, ac, &acc);
  out->cd = (1.0 - v) * gsl_interp_eval(t->rcd[j0], t->agrid, zd0, ac, &acc) +
            v * gsl_interp_eval(t->rcd[j1], t->agrid, zd1, ac, &acc);
  if (want_cm) {
    const double *zm0 = t->zcm + j0 * t->na, *zm1 = t->zcm + j1 * t->na;
    out->cm = (1.0 - v) * gsl_interp_eval(t->rcm[j0], t->agrid, zm0, ac, &acc) +
              v * gsl_interp_eval(t->rcm[j1], t->agrid, zm1, ac, &acc);
  } else {
    out->cm = NAN;
  }
  if (out->cd < 1e-4) {
    out->cd = 1e-4; /* guard: drag never vanishes */
  }
  int r0 = curve_region(c0, a_deg), r1 = curve_region(c1, a_deg);
  out->region = r0 > r1 ? r0 : r1;
  out->trip_unbound = curve_trip(c0, a_deg) | curve_trip(c1, a_deg);
  /* stalled: beyond the angle of cl_max (the post-stall extension counts), or below the
   * angle of an interior cl minimum, or below the negative stall angle of the extension */
  double neg0 = c0->a_clmin > c0->a_lo ? c0->a_clmin : c0->a_ns;
  double neg1 = c1->a_clmin > c1->a_lo ? c1->a_clmin : c1->a_ns;
  out->stalled = a_deg > fmin(c0->a_clmax, c1->a_clmax) || a_deg < fmax(neg0, neg1);
  /* Prandtl-Glauert on the lift of the computed range, fading out over 10 deg beyond it */
  double m = mach > 0.8 ? 0.8 : (mach > 0.0 ? mach : 0.0);
  double f = sqrt(1.0 - t->opt.mach * t->opt.mach) / sqrt(1.0 - m * m);
  /* computed range interpolated in log Re between the two curves, so the factor is
   * continuous in Re (Newton solvers downstream need that) */
  double u = c1->logre > c0->logre ? (y - c0->logre) / (c1->logre - c0->logre) : 0.0;
  u = u < 0.0 ? 0.0 : (u > 1.0 ? 1.0 : u);
  double lo = c0->a_lo + u * (c1->a_lo - c0->a_lo), hi = c0->a_hi + u * (c1->a_hi - c0->a_hi);
  double dist = a_deg > hi ? a_deg - hi : (a_deg < lo ? lo - a_deg : 0.0);
  double w = dist >= 10.0 ? 0.0 : 1.0 - dist / 10.0;
  out->cl *= 1.0 + w * (f - 1.0);
  double a0 = (c0->alpha0 + u * (c1->alpha0 - c0->alpha0)) * DEG;
  out->cl_lin = 2.0 * ASCR_PI * (a - a0) / sqrt(1.0 - m * m);
}

size_t ascr_polar_table_curves(const ascr_polar_table *t)
{
  return t->linear ? 0 : t->nc;
}

double ascr_polar_table_re_min(const ascr_polar_table *t)
{
  return t->linear ? 0.0 : t->c[0].re;
}

double ascr_polar_table_re_max(const ascr_polar_table *t)
{
  return t->linear ? HUGE_VAL : t->c[t->nc - 1].re;
}

void ascr_polar_table_curve_range(const ascr_polar_table *t, size_t i, double *re,
                                  double *alpha_lo_deg, double *alpha_hi_deg)
{
  if (t->linear || i >= t->nc) {
    *re = *alpha_lo_deg = *alpha_hi_deg = NAN;
    return;
  }
  *re = t->c[i].re;
  *alpha_lo_deg = t->c[i].a_lo;
  *alpha_hi_deg = t->c[i].a_hi;
}
