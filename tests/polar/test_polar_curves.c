/* tests/polar/test_polar_curves.c
 * Table curves from the viscous solver, polar-table files and cache keys: a round trip is
 * exact, a damaged or foreign file is refused (never trusted), keys change with every input
 * that changes the polar, and the Re ladder covers the asked range.
 */
#include "ascr_test.h"
#include "airscrew/ascr_geom.h"
#include "airscrew/ascr_table.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

static char tmpdir[256];

static int setup(void **state)
{
  (void)state;
  snprintf(tmpdir, sizeof tmpdir, "/tmp/ascr-curves-XXXXXX");
  return mkdtemp(tmpdir) == NULL ? -1 : 0;
}

static int teardown(void **state)
{
  (void)state;
  char cmd[300];
  snprintf(cmd, sizeof cmd, "rm -rf '%s'", tmpdir);
  return system(cmd) == 0 ? 0 : -1;
}

static void test_compute_roundtrip(void **state)
{
  (void)state;
  ascr_geom_section *sec = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca4412", &sec, NULL), ASCR_OK);
  ascr_curve_request rq = ascr_curve_request_defaults(2e5);
  rq.alpha_lo_deg = -4.0;
  rq.alpha_hi_deg = 8.0;
  rq.alpha_step_deg = 2.0;
  ascr_curve_data c;
  ascr_errbuf err;
  assert_int_equal(ascr_table_curve_compute(sec, &rq, &c, &err), ASCR_OK);
  assert_int_equal(c.n, 7);
  size_t nconv = 0;
  for (size_t i = 0; i < c.n; i++) {
    nconv += (size_t)c.converged[i];
    if (c.converged[i]) {
      assert_true(isfinite(c.cl[i]) && c.cd[i] > 0.0 && c.cd[i] < 0.1);
    } else {
      assert_true(isnan(c.cl[i]));
    }
  }
  assert_true(nconv >= 6);
  /* cl rises with alpha through the attached range (NACA 4412 zero lift near -4 deg:
   * Abbott & von Doenhoff, App. IV) */
  assert_true(c.cl[1] > 0.0 && c.cl[4] > c.cl[2]);

  char fp[17], key[17], text[512];
  ascr_section_fingerprint(sec, fp);
  ascr_curve_cache_key(fp, &rq, key, text, sizeof text);
  char path[400];
  snprintf(path, sizeof path, "%s/%s.json", tmpdir, key);
  assert_int_equal(ascr_table_file_write(path, "naca4412", text, &c, 1, &err), ASCR_OK);
  ascr_curve_data *back = NULL;
  size_t nb = 0;
  assert_int_equal(ascr_table_file_read(path, text, &back, &nb, &err), ASCR_OK);
  assert_int_equal(nb, 1);
  assert_int_equal(back[0].n, c.n);
  for (size_t i = 0; i < c.n; i++) {
    assert_int_equal(back[0].converged[i], c.converged[i]);
    if (c.converged[i]) {
      assert_true(back[0].cl[i] == c.cl[i] && back[0].cd[i] == c.cd[i] && back[0].cm[i] == c.cm[i]);
    }
  }
  ascr_assert_close(back[0].re, 2e5, 0.0, 0.0, "Re kept");
  assert_true(back[0].trip_upper > 1.0);
  ascr_curve_data_clear(&back[0]);
  free(back);

  /* another request: the key differs, and the file is refused for it */
  ascr_curve_request rq2 = rq;
  rq2.ncrit = 7.0;
  char key2[17], text2[512];
  ascr_curve_cache_key(fp, &rq2, key2, text2, sizeof text2);
  assert_string_not_equal(key, key2);
  assert_int_equal(ascr_table_file_read(path, text2, &back, &nb, &err), ASCR_EPARSE);
  assert_non_null(strstr(err.msg, "key"));

  /* a damaged entry (one digit changed) is detected by the checksum */
  FILE *f = fopen(path, "r+");
  assert_non_null(f);
  char buf[65536];
  size_t n = fread(buf, 1, sizeof buf - 1, f);
  buf[n] = '\0';
  assert_null(strstr(buf, "trip_not_applied")); /* written only where a trip bound nothing */
  char *p = strstr(buf, "\"cd\"");
  assert_non_null(p);
  p = strchr(p, '0');
  assert_non_null(p);
  *p = '1';
  rewind(f);
  fwrite(buf, 1, n, f);
  fclose(f);
  assert_int_equal(ascr_table_file_read(path, text, &back, &nb, &err), ASCR_EPARSE);
  assert_non_null(strstr(err.msg, "checksum"));
  /* a truncated one is a syntax error */
  f = fopen(path, "w");
  fwrite(buf, 1, n / 2, f);
  fclose(f);
  assert_int_equal(ascr_table_file_read(path, text, &back, &nb, &err), ASCR_EPARSE);

  /* the computed curve makes a table */
  ascr_polar_table *t = NULL;
  assert_int_equal(ascr_polar_table_from_curves(&c, 1, NULL, &t, &err), ASCR_OK);
  ascr_table_sample q;
  ascr_polar_table_eval(t, 0.0, 2e5, 0.0, &q);
  ascr_assert_close(q.cl, c.cl[2], 1e-9, 1e-9, "table at a computed point");
  ascr_polar_table_free(t);
  ascr_curve_data_clear(&c);
  ascr_geom_section_free(sec);
}

/* A tripped curve keeps the points where a trip bound nothing (the stagnation point behind
 * it: ascr_polar_point.trip_not_applied), through a polar-table file too; a file with a bad
 * flag is refused. NACA 0012, Re 1e6, trips at x/c 0.02: at 2 deg both trips bind; by 10 deg
 * the stagnation point has moved behind the lower one (tests/visc: the same case). */
static void test_trip_flags(void **state)
{
  (void)state;
  ascr_geom_section *sec = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca0012", &sec, NULL), ASCR_OK);
  ascr_curve_request rq = ascr_curve_request_defaults(1e6);
  rq.trip_upper = rq.trip_lower = 0.02;
  rq.alpha_lo_deg = 2.0;
  rq.alpha_hi_deg = 10.0;
  rq.alpha_step_deg = 4.0;
  ascr_curve_data c;
  ascr_errbuf err;
  assert_int_equal(ascr_table_curve_compute(sec, &rq, &c, &err), ASCR_OK);
  assert_int_equal(c.n, 3);
  assert_non_null(c.trip_not_applied);
  assert_true(c.converged[0] && c.trip_not_applied[0] == 0);
  size_t lower = 0;
  for (size_t i = 0; i < c.n; i++) lower += (size_t)(c.converged[i] && (c.trip_not_applied[i] & 2));
  assert_true(lower >= 1);
  assert_true(c.converged[2] && (c.trip_not_applied[2] & 2)); /* 10 deg */
  size_t cnt[2];
  ascr_curve_trip_counts(&c, cnt);
  assert_int_equal(cnt[0], 0);
  assert_int_equal(cnt[1], lower);

  char fp[17], key[17], text[512];
  ascr_section_fingerprint(sec, fp);
  ascr_curve_cache_key(fp, &rq, key, text, sizeof text);
  assert_non_null(strstr(text, "trip flags"));
  char path[400];
  snprintf(path, sizeof path, "%s/%s.json", tmpdir, key);
  assert_int_equal(ascr_table_file_write(path, "naca0012", text, &c, 1, &err), ASCR_OK);
  ascr_curve_data *back = NULL;
  size_t nb = 0;
  assert_int_equal(ascr_table_file_read(path, text, &back, &nb, &err), ASCR_OK);
  for (size_t i = 0; i < c.n; i++) assert_int_equal(back[0].trip_not_applied[i], c.trip_not_applied[i]);
  ascr_curve_data_clear(&back[0]);
  free(back);

  /* a flag out of range, in a file without a checksum to trip over first */
  const char *bad = "{\"format\": \"airscrew-polar-table-1\", \"curves\": [{\"re\": 1e6, "
                    "\"mach\": 0, \"ncrit\": 9, \"trip_upper\": 0.02, \"trip_lower\": 0.02, "
                    "\"alpha_deg\": [0, 2], \"cl\": [0, 0.2], \"cd\": [0.01, 0.01], "
                    "\"cm\": [0, 0], \"converged\": [true, true], \"trip_not_applied\": [0, 5]}]}";
  assert_int_equal(ascr_table_file_parse(bad, strlen(bad), "bad.json", NULL, &back, &nb, &err), ASCR_EPARSE);
  assert_non_null(strstr(err.msg, "trip_not_applied[1]"));
  ascr_curve_data_clear(&c);
  ascr_geom_section_free(sec);
}

static void test_keys_and_ladder(void **state)
{
  (void)state;
  ascr_curve_request rq = ascr_curve_request_defaults(1e5);
  char k0[17], k[17];
  ascr_curve_cache_key("0123456789abcdef", &rq, k0, NULL, 0);
  ascr_curve_request v[5] = {rq, rq, rq, rq, rq};
  v[0].re = 1.78e5;
  v[1].mach = 0.1;
  v[2].trip_upper = 0.1;
  v[3].n_panels = 120;
  v[4].alpha_hi_deg = 14.0;
  for (int i = 0; i < 5; i++) {
    ascr_curve_cache_key("0123456789abcdef", &v[i], k, NULL, 0);
    assert_string_not_equal(k0, k);
  }
  /* the panel count by Re (0, the default) and the same count named give one key: the entry
   * holds the count used (ascr_geom_panels_for_re) */
  ascr_curve_request byre = rq, named = rq;
  named.n_panels = ascr_geom_panels_for_re(rq.re);
  assert_int_equal(byre.n_panels, 0);
  ascr_curve_cache_key("0123456789abcdef", &named, k, NULL, 0);
  assert_string_equal(k0, k);
  byre.re = named.re = 3e6;
  named.n_panels = ascr_geom_panels_for_re(3e6);
  assert_int_not_equal(named.n_panels, ASCR_GEOM_DEFAULT_PANELS);
  char k1[17];
  ascr_curve_cache_key("0123456789abcdef", &byre, k1, NULL, 0);
  ascr_curve_cache_key("0123456789abcdef", &named, k, NULL, 0);
  assert_string_equal(k1, k);
  ascr_curve_cache_key("0123456789abcdee", &rq, k, NULL, 0);
  assert_string_not_equal(k0, k);
  double re[32];
  size_t n = ascr_table_re_ladder(2.2e4, 9.0e4, re, 32);
  assert_true(n >= 3 && n <= 6);
  assert_true(re[0] <= 2.2e4 && re[n - 1] >= 9.0e4);
  for (size_t i = 1; i < n; i++) {
    ascr_assert_close(re[i] / re[i - 1], pow(10.0, 0.25), 0.01, 0.0, "four rungs per decade");
  }
  ascr_assert_close(re[1], 31600.0, 1e-12, 0.0, "rungs rounded to three figures");
}

/* Issue 17: a polar-table file is read only if it is a regular file (a FIFO in place of a cache
 * entry blocked the program; /dev/zero grew memory without end), with the 64 MiB limit counted
 * while reading (before, the size was taken from an unflushed memory stream and never applied). */
static void test_table_file_reader_refuses_what_is_not_a_bounded_regular_file(void **state)
{
  (void)state;
  ascr_curve_data *cv = NULL;
  size_t nc = 0;
  ascr_errbuf e;
  char fifo[300], big[300];
  snprintf(fifo, sizeof fifo, "%s/entry.fifo", tmpdir);
  assert_int_equal(mkfifo(fifo, 0600), 0);
  assert_int_equal(ascr_table_file_read(fifo, NULL, &cv, &nc, &e), ASCR_EIO);
  assert_non_null(strstr(e.msg, "not a regular file"));
  assert_int_equal(ascr_table_file_read("/dev/zero", NULL, &cv, &nc, &e), ASCR_EIO);
  assert_non_null(strstr(e.msg, "not a regular file"));
  /* a sparse regular file just over the limit */
  snprintf(big, sizeof big, "%s/big.json", tmpdir);
  FILE *f = fopen(big, "wb");
  assert_non_null(f);
  assert_int_equal(ftruncate(fileno(f), (off_t)(65 << 20)), 0);
  fclose(f);
  assert_int_equal(ascr_table_file_read(big, NULL, &cv, &nc, &e), ASCR_EPARSE);
  assert_non_null(strstr(e.msg, "64 MiB"));
  assert_null(cv);
  assert_int_equal(nc, 0);
  unlink(big);
  unlink(fifo);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_compute_roundtrip),
      cmocka_unit_test(test_keys_and_ladder),
      cmocka_unit_test(test_trip_flags),
      cmocka_unit_test(test_table_file_reader_refuses_what_is_not_a_bounded_regular_file),
  };
  return cmocka_run_group_tests(tests, setup, teardown);
}
