/* bench/study_visc_bubbles.c
 * The upper-surface separation bubbles of the UIUC sections (reference/sd7003_, sd8000_,
 * clarky_coords_uiuc.csv) at Re 6e4, 1e5, 2e5 and 0, 2, 4 deg, in the parameters by which bubbles
 * are classified: where the laminar layer separates (Cf first negative past 0.02 c), turns
 * turbulent and reattaches (Cf positive again, else "open"); the momentum- and displacement-
 * thickness Reynolds numbers at separation; Gaster's pressure-gradient parameter
 * P = (theta_s^2 / nu) dU/dx over the bubble (Gaster 1967, AGARD CP-4), with dU/dx from the
 * inviscid edge velocity between separation and reattachment (in brackets: from the viscous
 * one); and the pressure recovery of the turbulent part, sigma = 1 - (ue_r / ue_tr)^2.
 * Each state is the one a polar sweep reports (ascr_polar_solve_point). Figures only: the
 * table of docs/theory/viscous.md, "The upper bubbles in Gaster's parameters".
 * Arguments: [reference folder] (default: reference).
 */
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>

void openblas_set_num_threads(int num_threads);

#define PI 3.14159265358979323846

/* Inviscid surface speed on the upper surface at x (nodes 0 .. ile run from the trailing edge
 * to the leading edge), linear in x; NaN outside. */
static double upper_speed(const double *xn, const double *q, size_t ile, double x)
{
  for (size_t i = 0; i < ile; i++) {
    double x0 = xn[i + 1], x1 = xn[i]; /* x0 < x1 */
    if (x0 <= x && x <= x1) {
      double t = x1 > x0 ? (x - x0) / (x1 - x0) : 0.0;
      return fabs(q[i + 1]) + t * (fabs(q[i]) - fabs(q[i + 1]));
    }
  }
  return NAN;
}

int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  openblas_set_num_threads(1);
  const char *dir = argc > 1 ? argv[1] : "reference";
  const char *names[] = {"sd7003", "sd8000", "clarky"};
  const double res[] = {6e4, 1e5, 2e5}, alphas[] = {0.0, 2.0, 4.0};
  printf("%-7s %7s %5s | %5s %5s %6s | %6s %6s | %8s %10s | %6s\n", "section", "Re", "alpha",
         "x_sep", "x_tr", "x_reat", "Re_ths", "Re_ds", "P inv", "(viscous)", "sigma");
  for (int is = 0; is < 3; is++) {
    char path[512];
    snprintf(path, sizeof path, "%s/%s_coords_uiuc.csv", dir, names[is]);
    ascr_geom_section *raw = NULL, *s = NULL;
    ascr_errbuf e;
    if (ascr_geom_section_read(path, &raw, NULL, &e) != ASCR_OK ||
        ascr_geom_section_repanel(raw, NULL, &s, &e) != ASCR_OK) {
      fprintf(stderr, "%s: %s\n", path, e.msg);
      return 1;
    }
    size_t n = ascr_geom_section_size(s);
    ascr_panel_solver *w = ascr_panel_solver_alloc(n);
    ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
    if (w == NULL || v == NULL || ascr_panel_solver_set(w, s, &e) != ASCR_OK) {
      fprintf(stderr, "%s: set-up failed\n", path);
      return 1;
    }
    const double *xn = ascr_geom_section_x(s);
    double *q = malloc(n * sizeof *q);
    size_t ile = ascr_geom_section_le_index(s);
    for (int ir = 0; ir < 3; ir++) {
      ascr_visc_params p = ascr_visc_params_defaults();
      p.re = res[ir];
      ascr_visc_solver_set(v, w, &p, NULL);
      for (int ia = 0; ia < 3; ia++) {
        ascr_visc_result r;
        printf("%-7s %7.0f %5.1f | ", names[is], res[ir], alphas[ia]);
        if (ascr_polar_solve_point(v, alphas[ia], &r, NULL) != ASCR_OK) {
          printf("not converged\n");
          continue;
        }
        ascr_panel_result pr;
        ascr_panel_solver_solve(w, alphas[ia] * PI / 180.0, 0.0, &pr, NULL, q, NULL);
        size_t ns = ascr_visc_solver_stations(v);
        int *side = malloc(ns * sizeof *side), *turb = malloc(ns * sizeof *turb);
        double *b = malloc(5 * ns * sizeof *b);
        double *x = b, *ue = b + ns, *ds = b + 2 * ns, *th = b + 3 * ns, *cf = b + 4 * ns;
        ascr_visc_solver_distributions(v, side, NULL, x, NULL, ue, ds, th, NULL, cf, NULL, turb);
        size_t ks = ns, kt = ns, kr = ns, kend = 0;
        for (size_t k = 0; k < ns && side[k] == 0; k++) {
          kend = k;
          if (ks == ns && !turb[k] && cf[k] < 0.0 && x[k] > 0.02) ks = k;
          if (kt == ns && turb[k]) kt = k;
          if (kt < ns && kr == ns && k >= kt && cf[k] > 0.0) kr = k;
        }
        if (ks == ns) {
          printf("no laminar separation\n");
        } else if (kt == ns) {
          printf("%5.3f laminar to the trailing edge\n", x[ks]);
        } else {
          size_t ke = kr < ns ? kr : kend;
          double xr = x[ke], re = res[ir];
          double dui = (upper_speed(xn, q, ile, xr) - upper_speed(xn, q, ile, x[ks])) / (xr - x[ks]);
          double duv = (ue[ke] - ue[ks]) / (xr - x[ks]);
          double t2 = th[ks] * th[ks] * re;
          char xrs[16];
          if (kr < ns) snprintf(xrs, sizeof xrs, "%6.3f", x[kr]);
          else snprintf(xrs, sizeof xrs, "%6s", "open");
          printf("%5.3f %5.3f %s | %6.0f %6.0f | %8.3f (%7.3f) | %6.3f\n", x[ks], x[kt], xrs,
                 re * ue[ks] * th[ks], re * ue[ks] * ds[ks], t2 * dui, t2 * duv,
                 1.0 - (ue[ke] / ue[kt]) * (ue[ke] / ue[kt]));
        }
        fflush(stdout);
        free(side);
        free(turb);
        free(b);
      }
    }
    free(q);
    ascr_visc_solver_free(v);
    ascr_panel_solver_free(w);
    ascr_geom_section_free(s);
    ascr_geom_section_free(raw);
  }
  return 0;
}
