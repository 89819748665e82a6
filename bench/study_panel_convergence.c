/* bench/study_panel_convergence.c
 * The panel-count study behind ASCR_GEOM_DEFAULT_PANELS (docs/theory/panel-convergence.md):
 * errors against the exact Karman-Trefftz flow and the drift of cl, cm for NACA 0012, NACA
 * 4412 and a 2 %-thick cambered plate as the panel count grows. Prints figures; not a test.
 */
#include "karman_trefftz.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>

#define DEG (3.14159265358979323846 / 180.0)
#define DENSE 4001

static int solve(const ascr_geom_section *s, size_t np, double alpha, ascr_panel_result *res,
                 ascr_geom_section **rep, double **cp)
{
  ascr_geom_repanel_params p = ascr_geom_repanel_defaults();
  p.n_panels = np;
  if (ascr_geom_section_repanel(s, &p, rep, NULL) != ASCR_OK) return 1;
  size_t n = ascr_geom_section_size(*rep);
  ascr_panel_solver *w = ascr_panel_solver_alloc(n);
  *cp = malloc(n * sizeof **cp);
  int rc = ascr_panel_solver_set(w, *rep, NULL) != ASCR_OK ||
           ascr_panel_solver_solve(w, alpha, 0.0, res, *cp, NULL, NULL) != ASCR_OK;
  ascr_panel_solver_free(w);
  return rc;
}

int main(void)
{
  gsl_set_error_handler_off();
  const size_t np[] = {40, 80, 120, 160, 240, 320, 640, 1280};
  const int NN = sizeof np / sizeof np[0];
  kt_section k;
  kt_init(&k, 0.1, 0.08, 10.0 * DEG);
  double *x = malloc(DENSE * sizeof *x), *y = malloc(DENSE * sizeof *y);
  kt_contour(&k, DENSE, x, y);
  ascr_geom_section *kts = NULL;
  if (ascr_geom_section_from_points(x, y, DENSE, "kt", &kts, NULL, NULL) != ASCR_OK) return 1;
  const double a = 3.7 * DEG;
  printf("Karman-Trefftz (mu = -0.1 + 0.08i, TE angle 10 deg), alpha 3.7 deg, exact cl %.6f\n",
         kt_cl(&k, a));
  printf("%8s %14s %14s %16s\n", "panels", "cl rel err", "cl_circ err", "max|dCp| (no TE)");
  for (int i = 0; i < NN; i++) {
    ascr_panel_result r;
    ascr_geom_section *rep = NULL;
    double *cp = NULL;
    if (solve(kts, np[i], a, &r, &rep, &cp)) return 1;
    size_t n = ascr_geom_section_size(rep);
    double e = 0.0;
    for (size_t j = 1; j + 1 < n; j++) {
      double th = kt_theta_of(&k, ascr_geom_section_x(rep)[j], ascr_geom_section_y(rep)[j]);
      e = fmax(e, fabs(cp[j] - kt_cp(&k, th, a)));
    }
    printf("%8zu %14.3e %14.3e %16.4f\n", np[i], (r.cl - kt_cl(&k, a)) / kt_cl(&k, a),
           (r.cl_circ - kt_cl(&k, a)) / kt_cl(&k, a), e);
    free(cp);
    ascr_geom_section_free(rep);
  }
  const char *specs[] = {"naca0012", "naca4412", "plate:t=2,f=4,xf=50"};
  for (int s = 0; s < 3; s++) {
    ascr_geom_section *g = NULL;
    if (ascr_geom_section_from_spec(specs[s], &g, NULL) != ASCR_OK) return 1;
    ascr_panel_result ref;
    ascr_geom_section *rep = NULL;
    double *cp = NULL;
    if (solve(g, 1280, 4.0 * DEG, &ref, &rep, &cp)) return 1;
    free(cp);
    ascr_geom_section_free(rep);
    printf("\n%s at alpha 4 deg, relative to 1280 panels (cl %.6f, cm %.6f)\n", specs[s], ref.cl,
           ref.cm);
    printf("%8s %14s %14s\n", "panels", "cl rel diff", "cm diff");
    for (int i = 0; i < NN - 1; i++) {
      ascr_panel_result r;
      if (solve(g, np[i], 4.0 * DEG, &r, &rep, &cp)) return 1;
      printf("%8zu %14.3e %14.3e\n", np[i], (r.cl - ref.cl) / ref.cl, r.cm - ref.cm);
      free(cp);
      ascr_geom_section_free(rep);
    }
    ascr_geom_section_free(g);
  }
  ascr_geom_section_free(kts);
  free(x);
  free(y);
  return 0;
}
