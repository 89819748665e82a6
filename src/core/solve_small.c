/* src/core/solve_small.c
 * Dense solve of a small linear system (n <= 3): the boundary-layer station Newton steps of the
 * direct march (src/bl/march.c), the cold-start march and the diagonal blocks of the coupled
 * Newton matrix (src/visc/). Gaussian elimination with partial pivoting (Golub & Van Loan,
 * Matrix Computations, 3rd ed. 1996, Algorithm 3.4.1); 0-based indices, a row-major.
 */
#include "core/core_impl.h"

#include <math.h>

int core_solve_small_multi(double *a, double *b, int n, int nrhs)
{
  for (int c = 0; c < n; c++) {
    int p = c;
    for (int r = c + 1; r < n; r++) {
      if (fabs(a[r * n + c]) > fabs(a[p * n + c])) p = r;
    }
    if (!(fabs(a[p * n + c]) > 1e-300)) return 0;
    if (p != c) {
      for (int q = 0; q < n; q++) {
        double t = a[c * n + q];
        a[c * n + q] = a[p * n + q];
        a[p * n + q] = t;
      }
      for (int j = 0; j < nrhs; j++) {
        double t = b[c * nrhs + j];
        b[c * nrhs + j] = b[p * nrhs + j];
        b[p * nrhs + j] = t;
      }
    }
    for (int r = c + 1; r < n; r++) {
      double f = a[r * n + c] / a[c * n + c];
      for (int q = c; q < n; q++) a[r * n + q] -= f * a[c * n + q];
      for (int j = 0; j < nrhs; j++) b[r * nrhs + j] -= f * b[c * nrhs + j];
    }
  }
  for (int c = n - 1; c >= 0; c--) {
    for (int j = 0; j < nrhs; j++) {
      double t = b[c * nrhs + j];
      for (int q = c + 1; q < n; q++) t -= a[c * n + q] * b[q * nrhs + j];
      b[c * nrhs + j] = t / a[c * n + c];
    }
  }
  return 1;
}

int core_solve_small(double *a, double *b, int n)
{
  return core_solve_small_multi(a, b, n, 1);
}
