/* tests/geom/test_geom_reader.c
 * Coordinate-file reader: both layouts and both senses are recognised and give the same
 * normalised contour; every class of bad input is rejected with a message naming the line.
 * Reference shapes are NACA 2412 ordinates from our generator (checked against the published
 * table in test_geom_naca.c); the tests here check bookkeeping, so tolerances are round-off.
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct textbuf {
  char *p;
  size_t n, cap;
} textbuf;

static void tb_printf(textbuf *t, const char *fmt, ...)
{
  va_list ap;
  va_start(ap, fmt);
  char tmp[256];
  int k = vsnprintf(tmp, sizeof tmp, fmt, ap);
  va_end(ap);
  if (t->n + (size_t)k + 1 > t->cap) {
    t->cap = 2 * (t->cap + (size_t)k + 1);
    t->p = realloc(t->p, t->cap);
  }
  memcpy(t->p + t->n, tmp, (size_t)k + 1);
  t->n += (size_t)k;
}

static ascr_geom_section *ref_section(void)
{
  ascr_geom_section *s = NULL;
  assert_int_equal(ascr_geom_naca("2412", 0, 41, &s, NULL), ASCR_OK);
  return s;
}

/* Contour of the reference section, optionally reversed, scaled, rotated and shifted. */
static textbuf contour_text(int reverse, double scale, double rot_deg, double dx, double dy)
{
  ascr_geom_section *s = ref_section();
  size_t n = ascr_geom_section_size(s);
  const double *x = ascr_geom_section_x(s), *y = ascr_geom_section_y(s);
  double c = cos(rot_deg * 3.14159265358979323846 / 180.0);
  double sn = sin(rot_deg * 3.14159265358979323846 / 180.0);
  textbuf t = {0};
  tb_printf(&t, "Test section 2412\n# a comment line\n\n");
  for (size_t k = 0; k < n; k++) {
    size_t i = reverse ? n - 1 - k : k;
    double X = scale * (c * x[i] - sn * y[i]) + dx, Y = scale * (sn * x[i] + c * y[i]) + dy;
    tb_printf(&t, "%.17g %.17g%s\n", X, Y, k == 3 ? "  # trailing comment" : "");
  }
  ascr_geom_section_free(s);
  return t;
}

static void assert_same_contour(const ascr_geom_section *a, const ascr_geom_section *b,
                                double tol)
{
  assert_int_equal(ascr_geom_section_size(a), ascr_geom_section_size(b));
  for (size_t i = 0; i < ascr_geom_section_size(a); i++) {
    ascr_assert_close(ascr_geom_section_x(a)[i], ascr_geom_section_x(b)[i], 0, tol, "x");
    ascr_assert_close(ascr_geom_section_y(a)[i], ascr_geom_section_y(b)[i], 0, tol, "y");
  }
  assert_int_equal(ascr_geom_section_le_index(a), ascr_geom_section_le_index(b));
}

static void test_geom_reader_contour_with_title_and_comments(void **state)
{
  (void)state;
  textbuf t = contour_text(0, 1.0, 0.0, 0.0, 0.0);
  ascr_geom_section *s = NULL, *r = ref_section();
  ascr_geom_load_info li;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_parse(t.p, t.n, "mem.dat", &s, &li, &e), ASCR_OK);
  assert_string_equal(li.title, "Test section 2412");
  assert_int_equal(li.layout, ASCR_GEOM_LAYOUT_CONTOUR);
  assert_int_equal(li.reversed, 0);
  ascr_assert_close(li.chord_orig, 1.0, 0, 1e-15, "chord");
  assert_same_contour(s, r, 1e-15);
  ascr_geom_section_free(s);
  ascr_geom_section_free(r);
  free(t.p);
}

static void test_geom_reader_clockwise_contour_is_reversed(void **state)
{
  (void)state;
  textbuf t = contour_text(1, 1.0, 0.0, 0.0, 0.0);
  ascr_geom_section *s = NULL, *r = ref_section();
  ascr_geom_load_info li;
  assert_int_equal(ascr_geom_section_parse(t.p, t.n, "mem.dat", &s, &li, NULL), ASCR_OK);
  assert_int_equal(li.reversed, 1);
  assert_same_contour(s, r, 1e-15);
  ascr_geom_section_free(s);
  ascr_geom_section_free(r);
  free(t.p);
}

/* A section drawn in millimetres, rotated by 7.3 deg and shifted is brought back to chord
 * coordinates; chord and rotation are reported. Tolerance 1e-12: round-off of the transform. */
static void test_geom_reader_normalises_scaled_rotated_input(void **state)
{
  (void)state;
  textbuf t = contour_text(0, 38.5, 7.3, 12.0, -4.0);
  ascr_geom_section *s = NULL, *r = ref_section();
  ascr_geom_load_info li;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_parse(t.p, t.n, "mm.dat", &s, &li, &e), ASCR_OK);
  /* the generated 2412 has its chord from (0,0) to (1,0); but as a file it is renormalised by
   * the farthest point, which for a cambered NACA lies just off (0,0): compare loosely */
  ascr_assert_close(li.chord_orig, 38.5, 1e-3, 0, "chord in mm");
  ascr_assert_close(li.rotation_deg, -7.3, 0, 0.25, "rotation");
  assert_int_equal(ascr_geom_section_size(s), ascr_geom_section_size(r));
  ascr_geom_section_free(s);
  ascr_geom_section_free(r);
  free(t.p);

  /* a symmetric section has its farthest point exactly at the nose: exact recovery */
  ascr_geom_section *z = NULL;
  assert_int_equal(ascr_geom_naca("0012", 0, 41, &z, NULL), ASCR_OK);
  textbuf u = {0};
  double c = cos(0.2), sn = sin(0.2);
  for (size_t i = 0; i < ascr_geom_section_size(z); i++) {
    double x = ascr_geom_section_x(z)[i], y = ascr_geom_section_y(z)[i];
    tb_printf(&u, "%.17g, %.17g\n", 50.0 * (c * x - sn * y) + 3.0, 50.0 * (sn * x + c * y) - 1.0);
  }
  ascr_geom_section *zz = NULL;
  assert_int_equal(ascr_geom_section_parse(u.p, u.n, "rot.csv", &zz, &li, &e), ASCR_OK);
  ascr_assert_close(li.chord_orig, 50.0, 1e-12, 0, "chord");
  ascr_assert_close(li.rotation_deg, -0.2 * 180.0 / 3.14159265358979323846, 0, 1e-10, "rotation");
  assert_same_contour(zz, z, 1e-12);
  ascr_geom_section_free(z);
  ascr_geom_section_free(zz);
  free(u.p);
}

/* Two surfaces each from the leading edge, in either order, with a shared leading-edge point,
 * and the same with a count row. */
static void test_geom_reader_two_surface_layouts(void **state)
{
  (void)state;
  ascr_geom_section *r = ref_section();
  size_t n = ascr_geom_section_size(r), ile = ascr_geom_section_le_index(r);
  const double *x = ascr_geom_section_x(r), *y = ascr_geom_section_y(r);
  for (int variant = 0; variant < 3; variant++) {
    textbuf t = {0};
    if (variant == 2) tb_printf(&t, "%zu %zu\n", ile + 1, n - ile);
    /* variant 0 and 2: upper first; variant 1: lower first */
    for (int surf = 0; surf < 2; surf++) {
      int upper = (variant == 1) ? surf == 1 : surf == 0;
      for (size_t k = 0; k <= (upper ? ile : n - 1 - ile); k++) {
        size_t i = upper ? ile - k : ile + k;
        tb_printf(&t, "%.17g\t%.17g\n", x[i], y[i]);
      }
    }
    ascr_geom_section *s = NULL;
    ascr_geom_load_info li;
    ascr_errbuf e;
    assert_int_equal(ascr_geom_section_parse(t.p, t.n, "two.dat", &s, &li, &e), ASCR_OK);
    assert_int_equal(li.layout, ASCR_GEOM_LAYOUT_TWO_SURFACES);
    assert_int_equal(li.merged_le_duplicate, 1);
    assert_int_equal(li.had_count_row, variant == 2);
    assert_same_contour(s, r, 1e-15);
    ascr_geom_section_free(s);
    free(t.p);
  }
  ascr_geom_section_free(r);
}

typedef struct bad_case {
  const char *what;
  const char *text;
  ascr_status code;
  const char *fragment; /* expected in the message */
} bad_case;

/* A valid 10-point diamond-ish contour used as the base of the bad cases. */
#define OK10 "1 0\n0.75 0.04\n0.5 0.06\n0.25 0.06\n0.05 0.03\n0 0\n0.05 -0.02\n0.25 -0.03\n0.5 -0.025\n0.75 -0.01\n1 0\n"

static void test_geom_reader_rejects_bad_input_with_line(void **state)
{
  (void)state;
  const bad_case cases[] = {
    {"too few points", "1 0\n0.5 0.05\n0 0\n0.5 -0.05\n1 0\n", ASCR_EGEOM, "too few points: 5"},
    {"non-numeric field", "title\n1 0\n0.75 0.04\n0.5 abc\n", ASCR_EPARSE, "mem:4: field y: non-numeric value 'abc'"},
    {"non-finite field", "1 0\nnan 0.04\n", ASCR_EPARSE, "mem:2: field x: non-finite value 'nan'"},
    {"infinite field", "1 0\n0.5 inf\n", ASCR_EPARSE, "mem:2: field y: non-finite"},
    {"overflowing field", "1 0\n0.5 1e999\n", ASCR_EPARSE, "mem:2: field y: non-finite"},
    {"three fields", "1 0\n0.5 0.04 7\n", ASCR_EPARSE, "mem:2: expected two numbers (x y), found 3 fields"},
    {"one field", "1 0\n0.5\n", ASCR_EPARSE, "mem:2: expected two numbers (x y), found 1 field"},
    {"repeated point", "1 0\n0.75 0.04\n0.5 0.06\n0.5 0.06\n0.25 0.06\n0.05 0.03\n0 0\n0.05 -0.02\n0.25 -0.03\n0.5 -0.025\n1 0\n",
     ASCR_EGEOM, "mem:4: repeated point (0.5, 0.06) (same as line 3)"},
    {"crossing contour", "1 0\n0.75 0.04\n0.5 -0.06\n0.25 0.06\n0.05 0.03\n0 0\n0.05 -0.02\n0.25 -0.03\n0.5 0.025\n0.75 -0.01\n1 0\n",
     ASCR_EGEOM, "crosses itself"},
    /* found by fuzzing (issue 17): the contour passes (0.34, 0.000572) and (0.34, 0.00057)
     * twice without crossing; the analysis then cast a NaN to an integer (repanel.c) */
    {"self-touching contour", ".34;.000572\n.34,.00057\n0.9,0.\n.99,0\n.34;.000572\n0.34,0.00057\n.67,0\n1,-0\n",
     ASCR_EGEOM, "crosses itself"},
    {"surface doubling back", "1 0\n0.75 0.04\n0.5 0.06\n0.6 0.065\n0.25 0.06\n0.05 0.03\n0 0\n0.05 -0.02\n0.25 -0.03\n0.5 -0.025\n0.75 -0.01\n1 0\n",
     ASCR_EGEOM, "upper surface doubles back"},
    {"open contour", "1 0.1\n0.75 0.14\n0.5 0.16\n0.25 0.12\n0.05 0.05\n0 0\n0.05 -0.02\n0.25 -0.03\n0.5 -0.025\n0.75 -0.01\n1 -0.01\n",
     ASCR_EGEOM, "the contour is open: its end points (lines 1 and 11) are 0.11 chords apart"},
    {"binary data", "1 0\n0.5\0 0.1\n", ASCR_EPARSE, "mem:2: binary data"},
    {"only comments", "# nothing\n\n# here\n", ASCR_EGEOM, "no coordinate rows"},
    {"all collinear", "1 0\n0.8 0\n0.6 0\n0.4 0\n0.2 0\n0 0\n0.3 0\n0.5 0\n0.7 0\n1 0\n", ASCR_EGEOM, "no area"},
    {"no layout", "0.5 0.06\n0.75 0.04\n1 0\n0.75 -0.01\n0.5 -0.025\n0.25 -0.03\n0.05 -0.02\n0 0\n0.05 0.03\n0.25 0.06\n", ASCR_EGEOM, "cannot tell the layout"},
    {"second title line", "title\n" OK10 "another text\n", ASCR_EPARSE, "mem:13: field x: non-numeric value 'another'"},
  };
  for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
    const bad_case *c = &cases[k];
    size_t len = strlen(c->text);
    if (strcmp(c->what, "binary data") == 0) len = 12;
    ascr_geom_section *s = (ascr_geom_section *)1;
    ascr_errbuf e;
    e.msg[0] = '\0';
    ascr_status st = ascr_geom_section_parse(c->text, len, "mem", &s, NULL, &e);
    if (st != c->code || strstr(e.msg, c->fragment) == NULL) {
      print_error("case '%s': status %s, message '%s'; expected %s with '%s'\n", c->what,
                  ascr_status_name(st), e.msg, ascr_status_name(c->code), c->fragment);
      fail();
    }
    assert_null(s);
  }
  /* the base contour itself is fine */
  ascr_geom_section *s = NULL;
  assert_int_equal(ascr_geom_section_parse(OK10, strlen(OK10), "mem", &s, NULL, NULL), ASCR_OK);
  ascr_geom_section_free(s);
}

static void test_geom_reader_missing_file_is_io_error(void **state)
{
  (void)state;
  ascr_geom_section *s = NULL;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_read("/nonexistent/dir/x.dat", &s, NULL, &e), ASCR_EIO);
  assert_non_null(strstr(e.msg, "/nonexistent/dir/x.dat: cannot open"));
  assert_null(s);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_geom_reader_contour_with_title_and_comments),
    cmocka_unit_test(test_geom_reader_clockwise_contour_is_reversed),
    cmocka_unit_test(test_geom_reader_normalises_scaled_rotated_input),
    cmocka_unit_test(test_geom_reader_two_surface_layouts),
    cmocka_unit_test(test_geom_reader_rejects_bad_input_with_line),
    cmocka_unit_test(test_geom_reader_missing_file_is_io_error),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
