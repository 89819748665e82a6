/* src/structure/modes.c
 * Natural frequencies of the rotating blade: flap, lag and torsion (include/airscrew/
 * ascr_structure.h; docs/theory/structure.md, "Rotating modes").
 *
 * Bending: Euler-Bernoulli elements with Hermite cubic shape functions between stations, the
 * element's properties the mean of its two stations; element matrices (Przemieniecki, Theory of
 * Matrix Structural Analysis, 1968, ch. 5 and 11; from memory):
 *   K_E = EI/h^3 [12 6h -12 6h; 6h 4h^2 -6h 2h^2; -12 -6h 12 -6h; 6h 2h^2 -6h 4h^2],
 *   M   = m h/420 [156 22h 54 -13h; 22h 4h^2 13h -3h^2; 54 13h 156 -22h; -13h -3h^2 -22h 4h^2],
 *   K_G = F/(30h) [36 3h -36 3h; 3h 4h^2 -3h -h^2; -36 -3h 36 -3h; 3h -h^2 -3h 4h^2],
 * F the centrifugal tension Omega^2 int_r^R m r' dr' at the element's middle. Flap:
 * K_E + K_G; lag: K_E + K_G - Omega^2 M (the in-plane component of the centrifugal force, which
 * makes a zero-offset hinged blade's lag frequency zero; Bramwell, Done & Balmford, Bramwell's
 * Helicopter Dynamics, 2nd ed. 2001, ch. 8; from memory). Torsion: linear elements,
 * K = GJ/h [1 -1; -1 1], M = rho Ip h/6 [2 1; 1 2], and the propeller moment (the centrifugal
 * forces turning the section towards the plane of rotation) Omega^2 rho (I_yy - I_xx) cos(2 theta)
 * with the same shape (Bielawa, Rotary Wing Structural Dynamics and Aeroelasticity, 1992, ch. 5;
 * from memory). Each family: K phi = omega^2 M phi by LAPACKE dsygv.
 */
#include "core/core_impl.h"
#include "airscrew/ascr_structure.h"

#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define DEG (ASCR_PI / 180.0)

ascr_modes_params ascr_modes_params_defaults(void)
{
  ascr_modes_params p;
  p.hinged_root = 0;
  p.n_modes = 3;
  return p;
}

/* add the 4x4 element matrix e at node i (dofs 2i .. 2i+3) into the full n x n matrix a, the
 * first `skip` dofs (the root's constrained ones) removed */
static void add4(double *a, size_t nd, size_t i, double e[4][4], size_t skip)
{
  for (int p = 0; p < 4; p++) {
    size_t gp = 2 * i + (size_t)p;
    if (gp < skip) continue;
    for (int q = 0; q < 4; q++) {
      size_t gq = 2 * i + (size_t)q;
      if (gq < skip) continue;
      a[(gp - skip) * nd + (gq - skip)] += e[p][q];
    }
  }
}

/* lowest eigenvalues of K phi = lambda M phi as frequencies in Hz (NaN for lambda < 0) */
static ascr_status solve(double *k, double *m, size_t nd, double *w, double *hz, size_t nm,
                         ascr_errbuf *err)
{
  lapack_int info = LAPACKE_dsygv(LAPACK_ROW_MAJOR, 1, 'N', 'U', (lapack_int)nd, k, (lapack_int)nd,
                                  m, (lapack_int)nd, w);
  if (info != 0) return core_fail(err, ASCR_ESING, "modes: the eigen solver failed (info %d)", (int)info);
  for (size_t j = 0; j < nm; j++) {
    hz[j] = j < nd && w[j] >= 0.0 ? sqrt(w[j]) / (2.0 * ASCR_PI) : NAN;
  }
  return ASCR_OK;
}

ascr_status ascr_blade_modes_at(const ascr_structure_station *st, size_t n, double rpm,
                                const ascr_modes_params *pin, ascr_blade_modes *out,
                                ascr_errbuf *err)
{
  ascr_modes_params p = pin != NULL ? *pin : ascr_modes_params_defaults();
  if (st == NULL || out == NULL || n < 3 || !(rpm >= 0.0 && isfinite(rpm)) || p.n_modes < 1 ||
      p.n_modes > ASCR_MODES_MAX) {
    return core_fail(err, ASCR_EINVAL, "modes: bad arguments (3 or more stations, rpm >= 0, 1 .. %d "
                     "modes)", ASCR_MODES_MAX);
  }
  for (size_t i = 0; i < n; i++) {
    if (!(st[i].mass_per_length_kg_m > 0.0) || !(st[i].ei_flap_nm2 > 0.0) ||
        !(st[i].ei_lag_nm2 > 0.0) || !(st[i].gj_nm2 > 0.0) || (i > 0 && !(st[i].r_m > st[i - 1].r_m))) {
      return core_fail(err, ASCR_EINVAL, "modes: station %zu: mass, stiffnesses > 0 and ascending "
                       "radii required", i);
    }
  }
  double om = rpm * 2.0 * ASCR_PI / 60.0, om2 = om * om;
  size_t ne = n - 1, skip = p.hinged_root ? 1 : 2, nd = 2 * n - skip, nt = n - 1;
  double *kf = calloc(nd * nd, sizeof *kf), *kl = calloc(nd * nd, sizeof *kl);
  double *mb = calloc(nd * nd, sizeof *mb), *ml = calloc(nd * nd, sizeof *ml);
  double *kt = calloc(nt * nt, sizeof *kt), *mt = calloc(nt * nt, sizeof *mt);
  double *w = calloc(nd, sizeof *w), *f = calloc(n, sizeof *f);
  ascr_status s = ASCR_OK;
  if (kf == NULL || kl == NULL || mb == NULL || ml == NULL || kt == NULL || mt == NULL || w == NULL ||
      f == NULL) {
    s = core_fail(err, ASCR_ENOMEM, "modes: out of memory");
    goto done;
  }
  /* centrifugal tension at each station (trapezoidal rule from the tip) */
  f[n - 1] = 0.0;
  for (size_t i = n - 1; i-- > 0;) {
    double h = st[i + 1].r_m - st[i].r_m;
    f[i] = f[i + 1] + 0.5 * h * om2 *
                          (st[i].mass_per_length_kg_m * st[i].r_m +
                           st[i + 1].mass_per_length_kg_m * st[i + 1].r_m);
  }
  for (size_t e = 0; e < ne; e++) {
    const ascr_structure_station *a = &st[e], *b = &st[e + 1];
    double h = b->r_m - a->r_m, h2 = h * h, m = 0.5 * (a->mass_per_length_kg_m + b->mass_per_length_kg_m);
    double eif = 0.5 * (a->ei_flap_nm2 + b->ei_flap_nm2), eil = 0.5 * (a->ei_lag_nm2 + b->ei_lag_nm2);
    /* the tension at the element's middle: F decreases with r as int m r dr */
    double rm = 0.5 * (a->r_m + b->r_m);
    double fm = f[e + 1] + 0.5 * om2 * m * (b->r_m * b->r_m - rm * rm);
    const double ke[4][4] = {{12, 6 * h, -12, 6 * h}, {6 * h, 4 * h2, -6 * h, 2 * h2},
                             {-12, -6 * h, 12, -6 * h}, {6 * h, 2 * h2, -6 * h, 4 * h2}};
    const double me[4][4] = {{156, 22 * h, 54, -13 * h}, {22 * h, 4 * h2, 13 * h, -3 * h2},
                             {54, 13 * h, 156, -22 * h}, {-13 * h, -3 * h2, -22 * h, 4 * h2}};
    const double ge[4][4] = {{36, 3 * h, -36, 3 * h}, {3 * h, 4 * h2, -3 * h, -h2},
                             {-36, -3 * h, 36, -3 * h}, {3 * h, -h2, -3 * h, 4 * h2}};
    double kfe[4][4], kle[4][4], mee[4][4];
    for (int i = 0; i < 4; i++) {
      for (int j = 0; j < 4; j++) {
        double mij = m * h / 420.0 * me[i][j], gij = fm / (30.0 * h) * ge[i][j];
        mee[i][j] = mij;
        kfe[i][j] = eif / (h2 * h) * ke[i][j] + gij;
        kle[i][j] = eil / (h2 * h) * ke[i][j] + gij - om2 * mij;
      }
    }
    add4(kf, nd, e, kfe, skip);
    add4(kl, nd, e, kle, skip);
    add4(mb, nd, e, mee, skip);
    /* torsion: dofs theta_1 .. theta_{n-1} (theta_0 = 0 at the root) */
    double gj = 0.5 * (a->gj_nm2 + b->gj_nm2);
    double ip = 0.5 * (a->props.i_xx + a->props.i_yy + b->props.i_xx + b->props.i_yy);
    double rho = m / (0.5 * (a->props.area + b->props.area));
    double pm = 0.5 * (cos(2.0 * a->twist_deg * DEG) * (a->props.i_yy - a->props.i_xx) +
                       cos(2.0 * b->twist_deg * DEG) * (b->props.i_yy - b->props.i_xx));
    double kt2[2][2] = {{1, -1}, {-1, 1}}, mt2[2][2] = {{2, 1}, {1, 2}};
    for (int i = 0; i < 2; i++) {
      for (int j = 0; j < 2; j++) {
        size_t gi = e + (size_t)i, gj2 = e + (size_t)j;
        if (gi == 0 || gj2 == 0) continue;
        kt[(gi - 1) * nt + (gj2 - 1)] += gj / h * kt2[i][j] + om2 * rho * pm * h / 6.0 * mt2[i][j];
        mt[(gi - 1) * nt + (gj2 - 1)] += rho * ip * h / 6.0 * mt2[i][j];
      }
    }
  }
  memcpy(ml, mb, nd * nd * sizeof *ml);
  memset(out, 0, sizeof *out);
  out->rpm = rpm;
  out->n_modes = p.n_modes;
  s = solve(kf, mb, nd, w, out->flap_hz, p.n_modes, err);
  if (s == ASCR_OK) s = solve(kl, ml, nd, w, out->lag_hz, p.n_modes, err);
  if (s == ASCR_OK) s = solve(kt, mt, nt, w, out->torsion_hz, p.n_modes, err);
done:
  free(kf);
  free(kl);
  free(mb);
  free(ml);
  free(kt);
  free(mt);
  free(w);
  free(f);
  return s;
}

static double family_hz(const ascr_blade_modes *m, int fam, size_t j)
{
  return fam == 0 ? m->flap_hz[j] : fam == 1 ? m->lag_hz[j] : m->torsion_hz[j];
}

size_t ascr_campbell_crossings(const ascr_blade_modes *m, size_t n, int max_order,
                               ascr_campbell_crossing *out, size_t max_out)
{
  size_t cnt = 0;
  if (m == NULL || n < 1) return 0;
  for (int fam = 0; fam < 3; fam++) {
    for (size_t j = 0; j < m[0].n_modes && j < ASCR_MODES_MAX; j++) {
      for (int k = 1; k <= max_order; k++) {
        for (size_t i = 0; i < n; i++) {
          double g1 = family_hz(&m[i], fam, j) - k * m[i].rpm / 60.0;
          double rpm = NAN;
          if (g1 == 0.0) {
            rpm = m[i].rpm; /* on the line at a computed rpm */
          } else if (i > 0) {
            double g0 = family_hz(&m[i - 1], fam, j) - k * m[i - 1].rpm / 60.0;
            if (g0 != 0.0 && isfinite(g0) && isfinite(g1) && (g0 < 0.0) != (g1 < 0.0)) {
              rpm = m[i - 1].rpm + (m[i].rpm - m[i - 1].rpm) * g0 / (g0 - g1);
            }
          }
          if (isnan(rpm)) continue;
          if (cnt < max_out && out != NULL) {
            out[cnt] = (ascr_campbell_crossing){fam, j, k, rpm, k * rpm / 60.0};
          }
          cnt++;
        }
      }
    }
  }
  return cnt;
}
