/* src/bl/march.c
 * Direct march of the two-equation integral boundary layer on a prescribed edge velocity.
 *
 * Method. Between stations 1 (known) and 2 (unknown) the integral equations
 *     momentum:        d ln(theta)/dxi + (2 + H - Me^2) d ln(ue)/dxi = Cf / (2 theta)
 *     kinetic energy:  d ln(H*)/dxi   + (1 - H) d ln(ue)/dxi        = (2 CD/H* - Cf/2) / theta
 *     amplification:   dN/dxi = rate(Hk, theta, Re_theta)                         (laminar)
 *     lag:             d sqrt(Ctau)/dxi = K sqrt(Ctau) (sqrt(Ctau_EQ) - sqrt(Ctau)) / delta  (turbulent)
 * (Drela & Giles 1987, eqs. for the momentum and shape-parameter equations; lag equation after
 * Green, Weeks & Brooman 1977; K = 2.8 in the sqrt(Ctau) form) are integrated in logarithmic form: the logarithmic
 * terms exactly, the coefficient (2 + H - Me^2), (1 - H) as interval means, and the right-hand
 * sides by the trapezoidal rule in ln(xi) (bl_interval_integral); the stiff lag equation by the
 * implicit Euler rule (station 2 value), which cannot overshoot. The unknowns at station 2,
 * (ln theta, H) or (ln theta, H, sqrt Ctau), are found by Newton's method with a forward-
 * difference Jacobian (step 1e-7), step limits |d ln theta| <= 0.5, |dH| <= 0.5, H >= 1.02,
 * and convergence when the largest residual is below 1e-11.
 *
 * Start. A similarity (Falkner-Skan) state from the local exponent m = (s/ue) due/ds at the
 * first station (bl_similarity_start), or a turbulent flat-plate estimate (1/7-power law:
 * delta = 0.37 s Re_s^-0.2, theta = 7/72 delta, H = 1.3) with Ctau = Ctau_EQ.
 * Transition. When N crosses N_crit within an interval (or the interval contains the trip), the
 * crossing xi_tr is placed by linear interpolation of N, the laminar equations are solved to
 * xi_tr, Ctau starts at bl_ctau_initial(), and the turbulent equations take over to station 2.
 * Separation. In this direct (prescribed-ue) form the equations are singular at separation
 * (Goldstein 1948); the march stops where Hk exceeds 3.8 (laminar; Falkner-Skan separation is
 * at Hk = 4.03) or 2.8 (turbulent), and reports as the separation point the place where the
 * falling skin friction extrapolates linearly to zero (at most five intervals further); where
 * Newton fails with Hk already past 3.5 / 2.5 it reports the failing station.
 */
#include "bl/bl_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <string.h>

#define LAM_SEP_HK 3.8
#define TURB_SEP_HK 2.8
#define NEWTON_MAX 40
#define NEWTON_TOL 1e-11

ascr_bl_params ascr_bl_params_defaults(void)
{
  ascr_bl_params p;
  p.re = 1e6;
  p.mach = 0.0;
  p.ncrit = 9.0;
  p.s_trip = -1.0;
  p.start = ASCR_BL_START_SIMILAR;
  const bl_turb_fit fit = bl_turb_fit_published();
  p.turb_rth_min = fit.rth_min;
  p.turb_rth_width = fit.rth_width;
  p.turb_lag_coles = fit.coles;
  return p;
}

/* Per-station state used inside the march. */
typedef struct st_state {
  double xi, ue, theta, h, sc; /* sc = sqrt(Ctau) */
  int turb;
} st_state;

typedef struct st_eval {
  bl_closure c;
  double rth, me;
  double mom_rhs; /* Cf / (2 theta) */
  double ke_rhs;  /* (2 CD/H* - Cf/2) / theta */
  double lag_rhs; /* K sc (sqrt(ctau_eq) - sc) / delta */
  double amp;     /* dN/dxi (laminar) */
} st_eval;

static void evaluate(const st_state *s, double re, double mach, bl_turb_fit fit, st_eval *e)
{
  e->me = mach * s->ue;
  e->rth = re * s->ue * s->theta;
  if (s->turb) {
    bl_closure_turbulent(s->h, e->rth, e->me, s->sc * s->sc, 0, fit, &e->c);
    double hk = e->c.hk;
    e->lag_rhs = bl_lag_rate(s->theta, s->h, hk, s->sc, e->c.ctau_eq, e->c.cf, 0, fit.coles, 0.0);
    e->amp = 0.0;
  } else {
    bl_closure_laminar(s->h, e->rth, e->me, &e->c);
    e->lag_rhs = 0.0;
    e->amp = bl_amplification_rate(e->c.hk, s->theta, e->rth);
  }
  e->mom_rhs = 0.5 * e->c.cf / s->theta;
  e->ke_rhs = (2.0 * e->c.cd / e->c.hs - 0.5 * e->c.cf) / s->theta;
}

/* Interval residuals for station b given station a. */
static void residuals(const st_state *a, const st_eval *ea, const st_state *b, double re,
                      double mach, bl_turb_fit fit, double *r)
{
  st_eval eb;
  evaluate(b, re, mach, fit, &eb);
  double dxi = b->xi - a->xi;
  double lue = log(b->ue / a->ue);
  double hm = 0.5 * (a->h + b->h);
  double mm = 0.5 * (ea->me * ea->me + eb.me * eb.me);
  r[0] = log(b->theta / a->theta) + (2.0 + hm - mm) * lue -
         bl_interval_integral(ea->mom_rhs, eb.mom_rhs, a->xi, b->xi);
  r[1] = log(eb.c.hs / ea->c.hs) + (1.0 - hm) * lue -
         bl_interval_integral(ea->ke_rhs, eb.ke_rhs, a->xi, b->xi);
  if (b->turb) {
    r[2] = (b->sc - a->sc) - dxi * eb.lag_rhs;
  }
}

/* Solve the interval a -> b; b holds the initial guess and receives the solution.
 * Returns the iteration count, or -1 on failure (b left at the last iterate). */
static int solve_interval(const st_state *a, st_state *b, double re, double mach, bl_turb_fit fit,
                          double *resid)
{
  st_eval ea;
  evaluate(a, re, mach, fit, &ea);
  int n = b->turb ? 3 : 2;
  for (int it = 1; it <= NEWTON_MAX; it++) {
    double r[3] = {0, 0, 0};
    residuals(a, &ea, b, re, mach, fit, r);
    double rmax = 0.0;
    for (int i = 0; i < n; i++) rmax = fmax(rmax, fabs(r[i]));
    *resid = rmax;
    if (!isfinite(rmax)) return -1;
    if (rmax < NEWTON_TOL) return it;
    double J[3][3];
    for (int j = 0; j < n; j++) {
      st_state p = *b;
      double h;
      if (j == 0) {
        h = 1e-7;
        p.theta = b->theta * exp(h);
      } else if (j == 1) {
        h = 1e-7 * b->h;
        p.h = b->h + h;
      } else {
        h = 1e-7 * fmax(b->sc, 1e-3);
        p.sc = b->sc + h;
      }
      double rp[3] = {0, 0, 0};
      residuals(a, &ea, &p, re, mach, fit, rp);
      for (int i = 0; i < n; i++) J[i][j] = (rp[i] - r[i]) / h;
    }
    double jm[9], dx[3] = {0, 0, 0};
    for (int i = 0; i < n; i++) {
      for (int j = 0; j < n; j++) jm[i * n + j] = J[i][j];
      dx[i] = -r[i];
    }
    if (!core_solve_small(jm, dx, n)) return -1;
    double lim = 1.0;
    if (fabs(dx[0]) > 0.5) lim = fmin(lim, 0.5 / fabs(dx[0]));
    if (fabs(dx[1]) > 0.5) lim = fmin(lim, 0.5 / fabs(dx[1]));
    if (n == 3 && fabs(dx[2]) > 0.5 * fmax(b->sc, 0.01)) lim = fmin(lim, 0.5 * fmax(b->sc, 0.01) / fabs(dx[2]));
    b->theta *= exp(lim * dx[0]);
    b->h += lim * dx[1];
    if (b->h < 1.02) b->h = 1.02;
    if (n == 3) {
      b->sc += lim * dx[2];
      if (b->sc < 1e-4) b->sc = 1e-4;
    }
  }
  return -1;
}

/* Residual of the Falkner-Skan shape-parameter condition at H for exponent m, and f(H). */
static double similarity_g(double m, double hh, double *f_out)
{
  bl_closure c;
  const double rth = 1000.0; /* f and d below do not depend on Re_theta */
  bl_closure_laminar(hh, rth, 0.0, &c);
  double f = 0.5 * c.cf * rth, d = 2.0 * c.cd / c.hs * rth;
  double den = 0.5 * (1.0 - m) + (2.0 + hh) * m;
  if (f_out) *f_out = f;
  return (1.0 - hh) * m * f / den - (d - f);
}

double bl_interval_log(double xa, double xb)
{
  return xa > 0.0 && xb > xa ? log(xb / xa) : NAN;
}

double bl_interval_integral_lx(double fa, double fb, double xa, double xb, double lx)
{
  if (xa > 0.0 && xb > xa) {
    return 0.5 * (fa * xa + fb * xb) * lx;
  }
  return 0.5 * (fa + fb) * (xb - xa);
}

double bl_interval_integral(double fa, double fb, double xa, double xb)
{
  return bl_interval_integral_lx(fa, fb, xa, xb, bl_interval_log(xa, xb));
}

int bl_similarity_shape(double m, double *h, double *f)
{
  /* Falkner-Skan: (1 - H) m f / [(1-m)/2 + (2+H) m] = d - f, with f = Re_theta Cf/2,
   * d = Re_theta 2 CD / H* from the laminar closure. Bisection on H in [1.8, 3.9]. */
  double lo = 1.8, hi = 3.9;
  double glo = similarity_g(m, lo, NULL), ghi = similarity_g(m, hi, NULL);
  if (glo * ghi > 0.0) return -1;
  for (int it = 0; it < 100; it++) {
    double mid = 0.5 * (lo + hi), g = similarity_g(m, mid, NULL);
    if ((g > 0.0) == (glo > 0.0)) {
      lo = mid;
      glo = g;
    } else {
      hi = mid;
    }
  }
  *h = 0.5 * (lo + hi);
  similarity_g(m, *h, f);
  return 0;
}

double bl_similarity_theta(double m, double h, double f, double re, double ue, double xi)
{
  /* Falkner-Skan: theta^2 = f xi / (Re ue [(1-m)/2 + (2+H) m]) */
  return sqrt(f * xi / (re * ue * (0.5 * (1.0 - m) + (2.0 + h) * m)));
}

int bl_similarity_start(double m, double re, double ue, double xi, double *theta, double *h)
{
  double f;
  if (bl_similarity_shape(m, h, &f) != 0) return -1;
  *theta = bl_similarity_theta(m, *h, f, re, ue, xi);
  return 0;
}

static void store(const st_state *s, double re, double mach, bl_turb_fit fit, double n,
                  ascr_bl_station *o)
{
  st_eval e;
  evaluate(s, re, mach, fit, &e);
  o->s = s->xi;
  o->ue = s->ue;
  o->theta = s->theta;
  o->dstar = s->h * s->theta;
  o->h = s->h;
  o->hk = e.c.hk;
  o->cf = e.c.cf;
  o->cd = e.c.cd;
  o->re_theta = e.rth;
  o->n = n;
  o->ctau = s->turb ? s->sc * s->sc : 0.0;
  o->turbulent = s->turb;
}

ascr_status ascr_bl_march(const double *s, const double *ue, size_t n, const ascr_bl_params *p,
                          ascr_bl_station *out, ascr_bl_result *res, ascr_errbuf *err)
{
  if (s == NULL || ue == NULL || p == NULL || out == NULL || res == NULL) {
    return core_fail(err, ASCR_EINVAL, "boundary-layer march: NULL argument");
  }
  memset(res, 0, sizeof *res);
  res->s_transition = NAN;
  res->s_separation = NAN;
  if (n < 2) {
    return core_fail(err, ASCR_EINVAL, "boundary-layer march: %zu stations (need at least 2)", n);
  }
  if (!(p->re > 0.0) || !isfinite(p->re)) {
    return core_fail(err, ASCR_EINVAL, "boundary-layer march: Re = %g must be above 0", p->re);
  }
  if (!(p->mach >= 0.0 && p->mach <= 0.9)) {
    return core_fail(err, ASCR_EINVAL, "boundary-layer march: Mach %g outside 0 .. 0.9", p->mach);
  }
  if (!(p->ncrit > 0.0 && p->ncrit <= 30.0)) {
    return core_fail(err, ASCR_EINVAL, "boundary-layer march: N_crit %g outside (0, 30]", p->ncrit);
  }
  if (!(p->turb_rth_min >= 0.0 && p->turb_rth_min <= 1e4) ||
      !(p->turb_rth_width >= 0.0 && p->turb_rth_width <= 1e4) ||
      !(p->turb_lag_coles >= 0.0 && p->turb_lag_coles <= 1.0)) {
    return core_fail(err, ASCR_EINVAL, "boundary-layer march: turbulent Re_theta floor %g or its "
                     "width %g outside 0 .. 1e4, or Coles weight %g outside 0 .. 1",
                     p->turb_rth_min, p->turb_rth_width, p->turb_lag_coles);
  }
  for (size_t i = 0; i < n; i++) {
    if (!(ue[i] > 0.0) || !isfinite(ue[i]) || !isfinite(s[i])) {
      return core_fail(err, ASCR_EINVAL, "boundary-layer march: station %zu: ue = %g (must be "
                       "finite and above 0)", i, ue[i]);
    }
    if (i > 0 && !(s[i] > s[i - 1])) {
      return core_fail(err, ASCR_EINVAL, "boundary-layer march: station %zu: s = %g does not "
                       "increase", i, s[i]);
    }
  }
  memset(out, 0, n * sizeof *out);
  const double re = p->re, mach = p->mach;
  const bl_turb_fit fit = {p->turb_rth_min, p->turb_rth_width, p->turb_lag_coles};
  st_state a;
  a.xi = s[0];
  a.ue = ue[0];
  a.sc = 0.0;
  a.turb = 0;
  double namp = 0.0;
  if (p->start == ASCR_BL_START_TURBULENT) {
    if (!(s[0] > 0.0)) {
      return core_fail(err, ASCR_EINVAL, "boundary-layer march: a turbulent start needs s[0] > 0");
    }
    double res_s = re * ue[0] * s[0];
    double delta = 0.37 * s[0] * pow(res_s, -0.2);
    a.theta = 7.0 / 72.0 * delta;
    a.h = 1.3;
    a.turb = 1;
    bl_closure c;
    bl_closure_turbulent(a.h, re * a.ue * a.theta, mach * a.ue, 1e-4, 0, fit, &c);
    a.sc = sqrt(c.ctau_eq);
    res->s_transition = s[0];
    res->forced = 1;
  } else {
    if (!(s[0] > 0.0)) {
      return core_fail(err, ASCR_EINVAL, "boundary-layer march: a similarity start needs s[0] > 0 "
                       "(distance from the stagnation point or leading edge)");
    }
    double m = s[0] / ue[0] * (ue[1] - ue[0]) / (s[1] - s[0]);
    m = fmax(0.0, fmin(1.0, m));
    if (bl_similarity_start(m, re, ue[0], s[0], &a.theta, &a.h) != 0) {
      return core_fail(err, ASCR_EMAXITER, "boundary-layer march: no similarity start for m = %g", m);
    }
  }
  store(&a, re, mach, fit, namp, &out[0]);
  res->n_done = 1;
  for (size_t i = 1; i < n; i++) {
    st_state b = a;
    b.xi = s[i];
    b.ue = ue[i];
    double resid = 0.0;
    int its;
    if (!a.turb) {
      its = solve_interval(&a, &b, re, mach, fit, &resid);
      if (its < 0 || b.h > LAM_SEP_HK * 1.2) {
        if (b.h > 3.5 || a.h > 3.5) {
          res->s_separation = s[i];
          return ASCR_OK;
        }
        return core_fail(err, ASCR_EMAXITER, "boundary-layer march: laminar station %zu (s = %.5g): "
                         "Newton failed, residual %.2e", i, s[i], resid);
      }
      st_eval ea, eb;
      evaluate(&a, re, mach, fit, &ea);
      evaluate(&b, re, mach, fit, &eb);
      double n2 = namp + bl_interval_integral(ea.amp, eb.amp, a.xi, b.xi);
      int trip = p->s_trip >= 0.0 && p->s_trip > a.xi && p->s_trip <= b.xi;
      if (n2 >= p->ncrit || trip) {
        double xtr = n2 >= p->ncrit ? a.xi + (p->ncrit - namp) / (n2 - namp) * (b.xi - a.xi) : b.xi;
        int forced = 0;
        if (trip && p->s_trip < xtr) {
          xtr = p->s_trip;
          forced = 1;
        }
        /* laminar part to the transition point */
        st_state t = a;
        if (xtr - a.xi > 1e-12 * (1.0 + fabs(a.xi))) {
          t.xi = xtr;
          t.ue = a.ue + (b.ue - a.ue) * (xtr - a.xi) / (b.xi - a.xi);
          its = solve_interval(&a, &t, re, mach, fit, &resid);
          if (its < 0) {
            return core_fail(err, ASCR_EMAXITER, "boundary-layer march: transition at s = %.5g: "
                             "laminar part failed, residual %.2e", xtr, resid);
          }
        }
        st_eval et;
        t.turb = 1;
        t.sc = 0.0;
        evaluate(&t, re, mach, fit, &et);
        t.sc = sqrt(bl_ctau_initial(et.c.hk, et.c.ctau_eq));
        res->s_transition = xtr;
        res->forced = forced;
        namp = p->ncrit;
        /* turbulent part to station i */
        b = t;
        b.xi = s[i];
        b.ue = ue[i];
        if (b.xi - t.xi > 1e-12 * (1.0 + fabs(t.xi))) {
          its = solve_interval(&t, &b, re, mach, fit, &resid);
          if (its < 0) {
            b = t;
            b.xi = s[i];
            b.ue = ue[i];
            b.h = 1.6;
            its = solve_interval(&t, &b, re, mach, fit, &resid);
          }
          if (its < 0) {
            return core_fail(err, ASCR_EMAXITER, "boundary-layer march: station %zu (s = %.5g) "
                             "after transition: Newton failed, residual %.2e", i, s[i], resid);
          }
        }
      } else {
        namp = n2;
      }
    } else {
      its = solve_interval(&a, &b, re, mach, fit, &resid);
      if (its < 0 || b.h > TURB_SEP_HK * 1.3) {
        if (b.h > 2.5 || a.h > 2.5) {
          res->s_separation = s[i];
          return ASCR_OK;
        }
        return core_fail(err, ASCR_EMAXITER, "boundary-layer march: turbulent station %zu "
                         "(s = %.5g): Newton failed, residual %.2e", i, s[i], resid);
      }
    }
    if (its > res->max_iterations) res->max_iterations = its;
    store(&b, re, mach, fit, namp, &out[i]);
    res->n_done = i + 1;
    if ((!b.turb && out[i].hk > LAM_SEP_HK) || (b.turb && out[i].hk > TURB_SEP_HK)) {
      /* where the skin friction, falling, extrapolates linearly to zero (at most five
       * intervals ahead): the separation point itself lies just beyond the stopping limit */
      double sep = s[i];
      double c1 = out[i].cf, c0 = out[i - 1].cf;
      if (c1 > 0.0 && c0 > c1) {
        sep = s[i] + fmin(c1 / (c0 - c1), 5.0) * (s[i] - s[i - 1]);
      }
      res->s_separation = sep;
      return ASCR_OK;
    }
    a = b;
  }
  return ASCR_OK;
}

size_t bl_march_laminar_from(double theta0, double h0, double n0, const double *s,
                             const double *ue, size_t n, double re, double mach, double ncrit,
                             double *theta, double *h, double *nn, int *why)
{
  /* a laminar march: the turbulent fits are not used */
  const bl_turb_fit fit = bl_turb_fit_published();
  st_state a;
  a.xi = s[0];
  a.ue = ue[0];
  a.theta = theta0;
  a.h = h0;
  a.sc = 0.0;
  a.turb = 0;
  double namp = n0;
  theta[0] = theta0;
  h[0] = h0;
  nn[0] = n0;
  *why = 0;
  for (size_t i = 1; i < n; i++) {
    st_state b = a;
    b.xi = s[i];
    b.ue = ue[i];
    double resid;
    int its = solve_interval(&a, &b, re, mach, fit, &resid);
    st_eval ea, eb;
    if (its < 0) {
      *why = 2;
      return i;
    }
    evaluate(&a, re, mach, fit, &ea);
    evaluate(&b, re, mach, fit, &eb);
    namp += bl_interval_integral(ea.amp, eb.amp, a.xi, b.xi);
    theta[i] = b.theta;
    h[i] = b.h;
    nn[i] = namp;
    if (namp >= ncrit) {
      *why = 1;
      return i;
    }
    if (eb.c.hk > LAM_SEP_HK) {
      *why = 2;
      return i;
    }
    a = b;
  }
  return n;
}
