/* tests/rotor/test_blade_tables.c
 * The library's table pipeline (ascr_blade_tables_prepare): one operating point gives the same
 * bits asked alone and inside a wider map (the tables of the two requests hold different
 * curves; a lookup uses only the two around its Re), the cache serves the second request, and
 * a section with no usable curve is refused with a message that names it.
 * Cheap curves (100 panels, -4..8 deg by 2) keep the test short; the property does not depend
 * on them.
 */
#include "ascr_test.h"
#include "airscrew/ascr_blade_tables.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

typedef struct test_blade {
  ascr_blade b;
  ascr_blade_station st[3];
  char *name[1], *source[1];
  char name_buf[8], source_buf[64];
} test_blade;

/* A two-blade 6-inch prop of our own with a NACA 4412 section. */
static void blade_init(test_blade *t)
{
  memset(t, 0, sizeof *t);
  t->b.n_blades = 2;
  t->b.r_tip_m = 0.0762;
  t->b.r_hub_m = 0.008;
  t->b.rotation = 1;
  t->b.n_stations = 3;
  t->b.stations = t->st;
  const double r[3] = {0.012, 0.045, 0.0762}, c[3] = {0.012, 0.014, 0.008}, tw[3] = {28, 16, 10};
  for (int i = 0; i < 3; i++) {
    t->st[i].r_m = r[i];
    t->st[i].chord_m = c[i];
    t->st[i].twist_deg = tw[i];
    t->st[i].section = 0;
  }
  snprintf(t->name_buf, sizeof t->name_buf, "main");
  snprintf(t->source_buf, sizeof t->source_buf, "naca4412");
  t->name[0] = t->name_buf;
  t->source[0] = t->source_buf;
  t->b.n_sections = 1;
  t->b.section_name = t->name;
  t->b.section_source = t->source;
}

static ascr_blade_tables_options options(const char *cache)
{
  ascr_blade_tables_options o = ascr_blade_tables_options_defaults();
  o.cache_dir = cache;
  o.curve.n_panels = 100;
  o.curve.alpha_lo_deg = -4.0;
  o.curve.alpha_hi_deg = 8.0;
  o.curve.alpha_step_deg = 2.0;
  return o;
}

static void point(const ascr_blade *b, const ascr_blade_tables *t, ascr_inflow model, double rpm,
                  ascr_rotor_result *r)
{
  ascr_errbuf err;
  ascr_status st = ascr_rotor_point(b, (const ascr_polar_table *const *)t->tables, NULL, model,
                                    NULL, rpm, 0.0, r, NULL, &err);
  assert_int_equal(st, ASCR_OK);
}

static void test_point_alone_and_in_a_map(void **state)
{
  (void)state;
  char cache[] = "/tmp/ascr-test-tables-XXXXXX";
  assert_non_null(mkdtemp(cache));
  test_blade tb;
  blade_init(&tb);
  ascr_blade_tables_options o = options(cache);
  ascr_blade_tables alone, wide;
  ascr_errbuf err;
  assert_int_equal(ascr_blade_tables_prepare(&tb.b, NULL, 12000, 12000, 0, 0, &o, &alone, &err),
                   ASCR_OK);
  assert_int_equal(ascr_blade_tables_prepare(&tb.b, NULL, 6000, 30000, 0, 15, &o, &wide, &err),
                   ASCR_OK);
  /* the wide request needs more curves, and the alone request's came from the cache */
  assert_true(wide.info[0].n_curves > alone.info[0].n_curves);
  assert_int_equal(wide.info[0].from_cache, alone.info[0].n_curves);
  assert_int_equal(wide.info[0].computed, wide.info[0].n_curves - alone.info[0].n_curves);
  assert_int_equal(alone.n_notes, 0);
  for (int m = 0; m < 2; m++) {
    ascr_inflow model = m == 0 ? ASCR_INFLOW_BEMT : ASCR_INFLOW_VORTEX;
    ascr_rotor_result ra, rw;
    point(&tb.b, &alone, model, 12000, &ra);
    point(&tb.b, &wide, model, 12000, &rw);
    assert_true(ra.converged && rw.converged);
    assert_true(ra.thrust_N == rw.thrust_N);
    assert_true(ra.torque_Nm == rw.torque_Nm);
    assert_true(ra.thrust_N > 0.0);
  }
  /* the vortex model over the map's envelope, hover to windmilling (a 6-inch prop at 15 m/s
   * and 6000 rpm has J 0.98: its thrust is negative) */
  size_t nconv = 0, npt = 0, nneg = 0;
  for (double rpm = 6000.0; rpm <= 30000.0; rpm += 4000.0) {
    for (double v = 0.0; v <= 15.0; v += 7.5) {
      ascr_rotor_result r;
      ascr_status st = ascr_rotor_point(&tb.b, (const ascr_polar_table *const *)wide.tables, NULL,
                                        ASCR_INFLOW_VORTEX, NULL, rpm, v, &r, NULL, &err);
      assert_int_equal(st, ASCR_OK);
      npt++;
      nconv += (size_t)r.converged;
      nneg += (size_t)(r.converged && r.thrust_N < 0.0);
    }
  }
  print_message("vortex model over the envelope: %zu of %zu points converged, %zu windmilling\n",
                nconv, npt, nneg);
  assert_int_equal(nconv, npt);
  assert_true(nneg > 0);
  ascr_blade_tables_free(&alone);
  ascr_blade_tables_free(&wide);
  /* with the blade's own envelope (blade file "envelope") every request inside it builds the
   * same curves: here the wide map's, served by the cache */
  tb.b.envelope_rpm[0] = 6000.0;
  tb.b.envelope_rpm[1] = 30000.0;
  tb.b.envelope_airspeed_max_m_s = 15.0;
  ascr_blade_tables e1, e2;
  assert_int_equal(ascr_blade_tables_prepare(&tb.b, NULL, 12000, 12000, 0, 0, &o, &e1, &err), ASCR_OK);
  assert_int_equal(ascr_blade_tables_prepare(&tb.b, NULL, 20000, 25000, 5, 5, &o, &e2, &err), ASCR_OK);
  assert_int_equal(e1.info[0].n_curves, e2.info[0].n_curves);
  assert_int_equal(e1.info[0].computed, 0);
  for (size_t k = 0; k < e1.info[0].n_curves; k++) assert_true(e1.info[0].re[k] == e2.info[0].re[k]);
  ascr_blade_tables_free(&e1);
  ascr_blade_tables_free(&e2);
  tb.b.envelope_rpm[0] = tb.b.envelope_rpm[1] = NAN;
  /* a section whose curves never reach above 1 deg has no usable curve: refused, named */
  o.curve.alpha_lo_deg = -8.0;
  o.curve.alpha_hi_deg = -5.0;
  o.curve.alpha_step_deg = 1.0;
  o.cache_dir = NULL;
  ascr_blade_tables none;
  assert_int_equal(ascr_blade_tables_prepare(&tb.b, NULL, 12000, 12000, 0, 0, &o, &none, &err),
                   ASCR_EDOM);
  assert_int_equal(none.failed, ASCR_TABLES_TABLE);
  assert_non_null(strstr(err.msg, "section 'main'"));
  ascr_blade_tables_free(&none);
  char cmd[128];
  snprintf(cmd, sizeof cmd, "rm -rf %s", cache);
  assert_int_equal(system(cmd), 0);
}

/* Options that do not fit the blade are refused before anything is computed. */
static void test_refusals(void **state)
{
  (void)state;
  test_blade tb;
  blade_init(&tb);
  ascr_blade_tables_options o = options(NULL);
  const char *fs[1] = {"tip"}, *fp[1] = {"/nonexistent.json"};
  o.n_files = 1;
  o.file_section = fs;
  o.file_path = fp;
  ascr_blade_tables t;
  ascr_errbuf err;
  assert_int_equal(ascr_blade_tables_prepare(&tb.b, NULL, 12000, 12000, 0, 0, &o, &t, &err),
                   ASCR_EINVAL);
  assert_int_equal(t.failed, ASCR_TABLES_ARGUMENTS);
  assert_non_null(strstr(err.msg, "no section named 'tip'"));
  ascr_blade_tables_free(&t);
  o = options(NULL);
  snprintf(tb.source_buf, sizeof tb.source_buf, "no-such-section-file.dat");
  assert_int_equal(ascr_blade_tables_prepare(&tb.b, NULL, 12000, 12000, 0, 0, &o, &t, &err),
                   ASCR_EINVAL);
  assert_int_equal(t.failed, ASCR_TABLES_SECTION);
  assert_non_null(strstr(err.msg, "section 'main'"));
  ascr_blade_tables_free(&t);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_refusals),
      cmocka_unit_test(test_point_alone_and_in_a_map),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
