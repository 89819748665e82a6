/* tests/support/karman_trefftz.c
 * Exact potential flow about Karman-Trefftz sections, used as the inviscid reference by the
 * tests and by bench/study_panel_convergence.c.
 *
 * Th. von Karman and E. Trefftz, "Potentialstroemung um gegebene Tragflaechenquerschnitte",
 * Zeitschrift fuer Flugtechnik und Motorluftschiffahrt 9, 1918, pp. 111-116; also
 * L. M. Milne-Thomson, Theoretical Aerodynamics, 4th ed., 1958, or any aerodynamics text.
 * Circle-plane complex velocity with free stream 1 at angle a and clockwise circulation G
 * (Kutta condition at the trailing-edge angle theta_te):
 *   W(zeta) = e^{-ia} - R^2 e^{ia}/(zeta - zc)^2 + i G / (2 pi (zeta - zc)),
 *   G = 4 pi R sin(a - theta_te);
 * mapped-plane velocity w = W / (dz/dzeta), dz/dzeta = 4 n^2 b^2 r^(n-1) / ((1 - r^n)^2 (zeta+b)^2).
 * As zeta -> infinity z ~ zeta, so the free stream is the same in both planes.
 */
#include "karman_trefftz.h"

#include <complex.h>
#include <math.h>

#ifndef M_PI
#define M_PI 3.14159265358979323846
#endif

static double complex kt_map(const kt_section *k, double complex zeta)
{
  const double b = 1.0;
  double complex r = (zeta - b) / (zeta + b);
  double complex rn = cpow(r, k->n);
  return k->n * b * (1.0 + rn) / (1.0 - rn);
}

static double complex kt_circle(const kt_section *k, double theta)
{
  return (-k->mux + I * k->muy) + k->R * cexp(I * theta);
}

static double complex kt_raw(const kt_section *k, double theta)
{
  return kt_map(k, kt_circle(k, theta));
}

void kt_init(kt_section *k, double mux, double muy, double tau)
{
  k->mux = mux;
  k->muy = muy;
  k->tau = tau;
  k->n = 2.0 - tau / M_PI;
  double complex zc = -mux + I * muy;
  k->R = cabs(1.0 - zc);
  k->theta_te = carg(1.0 - zc);
  /* leading edge: point farthest from the trailing edge z = n b; golden search around pi */
  double complex zte = k->n;
  double lo = k->theta_te + 0.5 * M_PI, hi = k->theta_te + 1.5 * M_PI;
  const double gr = 0.5 * (sqrt(5.0) - 1.0);
  for (int it = 0; it < 200; it++) {
    double a = hi - gr * (hi - lo), c = lo + gr * (hi - lo);
    if (cabs(kt_raw(k, a) - zte) > cabs(kt_raw(k, c) - zte)) hi = c;
    else lo = a;
  }
  k->theta_le = 0.5 * (lo + hi);
  double complex zle = kt_raw(k, k->theta_le);
  k->z_le_re = creal(zle);
  k->z_le_im = cimag(zle);
  k->chord = cabs(zte - zle);
  k->phi = carg(zte - zle);
}

void kt_point(const kt_section *k, double theta, double *x, double *y)
{
  double complex z = kt_raw(k, theta) - (k->z_le_re + I * k->z_le_im);
  z *= cexp(-I * k->phi) / k->chord;
  *x = creal(z);
  *y = cimag(z);
}

double kt_cp(const kt_section *k, double theta, double alpha)
{
  const double b = 1.0;
  double a = alpha + k->phi; /* free-stream angle in the mapped plane */
  double complex zc = -k->mux + I * k->muy;
  double complex zeta = kt_circle(k, theta);
  double complex d = zeta - zc;
  double G = 4.0 * M_PI * k->R * sin(a - k->theta_te);
  double complex W = cexp(-I * a) - k->R * k->R * cexp(I * a) / (d * d) + I * G / (2.0 * M_PI * d);
  double complex r = (zeta - b) / (zeta + b);
  double complex rn = cpow(r, k->n);
  double complex dz = 4.0 * k->n * k->n * b * b * (rn / r) / ((1.0 - rn) * (1.0 - rn) * (zeta + b) * (zeta + b));
  double complex w = W / dz;
  return 1.0 - creal(w * conj(w));
}

double kt_cl(const kt_section *k, double alpha)
{
  double a = alpha + k->phi;
  double G = 4.0 * M_PI * k->R * sin(a - k->theta_te);
  return 2.0 * G / k->chord;
}

double kt_theta_of(const kt_section *k, double x, double y)
{
  /* coarse scan then golden refinement of the distance */
  const int NS = 4000;
  double best = 0.0, bd = INFINITY;
  for (int i = 0; i < NS; i++) {
    double th = k->theta_te + 2.0 * M_PI * (i + 0.5) / NS;
    double px, py;
    kt_point(k, th, &px, &py);
    double dd = hypot(px - x, py - y);
    if (dd < bd) {
      bd = dd;
      best = th;
    }
  }
  double lo = best - 2.0 * M_PI / NS, hi = best + 2.0 * M_PI / NS;
  const double gr = 0.5 * (sqrt(5.0) - 1.0);
  for (int it = 0; it < 100; it++) {
    double a = hi - gr * (hi - lo), c = lo + gr * (hi - lo);
    double ax, ay, cx, cy;
    kt_point(k, a, &ax, &ay);
    kt_point(k, c, &cx, &cy);
    if (hypot(ax - x, ay - y) > hypot(cx - x, cy - y)) lo = a;
    else hi = c;
  }
  return 0.5 * (lo + hi);
}

void kt_contour(const kt_section *k, size_t n, double *x, double *y)
{
  /* upper: theta from theta_te (TE) to theta_le; lower: theta_le to theta_te + 2 pi.
   * Uniform in theta: the mapping itself clusters points at the trailing edge. */
  size_t h = n / 2;
  double t0 = k->theta_te, t1 = k->theta_le, t2 = k->theta_te + 2.0 * M_PI;
  for (size_t i = 0; i <= h; i++) {
    double f = (double)i / (double)h;
    kt_point(k, t0 + (t1 - t0) * f, &x[i], &y[i]);
    kt_point(k, t1 + (t2 - t1) * f, &x[h + i], &y[h + i]);
  }
  x[0] = 1.0; y[0] = 0.0;
  x[h] = 0.0; y[h] = 0.0;
  x[n - 1] = 1.0; y[n - 1] = 0.0;
}
