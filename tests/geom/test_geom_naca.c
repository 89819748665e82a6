/* tests/geom/test_geom_naca.c
 * NACA and plate generators: ordinates against the published table, metrics against the
 * defining numbers of each designation.
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* Upper-surface ordinate at chord station xq by linear interpolation between generated nodes
 * (upper surface = nodes 0..i_le, x decreasing). */
static double upper_y_at(const ascr_geom_section *s, double xq)
{
  const double *x = ascr_geom_section_x(s), *y = ascr_geom_section_y(s);
  size_t ile = ascr_geom_section_le_index(s);
  for (size_t i = ile; i > 0; i--) {
    /* segment from node i (nearer LE) to node i-1 */
    if (x[i] <= xq && xq <= x[i - 1]) {
      double f = (xq - x[i]) / (x[i - 1] - x[i]);
      return y[i] + f * (y[i - 1] - y[i]);
    }
  }
  return NAN;
}

/* Abbott & von Doenhoff (1959), Appendix I, NACA 0012 table: reference/naca0012_ordinates_abbott.csv.
 * Tolerance 1e-5 chord: the table is rounded to 5e-6 chord (and one entry, x = 20 %, sits on a
 * rounding half); linear interpolation between 4001 generated nodes adds below 1e-6. */
static void test_geom_naca0012_ordinates_match_abbott_table(void **state)
{
  (void)state;
  ascr_geom_section *s = NULL;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_naca("0012", 0, 2001, &s, &e), ASCR_OK);
  FILE *fp = fopen(ASCR_REFERENCE_DIR "/naca0012_ordinates_abbott.csv", "r");
  assert_non_null(fp);
  char line[256];
  int rows = 0;
  while (fgets(line, sizeof line, fp)) {
    double xp, yp;
    if (line[0] == '#' || sscanf(line, "%lf,%lf", &xp, &yp) != 2) continue;
    double yg = upper_y_at(s, xp / 100.0);
    char desc[64];
    snprintf(desc, sizeof desc, "NACA 0012 y at x = %.2f %%", xp);
    ascr_assert_close(yg, yp / 100.0, 0.0, 1e-5, desc);
    rows++;
  }
  fclose(fp);
  assert_int_equal(rows, 18);
  ascr_geom_section_free(s);
}

typedef struct naca_case {
  const char *spec;
  double t, xt, f, xf;   /* defining numbers */
  double tol_t, tol_xt, tol_f, tol_xf;
} naca_case;

/* Metrics against the numbers a designation defines (Abbott & von Doenhoff 1959, sec. 6.4-6.5):
 * 4-digit MPTT: camber M %, at P/10, thickness TT %, max thickness of the 4-digit thickness form
 * at x = 0.2998 (root of dy_t/dx). 5-digit 230TT: max camber at x = 0.15 (the "3" = 0.05 x 3),
 * camber 0.01839 from the mean-line equation at the tabulated r = 0.2025, k1 = 15.957.
 * Our metrics measure thickness and camber normal to the chord, while the designation lays the
 * thickness normal to the mean line; the difference is O(t * slope^2) in thickness and moves the
 * camber maximum by O(t * slope) in x, hence the wider x tolerances for cambered sections. */
static void test_geom_naca_metrics_match_designation(void **state)
{
  (void)state;
  const naca_case cases[] = {
    {"naca0012", 0.12, 0.2998, 0.0, -1, 2e-4, 2e-3, 1e-9, -1},
    {"naca0006", 0.06, 0.2998, 0.0, -1, 1e-4, 2e-3, 1e-9, -1},
    {"naca2412", 0.12, 0.2998, 0.02, 0.40, 5e-4, 3e-3, 1e-4, 5e-3},
    {"naca4412", 0.12, 0.2998, 0.04, 0.40, 5e-4, 6e-3, 1e-4, 5e-3},
    {"naca23012", 0.12, 0.2998, 0.01839, 0.15, 5e-4, 3e-3, 2e-4, 1e-2},
  };
  for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
    const naca_case *c = &cases[k];
    ascr_geom_section *s = NULL;
    ascr_errbuf e;
    assert_int_equal(ascr_geom_section_from_spec(c->spec, &s, &e), ASCR_OK);
    ascr_geom_metrics m;
    assert_int_equal(ascr_geom_section_metrics(s, &m, &e), ASCR_OK);
    char d[96];
    snprintf(d, sizeof d, "%s max thickness", c->spec);
    ascr_assert_close(m.thickness, c->t, 0.0, c->tol_t, d);
    snprintf(d, sizeof d, "%s x of max thickness", c->spec);
    ascr_assert_close(m.thickness_x, c->xt, 0.0, c->tol_xt, d);
    snprintf(d, sizeof d, "%s max camber", c->spec);
    ascr_assert_close(m.camber, c->f, 0.0, c->tol_f, d);
    if (c->xf > 0) {
      snprintf(d, sizeof d, "%s x of max camber", c->spec);
      ascr_assert_close(m.camber_x, c->xf, 0.0, c->tol_xf, d);
    }
    ascr_geom_section_free(s);
  }
}

/* Leading-edge radius r = 1.1019 t^2 (Abbott & von Doenhoff 1959, sec. 6.4); trailing-edge
 * gap 2 y_t(1) = 2 * 0.0021 t/0.2 for the open form and 0 for the closed form; included TE
 * angle 2 atan(|dy_t/dx| at x = 1) with dy_t/dx(1) = (t/0.2)(0.14845 - 0.1260 - 0.7032 +
 * 0.8529 - 0.4060) = -1.16925 t (differentiating eq. 6.2). Tolerances: radius 2 % (spline
 * curvature at the nose node with 201 cosine points per side: for NACA 0006 the first arc
 * step is 0.17 r, which biases the curvature by about 1 %); gap 1e-6; angle 0.3 deg (the
 * natural-spline end condition biases the end slope by O(h)). */
static void test_geom_naca_le_radius_te_gap_and_angle(void **state)
{
  (void)state;
  const double ts[] = {0.06, 0.12, 0.18};
  const char *specs[] = {"naca0006", "naca0012", "naca0018"};
  for (int k = 0; k < 3; k++) {
    ascr_geom_section *s = NULL;
    ascr_errbuf e;
    assert_int_equal(ascr_geom_section_from_spec(specs[k], &s, &e), ASCR_OK);
    ascr_geom_metrics m;
    assert_int_equal(ascr_geom_section_metrics(s, &m, &e), ASCR_OK);
    double t = ts[k];
    ascr_assert_close(m.le_radius, 1.1019 * t * t, 0.02, 0.0, "NACA 00xx leading-edge radius");
    ascr_assert_close(m.te_gap, 2.0 * 0.0021 * t / 0.2, 0.0, 1e-6, "NACA 00xx open TE gap");
    double ang = 2.0 * atan(1.16925 * t) * 180.0 / 3.14159265358979323846;
    ascr_assert_close(m.te_angle_deg, ang, 0.0, 0.3, "NACA 00xx TE included angle");
    ascr_geom_section_free(s);
  }
  ascr_geom_section *s = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012c", &s, NULL), ASCR_OK);
  ascr_geom_metrics m;
  assert_int_equal(ascr_geom_section_metrics(s, &m, NULL), ASCR_OK);
  ascr_assert_close(m.te_gap, 0.0, 0.0, 1e-12, "NACA 0012 closed TE gap");
  ascr_geom_section_free(s);
}

/* Area of NACA 00xx: integral of 2 y_t over the chord = (t/0.2) * 2 * (0.2969*2/3 - 0.126/2
 * - 0.3516/3 + 0.2843/4 - 0.1015/5) = 0.68464 t (closed form of eq. 6.2). Tolerance 0.2 %:
 * the shoelace sum on 4000 samples per surface, and the thickness laid on the chord exactly. */
static void test_geom_naca_area_matches_integral(void **state)
{
  (void)state;
  ascr_geom_section *s = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &s, NULL), ASCR_OK);
  ascr_geom_metrics m;
  assert_int_equal(ascr_geom_section_metrics(s, &m, NULL), ASCR_OK);
  double k = 2.0 / 0.2 * (0.2969 * 2.0 / 3.0 - 0.126 / 2.0 - 0.3516 / 3.0 + 0.2843 / 4.0 -
                          0.1015 / 5.0);
  ascr_assert_close(m.area, k * 0.12, 2e-3, 0.0, "NACA 0012 area");
  ascr_geom_section_free(s);
}

/* Plate: its metrics reproduce its parameters (our construction, src/geom/plate.c):
 * thickness t (flat part, exact), camber f at xf (thickness symmetric about the camber line,
 * so the chord-normal midline equals the camber line to O(t f)), LE radius t/(4 nose),
 * TE gap = te thickness (the TE is on the camber line end, slope small). */
static void test_geom_plate_metrics_match_parameters(void **state)
{
  (void)state;
  ascr_geom_plate_params p = ascr_geom_plate_defaults();
  p.thickness = 0.025;
  p.camber = 0.045;
  p.camber_pos = 0.42;
  p.nose_length = 1.3;
  p.taper_length = 0.25;
  p.te_thickness = 0.004;
  ascr_geom_section *s = NULL;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_plate(&p, 301, &s, &e), ASCR_OK);
  ascr_geom_metrics m;
  assert_int_equal(ascr_geom_section_metrics(s, &m, &e), ASCR_OK);
  ascr_assert_close(m.thickness, 0.025, 0.02, 0.0, "plate thickness");
  ascr_assert_close(m.camber, 0.045, 0.0, 2e-4, "plate camber");
  ascr_assert_close(m.camber_x, 0.42, 0.0, 5e-3, "plate camber position");
  ascr_assert_close(m.le_radius, 0.025 / (4.0 * 1.3), 0.05, 0.0, "plate nose radius");
  ascr_assert_close(m.te_gap, 0.004, 0.02, 0.0, "plate TE thickness");
  ascr_geom_section_free(s);
}

/* Every status of the generators is provoked. */
static void test_geom_generators_reject_bad_specs(void **state)
{
  (void)state;
  ascr_geom_section *s = (ascr_geom_section *)1;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_from_spec("naca24x2", &s, &e), ASCR_EPARSE);
  assert_null(s);
  assert_non_null(strstr(e.msg, "not a NACA"));
  assert_int_equal(ascr_geom_section_from_spec("naca23112", &s, &e), ASCR_EDOM);
  assert_non_null(strstr(e.msg, "reflexed"));
  assert_int_equal(ascr_geom_section_from_spec("naca2400", &s, &e), ASCR_EDOM);
  assert_int_equal(ascr_geom_section_from_spec("naca2012", &s, &e), ASCR_EDOM);
  assert_int_equal(ascr_geom_section_from_spec("plate:t=30", &s, &e), ASCR_EDOM);
  assert_non_null(strstr(e.msg, "thickness"));
  assert_int_equal(ascr_geom_section_from_spec("plate:q=3", &s, &e), ASCR_EPARSE);
  assert_non_null(strstr(e.msg, "unknown key 'q'"));
  assert_int_equal(ascr_geom_section_from_spec("plate:t=abc", &s, &e), ASCR_EPARSE);
  /* a key given twice (issue 17): refused, not the last one silently taken */
  assert_int_equal(ascr_geom_section_from_spec("plate:t=2.5,t=3", &s, &e), ASCR_EPARSE);
  assert_non_null(strstr(e.msg, "given twice"));
  assert_int_equal(ascr_geom_section_from_spec("plate:t=2,taper=0", &s, &e), ASCR_EDOM);
  assert_int_equal(ascr_geom_section_from_spec("wing.dat", &s, &e), ASCR_EPARSE);
  assert_false(ascr_geom_is_spec("wing.dat"));
  assert_true(ascr_geom_is_spec("naca0012"));
  assert_true(ascr_geom_is_spec("plate:t=2"));
  assert_int_equal(ascr_geom_naca("0012", 0, 3, &s, &e), ASCR_EINVAL);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_geom_naca0012_ordinates_match_abbott_table),
    cmocka_unit_test(test_geom_naca_metrics_match_designation),
    cmocka_unit_test(test_geom_naca_le_radius_te_gap_and_angle),
    cmocka_unit_test(test_geom_naca_area_matches_integral),
    cmocka_unit_test(test_geom_plate_metrics_match_parameters),
    cmocka_unit_test(test_geom_generators_reject_bad_specs),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
