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

/* Viscous contract: "flow ... --re RE --json" adds cd, cdf, cdp, x_transition_upper,
 * x_transition_lower, converged and the boundary-layer distributions. */
static void test_cli_flow_viscous_json_contract(void **state)
{
  (void)state;
  int code = -1;
  json_t *j = run_json("flow naca2412 --alpha 2 --re 2e5 --json", &code);
  assert_int_equal(code, 0);
  assert_non_null(j);
  assert_true(json_is_true(json_object_get(j, "converged")));
  double cl = num(j, "cl"), cd = num(j, "cd"), cdf = num(j, "cdf"), cdp = num(j, "cdp");
  assert_true(cl > 0.3 && cl < 0.8);
  assert_true(cd > 0.0 && cdf > 0.0);
  ascr_assert_close(cdf + cdp, cd, 1e-9, 1e-12, "cd = cdf + cdp");
  double xu = num(j, "x_transition_upper");
  assert_true(xu > 0.0 && xu <= 1.0);
  (void)num(j, "cm");
  json_t *sf = json_object_get(j, "surface");
  assert_true(json_is_array(json_object_get(sf, "cp")));
  json_t *bl = json_object_get(j, "boundary_layer");
  assert_true(json_is_object(bl));
  size_t n = json_array_size(json_object_get(bl, "s"));
  assert_true(n > 160);
  const char *keys[] = {"side", "x", "y", "ue", "dstar", "delta_star", "theta", "shape_factor",
                        "cf", "n_or_sqrt_ctau", "n_amp", "sqrt_ctau", "turbulent"};
  for (size_t k = 0; k < sizeof keys / sizeof keys[0]; k++) {
    assert_int_equal(json_array_size(json_object_get(bl, keys[k])), n);
  }
  /* issue 17: N and sqrt(Ctau) each in its own array, null where the other regime holds */
  json_t *tu = json_object_get(bl, "turbulent"), *na = json_object_get(bl, "n_amp"),
         *ca = json_object_get(bl, "sqrt_ctau"), *both = json_object_get(bl, "n_or_sqrt_ctau");
  size_t nlam = 0, nturb = 0;
  for (size_t k = 0; k < n; k++) {
    int t = json_is_true(json_array_get(tu, k));
    json_t *have = json_array_get(t ? ca : na, k), *none = json_array_get(t ? na : ca, k);
    assert_true(json_is_number(have));
    assert_true(json_is_null(none));
    ascr_assert_close(json_number_value(have), json_number_value(json_array_get(both, k)), 0, 0,
                      "split value");
    nlam += !t;
    nturb += t;
  }
  assert_true(nlam > 0 && nturb > 0);
  json_decref(j);
}

/* --history: a list "history" of the solver's Newton steps over every start it made (as many
 * as the reported iterations); the last is the converged run's, with an update below the
 * default tolerance (1e-7) and the result's transition point. A single point is reached as a
 * sweep reaches it (ascr_polar_solve_point): a fresh start at the zero-lift angle (0 deg for the
 * symmetric section), then continued ("previous") up to the angle asked. */
static void test_cli_flow_history_lists_the_newton_steps(void **state)
{
  (void)state;
  int code = -1;
  json_t *j = run_json("flow naca0012 --alpha 2 --re 1e6 --history --json", &code);
  assert_int_equal(code, 0);
  assert_non_null(j);
  assert_true(json_is_true(json_object_get(j, "converged")));
  json_t *h = json_object_get(j, "history");
  assert_true(json_is_array(h));
  size_t n = json_array_size(h);
  assert_true(n >= 2);
  /* every step counted in "iterations" */
  assert_int_equal((long)n, (long)num(j, "iterations"));
  json_t *last = json_array_get(h, n - 1);
  /* converged: the last update below the tolerance 1e-7, or the error it leaves, estimated from
   * the contraction of the last two steps (Theta/(1 - Theta) |dx|, Theta <= 1/4; driver.c) */
  double u1 = num(last, "update"), u0 = num(json_array_get(h, n - 2), "update");
  double theta = u1 / u0;
  assert_true(u1 < 1e-7 || (theta <= 0.25 && theta / (1.0 - theta) * u1 < 1e-7));
  assert_true(json_is_true(json_object_get(last, "exact_rule")));
  ascr_assert_close(num(last, "x_transition_upper"), num(j, "x_transition_upper"), 0.0, 1e-9,
                    "last step's transition = result's");
  const char *start = json_string_value(json_object_get(last, "start"));
  assert_non_null(start);
  assert_string_equal(start, "previous");
  ascr_assert_close(num(last, "alpha_deg"), 2.0, 0.0, 1e-12, "the last step at the angle asked");
  json_t *first = json_array_get(h, 0);
  const char *start0 = json_string_value(json_object_get(first, "start"));
  assert_non_null(start0);
  assert_true(strcmp(start0, "march") == 0 || strcmp(start0, "coupled-march") == 0);
  ascr_assert_close(num(first, "alpha_deg"), 0.0, 0.0, 1e-9, "fresh start at zero lift");
  double aprev = -1.0;
  for (size_t i = 0; i < n; i++) {
    json_t *st = json_array_get(h, i);
    double relax = num(st, "relax");
    assert_true(relax > 0.0 && relax <= 1.0);
    assert_true(num(st, "iteration") >= 1.0);
    double a = num(st, "alpha_deg");
    assert_true(a >= aprev - 1e-12 && a <= 2.0 + 1e-12); /* 0 -> 1 -> 2 deg, in order */
    aprev = a;
  }
  json_decref(j);
}

/* Polar contract: an object with a list "polars", each with re, mach, ncrit and a list
 * "points" of alpha_deg, cl, cd, cdf, cdp, cm, x_transition_upper, x_transition_lower,
 * converged. */
static void test_cli_polar_json_contract(void **state)
{
  (void)state;
  int code = -1;
  json_t *j = run_json("polar naca0012 --re 1e6,3e6 --alpha 0:4:2 --json", &code);
  assert_int_equal(code, 0);
  json_t *pl = json_object_get(j, "polars");
  assert_true(json_is_array(pl));
  assert_int_equal(json_array_size(pl), 2);
  const double res[2] = {1e6, 3e6};
  assert_int_equal(ascr_geom_panels_for_re(1e6), ASCR_GEOM_DEFAULT_PANELS);
  assert_true(ascr_geom_panels_for_re(3e6) > ASCR_GEOM_DEFAULT_PANELS);
  assert_null(json_object_get(j, "n_panels"));
  for (size_t k = 0; k < 2; k++) {
    json_t *p = json_array_get(pl, k);
    ascr_assert_close(num(p, "re"), res[k], 1e-12, 0, "re");
    ascr_assert_close(num(p, "mach"), 0.0, 0, 0, "mach");
    ascr_assert_close(num(p, "ncrit"), 9.0, 0, 0, "ncrit");
    /* each polar's panel count follows its own Re (ascr_geom_panels_for_re), so Re 1e6 is
     * computed as it is alone; with two counts there is none at the top */
    ascr_assert_close(num(p, "n_panels"), (double)ascr_geom_panels_for_re(res[k]), 0, 0, "n_panels");
    json_t *pts = json_object_get(p, "points");
    assert_int_equal(json_array_size(pts), 3);
    double prev = -1.0;
    for (size_t i = 0; i < 3; i++) {
      json_t *q = json_array_get(pts, i);
      ascr_assert_close(num(q, "alpha_deg"), 2.0 * (double)i, 0, 1e-12, "alpha");
      assert_true(json_is_true(json_object_get(q, "converged")));
      double cl = num(q, "cl");
      assert_true(cl > prev);
      prev = cl;
      const char *keys[] = {"cd", "cdf", "cdp", "cm", "x_transition_upper", "x_transition_lower"};
      for (size_t m = 0; m < 6; m++) (void)num(q, keys[m]);
    }
  }
  /* the Reynolds-number summary (issue 12): one object per Re, its figures those of the points
   * printed beside it (smallest cd, largest cl/cd, cl_max of a lift curve rising to the end) */
  json_t *rs = json_object_get(j, "re_summary");
  assert_true(json_is_array(rs));
  assert_int_equal(json_array_size(rs), 2);
  for (size_t k = 0; k < 2; k++) {
    json_t *o = json_array_get(rs, k), *pts = json_object_get(json_array_get(pl, k), "points");
    ascr_assert_close(num(o, "re"), res[k], 1e-12, 0, "re_summary re");
    double cdmin = INFINITY, ldmax = 0.0, clmax = -INFINITY;
    for (size_t i = 0; i < json_array_size(pts); i++) {
      json_t *q = json_array_get(pts, i);
      cdmin = fmin(cdmin, num(q, "cd"));
      ldmax = fmax(ldmax, num(q, "cl") / num(q, "cd"));
      clmax = fmax(clmax, num(q, "cl"));
    }
    ascr_assert_close(num(o, "cd_min"), cdmin, 1e-9, 0, "cd_min");
    ascr_assert_close(num(o, "ld_max"), ldmax, 1e-9, 0, "ld_max");
    ascr_assert_close(num(o, "cl_max"), clmax, 1e-9, 0, "cl_max");
    ascr_assert_close(num(o, "alpha_cl_max_deg"), 4.0, 0, 1e-12, "alpha_cl_max_deg");
    json_t *b = json_object_get(o, "bubble");
    assert_true(json_is_object(b));
    ascr_assert_close(num(b, "cl"), 0.5, 0, 0, "bubble cl");
    assert_true(json_is_string(json_object_get(b, "status")));
  }
  /* one condition, one answer: each Re asked alone gives the numbers it has in the list (its
   * panel count follows its own Re, never the list's) */
  for (size_t k = 0; k < 2; k++) {
    char cmd[128];
    snprintf(cmd, sizeof cmd, "polar naca0012 --re %g --alpha 0:4:2 --json", res[k]);
    int c1 = -1;
    json_t *a = run_json(cmd, &c1);
    assert_int_equal(c1, 0);
    json_t *pa = json_object_get(json_array_get(json_object_get(a, "polars"), 0), "points");
    json_t *pb = json_object_get(json_array_get(pl, k), "points");
    assert_int_equal(json_array_size(pa), json_array_size(pb));
    for (size_t i = 0; i < json_array_size(pa); i++) {
      const char *keys[] = {"cl", "cd", "cm"};
      for (size_t m = 0; m < 3; m++) {
        assert_true(num(json_array_get(pa, i), keys[m]) == num(json_array_get(pb, i), keys[m]));
      }
    }
    ascr_assert_close(num(a, "n_panels"), (double)ascr_geom_panels_for_re(res[k]), 0, 0, "alone: n_panels");
    json_decref(a);
  }
  json_decref(j);
}

/* The transition band (issue 12): --ncrit-range LO:HI adds per point cl_band, cd_band and
 * cm_band ([least, largest] over the sweeps at LO, the nominal N_crit and HI) and band_complete,
 * and per polar ncrit_range. The nominal value lies inside its band; on NACA 0012 at Re 1e6
 * a lower N_crit moves transition forward and raises the drag at every angle (Schlichting ch.
 * XVII: a longer turbulent run), so the band has a width. */
static void test_cli_polar_json_transition_band(void **state)
{
  (void)state;
  int code = -1;
  json_t *j = run_json("polar naca0012 --re 1e6 --alpha 0:4:2 --ncrit-range 7:11 --json", &code);
  assert_int_equal(code, 0);
  json_t *p = json_array_get(json_object_get(j, "polars"), 0);
  json_t *nr = json_object_get(p, "ncrit_range");
  assert_int_equal(json_array_size(nr), 2);
  ascr_assert_close(json_number_value(json_array_get(nr, 0)), 7.0, 0, 0, "ncrit lo");
  ascr_assert_close(json_number_value(json_array_get(nr, 1)), 11.0, 0, 0, "ncrit hi");
  json_t *pts = json_object_get(p, "points");
  assert_int_equal(json_array_size(pts), 3);
  for (size_t i = 0; i < 3; i++) {
    json_t *q = json_array_get(pts, i);
    assert_true(json_is_true(json_object_get(q, "band_complete")));
    const char *keys[3] = {"cl", "cd", "cm"}, *bk[3] = {"cl_band", "cd_band", "cm_band"};
    for (int m = 0; m < 3; m++) {
      json_t *b = json_object_get(q, bk[m]);
      assert_int_equal(json_array_size(b), 2);
      double lo = json_number_value(json_array_get(b, 0)), hi = json_number_value(json_array_get(b, 1));
      double v = num(q, keys[m]);
      assert_true(lo <= v && v <= hi);
    }
    json_t *db = json_object_get(q, "cd_band");
    assert_true(json_number_value(json_array_get(db, 1)) > json_number_value(json_array_get(db, 0)));
  }
  json_decref(j);
}

/* Rotor JSON contract (issue: points with rpm, speed_m_s, thrust_N, torque_Nm, power_W, CT,
 * CP, J, efficiency, converged and per-station distributions), checked for internal
 * consistency: CT = T/(rho n^2 D^4), CP = P/(rho n^3 D^5), P = 2 pi n Q, J = V/(n D),
 * eta = T V / P, and the stations' dT/dr integrating to the thrust (midpoint rule on the
 * element widths, within 2 %: the output carries r but not the element edges). */
static void test_cli_rotor_json_contract(void **state)
{
  (void)state;
  int code = -1;
  json_t *j = run_json("rotor " ASCR_SOURCE_DIR "/tests/data/blades/two-blade-4412.json --rpm 7000,8000 "
                       "--speed 0,9 --polar-table main=" ASCR_SOURCE_DIR "/tests/data/naca4412-table.json "
                       "--json", &code);
  assert_int_equal(code, 0);
  assert_non_null(j);
  assert_string_equal(json_string_value(json_object_get(j, "inflow")), "bemt");
  double d = num(j, "diameter_m");
  double rho = num(json_object_get(j, "air"), "density_kg_m3");
  assert_true(json_array_size(json_object_get(j, "cautions")) >= 2);
  json_t *pts = json_object_get(j, "points");
  assert_int_equal(json_array_size(pts), 4);
  for (size_t k = 0; k < 4; k++) {
    json_t *p = json_array_get(pts, k);
    assert_true(json_is_true(json_object_get(p, "converged")));
    double rpm = num(p, "rpm"), v = num(p, "speed_m_s"), t = num(p, "thrust_N");
    double q = num(p, "torque_Nm"), pw = num(p, "power_W"), n = rpm / 60.0;
    assert_true(t > 0.0 && q > 0.0);
    ascr_assert_close(num(p, "CT"), t / (rho * n * n * pow(d, 4)), 1e-8, 0.0, "CT definition");
    ascr_assert_close(num(p, "CP"), pw / (rho * n * n * n * pow(d, 5)), 1e-8, 0.0, "CP definition");
    ascr_assert_close(pw, 2.0 * 3.14159265358979323846 * n * q, 1e-8, 0.0, "P = 2 pi n Q");
    ascr_assert_close(num(p, "J"), v / (n * d), 1e-8, 1e-12, "J definition");
    json_t *eta = json_object_get(p, "efficiency");
    if (v > 0.0) {
      ascr_assert_close(json_number_value(eta), t * v / pw, 1e-8, 0.0, "eta definition");
    } else {
      assert_true(json_is_null(eta));
      assert_true(num(p, "figure_of_merit") > 0.3);
    }
    json_t *st = json_object_get(p, "stations");
    size_t ns = json_array_size(st);
    assert_int_equal(ns, 40);
    double sum = 0.0;
    for (size_t i = 0; i < ns; i++) {
      json_t *e = json_array_get(st, i);
      const char *keys[] = {"r_m", "alpha_deg", "re", "mach", "cl", "cd", "cm", "dT_dr_N_per_m",
                            "dQ_dr_Nm_per_m", "dM_dr_Nm_per_m"};
      for (size_t m = 0; m < 10; m++) (void)num(e, keys[m]);
      assert_true(json_is_boolean(json_object_get(e, "stalled")));
      double r = num(e, "r_m");
      double rl = i > 0 ? 0.5 * (r + num(json_array_get(st, i - 1), "r_m")) : 0.2 * d / 2.0;
      double rr = i + 1 < ns ? 0.5 * (r + num(json_array_get(st, i + 1), "r_m")) : d / 2.0;
      sum += num(e, "dT_dr_N_per_m") * (rr - rl);
    }
    ascr_assert_close(sum, t, 0.02, 0.0, "stations integrate to the thrust");
    /* rotor convention (issue 13): CT_rotor = T/(rho A (Omega R)^2), CT/sigma with sigma the
     * top-level solidity; the confidence of every converged point said */
    double omr = 2.0 * 3.14159265358979323846 * n * d / 2.0, area = 3.14159265358979323846 * d * d / 4.0;
    ascr_assert_close(num(p, "CT_rotor"), t / (rho * area * omr * omr), 1e-8, 0.0, "CT_rotor");
    ascr_assert_close(num(p, "CT_over_sigma"), num(p, "CT_rotor") / num(j, "solidity"), 1e-8, 0.0, "CT/sigma");
    assert_true(json_is_string(json_object_get(p, "confidence")));
    assert_true(num(p, "re_075") > 1e4);
  }
  json_decref(j);
  /* the N_crit band: [min, max] that holds the nominal value (a polar-table file serves every
   * N_crit here, so the band is closed up on it) */
  j = run_json("rotor " ASCR_SOURCE_DIR "/tests/data/blades/two-blade-4412.json --rpm 7000 "
               "--airspeed 9 --ncrit-range 5:11 --polar-table main=" ASCR_SOURCE_DIR
               "/tests/data/naca4412-table.json --json", &code);
  assert_int_equal(code, 0);
  assert_non_null(j);
  assert_int_equal(json_array_size(json_object_get(j, "ncrit_range")), 2);
  json_t *p0 = json_array_get(json_object_get(j, "points"), 0);
  json_t *tb = json_object_get(p0, "thrust_band_N");
  assert_int_equal(json_array_size(tb), 2);
  double t0 = num(p0, "thrust_N");
  assert_true(json_number_value(json_array_get(tb, 0)) <= t0 && json_number_value(json_array_get(tb, 1)) >= t0);
  assert_int_equal(json_array_size(json_object_get(p0, "power_band_W")), 2);
  assert_int_equal(json_array_size(json_object_get(p0, "efficiency_band")), 2);
  assert_true(json_is_true(json_object_get(p0, "band_complete")));
  json_decref(j);
  /* tables computed with trips count, per curve, the converged points where a trip bound
   * nothing (the stagnation point behind it); NACA 4412 at Re 1e4-1e5, trips at 2 %, 0..12 deg
   * by 4: the lower trip from 12 deg on the curves above the lowest */
  j = run_json("rotor " ASCR_SOURCE_DIR "/tests/data/blades/two-blade-4412.json --rpm 7000 "
               "--no-cache --trip-upper 0.02 --trip-lower 0.02 --table-alpha 0:12:4 --json", &code);
  assert_int_equal(code, 0);
  assert_non_null(j);
  json_t *cs = json_object_get(json_array_get(json_object_get(j, "sections"), 0), "curves");
  assert_true(json_array_size(cs) >= 3);
  size_t lower = 0;
  for (size_t k = 0; k < json_array_size(cs); k++) {
    json_t *tn = json_object_get(json_array_get(cs, k), "trip_not_applied_points");
    assert_true(json_is_object(tn));
    assert_true(num(tn, "upper") == 0.0);
    lower += (size_t)num(tn, "lower");
  }
  assert_true(lower >= 1);
  /* and per element: where the elements' angle lies on or past the curves' first flagged
   * point (12 deg) or in the interval before it (from 8 deg), trip_not_applied names the lower
   * surface; below 8 deg it is empty; the point's warning counts them */
  json_t *q0 = json_array_get(json_object_get(j, "points"), 0);
  json_t *st = json_object_get(q0, "stations");
  size_t flagged = 0, low = 0;
  for (size_t i = 0; i < json_array_size(st); i++) {
    json_t *e = json_array_get(st, i), *tn = json_object_get(e, "trip_not_applied");
    assert_true(json_is_array(tn));
    double a = num(e, "alpha_deg");
    if (json_array_size(tn) > 0) {
      assert_string_equal(json_string_value(json_array_get(tn, 0)), "lower");
      assert_true(a > 8.0);
      flagged++;
    }
    if (a >= 12.0) assert_int_equal(json_array_size(tn), 1);
    if (a < 8.0) low++, assert_int_equal(json_array_size(tn), 0);
  }
  assert_true(flagged > 0 && low > 0);
  char want[160];
  snprintf(want, sizeof want, "%zu of %zu elements where the section's trip binds nothing", flagged,
           json_array_size(st));
  int seen = 0;
  json_t *w = json_object_get(q0, "warnings");
  for (size_t i = 0; i < json_array_size(w); i++) {
    seen |= strstr(json_string_value(json_array_get(w, i)), want) != NULL;
  }
  assert_true(seen);
  json_decref(j);
}

/* Determinism: the same input gives byte-identical output (a polar sweep and a rotor map with
 * both inflow models, run twice). */
static char *run_raw(const char *args, size_t *len)
{
  char cmd[1024];
  snprintf(cmd, sizeof cmd, "'%s' %s 2>/dev/null", ASCR_CLI_PATH, args);
  FILE *p = popen(cmd, "r");
  assert_non_null(p);
  char *buf = NULL;
  FILE *m = open_memstream(&buf, len);
  char chunk[4096];
  size_t got;
  while ((got = fread(chunk, 1, sizeof chunk, p)) > 0) fwrite(chunk, 1, got, m);
  fclose(m);
  assert_int_equal(pclose(p), 0);
  return buf;
}

/* airscrew drive ... --json: the contract of issue 14 (a list "points", each with the named
 * fields and the motor's parameters echoed), the energy balance of each point, and agreement
 * with the rotor command: the propeller at a drive point's rpm gives the drive point's thrust
 * (1e-8: the 10 significant digits printed), and the throttle for a thrust lands on the rpm of
 * "rotor --thrust" (its search's 1e-7). */
#define DRIVE_ARGS ASCR_SOURCE_DIR "/tests/data/blades/two-blade-4412.json " ASCR_SOURCE_DIR \
  "/tests/data/powertrains/eight-inch-3s.json --polar-table main=" ASCR_SOURCE_DIR           \
  "/tests/data/naca4412-table.json"
static void test_cli_drive_json_contract(void **state)
{
  (void)state;
  int code = -1;
  json_t *j = run_json("drive " DRIVE_ARGS " --throttle 40,80 --speed 0,6 --json", &code);
  assert_int_equal(code, 0);
  assert_non_null(j);
  json_t *pts = json_object_get(j, "points");
  assert_int_equal(json_array_size(pts), 4);
  static const char *const keys[] = {"throttle", "rpm", "speed_m_s", "thrust_N", "torque_Nm",
                                     "current_A", "motor_voltage_V", "battery_voltage_V",
                                     "shaft_power_W", "electrical_power_W", "kv_rpm_per_V",
                                     "resistance_ohm", "no_load_current_A", NULL};
  for (size_t k = 0; k < 4; k++) {
    json_t *p = json_array_get(pts, k);
    assert_true(json_is_true(json_object_get(p, "converged")));
    for (size_t i = 0; keys[i] != NULL; i++) (void)num(p, keys[i]);
    ascr_assert_close(num(p, "kv_rpm_per_V"), 920.0, 0.0, 0.0, "KV echoed");
    double sum = num(p, "shaft_power_W") + num(p, "copper_loss_W") + num(p, "no_load_loss_W") +
                 num(p, "esc_loss_W") + num(p, "wiring_loss_W");
    ascr_assert_close(num(p, "electrical_power_W"), sum, 1e-8, 0.0, "energy balance");
  }
  /* the first point (40 %, 0 m/s) against the rotor command at its rpm */
  json_t *p0 = json_array_get(pts, 0);
  ascr_assert_close(num(p0, "throttle"), 0.4, 1e-12, 0.0, "throttle as a fraction");
  char args[2048];
  snprintf(args, sizeof args, "rotor " ASCR_SOURCE_DIR "/tests/data/blades/two-blade-4412.json --rpm %.10g "
           "--polar-table main=" ASCR_SOURCE_DIR "/tests/data/naca4412-table.json --json", num(p0, "rpm"));
  json_t *r = run_json(args, &code);
  assert_int_equal(code, 0);
  json_t *rp = json_array_get(json_object_get(r, "points"), 0);
  ascr_assert_close(num(rp, "thrust_N"), num(p0, "thrust_N"), 1e-8, 0.0, "rotor at the drive rpm");
  ascr_assert_close(num(rp, "torque_Nm"), num(p0, "torque_Nm"), 1e-8, 0.0, "torque at the drive rpm");
  json_decref(r);
  json_t *lin = json_object_get(j, "linearity");
  assert_int_equal(json_array_size(lin), 2);
  (void)num(json_array_get(lin, 0), "max_deviation");
  (void)num(json_array_get(lin, 0), "gain_ratio_25_75");
  json_decref(j);
  /* the throttle for 3 N in hover and the rotor's own thrust search */
  j = run_json("drive " DRIVE_ARGS " --thrust 3 --json", &code);
  assert_int_equal(code, 0);
  json_t *h = json_array_get(json_object_get(j, "points"), 0);
  ascr_assert_close(num(h, "thrust_N"), 3.0, 1e-6, 0.0, "thrust reached");
  assert_true(num(h, "throttle") > 0.0 && num(h, "throttle") < 1.0);
  r = run_json("rotor " ASCR_SOURCE_DIR "/tests/data/blades/two-blade-4412.json --thrust 3 --rpm-range "
               "1000:30000 --polar-table main=" ASCR_SOURCE_DIR "/tests/data/naca4412-table.json --json", &code);
  assert_int_equal(code, 0);
  rp = json_array_get(json_object_get(r, "points"), 0);
  ascr_assert_close(num(h, "rpm"), num(rp, "rpm"), 1e-6, 0.0, "hover rpm as rotor --thrust");
  json_decref(r);
  json_decref(j);
}

/* airscrew design SPEC -o BLADE --json: the contract of issue 15 (design_point with rpm,
 * speed_m_s, thrust_N, power_W, efficiency; blade_file), and the blade file it writes gives,
 * under "rotor" at the design point, the predicted thrust and power (1e-3: the file keeps
 * lengths to 1 um and twist to 1e-4 deg). */
static void test_cli_design_json_contract(void **state)
{
  (void)state;
  int code = -1;
  char tmpl[] = "/tmp/airscrew-design-XXXXXX";
  assert_non_null(mkdtemp(tmpl));
  char args[2048], blade[256];
  snprintf(blade, sizeof blade, "%s/designed.json", tmpl);
  snprintf(args, sizeof args, "design " ASCR_SOURCE_DIR "/tests/data/designs/eight-inch-4412.json -o %s "
           "--polar-table main=" ASCR_SOURCE_DIR "/tests/data/naca4412-table.json --json", blade);
  json_t *j = run_json(args, &code);
  assert_int_equal(code, 0);
  assert_non_null(j);
  json_t *dp = json_object_get(j, "design_point");
  ascr_assert_close(num(dp, "rpm"), 8000.0, 0.0, 0.0, "design rpm");
  ascr_assert_close(num(dp, "speed_m_s"), 10.0, 0.0, 0.0, "design speed");
  ascr_assert_close(num(dp, "thrust_N"), 2.5, 1e-2, 0.0, "design thrust within 1 %");
  (void)num(dp, "power_W");
  (void)num(dp, "efficiency");
  assert_string_equal(json_string_value(json_object_get(j, "blade_file")), blade);
  snprintf(args, sizeof args, "rotor %s --rpm 8000 --speed 10 --polar-table main=" ASCR_SOURCE_DIR
           "/tests/data/naca4412-table.json --json", blade);
  json_t *r = run_json(args, &code);
  assert_int_equal(code, 0);
  json_t *rp = json_array_get(json_object_get(r, "points"), 0);
  ascr_assert_close(num(rp, "thrust_N"), num(dp, "thrust_N"), 1e-3, 0.0, "rotor on the designed blade");
  ascr_assert_close(num(rp, "power_W"), num(dp, "power_W"), 1e-3, 0.0, "power on the designed blade");
  json_decref(r);
  json_decref(j);
  unlink(blade);
  rmdir(tmpl);
}

/* airscrew structure BLADE MATERIAL --rpm VALUES --json: the contract of issue 16 (mass_kg,
 * volume_m3, stations with r_m, area_m2, EI_flap_Nm2, EI_lag_Nm2, mass_per_length_kg_m,
 * stress_Pa; max_stress_Pa, safety_factor; modes per rpm with flap_hz, lag_hz, torsion_hz lists,
 * lowest first), and its internal consistency: the mass is the integral of the mass per length
 * (trapezoidal, as computed), density times volume, the safety factor the strength over the
 * largest stress; 1e-9 (the JSON keeps 10 significant digits). */
static void test_cli_structure_json_contract(void **state)
{
  (void)state;
  int code = -1;
  json_t *j = run_json("structure " ASCR_SOURCE_DIR "/tests/data/blades/two-blade-4412.json "
                       ASCR_SOURCE_DIR "/docs/examples/materials/polycarbonate.json --rpm 4000:8000:2000 "
                       "--stations 21 --polar-table main=" ASCR_SOURCE_DIR "/tests/data/naca4412-table.json --json",
                       &code);
  assert_int_equal(code, 0);
  assert_non_null(j);
  double mass = num(j, "mass_kg"), vol = num(j, "volume_m3");
  ascr_assert_close(mass, 1200.0 * vol, 1e-9, 0.0, "mass = density x volume (uniform material)");
  json_t *sa = json_object_get(j, "stations");
  assert_int_equal(json_array_size(sa), 21);
  double m_int = 0.0, smax = 0.0;
  for (size_t i = 0; i < 21; i++) {
    json_t *q = json_array_get(sa, i);
    (void)num(q, "area_m2");
    assert_true(num(q, "EI_flap_Nm2") > 0.0 && num(q, "EI_lag_Nm2") > 0.0);
    smax = fmax(smax, num(q, "stress_Pa"));
    if (i > 0) {
      json_t *p = json_array_get(sa, i - 1);
      m_int += 0.5 * (num(q, "r_m") - num(p, "r_m")) *
               (num(q, "mass_per_length_kg_m") + num(p, "mass_per_length_kg_m"));
    }
  }
  ascr_assert_close(mass, m_int, 1e-9, 0.0, "mass = integral of the mass per length");
  ascr_assert_close(num(j, "max_stress_Pa"), smax, 1e-9, 0.0, "largest station stress");
  json_t *mf = json_load_file(ASCR_SOURCE_DIR "/docs/examples/materials/polycarbonate.json", 0, NULL);
  assert_non_null(mf);
  double strength = num(json_object_get(mf, "tensile_strength_Pa"), "value");
  json_decref(mf);
  ascr_assert_close(num(j, "safety_factor"), strength / smax, 1e-9, 0.0, "strength / largest stress");
  json_t *ma = json_object_get(j, "modes");
  assert_int_equal(json_array_size(ma), 3);
  static const char *const fam[3] = {"flap_hz", "lag_hz", "torsion_hz"};
  for (size_t k = 0; k < 3; k++) {
    json_t *m = json_array_get(ma, k);
    ascr_assert_close(num(m, "rpm"), 4000.0 + 2000.0 * k, 0.0, 0.0, "modes rpm");
    for (int f = 0; f < 3; f++) {
      json_t *l = json_object_get(m, fam[f]);
      assert_true(json_array_size(l) >= 2);
      for (size_t q = 1; q < json_array_size(l); q++) {
        assert_true(json_number_value(json_array_get(l, q)) >= json_number_value(json_array_get(l, q - 1)));
      }
    }
  }
  assert_true(json_is_array(json_object_get(j, "crossings")));
  json_decref(j);
}

static void test_cli_output_is_deterministic(void **state)
{
  (void)state;
  const char *cmds[] = {
    "polar naca4412 --re 1e5 --alpha -2:6:1 --json",
    "rotor " ASCR_SOURCE_DIR "/tests/data/blades/two-blade-4412.json --rpm 7000,9000 --speed 0,10 "
    "--polar-table main=" ASCR_SOURCE_DIR "/tests/data/naca4412-table.json --json",
    "rotor " ASCR_SOURCE_DIR "/tests/data/blades/two-blade-4412.json --rpm 7000,9000 --speed 10 "
    "--inflow vortex --polar-table main=" ASCR_SOURCE_DIR "/tests/data/naca4412-table.json --csv"};
  for (size_t i = 0; i < sizeof cmds / sizeof cmds[0]; i++) {
    size_t n1 = 0, n2 = 0;
    char *a = run_raw(cmds[i], &n1);
    char *b = run_raw(cmds[i], &n2);
    assert_true(n1 > 100);
    assert_int_equal(n1, n2);
    assert_memory_equal(a, b, n1);
    free(a);
    free(b);
  }
}

int main(void)
{
  gsl_set_error_handler_off();
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_cli_flow_json_contract_matches_library),
    cmocka_unit_test(test_cli_flow_json_mach_raises_lift),
    cmocka_unit_test(test_cli_section_points_round_trip),
    cmocka_unit_test(test_cli_flow_viscous_json_contract),
    cmocka_unit_test(test_cli_flow_history_lists_the_newton_steps),
    cmocka_unit_test(test_cli_polar_json_contract),
    cmocka_unit_test(test_cli_polar_json_transition_band),
    cmocka_unit_test(test_cli_rotor_json_contract),
    cmocka_unit_test(test_cli_drive_json_contract),
    cmocka_unit_test(test_cli_design_json_contract),
    cmocka_unit_test(test_cli_structure_json_contract),
    cmocka_unit_test(test_cli_output_is_deterministic),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
