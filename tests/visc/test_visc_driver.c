/* tests/visc/test_visc_driver.c
 * The stepping interface of the viscous solver (ascr_visc_solver_start / _iterate / _test /
 * _result): a run stepped by the caller reaches the same state as ascr_visc_solver_solve (which
 * runs the same steps), its states follow the documented sequence, the trace sees every step,
 * and misuse is refused with ASCR_EINVAL. Case: NACA 0012 at Re 1e6, 2 deg; the stepped run
 * uses the start whose run converged inside solve (a fresh start depends only on the
 * condition, so the two runs take the same steps).
 */
#include "ascr_test.h"
#include "visc_fixture.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <string.h>

#define DEG (3.14159265358979323846 / 180.0)

typedef struct tally {
  int n, last_iteration, monotone, last_start;
} tally;

static void count_steps(void *ctx, const ascr_visc_step *st)
{
  tally *t = ctx;
  t->n++;
  if (st->iteration != t->last_iteration + 1 && st->iteration != 1) t->monotone = 0;
  t->last_iteration = st->iteration;
  t->last_start = st->start;
}

static void test_visc_stepped_run_matches_solve(void **state)
{
  (void)state;
  fixture f;
  setup(&f, "naca0012", 1e6);
  ascr_errbuf e;
  /* the whole solve, traced */
  tally t = {0, 0, 1, -1};
  ascr_visc_solver_set_trace(f.v, count_steps, &t);
  ascr_visc_result rs;
  assert_int_equal(ascr_visc_solver_solve(f.v, 2.0 * DEG, 0, &rs, &e), ASCR_OK);
  ascr_visc_solver_set_trace(f.v, NULL, NULL);
  assert_int_equal(t.n, rs.iterations);
  assert_true(t.monotone);
  assert_true(t.last_start == ASCR_VISC_START_MARCH || t.last_start == ASCR_VISC_START_COUPLED_MARCH);
  /* the start that converged inside solve, stepped */
  ascr_visc_start start = (ascr_visc_start)t.last_start;
  assert_int_equal(ascr_visc_solver_start(f.v, 2.0 * DEG, start, &e), ASCR_OK);
  ascr_visc_result rr;
  assert_int_equal(ascr_visc_solver_result(f.v, &rr, &e), ASCR_CONTINUE);
  assert_int_equal(rr.converged, 0);
  int steps = 0;
  ascr_visc_step st;
  double first_residual = NAN, last_residual = NAN;
  while (ascr_visc_solver_test(f.v) == ASCR_CONTINUE) {
    assert_int_equal(ascr_visc_solver_iterate(f.v, &st, &e), ASCR_OK);
    steps++;
    assert_int_equal(st.iteration, steps);
    assert_int_equal(st.start, start);
    assert_true(st.relax > 0.0 && st.relax <= 1.0);
    if (steps == 1) first_residual = st.residual_max;
    last_residual = st.residual_max;
    assert_true(steps <= 60);
  }
  assert_int_equal(ascr_visc_solver_test(f.v), ASCR_OK);
  assert_int_equal(ascr_visc_solver_result(f.v, &rr, &e), ASCR_OK);
  assert_int_equal(rr.converged, 1);
  assert_int_equal(steps, t.last_iteration);
  assert_true(last_residual < 1e-3 * first_residual);
  /* the same steps from the same start: the same numbers */
  assert_true(rr.cl == rs.cl && rr.cd == rs.cd && rr.cm == rs.cm);
  assert_true(fabs(st.x_transition_upper - rr.x_transition_upper) < 1e-12);
  /* iterating an ended run is refused */
  assert_int_equal(ascr_visc_solver_iterate(f.v, &st, &e), ASCR_EINVAL);
  /* a warm run from it to 3 deg, stepped, and the same by solve */
  assert_int_equal(ascr_visc_solver_start(f.v, 3.0 * DEG, ASCR_VISC_START_PREVIOUS, &e), ASCR_OK);
  while (ascr_visc_solver_test(f.v) == ASCR_CONTINUE) {
    assert_int_equal(ascr_visc_solver_iterate(f.v, &st, &e), ASCR_OK);
    assert_int_equal(st.start, ASCR_VISC_START_PREVIOUS);
  }
  assert_int_equal(ascr_visc_solver_result(f.v, &rr, &e), ASCR_OK);
  assert_true(rr.cl > rs.cl);
  teardown(&f);
}

static void test_visc_stepping_refuses_misuse(void **state)
{
  (void)state;
  fixture f;
  setup(&f, "naca0012", 1e6);
  ascr_errbuf e;
  ascr_visc_step st;
  ascr_visc_result r;
  /* nothing started */
  assert_int_equal(ascr_visc_solver_test(f.v), ASCR_EINVAL);
  assert_int_equal(ascr_visc_solver_iterate(f.v, &st, &e), ASCR_EINVAL);
  assert_int_equal(ascr_visc_solver_result(f.v, &r, &e), ASCR_EINVAL);
  /* no converged state to continue from */
  assert_int_equal(ascr_visc_solver_start(f.v, 0.0, ASCR_VISC_START_PREVIOUS, &e), ASCR_EINVAL);
  assert_non_null(strstr(e.msg, "no converged state"));
  /* unknown start, angle out of range */
  assert_int_equal(ascr_visc_solver_start(f.v, 0.0, (ascr_visc_start)7, &e), ASCR_EINVAL);
  assert_int_equal(ascr_visc_solver_start(f.v, 2.0, ASCR_VISC_START_MARCH, &e), ASCR_EINVAL);
  assert_int_equal(ascr_visc_solver_test(f.v), ASCR_EINVAL);
  assert_int_equal(ascr_visc_solver_start(NULL, 0.0, ASCR_VISC_START_MARCH, &e), ASCR_EINVAL);
  teardown(&f);
}

/* A run limited to 3 iterations ends unconverged with ASCR_EMAXITER and says so. */
static void test_visc_stepped_run_reports_the_limit(void **state)
{
  (void)state;
  fixture f;
  setup(&f, "naca2412", 1e5);
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = 1e5;
  p.max_iter = 3;
  ascr_errbuf e;
  assert_int_equal(ascr_visc_solver_set(f.v, f.w, &p, &e), ASCR_OK);
  assert_int_equal(ascr_visc_solver_start(f.v, 4.0 * DEG, ASCR_VISC_START_MARCH, &e), ASCR_OK);
  int steps = 0;
  while (ascr_visc_solver_test(f.v) == ASCR_CONTINUE) {
    assert_int_equal(ascr_visc_solver_iterate(f.v, NULL, &e), ASCR_OK);
    steps++;
  }
  assert_int_equal(steps, 3);
  assert_int_equal(ascr_visc_solver_test(f.v), ASCR_EMAXITER);
  ascr_visc_result r;
  assert_int_equal(ascr_visc_solver_result(f.v, &r, &e), ASCR_EMAXITER);
  assert_int_equal(r.converged, 0);
  assert_int_equal(r.iterations, 3);
  assert_non_null(strstr(e.msg, "not converged after 3 iterations"));
  /* an unconverged run leaves nothing to continue from */
  assert_int_equal(ascr_visc_solver_start(f.v, 4.0 * DEG, ASCR_VISC_START_PREVIOUS, &e), ASCR_EINVAL);
  teardown(&f);
}

/* A trip between the leading edge and the stagnation point binds nothing and the result says
 * so: NACA 0012 at Re 1e6 with both trips at x/c 0.02. At 2 deg both are applied (the layers
 * start ahead of them, transition forced there); at 10 deg the stagnation point lies near
 * x/c 0.025 on the lower surface, behind the lower trip, which the result flags (bit 1) while
 * the upper one stays applied. (Near 8 deg, where the stagnation point passes the trip, the
 * model itself jumps from a tripped to a free lower layer; the walk steps over it.) */
static void test_visc_trip_ahead_of_stagnation_is_flagged(void **state)
{
  (void)state;
  fixture f;
  setup(&f, "naca0012", 1e6);
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = 1e6;
  p.trip_upper = p.trip_lower = 0.02;
  assert_int_equal(ascr_visc_solver_set(f.v, f.w, &p, NULL), ASCR_OK);
  ascr_visc_result r;
  int warm = 0;
  const int walk[6] = {0, 2, 4, 6, 9, 10};
  for (int k = 0; k < 6; k++) {
    int a = walk[k];
    assert_int_equal(ascr_visc_solver_solve(f.v, a * M_PI / 180.0, warm, &r, NULL), ASCR_OK);
    warm = 1;
    if (a == 2) {
      assert_int_equal(r.trip_not_applied, 0);
      assert_true(r.forced_upper);
      ascr_assert_close(r.x_transition_lower, 0.02, 0.0, 1e-6, "lower transition at its trip");
    }
  }
  assert_int_equal(r.trip_not_applied, 2);
  assert_true(r.forced_upper || r.x_transition_upper < 0.02);
  teardown(&f);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_visc_stepped_run_matches_solve),
    cmocka_unit_test(test_visc_stepping_refuses_misuse),
    cmocka_unit_test(test_visc_stepped_run_reports_the_limit),
    cmocka_unit_test(test_visc_trip_ahead_of_stagnation_is_flagged),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
