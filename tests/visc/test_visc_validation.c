/* tests/visc/test_visc_validation.c
 * The coupled viscous analysis against measured section data (reference/, each file with its
 * source header): NACA 0012 at Re 6e6 smooth (Abbott & von Doenhoff) and tripped (Ladson,
 * NASA TM-4074), the NACA 0012 lift slope (McCroskey 1987), and SD7003 at Re 1e5 (UIUC
 * low-speed airfoil tests); NACA 0012 at every other condition reference/ holds it: free
 * transition at Re 5.97e6, Mach 0.15 (Ladson, TM-4074 Table I), lift against angle at Re 6e6
 * (Abbott & von Doenhoff), lift and upper-surface pressure at Re 2.88e6 tripped (Gregory &
 * O'Reilly, ARC R&M 3726), each against issue 12's targets. Polars are computed with the
 * library's sweep at its panel count for the Re (ascr_geom_panels_for_re: 160 up to Re 1e6,
 * 240 at the Re 2.88e6-6e6 sets, but for one, below) and N_crit 9. usage: test_visc_validation
 * [naca0012]
 * (the second group, through stall at Re 3e6-6e6, takes about two minutes and is a CTest test of
 * its own, left out of the sanitizer stage).
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct polar {
  size_t n;
  ascr_polar_point *p;
  ascr_polar_summary sum;
} polar;

/* panels 0: the library's count for the Re (ascr_geom_panels_for_re), as polar and the rotor
 * tables take it */
static polar run_polar_mach(ascr_geom_section *raw, double re, double mach, double a0, double a1,
                            double da, double trip, size_t panels)
{
  ascr_geom_section *s = NULL;
  ascr_errbuf e;
  ascr_geom_repanel_params rp = ascr_geom_repanel_defaults();
  rp.n_panels = panels > 0 ? panels : ascr_geom_panels_for_re(re);
  assert_int_equal(ascr_geom_section_repanel(raw, &rp, &s, &e), ASCR_OK);
  size_t n = ascr_geom_section_size(s);
  ascr_panel_solver *w = ascr_panel_solver_alloc(n);
  assert_int_equal(ascr_panel_solver_set(w, s, &e), ASCR_OK);
  ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
  assert_non_null(v);
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = re;
  p.mach = mach;
  if (trip <= 1.0) {
    p.trip_upper = trip;
    p.trip_lower = trip;
  }
  assert_int_equal(ascr_visc_solver_set(v, w, &p, &e), ASCR_OK);
  polar pl;
  pl.n = ascr_polar_grid_size(a0, a1, da);
  pl.p = calloc(pl.n, sizeof *pl.p);
  assert_int_equal(ascr_polar_sweep(v, a0, a1, da, pl.p, &pl.sum, NULL, NULL, &e), ASCR_OK);
  ascr_visc_solver_free(v);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  return pl;
}

static polar run_polar(ascr_geom_section *raw, double re, double a0, double a1, double da,
                       double trip)
{
  return run_polar_mach(raw, re, 0.0, a0, a1, da, trip, 0);
}

/* cd of the converged polar at lift coefficient cl, linear between neighbouring points
 * (NaN if cl is outside the converged range). */
static double cd_at_cl(const polar *pl, double cl)
{
  for (size_t i = 0; i + 1 < pl->n; i++) {
    const ascr_polar_point *a = &pl->p[i], *b = &pl->p[i + 1];
    if (!a->converged || !b->converged) continue;
    if ((a->cl <= cl && cl <= b->cl) || (b->cl <= cl && cl <= a->cl)) {
      double f = (b->cl != a->cl) ? (cl - a->cl) / (b->cl - a->cl) : 0.0;
      return a->cd + f * (b->cd - a->cd);
    }
  }
  return NAN;
}

/* Compare the polar's cd at each reference cl within [cl_lo, cl_hi] with the reference cd,
 * relative tolerance tol. Returns the number of points compared. */
static int compare_cd(const polar *pl, const double *cl, const double *cd, size_t nr,
                      double cl_lo, double cl_hi, double tol, const char *what, const char *ref,
                      const char *vname, const char *vsource)
{
  int checked = 0;
  for (size_t i = 0; i < nr; i++) {
    if (cl[i] < cl_lo || cl[i] > cl_hi) continue;
    double c = cd_at_cl(pl, cl[i]);
    char d[96];
    snprintf(d, sizeof d, "%s cd at cl %.3f", what, cl[i]);
    print_message("%s: airscrew %.5f, %s %.5f\n", d, c, ref, cd[i]);
    ascr_validation_row(vname, vsource, "cl,cd_reference,cd_airscrew,difference_percent,tolerance_percent",
                        "%.3f,%.5f,%.5f,%+.1f,%.0f", cl[i], cd[i], c, 100.0 * (c / cd[i] - 1.0),
                        100.0 * tol);
    ascr_assert_close(c, cd[i], tol, 0.0, d);
    checked++;
  }
  return checked;
}

/* Read columns (ci, cj) of a reference CSV after its '#' lines and header; rows whose first
 * column equals key (if key_col >= 0) only. Returns the row count. */
static size_t read_ref(const char *name, int key_col, double key, int ci, int cj, double *a,
                       double *b, size_t max)
{
  char path[512];
  snprintf(path, sizeof path, "%s/%s", ASCR_REFERENCE_DIR, name);
  FILE *fp = fopen(path, "r");
  assert_non_null(fp);
  char line[512];
  size_t k = 0;
  while (fgets(line, sizeof line, fp) && k < max) {
    if (line[0] == '#' || !(line[0] == '-' || line[0] == '.' || (line[0] >= '0' && line[0] <= '9'))) continue;
    double col[12];
    int nc = 0;
    char *save = NULL;
    for (char *t = strtok_r(line, ",", &save); t && nc < 12; t = strtok_r(NULL, ",", &save)) col[nc++] = atof(t);
    if (nc <= ci || nc <= cj) continue;
    if (key_col >= 0 && fabs(col[key_col] - key) > 1e-6 * fabs(key)) continue;
    a[k] = col[ci];
    b[k] = col[cj];
    k++;
  }
  fclose(fp);
  return k;
}

/* NACA 0012, Re 6e6, smooth model: cd against cl from Abbott & von Doenhoff (1959), NACA 0012
 * section chart, as digitised (reference/naca0012_abbott_vondoenhoff_re6e6_cd_cl_digitized.csv,
 * "approximate"). Free transition, N_crit 9. Tolerance 12 %: the digitising of the book plot
 * (about +-0.0003 in cd, 5 % at these levels) plus the integral method's known error in
 * turbulent skin friction (about -5 %, see test_bl_march.c) and in transition position. */
static void test_visc_naca0012_re6e6_drag_matches_abbott(void **state)
{
  (void)state;
  ascr_geom_section *raw = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &raw, NULL), ASCR_OK);
  polar pl = run_polar(raw, 6e6, 0.0, 8.0, 1.0, 2.0);
  double cl[40], cd[40];
  size_t nr = read_ref("naca0012_abbott_vondoenhoff_re6e6_cd_cl_digitized.csv", -1, 0, 0, 1, cl, cd, 40);
  assert_true(nr > 10);
  assert_true(compare_cd(&pl, cl, cd, nr, 0.0, 0.7, 0.12, "NACA 0012 Re 6e6", "Abbott",
                         "naca0012_re6e6_smooth", "Abbott & von Doenhoff, Theory of Wing Sections, App. IV, NACA 0012 Re 6e6 smooth (digitised)") >= 5);
  /* lift slope: McCroskey (1987) best fit dcl/dalpha = (0.1025 + 0.00485 log10(Re/1e6))/deg
   * (reference/naca0012_mccroskey_lift_slope.csv header); its data scatter about +-4 %, and
   * we take the slope between 0 and 4 deg; tolerance 6 % */
  double slope = (ascr_polar_cl_at_alpha(pl.p, pl.n, 4.0) - ascr_polar_cl_at_alpha(pl.p, pl.n, 0.0)) / 4.0;
  ascr_validation_row("naca0012_lift_slope", "McCroskey (1987) best-fit lift slope, NACA 0012, Re 6e6",
                      "lift_slope_reference_per_deg,lift_slope_airscrew_per_deg,difference_percent,tolerance_percent",
                      "%.4f,%.4f,%+.1f,6", 0.1025 + 0.00485 * log10(6.0), slope,
                      100.0 * (slope / (0.1025 + 0.00485 * log10(6.0)) - 1.0));
  ascr_assert_close(slope, 0.1025 + 0.00485 * log10(6.0), 0.06, 0.0, "NACA 0012 lift slope /deg");
  free(pl.p);
  ascr_geom_section_free(raw);
}

/* NACA 0012, Re 6e6, transition fixed near the leading edge: Ladson, NASA TM-4074 (1988),
 * 120-grit rows (reference/naca0012_ladson_tm4074_tripped_re6e6.csv). Trip at x/c 0.05 on both
 * sides: an assumption of ours, the reference header gives the grit sizes but not the strip
 * position (a few per cent of chord is usual). Tolerance 10 %: the three
 * grit sizes in the report differ by about 5 % in cd at low lift, and the integral method's
 * turbulent skin friction is about 5 % low. */
static void test_visc_naca0012_tripped_drag_matches_ladson(void **state)
{
  (void)state;
  ascr_geom_section *raw = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &raw, NULL), ASCR_OK);
  polar pl = run_polar(raw, 6e6, -2.0, 8.0, 1.0, 0.05);
  double al[40], cd[40], al2[40], cl[40];
  size_t nr = read_ref("naca0012_ladson_tm4074_tripped_re6e6.csv", 0, 120.0, 1, 3, al, cd, 40);
  size_t nr2 = read_ref("naca0012_ladson_tm4074_tripped_re6e6.csv", 0, 120.0, 1, 2, al2, cl, 40);
  assert_true(nr > 5 && nr2 == nr);
  assert_true(compare_cd(&pl, cl, cd, nr, -0.2, 0.8, 0.10, "NACA 0012 tripped", "Ladson",
                         "naca0012_re6e6_tripped", "Ladson, NASA TM-4074 (1988), NACA 0012 Re 6e6, 120 grit") >= 4);
  free(pl.p);
  ascr_geom_section_free(raw);
}

/* SD7003 at Re 1.016e5 against the UIUC low-speed airfoil tests (Selig et al.; reference/
 * sd7003_uiuc_lsat_drag.csv, run JG00171): cd over the low-drag range 0.3 <= cl <= 0.9.
 * Tolerance 20 %: the four spanwise wake-rake stations in the same run differ by up to 20 %
 * from their mean at these conditions (the listed cd_s1..cd_s4), the laminar separation bubble
 * that decides the drag at this Reynolds number is sensitive to N_crit (tunnel turbulence),
 * and the model was measured at 1.016e5, not 1e5. */
static void test_visc_sd7003_low_re_drag_matches_uiuc(void **state)
{
  (void)state;
  ascr_geom_section *raw = NULL;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_read(ASCR_REFERENCE_DIR "/sd7003_coords_uiuc.csv", &raw, NULL, &e), ASCR_OK);
  polar pl = run_polar(raw, 1.016e5, -2.0, 9.0, 1.0, 2.0);
  double cl[40], cd[40];
  size_t nr = read_ref("sd7003_uiuc_lsat_drag.csv", 0, 101600.0, 2, 3, cl, cd, 40);
  assert_true(nr >= 8);
  assert_true(compare_cd(&pl, cl, cd, nr, 0.3, 0.9, 0.20, "SD7003 Re 1e5", "UIUC", "sd7003_re1e5",
                         "UIUC low-speed airfoil tests (Selig et al.), SD7003 Re 1.016e5") >= 3);
  free(pl.p);
  ascr_geom_section_free(raw);
}

/* Panels at Re 3e6-6e6: there the upper layer's transition sits within 2-3 % of the chord
 * behind the leading edge, and at 160 panels the one interval that holds it under-resolves
 * the turbulent start (the layer just behind it runs to the closure's floor, Hk 1.05, and
 * the Newton iteration stalls: 12 of 37 points from 8.5 deg fail at Re 6e6). With 240 and 320
 * panels every point from 6 to 12 deg converges and cl agrees to 0.002 between the two
 * (docs/theory/viscous.md, "NACA 0012 at every condition reference/ holds"); the library's
 * count for these Re is 240 (ascr_geom_panels_for_re). The tripped set at 2.88e6 is run at
 * 160: at 240 panels its sweep spends 2.5 minutes on the angles where the stagnation point
 * passes the lower trip (14-14.5 deg), which fail either way. */
#define TRIPPED_2_88E6_PANELS ASCR_GEOM_DEFAULT_PANELS

/* ---- NACA 0012 against issue 12's targets -------------------------------------------------
 * The targets (issue 12), each with its reason: lift at a given angle below stall within 0.03
 * (a balance's or a pressure integration's repeatability, about 0.005, and +-0.1 deg of angle
 * setting, 0.011); cl_max within 0.08 (stall is where the method is least sure); mean |cd
 * error| over the low-drag range (cd at most 1.5 times the smallest measured) within 10 %;
 * mean |Cp error| over a digitised upper-surface distribution within 0.05 (the digitising,
 * "approximate", about +-0.02, and the pressure-tap scatter). A target held (1) fails the test
 * when it is no longer met; an open one (0) is reported, never asserted, until a change meets
 * it (as in test_visc_uiuc.c). Held/open as measured 2026-12-05 (twentieth session). */
static int target(const char *what, double err, double tol, int held, size_t n, size_t m,
                  int *failed)
{
  int met = isfinite(err) && err <= tol;
  print_message("NACA 0012 %-44s %.4f (target %.4f; %zu of %zu compared) %s\n", what, err, tol, n,
                m, met ? (held ? "met" : "met (open: may be held now)")
                       : (held ? "FAILED" : "open"));
  if (held && !met) *failed = 1;
  return met;
}

/* largest |cl error| at the measured angles up to the measured cl_max (which it returns in
 * *clmax_meas); sign > 0: angles as given; the symmetric section lets negative angles be
 * compared as positive ones with the sign of cl changed (|alpha| folded). */
static double cl_error_below_stall(const polar *pl, const double *al, const double *cl, size_t nr,
                                   size_t *n, double *clmax_meas)
{
  size_t im = 0;
  for (size_t i = 0; i < nr; i++) im = cl[i] > cl[im] ? i : im;
  *clmax_meas = cl[im];
  double worst = 0.0;
  *n = 0;
  for (size_t i = 0; i < nr; i++) {
    double a = fabs(al[i]), c = al[i] < 0.0 ? -cl[i] : cl[i];
    if (a > al[im] + 1e-9 || (al[i] < 0.0 && c > *clmax_meas)) continue;
    double ours = ascr_polar_cl_at_alpha(pl->p, pl->n, a);
    if (!isfinite(ours)) continue;
    print_message("  alpha %6.2f: cl airscrew %.4f, measured %.4f\n", al[i], al[i] < 0.0 ? -ours : ours, cl[i]);
    worst = fmax(worst, fabs(ours - c));
    (*n)++;
  }
  return worst;
}

/* The lift targets of one set: cl below stall (largest error over the measured angles up to
 * the measured cl_max; m of them in the set) and cl_max (held if clmax_held). */
static void lift_targets(const polar *pl, const double *al, const double *cl, size_t nr, size_t m,
                         const char *label, int clmax_held, int *failed)
{
  size_t n = 0;
  double clmax_meas;
  double e = cl_error_below_stall(pl, al, cl, nr, &n, &clmax_meas);
  char what[96];
  snprintf(what, sizeof what, "%s: cl below stall, largest", label);
  target(what, e, 0.03, 0, n, m, failed);
  snprintf(what, sizeof what, "%s: cl_max", label);
  target(what, fabs(pl->sum.cl_max - clmax_meas), 0.08, clmax_held, 1, 1, failed);
  print_message("  cl_max airscrew %.4f at %.2f deg, measured %.4f\n", pl->sum.cl_max,
                pl->sum.alpha_cl_max_deg, clmax_meas);
}

/* Free transition, Re 5.97e6, Mach 0.15: Ladson, NASA TM-4074 (1988) Table I
 * (reference/naca0012_ladson_tm4074_free_transition_re5.97e6_M0.15.csv; cl, cm from integrated
 * pressures, cd from a wake rake). The tunnel's free-transition drag near zero lift (0.0065)
 * lies 10 % above the smooth-model drag of Abbott & von Doenhoff at Re 6e6 (0.0059): two
 * facilities, one section. */
static void test_visc_naca0012_free_transition_against_ladson(void **state)
{
  (void)state;
  ascr_geom_section *raw = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &raw, NULL), ASCR_OK);
  polar pl = run_polar_mach(raw, 5.97e6, 0.15, -4.5, 18.0, 0.5, 2.0, 0);
  double al[40], cl[40], al2[40], cd[40];
  size_t nr = read_ref("naca0012_ladson_tm4074_free_transition_re5.97e6_M0.15.csv", -1, 0, 0, 1, al, cl, 40);
  size_t nd = read_ref("naca0012_ladson_tm4074_free_transition_re5.97e6_M0.15.csv", -1, 0, 0, 2, al2, cd, 40);
  assert_true(nr >= 16 && nd >= 14);
  int failed = 0;
  lift_targets(&pl, al, cl, nr, nr - 2, "Re 5.97e6 M 0.15 free", 1, &failed);
  /* drag over the low-drag range at the measured angle (rows with cd given) */
  double cdmin = HUGE_VAL;
  /* the post-stall rows have no cd (blank in the file; read_ref then takes the next column):
   * the low-drag range is read from the rows up to the measured cl_max */
  size_t im = 0;
  for (size_t i = 0; i < nr; i++) im = cl[i] > cl[im] ? i : im;
  nd = nd < im + 1 ? nd : im + 1;
  for (size_t i = 0; i < nd; i++) cdmin = fmin(cdmin, cd[i]);
  double sum = 0.0;
  size_t k = 0, m = 0;
  for (size_t i = 0; i < nd; i++) {
    if (cd[i] > 1.5 * cdmin) continue;
    m++;
    for (size_t j = 0; j + 1 < pl.n; j++) {
      const ascr_polar_point *a = &pl.p[j], *b = &pl.p[j + 1];
      if (!a->converged || !b->converged || al2[i] < a->alpha_deg || al2[i] > b->alpha_deg) continue;
      double c = a->cd + (al2[i] - a->alpha_deg) / (b->alpha_deg - a->alpha_deg) * (b->cd - a->cd);
      print_message("  alpha %6.2f: cd airscrew %.5f, measured %.5f (%+.1f %%)\n", al2[i], c, cd[i],
                    100.0 * (c / cd[i] - 1.0));
      ascr_validation_row("naca0012_re5.97e6_free", "Ladson, NASA TM-4074 (1988) Table I, NACA 0012 Re 5.97e6 M 0.15 free transition",
                          "alpha_deg,cd_reference,cd_airscrew,difference_percent",
                          "%.2f,%.5f,%.5f,%+.1f", al2[i], cd[i], c, 100.0 * (c / cd[i] - 1.0));
      sum += fabs(c / cd[i] - 1.0);
      k++;
      break;
    }
  }
  target("Re 5.97e6 M 0.15 free: cd low-drag range, mean", k ? sum / (double)k : NAN, 0.10, 0, k, m, &failed);
  assert_false(failed);
  free(pl.p);
  ascr_geom_section_free(raw);
}

/* Lift against angle at Re 6e6, smooth model: Abbott & von Doenhoff (1959) as digitised
 * (reference/naca0012_abbott_vondoenhoff_re6e6_cl_alpha_digitized.csv, "approximate": about
 * +-0.02 in cl from the digitising, within the 0.03 target's allowance for it). Both signs of
 * angle, folded onto the positive sweep (a symmetric section). */
static void test_visc_naca0012_lift_against_abbott(void **state)
{
  (void)state;
  ascr_geom_section *raw = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &raw, NULL), ASCR_OK);
  polar pl = run_polar_mach(raw, 6e6, 0.0, 0.0, 17.5, 0.5, 2.0, 0);
  double al[60], cl[60];
  size_t nr = read_ref("naca0012_abbott_vondoenhoff_re6e6_cl_alpha_digitized.csv", -1, 0, 0, 1, al, cl, 60);
  assert_true(nr >= 20);
  int failed = 0;
  lift_targets(&pl, al, cl, nr, nr, "Re 6e6 smooth", 0, &failed);
  assert_false(failed);
  free(pl.p);
  ascr_geom_section_free(raw);
}

/* Re 2.88e6, transition tripped: Gregory & O'Reilly, ARC R&M 3726 (1970), as digitised
 * (reference/naca0012_gregory_oreilly_re2.88e6_{cl,cp_upper}_digitized.csv, "approximate").
 * The trip position is not in the files: x/c 0.05 on both surfaces here, an assumption of ours
 * (as for Ladson's tripped rows above). Upper-surface Cp at 0 and 10 deg (15 deg is at stall):
 * the viscous surface pressure interpolated at the tap positions. */
static void test_visc_naca0012_tripped_against_gregory(void **state)
{
  (void)state;
  ascr_geom_section *raw = NULL, *s = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &raw, NULL), ASCR_OK);
  polar pl = run_polar_mach(raw, 2.88e6, 0.0, 0.0, 17.0, 0.5, 0.05, TRIPPED_2_88E6_PANELS);
  double al[40], cl[40];
  size_t nr = read_ref("naca0012_gregory_oreilly_re2.88e6_cl_digitized.csv", -1, 0, 0, 1, al, cl, 40);
  assert_true(nr >= 10);
  int failed = 0;
  lift_targets(&pl, al, cl, nr, nr - 2, "Re 2.88e6 tripped", 1, &failed);
  /* upper-surface pressure */
  assert_int_equal(ascr_geom_section_repanel(raw, NULL, &s, NULL), ASCR_OK);
  size_t nn = ascr_geom_section_size(s), le = ascr_geom_section_le_index(s);
  const double *x = ascr_geom_section_x(s);
  ascr_panel_solver *w = ascr_panel_solver_alloc(nn);
  assert_int_equal(ascr_panel_solver_set(w, s, NULL), ASCR_OK);
  ascr_visc_solver *v = ascr_visc_solver_alloc(nn, ascr_visc_default_wake_nodes(nn));
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = 2.88e6;
  p.trip_upper = p.trip_lower = 0.05;
  assert_int_equal(ascr_visc_solver_set(v, w, &p, NULL), ASCR_OK);
  double *cp = calloc(nn, sizeof *cp);
  const double cases[2] = {0.0, 10.0};
  const char *keys[2] = {"alpha=0", "alpha=10"};
  for (int c = 0; c < 2; c++) {
    ascr_visc_result r;
    int warm = 0;
    for (double a = 0.0; a <= cases[c] + 1e-9; a += 1.0) {
      warm = ascr_visc_solver_solve(v, a * M_PI / 180.0, warm, &r, NULL) == ASCR_OK;
    }
    assert_true(warm);
    ascr_visc_solver_cp(v, cp);
    /* the tap rows of this angle */
    char path[512], line[256];
    snprintf(path, sizeof path, "%s/%s", ASCR_REFERENCE_DIR, "naca0012_gregory_oreilly_re2.88e6_cp_upper_digitized.csv");
    FILE *fp = fopen(path, "r");
    assert_non_null(fp);
    double sum = 0.0;
    size_t k = 0;
    while (fgets(line, sizeof line, fp) != NULL) {
      char key[32];
      double xc, cpm;
      if (sscanf(line, "%31[^,],%lf,%lf", key, &xc, &cpm) != 3 || strcmp(key, keys[c]) != 0) continue;
      if (xc < 0.01 || xc > 0.99) continue; /* the stagnation tap and the trailing edge */
      /* upper surface: nodes le down to 0, x increasing */
      for (size_t i = le; i > 0; i--) {
        if (x[i] <= xc && x[i - 1] >= xc) {
          double f = (xc - x[i]) / (x[i - 1] - x[i]);
          double cpo = cp[i] + f * (cp[i - 1] - cp[i]);
          sum += fabs(cpo - cpm);
          k++;
          break;
        }
      }
    }
    fclose(fp);
    char what[64];
    snprintf(what, sizeof what, "Re 2.88e6 tripped: upper Cp at %s, mean", keys[c]);
    target(what, k ? sum / (double)k : NAN, 0.05, 1, k, k, &failed);
  }
  free(cp);
  ascr_visc_solver_free(v);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  assert_false(failed);
  free(pl.p);
  ascr_geom_section_free(raw);
}

int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  if (argc > 1 && strcmp(argv[1], "naca0012") == 0) {
    const struct CMUnitTest high_re[] = {
        cmocka_unit_test(test_visc_naca0012_free_transition_against_ladson),
        cmocka_unit_test(test_visc_naca0012_lift_against_abbott),
        cmocka_unit_test(test_visc_naca0012_tripped_against_gregory),
    };
    return cmocka_run_group_tests(high_re, NULL, NULL);
  }
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_visc_naca0012_re6e6_drag_matches_abbott),
    cmocka_unit_test(test_visc_naca0012_tripped_drag_matches_ladson),
    cmocka_unit_test(test_visc_sd7003_low_re_drag_matches_uiuc),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
