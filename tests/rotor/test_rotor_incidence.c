/* tests/rotor/test_rotor_incidence.c
 * BEMT with the disc at incidence (src/rotor/incidence.c): the axial case against the axial BEMT,
 * the edgewise mean induced velocity against Glauert's momentum result, continuity from 0 to 90
 * degrees, and the signs of the in-plane force and hub moments. The propeller: a 5-inch two-blade
 * layout on an analytic section (cl = 2 pi (alpha - alpha0), constant cd), so that the checks
 * see the inflow model alone.
 */
#include "ascr_test.h"
#include "test_props.h"
#include "airscrew/ascr_rotor.h"
#include "airscrew/ascr_table.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846

typedef struct fixture {
  ascr_blade b;
  ascr_blade_station st[TEST_PROP_STATIONS];
  ascr_polar_table *tab;
  const ascr_polar_table *tabs[1];
  ascr_rotor_params p;
} fixture;

static int setup(void **state)
{
  fixture *f = calloc(1, sizeof *f);
  if (f == NULL) return -1;
  if (test_prop_five_inch(&f->b, f->st, &f->tab) != 0) return -1;
  f->tabs[0] = f->tab;
  f->p = ascr_rotor_params_defaults();
  *state = f;
  return 0;
}

static int teardown(void **state)
{
  fixture *f = *state;
  ascr_polar_table_free(f->tab);
  free(f);
  return 0;
}

/* Axial flow (incidence 0) and hover: the equations are the axial BEMT's in other unknowns, so
 * thrust and torque agree to the solvers' tolerances (1e-9; both solve to 1e-11 and better). */
static void test_axial_is_bemt(void **state)
{
  fixture *f = *state;
  const double speeds[3] = {0.0, 5.0, 15.0};
  for (int k = 0; k < 3; k++) {
    ascr_rotor_result br;
    ascr_rotor_incidence_result ir;
    ascr_errbuf err;
    assert_int_equal(ascr_rotor_bemt(&f->b, f->tabs, &f->p, 20000.0, speeds[k], &br, NULL, &err), ASCR_OK);
    assert_int_equal(ascr_rotor_incidence(&f->b, f->tabs, &f->p, 20000.0, speeds[k], 0.0, 24, &ir, &err), ASCR_OK);
    assert_true(br.converged && ir.r.converged);
    ascr_assert_close(ir.r.thrust_N, br.thrust_N, 1e-9, 0.0, "axial thrust as BEMT");
    ascr_assert_close(ir.r.torque_Nm, br.torque_Nm, 1e-9, 0.0, "axial torque as BEMT");
    assert_true(fabs(ir.h_force_N) < 1e-12 && fabs(ir.roll_moment_Nm) < 1e-12);
    /* any incidence in hover (no airflow) is hover */
    assert_int_equal(ascr_rotor_incidence(&f->b, f->tabs, &f->p, 20000.0, 0.0, 60.0, 24, &ir, &err), ASCR_OK);
    if (k == 0) ascr_assert_close(ir.r.thrust_N, br.thrust_N, 1e-9, 0.0, "hover at any incidence");
  }
}

/* Edgewise flight at high advance ratio: the disc's mean induced velocity against Glauert's
 * forward-flight momentum result T = 2 rho A v sqrt(Vp^2 + v^2) (Glauert, ARC R&M 1111, 1926;
 * Leishman, Principles of Helicopter Aerodynamics, 2nd ed., eq. 2.112), solved for v at the
 * computed thrust. Tip and hub loss off (Glauert's disc has none). Tolerance 0.5 %: the annuli
 * carry unequal inflow, whose mass flux differs from the mean's by O((v/Vp)^2) (measured
 * 0.02-0.3 % over Vp 20-80 m/s). */
static void test_edgewise_glauert(void **state)
{
  fixture *f = *state;
  ascr_rotor_params p = f->p;
  p.tip_loss = 0;
  p.hub_loss = 0;
  double r0 = f->st[0].r_m, rt = f->b.r_tip_m, area = PI * (rt * rt - r0 * r0);
  for (double vp = 20.0; vp <= 80.0; vp += 20.0) {
    ascr_rotor_incidence_result ir;
    assert_int_equal(ascr_rotor_incidence(&f->b, f->tabs, &p, 20000.0, vp, 90.0, 24, &ir, NULL), ASCR_OK);
    assert_true(ir.r.converged);
    /* v from T = 2 rho A v sqrt(Vp^2 + v^2) by bisection (monotone in v) */
    double lo = 0.0, hi = 100.0;
    for (int it = 0; it < 200; it++) {
      double m = 0.5 * (lo + hi);
      if (2.0 * p.density_kg_m3 * area * m * hypot(vp, m) < ir.r.thrust_N) lo = m;
      else hi = m;
    }
    ascr_assert_close(ir.induced_mean_m_s, 0.5 * (lo + hi), 5e-3, 0.0, "edgewise mean inflow, Glauert");
  }
}

/* Continuity from axial to edgewise: thrust, torque and in-plane force by 1 deg steps change
 * smoothly (no step above 2 % of the largest value, second differences below 0.2 %), and the
 * first degree joins the axial result. */
static void test_continuity(void **state)
{
  fixture *f = *state;
  double t[91], q[91], h[91];
  for (int i = 0; i <= 90; i++) {
    ascr_rotor_incidence_result ir;
    assert_int_equal(ascr_rotor_incidence(&f->b, f->tabs, &f->p, 20000.0, 15.0, (double)i, 24, &ir, NULL), ASCR_OK);
    assert_true(ir.r.converged);
    t[i] = ir.r.thrust_N;
    q[i] = ir.r.torque_Nm;
    h[i] = ir.h_force_N;
  }
  double tmax = 0.0, qmax = 0.0, hmax = 0.0;
  for (int i = 0; i <= 90; i++) {
    tmax = fmax(tmax, fabs(t[i]));
    qmax = fmax(qmax, fabs(q[i]));
    hmax = fmax(hmax, fabs(h[i]));
  }
  for (int i = 1; i <= 90; i++) {
    assert_true(fabs(t[i] - t[i - 1]) < 0.02 * tmax);
    assert_true(fabs(q[i] - q[i - 1]) < 0.02 * qmax);
    assert_true(fabs(h[i] - h[i - 1]) < 0.05 * hmax);
    if (i >= 2) {
      assert_true(fabs(t[i] - 2.0 * t[i - 1] + t[i - 2]) < 2e-3 * tmax);
      assert_true(fabs(q[i] - 2.0 * q[i - 1] + q[i - 2]) < 2e-3 * qmax);
    }
  }
  /* a thousandth of a degree from axial */
  ascr_rotor_incidence_result a0, a1;
  ascr_rotor_incidence(&f->b, f->tabs, &f->p, 20000.0, 15.0, 0.0, 24, &a0, NULL);
  ascr_rotor_incidence(&f->b, f->tabs, &f->p, 20000.0, 15.0, 1e-3, 24, &a1, NULL);
  ascr_assert_close(a1.r.thrust_N, a0.r.thrust_N, 1e-6, 0.0, "joins the axial case");
}

/* Signs (momentum and blade-element reasoning, e.g. Leishman ch. 3): the in-plane flow is
 * resisted (H > 0 along it); the advancing side carries more thrust (roll moment > 0); the
 * inflow, larger downstream (the skewed wake), unloads the downstream side (pitch moment < 0);
 * the in-plane flow raises thrust at fixed rpm (more mass flux, the translational lift). */
static void test_signs(void **state)
{
  fixture *f = *state;
  ascr_rotor_incidence_result ir, ax;
  ascr_rotor_incidence(&f->b, f->tabs, &f->p, 20000.0, 10.0, 0.0, 24, &ax, NULL);
  ascr_rotor_incidence(&f->b, f->tabs, &f->p, 20000.0, 10.0, 90.0, 24, &ir, NULL);
  assert_true(ir.r.converged);
  assert_true(ir.h_force_N > 0.0);
  assert_true(ir.roll_moment_Nm > 0.0);
  assert_true(ir.pitch_moment_Nm < 0.0);
  assert_true(ir.r.thrust_N > ax.r.thrust_N);
  assert_true(ir.skew_deg > 0.0 && ir.skew_deg < 90.0);
  /* refusals */
  assert_int_equal(ascr_rotor_incidence(&f->b, f->tabs, &f->p, 20000.0, 10.0, 95.0, 24, &ir, NULL), ASCR_EINVAL);
  assert_int_equal(ascr_rotor_incidence(&f->b, f->tabs, &f->p, 20000.0, 10.0, 30.0, 2, &ir, NULL), ASCR_EINVAL);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_axial_is_bemt),
      cmocka_unit_test(test_edgewise_glauert),
      cmocka_unit_test(test_continuity),
      cmocka_unit_test(test_signs),
  };
  return cmocka_run_group_tests(tests, setup, teardown);
}
