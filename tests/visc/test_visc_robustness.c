/* tests/visc/test_visc_robustness.c
 * Robustness of the viscous polar sweep (default formulation: exact transition) on the grid of
 * issue 3: the sample sections (airfoils/: the thin cambered plate and the NACA 4412
 * coordinate file) and the generated NACA 0012, 2412 and 4412 at Re 30k, 60k, 100k, 200k and
 * 1e6, alpha -6 to 16 deg by 0.5 deg (1125 points), one CTest test per section so that ctest -j
 * spreads them over the cores (about 60-150 s each in a release build). Every point must be
 * either converged, with finite numbers and a final update below the tolerance, or flagged
 * unconverged (no NaN is ever reported as a result).
 * The same for issue 11's low-Reynolds-number grid of thin plates ("lowre", robustness_grid.h).
 * usage: test_visc_robustness GRID INDEX   (GRID main or lowre; writes
 * robustness-GRID-INDEX.txt: "Re points converged" per line, read by
 * test_visc_robustness_summary.c, which checks the shares)
 */
#include "ascr_test.h"
#include "robustness_grid.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static const robust_grid *grid;
static size_t section_index;

static void test_visc_polar_sweeps_flag_every_point(void **state)
{
  (void)state;
  const char *sec = grid->sections[section_index];
  char path[512];
  if (strncmp(sec, "airfoils/", 9) == 0) {
    snprintf(path, sizeof path, "%s/%s", ASCR_SOURCE_DIR, sec);
    sec = path;
  }
  ascr_geom_section *raw = NULL, *s = NULL;
  ascr_errbuf e;
  if (ascr_geom_is_spec(sec)) {
    assert_int_equal(ascr_geom_section_from_spec(sec, &raw, &e), ASCR_OK);
  } else {
    assert_int_equal(ascr_geom_section_read(sec, &raw, NULL, &e), ASCR_OK);
  }
  assert_int_equal(ascr_geom_section_repanel(raw, NULL, &s, &e), ASCR_OK);
  size_t n = ascr_geom_section_size(s);
  ascr_panel_solver *w = ascr_panel_solver_alloc(n);
  assert_int_equal(ascr_panel_solver_set(w, s, &e), ASCR_OK);
  ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
  char out[64];
  snprintf(out, sizeof out, "robustness-%s-%zu.txt", grid->name, section_index);
  FILE *fp = fopen(out, "w");
  assert_non_null(fp);
  for (size_t ir = 0; ir < grid->n_re; ir++) {
    ascr_visc_params p = ascr_visc_params_defaults();
    p.re = grid->re[ir];
    assert_int_equal(ascr_visc_solver_set(v, w, &p, &e), ASCR_OK);
    size_t np = ascr_polar_grid_size(grid->alpha0, grid->alpha1, ROBUST_STEP);
    assert_int_equal(np, robust_grid_points(grid));
    ascr_polar_point *pts = calloc(np, sizeof *pts);
    assert_non_null(pts);
    ascr_polar_summary sum;
    assert_int_equal(ascr_polar_sweep(v, grid->alpha0, grid->alpha1, ROBUST_STEP, pts, &sum,
                                      NULL, NULL, &e), ASCR_OK);
    for (size_t i = 0; i < np; i++) {
      const ascr_polar_point *q = &pts[i];
      assert_true(q->converged == 0 || q->converged == 1);
      if (q->converged) {
        assert_true(isfinite(q->cl) && isfinite(q->cd) && isfinite(q->cm) && isfinite(q->cdf));
        assert_true(q->cd > 0.0);
        assert_true(q->residual <= p.tol);
      }
      assert_true(q->alpha_deg == grid->alpha0 + ROBUST_STEP * (double)i);
    }
    print_message("%-40s Re %7.0f: %2zu/%zu converged\n", grid->sections[section_index],
                  grid->re[ir], sum.n_converged, sum.n_points);
    fprintf(fp, "%.0f %zu %zu\n", grid->re[ir], sum.n_points, sum.n_converged);
    free(pts);
  }
  assert_int_equal(fclose(fp), 0);
  ascr_visc_solver_free(v);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  ascr_geom_section_free(raw);
}

int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  grid = argc == 3 ? robust_grid_find(argv[1]) : NULL;
  char *end = NULL;
  section_index = argc == 3 ? strtoul(argv[2], &end, 10) : 0;
  if (grid == NULL || end == argv[2] || *end != '\0' || section_index >= grid->n_sections) {
    fprintf(stderr, "usage: test_visc_robustness main|lowre INDEX\n");
    return 2;
  }
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_visc_polar_sweeps_flag_every_point),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
