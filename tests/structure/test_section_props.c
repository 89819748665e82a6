/* tests/structure/test_section_props.c
 * Section properties (src/structure/section_props.c) against closed forms: the rectangle, the
 * ellipse, the thin circular-arc band (annular sector) and the NACA four-digit thickness
 * distribution, each with its source beside it.
 */
#include "ascr_test.h"
#include "airscrew/ascr_structure.h"

#include <math.h>
#include <stdlib.h>

#define PI 3.14159265358979323846

/* Rectangle b x t (a polygon of four vertices: exact). A = b t, I_xx = b t^3/12, I_yy = t b^3/12
 * (any strength-of-materials text, e.g. Gere & Timoshenko, Mechanics of Materials, app. D).
 * Torsion: the exact solution (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., sec. 109):
 * J = b t^3/3 [1 - 192 t/(pi^5 b) sum_{n odd} tanh(n pi b/(2 t))/n^5]; Saint-Venant's
 * approximation is required within 10 % (its accuracy for compact and thin solid sections;
 * measured +8.1 % for the square, +1.9 % at b/t = 4, -3.6 % at b/t = 10). */
static void test_rectangle(void **state)
{
  (void)state;
  const double ratios[3] = {1.0, 4.0, 10.0};
  for (int k = 0; k < 3; k++) {
    double t = 0.002, b = ratios[k] * t;
    /* clockwise on purpose, shifted off the origin, rotated by 30 deg */
    double c30 = cos(PI / 6.0), s30 = sin(PI / 6.0);
    double px[4] = {0.0, 0.0, b, b}, py[4] = {0.0, t, t, 0.0}, x[4], y[4];
    for (int i = 0; i < 4; i++) {
      x[i] = 0.3 + c30 * px[i] - s30 * py[i];
      y[i] = -0.1 + s30 * px[i] + c30 * py[i];
    }
    ascr_section_props p;
    ascr_errbuf err;
    assert_int_equal(ascr_section_props_polygon(x, y, 4, 1.0, &p, &err), ASCR_OK);
    ascr_assert_close(p.area, b * t, 1e-12, 0.0, "rectangle area");
    ascr_assert_close(p.i_1, fmax(t * b * b * b, b * t * t * t) / 12.0, 1e-9, 0.0, "principal I_1");
    ascr_assert_close(p.i_2, fmin(t * b * b * b, b * t * t * t) / 12.0, 1e-9, 0.0, "principal I_2");
    /* the axis of the larger moment is normal to the long side b, which lies at 30 deg */
    if (k > 0) ascr_assert_close(p.principal_deg, -60.0, 0.0, 1e-7, "principal axis normal to b");
    double sum = 0.0;
    for (int n = 1; n < 200; n += 2) sum += tanh(n * PI * b / (2.0 * t)) / pow(n, 5);
    double j = b * t * t * t / 3.0 * (1.0 - 192.0 * t / (pow(PI, 5) * b) * sum);
    print_message("b/t %4.1f: J Saint-Venant / exact = %.4f\n", ratios[k], p.j_torsion / j);
    ascr_assert_close(p.j_torsion, j, 0.10, 0.0, "torsion constant within 10 %");
  }
}

/* Ellipse, semi-axes a, b (2000 vertices): A = pi a b, I_xx = pi a b^3/4, I_yy = pi a^3 b/4, and
 * J = pi a^3 b^3/(a^2 + b^2), which Saint-Venant's formula gives exactly (Timoshenko & Goodier,
 * sec. 106). The inscribed polygon's error is of order (2 pi/N)^2/6 = 1.6e-6: 1e-5 allowed. */
static void test_ellipse(void **state)
{
  (void)state;
  enum { N = 2000 };
  double *x = malloc(N * sizeof *x), *y = malloc(N * sizeof *y);
  assert_non_null(x);
  assert_non_null(y);
  double a = 0.5, b = 0.06;
  for (int i = 0; i < N; i++) {
    double th = 2.0 * PI * i / N;
    x[i] = 0.5 + a * cos(th);
    y[i] = b * sin(th);
  }
  ascr_section_props p;
  ascr_errbuf err;
  double c = 0.02; /* chord scale */
  assert_int_equal(ascr_section_props_polygon(x, y, N, c, &p, &err), ASCR_OK);
  double A = PI * a * b * c * c, ixx = PI * a * pow(b, 3) / 4.0 * pow(c, 4);
  double iyy = PI * pow(a, 3) * b / 4.0 * pow(c, 4);
  double j = PI * pow(a, 3) * pow(b, 3) / (a * a + b * b) * pow(c, 4);
  ascr_assert_close(p.area, A, 1e-5, 0.0, "ellipse area");
  ascr_assert_close(p.x_c, 0.5 * c, 1e-12, 0.0, "centroid x");
  ascr_assert_close(p.y_c, 0.0, 0.0, 1e-15, "centroid y");
  ascr_assert_close(p.i_xx, ixx, 1e-5, 0.0, "ellipse I_xx");
  ascr_assert_close(p.i_yy, iyy, 1e-5, 0.0, "ellipse I_yy");
  ascr_assert_close(p.i_xy, 0.0, 0.0, 1e-9 * iyy, "ellipse I_xy");
  ascr_assert_close(p.j_torsion, j, 3e-5, 0.0, "ellipse torsion constant (exact formula)");
  free(x);
  free(y);
}

/* Thin circular-arc band (a cambered plate of constant thickness): the annular sector of mean
 * radius R, thickness t, opening theta, symmetric about the y axis. Closed forms by integrating
 * in polar coordinates: A = theta R t; int y dA = 2 sin(theta/2) (Ro^3 - Ri^3)/3;
 * int x^2 dA = (Ro^4 - Ri^4)/4 (theta - sin theta)/2, int y^2 dA = (Ro^4 - Ri^4)/4
 * (theta + sin theta)/2. 4000 vertices on each arc: 1e-6 allowed. */
static void test_circular_arc_band(void **state)
{
  (void)state;
  enum { M = 4000 };
  double *x = malloc(2 * M * sizeof *x), *y = malloc(2 * M * sizeof *y);
  assert_non_null(x);
  assert_non_null(y);
  double R = 1.0, t = 0.03, th = 0.5, ro = R + 0.5 * t, ri = R - 0.5 * t;
  for (int i = 0; i < M; i++) {
    double ph = -0.5 * th + th * i / (M - 1);
    x[i] = ro * sin(ph);
    y[i] = ro * cos(ph);
    x[2 * M - 1 - i] = ri * sin(ph);
    y[2 * M - 1 - i] = ri * cos(ph);
  }
  ascr_section_props p;
  ascr_errbuf err;
  assert_int_equal(ascr_section_props_polygon(x, y, 2 * M, 1.0, &p, &err), ASCR_OK);
  double A = th * R * t;
  double yc = 2.0 * sin(0.5 * th) * (pow(ro, 3) - pow(ri, 3)) / 3.0 / A;
  double x2 = (pow(ro, 4) - pow(ri, 4)) / 4.0 * (th - sin(th)) / 2.0;
  double y2 = (pow(ro, 4) - pow(ri, 4)) / 4.0 * (th + sin(th)) / 2.0;
  ascr_assert_close(p.area, A, 1e-6, 0.0, "arc band area");
  ascr_assert_close(p.y_c, yc, 1e-6, 0.0, "arc band centroid");
  ascr_assert_close(p.i_yy, x2, 1e-6, 0.0, "arc band I_yy");
  ascr_assert_close(p.i_xx, y2 - A * yc * yc, 1e-5, 0.0, "arc band I_xx about the centroid");
  free(x);
  free(y);
}

/* NACA 0012 (the generator's contour, chord 1): the area of the four-digit thickness
 * distribution, 2 int y_t dx = 10 t (0.2969 (2/3) - 0.1260/2 - 0.3516/3 + 0.2843/4 - 0.1015/5)
 * = 0.68508 t (Abbott & von Doenhoff, Theory of Wing Sections, 1959, eq. 6.2, integrated); the
 * generator's contour may close its trailing edge, which changes the area by less than 0.2 %.
 * Scaling: A ~ c^2, I ~ c^4, J ~ c^4. */
static void test_naca0012(void **state)
{
  (void)state;
  ascr_geom_section *s = NULL;
  ascr_errbuf err;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &s, &err), ASCR_OK);
  ascr_section_props p, q;
  assert_int_equal(ascr_section_props_of(s, 1.0, &p, &err), ASCR_OK);
  print_message("NACA 0012: A %.6f (0.68508 t = %.6f), I_xx %.4e, I_yy %.4e, J %.4e\n", p.area,
                0.68508 * 0.12, p.i_xx, p.i_yy, p.j_torsion);
  ascr_assert_close(p.area, 0.68508 * 0.12, 2e-3, 0.0, "NACA 0012 area");
  ascr_assert_close(p.y_c, 0.0, 0.0, 1e-9, "symmetric section: centroid on the chord");
  assert_int_equal(ascr_section_props_of(s, 0.02, &q, &err), ASCR_OK);
  ascr_assert_close(q.area, p.area * 4e-4, 1e-12, 0.0, "A ~ c^2");
  ascr_assert_close(q.i_xx, p.i_xx * 1.6e-7, 1e-12, 0.0, "I ~ c^4");
  ascr_assert_close(q.j_torsion, p.j_torsion * 1.6e-7, 1e-12, 0.0, "J ~ c^4");
  ascr_geom_section_free(s);
  double x3[3] = {0.0, 1.0, 2.0}, y3[3] = {0.0, 0.0, 0.0};
  assert_int_equal(ascr_section_props_polygon(x3, y3, 3, 1.0, &p, &err), ASCR_EGEOM);
  assert_int_equal(ascr_section_props_polygon(x3, y3, 2, 1.0, &p, &err), ASCR_EINVAL);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_rectangle),
      cmocka_unit_test(test_ellipse),
      cmocka_unit_test(test_circular_arc_band),
      cmocka_unit_test(test_naca0012),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
