/* tests/cli/test_cli_json.c
 * The machine-readable contract of the command line: "airscrew flow SECTION --alpha DEG
 * --inviscid --json" prints one JSON object with numbers cl and cm and an object surface with
 * arrays x, y, cp over the surface nodes (upper trailing edge, over the upper surface to the
 * leading edge, back along the lower surface). The numbers must equal what the library gives
 * for the same input (same code path; tolerance: the 12 significant digits printed).
 */
#define _POSIX_C_SOURCE 200809L
#include "ascr_test.h"

#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <jansson.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/wait.h>
#include <unistd.h>

#define DEG (3.14159265358979323846 / 180.0)

/* Run the CLI with arguments, return its stdout parsed as JSON (NULL on failure); *code gets
 * the exit status. */
static json_t *run_json(const char *args, int *code)
{
  char cmd[1024];
  snprintf(cmd, sizeof cmd, "'%s' %s", ASCR_CLI_PATH, args);
  FILE *p = popen(cmd, "r");
  assert_non_null(p);
  char *buf = NULL;
  size_t len = 0;
  FILE *m = open_memstream(&buf, &len);
  char chunk[4096];
  size_t got;
  while ((got = fread(chunk, 1, sizeof chunk, p)) > 0) fwrite(chunk, 1, got, m);
  fclose(m);
  int st = pclose(p);
  *code = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
  json_error_t jerr;
  json_t *j = json_loadb(buf, len, 0, &jerr);
  free(buf);
  return j;
}

static double num(const json_t *o, const char *key)
{
  json_t *v = json_object_get(o, key);
  assert_non_null(v);
  assert_true(json_is_number(v));
  return json_number_value(v);
}

static void test_cli_flow_json_contract_matches_library(void **state)
{
  (void)state;
  int code = -1;
  json_t *j = run_json("flow naca2412 --alpha 3.7 --inviscid --json", &code);
  assert_int_equal(code, 0);
  assert_non_null(j);
  double cl = num(j, "cl"), cm = num(j, "cm");
  json_t *sf = json_object_get(j, "surface");
  assert_true(json_is_object(sf));
  json_t *xa = json_object_get(sf, "x"), *ya = json_object_get(sf, "y"),
         *ca = json_object_get(sf, "cp");
  assert_true(json_is_array(xa) && json_is_array(ya) && json_is_array(ca));
  size_t n = json_array_size(xa);
  assert_int_equal(n, ASCR_GEOM_DEFAULT_PANELS + 1);
  assert_int_equal(json_array_size(ya), n);
  assert_int_equal(json_array_size(ca), n);
  /* ordering: starts and ends at the trailing edge, upper surface first */
  assert_true(json_number_value(json_array_get(xa, 0)) > 0.999);
  assert_true(json_number_value(json_array_get(xa, n - 1)) > 0.999);
  assert_true(json_number_value(json_array_get(ya, n / 4)) > 0.0);
  assert_true(json_number_value(json_array_get(ya, 3 * n / 4)) < 0.0);

  /* the same computation in-process */
  ascr_geom_section *s = NULL, *r = NULL;
  assert_int_equal(ascr_geom_section_from_spec("naca2412", &s, NULL), ASCR_OK);
  assert_int_equal(ascr_geom_section_repanel(s, NULL, &r, NULL), ASCR_OK);
  ascr_panel_solver *w = ascr_panel_solver_alloc(n);
  assert_int_equal(ascr_panel_solver_set(w, r, NULL), ASCR_OK);
  double *cp = malloc(n * sizeof *cp);
  ascr_panel_result res;
  assert_int_equal(ascr_panel_solver_solve(w, 3.7 * DEG, 0.0, &res, cp, NULL, NULL), ASCR_OK);
  ascr_assert_close(cl, res.cl, 1e-11, 1e-13, "cl via CLI");
  ascr_assert_close(cm, res.cm, 1e-11, 1e-13, "cm via CLI");
  for (size_t i = 0; i < n; i++) {
    ascr_assert_close(json_number_value(json_array_get(ca, i)), cp[i], 1e-11, 1e-13, "cp via CLI");
    ascr_assert_close(json_number_value(json_array_get(xa, i)), ascr_geom_section_x(r)[i], 1e-11, 1e-13, "x");
  }
  free(cp);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(r);
  ascr_geom_section_free(s);
  json_decref(j);
}

/* --mach applies the correction: lift rises (Karman-Tsien, above Prandtl-Glauert's 1/beta). */
static void test_cli_flow_json_mach_raises_lift(void **state)
{
  (void)state;
  int c0 = -1, c1 = -1;
  json_t *a = run_json("flow naca0012 --alpha 2 --inviscid --json", &c0);
  json_t *b = run_json("flow naca0012 --alpha 2 --inviscid --mach 0.5 --json", &c1);
  assert_int_equal(c0, 0);
  assert_int_equal(c1, 0);
  assert_true(num(b, "cl") > num(a, "cl") / sqrt(1.0 - 0.25));
  ascr_assert_close(num(b, "mach"), 0.5, 0, 1e-15, "mach echoed");
  json_decref(a);
  json_decref(b);
}

/* A section written by the CLI as a coordinate file reads back with the same shape. */
static void test_cli_section_points_round_trip(void **state)
{
  (void)state;
  char dir[] = "/tmp/ascr-cli-XXXXXX";
  assert_non_null(mkdtemp(dir));
  char args[512], path[300];
  snprintf(path, sizeof path, "%s/p.dat", dir);
  snprintf(args, sizeof args, "section plate:t=2.5,f=4.5,xf=42 --panels 120 --points -o %s", path);
  int code = -1;
  json_t *j = run_json(args, &code);
  assert_int_equal(code, 0);
  json_decref(j);
  snprintf(args, sizeof args, "section %s --json", path);
  json_t *a = run_json(args, &code);
  assert_int_equal(code, 0);
  json_t *b = run_json("section plate:t=2.5,f=4.5,xf=42 --panels 120 --json", &code);
  assert_int_equal(code, 0);
  json_t *ma = json_object_get(a, "metrics"), *mb = json_object_get(b, "metrics");
  assert_int_equal(num(a, "n_nodes"), 121);
  /* the file holds 8 decimals: metrics agree to that level (1e-6 allows for the nose spline) */
  ascr_assert_close(num(ma, "thickness"), num(mb, "thickness"), 0, 1e-6, "thickness");
  ascr_assert_close(num(ma, "camber"), num(mb, "camber"), 0, 1e-6, "camber");
  ascr_assert_close(num(ma, "area"), num(mb, "area"), 0, 1e-6, "area");
  json_decref(a);
  json_decref(b);
  /* refuses to overwrite without --force, keeps the file */
  snprintf(args, sizeof args, "section naca0012 --points -o %s 2>/dev/null", path);
  j = run_json(args, &code);
  assert_int_equal(code, 5);
  json_decref(j);
  snprintf(args, sizeof args, "section %s --json", path);
  a = run_json(args, &code);
  assert_int_equal(num(a, "n_nodes"), 121);
  json_decref(a);
  unlink(path);
  rmdir(dir);
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_cli_flow_json_contract_matches_library),
    cmocka_unit_test(test_cli_flow_json_mach_raises_lift),
    cmocka_unit_test(test_cli_section_points_round_trip),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
