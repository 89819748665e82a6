/* bench/bench_visc.c
 * Timing of the viscous stage: an alpha sweep of NACA 2412 at 160 panels, Re 1e5 and 1e6
 * (-2 to 10 deg by 0.5 deg, continuation), reporting the median wall time per converged point,
 * the mean and median Newton iterations per point, and the time of one dense LU (LAPACKE dgesv) of the
 * coupled system's order measured in the same run, so that the cost per point can be read in
 * LU-equivalents. A cold start (one point from a fresh march) is timed too. The sweep is
 * repeated three times and each point's time is its median over the repeats; the LU is timed
 * before and after (median of 14), so that a drift of the machine's speed does not enter the
 * ratio. Both the median point and the mean over the sweep (total time / points: what a polar
 * costs) are given in LU-equivalents, with the slowest point's iterations.
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

static void lu_times(int n, double *t)
{
  double *a = malloc((size_t)n * (size_t)n * sizeof *a), *b = malloc((size_t)n * sizeof *b);
  lapack_int *ip = malloc((size_t)n * sizeof *ip);
  for (int rep = 0; rep < 7; rep++) {
    srand(12345);
    for (int i = 0; i < n * n; i++) a[i] = (double)rand() / RAND_MAX + (i % (n + 1) == 0 ? n : 0);
    for (int i = 0; i < n; i++) b[i] = 1.0;
    double t0 = bench_now();
    LAPACKE_dgesv(LAPACK_COL_MAJOR, n, 1, a, n, ip, b, n);
    t[rep] = bench_now() - t0;
  }
  free(a);
  free(b);
  free(ip);
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
  enum { REPS = 3 };
  double tl[14];
  lu_times(order, tl);
  const double res[2] = {1e5, 1e6};
  size_t np = ascr_polar_grid_size(-2.0, 10.0, 0.5);
  double *tp = malloc(REPS * 2 * np * sizeof *tp), *ip = malloc(2 * np * sizeof *ip);
  double tcold[2][REPS];
  size_t conv[2] = {0, 0};
  long its[2] = {0, 0};
  for (int rep = 0; rep < REPS; rep++) {
    for (int k = 0; k < 2; k++) {
      ascr_visc_params p = ascr_visc_params_defaults();
      p.re = res[k];
      ascr_visc_solver_set(v, w, &p, NULL);
      /* cold start at 2 deg */
      ascr_visc_result r;
      double t0 = bench_now();
      ascr_visc_solver_solve(v, 2.0 * 3.14159265358979323846 / 180.0, 0, &r, NULL);
      tcold[k][rep] = bench_now() - t0;
      /* the sweep, point by point with continuation (as ascr_polar_sweep steps) */
      int warm = 0;
      for (size_t i = 0; i < np; i++) {
        double a = (-2.0 + 0.5 * (double)i) * 3.14159265358979323846 / 180.0;
        t0 = bench_now();
        ascr_status st = ascr_visc_solver_solve(v, a, warm, &r, NULL);
        tp[(k * np + i) * REPS + rep] = bench_now() - t0;
        if (rep == 0) {
          if (i > 0) its[k] += r.iterations;
          ip[k * np + i] = (double)r.iterations;
          if (st == ASCR_OK) conv[k]++;
        }
        warm = st == ASCR_OK;
      }
    }
  }
  lu_times(order, tl + 7);
  qsort(tl, 14, sizeof *tl, bench_cmp);
  double tlu = 0.5 * (tl[6] + tl[7]);
  printf("viscous stage, NACA 2412, %zu panels, %zu wake nodes: Newton system of order %d\n",
         n - 1, nw, order);
  printf("one dense LU (dgesv) of that order: %.2f ms (median of 14, before and after)\n", 1e3 * tlu);
  printf("sweep -2..10 deg by 0.5 deg, %d repeats (each point: its median); the swept points\n"
         "are the %zu after the first, which starts cold (its cost in '1st LU'; 'cold LU': a cold\n"
         "start at 2 deg)\n\n", REPS, np - 1);
  printf("%8s %10s %9s %9s %6s %6s %8s %9s %9s %8s %8s\n", "Re", "converged", "median ms", "mean ms",
         "its", "mean", "its max", "LU-eq md", "LU-eq mn", "1st LU", "cold LU");
  const size_t ns = np - 1;
  for (int k = 0; k < 2; k++) {
    double *pt = malloc(ns * sizeof *pt), total = 0.0, first = 0.0;
    for (size_t i = 0; i < np; i++) {
      double *t3 = tp + (k * np + i) * REPS;
      qsort(t3, REPS, sizeof *t3, bench_cmp);
      if (i == 0) {
        first = t3[REPS / 2];
        continue;
      }
      pt[i - 1] = t3[REPS / 2];
      total += pt[i - 1];
    }
    qsort(pt, ns, sizeof *pt, bench_cmp);
    double *ik = ip + k * np + 1;
    qsort(ik, ns, sizeof *ik, bench_cmp);
    qsort(tcold[k], REPS, sizeof tcold[k][0], bench_cmp);
    double med = pt[ns / 2], mean = total / (double)ns;
    printf("%8.0e %6zu/%-3zu %9.2f %9.2f %6.0f %6.1f %8.0f %9.2f %9.2f %8.1f %8.1f\n", res[k], conv[k],
           np, 1e3 * med, 1e3 * mean, ik[ns / 2], (double)its[k] / (double)ns, ik[ns - 1], med / tlu,
           mean / tlu, first / tlu, tcold[k][REPS / 2] / tlu);
    free(pt);
  }
  free(tp);
  free(ip);
  ascr_visc_solver_free(v);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  ascr_geom_section_free(raw);
  return 0;
}
