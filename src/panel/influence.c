/* src/panel/influence.c
 * Field influences of the panel singularities, used by the viscous stage: velocity of the
 * linear-vorticity sheet (and trailing-edge panel) at any point, velocity and stream function
 * of uniform source panels, and solves with the stored LU factors.
 *
 * Method. In panel-local coordinates (X along the panel, Y to its left, length L), with
 * I1 = theta2 - theta1 (the angle the panel subtends at the point) and I2 = ln(r1/r2):
 *   int Y/r^2 dxi = I1,          int xi Y/r^2 dxi = X I1 - Y I2,
 *   int (X-xi)/r^2 dxi = I2,     int xi (X-xi)/r^2 dxi = X I2 - L + Y I1.
 * A clockwise vortex sheet gamma(xi) induces u = (1/2pi) int gamma Y/r^2, v = -(1/2pi) int
 * gamma (X-xi)/r^2; a source sheet sigma induces u = (1/2pi) int sigma (X-xi)/r^2,
 * v = (1/2pi) int sigma Y/r^2 (Katz & Plotkin 2001, sec. 10.2-10.3, written in our sign
 * convention). Stream function of a uniform source: (1/2pi) int theta dxi, with the branch of
 * theta chosen per use (see panel_source_psi); antiderivatives in docs/theory/viscous.md.
 */
#include "panel/panel_impl.h"
#include "core/core_impl.h"

#include <math.h>

/* Panel-local coordinates of a point for a panel from (ax, ay) with length L and unit tangent
 * (tx, ty). */
static void frame_point(double ax, double ay, double tx, double ty, double px, double py,
                        double *X, double *Y)
{
  double rx = px - ax, ry = py - ay;
  *X = rx * tx + ry * ty;
  *Y = -rx * ty + ry * tx;
}

/* The panel's frame (the expressions of the panel solver's set-up, linvort.c) and the point in
 * it. */
static void local_frame(double ax, double ay, double bx, double by, double px, double py,
                        double *X, double *Y, double *L, double *tx, double *ty)
{
  double dx = bx - ax, dy = by - ay;
  *L = hypot(dx, dy);
  *tx = dx / *L;
  *ty = dy / *L;
  frame_point(ax, ay, *tx, *ty, px, py, X, Y);
}

/* I1 and I2 for a point; on the panel line I1 is 0 outside the span and 0 (mean) inside. */
static void angles_logs(double X, double Y, double L, double *i1, double *i2)
{
  double r1s = X * X + Y * Y, r2s = (X - L) * (X - L) + Y * Y;
  double ax = X, ay = Y, bx = X - L, by = Y;
  double cr = ax * by - ay * bx, dt = ax * bx + ay * by;
  *i1 = (cr == 0.0) ? 0.0 : atan2(cr, dt);
  *i2 = (r1s > 0.0 && r2s > 0.0) ? 0.5 * log(r1s / r2s) : 0.0;
  (void)ay;
}

void panel_velocity_coeffs(const ascr_panel_solver *w, double px, double py, double *cu,
                           double *cv)
{
  const size_t n = w->n;
  const double k = 1.0 / (2.0 * ASCR_PI);
  for (size_t j = 0; j < n; j++) {
    cu[j] = 0.0;
    cv[j] = 0.0;
  }
  for (size_t j = 0; j + 1 < n; j++) {
    /* the body panels' frames as the set-up computed them (the same numbers) */
    double X, Y, L = w->plen[j], tx = w->ptx[j], ty = w->pty[j], i1, i2;
    frame_point(w->x[j], w->y[j], tx, ty, px, py, &X, &Y);
    angles_logs(X, Y, L, &i1, &i2);
    double jy1 = X * i1 - Y * i2;         /* int xi Y / r^2 */
    double jx1 = X * i2 - L + Y * i1;     /* int xi (X - xi) / r^2 */
    double ua = k * (i1 - jy1 / L), ub = k * (jy1 / L);
    double va = -k * (i2 - jx1 / L), vb = -k * (jx1 / L);
    cu[j] += ua * tx - va * ty;
    cv[j] += ua * ty + va * tx;
    cu[j + 1] += ub * tx - vb * ty;
    cv[j + 1] += ub * ty + vb * tx;
  }
  if (!w->sharp) {
    double X, Y, L, tx, ty, i1, i2;
    local_frame(w->x[n - 1], w->y[n - 1], w->x[0], w->y[0], px, py, &X, &Y, &L, &tx, &ty);
    angles_logs(X, Y, L, &i1, &i2);
    /* per unit U = (gamma_0 - gamma_{n-1})/2: source te_sn, vortex -te_tb */
    double ul = k * (w->te_sn * i2 - w->te_tb * i1);
    double vl = k * (w->te_sn * i1 + w->te_tb * i2);
    double ug = ul * tx - vl * ty, vg = ul * ty + vl * tx;
    cu[0] += 0.5 * ug;
    cv[0] += 0.5 * vg;
    cu[n - 1] -= 0.5 * ug;
    cv[n - 1] -= 0.5 * vg;
  }
}

void panel_source_velocity(double ax, double ay, double bx, double by, double px, double py,
                           double *u, double *v)
{
  double X, Y, L, tx, ty;
  local_frame(ax, ay, bx, by, px, py, &X, &Y, &L, &tx, &ty);
  panel_source_velocity_frame(ax, ay, L, tx, ty, px, py, u, v);
}

void panel_source_velocity_frame(double ax, double ay, double L, double tx, double ty, double px,
                                 double py, double *u, double *v)
{
  double X, Y, i1, i2;
  frame_point(ax, ay, tx, ty, px, py, &X, &Y);
  angles_logs(X, Y, L, &i1, &i2);
  const double k = 1.0 / (2.0 * ASCR_PI);
  double ul = k * i2, vl = k * i1;
  *u = ul * tx - vl * ty;
  *v = ul * ty + vl * tx;
}

double panel_source_psi(double ax, double ay, double bx, double by, double px, double py,
                        int forward_cut)
{
  double X, Y, L, tx, ty;
  local_frame(ax, ay, bx, by, px, py, &X, &Y, &L, &tx, &ty);
  return panel_source_psi_frame(ax, ay, L, tx, ty, px, py, forward_cut);
}

double panel_source_psi_frame(double ax, double ay, double L, double tx, double ty, double px,
                              double py, int forward_cut)
{
  double X, Y;
  frame_point(ax, ay, tx, ty, px, py, &X, &Y);
  double r1s = X * X + Y * Y, r2s = (X - L) * (X - L) + Y * Y;
  double lr1 = r1s > 0.0 ? 0.5 * log(r1s) : 0.0, lr2 = r2s > 0.0 ? 0.5 * log(r2s) : 0.0;
  double q;
  if (!forward_cut) {
    double ph1 = atan2(X, Y), ph2 = atan2(X - L, Y);
    q = -X * ph1 + (X - L) * ph2 + Y * (lr1 - lr2);
  } else {
    /* theta = atan2(-Y, xi - X) + const: cut along the panel line downstream of each source
     * point; antiderivative in w = xi - X: w atan2(-Y, w) - Y ln r */
    double t1 = atan2(-Y, -X), t2 = atan2(-Y, L - X);
    q = (L - X) * t2 - Y * lr2 - (-X * t1 - Y * lr1);
  }
  return q / (2.0 * ASCR_PI);
}

int panel_lu_solve(const ascr_panel_solver *w, double *rhs, size_t nrhs)
{
  lapack_int m = (lapack_int)(w->n + 1);
  lapack_int info = LAPACKE_dgetrs(LAPACK_COL_MAJOR, 'N', m, (lapack_int)nrhs, w->a, m, w->ipiv,
                                   rhs, m);
  return info == 0 ? 0 : -1;
}
