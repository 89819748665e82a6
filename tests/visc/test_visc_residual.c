/* tests/visc/test_visc_residual.c
 * The residual's two fast paths against the plain one (src/visc/residual.c). Each station's
 * closures are evaluated once where the plain path evaluates them twice: as the downstream end
 * of its own interval and the upstream end of the next. Both fast paths must give the numbers
 * of the plain one:
 *  - the line search's residual norm (visc_residual_norm2) equals the sum of squares of the
 *    residuals the Newton system is built from (visc_assemble), at every iterate of a run;
 *  - the forward differences of an interval with the previous interval's end evaluations held
 *    (visc_residual_plain_fd with its cache) equal those computed afresh (without it).
 * States: the iterates of runs on NACA 2412 at Re 1e5, 3 deg (laminar, transition, turbulent and
 * wake intervals, a separation bubble) and the 3 %-thick, 4.5 %-camber plate at Re 2e4, 2 deg;
 * NACA 2412 once more with the study option wall_curvature (each station's own curvature in the
 * lag equation, interpolated at a transition point).
 * Tolerance: 1e-12 relative. The paths do the same operations in the same order, so on this
 * machine they agree to the bit; a compiler that fuses multiplies and adds differently in the
 * two functions may leave a few units in the last place.
 */
#include "ascr_test.h"
#include "visc_fixture.h"

#include "visc/visc_impl.h"

#include <gsl/gsl_errno.h>

#include <math.h>
#include <string.h>

#define DEG (3.14159265358979323846 / 180.0)
#define REL 1e-12

static int close_rel(double a, double b)
{
  return a == b || fabs(a - b) <= REL * fmax(fabs(a), fabs(b));
}

/* forward-difference steps of a station (any steps do, as long as a station keeps its own) */
static void steps_of(const vstate *s, double h[4])
{
  h[0] = 1e-7 * fabs(s->th) + 1e-14;
  h[1] = 1e-7 * fabs(s->m) + 1e-14;
  h[2] = 1e-7 * fmax(fabs(s->c), 1e-3);
  h[3] = 1e-7 * fmax(fabs(s->ue), 1e-3);
}

/* Both checks at the solver's present state; counts the interval kinds seen. */
static void check_state(ascr_visc_solver *v, size_t seen[6])
{
  visc_update_ue(v);
  visc_set_xi(v);
  vctx cxs[3];
  for (int s = 0; s < 3; s++) cxs[s] = visc_context(v, s);
  double n2 = visc_residual_norm2(v, cxs);
  visc_assemble(v, cxs);
  double sum = 0.0;
  for (size_t i = 0; i < 3 * v->nst; i++) sum += isfinite(v->R[i]) ? v->R[i] * v->R[i] : 1e300;
  if (!close_rel(n2, sum)) fail_msg("residual norm %.17g, Newton system's %.17g", n2, sum);
  visc_end_evals ends;
  ends.k = SIZE_MAX;
  for (size_t k = 0; k < v->nst; k++) {
    size_t a, b, w;
    int kind = visc_station_kind(v, k, &a, &b, &w);
    seen[kind]++;
    if (kind != VR_LAM && kind != VR_TURB && kind != VR_WAKE) {
      ends.k = SIZE_MAX;
      continue;
    }
    const vctx *cx = &cxs[v->side[k]];
    vstate sa = visc_get_state(v, a), sb = visc_get_state(v, b);
    double h[2][4];
    steps_of(&sa, h[0]);
    steps_of(&sb, h[1]);
    double r0[3], r1[2][4][3], rx[3], c0[3], c1[2][4][3], cxr[3];
    double hx = 1e-7 * fmax(v->xi[v->side[k] == 0 ? 0 : v->nu], 1e-9);
    visc_residual_plain_fd(kind, cx, &sa, &sb, (const double(*)[4])h, hx, r0, r1, rx, a, b, NULL);
    visc_residual_plain_fd(kind, cx, &sa, &sb, (const double(*)[4])h, hx, c0, c1, cxr, a, b, &ends);
    for (int e = 0; e < 3; e++) {
      if (!close_rel(r0[e], c0[e]) || !close_rel(rx[e], cxr[e])) {
        fail_msg("station %zu (kind %d): residual %d %.17g / %.17g, shifted %.17g / %.17g", k,
                 kind, e, r0[e], c0[e], rx[e], cxr[e]);
      }
      for (int q = 0; q < 2; q++) {
        for (int var = 0; var < 4; var++) {
          if (!close_rel(r1[q][var][e], c1[q][var][e])) {
            fail_msg("station %zu (kind %d): end %d variable %d residual %d: %.17g afresh, %.17g "
                     "with the held end", k, kind, q, var, e, r1[q][var][e], c1[q][var][e]);
          }
        }
      }
    }
  }
}

static void check_run(const char *spec, double re, double alpha_deg, int wall_curvature)
{
  fixture f;
  setup(&f, spec, re);
  ascr_errbuf e;
  if (wall_curvature) {
    ascr_visc_params p = ascr_visc_params_defaults();
    p.re = re;
    p.wall_curvature = 1;
    assert_int_equal(ascr_visc_solver_set(f.v, f.w, &p, &e), ASCR_OK);
  }
  size_t seen[6] = {0}, checked = 0;
  assert_int_equal(ascr_visc_solver_start(f.v, alpha_deg * DEG, ASCR_VISC_START_MARCH, &e),
                   ASCR_OK);
  while (ascr_visc_solver_test(f.v) == ASCR_CONTINUE && checked < 40) {
    check_state(f.v, seen);
    checked++;
    ascr_visc_step st;
    assert_int_equal(ascr_visc_solver_iterate(f.v, &st, &e), ASCR_OK);
  }
  print_message("%s Re %.0f, %.1f deg: %zu iterates; station kinds seen: laminar %zu, transition "
                "%zu, turbulent %zu, wake %zu\n", spec, re, alpha_deg, checked, seen[VR_LAM],
                seen[VR_TRANS], seen[VR_TURB], seen[VR_WAKE]);
  assert_true(checked >= 3);
  /* every fast path was exercised: held ends across laminar, turbulent and wake intervals, and a
   * transition interval between them */
  assert_true(seen[VR_LAM] > 0 && seen[VR_TRANS] > 0 && seen[VR_TURB] > 0 && seen[VR_WAKE] > 0);
  teardown(&f);
}

static void test_visc_residual_fast_paths_naca2412(void **state)
{
  (void)state;
  check_run("naca2412", 1e5, 3.0, 0);
}

/* The curvature the option gives each station: NACA 2412's convex surfaces, positive and about
 * the nose's 1/r (r = 1.1 t^2 c, Abbott & von Doenhoff's leading-edge radius of the 4-digit
 * sections: 62 per chord at t = 0.12) near the leading edge after the smoothing, at most that;
 * zero in the wake; zero everywhere without the option. */
static void test_visc_residual_fast_paths_wall_curvature(void **state)
{
  (void)state;
  check_run("naca2412", 1e5, 3.0, 1);
  fixture f;
  setup(&f, "naca2412", 1e5);
  ascr_errbuf e;
  assert_int_equal(ascr_visc_solver_start(f.v, 3.0 * DEG, ASCR_VISC_START_MARCH, &e), ASCR_OK);
  for (size_t k = 0; k < f.v->nst; k++) assert_true(f.v->kappa_st[k] == 0.0);
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = 1e5;
  p.wall_curvature = 2;
  assert_int_equal(ascr_visc_solver_set(f.v, f.w, &p, &e), ASCR_EINVAL);
  p.wall_curvature = 1;
  assert_int_equal(ascr_visc_solver_set(f.v, f.w, &p, &e), ASCR_OK);
  assert_int_equal(ascr_visc_solver_start(f.v, 3.0 * DEG, ASCR_VISC_START_MARCH, &e), ASCR_OK);
  double kmax = 0.0;
  size_t ns = f.v->nu + f.v->nl;
  for (size_t k = 0; k < f.v->nst; k++) {
    if (k >= ns) {
      assert_true(f.v->kappa_st[k] == 0.0);
    } else {
      assert_true(f.v->kappa_st[k] > 0.0);
      kmax = fmax(kmax, f.v->kappa_st[k]);
    }
  }
  print_message("NACA 2412: largest smoothed wall curvature %.1f per chord (nose 1/r = %.1f)\n",
                kmax, 1.0 / (1.1019 * 0.12 * 0.12));
  assert_true(kmax > 10.0 && kmax <= 1.0 / (1.1019 * 0.12 * 0.12));
  teardown(&f);
}

static void test_visc_residual_fast_paths_thin_plate(void **state)
{
  (void)state;
  check_run("plate:t=3,f=4.5,xf=45", 2e4, 2.0, 0);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_visc_residual_fast_paths_naca2412),
    cmocka_unit_test(test_visc_residual_fast_paths_thin_plate),
    cmocka_unit_test(test_visc_residual_fast_paths_wall_curvature),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
