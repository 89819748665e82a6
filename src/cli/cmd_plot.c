/* src/cli/cmd_plot.c
 * "airscrew plot": redraw the figures of a saved JSON result of polar or rotor.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli.h"
#include "cli_csv.h"
#include "cli_figures.h"
#include "commands.h"

#include <strings.h>

#include <jansson.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

static void plot_help(FILE *fp)
{
  fputs("usage: airscrew plot RESULT.json|RESULT.csv --out DIR [--model NAME] [--force]\n"
        "\n"
        "Draw the figures of a result saved with --json or --csv by 'airscrew polar' (polars:\n"
        "DIR/polar; from JSON with several Re also the Reynolds-number study, DIR/polar-re) or 'airscrew rotor' (CT, CP, efficiency, thrust and power: DIR/rotor;\n"
        "spanwise loading: DIR/rotor-spanwise, from JSON with --stations), as SVG and PNG.\n"
        "Files ending in .csv are read as CSV, others as JSON. Unconverged points (null in\n"
        "JSON, converged=false or empty in CSV) are left out. A rotor CSV with a model column\n"
        "(the demo's rotor-map.csv) is drawn for one model: --model NAME, default the first.\n",
        fp);
}

/* largest result file read (a rotor map with spanwise stations is a few MiB) */
#define PLOT_JSON_MAX ((size_t)64 << 20)

static double jnum(json_t *o, const char *k)
{
  json_t *v = json_object_get(o, k);
  return json_is_number(v) ? json_number_value(v) : NAN;
}

/* The numeric fields of an object: absent or null read as NaN (an unconverged point), a
 * number as itself, anything else is an error naming the file, the place and the field.
 * Returns 0 or CLI_EXIT_INPUT (message printed). */
static int jnums(const char *file, const char *where, size_t i, json_t *o, const char *const *keys,
                 double *const *out, size_t nk)
{
  if (!json_is_object(o)) {
    cli_error("%s: %s[%zu]: expected an object", file, where, i);
    return CLI_EXIT_INPUT;
  }
  for (size_t k = 0; k < nk; k++) {
    json_t *v = json_object_get(o, keys[k]);
    if (v != NULL && !json_is_null(v) && !json_is_number(v)) {
      cli_error("%s: %s[%zu].%s: expected a number", file, where, i, keys[k]);
      return CLI_EXIT_INPUT;
    }
    *out[k] = json_is_number(v) ? json_number_value(v) : NAN;
  }
  return 0;
}

/* The Reynolds-number study of a polar result (its "re_summary", issue 12): DIR/polar-re, one
 * series per Mach number, drawn where the result holds at least two Reynolds numbers. */
static int plot_re_summary(const char *file, json_t *root, const char *dir)
{
  enum { MAXM = 8 };
  json_t *rs = json_object_get(root, "re_summary");
  size_t n = json_array_size(rs);
  if (n < 2) return 0;
  if (n > 4096) {
    cli_error("%s: re_summary: too many entries", file);
    return CLI_EXIT_INPUT;
  }
  double *v = calloc(11 * n, sizeof *v);
  double *b = calloc(8 * n, sizeof *b);
  fig_re_series *fs = calloc(MAXM, sizeof *fs);
  if (v == NULL || b == NULL || fs == NULL) {
    free(v);
    free(b);
    free(fs);
    return CLI_EXIT_INTERNAL;
  }
  static const char *const keys[7] = {"re", "mach", "cd_min", "ld_max", "cl_max",
                                      "alpha_zero_lift_deg", "lift_slope_per_deg"};
  static const char *const bkeys[3] = {"cl", "x_separation_upper", "x_reattach_upper"};
  int rc = 0;
  for (size_t i = 0; i < n && rc == 0; i++) {
    json_t *o = json_array_get(rs, i);
    double *row = v + 11 * i;
    double *out[7] = {row, row + 1, row + 2, row + 3, row + 4, row + 5, row + 6};
    rc = jnums(file, "re_summary", i, o, keys, out, 7);
    if (rc != 0) break;
    json_t *bo = json_object_get(o, "bubble");
    double *bout[3] = {row + 7, row + 8, row + 9};
    if (bo != NULL) {
      char where[40];
      snprintf(where, sizeof where, "re_summary[%zu].bubble", i);
      rc = jnums(file, where, 0, bo, bkeys, bout, 3);
      json_t *st = json_object_get(bo, "status");
      row[10] = json_is_string(st) && strcmp(json_string_value(st), "closed") == 0;
    } else {
      row[7] = row[8] = row[9] = NAN;
      row[10] = 0.0;
    }
  }
  /* group by Mach number, in the order met */
  double machs[MAXM];
  size_t nm = 0, used = 0, distinct_re = 0;
  for (size_t i = 0; i < n && rc == 0; i++) {
    double m = v[11 * i + 1];
    size_t k = 0;
    while (k < nm && !(machs[k] == m || (isnan(machs[k]) && isnan(m)))) k++;
    if (k == nm && nm < MAXM) machs[nm++] = m;
  }
  for (size_t k = 0; k < nm && rc == 0; k++) {
    fig_re_series *f = &fs[k];
    double *c = b + used;
    size_t cnt = 0;
    for (size_t i = 0; i < n; i++) {
      double m = v[11 * i + 1];
      if (!(m == machs[k] || (isnan(m) && isnan(machs[k])))) continue;
      cnt++;
    }
    for (size_t i = 0, j = 0; i < n; i++) {
      const double *row = v + 11 * i;
      if (!(row[1] == machs[k] || (isnan(row[1]) && isnan(machs[k])))) continue;
      c[j] = row[0];
      for (int q = 0; q < 5; q++) c[(size_t)(q + 1) * cnt + j] = row[2 + q];
      c[6 * cnt + j] = row[8];
      c[7 * cnt + j] = row[10] > 0.0 ? row[9] : NAN;
      j++;
    }
    fig_re_series_bind(f, machs[k], cnt, c);
    used += 8 * cnt;
    distinct_re = cnt > distinct_re ? cnt : distinct_re;
  }
  if (rc == 0 && distinct_re >= 2) {
    json_t *sec = json_object_get(root, "section");
    rc = fig_re_study(dir, json_is_string(sec) ? json_string_value(sec) : file, v[7], fs, nm);
  }
  free(v);
  free(b);
  free(fs);
  return rc;
}

static int plot_polars(const char *file, json_t *root, const char *dir)
{
  json_t *pl = json_object_get(root, "polars");
  size_t np = json_array_size(pl);
  if (np == 0 || np > 256) {
    cli_error("%s: polars: empty or too many", file);
    return CLI_EXIT_INPUT;
  }
  fig_polar *f = calloc(np, sizeof *f);
  if (f == NULL) return CLI_EXIT_INTERNAL;
  int rc = 0;
  for (size_t k = 0; k < np && rc == 0; k++) {
    json_t *po = json_array_get(pl, k), *pts = json_object_get(po, "points");
    size_t n = json_array_size(pts);
    if (!json_is_object(po) || n == 0 || n > 100000) {
      cli_error("%s: polars[%zu].points: missing or empty", file, k);
      rc = CLI_EXIT_INPUT;
      break;
    }
    double *b = calloc(4 * n, sizeof *b);
    if (b == NULL) {
      rc = CLI_EXIT_INTERNAL;
      break;
    }
    f[k].n = n;
    f[k].alpha = b;
    f[k].cl = b + n;
    f[k].cd = b + 2 * n;
    f[k].cm = b + 3 * n;
    char where[48];
    snprintf(where, sizeof where, "polars[%zu].points", k);
    static const char *const keys[4] = {"alpha_deg", "cl", "cd", "cm"};
    for (size_t i = 0; i < n && rc == 0; i++) {
      double *out[4] = {&f[k].alpha[i], &f[k].cl[i], &f[k].cd[i], &f[k].cm[i]};
      rc = jnums(file, where, i, json_array_get(pts, i), keys, out, 4);
    }
    if (rc != 0) break;
    json_t *sec = json_object_get(po, "section");
    int n0 = json_is_string(sec) ? snprintf(f[k].label, sizeof f[k].label, "%.40s, ", json_string_value(sec)) : 0;
    double mach = jnum(po, "mach"), ncrit = jnum(po, "ncrit");
    int n1 = snprintf(f[k].label + n0, sizeof f[k].label - (size_t)n0, "Re %.3gk", jnum(po, "re") / 1000.0);
    if (isfinite(mach) && mach > 0.0) {
      n1 += snprintf(f[k].label + n0 + n1, sizeof f[k].label - (size_t)(n0 + n1), ", M %.2g", mach);
    }
    if (isfinite(ncrit)) {
      snprintf(f[k].label + n0 + n1, sizeof f[k].label - (size_t)(n0 + n1), ", N#dcrit#u %.3g", ncrit);
    }
  }
  if (rc == 0) {
    json_t *sec = json_object_get(root, "section");
    rc = fig_polars(dir, json_is_string(sec) ? json_string_value(sec) : file, f, np);
  }
  for (size_t k = 0; k < np; k++) free(f[k].alpha);
  free(f);
  return rc;
}

static int plot_rotor(const char *file, json_t *root, const char *dir)
{
  json_t *pts = json_object_get(root, "points");
  size_t np = json_array_size(pts);
  if (np == 0 || np > 100000) {
    cli_error("%s: points: empty", file);
    return CLI_EXIT_INPUT;
  }
  fig_rotor_point *f = calloc(np, sizeof *f);
  if (f == NULL) return CLI_EXIT_INTERNAL;
  int rc = 0;
  for (size_t k = 0; k < np && rc == 0; k++) {
    json_t *p = json_array_get(pts, k);
    static const char *const keys[8] = {"rpm", "speed_m_s", "J", "CT", "CP", "efficiency",
                                        "thrust_N", "power_W"};
    double *out[8] = {&f[k].rpm, &f[k].speed, &f[k].J, &f[k].CT, &f[k].CP, &f[k].eta,
                      &f[k].thrust, &f[k].power};
    rc = jnums(file, "points", k, p, keys, out, 8);
    if (rc != 0) break;
    json_t *st = json_object_get(p, "stations");
    size_t ns = json_array_size(st);
    if (ns > 0 && ns <= 4000) {
      double *b = calloc(2 * ns, sizeof *b);
      if (b == NULL) {
        rc = CLI_EXIT_INTERNAL;
        break;
      }
      f[k].ns = ns;
      f[k].r_over_R = b;
      f[k].dT_dr = b + ns;
      for (size_t i = 0; i < ns; i++) {
        json_t *e = json_array_get(st, i);
        b[i] = jnum(e, "r_over_R");
        b[ns + i] = jnum(e, "dT_dr_N_per_m");
      }
    }
  }
  if (rc == 0) {
    json_t *bl = json_object_get(root, "blade");
    rc = fig_rotor(dir, json_is_string(bl) ? json_string_value(bl) : file, f, np);
  }
  for (size_t k = 0; k < np; k++) free(f[k].r_over_R);
  free(f);
  return rc;
}

/* One CSV cell as a JSON number: null where empty, where the row is not converged, or "nan";
 * an error naming the line and column where it is not a number. */
static int csv_num(const char *file, const cli_csv *t, size_t r, int col, int conv_col, json_t **out)
{
  *out = NULL;
  if (col < 0) return 0;
  const char *v = t->cell[r * t->ncol + (size_t)col];
  const char *cv = conv_col >= 0 ? t->cell[r * t->ncol + (size_t)conv_col] : NULL;
  if (cv != NULL && strcmp(cv, "true") != 0 && strcmp(cv, "false") != 0) {
    cli_error("%s:%zu: converged: '%s' is not true or false", file, t->line[r], cv);
    return CLI_EXIT_INPUT;
  }
  double x;
  if (v == NULL || strcmp(v, "nan") == 0) {
    *out = json_null();
    return 0;
  }
  if (cli_parse_number(v, &x) != 0) {
    /* one rule for non-finite cells: "nan" (like an empty cell) is no value, an infinity is
     * an error */
    int inf = strstr(v, "inf") != NULL || strstr(v, "Inf") != NULL || strstr(v, "INF") != NULL;
    cli_error("%s:%zu: %s: '%s' is not %s", file, t->line[r], t->head[col], v,
              inf ? "a finite number (\"nan\" or an empty cell marks a missing value)" : "a number");
    return CLI_EXIT_INPUT;
  }
  *out = (cv != NULL && strcmp(cv, "false") == 0) ? json_null() : json_real(x);
  return *out == NULL ? CLI_EXIT_INTERNAL : 0;
}

static int same(double a, double b) { return a == b || (isnan(a) && isnan(b)); }

/* Rebuild the JSON shape of a polar or rotor result from its CSV form, so that both draw
 * through the same code. Polar CSV: re, alpha_deg, cl, cd, cm required; mach, ncrit, section
 * optional (rows grouped into polars where re, mach, ncrit or section change). Rotor CSV: rpm,
 * speed_m_s, J, CT, CP, efficiency, thrust_N, power_W required; with a model column only the
 * rows of MODEL (default: the first row's) are drawn. */
static int csv_to_result(const char *file, const char *model, json_t **out)
{
  cli_csv t;
  int rc = cli_csv_read(file, &t);
  if (rc) return rc;
  static const char *const pcols[] = {"re", "mach", "ncrit", "alpha_deg", "cl", "cd", "cm"};
  static const char *const rcols[] = {"rpm", "speed_m_s", "J", "CT", "CP", "efficiency", "thrust_N", "power_W"};
  int polar = cli_csv_col(&t, "alpha_deg") >= 0, rotor = cli_csv_col(&t, "CT") >= 0;
  const char *const *need = polar ? pcols : rcols;
  size_t nneed = polar ? sizeof pcols / sizeof *pcols : sizeof rcols / sizeof *rcols;
  if (polar == rotor) {
    cli_error("%s: header is neither a polar result (alpha_deg, cl, cd ...) nor a rotor result "
              "(rpm, J, CT, CP ...)", file);
    cli_csv_free(&t);
    return CLI_EXIT_INPUT;
  }
  int col[8];
  for (size_t k = 0; k < nneed; k++) {
    col[k] = cli_csv_col(&t, need[k]);
    if (col[k] < 0 && !(polar && (k == 1 || k == 2))) {
      cli_error("%s: column '%s' missing from the header", file, need[k]);
      cli_csv_free(&t);
      return CLI_EXIT_INPUT;
    }
  }
  if (t.nrow == 0) {
    cli_error("%s: no result rows", file);
    cli_csv_free(&t);
    return CLI_EXIT_INPUT;
  }
  int conv = cli_csv_col(&t, "converged"), csec = cli_csv_col(&t, "section");
  int cmodel = polar ? -1 : cli_csv_col(&t, "model");
  if (model != NULL && cmodel < 0) {
    cli_error("%s: --model given but the file has no model column", file);
    cli_csv_free(&t);
    return CLI_EXIT_USAGE;
  }
  if (cmodel >= 0 && model == NULL) model = t.cell[(size_t)cmodel] != NULL ? t.cell[(size_t)cmodel] : "";
  json_t *root = json_object(), *list = json_array(), *cur = NULL;
  if (root == NULL || list == NULL) rc = CLI_EXIT_INTERNAL;
  const char *name = cli_csv_meta(&t, polar ? "section" : "blade");
  if (rc == 0 && name != NULL) json_object_set_new(root, polar ? "section" : "blade", json_string(name));
  if (rc == 0) json_object_set(root, polar ? "polars" : "points", list);
  double key[3] = {NAN, NAN, NAN};
  const char *keysec = NULL;
  size_t kept = 0;
  for (size_t r = 0; r < t.nrow && rc == 0; r++) {
    if (cmodel >= 0) {
      const char *m = t.cell[r * t.ncol + (size_t)cmodel];
      if (strcmp(m != NULL ? m : "", model) != 0) continue;
    }
    kept++;
    json_t *v[8];
    for (size_t k = 0; k < nneed; k++) v[k] = NULL;
    for (size_t k = 0; k < nneed && rc == 0; k++) {
      /* the polar's identity (re, mach, ncrit) is needed even where the point failed */
      rc = csv_num(file, &t, r, col[k], polar && k < 3 ? -1 : conv, &v[k]);
    }
    if (rc == 0 && polar) {
      double kv[3];
      for (int k = 0; k < 3; k++) kv[k] = json_is_number(v[k]) ? json_number_value(v[k]) : NAN;
      const char *sec = csec >= 0 ? t.cell[r * t.ncol + (size_t)csec] : NULL;
      if (!json_is_number(v[0])) {
        cli_error("%s:%zu: re: a polar row needs its Reynolds number", file, t.line[r]);
        rc = CLI_EXIT_INPUT;
      } else if (cur == NULL || !same(kv[0], key[0]) || !same(kv[1], key[1]) || !same(kv[2], key[2]) ||
                 (sec != keysec && (sec == NULL || keysec == NULL || strcmp(sec, keysec) != 0))) {
        cur = json_object();
        json_object_set(cur, "re", v[0]);
        if (v[1] != NULL) json_object_set(cur, "mach", v[1]);
        if (v[2] != NULL) json_object_set(cur, "ncrit", v[2]);
        if (sec != NULL) json_object_set_new(cur, "section", json_string(sec));
        json_object_set_new(cur, "points", json_array());
        json_array_append_new(list, cur);
        memcpy(key, kv, sizeof key);
        keysec = sec;
      }
      if (rc == 0) {
        json_t *pt = json_object();
        for (size_t k = 3; k < nneed; k++) json_object_set(pt, need[k], v[k]);
        json_array_append_new(json_object_get(cur, "points"), pt);
      }
    } else if (rc == 0) {
      json_t *pt = json_object();
      for (size_t k = 0; k < nneed; k++) json_object_set(pt, need[k], v[k]);
      json_array_append_new(list, pt);
    }
    for (size_t k = 0; k < nneed; k++) json_decref(v[k]);
  }
  if (rc == 0 && kept == 0) {
    cli_error("%s: no rows of model '%s'", file, model);
    rc = CLI_EXIT_INPUT;
  }
  if (rc == 0 && !polar) {
    char bl[300];
    snprintf(bl, sizeof bl, "%s%s%s%s", name != NULL ? name : file, cmodel >= 0 ? " (" : "",
             cmodel >= 0 ? model : "", cmodel >= 0 ? ")" : "");
    json_object_set_new(root, "blade", json_string(bl));
  }
  json_decref(list);
  cli_csv_free(&t);
  if (rc) {
    json_decref(root);
    return rc;
  }
  *out = root;
  return 0;
}

int cmd_plot(int argc, char **argv)
{
  const char *file = NULL, *dir = NULL, *model = NULL;
  int force = 0;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--help") == 0 || strcmp(argv[i], "-h") == 0) {
      plot_help(stdout);
      return CLI_EXIT_OK;
    } else if (strcmp(argv[i], "--out") == 0 && i + 1 < argc) {
      dir = argv[++i];
    } else if (strcmp(argv[i], "--force") == 0) {
      force = 1;
    } else if (strcmp(argv[i], "--model") == 0 && i + 1 < argc) {
      model = argv[++i];
    } else if (argv[i][0] != '-' && file == NULL) {
      file = argv[i];
    } else {
      cli_error("plot: unexpected '%s' (see airscrew plot --help)", argv[i]);
      return CLI_EXIT_USAGE;
    }
  }
  if (file == NULL || dir == NULL) {
    cli_error("plot: give RESULT.json and --out DIR (see airscrew plot --help)");
    return CLI_EXIT_USAGE;
  }
  if (cli_check_options_only) return CLI_EXIT_OK;
  size_t flen = strlen(file);
  json_t *root = NULL;
  int rc;
  int is_csv = flen > 4 && strcasecmp(file + flen - 4, ".csv") == 0;
  if (model != NULL && !is_csv) {
    cli_error("plot: --model selects rows of a rotor CSV file with a model column");
    return CLI_EXIT_USAGE;
  }
  if (is_csv) {
    rc = csv_to_result(file, model, &root);
    if (rc) return rc;
  } else {
    char *text = NULL;
    size_t tlen = 0;
    rc = cli_read_file(file, PLOT_JSON_MAX, "result", &text, &tlen);
    if (rc) return rc;
    json_error_t je;
    root = json_loadb(text, tlen, JSON_REJECT_DUPLICATES, &je);
    free(text);
    if (root == NULL) {
      cli_error("%s:%d:%d: %s", file, je.line, je.column, je.text);
      return CLI_EXIT_INPUT;
    }
  }
  if (json_is_array(json_object_get(root, "polars"))) {
    int study = json_array_size(json_object_get(root, "re_summary")) >= 2;
    rc = fig_prepare_dir(dir, (const char *const[]){"polar", study ? "polar-re" : NULL, NULL}, force);
    if (rc == 0) rc = plot_polars(file, root, dir);
    if (rc == 0) rc = plot_re_summary(file, root, dir);
  } else if (json_is_array(json_object_get(root, "points")) && json_object_get(root, "blade") != NULL) {
    rc = fig_prepare_dir(dir, (const char *const[]){"rotor", "rotor-spanwise", NULL}, force);
    if (rc == 0) rc = plot_rotor(file, root, dir);
  } else {
    cli_error("%s: neither a polar result (\"polars\") nor a rotor result (\"points\", \"blade\")", file);
    rc = CLI_EXIT_INPUT;
  }
  json_decref(root);
  if (rc == 0) printf("figures written to %s/\n", dir);
  return rc;
}
