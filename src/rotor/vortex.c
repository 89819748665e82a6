/* src/rotor/vortex.c
 * Lifting-line rotor with a rigid helical wake (docs/theory/rotor.md, "Vortex model").
 *
 * Each blade carries n horseshoe vortices: a bound segment on the radial quarter-chord line
 * from the element's outer edge to its inner edge, and two trailing filaments that follow a
 * helix of the edge radius downstream, x = h psi, at azimuth theta_blade - psi (the wake stays
 * where it was shed while the blade moves on). The helix pitch h = (V + w)/Omega takes the
 * area-weighted mean axial induced velocity w at the blades and is iterated, starting from
 * the BEMT solution. The flow is steady in the blade frame and the same at every blade, so
 * the control points of blade 0 suffice. Velocities from straight segments by Biot-Savart
 * (Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed. 2001, eq. 10.115) with the cut-off core
 * |r1 x r2|^2 + delta^2 |r0|^2 (as in van Garrel 2003, ECN-C--03-079). The circulations solve
 * Gamma_i = W_i c_i cl_i / 2 with the section tables at the local alpha, Re and Mach by
 * Newton's method: Jacobian I - dg/du_a A - dg/du_t T, the local derivatives by central
 * differences, the dense system by LAPACKE dgesv.
 */
#include "rotor/rotor_impl.h"
#include "core/core_impl.h"
#include "polar/polar_impl.h"

#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define DEG (ASCR_PI / 180.0)

ascr_vortex_params ascr_vortex_params_defaults(void)
{
  ascr_vortex_params v;
  v.wake_length_radii = 12.0;
  v.near_step_deg = 10.0;
  v.core_widths = 0.25;
  v.max_wake_iter = 30;
  return v;
}

typedef struct vx {
  const ascr_blade *b;
  const ascr_polar_table *const *tables;
  const ascr_rotor_params *p;
  size_t n;
  int nb;
  double omega, v;
  double *edge, *rc, *dr, *chord, *theta, *core; /* core: per edge */
  size_t *s0, *s1;
  double *w;
  double *A, *T;      /* n x n: axial and swirl velocity at control i per unit Gamma_j */
  double *fa, *ft;    /* n x (n+1): filament influences (work) */
  double *psi;        /* wake azimuths */
  size_t m;
  /* per element state */
  double *gam, *ua, *ut, *jac, *rhs, *dga, *dgt;
  double *mu;         /* artificial viscosity of each element at the current state */
  int *ipiv;
  /* homotopy: induced velocity = hs (A Gamma) + (1 - hs) u0, hs = 1 for the model itself */
  double hs;
  double *ua0, *ut0, *gsave;
} vx;

/* Unit-strength straight segment a -> b at point p, added to out (Katz & Plotkin eq. 10.115
 * with the cut-off core). */
static void segment(const double p[3], const double a[3], const double b[3], double delta2,
                    double out[3])
{
  double r1[3] = {p[0] - a[0], p[1] - a[1], p[2] - a[2]};
  double r2[3] = {p[0] - b[0], p[1] - b[1], p[2] - b[2]};
  double r0[3] = {b[0] - a[0], b[1] - a[1], b[2] - a[2]};
  double c[3] = {r1[1] * r2[2] - r1[2] * r2[1], r1[2] * r2[0] - r1[0] * r2[2],
                 r1[0] * r2[1] - r1[1] * r2[0]};
  double c2 = c[0] * c[0] + c[1] * c[1] + c[2] * c[2];
  double n1 = sqrt(r1[0] * r1[0] + r1[1] * r1[1] + r1[2] * r1[2]);
  double n2 = sqrt(r2[0] * r2[0] + r2[1] * r2[1] + r2[2] * r2[2]);
  double l2 = r0[0] * r0[0] + r0[1] * r0[1] + r0[2] * r0[2];
  double den = c2 + delta2 * l2;
  if (den < 1e-300 || n1 < 1e-300 || n2 < 1e-300) {
    return;
  }
  double k = ((r0[0] * r1[0] + r0[1] * r1[1] + r0[2] * r1[2]) / n1 -
              (r0[0] * r2[0] + r0[1] * r2[1] + r0[2] * r2[2]) / n2) /
             (4.0 * ASCR_PI * den);
  out[0] += k * c[0];
  out[1] += k * c[1];
  out[2] += k * c[2];
}

/* The segment a -> b at every control point (0, rc[i], 0), axial and swirl components added
 * to ua[i], ut[i]: the same formula as segment(), written out for points on the y axis so that
 * the compiler can vectorise the loop (the hot spot of the model). */
static void segment_row(const double *rc, size_t n, const double a[3], const double b[3],
                        double delta2, double *restrict ua, double *restrict ut)
{
  const double r0x = b[0] - a[0], r0y = b[1] - a[1], r0z = b[2] - a[2];
  const double l2 = r0x * r0x + r0y * r0y + r0z * r0z;
  const double dl2 = delta2 * l2, k4 = 1.0 / (4.0 * ASCR_PI);
  for (size_t i = 0; i < n; i++) {
    double r1x = -a[0], r1y = rc[i] - a[1], r1z = -a[2];
    double r2x = -b[0], r2y = rc[i] - b[1], r2z = -b[2];
    double cx = r1y * r2z - r1z * r2y, cy = r1z * r2x - r1x * r2z, cz = r1x * r2y - r1y * r2x;
    double c2 = cx * cx + cy * cy + cz * cz;
    double n1 = sqrt(r1x * r1x + r1y * r1y + r1z * r1z);
    double n2 = sqrt(r2x * r2x + r2y * r2y + r2z * r2z);
    double d1 = r0x * r1x + r0y * r1y + r0z * r1z, dd2 = r0x * r2x + r0y * r2y + r0z * r2z;
    double den = (c2 + dl2) * n1 * n2;
    double k = den > 1e-300 ? k4 * (d1 * n2 - dd2 * n1) / den : 0.0;
    ua[i] += k * cx;
    ut[i] += k * cz;
  }
}

/* Wake azimuths: near_step over the first revolution, then growing by 5 % a step up to
 * 45 deg, until the helix has travelled len axially at advance h per radian. */
static size_t wake_angles(double near_step, double h, double len, double *psi, size_t max)
{
  size_t m = 0;
  double a = 0.0, d = near_step;
  if (psi != NULL) psi[0] = 0.0;
  while (m + 1 < max) {
    a += d;
    m++;
    if (psi != NULL) psi[m] = a;
    if (h * a >= len) break;
    if (a > 2.0 * ASCR_PI) d = fmin(d * 1.05, 45.0 * DEG);
  }
  return m; /* segments */
}

static void build_influence(vx *s, const double *hedge, const ascr_vortex_params *vp)
{
  size_t n = s->n, ne = n + 1;
  double hmin = HUGE_VAL;
  for (size_t e = 0; e < ne; e++) hmin = fmin(hmin, hedge[e]);
  s->m = wake_angles(vp->near_step_deg * DEG, hmin, vp->wake_length_radii * s->b->r_tip_m, s->psi, 4001);
  memset(s->fa, 0, n * ne * sizeof *s->fa);
  memset(s->ft, 0, n * ne * sizeof *s->ft);
  memset(s->A, 0, n * n * sizeof *s->A);
  memset(s->T, 0, n * n * sizeof *s->T);
  for (int k = 0; k < s->nb; k++) {
    double th = 2.0 * ASCR_PI * k / s->nb;
    for (size_t e = 0; e < ne; e++) {
      double re = s->edge[e], d2 = s->core[e] * s->core[e], h = hedge[e];
      double a[3] = {0.0, re * cos(th), re * sin(th)};
      double len = vp->wake_length_radii * s->b->r_tip_m;
      double *fa = s->fa + e * n, *ft = s->ft + e * n; /* edge-major work rows */
      for (size_t j = 1; j <= s->m; j++) {
        double q = s->psi[j];
        if (h * s->psi[j - 1] >= len) {
          break; /* this filament has reached the wake length */
        }
        double bpt[3] = {h * q, re * cos(th - q), re * sin(th - q)};
        segment_row(s->rc, n, a, bpt, d2, fa, ft);
        a[0] = bpt[0];
        a[1] = bpt[1];
        a[2] = bpt[2];
      }
    }
    if (k == 0) {
      continue; /* own bound vortex: collinear with the control points, no velocity */
    }
    for (size_t j = 0; j < n; j++) {
      double pa[3] = {0.0, s->edge[j + 1] * cos(th), s->edge[j + 1] * sin(th)};
      double pb[3] = {0.0, s->edge[j] * cos(th), s->edge[j] * sin(th)};
      double d2 = 0.25 * (s->core[j] + s->core[j + 1]) * (s->core[j] + s->core[j + 1]);
      for (size_t i = 0; i < n; i++) {
        double pnt[3] = {0.0, s->rc[i], 0.0}, u[3] = {0.0, 0.0, 0.0};
        segment(pnt, pa, pb, d2, u);
        s->A[i * n + j] += u[0];
        s->T[i * n + j] += u[2];
      }
    }
  }
  for (size_t i = 0; i < n; i++) {
    for (size_t j = 0; j < n; j++) {
      s->A[i * n + j] += s->fa[j * n + i] - s->fa[(j + 1) * n + i];
      s->T[i * n + j] += s->ft[j * n + i] - s->ft[(j + 1) * n + i];
    }
  }
}

/* W c cl / 2 at element i for induced velocities (ua, ut); fills the sample and W. */
static double local_g(const vx *s, size_t i, double ua, double ut, ascr_table_sample *smp,
                      double *wrel, double *phi)
{
  double va = s->v + ua, vt = s->omega * s->rc[i] - ut;
  double w = hypot(va, vt);
  double ph = atan2(va, vt);
  double re = s->p->density_kg_m3 * w * s->chord[i] / s->p->viscosity_pa_s;
  double mach = w / s->p->sound_speed_m_s;
  rotor_sample(s->tables, s->s0[i], s->s1[i], s->w[i], s->theta[i] - ph, re, mach,
               rotor_stall_delay_factor(s->p, s->chord[i], s->rc[i]), smp);
  if (wrel != NULL) *wrel = w;
  if (phi != NULL) *phi = ph;
  return 0.5 * w * s->chord[i] * smp->cl;
}

static void induced(const vx *s)
{
  size_t n = s->n;
  for (size_t i = 0; i < n; i++) {
    double a = 0.0, t = 0.0;
    for (size_t j = 0; j < n; j++) {
      a += s->A[i * n + j] * s->gam[j];
      t += s->T[i * n + j] * s->gam[j];
    }
    s->ua[i] = s->hs * a + (1.0 - s->hs) * s->ua0[i];
    s->ut[i] = s->hs * t + (1.0 - s->hs) * s->ut0[i];
  }
}

/* Artificial viscosity where the lift curve falls (after Chattot 2004, AIAA 2004-0220, who adds
 * mu (Gamma_{i+1} - 2 Gamma_i + Gamma_{i-1}) to the nonlinear lifting-line equations of stalled
 * sections; from memory, the coefficient derived here). A saw-tooth circulation eps (-1)^i on
 * elements of width dr induces a saw-tooth downwash of about eps/dr (the trailing vortices of
 * the two neighbouring edges, sum over the alternating far ones: pi/2 times their 2/pi), which
 * changes g_i = W c cl/2 by -c (dcl/dalpha) eps/(2 dr). Where dcl/dalpha < 0 and c/dr is large
 * (narrow elements, stalled roots) that mode is a solution of its own: circulation and inflow
 * alternate from element to element. The term adds 4 mu eps to the mode; with
 * mu = max(0, -c dcl/dalpha/(2 dr))/4 (the max rounded, mu_at) the mode keeps the factor 1 of a
 * section with zero lift slope, and the solution is unique again. The term vanishes where the lift curve rises and,
 * where it does not, it is of order c dr Gamma'': it vanishes as the elements are refined. The
 * slope is taken by central differences over +-MU_DALPHA. */
#define MU_DALPHA (0.5 * DEG)

static double slope_at(const vx *s, size_t i, double ua, double ut)
{
  double va = s->v + ua, vt = s->omega * s->rc[i] - ut;
  double w = hypot(va, vt), ph = atan2(va, vt);
  double re = s->p->density_kg_m3 * w * s->chord[i] / s->p->viscosity_pa_s;
  double mach = w / s->p->sound_speed_m_s, a = s->theta[i] - ph;
  ascr_table_sample qp, qm;
  polar_table_lookup(s->tables[s->s0[i]], a + MU_DALPHA, re, mach, 0, &qp);
  polar_table_lookup(s->tables[s->s0[i]], a - MU_DALPHA, re, mach, 0, &qm);
  double sl = (qp.cl - qm.cl) / (2.0 * MU_DALPHA);
  if (s->s1[i] != s->s0[i] && s->w[i] > 0.0) {
    polar_table_lookup(s->tables[s->s1[i]], a + MU_DALPHA, re, mach, 0, &qp);
    polar_table_lookup(s->tables[s->s1[i]], a - MU_DALPHA, re, mach, 0, &qm);
    sl = (1.0 - s->w[i]) * sl + s->w[i] * (qp.cl - qm.cl) / (2.0 * MU_DALPHA);
  }
  return sl;
}

/* max(0, -a) rounded over MU_ROUND per radian, (sqrt(a^2 + MU_ROUND^2) - a)/2, so that the
 * residual stays smooth where an element passes cl_max (a hard max left Newton stalled on
 * that kink: the example blade at 10,000 rpm); below 1e-3 of mu's stalled value where the lift
 * slope is that of an attached section (a ~ 5.7 per radian) */
#define MU_ROUND 0.1

static double mu_at(const vx *s, size_t i, double ua, double ut)
{
  double a = slope_at(s, i, ua, ut);
  double neg = 0.5 * (sqrt(a * a + MU_ROUND * MU_ROUND) - a);
  return 0.125 * s->chord[i] * neg / s->dr[i];
}

/* Gamma_{i+1} - 2 Gamma_i + Gamma_{i-1}, the ends with zero-gradient ghost values. */
static double second_difference(const vx *s, size_t i)
{
  double gl = i > 0 ? s->gam[i - 1] : s->gam[i];
  double gr = i + 1 < s->n ? s->gam[i + 1] : s->gam[i];
  return gl - 2.0 * s->gam[i] + gr;
}

static double laplacian(const vx *s, size_t i) { return s->mu[i] * second_difference(s, i); }

/* Residual Gamma_i - g_i - mu_i (Gamma_{i+1} - 2 Gamma_i + Gamma_{i-1}) at the current Gamma
 * into res (mu at the current state); returns its largest magnitude. */
static double residual_all(vx *s, double *res)
{
  induced(s);
  for (size_t i = 0; i < s->n; i++) s->mu[i] = mu_at(s, i, s->ua[i], s->ut[i]);
  double rmax = 0.0;
  for (size_t i = 0; i < s->n; i++) {
    ascr_table_sample q;
    res[i] = s->gam[i] - local_g(s, i, s->ua[i], s->ut[i], &q, NULL, NULL) - laplacian(s, i);
    rmax = fmax(rmax, fabs(res[i]));
  }
  return rmax;
}

/* Newton on Gamma for the current wake, with a backtracking line search on the largest
 * residual (the tables are smooth but their post-stall joins are only continuous); returns 1
 * when the residual is below 1e-9 of the circulation scale. */
static int solve_gamma(vx *s)
{
  size_t n = s->n;
  double scale = 0.0;
  for (size_t i = 0; i < n; i++) {
    scale = fmax(scale, 0.5 * hypot(s->v, s->omega * s->rc[i]) * s->chord[i]);
  }
  double *r = s->rhs + n; /* second half of the work array */
  double *g0 = r + n;
  double rmax = residual_all(s, r);
  /* ptc > 0: pseudo-transient continuation (Kelley & Keyes 1998, SIAM J. Numer. Anal. 35(2),
   * "Convergence analysis of pseudo-transient continuation"): ptc I added to the Jacobian, the
   * step taken without a line search, ptc scaled by the residual ratio (switched evolution
   * relaxation) so that it falls to zero and Newton's convergence returns. Entered where the
   * line search finds no descent: a stalled element at a kink or fold of its lift curve. */
  double ptc = 0.0;
  for (int it = 0; it < 200; it++) {
    if (!isfinite(rmax)) {
      return 0;
    }
    if (rmax <= 1e-9 * scale) {
      return 1;
    }
    for (size_t i = 0; i < n; i++) {
      double h = 1e-6 * (fabs(s->v) + s->omega * s->rc[i]);
      ascr_table_sample t;
      s->dga[i] = (local_g(s, i, s->ua[i] + h, s->ut[i], &t, NULL, NULL) -
                   local_g(s, i, s->ua[i] - h, s->ut[i], &t, NULL, NULL)) / (2.0 * h);
      s->dgt[i] = (local_g(s, i, s->ua[i], s->ut[i] + h, &t, NULL, NULL) -
                   local_g(s, i, s->ua[i], s->ut[i] - h, &t, NULL, NULL)) / (2.0 * h);
      /* the viscosity term's own dependence on the inflow, through mu: folded into dga, dgt
       * (the residual is Gamma - g - mu L, so -L dmu/du enters as dg/du does) */
      double lap = second_difference(s, i);
      if (lap != 0.0) {
        s->dga[i] += lap * (mu_at(s, i, s->ua[i] + h, s->ut[i]) - mu_at(s, i, s->ua[i] - h, s->ut[i])) / (2.0 * h);
        s->dgt[i] += lap * (mu_at(s, i, s->ua[i], s->ut[i] + h) - mu_at(s, i, s->ua[i], s->ut[i] - h)) / (2.0 * h);
      }
      s->rhs[i] = -r[i];
    }
    for (size_t i = 0; i < n; i++) {
      for (size_t j = 0; j < n; j++) {
        s->jac[i * n + j] = (i == j ? 1.0 + ptc : 0.0) -
                            s->hs * (s->dga[i] * s->A[i * n + j] + s->dgt[i] * s->T[i * n + j]);
      }
      /* the viscosity term at the current mu */
      size_t il = i > 0 ? i - 1 : i, ir = i + 1 < n ? i + 1 : i;
      s->jac[i * n + i] += 2.0 * s->mu[i];
      s->jac[i * n + il] -= s->mu[i];
      s->jac[i * n + ir] -= s->mu[i];
    }
    lapack_int info = LAPACKE_dgesv(LAPACK_ROW_MAJOR, (lapack_int)n, 1, s->jac, (lapack_int)n,
                                    s->ipiv, s->rhs, 1);
    if (info != 0) {
      return 0;
    }
    /* at most a fifth of the circulation scale per element and step */
    double dmax = 0.0;
    for (size_t i = 0; i < n; i++) dmax = fmax(dmax, fabs(s->rhs[i]));
    double lam = dmax > 0.2 * scale ? 0.2 * scale / dmax : 1.0;
    memcpy(g0, s->gam, n * sizeof *g0);
    double rnew = HUGE_VAL;
    if (ptc > 0.0) {
      for (size_t i = 0; i < n; i++) s->gam[i] = g0[i] + lam * s->rhs[i];
      rnew = residual_all(s, r);
      if (!(rnew < 10.0 * rmax)) {
        /* too long a pseudo-time step: back, and shorter */
        memcpy(s->gam, g0, n * sizeof *g0);
        rmax = residual_all(s, r);
        ptc *= 10.0;
        if (ptc > 1e6) return 0;
        continue;
      }
      ptc *= rnew / rmax;
      if (ptc < 1e-8) ptc = 0.0; /* back to Newton */
      rmax = rnew;
      continue;
    }
    for (int ls = 0; ls < 12; ls++) {
      for (size_t i = 0; i < n; i++) s->gam[i] = g0[i] + lam * s->rhs[i];
      rnew = residual_all(s, r);
      if (rnew < (1.0 - 1e-4 * lam) * rmax) {
        break;
      }
      lam *= 0.5;
    }
    if (!(rnew < rmax)) {
      /* no descent along the Newton direction: pseudo-transient steps from here */
      memcpy(s->gam, g0, n * sizeof *g0);
      rmax = residual_all(s, r);
      ptc = 1.0;
      continue;
    }
    rmax = rnew;
  }
  return rmax <= 1e-6 * scale;
}

/* Homotopy from the start state: with the induced velocity hs (A Gamma) + (1 - hs) u0, hs = 0
 * is solved element by element (Gamma = g(u0)) and hs is raised to 1 in adaptive steps, each
 * solved by Newton from the last. It follows the branch of solutions that starts at the BEMT
 * (or previous-wake) state, which is what the direct Newton iteration loses where stalled
 * sections admit several circulation distributions. Returns 1 on reaching hs = 1. */
static int solve_homotopy(vx *s)
{
  size_t n = s->n;
  for (size_t i = 0; i < n; i++) {
    ascr_table_sample q;
    s->gam[i] = local_g(s, i, s->ua0[i], s->ut0[i], &q, NULL, NULL);
  }
  double h = 0.0, dh = 0.25;
  while (h < 1.0) {
    double target = fmin(1.0, h + dh);
    memcpy(s->gsave, s->gam, n * sizeof *s->gam);
    s->hs = target;
    if (solve_gamma(s)) {
      h = target;
      dh = fmin(1.5 * dh, 0.5);
    } else {
      memcpy(s->gam, s->gsave, n * sizeof *s->gam);
      dh *= 0.5;
      if (dh < 1.0 / 256.0) {
        s->hs = 1.0;
        return 0;
      }
    }
  }
  s->hs = 1.0;
  return 1;
}

static void vx_free(vx *s)
{
  free(s->edge); free(s->rc); free(s->dr); free(s->chord); free(s->theta); free(s->core);
  free(s->s0); free(s->s1); free(s->w); free(s->A); free(s->T); free(s->fa); free(s->ft);
  free(s->psi); free(s->gam); free(s->ua); free(s->ut); free(s->jac); free(s->rhs);
  free(s->dga); free(s->dgt); free(s->ipiv); free(s->ua0); free(s->ut0); free(s->gsave);
  free(s->mu);
}

/* Advance per radian of the rigid helical wake: h = (V + w)/Omega, one value for every
 * trailing filament, w the thrust-weighted mean axial induced velocity at the lifting line
 * (weights Gamma (Omega r - u_t) dr, the Kutta-Joukowski thrust of each element; the plain
 * r dr mean where no element pushes). w is the uniform velocity that takes the same induced
 * power at the same thrust (P_i = T w), and a semi-infinite helical sheet convected at the
 * disc's induced velocity reproduces momentum theory's v = sqrt(T / (2 rho A)) at the disc
 * (docs/theory/rotor.md, "Wake pitch"). Pitches taken from each edge's local inflow (the
 * moderately loaded form of Lerbs 1952, used before) made a hovering rotor with outboard
 * loading convect its outer filaments faster than the disc flow: figures of merit above 1. */
static double wake_pitch(const vx *s)
{
  double wt = 0.0, w = 0.0, aw = 0.0, a = 0.0;
  for (size_t i = 0; i < s->n; i++) {
    double dt = fmax(s->gam[i] * (s->omega * s->rc[i] - s->ut[i]) * s->dr[i], 0.0);
    wt += dt * s->ua[i];
    w += dt;
    aw += s->ua[i] * s->rc[i] * s->dr[i];
    a += s->rc[i] * s->dr[i];
  }
  double wbar = w > 0.0 ? wt / w : aw / a;
  return (s->v + wbar) / s->omega;
}

ascr_status rotor_vortex_from(const ascr_blade *b, const ascr_polar_table *const *tables,
                              const ascr_rotor_params *pin, const ascr_vortex_params *vpin,
                              double rpm, double speed_m_s, const ascr_rotor_result *bres,
                              const ascr_rotor_element *bel, ascr_rotor_result *res,
                              ascr_rotor_element *el, ascr_errbuf *err)
{
  ascr_rotor_params p = *pin;
  ascr_vortex_params vp = *vpin;
  size_t n = p.n_elements;
  const ascr_rotor_result br = *bres;
  vx s;
  memset(&s, 0, sizeof s);
  s.b = b;
  s.tables = tables;
  s.p = &p;
  s.n = n;
  s.nb = b->n_blades;
  s.omega = rpm * 2.0 * ASCR_PI / 60.0;
  s.v = speed_m_s;
  s.edge = core_calloc(n + 1, sizeof *s.edge);
  s.core = core_calloc(n + 1, sizeof *s.core);
  s.rc = core_calloc(n, sizeof *s.rc);
  s.dr = core_calloc(n, sizeof *s.dr);
  s.chord = core_calloc(n, sizeof *s.chord);
  s.theta = core_calloc(n, sizeof *s.theta);
  s.s0 = core_calloc(n, sizeof *s.s0);
  s.s1 = core_calloc(n, sizeof *s.s1);
  s.w = core_calloc(n, sizeof *s.w);
  s.A = core_calloc(n * n, sizeof *s.A);
  s.T = core_calloc(n * n, sizeof *s.T);
  s.fa = core_calloc(n * (n + 1), sizeof *s.fa);
  s.ft = core_calloc(n * (n + 1), sizeof *s.ft);
  s.psi = core_calloc(4002, sizeof *s.psi);
  s.gam = core_calloc(n, sizeof *s.gam);
  s.ua = core_calloc(n, sizeof *s.ua);
  s.ut = core_calloc(n, sizeof *s.ut);
  s.jac = core_calloc(n * n, sizeof *s.jac);
  s.rhs = core_calloc(3 * n, sizeof *s.rhs);
  s.dga = core_calloc(n, sizeof *s.dga);
  s.dgt = core_calloc(n, sizeof *s.dgt);
  s.ipiv = core_calloc(n, sizeof *s.ipiv);
  s.ua0 = core_calloc(n, sizeof *s.ua0);
  s.ut0 = core_calloc(n, sizeof *s.ut0);
  s.gsave = core_calloc(n, sizeof *s.gsave);
  s.mu = core_calloc(n, sizeof *s.mu);
  s.hs = 1.0;
  if (s.edge == NULL || s.core == NULL || s.rc == NULL || s.dr == NULL || s.chord == NULL ||
      s.theta == NULL || s.s0 == NULL || s.s1 == NULL || s.w == NULL || s.A == NULL ||
      s.T == NULL || s.fa == NULL || s.ft == NULL || s.psi == NULL || s.gam == NULL ||
      s.ua == NULL || s.ut == NULL || s.jac == NULL || s.rhs == NULL || s.dga == NULL ||
      s.dgt == NULL || s.ipiv == NULL || s.ua0 == NULL || s.ut0 == NULL || s.gsave == NULL ||
      s.mu == NULL) {
    vx_free(&s);
    return core_fail(err, ASCR_ENOMEM, "vortex model: out of memory");
  }
  double r0 = b->stations[0].r_m, r1 = b->stations[b->n_stations - 1].r_m;
  for (size_t e = 0; e <= n; e++) {
    s.edge[e] = rotor_edge(r0, r1, e, n);
  }
  /* core radius: a fraction of the narrower neighbouring element, so that the regularisation
   * only removes the singularity and never hides the tip vortex from the elements next to it */
  for (size_t e = 0; e <= n; e++) {
    double wl = e > 0 ? s.edge[e] - s.edge[e - 1] : HUGE_VAL;
    double wr = e < n ? s.edge[e + 1] - s.edge[e] : HUGE_VAL;
    s.core[e] = vp.core_widths * fmin(wl, wr);
  }
  double wsum = 0.0, asum = 0.0;
  for (size_t i = 0; i < n; i++) {
    s.rc[i] = 0.5 * (s.edge[i] + s.edge[i + 1]);
    s.dr[i] = s.edge[i + 1] - s.edge[i];
    double tw;
    rotor_blade_at(b, s.rc[i], &s.chord[i], &tw, &s.s0[i], &s.s1[i], &s.w[i]);
    s.theta[i] = tw * DEG;
    /* start: the BEMT circulation (W c cl / 2) and its mean axial induced velocity */
    if (br.converged && bel[i].converged) {
      double w = hypot(s.v + bel[i].v_axial_m_s, s.omega * s.rc[i] - bel[i].v_swirl_m_s);
      s.gam[i] = 0.5 * w * s.chord[i] * bel[i].cl;
      wsum += bel[i].v_axial_m_s * s.rc[i] * s.dr[i];
    }
    asum += s.rc[i] * s.dr[i];
  }
  /* helix advance per radian, one for all trailing filaments (wake_pitch), from the BEMT
   * induced velocities first */
  double *hedge = core_calloc(n + 1, sizeof *hedge);
  if (hedge == NULL) {
    vx_free(&s);
    return core_fail(err, ASCR_ENOMEM, "vortex model: out of memory");
  }
  for (size_t i = 0; i < n; i++) {
    s.ua[i] = br.converged && bel[i].converged ? bel[i].v_axial_m_s : wsum / asum;
    s.ut[i] = br.converged && bel[i].converged ? bel[i].v_swirl_m_s : 0.0;
  }
  const double hmin = 0.005 * b->r_tip_m; /* at least 0.5 % of the tip speed */
  int ok = 0, wake_ok = 0;
  /* the pitch is the fixed point h = F(h) of "solve the circulation in the wake of pitch h,
   * take its wake_pitch": secant steps on F(h) - h from the second solve on (the plain
   * substitution h <- F(h) took 5 to 8 wake solves on the demo's points), each kept within a
   * factor 2 of F(h) and replaced by F(h) where the secant has no slope */
  double hcur = 0.0, hold = 0.0, gold = 0.0;
  for (int it = 0; it <= vp.max_wake_iter; it++) {
    double hbar = wake_pitch(&s);
    if (!(hbar > hmin)) {
      ok = 0; /* the wake does not leave the disc: outside what a rigid wake can model */
      break;
    }
    double hnext = hbar;
    if (it > 0) {
      double g = hbar - hcur;
      if (fabs(g) <= 1e-4 * hcur) {
        wake_ok = 1;
        break;
      }
      if (it == vp.max_wake_iter) {
        break;
      }
      if (it > 1 && g != gold) {
        double sec = hcur - g * (hcur - hold) / (g - gold);
        if (isfinite(sec) && sec > hmin) {
          hnext = fmin(fmax(sec, 0.5 * hbar), 2.0 * hbar);
        }
      }
      hold = hcur;
      gold = g;
    }
    hcur = hnext;
    for (size_t e = 0; e <= n; e++) hedge[e] = hcur;
    build_influence(&s, hedge, &vp);
    memcpy(s.ua0, s.ua, n * sizeof *s.ua0); /* the start state's induced velocities */
    memcpy(s.ut0, s.ut, n * sizeof *s.ut0);
    memcpy(s.gsave, s.gam, n * sizeof *s.gam);
    ok = solve_gamma(&s);
    if (!ok) {
      ok = solve_homotopy(&s);
    }
    if (!ok) {
      break;
    }
    induced(&s);
  }
  free(hedge);
  int conv = ok && wake_ok;
  /* loads */
  memset(res, 0, sizeof *res);
  double thrust = 0.0, torque = 0.0, rho = p.density_kg_m3;
  rotor_flags fl = {0, 0, 0, 0, 0, 0.0, 0.0};
  if (ok) {
    induced(&s);
  }
  for (size_t i = 0; i < n; i++) {
    ascr_table_sample q;
    double w = 0.0, ph = 0.0;
    local_g(&s, i, s.ua[i], s.ut[i], &q, &w, &ph);
    double va = s.v + s.ua[i], vt = s.omega * s.rc[i] - s.ut[i];
    double dt = s.nb * (rho * s.gam[i] * vt - 0.5 * rho * w * s.chord[i] * q.cd * va);
    double dq = s.nb * (rho * s.gam[i] * va + 0.5 * rho * w * s.chord[i] * q.cd * vt) * s.rc[i];
    if (conv) {
      thrust += dt * s.dr[i];
      torque += dq * s.dr[i];
      rotor_flags_add(&fl, &q, dt, s.dr[i]);
    }
    if (el != NULL) {
      ascr_rotor_element *o = &el[i];
      memset(o, 0, sizeof *o);
      o->r_m = s.rc[i];
      o->dr_m = s.dr[i];
      o->chord_m = s.chord[i];
      o->converged = conv;
      o->phi_deg = conv ? ph / DEG : NAN;
      o->alpha_deg = conv ? (s.theta[i] - ph) / DEG : NAN;
      o->re = conv ? rho * w * s.chord[i] / p.viscosity_pa_s : NAN;
      o->mach = conv ? w / p.sound_speed_m_s : NAN;
      o->cl = conv ? 2.0 * s.gam[i] / (w * s.chord[i]) : NAN;
      o->cd = conv ? q.cd : NAN;
      o->cm = conv ? rotor_sample_cm(s.tables, s.s0[i], s.s1[i], s.w[i], s.theta[i] - ph, o->re, o->mach)
                   : NAN;
      o->dM_dr_Nm_m = conv ? 0.5 * rho * w * w * s.chord[i] * s.chord[i] * o->cm : NAN;
      o->v_axial_m_s = conv ? s.ua[i] : NAN;
      o->v_swirl_m_s = conv ? s.ut[i] : NAN;
      o->loss = 1.0;
      o->dT_dr_N_m = conv ? dt : NAN;
      o->dQ_dr_Nm_m = conv ? dq : NAN;
      o->region = q.region;
      o->stalled = q.stalled;
      o->re_outside = q.re_outside;
      o->trip_unbound = q.trip_unbound;
    }
  }
  rotor_point_finish(b, &p, rpm, speed_m_s, thrust, torque, conv, &fl, res);
  vx_free(&s);
  return ASCR_OK;
}
