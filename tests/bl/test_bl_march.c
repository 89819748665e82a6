/* tests/bl/test_bl_march.c
 * The integral boundary layer on prescribed edge velocities against classical solutions:
 * Blasius flat plate, Hiemenz stagnation flow, Howarth's linearly retarded flow, the turbulent
 * flat plate (Schlichting's formula), and e^N transition on a flat plate.
 */
#include "ascr_test.h"

#include "bl/bl_impl.h"
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <string.h>

#define NST 201

/* Stations geometrically spaced from s0 to s1 with ue = u0 + u1 s. */
static void stations(double s0, double s1, double u0, double u1, double *s, double *ue)
{
  for (int i = 0; i < NST; i++) {
    s[i] = s0 * pow(s1 / s0, (double)i / (NST - 1));
    ue[i] = u0 + u1 * s[i];
  }
}

/* Closure at the Blasius state. Exact Blasius values (Schlichting, Boundary-Layer Theory, 7th
 * ed., ch. 7, from memory): theta = 0.66411, energy thickness 1.0444 (both times x/sqrt(Re_x)),
 * so H = 2.5911, H* = 1.0444/0.66411 = 1.5726, Re_theta Cf/2 = 0.66411^2/2 = 0.2205 and, from
 * the kinetic-energy balance on a flat plate, Re_theta 2CD/H* = the same 0.2205. The closure fits
 * are quoted by their authors to about 1 %; tolerance 0.5 % here, as the fits pass the
 * Blasius point closely. */
static void test_bl_laminar_closure_at_blasius_state(void **state)
{
  (void)state;
  bl_closure c;
  const double rth = 537.0; /* any Re_theta: the laminar f and d do not depend on it */
  bl_closure_laminar(2.5911, rth, 0.0, &c);
  ascr_assert_close(c.hs, 1.5726, 5e-3, 0, "H* Blasius");
  ascr_assert_close(0.5 * c.cf * rth, 0.66411 * 0.66411 / 2.0, 5e-3, 0, "Re_theta Cf/2 Blasius");
  ascr_assert_close(2.0 * c.cd / c.hs * rth, 0.66411 * 0.66411 / 2.0, 5e-3, 0, "Re_theta 2CD/H*");
}

/* Blasius flat plate (Blasius 1908; Schlichting ch. 7): theta sqrt(Re_x)/x = 0.66411,
 * H = 2.5911, Cf sqrt(Re_x) = 0.66411. Tolerance 0.5 %: the closure fit at the Blasius point
 * (above) plus the march's discretisation (trapezoidal, 200 geometric intervals). */
static void test_bl_blasius_flat_plate(void **state)
{
  (void)state;
  double s[NST], ue[NST];
  ascr_bl_station st[NST];
  stations(1e-4, 1.0, 1.0, 0.0, s, ue);
  ascr_bl_params p = ascr_bl_params_defaults();
  p.re = 1.0e5;
  ascr_bl_result r;
  ascr_errbuf e;
  assert_int_equal(ascr_bl_march(s, ue, NST, &p, st, &r, &e), ASCR_OK);
  assert_int_equal(r.n_done, NST);
  assert_true(isnan(r.s_transition));
  for (int i = 20; i < NST; i += 45) {
    double rex = p.re * s[i];
    ascr_assert_close(st[i].theta * sqrt(rex) / s[i], 0.66411, 5e-3, 0, "Blasius theta");
    ascr_assert_close(st[i].h, 2.5911, 5e-3, 0, "Blasius H");
    ascr_assert_close(st[i].cf * sqrt(rex), 0.66411, 5e-3, 0, "Blasius Cf");
    assert_int_equal(st[i].turbulent, 0);
  }
}

/* Hiemenz plane stagnation flow ue = a s (Hiemenz 1911; Schlichting ch. 5): theta =
 * 0.29234 sqrt(nu/a), dstar = 0.64790 sqrt(nu/a), H = 2.2162, constant along the wall.
 * Tolerance 1.5 %: the Falkner-Skan closure fits miss the m = 1 profile by about 1 % (the
 * start state solves the closure-consistent similarity equations exactly). */
static void test_bl_hiemenz_stagnation_flow(void **state)
{
  (void)state;
  double s[NST], ue[NST];
  ascr_bl_station st[NST];
  const double a = 3.7;
  stations(1e-4, 0.05, 0.0, a, s, ue);
  ascr_bl_params p = ascr_bl_params_defaults();
  p.re = 2.0e5;
  ascr_bl_result r;
  assert_int_equal(ascr_bl_march(s, ue, NST, &p, st, &r, NULL), ASCR_OK);
  assert_int_equal(r.n_done, NST);
  double scale = sqrt(1.0 / (p.re * a));
  for (int i = 0; i < NST; i += 50) {
    ascr_assert_close(st[i].theta / scale, 0.29234, 0.015, 0, "Hiemenz theta");
    ascr_assert_close(st[i].h, 2.2162, 0.015, 0, "Hiemenz H");
  }
}

/* Howarth's linearly retarded flow ue = 1 - s (Howarth 1938, Proc. R. Soc. A 164; Schlichting
 * ch. 10): laminar separation at s = 0.1199 (value from memory of the tabulated series
 * solution). Integral methods with Falkner-Skan closures separate a few per cent early
 * (Thwaites' method: 0.123, the other way); tolerance 0.006 (5 %). */
static void test_bl_howarth_retarded_flow_separates(void **state)
{
  (void)state;
  double s[401], ue[401];
  ascr_bl_station st[401];
  for (int i = 0; i < 401; i++) {
    s[i] = 1e-4 + (0.3 - 1e-4) * i / 400.0;
    ue[i] = 1.0 - s[i];
  }
  ascr_bl_params p = ascr_bl_params_defaults();
  p.re = 1.0e6;
  ascr_bl_result r;
  assert_int_equal(ascr_bl_march(s, ue, 401, &p, st, &r, NULL), ASCR_OK);
  assert_true(r.n_done < 401);
  print_message("Howarth separation at s = %.4f (exact 0.1199)\n", r.s_separation);
  ascr_assert_close(r.s_separation, 0.1199, 0, 0.006, "Howarth separation");
}

/* Turbulent flat plate from the leading edge against Schlichting's local skin-friction formula
 * Cf = (2 log10 Re_x - 0.65)^-2.3 (Schlichting, Boundary-Layer Theory, 7th ed., eq. 21.12),
 * for 1e6 <= Re_x <= 1e7. Tolerance 8 %: the formula fits measurements to a few per cent, and
 * the G-beta equilibrium locus with A = 6.7 used by the closure (Drela & Giles 1987) puts the
 * flat-plate H slightly high; by hand at Re_x = 4e6, H = 1/(1 - 6.7 sqrt(Cf/2)) = 1.335 and
 * Swafford's Cf there is 0.0028 against the formula's 0.00297 (-5 %). */
static void test_bl_turbulent_flat_plate_skin_friction(void **state)
{
  (void)state;
  double s[NST], ue[NST];
  ascr_bl_station st[NST];
  stations(1e-4, 1.0, 1.0, 0.0, s, ue);
  ascr_bl_params p = ascr_bl_params_defaults();
  p.re = 1.0e7;
  p.start = ASCR_BL_START_TURBULENT;
  ascr_bl_result r;
  assert_int_equal(ascr_bl_march(s, ue, NST, &p, st, &r, NULL), ASCR_OK);
  assert_int_equal(r.n_done, NST);
  int checked = 0;
  for (int i = 0; i < NST; i++) {
    double rex = p.re * s[i];
    if (rex < 1e6) continue;
    double ref = pow(2.0 * log10(rex) - 0.65, -2.3);
    ascr_assert_close(st[i].cf, ref, 0.08, 0, "turbulent flat-plate Cf");
    assert_true(st[i].h > 1.25 && st[i].h < 1.45);
    checked++;
  }
  assert_true(checked > 40);
}

/* Natural transition on a flat plate: with N_crit = 9 the e^N method places it near
 * Re_x = 2.8e6, the value measured in a low-turbulence tunnel by Schubauer & Skramstad (NACA
 * Report 909, 1948; from memory) to which N = 9 was calibrated (Smith & Gamberoni 1956, van
 * Ingen 1956). Accept 2e6 .. 4e6. A lower N_crit moves it upstream; a trip forces it. */
static void test_bl_flat_plate_transition(void **state)
{
  (void)state;
  double s[NST], ue[NST];
  ascr_bl_station st[NST];
  stations(1e-4, 1.0, 1.0, 0.0, s, ue);
  ascr_bl_params p = ascr_bl_params_defaults();
  p.re = 1.0e7;
  ascr_bl_result r9, r5, rt;
  assert_int_equal(ascr_bl_march(s, ue, NST, &p, st, &r9, NULL), ASCR_OK);
  print_message("flat plate transition at Re_x = %.3g (N_crit 9)\n", r9.s_transition * p.re);
  assert_true(r9.s_transition * p.re > 2.0e6 && r9.s_transition * p.re < 4.0e6);
  assert_int_equal(r9.forced, 0);
  assert_true(st[NST - 1].turbulent);
  p.ncrit = ascr_bl_ncrit_from_turbulence(1.0); /* Mack 1977: Tu 1 % -> N_crit 2.62 */
  ascr_assert_close(p.ncrit, -8.43 - 2.4 * log(0.01), 1e-14, 0, "Mack N_crit");
  assert_int_equal(ascr_bl_march(s, ue, NST, &p, st, &r5, NULL), ASCR_OK);
  assert_true(r5.s_transition < 0.5 * r9.s_transition);
  p.ncrit = 9.0;
  p.s_trip = 0.0123;
  assert_int_equal(ascr_bl_march(s, ue, NST, &p, st, &rt, NULL), ASCR_OK);
  ascr_assert_close(rt.s_transition, 0.0123, 0, 1e-15, "trip location");
  assert_int_equal(rt.forced, 1);
}

/* The turbulent fits below Preston's minimum Re_theta (J. Fluid Mech. 3, 1958: no turbulent
 * layer below about 320; bl_impl.h): evaluated at the floor, so that two states below it give
 * the same skin friction within the smoothing (Re_theta 50 and 150 are held at 323 and 325: Cf
 * differs by about 0.3 %); well above it the fits are untouched (at Re_theta 3000 the smooth
 * maximum moves Re_theta by 0.3, Cf by under 0.01 %). A plain maximum (width 0) gives the floor's
 * value exactly. */
static void test_bl_turbulent_fits_held_above_preston_minimum(void **state)
{
  (void)state;
  const bl_turb_fit preston = bl_turb_fit_published(), plain = {320.0, 0.0, 1.0};
  bl_closure a, b, c, d;
  bl_closure_turbulent(1.5, 50.0, 0.0, 0.01, 0, preston, &a);
  bl_closure_turbulent(1.5, 150.0, 0.0, 0.01, 0, preston, &b);
  ascr_assert_close(a.cf, b.cf, 0.005, 0, "Cf below the floor");
  bl_closure_turbulent(1.5, 50.0, 0.0, 0.01, 0, plain, &c);
  bl_closure_turbulent(1.5, 320.0, 0.0, 0.01, 0, plain, &d);
  ascr_assert_close(c.cf, d.cf, 1e-15, 0, "Cf at the plain floor");
  ascr_assert_close(c.hs, d.hs, 1e-15, 0, "H* at the plain floor");
  bl_closure_turbulent(1.5, 3000.0, 0.0, 0.01, 0, preston, &a);
  bl_closure_turbulent(1.5, 3000.0, 0.0, 0.01, 0, plain, &b);
  ascr_assert_close(a.cf, b.cf, 1e-4, 0, "Cf well above the floor");
  ascr_bl_params p = ascr_bl_params_defaults();
  assert_true(p.turb_rth_min == BL_TURB_RTH_MIN && p.turb_rth_width == BL_TURB_RTH_WIDTH);
}

/* The lag thickness (bl_lag_rate): in an attached flat-plate layer (H 1.4 at Re_theta 2000,
 * Coles' flat-plate profile) the entrainment fit of Green, Weeks & Brooman and Coles' wake law
 * give thicknesses within 15 % of each other (published relations for the same layer; measured
 * here 8.85 and 8.89 theta); at Hk 1.07, beyond the fit's range, the fit gives 29 theta and the
 * rate uses Coles' thickness: the relaxation is three or more times faster. Weight 0 leaves the
 * bound out. */
static void test_bl_lag_thickness_bounded_by_coles(void **state)
{
  (void)state;
  const bl_turb_fit fit = bl_turb_fit_published();
  const double th = 1e-3, sc = 0.03, eq = 0.02;
  bl_closure c;
  bl_closure_turbulent(1.4, 2000.0, 0.0, sc * sc, 0, fit, &c);
  double head = th * (3.15 + 1.72 / 0.4) + 1.4 * th;
  double coles = BL_COLES_KAPPA * 1.4 * th / ((1.0 + BL_COLES_PI) * sqrt(0.5 * c.cf));
  print_message("flat-plate layer, H 1.4, Re_theta 2000: Cf %.5f, delta/theta %.2f (fit), %.2f "
                "(Coles)\n", c.cf, head / th, coles / th);
  ascr_assert_close(coles, head, 0.15, 0, "two lag thicknesses of an attached layer");
  double r1 = bl_lag_rate(th, 1.4, 1.4, sc, eq, c.cf, 0, 1.0, 0.0);
  double r0 = bl_lag_rate(th, 1.4, 1.4, sc, eq, c.cf, 0, 0.0, 0.0);
  ascr_assert_close(r1, r0, 0.15, 0, "lag rate of an attached layer");
  r1 = bl_lag_rate(th, 1.07, 1.07, sc, eq, 0.006, 0, 1.0, 0.0);
  r0 = bl_lag_rate(th, 1.07, 1.07, sc, eq, 0.006, 0, 0.0, 0.0);
  assert_true(r1 > 3.0 * r0);
  /* a wake has no skin friction: the fit alone */
  ascr_assert_close(bl_lag_rate(th, 1.07, 1.07, sc, eq, 0.0, 1, 1.0, 0.0),
                    bl_lag_rate(th, 1.07, 1.07, sc, eq, 0.0, 1, 0.0, 0.0), 1e-15, 0, "wake");
}

/* Streamline curvature (bl_curvature_lambda; Bradshaw 1969, in the lag equation as Green, Weeks &
 * Brooman 1977). The factor is 1 on a flat wall and in a wake, above 1 on a convex wall (the
 * dissipation length shortened), below 1 and above 0 on a concave one however curved. The
 * integral Richardson number (lambda - 1)/7 is checked against one evaluated on a profile: the
 * power law U/Ue = (y/delta)^n with n = (H - 1)/2, its theta by quadrature, Ri = 2 (U/R) /
 * (dU/dy) at y = 0.4 delta (the outer layer, where the shear stress is carried). They are two
 * evaluations of one quantity (a one-parameter profile family at one height against the
 * entrainment fit's delta, whose delta/theta differs from the power law's by 5-15 %): measured
 * 2-31 % apart over H 1.3-2.0, the larger at H 2 where adverse-gradient profiles are no power
 * laws; held within 35 %, which catches a wrong factor or a missing term, not the form's
 * accuracy. */
static void test_bl_curvature_length_scale(void **state)
{
  (void)state;
  const double th = 2e-3, sc = 0.03, eq = 0.02;
  assert_true(bl_curvature_lambda(th, 1.5, 1.5, 0.0) == 1.0);
  assert_true(bl_curvature_lambda(th, 1.5, 1.5, 0.5) > 1.0);
  double lc = bl_curvature_lambda(th, 1.5, 1.5, -0.5);
  assert_true(lc < 1.0 && lc > 0.0);
  assert_true(bl_curvature_lambda(th, 1.5, 1.5, -1e6) > 0.0);
  /* the wake's rate ignores a curvature */
  ascr_assert_close(bl_lag_rate(th, 1.2, 1.2, sc, eq, 0.0, 1, 1.0, 2.0),
                    bl_lag_rate(th, 1.2, 1.2, sc, eq, 0.0, 1, 1.0, 0.0), 1e-15, 0, "wake");
  /* a convex wall lowers the stress the lag equation relaxes to: sqrt(Ctau_EQ)/lambda */
  double r = bl_lag_rate(th, 1.5, 1.5, sqrt(eq), eq, 0.004, 0, 1.0, 0.5);
  assert_true(r < 0.0);
  const double hs[] = {1.3, 1.4, 1.6, 1.8, 2.0};
  const double kappa = 0.5, delta = 1.0;
  for (size_t i = 0; i < sizeof hs / sizeof hs[0]; i++) {
    double h = hs[i], n = 0.5 * (h - 1.0), thp = 0.0;
    const int nq = 20000;
    for (int q = 0; q < nq; q++) {
      double u = pow((q + 0.5) / nq, n);
      thp += u * (1.0 - u) / nq;
    }
    thp *= delta;
    double y = 0.4 * delta, u = pow(y / delta, n), dudy = n * u / y;
    double ri_profile = 2.0 * u * kappa / dudy;
    double ri_integral = (bl_curvature_lambda(thp, h, h, kappa) - 1.0) / 7.0;
    print_message("H %.1f: Ri (integral) %.4f, (power-law profile at 0.4 delta) %.4f\n", h,
                  ri_integral, ri_profile);
    ascr_assert_close(ri_integral, ri_profile, 0.35, 0, "curvature Richardson number");
  }
}

static void test_bl_march_rejects_bad_input(void **state)
{
  (void)state;
  double s[5] = {0.1, 0.2, 0.2, 0.4, 0.5}, ue[5] = {1, 1, 1, 1, 1};
  ascr_bl_station st[5];
  ascr_bl_params p = ascr_bl_params_defaults();
  ascr_bl_result r;
  ascr_errbuf e;
  assert_int_equal(ascr_bl_march(s, ue, 5, &p, st, &r, &e), ASCR_EINVAL);
  assert_non_null(strstr(e.msg, "station 2"));
  s[2] = 0.3;
  ue[3] = -1.0;
  assert_int_equal(ascr_bl_march(s, ue, 5, &p, st, &r, &e), ASCR_EINVAL);
  assert_non_null(strstr(e.msg, "station 3: ue = -1"));
  ue[3] = 1.0;
  p.re = -5.0;
  assert_int_equal(ascr_bl_march(s, ue, 5, &p, st, &r, &e), ASCR_EINVAL);
  p.re = 1e5;
  s[0] = 0.0;
  assert_int_equal(ascr_bl_march(s, ue, 5, &p, st, &r, &e), ASCR_EINVAL);
  assert_non_null(strstr(e.msg, "s[0] > 0"));
  s[0] = 0.1;
  p.turb_rth_min = NAN;
  assert_int_equal(ascr_bl_march(s, ue, 5, &p, st, &r, &e), ASCR_EINVAL);
  assert_non_null(strstr(e.msg, "Re_theta floor"));
  assert_true(isnan(ascr_bl_ncrit_from_turbulence(0.0)));
}

/* Transition presets: each named, with a basis; the tunnel's value is Mack's relation at the
 * turbulence of a low-turbulence tunnel (0.07 %); the others, common practice, in the order of
 * growing disturbance (smooth calm air to a rough print) and each close to the turbulence level
 * its basis quotes (within 0.6 of Mack's relation at that level). */
static void test_bl_transition_presets(void **state)
{
  (void)state;
  size_t n = 0;
  const ascr_transition_preset *p = ascr_transition_presets(&n);
  assert_true(n >= 5);
  for (size_t i = 0; i < n; i++) {
    assert_non_null(p[i].basis);
    assert_true(strlen(p[i].basis) > 20);
    if (i > 0) assert_true(p[i].ncrit < p[i - 1].ncrit);
    assert_ptr_equal(ascr_transition_preset_find(p[i].name), &p[i]);
  }
  const ascr_transition_preset *t = ascr_transition_preset_find("tunnel");
  assert_non_null(t);
  assert_true(fabs(t->ncrit - ascr_bl_ncrit_from_turbulence(0.07)) < 0.1);
  const double tu[5] = {0.03, 0.07, 0.15, 0.3, 0.8}; /* the levels the bases quote */
  for (size_t i = 0; i < 5 && i < n; i++) {
    assert_true(fabs(p[i].ncrit - ascr_bl_ncrit_from_turbulence(tu[i])) < 0.6);
  }
  assert_null(ascr_transition_preset_find("no-such"));
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_bl_laminar_closure_at_blasius_state),
    cmocka_unit_test(test_bl_blasius_flat_plate),
    cmocka_unit_test(test_bl_hiemenz_stagnation_flow),
    cmocka_unit_test(test_bl_howarth_retarded_flow_separates),
    cmocka_unit_test(test_bl_turbulent_flat_plate_skin_friction),
    cmocka_unit_test(test_bl_flat_plate_transition),
    cmocka_unit_test(test_bl_turbulent_fits_held_above_preston_minimum),
    cmocka_unit_test(test_bl_lag_thickness_bounded_by_coles),
    cmocka_unit_test(test_bl_curvature_length_scale),
    cmocka_unit_test(test_bl_march_rejects_bad_input),
    cmocka_unit_test(test_bl_transition_presets),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
