/* tests/structure/test_blade_loads.c
 * The blade under load (src/structure/blade_loads.c) against closed forms: the uniform rotating
 * bar, the uniformly loaded cantilever, the section turned by its twist.
 */
#include "ascr_test.h"
#include "airscrew/ascr_structure.h"

#include <math.h>
#include <string.h>

#define PI 3.14159265358979323846
#define NST 401

static ascr_material material(void)
{
  ascr_material m;
  memset(&m, 0, sizeof m);
  m.density_kg_m3.value = 1200.0;
  m.elastic_modulus_pa.value = 2.35e9;
  m.poisson_ratio.value = 0.37;
  m.shear_modulus_pa.value = 2.35e9 / 2.74;
  m.tensile_strength_pa.value = 62e6;
  m.fatigue_limit_pa.value = NAN;
  return m;
}

/* a uniform blade: chord 10 mm, NACA 0012, from 10 mm to the 100 mm tip, twist tw */
static void uniform(ascr_blade *b, ascr_blade_station st[2], double tw)
{
  memset(b, 0, sizeof *b);
  b->n_blades = 2;
  b->r_tip_m = 0.1;
  b->r_hub_m = 0.01;
  b->rotation = 1;
  b->n_stations = 2;
  b->stations = st;
  b->n_sections = 1;
  b->envelope_rpm[0] = b->envelope_rpm[1] = NAN;
  st[0] = (ascr_blade_station){0.01, 0.01, tw, 0};
  st[1] = (ascr_blade_station){0.1, 0.01, tw, 0};
}

/* the uniform blade twisted by tw, NACA 0012, of material(), at rpm under the loads el (n_el; NULL:
 * none) on n stations */
static void analyse(double tw, double rpm, const ascr_rotor_element *el, size_t n_el, size_t n,
                    ascr_structure_station *st, ascr_structure_summary *s)
{
  ascr_blade b;
  ascr_blade_station bs[2];
  uniform(&b, bs, tw);
  ascr_geom_section *g = NULL;
  ascr_errbuf err;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &g, &err), ASCR_OK);
  const ascr_geom_section *secs[1] = {g};
  ascr_material m = material();
  assert_int_equal(ascr_blade_structure(&b, secs, &m, rpm, el, n_el, n, st, s, &err), ASCR_OK);
  ascr_geom_section_free(g);
}

/* Uniform rotating bar: the centrifugal stress at r is rho Omega^2 (R^2 - r^2) / 2 (integrate
 * rho A Omega^2 r' from r to R; e.g. Den Hartog, Strength of Materials, 1949, rotating bars): the
 * trapezoidal rule is exact on the linear integrand (1e-12). Mass rho A L, centre of mass at
 * mid-span. */
static void test_uniform_rotating_bar(void **state)
{
  (void)state;
  static ascr_structure_station st[NST];
  ascr_structure_summary s;
  double rpm = 20000.0, om = rpm * PI / 30.0;
  analyse(0.0, rpm, NULL, 0, NST, st, &s);
  double A = st[0].props.area;
  for (size_t i = 0; i < NST; i += 50) {
    double r = st[i].r_m;
    ascr_assert_close(st[i].stress_pa, 1200.0 * om * om * (0.01 - r * r) / 2.0, 1e-12, 1e-3,
                      "centrifugal stress");
  }
  ascr_assert_close(s.mass_kg, 1200.0 * A * 0.09, 1e-12, 0.0, "mass");
  ascr_assert_close(s.cg_r_m, 0.055, 1e-12, 0.0, "centre of mass");
  ascr_assert_close(s.max_stress_r_m, 0.01, 0.0, 0.0, "largest stress at the root");
  ascr_assert_close(s.safety_factor, 62e6 / s.max_stress_pa, 1e-15, 0.0, "safety factor");
  assert_true(isnan(s.fatigue_factor));
  ascr_assert_close(s.tip_deflection_m, 0.0, 0.0, 0.0, "no air load, no deflection");
}

/* Uniformly loaded cantilever (q per length, one blade; Euler-Bernoulli, e.g. Gere & Timoshenko,
 * Mechanics of Materials, app. G): M(r) = q (R - r)^2 / 2 exactly (the loads are integrated
 * element by element), tip deflection q L^4 / (8 E I) (the trapezoidal double integral on 401
 * stations: 1e-4), root bending stress M y_max / I with y_max = 0.06 c for NACA 0012 (the
 * contour's extreme: 2e-3, the generator's nodes around the thickest point). */
static void test_loaded_cantilever(void **state)
{
  (void)state;
  static ascr_structure_station st[NST];
  enum { NE = 30 };
  ascr_rotor_element el[NE];
  memset(el, 0, sizeof el);
  double q = 20.0; /* N/m, one blade */
  for (int i = 0; i < NE; i++) {
    el[i].dr_m = 0.09 / NE;
    el[i].r_m = 0.01 + (i + 0.5) * el[i].dr_m;
    el[i].dT_dr_N_m = 2.0 * q; /* all blades */
    el[i].converged = 1;
  }
  ascr_structure_summary s;
  analyse(0.0, 0.0, el, NE, NST, st, &s);
  for (size_t i = 0; i < NST; i += 40) {
    double r = st[i].r_m;
    ascr_assert_close(st[i].moment_flap_Nm, q * (0.1 - r) * (0.1 - r) / 2.0, 1e-12, 1e-15,
                      "flap moment");
  }
  double ei = st[0].ei_flap_nm2;
  ascr_assert_close(ei, 2.35e9 * st[0].props.i_xx, 1e-12, 0.0, "untwisted: EI_flap = E I_xx");
  ascr_assert_close(s.tip_deflection_m, q * pow(0.09, 4) / (8.0 * ei), 1e-4, 0.0, "tip deflection");
  double m0 = q * 0.09 * 0.09 / 2.0;
  ascr_assert_close(st[0].stress_pa, m0 * 0.06 * 0.01 / st[0].props.i_xx, 2e-3, 0.0,
                    "root bending stress");
}

/* The twist turns the section's tensor: at 90 deg the flap stiffness is E I_yy and the lag
 * stiffness E I_xx; at 30 deg both follow I(phi) = I_xx cos^2 + I_yy sin^2 (I_xy = 0 here). */
static void test_twist_turns_the_section(void **state)
{
  (void)state;
  static ascr_structure_station st[NST];
  ascr_structure_summary s;
  const double tws[2] = {90.0, 30.0};
  for (int k = 0; k < 2; k++) {
    analyse(tws[k], 0.0, NULL, 0, 11, st, &s);
    double c = cos(tws[k] * PI / 180.0), sn = sin(tws[k] * PI / 180.0);
    const ascr_section_props *p = &st[3].props;
    ascr_assert_close(st[3].ei_flap_nm2, 2.35e9 * (c * c * p->i_xx + sn * sn * p->i_yy), 1e-9, 0.0,
                      "flap stiffness turned");
    ascr_assert_close(st[3].ei_lag_nm2, 2.35e9 * (sn * sn * p->i_xx + c * c * p->i_yy), 1e-9, 0.0,
                      "lag stiffness turned");
  }
}

/* Uniform blade twisted by 30 deg: the centrifugal twisting moment per length
 * t = -rho Omega^2 (I_yy - I_xx) sin 30 cos 30 is constant, the moment carried at r is t (R - r)
 * (exact by the trapezoidal rule) and the tip's elastic twist t L^2 / (2 GJ) (the trapezoidal
 * integral of a linear function: exact), towards flat pitch. */
static void test_centrifugal_twisting_moment(void **state)
{
  (void)state;
  static ascr_structure_station st[NST];
  ascr_structure_summary s;
  double rpm = 20000.0, om = rpm * PI / 30.0;
  analyse(30.0, rpm, NULL, 0, NST, st, &s);
  const ascr_section_props *p = &st[0].props;
  double t = -1200.0 * om * om * (p->i_yy - p->i_xx) * sin(PI / 6.0) * cos(PI / 6.0);
  for (size_t i = 0; i < NST; i += 100) {
    ascr_assert_close(st[i].moment_twist_Nm, t * (0.1 - st[i].r_m), 1e-12, 1e-15, "twisting moment");
  }
  double th = t * 0.09 * 0.09 / (2.0 * st[0].gj_nm2) * 180.0 / PI;
  ascr_assert_close(s.tip_pitch_change_deg, th, 1e-9, 0.0, "tip pitch change");
  assert_true(s.tip_pitch_change_deg < 0.0);
}

/* Uniform untwisted blade under a uniform air pitching moment m0 per length (elements covering
 * the span, one blade): the moment carried at r is m0 (R - r) (a sum of exact element pieces)
 * and the tip twists by m0 L^2 / (2 GJ) (trapezoidal rule on a linear function: exact), all of
 * it the air's; nose-down moment, towards flat pitch. Spinning, but without twist the
 * centrifugal twisting moment is zero. */
static void test_air_pitching_moment(void **state)
{
  (void)state;
  enum { NE = 30 };
  ascr_rotor_element el[NE];
  memset(el, 0, sizeof el);
  double m0 = -2e-4; /* N m per m */
  for (int i = 0; i < NE; i++) {
    el[i].dr_m = 0.09 / NE;
    el[i].r_m = 0.01 + (i + 0.5) * el[i].dr_m;
    el[i].dM_dr_Nm_m = m0;
    el[i].converged = 1;
  }
  static ascr_structure_station st[NST];
  ascr_structure_summary s;
  analyse(0.0, 20000.0, el, NE, NST, st, &s);
  for (size_t i = 0; i < NST; i += 100) {
    ascr_assert_close(st[i].moment_twist_Nm, m0 * (0.1 - st[i].r_m), 1e-12, 1e-15, "air moment");
    ascr_assert_close(st[i].moment_twist_air_Nm, st[i].moment_twist_Nm, 1e-15, 0.0, "all of it air");
  }
  double th = m0 * 0.09 * 0.09 / (2.0 * st[0].gj_nm2) * 180.0 / PI;
  ascr_assert_close(s.tip_pitch_change_deg, th, 1e-9, 0.0, "tip pitch change");
  ascr_assert_close(s.tip_pitch_change_air_deg, th, 1e-9, 0.0, "air's share");
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_uniform_rotating_bar),
      cmocka_unit_test(test_loaded_cantilever),
      cmocka_unit_test(test_twist_turns_the_section),
      cmocka_unit_test(test_centrifugal_twisting_moment),
      cmocka_unit_test(test_air_pitching_moment),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
