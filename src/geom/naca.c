/* src/geom/naca.c
 * NACA 4-digit and 5-digit sections.
 *
 * Method. Thickness (Abbott & von Doenhoff, Theory of Wing Sections, Dover 1959, sec. 6.4,
 * eq. 6.2): y_t = (t/0.2) (0.29690 sqrt(x) - 0.12600 x - 0.35160 x^2 + 0.28430 x^3
 * - 0.10150 x^4); the closed-trailing-edge variant uses -0.1036 x^4 (common practice).
 * 4-digit mean line MPXX (sec. 6.4, eq. 6.4): y_c = m/p^2 (2 p x - x^2) for x < p,
 * m/(1-p)^2 ((1 - 2p) + 2 p x - x^2) for x >= p, with m = M/100, p = P/10.
 * 5-digit mean line LPQXX, non-reflexed (Q = 0) (Abbott & von Doenhoff sec. 6.5; Jacobs &
 * Pinkerton, NACA Report 537, 1935): y_c = (k1/6)(x^3 - 3 r x^2 + r^2 (3 - r) x) for x < r,
 * (k1/6) r^3 (1 - x) for x >= r, scaled linearly with the design lift coefficient 0.15 L.
 * The constants r and k1 for design cl = 0.3 and max-camber positions 0.05..0.25 are those
 * tabulated by Abbott & von Doenhoff (p. 115).
 * The thickness is laid normal to the mean line (eq. 6.1): x_u = x - y_t sin(theta),
 * y_u = y_c + y_t cos(theta), x_l = x + y_t sin(theta), y_l = y_c - y_t cos(theta),
 * theta = atan(dy_c/dx). Stations are cosine spaced so the nose is well resolved.
 * The chord line is the designation's own (0,0)-(1,0); it is not renormalised.
 */
#include "geom/geom_impl.h"
#include "core/core_impl.h"

#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static double naca_thickness(double x, double t, int closed)
{
  const double a4 = closed ? -0.1036 : -0.1015;
  return t / 0.2 * (0.2969 * sqrt(x) - 0.1260 * x - 0.3516 * x * x + 0.2843 * x * x * x +
                    a4 * x * x * x * x);
}

ascr_status geom_profile_alloc(geom_profile *p, size_t m, ascr_errbuf *err)
{
  p->m = m;
  p->xs = core_calloc(m, sizeof(double));
  p->yc = core_calloc(m, sizeof(double));
  p->dyc = core_calloc(m, sizeof(double));
  p->yt = core_calloc(m, sizeof(double));
  if (p->xs == NULL || p->yc == NULL || p->dyc == NULL || p->yt == NULL) {
    geom_profile_free(p);
    return core_fail(err, ASCR_ENOMEM, "section generator: out of memory for %zu stations", m);
  }
  geom_cosine_stations(p->xs, m);
  return ASCR_OK;
}

void geom_profile_free(geom_profile *p)
{
  free(p->xs);
  free(p->yc);
  free(p->dyc);
  free(p->yt);
  p->xs = p->yc = p->dyc = p->yt = NULL;
}

void geom_camber_two_parabola(double f, double xf, double x, double *yc, double *dyc)
{
  if (f == 0.0) {
    *yc = 0.0;
    *dyc = 0.0;
  } else if (x < xf) {
    *yc = f / (xf * xf) * (2.0 * xf * x - x * x);
    *dyc = 2.0 * f / (xf * xf) * (xf - x);
  } else {
    *yc = f / ((1.0 - xf) * (1.0 - xf)) * ((1.0 - 2.0 * xf) + 2.0 * xf * x - x * x);
    *dyc = 2.0 * f / ((1.0 - xf) * (1.0 - xf)) * (xf - x);
  }
}

ascr_status geom_from_profile(const geom_profile *p, const char *name, ascr_geom_section **out,
                              ascr_errbuf *err)
{
  const size_t m = p->m;
  size_t n = 2 * m - 1;
  ascr_geom_section *s = geom_section_new(n, name);
  if (s == NULL) {
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory", name);
  }
  for (size_t i = 0; i < m; i++) {
    double th = atan(p->dyc[i]);
    double xu = p->xs[i] - p->yt[i] * sin(th), yu = p->yc[i] + p->yt[i] * cos(th);
    double xl = p->xs[i] + p->yt[i] * sin(th), yl = p->yc[i] - p->yt[i] * cos(th);
    s->x[m - 1 - i] = xu;
    s->y[m - 1 - i] = yu;
    s->x[m - 1 + i] = xl;
    s->y[m - 1 + i] = yl;
  }
  s->i_le = m - 1;
  s->x[m - 1] = 0.0;
  s->y[m - 1] = 0.0;
  *out = s;
  return ASCR_OK;
}

static int all_digits(const char *s, size_t n)
{
  if (strlen(s) != n) return 0;
  for (size_t i = 0; i < n; i++) {
    if (!isdigit((unsigned char)s[i])) return 0;
  }
  return 1;
}

ascr_status ascr_geom_naca(const char *digits, int closed_te, size_t n_side,
                           ascr_geom_section **out, ascr_errbuf *err)
{
  if (out == NULL || digits == NULL) {
    return core_fail(err, ASCR_EINVAL, "naca: NULL argument");
  }
  *out = NULL;
  if (n_side < 8 || n_side > 100000) {
    return core_fail(err, ASCR_EINVAL, "naca%s: %zu points per side (8 .. 100000 allowed)",
                     digits, n_side);
  }
  int five = 0;
  if (all_digits(digits, 5)) {
    five = 1;
  } else if (!all_digits(digits, 4)) {
    return core_fail(err, ASCR_EPARSE,
                     "naca%s: not a NACA 4-digit or 5-digit designation (e.g. naca2412, "
                     "naca23012)", digits);
  }
  double t = (double)atoi(digits + (five ? 3 : 2)) / 100.0;
  if (!(t > 0.0)) {
    return core_fail(err, ASCR_EDOM, "naca%s: thickness must be above zero", digits);
  }
  double m4 = 0.0, p4 = 0.0, r5 = 0.0, k1 = 0.0;
  if (!five) {
    m4 = (digits[0] - '0') / 100.0;
    p4 = (digits[1] - '0') / 10.0;
    if (m4 > 0.0 && p4 == 0.0) {
      return core_fail(err, ASCR_EDOM,
                       "naca%s: camber %g %% with its position at 0 is not defined", digits,
                       m4 * 100.0);
    }
  } else {
    int L = digits[0] - '0', P = digits[1] - '0', Q = digits[2] - '0';
    /* Abbott & von Doenhoff p. 115: mean lines 210..250 (design cl 0.3) */
    static const double tab_r[5] = {0.0580, 0.1260, 0.2025, 0.2900, 0.3910};
    static const double tab_k1[5] = {361.400, 51.640, 15.957, 6.643, 3.230};
    if (Q == 1) {
      return core_fail(err, ASCR_EDOM, "naca%s: reflexed 5-digit mean lines are not supported",
                       digits);
    }
    if (Q != 0) {
      return core_fail(err, ASCR_EPARSE, "naca%s: third digit must be 0 (or 1 for reflex)",
                       digits);
    }
    if (P < 1 || P > 5) {
      return core_fail(err, ASCR_EDOM,
                       "naca%s: second digit %d: max-camber positions 1..5 (5 %%..25 %%) are "
                       "tabulated", digits, P);
    }
    r5 = tab_r[P - 1];
    k1 = tab_k1[P - 1] * (0.15 * L) / 0.3;
  }
  geom_profile pr;
  ascr_status st = geom_profile_alloc(&pr, n_side, err);
  if (st != ASCR_OK) {
    return st;
  }
  for (size_t i = 0; i < n_side; i++) {
    double x = pr.xs[i];
    pr.yt[i] = naca_thickness(x, t, closed_te);
    if (!five) {
      geom_camber_two_parabola(m4, p4, x, &pr.yc[i], &pr.dyc[i]);
    } else if (x < r5) {
      pr.yc[i] = k1 / 6.0 * (x * x * x - 3.0 * r5 * x * x + r5 * r5 * (3.0 - r5) * x);
      pr.dyc[i] = k1 / 6.0 * (3.0 * x * x - 6.0 * r5 * x + r5 * r5 * (3.0 - r5));
    } else {
      pr.yc[i] = k1 / 6.0 * r5 * r5 * r5 * (1.0 - x);
      pr.dyc[i] = -k1 / 6.0 * r5 * r5 * r5;
    }
  }
  pr.yt[0] = 0.0;
  char name[32];
  snprintf(name, sizeof name, "NACA %s%s", digits, closed_te ? " (closed TE)" : "");
  st = geom_from_profile(&pr, name, out, err);
  geom_profile_free(&pr);
  return st;
}
