/* tests/cli/test_fig_polar.c
 * The panels of the CLI's polar figure (src/cli/fig_polar_panels.c): the drag polar drawn as
 * the trade draws it (cd across, cl up; issue 17: it had cl across), and the legend of a polar
 * with no converged point saying so (issue 17: it named the curve and drew nothing).
 */
#include "ascr_test.h"
#include "cli_figures.h"

#include <math.h>
#include <string.h>

static double alpha[3] = {0.0, 1.0, 2.0};
static double cl_a[3] = {0.2, 0.3, 0.4}, cd_a[3] = {0.01, 0.011, 0.013}, cm_a[3] = {-0.05, -0.05, -0.05};
static double nan3[3] = {NAN, NAN, NAN};

static void set(fig_polar *f, const char *label, double *cl, double *cd, double *cm)
{
  memset(f, 0, sizeof *f);
  strcpy(f->label, label);
  f->n = 3;
  f->alpha = alpha;
  f->cl = cl;
  f->cd = cd;
  f->cm = cm;
}

/* one polar with converged points, one without */
static void make(fig_polar p[2])
{
  set(&p[0], "Re 60k", cl_a, cd_a, cm_a);
  set(&p[1], "Re 10k", nan3, nan3, nan3);
}

/* the two polars above through the panel builder */
typedef struct built {
  fig_polar p[2];
  plot_panel pan[4];
  plot_series sr[16];
  double ld0[3], ld1[3];
  double *ld[2];
  char label[2][128];
} built;

static void build(built *b)
{
  make(b->p);
  b->ld[0] = b->ld0;
  b->ld[1] = b->ld1;
  fig_polar_work w = {b->sr, b->ld, b->label};
  fig_polar_panels("lift", b->p, 2, &w, b->pan);
}

static void test_fig_polar_drag_polar_has_cd_across(void **state)
{
  (void)state;
  built b;
  build(&b);
  const plot_panel *pan = b.pan;
  assert_string_equal(pan[1].title, "drag polar");
  assert_non_null(strstr(pan[1].xlabel, "drag"));
  assert_non_null(strstr(pan[1].ylabel, "lift"));
  assert_int_equal(pan[1].n_series, 2);
  assert_ptr_equal(pan[1].series[0].x, cd_a);
  assert_ptr_equal(pan[1].series[0].y, cl_a);
  /* the other panels against the angle, L/D computed */
  assert_ptr_equal(pan[0].series[0].x, alpha);
  assert_ptr_equal(pan[2].series[0].y, cm_a);
  assert_true(fabs(pan[3].series[0].y[1] - 0.3 / 0.011) < 1e-12);
}

static void test_fig_polar_legend_says_no_converged_points(void **state)
{
  (void)state;
  built b;
  build(&b);
  assert_string_equal(b.pan[0].series[0].label, "Re 60k");
  assert_string_equal(b.pan[0].series[1].label, "Re 10k: no converged points");
  /* only the first panel carries the legend */
  assert_null(b.pan[1].series[0].label);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_fig_polar_drag_polar_has_cd_across),
    cmocka_unit_test(test_fig_polar_legend_says_no_converged_points),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
