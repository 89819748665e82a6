/* bench/study_visc_convergence.c
 * The converged share of the viscous polar sweep on the full grid of issue 3: the sample
 * sections and NACA 0012, 2412, 4412 at Re 30k, 60k, 100k, 200k and 1e6, alpha -6 to 16 deg
 * by 0.5 deg. Prints a table and the total; takes minutes. Figures only. With STUDY_LIST_FAILED
 * set, the angles that failed are listed on stderr. With STUDY_LOWRE set, the grid is
 * issue 11's low-Reynolds-number extension instead: thin cambered plates (2, 3, 4 % thick,
 * 3-6 % camber; generator and coordinate-file forms) at Re 5k, 10k and 20k, -6 to 14 deg.
 * STUDY_STEP=1 sweeps by 1 deg instead of 0.5 (the same angles every second point).
 */
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <stdio.h>
#include <stdlib.h>

void openblas_set_num_threads(int num_threads);

int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  openblas_set_num_threads(1);
  const char *dir = argc > 1 ? argv[1] : "airfoils";
  char plate[512], n4412[512];
  snprintf(plate, sizeof plate, "%s/microprop-plate-t25-f45.dat", dir);
  snprintf(n4412, sizeof n4412, "%s/naca4412.dat", dir);
  const char *secs_main[] = {plate, n4412, "naca0012", "naca2412", "naca4412"};
  const double res_main[] = {3e4, 6e4, 1e5, 2e5, 1e6};
  const char *secs_low[] = {plate, "plate:t=2,f=3", "plate:t=3,f=4.5,xf=45", "plate:t=4,f=6,xf=40",
                            "plate:t=2,f=6,xf=40"};
  const double res_low[] = {5e3, 1e4, 2e4};
  const int low = getenv("STUDY_LOWRE") != NULL;
  const char *step_env = getenv("STUDY_STEP"); /* the sweep's step, deg (default 0.5) */
  const double step = step_env != NULL && atof(step_env) > 0.0 ? atof(step_env) : 0.5;
  const char **secs = low ? secs_low : secs_main;
  const double *res = low ? res_low : res_main;
  const int nsec = low ? 5 : 5, nre = low ? 3 : 5;
  const double a_hi = low ? 14.0 : 16.0;
  size_t total = 0, conv = 0;
  double its_conv = 0.0, its_fail = 0.0; /* Newton iterations spent on converged / failed points */
  printf("%-32s", "section \\ Re");
  for (int ir = 0; ir < nre; ir++) printf(" %8.0f", res[ir]);
  printf("\n");
  for (int is = 0; is < nsec; is++) {
    ascr_geom_section *raw = NULL, *s = NULL;
    ascr_status st = ascr_geom_is_spec(secs[is]) ? ascr_geom_section_from_spec(secs[is], &raw, NULL)
                                                 : ascr_geom_section_read(secs[is], &raw, NULL, NULL);
    if (st != ASCR_OK || ascr_geom_section_repanel(raw, NULL, &s, NULL) != ASCR_OK) {
      fprintf(stderr, "cannot load %s (run from the source folder or give the airfoils folder)\n", secs[is]);
      return 1;
    }
    size_t n = ascr_geom_section_size(s);
    ascr_panel_solver *w = ascr_panel_solver_alloc(n);
    ascr_panel_solver_set(w, s, NULL);
    ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
    printf("%-32.32s", secs[is]);
    for (int ir = 0; ir < nre; ir++) {
      ascr_visc_params p = ascr_visc_params_defaults();
      p.re = res[ir];
      ascr_visc_solver_set(v, w, &p, NULL);
      size_t np = ascr_polar_grid_size(-6.0, a_hi, step);
      ascr_polar_point *pts = calloc(np, sizeof *pts);
      ascr_polar_summary sum;
      ascr_polar_sweep(v, -6.0, a_hi, step, pts, &sum, NULL, NULL, NULL);
      printf("  %3zu/%-3zu", sum.n_converged, sum.n_points);
      fflush(stdout);
      if (getenv("STUDY_LIST_FAILED") != NULL) { /* where the failures are, on stderr */
        fprintf(stderr, "%s Re %.0f failed at:", secs[is], res[ir]);
        for (size_t i = 0; i < np; i++) {
          if (!pts[i].converged) fprintf(stderr, " %.1f", pts[i].alpha_deg);
        }
        fprintf(stderr, "\n");
      }
      for (size_t i = 0; i < np; i++) {
        if (pts[i].converged) its_conv += pts[i].iterations;
        else its_fail += pts[i].iterations;
      }
      total += sum.n_points;
      conv += sum.n_converged;
      free(pts);
    }
    printf("\n");
    ascr_visc_solver_free(v);
    ascr_panel_solver_free(w);
    ascr_geom_section_free(s);
    ascr_geom_section_free(raw);
  }
  printf("converged %zu of %zu points (%.1f %%)\n", conv, total, 100.0 * (double)conv / (double)total);
  printf("Newton iterations: %.0f on converged points (%.0f a point), %.0f on failed points (%.0f a point)\n",
         its_conv, its_conv / (double)(conv > 0 ? conv : 1), its_fail,
         its_fail / (double)(total - conv > 0 ? total - conv : 1));
  return 0;
}
