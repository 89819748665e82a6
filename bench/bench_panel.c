/* bench/bench_panel.c
 * Timing of the inviscid panel stage: repanelling, influence-matrix setup + LU factor
 * (ascr_panel_solver_set), and one further angle of attack (ascr_panel_solver_solve with the
 * Cp and q arrays), at 80, 160 and 320 panels on NACA 2412. Prints the median of repeated
 * measurements (wall clock, CLOCK_MONOTONIC), one OpenBLAS thread. Goal on a 2-core machine: 160 panels set-up +
 * factor < 5 ms, each further alpha < 20 us. Not a test: figures only.
 */
#define _POSIX_C_SOURCE 200809L
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include "bench_util.h"

void openblas_set_num_threads(int num_threads);

int main(void)
{
  gsl_set_error_handler_off();
  openblas_set_num_threads(1); /* small systems: threads cost more than they save */
  ascr_geom_section *s = NULL;
  if (ascr_geom_section_from_spec("naca2412", &s, NULL) != ASCR_OK) return 1;
  const size_t counts[3] = {80, 160, 320};
  enum { REPEATS = 31, ALPHAS = 200 };
  printf("panel stage timings, NACA 2412, median of %d repeats\n", REPEATS);
  printf("%8s %14s %20s %16s\n", "panels", "repanel [ms]", "set-up+factor [ms]", "per alpha [us]");
  for (int k = 0; k < 3; k++) {
    ascr_geom_repanel_params p = ascr_geom_repanel_defaults();
    p.n_panels = counts[k];
    double trep[REPEATS], tset[REPEATS], talpha[REPEATS];
    ascr_geom_section *r = NULL;
    for (int i = 0; i < REPEATS; i++) {
      ascr_geom_section_free(r);
      double t0 = bench_now();
      if (ascr_geom_section_repanel(s, &p, &r, NULL) != ASCR_OK) return 1;
      trep[i] = bench_now() - t0;
    }
    size_t n = ascr_geom_section_size(r);
    ascr_panel_solver *w = ascr_panel_solver_alloc(n);
    double *cp = malloc(n * sizeof *cp), *q = malloc(n * sizeof *q);
    for (int i = 0; i < REPEATS; i++) {
      double t0 = bench_now();
      if (ascr_panel_solver_set(w, r, NULL) != ASCR_OK) return 1;
      tset[i] = bench_now() - t0;
    }
    volatile double sink = 0.0;
    for (int i = 0; i < REPEATS; i++) {
      double t0 = bench_now();
      for (int a = 0; a < ALPHAS; a++) {
        ascr_panel_result res;
        ascr_panel_solver_solve(w, (-5.0 + 0.07 * a) * 3.14159265358979323846 / 180.0, 0.0, &res,
                                cp, q, NULL);
        sink += res.cl;
      }
      talpha[i] = (bench_now() - t0) / ALPHAS;
    }
    (void)sink;
    printf("%8zu %14.3f %20.3f %16.2f\n", counts[k], 1e3 * bench_median(trep, REPEATS),
           1e3 * bench_median(tset, REPEATS), 1e6 * bench_median(talpha, REPEATS));
    free(cp);
    free(q);
    ascr_panel_solver_free(w);
    ascr_geom_section_free(r);
  }
  ascr_geom_section_free(s);
  return 0;
}
