/* bench/study_visc_validation.c
 * Section polars against the UIUC low-speed airfoil tests (Selig et al.; reference/sd7003_*,
 * sd8000_*, clarky_*: every Reynolds number the drag files hold), computed and compared by
 * tests/support/uiuc_compare.c (its header says what each figure is); the validation test
 * tests/visc/test_visc_uiuc.c checks the same figures. Figures only: per (section, Re) the
 * converged points of the sweep; drag mean / largest / signed mean error in per cent, and
 * beside it the tunnel's spanwise spread (its four wake-rake stations' standard deviation, per
 * cent of their mean) and how many computed cd lie within the stations' range; lift
 * mean / largest / signed mean error; the lift slope per degree computed / measured (+- the
 * measured fit's standard error) and the zero-lift angles of the two fitted lines; cl_max
 * computed / measured; where the lift file has the moment (Clark Y), the mean and signed mean
 * cm_c/4 error at the measured angle.
 * Arguments: [reference folder] (default: reference) [--band LO:HI]: with the band, the polars
 * are also computed at N_crit LO and HI (three times the work) and each row ends with how many
 * measured cd and cl lie within the band the three span (the transition-uncertainty band of
 * `polar --ncrit-range`, against the tunnel). --wall-curvature: the viscous solver's study
 * option wall_curvature = 1 (the turbulent layer's dissipation length following the wall's
 * curvature; docs/theory/viscous.md, "Streamline curvature").
 */
#include "uiuc_compare.h"

#include <gsl/gsl_errno.h>
#include <stdio.h>
#include <string.h>

void openblas_set_num_threads(int num_threads);

int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  openblas_set_num_threads(1);
  const char *dir = "reference";
  double lo = 0.0, hi = 0.0;
  int curvature = 0;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--wall-curvature") == 0) {
      curvature = 1;
    } else if (strcmp(argv[i], "--band") == 0 && i + 1 < argc) {
      if (sscanf(argv[++i], "%lf:%lf", &lo, &hi) != 2 || !(lo > 0.0 && hi > lo)) {
        fprintf(stderr, "--band LO:HI, 0 < LO < HI\n");
        return 2;
      }
    } else {
      dir = argv[i];
    }
  }
  int band = hi > 0.0;
  const char *names[] = {"sd7003", "sd8000", "clarky"};
  printf("%-7s %7s %5s | %-30s | %-17s | %-29s | %-24s | %-15s | %-13s | %s\n", "section", "Re",
         "conv",
         "cd err % mean / max / bias (n)", "stations sd %, in", "cl err mean / max / bias (n)",
         "slope /deg calc / meas", "alpha0 calc/meas", "cl_max calc/meas", "cm err mean / bias");
  for (int is = 0; is < 3; is++) {
    uiuc_result res[16];
    size_t n = 0;
    int bad = uiuc_section_run_study(dir, names[is], lo, hi, curvature, res, 16, &n);
    if (bad != 0) return 1;
    for (size_t i = 0; i < n; i++) {
      const uiuc_result *o = &res[i];
      printf("%-7s %7.0f %2zu/%-2zu | %6.1f / %6.1f / %+6.1f (%2zu) | %5.1f, %2zu of %-2zu   | "
             "%.3f / %.3f / %+.3f (%2zu) | "
             "%.4f / %.4f +- %.4f | %+6.2f / %+6.2f | %5.2f / %5.2f | %.4f / %+.4f",
             names[is], o->re, o->n_converged, o->n_points, 100.0 * o->cd_mean, 100.0 * o->cd_max,
             100.0 * o->cd_bias, o->cd_n, 100.0 * o->cd_station_sd, o->cd_in_range, o->cd_n,
             o->cl_mean, o->cl_max_err, o->cl_bias, o->cl_n,
             o->slope_calc, o->slope_meas, o->slope_meas_se, o->alpha0_calc, o->alpha0_meas,
             o->clmax_calc, o->clmax_meas,
             o->cm_mean, o->cm_bias);
      if (band) {
        printf(" | in N_crit %g..%g band: cd %zu of %zu, cl %zu of %zu", lo, hi, o->cd_in_band,
               o->cd_n, o->cl_in_band, o->cl_n);
      }
      putchar('\n');
      fflush(stdout);
    }
  }
  return 0;
}
