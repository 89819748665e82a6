/* bench/study_polar_paths.c
 * One condition, one answer, path by path, on the sections with tunnel data (reference/
 * sd7003, sd8000, clarky coordinates) at Re 6e4, 1e5, 2e5, 3e5: at -2..10 deg by 1 deg, the state
 * of a sweep over -4..12 deg by 0.5 deg against
 *   single: the library's single point (ascr_polar_solve_point, the command line's one angle),
 *   raw:    a raw fresh start at the angle (ascr_visc_solver_solve, no warm state),
 *   grid1:  a sweep over the same range by 1 deg,
 * counting the points that differ by more than 0.005 in cl or 1 % in cd (issue 11's uniqueness
 * tolerances), and of those the ones the 0.5-deg sweep does not flag bistable with that state as
 * its other state ("unflagged"). Figures only; STUDY_VERBOSE=1 lists every differing point.
 * Arguments: [reference folder] (default: reference). About six minutes on one core.
 */
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>

void openblas_set_num_threads(int num_threads);

#define DEG (3.14159265358979323846 / 180.0)

static int differs(double cl, double cd, const ascr_polar_point *p)
{
  return fabs(cl - p->cl) > 0.005 || fabs(cd - p->cd) > 0.01 * p->cd;
}

static int is_other(double cl, double cd, const ascr_polar_point *p)
{
  return p->bistable && fabs(cl - p->other_cl) <= 0.005 && fabs(cd - p->other_cd) <= 0.01 * p->other_cd;
}

int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  openblas_set_num_threads(1);
  const char *dir = argc > 1 ? argv[1] : "reference";
  int verbose = getenv("STUDY_VERBOSE") != NULL;
  const char *names[] = {"sd7003", "sd8000", "clarky"};
  const double res[] = {6e4, 1e5, 2e5, 3e5};
  int n_all = 0, d[3] = {0, 0, 0}, u[3] = {0, 0, 0};
  const char *lab[3] = {"single", "raw", "grid1"};
  printf("%-7s %7s | %-14s | %-14s | %-14s  (differ / unflagged of points compared)\n", "section",
         "Re", "single point", "raw start", "1-deg sweep");
  for (int is = 0; is < 3; is++) {
    char path[512];
    snprintf(path, sizeof path, "%s/%s_coords_uiuc.csv", dir, names[is]);
    ascr_geom_section *raw = NULL, *s = NULL;
    if (ascr_geom_section_read(path, &raw, NULL, NULL) != ASCR_OK ||
        ascr_geom_section_repanel(raw, NULL, &s, NULL) != ASCR_OK) {
      fprintf(stderr, "cannot load %s\n", path);
      return 1;
    }
    size_t n = ascr_geom_section_size(s);
    ascr_panel_solver *w = ascr_panel_solver_alloc(n);
    ascr_panel_solver_set(w, s, NULL);
    ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
    for (int ir = 0; ir < 4; ir++) {
      ascr_visc_params p = ascr_visc_params_defaults();
      p.re = res[ir];
      ascr_visc_solver_set(v, w, &p, NULL);
      ascr_polar_point a[40], b[20];
      ascr_polar_summary sum;
      ascr_polar_sweep(v, -4.0, 12.0, 0.5, a, &sum, NULL, NULL, NULL);
      ascr_polar_sweep(v, -4.0, 12.0, 1.0, b, &sum, NULL, NULL, NULL);
      int pd[3] = {0, 0, 0}, pu[3] = {0, 0, 0}, pn = 0;
      for (int k = 2; k <= 14; k++) {
        const ascr_polar_point *ref = &a[2 * k];
        if (!ref->converged) continue;
        double alpha = ref->alpha_deg;
        double cl[3] = {NAN, NAN, NAN}, cd[3] = {NAN, NAN, NAN};
        ascr_visc_result r;
        if (ascr_polar_solve_point(v, alpha, &r, NULL) == ASCR_OK) {
          cl[0] = r.cl;
          cd[0] = r.cd;
        }
        if (ascr_visc_solver_solve(v, alpha * DEG, 0, &r, NULL) == ASCR_OK) {
          cl[1] = r.cl;
          cd[1] = r.cd;
        }
        if (b[k].converged) {
          cl[2] = b[k].cl;
          cd[2] = b[k].cd;
        }
        pn++;
        for (int m = 0; m < 3; m++) {
          if (isnan(cl[m]) || !differs(cl[m], cd[m], ref)) continue;
          pd[m]++;
          int flagged = is_other(cl[m], cd[m], ref);
          if (!flagged) pu[m]++;
          if (verbose)
            printf("  %s %.0f %5.1f deg %-6s cl %.4f cd %.5f | sweep cl %.4f cd %.5f%s\n",
                   names[is], res[ir], alpha, lab[m], cl[m], cd[m], ref->cl, ref->cd,
                   flagged ? " (its other state)" : "");
        }
      }
      printf("%-7s %7.0f | %4d / %-2d of %2d | %4d / %-2d of %2d | %4d / %-2d of %2d\n", names[is],
             res[ir], pd[0], pu[0], pn, pd[1], pu[1], pn, pd[2], pu[2], pn);
      fflush(stdout);
      n_all += pn;
      for (int m = 0; m < 3; m++) {
        d[m] += pd[m];
        u[m] += pu[m];
      }
    }
    ascr_visc_solver_free(v);
    ascr_panel_solver_free(w);
    ascr_geom_section_free(s);
    ascr_geom_section_free(raw);
  }
  printf("%-15s | %4d / %-2d of %d | %4d / %-2d of %d | %4d / %-2d of %d\n", "all", d[0], u[0],
         n_all, d[1], u[1], n_all, d[2], u[2], n_all);
  return 0;
}
