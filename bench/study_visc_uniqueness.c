/* bench/study_visc_uniqueness.c
 * One condition, one answer: for (section, Re) pairs and a few angles each, the viscous result
 * reached by three paths -- a cold single point, a warm-started walk up to the angle from 3 deg
 * below (0.5 deg steps), a walk down from 3 deg above -- and the largest differences in cl and
 * (relative) cd. Figures only; a property test (planned: tests/visc/test_visc_uniqueness.c) will assert a
 * subset once it passes. Arguments: [airfoils folder]. STUDY_VERBOSE=1 prints every angle.
 */
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>

void openblas_set_num_threads(int num_threads);

#define DEG (3.14159265358979323846 / 180.0)

/* walk from a_start to a_end in 0.5 deg steps, cold at the start, warm after; 1 if the last
 * point converged */
static int walk(ascr_visc_solver *v, double a_start, double a_end, ascr_visc_result *r)
{
  double step = a_end > a_start ? 0.5 : -0.5;
  int n = (int)lround(fabs(a_end - a_start) / 0.5);
  int have = 0;
  for (int k = 0; k <= n; k++) {
    double a = a_start + step * k;
    ascr_status st = have ? ascr_visc_solver_solve(v, a * DEG, 1, r, NULL)
                          : ascr_polar_solve_point(v, a, r, NULL);
    have = st == ASCR_OK;
    if (!have && k == n) return 0;
  }
  return r->converged;
}

int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  openblas_set_num_threads(1);
  const char *dir = argc > 1 ? argv[1] : "airfoils";
  char plate[512];
  snprintf(plate, sizeof plate, "%s/microprop-plate-t25-f45.dat", dir);
  struct { const char *sec; double re; } pairs[] = {
    {"naca0012", 1e5}, {"naca0012", 1e6}, {"naca2412", 1e5}, {"naca2412", 2e5},
    {"naca4412", 6e4}, {"naca4412", 1e6}, {"naca6409", 5e4}, {"naca6409", 2e5},
    {plate, 2e4}, {plate, 6e4}, {"plate:t=2,f=3", 1e4}, {"plate:t=3,f=5", 3e4},
    {"plate:t=4,f=6", 1e4}, {"plate:t=2,f=4", 1e5},
  };
  const double angles[] = {-1.3, 1.7, 3.6, 5.9};
  int verbose = getenv("STUDY_VERBOSE") != NULL;
  size_t n_cmp = 0, n_bad = 0, n_unconv = 0;
  double worst_cl = 0.0, worst_cd = 0.0;
  for (size_t ip = 0; ip < sizeof pairs / sizeof pairs[0]; ip++) {
    ascr_geom_section *raw = NULL, *s = NULL;
    ascr_status st = ascr_geom_is_spec(pairs[ip].sec) ? ascr_geom_section_from_spec(pairs[ip].sec, &raw, NULL)
                                                      : ascr_geom_section_read(pairs[ip].sec, &raw, NULL, NULL);
    if (st != ASCR_OK || ascr_geom_section_repanel(raw, NULL, &s, NULL) != ASCR_OK) {
      fprintf(stderr, "cannot load %s\n", pairs[ip].sec);
      return 1;
    }
    size_t n = ascr_geom_section_size(s);
    ascr_panel_solver *w = ascr_panel_solver_alloc(n);
    ascr_panel_solver_set(w, s, NULL);
    ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
    ascr_visc_params p = ascr_visc_params_defaults();
    p.re = pairs[ip].re;
    ascr_visc_solver_set(v, w, &p, NULL);
    size_t bad_here = 0, cmp_here = 0;
    for (size_t ia = 0; ia < sizeof angles / sizeof angles[0]; ia++) {
      double a = angles[ia];
      ascr_visc_result rc, ru, rd;
      int oc = ascr_polar_solve_point(v, a, &rc, NULL) == ASCR_OK;
      int ou = walk(v, a - 3.0, a, &ru);
      int od = walk(v, a + 3.0, a, &rd);
      const ascr_visc_result *rs[3] = {&rc, &ru, &rd};
      int ok[3] = {oc, ou, od};
      n_unconv += (size_t)(!oc + !ou + !od);
      double dcl = 0.0, dcd = 0.0;
      for (int i = 0; i < 3; i++) {
        for (int j = i + 1; j < 3; j++) {
          if (!ok[i] || !ok[j]) continue;
          dcl = fmax(dcl, fabs(rs[i]->cl - rs[j]->cl));
          dcd = fmax(dcd, fabs(rs[i]->cd - rs[j]->cd) / fmin(rs[i]->cd, rs[j]->cd));
        }
      }
      int comparable = (oc + ou + od) >= 2;
      if (comparable) {
        cmp_here++;
        if (dcl > 0.005 || dcd > 0.01) bad_here++;
        worst_cl = fmax(worst_cl, dcl);
        worst_cd = fmax(worst_cd, dcd);
      }
      if (verbose) {
        printf("  %-24.24s Re %8.0f a %5.1f: cold %d %.4f %.5f  up %d %.4f %.5f  down %d %.4f %.5f  "
               "dcl %.4f dcd %.1f%%\n", pairs[ip].sec, p.re, a, oc, rc.cl, rc.cd, ou, ru.cl, ru.cd,
               od, rd.cl, rd.cd, dcl, 100.0 * dcd);
      }
    }
    printf("%-40.40s Re %8.0f: %zu of %zu compared angles disagree\n", pairs[ip].sec, p.re,
           bad_here, cmp_here);
    fflush(stdout);
    n_cmp += cmp_here;
    n_bad += bad_here;
    ascr_visc_solver_free(v);
    ascr_panel_solver_free(w);
    ascr_geom_section_free(s);
    ascr_geom_section_free(raw);
  }
  printf("disagree (|dcl| > 0.005 or |dcd| > 1 %%): %zu of %zu; worst dcl %.4f, dcd %.1f %%; "
         "unconverged solves %zu\n", n_bad, n_cmp, worst_cl, 100.0 * worst_cd, n_unconv);
  return 0;
}
