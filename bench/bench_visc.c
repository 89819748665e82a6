/* bench/bench_visc.c
 * Timing of the viscous stage: an alpha sweep of NACA 2412 at 160 panels, Re 1e5 and 1e6
 * (-2 to 10 deg by 0.5 deg, continuation), reporting the median wall time per converged point,
 * the mean and median Newton iterations per point, and the time of one dense LU (LAPACKE dgesv) of the
 * coupled system's order measured in the same run, so that the cost per point can be read in
 * LU-equivalents. A cold start (one point from a fresh march) is timed too.
 * Issue goal: <= 3 LU-equivalents per swept point, <= 10 for a cold start (issue 11).
 * Figures only.
 */
#define _POSIX_C_SOURCE 200809L
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <lapacke.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include "bench_util.h"

void openblas_set_num_threads(int num_threads);

static double lu_time(int n)
{
  double *a = malloc((size_t)n * (size_t)n * sizeof *a), *b = malloc((size_t)n * sizeof *b);
  lapack_int *ip = malloc((size_t)n * sizeof *ip);
  double t[7];
  for (int rep = 0; rep < 7; rep++) {
    srand(12345);
    for (int i = 0; i < n * n; i++) a[i] = (double)rand() / RAND_MAX + (i % (n + 1) == 0 ? n : 0);
    for (int i = 0; i < n; i++) b[i] = 1.0;
    double t0 = bench_now();
    LAPACKE_dgesv(LAPACK_COL_MAJOR, n, 1, a, n, ip, b, n);
    t[rep] = bench_now() - t0;
  }
  qsort(t, 7, sizeof *t, bench_cmp);
  free(a);
  free(b);
  free(ip);
  return t[3];
}

int main(void)
{
  gsl_set_error_handler_off();
  openblas_set_num_threads(1);
  ascr_geom_section *raw = NULL, *s = NULL;
  if (ascr_geom_section_from_spec("naca2412", &raw, NULL) != ASCR_OK) return 1;
  if (ascr_geom_section_repanel(raw, NULL, &s, NULL) != ASCR_OK) return 1;
  size_t n = ascr_geom_section_size(s), nw = ascr_visc_default_wake_nodes(n);
  ascr_panel_solver *w = ascr_panel_solver_alloc(n);
  ascr_panel_solver_set(w, s, NULL);
  ascr_visc_solver *v = ascr_visc_solver_alloc(n, nw);
  int order = (int)(3 * (n + nw));
  double tlu = lu_time(order);
  printf("viscous stage, NACA 2412, %zu panels, %zu wake nodes: Newton system of order %d\n",
         n - 1, nw, order);
  printf("one dense LU (dgesv) of that order: %.2f ms (median of 7)\n\n", 1e3 * tlu);
  printf("%8s %10s %12s %8s %6s %10s %12s\n", "Re", "converged", "ms/point", "its mean", "median",
         "LU-eq", "cold ms");
  const double res[2] = {1e5, 1e6};
  for (int k = 0; k < 2; k++) {
    ascr_visc_params p = ascr_visc_params_defaults();
    p.re = res[k];
    ascr_visc_solver_set(v, w, &p, NULL);
    /* cold start at 2 deg */
    ascr_visc_result r;
    double t0 = bench_now();
    ascr_visc_solver_solve(v, 2.0 * 3.14159265358979323846 / 180.0, 0, &r, NULL);
    double tcold = bench_now() - t0;
    /* sweep: per-point time from the progress callback is not available, so time each point
     * by sweeping in single steps with continuation */
    size_t np = ascr_polar_grid_size(-2.0, 10.0, 0.5);
    double *tp = malloc(np * sizeof *tp), *ip = malloc(np * sizeof *ip);
    long its = 0;
    size_t conv = 0;
    int warm = 0;
    for (size_t i = 0; i < np; i++) {
      double a = (-2.0 + 0.5 * (double)i) * 3.14159265358979323846 / 180.0;
      t0 = bench_now();
      ascr_status st = ascr_visc_solver_solve(v, a, warm, &r, NULL);
      tp[i] = bench_now() - t0;
      its += r.iterations;
      ip[i] = (double)r.iterations;
      if (st == ASCR_OK) conv++;
      warm = st == ASCR_OK;
    }
    qsort(tp, np, sizeof *tp, bench_cmp);
    qsort(ip, np, sizeof *ip, bench_cmp);
    double med = tp[np / 2];
    printf("%8.0e %6zu/%-3zu %12.2f %8.1f %6.0f %10.1f %12.1f\n", res[k], conv, np, 1e3 * med,
           (double)its / (double)np, ip[np / 2], med / tlu, 1e3 * tcold);
    free(tp);
    free(ip);
  }
  ascr_visc_solver_free(v);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  ascr_geom_section_free(raw);
  return 0;
}
