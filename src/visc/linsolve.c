/* src/visc/linsolve.c
 * Solution of the Newton system in structured form J = L + U D Q (see below).
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <cblas.h>
#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

/* ---- structured solve of the Newton system ----------------------------------------------
 * J = L + U D Q: L holds each residual's derivatives with respect to the unknowns of its own
 * and its upstream stations (block lower triangular in station order: a residual involves its
 * station, the one before it, and at the wake's first station the two trailing-edge stations);
 * U holds its derivatives with respect to edge velocities; D is the mass-defect influence
 * (ue = ue_inv + D m) and Q picks the m unknowns. With y = D Q x (the edge-velocity change):
 *     x = L^-1 (b - U y),   (I + D Q L^-1 U) y = D Q L^-1 b,
 * so the dense factorisation is of order nst instead of 3 nst (27 times fewer operations) and
 * the rest is block substitution. The result is checked against the structured matrix; a
 * solution that does not satisfy it to 1e-6 of the residual falls back to the dense LU. */

/* Invert the diagonal blocks of L once per Newton step; 0 if one is singular. */
static int invert_diagonal(ascr_visc_solver *v)
{
  for (size_t k = 0; k < v->nst; k++) {
    const size_t *ls = v->lst + 3 * k;
    int qs = -1;
    for (int q = 0; q < 3 && ls[q] != SIZE_MAX; q++) {
      if (ls[q] == k) qs = q;
    }
    if (qs < 0) return 0;
    double a[9], *inv = v->dinv + 9 * k;
    memcpy(a, v->lblk + (3 * k + (size_t)qs) * 9, sizeof a);
    /* the inverse's columns solved together: inv starts as the identity (row-major) */
    for (int e = 0; e < 9; e++) inv[e] = e % 4 == 0;
    if (!core_solve_small_multi(a, inv, 3, 3)) return 0;
  }
  return 1;
}

/* One station k of the substitution x <- L^-1 x (the stations before it done). */
static inline void lsolve_station(const ascr_visc_solver *v, double *x, size_t k)
{
  const size_t *ls = v->lst + 3 * k;
  double r0 = x[3 * k], r1 = x[3 * k + 1], r2 = x[3 * k + 2];
  for (int q = 0; q < 3 && ls[q] != SIZE_MAX; q++) {
    if (ls[q] == k) continue;
    const double *blk = v->lblk + (3 * k + (size_t)q) * 9;
    const double *xs = x + 3 * ls[q];
    r0 -= blk[0] * xs[0] + blk[1] * xs[1] + blk[2] * xs[2];
    r1 -= blk[3] * xs[0] + blk[4] * xs[1] + blk[5] * xs[2];
    r2 -= blk[6] * xs[0] + blk[7] * xs[1] + blk[8] * xs[2];
  }
  const double *d = v->dinv + 9 * k;
  x[3 * k] = d[0] * r0 + d[1] * r1 + d[2] * r2;
  x[3 * k + 1] = d[3] * r0 + d[4] * r1 + d[5] * r2;
  x[3 * k + 2] = d[6] * r0 + d[7] * r1 + d[8] * r2;
}

/* x <- L^-1 x, forward over stations from k0 (x is zero above station k0). */
static void lsolve(const ascr_visc_solver *v, double *x, size_t k0)
{
  for (size_t k = k0; k < v->nst; k++) lsolve_station(v, x, k);
}

/* lsolve on LCOLS columns of ld doubles at once (x + c ld, each zero above its own station
 * k0[c]): every column takes the same operations in the same order as lsolve alone (the same
 * numbers); the columns' independent substitutions overlap in the processor. */
enum { LCOLS = 4 };
static void lsolve_cols(const ascr_visc_solver *v, double *x, size_t ld, const size_t k0[LCOLS])
{
  size_t kmin = k0[0];
  for (int c = 1; c < LCOLS; c++) kmin = k0[c] < kmin ? k0[c] : kmin;
  for (size_t k = kmin; k < v->nst; k++) {
    for (int c = 0; c < LCOLS; c++) {
      if (k >= k0[c]) lsolve_station(v, x + (size_t)c * ld, k);
    }
  }
}

/* Solve J dx = -R (unscaled unknowns) in structured form; 1 on success. */
int visc_solve_structured(ascr_visc_solver *v)
{
  const size_t nst = v->nst, N = 3 * nst;
  double *zf = v->J; /* N x nst, column-major: L^-1 U */
  if (!invert_diagonal(v)) return 0;
  for (size_t j = 0; j < nst; j++) memset(zf + j * N, 0, N * sizeof *zf);
  /* scatter U by columns (D rows); yv holds, per column, the first station with a nonzero
   * (the substitution starts there: L is lower triangular) */
  for (size_t j = 0; j < nst; j++) v->yv[j] = (double)nst;
  for (size_t row = 0; row < N; row++) {
    for (int q = 0; q < v->ucnt[row]; q++) {
      size_t j = v->uidx[row * UMAX + (size_t)q];
      zf[j * N + row] += v->ucoef[row * UMAX + (size_t)q];
      if ((double)(row / 3) < v->yv[j]) v->yv[j] = (double)(row / 3);
    }
  }
  size_t jc = 0;
  for (; jc + LCOLS <= nst; jc += LCOLS) {
    size_t k0[LCOLS];
    for (int c = 0; c < LCOLS; c++) k0[c] = (size_t)v->yv[jc + (size_t)c];
    lsolve_cols(v, zf + jc * N, N, k0);
  }
  for (; jc < nst; jc++) {
    size_t k0 = (size_t)v->yv[jc];
    if (k0 < nst) lsolve(v, zf + jc * N, k0);
  }
  /* zm = Q L^-1 U (row-major nst x nst) */
  for (size_t kk = 0; kk < nst; kk++) {
    for (size_t j = 0; j < nst; j++) v->zm[kk * nst + j] = zf[j * N + 3 * kk + 1];
  }
  /* M = I + D zm. Column j of zm is zero above station yv[j] (L is lower triangular), about
   * half of it: the product is taken by blocks of columns over the rows from the block's first
   * nonzero on (the same numbers as the full product, half the operations) */
  enum { ZBLK = 16 };
  for (size_t j0 = 0; j0 < nst; j0 += ZBLK) {
    size_t nb = nst - j0 < ZBLK ? nst - j0 : ZBLK, r0 = nst;
    for (size_t j = j0; j < j0 + nb; j++) {
      if ((size_t)v->yv[j] < r0) r0 = (size_t)v->yv[j];
    }
    if (r0 >= nst) {
      for (size_t i = 0; i < nst; i++) memset(v->mmat + i * nst + j0, 0, nb * sizeof *v->mmat);
      continue;
    }
    cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasNoTrans, (int)nst, (int)nb, (int)(nst - r0), 1.0,
                v->D + r0, (int)nst, v->zm + r0 * nst + j0, (int)nst, 0.0, v->mmat + j0, (int)nst);
  }
  for (size_t j = 0; j < nst; j++) v->mmat[j * nst + j] += 1.0;
  /* w = L^-1 (-R), y from M y = D Q w */
  for (size_t i = 0; i < N; i++) v->wv[i] = -v->R[i];
  lsolve(v, v->wv, 0);
  visc_d_times(v, NULL, v->wv + 1, 3, v->yv);
  /* mmat is row-major M, i.e. column-major M^T: factor that and solve with the transpose */
  lapack_int info = LAPACKE_dgetrf_work(LAPACK_COL_MAJOR, (lapack_int)nst, (lapack_int)nst, v->mmat,
                                   (lapack_int)nst, v->ipiv2);
  if (info != 0) return 0;
  info = LAPACKE_dgetrs_work(LAPACK_COL_MAJOR, 'T', (lapack_int)nst, 1, v->mmat, (lapack_int)nst,
                        v->ipiv2, v->yv, (lapack_int)nst);
  if (info != 0) return 0;
  /* dx = w - (L^-1 U) y */
  memcpy(v->dx, v->wv, N * sizeof *v->dx);
  cblas_dgemv(CblasColMajor, CblasNoTrans, (int)N, (int)nst, -1.0, zf, (int)N, v->yv, 1, 1.0,
              v->dx, 1);
  /* check: L dx + U D Q dx + R = 0 */
  double rmax = 0.0, emax = 0.0;
  visc_d_times(v, NULL, v->dx + 1, 3, v->wv); /* the edge-velocity change */
  for (size_t k = 0; k < nst; k++) {
    const size_t *ls = v->lst + 3 * k;
    for (size_t e = 0; e < 3; e++) {
      size_t row = 3 * k + e;
      double t = v->R[row];
      for (int q = 0; q < 3 && ls[q] != SIZE_MAX; q++) {
        const double *blk = v->lblk + (3 * k + (size_t)q) * 9;
        const double *xs = v->dx + 3 * ls[q];
        t += blk[e * 3] * xs[0] + blk[e * 3 + 1] * xs[1] + blk[e * 3 + 2] * xs[2];
      }
      for (int q = 0; q < v->ucnt[row]; q++) {
        t += v->ucoef[row * UMAX + (size_t)q] * v->wv[v->uidx[row * UMAX + (size_t)q]];
      }
      emax = fmax(emax, fabs(t));
      rmax = fmax(rmax, fabs(v->R[row]));
    }
  }
  return isfinite(emax) && emax <= 1e-6 * rmax + 1e-300;
}

