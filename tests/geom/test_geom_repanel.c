/* tests/geom/test_geom_repanel.c
 * Repanelling: node count, fixed end and leading-edge nodes, nodes on the original shape,
 * clustering at the nose and trailing edge, and error returns.
 */
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Nodes of NACA 0012 repanelled from a dense generated contour lie on the exact thickness
 * form (Abbott & von Doenhoff 1959, eq. 6.2). Tolerance 2e-6 chord: the cubic spline through
 * 401 cosine-spaced points interpolates the shape to O(h^4). */
static void test_geom_repanel_nodes_lie_on_naca0012(void **state)
{
  (void)state;
  ascr_geom_section *s = NULL, *r = NULL;
  assert_int_equal(ascr_geom_naca("0012", 0, 201, &s, NULL), ASCR_OK);
  ascr_geom_repanel_params p = ascr_geom_repanel_defaults();
  p.n_panels = 137;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_repanel(s, &p, &r, &e), ASCR_OK);
  size_t n = ascr_geom_section_size(r);
  assert_int_equal(n, 138);
  const double *x = ascr_geom_section_x(r), *y = ascr_geom_section_y(r);
  size_t ile = ascr_geom_section_le_index(r);
  assert_true(ile > 50 && ile < 90);
  ascr_assert_close(x[ile], 0.0, 0, 1e-15, "LE node x");
  ascr_assert_close(y[ile], 0.0, 0, 1e-15, "LE node y");
  ascr_assert_close(x[0], 1.0, 0, 1e-15, "upper TE x");
  ascr_assert_close(x[n - 1], 1.0, 0, 1e-15, "lower TE x");
  for (size_t i = 0; i < n; i++) {
    double X = x[i];
    if (X < 0.0) X = 0.0;
    double yt = 0.6 * (0.2969 * sqrt(X) - 0.126 * X - 0.3516 * X * X + 0.2843 * X * X * X -
                       0.1015 * X * X * X * X);
    ascr_assert_close(fabs(y[i]), yt, 0, 2e-6, "node on NACA 0012 thickness form");
    if (i < ile) assert_true(y[i] >= 0.0);
    if (i > ile) assert_true(y[i] <= 0.0);
  }
  /* clustering: nose and trailing-edge panels are shorter than mid-chord panels */
  double ds_le = hypot(x[ile + 1] - x[ile], y[ile + 1] - y[ile]);
  double ds_te = hypot(x[1] - x[0], y[1] - y[0]);
  double ds_mid = 0.0;
  for (size_t i = 0; i + 1 < n; i++) {
    if (x[i] > 0.45 && x[i] < 0.55 && i < ile) ds_mid = hypot(x[i + 1] - x[i], y[i + 1] - y[i]);
  }
  assert_true(ds_le < 0.25 * ds_mid);
  assert_true(ds_te < 0.6 * ds_mid);
  ascr_geom_section_free(s);
  ascr_geom_section_free(r);
}

static void test_geom_repanel_rejects_bad_counts(void **state)
{
  (void)state;
  ascr_geom_section *s = NULL, *r = (ascr_geom_section *)1;
  assert_int_equal(ascr_geom_naca("2412", 0, 101, &s, NULL), ASCR_OK);
  ascr_geom_repanel_params p = ascr_geom_repanel_defaults();
  p.n_panels = 10;
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_repanel(s, &p, &r, &e), ASCR_EINVAL);
  assert_non_null(strstr(e.msg, "10 panels requested"));
  assert_null(r);
  p.n_panels = 100;
  p.te_extent = 0.0;
  assert_int_equal(ascr_geom_section_repanel(s, &p, &r, &e), ASCR_EINVAL);
  ascr_geom_section_free(s);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_geom_repanel_nodes_lie_on_naca0012),
    cmocka_unit_test(test_geom_repanel_rejects_bad_counts),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
