/* src/panel/linvort.c
 * Inviscid section flow by linear-vorticity surface panels, stream-function formulation.
 *
 * Method. The contour of n nodes carries a vortex sheet whose strength gamma varies linearly
 * along each of the n-1 panels between consecutive nodes. The stream function of the free
 * stream (speed 1, angle alpha) plus the sheet must equal one unknown constant Psi0 at every
 * node (the body is a streamline):
 *     y_i cos(alpha) - x_i sin(alpha) + sum_j psi_ij(gamma) + psi_TE,i = Psi0,  i = 0..n-1,
 * closed by the Kutta condition gamma_0 + gamma_{n-1} = 0 (equal speeds leaving the trailing
 * edge). The unknowns are gamma_0..gamma_{n-1} and Psi0: an (n+1) x (n+1) dense system that is
 * LU-factored once (LAPACKE_dgetrf) and solved for the free stream at 0 and 90 deg; any alpha
 * is the superposition gamma = cos(alpha) gamma_0deg + sin(alpha) gamma_90deg.
 * A finite trailing-edge gap is closed by a panel with uniform source strength sigma and
 * uniform vorticity gamma_TE chosen so that the flow leaving the gap continues along the
 * trailing-edge bisector b with the mean trailing-edge speed U = (gamma_0 - gamma_{n-1})/2:
 *     sigma = U (b . n_out),   gamma_TE = -U (b . t_TE),
 * (the idea of Drela 1989; the signs here follow from our conventions, derived in
 * docs/theory/panel-method.md). With a sharp trailing edge the node equations 0 and n-1
 * coincide; equation n-1 is then replaced by a condition that, with the Kutta condition, sets
 * the trailing-edge speed to the mean of its linear extrapolations from the two sides.
 *
 * Panel integrals (derived in docs/theory/panel-method.md; Katz & Plotkin 2001, sec. 10.2-10.4
 * and 11.x for the same integrals in velocity form). In panel-local coordinates (X along the
 * panel from its first node, Y to its left, length L), with r1, r2 the distances to the panel
 * ends and theta_k = atan2(Y, X - x_k):
 *     P0 = int_0^L ln r dxi    = X ln r1 - (X-L) ln r2 - L + Y (theta2 - theta1)
 *     P1 = int_0^L xi ln r dxi = X P0 - (r1^2 ln r1 - r2^2 ln r2)/2 + (r1^2 - r2^2)/4
 *     Q  = int_0^L theta dxi   = -X phi1 + (X-L) phi2 + Y (ln r1 - ln r2) (+ const),
 *          phi_k = atan2(X - x_k, Y): the branch cut points to the right of the panel,
 *          which for the trailing-edge panel is downstream, away from every node.
 * A vortex of clockwise strength gamma has stream function (gamma/2pi) ln r; a source of
 * strength sigma has (sigma/2pi) theta.
 *
 * References.
 *   J. Katz and A. Plotkin, Low-Speed Aerodynamics, 2nd ed., Cambridge Univ. Press, 2001,
 *     ch. 10 (singularity elements) and ch. 11 (two-dimensional panel methods).
 *   M. Drela, "XFOIL: An Analysis and Design System for Low Reynolds Number Airfoils", in
 *     Low Reynolds Number Aerodynamics, T. J. Mueller (ed.), Lecture Notes in Engineering 54,
 *     Springer, 1989, pp. 1-12 (linear-vorticity stream-function formulation, section 2).
 *
 * Notation. Nodes 0-based, counter-clockwise from the upper trailing edge; gamma positive
 * clockwise, equal to the surface speed toward the trailing edge on the upper surface;
 * outward normal n_out = (t_y, -t_x) for panel direction t. Matrix stored column-major,
 * A[row + col*(n+1)], unknown n is Psi0.
 */
#include "panel/panel_impl.h"
#include "core/core_impl.h"

#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

ascr_panel_solver *ascr_panel_solver_alloc(size_t n_nodes)
{
  if (n_nodes < 8 || n_nodes > 20000) {
    return NULL;
  }
  ascr_panel_solver *w = calloc(1, sizeof *w);
  if (w == NULL) return NULL;
  size_t m = n_nodes + 1;
  w->n = n_nodes;
  w->x = core_calloc(n_nodes, sizeof(double));
  w->y = core_calloc(n_nodes, sizeof(double));
  w->a = core_calloc(m * m, sizeof(double));
  w->ipiv = core_calloc(m, sizeof(lapack_int));
  w->g0 = core_calloc(m, sizeof(double));
  w->g90 = core_calloc(m, sizeof(double));
  w->ptx = core_calloc(n_nodes, sizeof(double));
  w->pty = core_calloc(n_nodes, sizeof(double));
  w->plen = core_calloc(n_nodes, sizeof(double));
  w->lnr = core_calloc(n_nodes, sizeof(double));
  w->rsq = core_calloc(n_nodes, sizeof(double));
  if (!w->x || !w->y || !w->a || !w->ipiv || !w->g0 || !w->g90 || !w->ptx || !w->pty ||
      !w->plen || !w->lnr || !w->rsq) {
    ascr_panel_solver_free(w);
    return NULL;
  }
  return w;
}

void ascr_panel_solver_free(ascr_panel_solver *w)
{
  if (w == NULL) return;
  free(w->x);
  free(w->y);
  free(w->a);
  free(w->ipiv);
  free(w->g0);
  free(w->g90);
  free(w->ptx);
  free(w->pty);
  free(w->plen);
  free(w->lnr);
  free(w->rsq);
  free(w);
}

size_t ascr_panel_solver_size(const ascr_panel_solver *w) { return w ? w->n : 0; }
int ascr_panel_solver_sharp_te(const ascr_panel_solver *w) { return w ? w->sharp : 0; }
const double *ascr_panel_solver_x(const ascr_panel_solver *w) { return w ? w->x : NULL; }
const double *ascr_panel_solver_y(const ascr_panel_solver *w) { return w ? w->y : NULL; }

static double safe_log(double r) { return r > 1e-300 ? log(r) : 0.0; }

void panel_integrals(double ax, double ay, double bx, double by, double px, double py,
                     double *p0, double *p1, double *q)
{
  double dx = bx - ax, dy = by - ay;
  double L = hypot(dx, dy);
  double tx = dx / L, ty = dy / L;
  double rx = px - ax, ry = py - ay;
  double X = rx * tx + ry * ty;
  double Y = -rx * ty + ry * tx;
  double r1s = X * X + Y * Y, r2s = (X - L) * (X - L) + Y * Y;
  double lr1 = safe_log(sqrt(r1s)), lr2 = safe_log(sqrt(r2s));
  double th1 = atan2(Y, X), th2 = atan2(Y, X - L);
  double P0 = X * lr1 - (X - L) * lr2 - L + Y * (th2 - th1);
  if (p0) *p0 = P0;
  if (p1) *p1 = X * P0 - 0.5 * (r1s * lr1 - r2s * lr2) + 0.25 * (r1s - r2s);
  if (q) {
    double ph1 = atan2(X, Y), ph2 = atan2(X - L, Y);
    *q = -X * ph1 + (X - L) * ph2 + Y * (lr1 - lr2);
  }
}

ascr_status ascr_panel_solver_set(ascr_panel_solver *w, const ascr_geom_section *s,
                                  ascr_errbuf *err)
{
  if (w == NULL || s == NULL) {
    return core_fail(err, ASCR_EINVAL, "panel solver: NULL argument");
  }
  const size_t n = w->n, m = n + 1;
  if (ascr_geom_section_size(s) != n) {
    return core_fail(err, ASCR_EINVAL,
                     "panel solver: section %s has %zu nodes, solver was allocated for %zu",
                     ascr_geom_section_name(s), ascr_geom_section_size(s), n);
  }
  w->is_set = 0;
  memcpy(w->x, ascr_geom_section_x(s), n * sizeof(double));
  memcpy(w->y, ascr_geom_section_y(s), n * sizeof(double));
  const double *x = w->x, *y = w->y;
  double *A = w->a;
  memset(A, 0, m * m * sizeof(double));
  const double inv2pi = 1.0 / (2.0 * ASCR_PI);

  double perim = 0.0;
  for (size_t j = 0; j + 1 < n; j++) {
    perim += hypot(x[j + 1] - x[j], y[j + 1] - y[j]);
  }
  w->te_len = hypot(x[0] - x[n - 1], y[0] - y[n - 1]);
  /* a gap small against the trailing-edge panels (rounded coordinates leave 1e-5 chord) is
   * closed: its panel would make the node equations 0 and n-1 nearly equal */
  double lte = 0.5 * (hypot(x[1] - x[0], y[1] - y[0]) + hypot(x[n - 1] - x[n - 2], y[n - 1] - y[n - 2]));
  w->sharp = w->te_len < ASCR_PANEL_SHARP_TE_GAP * perim || w->te_len < 0.05 * lte;
  /* trailing-edge bisector b, pointing downstream */
  double ux = x[0] - x[1], uy = y[0] - y[1], lx = x[n - 1] - x[n - 2], ly = y[n - 1] - y[n - 2];
  double lu = hypot(ux, uy), ll = hypot(lx, ly);
  double bx = ux / lu + lx / ll, by = uy / lu + ly / ll;
  double lb = hypot(bx, by);
  if (lb > 0.0) {
    bx /= lb;
    by /= lb;
  } else {
    bx = 1.0;
    by = 0.0;
  }
  w->te_sn = 0.0;
  w->te_tb = 0.0;
  if (!w->sharp) {
    double tx = (x[0] - x[n - 1]) / w->te_len, ty = (y[0] - y[n - 1]) / w->te_len;
    w->te_sn = bx * ty - by * tx; /* b . n_out, n_out = (t_y, -t_x) */
    w->te_tb = bx * tx + by * ty;
  }

  for (size_t j = 0; j + 1 < n; j++) {
    double dx = x[j + 1] - x[j], dy = y[j + 1] - y[j];
    w->plen[j] = hypot(dx, dy);
    w->ptx[j] = dx / w->plen[j];
    w->pty[j] = dy / w->plen[j];
  }
  for (size_t i = 0; i < n; i++) {
    /* ln r and r^2 to every node are shared by the two panels that meet there; the angle
     * theta2 - theta1 a panel subtends is atan2(a x b, a . b) with a, b the vectors from its
     * two nodes to the field point (the same value as in panel_integrals, frame-free). */
    for (size_t j = 0; j < n; j++) {
      double rx = x[i] - x[j], ry = y[i] - y[j];
      w->rsq[j] = rx * rx + ry * ry;
      w->lnr[j] = w->rsq[j] > 0.0 ? 0.5 * log(w->rsq[j]) : 0.0;
    }
    for (size_t j = 0; j + 1 < n; j++) {
      double ax = x[i] - x[j], ay = y[i] - y[j], bx2 = x[i] - x[j + 1], by2 = y[i] - y[j + 1];
      double L = w->plen[j];
      double X = ax * w->ptx[j] + ay * w->pty[j];
      double Y = -ax * w->pty[j] + ay * w->ptx[j];
      double dth = atan2(ax * by2 - ay * bx2, ax * bx2 + ay * by2);
      double lr1 = w->lnr[j], lr2 = w->lnr[j + 1], r1s = w->rsq[j], r2s = w->rsq[j + 1];
      double P0 = X * lr1 - (X - L) * lr2 - L + Y * dth;
      double P1 = X * P0 - 0.5 * (r1s * lr1 - r2s * lr2) + 0.25 * (r1s - r2s);
      A[i + j * m] += inv2pi * (P0 - P1 / L);
      A[i + (j + 1) * m] += inv2pi * (P1 / L);
    }
    if (!w->sharp) {
      double P0, Q;
      panel_integrals(x[n - 1], y[n - 1], x[0], y[0], x[i], y[i], &P0, NULL, &Q);
      double c = inv2pi * 0.5 * (w->te_sn * Q - w->te_tb * P0);
      A[i + 0 * m] += c;
      A[i + (n - 1) * m] -= c;
    }
    A[i + n * m] = -1.0;
    w->g0[i] = -y[i];
    w->g90[i] = x[i];
  }
  if (w->sharp) {
    /* Replace node equation n-1 (identical to equation 0) by: gamma at the trailing edge
     * minus its linear extrapolation from the two upper nodes equals the same on the lower
     * side. With the Kutta condition this sets the trailing-edge speed to the mean of the two
     * one-sided extrapolations (node spacings h, k taken into account). */
    size_t r = n - 1;
    double h1 = hypot(x[1] - x[0], y[1] - y[0]), h2 = hypot(x[2] - x[1], y[2] - y[1]);
    double k1 = hypot(x[n - 2] - x[n - 1], y[n - 2] - y[n - 1]);
    double k2 = hypot(x[n - 3] - x[n - 2], y[n - 3] - y[n - 2]);
    double eh = h1 / h2, ek = k1 / k2;
    for (size_t j = 0; j < m; j++) A[r + j * m] = 0.0;
    A[r + 0 * m] = 1.0;
    A[r + 1 * m] = -(1.0 + eh);
    A[r + 2 * m] = eh;
    A[r + (n - 1) * m] = -1.0;
    A[r + (n - 2) * m] = (1.0 + ek);
    A[r + (n - 3) * m] = -ek;
    w->g0[r] = 0.0;
    w->g90[r] = 0.0;
  }
  /* Kutta condition */
  A[n + 0 * m] = 1.0;
  A[n + (n - 1) * m] = 1.0;
  w->g0[n] = 0.0;
  w->g90[n] = 0.0;

  lapack_int mm = (lapack_int)m;
  lapack_int info = LAPACKE_dgetrf(LAPACK_COL_MAJOR, mm, mm, A, mm, w->ipiv);
  if (info != 0) {
    return core_fail(err, info > 0 ? ASCR_ESING : ASCR_EINVAL,
                     "panel system of %s, n = %zu: LU factorisation failed (info = %d)",
                     ascr_geom_section_name(s), m, (int)info);
  }
  /* the two unit right-hand sides (free stream at 0 and 90 deg) */
  info = LAPACKE_dgetrs(LAPACK_COL_MAJOR, 'N', mm, 1, A, mm, w->ipiv, w->g0, mm);
  if (info == 0) {
    info = LAPACKE_dgetrs(LAPACK_COL_MAJOR, 'N', mm, 1, A, mm, w->ipiv, w->g90, mm);
  }
  if (info != 0) {
    return core_fail(err, ASCR_EINVAL, "panel system of %s, n = %zu: solve failed (info = %d)",
                     ascr_geom_section_name(s), m, (int)info);
  }
  for (size_t i = 0; i < m; i++) {
    if (!isfinite(w->g0[i]) || !isfinite(w->g90[i])) {
      return core_fail(err, ASCR_ESING, "panel system of %s, n = %zu: singular to working precision",
                       ascr_geom_section_name(s), m);
    }
  }
  w->is_set = 1;
  return ASCR_OK;
}

void panel_force_accumulate(double xa, double ya, double xb, double yb, double cpa, double cpb,
                            double *fx, double *fy, double *mom)
{
  const double xr = 0.25, yr = 0.0;
  double dx = xb - xa, dy = yb - ya;
  double L = hypot(dx, dy);
  if (!(L > 0.0)) return;
  double nx = dy / L, ny = -dx / L; /* outward normal */
  *fx -= 0.5 * (cpa + cpb) * L * nx;
  *fy -= 0.5 * (cpa + cpb) * L * ny;
  /* moment arm, linear along the panel: h = (x - xr) n_y - (y - yr) n_x; exact for linear Cp */
  double ha = (xa - xr) * ny - (ya - yr) * nx;
  double hb = (xb - xr) * ny - (yb - yr) * nx;
  *mom += L / 6.0 * (2.0 * cpa * ha + cpa * hb + cpb * ha + 2.0 * cpb * hb);
}

void panel_integrate_cp(const ascr_panel_solver *w, const double *cp, double alpha_rad,
                        double *cl, double *cm, double *cdp)
{
  const size_t n = w->n;
  double fx = 0.0, fy = 0.0, mom = 0.0;
  for (size_t i = 1; i <= n; i++) {
    size_t a = i - 1, k = i < n ? i : 0;
    panel_force_accumulate(w->x[a], w->y[a], w->x[k], w->y[k], cp[a], cp[k], &fx, &fy, &mom);
  }
  double ca = cos(alpha_rad), sa = sin(alpha_rad);
  *cl = fy * ca - fx * sa;
  *cdp = fx * ca + fy * sa;
  *cm = mom;
}

ascr_status ascr_panel_solver_solve(const ascr_panel_solver *w, double alpha_rad, double mach,
                                    ascr_panel_result *r, double *cp, double *q,
                                    ascr_errbuf *err)
{
  if (w == NULL || r == NULL) {
    return core_fail(err, ASCR_EINVAL, "panel solve: NULL argument");
  }
  if (!w->is_set) {
    return core_fail(err, ASCR_EINVAL, "panel solve: solver has no geometry (call _set first)");
  }
  if (!isfinite(alpha_rad)) {
    return core_fail(err, ASCR_EDOM, "panel solve: angle of attack is not finite");
  }
  if (!(mach >= 0.0 && mach < 1.0)) {
    return core_fail(err, ASCR_EDOM, "panel solve: Mach %g outside [0, 1)", mach);
  }
  const size_t n = w->n;
  const double ca = cos(alpha_rad), sa = sin(alpha_rad);
  const double beta = sqrt(1.0 - mach * mach);
  double fx = 0.0, fy = 0.0, mom = 0.0, circ = 0.0;
  double cpmin = INFINITY;
  double gprev = 0.0, cpprev = 0.0;
  for (size_t i = 0; i <= n; i++) {
    /* i == n closes the contour through the trailing-edge panel (node n-1 -> node 0) */
    size_t k = i < n ? i : 0;
    double g = ca * w->g0[k] + sa * w->g90[k];
    double c0 = 1.0 - g * g;
    double c = c0;
    if (mach > 0.0) {
      c = ascr_panel_karman_tsien(c0, mach);
      if (!isfinite(c)) {
        return core_fail(err, ASCR_EDOM,
                         "panel solve: Karman-Tsien correction breaks down at node %zu "
                         "(incompressible Cp = %.3f, Mach %.3f): flow far beyond sonic", k, c0,
                         mach);
      }
    }
    if (i < n) {
      if (cp) cp[i] = c;
      if (q) q[i] = g;
      cpmin = fmin(cpmin, c);
    }
    if (i > 0) {
      size_t a = i - 1;
      double L = hypot(w->x[k] - w->x[a], w->y[k] - w->y[a]);
      if (L > 0.0) {
        panel_force_accumulate(w->x[a], w->y[a], w->x[k], w->y[k], cpprev, c, &fx, &fy, &mom);
        if (i < n) {
          circ += 0.5 * (gprev + g) * L;
        } else if (!w->sharp) {
          double gte0 = ca * w->g0[0] + sa * w->g90[0];
          double gten = ca * w->g0[n - 1] + sa * w->g90[n - 1];
          circ += -0.5 * (gte0 - gten) * w->te_tb * L;
        }
      }
    }
    gprev = g;
    cpprev = c;
  }
  r->alpha_rad = alpha_rad;
  r->mach = mach;
  r->cl = fy * ca - fx * sa;
  r->cd_p = fx * ca + fy * sa;
  r->cm = mom;
  r->gamma_total = circ;
  r->cl_circ = 2.0 * circ / beta;
  r->cp_min = cpmin;
  r->cp_critical = mach > 0.0 ? panel_cp_critical(mach) : -INFINITY;
  return ASCR_OK;
}
