/* tests/support/uiuc_compare.h
 * Section polars against the UIUC low-speed airfoil tests (Selig et al.; reference/sd7003_*,
 * sd8000_*, clarky_*: coordinates, drag runs and lift runs, each file with its source header):
 * one computation shared by the validation test (tests/visc/test_visc_uiuc.c) and the study
 * that prints it (bench/study_visc_validation.c). Per Reynolds number of the drag file:
 *   - drag: mean, largest and signed mean (bias, + = computed high) relative cd error at the
 *     measured cl over the measured low-drag range (points whose cd is at most 1.5 times the
 *     run's smallest cd: our definition of "attached"), cd of the computed polar interpolated
 *     at that cl on its branch below the largest cl; over the same points, the tunnel's own
 *     spread — the standard deviation of its four spanwise wake-rake stations (cd_s1..cd_s4)
 *     relative to their mean, averaged — and how many computed cd lie within the stations'
 *     range (smallest to largest of the four);
 *   - lift: mean, largest and signed mean cl error at the measured angle, -2 to 6 deg, from the
 *     lift run of the nearest Re (within 5 %; the up-going branch of the loop only);
 *   - lift slope: least-squares dcl/dalpha over the measured angles from -2 to 5 deg of that
 *     run, measured and computed at the same angles, with the measured fit's standard error,
 *     and the zero-lift angle of each fitted line (printed; not one of issue 12's checks);
 *   - cl_max: measured (up-going branch) against the sweep's largest converged cl;
 *   - pitching moment, where the lift file has one (Clark Y; the SD files carry a placeholder
 *     that is not reproduced): mean and signed mean cm_c/4 error at the measured angle over the
 *     lift comparison's angles (printed by the study; not one of issue 12's checks);
 *   - converged points of the sweep.
 * Polars: 160 panels, N_crit 9, -4 to 16 deg by 0.5 deg, at the run's average Re.
 */
#ifndef UIUC_COMPARE_H
#define UIUC_COMPARE_H

#include <stddef.h>

typedef struct uiuc_result {
  double re;                      /* the drag run's average Re */
  double re_lift;                 /* the lift run used (NaN: none within 5 %) */
  size_t n_points, n_converged;   /* of the sweep */
  double cd_mean, cd_max, cd_bias; /* relative; NaN where cd_n = 0 */
  size_t cd_n;
  double cd_station_sd;           /* the stations' mean relative standard deviation; NaN: none */
  size_t cd_in_range;             /* computed cd within the stations' range, of cd_n */
  double cl_mean, cl_max_err, cl_bias; /* absolute; NaN where cl_n = 0 */
  size_t cl_n;
  double slope_calc, slope_meas, slope_meas_se; /* per deg; NaN where fewer than 4 angles */
  double alpha0_calc, alpha0_meas; /* zero-lift angle of the same least-squares lines, deg */
  double clmax_calc, clmax_meas;
  double cm_mean, cm_bias;        /* absolute; NaN where cm_n = 0 */
  size_t cm_n;
  /* with a transition band (uiuc_section_run_study): how many measured cd / cl of the
   * comparisons above lie within [min, max] of the computed values at N_crit lo, 9 and hi */
  size_t cd_in_band, cl_in_band;
} uiuc_result;

/* Run every Reynolds number of section name ("sd7003", "sd8000", "clarky") from folder dir;
 * at most cap results into out, their count in *n. re_only > 0: only the drag run of that
 * average Re. 0 on success, 1 if a file cannot be read (message on stderr). */
int uiuc_section_run(const char *dir, const char *name, double re_only, uiuc_result *out,
                     size_t cap, size_t *n);

/* As uiuc_section_run (every Re), for studies: with ncrit_hi > ncrit_lo the polars are also
 * computed at N_crit lo and hi and cd_in_band, cl_in_band filled (the figures are those at
 * N_crit 9; three times the work); wall_curvature as in ascr_visc_params (1: the turbulent
 * layer's dissipation length follows the wall's curvature). */
int uiuc_section_run_study(const char *dir, const char *name, double ncrit_lo, double ncrit_hi,
                           int wall_curvature, uiuc_result *out, size_t cap, size_t *n);

#endif
