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

ascr_status geom_from_camber_thickness(const double *xs, const double *yc, const double *dyc,
                                       const double *yt, size_t m, const char *name,
                                       ascr_geom_section **out, ascr_errbuf *err)
{
  size_t n = 2 * m - 1;
  ascr_geom_section *s = geom_section_new(n, name);
  if (s == NULL) {
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory", name);
  }
  for (size_t i = 0; i < m; i++) {
    double th = atan(dyc[i]);
    double xu = xs[i] - yt[i] * sin(th), yu = yc[i] + yt[i] * cos(th);
    double xl = xs[i] + yt[i] * sin(th), yl = yc[i] - yt[i] * cos(th);
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
  double *xs = core_calloc(n_side, sizeof(double));
  double *yc = core_calloc(n_side, sizeof(double));
  double *dyc = core_calloc(n_side, sizeof(double));
  double *yt = core_calloc(n_side, sizeof(double));
  ascr_status st = ASCR_OK;
  if (xs == NULL || yc == NULL || dyc == NULL || yt == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "naca%s: out of memory", digits);
    goto done;
  }
  geom_cosine_stations(xs, n_side);
  for (size_t i = 0; i < n_side; i++) {
    double x = xs[i];
    yt[i] = naca_thickness(x, t, closed_te);
    if (!five) {
      if (m4 > 0.0) {
        if (x < p4) {
          yc[i] = m4 / (p4 * p4) * (2.0 * p4 * x - x * x);
          dyc[i] = 2.0 * m4 / (p4 * p4) * (p4 - x);
        } else {
          yc[i] = m4 / ((1.0 - p4) * (1.0 - p4)) * ((1.0 - 2.0 * p4) + 2.0 * p4 * x - x * x);
          dyc[i] = 2.0 * m4 / ((1.0 - p4) * (1.0 - p4)) * (p4 - x);
        }
      }
    } else {
      if (x < r5) {
        yc[i] = k1 / 6.0 * (x * x * x - 3.0 * r5 * x * x + r5 * r5 * (3.0 - r5) * x);
        dyc[i] = k1 / 6.0 * (3.0 * x * x - 6.0 * r5 * x + r5 * r5 * (3.0 - r5));
      } else {
        yc[i] = k1 / 6.0 * r5 * r5 * r5 * (1.0 - x);
        dyc[i] = -k1 / 6.0 * r5 * r5 * r5;
      }
    }
  }
  yt[0] = 0.0;
  char name[32];
  snprintf(name, sizeof name, "NACA %s%s", digits, closed_te ? " (closed TE)" : "");
  st = geom_from_camber_thickness(xs, yc, dyc, yt, n_side, name, out, err);
done:
  free(xs);
  free(yc);
  free(dyc);
  free(yt);
  return st;
}
